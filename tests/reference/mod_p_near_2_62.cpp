// Z/p for the largest moduli lacuna accepts (issue 7 §2). lacuna::mod_p and mod_p_dynamic
// take primes p < 2^62 (mod_p_modulus_limit), so the primes here are the eight largest below
// 2^62, the four largest below 2^61, and the primes on both sides of 2^32, where mul_mod
// switches from a 64-bit to a 128-bit product. The primes come from FLINT 2.9's n_is_prime
// (searching down) and n_nextprime, and are confirmed by lacuna::is_prime. On 3000 pairs per prime
// (fixed seeds; edge residues 0, 1, p - 1, p - 2 and negative int64 inputs mixed in) sums,
// differences, negation, products, inverses, quotients and powers are checked against
// boost::multiprecision::cpp_int and against FLINT's n_addmod, n_submod, n_negmod,
// n_mulmod2_preinv, n_invmod and n_powmod2_preinv; Euler's criterion a^((p-1)/2) against
// FLINT's n_jacobi. Primes at or above 2^62 (just above it, just below 2^63) are refused.
#include <lacuna/ring/mod_p.hpp>

#include <flint/ulong_extras.h>

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <limits>
#include <random>
#include <stdexcept>
#include <vector>

namespace reference_mod_p_near_2_62_test {

using boost::multiprecision::cpp_int;
using lacuna::mod_p_dynamic;

namespace {
constexpr std::uint64_t two62 = std::uint64_t{1} << 62U;

/// The largest prime below n by FLINT's n_is_prime (FLINT 2.9 has n_nextprime only).
std::uint64_t prev_prime(std::uint64_t n) {
  do --n;
  while (!n_is_prime(static_cast<ulong>(n)));
  return n;
}

/// The `count` largest primes below n.
std::vector<std::uint64_t> primes_below(std::uint64_t n, int count) {
  std::vector<std::uint64_t> out;
  for (int i = 0; i < count; ++i) out.push_back(n = prev_prime(n));
  return out;
}

/// A residue, often an edge one; or the residue of an arbitrary (often negative) int64.
std::pair<std::uint64_t, std::int64_t> draw(std::mt19937_64& rng, std::uint64_t p) {
  const auto n = static_cast<std::int64_t>(rng());
  switch (rng() % 6) {
    case 0: return {std::vector<std::uint64_t>{0, 1, p - 1, p - 2}[rng() % 4], 0};
    case 1: {  // from a signed integer: the residue of n
      cpp_int r = cpp_int(n) % p;
      if (r < 0) r += p;
      return {r.convert_to<std::uint64_t>(), n};
    }
    default: return {rng() % p, 0};
  }
}

/// Every operation of mod_p_dynamic modulo p against cpp_int and FLINT.
void check_dynamic(std::uint64_t p, int pairs) {
  const ulong pinv = n_preinvert_limb(static_cast<ulong>(p));
  const cpp_int P = p;
  std::mt19937_64 rng(p ^ 0x5eedULL);
  for (int i = 0; i < pairs; ++i) {
    const auto [x, nx] = draw(rng, p);
    const auto [y, ny] = draw(rng, p);
    // Build from the signed integer when there is one, so construction is checked too.
    const mod_p_dynamic a = nx != 0 ? mod_p_dynamic(nx, p) : mod_p_dynamic(static_cast<std::int64_t>(x), p);
    const mod_p_dynamic b = ny != 0 ? mod_p_dynamic(ny, p) : mod_p_dynamic(static_cast<std::int64_t>(y), p);
    INFO("p = ", p, ", a = ", x, ", b = ", y);
    REQUIRE(a.value() == x);
    REQUIRE(b.value() == y);
    const cpp_int X = x, Y = y;
    const auto fx = static_cast<ulong>(x), fy = static_cast<ulong>(y), fp = static_cast<ulong>(p);
    CHECK(cpp_int((a + b).value()) == (X + Y) % P);
    CHECK((a + b).value() == n_addmod(fx, fy, fp));
    CHECK(cpp_int((a - b).value()) == (X - Y + P) % P);
    CHECK((a - b).value() == n_submod(fx, fy, fp));
    CHECK(cpp_int((-a).value()) == (P - X) % P);
    CHECK((-a).value() == n_negmod(fx, fp));
    CHECK(cpp_int((a * b).value()) == X * Y % P);
    CHECK((a * b).value() == n_mulmod2_preinv(fx, fy, fp, pinv));
    CHECK((a * b).modulus() == p);
    if (x != 0) {
      const auto inv = a.inverse();
      CHECK(cpp_int(inv.value()) * X % P == 1);  // the inverse, verified in cpp_int
      CHECK(inv.value() == n_invmod(fx, fp));
      CHECK(cpp_int((b / a).value()) == Y * cpp_int(inv.value()) % P);
    } else {
      CHECK_THROWS_AS((void)a.inverse(), std::domain_error);
    }
  }
}

template <std::uint64_t P>
void check_static(int pairs) {
  using F = lacuna::mod_p<P>;
  const ulong pinv = n_preinvert_limb(static_cast<ulong>(P));
  std::mt19937_64 rng(P);
  for (int i = 0; i < pairs; ++i) {
    const auto [x, nx] = draw(rng, P);
    const auto [y, ny] = draw(rng, P);
    const F a = nx != 0 ? F(nx) : F::from_residue(x);
    const F b = ny != 0 ? F(ny) : F::from_residue(y);
    INFO("P = ", P, ", a = ", x, ", b = ", y);
    REQUIRE(a.value() == x);
    REQUIRE(b.value() == y);
    const auto fx = static_cast<ulong>(x), fy = static_cast<ulong>(y), fp = static_cast<ulong>(P);
    CHECK((a + b).value() == n_addmod(fx, fy, fp));
    CHECK((a - b).value() == n_submod(fx, fy, fp));
    CHECK((-a).value() == n_negmod(fx, fp));
    CHECK((a * b).value() == n_mulmod2_preinv(fx, fy, fp, pinv));
    CHECK(cpp_int((a * b).value()) == cpp_int(x) * y % P);
    // n_powmod2_preinv takes a signed exponent (negative: a power of the inverse), so e < 2^63.
    const std::uint64_t e = rng() >> 1U;
    CHECK(a.pow(e).value() == n_powmod2_preinv(fx, static_cast<slong>(e), fp, pinv));
    CHECK(cpp_int(a.pow(e).value()) == boost::multiprecision::powm(cpp_int(x), cpp_int(e), cpp_int(P)));
    if (x != 0) {
      CHECK(a.inverse().value() == n_invmod(fx, fp));
      CHECK(cpp_int(a.inverse().value()) * x % P == 1);
      // Euler's criterion: a^((P-1)/2) = (a / P), the Legendre symbol (FLINT n_jacobi).
      if constexpr (P > 2) {
        const int leg = n_jacobi(static_cast<mp_limb_signed_t>(x % P), fp);
        CHECK(a.pow((P - 1) / 2) == F(leg));
      }
      // Fermat: a^(P-1) = 1.
      CHECK(a.pow(P - 1) == F(1));
    }
  }
  // The ends of the int64 range reduce to the right residues (cpp_int).
  for (std::int64_t n : {std::numeric_limits<std::int64_t>::min(), std::numeric_limits<std::int64_t>::max(), std::int64_t{-1}}) {
    cpp_int r = cpp_int(n) % P;
    if (r < 0) r += P;
    CHECK(cpp_int(F(n).value()) == r);
  }
}
}  // namespace

TEST_CASE("the primes near 2^62, 2^61 and 2^32, by FLINT and by lacuna::is_prime") {
  const auto below62 = primes_below(two62, 8);
  // Offsets from 2^62 of the largest primes below it (by FLINT's n_is_prime above;
  // 2^62 - 57 also from tests/reference/ring_primality.cpp).
  const std::vector<std::uint64_t> want{two62 - 57, two62 - 87, two62 - 117, two62 - 143};
  for (std::size_t i = 0; i < want.size(); ++i) CHECK(below62[i] == want[i]);
  for (auto p : below62) CHECK(lacuna::is_prime(p));
  CHECK(n_nextprime(static_cast<ulong>(two62), 1) == two62 + 135);
  CHECK(n_is_prime(static_cast<ulong>((std::uint64_t{1} << 32U) + 15)));
  CHECK(prev_prime(std::uint64_t{1} << 32U) == (std::uint64_t{1} << 32U) - 5);
}

TEST_CASE("mod_p_dynamic near 2^62 against cpp_int and FLINT") {
  for (auto p : primes_below(two62, 8)) check_dynamic(p, 3000);
  for (auto p : primes_below(std::uint64_t{1} << 61U, 4)) check_dynamic(p, 3000);
  // Both sides of 2^32: the 64-bit product path (p <= 2^32) and the 128-bit one.
  for (std::uint64_t p : {(std::uint64_t{1} << 32U) - 5, (std::uint64_t{1} << 32U) + 15, (std::uint64_t{1} << 32U) + 61})
    check_dynamic(p, 3000);
}

TEST_CASE_TEMPLATE("mod_p<P> near 2^62 and 2^32 against FLINT", T, std::integral_constant<std::uint64_t, two62 - 57>,
                   std::integral_constant<std::uint64_t, two62 - 87>, std::integral_constant<std::uint64_t, two62 - 143>,
                   std::integral_constant<std::uint64_t, (std::uint64_t{1} << 61U) - 1>,
                   std::integral_constant<std::uint64_t, (std::uint64_t{1} << 32U) - 5>,
                   std::integral_constant<std::uint64_t, (std::uint64_t{1} << 32U) + 15>) {
  CHECK(n_is_prime(static_cast<ulong>(T::value)));
  check_static<T::value>(3000);
}

TEST_CASE("moduli at or above 2^62 are refused, prime or not") {
  // 2^62 + 135 is the least prime above 2^62 and 2^63 - 25 the largest below 2^63 (FLINT's
  // n_nextprime, and n_is_prime searching down).
  const std::uint64_t above62 = two62 + 135, below63 = (std::uint64_t{1} << 63U) - 25;
  CHECK(n_is_prime(static_cast<ulong>(above62)));
  CHECK(prev_prime(std::uint64_t{1} << 63U) == below63);
  for (std::uint64_t p : {two62, above62, below63, std::uint64_t{1} << 63U}) {
    INFO("p = ", p);
    CHECK_THROWS_AS(lacuna::prime_modulus{p}, std::invalid_argument);
    CHECK_THROWS_AS(mod_p_dynamic(1, p), std::invalid_argument);
  }
  CHECK(lacuna::mod_p_modulus_limit == two62);
  CHECK_NOTHROW(lacuna::prime_modulus{two62 - 57});
}

}  // namespace reference_mod_p_near_2_62_test

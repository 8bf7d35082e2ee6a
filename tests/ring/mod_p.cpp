// lacuna::mod_p<P> for P = 2, 3, 65521 (largest prime below 2^16), 2^61 - 1 (Mersenne prime)
// and 2^62 - 57 (largest prime below 2^62). Their primality: lacuna::is_prime in a
// static_assert inside mod_p, cross-checked with FLINT's n_is_prime in
// tests/reference/ring_primality.cpp. Products, sums and inverses are checked against cpp_int
// arithmetic; the axioms through the conformance suite.
#include <lacuna/ring/mod_p.hpp>

#include "ring_conformance.hpp"

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <random>
#include <stdexcept>

namespace ring_mod_p_test {

using boost::multiprecision::cpp_int;

namespace {
constexpr std::uint64_t m61 = (std::uint64_t{1} << 61U) - 1;
constexpr std::uint64_t p62 = (std::uint64_t{1} << 62U) - 57;

template <std::uint64_t P>
lacuna::mod_p<P> random_element(std::mt19937_64& rng) {
  // edge residues often, uniform otherwise
  switch (rng() % 4) {
    case 0: return lacuna::mod_p<P>::from_residue(P - 1 - rng() % (P < 3 ? P : 3));
    case 1: return lacuna::mod_p<P>(static_cast<std::int64_t>(rng()));  // negative too
    default: return lacuna::mod_p<P>::from_residue(rng() % P);
  }
}

template <std::uint64_t P>
void check_against_cpp_int() {
  using F = lacuna::mod_p<P>;
  std::mt19937_64 rng(P);
  for (int i = 0; i < 2000; ++i) {
    const F a = random_element<P>(rng), b = random_element<P>(rng);
    const cpp_int x = a.value(), y = b.value(), p = P;
    INFO("a = ", a.value(), ", b = ", b.value());
    CHECK(a.value() < P);
    CHECK(cpp_int((a * b).value()) == x * y % p);
    CHECK(cpp_int((a + b).value()) == (x + y) % p);
    CHECK(cpp_int((a - b).value()) == (x - y + p) % p);
    if (a.value() != 0) {
      const F inv = a.inverse();
      CHECK(cpp_int(inv.value()) * x % p == 1);  // the inverse, verified in cpp_int
      CHECK(cpp_int((b / a).value()) == y * cpp_int(inv.value()) % p);
    }
    // construction from a signed integer is the residue, also for negatives
    const auto n = static_cast<std::int64_t>(rng());
    cpp_int r = cpp_int(n) % p;
    if (r < 0) r += p;
    CHECK(cpp_int(F(n).value()) == r);
  }
  CHECK(F(std::numeric_limits<std::int64_t>::min()).value() ==
        ((cpp_int(std::numeric_limits<std::int64_t>::min()) % P + P) % P).template convert_to<std::uint64_t>());
  CHECK_THROWS_AS((void)F(0).inverse(), std::domain_error);
  CHECK_THROWS_WITH((void)F(0).inverse(), "lacuna::mod_p: zero has no inverse");
  // Fermat: a^(P-1) == 1
  CHECK(F(P > 2 ? 2 : 1).pow(P - 1) == F(1));
  if constexpr (P > 3) CHECK(F(3).pow(P - 1) == F(1));
}
}  // namespace

TEST_CASE_TEMPLATE("mod_p against cpp_int", T, std::integral_constant<std::uint64_t, 2>,
                   std::integral_constant<std::uint64_t, 3>, std::integral_constant<std::uint64_t, 65521>,
                   std::integral_constant<std::uint64_t, m61>, std::integral_constant<std::uint64_t, p62>) {
  check_against_cpp_int<T::value>();
}

TEST_CASE_TEMPLATE("mod_p: field conformance suite", T, std::integral_constant<std::uint64_t, 2>,
                   std::integral_constant<std::uint64_t, 3>, std::integral_constant<std::uint64_t, 65521>,
                   std::integral_constant<std::uint64_t, m61>, std::integral_constant<std::uint64_t, p62>) {
  ring_test::check_field<lacuna::mod_p<T::value>>(random_element<T::value>, 300);
}

TEST_CASE("small fields by hand, from memory") {
  using F7 = lacuna::mod_p<7>;
  CHECK(F7(3).inverse() == F7(5));  // 3 * 5 = 15 = 1 mod 7
  CHECK(F7(-1) == F7(6));
  CHECK(F7(2) / F7(3) == F7(3));    // 2 * 3^-1 = 2 * 5 = 10 = 3
  constexpr lacuna::mod_p<p62> big(-1);
  static_assert(big.value() == p62 - 1);
  static_assert((big * big).value() == 1);  // (-1)^2 at compile time, through 128 bits
  CHECK(lacuna::mod_p<m61>(-1).inverse() == lacuna::mod_p<m61>(-1));
}

}  // namespace ring_mod_p_test

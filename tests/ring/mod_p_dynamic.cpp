// lacuna::mod_p_dynamic: the modulus at run time, the unbound integers, mixed moduli and
// composite moduli as errors with a clear message. Products and inverses against cpp_int.
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/mod_p.hpp>

#include "ring_conformance.hpp"

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <random>
#include <stdexcept>

namespace ring_mod_p_dynamic_test {

using lacuna::mod_p_dynamic;
using boost::multiprecision::cpp_int;

namespace {
constexpr std::uint64_t p62 = (std::uint64_t{1} << 62U) - 57;

struct bound_gen {
  std::uint64_t p;
  mod_p_dynamic operator()(std::mt19937_64& rng) const {
    return mod_p_dynamic(static_cast<std::int64_t>(rng() >> 1U), lacuna::prime_modulus(p));
  }
};
/// Mostly bound elements, and unbound small integers, to exercise the adoption rule.
struct mixed_gen {
  std::uint64_t p;
  mod_p_dynamic operator()(std::mt19937_64& rng) const {
    if (rng() % 3 == 0) return mod_p_dynamic(static_cast<std::int64_t>(rng() % 201) - 100);
    return bound_gen{p}(rng);
  }
};
}  // namespace

TEST_CASE("composite or too large moduli are rejected with a clear message") {
  CHECK_THROWS_AS(mod_p_dynamic(1, 15), std::invalid_argument);
  CHECK_THROWS_WITH(mod_p_dynamic(1, 15), "lacuna::mod_p_dynamic: modulus 15 is not prime");
  CHECK_THROWS_WITH(mod_p_dynamic(1, 1), "lacuna::mod_p_dynamic: modulus 1 is not prime");
  CHECK_THROWS_WITH(mod_p_dynamic(1, 0), "lacuna::mod_p_dynamic: modulus 0 is not prime");
  CHECK_THROWS_WITH(lacuna::prime_modulus(3215031751ULL), "lacuna::mod_p_dynamic: modulus 3215031751 is not prime");
  CHECK_THROWS_WITH(mod_p_dynamic(1, 18446744073709551557ULL),  // prime, but 2^64 - 59 >= 2^62
                    "lacuna::mod_p_dynamic: modulus 18446744073709551557 is not below 2^62");
  CHECK_NOTHROW(mod_p_dynamic(1, p62));
}

TEST_CASE("bound arithmetic against cpp_int, p = 2^62 - 57 and p = 65521") {
  for (std::uint64_t p : {p62, std::uint64_t{65521}, std::uint64_t{3}}) {
    std::mt19937_64 rng(p);
    for (int i = 0; i < 2000; ++i) {
      const mod_p_dynamic a = bound_gen{p}(rng), b = bound_gen{p}(rng);
      const cpp_int x = a.value(), y = b.value();
      INFO("p = ", p, ", a = ", a.value(), ", b = ", b.value());
      CHECK((a * b).modulus() == p);
      CHECK(cpp_int((a * b).value()) == x * y % p);
      CHECK(cpp_int((a - b).value()) == (x - y + p) % p);
      if (a.value() != 0) CHECK(cpp_int(a.inverse().value()) * x % p == 1);
    }
  }
}

TEST_CASE("unbound integers adopt the modulus of the other operand") {
  const mod_p_dynamic a(3, 7);
  const mod_p_dynamic z = lacuna::zero<mod_p_dynamic>();
  const mod_p_dynamic o = lacuna::one<mod_p_dynamic>();
  CHECK_FALSE(z.is_bound());
  CHECK(z.modulus() == 0);
  CHECK((z + a).is_bound());
  CHECK((z + a).modulus() == 7);
  CHECK((o * a) == a);
  CHECK((a * mod_p_dynamic(-1)).value() == 4);
  CHECK(mod_p_dynamic(10) == a);  // 10 = 3 mod 7: equality binds too
  CHECK(a == mod_p_dynamic(-4));
  CHECK(mod_p_dynamic(10) != mod_p_dynamic(3));  // both unbound: the integers differ
  // unbound with unbound stays unbound and exact
  const mod_p_dynamic u = mod_p_dynamic(6) * mod_p_dynamic(7);
  CHECK_FALSE(u.is_bound());
  CHECK(u.unbound_value() == 42);
  CHECK_THROWS_AS(mod_p_dynamic(std::int64_t{1} << 40U) * mod_p_dynamic(std::int64_t{1} << 40U), std::overflow_error);
  // the generic algorithms start from zero() and one() and still work
  const auto e = lacuna::extended_gcd(a, mod_p_dynamic(5, 7));
  CHECK(e.g == o);
  CHECK(e.s * a + e.t * mod_p_dynamic(5, 7) == o);
  CHECK(lacuna::gcd(a, z).modulus() == 7);
}

TEST_CASE("mixing moduli is an error; inverses need a modulus") {
  CHECK_THROWS_WITH(mod_p_dynamic(1, 5) + mod_p_dynamic(1, 7),
                    "lacuna::mod_p_dynamic: operands have different moduli (5 and 7)");
  CHECK_FALSE(mod_p_dynamic(1, 5) == mod_p_dynamic(1, 7));
  CHECK(mod_p_dynamic(-1).inverse() == mod_p_dynamic(-1));
  CHECK_THROWS_AS((void)mod_p_dynamic(2).inverse(), std::domain_error);
  CHECK_THROWS_WITH((void)mod_p_dynamic(0, 5).inverse(), "lacuna::mod_p_dynamic: zero has no inverse");
  CHECK(mod_p_dynamic(2) / mod_p_dynamic(3, 5) == mod_p_dynamic(4, 5));  // 2 * 3^-1 = 2 * 2 = 4 mod 5
}

TEST_CASE("mod_p_dynamic: field conformance suite (bound) and ring suite (mixed bound/unbound)") {
  ring_test::check_field<mod_p_dynamic>(bound_gen{p62}, 300);
  ring_test::check_field<mod_p_dynamic>(bound_gen{65521}, 200);
  ring_test::check_commutative_ring<mod_p_dynamic>(mixed_gen{p62}, 300);
  ring_test::check_commutative_ring<mod_p_dynamic>(mixed_gen{5}, 300);
}

}  // namespace ring_mod_p_dynamic_test

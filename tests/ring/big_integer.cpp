// lacuna::big_integer: the plain cpp_int ring (reference: cpp_int itself, and the axioms).
#include <lacuna/ring/big_integer.hpp>

#include "ring_conformance.hpp"

#include <doctest/doctest.h>

#include <random>
#include <stdexcept>

namespace ring_big_integer_test {

using lacuna::big_integer;
using boost::multiprecision::cpp_int;

namespace {
big_integer random_big(std::mt19937_64& rng) {
  cpp_int v = rng() % 4 == 0 ? cpp_int(static_cast<std::int64_t>(rng() % 21) - 10) : (cpp_int(rng()) << (rng() % 130)) + rng();
  return big_integer(rng() % 2 ? v : cpp_int(-v));
}
}  // namespace

TEST_CASE("big_integer arithmetic is cpp_int arithmetic") {
  const big_integer a(std::string("-123456789012345678901234567890"));
  const big_integer b(987654321);
  CHECK((a * b).value() == cpp_int("-123456789012345678901234567890") * 987654321);
  CHECK((a / b).value() == cpp_int("-123456789012345678901234567890") / 987654321);
  CHECK((a % b).value() == cpp_int("-123456789012345678901234567890") % 987654321);
  CHECK((a % b).sign() < 0);  // truncating: sign of the dividend
  CHECK(lacuna::gcd(big_integer(-12), big_integer(18)) == big_integer(6));
  CHECK_THROWS_AS(a / big_integer(0), std::domain_error);
  // auto is safe: the wrapper's operators return values, not expression templates
  auto c = a * b + b;
  static_assert(std::is_same_v<decltype(c), big_integer>);
  CHECK(c.value() == cpp_int("-123456789012345678901234567890") * 987654321 + 987654321);
}

TEST_CASE("big_integer: ring conformance suite") {
  ring_test::check_euclidean_domain<big_integer>(random_big, 300);
}

}  // namespace ring_big_integer_test

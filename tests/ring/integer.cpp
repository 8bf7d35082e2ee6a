// lacuna::integer: exactness around the 64-bit boundary (reference: Boost.Multiprecision
// cpp_int), the canonical small/big form, and the ring conformance suite.
#include <lacuna/ring/integer.hpp>

#include "ring_conformance.hpp"

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <limits>
#include <random>
#include <sstream>
#include <stdexcept>
#include <unordered_set>
#include <vector>

namespace ring_integer_test {

using lacuna::integer;
using boost::multiprecision::cpp_int;

namespace {
constexpr std::int64_t lo = std::numeric_limits<std::int64_t>::min();
constexpr std::int64_t hi = std::numeric_limits<std::int64_t>::max();

bool fits(const cpp_int& v) { return v >= lo && v <= hi; }

/// The value and its representation agree with the exact reference.
void check_same(const integer& x, const cpp_int& exact) {
  INFO("x = ", x.to_string(), ", exact = ", exact.str());
  CHECK(x.to_big() == exact);
  CHECK(x.is_small() == fits(exact));  // canonical: small exactly when it fits
  if (x.is_small()) CHECK(cpp_int(x.small_value()) == exact);
  CHECK(x.to_string() == exact.str());
}

std::vector<cpp_int> edge_values() {
  std::vector<cpp_int> v;
  for (std::int64_t s : {lo, lo + 1, lo / 2, std::int64_t{-3037000500}, std::int64_t{-2}, std::int64_t{-1},
                         std::int64_t{0}, std::int64_t{1}, std::int64_t{2}, std::int64_t{3037000500}, hi / 2, hi - 1, hi})
    v.emplace_back(s);
  v.push_back(cpp_int(hi) + 1);  // 2^63: the smallest positive big value
  v.push_back(cpp_int(lo) - 1);
  v.push_back(cpp_int(hi) * hi);
  v.push_back(-(cpp_int(1) << 200) + 12345);
  return v;
}

integer random_integer(std::mt19937_64& rng) {
  switch (rng() % 5) {
    case 0: return integer(static_cast<std::int64_t>(rng() % 2001) - 1000);
    case 1: return integer(static_cast<std::int64_t>(rng()));  // anywhere in the 64-bit range
    case 2: return integer(rng() % 2 ? hi - static_cast<std::int64_t>(rng() % 3) : lo + static_cast<std::int64_t>(rng() % 3));
    case 3: {  // beyond 64 bits
      cpp_int v = (cpp_int(rng()) << 64) + rng();
      return integer(rng() % 2 ? v : cpp_int(-v));
    }
    default: return integer(static_cast<std::int64_t>(rng() % 7) - 3);
  }
}
}  // namespace

TEST_CASE("integer is compact") {
  CHECK(sizeof(integer) <= 16);
  static_assert(std::is_nothrow_move_constructible_v<integer>);
}

TEST_CASE("+ - * / % and unary - around INT64_MIN and INT64_MAX are exact (reference: cpp_int)") {
  for (const cpp_int& a : edge_values()) {
    const integer ia(a);
    check_same(ia, a);
    check_same(-ia, cpp_int(-a));
    for (const cpp_int& b : edge_values()) {
      const integer ib(b);
      INFO("a = ", a.str(), ", b = ", b.str());
      check_same(ia + ib, cpp_int(a + b));
      check_same(ia - ib, cpp_int(a - b));
      check_same(ia * ib, cpp_int(a * b));
      if (b != 0) {
        // cpp_int's / and % truncate toward zero, as C++'s built-in operators do.
        check_same(ia / ib, cpp_int(a / b));
        check_same(ia % ib, cpp_int(a % b));
        const auto [q, r] = lacuna::div_rem(ia, ib);
        check_same(q, cpp_int(a / b));
        check_same(r, cpp_int(a % b));
      }
      integer m = ia;
      m += ib;
      check_same(m, cpp_int(a + b));
      m = ia;
      m *= ib;
      check_same(m, cpp_int(a * b));
      CHECK((ia == ib) == (a == b));
      CHECK((ia < ib) == (a < b));
      CHECK((ia <=> ib) == (a.compare(b) <=> 0));
    }
  }
}

TEST_CASE("the classic overflow cases, from memory") {
  const integer max(hi), min(lo);
  check_same(max + 1, cpp_int(1) << 63);
  check_same(min - 1, -(cpp_int(1) << 63) - 1);
  check_same(-min, cpp_int(1) << 63);
  check_same(min / -1, cpp_int(1) << 63);
  check_same(min % -1, cpp_int(0));
  check_same(min * -1, cpp_int(1) << 63);
  check_same(abs(min), cpp_int(1) << 63);
  // and back: a big intermediate that returns to 64 bits is small again
  const integer big = max + max;
  CHECK_FALSE(big.is_small());
  check_same(big - max, cpp_int(hi));
  check_same(big / 2, cpp_int(hi));
  check_same((max * max) / max, cpp_int(hi));
  check_same(integer(std::numeric_limits<std::uint64_t>::max()), (cpp_int(1) << 64) - 1);
  check_same(integer(cpp_int(5)), cpp_int(5));  // a small cpp_int becomes small
}

TEST_CASE("truncating division, as C++ (from the C++ standard: -7 / 2 == -3, -7 % 2 == -1)") {
  CHECK(integer(-7) / integer(2) == integer(-3));
  CHECK(integer(-7) % integer(2) == integer(-1));
  CHECK(integer(7) % integer(-2) == integer(1));
  CHECK_THROWS_AS(integer(1) / integer(0), std::domain_error);
  CHECK_THROWS_AS(integer(1) % integer(0), std::domain_error);
  CHECK_THROWS_AS(lacuna::div_rem(integer(cpp_int(1) << 100), integer(0)), std::domain_error);
  CHECK_THROWS_WITH(integer(1) / integer(0), "lacuna::integer: division by zero");
}

TEST_CASE("random products and sums of big and small values agree with cpp_int") {
  std::mt19937_64 rng(12345);
  for (int i = 0; i < 2000; ++i) {
    const integer a = random_integer(rng), b = random_integer(rng);
    const cpp_int x = a.to_big(), y = b.to_big();
    check_same(a * b + a - b, cpp_int(x * y + x - y));
    if (y != 0) check_same(a % b, cpp_int(x % y));
  }
}

TEST_CASE("copies, moves, self-assignment") {
  integer a(cpp_int(1) << 100);
  integer b = a;
  b += 1;
  CHECK(a.to_big() == (cpp_int(1) << 100));  // deep copy
  integer c = std::move(b);
  CHECK(c.to_big() == (cpp_int(1) << 100) + 1);
  a = a;  // NOLINT: self-assignment must keep the value
  CHECK(a.to_big() == (cpp_int(1) << 100));
  a = integer(3);
  CHECK(a.is_small());
  a = c;
  CHECK(a == c);
  c = integer(-4);
  a = c;
  CHECK(a.is_small());
  CHECK(a == integer(-4));
}

TEST_CASE("printing and hashing") {
  std::ostringstream os;
  os << integer(-42) << " " << integer(cpp_int(1) << 70);
  CHECK(os.str() == "-42 1180591620717411303424");  // 2^70, from memory
  std::unordered_set<integer> s;
  s.insert(integer(hi) + 1);
  s.insert(integer(cpp_int(1) << 63));  // the same value built another way
  s.insert(integer(7));
  s.insert(integer(14) / 2);
  CHECK(s.size() == 2);
  CHECK(std::hash<integer>{}(integer(hi) + 1 - 1) == std::hash<integer>{}(integer(hi)));
}

TEST_CASE("integer's Euclidean structure") {
  CHECK(lacuna::euclidean_size(integer(-5)) == integer(5));
  CHECK(lacuna::normalize(integer(-5)) == integer(5));
  CHECK(lacuna::unit_part(integer(-5)) == integer(-1));
  CHECK(lacuna::unit_part(integer(0)) == integer(1));
  CHECK(lacuna::is_unit(integer(-1)));
  CHECK_FALSE(lacuna::is_unit(integer(2)));
  CHECK_FALSE(lacuna::is_unit(integer(0)));
  // gcd(INT64_MIN, 0) == 2^63 does not fit in 64 bits
  CHECK(lacuna::gcd(integer(lo), integer(0)).to_big() == (cpp_int(1) << 63));
  CHECK(lacuna::gcd(integer(lo), integer(lo)).to_big() == (cpp_int(1) << 63));
}

TEST_CASE("integer: ring conformance suite") {
  ring_test::check_euclidean_domain<integer>(random_integer, 400);
}

}  // namespace ring_integer_test

// checked_add/sub/mul/neg/mul_add around the ends of the int64 range, against cpp_int
// (Boost.Multiprecision is the reference for what the exact result is and whether it fits).
#include <lacuna/ring/checked.hpp>

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <limits>
#include <random>
#include <vector>

namespace ring_checked_test {

using boost::multiprecision::cpp_int;
namespace {
constexpr std::int64_t lo = std::numeric_limits<std::int64_t>::min();
constexpr std::int64_t hi = std::numeric_limits<std::int64_t>::max();

bool fits(const cpp_int& v) { return v >= lo && v <= hi; }

std::vector<std::int64_t> edge_values() {
  std::vector<std::int64_t> v = {lo, lo + 1, lo + 2, lo / 2, lo / 2 - 1, -3037000500, -3037000499, -2, -1, 0,
                                 1, 2, 3037000499, 3037000500, hi / 2, hi / 2 + 1, hi - 1, hi};
  std::mt19937_64 rng(7);
  for (int i = 0; i < 40; ++i) v.push_back(static_cast<std::int64_t>(rng()));
  return v;
}
}  // namespace

// Compile-time use (the engine may fold constants).
static_assert([] { std::int64_t r = 0; return lacuna::checked_add(hi, 1, r); }());
static_assert([] { std::int64_t r = 0; return !lacuna::checked_add(hi, -1, r) && r == hi - 1; }());
static_assert([] { std::int64_t r = 0; return lacuna::checked_neg(lo, r); }());

TEST_CASE("checked arithmetic agrees with cpp_int on edge values") {
  for (std::int64_t a : edge_values()) {
    std::int64_t r = 0;
    {
      const cpp_int exact = -cpp_int(a);
      const bool overflow = lacuna::checked_neg(a, r);
      CHECK(overflow == !fits(exact));
      if (!overflow) CHECK(cpp_int(r) == exact);
    }
    for (std::int64_t b : edge_values()) {
      INFO("a = ", a, ", b = ", b);
      cpp_int exact = cpp_int(a) + b;
      bool overflow = lacuna::checked_add(a, b, r);
      CHECK(overflow == !fits(exact));
      if (!overflow) CHECK(cpp_int(r) == exact);

      exact = cpp_int(a) - b;
      overflow = lacuna::checked_sub(a, b, r);
      CHECK(overflow == !fits(exact));
      if (!overflow) CHECK(cpp_int(r) == exact);

      exact = cpp_int(a) * b;
      overflow = lacuna::checked_mul(a, b, r);
      CHECK(overflow == !fits(exact));
      if (!overflow) CHECK(cpp_int(r) == exact);

      // mul_add reports overflow of the product or the sum: with c = 1 and c = -1
      for (std::int64_t c : {std::int64_t{1}, std::int64_t{-1}}) {
        const cpp_int p = cpp_int(a) * b;
        overflow = lacuna::checked_mul_add(a, b, c, r);
        CHECK(overflow == (!fits(p) || !fits(p + c)));
        if (!overflow) CHECK(cpp_int(r) == p + c);
      }
    }
  }
}

TEST_CASE("the exact boundaries, from memory: INT64_MAX = 2^63 - 1") {
  std::int64_t r = 0;
  CHECK(lacuna::checked_add(hi, 1, r));
  CHECK_FALSE(lacuna::checked_add(hi, 0, r));
  CHECK(lacuna::checked_sub(lo, 1, r));
  CHECK_FALSE(lacuna::checked_sub(-1, hi, r));
  CHECK(r == lo);
  CHECK(lacuna::checked_mul(lo, -1, r));
  CHECK_FALSE(lacuna::checked_mul(3037000499, 3037000499, r));  // 3037000499^2 < 2^63 (floor sqrt(2^63-1))
  CHECK(lacuna::checked_mul(3037000500, 3037000500, r));
  CHECK_FALSE(lacuna::checked_neg(lo + 1, r));
  CHECK(r == hi);
}

}  // namespace ring_checked_test

// lacuna::integer's small path never allocates: global operator new is counted in this
// test executable, and 64-bit arithmetic (including gcd and div_rem) must not call it,
// while an overflowing product must (it switches to cpp_int on the heap).
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <doctest/doctest.h>

#include "count_allocations.hpp"

#include <cstdlib>
#include <new>

namespace ring_integer_alloc_test {

using lacuna_test::allocations;

TEST_CASE("64-bit arithmetic on lacuna::integer does not allocate") {
  using lacuna::integer;
  integer acc(1);
  const std::size_t before = allocations.load();
  for (std::int64_t i = 1; i < 1000; ++i) {
    integer x(i * 7919);
    acc = (acc * integer(31) + x) % integer(1'000'000'007);
    acc -= integer(i);
    const auto [q, r] = lacuna::div_rem(acc, integer(i));
    acc = q + r + lacuna::gcd(acc, x);
    const auto e = lacuna::extended_gcd(x, integer(i + 1));
    acc += e.s * integer(0);
  }
  CHECK(allocations.load() == before);
  CHECK(acc.is_small());
  const integer big = integer(INT64_MAX) * integer(2);
  CHECK(allocations.load() > before);  // the big path does allocate
  CHECK_FALSE(big.is_small());
}

}  // namespace ring_integer_alloc_test

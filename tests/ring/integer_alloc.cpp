// lacuna::integer's small path never allocates: global operator new is counted in this
// test executable, and 64-bit arithmetic (including gcd and div_rem) must not call it,
// while an overflowing product must (it switches to cpp_int on the heap).
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <doctest/doctest.h>

#include <cstdlib>
#include <new>

namespace {
long allocations = 0;
}

// The replacement pair below allocates with malloc and frees with free, which is consistent;
// GCC's -Wmismatched-new-delete cannot see that once Boost's inlined `new` meets this
// `delete` (seen under -O2 -g with the sanitizers), so it is silenced for these two only.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmismatched-new-delete"
#endif
void* operator new(std::size_t n) {
  ++allocations;
  if (void* p = std::malloc(n == 0 ? 1 : n)) return p;
  throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif

TEST_CASE("64-bit arithmetic on lacuna::integer does not allocate") {
  using lacuna::integer;
  integer acc(1);
  const long before = allocations;
  for (std::int64_t i = 1; i < 1000; ++i) {
    integer x(i * 7919);
    acc = (acc * integer(31) + x) % integer(1'000'000'007);
    acc -= integer(i);
    const auto [q, r] = lacuna::div_rem(acc, integer(i));
    acc = q + r + lacuna::gcd(acc, x);
    const auto e = lacuna::extended_gcd(x, integer(i + 1));
    acc += e.s * integer(0);
  }
  CHECK(allocations == before);
  CHECK(acc.is_small());
  const integer big = integer(INT64_MAX) * integer(2);
  CHECK(allocations > before);  // the big path does allocate
  CHECK_FALSE(big.is_small());
}

// simplicial_complex::boundary allocates nothing below dimension 8 (its result keeps an inline
// buffer and faces are found by binary search): counted with a replaced global operator new.
#include <doctest/doctest.h>

#include "support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <atomic>
#include <cstdlib>
#include <new>

// GCC 12 inlines the replaced operator delete into std::allocator and then mistakes the
// malloc/free pair for a mismatch (-Wmismatched-new-delete); the pair is matched by design.
#pragma GCC diagnostic ignored "-Wmismatched-new-delete"

namespace {
std::atomic<std::size_t> allocations{0};
}  // namespace

void* operator new(std::size_t n) {
  ++allocations;
  if (void* p = std::malloc(n ? n : 1)) return p;
  throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }

TEST_CASE("boundaries of simplices of dimension < 8 do not allocate; of cell lists neither") {
  const auto s = test_support::simplex_boundary_sphere(8);  // simplices up to dimension 7
  const auto c = lacuna::cell_list::torus();
  std::int64_t sum = 0;
  const std::size_t before = allocations.load();
  for (int k = 0; k <= s.top_dimension(); ++k)
    for (std::size_t i = 0; i < s.cell_count(k); ++i)
      for (const auto& t : s.boundary(k, i)) sum += t.coefficient * static_cast<std::int64_t>(t.face % 3);
  for (const auto& t : c.boundary(2, 1)) sum += t.coefficient.small_value();
  const std::size_t after = allocations.load();
  CHECK(after == before);
  CHECK(sum != 0);  // the loop did run (and is not optimized away)
  // a 9-dimensional simplex needs the heap: the counter does see allocations
  const auto big = test_support::simplex_boundary_sphere(10);
  const std::size_t b2 = allocations.load();
  CHECK(big.boundary(9, 0).size() == 10);
  CHECK(allocations.load() > b2);
}

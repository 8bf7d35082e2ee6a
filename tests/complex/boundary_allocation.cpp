// simplicial_complex::boundary allocates nothing below dimension 8 (its result keeps an inline
// buffer and faces are found by binary search): counted with a replaced global operator new.
#include <doctest/doctest.h>

#include "count_allocations.hpp"
#include "support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <atomic>
#include <cstdlib>
#include <new>

namespace complex_boundary_allocation_test {

using lacuna_test::allocations;

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

}  // namespace complex_boundary_allocation_test

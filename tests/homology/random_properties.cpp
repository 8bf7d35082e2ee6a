// The randomized property suite, short run (issue 7 §3; the long run is
// random_properties_long.long.cpp). Fixed seeds; the checks and their theorems are in
// random_properties.hpp: ∂∂ = 0, Euler–Poincaré over Q and Z/p, the universal coefficient
// theorem, Künneth on random products, barycentric subdivision, every variant against every
// other (sparse, Markowitz, dense Smith; field reductions against Smith ranks), and random
// pairs (exactness, H(X, A) = H̃(X ∪ CA) = H̃(X/A), χ additivity) on random cubical volumes,
// cell lists and simplicial complexes.
#include "random_properties.hpp"

namespace homology_random_properties_test {

using namespace random_test;

TEST_CASE("random cubical volumes (seed 701)") { suite_cubical(701, 4, 4); }
TEST_CASE("random cell lists (seed 702)") { suite_cell_lists(702, 12); }
TEST_CASE("random simplicial complexes and pairs (seed 703)") { suite_simplicial(703, 10, 7); }
TEST_CASE("Künneth on random products (seed 704)") { suite_kunneth(704, 10); }

}  // namespace homology_random_properties_test

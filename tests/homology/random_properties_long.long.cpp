// The randomized property suite, long run (label "long"; ctest --test-dir build -L long):
// the checks of random_properties.hpp on more and larger random complexes, other seeds than
// the short run's (random_properties.cpp).
#include "random_properties.hpp"

namespace homology_random_properties_long_test {

using namespace random_test;

TEST_CASE("random cubical volumes (seeds 801, 802)") {
  suite_cubical(801, 25, 4);
  suite_cubical(802, 8, 7);
}
TEST_CASE("random cell lists (seed 803)") { suite_cell_lists(803, 150); }
TEST_CASE("random simplicial complexes and pairs (seed 804)") { suite_simplicial(804, 80, 9); }
TEST_CASE("Künneth on random products (seed 805)") { suite_kunneth(805, 60); }

}  // namespace homology_random_properties_long_test

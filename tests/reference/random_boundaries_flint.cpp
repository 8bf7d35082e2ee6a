// Randomized FLINT cross-checks of boundary matrices, short run (seed 901); the checks are
// in random_flint_checks.hpp, the long run in random_boundaries_flint_long.long.cpp.
#include "random_flint_checks.hpp"

namespace reference_random_boundaries_flint_test {

TEST_CASE("random complexes: Smith forms and ranks mod p of the boundary matrices agree with FLINT (seed 901)") {
  random_flint::suite(901, 8, 4, 7);
}

}  // namespace reference_random_boundaries_flint_test

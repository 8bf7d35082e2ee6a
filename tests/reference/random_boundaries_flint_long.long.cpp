// Randomized FLINT cross-checks of boundary matrices, long run (label "long"; seeds 902, 903):
// more and larger random complexes than random_boundaries_flint.cpp, same checks
// (random_flint_checks.hpp).
#include "random_flint_checks.hpp"

namespace reference_random_boundaries_flint_long_test {

TEST_CASE("random complexes against FLINT, many (seed 902)") { random_flint::suite(902, 80, 4, 8); }
TEST_CASE("random complexes against FLINT, larger (seed 903)") { random_flint::suite(903, 8, 5, 9); }

}  // namespace reference_random_boundaries_flint_long_test

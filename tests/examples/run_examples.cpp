// Runs example programs that the documentation quotes (built with the examples) and checks
// their exit status and the lines the documents show:
//   * examples/quick_start.cpp, the README's quick start: the Klein bottle, H_1 = Z + Z/2
//     (Hatcher 2002, Example 2.37; the program checks the groups itself and exits 1 if wrong);
//   * examples/maps_walkthrough.cpp, the worked example of docs/maps-and-sequences.md: the
//     annulus and its boundary, H_n(X, ∂X) = Z, Z, 0 for n = 2, 1, 0 (Lefschetz duality,
//     Hatcher 2002, Theorem 3.43), exactness at its 9 places, and the Lefschetz number 0 of a
//     rotation, homotopic to the identity (χ of the annulus; Hatcher 2002, §2.C);
//   * examples/persistence_walkthrough.cpp, the worked example of docs/persistence.md: the
//     diagrams of a made-up height map, of a rectangle's corners (the loop dies at sqrt 5, its
//     diagonal) and of the projective plane over Z/2 and Z/3 (H_1 = Z/2 is seen mod 2 only:
//     the universal coefficient theorem, Hatcher 2002, Corollary 3A.6).
#include <doctest/doctest.h>

#include "run_program.hpp"

#include <cstdio>
#include <string>

namespace examples_run_examples_test {

namespace {

examples_support::run_result run(const std::string& program) { return examples_support::run_program(program, false); }

}  // namespace

TEST_CASE("examples/quick_start prints the Klein bottle's groups, as the README shows") {
  const auto r = run("quick_start");
  INFO(r.text);
  CHECK(r.status == 0);
  CHECK(r.text ==
        "H_0: rank 1, 1 generators\n"
        "H_1: rank 1, torsion Z/2, 2 generators\n"
        "H_2: rank 0, 0 generators\n");
}

TEST_CASE("examples/maps_walkthrough prints what docs/maps-and-sequences.md shows") {
  const auto r = run("maps_walkthrough");
  INFO(r.text);
  CHECK(r.status == 0);
  for (const char* line : {"H_2(X,A) = Z^1\n", "H_1(A) = Z^2\n", "H_1(X) = Z^1\n", "H_1(X,A) = Z^1\n",
                           "H_0(A) = Z^2\n", "exact: yes (9 places)\n", "Lefschetz number of the rotation: 0\n",
                           "all self-checks passed\n"}) {
    CAPTURE(line);
    CHECK(r.text.find(line) != std::string::npos);
  }
  CHECK(r.text.find("FAIL") == std::string::npos);
}

TEST_CASE("examples/persistence_walkthrough prints what docs/persistence.md shows") {
  const auto r = run("persistence_walkthrough");
  INFO(r.text);
  CHECK(r.status == 0);
  CHECK(r.text ==
        "sublevel sets of the height map, Z/2:\n"
        "  H_0: [1, inf) [4, 6)\n"
        "  H_1: [2, 9)\n"
        "  H_2:\n"
        "Betti numbers at height 5: 2 1\n"
        "classes of H_1 alive from 2 to 8: 1\n"
        "the loop is born with edge [3,4]x[3], killed by square [3,4]x[2,3], and drawn by 8 edges\n"
        "superlevel sets of the same map:\n"
        "  H_0: [9, inf) [6, 3)\n"
        "  H_1: [6, 1) [3, 2)\n"
        "  H_2:\n"
        "Vietoris-Rips of a 2 x 1 rectangle:\n"
        "  H_0: [0, 1) [0, 1) [0, 2) [0, inf)\n"
        "  H_1: [2, 2.23606797749979)\n"
        "projective plane over Z/2:\n"
        "  H_0: [0, inf)\n"
        "  H_1: [1, inf)\n"
        "  H_2: [2, inf)\n"
        "projective plane over Z/3:\n"
        "  H_0: [0, inf)\n"
        "  H_1: [1, 2)\n"
        "  H_2:\n"
        "all checks passed\n");
}

}  // namespace examples_run_examples_test

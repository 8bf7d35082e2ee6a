// Runs example programs that the documentation quotes (built with the examples) and checks
// their exit status and the lines the documents show:
//   * examples/quick_start.cpp, the README's quick start: the Klein bottle, H_1 = Z + Z/2
//     (Hatcher 2002, Example 2.37; the program checks the groups itself and exits 1 if wrong);
//   * examples/maps_walkthrough.cpp, the worked example of docs/maps-and-sequences.md: the
//     annulus and its boundary, H_n(X, ∂X) = Z, Z, 0 for n = 2, 1, 0 (Lefschetz duality,
//     Hatcher 2002, Theorem 3.43), exactness at its 9 places, and the Lefschetz number 0 of a
//     rotation, homotopic to the identity (χ of the annulus; Hatcher 2002, §2.C).
#include <doctest/doctest.h>

#include <cstdio>
#include <string>

namespace examples_run_examples_test {

namespace {

struct run_result {
  int status = -1;
  std::string text;
};

run_result run(const std::string& program) {
  const std::string cmd = std::string(LACUNA_BINARY_DIR) + "/" + program;
  run_result r;
  FILE* out = popen(cmd.c_str(), "r");
  REQUIRE(out != nullptr);
  char buf[512];
  while (std::fgets(buf, sizeof buf, out) != nullptr) r.text += buf;
  r.status = pclose(out);
  return r;
}

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

}  // namespace examples_run_examples_test

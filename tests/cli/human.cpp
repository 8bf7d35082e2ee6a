// Output for people (no --json): standard notation (docs/formats.md: "Z^2", "Z ⊕ Z/2").
#include "run.hpp"

#include <string>

namespace cli_human_test {

using namespace cli_test;

namespace {

std::string text_of(const std::vector<std::string>& args) {
  const auto r = run(args);
  CHECK(r.status == 0);
  CHECK(r.err.empty());
  return r.out;
}

bool has_line(const std::string& out, const std::string& line) {
  return ("\n" + out).find("\n" + line + "\n") != std::string::npos;
}

}  // namespace

TEST_CASE("human-readable: RP^2, the torus, the Klein bottle") {
  // RP^2: H_1 = Z/2 (Hatcher, Algebraic Topology, 2002, Example 2.42)
  auto out = text_of({"homology", data("projective_plane.cells").string()});
  CHECK(has_line(out, "H_0 = Z"));
  CHECK(has_line(out, "H_1 = Z/2"));
  CHECK(has_line(out, "H_2 = 0"));
  // the torus: H_1 = Z^2 (ranks 1, 2, 1)
  out = text_of({"homology", data("torus.cells").string()});
  CHECK(has_line(out, "H_1 = Z^2"));
  CHECK(has_line(out, "H_2 = Z"));
  // the Klein bottle: H_1 = Z ⊕ Z/2 (Hatcher, 2002, Example 2.37 with g = 2, from memory),
  // U+2295 between the summands as docs/formats.md writes it
  out = text_of({"homology", data("klein_bottle.cells").string()});
  CHECK(has_line(out, "H_1 = Z \u2295 Z/2"));
  // Z/6 + Z/4 + Z/2 = Z/2 ⊕ Z/2 ⊕ Z/12 (by hand); the tool writes equal factors as a power
  out = text_of({"homology", data("torsion_mix.cells").string()});
  CHECK((has_line(out, "H_1 = (Z/2)^2 \u2295 Z/12") || has_line(out, "H_1 = Z/2 \u2295 Z/2 \u2295 Z/12")));
}

TEST_CASE("human-readable: over fields the summands are the field") {
  // H_*(RP^2; Z/2) = Z/2 in each dimension (Hatcher, 2002, Example 2.42, mod 2)
  auto out = text_of({"homology", "--coefficients", "Z/2", data("projective_plane.cells").string()});
  CHECK(has_line(out, "H_1 = Z/2"));
  CHECK(has_line(out, "H_2 = Z/2"));
  // over Q the torus is Q, Q^2, Q (universal coefficients)
  out = text_of({"homology", "--coefficients", "Q", data("torus.cells").string()});
  CHECK(has_line(out, "H_0 = Q"));
  CHECK(has_line(out, "H_1 = Q^2"));
  // over Q, RP^2 is a point: H_1 = 0
  out = text_of({"homology", "--coefficients", "Q", data("projective_plane.cells").string()});
  CHECK(has_line(out, "H_1 = 0"));
  // nothing in the output looks like JSON
  CHECK(out.find('{') == std::string::npos);
}

TEST_CASE("human-readable: one line per dimension 0..top, and none for the empty complex") {
  auto out = text_of({"homology", data("cube.off").string()});
  // H = Z, 0, Z for the 2-sphere (Hatcher, 2002, Corollary 2.14, from memory)
  CHECK(has_line(out, "H_0 = Z"));
  CHECK(has_line(out, "H_1 = 0"));
  CHECK(has_line(out, "H_2 = Z"));
  CHECK(out.find("H_3") == std::string::npos);
  out = text_of({"homology", data("empty.facets").string()});
  CHECK(out.find("H_") == std::string::npos);
  CHECK(out.find("Euler characteristic: 0") != std::string::npos);
}

}  // namespace cli_human_test

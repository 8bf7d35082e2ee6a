// --reduction: every kind gives the same groups (the groups of a chain complex do not depend
// on the homology-preserving reduction run before the algebra: Kaczynski, Mrozek & Ślusarek
// 1998; Forman 1998, Theorem 8.2), on a cell list with torsion, an image, a volume and a
// random 12^3 volume whose groups are checked against Alexander duality
// (tests/cubical/volume_support.hpp: b0, b2 by union-find, b1 = b0 + b2 - chi; Hatcher 2002,
// Corollary 3.46); a kind that does not exist is an error of use.
#include "json_checks.hpp"

#include "../cubical/volume_support.hpp"

#include <string>
#include <vector>

namespace cli_reduction_test {

using namespace cli_test;

namespace {

const std::vector<std::string> kinds = {"auto", "none", "collapses", "coreductions", "both", "morse"};

std::vector<group> groups_with(const std::string& kind, const std::string& file, const std::string& coefficients = "Z") {
  return groups_of(parse_result(run({"homology", "--json", "--reduction", kind, "--coefficients", coefficients, file})));
}

}  // namespace

TEST_CASE("--reduction: the same groups whatever the kind") {
  temp_dir dir;
  const auto volume = lacuna_volumes::coin_flip_volume(12, 0.5, 5);
  const std::string nrrd = (dir.path() / "coin.nrrd").string();
  lacuna_volumes::write_nrrd(nrrd, volume);
  const auto d = lacuna_volumes::duality_betti(volume);
  const std::vector<std::string> files = {data("klein_bottle.cells").string(), data("torus.cells").string(),
                                          dir.write("ring.pbm", "P1\n3 3\n1 1 1\n1 0 1\n1 1 1\n"), nrrd};
  for (const auto& f : files) {
    CAPTURE(f);
    const auto want = groups_with("both", f);
    for (const auto& k : kinds) {
      CAPTURE(k);
      CHECK(groups_with(k, f) == want);
      CHECK(groups_with(k, f, "Z/2").size() == want.size());
    }
  }
  const auto g = groups_with("morse", nrrd);
  REQUIRE(g.size() == 4);
  CHECK(g[0].rank == d.b0);
  CHECK(g[1].rank == d.b1);
  CHECK(g[2].rank == d.b2);
  // the Klein bottle: H_1 = Z + Z/2 (Hatcher 2002, Example 2.37, from memory) under every kind
  for (const auto& k : kinds) CHECK(groups_with(k, data("klein_bottle.cells").string())[1].torsion.size() == 1);
}

TEST_CASE("--reduction with a kind that does not exist is an error of use") {
  const auto r = run({"homology", "--reduction", "fast", data("torus.cells").string()});
  CHECK(r.status == 2);
  CHECK(r.out.empty());
  CHECK(r.err.find("--reduction") != std::string::npos);
}

}  // namespace cli_reduction_test

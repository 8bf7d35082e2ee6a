// lacuna homology --check: the identities it prints (Euler characteristic; universal
// coefficients over a field), their values recomputed here from the tool's own integral groups
// by the formula of Hatcher 2002, Theorem 3A.3, on textbook and random complexes.
#include "json_checks.hpp"
#include "run.hpp"

#include <cstdint>
#include <random>
#include <set>
#include <string>
#include <vector>

namespace cli_check_test {

using namespace cli_test;

namespace {

/// Runs homology --check --json and checks the layout: the fixed keys (and "relative_to",
/// "reduced" where given), then "checks", every identity holding with equal sides.
ordered_json run_check(const std::vector<std::string>& extra, const std::string& file) {
  std::vector<std::string> args{"homology", "--json", "--check"};
  args.insert(args.end(), extra.begin(), extra.end());
  args.push_back(file);
  const auto r = run(args);
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  const ordered_json j = ordered_json::parse(r.out);
  std::vector<std::string> keys;
  for (auto it = j.begin(); it != j.end(); ++it)
    if (it.key() != "relative_to" && it.key() != "reduced") keys.push_back(it.key());
  REQUIRE(keys == std::vector<std::string>{"coefficients", "cells", "euler_characteristic", "homology", "checks"});
  for (const auto& c : j["checks"]) {
    std::vector<std::string> ck;
    for (auto it = c.begin(); it != c.end(); ++it) ck.push_back(it.key());
    CHECK(ck == std::vector<std::string>{"statement", "predicted", "computed", "holds"});
    CHECK(c["holds"] == true);
    CHECK(c["predicted"] == c["computed"]);
  }
  return j;
}

/// The universal-coefficient dimensions over Z/p (p = 0: over Q) from integral groups
/// (Hatcher 2002, Theorem 3A.3): rank H_k + #{p | t, t in torsion H_k} + the same for H_{k-1}.
std::vector<std::uint64_t> predicted_dims(const std::vector<group>& z, std::uint64_t p) {
  std::vector<std::uint64_t> out;
  for (std::size_t k = 0; k < z.size(); ++k) {
    std::uint64_t d = z[k].rank;
    if (p != 0) {
      for (auto t : z[k].torsion) d += t % p == 0 ? 1 : 0;
      if (k > 0)
        for (auto t : z[k - 1].torsion) d += t % p == 0 ? 1 : 0;
    }
    out.push_back(d);
  }
  return out;
}

void check_against_integers(const std::string& file, const std::vector<std::string>& extra = {}) {
  std::vector<std::string> zargs{"homology", "--json"};
  zargs.insert(zargs.end(), extra.begin(), extra.end());
  zargs.push_back(file);
  const auto zr = run(zargs);
  REQUIRE(zr.status == 0);
  const auto z = groups_of(ordered_json::parse(zr.out));
  for (const auto& [name, p] : std::vector<std::pair<std::string, std::uint64_t>>{{"Q", 0}, {"Z/2", 2}, {"Z/3", 3}}) {
    CAPTURE(name);
    std::vector<std::string> args = extra;
    args.insert(args.end(), {"--coefficients", name});
    const auto j = run_check(args, file);
    const auto expected = predicted_dims(z, p);
    const auto& checks = j["checks"];
    REQUIRE(checks.size() == 1 + z.size());  // χ, then one per dimension
    for (std::size_t k = 0; k < z.size(); ++k) {
      CAPTURE(k);
      CHECK(checks[1 + k]["predicted"] == expected[k]);
      CHECK(j["homology"][k]["rank"] == expected[k]);
      CHECK(checks[1 + k]["computed"] == j["homology"][k]["rank"]);
      CHECK(checks[1 + k]["statement"].get<std::string>().rfind("dim H", 0) == 0);
    }
  }
}

}  // namespace

TEST_CASE("over Z: the Euler characteristic, one identity") {
  // torsion_mix: H_0 = Z, H_1 = (Z/2)^2 + Z/12, H_2 = 0; χ = 1 - 3 + 3 = 1 (cells) = 1 (ranks)
  const auto j = run_check({}, data("torsion_mix.cells").string());
  REQUIRE(j["checks"].size() == 1);
  CHECK(j["checks"][0]["predicted"] == 1);
  CHECK(j["checks"][0]["statement"].get<std::string>().find("rank H_k") != std::string::npos);
}

TEST_CASE("over Z/2, Z/3 and Q: each dimension against universal coefficients") {
  // torsion_mix over Z/2: H_1 has dimension 3 (three even factors) and H_2 dimension 3 (Tor),
  // over Z/3: 1 and 1 (the factor 12) — Hatcher 2002, Theorem 3A.3 (from memory)
  for (const char* name : {"torsion_mix.cells", "projective_plane.cells", "klein_bottle.cells", "rp2_6.facets",
                           "torus.cells"}) {
    CAPTURE(name);
    check_against_integers(data(name).string());
  }
  const auto j = run_check({"--coefficients", "Z/2"}, data("torsion_mix.cells").string());
  CHECK(j["homology"][1]["rank"] == 3);
  CHECK(j["homology"][2]["rank"] == 3);
}

TEST_CASE("on random complexes, with --reduced and --relative") {
  std::mt19937 rng(31203);
  std::uniform_int_distribution<int> coef(-6, 6);
  temp_dir d;
  for (int trial = 0; trial < 8; ++trial) {
    // one vertex, three loops, three 2-cells with random boundaries: torsion of many kinds
    std::string text = "0 v\n1 a : v - v\n1 b : v - v\n1 c : v - v\n";
    for (int i = 0; i < 3; ++i) {
      std::string b;
      for (const char* e : {"a", "b", "c"}) {
        const int x = coef(rng);  // a zero coefficient is not written (docs/formats.md)
        if (x != 0) b += (x < 0 ? " - " : " + ") + std::to_string(x < 0 ? -x : x) + "*" + e;
      }
      text += "2 f" + std::to_string(i) + " : " + (b.empty() ? "0" : b) + "\n";
    }
    CAPTURE(text);
    const auto file = d.write("x.cells", text);
    check_against_integers(file);
    check_against_integers(file, {"--reduced"});
    const auto sub = d.write("s.cells", "0 v\n1 a : v - v\n");
    check_against_integers(file, {"--relative", sub});
  }
}

TEST_CASE("with --generators, and in the text output") {
  run_check({"--generators", "--coefficients", "Z/2"}, data("klein_bottle.cells").string());
  const auto r = run({"homology", "--check", "--coefficients", "Z/2", data("klein_bottle.cells").string()});
  REQUIRE(r.status == 0);
  CHECK(r.out.find("\nH_2 = Z/2\ncheck: χ from the cells = Σ (-1)^k dim H_k: 0 = 0\n") != std::string::npos);
  CHECK(r.out.find("check: dim H_1(Z/2) = rank H_1(Z) + #{2 | torsion of H_1(Z)} + #{2 | torsion of H_0(Z)}: 2 = 2\n") !=
        std::string::npos);
  // the reduced Euler identity: χ − 1 = Σ (-1)^k rank H~_k
  const auto reduced = run_check({"--reduced"}, data("klein_bottle.cells").string());
  CHECK(reduced["checks"][0]["predicted"] == -1);
  // without --check, no "checks" key: the fixed layout of docs/formats.md
  CHECK(run({"homology", "--json", data("klein_bottle.cells").string()}).out.find("checks") == std::string::npos);
}

TEST_CASE("the example of docs/cli.md, *Checks*, byte for byte") {
  const std::string file = data("klein_bottle.cells").string();
  const auto r = run({"homology", "--check", "--coefficients", "Z/2", file});
  REQUIRE(r.status == 0);
  CHECK(r.out == "homology of " + file +
                     " over Z/2\n"
                     "cells: 1 in dimension 0, 2 in dimension 1, 1 in dimension 2\n"
                     "Euler characteristic: 0\n"
                     "H_0 = Z/2\nH_1 = (Z/2)^2\nH_2 = Z/2\n"
                     "check: χ from the cells = Σ (-1)^k dim H_k: 0 = 0\n"
                     "check: dim H_0(Z/2) = rank H_0(Z) + #{2 | torsion of H_0(Z)}: 1 = 1\n"
                     "check: dim H_1(Z/2) = rank H_1(Z) + #{2 | torsion of H_1(Z)} + #{2 | torsion of H_0(Z)}: 2 = 2\n"
                     "check: dim H_2(Z/2) = rank H_2(Z) + #{2 | torsion of H_2(Z)} + #{2 | torsion of H_1(Z)}: 1 = 1\n");
}

}  // namespace cli_check_test

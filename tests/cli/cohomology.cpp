// lacuna cohomology: textbook groups, the JSON layout (docs/formats.md, *Cohomology*), cocycle
// generators checked to be cocycles by the test itself, the universal coefficient theorem
// between the tool's cohomology and its homology on random complexes, and the refusals.
#include "json_checks.hpp"
#include "run.hpp"

#include <cstdint>
#include <fstream>
#include <map>
#include <random>
#include <regex>
#include <set>
#include <sstream>
#include <string>
#include <vector>

namespace cli_cohomology_test {

using namespace cli_test;

namespace {

/// Parses a cohomology result and checks its layout: the keys of the homology JSON with
/// "cohomology" in place of "homology", one entry per dimension 0..top, χ from the cells
/// equal to the alternating sum of the ranks, cochains under "cochain" with --generators.
ordered_json parse_cohomology(const result& r, bool generators = false) {
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  const ordered_json j = ordered_json::parse(r.out);
  REQUIRE(j.is_object());
  std::vector<std::string> keys;
  for (auto it = j.begin(); it != j.end(); ++it) keys.push_back(it.key());
  REQUIRE(keys == std::vector<std::string>{"coefficients", "cells", "euler_characteristic", "cohomology"});
  const auto& cells = j["cells"];
  const auto& h = j["cohomology"];
  REQUIRE(h.size() == cells.size());
  std::int64_t chi_cells = 0, chi_ranks = 0;
  for (std::size_t k = 0; k < h.size(); ++k) {
    std::vector<std::string> ek;
    for (auto it = h[k].begin(); it != h[k].end(); ++it) ek.push_back(it.key());
    std::vector<std::string> expected{"dimension", "rank", "torsion"};
    if (generators) expected.push_back("generators");
    CHECK(ek == expected);
    CHECK(h[k]["dimension"] == k);
    const auto sign = k % 2 == 0 ? 1 : -1;
    chi_cells += sign * cells[k].get<std::int64_t>();
    chi_ranks += sign * h[k]["rank"].get<std::int64_t>();
    if (generators) {
      const auto& g = h[k]["generators"];
      REQUIRE(g.size() == h[k]["rank"].get<std::size_t>() + h[k]["torsion"].size());
      for (std::size_t i = 0; i < g.size(); ++i) {
        std::vector<std::string> gk;
        for (auto it = g[i].begin(); it != g[i].end(); ++it) gk.push_back(it.key());
        CHECK(gk == std::vector<std::string>{"order", "cochain"});
        // free summands first (order 0), then one per torsion factor, in the order of torsion
        const std::size_t rank = h[k]["rank"].get<std::size_t>();
        if (i < rank)
          CHECK(g[i]["order"] == 0);
        else
          CHECK(g[i]["order"] == h[k]["torsion"][i - rank]);
      }
    }
  }
  // Euler characteristic: the alternating sum of the cell counts, and of the ranks of the
  // cohomology groups (Hatcher 2002, Theorem 2.44 with Theorem 3.2: rank H^n = rank H_n)
  CHECK(j["euler_characteristic"].get<std::int64_t>() == chi_cells);
  CHECK(chi_ranks == chi_cells);
  return j;
}

std::vector<group> groups_in(const ordered_json& j, const char* key) {
  std::vector<group> out;
  for (const auto& e : j[key]) {
    group g{e["rank"].get<std::uint64_t>(), {}};
    for (const auto& t : e["torsion"]) g.torsion.push_back(t.get<std::uint64_t>());
    out.push_back(g);
  }
  return out;
}

std::vector<group> cohomology_of(const std::string& file, const std::vector<std::string>& extra = {}) {
  std::vector<std::string> args{"cohomology", "--json"};
  args.insert(args.end(), extra.begin(), extra.end());
  args.push_back(file);
  return groups_in(parse_cohomology(run(args)), "cohomology");
}

std::vector<group> homology_of(const std::string& file, const std::vector<std::string>& extra = {}) {
  std::vector<std::string> args{"homology", "--json"};
  args.insert(args.end(), extra.begin(), extra.end());
  args.push_back(file);
  return groups_of(parse_result(run(args)));
}

/// The boundaries of a .cells file as the test reads it (docs/formats.md grammar): per
/// dimension, cell name -> (face name -> coefficient).
using boundary_map = std::map<int, std::map<std::string, std::map<std::string, std::int64_t>>>;

boundary_map read_cells(const std::string& path) {
  boundary_map m;
  std::ifstream f(path);
  static const std::regex term(R"(([+-]?)(?:(\d+)\*)?([A-Za-z_][A-Za-z0-9_.']*))");
  for (std::string l; std::getline(f, l);) {
    if (auto h = l.find('#'); h != std::string::npos) l.erase(h);
    std::istringstream in(l);
    int dim = -1;
    std::string name, rest, s;
    if (!(in >> dim >> name)) continue;
    auto& b = m[dim][name];
    std::getline(in, rest);
    for (char ch : rest)
      if (ch != ' ' && ch != '\t' && ch != '\r' && ch != ':') s += ch;
    if (dim == 0 || s == "0") continue;
    for (std::sregex_iterator it(s.begin(), s.end(), term), end; it != end; ++it) {
      std::int64_t c = (*it)[2].matched ? std::stoll((*it)[2].str()) : 1;
      if ((*it)[1] == "-") c = -c;
      b[(*it)[3].str()] += c;
    }
  }
  return m;
}

/// The coboundary of the k-cochain `f` (cell name -> value), evaluated on every (k+1)-cell.
std::map<std::string, std::int64_t> coboundary(const boundary_map& m, int k, const std::map<std::string, std::int64_t>& f) {
  std::map<std::string, std::int64_t> out;
  if (!m.contains(k + 1)) return out;
  for (const auto& [cell, faces] : m.at(k + 1)) {
    std::int64_t v = 0;
    for (const auto& [face, c] : faces)
      if (auto it = f.find(face); it != f.end()) v += c * it->second;
    out[cell] = v;
  }
  return out;
}

/// Random facet lists on `vertices` vertices: `count` simplices of 2 to `max_size` vertices.
std::string random_facets(std::mt19937& rng, int vertices, int count, int max_size) {
  std::string text;
  std::uniform_int_distribution<int> size(2, max_size), vertex(0, vertices - 1);
  for (int i = 0; i < count; ++i) {
    std::set<int> s;
    const int n = size(rng);
    while (static_cast<int>(s.size()) < n) s.insert(vertex(rng));
    for (int v : s) text += "v" + std::to_string(v) + " ";
    text += "\n";
  }
  return text;
}

/// A random cell list with torsion: one vertex, `loops` loops, and 2-cells whose boundaries
/// are random integer combinations of the loops (any such chain is a cycle: every loop has
/// boundary v - v = 0), each twice (d_i and D_i, the same boundary), and one 3-cell whose
/// boundary is a multiple of the 2-cycle d0 - D0.
std::string random_cells(std::mt19937& rng, int loops, int discs) {
  std::uniform_int_distribution<int> coef(-4, 4);
  std::string text = "0 v\n";
  for (int i = 0; i < loops; ++i) text += "1 e" + std::to_string(i) + " : v - v\n";
  for (int i = 0; i < discs; ++i) {
    std::string b;
    for (int j = 0; j < loops; ++j) {
      const int c = coef(rng);
      if (c != 0) b += (c < 0 ? " - " : " + ") + std::to_string(c < 0 ? -c : c) + "*e" + std::to_string(j);
    }
    text += "2 d" + std::to_string(i) + " : " + (b.empty() ? "0" : b) + "\n";
    text += "2 D" + std::to_string(i) + " : " + (b.empty() ? "0" : b) + "\n";  // the same boundary: d - D is a 2-cycle
  }
  // m*(d0 - D0) is a 2-cycle; a multiple m > 1 leaves Z/m in H_2 (and in H^3)
  const std::string m = std::to_string(std::uniform_int_distribution<int>(1, 3)(rng));
  if (discs > 0) text += "3 w : " + m + "*d0 - " + m + "*D0\n";
  return text;
}

}  // namespace

TEST_CASE("the projective plane: H^0 = Z, H^1 = 0, H^2 = Z/2 (torsion one degree up)") {
  // Hatcher 2002, Theorem 3.2 and the example of RP^n after it (from memory): H^1(RP^2; Z) = 0,
  // H^2(RP^2; Z) = Z/2, while H_1 = Z/2, H_2 = 0. Both models of tests/data/cli.
  const std::vector<group> expected{{1, {}}, {0, {}}, {0, {2}}};
  CHECK(cohomology_of(data("projective_plane.cells").string()) == expected);
  CHECK(cohomology_of(data("rp2_6.facets").string()) == expected);
  // over a field of characteristic 2 every degree is Z/2; over Q and Z/3 only H^0 survives
  const std::vector<group> mod2{{1, {}}, {1, {}}, {1, {}}}, rational{{1, {}}, {0, {}}, {0, {}}};
  CHECK(cohomology_of(data("rp2_6.facets").string(), {"--coefficients", "Z/2"}) == mod2);
  CHECK(cohomology_of(data("rp2_6.facets").string(), {"--coefficients", "Q"}) == rational);
  CHECK(cohomology_of(data("projective_plane.cells").string(), {"--coefficients", "Z/3"}) == rational);
}

TEST_CASE("the Klein bottle and the torus") {
  // Hatcher 2002 (from memory): the Klein bottle has H^1 = Z, H^2 = Z/2 (H_1 = Z + Z/2, H_2 = 0);
  // the torus H^0 = Z, H^1 = Z^2, H^2 = Z.
  CHECK(cohomology_of(data("klein_bottle.cells").string()) == std::vector<group>{{1, {}}, {1, {}}, {0, {2}}});
  CHECK(cohomology_of(data("torus.cells").string()) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(cohomology_of(data("klein_bottle.cells").string(), {"--coefficients", "Z/2"}) ==
        std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
}

TEST_CASE("--generators: every cochain is a cocycle, torsion ones are not coboundaries") {
  for (const char* name : {"projective_plane.cells", "klein_bottle.cells", "torus.cells", "torsion_mix.cells"}) {
    CAPTURE(name);
    const std::string file = data(name).string();
    const auto m = read_cells(file);
    const auto j = parse_cohomology(run({"cohomology", "--json", "--generators", file}), true);
    for (const auto& e : j["cohomology"]) {
      const int k = e["dimension"].get<int>();
      for (const auto& g : e["generators"]) {
        std::map<std::string, std::int64_t> f;
        for (const auto& t : g["cochain"]) {
          REQUIRE(m.at(k).contains(t[1].get<std::string>()));  // a k-cell of the file
          f[t[1].get<std::string>()] = t[0].get<std::int64_t>();
        }
        CHECK(!f.empty());
        for (const auto& [cell, v] : coboundary(m, k, f)) {
          CAPTURE(cell);
          CHECK(v == 0);  // δf = 0: a cocycle
        }
      }
    }
  }
  // In the one-cell projective plane and the Klein bottle, the coboundaries in degree 2 are
  // the even multiples of the 2-cell's dual (δq* = 2r*; δa* = 2K*, δb* = 0), so a torsion
  // generator of H^2 must take an odd value on it.
  for (const auto& [name, top] : std::vector<std::pair<std::string, std::string>>{{"projective_plane.cells", "r"},
                                                                                   {"klein_bottle.cells", "K"}}) {
    const auto j = parse_cohomology(run({"cohomology", "--json", "--generators", data(name).string()}), true);
    const auto& g = j["cohomology"][2]["generators"];
    REQUIRE(g.size() == 1);
    CHECK(g[0]["order"] == 2);
    REQUIRE(g[0]["cochain"].size() == 1);
    CHECK(g[0]["cochain"][0][1] == top);
    CHECK(g[0]["cochain"][0][0].get<std::int64_t>() % 2 != 0);
  }
}

TEST_CASE("the text output") {
  const auto r = run({"cohomology", "--generators", data("klein_bottle.cells").string()});
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  CHECK(r.out.rfind("cohomology of " + data("klein_bottle.cells").string() + " over Z\n", 0) == 0);
  CHECK(r.out.find("\nH^1 = Z\n") != std::string::npos);
  CHECK(r.out.find("\nH^2 = Z/2\n  generator (order 2): ") != std::string::npos);
  CHECK(r.out.find("H_") == std::string::npos);
}

TEST_CASE("the examples of docs/cli.md, *Cohomology*, byte for byte") {
  // The page's examples, run on the files of tests/data/cli (named there without a directory).
  const std::string rp2 = data("projective_plane.cells").string();
  auto r = run({"cohomology", rp2});
  REQUIRE(r.status == 0);
  CHECK(r.out ==
        "cohomology of " + rp2 +
            " over Z\ncells: 1 in dimension 0, 1 in dimension 1, 1 in dimension 2\nEuler characteristic: 1\n"
            "H^0 = Z\nH^1 = 0\nH^2 = Z/2\n");
  r = run({"cohomology", "--json", "--generators", data("torus.cells").string()});
  REQUIRE(r.status == 0);
  CHECK(r.out == R"({
  "coefficients": "Z",
  "cells": [1, 3, 2],
  "euler_characteristic": 0,
  "cohomology": [
    {"dimension": 0, "rank": 1, "torsion": [], "generators": [
      {"order": 0, "cochain": [[1, "v"]]}
    ]},
    {"dimension": 1, "rank": 2, "torsion": [], "generators": [
      {"order": 0, "cochain": [[-1, "a"], [1, "b"]]},
      {"order": 0, "cochain": [[1, "a"], [1, "c"]]}
    ]},
    {"dimension": 2, "rank": 1, "torsion": [], "generators": [
      {"order": 0, "cochain": [[1, "L"]]}
    ]}
  ]
}
)");
}

TEST_CASE("universal coefficients: H^n(X; Z) = Z^{rank H_n} + torsion H_{n-1}, on random complexes") {
  // Hatcher 2002, Theorem 3.2 (Ext(H_{n-1}, Z) is the torsion of H_{n-1}, Hom(H_n, Z) free of
  // rank H_n), with homology and cohomology both computed by the tool; over a field F,
  // H^n(X; F) is the dual of H_n(X; F), of the same dimension.
  std::mt19937 rng(20261203);
  temp_dir d;
  for (int trial = 0; trial < 12; ++trial) {
    CAPTURE(trial);
    const bool cells = trial % 2 == 1;
    const std::string text = cells ? random_cells(rng, 2 + trial % 3, 1 + trial % 3) : random_facets(rng, 7, 9, 4);
    CAPTURE(text);
    const std::string file = d.write(cells ? "x.cells" : "x.facets", text);
    const auto h = homology_of(file);
    const auto c = cohomology_of(file);
    REQUIRE(c.size() == h.size());
    for (std::size_t n = 0; n < h.size(); ++n) {
      CAPTURE(n);
      CHECK(c[n].rank == h[n].rank);
      CHECK(c[n].torsion == (n > 0 ? h[n - 1].torsion : std::vector<std::uint64_t>{}));
    }
    for (const char* f : {"Q", "Z/2", "Z/3"}) {
      CAPTURE(f);
      const auto hf = homology_of(file, {"--coefficients", f});
      const auto cf = cohomology_of(file, {"--coefficients", f});
      CHECK(cf == hf);
    }
  }
}

TEST_CASE("refused: --relative and --reduced, with exit status 2 and one line") {
  const std::string file = data("torus.cells").string();
  CHECK(expect_error(run({"cohomology", "--relative", file, file})).find("--relative is not offered") != std::string::npos);
  CHECK(expect_error(run({"cohomology", "--reduced", file})).find("--reduced is not offered") != std::string::npos);
  CHECK(expect_error(run({"cohomology", "--coefficients", "Z/4", file})) == "lacuna: --coefficients Z/4: 4 is not a prime");
  CHECK(expect_error(run({"cohomology"})).rfind("lacuna: ", 0) == 0);
}

TEST_CASE("the empty complex") {
  const auto j = parse_cohomology(run({"cohomology", "--json", data("empty.facets").string()}));
  CHECK(j["cells"] == ordered_json::parse("[]"));
  CHECK(j["cohomology"] == ordered_json::parse("[]"));
}

}  // namespace cli_cohomology_test

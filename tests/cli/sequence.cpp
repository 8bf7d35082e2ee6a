// lacuna sequence SUB FILE: the long exact sequence of a pair, as text and as JSON
// (docs/maps-and-sequences.md fixes the layout).
#include "run.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <string>
#include <vector>

namespace cli_sequence_test {

using namespace cli_test;
using json = nlohmann::ordered_json;

namespace {

// The five-vertex Möbius band (5 triangles, 10 edges; the edges i i+1 are interior) and its
// boundary, the single circle 1 3 5 2 4.
const char* const moebius = "1 2 3\n2 3 4\n3 4 5\n4 5 1\n5 1 2\n";
const char* const moebius_boundary = "1 3\n3 5\n5 2\n2 4\n4 1\n";
const char* const hexagon_disk = "o 1 2\no 2 3\no 3 4\no 4 5\no 5 6\no 6 1\n";
const char* const hexagon_circle = "1 2\n2 3\n3 4\n4 5\n5 6\n6 1\n";

json sequence_json(const std::string& sub, const std::string& file, const std::string& coefficients = "Z") {
  const auto r = run({"sequence", "--json", "--coefficients", coefficients, sub, file});
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  const json j = json::parse(r.out);
  std::vector<std::string> keys;
  for (auto it = j.begin(); it != j.end(); ++it) keys.push_back(it.key());
  CHECK(keys == std::vector<std::string>{"coefficients", "space", "subcomplex", "groups", "maps", "exact", "failures"});
  CHECK(j["space"] == file);
  CHECK(j["subcomplex"] == sub);
  // maps[a] goes from groups[a] to groups[a+1]; its matrix has one row per coordinate of the
  // target and one entry per coordinate of the source in every row.
  const auto& g = j["groups"];
  const auto& m = j["maps"];
  REQUIRE(m.size() + 1 == g.size());
  for (std::size_t a = 0; a < m.size(); ++a) {
    CHECK(m[a]["from"] == a);
    CHECK(m[a]["to"] == a + 1);
    const auto coords = [](const json& e) { return e["rank"].get<std::size_t>() + e["torsion"].size(); };
    CHECK(m[a]["matrix"].size() == coords(g[a + 1]));
    for (const auto& row : m[a]["matrix"]) CHECK(row.size() == coords(g[a]));
    CHECK(g[a]["generators"].size() == coords(g[a]));
  }
  return j;
}

/// The entry of `groups` called name ("H_1(X,A)").
const json& group(const json& j, const std::string& name) {
  for (const auto& e : j["groups"])
    if (e["name"] == name) return e;
  FAIL("no group " << name);
  return j;
}
/// The map called name ("i_*") in dimension n.
const json& map(const json& j, const std::string& name, int n) {
  for (const auto& e : j["maps"])
    if (e["name"] == name && e["dimension"] == n) return e;
  FAIL("no map " << name << " in dimension " << n);
  return j;
}

}  // namespace

TEST_CASE("(Möbius band, boundary circle): i_* on H_1 is multiplication by +-2") {
  // The band deformation retracts onto its core circle and the boundary circle goes around the
  // core twice (Hatcher 2002, Chapter 0, the Möbius band deformation retracts onto its core circle; the boundary wraps twice around it),
  // so i_* : H_1(A) = Z -> H_1(X) = Z is +-2 and, by exactness, H_1(X, A) = Z/2, H_2(X, A) = 0.
  temp_dir d;
  const auto X = d.write("moebius.facets", moebius);
  const auto A = d.write("boundary.facets", moebius_boundary);
  const auto j = sequence_json(A, X);
  CHECK(j["exact"] == true);
  CHECK(j["failures"].empty());
  const auto& i1 = map(j, "i_*", 1)["matrix"];
  REQUIRE(i1.size() == 1);
  REQUIRE(i1[0].size() == 1);
  CHECK((i1[0][0] == 2 || i1[0][0] == -2));
  CHECK(group(j, "H_1(A)")["rank"] == 1);
  CHECK(group(j, "H_1(X)")["rank"] == 1);
  CHECK(group(j, "H_1(X,A)")["rank"] == 0);
  CHECK(group(j, "H_1(X,A)")["torsion"] == json::parse("[2]"));
  CHECK(group(j, "H_2(X,A)")["rank"] == 0);
  // H_0(A) -> H_0(X) is an isomorphism of Z (both connected).
  CHECK(map(j, "i_*", 0)["matrix"] == json::parse("[[1]]"));
  // The generator of H_1(A) is the whole boundary circle: its five edges, named as in FILE.
  const auto& gA = group(j, "H_1(A)")["generators"];
  REQUIRE(gA.size() == 1);
  CHECK(gA[0].size() == 5);
  // (named as in FILE: labels in FILE's vertex order, so "1 4" for SUB's line "4 1")
  std::vector<std::string> edges;
  for (const auto& t : gA[0]) {
    CHECK((t[0] == 1 || t[0] == -1));
    edges.push_back(t[1]);
  }
  std::sort(edges.begin(), edges.end());
  CHECK(edges == std::vector<std::string>{"1 3", "1 4", "2 4", "2 5", "3 5"});

  // Over Z/2 the inclusion is 0 on H_1 (2 = 0), and exactness gives H_2(X, A; Z/2) = H_1(A; Z/2) = Z/2.
  const auto j2 = sequence_json(A, X, "Z/2");
  CHECK(j2["exact"] == true);
  CHECK(map(j2, "i_*", 1)["matrix"] == json::parse("[[0]]"));
  CHECK(group(j2, "H_2(X,A)")["rank"] == 1);
  CHECK(map(j2, "∂_*", 2)["matrix"] == json::parse("[[1]]"));

  const auto text = run({"sequence", A, X});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("H_1(X,A) = Z/2\n") != std::string::npos);
  CHECK((text.out.find("i_*: H_1(A) -> H_1(X) = [2]\n") != std::string::npos ||
         text.out.find("i_*: H_1(A) -> H_1(X) = [-2]\n") != std::string::npos));
  CHECK(text.out.find("exact at every place\n") != std::string::npos);
}

TEST_CASE("(disk, circle): the connecting map H_2(D^2, S^1) -> H_1(S^1) is an isomorphism") {
  // Hatcher 2002, Example 2.23: H_n(D^n, S^{n-1}) = Z and, D^n being contractible, ∂_* is an
  // isomorphism onto H_{n-1}(S^{n-1}) = Z; i_* on H_0 is an isomorphism too.
  temp_dir d;
  const auto X = d.write("disk.facets", hexagon_disk);
  const auto A = d.write("circle.facets", hexagon_circle);
  for (const std::string co : {"Z", "Q", "Z/5"}) {
    CAPTURE(co);
    const auto j = sequence_json(A, X, co);
    CHECK(j["coefficients"] == co);
    CHECK(j["exact"] == true);
    CHECK(group(j, "H_2(X,A)")["rank"] == 1);
    CHECK(group(j, "H_1(A)")["rank"] == 1);
    CHECK(group(j, "H_1(X)")["rank"] == 0);
    const auto& c = map(j, "∂_*", 2)["matrix"];
    const std::string minus_one = co == "Z/5" ? "4" : "-1";
    CHECK((c == json::parse("[[1]]") || c == json::parse("[[" + minus_one + "]]")));
    CHECK(map(j, "i_*", 0)["matrix"] == json::parse("[[1]]"));
  }
  // The same pair as cell lists: one 0-cell, one 1-cell, one 2-cell.
  const auto Xc = d.write("disk.cells", "0 v\n1 e : v - v\n2 D : e\n");
  const auto Ac = d.write("circle.cells", "0 v\n1 e : v - v\n");
  const auto jc = sequence_json(Ac, Xc);
  CHECK(jc["exact"] == true);
  CHECK(map(jc, "∂_*", 2)["matrix"] == json::parse("[[1]]"));  // ∂D = e: the generators D and e
}

TEST_CASE("lacuna sequence: errors follow the contract") {
  temp_dir d;
  const auto X = d.write("edge.cells", "0 v\n0 w\n1 e : w - v\n");
  const auto open = d.write("open.cells", "0 v\n1 e : 0\n");
  const auto line = expect_error(run({"sequence", open, X}));
  CHECK(line.rfind(open + ":2: ", 0) == 0);
  const auto mesh = data("cube.off").string();
  CHECK(expect_error(run({"sequence", mesh, mesh})).find(".facets and .cells") != std::string::npos);
  CHECK(expect_error(run({"sequence", X})).find("lacuna: ") == 0);  // SUB missing
}

}  // namespace cli_sequence_test

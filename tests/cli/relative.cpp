// lacuna homology --relative SUB FILE: the homology of the pair (FILE, SUB), and SUBs that
// are refused (not a subcomplex, a cell FILE lacks, a format without names).
#include "json_checks.hpp"
#include "run.hpp"

#include <string>
#include <vector>

namespace cli_relative_test {

using namespace cli_test;

namespace {

// A hexagon coned off from its centre o: a disk, and its boundary circle 1 2 3 4 5 6.
const char* const hexagon_disk =
    "o 1 2\no 2 3\no 3 4\no 4 5\no 5 6\no 6 1\n";
const char* const hexagon_circle = "1 2\n2 3\n3 4\n# the circle, edge by edge\n4 5\n5 6\n6 1\n";

std::vector<group> relative(const temp_dir& d, const std::string& sub, const std::string& file,
                            const std::vector<std::string>& extra = {}) {
  std::vector<std::string> args{"homology", "--json", "--relative", sub};
  args.insert(args.end(), extra.begin(), extra.end());
  args.push_back(file);
  (void)d;
  const auto j = parse_result(run(args));
  CHECK(j["relative_to"] == sub);  // the path as given
  return groups_of(j);
}

}  // namespace

TEST_CASE("(D^2, S^1) as facet lists: H_2 = Z, H_1 = H_0 = 0") {
  // Hatcher 2002, Example 2.23 / Proposition 2.22: H_n(D^n, S^{n-1}) = H~_n(S^n), which is Z in
  // degree n and 0 elsewhere.
  temp_dir d;
  const auto X = d.write("disk.facets", hexagon_disk);
  const auto A = d.write("circle.facets", hexagon_circle);
  CHECK(relative(d, A, X) == std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
  CHECK(relative(d, A, X, {"--coefficients", "Q"}) == std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
  CHECK(relative(d, A, X, {"--coefficients", "Z/3"}) == std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
  // The cells of the relative chain complex: those of the disk not on the circle (the centre,
  // its six spokes, the six triangles); χ(D^2, S^1) = 1 - 6 + 6 = 1 = χ(D^2) - χ(S^1).
  const auto j = parse_result(run({"homology", "--json", "--generators", "--relative", A, X}), true);
  CHECK(j["cells"] == ordered_json::parse("[1, 6, 6]"));
  CHECK(j["euler_characteristic"] == 1);
  // The generator is a relative cycle: all six triangles of FILE, each with coefficient +-1
  // (the fundamental class of the disk modulo its boundary).
  const auto& gens = j["homology"][2]["generators"];
  REQUIRE(gens.size() == 1);
  CHECK(gens[0]["order"] == 0);
  const auto& ch = gens[0]["chain"];
  REQUIRE(ch.size() == 6);
  for (const auto& t : ch) {
    CHECK((t[0] == 1 || t[0] == -1));
    CHECK(t[1].get<std::string>().rfind("o ", 0) == 0);  // a triangle of FILE, named as there
  }
  const auto text = run({"homology", "--relative", A, X});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("relative to " + A) != std::string::npos);
  CHECK(text.out.find("H_2 = Z\n") != std::string::npos);
  CHECK(text.out.find("H_1 = 0\n") != std::string::npos);
}

TEST_CASE("(D^3, S^2): the tetrahedron and its boundary; and (X, X) and (X, point)") {
  temp_dir d;
  const auto X = d.write("ball.facets", "a b c d\n");
  const auto A = d.write("sphere.facets", "a b c\na b d\na c d\nb c d\n");
  // Hatcher 2002, Example 2.23: H_3(D^3, S^2) = Z, the rest 0.
  CHECK(relative(d, A, X) == std::vector<group>{{0, {}}, {0, {}}, {0, {}}, {1, {}}});
  // (X, X): every relative group is 0 (the relative chain complex is 0).
  const auto same = d.write("same.facets", "d c b a\n");  // the same simplex, labels in another order
  CHECK(relative(d, same, X) == std::vector<group>{{0, {}}, {0, {}}, {0, {}}, {0, {}}});
  // (X, point) for contractible X: H_n(X, x) = H~_n(X) = 0 (Hatcher 2002, §2.1, after Example 2.18).
  const auto pt = d.write("point.facets", "c\n");
  CHECK(relative(d, pt, X) == std::vector<group>{{0, {}}, {0, {}}, {0, {}}, {0, {}}});
}

TEST_CASE("(D^2, S^1) as cell lists, and (RP^2, RP^1)") {
  temp_dir d;
  const auto X = d.write("disk.cells", "0 v\n1 e : v - v\n2 D : e\n");
  const auto A = d.write("circle.cells", "0 v\n1 e : v - v\n");
  CHECK(relative(d, A, X) == std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
  // (RP^2, RP^1): the relative chain complex is one 2-cell with zero boundary, H_2 = Z (cellular
  // homology, Hatcher 2002, §2.2: H_n(X^n, X^{n-1}) is free on the n-cells).
  const auto P = d.write("rp2.cells", "0 p\n1 q : p - p\n2 r : 2*q\n");
  const auto P1 = d.write("rp1.cells", "0 p\n1 q : 0\n");  // q's boundary p - p is 0 in FILE too
  CHECK(relative(d, P1, P) ==
        std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
}

TEST_CASE("a SUB that is not a subcomplex is exit status 2 naming the cell") {
  temp_dir d;
  const auto X = d.write("edge.cells", "0 v\n0 w\n1 e : w - v\n");
  // e is in SUB but its face w (in FILE) is not.
  const auto open = d.write("open.cells", "0 v\n1 e : 0\n");
  const auto line = expect_error(run({"homology", "--relative", open, X}));
  CAPTURE(line);
  CHECK(line.rfind(open + ":2: ", 0) == 0);
  CHECK(line.find("'e'") != std::string::npos);
  CHECK(line.find("'w'") != std::string::npos);
  // A SUB whose own boundary names a cell it does not declare: the reader refuses it.
  const auto undeclared = d.write("undeclared.cells", "0 v\n1 e : w - v\n");
  const auto line2 = expect_error(run({"homology", "--relative", undeclared, X}));
  CAPTURE(line2);
  CHECK(line2.rfind(undeclared + ":2: ", 0) == 0);
  CHECK(line2.find("w") != std::string::npos);
  // A SUB cell with another boundary than in FILE.
  const auto other = d.write("other.cells", "0 v\n0 w\n1 e : v - w\n");
  const auto line3 = expect_error(run({"homology", "--relative", other, X}));
  CAPTURE(line3);
  CHECK(line3.rfind(other + ":3: ", 0) == 0);
  CHECK(line3.find("'e'") != std::string::npos);
}

TEST_CASE("a SUB cell absent from FILE is exit status 2 naming the cell") {
  temp_dir d;
  const auto X = d.write("disk.facets", hexagon_disk);
  const auto A = d.write("bad.facets", "1 2\n# a chord that is not an edge of the disk\n1 4\n");
  const auto line = expect_error(run({"homology", "--relative", A, X}));
  CAPTURE(line);
  CHECK(line.rfind(A + ":3: ", 0) == 0);
  CHECK(line.find("'1 4'") != std::string::npos);
  const auto unknown = d.write("unknown.facets", "1 2\n7\n");  // a vertex FILE lacks
  const auto line2 = expect_error(run({"homology", "--relative", unknown, X}));
  CAPTURE(line2);
  CHECK(line2.rfind(unknown + ":2: ", 0) == 0);
  CHECK(line2.find("'7'") != std::string::npos);

  const auto C = d.write("disk.cells", "0 v\n1 e : v - v\n2 D : e\n");
  const auto S = d.write("sub.cells", "0 v\n0 u\n");
  const auto line3 = expect_error(run({"homology", "--relative", S, C}));
  CAPTURE(line3);
  CHECK(line3.rfind(S + ":2: ", 0) == 0);
  CHECK(line3.find("'u'") != std::string::npos);
  const auto wrongdim = d.write("wrongdim.cells", "0 e\n");
  const auto line4 = expect_error(run({"homology", "--relative", wrongdim, C}));
  CAPTURE(line4);
  CHECK(line4.rfind(wrongdim + ":1: ", 0) == 0);
}

TEST_CASE("--relative: SUB in another format, meshes and images, a missing SUB") {
  temp_dir d;
  const auto X = d.write("disk.facets", hexagon_disk);
  const auto C = d.write("circle.cells", "0 v\n1 e : v - v\n");
  CHECK(expect_error(run({"homology", "--relative", C, X})).rfind(C + ": ", 0) == 0);
  const auto mesh = data("cube.off").string();
  const auto line = expect_error(run({"homology", "--relative", mesh, mesh}));
  CHECK(line.find(".facets and .cells") != std::string::npos);
  CHECK(expect_error(run({"homology", "--relative", (d.path() / "none.facets").string(), X})).find("no such file") !=
        std::string::npos);
}

}  // namespace cli_relative_test

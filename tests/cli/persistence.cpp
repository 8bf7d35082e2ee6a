// `lacuna persistence` against the Persistence section of the tool's contract
// (docs/persistence-cli.md): the JSON layout, the order of the pairs, values as shortest decimals,
// the filtrations of every input kind, --max-dimension, --up-to, --values, --superlevel, the
// pictures, and exit status 2 with one line for every bad input. Expected diagrams are worked
// out by hand beside each case (the Vietoris-Rips filtration of a unit square, the minimum
// spanning tree of points on a line, a hollow triangle, the projective plane over Z/2 and Q
// (Hatcher 2002, Example 2.42: H_1(RP^2; Z) = Z/2, so the 1-cell q is a cycle over Z/2 that the
// 2-cell r kills over Q), a shell of voxels around one voxel (a 2-sphere)).
#include "json_checks.hpp"
#include "run.hpp"

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace persistence_cli_test {

inline std::string pdata(const std::string& name) {
  return (std::filesystem::path(LACUNA_TEST_DATA_DIR) / "persistence" / name).string();
}
inline std::string cdata(const std::string& name) { return cli_test::data(name).string(); }
inline std::string idata(const std::string& name) {
  return (std::filesystem::path(LACUNA_TEST_DATA_DIR) / "image" / name).string();
}

/// The JSON result of a successful run, checked for the layout of the contract: the keys
/// coefficients, filtration, diagrams in this order, one diagram per dimension 0..D in order,
/// each pair [birth, death or null].
inline cli_test::ordered_json json_of(const std::vector<std::string>& args) {
  const auto r = cli_test::run(args);
  INFO(r.err);
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  const auto j = cli_test::ordered_json::parse(r.out);
  std::vector<std::string> keys;
  for (const auto& [k, v] : j.items()) keys.push_back(k);
  CHECK(keys == std::vector<std::string>{"coefficients", "filtration", "diagrams"});
  for (std::size_t k = 0; k < j["diagrams"].size(); ++k) {
    const auto& d = j["diagrams"][k];
    CHECK(d["dimension"] == k);
    for (const auto& p : d["pairs"]) {
      CHECK(p.size() == 2);
      CHECK(p[0].is_number());
      CHECK((p[1].is_number() || p[1].is_null()));
    }
  }
  return j;
}

/// The pairs of dimension k as text, "[b, d]" joined by spaces (deaths null as "null").
inline std::string pairs(const cli_test::ordered_json& j, std::size_t k) {
  std::string s;
  for (const auto& p : j["diagrams"][k]["pairs"]) {
    if (!s.empty()) s += ' ';
    s += p.dump();
  }
  return s;
}

}  // namespace persistence_cli_test

TEST_CASE("persistence: a unit square, the contract's JSON layout exactly") {
  using namespace persistence_cli_test;
  // By hand: four points at the corners of the unit square. Edges of length 1 join them into
  // one component (three deaths at 1) and close a 4-cycle, which the diagonals (sqrt 2) fill.
  const auto r = cli_test::run({"persistence", "--json", pdata("square.points")});
  CHECK(r.status == 0);
  CHECK(r.out ==
        "{\n"
        "  \"coefficients\": \"Z/2\",\n"
        "  \"filtration\": \"vietoris-rips\",\n"
        "  \"diagrams\": [\n"
        "    {\"dimension\": 0, \"pairs\": [[0, 1], [0, 1], [0, 1], [0, null]]},\n"
        "    {\"dimension\": 1, \"pairs\": [[1, 1.4142135623730951]]}\n"
        "  ]\n"
        "}\n");
  // sqrt(2) in double is 1.4142135623730951: the shortest decimal that reads back the same
  CHECK(std::stod("1.4142135623730951") == std::sqrt(2.0));
  // the same square from a CSV file with a header and CRLF line ends
  CHECK(cli_test::run({"persistence", "--json", pdata("square_header.csv")}).out == r.out);
  // and for people
  const auto h = cli_test::run({"persistence", pdata("square.points")});
  CHECK(h.status == 0);
  CHECK(h.out == "persistence of " + pdata("square.points") +
                     " over Z/2 (vietoris-rips filtration)\n"
                     "dimension 0: 4 classes\n"
                     "  born 0, dies 1\n  born 0, dies 1\n  born 0, dies 1\n  born 0, never dies\n"
                     "dimension 1: 1 class\n"
                     "  born 1, dies 1.4142135623730951\n");
}

TEST_CASE("persistence: distance matrices, --max-dimension, --up-to") {
  using namespace persistence_cli_test;
  // points on a line at 0, 1, 3, 6: components merge at the gaps 1, 2, 3 (a minimum spanning
  // tree); no cycle survives (every triangle is filled as soon as its longest edge enters)
  const auto t = json_of({"persistence", "--json", pdata("triangle4.distances")});
  CHECK(t["diagrams"].size() == 2);  // default D = 1
  CHECK(pairs(t, 0) == "[0,1] [0,2] [0,3] [0,null]");
  CHECK(pairs(t, 1) == "");
  CHECK(json_of({"persistence", "--json", pdata("full4.distances")}) == t);
  const auto d0 = json_of({"persistence", "--json", "--max-dimension", "0", pdata("triangle4.distances")});
  CHECK(d0["diagrams"].size() == 1);
  const auto d3 = json_of({"persistence", "--json", "--max-dimension", "3", pdata("square.points")});
  CHECK(d3["diagrams"].size() == 4);  // dimensions 0..3, the top two empty
  CHECK(pairs(d3, 2) == "");
  CHECK(pairs(d3, 3) == "");
  // --up-to 1.2: only edges up to 1.2 (the sides, not the diagonals): the 4-cycle never dies
  const auto u = json_of({"persistence", "--json", "--up-to", "1.2", pdata("square.points")});
  CHECK(pairs(u, 0) == "[0,1] [0,1] [0,1] [0,null]");
  CHECK(pairs(u, 1) == "[1,null]");
  // --up-to 2.5 on the line: the gap of 3 is not crossed, two components never die
  const auto v = json_of({"persistence", "--json", "--up-to", "2.5", pdata("triangle4.distances")});
  CHECK(pairs(v, 0) == "[0,1] [0,2] [0,null] [0,null]");
  // an empty cloud: empty diagrams 0..1
  cli_test::temp_dir dir;
  const auto e = json_of({"persistence", "--json", dir.write("empty.points", "# nothing\n")});
  CHECK(e["diagrams"].size() == 2);
  CHECK(pairs(e, 0) == "");
}

TEST_CASE("persistence: complexes with values, over Z/2 and Q") {
  using namespace persistence_cli_test;
  // hollow triangle x, y, z at 0, 0.5, 1; edges x y at 0.5 (the later vertex), z x at 1,
  // y z listed at 2: y and z are born and killed at once (persistence zero, never printed);
  // the cycle is born at 2 and never dies
  const auto t =
      json_of({"persistence", "--json", "--values", pdata("triangle.values"), cdata("hollow_triangle.facets")});
  CHECK(t["filtration"] == "values");
  CHECK(t["diagrams"].size() == 2);  // default D = the top dimension, 1
  CHECK(pairs(t, 0) == "[0,null]");
  CHECK(pairs(t, 1) == "[2,null]");
  // the projective plane p at 0, q at 1, r (boundary 2q) at 2.5
  const auto z2 =
      json_of({"persistence", "--json", "--values", pdata("projective_plane.values"), cdata("projective_plane.cells")});
  CHECK(pairs(z2, 1) == "[1,null]");  // over Z/2, 2q = 0: q stays a class, and r is one too
  CHECK(pairs(z2, 2) == "[2.5,null]");
  const auto q = json_of({"persistence", "--json", "--coefficients", "Q", "--values", pdata("projective_plane.values"),
                          cdata("projective_plane.cells")});
  CHECK(q["coefficients"] == "Q");
  CHECK(pairs(q, 1) == "[1,2.5]");  // over Q, r kills q
  CHECK(pairs(q, 2) == "");
  const auto z3 = json_of({"persistence", "--json", "--coefficients", "Z/3", "--values",
                           pdata("projective_plane.values"), cdata("projective_plane.cells")});
  CHECK(z3["coefficients"] == "Z/3");
  CHECK(z3["diagrams"] == q["diagrams"]);  // 2 is a unit mod 3
  // --up-to 2: r (at 2.5) is cut off, q never dies
  const auto u = json_of({"persistence", "--json", "--coefficients", "Q", "--up-to", "2", "--values",
                          pdata("projective_plane.values"), cdata("projective_plane.cells")});
  CHECK(pairs(u, 1) == "[1,null]");
  // lower star from the vertices alone; pairs sorted by birth, then death, null last
  cli_test::temp_dir dir;
  const auto f = dir.write("path.facets", "a b\nb c\nc d\nd e\n");
  const auto vals = dir.write("path.values", "a 3\nb 1\nc 4\nd 0\ne 2\n");
  // by hand: minima d (0), b (1), e (2), a (3); b meets d at c (4); e meets d at d e (2, zero
  // persistence), a meets b at a b (3, zero persistence)
  const auto p = json_of({"persistence", "--json", "--values", vals, f});
  CHECK(pairs(p, 0) == "[0,null] [1,4]");
}

TEST_CASE("persistence: images and volumes, sublevel and superlevel") {
  using namespace persistence_cli_test;
  // a 3 x 3 x 3 volume: a shell of 1s around a centre of 0 (tests/data/image/hollow.nrrd)
  const auto sub = json_of({"persistence", "--json", idata("hollow.nrrd")});
  CHECK(sub["filtration"] == "sublevel");
  CHECK(sub["diagrams"].size() == 4);  // dimensions 0..3
  CHECK(pairs(sub, 0) == "[0,null]");
  CHECK(pairs(sub, 2) == "");
  // superlevel: the shell enters first (at 1), a 2-sphere, filled when the centre enters (0);
  // the samples themselves are printed, the birth at least the death
  const auto sup = json_of({"persistence", "--json", "--superlevel", idata("hollow.nrrd")});
  CHECK(sup["filtration"] == "superlevel");
  CHECK(pairs(sup, 0) == "[1,null]");
  CHECK(pairs(sup, 2) == "[1,0]");
  // --up-to 1 with --superlevel keeps values from 1 up: the sphere never dies
  const auto cut = json_of({"persistence", "--json", "--superlevel", "--up-to", "1", idata("hollow.nrrd")});
  CHECK(pairs(cut, 2) == "[1,null]");
  // an image: two wells of 0 in a plateau of 5, joined through a saddle of 3
  cli_test::temp_dir dir;
  const auto img = dir.write("wells.pgm", "P2\n5 1\n9\n0 3 1 5 5\n");
  // by hand (sublevel, the full grid of closed pixels): minima at 0 and 1, merged at 3
  const auto w = json_of({"persistence", "--json", img});
  CHECK(pairs(w, 0) == "[0,null] [1,3]");
  CHECK(pairs(w, 1) == "");
  // --up-to below every sample: nothing enters
  const auto none = json_of({"persistence", "--json", "--up-to", "-1", img});
  CHECK(pairs(none, 0) == "");
}

TEST_CASE("persistence: pictures, and the same result with or without them") {
  using namespace persistence_cli_test;
  cli_test::temp_dir dir;
  const auto d = (dir.path() / "d.svg").string(), b = (dir.path() / "b.svg").string();
  const auto plain = cli_test::run({"persistence", "--json", pdata("square.points")});
  const auto with = cli_test::run({"persistence", "--json", "--diagram", d, "--barcode", b, pdata("square.points")});
  CHECK(with.status == 0);
  CHECK(with.out == plain.out);
  for (const auto& file : {d, b}) {
    std::ifstream in(file);
    std::stringstream ss;
    ss << in.rdbuf();
    const std::string svg = ss.str();
    CHECK(svg.rfind("<?xml", 0) == 0);
    const std::string mark = file == d ? "class=\"mark" : "class=\"bar";
    std::size_t n = 0;
    for (auto at = svg.find(mark); at != std::string::npos; at = svg.find(mark, at + 1)) ++n;
    CHECK(n == 5);  // four classes in dimension 0, one in dimension 1
  }
  // a picture that cannot be written: status 2, nothing on stdout
  const auto line = cli_test::expect_error(
      cli_test::run({"persistence", "--diagram", (dir.path() / "no" / "d.svg").string(), pdata("square.points")}));
  CHECK(line.find("cannot write the file") != std::string::npos);
}

TEST_CASE("persistence: every bad input is exit status 2 and one line") {
  using namespace persistence_cli_test;
  using cli_test::expect_error;
  using cli_test::run;
  const auto sq = pdata("square.points");
  CHECK(expect_error(run({"persistence", "--coefficients", "Z", sq})).find("needs a field") != std::string::npos);
  for (const char* co : {"Z/4", "Z/1", "R", "Z/", "Q/2"}) {
    CAPTURE(co);
    CHECK(expect_error(run({"persistence", "--coefficients", co, sq})).find(co) != std::string::npos);
  }
  CHECK(expect_error(run({"persistence", "--max-dimension", "-1", sq})).find("max-dimension") != std::string::npos);
  CHECK(expect_error(run({"persistence", "--max-dimension", "5000", sq})).find("max-dimension") != std::string::npos);
  CHECK(expect_error(run({"persistence", "--max-dimension", "x", sq})).find("max-dimension") != std::string::npos);
  // One number parser for every option (issue 14 item 1): decimal only, never octal; empty refused.
  CHECK(expect_error(run({"persistence", "--max-dimension", "", sq})).find("the value is empty") != std::string::npos);
  CHECK(expect_error(run({"persistence", "--max-dimension", "0x1", sq})).find("read in base 10") != std::string::npos);
  CHECK(persistence_cli_test::json_of({"persistence", "--json", "--max-dimension", "010", sq}) ==
        persistence_cli_test::json_of({"persistence", "--json", "--max-dimension", "10", sq}));
  CHECK(persistence_cli_test::json_of({"persistence", "--json", "--max-dimension", "01", sq}) ==
        persistence_cli_test::json_of({"persistence", "--json", "--max-dimension", "1", sq}));
  CHECK(expect_error(run({"persistence", "--up-to", ".5", sq})) ==
        "lacuna: --up-to '.5' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  CHECK(expect_error(run({"persistence", "--superlevel", sq})).find("--superlevel applies to images") !=
        std::string::npos);
  CHECK(expect_error(run({"persistence", "--values", pdata("triangle.values"), sq})).find("--values applies") !=
        std::string::npos);
  CHECK(expect_error(run({"persistence", cdata("hollow_triangle.facets")})).find("needs --values") != std::string::npos);
  CHECK(expect_error(run({"persistence", idata("ring.pbm")})).find("unknown file type") != std::string::npos);
  CHECK(expect_error(run({"persistence", pdata("no_such.points")})) == pdata("no_such.points") + ": no such file");
  CHECK(expect_error(run({"persistence"})).find("lacuna: ") == 0);
  // the readers' errors, FILE:LINE: message
  CHECK(expect_error(run({"persistence", pdata("points_ragged.points")})) ==
        pdata("points_ragged.points") +
            ":4: a point with 3 coordinates, but the first point (line 1) has 2: every point needs the same number");
  CHECK(expect_error(run({"persistence", pdata("distances_asymmetric.distances")})).rfind(
            pdata("distances_asymmetric.distances") + ":3: ", 0) == 0);
  CHECK(expect_error(run({"persistence", pdata("points_nul.points")})) ==
        pdata("points_nul.points") + ":2: a control character (byte 0x00) in column 3: the file is not text");
  // value files: errors at their line of VALUES, naming the cell
  const auto tri = cdata("hollow_triangle.facets");
  CHECK(expect_error(run({"persistence", "--values", pdata("values_twice.values"), tri})) ==
        pdata("values_twice.values") + ":3: the cell 'x y' is listed twice (first on line 2)");
  CHECK(expect_error(run({"persistence", "--values", pdata("values_not_simplex.values"), tri})) ==
        pdata("values_not_simplex.values") + ":1: 'x y z' is not a simplex of " + tri);
  const auto rp2 = cdata("projective_plane.cells");
  CHECK(expect_error(run({"persistence", "--values", pdata("values_unknown.values"), rp2})) ==
        pdata("values_unknown.values") + ":2: 's' is not a cell of " + rp2);
  cli_test::temp_dir dir;
  // a cell entering before one of its faces: at the cell's line of VALUES
  const auto early = dir.write("early.values", "p 2\n# q enters before p\nq 1\n");
  CHECK(expect_error(run({"persistence", "--values", early, rp2})) ==
        early + ":3: the 1-cell 'q' enters at 1, before its face 'p' (at 2)");
  // a cell with no value and no faces: at its line of FILE
  const auto novalue = dir.write("novalue.values", "x 0\ny 1\n");
  CHECK(expect_error(run({"persistence", "--values", novalue, tri})) ==
        tri + ":3: the cell 'z' has no value in " + novalue + " and no faces to take one from");
  const auto cells = dir.write("two.cells", "0 a\n0 b\n1 e : b - a\n");
  const auto cv = dir.write("two.values", "a 0\n");
  CHECK(expect_error(run({"persistence", "--values", cv, cells})) ==
        cells + ":2: the cell 'b' has no value in " + cv + " and no faces to take one from");
}

// The error contract of docs/formats.md, for every error class: exit status 2, nothing on
// stdout, exactly one line on stderr, "FILE:LINE: what is wrong" where a line is known.
#include "json_checks.hpp"
#include "run.hpp"

#include <regex>
#include <string>

namespace cli_errors_test {

using namespace cli_test;

namespace {

/// The line starts with "FILE:LINE: " and has a message after it.
void expect_located(const std::string& line, const std::string& file, int line_number) {
  CAPTURE(line);
  const std::string prefix = file + ":" + std::to_string(line_number) + ": ";
  CHECK(line.rfind(prefix, 0) == 0);
  CHECK(line.size() > prefix.size());
}

/// The line starts with "FILE: " (no line is known) and has a message after it.
void expect_file(const std::string& line, const std::string& file) {
  CAPTURE(line);
  CHECK(line.rfind(file + ": ", 0) == 0);
  CHECK(line.size() > file.size() + 2);
}

}  // namespace

TEST_CASE("errors: unknown extension, missing file, a directory") {
  temp_dir dir;
  const auto txt = dir.write("surface.txt", "a b c\n");
  auto line = expect_error(run({"homology", txt}));
  expect_file(line, txt);
  CHECK(line.find(".txt") != std::string::npos);

  const auto missing = (dir.path() / "missing.facets").string();
  line = expect_error(run({"homology", missing}));
  expect_file(line, missing);

  std::filesystem::create_directory(dir.path() / "folder.cells");
  const auto folder = (dir.path() / "folder.cells").string();
  line = expect_error(run({"homology", folder}));
  expect_file(line, folder);
}

TEST_CASE("errors: bad coefficients") {
  const auto f = data("hollow_triangle.facets").string();
  // docs/formats.md: R is Z, Q or Z/p for a prime p; 4 and 0 are not primes, x is not a number, R
  // is not a ring the tool knows, 1 is not a prime, and an empty modulus is nothing
  for (const char* co : {"Z/4", "Z/0", "Z/1", "Z/x", "R", "Z/", "z", "Z/2/3", "Z/-3", "Z/65520"}) {
    CAPTURE(co);
    const auto line = expect_error(run({"homology", "--coefficients", co, f}));
    CHECK(line.find(co) != std::string::npos);  // the message names what was given
  }
}

TEST_CASE("errors: bad command lines") {
  const auto f = data("hollow_triangle.facets").string();
  for (const auto& args : std::vector<std::vector<std::string>>{
           {"homology", "--bogus", f},       // unknown option
           {"homology"},                     // missing FILE
           {"homology", "--json"},           // missing FILE, with an option
           {"homology", f, f},               // two files
           {},                               // no subcommand
           {"homotopy", f},                  // unknown subcommand
           {"homology", "--coefficients"},   // option without its value
           {"homology", "--threshold", "x", f},
       }) {
    std::string joined;
    for (const auto& a : args) joined += a + " ";
    CAPTURE(joined);
    expect_error(run(args));
  }
}

TEST_CASE("errors: --threshold on a file that is not an image or volume") {
  for (const char* name : {"hollow_triangle.facets", "projective_plane.cells", "cube.off", "cube.obj"}) {
    CAPTURE(name);
    const auto line = expect_error(run({"homology", "--threshold", "3", data(name).string()}));
    CHECK(line.find("--threshold") != std::string::npos);
  }
}

TEST_CASE("errors: malformed .facets, with the line") {
  temp_dir dir;
  // docs/formats.md: a label written twice on one line is an error at that line
  auto f = dir.write("repeat.facets", "# a comment\na b\n\nb c b\n");
  expect_located(expect_error(run({"homology", f})), f, 4);
  f = dir.write("repeat_crlf.facets", "a b\r\nc d\r\nx y x\r\n");
  expect_located(expect_error(run({"homology", "--json", f})), f, 3);
}

TEST_CASE("errors: malformed .cells, with the line") {
  temp_dir dir;
  struct bad {
    const char* name;
    const char* text;
    int line;
  };
  for (const auto& b : {
           // a NAME must be declared on an earlier line (docs/formats.md)
           bad{"undeclared.cells", "0 p\n1 q : p - z\n", 2},
           bad{"forward.cells", "0 p\n1 q : p - s\n0 s\n", 2},
           // names are unique
           bad{"twice.cells", "0 p\n0 p\n", 2},
           // the boundary of a boundary must be zero: d(q) = s - p, d(r) = q, dd(r) != 0
           bad{"dd.cells", "0 p\n0 s\n1 q : s - p\n# r is not a disc\n2 r : q\n", 5},
           // syntax: no ':', no '*', a name starting with a digit, a bad term, nothing after ':'
           bad{"colon.cells", "0 p\n1 q p - p\n", 2},
           bad{"star.cells", "0 p\n1 q : 2 p\n", 2},
           bad{"digit.cells", "0 9p\n", 1},
           bad{"term.cells", "0 p\n1 q : p p\n", 2},
           bad{"empty_boundary.cells", "0 p\n1 q :\n", 2},
           // a face of the wrong dimension
           bad{"dimension.cells", "0 p\n1 q : p - p\n2 r : p\n", 3},
           // a 0-cell with a boundary
           bad{"zero_cell.cells", "0 p : 0\n", 1},
       }) {
    CAPTURE(b.name);
    const auto f = dir.write(b.name, b.text);
    const auto line = expect_error(run({"homology", "--json", f}));
    expect_located(line, f, b.line);
    if (std::string(b.name) == "dd.cells") CHECK(line.find("'r'") != std::string::npos);  // names the cell
  }
}

TEST_CASE("errors: damaged images, volumes and meshes") {
  temp_dir dir;
  // a binary PGM that promises 16 bytes of pixels and holds 2: no line for binary data, the
  // message names the file
  auto f = dir.write("truncated.pgm", "P5\n4 4\n255\nab");
  expect_file(expect_error(run({"homology", f})), f);
  // plain PGM with too few samples (line known)
  f = dir.write("short.pgm", "P2\n2 2\n9\n1 2\n3\n");
  expect_error(run({"homology", f}));
  // a PBM pixel that is not 0 or 1, on line 3
  f = dir.write("pixel.pbm", "P1\n2 1\n1 7\n");
  expect_located(expect_error(run({"homology", f})), f, 3);
  // a NRRD header promising 8 bytes of samples before 3
  f = dir.write("lying.nrrd", "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\nabc");
  expect_file(expect_error(run({"homology", f})), f);
  // a NRRD header with 2 sizes for dimension 3: reported at the sizes line, 4
  f = dir.write("sizes.nrrd", "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 2 2\nencoding: raw\n\nabcd");
  expect_located(expect_error(run({"homology", f})), f, 4);
  // gzip data that is not gzip
  f = dir.write("garbage.nrrd", "NRRD0004\ntype: uint8\ndimension: 1\nsizes: 2\nencoding: gzip\n\nnot gzip at all");
  expect_file(expect_error(run({"homology", f})), f);
  // an OFF face using vertex 5 of 3, on line 6
  f = dir.write("index.off", "OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 5\n");
  expect_located(expect_error(run({"homology", f})), f, 6);
  // an OBJ face using vertex 4 of 3, on line 4
  f = dir.write("index.obj", "v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 4\n");
  expect_located(expect_error(run({"homology", f})), f, 4);
  // not an image at all
  f = dir.write("text.pgm", "hello\n");
  expect_located(expect_error(run({"homology", f})), f, 1);
}

TEST_CASE("errors: a short .facets line that implies too many simplices") {
  temp_dir dir;
  // 21 labels on line 2: 2^21 - 1 faces, over the default of 20 labels per line
  std::string labels;
  for (int i = 0; i < 21; ++i) labels += std::string(1, static_cast<char>('a' + i)) + " ";
  const auto f = dir.write("wide.facets", "# one wide simplex\n" + labels + "\n");
  expect_located(expect_error(run({"homology", f})), f, 2);
  // the option moves the limit both ways: a 5-vertex line is refused under 4, read under 5
  // (the 4-simplex is contractible: b0 = 1, nothing else)
  const auto g = dir.write("five.facets", "a b c d e\n");
  expect_located(expect_error(run({"homology", "--max-facet-vertices", "4", g})), g, 1);
  const auto j = parse_result(run({"homology", "--quiet", "--json", "--max-facet-vertices", "5", g}));
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}, {0, {}}, {0, {}}});
  CHECK(cells_of(j) == std::vector<std::uint64_t>{5, 10, 10, 5, 1});  // binomial coefficients C(5, k+1)
  expect_error(run({"homology", "--max-facet-vertices", "-3", f}));
}

TEST_CASE("errors: --max-cells exceeded") {
  temp_dir dir;
  // a 4x4 image has (2*4+1)^2 = 81 grid cells: refused below that, accepted at 81
  const auto img = dir.write("full.pbm", "P1\n4 4\n1111\n1111\n1111\n1111\n");
  expect_error(run({"homology", "--max-cells", "80", img}));
  CHECK(run({"homology", "--max-cells", "81", img}).status == 0);
  // the torus has 6 cells; the third declared cell breaks a limit of 2, on line 5 (after two comment lines)
  const auto torus = data("torus.cells").string();
  expect_located(expect_error(run({"homology", "--max-cells", "2", torus})), torus, 5);
  CHECK(run({"homology", "--max-cells", "6", torus}).status == 0);
  // the hollow triangle has 6 simplices; a limit of 2 refuses its first edge, line 2
  const auto tri = data("hollow_triangle.facets").string();
  expect_located(expect_error(run({"homology", "--max-cells", "2", tri})), tri, 2);
  // the cube mesh: 8 vertices + 6 faces + 24 corners = 38 (read_limits: vertices + faces + corners)
  const auto off = data("cube.off").string();
  expect_error(run({"homology", "--max-cells", "10", off}));
  CHECK(run({"homology", "--max-cells", "1000", off}).status == 0);
  // a volume of 2x2x2 voxels has 5^3 = 125 grid cells
  const auto vol = dir.write("v.nrrd", "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\n" + std::string(8, '\x01'));
  expect_error(run({"homology", "--max-cells", "124", vol}));
  CHECK(run({"homology", "--max-cells", "125", vol}).status == 0);
}

TEST_CASE("errors: a bad --max-cells value") {
  const auto f = data("hollow_triangle.facets").string();
  for (const char* v : {"x", "", "1.5", "-1", "-5"}) {
    CAPTURE(v);
    expect_error(run({"homology", "--max-cells", v, f}));
  }
}

TEST_CASE("errors never look like results: with --json too, and in every coefficient ring") {
  temp_dir dir;
  const auto f = dir.write("bad.cells", "0 p\n1 q : p - z\n");
  for (const char* co : {"Z", "Q", "Z/2", "Z/3"})
    for (bool gens : {false, true}) {
      CAPTURE(co);
      std::vector<std::string> args{"homology", "--json", "--coefficients", co};
      if (gens) args.push_back("--generators");
      args.push_back(f);
      expect_located(expect_error(run(args)), f, 2);
    }
}

}  // namespace cli_errors_test

// Issue 14, "Reliability, second pass": odd but legal-looking input that gave silent wrong
// answers, unbounded reads, messages cut short, and the memory budget. Every expected value
// is worked out by hand beside it (the complexes are a few cells) or is the contract of
// docs/formats.md and docs/cli.md.
#include "json_checks.hpp"
#include "run.hpp"

#include <sys/stat.h>

#include <filesystem>
#include <string>
#include <vector>

namespace cli_reliability_test {

using cli_test::expect_error;
using cli_test::run;
using cli_test::temp_dir;

/// H_k of a --json result as (rank, torsion) per dimension.
inline std::vector<cli_test::group> groups(const cli_test::result& r) {
  REQUIRE(r.status == 0);
  return cli_test::groups_of(cli_test::parse_result(r));
}

/// The JSON cells array.
inline std::vector<std::uint64_t> cells(const cli_test::result& r) {
  REQUIRE(r.status == 0);
  return cli_test::cells_of(cli_test::parse_result(r));
}

/// Runs the tool through sh with an address-space limit of `kib` KiB (ulimit -v).
inline cli_test::result run_limited(std::size_t kib, const std::vector<std::string>& args) {
  std::string cmd = "ulimit -v " + std::to_string(kib) + " && exec \"$0\"";
  for (std::size_t i = 0; i < args.size(); ++i) cmd += " \"$" + std::to_string(i + 1) + "\"";
  std::vector<std::string> argv{"-c", cmd, cli_test::tool().string()};
  argv.insert(argv.end(), args.begin(), args.end());
  return cli_test::run_program("/bin/sh", argv);
}

}  // namespace cli_reliability_test

// ---- 1. numbers: decimal only, one parser for every option ---------------------------------

TEST_CASE("issue 14.1: numeric options are decimal; empty and overflowing values are refused") {
  using namespace cli_reliability_test;
  temp_dir dir;
  // a 3x1 greymap with samples 8, 9, 10: --threshold 010 is ten (one pixel: a square, 4
  // vertices, 4 edges), not eight (octal: three pixels, a 3x1 strip: 8 vertices, 10 edges,
  // 3 squares); counted by hand
  const auto img = dir.write("ramp.pgm", "P2\n3 1\n10\n8 9 10\n");
  CHECK(cells(run({"homology", "--quiet", "--json", "--threshold", "010", img})) == std::vector<std::uint64_t>{4, 4, 1});
  CHECK(cells(run({"homology", "--quiet", "--json", "--threshold", "08", img})) == std::vector<std::uint64_t>{8, 10, 3});
  CHECK(cells(run({"homology", "--quiet", "--json", "--threshold", "+9", img})) == std::vector<std::uint64_t>{6, 7, 2});
  CHECK(cells(run({"homology", "--quiet", "--json", "--threshold", "-0009", img})) == std::vector<std::uint64_t>{8, 10, 3});
  for (const char* bad : {"", "0x8", "8.0", "1e1", " 8", "8 ", "--", "9223372036854775808", "-9223372036854775809"}) {
    CAPTURE(bad);
    const auto line = expect_error(run({"homology", "--threshold", bad, img}));
    CHECK(line.find("--threshold") != std::string::npos);
  }
  CHECK(expect_error(run({"homology", "--threshold", "99999999999999999999999", img})).find("out of range") !=
        std::string::npos);
  // --max-cells 010 is ten: a cell list of 9 cells passes, one of 11 does not
  std::string nine = "0 v0\n", eleven;
  for (int i = 1; i < 5; ++i) nine += "0 v" + std::to_string(i) + "\n1 e" + std::to_string(i) + " : v" + std::to_string(i) + " - v0\n";
  eleven = nine + "0 w\n1 f : w - v0\n";
  const auto f9 = dir.write("nine.cells", nine), f11 = dir.write("eleven.cells", eleven);
  CHECK(run({"homology", "--quiet", "--max-cells", "010", f9}).status == 0);
  expect_error(run({"homology", "--quiet", "--max-cells", "010", f11}));
  CHECK(run({"homology", "--quiet", "--max-cells", "011", f11}).status == 0);
  CHECK(expect_error(run({"homology", "--max-cells", "18446744073709551616", f9})).find("out of range") != std::string::npos);
  expect_error(run({"homology", "--max-cells", "", f9}));
  // --max-facet-vertices 03 is three labels per line
  const auto tri = dir.write("tri.facets", "a b c\n");
  CHECK(run({"homology", "--quiet", "--max-facet-vertices", "03", tri}).status == 0);
  expect_error(run({"homology", "--quiet", "--max-facet-vertices", "02", tri}));
  expect_error(run({"homology", "--max-facet-vertices", "", tri}));
  // the sequence subcommand reads its numbers the same way
  expect_error(run({"sequence", "--max-cells", "", f9, f9}));
}

// ---- 2. a UTF-8 byte-order mark is skipped by every text reader --------------------------

TEST_CASE("issue 14.2: a leading byte-order mark is skipped by every text reader") {
  using namespace cli_reliability_test;
  temp_dir dir;
  const std::string bom = "\xEF\xBB\xBF";
  // the hollow triangle: H_0 = Z, H_1 = Z, 3 vertices and 3 edges
  const std::vector<cli_test::group> circle{{1, {}}, {1, {}}};
  for (const std::string& text : {std::string("x y\ny z\nz x\n"), std::string("# a comment\nx y\ny z\nz x\n")}) {
    const auto f = dir.write("bom.facets", bom + text);
    const auto r = run({"homology", "--quiet", "--json", f});
    CHECK(groups(r) == circle);
    CHECK(cells(r) == std::vector<std::uint64_t>{3, 3});
  }
  // the projective plane from one cell per dimension: H_0 = Z, H_1 = Z/2, H_2 = 0
  const auto rp2 = dir.write("bom.cells", bom + "0 p\n1 q : p - p\n2 r : 2*q\n");
  CHECK(groups(run({"homology", "--quiet", "--json", rp2})) == std::vector<cli_test::group>{{1, {}}, {0, {2}}, {0, {}}});
  // a square as a mesh (one 2-cell): a disk, H_0 = Z
  const auto off = dir.write("bom.off", bom + "OFF\n4 1 0\n0 0 0\n1 0 0\n1 1 0\n0 1 0\n4 0 1 2 3\n");
  CHECK(cells(run({"homology", "--quiet", "--json", off})) == std::vector<std::uint64_t>{4, 4, 1});
  const auto obj = dir.write("bom.obj", bom + "v 0 0 0\nv 1 0 0\nv 1 1 0\nv 0 1 0\nf 1 2 3 4\n");
  CHECK(cells(run({"homology", "--quiet", "--json", obj})) == std::vector<std::uint64_t>{4, 4, 1});
  // one black pixel: a square
  const auto pbm = dir.write("bom.pbm", bom + "P1\n1 1\n1\n");
  CHECK(cells(run({"homology", "--quiet", "--json", pbm})) == std::vector<std::uint64_t>{4, 4, 1});
  const auto pgm = dir.write("bom.pgm", bom + "P5\n1 1\n255\n\x07");
  CHECK(cells(run({"homology", "--quiet", "--json", pgm})) == std::vector<std::uint64_t>{4, 4, 1});
  const auto nrrd = dir.write("bom.nrrd", bom + "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 1 1 1\nencoding: raw\n\n\x01");
  CHECK(cells(run({"homology", "--quiet", "--json", nrrd})) == std::vector<std::uint64_t>{8, 12, 6, 1});
  // SUB too: the hollow triangle relative to the vertex x: H_0 = 0, H_1 = Z
  const auto x = dir.write("x.facets", "x y\ny z\nz x\n");
  const auto sub = dir.write("sub.facets", bom + "x\n");
  CHECK(groups(run({"homology", "--quiet", "--json", "--relative", sub, x})) ==
        std::vector<cli_test::group>{{0, {}}, {1, {}}});
}

// ---- 3. a bare CR is an error naming its line, in every text reader -----------------------

TEST_CASE("issue 14.3: a carriage return alone is refused with its line") {
  using namespace cli_reliability_test;
  temp_dir dir;
  struct bad {
    const char* name;
    std::string text;
    int line;
  };
  for (const auto& b : std::vector<bad>{
           {"cr.facets", "a b\rb c\r", 1},                             // was: one 3-simplex, exit 0
           {"cr2.facets", "a b\nb c\rc d\n", 2},
           {"cr.cells", "0 p\r1 q : p - p\r", 1},
           {"cr.obj", "v 0 0 0\rv 1 0 0\rv 0 1 0\rf 1 2 3\r", 1},  // was: the faces swallowed, exit 0
           {"cr.off", "OFF\r3 1 0\r0 0 0\r1 0 0\r0 1 0\r3 0 1 2\r", 1},
           {"cr.pbm", "P1\n2 1\r1 1\n", 2},
           {"cr.pgm", "P2\n# made\rby hand\n1 1\n1\n1\n", 2},
           {"cr.nrrd", "NRRD0004\ntype: uint8\rdimension: 1\nsizes: 1\nencoding: raw\n\n\x01", 2},
       }) {
    CAPTURE(b.name);
    const auto f = dir.write(b.name, b.text);
    const auto line = expect_error(run({"homology", "--quiet", f}));
    CHECK(line.rfind(f + ":" + std::to_string(b.line) + ": ", 0) == 0);
    CHECK(line.find("CR") != std::string::npos);
  }
  // CRLF is fine: the hollow triangle
  const auto crlf = dir.write("crlf.facets", "x y\r\ny z\r\nz x\r\n");
  CHECK(groups(run({"homology", "--quiet", "--json", crlf})) == std::vector<cli_test::group>{{1, {}}, {1, {}}});
}

// ---- 4. faces as written: a SUB that is not a subcomplex is refused -----------------------

TEST_CASE("issue 14.4: faces whose coefficients cancel are faces, for --relative and sequence") {
  using namespace cli_reliability_test;
  temp_dir dir;
  // X: vertices p, q, a loop s at q (s : q - q); SUB lists s without q: not a subcomplex
  const auto x = dir.write("x.cells", "0 p\n0 q\n1 s : q - q\n");
  const auto sub = dir.write("sub.cells", "0 p\n1 s : 0\n");
  for (const char* cmd : {"homology", "sequence"}) {
    CAPTURE(cmd);
    const auto line = std::string(cmd) == "homology" ? expect_error(run({"homology", "--relative", sub, x}))
                                                     : expect_error(run({"sequence", sub, x}));
    CHECK(line.rfind(sub + ":2: ", 0) == 0);
    CHECK(line.find("'s'") != std::string::npos);
    CHECK(line.find("'q'") != std::string::npos);
  }
  // an edge a : v - v listed as '1 a : 0' without v: refused the same way
  const auto x2 = dir.write("x2.cells", "0 v\n0 w\n1 a : v - v\n");
  const auto sub2 = dir.write("sub2.cells", "0 w\n1 a : 0\n");
  expect_error(run({"homology", "--relative", sub2, x2}));
  // with q in SUB it is a subcomplex: H(X, {q, s}) — X/A is two points p and [A]: H_0 = Z
  // (relative), H_1 = 0 (the loop lies in A); by hand
  const auto good = dir.write("good.cells", "0 q\n1 s : q - q\n");
  CHECK(groups(run({"homology", "--quiet", "--json", "--relative", good, x})) ==
        std::vector<cli_test::group>{{1, {}}, {0, {}}});
}

// ---- 5. JSON is valid UTF-8 whatever the file name ------------------------------------------

TEST_CASE("issue 14.5: a file name that is not UTF-8 gives valid JSON (U+FFFD)") {
  using namespace cli_reliability_test;
  temp_dir dir;
  const auto x = dir.write("x.facets", "x y\ny z\nz x\n");
  const auto sub = dir.write("s\xE9\xFF.facets", "x\n");  // Latin-1 e-acute, and 0xFF
  for (const bool seq : {false, true}) {
    CAPTURE(seq);
    const auto r = seq ? run({"sequence", "--quiet", "--json", sub, x})
                       : run({"homology", "--quiet", "--json", "--relative", sub, x});
    REQUIRE(r.status == 0);
    // nlohmann::json refuses invalid UTF-8 (it throws): parsing is the check
    const auto j = nlohmann::json::parse(r.out);
    const std::string given = seq ? j["subcomplex"].get<std::string>() : j["relative_to"].get<std::string>();
    CHECK(given.find("s\xEF\xBF\xBD\xEF\xBF\xBD.facets") != std::string::npos);  // two U+FFFD
  }
}

// ---- 6. a NUL byte never cuts a message short ------------------------------------------------

TEST_CASE("issue 14.6: a NUL byte in a token is shown as \\x00 and the message goes on") {
  using namespace cli_reliability_test;
  temp_dir dir;
  using namespace std::string_literals;
  struct bad {
    const char* name;
    std::string text;
    const char* rest;  // what the message says after the token
  };
  for (const auto& b : std::vector<bad>{
           {"nul.cells", "0 p\n1 a\0b : p - p\n"s, "in the cell name"},
           {"nul.off", "OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 \0\n3 0 1 2\n"s, "of vertex 2"},
           {"nul.obj", "v 0 0 0\nv 1 0 0\nv 0 1 \0\nf 1 2 3\n"s, "coordinate"},
           {"nul.nrrd", "NRRD0004\ntype: uint\0 8\ndimension: 1\nsizes: 1\nencoding: raw\n\n\x01"s, "is not supported"},
           {"nul.pgm", "P2\n1 1\n2\0\n1\n"s, "maxval"},
       }) {
    CAPTURE(b.name);
    const auto f = dir.write(b.name, b.text);
    const auto line = expect_error(run({"homology", "--quiet", f}));
    CHECK(line.find("\\x00") != std::string::npos);
    CHECK(line.find(b.rest) != std::string::npos);
  }
}

// ---- 8. endless streams: a clear error, bounded memory ---------------------------------------

TEST_CASE("issue 14.8: an endless stream ends in an error at line 1, within 1 GB") {
  using namespace cli_reliability_test;
  temp_dir dir;
  for (const char* ext : {".facets", ".cells", ".off", ".obj", ".nrrd", ".pgm"}) {
    CAPTURE(ext);
    const auto link = (dir.path() / (std::string("zero") + ext)).string();
    std::filesystem::create_symlink("/dev/zero", link);
    // was (.facets, .cells): 2 GB and more, then "read error" without a line, or out of memory
    const auto line = expect_error(run_limited(std::size_t{1} << 20, {"homology", "--quiet", link}));
    CHECK(line.rfind(link + ":1: ", 0) == 0);
  }
  // a pipe that never ends a line
  const auto fifo = (dir.path() / "endless.cells").string();
  REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
  const auto r = cli_test::run_program(
      "/bin/sh", {"-c", "(tr '\\000' x < /dev/zero > \"$1\" 2>/dev/null &) ; ulimit -v 1048576 && exec \"$0\" homology \"$1\"",
                  cli_test::tool().string(), fifo});
  const auto line = expect_error(r);
  CHECK(line.rfind(fifo + ":1: ", 0) == 0);
  CHECK(line.find("longer than") != std::string::npos);
  // endless headers of short lines or of one comment: NRRD through a pipe, a P5 image file
  const auto nrrd = (dir.path() / "endless.nrrd").string();
  REQUIRE(::mkfifo(nrrd.c_str(), 0600) == 0);
  const auto r2 = cli_test::run_program(
      "/bin/sh", {"-c", "((printf 'NRRD0004\\n'; yes '# c') > \"$1\" 2>/dev/null &) ; ulimit -v 1048576 && exec \"$0\" homology \"$1\"",
                  cli_test::tool().string(), nrrd});
  CHECK(expect_error(r2).find("header longer than") != std::string::npos);
  const auto pgm = dir.write("comment.pgm", "P5\n#" + std::string(3 << 20, 'x'));
  CHECK(expect_error(run({"homology", pgm})).find("header longer than") != std::string::npos);
}

// ---- 10. messages of --coefficients ---------------------------------------------------------

TEST_CASE("issue 14.10: Z/ with many leading zeros, and primes above 2^64") {
  using namespace cli_reliability_test;
  const auto f = cli_test::data("projective_plane.cells").string();
  // leading zeros are dropped (docs/cli.md): Z/2 however many; RP^2 over Z/2 has
  // H_0 = H_1 = H_2 = Z/2 (Hatcher 2002, Example 2.42 with universal coefficients)
  const auto r = run({"homology", "--quiet", "--json", "--coefficients", "Z/" + std::string(40, '0') + "2", f});
  REQUIRE(r.status == 0);
  CHECK(cli_test::parse_result(r)["coefficients"] == "Z/2");
  // 2^64 + 13 is a prime (from memory); above 2^62 either way
  for (const char* big : {"Z/18446744073709551629", "Z/340282366920938463463374607431768211507", "Z/4611686018427388039"}) {
    CAPTURE(big);
    CHECK(expect_error(run({"homology", "--coefficients", big, f})).find("must be below 2^62") != std::string::npos);
  }
}

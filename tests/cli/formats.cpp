// The lacuna tool on every input format of docs/formats.md: its own examples, images and
// volumes with cell counts counted by hand, meshes. Each expected value names its source.
#include "json_checks.hpp"

#include <array>
#include <cstdint>
#include <string>

namespace cli_formats_test {

using namespace cli_test;

namespace {

ordered_json homology_json(const std::vector<std::string>& extra, const std::string& file) {
  std::vector<std::string> args{"homology", "--json"};
  args.insert(args.end(), extra.begin(), extra.end());
  args.push_back(file);
  return parse_result(run(args));
}

// ---- a gzip stream by hand: one stored deflate block (RFC 1951 3.2.4), RFC 1952 framing ----
std::uint32_t crc32(std::string_view s) {
  std::uint32_t c = 0xFFFFFFFFu;
  for (unsigned char b : s) {
    c ^= b;
    for (int k = 0; k < 8; ++k) c = (c >> 1) ^ (0xEDB88320u & (0u - (c & 1u)));
  }
  return c ^ 0xFFFFFFFFu;
}
void put_le(std::string& s, std::uint32_t v, int bytes) {
  for (int i = 0; i < bytes; ++i) s.push_back(static_cast<char>((v >> (8 * i)) & 0xFF));
}
std::string gzip_stored(std::string_view data) {
  std::string s("\x1f\x8b\x08\x00\x00\x00\x00\x00\x00\xff", 10);  // magic, deflate, no flags
  s.push_back('\x01');                                             // final block, stored
  const auto n = static_cast<std::uint32_t>(data.size());
  put_le(s, n, 2);
  put_le(s, ~n & 0xFFFFu, 2);
  s.append(data);
  put_le(s, crc32(data), 4);
  put_le(s, n, 4);
  return s;
}

}  // namespace

TEST_CASE("the hollow triangle .facets") {
  const auto j = homology_json({}, data("hollow_triangle.facets").string());
  CHECK(j["coefficients"] == "Z");
  // three vertices and three edges, a circle: H_0 = H_1 = Z (by hand)
  CHECK(cells_of(j) == std::vector<std::uint64_t>{3, 3});
  CHECK(j["euler_characteristic"] == 0);
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {1, {}}});
}

TEST_CASE("the projective plane .cells") {
  const auto j = homology_json({}, data("projective_plane.cells").string());
  // H(RP^2) = Z, Z/2, 0 (Hatcher, Algebraic Topology, 2002, Example 2.42)
  CHECK(cells_of(j) == std::vector<std::uint64_t>{1, 1, 1});
  CHECK(j["euler_characteristic"] == 1);
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {2}}, {0, {}}});
  // the torsion factor is a JSON integer, not a string
  CHECK(j["homology"][1]["torsion"][0].is_number_integer());
}

TEST_CASE("the torus JSON example of docs/cli.md, from a .cells torus") {
  const auto r = run({"homology", "--json", data("torus.cells").string()});
  const auto j = parse_result(r);
  // cells [1, 3, 2] counted in the file, euler_characteristic 0; ranks 1, 2, 1 by the Künneth
  // formula from H(S^1) = Z, Z
  CHECK(j["coefficients"] == "Z");
  CHECK(cells_of(j) == std::vector<std::uint64_t>{1, 3, 2});
  CHECK(j["euler_characteristic"] == 0);
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  // and the same JSON value as the example printed in docs/cli.md
  const auto example = ordered_json::parse(R"({
    "coefficients": "Z",
    "cells": [1, 3, 2],
    "euler_characteristic": 0,
    "homology": [
      {"dimension": 0, "rank": 1, "torsion": []},
      {"dimension": 1, "rank": 2, "torsion": []},
      {"dimension": 2, "rank": 1, "torsion": []}
    ]
  })");
  CHECK(j == example);
}

TEST_CASE("empty and comments-only files are the empty complex") {
  for (const char* name : {"empty.facets", "empty.cells", "comments_only.facets", "comments_only.cells"}) {
    CAPTURE(name);
    const auto j = homology_json({}, data(name).string());
    // docs/formats.md: for the empty complex, cells and homology are both []
    CHECK(j["cells"] == ordered_json::array());
    CHECK(j["homology"] == ordered_json::array());
    CHECK(j["euler_characteristic"] == 0);
  }
}

TEST_CASE(".facets: CRLF line ends, tabs, comments after a simplex; closure of listed faces") {
  temp_dir dir;
  // a solid triangle listed with a redundant edge and vertex: docs/formats.md: listing a face of
  // a simplex already listed changes nothing; a disc: H = Z, 0, 0 (by hand)
  const auto f = dir.write("disc.facets", "a\tb c   # the triangle\r\nb c\r\n\r\na\r\n");
  const auto j = homology_json({}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{3, 3, 1});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
}

TEST_CASE(".facets: the six-vertex projective plane") {
  const auto j = homology_json({}, data("rp2_6.facets").string());
  // 6 vertices, 15 edges, 10 triangles (counted in the file); H = Z, Z/2, 0 (Hatcher, 2002,
  // Example 2.42, for any triangulation of RP^2)
  CHECK(cells_of(j) == std::vector<std::uint64_t>{6, 15, 10});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {2}}, {0, {}}});
}

TEST_CASE(".pbm P1: a ring of 8 pixels, and two pixels meeting at a corner") {
  temp_dir dir;
  // 3x3 ring: all 16 grid points, 24 unit edges, 8 squares (counted by hand); an annulus:
  // H = Z, Z, 0
  auto j = homology_json({}, dir.write("ring.pbm", "P1\n# a comment in the header\n3 3\n1 1 1\n1 0 1\n1 1 1\n"));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{16, 24, 8});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {1, {}}, {0, {}}});
  // P1 samples need not be separated (netpbm's pbm(5), from memory)
  j = homology_json({}, dir.write("packed.pbm", "P1\n3 3\n111101111\n"));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{16, 24, 8});
  // diagonal pixels: 4 + 4 - 1 = 7 vertices, 8 edges, 2 squares; closed squares share the
  // corner, so one component (docs/formats.md: pixels that share only a corner
  // are connected)
  j = homology_json({}, dir.write("diag.pbm", "P1\n2 2\n1 0\n0 1\n"));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{7, 8, 2});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
}

TEST_CASE(".pbm P4: the ring, packed 8 pixels to a byte, most significant bit first") {
  temp_dir dir;
  // rows 111, 101, 111 -> bytes 0xE0, 0xA0, 0xE0; same counts as the P1 ring (by hand)
  const auto j = homology_json({}, dir.write("ring4.pbm", std::string("P4\n3 3\n\xE0\xA0\xE0", 10)));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{16, 24, 8});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {1, {}}, {0, {}}});
}

TEST_CASE(".pgm P2: foreground is non-zero, or at least --threshold") {
  temp_dir dir;
  const auto f = dir.write("row.pgm", "P2\n3 1\n9\n5 0 9\n");
  // pixels 5 and 9 apart: two squares, 8 vertices, 8 edges; two components (by hand)
  auto j = homology_json({}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{8, 8, 2});
  CHECK(groups_of(j) == std::vector<group>{{2, {}}, {0, {}}, {0, {}}});
  // --threshold 6: only the 9; one square, 4 vertices, 4 edges (by hand)
  j = homology_json({"--threshold", "6"}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{4, 4, 1});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  // --threshold 5 (at least T): 5 and 9 again
  j = homology_json({"--threshold", "5"}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{8, 8, 2});
  // --threshold 0: every pixel, a 3x1 strip: 8 vertices, 10 edges, 3 squares (by hand)
  j = homology_json({"--threshold", "0"}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{8, 10, 3});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  // --threshold 10: no pixel; the empty complex (docs/formats.md: cells and homology both [])
  j = homology_json({"--threshold", "10"}, f);
  CHECK(j["cells"] == ordered_json::array());
  CHECK(j["homology"] == ordered_json::array());
}

TEST_CASE(".pgm P5: 8-bit and 16-bit big-endian samples, with and without --threshold") {
  temp_dir dir;
  // 2x2, samples 0 7 / 7 0: two squares at a corner, counts as the diagonal P1 (by hand)
  auto f = dir.write("d8.pgm", std::string("P5\n2 2\n255\n\x00\x07\x07\x00", 15));
  auto j = homology_json({}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{7, 8, 2});
  j = homology_json({"--threshold", "8"}, f);
  CHECK(j["cells"] == ordered_json::array());
  // maxval 1000: 2-byte samples 1000 (0x03E8) and 5: 6 vertices, 7 edges, 2 squares;
  // --threshold 500 keeps one square (by hand)
  f = dir.write("w16.pgm", std::string("P5\n2 1\n1000\n\x03\xE8\x00\x05", 16));
  j = homology_json({}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{6, 7, 2});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  j = homology_json({"--threshold", "500"}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{4, 4, 1});
  // --threshold 1001 (above both samples): nothing
  j = homology_json({"--threshold", "1001"}, f);
  CHECK(j["cells"] == ordered_json::array());
}

TEST_CASE(".nrrd raw: a hollow 3x3x3 block is a sphere; voxels meeting at a corner") {
  temp_dir dir;
  std::string voxels(27, '\x01');
  voxels[13] = '\0';  // the centre (1,1,1)
  const std::string header = "NRRD0004\n# a comment\ntype: uint8\ndimension: 3\nsizes: 3 3 3\nencoding: raw\n\n";
  // 4^3 = 64 vertices, 3*3*4*4 = 144 edges, 3*3*3*4 = 108 squares, 26 cubes (by hand);
  // the boundary of the centre cube stays: S^2, H = Z, 0, Z, 0
  auto j = homology_json({}, dir.write("hollow.nrrd", header + voxels));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{64, 144, 108, 26});
  CHECK(j["euler_characteristic"] == 2);
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}, {0, {}}});
  // voxels (0,0,0) and (1,1,1) of 2x2x2: 8 + 8 - 1 vertices, 24 edges, 12 squares, 2 cubes;
  // connected through the shared corner (docs/formats.md)
  std::string diag(8, '\0');
  diag[0] = diag[7] = '\x01';
  j = homology_json({}, dir.write("diag.nrrd", "NRRD0004\ntype: uchar\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\n" + diag));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{15, 24, 12, 2});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}, {0, {}}});
}

TEST_CASE(".nrrd: 16-bit samples, both byte orders, and --threshold") {
  temp_dir dir;
  // two voxels in a row, samples 256 and 7: 12 vertices, 20 edges, 11 squares, 2 cubes;
  // --threshold 256 keeps one cube: 8, 12, 6, 1 (by hand)
  const std::string head = "NRRD0005\ntype: uint16\ndimension: 3\nsizes: 2 1 1\n";
  const auto big = dir.write("big.nrrd", head + "endian: big\nencoding: raw\n\n" + std::string("\x01\x00\x00\x07", 4));
  const auto little = dir.write("little.nrrd", head + "endian: little\nencoding: raw\n\n" + std::string("\x00\x01\x07\x00", 4));
  for (const auto& f : {big, little}) {
    CAPTURE(f);
    auto j = homology_json({}, f);
    CHECK(cells_of(j) == std::vector<std::uint64_t>{12, 20, 11, 2});
    j = homology_json({"--threshold", "256"}, f);
    CHECK(cells_of(j) == std::vector<std::uint64_t>{8, 12, 6, 1});
    CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}, {0, {}}});
  }
}

TEST_CASE(".nrrd gzip: the hollow block, compressed") {
  temp_dir dir;
  std::string voxels(27, '\x05');
  voxels[13] = '\0';
  const auto f = dir.write("hollow_gz.nrrd", "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 3 3 3\nencoding: gzip\n\n" +
                                                 gzip_stored(voxels));
  // the same counts as the raw hollow block above (by hand)
  const auto j = homology_json({}, f);
  CHECK(cells_of(j) == std::vector<std::uint64_t>{64, 144, 108, 26});
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}, {0, {}}});
  // --threshold 6 (above every sample): the empty complex
  CHECK(homology_json({"--threshold", "6"}, f)["cells"] == ordered_json::array());
}

TEST_CASE(".off and .obj: the surface of a cube") {
  for (const char* name : {"cube.off", "cube.obj"}) {
    CAPTURE(name);
    const auto j = homology_json({}, data(name).string());
    // 8 vertices, 12 edges, 6 squares; a 2-sphere: H = Z, 0, Z (Hatcher, Algebraic Topology, 2002, Corollary 2.14, from memory)
    CHECK(cells_of(j) == std::vector<std::uint64_t>{8, 12, 6});
    CHECK(j["euler_characteristic"] == 2);
    CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  }
}

TEST_CASE("the extension decides the format, in any letter case") {
  temp_dir dir;
  // the ring again, as RING.PBM (by hand, as above)
  const auto j = homology_json({}, dir.write("RING.PBM", "P1\n3 3\n1 1 1\n1 0 1\n1 1 1\n"));
  CHECK(cells_of(j) == std::vector<std::uint64_t>{16, 24, 8});
}

}  // namespace cli_formats_test

// Tests of lacuna::io::read_off: standard surfaces (chi from memory: sphere 2, annulus 0, a
// contractible book 1) and every kind of malformed input, each with its line and message.
#include <lacuna/io/off.hpp>

#include <doctest/doctest.h>

#include <fstream>
#include <iterator>
#include <random>

#include <sstream>
#include <string>

namespace io_off_reader_test {

namespace {

const std::string data = std::string(LACUNA_TEST_DATA_DIR) + "/mesh/";

// The reader must throw parse_error at `line` with a message containing `part`.
template <class F>
void expect_parse_error(F&& f, std::size_t line, const std::string& part) {
  try {
    f();
    FAIL("no error; expected: " << part);
  } catch (const lacuna::parse_error& e) {
    CHECK_MESSAGE(e.line() == line, std::string(e.what()));
    CHECK_MESSAGE(e.message().find(part) != std::string::npos, std::string(e.what()));
  }
}

void expect_file_error(const std::string& file, std::size_t line, const std::string& part,
                       const lacuna::io::read_limits& limits = {}) {
  INFO(file);
  expect_parse_error([&] { (void)lacuna::io::read_off(data + file, limits); }, line, part);
}

lacuna::polygon_mesh from_text(const std::string& text, const lacuna::io::read_limits& limits = {}) {
  std::istringstream in(text);
  return lacuna::io::read_off(in, "text.off", limits);
}

}  // namespace

TEST_CASE("OFF: a cube of six quads with comments and colours") {
  const auto m = lacuna::io::read_off(data + "cube.off");
  CHECK(m.cell_count(0) == 8);
  CHECK(m.cell_count(1) == 12);
  CHECK(m.cell_count(2) == 6);
  CHECK(lacuna::euler_characteristic(m) == 2);  // a sphere
  REQUIRE(m.positions().size() == 8);
  CHECK(m.positions()[7] == std::array<double, 3>{1, 1, 1});
  CHECK(m.face_vertices(2).size() == 4);
}

TEST_CASE("OFF: a non-manifold book, header variants and leniencies") {
  const auto b = lacuna::io::read_off(data + "book.off");
  CHECK(lacuna::euler_characteristic(b) == 1);  // three discs glued on a segment
  CHECK(b.edge_face_count(*b.find_edge(0, 1)) == 3);
  // counts on the header line, COFF with colours on vertex lines, CRLF, no final newline
  const auto t = from_text("COFF 3 1 3\r\n0 0 0 1 1 1 1\r\n1 0 0 1 1 1 1\r\n0 1 0 1 1 1 1\r\n3 0 1 2");
  CHECK(lacuna::euler_characteristic(t) == 1);
  // no header keyword at all (it is optional)
  CHECK(from_text("3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 2 1 0\n").cell_count(2) == 1);
  // nOFF with vertex dimension 2 on its own line; 4OFF with 4 coordinates
  const auto n = from_text("nOFF\n2\n4 1 4\n0 0\n1 0\n1 1\n0 1\n4 0 1 2 3\n");
  CHECK(lacuna::euler_characteristic(n) == 1);
  CHECK(from_text("4OFF\n3 1 0\n0 0 0 1\n1 0 0 1\n0 1 0 1\n3 0 1 2\n").cell_count(1) == 3);
  // a mesh without faces: isolated vertices; the empty mesh
  CHECK(from_text("OFF\n2 0 0\n0 0 0\n1 1 1\n").top_dimension() == 0);
  CHECK(from_text("OFF\n0 0 0\n").top_dimension() == -1);
  // the grid torus: 4x4 quads, chi 0
  std::string torus = "OFF\n16 16 32\n";
  for (int i = 0; i < 16; ++i) torus += "0 0 0\n";
  for (int i = 0; i < 4; ++i)
    for (int j = 0; j < 4; ++j)
      torus += "4 " + std::to_string(i * 4 + j) + " " + std::to_string(((i + 1) % 4) * 4 + j) + " " +
               std::to_string(((i + 1) % 4) * 4 + (j + 1) % 4) + " " + std::to_string(i * 4 + (j + 1) % 4) + "\n";
  const auto tor = from_text(torus);
  CHECK(tor.cell_count(1) == 32);
  CHECK(lacuna::euler_characteristic(tor) == 0);
}

TEST_CASE("OFF: malformed files name their line") {
  expect_file_error("bad_magic.off", 1, "not an OFF file");
  expect_file_error("binary.off", 1, "binary OFF is not supported");
  expect_file_error("truncated_vertices.off", 2, "the header claims 8 vertices and 6 faces, but the file holds only 18 more bytes");
  expect_file_error("truncated_faces.off", 6, "the file ends after 1 of 2 faces");
  expect_file_error("lying_counts.off", 2, "but the file holds only");
  expect_file_error("overflow_counts.off", 2, "bad vertex count");
  expect_file_error("bad_counts.off", 2, "expected the counts");
  expect_file_error("bad_number.off", 4, "bad coordinate '0.5.2' of vertex 1");
  expect_file_error("index_out_of_range.off", 6, "face f0: vertex 3 out of range (the mesh has 3 vertices)");
  expect_file_error("short_face.off", 6, "face f0 lists 3 of its 4 vertices");
  expect_file_error("degenerate_face.off", 8, "face f1: vertex v1 repeated consecutively");
  expect_file_error("two_vertex_face.off", 6, "face f0: 2 vertices, a polygon needs at least 3");
  expect_file_error("trailing_data.off", 7, "unexpected data after the last face");
  // more cells than the limit, refused at the counts line
  expect_file_error("cube.off", 3, "more than the limit of 10 cells", {.max_cells = 10});
  expect_parse_error([] { (void)from_text(""); }, 1, "empty file");
  expect_parse_error([] { (void)from_text("OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 2 junk-colour-ok\n3"); }, 7,
                     "unexpected data after the last face");
  expect_parse_error([] { (void)from_text("OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n-3 0 1 2\n"); }, 6, "bad vertex count '-3'");
  expect_parse_error([] { (void)from_text("OFF\n3 1 0\n0 0 0\n1 0\n"); }, 4, "vertex 1 has 2 coordinates, 3 expected");
  expect_parse_error([] { (void)lacuna::io::read_off(data + "no_such_file.off"); }, 0, "cannot open");
}

TEST_CASE("OFF: a hostile header on a stream that cannot tell its size") {
  // a pipe-like stream: the reader cannot measure it, so it must grow only as data arrives
  struct pipe_buf : std::streambuf {
    std::string s;
    explicit pipe_buf(std::string t) : s(std::move(t)) { setg(s.data(), s.data(), s.data() + s.size()); }
  } buf("OFF\n100000000 100000000 0\n0 0 0\n");
  std::istream in(&buf);
  expect_parse_error([&] { (void)lacuna::io::read_off(in, "pipe", {.max_cells = std::uint64_t{1} << 40}); }, 3,
                     "the file ends after 1 of 100000000 vertices");
}

namespace {
// Random damage to a valid input: flipped bytes, a cut, an inserted or deleted run (fixed seed).
std::string mutate(const std::string& s, std::mt19937& rng) {
  std::string t = s;
  const int kind = static_cast<int>(rng() % 4);
  if (t.empty()) return "\x01";
  const std::size_t at = rng() % t.size();
  if (kind == 0) {
    for (int i = 0; i < 1 + static_cast<int>(rng() % 4); ++i) t[rng() % t.size()] = static_cast<char>(rng() % 256);
  } else if (kind == 1) {
    t.resize(at);
  } else if (kind == 2) {
    const char* pieces[] = {"9", "99999999999999999999", "-1", " ", "\n", "#", "0", "4294967296", "\n\n", "x"};
    t.insert(at, pieces[rng() % 10]);
  } else {
    t.erase(at, 1 + rng() % 8);
  }
  return t;
}
}  // namespace

TEST_CASE("OFF: damaged inputs give a result or a parse_error, nothing else") {
  std::mt19937 rng(2024);
  for (const std::string& path : {data + "cube.off", data + "book.off"}) {
    std::ifstream f(path, std::ios::binary);
    const std::string original((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
    REQUIRE(!original.empty());
    std::size_t errors = 0;
    for (int round = 0; round < 400; ++round) {
      std::istringstream in(mutate(original, rng));
      try {
        (void)lacuna::io::read_off(in, "mutant.off");
      } catch (const lacuna::parse_error& e) {
        ++errors;
        CHECK(std::string(e.what()).rfind("mutant.", 0) == 0);  // always names the input
      }  // any other exception, a crash or a hang fails the test
    }
    CHECK(errors > 0);  // the damage is noticed at least sometimes
  }
}

}  // namespace io_off_reader_test

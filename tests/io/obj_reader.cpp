// Tests of lacuna::io::read_obj: surfaces with known Euler characteristics (from memory:
// annulus 0, torus 0, sphere 2) and every kind of malformed input with its line and message.
#include <lacuna/io/obj.hpp>

#include <doctest/doctest.h>

#include <fstream>
#include <iterator>
#include <random>

#include <sstream>
#include <string>

namespace io_obj_reader_test {

namespace {

const std::string data = std::string(LACUNA_TEST_DATA_DIR) + "/mesh/";

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

void expect_file_error(const std::string& file, std::size_t line, const std::string& part) {
  INFO(file);
  expect_parse_error([&] { (void)lacuna::io::read_obj(data + file); }, line, part);
}

lacuna::polygon_mesh from_text(const std::string& text, const lacuna::io::read_limits& limits = {}) {
  std::istringstream in(text);
  return lacuna::io::read_obj(in, "text.obj", limits);
}

}  // namespace

TEST_CASE("OBJ: an annulus with every corner form, relative indices and ignored statements") {
  const auto m = lacuna::io::read_obj(data + "annulus.obj");
  CHECK(m.cell_count(0) == 16);
  CHECK(m.cell_count(1) == 24);
  CHECK(m.cell_count(2) == 8);
  CHECK(lacuna::euler_characteristic(m) == 0);  // an annulus
  std::size_t rim = 0;
  for (std::size_t e = 0; e < m.edge_count(); ++e) rim += m.edge_face_count(e) == 1;
  CHECK(rim == 16);  // 12 outer and 4 inner boundary edges
  // the last face "f -6 -5 -1 -2" is 11 12 16 15 (1-based)
  const auto last = m.face_vertices(7);
  CHECK(std::vector<std::size_t>(last.begin(), last.end()) == std::vector<std::size_t>{10, 11, 15, 14});
  CHECK(m.positions()[15] == std::array<double, 3>{3, 3, 0});
}

TEST_CASE("OBJ: a cube, a torus, line continuations") {
  const auto cube = from_text(
      "v 0 0 0\nv 1 0 0\nv 0 1 0\nv 1 1 0\nv 0 0 1\nv 1 0 1\nv 0 1 1\nv 1 1 1 1.0\n"
      "f 1 2 4 3\nf 5 7 8 6\nf 1 5 6 2\nf 3 4 8 7\nf 1 3 7 5\nf 2 6 \\\n 8 4\n");
  CHECK(lacuna::euler_characteristic(cube) == 2);
  CHECK(cube.cell_count(2) == 6);
  std::string torus;
  for (int i = 0; i < 16; ++i) torus += "v 0 0 0\n";
  for (int i = 0; i < 4; ++i)
    for (int j = 0; j < 4; ++j)
      torus += "f " + std::to_string(i * 4 + j + 1) + " " + std::to_string(((i + 1) % 4) * 4 + j + 1) + " " +
               std::to_string(((i + 1) % 4) * 4 + (j + 1) % 4 + 1) + " " + std::to_string(i * 4 + (j + 1) % 4 + 1) + "\n";
  const auto t = from_text(torus);
  CHECK(t.cell_count(1) == 32);
  CHECK(lacuna::euler_characteristic(t) == 0);  // the torus
  CHECK(from_text("").top_dimension() == -1);
  CHECK(from_text("# nothing\nv 1 2 3\n").top_dimension() == 0);
}

TEST_CASE("OBJ: malformed files name their line") {
  expect_file_error("bad_number.obj", 5, "bad coordinate 'abc'");
  expect_file_error("index_zero.obj", 4, "vertex index 0 in face f0 (OBJ indices start at 1)");
  expect_file_error("index_out_of_range.obj", 4, "face f0: vertex 4 is not defined (3 vertices so far)");
  expect_file_error("relative_before_first.obj", 4, "face f0: relative index -4 reaches before the first vertex");
  expect_file_error("degenerate_face.obj", 5, "face f1: vertex v0 repeated consecutively (an edge from a vertex to itself)");
  expect_parse_error([] { (void)from_text("v 0 0 0\nv 1 0 0\nf 1 2 1 2\n"); }, 3, "face f0: fewer than 3 distinct vertices");
  expect_file_error("bad_index.obj", 4, "bad vertex index '2x' in face f0");
  expect_file_error("short_vertex.obj", 1, "vertex 1 has 2 coordinates, 3 expected");
  expect_parse_error([] { (void)from_text("v 0 0 0\nv 1 0 0\nf 1 2\n"); }, 3, "face f0: 2 vertices, a polygon needs at least 3");
  expect_parse_error([] { (void)from_text("v 0 0 0\nv 1 0 0\nv 1 1 0\nf 1 2 2 3\n"); }, 4, "face f0: vertex v1 repeated consecutively");
  // a continued statement is reported at the line where it starts
  expect_parse_error([] { (void)from_text("v 0 0 0\nf 1 \\\n 2 \\\n 9\n"); }, 2, "face f0: vertex 2 is not defined");
  expect_parse_error([] { (void)from_text("v 0 0 0\nv 1 0 0\nv 1 1 0\nf 1 2 3\n", {.max_cells = 5}); }, 4,
                     "more than the limit of 5 cells");
  expect_parse_error([] { (void)lacuna::io::read_obj(data + "no_such_file.obj"); }, 0, "cannot open");
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

TEST_CASE("OBJ: damaged inputs give a result or a parse_error, nothing else") {
  std::mt19937 rng(2024);
  for (const std::string& path : {data + "annulus.obj"}) {
    std::ifstream f(path, std::ios::binary);
    const std::string original((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
    REQUIRE(!original.empty());
    std::size_t errors = 0;
    for (int round = 0; round < 400; ++round) {
      std::istringstream in(mutate(original, rng));
      try {
        (void)lacuna::io::read_obj(in, "mutant.obj");
      } catch (const lacuna::parse_error& e) {
        ++errors;
        CHECK(std::string(e.what()).rfind("mutant.", 0) == 0);  // always names the input
      }  // any other exception, a crash or a hang fails the test
    }
    CHECK(errors > 0);  // the damage is noticed at least sometimes
  }
}

}  // namespace io_obj_reader_test

// Tests of lacuna::polygon_mesh: counts and Euler characteristics of standard surfaces
// (from memory: sphere 2, disc 1, annulus 0, torus 0), d∘d = 0, coboundaries, bad faces.
#include <lacuna/complex/polygon_mesh.hpp>
#include <lacuna/complex/validate.hpp>

#include <doctest/doctest.h>

#include <map>
#include <string>
#include <vector>

namespace cubical_polygon_mesh_test {

using lacuna::polygon_mesh;

static_assert(lacuna::complex_with_coboundary<polygon_mesh>);

namespace {

std::vector<std::size_t> counts(const polygon_mesh& m) { return {m.cell_count(0), m.cell_count(1), m.cell_count(2)}; }

void check_dd_and_coboundary(const polygon_mesh& m) {
  CHECK_NOTHROW(lacuna::validate(m));  // the library's own checker: faces in range, dd = 0
  for (std::size_t f = 0; f < m.face_count(); ++f) {
    std::map<std::size_t, long> acc;
    for (const auto& x : lacuna::boundary(m, 2, f))
      for (const auto& y : lacuna::boundary(m, 1, x.face)) acc[y.face] += x.coefficient * y.coefficient;
    for (auto [v, c] : acc) REQUIRE(c == 0);  // d(d(face)) = 0: the cycle closes
  }
  for (int k = 1; k <= 2; ++k) {
    std::size_t terms = 0, coterms = 0;
    for (std::size_t i = 0; i < m.cell_count(k); ++i)
      for (const auto& x : m.boundary(k, i)) {
        ++terms;
        bool found = false;
        for (const auto& y : m.coboundary(k - 1, x.face)) found |= (y.face == i && y.coefficient == x.coefficient);
        REQUIRE(found);
      }
    for (std::size_t i = 0; i < m.cell_count(k - 1); ++i) coterms += m.coboundary(k - 1, i).size();
    CHECK(terms == coterms);
  }
}

// The torus as an n x n grid of quads with opposite sides identified.
polygon_mesh grid_torus(std::size_t n) {
  std::vector<std::vector<std::size_t>> faces;
  auto v = [n](std::size_t i, std::size_t j) { return (i % n) * n + (j % n); };
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < n; ++j) faces.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1), v(i, j + 1)});
  return polygon_mesh(n * n, faces);
}

}  // namespace

TEST_CASE("a cube from six quads: 8, 12, 6, chi = 2 (a sphere)") {
  // vertices: bit 0 = x, bit 1 = y, bit 2 = z
  const polygon_mesh m(8, {{0, 1, 3, 2}, {4, 6, 7, 5}, {0, 4, 5, 1}, {2, 3, 7, 6}, {0, 2, 6, 4}, {1, 5, 7, 3}});
  CHECK(counts(m) == std::vector<std::size_t>{8, 12, 6});
  CHECK(lacuna::euler_characteristic(m) == 2);
  CHECK(m.top_dimension() == 2);
  for (std::size_t e = 0; e < m.edge_count(); ++e) CHECK(m.edge_face_count(e) == 2);  // closed surface
  check_dd_and_coboundary(m);
  // face 0 = 0 1 3 2: edges 01 (+), 13 (+), 23 (-: 3 -> 2), 02 (-: 2 -> 0)
  std::map<std::string, long> b;
  for (const auto& x : m.boundary(2, 0)) b[m.cell_name(1, x.face)] = x.coefficient;
  CHECK(b == std::map<std::string, long>{{"v0 v1", 1}, {"v1 v3", 1}, {"v2 v3", -1}, {"v0 v2", -1}});
  CHECK(m.cell_name(0, 5) == "v5");
  CHECK(m.cell_name(2, 3) == "f3");
  CHECK(m.find_edge(3, 1).has_value());
  CHECK_FALSE(m.find_edge(0, 7).has_value());
}

TEST_CASE("a square annulus: 8 quads around a hole, chi = 0, 8+8 rim edges") {
  // outer ring 0..11 on a 4x4 vertex grid with the middle square missing
  std::vector<std::vector<std::size_t>> faces;
  auto v = [](std::size_t x, std::size_t y) { return y * 4 + x; };
  for (std::size_t y = 0; y < 3; ++y)
    for (std::size_t x = 0; x < 3; ++x)
      if (!(x == 1 && y == 1)) faces.push_back({v(x, y), v(x + 1, y), v(x + 1, y + 1), v(x, y + 1)});
  const polygon_mesh m(16, faces);
  CHECK(counts(m) == std::vector<std::size_t>{16, 24, 8});  // 24 = 2*3*4 grid edges, all used
  CHECK(lacuna::euler_characteristic(m) == 0);  // annulus
  std::size_t rim = 0;
  for (std::size_t e = 0; e < m.edge_count(); ++e) rim += m.edge_face_count(e) == 1;
  CHECK(rim == 16);  // 12 outer + 4 inner boundary edges
  check_dd_and_coboundary(m);
}

TEST_CASE("a non-manifold book of three quads on one spine") {
  // spine v0 v1; pages end at (2,3), (4,5), (6,7)
  const polygon_mesh m(8, {{0, 1, 3, 2}, {0, 1, 5, 4}, {1, 0, 6, 7}});
  CHECK(counts(m) == std::vector<std::size_t>{8, 10, 3});
  CHECK(lacuna::euler_characteristic(m) == 1);  // contractible: three discs on a segment
  const auto spine = *m.find_edge(0, 1);
  CHECK(m.edge_face_count(spine) == 3);
  // the third page runs the spine from v1 to v0
  std::map<std::size_t, long> cob;
  for (const auto& x : m.coboundary(1, spine)) cob[x.face] = x.coefficient;
  CHECK(cob == std::map<std::size_t, long>{{0, 1}, {1, 1}, {2, -1}});
  check_dd_and_coboundary(m);
}

TEST_CASE("the torus as a 4x4 grid of quads: 16, 32, 16, chi = 0") {
  const auto m = grid_torus(4);
  CHECK(counts(m) == std::vector<std::size_t>{16, 32, 16});
  CHECK(lacuna::euler_characteristic(m) == 0);
  check_dd_and_coboundary(m);
  // a pentagon and a triangle together (mixed sizes), and an isolated vertex
  const polygon_mesh p(7, {{0, 1, 2, 3, 4}, {0, 4, 5}});
  CHECK(counts(p) == std::vector<std::size_t>{7, 7, 2});
  CHECK(lacuna::euler_characteristic(p) == 2);  // a disc plus an isolated vertex v6
  check_dd_and_coboundary(p);
}

TEST_CASE("empty and vertex-only meshes") {
  const polygon_mesh e;
  CHECK(e.top_dimension() == -1);
  CHECK(counts(e) == std::vector<std::size_t>{0, 0, 0});
  const polygon_mesh v(3, std::vector<std::vector<std::size_t>>{});
  CHECK(v.top_dimension() == 0);
  CHECK(lacuna::euler_characteristic(v) == 3);
}

TEST_CASE("degenerate faces are errors naming the face") {
  auto message = [](std::size_t n, std::vector<std::vector<std::size_t>> faces) -> std::string {
    try {
      polygon_mesh m(n, faces);
    } catch (const lacuna::invalid_complex& e) {
      CHECK(e.dimension() == 2);
      return e.what();
    }
    return "no error";
  };
  CHECK(message(4, {{0, 1, 2}, {0, 1}}) == "face f1: 2 vertices, a polygon needs at least 3");
  CHECK(message(4, {{0, 1, 1, 2}}) == "face f0: vertex v1 repeated consecutively (an edge from a vertex to itself)");
  CHECK(message(4, {{0, 1, 2, 0}}) == "face f0: vertex v0 repeated consecutively (an edge from a vertex to itself)");
  CHECK(message(4, {{0, 1, 0, 1}}) == "face f0: fewer than 3 distinct vertices");
  CHECK(message(4, {{0, 1, 2, 1, 3}}) == "face f0: edge v1 v2 used twice");
  CHECK(message(4, {{0, 1, 9}}) == "face f0: vertex 9 out of range (the mesh has 4 vertices)");
  // a polygon pinched at one vertex is allowed: 0 1 2 0 3 4
  CHECK(message(5, {{0, 1, 2, 0, 3, 4}}) == "no error");
}

}  // namespace cubical_polygon_mesh_test

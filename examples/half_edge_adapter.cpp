// examples/half_edge_adapter.cpp — adapting a cell type you cannot edit.
//
// Part 1 is a small half-edge mesh "written by a third party": it knows nothing of lacuna.
// Part 2 adapts it, without touching it, by specializing lacuna::complex_traits.
// Part 3 is the user's program: it builds two meshes of our own (the surface of a cube, and
// a 4 x 4 quad grid with opposite sides glued, a torus), checks them with lacuna::validate
// and compares their Euler characteristics with the known values. Exit status 1 if one is
// wrong.

// ============================ Part 1: the third-party mesh ================================
#include <array>
#include <cstddef>
#include <map>
#include <stdexcept>
#include <utility>
#include <vector>

namespace third_party {

/// One directed edge. The twin of half-edge h is h ^ 1 (twins are stored side by side).
struct half_edge {
  int origin = -1;  // vertex it starts at
  int next = -1;    // next half-edge around its face
  int face = -1;    // face on its left, -1 on a border
};

/// A polygon mesh in half-edge form.
struct half_edge_mesh {
  std::vector<std::array<double, 3>> positions;
  std::vector<half_edge> half_edges;
  std::vector<int> face_start;  // one half-edge of each face

  int twin(int h) const { return h ^ 1; }

  /// Builds the mesh from polygons given as vertex indices, counter-clockwise.
  static half_edge_mesh from_polygons(std::vector<std::array<double, 3>> positions,
                                      const std::vector<std::vector<int>>& polygons) {
    half_edge_mesh m;
    m.positions = std::move(positions);
    std::map<std::pair<int, int>, int> by_ends;  // (from, to) -> half-edge
    const auto half_edge_of = [&](int a, int b) {
      if (auto it = by_ends.find({a, b}); it != by_ends.end()) return it->second;
      const int h = static_cast<int>(m.half_edges.size());
      m.half_edges.push_back({a, -1, -1});
      m.half_edges.push_back({b, -1, -1});
      by_ends[{a, b}] = h;
      by_ends[{b, a}] = h + 1;
      return h;
    };
    for (const auto& poly : polygons) {
      const int f = static_cast<int>(m.face_start.size());
      std::vector<int> hs;
      for (std::size_t j = 0; j < poly.size(); ++j) hs.push_back(half_edge_of(poly[j], poly[(j + 1) % poly.size()]));
      for (std::size_t j = 0; j < hs.size(); ++j) {
        if (m.half_edges[static_cast<std::size_t>(hs[j])].face != -1) throw std::runtime_error("non-manifold edge");
        m.half_edges[static_cast<std::size_t>(hs[j])].face = f;
        m.half_edges[static_cast<std::size_t>(hs[j])].next = hs[(j + 1) % hs.size()];
      }
      m.face_start.push_back(hs[0]);
    }
    return m;
  }
};

}  // namespace third_party

// ============================ Part 2: the adapter ========================================
#include <lacuna/complex/concepts.hpp>

#include <string>

// Cells: 0 = vertices, 1 = edges (edge e is the twin pair 2e, 2e + 1, oriented along 2e),
// 2 = faces. The boundary of a face walks its half-edges: +edge along 2e, -edge along 2e + 1.
template <>
struct lacuna::complex_traits<third_party::half_edge_mesh> {
  using mesh = third_party::half_edge_mesh;
  static int top_dimension(const mesh& m) {
    return !m.face_start.empty() ? 2 : !m.half_edges.empty() ? 1 : !m.positions.empty() ? 0 : -1;
  }
  static std::size_t cell_count(const mesh& m, int k) {
    switch (k) {
      case 0: return m.positions.size();
      case 1: return m.half_edges.size() / 2;
      case 2: return m.face_start.size();
      default: return 0;
    }
  }
  static std::vector<lacuna::incidence> boundary(const mesh& m, int k, std::size_t i) {
    std::vector<lacuna::incidence> d;
    const auto& he = m.half_edges;
    if (k == 1) {  // head - tail of half-edge 2i
      d.push_back({static_cast<std::size_t>(he[2 * i + 1].origin), 1});
      d.push_back({static_cast<std::size_t>(he[2 * i].origin), -1});
    } else if (k == 2) {
      int h = m.face_start[i];
      do {
        d.push_back({static_cast<std::size_t>(h / 2), h % 2 == 0 ? 1 : -1});
        h = he[static_cast<std::size_t>(h)].next;
      } while (h != m.face_start[i]);
    }
    return d;
  }
  static std::string cell_name(const mesh&, int k, std::size_t i) {
    return std::string(k == 0 ? "v" : k == 1 ? "e" : "f") + std::to_string(i);
  }
};

// ============================ Part 3: the user's program =================================
#include <lacuna/complex/validate.hpp>

#include <iostream>

static_assert(lacuna::cell_complex<third_party::half_edge_mesh>);

int check(const char* what, const third_party::half_edge_mesh& m, std::int64_t expected_chi) {
  lacuna::validate(m);  // faces in range, ∂∂ = 0; throws naming the cell otherwise
  const auto chi = lacuna::euler_characteristic(m);
  std::cout << what << ": " << lacuna::cell_count(m, 0) << " vertices, " << lacuna::cell_count(m, 1) << " edges, "
            << lacuna::cell_count(m, 2) << " faces, chi = " << chi << " (expected " << expected_chi << ")\n";
  return chi == expected_chi ? 0 : 1;
}

int main() {
  // The cube: vertex (x, y, z) is number 4x + 2y + z; faces counter-clockwise seen from outside.
  std::vector<std::array<double, 3>> corners;
  for (int v = 0; v < 8; ++v) corners.push_back({double(v >> 2), double((v >> 1) & 1), double(v & 1)});
  const auto cube = third_party::half_edge_mesh::from_polygons(
      corners, {{0, 1, 3, 2}, {4, 6, 7, 5}, {0, 4, 5, 1}, {2, 3, 7, 6}, {0, 2, 6, 4}, {1, 5, 7, 3}});
  // The torus: a 4 x 4 grid of quads, vertex (i, j) is 4i + j, indices taken mod 4.
  std::vector<std::array<double, 3>> grid;
  std::vector<std::vector<int>> quads;
  for (int i = 0; i < 4; ++i)
    for (int j = 0; j < 4; ++j) {
      grid.push_back({double(i), double(j), 0});
      quads.push_back({4 * i + j, 4 * ((i + 1) % 4) + j, 4 * ((i + 1) % 4) + (j + 1) % 4, 4 * i + (j + 1) % 4});
    }
  const auto torus = third_party::half_edge_mesh::from_polygons(grid, quads);
  // chi = V - E + F = 2 for a convex polyhedron (Euler), 0 for the torus (Hatcher 2002, §2.2)
  return check("cube", cube, 2) | check("torus", torus, 0);
}

// lacuna/complex/polygon_mesh.hpp — a polygon mesh as a 2-dimensional cell complex.
//
// Vertices are 0..n-1. Every polygon (of any size, not triangulated) is a 2-cell whose boundary
// is its cycle of edges; edges are shared between faces and oriented from the lower to the
// higher vertex number, so the boundary of edge {a < b} is b - a and a face v_0 v_1 ... v_{m-1}
// has boundary sum_j s_j e(v_j, v_{j+1}) with s_j = +1 where v_j < v_{j+1}, -1 otherwise.
// Holes (edges of one face) and non-manifold edges (three or more faces) are fine.
//
// Numbering: edges are numbered in increasing order of (lower vertex, higher vertex); faces
// keep the order they were given in. Names: vertex "v<i>", edge "v<i> v<j>" (i < j), face
// "f<i>".
//
// A face is rejected (lacuna::invalid_complex naming it) when it has fewer than 3 vertices, a
// vertex out of range, a vertex repeated consecutively (an edge from a vertex to itself; the
// last and first vertex count as consecutive), fewer than 3 distinct vertices, or uses one edge
// twice. A vertex met twice non-consecutively (a polygon pinched at a vertex) is allowed.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <tuple>
#include <utility>
#include <vector>

namespace lacuna {

namespace detail {

/// Why a polygon (its vertex cycle) cannot be a face of a mesh with `vertex_count` vertices,
/// or nullopt if it can. `scratch` is reused between calls to avoid allocations.
inline std::optional<std::string> polygon_fault(std::span<const std::size_t> face, std::size_t vertex_count,
                                                std::vector<std::pair<std::size_t, std::size_t>>& scratch) {
  const std::size_t m = face.size();
  if (m < 3) return std::to_string(m) + " vertices, a polygon needs at least 3";
  for (std::size_t v : face)
    if (v >= vertex_count)
      return "vertex " + std::to_string(v) + " out of range (the mesh has " + std::to_string(vertex_count) +
             " vertices)";
  for (std::size_t j = 0; j < m; ++j)
    if (face[j] == face[(j + 1) % m])
      return "vertex v" + std::to_string(face[j]) + " repeated consecutively (an edge from a vertex to itself)";
  scratch.clear();
  for (std::size_t j = 0; j < m; ++j) scratch.emplace_back(face[j], 0);
  std::sort(scratch.begin(), scratch.end());
  const auto distinct = static_cast<std::size_t>(
      std::unique(scratch.begin(), scratch.end()) - scratch.begin());
  if (distinct < 3) return "fewer than 3 distinct vertices";
  scratch.clear();
  for (std::size_t j = 0; j < m; ++j) {
    const std::size_t a = face[j], b = face[(j + 1) % m];
    scratch.emplace_back(std::min(a, b), std::max(a, b));
  }
  std::sort(scratch.begin(), scratch.end());
  for (std::size_t j = 1; j < m; ++j)
    if (scratch[j] == scratch[j - 1])
      return "edge v" + std::to_string(scratch[j].first) + " v" + std::to_string(scratch[j].second) + " used twice";
  return std::nullopt;
}

}  // namespace detail

/// A polygon mesh: vertices, deduplicated edges and polygonal faces. Models
/// lacuna::complex_with_coboundary; boundaries and coboundaries are stored spans (O(1)).
class polygon_mesh {
 public:
  /// The boundary of a cell: a span of incidences into the mesh.
  using boundary_range = std::span<const incidence>;
  /// The coboundary of a cell: a span of incidences into the mesh.
  using coboundary_range = std::span<const incidence>;

  /// The empty mesh.
  polygon_mesh() : face_offsets_{0}, vertex_cob_offsets_{0}, edge_cob_offsets_{0} {}

  /// From faces in compressed form: face f has vertices
  /// face_vertices[face_offsets[f] .. face_offsets[f+1]). face_offsets starts with 0.
  /// Throws lacuna::invalid_complex naming the first bad face (dimension 2, its index).
  polygon_mesh(std::size_t vertex_count, std::vector<std::size_t> face_vertices, std::vector<std::size_t> face_offsets)
      : vertex_count_(vertex_count), face_vertices_(std::move(face_vertices)), face_offsets_(std::move(face_offsets)) {
    if (face_offsets_.empty() || face_offsets_.front() != 0 || face_offsets_.back() != face_vertices_.size() ||
        !std::is_sorted(face_offsets_.begin(), face_offsets_.end()))
      throw invalid_complex("polygon_mesh: face offsets do not describe the face vertex list");
    build();
  }

  /// From a list of faces, each a list of vertex numbers.
  polygon_mesh(std::size_t vertex_count, const std::vector<std::vector<std::size_t>>& faces)
      : polygon_mesh(vertex_count, flatten(faces), offsets(faces)) {}

  // ---- the cell_complex interface ---------------------------------------------------------

  /// 2 with a face, 0 with vertices only, -1 for the empty mesh.
  int top_dimension() const noexcept {
    if (face_count() > 0) return 2;
    return vertex_count_ > 0 ? 0 : -1;
  }
  /// The number of vertices, edges or faces (k = 0, 1, 2); 0 for other k.
  std::size_t cell_count(int k) const noexcept {
    switch (k) {
      case 0: return vertex_count_;
      case 1: return edge_count();
      case 2: return face_count();
      default: return 0;
    }
  }
  /// Vertex: empty. Edge {a<b}: (a,-1), (b,+1). Face: its edges in cycle order with signs.
  boundary_range boundary(int k, std::size_t i) const noexcept {
    if (k == 1) return {edge_boundary_.data() + 2 * i, 2};
    if (k == 2) return {face_boundary_.data() + face_offsets_[i], face_offsets_[i + 1] - face_offsets_[i]};
    return {};
  }
  /// Vertex: its edges (increasing); edge: its faces (increasing), with their coefficients.
  coboundary_range coboundary(int k, std::size_t i) const noexcept {
    if (k == 0) return {vertex_cob_.data() + vertex_cob_offsets_[i], vertex_cob_offsets_[i + 1] - vertex_cob_offsets_[i]};
    if (k == 1) return {edge_cob_.data() + edge_cob_offsets_[i], edge_cob_offsets_[i + 1] - edge_cob_offsets_[i]};
    return {};
  }
  /// "v3", "v3 v7", "f12".
  std::string cell_name(int k, std::size_t i) const {
    // built by appending: GCC 12 warns falsely (-Wrestrict) on "v" + std::to_string(...)
    std::string s(1, k == 2 ? 'f' : 'v');
    if (k != 1) return s.append(std::to_string(i));
    const auto [a, b] = edge_vertices(i);
    return s.append(std::to_string(a)).append(" v").append(std::to_string(b));
  }

  // ---- the mesh ---------------------------------------------------------------------------

  /// The number of vertices.
  std::size_t vertex_count() const noexcept { return vertex_count_; }
  /// The number of edges.
  std::size_t edge_count() const noexcept { return edge_boundary_.size() / 2; }
  /// The number of faces.
  std::size_t face_count() const noexcept { return face_offsets_.size() - 1; }
  /// The vertex cycle of face f, as given.
  std::span<const std::size_t> face_vertices(std::size_t f) const noexcept {
    return {face_vertices_.data() + face_offsets_[f], face_offsets_[f + 1] - face_offsets_[f]};
  }
  /// The two vertices of edge e, lower first.
  std::pair<std::size_t, std::size_t> edge_vertices(std::size_t e) const noexcept {
    return {edge_boundary_[2 * e].face, edge_boundary_[2 * e + 1].face};
  }
  /// The edge {a, b}, if the mesh has it. O(log degree).
  std::optional<std::size_t> find_edge(std::size_t a, std::size_t b) const noexcept {
    if (a > b) std::swap(a, b);
    if (b >= vertex_count_) return std::nullopt;
    for (const incidence& x : coboundary(0, a))
      if (edge_vertices(x.face).second == b) return x.face;
    return std::nullopt;
  }
  /// The number of faces on edge e: 1 on a hole's rim, 2 inside a surface, 3+ non-manifold.
  std::size_t edge_face_count(std::size_t e) const noexcept { return edge_cob_offsets_[e + 1] - edge_cob_offsets_[e]; }

  /// Vertex positions, if the source had them (readers keep them); empty otherwise.
  const std::vector<std::array<double, 3>>& positions() const noexcept { return positions_; }
  /// Sets the vertex positions (not checked against the vertex count).
  void set_positions(std::vector<std::array<double, 3>> p) { positions_ = std::move(p); }

 private:
  static std::vector<std::size_t> flatten(const std::vector<std::vector<std::size_t>>& faces) {
    std::vector<std::size_t> v;
    for (const auto& f : faces) v.insert(v.end(), f.begin(), f.end());
    return v;
  }
  static std::vector<std::size_t> offsets(const std::vector<std::vector<std::size_t>>& faces) {
    std::vector<std::size_t> o{0};
    for (const auto& f : faces) o.push_back(o.back() + f.size());
    return o;
  }

  void build() {
    const std::size_t nf = face_count();
    std::vector<std::pair<std::size_t, std::size_t>> scratch;
    for (std::size_t f = 0; f < nf; ++f)
      if (auto fault = detail::polygon_fault(face_vertices(f), vertex_count_, scratch))
        throw invalid_complex("face f" + std::to_string(f) + ": " + *fault, 2, f);

    struct side {
      std::size_t lo, hi, face, slot;
    };
    std::vector<side> sides;
    sides.reserve(face_vertices_.size());
    for (std::size_t f = 0; f < nf; ++f) {
      const std::size_t b = face_offsets_[f], m = face_offsets_[f + 1] - b;
      for (std::size_t j = 0; j < m; ++j) {
        const std::size_t u = face_vertices_[b + j], w = face_vertices_[b + (j + 1) % m];
        sides.push_back({std::min(u, w), std::max(u, w), f, b + j});
      }
    }
    std::sort(sides.begin(), sides.end(), [](const side& x, const side& y) {
      return std::tie(x.lo, x.hi, x.face) < std::tie(y.lo, y.hi, y.face);
    });

    face_boundary_.assign(face_vertices_.size(), incidence{0, 0});
    edge_cob_.reserve(sides.size());
    std::vector<std::size_t> degree(vertex_count_ + 1, 0);
    for (std::size_t s = 0; s < sides.size(); ++s) {
      if (s == 0 || sides[s].lo != sides[s - 1].lo || sides[s].hi != sides[s - 1].hi) {
        edge_boundary_.push_back({sides[s].lo, -1});
        edge_boundary_.push_back({sides[s].hi, 1});
        edge_cob_offsets_.push_back(edge_cob_.size());
        ++degree[sides[s].lo];
        ++degree[sides[s].hi];
      }
      const std::size_t e = edge_boundary_.size() / 2 - 1;
      const std::size_t slot = sides[s].slot, f = sides[s].face;
      const std::size_t next = slot + 1 == face_offsets_[f + 1] ? face_offsets_[f] : slot + 1;
      const std::int64_t sign = face_vertices_[slot] < face_vertices_[next] ? 1 : -1;
      face_boundary_[slot] = {e, sign};
      edge_cob_.push_back({f, sign});
    }
    edge_cob_offsets_.push_back(edge_cob_.size());

    vertex_cob_offsets_.assign(vertex_count_ + 1, 0);
    for (std::size_t v = 0; v < vertex_count_; ++v) vertex_cob_offsets_[v + 1] = vertex_cob_offsets_[v] + degree[v];
    vertex_cob_.assign(vertex_cob_offsets_.back(), incidence{0, 0});
    std::vector<std::size_t> fill(vertex_cob_offsets_.begin(), vertex_cob_offsets_.end() - 1);
    for (std::size_t e = 0; e < edge_count(); ++e) {  // edges increase, so each list is sorted
      const auto [a, b] = edge_vertices(e);
      vertex_cob_[fill[a]++] = {e, -1};
      vertex_cob_[fill[b]++] = {e, 1};
    }
  }

  std::size_t vertex_count_ = 0;
  std::vector<std::size_t> face_vertices_;
  std::vector<std::size_t> face_offsets_;
  std::vector<incidence> face_boundary_;   // parallel to face_vertices_
  std::vector<incidence> edge_boundary_;   // two per edge
  std::vector<std::size_t> vertex_cob_offsets_;
  std::vector<incidence> vertex_cob_;
  std::vector<std::size_t> edge_cob_offsets_;
  std::vector<incidence> edge_cob_;
  std::vector<std::array<double, 3>> positions_;
};

}  // namespace lacuna

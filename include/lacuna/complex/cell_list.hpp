// lacuna/complex/cell_list.hpp — Delta- and CW complexes given cell by cell, with arbitrary
// integer incidence numbers (models lacuna::cell_complex).
//
// Storage: per dimension, a CSR array of the boundaries (offsets, then (face, coefficient)
// terms, one entry per face with a non-zero coefficient, faces increasing) and the cell
// names. Cells are added in any order of dimension; a k-cell's faces must be (k-1)-cells
// that exist when it is added.
//
// The standard complexes are static members: circle, torus, klein_bottle, projective_plane,
// real_projective_space(n), lens_space(p, q), sphere(n).
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/detail/concat.hpp>
#include <lacuna/complex/errors.hpp>

#include <algorithm>
#include <cstdint>
#include <initializer_list>
#include <limits>
#include <numeric>
#include <optional>
#include <span>
#include <stdexcept>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace lacuna {

namespace detail {
/// a + b, or an invalid_complex naming `what` if it does not fit int64.
inline std::int64_t checked_add(std::int64_t a, std::int64_t b, const std::string& what) {
  std::int64_t r;
  if (__builtin_add_overflow(a, b, &r)) throw invalid_complex("integer overflow: " + what);
  return r;
}
/// a * b, or an invalid_complex naming `what` if it does not fit int64.
inline std::int64_t checked_mul(std::int64_t a, std::int64_t b, const std::string& what) {
  std::int64_t r;
  if (__builtin_mul_overflow(a, b, &r)) throw invalid_complex("integer overflow: " + what);
  return r;
}

/// Sorts terms by face, adds the coefficients of equal faces (overflow-checked), drops zeros.
inline void normalize_chain(std::vector<incidence>& terms, const std::string& what) {
  std::stable_sort(terms.begin(), terms.end(),
                   [](const incidence& a, const incidence& b) { return a.face < b.face; });
  std::size_t o = 0;
  for (std::size_t t = 0; t < terms.size();) {
    std::int64_t sum = 0;
    const std::size_t f = terms[t].face;
    for (; t < terms.size() && terms[t].face == f; ++t) sum = checked_add(sum, terms[t].coefficient, what);
    if (sum != 0) terms[o++] = incidence{f, sum};
  }
  terms.resize(o);
}
}  // namespace detail

/// A complex given cell by cell: names and integer boundaries. Models lacuna::cell_complex.
class cell_list {
 public:
  cell_list() = default;

  // ---- the cell_complex interface ------------------------------------------------------
  /// The highest dimension of a cell, -1 if there is none.
  int top_dimension() const noexcept {
    for (std::size_t k = dims_.size(); k > 0; --k)
      if (!dims_[k - 1].names.empty()) return static_cast<int>(k - 1);
    return -1;
  }
  /// The number of k-cells (0 outside 0..top).
  std::size_t cell_count(int k) const noexcept {
    if (k < 0 || static_cast<std::size_t>(k) >= dims_.size()) return 0;
    return dims_[static_cast<std::size_t>(k)].names.size();
  }
  /// The boundary of the i-th k-cell: faces increasing, coefficients non-zero.
  /// Precondition: i < cell_count(k).
  std::span<const incidence> boundary(int k, std::size_t i) const {
    const auto& d = dims_[static_cast<std::size_t>(k)];
    return {d.terms.data() + d.offsets[i], d.offsets[i + 1] - d.offsets[i]};
  }
  /// The name of the i-th k-cell.
  const std::string& cell_name(int k, std::size_t i) const { return dims_.at(static_cast<std::size_t>(k)).names.at(i); }

  // ---- building ------------------------------------------------------------------------
  /// Adds a k-cell with this name and boundary (terms with equal faces add up; zero terms
  /// are dropped) and returns its index among the k-cells. An empty name becomes "e<k>_<i>".
  /// Throws lacuna::invalid_complex if k < 0, a face is not an existing (k-1)-cell, a 0-cell
  /// is given a non-zero boundary, or coefficients overflow int64. ∂∂ = 0 is not checked
  /// here (see lacuna::validate).
  std::size_t add_cell(int k, std::string name, std::vector<incidence> boundary_terms) {
    if (k < 0) throw invalid_complex("cell_list: a cell of negative dimension " + std::to_string(k));
    const auto uk = static_cast<std::size_t>(k);
    if (dims_.size() <= uk) dims_.resize(uk + 1);
    auto& d = dims_[uk];
    const std::size_t index = d.names.size();
    if (name.empty()) name = detail::concat("e", std::to_string(k), "_", std::to_string(index));
    detail::normalize_chain(boundary_terms, "boundary of cell '" + name + "'");
    if (k == 0 && !boundary_terms.empty())
      throw invalid_complex("cell_list: the 0-cell '" + name + "' is given a non-zero boundary", 0, index);
    for (const auto& t : boundary_terms)
      if (t.face >= cell_count(k - 1))
        throw invalid_complex("cell_list: the boundary of " + std::to_string(k) + "-cell '" + name +
                                  "' names face " + std::to_string(t.face) + ", but there are only " +
                                  std::to_string(cell_count(k - 1)) + " " + std::to_string(k - 1) + "-cells",
                              k, index);
    d.terms.insert(d.terms.end(), boundary_terms.begin(), boundary_terms.end());
    d.offsets.push_back(d.terms.size());
    d.names.push_back(std::move(name));
    return index;
  }
  std::size_t add_cell(int k, std::string name, std::initializer_list<incidence> boundary_terms = {}) {
    return add_cell(k, std::move(name), std::vector<incidence>(boundary_terms));
  }
  /// Reserves room for n cells of dimension k with `terms` boundary terms in all.
  void reserve(int k, std::size_t n, std::size_t terms) {
    const auto uk = static_cast<std::size_t>(k);
    if (dims_.size() <= uk) dims_.resize(uk + 1);
    dims_[uk].names.reserve(n);
    dims_[uk].offsets.reserve(n + 1);
    dims_[uk].terms.reserve(terms);
  }

  /// The first cell with this name, as (dimension, index). Linear in the number of cells.
  std::optional<std::pair<int, std::size_t>> find(std::string_view name) const {
    for (std::size_t k = 0; k < dims_.size(); ++k) {
      const auto& n = dims_[k].names;
      const auto it = std::find(n.begin(), n.end(), name);
      if (it != n.end()) return std::pair<int, std::size_t>{static_cast<int>(k), static_cast<std::size_t>(it - n.begin())};
    }
    return std::nullopt;
  }

  friend bool operator==(const cell_list& a, const cell_list& b) {
    const int top = a.top_dimension();
    if (top != b.top_dimension()) return false;
    for (int k = 0; k <= top; ++k) {
      const auto& x = a.dims_[static_cast<std::size_t>(k)];
      const auto& y = b.dims_[static_cast<std::size_t>(k)];
      if (x.names != y.names || x.offsets != y.offsets || x.terms != y.terms) return false;
    }
    return true;
  }

  // ---- the standard complexes ----------------------------------------------------------
  /// S^1: one vertex v, one edge a with ∂a = v - v = 0.
  static cell_list circle() {
    cell_list c;
    c.add_cell(0, "v");
    c.add_cell(1, "a", {{0, 1}, {0, -1}});
    return c;
  }
  /// The torus as a Delta-complex: vertex v, edges a, b, c, triangles U, L with
  /// ∂U = ∂L = a + b - c (Hatcher, Algebraic Topology, 2002, §2.1, the torus example).
  static cell_list torus() {
    cell_list c;
    c.add_cell(0, "v");
    for (const char* e : {"a", "b", "c"}) c.add_cell(1, e, {{0, 1}, {0, -1}});
    c.add_cell(2, "U", {{0, 1}, {1, 1}, {2, -1}});
    c.add_cell(2, "L", {{0, 1}, {1, 1}, {2, -1}});
    return c;
  }
  /// The Klein bottle as a Delta-complex: vertex v, edges a, b, c, triangles U, L with
  /// ∂U = a + b - c, ∂L = a - b + c (Hatcher 2002, §2.1, the Klein bottle example).
  static cell_list klein_bottle() {
    cell_list c;
    c.add_cell(0, "v");
    for (const char* e : {"a", "b", "c"}) c.add_cell(1, e, {{0, 1}, {0, -1}});
    c.add_cell(2, "U", {{0, 1}, {1, 1}, {2, -1}});
    c.add_cell(2, "L", {{0, 1}, {1, -1}, {2, 1}});
    return c;
  }
  /// The projective plane as a Delta-complex: vertices v, w; edges a, b (from v to w) and
  /// a loop c at v; triangles U, L with ∂U = -a + b + c, ∂L = a - b + c
  /// (Hatcher 2002, §2.1, the RP^2 example; our labelling of the edges).
  static cell_list projective_plane() {
    cell_list c;
    c.add_cell(0, "v");
    c.add_cell(0, "w");
    c.add_cell(1, "a", {{1, 1}, {0, -1}});
    c.add_cell(1, "b", {{1, 1}, {0, -1}});
    c.add_cell(1, "c", {{0, 1}, {0, -1}});
    c.add_cell(2, "U", {{0, -1}, {1, 1}, {2, 1}});
    c.add_cell(2, "L", {{0, 1}, {1, -1}, {2, 1}});
    return c;
  }
  /// RP^n with one cell e_k in each dimension k <= n, ∂e_k = (1 + (-1)^k) e_{k-1}
  /// (Hatcher 2002, Example 2.42). Throws std::invalid_argument if n < 0.
  static cell_list real_projective_space(int n) {
    if (n < 0) throw std::invalid_argument("real_projective_space: negative dimension " + std::to_string(n));
    cell_list c;
    c.add_cell(0, "e0");
    for (int k = 1; k <= n; ++k) {
      if (k % 2 == 0)
        c.add_cell(k, detail::concat("e", std::to_string(k)), {{0, 2}});
      else
        c.add_cell(k, detail::concat("e", std::to_string(k)));
    }
    return c;
  }
  /// The lens space L(p, q) with one cell per dimension 0..3, boundaries 0, p, 0 in
  /// dimensions 1, 2, 3 (from memory; q does not enter the cellular boundaries).
  /// Throws std::invalid_argument unless p >= 1 and gcd(p, q) = 1.
  static cell_list lens_space(std::int64_t p, std::int64_t q) {
    if (p < 1 || std::gcd(p, q) != 1)
      throw std::invalid_argument("lens_space: L(p, q) needs p >= 1 and gcd(p, q) = 1, got p = " +
                                  std::to_string(p) + ", q = " + std::to_string(q));
    cell_list c;
    c.add_cell(0, "e0");
    c.add_cell(1, "e1");
    c.add_cell(2, "e2", {{0, p}});
    c.add_cell(3, "e3");
    return c;
  }
  /// S^n with two cells: a point and an n-cell attached by the constant map (n >= 1);
  /// S^0 is two points. Throws std::invalid_argument if n < 0.
  static cell_list sphere(int n) {
    if (n < 0) throw std::invalid_argument("sphere: negative dimension " + std::to_string(n));
    cell_list c;
    c.add_cell(0, "p");
    if (n == 0)
      c.add_cell(0, "q");
    else
      c.add_cell(n, "e");
    return c;
  }

 private:
  struct dimension {
    std::vector<std::size_t> offsets{0};
    std::vector<incidence> terms;
    std::vector<std::string> names;
  };
  std::vector<dimension> dims_;
};

}  // namespace lacuna

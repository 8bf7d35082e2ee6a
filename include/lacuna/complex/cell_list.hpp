// lacuna/complex/cell_list.hpp — Delta- and CW complexes given cell by cell, with arbitrary
// integer incidence numbers of any size (models lacuna::cell_complex).
//
// Storage: per dimension, a CSR array of the boundaries (offsets, then (face, coefficient)
// terms, one entry per face with a non-zero coefficient, faces increasing) and the cell
// names. Cells are added in any order of dimension; a k-cell's faces must be (k-1)-cells
// that exist when it is added.
//
// Coefficients: the terms of a dimension are stored as lacuna::incidence (int64) until a
// coefficient of that dimension does not fit in 64 bits; from then on that dimension alone
// stores lacuna::exact_incidence (lacuna::integer coefficients). boundary(k, i) is one view
// type for both, whose terms are exact_incidence values (built from the int64 storage
// without allocating); small_boundary(k, i) is the int64 span where the dimension has one.
//
// The standard complexes are static members: circle, torus, klein_bottle, projective_plane,
// real_projective_space(n), lens_space(p, q), sphere(n).
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/detail/concat.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <initializer_list>
#include <iterator>
#include <limits>
#include <numeric>
#include <optional>
#include <ranges>
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
  if (lacuna::checked_add(a, b, r)) throw invalid_complex("integer overflow: " + what);
  return r;
}
/// a * b, or an invalid_complex naming `what` if it does not fit int64.
inline std::int64_t checked_mul(std::int64_t a, std::int64_t b, const std::string& what) {
  std::int64_t r;
  if (lacuna::checked_mul(a, b, r)) throw invalid_complex("integer overflow: " + what);
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

/// Sorts terms by face; if every sum of the coefficients of one face fits in int64, adds them
/// up, drops zeros and returns true; otherwise leaves the (sorted) terms and returns false.
inline bool normalize_chain_if_fits(std::vector<incidence>& terms) {
  std::stable_sort(terms.begin(), terms.end(),
                   [](const incidence& a, const incidence& b) { return a.face < b.face; });
  bool merge = false;
  for (std::size_t t = 0; t < terms.size();) {
    std::int64_t sum = 0;
    const std::size_t f = terms[t].face, t0 = t;
    for (; t < terms.size() && terms[t].face == f; ++t)
      if (lacuna::checked_add(sum, terms[t].coefficient, sum)) return false;
    merge = merge || sum == 0 || t - t0 > 1;
  }
  if (merge) normalize_chain(terms, std::string());
  return true;
}

/// Sorts terms by face, adds the coefficients of equal faces exactly, drops zeros.
inline void normalize_chain(std::vector<exact_incidence>& terms) {
  std::stable_sort(terms.begin(), terms.end(),
                   [](const exact_incidence& a, const exact_incidence& b) { return a.face < b.face; });
  std::size_t o = 0;
  for (std::size_t t = 0; t < terms.size();) {
    integer sum;
    const std::size_t f = terms[t].face;
    for (; t < terms.size() && terms[t].face == f; ++t) sum += terms[t].coefficient;
    if (sum.sign() != 0) terms[o++] = exact_incidence{f, std::move(sum)};
  }
  terms.resize(o);
}
}  // namespace detail

/// A complex given cell by cell: names and integer boundaries. Models lacuna::cell_complex.
class cell_list {
 public:
  /// The boundary of a cell: a random-access view of exact_incidence values, over the int64
  /// or the exact storage of its dimension. Models std::ranges::random_access_range and
  /// std::ranges::sized_range; the terms are values (prvalues), not references.
  // (No std::ranges::view_interface base: clang 14 with libstdc++ 12 cannot check its
  // constraints on a nested class; the members it would add are written out below, and the
  // view_base tag makes it a std::ranges::view.)
  class boundary_view : public std::ranges::view_base {
   public:
    /// A random-access iterator over the terms (values, not references).
    class iterator {
     public:
      ///@{
      /// The iterator's types (std::ranges random access; the legacy category is input, since the terms are prvalues).
      using iterator_concept = std::random_access_iterator_tag;
      using iterator_category = std::input_iterator_tag;
      using value_type = exact_incidence;
      using reference = exact_incidence;
      using difference_type = std::ptrdiff_t;
      ///@}
      iterator() = default;
      /// The term i of the int64 storage s or, if s is null, of the exact storage e.
      iterator(const incidence* s, const exact_incidence* e, difference_type i) : s_(s), e_(e), i_(i) {}
      /// The current term.
      exact_incidence operator*() const {
        if (s_) [[likely]]
          return {s_[i_].face, integer(s_[i_].coefficient)};
        return e_[i_];
      }
      /// The term n places on.
      exact_incidence operator[](difference_type n) const { return *(*this + n); }
      ///@{
      /// Random-access iterator arithmetic and comparison.
      iterator& operator++() { return ++i_, *this; }
      iterator operator++(int) { auto t = *this; ++i_; return t; }
      iterator& operator--() { return --i_, *this; }
      iterator operator--(int) { auto t = *this; --i_; return t; }
      iterator& operator+=(difference_type n) { return i_ += n, *this; }
      iterator& operator-=(difference_type n) { return i_ -= n, *this; }
      friend iterator operator+(iterator a, difference_type n) { return a += n; }
      friend iterator operator+(difference_type n, iterator a) { return a += n; }
      friend iterator operator-(iterator a, difference_type n) { return a -= n; }
      friend difference_type operator-(const iterator& a, const iterator& b) { return a.i_ - b.i_; }
      friend bool operator==(const iterator& a, const iterator& b) { return a.i_ == b.i_; }
      friend auto operator<=>(const iterator& a, const iterator& b) { return a.i_ <=> b.i_; }
      ///@}

     private:
      const incidence* s_ = nullptr;
      const exact_incidence* e_ = nullptr;
      difference_type i_ = 0;
    };

    boundary_view() = default;
    ///@{
    /// A view of int64 or of exact terms.
    explicit boundary_view(std::span<const incidence> s) : s_(s.data()), n_(s.size()) {}
    explicit boundary_view(std::span<const exact_incidence> e) : e_(e.data()), n_(e.size()) {}
    ///@}
    ///@{
    /// The range of terms.
    iterator begin() const { return {s_, e_, 0}; }
    iterator end() const { return {s_, e_, static_cast<std::ptrdiff_t>(n_)}; }
    ///@}
    /// The number of terms.
    std::size_t size() const { return n_; }
    /// True when the cell has no faces.
    bool empty() const { return n_ == 0; }
    ///@{
    /// A term by position, the first and the last.
    exact_incidence operator[](std::size_t i) const { return begin()[static_cast<std::ptrdiff_t>(i)]; }
    exact_incidence front() const { return (*this)[0]; }
    exact_incidence back() const { return (*this)[n_ - 1]; }
    ///@}
    /// True when the terms are stored as int64 (then small_terms() holds them).
    bool is_small() const { return s_ != nullptr || e_ == nullptr; }
    /// The int64 terms. Precondition: is_small().
    std::span<const incidence> small_terms() const { return {s_, s_ ? n_ : 0}; }

   private:
    const incidence* s_ = nullptr;
    const exact_incidence* e_ = nullptr;
    std::size_t n_ = 0;
  };

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
  /// The boundary of the i-th k-cell: faces increasing, coefficients non-zero, exact.
  /// Precondition: i < cell_count(k).
  boundary_view boundary(int k, std::size_t i) const {
    const auto& d = dims_[static_cast<std::size_t>(k)];
    const std::size_t b = d.offsets[i], n = d.offsets[i + 1] - b;
    if (!d.exact) [[likely]]
      return boundary_view(std::span<const incidence>(d.terms.data() + b, n));
    return boundary_view(std::span<const exact_incidence>(d.exact_terms.data() + b, n));
  }
  /// The boundary of the i-th k-cell with int64 coefficients, without conversion. Throws
  /// std::overflow_error if dimension k holds a coefficient beyond int64 (has_big_coefficients).
  std::span<const incidence> small_boundary(int k, std::size_t i) const {
    const auto& d = dims_[static_cast<std::size_t>(k)];
    if (d.exact)
      throw std::overflow_error("cell_list: the " + std::to_string(k) +
                                "-cells have incidence numbers beyond 64 bits; use boundary()");
    return {d.terms.data() + d.offsets[i], d.offsets[i + 1] - d.offsets[i]};
  }
  /// True if some k-cell has an incidence number that does not fit in std::int64_t.
  bool has_big_coefficients(int k) const noexcept {
    return k >= 0 && static_cast<std::size_t>(k) < dims_.size() && dims_[static_cast<std::size_t>(k)].exact;
  }
  /// The name of the i-th k-cell.
  const std::string& cell_name(int k, std::size_t i) const { return dims_.at(static_cast<std::size_t>(k)).names.at(i); }

  // ---- building ------------------------------------------------------------------------
  /// Adds a k-cell with this name and boundary (terms with equal faces add up, exactly;
  /// zero terms are dropped) and returns its index among the k-cells. An empty name becomes
  /// "e<k>_<i>". Throws lacuna::invalid_complex if k < 0, a face is not an existing
  /// (k-1)-cell, or a 0-cell is given a non-zero boundary. A sum beyond int64 is kept exactly
  /// (the dimension switches to exact storage). ∂∂ = 0 is not checked here (see
  /// lacuna::validate).
  std::size_t add_cell(int k, std::string name, std::vector<incidence> boundary_terms) {
    auto& d = prepare(k, name);
    const std::vector<std::size_t> written = faces_as_written(boundary_terms);
    if (!detail::normalize_chain_if_fits(boundary_terms) || d.exact) {  // a sum beyond int64: exactly
      std::vector<exact_incidence> exact;
      exact.reserve(boundary_terms.size());
      for (const auto& t : boundary_terms) exact.push_back({t.face, integer(t.coefficient)});
      return add_exact(k, std::move(name), std::move(exact), written);
    }
    check_faces(k, name, boundary_terms);
    d.terms.insert(d.terms.end(), boundary_terms.begin(), boundary_terms.end());
    return finish(k, std::move(name), written);
  }
  /// The same with exact coefficients of any size. The terms are stored as int64 while every
  /// coefficient of the dimension fits.
  std::size_t add_cell(int k, std::string name, std::vector<exact_incidence> boundary_terms) {
    prepare(k, name);
    const std::vector<std::size_t> written = faces_as_written(boundary_terms);
    return add_exact(k, std::move(name), std::move(boundary_terms), written);
  }
  /// The same from a braced list of int64 terms.
  std::size_t add_cell(int k, std::string name, std::initializer_list<incidence> boundary_terms = {}) {
    return add_cell(k, std::move(name), std::vector<incidence>(boundary_terms));
  }
  /// Reserves room for n cells of dimension k with `terms` boundary terms in all.
  void reserve(int k, std::size_t n, std::size_t terms) {
    const auto uk = static_cast<std::size_t>(k);
    if (dims_.size() <= uk) dims_.resize(uk + 1);
    dims_[uk].names.reserve(n);
    dims_[uk].offsets.reserve(n + 1);
    if (dims_[uk].exact)
      dims_[uk].exact_terms.reserve(terms);
    else
      dims_[uk].terms.reserve(terms);
  }

  /// The faces of the i-th k-cell as its boundary was written, increasing: those of
  /// boundary(k, i) and those whose coefficients added up to zero (the face of
  /// `1 q : p - p` is p). A filtration waits for them (lacuna::faces_as_written).
  std::vector<std::size_t> faces_as_written(int k, std::size_t i) const {
    std::vector<std::size_t> out;
    for (const auto& t : boundary(k, i)) out.push_back(t.face);
    const auto& c = dims_[static_cast<std::size_t>(k)].cancelled;
    auto it = std::lower_bound(c.begin(), c.end(), std::pair<std::size_t, std::size_t>{i, 0});
    const std::size_t n = out.size();
    for (; it != c.end() && it->first == i; ++it) out.push_back(it->second);
    if (out.size() != n) std::inplace_merge(out.begin(), out.begin() + static_cast<std::ptrdiff_t>(n), out.end());
    return out;
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

  /// Equal names and boundaries (faces written with coefficients adding up to zero are not
  /// compared).
  friend bool operator==(const cell_list& a, const cell_list& b) {
    const int top = a.top_dimension();
    if (top != b.top_dimension()) return false;
    for (int k = 0; k <= top; ++k) {
      const auto& x = a.dims_[static_cast<std::size_t>(k)];
      const auto& y = b.dims_[static_cast<std::size_t>(k)];
      if (x.names != y.names || x.offsets != y.offsets) return false;
      if (!x.exact && !y.exact) {
        if (x.terms != y.terms) return false;
      } else {
        for (std::size_t i = 0; i + 1 < x.offsets.size(); ++i)
          if (!std::ranges::equal(a.boundary(k, i), b.boundary(k, i))) return false;
      }
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
    std::vector<incidence> terms;              // while !exact
    std::vector<exact_incidence> exact_terms;  // once a coefficient does not fit in int64
    std::vector<std::string> names;
    // (cell, face) for the faces written in a boundary whose coefficients added up to zero,
    // by cell: usually empty
    std::vector<std::pair<std::size_t, std::size_t>> cancelled;
    bool exact = false;
  };
  std::vector<dimension> dims_;

  /// The distinct faces of the terms, sorted.
  template <class Terms>
  static std::vector<std::size_t> faces_as_written(const Terms& terms) {
    std::vector<std::size_t> w;
    w.reserve(terms.size());
    for (const auto& t : terms) w.push_back(t.face);
    std::sort(w.begin(), w.end());
    w.erase(std::unique(w.begin(), w.end()), w.end());
    return w;
  }

  /// The dimension record of k (created if needed), and the default name of the new cell.
  dimension& prepare(int k, std::string& name) {
    if (k < 0) throw invalid_complex("cell_list: a cell of negative dimension " + std::to_string(k));
    const auto uk = static_cast<std::size_t>(k);
    if (dims_.size() <= uk) dims_.resize(uk + 1);
    auto& d = dims_[uk];
    if (name.empty()) name = detail::concat("e", std::to_string(k), "_", std::to_string(d.names.size()));
    return d;
  }
  template <class Terms>
  void check_faces(int k, const std::string& name, const Terms& terms) const {
    const std::size_t index = cell_count(k);
    if (k == 0 && !terms.empty())
      throw invalid_complex("cell_list: the 0-cell '" + name + "' is given a non-zero boundary", 0, index);
    for (const auto& t : terms)
      if (t.face >= cell_count(k - 1))
        throw invalid_complex("cell_list: the boundary of " + std::to_string(k) + "-cell '" + name +
                                  "' names face " + std::to_string(t.face) + ", but there are only " +
                                  std::to_string(cell_count(k - 1)) + " " + std::to_string(k - 1) + "-cells",
                              k, index);
  }
  /// Closes the cell just stored in dimension k; `written` (sorted, distinct) are the faces
  /// named in its boundary, and those that are not in the stored boundary are kept apart.
  std::size_t finish(int k, std::string name, const std::vector<std::size_t>& written) {
    dimension& d = dims_[static_cast<std::size_t>(k)];
    const std::size_t begin = d.offsets.back();
    const std::size_t end = d.exact ? d.exact_terms.size() : d.terms.size();
    d.offsets.push_back(end);
    d.names.push_back(std::move(name));
    const std::size_t i = d.names.size() - 1;
    if (end - begin != written.size()) {  // some written faces cancelled out: both lists sorted
      std::size_t t = begin;
      for (std::size_t f : written) {
        if (t < end && (d.exact ? d.exact_terms[t].face : d.terms[t].face) == f)
          ++t;
        else
          d.cancelled.emplace_back(i, f);
      }
    }
    return i;
  }
  std::size_t add_exact(int k, std::string name, std::vector<exact_incidence> terms, const std::vector<std::size_t>& written) {
    auto& d = dims_[static_cast<std::size_t>(k)];
    detail::normalize_chain(terms);
    check_faces(k, name, terms);
    const bool fits = std::ranges::all_of(terms, [](const exact_incidence& t) { return t.coefficient.is_small(); });
    if (fits && !d.exact) {
      for (const auto& t : terms) d.terms.push_back({t.face, t.coefficient.small_value()});
    } else {
      if (!d.exact) {  // switch this dimension to exact storage
        d.exact_terms.reserve(d.terms.size() + terms.size());
        for (const auto& t : d.terms) d.exact_terms.push_back({t.face, integer(t.coefficient)});
        std::vector<incidence>().swap(d.terms);
        d.exact = true;
      }
      for (auto& t : terms) d.exact_terms.push_back(std::move(t));
    }
    return finish(k, std::move(name), written);
  }
};

}  // namespace lacuna

// lacuna/complex/concepts.hpp — the cell-complex concepts and their customization points.
//
// A cell complex, for lacuna, is a graded family of cells with integer boundaries:
//   * a top dimension (-1 for the empty complex);
//   * for each dimension k in 0..top, a count n_k; the k-cells are indexed 0..n_k-1;
//   * for each cell, its boundary: a range of (face index, integer coefficient) pairs,
//     the faces being (k-1)-cells. A 0-cell has an empty boundary.
// Optionally it offers coboundaries (the cells having a given cell as a face, with the same
// coefficients) when it can give them cheaply, and names for its cells.
//
// The concepts refine one another, as graph concepts do in generic graph libraries:
//
//     graded_cells  ->  cell_complex  ->  complex_with_coboundary
//
// Each operation is a customization point that resolves, in this order, to
//   1. a static member of a specialization of lacuna::complex_traits<C>  (full control),
//   2. a member function of C                          (lacuna's own complexes do this),
//   3. a free function found by argument-dependent lookup in C's namespace (adapt a type you
//      cannot edit: examples/half_edge_adapter.cpp).
#pragma once

#include <concepts>
#include <cstddef>
#include <cstdint>
#include <iterator>
#include <ranges>
#include <string>
#include <tuple>
#include <type_traits>
#include <utility>

namespace lacuna {

/// One term of a boundary: the face (a cell one dimension down, by index) and its
/// incidence number.
struct incidence {
  std::size_t face;
  std::int64_t coefficient;
  friend bool operator==(const incidence&, const incidence&) = default;
};

/// Full-control customization point: specialize for a complex type you cannot edit.
/// Every member is optional (members of C and ADL functions are used where it is silent):
///   static int top_dimension(const C&);
///   static std::size_t cell_count(const C&, int k);
///   static R boundary(const C&, int k, std::size_t i);       R: range of incidence-like
///   static R coboundary(const C&, int k, std::size_t i);     optional: cheap coboundaries
///   static std::string cell_name(const C&, int k, std::size_t i);   optional
template <class C>
struct complex_traits {};

/// A value that names a face and a coefficient: lacuna::incidence, any struct with members
/// `face` and `coefficient`, or a pair-like (std::pair<index, coefficient>, std::tuple).
template <class V>
concept incidence_like =
    requires(const V& v) {
      { v.face } -> std::convertible_to<std::size_t>;
      { v.coefficient } -> std::convertible_to<std::int64_t>;
    } ||
    requires(const V& v) {
      { std::get<0>(v) } -> std::convertible_to<std::size_t>;
      { std::get<1>(v) } -> std::convertible_to<std::int64_t>;
    };

/// Reads an incidence-like value as lacuna::incidence.
template <incidence_like V>
constexpr incidence as_incidence(const V& v) {
  if constexpr (requires { v.face; v.coefficient; })
    return {static_cast<std::size_t>(v.face), static_cast<std::int64_t>(v.coefficient)};
  else
    return {static_cast<std::size_t>(std::get<0>(v)), static_cast<std::int64_t>(std::get<1>(v))};
}

namespace complex_cpo_detail {

void top_dimension() = delete;
void cell_count() = delete;
void boundary() = delete;
void coboundary() = delete;
void cell_name() = delete;

struct top_dimension_fn {
  template <class C>
    requires requires(const C& c) { { complex_traits<C>::top_dimension(c) } -> std::convertible_to<int>; }
  constexpr int operator()(const C& c) const {
    return complex_traits<C>::top_dimension(c);
  }
  template <class C>
    requires(!requires(const C& c) { complex_traits<C>::top_dimension(c); } &&
             requires(const C& c) { { c.top_dimension() } -> std::convertible_to<int>; })
  constexpr int operator()(const C& c) const {
    return c.top_dimension();
  }
  template <class C>
    requires(!requires(const C& c) { complex_traits<C>::top_dimension(c); } &&
             !requires(const C& c) { c.top_dimension(); } &&
             requires(const C& c) { { top_dimension(c) } -> std::convertible_to<int>; })
  constexpr int operator()(const C& c) const {
    return top_dimension(c);
  }
};

struct cell_count_fn {
  template <class C>
    requires requires(const C& c, int k) { { complex_traits<C>::cell_count(c, k) } -> std::convertible_to<std::size_t>; }
  constexpr std::size_t operator()(const C& c, int k) const {
    return complex_traits<C>::cell_count(c, k);
  }
  template <class C>
    requires(!requires(const C& c, int k) { complex_traits<C>::cell_count(c, k); } &&
             requires(const C& c, int k) { { c.cell_count(k) } -> std::convertible_to<std::size_t>; })
  constexpr std::size_t operator()(const C& c, int k) const {
    return c.cell_count(k);
  }
  template <class C>
    requires(!requires(const C& c, int k) { complex_traits<C>::cell_count(c, k); } &&
             !requires(const C& c, int k) { c.cell_count(k); } &&
             requires(const C& c, int k) { { cell_count(c, k) } -> std::convertible_to<std::size_t>; })
  constexpr std::size_t operator()(const C& c, int k) const {
    return cell_count(c, k);
  }
};

struct boundary_fn {
  template <class C>
    requires requires(const C& c, int k, std::size_t i) { complex_traits<C>::boundary(c, k, i); }
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return complex_traits<C>::boundary(c, k, i);
  }
  template <class C>
    requires(!requires(const C& c, int k, std::size_t i) { complex_traits<C>::boundary(c, k, i); } &&
             requires(const C& c, int k, std::size_t i) { c.boundary(k, i); })
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return c.boundary(k, i);
  }
  template <class C>
    requires(!requires(const C& c, int k, std::size_t i) { complex_traits<C>::boundary(c, k, i); } &&
             !requires(const C& c, int k, std::size_t i) { c.boundary(k, i); } &&
             requires(const C& c, int k, std::size_t i) { boundary(c, k, i); })
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return boundary(c, k, i);
  }
};

struct coboundary_fn {
  template <class C>
    requires requires(const C& c, int k, std::size_t i) { complex_traits<C>::coboundary(c, k, i); }
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return complex_traits<C>::coboundary(c, k, i);
  }
  template <class C>
    requires(!requires(const C& c, int k, std::size_t i) { complex_traits<C>::coboundary(c, k, i); } &&
             requires(const C& c, int k, std::size_t i) { c.coboundary(k, i); })
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return c.coboundary(k, i);
  }
  template <class C>
    requires(!requires(const C& c, int k, std::size_t i) { complex_traits<C>::coboundary(c, k, i); } &&
             !requires(const C& c, int k, std::size_t i) { c.coboundary(k, i); } &&
             requires(const C& c, int k, std::size_t i) { coboundary(c, k, i); })
  constexpr decltype(auto) operator()(const C& c, int k, std::size_t i) const {
    return coboundary(c, k, i);
  }
};

struct cell_name_fn {
  template <class C>
  std::string operator()(const C& c, int k, std::size_t i) const {
    if constexpr (requires { { complex_traits<C>::cell_name(c, k, i) } -> std::convertible_to<std::string>; })
      return complex_traits<C>::cell_name(c, k, i);
    else if constexpr (requires { { c.cell_name(k, i) } -> std::convertible_to<std::string>; })
      return c.cell_name(k, i);
    else if constexpr (requires { { cell_name(c, k, i) } -> std::convertible_to<std::string>; })
      return cell_name(c, k, i);
    else  // the default name of the i-th k-cell
      return "e" + std::to_string(k) + "_" + std::to_string(i);
  }
};

}  // namespace complex_cpo_detail

inline namespace cpo {
/// lacuna::top_dimension(c): the highest dimension of a cell, -1 for the empty complex.
inline constexpr complex_cpo_detail::top_dimension_fn top_dimension{};
/// lacuna::cell_count(c, k): the number of k-cells (0 for k outside 0..top).
inline constexpr complex_cpo_detail::cell_count_fn cell_count{};
/// lacuna::boundary(c, k, i): the boundary of the i-th k-cell, a range of incidence-like values.
inline constexpr complex_cpo_detail::boundary_fn boundary{};
/// lacuna::coboundary(c, k, i): the (k+1)-cells with the i-th k-cell as a face, where offered.
inline constexpr complex_cpo_detail::coboundary_fn coboundary{};
/// lacuna::cell_name(c, k, i): a name for a cell, for output ("a b c", a cell-list NAME, ...).
inline constexpr complex_cpo_detail::cell_name_fn cell_name{};
}  // namespace cpo

/// A graded family of cells: a top dimension and a count per dimension.
template <class C>
concept graded_cells = requires(const C& c, int k) {
  { lacuna::top_dimension(c) } -> std::convertible_to<int>;
  { lacuna::cell_count(c, k) } -> std::convertible_to<std::size_t>;
};

/// The range type of the boundary of a cell of C.
template <class C>
using boundary_range_t = decltype(lacuna::boundary(std::declval<const C&>(), 0, std::size_t{}));

/// A cell complex: graded cells whose boundaries are ranges of incidence-like values.
template <class C>
concept cell_complex = graded_cells<C> && requires(const C& c, int k, std::size_t i) {
  { lacuna::boundary(c, k, i) } -> std::ranges::input_range;
} && incidence_like<std::ranges::range_value_t<boundary_range_t<C>>>;

/// A cell complex that gives coboundaries cheaply. Algorithms that need coboundaries of a
/// complex that is not one build them on demand (lacuna/complex/coboundary_table.hpp).
template <class C>
concept complex_with_coboundary = cell_complex<C> && requires(const C& c, int k, std::size_t i) {
  { lacuna::coboundary(c, k, i) } -> std::ranges::input_range;
} && incidence_like<std::ranges::range_value_t<decltype(lacuna::coboundary(std::declval<const C&>(), 0, std::size_t{}))>>;

/// The total number of cells of c.
template <graded_cells C>
std::size_t total_cell_count(const C& c) {
  std::size_t n = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) n += lacuna::cell_count(c, k);
  return n;
}

/// The Euler characteristic from cell counts: sum of (-1)^k n_k.
template <graded_cells C>
std::int64_t euler_characteristic(const C& c) {
  std::int64_t chi = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) {
    const auto n = static_cast<std::int64_t>(lacuna::cell_count(c, k));
    chi += (k % 2 == 0) ? n : -n;
  }
  return chi;
}

}  // namespace lacuna

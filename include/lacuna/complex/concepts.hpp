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
//
// Incidence numbers are integers of any size. A boundary term's coefficient is either
// convertible to std::int64_t (the fast path: lacuna::incidence, the built-in complexes) or to
// lacuna::integer (exact: lacuna::exact_incidence, cell_list with coefficients beyond int64).
// Read them with
//   * coefficient_as_integer(v)   the exact value, for every incidence-like v;
//   * as_incidence(v)             as int64; std::overflow_error if the value does not fit, so
//                                 that code written for int64 never truncates silently;
//   * coefficient_in<R>(n, unit)  the image of an integer in a ring R (from_integer<R> for a
//                                 64-bit value, base-2^62 Horner beyond).
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <concepts>
#include <cstddef>
#include <cstdint>
#include <iterator>
#include <limits>
#include <ranges>
#include <stdexcept>
#include <string>
#include <tuple>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

/// One term of a boundary: the face (a cell one dimension down, by index) and its
/// incidence number.
struct incidence {
  /// The index of the face among the (k-1)-cells.
  std::size_t face;
  /// The incidence number.
  std::int64_t coefficient;
  /// Same face and incidence number.
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

/// One term of a boundary with an exact incidence number of any size.
struct exact_incidence {
  /// The index of the face among the (k-1)-cells.
  std::size_t face;
  /// The incidence number.
  integer coefficient;
  ///@{
  /// Same face and incidence number.
  friend bool operator==(const exact_incidence&, const exact_incidence&) = default;
  friend bool operator==(const exact_incidence& a, const incidence& b) {
  ///@}
    return a.face == b.face && a.coefficient == integer(b.coefficient);
  }
};

namespace incidence_detail {
template <class T>
concept integer_coefficient = std::convertible_to<T, std::int64_t> || std::convertible_to<T, integer>;
template <class V>
concept member_incidence = requires(const V& v) {
  { v.face } -> std::convertible_to<std::size_t>;
  { v.coefficient } -> integer_coefficient;
};
template <class V>
concept tuple_incidence = requires(const V& v) {
  { std::get<0>(v) } -> std::convertible_to<std::size_t>;
  { std::get<1>(v) } -> integer_coefficient;
};
template <class V>
constexpr decltype(auto) coefficient_of(const V& v) {
  if constexpr (member_incidence<V>)
    return (v.coefficient);
  else
    return std::get<1>(v);
}

/// True when every value of T fits in std::int64_t (see small_incidence_like).
template <class T>
inline constexpr bool fits_int64_by_type = [] {
  if constexpr (std::integral<T>)
    return sizeof(T) < sizeof(std::int64_t) || (sizeof(T) == sizeof(std::int64_t) && std::is_signed_v<T>);
  else
    return std::convertible_to<T, std::int64_t> && !std::convertible_to<T, integer>;
}();
}  // namespace incidence_detail

/// A value that names a face and a coefficient: lacuna::incidence, lacuna::exact_incidence,
/// any struct with members `face` and `coefficient`, or a pair-like (std::pair<index,
/// coefficient>, std::tuple). The coefficient converts to std::int64_t or to lacuna::integer.
template <class V>
concept incidence_like = incidence_detail::member_incidence<V> || incidence_detail::tuple_incidence<V>;

/// The type of the coefficient of an incidence-like V, without reference and const.
template <incidence_like V>
using incidence_coefficient_t =
    std::remove_cvref_t<decltype(incidence_detail::coefficient_of(std::declval<const V&>()))>;

/// True when every coefficient of V fits in std::int64_t by its type (the fast path): the
/// coefficient is an integral type of at most 64 bits that is not unsigned 64-bit, or a class
/// convertible to std::int64_t and not to lacuna::integer.
template <class V>
concept small_incidence_like = incidence_like<V> && incidence_detail::fits_int64_by_type<incidence_coefficient_t<V>>;

/// The face of an incidence-like value.
template <incidence_like V>
constexpr std::size_t incidence_face(const V& v) {
  if constexpr (incidence_detail::member_incidence<V>)
    return static_cast<std::size_t>(v.face);
  else
    return static_cast<std::size_t>(std::get<0>(v));
}

/// The exact coefficient of an incidence-like value, as lacuna::integer.
template <incidence_like V>
integer coefficient_as_integer(const V& v) {
  using T = incidence_coefficient_t<V>;
  const auto& c = incidence_detail::coefficient_of(v);
  if constexpr (std::same_as<T, integer>)
    return c;
  else if constexpr (std::integral<T> && !std::same_as<T, bool> && sizeof(T) > sizeof(std::int64_t))
    return integer(integer::big_type(c));  // __int128 and its kin
  else if constexpr (std::integral<T> && !std::same_as<T, bool>)
    return integer(c);  // exact for every built-in width up to 64 bits, unsigned too
  else if constexpr (std::convertible_to<T, integer>)
    return static_cast<integer>(c);
  else
    return integer(static_cast<std::int64_t>(c));
}

/// Reads an incidence-like value exactly, as lacuna::exact_incidence.
template <incidence_like V>
exact_incidence as_exact_incidence(const V& v) {
  return {incidence_face(v), coefficient_as_integer(v)};
}

namespace incidence_detail {
[[noreturn, gnu::cold]] inline void throw_does_not_fit(std::size_t face, const std::string& value) {
  throw std::overflow_error("lacuna: the incidence number " + value + " (on face " + std::to_string(face) +
                            ") does not fit in a signed 64-bit integer; read it with "
                            "lacuna::coefficient_as_integer");
}
}  // namespace incidence_detail

/// Reads an incidence-like value as lacuna::incidence (64-bit). Throws std::overflow_error if
/// the coefficient does not fit in std::int64_t (read such values with coefficient_as_integer).
template <incidence_like V>
incidence as_incidence(const V& v) {
  using T = incidence_coefficient_t<V>;
  const std::size_t face = incidence_face(v);
  if constexpr (small_incidence_like<V>) {
    return {face, static_cast<std::int64_t>(incidence_detail::coefficient_of(v))};
  } else if constexpr (std::unsigned_integral<T>) {
    const auto c = incidence_detail::coefficient_of(v);
    if (c > static_cast<T>(std::numeric_limits<std::int64_t>::max()))
      incidence_detail::throw_does_not_fit(face, std::to_string(c));
    return {face, static_cast<std::int64_t>(c)};
  } else {
    const integer c = coefficient_as_integer(v);
    if (!c.is_small()) incidence_detail::throw_does_not_fit(face, c.to_string());
    return {face, c.small_value()};
  }
}

/// The image of the integer n in R: from_integer<R>(n) * unit for a 64-bit value; beyond, by
/// Horner's rule in base 2^62 on |n| with from_integer on every digit, so it holds for Z, Q,
/// Z/p and every ring that maps machine integers. For lacuna::checked_int64 a value beyond
/// 64 bits overflows in the ring's own arithmetic (coefficient_overflow). `ring_one` is the one of
/// R (it matters for rings whose modulus lives in the elements).
template <class R>
R coefficient_in(const integer& n, const R& ring_one = one<R>()) {
  if (n.is_small()) [[likely]]
    return from_integer<R>(n.small_value()) * ring_one;
  constexpr unsigned bits = 62;
  const integer::big_type mask = (integer::big_type(1) << bits) - 1;
  integer::big_type m = n.to_big();
  const bool negative = m.sign() < 0;
  if (negative) m = -m;
  std::vector<std::int64_t> digits;  // least significant first
  while (m != 0) {
    digits.push_back(static_cast<std::int64_t>(m & mask));
    m >>= bits;
  }
  const R base = from_integer<R>(std::int64_t{1} << bits) * ring_one;
  R acc = zero<R>() * ring_one;
  for (std::size_t d = digits.size(); d-- > 0;) acc = acc * base + from_integer<R>(digits[d]) * ring_one;
  return negative ? -acc : acc;
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

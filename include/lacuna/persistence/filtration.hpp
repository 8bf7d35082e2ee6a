// lacuna/persistence/filtration.hpp — the filtration concept, its customization points, and
// the check that faces never enter after their cofaces.
//
// A filtration, for lacuna, is a cell complex (lacuna::cell_complex) whose every cell has a
// value, the moment it enters; values are of any totally ordered type (double, integer
// samples, a user's type) compared by an order the filtration chooses (std::less by default;
// a superlevel filtration runs from the largest value down). Cells enter in the order of
//     (value, dimension, index within the dimension),
// so cells of equal value enter by dimension, then by index: this is the total order every
// persistence reduction of lacuna works with, and the one in which the pairs are reported.
// A face must never enter after one of its cofaces (filtration_error names the cell).
//
// The operations are customization points, resolved like those of lacuna::cell_complex:
//   1. a static member of a specialization of lacuna::filtration_traits<F>   (full control),
//   2. a member function of F                        (lacuna's own filtrations do this),
//   3. a free function found by argument-dependent lookup in F's namespace.
//     lacuna::cell_value(f, k, i)       the value of the i-th k-cell (compulsory);
//     lacuna::value_order(f)            the strict weak order on values (optional: std::less);
//     lacuna::faces_as_written(c, k, i) the faces a cell waits for (optional, any complex):
//                                       a cell list keeps the faces written in its boundary
//                                       even when their coefficients add up to zero; the
//                                       default is the faces with a non-zero coefficient.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <charconv>
#include <concepts>
#include <cstddef>
#include <functional>
#include <ostream>
#include <ranges>
#include <sstream>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

/// Full-control customization point: specialize for a filtration type you cannot edit.
/// Every member is optional (members of F and ADL functions are used where it is silent):
///   static V cell_value(const F&, int k, std::size_t i);
///   static O value_order(const F&);       O: a strict weak order on V (default std::less<V>)
/// The cell-complex operations themselves come from lacuna::complex_traits<F>, members or ADL.
template <class F>
struct filtration_traits {};

/// A type usable as a filtration value: copyable and totally ordered by its operators (the
/// filtration may still order values another way, see value_order).
template <class V>
concept filtration_value = std::copyable<V> && std::totally_ordered<V>;

namespace filtration_cpo_detail {

void cell_value() = delete;
void value_order() = delete;
void faces_as_written() = delete;

struct cell_value_fn {
  template <class F>
    requires requires(const F& f, int k, std::size_t i) { filtration_traits<F>::cell_value(f, k, i); }
  constexpr decltype(auto) operator()(const F& f, int k, std::size_t i) const {
    return filtration_traits<F>::cell_value(f, k, i);
  }
  template <class F>
    requires(!requires(const F& f, int k, std::size_t i) { filtration_traits<F>::cell_value(f, k, i); } &&
             requires(const F& f, int k, std::size_t i) { f.cell_value(k, i); })
  constexpr decltype(auto) operator()(const F& f, int k, std::size_t i) const {
    return f.cell_value(k, i);
  }
  template <class F>
    requires(!requires(const F& f, int k, std::size_t i) { filtration_traits<F>::cell_value(f, k, i); } &&
             !requires(const F& f, int k, std::size_t i) { f.cell_value(k, i); } &&
             requires(const F& f, int k, std::size_t i) { cell_value(f, k, i); })
  constexpr decltype(auto) operator()(const F& f, int k, std::size_t i) const {
    return cell_value(f, k, i);
  }
};

template <class F>
using value_of_t = std::remove_cvref_t<decltype(std::declval<cell_value_fn>()(std::declval<const F&>(), 0, std::size_t{}))>;

struct value_order_fn {
  template <class F>
  constexpr auto operator()(const F& f) const {
    if constexpr (requires { filtration_traits<F>::value_order(f); })
      return filtration_traits<F>::value_order(f);
    else if constexpr (requires { f.value_order(); })
      return f.value_order();
    else if constexpr (requires { value_order(f); })
      return value_order(f);
    else
      return std::less<value_of_t<F>>{};
  }
};

struct faces_as_written_fn {
  template <class C>
  std::vector<std::size_t> operator()(const C& c, int k, std::size_t i) const {
    if constexpr (requires { complex_traits<C>::faces_as_written(c, k, i); })
      return to_vector(complex_traits<C>::faces_as_written(c, k, i));
    else if constexpr (requires { c.faces_as_written(k, i); })
      return to_vector(c.faces_as_written(k, i));
    else if constexpr (requires { faces_as_written(c, k, i); })
      return to_vector(faces_as_written(c, k, i));
    else {
      std::vector<std::size_t> out;
      if (k <= 0) return out;
      for (auto&& t : lacuna::boundary(c, k, i)) {
        bool nonzero;
        if constexpr (small_incidence_like<std::remove_cvref_t<decltype(t)>>)
          nonzero = as_incidence(t).coefficient != 0;
        else
          nonzero = coefficient_as_integer(t).sign() != 0;
        if (nonzero) out.push_back(incidence_face(t));
      }
      return out;
    }
  }

 private:
  template <class Range>
  static std::vector<std::size_t> to_vector(Range&& r) {
    std::vector<std::size_t> out;
    for (auto&& x : r) out.push_back(static_cast<std::size_t>(x));
    return out;
  }
};

}  // namespace filtration_cpo_detail

namespace detail {
/// fn(face) for the faces of a cell as lacuna::faces_as_written gives them, without a vector
/// when the complex has no faces_as_written of its own (the boundary is read directly).
template <class C, class Fn>
void for_each_face_as_written(const C& c, int k, std::size_t i, Fn&& fn) {
  if constexpr (requires { complex_traits<C>::faces_as_written(c, k, i); } || requires { c.faces_as_written(k, i); } ||
                requires { faces_as_written(c, k, i); }) {
    for (std::size_t f : filtration_cpo_detail::faces_as_written_fn{}(c, k, i)) fn(f);
  } else {
    if (k <= 0) return;
    for (auto&& t : lacuna::boundary(c, k, i)) {
      if constexpr (small_incidence_like<std::remove_cvref_t<decltype(t)>>) {
        if (as_incidence(t).coefficient != 0) fn(incidence_face(t));
      } else {
        if (coefficient_as_integer(t).sign() != 0) fn(incidence_face(t));
      }
    }
  }
}
}  // namespace detail

inline namespace cpo {
/// lacuna::cell_value(f, k, i): the value at which the i-th k-cell of the filtration enters.
inline constexpr filtration_cpo_detail::cell_value_fn cell_value{};
/// lacuna::value_order(f): the strict weak order in which the values of f run (a function
/// object; std::less<V> unless f says otherwise).
inline constexpr filtration_cpo_detail::value_order_fn value_order{};
/// lacuna::faces_as_written(c, k, i): the faces of a cell that it waits for, as a vector of
/// (k-1)-cell indices (see the file comment). Any complex; the default reads the boundary.
inline constexpr filtration_cpo_detail::faces_as_written_fn faces_as_written{};
}  // namespace cpo

/// The type of the values of a filtration F (lacuna::cell_value, without reference or const).
template <class F>
using filtration_value_t = filtration_cpo_detail::value_of_t<F>;

/// The type of the order of the values of a filtration F (lacuna::value_order).
template <class F>
using filtration_order_t = decltype(lacuna::value_order(std::declval<const F&>()));

/// A filtration: a cell complex whose cells have values (lacuna::cell_value) of a type that
/// models filtration_value, ordered by lacuna::value_order (a strict weak order, by default
/// the values' operator <). Faces must not enter after their cofaces; check_filtration
/// verifies it, and the persistence functions check it as they read the boundaries.
template <class F>
concept filtration = cell_complex<F> && requires(const F& f, int k, std::size_t i) {
  lacuna::cell_value(f, k, i);
  lacuna::value_order(f);
} && filtration_value<filtration_value_t<F>> &&
    std::strict_weak_order<const filtration_order_t<F>&, const filtration_value_t<F>&, const filtration_value_t<F>&>;

/// A face that would enter after one of its cofaces, or a cell that cannot be given a value.
/// dimension() and index() (from invalid_complex) name the offending cell — the coface that
/// enters too early, or the cell without a value; face_index() names the face (npos if none).
class filtration_error : public invalid_complex {
 public:
  /// The cell `index` of dimension `dimension`, and its face `face_index` (npos if none).
  filtration_error(const std::string& message, int dimension, std::size_t index, std::size_t face_index = npos)
      : invalid_complex(message, dimension, index), face_index_(face_index) {}
  /// The index of the face (a (dimension()-1)-cell) that enters after the cell, npos if the
  /// fault is not that one.
  std::size_t face_index() const noexcept { return face_index_; }

 private:
  std::size_t face_index_;
};

namespace detail {

/// The text of a value for error messages: through operator<< where there is one.
template <class V>
std::string value_text(const V& v) {
  if constexpr (std::is_floating_point_v<V>) {
    char buf[64];
    const auto r = std::to_chars(buf, buf + sizeof buf, v);  // the shortest form that reads back
    return std::string(buf, r.ptr);
  } else if constexpr (std::is_integral_v<V>) {
    return std::to_string(v);
  } else if constexpr (requires(std::ostream& os) { os << v; }) {
    std::ostringstream os;
    os << v;
    return os.str();
  } else {
    return "(a value)";
  }
}

template <class C, class V>
[[noreturn]] void throw_enters_before_face(const C& c, int k, std::size_t i, std::size_t face, const V& v, const V& fv) {
  throw filtration_error("lacuna: the " + std::to_string(k) + "-cell '" + lacuna::cell_name(c, k, i) + "' enters at " +
                             value_text(v) + ", before its face '" + lacuna::cell_name(c, k - 1, face) + "' (at " +
                             value_text(fv) + ")",
                         k, i, face);
}

}  // namespace detail

/// Checks that no face of a cell enters after it (faces as written, see faces_as_written;
/// for lacuna's own filtrations this holds by construction). Throws filtration_error naming
/// the first offending cell (lowest dimension, then index) and its face. O(cells x faces).
template <filtration F>
void check_filtration(const F& f) {
  const auto order = lacuna::value_order(f);
  for (int k = 1; k <= lacuna::top_dimension(f); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) {
      const filtration_value_t<F> v = lacuna::cell_value(f, k, i);
      detail::for_each_face_as_written(f, k, i, [&](std::size_t face) {
        const filtration_value_t<F> fv = lacuna::cell_value(f, k - 1, face);
        if (order(v, fv)) detail::throw_enters_before_face(f, k, i, face, v, fv);
      });
    }
}

}  // namespace lacuna

// lacuna/persistence/values_filtration.hpp — a filtration of any cell complex from values
// given per cell, and the lower-star filtration of a function on the vertices.
//
//   values_filtration f(c, values);                        every cell's value given
//   auto f = lower_star_filtration(c, vertex_values);      a cell takes the latest of its faces
//   auto f = values_filtration<C, V>::from_partial_values(c, partial);
//                                                          given where listed, else the latest
//                                                          of its faces (the rule of the
//                                                          command-line tool's --values)
// "The latest of its faces" is the largest value (in the filtration's order) among the
// faces the cell waits for — lacuna::faces_as_written: for a simplicial complex the simplices
// one dimension lower, so a simplex takes the largest value of its vertices; for a cell list
// the cells written in its boundary, whatever their coefficients add up to (the faces of
// `1 q : p - p` are `p`). A cell with no value and no faces is an error (filtration_error
// naming it), as is a cell that would enter before one of its faces.
//
// The filtration refers to the complex (it must outlive the filtration) and stores one value
// per cell. It models lacuna::filtration: the cell-complex operations are the complex's own.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/persistence/filtration.hpp>

#include <cstddef>
#include <functional>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// A cell complex C (models cell_complex) with a value of type V (models filtration_value)
/// per cell, ordered by Order (a strict weak order on V; std::greater<V> runs from the largest
/// value down). Models lacuna::filtration. The complex is referred to, not copied.
template <cell_complex C, filtration_value V, class Order = std::less<V>>
  requires std::strict_weak_order<const Order&, const V&, const V&>
class values_filtration {
 public:
  /// The complex C.
  using complex_type = C;
  /// The value type V.
  using value_type = V;
  /// The order on the values.
  using order_type = Order;

  /// Every cell's value: values[k][i] for the i-th k-cell, k = 0..top (one vector per
  /// dimension, each as long as the dimension has cells). Throws std::invalid_argument for
  /// vectors of the wrong sizes, filtration_error naming the cell if a cell would enter
  /// before one of its faces (faces as written) or a value is not ordered (a NaN).
  values_filtration(const C& complex, std::vector<std::vector<V>> values, Order order = {})
      : complex_(&complex), values_(std::move(values)), order_(std::move(order)) {
    const int top = lacuna::top_dimension(complex);
    if (values_.size() != static_cast<std::size_t>(top + 1))
      throw std::invalid_argument("lacuna::values_filtration: " + std::to_string(values_.size()) +
                                  " vectors of values for a complex of dimension " + std::to_string(top));
    for (int k = 0; k <= top; ++k)
      if (values_[static_cast<std::size_t>(k)].size() != lacuna::cell_count(complex, k))
        throw std::invalid_argument("lacuna::values_filtration: " +
                                    std::to_string(values_[static_cast<std::size_t>(k)].size()) + " values for the " +
                                    std::to_string(lacuna::cell_count(complex, k)) + " cells of dimension " +
                                    std::to_string(k));
    check_ordered();
    check_filtration(*this);
  }

 private:
  struct checked_tag {};
  /// Values already checked by the caller (from_partial_values).
  values_filtration(checked_tag, const C& complex, std::vector<std::vector<V>> values, Order order)
      : complex_(&complex), values_(std::move(values)), order_(std::move(order)) {}

 public:

  /// Values where given, the latest of its faces elsewhere (see the file comment):
  /// partial[k][i] is the value of the i-th k-cell or nullopt. A dimension's vector may be
  /// empty (no value given in that dimension) or as long as the dimension has cells.
  /// Throws filtration_error naming a cell without a value and without faces, or a cell
  /// entering before one of its faces; std::invalid_argument for vectors of wrong sizes.
  /// Cost: one pass over the faces of every cell.
  static values_filtration from_partial_values(const C& complex, const std::vector<std::vector<std::optional<V>>>& partial,
                                               Order order = {}) {
    const int top = lacuna::top_dimension(complex);
    if (partial.size() > static_cast<std::size_t>(top + 1))
      throw std::invalid_argument("lacuna::values_filtration: values given in dimension " +
                                  std::to_string(partial.size() - 1) + ", above the dimension " + std::to_string(top) +
                                  " of the complex");
    std::vector<std::vector<V>> values(static_cast<std::size_t>(top + 1));
    for (int k = 0; k <= top; ++k) {
      const auto uk = static_cast<std::size_t>(k);
      const std::size_t n = lacuna::cell_count(complex, k);
      const bool given = uk < partial.size() && !partial[uk].empty();
      if (given && partial[uk].size() != n)
        throw std::invalid_argument("lacuna::values_filtration: " + std::to_string(partial[uk].size()) +
                                    " optional values for the " + std::to_string(n) + " cells of dimension " +
                                    std::to_string(k));
      values[uk].reserve(n);
      for (std::size_t i = 0; i < n; ++i) {
        // the latest of the faces as written (none for a vertex)
        const V* latest = nullptr;
        if (k > 0)
          detail::for_each_face_as_written(complex, k, i, [&](std::size_t f) {
            const V& fv = values[uk - 1][f];
            if (!latest || order(*latest, fv)) latest = &fv;
          });
        if (given && partial[uk][i].has_value()) {
          const V& v = *partial[uk][i];
          if (order(v, v) || !(v == v))  // unordered against itself: a NaN
            throw filtration_error("lacuna: the value of the " + std::to_string(k) + "-cell '" +
                                       lacuna::cell_name(complex, k, i) + "' is not a number",
                                   k, i);
          if (latest && order(v, *latest)) {  // name the first face entering after it
            std::size_t face = 0;
            detail::for_each_face_as_written(complex, k, i, [&](std::size_t f) {
              if (&values[uk - 1][f] == latest) face = f;
            });
            detail::throw_enters_before_face(complex, k, i, face, v, *latest);
          }
          values[uk].push_back(v);
          continue;
        }
        if (!latest)
          throw filtration_error("lacuna: the " + std::to_string(k) + "-cell '" + lacuna::cell_name(complex, k, i) +
                                     "' has no value and no faces to take one from",
                                 k, i);
        values[uk].push_back(*latest);
      }
    }
    return values_filtration(checked_tag{}, complex, std::move(values), std::move(order));
  }

  // ---- the cell_complex interface: the complex's own --------------------------------------
  ///@{
  /// The cell_complex interface, forwarded to the complex.
  int top_dimension() const { return lacuna::top_dimension(*complex_); }
  std::size_t cell_count(int k) const { return lacuna::cell_count(*complex_, k); }
  decltype(auto) boundary(int k, std::size_t i) const { return lacuna::boundary(*complex_, k, i); }
  std::string cell_name(int k, std::size_t i) const { return lacuna::cell_name(*complex_, k, i); }
  std::vector<std::size_t> faces_as_written(int k, std::size_t i) const { return lacuna::faces_as_written(*complex_, k, i); }
  ///@}

  // ---- the filtration ---------------------------------------------------------------------
  /// The value of the i-th k-cell.
  const V& cell_value(int k, std::size_t i) const { return values_[static_cast<std::size_t>(k)][i]; }
  /// The order of the values.
  const Order& value_order() const noexcept { return order_; }
  /// The complex.
  const C& complex() const noexcept { return *complex_; }
  /// All values, values()[k][i].
  const std::vector<std::vector<V>>& values() const noexcept { return values_; }

 private:
  void check_ordered() const {
    for (std::size_t k = 0; k < values_.size(); ++k)
      for (std::size_t i = 0; i < values_[k].size(); ++i) {
        const V& v = values_[k][i];
        // A value unordered against itself (a NaN) would break every comparison.
        if (order_(v, v) || !(v == v))
          throw filtration_error("lacuna: the value of the " + std::to_string(k) + "-cell '" +
                                     lacuna::cell_name(*complex_, static_cast<int>(k), i) + "' is not a number",
                                 static_cast<int>(k), i);
      }
  }

  const C* complex_;
  std::vector<std::vector<V>> values_;
  Order order_;
};

/// The lower-star filtration of a function on the vertices: vertex i enters at
/// vertex_values[i], and every other cell with the latest of its faces (a simplex with the
/// largest value of its vertices). Throws std::invalid_argument unless there is one value per
/// vertex, filtration_error naming a cell of dimension >= 1 with no faces.
template <filtration_value V, cell_complex C, class Order = std::less<V>>
  requires std::strict_weak_order<const Order&, const V&, const V&>
values_filtration<C, V, Order> lower_star_filtration(const C& complex, const std::vector<V>& vertex_values,
                                                     Order order = {}) {
  if (vertex_values.size() != lacuna::cell_count(complex, 0))
    throw std::invalid_argument("lacuna::lower_star_filtration: " + std::to_string(vertex_values.size()) +
                                " values for " + std::to_string(lacuna::cell_count(complex, 0)) + " vertices");
  std::vector<std::vector<std::optional<V>>> partial(lacuna::top_dimension(complex) >= 0 ? 1 : 0);
  if (!partial.empty()) partial[0].assign(vertex_values.begin(), vertex_values.end());
  return values_filtration<C, V, Order>::from_partial_values(complex, partial, std::move(order));
}

}  // namespace lacuna

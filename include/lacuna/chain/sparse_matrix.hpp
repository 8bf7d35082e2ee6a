// lacuna/chain/sparse_matrix.hpp — sparse matrices by columns, and boundary matrices.
//
// Columns, because a boundary matrix is read cell by cell: column j of the k-th boundary
// matrix is the boundary of the j-th k-cell. Each column is sorted by row, without zeros.
#pragma once

#include <lacuna/chain/combine_terms.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <vector>

namespace lacuna {

/// A rows x cols matrix over R (commutative_ring), stored by sorted sparse columns.
template <commutative_ring R>
struct sparse_matrix {
  ///@{
  /// The shape.
  std::size_t rows = 0, cols = 0;
  ///@}
  /// The columns: entries sorted by row, no zeros (after normalize()).
  std::vector<std::vector<sparse_entry<R>>> columns;

  sparse_matrix() = default;
  /// The zero r x c matrix.
  sparse_matrix(std::size_t r, std::size_t c) : rows(r), cols(c), columns(c) {}

  /// Sets entry (i, j) (adds a term; call normalize() once after building by hand).
  void add(std::size_t i, std::size_t j, const R& v) {
    if (i >= rows || j >= cols) throw std::out_of_range("sparse_matrix: entry out of range");
    columns[j].push_back({static_cast<std::uint32_t>(i), v});
  }
  /// Sorts each column by row, adds repeated rows, drops zeros.
  void normalize() {
    for (auto& col : columns) combine_terms(col, &sparse_entry<R>::index, &sparse_entry<R>::value);
  }
  /// The number of stored entries.
  std::size_t nonzeros() const {
    std::size_t n = 0;
    for (const auto& c : columns) n += c.size();
    return n;
  }
  /// The same matrix, dense.
  dense_matrix<R> to_dense() const {
    dense_matrix<R> d(rows, cols);
    for (std::size_t j = 0; j < cols; ++j)
      for (const auto& e : columns[j]) d(e.index, j) = e.value;
    return d;
  }
};

/// The k-th boundary matrix of c over R: (k-1)-cells by k-cells; incidences n become
/// from_integer<R>(n) * unit, and those beyond int64 coefficient_in<R>(n, unit) (exact; for
/// checked_int64 they throw coefficient_overflow). Repeated faces add up in R.
template <commutative_ring R, cell_complex C>
sparse_matrix<R> boundary_matrix(const C& c, int k, const R& ring_one = one<R>()) {
  const std::size_t cols = k >= 0 && k <= lacuna::top_dimension(c) ? lacuna::cell_count(c, k) : 0;
  const std::size_t rows = k >= 1 && k - 1 <= lacuna::top_dimension(c) ? lacuna::cell_count(c, k - 1) : 0;
  sparse_matrix<R> m(rows, cols);
  if (k < 1) return m;
  for (std::size_t j = 0; j < cols; ++j)
    for (auto&& v : lacuna::boundary(c, k, j)) {
      if constexpr (small_incidence_like<std::remove_cvref_t<decltype(v)>>) {
        const incidence inc = as_incidence(v);
        m.add(inc.face, j, from_integer<R>(inc.coefficient) * ring_one);
      } else {
        m.add(incidence_face(v), j, coefficient_in<R>(coefficient_as_integer(v), ring_one));
      }
    }
  m.normalize();
  return m;
}

}  // namespace lacuna

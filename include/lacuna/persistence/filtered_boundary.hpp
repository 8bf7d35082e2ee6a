// lacuna/persistence/filtered_boundary.hpp — the structure stage of the matrix reductions:
// the cells of each dimension in the order of the filtration, and the boundary matrices with
// rows and columns in that order, over a field.
//
// Within dimension k the cells enter in the order of (value, index) — the total order
// (value, dimension, index) restricted to k-cells, which is all a boundary matrix needs: its
// rows are (k-1)-cells and its columns k-cells. Column p of matrix k is then the boundary
// of the p-th k-cell to enter, and the persistence pairing is read off the lowest non-zeros
// of the reduced matrix (Edelsbrunner, Letscher & Zomorodian 2002). Reading the boundaries
// also checks the filtration: a face entering after its coface is a filtration_error.
//
// A reduction variant of the user's own can start from this stage (filter_boundaries), reduce
// the matrices its own way and hand the pivots to persistence_from_pivots
// (lacuna/persistence/reduction.hpp).
#pragma once

#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/persistence/filtration.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <numeric>
#include <ranges>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

/// The boundary matrices of a filtration in filtration order, over the field R.
/// order[k][p] is the k-cell that enters p-th among the k-cells; position[k][i] is the place
/// of the i-th k-cell in that order; values[k][i] its value (V models filtration_value).
/// matrices[k] (k = 1..top) is the boundary from k-cells to (k-1)-cells, its columns and rows
/// the positions; matrices[0] is the empty 0 x n_0 matrix.
template <class V, commutative_ring R>
struct filtered_boundary {
  /// order[k][p]: the k-cell that enters p-th among the k-cells.
  std::vector<std::vector<std::uint32_t>> order;
  /// position[k][i]: the place of the i-th k-cell in that order.
  std::vector<std::vector<std::uint32_t>> position;
  /// values[k][i]: the value of the i-th k-cell.
  std::vector<std::vector<V>> values;
  /// matrices[k]: the boundary from k-cells to (k-1)-cells, rows and columns by position.
  std::vector<sparse_matrix<R>> matrices;

  /// The highest dimension held (-1: none).
  int top_dimension() const noexcept { return static_cast<int>(order.size()) - 1; }
};

/// Reads the cells of dimensions 0..top of a filtration (top <= its top dimension; -1 or more
/// than the top dimension: all) and builds filtered_boundary over R; `ring_one` is the one of R
/// (for mod_p_dynamic). Throws filtration_error naming a cell that enters before one of its
/// faces, std::length_error for more than 2^32 - 1 cells in one dimension,
/// computation_stopped on a stop request. Phase reported: "ordering the cells" (units: cells).
/// Cost: O(n log n) comparisons of values and one pass over the boundaries.
template <commutative_ring R, filtration F>
filtered_boundary<filtration_value_t<F>, R> filter_boundaries(const F& f, int top, const R& ring_one = one<R>(),
                                                              const run_control* control = nullptr) {
  using V = filtration_value_t<F>;
  const int ftop = lacuna::top_dimension(f);
  if (top < 0 || top > ftop) top = ftop;
  const auto order = lacuna::value_order(f);
  filtered_boundary<V, R> out;
  const auto n = static_cast<std::size_t>(top + 1);
  out.order.resize(n);
  out.position.resize(n);
  out.values.resize(n);
  out.matrices.resize(n);
  std::uint64_t total = 0;
  for (int k = 0; k <= top; ++k) total += lacuna::cell_count(f, k);
  detail::progress_ticker tick(control, "ordering the cells", total);
  for (int k = 0; k <= top; ++k) {
    const auto uk = static_cast<std::size_t>(k);
    const std::size_t count = lacuna::cell_count(f, k);
    if (count >= std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("lacuna: " + std::to_string(count) + " cells of dimension " + std::to_string(k) +
                              ", more than the 2^32 - 1 a persistence reduction indexes");
    auto& vals = out.values[uk];
    vals.reserve(count);
    for (std::size_t i = 0; i < count; ++i) vals.push_back(lacuna::cell_value(f, k, i));
    auto& ord = out.order[uk];
    ord.resize(count);
    {
      // sort (value, index) pairs: ties by index, with the values at hand
      std::vector<std::pair<V, std::uint32_t>> keyed;
      keyed.reserve(count);
      for (std::uint32_t i = 0; i < count; ++i) keyed.emplace_back(vals[i], i);
      std::sort(keyed.begin(), keyed.end(), [&](const auto& a, const auto& b) {
        if (order(a.first, b.first)) return true;
        if (order(b.first, a.first)) return false;
        return a.second < b.second;
      });
      for (std::uint32_t p = 0; p < count; ++p) ord[p] = keyed[p].second;
    }
    auto& pos = out.position[uk];
    pos.resize(count);
    for (std::uint32_t p = 0; p < count; ++p) pos[ord[p]] = p;
    auto& m = out.matrices[uk];
    m = sparse_matrix<R>(k == 0 ? 0 : lacuna::cell_count(f, k - 1), count);
    if (k == 0) {
      tick(count);
      continue;
    }
    const auto& below = out.position[uk - 1];
    const auto& below_values = out.values[uk - 1];
    for (std::uint32_t p = 0; p < count; ++p) {
      const std::size_t cell = ord[p];
      auto& column = m.columns[p];
      const auto b = lacuna::boundary(f, k, cell);
      if constexpr (std::ranges::sized_range<decltype(b)>) column.reserve(std::ranges::size(b));
      for (auto&& t : b) {
        const std::size_t face = incidence_face(t);
        if (face >= below.size())
          throw invalid_complex("lacuna: the boundary of the " + std::to_string(k) + "-cell '" +
                                    lacuna::cell_name(f, k, cell) + "' names the face " + std::to_string(face) +
                                    " of " + std::to_string(below.size()),
                                k, cell);
        if (order(vals[cell], below_values[face]))
          detail::throw_enters_before_face(f, k, cell, face, vals[cell], below_values[face]);
        R c;
        if constexpr (small_incidence_like<std::remove_cvref_t<decltype(t)>>)
          c = from_integer<R>(as_incidence(t).coefficient) * ring_one;
        else
          c = coefficient_in<R>(coefficient_as_integer(t), ring_one);
        if (c == zero<R>()) continue;  // an incidence that vanishes in R
        column.push_back({below[face], c});
      }
      tick();
    }
    m.normalize();
  }
  tick.finish();
  return out;
}

}  // namespace lacuna

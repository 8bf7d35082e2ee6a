// lacuna/complex/construct/disjoint_union.hpp — X ⊔ Y for any two cell complexes.
//
// In every dimension the cells of X come first (same indices), then those of Y (shifted by
// the number of cells of X in that dimension). Names: X's as they are, Y's with a "'"
// appended (so that two copies of one complex keep distinct names).
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>

#include <algorithm>

namespace lacuna {

/// The disjoint union X ⊔ Y as a cell_list. χ(X ⊔ Y) = χ(X) + χ(Y).
template <cell_complex X, cell_complex Y>
cell_list disjoint_union(const X& x, const Y& y) {
  cell_list out;
  const int top = std::max(lacuna::top_dimension(x), lacuna::top_dimension(y));
  for (int k = 0; k <= top; ++k) {
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i)
      out.add_cell(k, lacuna::cell_name(x, k, i), detail::boundary_terms(x, k, i));
    const std::size_t shift = k > 0 ? lacuna::cell_count(x, k - 1) : 0;
    for (std::size_t i = 0; i < lacuna::cell_count(y, k); ++i) {
      auto terms = detail::boundary_terms(y, k, i);
      for (auto& t : terms) t.face += shift;
      out.add_cell(k, lacuna::cell_name(y, k, i) + "'", std::move(terms));
    }
  }
  return out;
}

}  // namespace lacuna

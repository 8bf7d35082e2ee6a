// lacuna/complex/construct/wedge.hpp — X ∨ Y, two complexes joined at a point.
//
// The 0-cell y0 of Y is identified with the 0-cell x0 of X. Cells: those of X (same
// indices, same names), then those of Y except y0 (names with "'" appended); a face y0 of a
// 1-cell of Y becomes x0.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>

#include <algorithm>
#include <stdexcept>
#include <string>

namespace lacuna {

/// The wedge X ∨ Y identifying 0-cell x0 of X with 0-cell y0 of Y. χ(X ∨ Y) = χ(X) + χ(Y) - 1.
/// Throws std::invalid_argument if x0 or y0 is not a 0-cell.
template <cell_complex X, cell_complex Y>
cell_list wedge(const X& x, const Y& y, std::size_t x0 = 0, std::size_t y0 = 0) {
  if (x0 >= lacuna::cell_count(x, 0) || y0 >= lacuna::cell_count(y, 0))
    throw std::invalid_argument("wedge: base point " + std::to_string(x0) + " or " + std::to_string(y0) +
                                " is not a 0-cell");
  cell_list out;
  const int top = std::max(lacuna::top_dimension(x), lacuna::top_dimension(y));
  const std::size_t nx0 = lacuna::cell_count(x, 0);
  for (int k = 0; k <= top; ++k) {
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i)
      out.add_cell(k, lacuna::cell_name(x, k, i), detail::boundary_terms(x, k, i));
    const std::size_t shift = k > 0 ? lacuna::cell_count(x, k - 1) : 0;
    for (std::size_t i = 0; i < lacuna::cell_count(y, k); ++i) {
      if (k == 0 && i == y0) continue;
      auto terms = detail::boundary_terms(y, k, i);
      for (auto& t : terms) {
        if (k == 1)  // 0-cells of Y after y0 move down by one; y0 itself becomes x0
          t.face = t.face == y0 ? x0 : nx0 + t.face - (t.face > y0 ? 1 : 0);
        else
          t.face += shift;
      }
      out.add_cell(k, lacuna::cell_name(y, k, i) + "'", std::move(terms));
    }
  }
  return out;
}

}  // namespace lacuna

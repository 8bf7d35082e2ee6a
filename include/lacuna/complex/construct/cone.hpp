// lacuna/complex/construct/cone.hpp — the cone CX = X ∗ point of any cell complex.
//
// Cells: those of X (same indices and names); an apex, the last 0-cell, named "apex"; and for
// every k-cell σ a (k+1)-cell c(σ), after the (k+1)-cells of X, named "c(NAME)". With the
// apex last in the orientation (as in the simplicial join):
//     ∂ c(v) = apex - v,      ∂ c(σ) = c(∂σ) + (-1)^{k+1} σ   (k >= 1).
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/augmentation.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>

#include <string>

namespace lacuna {

/// The cone on X as a cell_list; contractible, χ = 1. Throws lacuna::invalid_complex naming
/// a 1-cell whose boundary has coefficient sum other than 0.
template <cell_complex X>
cell_list cone(const X& x) {
  detail::require_augmented(x, "cone");
  cell_list out;
  const int top = lacuna::top_dimension(x);
  for (int k = 0; k <= top + 1; ++k) {
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i)
      out.add_cell(k, lacuna::cell_name(x, k, i), detail::boundary_terms(x, k, i));
    if (k == 0) {
      out.add_cell(0, "apex");
      continue;
    }
    // the cones on the (k-1)-cells
    const std::size_t apex = lacuna::cell_count(x, 0);
    const std::size_t cone_shift = lacuna::cell_count(x, k - 1);  // c(τ) for a (k-2)-cell τ sits here
    for (std::size_t i = 0; i < lacuna::cell_count(x, k - 1); ++i) {
      std::vector<incidence> terms;
      if (k == 1) {
        terms = {{apex, 1}, {i, -1}};
      } else {
        for (const auto& t : lacuna::boundary(x, k - 1, i)) {
          const incidence f = as_incidence(t);
          terms.push_back({cone_shift + f.face, f.coefficient});
        }
        terms.push_back({i, (k % 2 == 0) ? std::int64_t{1} : std::int64_t{-1}});  // (-1)^{(k-1)+1}
      }
      out.add_cell(k, "c(" + lacuna::cell_name(x, k - 1, i) + ")", std::move(terms));
    }
  }
  return out;
}

}  // namespace lacuna

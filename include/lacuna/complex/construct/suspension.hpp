// lacuna/complex/construct/suspension.hpp — the (unreduced) suspension ΣX of any complex.
//
// ΣX = X × [0,1] with X × 0 and X × 1 each collapsed to a point. Cells: two 0-cells
// "north" and "south", and for every k-cell σ of X a (k+1)-cell s(σ) = σ × (0,1), named
// "s(NAME)", in the order of X. From the product rule:
//     ∂ s(v) = north - south,     ∂ s(σ) = s(∂σ)   (k >= 1).
// The suspension of the empty complex is S^0.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/augmentation.hpp>

#include <string>
#include <vector>

namespace lacuna {

/// The suspension ΣX as a cell_list; χ(ΣX) = 2 - χ(X). Throws lacuna::invalid_complex
/// naming a 1-cell whose boundary has coefficient sum other than 0.
template <cell_complex X>
cell_list suspension(const X& x) {
  detail::require_augmented(x, "suspension");
  cell_list out;
  out.add_cell(0, "north");
  out.add_cell(0, "south");
  for (int k = 0; k <= lacuna::top_dimension(x); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i) {
      std::vector<incidence> terms;
      if (k == 0)
        terms = {{0, 1}, {1, -1}};
      else
        for (const auto& t : lacuna::boundary(x, k, i)) terms.push_back(as_incidence(t));
      out.add_cell(k + 1, "s(" + lacuna::cell_name(x, k, i) + ")", std::move(terms));
    }
  return out;
}

}  // namespace lacuna

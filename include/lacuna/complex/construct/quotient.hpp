// lacuna/complex/construct/quotient.hpp — X/A, a subcomplex collapsed to a point.
//
// Cells of X/A: a 0-cell "*" (index 0) for A, then the cells of X not in A in their order.
// A cell of dimension >= 2 keeps its boundary with the faces in A dropped; a 1-cell's faces
// in A become "*" (their coefficients add). Following the convention X/∅ = X ⊔ point,
// "*" is there even when A is empty, so that H̃(X/A) = H(X, A) for every subcomplex A
// (Hatcher 2002, §2.1, Proposition 2.22; the X/∅ convention from memory).
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/subcomplex.hpp>

#include <concepts>
#include <utility>
#include <vector>

namespace lacuna {

/// X/A for the subcomplex A of cells (k, i) with in_a(k, i) true. χ(X/A) = χ(X) - χ(A) + 1.
/// Throws lacuna::invalid_complex naming the first cell of A whose face is not in A.
template <cell_complex C, class Pred>
  requires std::predicate<Pred&, int, std::size_t>
cell_list quotient(const C& c, Pred in_a) {
  const auto a = detail::select_closed(c, in_a, "quotient");
  cell_list out;
  out.add_cell(0, "*");
  std::vector<std::vector<std::size_t>> idx(a.new_index.size());
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) {
    auto& ik = idx[static_cast<std::size_t>(k)];
    ik.assign(lacuna::cell_count(c, k), cell_selection::npos);
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      if (a.contains(k, i)) continue;
      std::vector<incidence> terms;
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient == 0) continue;
        if (!a.contains(k - 1, f.face))
          terms.push_back({idx[static_cast<std::size_t>(k - 1)][f.face], f.coefficient});
        else if (k == 1)
          terms.push_back({0, f.coefficient});
      }
      ik[i] = out.add_cell(k, lacuna::cell_name(c, k, i), std::move(terms));
    }
  }
  return out;
}

/// X/A for the subcomplex A of the listed (dimension, index) cells.
template <cell_complex C>
cell_list quotient(const C& c, const std::vector<std::pair<int, std::size_t>>& a_cells) {
  return quotient(c, detail::list_predicate(a_cells, detail::all_counts(c)));
}

}  // namespace lacuna

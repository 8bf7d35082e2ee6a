// lacuna/complex/construct/to_cell_list.hpp — a copy of any cell complex as a cell_list.
//
// to_cell_list(c) copies names (lacuna::cell_name) and boundaries; it is what the generic
// constructions start from, and a way to freeze an adapted complex. Throws
// lacuna::invalid_complex naming the cell if a face is out of range or coefficients of a
// repeated face overflow int64.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>

#include <string>
#include <vector>

namespace lacuna {

namespace detail {
/// The boundary of the i-th k-cell of c as a vector of lacuna::incidence.
template <cell_complex C>
std::vector<incidence> boundary_terms(const C& c, int k, std::size_t i) {
  std::vector<incidence> v;
  for (const auto& t : lacuna::boundary(c, k, i)) v.push_back(as_incidence(t));
  return v;
}
}  // namespace detail

/// A cell_list with the cells, names and boundaries of c. O(cells + incidences).
template <cell_complex C>
cell_list to_cell_list(const C& c) {
  cell_list out;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i)
      out.add_cell(k, lacuna::cell_name(c, k, i), detail::boundary_terms(c, k, i));
  return out;
}

}  // namespace lacuna

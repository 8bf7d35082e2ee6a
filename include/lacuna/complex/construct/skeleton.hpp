// lacuna/complex/construct/skeleton.hpp — the k-skeleton of any cell complex.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>

#include <algorithm>

namespace lacuna {

/// The cells of dimension <= k, with the same indices, names and boundaries (empty if k < 0).
template <cell_complex C>
cell_list skeleton(const C& c, int k) {
  cell_list out;
  for (int d = 0; d <= std::min(k, lacuna::top_dimension(c)); ++d)
    for (std::size_t i = 0; i < lacuna::cell_count(c, d); ++i)
      out.add_cell(d, lacuna::cell_name(c, d, i), detail::boundary_terms(c, d, i));
  return out;
}

}  // namespace lacuna

// lacuna/complex/construct/subcomplex.hpp — the subcomplex spanned by chosen cells.
//
// subcomplex(c, pred) keeps the cells for which pred(k, i) is true; subcomplex(c, cells)
// keeps the listed (dimension, index) pairs. The chosen cells must be closed under taking
// faces (every face with a non-zero coefficient chosen too); otherwise lacuna::invalid_complex
// names the first chosen cell (lowest dimension, then index) whose face is missing.
// The kept cells are renumbered in their order; names and coefficients stay.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <concepts>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// Which cells of a complex are chosen, and their new indices (npos if not chosen).
struct cell_selection {
  /// The new index of a cell not chosen.
  static constexpr std::size_t npos = std::numeric_limits<std::size_t>::max();
  std::vector<std::vector<std::size_t>> new_index;  ///< [k][i]
  /// True if cell i of dimension k is chosen.
  bool contains(int k, std::size_t i) const {
    return k >= 0 && static_cast<std::size_t>(k) < new_index.size() && i < new_index[static_cast<std::size_t>(k)].size() &&
           new_index[static_cast<std::size_t>(k)][i] != npos;
  }
};

namespace detail {
template <cell_complex C, class Pred>
cell_selection select_closed(const C& c, Pred&& pred, const char* what) {
  cell_selection s;
  const int top = lacuna::top_dimension(c);
  s.new_index.resize(top >= 0 ? static_cast<std::size_t>(top) + 1 : 0);
  for (int k = 0; k <= top; ++k) {
    auto& idx = s.new_index[static_cast<std::size_t>(k)];
    idx.assign(lacuna::cell_count(c, k), cell_selection::npos);
    std::size_t next = 0;
    for (std::size_t i = 0; i < idx.size(); ++i) {
      if (!pred(k, i)) continue;
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient != 0 && !s.contains(k - 1, f.face))
          throw invalid_complex(std::string(what) + ": " + std::to_string(k) + "-cell " + std::to_string(i) + " ('" +
                                    lacuna::cell_name(c, k, i) + "') is chosen but its face, " +
                                    std::to_string(k - 1) + "-cell " + std::to_string(f.face) + " ('" +
                                    lacuna::cell_name(c, k - 1, f.face) + "'), is not",
                                k, i);
      }
      idx[i] = next++;
    }
  }
  return s;
}

inline auto list_predicate(const std::vector<std::pair<int, std::size_t>>& cells, const std::vector<std::size_t>& counts) {
  std::vector<std::vector<char>> chosen(counts.size());
  for (std::size_t k = 0; k < counts.size(); ++k) chosen[k].assign(counts[k], 0);
  for (const auto& [k, i] : cells) {
    if (k < 0 || static_cast<std::size_t>(k) >= counts.size() || i >= counts[static_cast<std::size_t>(k)])
      throw invalid_complex("cell list names " + std::to_string(k) + "-cell " + std::to_string(i) +
                                ", which the complex does not have",
                            k, i);
    chosen[static_cast<std::size_t>(k)][i] = 1;
  }
  return [chosen = std::move(chosen)](int k, std::size_t i) { return chosen[static_cast<std::size_t>(k)][i] != 0; };
}

template <cell_complex C>
std::vector<std::size_t> all_counts(const C& c) {
  std::vector<std::size_t> v;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) v.push_back(lacuna::cell_count(c, k));
  return v;
}
}  // namespace detail

/// The subcomplex of the cells (k, i) with pred(k, i) true, as a cell_list.
template <cell_complex C, class Pred>
  requires std::predicate<Pred&, int, std::size_t>
cell_list subcomplex(const C& c, Pred pred) {
  const auto s = detail::select_closed(c, pred, "subcomplex");
  cell_list out;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      if (!s.contains(k, i)) continue;
      std::vector<incidence> terms;
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient != 0) terms.push_back({s.new_index[static_cast<std::size_t>(k - 1)][f.face], f.coefficient});
      }
      out.add_cell(k, lacuna::cell_name(c, k, i), std::move(terms));
    }
  return out;
}

/// The subcomplex of the listed cells, as (dimension, index) pairs in any order.
template <cell_complex C>
cell_list subcomplex(const C& c, const std::vector<std::pair<int, std::size_t>>& cells) {
  return subcomplex(c, detail::list_predicate(cells, detail::all_counts(c)));
}

}  // namespace lacuna

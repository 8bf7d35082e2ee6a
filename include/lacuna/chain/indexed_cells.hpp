// lacuna/chain/indexed_cells.hpp — a set of cells of one level, listed, with each cell's
// position in the list.
//
// The one type for "these cells of level L, renumbered 0..n-1" that the algorithms keep
// beside a reducible complex: the alive cells a column reduction works on
// (algorithm/field_ranks.hpp), the core cells and the isolated cells of a level
// (homology/result.hpp). Both directions are kept because both are read: the list to walk
// the set, the positions to move an incidence from a local index to a matrix row.
#pragma once

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <vector>

namespace lacuna {

/// A set of local cell indices of one level with their positions in the set's list.
struct indexed_cells {
  std::vector<std::uint32_t> cells;    ///< the chosen cells, in list order
  std::vector<std::int64_t> position;  ///< local index -> position in `cells`, -1 if not chosen

  indexed_cells() = default;
  /// An empty set over a level of level_size cells.
  explicit indexed_cells(std::size_t level_size) : position(level_size, -1) {}

  /// Appends cell i (i < the level size, not yet chosen).
  void add(std::uint32_t i) {
    position[i] = static_cast<std::int64_t>(cells.size());
    cells.push_back(i);
  }
  /// True if cell i is chosen.
  bool contains(std::uint32_t i) const { return position[i] >= 0; }
  /// Reverses the list (and the positions with it).
  void reverse() {
    std::reverse(cells.begin(), cells.end());
    const auto n = static_cast<std::int64_t>(cells.size());
    for (auto& p : position)
      if (p >= 0) p = n - 1 - p;
  }

  /// The number of cells listed.
  std::size_t size() const { return cells.size(); }
  /// Whether no cell is listed.
  bool empty() const { return cells.empty(); }
  /// The k-th cell of the list.
  std::uint32_t operator[](std::size_t k) const { return cells[k]; }
  /// The cells in list order.
  auto begin() const { return cells.begin(); }
  /// The end of the list.
  auto end() const { return cells.end(); }
};

}  // namespace lacuna

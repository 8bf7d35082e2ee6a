// lacuna/chain/boundary_squared.hpp — the check ∂∂ = 0 on a elimination_workspace, right after it
// is built: the engine refuses a "complex" whose boundary of a boundary is not zero, whose
// homology would be no homology at all.
//
// It runs on the boundary matrices as indexed (in the working coefficients W, so over Z/p a
// fault that is a multiple of p is not seen: the chain complex mod p is then a chain complex),
// one pass over each k-cell's faces' faces: O(sum over cells of |∂c| |∂ of a face|) time (for
// a cell with few of them, times their number), O(cells of one dimension) memory at most.
// docs/reliability.md has its cost: a few percent of homology().
#pragma once

#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/ring/concepts.hpp>

#include <cstdint>
#include <optional>
#include <utility>
#include <vector>

namespace lacuna::detail {

/// The first cell (level, local index) whose boundary's boundary is not zero, levels from the
/// bottom; none when rc is a chain complex. With the augmentation (reduced homology) the empty
/// cell is left out: ε∂ = 0 is not asked of a complex.
template <class W>
std::optional<std::pair<int, std::uint32_t>> first_nonzero_boundary_squared(const elimination_workspace<W>& rc) {
  std::vector<W> acc;  // over the cells two levels down, zero between cells
  for (int L = 2; L < rc.levels(); ++L) {
    if (rc.dimension_of_level(L - 2) < 0) continue;  // the empty cell of the augmentation
    acc.assign(rc.size(L - 2), zero<W>());
    for (std::uint32_t i = 0; i < rc.size(L); ++i) {
      for (const auto& e : rc.boundary(L, i))
        for (const auto& g : rc.boundary(L - 1, e.index)) acc[g.index] += e.value * g.value;
      // the same terms again: each sum read, then cleared for the next cell
      bool bad = false;
      for (const auto& e : rc.boundary(L, i))
        for (const auto& g : rc.boundary(L - 1, e.index)) {
          bad = bad || !(acc[g.index] == zero<W>());
          acc[g.index] = zero<W>();
        }
      if (bad) return std::pair<int, std::uint32_t>{L, i};
    }
  }
  return std::nullopt;
}

}  // namespace lacuna::detail

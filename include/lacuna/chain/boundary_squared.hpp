// lacuna/chain/boundary_squared.hpp — the check ∂∂ = 0 on a reducible_complex, right after it
// is built: the engine refuses a "complex" whose boundary of a boundary is not zero, whose
// homology would be no homology at all.
//
// It runs on the boundary matrices as indexed (in the working coefficients W, so over Z/p a
// fault that is a multiple of p is not seen: the chain complex mod p is then a chain complex),
// one pass over each k-cell's faces' faces with a dense accumulator: O(sum over cells of
// |∂c| |∂ of a face|) time, O(cells of one dimension) memory — about what building the complex
// costs again for simplicial and cubical complexes (docs/reliability.md has the figures).
#pragma once

#include <lacuna/chain/reducible_complex.hpp>
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
std::optional<std::pair<int, std::uint32_t>> first_nonzero_boundary_squared(const reducible_complex<W>& rc) {
  std::vector<W> acc;
  std::vector<std::uint32_t> touched;
  for (int L = 2; L < rc.levels(); ++L) {
    if (rc.dimension_of_level(L - 2) < 0 && !rc.is_dual()) continue;  // the empty cell
    acc.assign(rc.size(L - 2), zero<W>());
    std::vector<char> seen(rc.size(L - 2), 0);
    for (std::uint32_t i = 0; i < rc.size(L); ++i) {
      touched.clear();
      for (const auto& e : rc.boundary(L, i))
        for (const auto& g : rc.boundary(L - 1, e.index)) {
          if (!seen[g.index]) {
            seen[g.index] = 1;
            touched.push_back(g.index);
          }
          acc[g.index] += e.value * g.value;
        }
      bool bad = false;
      for (const auto t : touched) {
        bad = bad || !(acc[t] == zero<W>());
        acc[t] = zero<W>();
        seen[t] = 0;
      }
      if (bad) return std::pair<int, std::uint32_t>{L, i};
    }
  }
  return std::nullopt;
}

}  // namespace lacuna::detail

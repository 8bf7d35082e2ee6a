// lacuna/algorithm/smith_invariants.hpp — the result type of the Smith-form routes that
// return invariant factors only (smith_normal_form.hpp, modular_smith.hpp).
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <cstddef>
#include <vector>

namespace lacuna {

/// The invariant factors of a matrix: rank r and d_1 | d_2 | ... | d_r, normalized,
/// units included (so factors.size() == rank).
template <euclidean_domain R>
struct smith_invariants {
  /// The rank r.
  std::size_t rank = 0;
  /// d_1 | d_2 | ... | d_r, normalized, units included.
  std::vector<R> factors;
  /// The factors that are not units (the torsion of the cokernel).
  std::vector<R> non_units() const {
    std::vector<R> out;
    for (const auto& f : factors)
      if (!(normalize(f) == one<R>())) out.push_back(f);
    return out;
  }
};

}  // namespace lacuna

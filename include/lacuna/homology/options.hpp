// lacuna/homology/options.hpp — the options of lacuna::homology, relative_homology and
// cohomology (homology/homology.hpp).
#pragma once

#include <lacuna/chain/run_control.hpp>

#include <optional>

namespace lacuna {

/// Options of lacuna::homology and lacuna::cohomology.
struct homology_options {
  bool generators = false;  ///< one cycle per free summand and per torsion factor
  bool reduced = false;     ///< reduced homology (augmented by the empty cell)
  /// With generators, homology only: for every torsion generator z of order d, a (k+1)-chain
  /// w with ∂w = d·z (homology_group::bounding_chains), for the certificates of
  /// homology/certificate.hpp. Runs the elimination route without a Morse pre-reduction.
  bool witnesses = false;
  /// Keep what coordinates() and is_boundary() need. Unset: kept exactly when generators
  /// are asked for. Set it to false with generators to save the memory (about a third).
  std::optional<bool> keep_basis{};
  /// Threads to use where the work splits (indexing the dimensions, lifting generators of
  /// different dimensions). Results do not depend on it. With 2 or more, the complex's
  /// boundary() is called from two threads at once (safe for lacuna's own complexes).
  unsigned threads = 1;
  /// A stop request and a progress callback (lacuna/chain/run_control.hpp): a stopped
  /// computation throws lacuna::computation_stopped and returns nothing. Phases reported:
  /// "building the chain complex", "eliminating unit pivots", "Smith form of the core",
  /// "lifting generators"; over Z/2 and Z/p without generators "building the chain complex",
  /// then "reducing columns over a field" (lacuna/algorithm/field_ranks.hpp); over the
  /// integers on the coboundary route, "reducing coboundaries" instead of the elimination.
  run_control control{};
};

}  // namespace lacuna

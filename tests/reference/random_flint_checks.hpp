// Randomized FLINT cross-checks of boundary matrices (issue 7 §3), shared by
// tests/reference/random_boundaries_flint.cpp (short) and random_boundaries_flint_long.long.cpp
// (label "long"). On random simplicial complexes, cubical volumes and cell lists (generators
// of tests/homology/random_properties.hpp): the invariant factors of every boundary matrix by
// FLINT 2.9's fmpz_mat_snf equal those of every Smith-form variant over lacuna::integer and
// lacuna::big_integer; the homology FLINT predicts (structure theorem, flint_support.hpp)
// equals the engine's, every variant, both rings; dim H_k(X; Z/p) from FLINT's nmod_mat_rank
// equals the engine's over mod_p<p> for p = 2, 3, 2^61 - 1, and the field reductions' ranks
// equal nmod_mat_rank.
#pragma once

#include "../homology/random_properties.hpp"
#include "flint_support.hpp"

namespace random_flint {

using namespace flint_test;

template <class C>
void check_with_flint(const C& c, bool big) {
  const int top = lacuna::top_dimension(c);
  for (int k = 1; k <= top; ++k) {
    CAPTURE(k);
    const auto m = exact_boundary(c, k);
    const auto want = flint_invariants(m);  // FLINT fmpz_mat_snf
    CHECK(every_smith_variant<integer>(m) == want);
    if (big) CHECK(every_smith_variant<big_integer>(m) == want);
    for (std::uint64_t p : {std::uint64_t{2}, std::uint64_t{3}, random_test::m61}) {
      const auto r = flint_rank_mod(m, p);  // FLINT nmod_mat_rank
      CAPTURE(p);
      CHECK(lacuna::reduce_columns(lacuna::boundary_matrix<lacuna::mod_p_dynamic>(c, k, lacuna::mod_p_dynamic(1, p))).rank == r);
    }
  }
  const auto h = flint_homology(c);
  CHECK(engine_variants<integer>(c) == h);
  if (big) CHECK(engine_variants<big_integer>(c) == h);
  const auto b2 = flint_betti_mod(c, 2), b3 = flint_betti_mod(c, 3), b61 = flint_betti_mod(c, random_test::m61);
  CHECK(lacuna::homology<lacuna::mod_p<2>>(c).betti_numbers() == b2);
  CHECK(lacuna::homology<lacuna::mod_p<3>>(c).betti_numbers() == b3);
  CHECK(lacuna::homology<lacuna::mod_p<random_test::m61>>(c).betti_numbers() == b61);
}

/// `trials` random complexes of each family from `seed`; volumes of side `side`.
inline void suite(std::uint64_t seed, int trials, std::size_t side, int vertices) {
  std::mt19937_64 rng(seed);
  int torsion = 0;
  for (int t = 0; t < trials; ++t) {
    CAPTURE(t);
    const auto x = random_test::random_simplicial(rng, vertices, 4, 5 + t % 11);
    check_with_flint(x, t % 2 == 0);
    check_with_flint(random_test::random_volume<3>(rng, {side, side, side - 1}, 0.4 + 0.05 * (t % 5)), t % 3 == 0);
    check_with_flint(random_test::random_volume<2>(rng, {2 * side, side + 1}, 0.5), false);
    const auto c = random_test::random_cell_list(rng, t, 1 + t % 7);
    check_with_flint(c, true);
    for (const auto& g : flint_homology(c)) torsion += !g.torsion.empty();
  }
  if (trials >= 8) CHECK(torsion >= 2);  // the Smith forms are not all units
}

}  // namespace random_flint

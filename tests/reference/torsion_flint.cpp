// The coboundary route (lacuna/algorithm/integral_reduction.hpp) against FLINT's fmpz_mat_snf,
// an independent implementation: for every boundary matrix ∂_{k+1} of the complex, the route's
// rank and non-unit invariant factors of δ_k = ∂_{k+1}^T must equal FLINT's Smith form of
// ∂_{k+1} (a matrix and its transpose have the same Smith form). Complexes: the matching
// complex of K_8, the 4 × 5 chessboard complex, random 2-complexes of Linial–Meshulam type
// (all edges on n vertices, each triangle with probability p), each also with every remainder
// past the dense limit (lattice_smith_invariants or the sparse route), and a cell list whose
// reduction passes 64 bits (the checked_int64 run throws, the lacuna::integer run answers).
#include "../homology/support.hpp"
#include "flint_support.hpp"

#include <lacuna/algorithm/integral_reduction.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>

#include <random>

namespace reference_torsion_flint_test {

using lacuna::integer;

/// The route's invariants per boundary matrix, as FLINT would print them: "1" for each unit
/// (rank − #torsion of them, the units come first) then the non-unit factors.
template <class W, class C>
std::vector<std::vector<std::string>> route_invariants(const C& c, const lacuna::coboundary_reduction& options = {}) {
  const auto rc = lacuna::elimination_workspace<W>::build(c);
  const auto inv = lacuna::reduce_coboundaries<integer>(rc, options);
  std::vector<std::vector<std::string>> out;
  for (std::size_t L = 0; L + 1 < inv.size(); ++L) {
    std::vector<std::string> f(inv[L].rank - inv[L].torsion.size(), "1");
    for (const auto& t : inv[L].torsion) f.push_back(lacuna_test::text(t));
    out.push_back(f);
  }
  return out;
}

template <class C>
std::vector<std::vector<std::string>> flint_all(const C& c) {
  std::vector<std::vector<std::string>> out;
  for (int k = 1; k <= lacuna::top_dimension(c); ++k) out.push_back(flint_test::flint_invariants(flint_test::exact_boundary(c, k)));
  return out;
}

template <class C>
void check_against_flint(const C& c) {
  const auto expected = flint_all(c);
  CHECK(route_invariants<lacuna::checked_int64>(c) == expected);
  CHECK(route_invariants<integer>(c) == expected);
  // every remainder past the dense limit: through lattice_smith_invariants where its proofs
  // hold (algorithm/lattice_smith.hpp), else the sparse route; and the sparse route alone
  CHECK(route_invariants<lacuna::checked_int64>(c, {.dense_limit = 0}) == expected);
  CHECK(route_invariants<lacuna::checked_int64>(c, {.dense_limit = 0, .lattice_smith = false}) == expected);
}

/// All edges on n vertices, each triangle with probability p (Linial & Meshulam 2006).
lacuna::simplicial_complex<int> linial_meshulam(std::mt19937_64& rng, int n, double p) {
  std::bernoulli_distribution keep(p);
  std::vector<std::vector<int>> facets;
  for (int a = 0; a < n; ++a)
    for (int b = a + 1; b < n; ++b) facets.push_back({a, b});
  for (int a = 0; a < n; ++a)
    for (int b = a + 1; b < n; ++b)
      for (int d = b + 1; d < n; ++d)
        if (keep(rng)) facets.push_back({a, b, d});
  return lacuna::simplicial_complex<int>::from_facets(facets);
}

TEST_CASE("matching complex of K_8 and the 4 x 5 chessboard complex: every boundary matrix against fmpz_mat_snf") {
  check_against_flint(lacuna::matching_complex(8));
  check_against_flint(lacuna::chessboard_complex(4, 5));
  check_against_flint(lacuna::matching_complex(7));  // the one with torsion (Z/3)
}

TEST_CASE("random Linial–Meshulam 2-complexes against fmpz_mat_snf (seed 1202)") {
  std::mt19937_64 rng(1202);
  for (int t = 0; t < 6; ++t) {
    CAPTURE(t);
    // n = 12, p near the threshold where H_1 becomes finite (about 2 log n / n ~ 0.4 here),
    // where torsion is common
    check_against_flint(linial_meshulam(rng, 12, 0.25 + 0.03 * t));
  }
}

TEST_CASE("a reduction beyond 64 bits: checked_int64 throws, lacuna::integer gives FLINT's factors") {
  lacuna::cell_list c;
  c.add_cell(0, "v");
  const auto a = c.add_cell(1, "a", {{0, 1}, {0, -1}});
  const auto b = c.add_cell(1, "b", {{0, 1}, {0, -1}});
  const std::int64_t big = std::int64_t{1} << 40;
  c.add_cell(2, "c0", {{a, big}, {b, 3}});
  c.add_cell(2, "c1", {{a, 1}, {b, big}});
  const auto rc = lacuna::elimination_workspace<lacuna::checked_int64>::build(c);
  CHECK_THROWS_AS(lacuna::reduce_coboundaries<integer>(rc), lacuna::coefficient_overflow);
  CHECK(route_invariants<integer>(c) == flint_all(c));
  // and the homology front widens by itself
  CHECK(lacuna_test::groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{})) ==
        flint_test::flint_homology(c));
}

TEST_CASE("a deferred column beyond 64 bits: reduced alone over lacuna::integer, FLINT's factors") {
  // δ_1 has columns a = (c0: 2^40, c1: 1) and x = (c1: 2^40, c2: 2): a becomes the unit pivot
  // of row c1, x is deferred (its low 2 is not a unit), and reducing x against a makes the
  // entry of row c0 −2^80. The 64-bit pass must not throw: that column alone is redone over
  // lacuna::integer. Expected: FLINT's Smith form of ∂_2 (ones and 2, since gcd(2^80, 2) = 2).
  lacuna::cell_list c;
  c.add_cell(0, "v");
  const auto a = c.add_cell(1, "a", {{0, 1}, {0, -1}});
  const auto x = c.add_cell(1, "x", {{0, 1}, {0, -1}});
  const std::int64_t big = std::int64_t{1} << 40;
  c.add_cell(2, "c0", {{a, big}});
  c.add_cell(2, "c1", {{a, 1}, {x, big}});
  c.add_cell(2, "c2", {{x, 2}});
  const auto rc = lacuna::elimination_workspace<lacuna::checked_int64>::build(c);
  const auto inv = lacuna::reduce_coboundaries<integer>(rc);
  REQUIRE(inv.size() >= 2);
  CHECK(inv[1].deferred == 1);
  CHECK(inv[1].widened == 1);  // the path under test was taken
  CHECK(route_invariants<lacuna::checked_int64>(c) == flint_all(c));
  CHECK(route_invariants<integer>(c) == flint_all(c));
  CHECK(lacuna_test::groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{})) ==
        flint_test::flint_homology(c));
}

TEST_CASE("a deferred column passing 64 bits by adding or subtracting a ±1 entry: widened alone, FLINT's factors") {
  // The deferred columns are reduced several at a time with wrapping additions whose overflow
  // is read from the signs (algorithm/integral_reduction.hpp); here the pivot entry is ±1, so
  // only that test can see the overflow. δ_1 has columns a = (c0: s, c1: 1), the unit pivot of
  // row c1, and x = (c0: -2^62 - 1 or 2^62 + 1, c1: 2^62, c2: 2), deferred (its low 2 is not a
  // unit); reducing x against a gives row c0 the value x_c0 - s·2^62 = ∓(2^63 + 1): past 64
  // bits. Expected: FLINT's Smith form of ∂_2 (and the homology FLINT gives), with the column
  // reduced over lacuna::integer (widened == 1).
  for (const std::int64_t s : {std::int64_t{1}, std::int64_t{-1}}) {
    CAPTURE(s);
    lacuna::cell_list c;
    c.add_cell(0, "v");
    const auto a = c.add_cell(1, "a", {{0, 1}, {0, -1}});
    const auto x = c.add_cell(1, "x", {{0, 1}, {0, -1}});
    const std::int64_t half = std::int64_t{1} << 62;
    c.add_cell(2, "c0", {{a, s}, {x, s == 1 ? -half - 1 : half + 1}});
    c.add_cell(2, "c1", {{a, 1}, {x, half}});
    c.add_cell(2, "c2", {{x, 2}});
    const auto rc = lacuna::elimination_workspace<lacuna::checked_int64>::build(c);
    const auto inv = lacuna::reduce_coboundaries<integer>(rc);
    REQUIRE(inv.size() >= 2);
    CHECK(inv[1].deferred == 1);
    CHECK(inv[1].widened == 1);  // the path under test was taken
    CHECK(route_invariants<lacuna::checked_int64>(c) == flint_all(c));
    CHECK(route_invariants<integer>(c) == flint_all(c));
    CHECK(lacuna_test::groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{})) ==
          flint_test::flint_homology(c));
  }
}

}  // namespace reference_torsion_flint_test

// The coboundary route (coboundary_reduction, lacuna/algorithm/integral_reduction.hpp) on
// torsion-rich complexes of graphs — matching complexes M(K_n) and chessboard complexes — and
// on the random complexes of the property suite. Sources of the expected values, beside each
// check: published values (from memory), theorems (Euler–Poincaré, the universal coefficient
// theorem, connectivity bounds), and the engine's other route (sparse_elimination with unit
// pivot elimination and dense Smith forms of the core), which shares no code with the
// reduction of coboundaries beyond building the chain complex.
#include "random_properties.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <algorithm>
#include <random>
#include <string>
#include <vector>

namespace homology_graph_complexes_test {

using lacuna::integer;
using lacuna_test::group;
using lacuna_test::groups_of;

const lacuna::sparse_elimination old_route{.allow_coboundary_route = false};

template <class C>
std::vector<group> by_coboundaries(const C& c, bool reduced = false) {
  return groups_of(lacuna::homology<integer>(c, {.reduced = reduced}, lacuna::coboundary_reduction{}));
}
template <class C>
std::vector<group> by_old_route(const C& c, bool reduced = false) {
  return groups_of(lacuna::homology<integer>(c, {.reduced = reduced}, old_route));
}

/// Euler–Poincaré: Σ (−1)^k rank H_k = Σ (−1)^k (number of k-cells).
template <class C>
void check_euler(const C& c, const std::vector<group>& h) {
  long long chi_cells = 0, chi_h = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    chi_cells += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(lacuna::cell_count(c, k));
  for (std::size_t k = 0; k < h.size(); ++k) chi_h += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(h[k].rank);
  CHECK(chi_h == chi_cells);
}

/// Universal coefficients (Hatcher 2002, Theorem 3A.3): dim H_k(X; Z/p) = rank H_k +
/// #{factors of H_k divisible by p} + #{those of H_{k−1}}; predicted from the route's Z
/// groups, compared with the old route over Z/2, Z/3 and Z/5.
template <class C>
void check_uct(const C& c, const std::vector<group>& hz) {
  auto predict = [&](std::uint64_t p) {
    std::vector<std::size_t> b;
    for (std::size_t k = 0; k < hz.size(); ++k) {
      std::size_t d = hz[k].rank;
      for (const auto& t : hz[k].torsion) d += random_test::divides(p, t);
      if (k > 0)
        for (const auto& t : hz[k - 1].torsion) d += random_test::divides(p, t);
      b.push_back(d);
    }
    return b;
  };
  CHECK(lacuna::homology<lacuna::z2>(c, {}, old_route).betti_numbers() == predict(2));
  CHECK(lacuna::homology<lacuna::mod_p<3>>(c, {}, old_route).betti_numbers() == predict(3));
  CHECK(lacuna::homology<lacuna::mod_p<5>>(c, {}, old_route).betti_numbers() == predict(5));
}

/// A (ν − 1)-connected complex has H̃_i = 0 for i ≤ ν − 1 (Hurewicz).
void check_vanishing_below(const std::vector<group>& reduced, int nu) {
  for (int i = 0; i <= nu - 1 && i < static_cast<int>(reduced.size()); ++i) CHECK(reduced[static_cast<std::size_t>(i)] == group{});
}

TEST_CASE("Bouc 1992: the reduced H_1 of the matching complex of K_7 is Z/3") {
  const auto m7 = lacuna::matching_complex(7);
  const auto h = by_coboundaries(m7, true);
  REQUIRE(h.size() >= 2);
  CHECK(h[0] == group{});  // connected (from the connectivity bound below, ν_7 = 1)
  CHECK(h[1] == group{0, {"3"}});
}

TEST_CASE("the chessboard complex of a 3 x 4 board is a torus (Björner, Lovász, Vrećica & Živaljević 1994, from memory)") {
  const auto h = by_coboundaries(lacuna::chessboard_complex(3, 4));
  CHECK(h == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
}

TEST_CASE("facet counts of the constructions: (n−1)!! perfect matchings, n·(n−2)!! near-perfect ones, n!/(n−m)! placements") {
  CHECK(lacuna::matching_complex_facets(8).size() == 105u);   // 7·5·3·1
  CHECK(lacuna::matching_complex_facets(7).size() == 105u);   // 7·(5·3·1)
  CHECK(lacuna::matching_complex_facets(11).size() == 10395u);
  CHECK(lacuna::chessboard_complex_facets(3, 5).size() == 60u);
  CHECK(lacuna::chessboard_complex_facets(5, 3).size() == 60u);
  CHECK_THROWS_AS(lacuna::matching_complex(1), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::chessboard_complex(0, 3), std::invalid_argument);
}

TEST_CASE("matching complexes M(K_n), n <= 8: both routes, Euler, universal coefficients, connectivity") {
  for (int n = 3; n <= 8; ++n) {
    CAPTURE(n);
    const auto c = lacuna::matching_complex(n);
    const auto h = by_coboundaries(c);
    CHECK(h == by_old_route(c));
    const auto hr = by_coboundaries(c, true);
    CHECK(hr == by_old_route(c, true));
    check_euler(c, h);
    check_uct(c, h);
    // Björner, Lovász, Vrećica & Živaljević (1994), from memory: M(K_n) is (ν_n − 1)-connected,
    // ν_n = ⌊(n+1)/3⌋ − 1.
    check_vanishing_below(hr, (n + 1) / 3 - 1);
  }
}

TEST_CASE("M(K_11) over Z: its rank-deficient level-4 remainder through the lattice route; Euler, universal coefficients, connectivity, the sparse route") {
  const auto c = lacuna::matching_complex(11);
  // The progress phases show which route finished the remainders: the bordering-minor proof
  // of lattice_smith.hpp (rank-deficient steps R1-R4) must have run.
  lacuna::homology_options o;
  bool bordering = false;
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "Smith form of the core: bordering minors") bordering = true;
  };
  const auto h = groups_of(lacuna::homology<integer>(c, o, lacuna::coboundary_reduction{}));
  CHECK(bordering);
  // The same route with the rank-deficient lattice steps off (the sparse route finishes the
  // remainder): an independent Smith form.
  CHECK(h == groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{.lattice_rank_deficient = false})));
  check_euler(c, h);
  check_uct(c, h);
  // Björner, Lovász, Vrećica & Živaljević (1994), from memory: (ν_11 − 1)-connected, ν_11 = 3.
  check_vanishing_below(by_coboundaries(c, true), 3);
  bool torsion = false;
  for (const auto& g : h) torsion = torsion || !g.torsion.empty();
  CHECK(torsion);  // M(K_n) has 3-torsion from n = 7 on (Bouc 1992, from memory)
  // Over Q the same remainder has only its rank proved (ranks_only: the bordering minors,
  // no local Smith forms). Universal coefficients (Hatcher 2002, Theorem 3A.3): the
  // dimensions over Q are the free ranks over Z.
  bool bordering_q = false, local_q = false;
  lacuna::homology_options oq;
  oq.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "Smith form of the core: bordering minors") bordering_q = true;
    if (r.phase == "Smith form of the core: local Smith forms") local_q = true;
  };
  const auto q = lacuna::homology<lacuna::rational>(c, oq);
  CHECK(bordering_q);
  CHECK_FALSE(local_q);
  REQUIRE(q.groups.size() == h.size());
  for (std::size_t k = 0; k < h.size(); ++k) {
    CHECK(q[static_cast<int>(k)].rank == h[k].rank);
    CHECK(q[static_cast<int>(k)].torsion.empty());
  }
}

TEST_CASE("chessboard complexes up to 4 x 5: both routes, Euler, universal coefficients, connectivity") {
  for (int m = 1; m <= 4; ++m)
    for (int n = m; n <= 5; ++n) {
      CAPTURE(m);
      CAPTURE(n);
      const auto c = lacuna::chessboard_complex(m, n);
      const auto h = by_coboundaries(c);
      CHECK(h == by_old_route(c));
      const auto hr = by_coboundaries(c, true);
      CHECK(hr == by_old_route(c, true));
      check_euler(c, h);
      check_uct(c, h);
      // Björner, Lovász, Vrećica & Živaljević (1994), from memory: the m × n chessboard
      // complex (m <= n) is (ν − 1)-connected, ν = min(m, ⌊(m+n+1)/3⌋) − 1.
      check_vanishing_below(hr, std::min(m, (m + n + 1) / 3) - 1);
    }
}

TEST_CASE("random simplicial complexes and cell lists: the routes agree, with reduced and relative variants (seed 1201)") {
  std::mt19937_64 rng(1201);
  for (int t = 0; t < 12; ++t) {
    CAPTURE(t);
    const auto x = random_test::random_simplicial(rng, 7, 3, 6 + t);
    CHECK(by_coboundaries(x) == by_old_route(x));
    CHECK(by_coboundaries(x, true) == by_old_route(x, true));
    const auto a = random_test::random_subcomplex(rng, x, 0.2);
    CHECK(groups_of(lacuna::relative_homology<integer>(x, a, {}, lacuna::coboundary_reduction{})) ==
          groups_of(lacuna::relative_homology<integer>(x, a, {}, old_route)));
    CHECK(groups_of(lacuna::relative_homology<integer>(x, a, {}, lacuna::coboundary_reduction{})) ==
          groups_of(lacuna::relative_homology<integer>(x, a, {}, lacuna::dense_elimination{})));
    const auto cl = random_test::random_cell_list(rng, t, 3 + t % 5);
    const auto hc = by_coboundaries(cl);
    CHECK(hc == by_old_route(cl));
    CHECK(hc == groups_of(lacuna::homology<integer>(cl, {}, lacuna::dense_elimination{})));
    check_euler(cl, hc);
  }
}

TEST_CASE("the route over other rings: Z/2 and Z/3 dimensions equal the old route's") {
  for (const auto& c : {lacuna::matching_complex(7), lacuna::chessboard_complex(3, 5)}) {
    CHECK(lacuna::homology<lacuna::z2>(c, {}, lacuna::coboundary_reduction{}).betti_numbers() ==
          lacuna::homology<lacuna::z2>(c, {}, old_route).betti_numbers());
    CHECK(lacuna::homology<lacuna::mod_p<3>>(c, {}, lacuna::coboundary_reduction{}).betti_numbers() ==
          lacuna::homology<lacuna::mod_p<3>>(c, {}, old_route).betti_numbers());
  }
}

TEST_CASE("over Q: the default takes the integral route; ranks equal the old route's over Q and the free ranks over Z") {
  // H_k(X; Q) = H_k(X; Z) ⊗ Q (universal coefficients, Hatcher 2002 Theorem 3A.3): the free
  // rank over Z, no torsion. M(K_7): H̃_1(Z) = Z/3 (Bouc 1992), so H̃_1(Q) = 0.
  const auto m7 = lacuna::matching_complex(7);
  const auto q7 = lacuna::homology<lacuna::rational>(m7, {.reduced = true});
  REQUIRE(q7.groups.size() >= 2);
  CHECK(q7[1].rank == 0);
  CHECK(q7[1].torsion.empty());
  CHECK(q7.betti_numbers() == lacuna::homology<lacuna::rational>(m7, {.reduced = true}, old_route).betti_numbers());
  std::vector<std::string> phases;
  lacuna::homology_options watched{};
  watched.control.progress = [&](const lacuna::progress_report& r) {
    if (phases.empty() || phases.back() != r.phase) phases.emplace_back(r.phase);
  };
  (void)lacuna::homology<lacuna::rational>(lacuna::chessboard_complex(3, 5), watched);
  CHECK(std::find(phases.begin(), phases.end(), "reducing coboundaries") != phases.end());
  std::mt19937_64 rng(1203);
  for (int t = 0; t < 10; ++t) {
    CAPTURE(t);
    const auto x = random_test::random_simplicial(rng, 7, 3, 6 + t);
    const auto q = lacuna::homology<lacuna::rational>(x);
    CHECK(q.betti_numbers() == lacuna::homology<lacuna::rational>(x, {}, old_route).betti_numbers());
    CHECK(q.betti_numbers() == lacuna::homology<integer>(x, {}, old_route).betti_numbers());
    const auto cl = random_test::random_cell_list(rng, t, 3 + t % 5);
    CHECK(lacuna::homology<lacuna::rational>(cl).betti_numbers() ==
          lacuna::homology<lacuna::rational>(cl, {}, lacuna::dense_elimination{}).betti_numbers());
  }
}

TEST_CASE("coefficients beyond 64 bits: the route widens to lacuna::integer") {
  // ∂c0 = 2^40 a, ∂c1 = a + 2^40 b (a, b loops at one vertex). The reduction of the
  // coboundary of b subtracts 2^40 times that of a and meets 2^80. The relation matrix has
  // entry gcd 1 and determinant 2^80, so H_1 = Z/2^80 (Smith normal form, by hand).
  lacuna::cell_list c;
  c.add_cell(0, "v");
  const auto a = c.add_cell(1, "a", {{0, 1}, {0, -1}});
  const auto b = c.add_cell(1, "b", {{0, 1}, {0, -1}});
  const std::int64_t big = std::int64_t{1} << 40;
  c.add_cell(2, "c0", {{a, big}});
  c.add_cell(2, "c1", {{a, 1}, {b, big}});
  const auto h = by_coboundaries(c);
  REQUIRE(h.size() == 3u);
  CHECK(h[1] == group{0, {"1208925819614629174706176"}});  // 2^80
  CHECK(h == groups_of(lacuna::homology<integer>(c, {}, lacuna::dense_elimination{})));
}

TEST_CASE("which route runs: the default takes the coboundary route for integral ranks and torsion of a simplicial complex") {
  const auto c = lacuna::matching_complex(6);
  auto phases_of = [&](auto run) {
    std::vector<std::string> seen;
    lacuna::homology_options o;
    o.control.progress = [&](const lacuna::progress_report& r) {
      if (seen.empty() || seen.back() != r.phase) seen.emplace_back(r.phase);
    };
    run(o);
    return seen;
  };
  auto has = [](const std::vector<std::string>& v, const std::string& s) { return std::find(v.begin(), v.end(), s) != v.end(); };
  const auto by_default = phases_of([&](lacuna::homology_options& o) { lacuna::homology<integer>(c, o); });
  CHECK(has(by_default, "reducing coboundaries"));
  CHECK(!has(by_default, "eliminating unit pivots"));
  const auto with_generators = phases_of([&](lacuna::homology_options& o) {
    o.generators = true;
    lacuna::homology<integer>(c, o, lacuna::coboundary_reduction{});
  });
  CHECK(!has(with_generators, "reducing coboundaries"));  // generators: the old route
  const auto over_z2 = phases_of([&](lacuna::homology_options& o) { lacuna::homology<lacuna::z2>(c, o); });
  CHECK(!has(over_z2, "reducing coboundaries"));
  // with generators asked of the route, the groups are those of the old route, generators included
  const auto hg = lacuna::homology<integer>(c, {.generators = true}, lacuna::coboundary_reduction{});
  CHECK(groups_of(hg) == by_old_route(c));
  CHECK(!hg.groups[1].generators.empty());
}

TEST_CASE("a stop request ends the route with computation_stopped") {
  const auto c = lacuna::matching_complex(8);
  lacuna::homology_options o;
  o.control.progress = [](const lacuna::progress_report& r) {
    if (r.phase == std::string_view("reducing coboundaries") && r.done > 0) throw lacuna::computation_stopped();
  };
  CHECK_THROWS_AS(lacuna::homology<integer>(c, o, lacuna::coboundary_reduction{}), lacuna::computation_stopped);
}

TEST_CASE("not a chain complex: the route names the cell, as the old route does") {
  lacuna::cell_list c;
  c.add_cell(0, "v");
  c.add_cell(0, "w");
  const auto e = c.add_cell(1, "e", {{1, 1}, {0, -1}});
  c.add_cell(2, "bad", {{e, 1}});
  CHECK_THROWS_AS(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{}), lacuna::invalid_complex);
}

}  // namespace homology_graph_complexes_test

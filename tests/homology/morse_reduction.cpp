// The discrete Morse reduction (lacuna/algorithm/morse_reduction.hpp) on textbook spaces and
// random complexes. What is checked, and why it must hold:
//   * the Morse complex is a chain complex (validate: ∂∂ = 0) with the homology of the
//     original over Z and Z/2 (Forman 1998, the Morse complex theorem; Sköldberg 2006, the
//     main theorem; both from memory), and for the textbook spaces the groups the books give;
//   * it has no more k-cells than the original and the same Euler characteristic (a Morse
//     pair removes one cell in each of two adjacent dimensions);
//   * lift (g) and project (f) are chain maps, f∘g = id, and g∘f = id on homology
//     (Sköldberg 2006: f, g are inverse homotopy equivalences; from memory);
//   * lifted generators of the Morse homology are cycles of the original, the free ones form
//     a unimodular matrix in a basis of the original's homology, and the torsion ones have
//     their orders and generate the torsion subgroup;
//   * coefficients beyond int64 throw coefficient_overflow; a stop request throws
//     computation_stopped.
#include "random_properties.hpp"

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/morse_reduction.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <cstdint>
#include <random>
#include <set>
#include <stop_token>
#include <string>
#include <vector>

namespace homology_morse_reduction_test {

using lacuna::cell_list;
using lacuna::integer;
using lacuna_test::group;
using lacuna_test::groups_of;

static_assert(lacuna::cell_complex<lacuna::morse_complex>);
static_assert(!lacuna::complex_with_coboundary<lacuna::morse_complex>);

namespace {

group Z(std::size_t r, std::vector<std::string> t = {}) { return {r, std::move(t)}; }

/// ∂x in the complex c, over R, computed from c's own boundaries.
template <class R, class C>
lacuna::chain<R> boundary_of(const C& c, const lacuna::chain<R>& x) {
  lacuna::chain<R> out{x.dimension - 1, {}};
  if (x.dimension == 0) return out;
  for (const auto& t : x.terms)
    for (auto&& v : lacuna::boundary(c, x.dimension, t.cell)) {
      const auto inc = lacuna::as_incidence(v);
      out.terms.push_back({inc.face, lacuna::from_integer<R>(inc.coefficient) * t.coefficient});
    }
  out.normalize_terms();
  return out;
}

/// A chain of up to `terms` random k-cells of n with coefficients in -3..3.
template <class R>
lacuna::chain<R> random_chain(std::mt19937_64& rng, int k, std::size_t n, int terms) {
  lacuna::chain<R> z{k, {}};
  std::uniform_int_distribution<std::size_t> cell(0, n - 1);
  std::uniform_int_distribution<int> coef(-3, 3);
  for (int i = 0; i < terms; ++i) z.terms.push_back({cell(rng), lacuna::from_integer<R>(coef(rng))});
  z.normalize_terms();
  return z;
}

/// f and g are chain maps, f∘g = id (on random chains of each dimension).
template <class R, class C>
void check_maps(std::mt19937_64& rng, const C& c, const lacuna::morse_complex& m) {
  for (int k = 0; k <= m.top_dimension(); ++k) {
    CAPTURE(k);
    for (int trial = 0; trial < 4; ++trial) {
      if (m.cell_count(k) > 0) {
        const auto z = random_chain<R>(rng, k, m.cell_count(k), 1 + trial * 2);
        const auto g = m.lift(z);
        CHECK(g.dimension == k);
        CHECK(m.project(g) == z);                                  // f∘g = id
        if (k > 0) CHECK(boundary_of(c, g) == m.lift(boundary_of(m, z)));  // ∂g = g∂
      }
      if (k > 0 && lacuna::cell_count(c, k) > 0) {
        const auto x = random_chain<R>(rng, k, lacuna::cell_count(c, k), 1 + trial * 3);
        // f∂ = ∂f: the image of a boundary is the Morse boundary of the image.
        CHECK(m.project(boundary_of(c, x)) == boundary_of(m, m.project(x)));
      }
    }
  }
}

integer order_in(const integer& w, const integer& t) { return t / lacuna::gcd(w, t); }

/// Generators of H(m) lifted to c: cycles; free ones unimodular in the original's basis,
/// torsion ones of their orders, generating the torsion; and g∘f = id on H(c).
template <class C>
void check_generators(const C& c, const lacuna::morse_complex& m) {
  const auto hm = lacuna::homology<integer>(m, {.generators = true});
  const auto ho = lacuna::homology<integer>(c, {.generators = true});
  REQUIRE(ho.has_basis());
  for (int k = 0; k <= m.top_dimension(); ++k) {
    CAPTURE(k);
    const auto& gm = hm[k];
    const auto& go = ho[k];
    REQUIRE(gm.rank == go.rank);
    REQUIRE(gm.torsion == go.torsion);
    const std::size_t r = go.rank, t = go.torsion.size();
    std::vector<std::vector<integer>> x;
    for (const auto& z : gm.generators) {
      const auto g = m.lift(z);
      CHECK(boundary_of(c, g).is_zero());
      x.push_back(ho.coordinates(c, g));
      REQUIRE(x.back().size() == r + t);
    }
    REQUIRE(x.size() == r + t);
    lacuna_test::check_free_block_unimodular(x, r);  // the free block has determinant ±1
    if (t > 0) {
      // Each torsion generator: zero free part, order (lcm of t_j / gcd(w_j, t_j)) its own.
      for (std::size_t i = r; i < r + t; ++i) {
        integer ord(1);
        for (std::size_t j = 0; j < r; ++j) CHECK(x[i][j] == integer(0));
        for (std::size_t j = 0; j < t; ++j) {
          const integer o = order_in(x[i][r + j], go.torsion[j]);
          ord = ord / lacuna::gcd(ord, o) * o;
        }
        CHECK(ord == lacuna::normalize(gm.orders[i]));
      }
      // Together they generate ⊕ Z/t_j: the rows w_i with the relations t_j e_j span Z^t
      // (Smith form of the stacked matrix all ones), so the induced map on torsion is onto,
      // hence one-to-one (a finite group).
      lacuna::dense_matrix<integer> W(2 * t, t);
      for (std::size_t i = 0; i < t; ++i)
        for (std::size_t j = 0; j < t; ++j) W(i, j) = x[r + i][r + j];
      for (std::size_t j = 0; j < t; ++j) W(t + j, j) = go.torsion[j];
      const auto s = lacuna::dense_smith_form(W);
      CHECK(s.rank == t);
      for (const auto& d : s.diagonal) CHECK(d == integer(1));
    }
    // g∘f = id on homology: the original's generators come back to their own classes.
    for (const auto& z : go.generators) {
      const auto fz = m.project(z);
      CHECK(boundary_of(m, fz).is_zero());
      CHECK(ho.coordinates(c, m.lift(fz)) == ho.coordinates(c, z));
    }
  }
}

/// Every check on one complex; returns the integral groups of the Morse complex.
template <class C>
std::vector<group> check_morse(std::mt19937_64& rng, const C& c) {
  const auto m = lacuna::morse_reduce(c);
  lacuna::validate(m);
  REQUIRE(m.top_dimension() == lacuna::top_dimension(c));
  std::int64_t chi = 0;
  for (int k = 0; k <= m.top_dimension(); ++k) {
    CAPTURE(k);
    CHECK(m.original_count(k) == lacuna::cell_count(c, k));
    CHECK(m.cell_count(k) <= lacuna::cell_count(c, k));
    std::set<std::size_t> seen;
    for (std::size_t i = 0; i < m.cell_count(k); ++i) {
      CHECK(m.original_cell(k, i) < lacuna::cell_count(c, k));
      seen.insert(m.original_cell(k, i));
      const auto b = m.boundary(k, i);
      for (std::size_t j = 0; j < b.size(); ++j) {
        CHECK(b[j].coefficient != 0);
        if (j > 0) CHECK(b[j - 1].face < b[j].face);
      }
    }
    CHECK(seen.size() == m.cell_count(k));
    chi += (k % 2 ? -1 : 1) * static_cast<std::int64_t>(m.cell_count(k));
  }
  CHECK(chi == lacuna::euler_characteristic(c));
  const auto hz = groups_of(lacuna::homology<integer>(m));
  CHECK(hz == groups_of(lacuna::homology<integer>(c)));
  CHECK(groups_of(lacuna::homology<lacuna::z2>(m)) == groups_of(lacuna::homology<lacuna::z2>(c)));
  check_generators(c, m);
  check_maps<integer>(rng, c, m);
  check_maps<lacuna::z2>(rng, c, m);
  return hz;
}

}  // namespace

TEST_CASE("Morse reduction of textbook spaces: the books' groups, with generators") {
  std::mt19937_64 rng(801);
  // H_k(S^n) = Z for k = 0, n, else 0 (Hatcher, Algebraic Topology, 2002, Corollary 2.14).
  for (int n = 1; n <= 4; ++n) {
    CAPTURE(n);
    std::vector<group> want(static_cast<std::size_t>(n) + 1, Z(0));
    want[0] = Z(1);
    want[static_cast<std::size_t>(n)] = Z(1);
    CHECK(check_morse(rng, lacuna_test::simplex_boundary_sphere(n)) == want);
    CHECK(check_morse(rng, cell_list::sphere(n)) == want);
  }
  // H(T^2) = Z, Z^2, Z (Hatcher 2002, Example 2.3 / §2.1).
  CHECK(check_morse(rng, cell_list::torus()) == std::vector<group>{Z(1), Z(2), Z(1)});
  CHECK(check_morse(rng, lacuna_test::seven_vertex_torus()) == std::vector<group>{Z(1), Z(2), Z(1)});
  // Klein bottle: Z, Z + Z/2, 0 (Hatcher 2002, §2.1).
  CHECK(check_morse(rng, cell_list::klein_bottle()) == std::vector<group>{Z(1), Z(1, {"2"}), Z(0)});
  // RP^2: Z, Z/2, 0 (Hatcher 2002, §2.1).
  CHECK(check_morse(rng, cell_list::projective_plane()) == std::vector<group>{Z(1), Z(0, {"2"}), Z(0)});
  CHECK(check_morse(rng, lacuna_test::six_vertex_rp2()) == std::vector<group>{Z(1), Z(0, {"2"}), Z(0)});
  // RP^n (Hatcher 2002, Example 2.42): Z for k = 0 and k = n odd, Z/2 for odd 0 < k < n.
  for (int n = 1; n <= 7; ++n) {
    CAPTURE(n);
    std::vector<group> want;
    for (int k = 0; k <= n; ++k)
      want.push_back(k == 0 || (k == n && k % 2 == 1) ? Z(1) : k % 2 == 1 ? Z(0, {"2"}) : Z(0));
    const auto c = cell_list::real_projective_space(n);
    CHECK(check_morse(rng, c) == want);
    // One cell per dimension with boundary coefficients 0 or 2 (Hatcher 2002, Example 2.42):
    // no coefficient is a unit, so nothing pairs and every cell is critical.
    const auto m = lacuna::morse_reduce(c);
    for (int k = 0; k <= n; ++k) CHECK(m.cell_count(k) == 1);
  }
  // Lens spaces L(p, q): Z, Z/p, 0, Z (Hatcher 2002, Example 2.43).
  for (auto [p, q] : std::vector<std::pair<int, int>>{{2, 1}, {3, 1}, {5, 2}, {7, 3}, {12, 5}}) {
    CAPTURE(p);
    CHECK(check_morse(rng, cell_list::lens_space(p, q)) == std::vector<group>{Z(1), Z(0, {std::to_string(p)}), Z(0), Z(1)});
  }
  // The Möbius band retracts onto its core circle: Z, Z, 0 (from memory).
  CHECK(check_morse(rng, lacuna_test::five_vertex_moebius()) == std::vector<group>{Z(1), Z(1), Z(0)});
  // The dunce hat is contractible (Zeeman 1964, "On the dunce hat"), but not collapsible:
  // coreductions still find a reduction, not necessarily to one point.
  CHECK(check_morse(rng, lacuna_test::dunce_hat(4)) == std::vector<group>{Z(1), Z(0), Z(0)});
  cell_list hat;  // one cell per dimension: ∂D = a + a - a (the definition as a quotient)
  hat.add_cell(0, "v");
  hat.add_cell(1, "a", {{0, 1}, {0, -1}});
  hat.add_cell(2, "D", {{0, 1}, {0, 1}, {0, -1}});
  CHECK(check_morse(rng, hat) == std::vector<group>{Z(1), Z(0), Z(0)});
  // The matching complex of K_7: reduced H_1 = Z/3 (Bouc 1992; from memory), so unreduced
  // Z, Z/3, Z^20 (rank H_2 from χ = 21 - 105 + 105 = 21, as in textbook.cpp).
  CHECK(check_morse(rng, lacuna_test::matching_complex(7)) == std::vector<group>{Z(1), Z(0, {"3"}), Z(20)});
}

TEST_CASE("Morse reduction of random complexes (seeds 811 to 815)") {
  SUBCASE("random simplicial complexes") {
    std::mt19937_64 rng(811);
    for (int t = 0; t < 24; ++t) {
      CAPTURE(t);
      check_morse(rng, random_test::random_simplicial(rng, 6 + t % 6, 2 + t % 3, 4 + 3 * t));
    }
  }
  SUBCASE("random cell lists: quotients, suspensions, wedges, presentations") {
    std::mt19937_64 rng(812);
    for (int t = 0; t < 32; ++t) {
      CAPTURE(t);
      check_morse(rng, random_test::random_cell_list(rng, t, 1 + t % 7));
    }
  }
  SUBCASE("random cubical volumes") {
    std::mt19937_64 rng(813);
    for (int t = 0; t < 10; ++t) {
      CAPTURE(t);
      const double density = 0.35 + 0.1 * (t % 5);
      check_morse(rng, random_test::random_volume<2>(rng, {8, 7}, density));
      check_morse(rng, random_test::random_volume<3>(rng, {5, 4, static_cast<std::size_t>(3 + t % 2)}, density));
    }
  }
  SUBCASE("products of random presentations and complexes (torsion products)") {
    std::mt19937_64 rng(814);
    for (int t = 0; t < 6; ++t) {
      CAPTURE(t);
      const auto a = random_test::random_presentation(rng, 1 + t % 3, 1 + t % 3, 6);
      check_morse(rng, lacuna::product(a, random_test::random_cell_list(rng, t, 1 + t % 3)));
    }
  }
  SUBCASE("a random simplicial complex of about 2300 cells") {
    std::mt19937_64 rng(815);
    const auto c = random_test::random_simplicial(rng, 30, 4, 380);
    CHECK(lacuna::total_cell_count(c) > 2000);
    check_morse(rng, c);
  }
}

TEST_CASE("Morse boundaries along gradient paths, and coefficients beyond int64") {
  // One vertex, loops e_0..e_n, 2-cells u_i with ∂u_i = e_i + M e_{i-1} and σ with ∂σ = 2 e_n.
  // By hand: in H_1, e_i = -M e_{i-1}, so H_1 = Z/(2 M^n) and H_2 = 0; the coreductions
  // pair (e_i, u_i) after e_0 is made critical, and the gradient path from σ gives the
  // Morse boundary ∂σ = 2 (-M)^n e_0.
  const auto ladder = [](std::int64_t M, int n) {
    cell_list c;
    c.add_cell(0, "v");
    for (int i = 0; i <= n; ++i) c.add_cell(1, "", {{0, 1}, {0, -1}});
    for (int i = 1; i <= n; ++i)
      c.add_cell(2, "", {{static_cast<std::size_t>(i), 1}, {static_cast<std::size_t>(i - 1), M}});
    c.add_cell(2, "", {{static_cast<std::size_t>(n), 2}});
    return c;
  };
  {
    const auto c = ladder(3, 3);
    const auto m = lacuna::morse_reduce(c);
    REQUIRE(m.cell_count(0) == 1);
    REQUIRE(m.cell_count(1) == 1);
    REQUIRE(m.cell_count(2) == 1);
    CHECK(m.original_cell(1, 0) == 0);
    CHECK(m.original_cell(2, 0) == 3);
    const auto b = m.boundary(2, 0);
    REQUIRE(b.size() == 1);
    CHECK(b[0] == lacuna::incidence{0, -54});  // 2 (-3)^3
    std::mt19937_64 rng(821);
    CHECK(check_morse(rng, c) == std::vector<group>{Z(1), Z(0, {"54"}), Z(0)});
  }
  // 2 * (2^20)^4 = 2^81 does not fit: the reduction refuses rather than wraps.
  CHECK_THROWS_AS(lacuna::morse_reduce(ladder(std::int64_t{1} << 20, 4)), lacuna::coefficient_overflow);
  // 2 * (2^20)^3 = 2^61 still fits.
  CHECK(lacuna::morse_reduce(ladder(std::int64_t{1} << 20, 3)).boundary(2, 0)[0].coefficient == -(std::int64_t{1} << 61));
  // An incidence number beyond int64 in the input.
  cell_list big;
  big.add_cell(0, "v");
  big.add_cell(1, "a", {{0, 1}, {0, -1}});
  big.add_cell(2, "D", std::vector<lacuna::exact_incidence>{{0, integer(integer::big_type(1) << 70)}});
  CHECK_THROWS_AS(lacuna::morse_reduce(big), lacuna::coefficient_overflow);
}

TEST_CASE("Morse complex: the empty complex, and bad arguments") {
  const auto e = lacuna::morse_reduce(cell_list{});
  CHECK(e.top_dimension() == -1);
  CHECK(e.cell_count(0) == 0);
  CHECK(e.original_count(0) == 0);
  const auto m = lacuna::morse_reduce(cell_list::torus());
  CHECK_THROWS_AS(m.boundary(3, 0), std::invalid_argument);
  CHECK_THROWS_AS(m.boundary(1, m.cell_count(1)), std::out_of_range);
  CHECK_THROWS_AS(m.lift(lacuna::chain<integer>{1, {{m.cell_count(1), integer(1)}}}), std::invalid_argument);
  CHECK_THROWS_AS(m.project(lacuna::chain<integer>{1, {{m.original_count(1), integer(1)}}}), std::invalid_argument);
  CHECK_THROWS_AS(m.lift(lacuna::chain<integer>{5, {{0, integer(1)}}}), std::invalid_argument);
  CHECK(m.lift(lacuna::chain<integer>{5, {}}).is_zero());
}

TEST_CASE("Morse reduction: stop requests and progress") {
  // A 41 x 41 square of pixels without the pixels (odd, odd): 400 enclosed holes, so
  // hundreds of critical edges with long gradient paths.
  const auto holes = lacuna::cubical_complex<2>::from_predicate(
      {41, 41}, [](const auto& x) { return x[0] % 2 == 0 || x[1] % 2 == 0; });
  {  // a normal run reports both phases and closes them
    std::vector<std::string> closed;
    lacuna::run_control ctl;
    ctl.progress = [&](const lacuna::progress_report& r) {
      CHECK(r.done <= r.total);
      if (r.done == r.total && (closed.empty() || closed.back() != r.phase)) closed.emplace_back(r.phase);
    };
    const auto m = lacuna::morse_reduce(holes, {.control = &ctl});
    CHECK(closed == std::vector<std::string>{"Morse matching", "Morse boundaries"});
    // 400 holes: H_1 = Z^400 (Alexander duality for a planar set: one generator per bounded
    // complementary component; from memory).
    CHECK(lacuna::homology<integer>(m).betti_numbers() == std::vector<std::size_t>{1, 400, 0});
    CHECK(lacuna::homology<integer>(holes).betti_numbers() == std::vector<std::size_t>{1, 400, 0});
  }
  {  // stopped before it starts
    std::stop_source src;
    src.request_stop();
    lacuna::run_control ctl{.stop = src.get_token()};
    CHECK_THROWS_AS(lacuna::morse_reduce(holes, {.control = &ctl}), lacuna::computation_stopped);
  }
  for (const std::string phase : {"Morse matching", "Morse boundaries"}) {  // stopped midway
    CAPTURE(phase);
    std::stop_source src;
    lacuna::run_control ctl{.stop = src.get_token()};
    ctl.progress = [&](const lacuna::progress_report& r) {
      if (r.phase == phase && r.done > 0 && r.done < r.total) src.request_stop();
    };
    CHECK_THROWS_AS(lacuna::morse_reduce(holes, {.control = &ctl}), lacuna::computation_stopped);
    CHECK(src.stop_requested());
  }
  {  // lift and project look at the stop request too
    const auto m = lacuna::morse_reduce(holes);
    std::stop_source src;
    src.request_stop();
    lacuna::run_control ctl{.stop = src.get_token()};
    lacuna::chain<integer> all{1, {}};
    for (std::size_t i = 0; i < m.cell_count(1); ++i) all.terms.push_back({i, integer(1)});
    CHECK_THROWS_AS(m.lift(all, integer(1), &ctl), lacuna::computation_stopped);
    CHECK_FALSE(m.lift(all).is_zero());
  }
}

}  // namespace homology_morse_reduction_test

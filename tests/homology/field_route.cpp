// Homology over fields through the column reductions (lacuna/algorithm/field_ranks.hpp): the
// default route of lacuna::homology over Z/2 and Z/p without generators. Checked against
//  - the route of the integers run over the same field (sparse_elimination with
//    field_column_reduction = false: unit pivots, then Smith forms of the core), and against
//    dense Smith forms of the whole boundary matrices (dense_elimination) on small complexes;
//  - both directions of field_betti_numbers, with and without a pre-reduction, in the
//    complex's order of cells and reversed;
//  - values from textbooks (Hatcher, Algebraic Topology, 2002, §2.1–2.2, from memory): the
//    torus has H = Z, Z², Z; the Klein bottle Z, Z ⊕ Z/2, 0; RP² Z, Z/2, 0; the lens space
//    L(5, 1) Z, Z/5, 0, Z; the dunce hat is contractible; the Möbius band is a circle. Over a
//    field these become dimensions by the universal coefficient theorem (Hatcher 2002,
//    Theorem 3A.3): dim H_k(X; Z/p) = rank H_k + #(factors of H_k divisible by p) +
//    #(factors of H_{k−1} divisible by p);
//  - the same theorem on random complexes, against lacuna::homology<integer>;
//  - the matching complex M(K_7): H̃_1(M_7; Z) = Z/3 (Bouc 1992, from memory), so H̃_1 has
//    dimension 1 over Z/3 and 0 over Z/2 and Z/5.
#include "random_properties.hpp"

#include <lacuna/algorithm/field_ranks.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>

#include <doctest/doctest.h>

#include <random>
#include <stop_token>
#include <string>
#include <vector>

namespace homology_field_route_test {

using lacuna::cell_list;
using lacuna::mod_p;
using lacuna::mod_p_dynamic;
using lacuna::z2;
using random_test::m61;

namespace {

const lacuna::sparse_elimination old_route{.field_column_reduction = false};

using betti_t = std::vector<std::size_t>;

/// Homology (co = false) or cohomology (co = true) Betti numbers by one algorithm.
template <class F, class C, class Algorithm>
betti_t run(const C& c, bool co, bool reduced, const Algorithm& alg, const F& unit) {
  const lacuna::homology_options o{.reduced = reduced};
  return (co ? lacuna::cohomology<F>(c, o, alg, unit) : lacuna::homology<F>(c, o, alg, unit)).betti_numbers();
}

/// The new route (default) against the old one, dense Smith forms (small complexes) and each
/// setting of field_betti_numbers called directly; homology, reduced homology, cohomology.
template <class F, class C>
void same_as_old(const C& c, const F& unit = lacuna::one<F>()) {
  const int top = lacuna::top_dimension(c);
  for (int mode = 0; mode < 3; ++mode) {
    const bool co = mode == 2, reduced = mode == 1;
    CAPTURE(mode);
    const betti_t fresh = run<F>(c, co, reduced, lacuna::sparse_elimination{}, unit);
    CHECK(fresh == run<F>(c, co, reduced, old_route, unit));
    if (lacuna::total_cell_count(c) <= 1200) CHECK(fresh == run<F>(c, co, reduced, lacuna::dense_elimination{}, unit));
    for (auto dir : {lacuna::reduction_direction::coboundary, lacuna::reduction_direction::boundary,
                     lacuna::reduction_direction::automatic})
      for (int setting = 0; setting < 3; ++setting) {
        const bool pre = setting == 1, reversed = setting == 2;
        CAPTURE(static_cast<int>(dir));
        CAPTURE(setting);
        auto rc = lacuna::elimination_workspace<F>::build(c, {.augmented = reduced, .dual = co}, unit);
        lacuna::elimination_options e;
        e.markowitz = false;
        const auto levels =
            lacuna::field_betti_numbers(rc, pre ? &e : nullptr, {.direction = dir, .reversed = reversed});
        for (int k = 0; k <= top; ++k) {
          const int L = co ? top - k : k + (reduced ? 1 : 0);
          CHECK(levels[static_cast<std::size_t>(L)] == fresh[static_cast<std::size_t>(k)]);
        }
      }
  }
}

/// Relative homology H(X, A) by both routes.
template <class F, class C>
void same_as_old_relative(const C& c, const random_test::marks_t& a, const F& unit = lacuna::one<F>()) {
  const auto fresh = lacuna::relative_homology<F>(c, a, {}, lacuna::sparse_elimination{}, unit).betti_numbers();
  CHECK(fresh == lacuna::relative_homology<F>(c, a, {}, old_route, unit).betti_numbers());
}

template <class C>
void same_as_old_every_field(const C& c) {
  same_as_old<z2>(c);
  same_as_old<mod_p<3>>(c);
  same_as_old<mod_p<5>>(c);
  same_as_old<mod_p_dynamic>(c, mod_p_dynamic(1, m61));
}

/// dim H_k(X; Z/p) from the integral groups (universal coefficient theorem, as above).
betti_t uct(const std::vector<lacuna_test::group>& hz, std::uint64_t p) {
  betti_t b;
  for (std::size_t k = 0; k < hz.size(); ++k) {
    std::size_t d = hz[k].rank;
    for (const auto& t : hz[k].torsion) d += random_test::divides(p, t);
    if (k > 0)
      for (const auto& t : hz[k - 1].torsion) d += random_test::divides(p, t);
    b.push_back(d);
  }
  return b;
}

/// Integral groups given as (rank, torsion factors) per dimension, checked over Z/2, Z/3,
/// Z/5 and Z/(2^61 − 1) on the new route through the universal coefficient theorem.
template <class C>
void textbook(const C& c, const std::vector<lacuna_test::group>& integral) {
  // the integral groups themselves, so that a wrong expectation cannot pass unnoticed
  CHECK(lacuna_test::groups_of(lacuna::homology<lacuna::integer>(c)) == integral);
  CHECK(lacuna::homology<z2>(c).betti_numbers() == uct(integral, 2));
  CHECK(lacuna::homology<mod_p<3>>(c).betti_numbers() == uct(integral, 3));
  CHECK(lacuna::homology<mod_p<5>>(c).betti_numbers() == uct(integral, 5));
  CHECK(lacuna::homology<mod_p_dynamic>(c, {}, {}, mod_p_dynamic(1, m61)).betti_numbers() == uct(integral, m61));
  same_as_old_every_field(c);
}

lacuna_test::group Z(std::size_t rank, std::vector<std::string> torsion = {}) { return {rank, std::move(torsion)}; }

}  // namespace

TEST_CASE("textbook complexes over Z/2, Z/3, Z/5 and Z/(2^61 - 1): both routes and the textbook values") {
  // Hatcher 2002: the torus (Example 2.3), the Klein bottle and RP² (§2.1, from their
  // Δ-complex structures), the lens space L(5, 1) (Example 2.43), S² and S³; the dunce hat
  // is contractible (Hatcher, Chapter 0); the Möbius band deformation retracts to a circle.
  textbook(lacuna_test::seven_vertex_torus(), {Z(1), Z(2), Z(1)});
  textbook(cell_list::klein_bottle(), {Z(1), Z(1, {"2"}), Z(0)});
  textbook(lacuna_test::six_vertex_rp2(), {Z(1), Z(0, {"2"}), Z(0)});
  textbook(cell_list::projective_plane(), {Z(1), Z(0, {"2"}), Z(0)});
  textbook(cell_list::lens_space(5, 1), {Z(1), Z(0, {"5"}), Z(0), Z(1)});
  textbook(lacuna_test::dunce_hat(), {Z(1), Z(0), Z(0)});
  textbook(lacuna_test::five_vertex_moebius(), {Z(1), Z(1), Z(0)});
  textbook(lacuna_test::simplex_boundary_sphere(2), {Z(1), Z(0), Z(1)});
  textbook(lacuna_test::simplex_boundary_sphere(3), {Z(1), Z(0), Z(0), Z(1)});
  // RP² over Z/2: every dimension is one (spelled out, Hatcher 2002, Example 2.42 with Z/2)
  CHECK(lacuna::homology<z2>(lacuna_test::six_vertex_rp2()).betti_numbers() == betti_t{1, 1, 1});
  CHECK(lacuna::homology<mod_p<3>>(lacuna_test::six_vertex_rp2()).betti_numbers() == betti_t{1, 0, 0});
}

TEST_CASE("relative homology of textbook pairs: both routes") {
  std::mt19937_64 rng(1201);
  for (int trial = 0; trial < 6; ++trial) {
    const auto c = lacuna_test::seven_vertex_torus();
    const auto a = random_test::random_subcomplex(rng, c, 0.25);
    same_as_old_relative<z2>(c, a);
    same_as_old_relative<mod_p<3>>(c, a);
    same_as_old_relative<mod_p<5>>(c, a);
    same_as_old_relative<mod_p_dynamic>(c, a, mod_p_dynamic(1, m61));
  }
  // (S², a vertex): H_2 = Z and nothing else in positive dimensions (the long exact sequence)
  const auto s2 = lacuna_test::simplex_boundary_sphere(2);
  random_test::marks_t vertex(3);
  vertex[0].assign(lacuna::cell_count(s2, 0), false);
  vertex[0][0] = true;
  vertex[1].assign(lacuna::cell_count(s2, 1), false);
  vertex[2].assign(lacuna::cell_count(s2, 2), false);
  CHECK(lacuna::relative_homology<mod_p<3>>(s2, vertex).betti_numbers() == betti_t{0, 0, 1});
}

TEST_CASE("random complexes: both routes, and the universal coefficient theorem against the integers (seed 1202)") {
  std::mt19937_64 rng(1202);
  for (int trial = 0; trial < 8; ++trial) {
    CAPTURE(trial);
    const auto s = random_test::random_simplicial(rng, 7, 3, 9);
    same_as_old_every_field(s);
    random_test::check_uct(s, lacuna_test::groups_of(lacuna::homology<lacuna::integer>(s)));
    const auto a = random_test::random_subcomplex(rng, s, 0.3);
    same_as_old_relative<z2>(s, a);
    same_as_old_relative<mod_p<3>>(s, a);
    same_as_old_relative<mod_p_dynamic>(s, a, mod_p_dynamic(1, m61));

    const auto v = random_test::random_volume<3>(rng, {4, 4, 3}, 0.5);
    same_as_old_every_field(v);
    random_test::check_uct(v, lacuna_test::groups_of(lacuna::homology<lacuna::integer>(v)));

    const auto cl = random_test::random_cell_list(rng, trial % 4, 6);
    same_as_old_every_field(cl);
    random_test::check_uct(cl, lacuna_test::groups_of(lacuna::homology<lacuna::integer>(cl)));
  }
}

TEST_CASE("matching complex M(K_7): H~_1 has dimension 1 over Z/3, 0 over Z/2 and Z/5") {
  // H̃_1(M_7; Z) = Z/3 (Bouc 1992, from memory); with the universal coefficient theorem
  // dim H̃_1(M_7; Z/p) = [p = 3], since H̃_0 = 0 (M_7 is connected).
  const auto m7 = lacuna_test::matching_complex(7);
  const lacuna::homology_options reduced{.reduced = true};
  CHECK(lacuna::homology<mod_p<3>>(m7, reduced)[1].rank == 1);
  CHECK(lacuna::homology<z2>(m7, reduced)[1].rank == 0);
  CHECK(lacuna::homology<mod_p<5>>(m7, reduced)[1].rank == 0);
  CHECK(lacuna::homology<mod_p<3>>(m7, reduced)[0].rank == 0);
  // the integers agree (H̃_1 = Z/3), and every field by the universal coefficient theorem
  const auto hz = lacuna_test::groups_of(lacuna::homology<lacuna::integer>(m7, reduced));
  CHECK(hz[1] == Z(0, {"3"}));
  CHECK(lacuna::homology<mod_p<3>>(m7, reduced).betti_numbers() == uct(hz, 3));
  CHECK(lacuna::homology<z2>(m7, reduced).betti_numbers() == uct(hz, 2));
  same_as_old_every_field(m7);
}

TEST_CASE("the field route stops on request and reports its phase") {
  const auto m7 = lacuna_test::matching_complex(7);
  std::stop_source source;
  source.request_stop();
  lacuna::homology_options o;
  o.control.stop = source.get_token();
  CHECK_THROWS_AS(lacuna::homology<z2>(m7, o), lacuna::computation_stopped);
  CHECK_THROWS_AS(lacuna::homology<mod_p<3>>(m7, o), lacuna::computation_stopped);
  // a stop from the progress callback during the column reduction
  std::stop_source mid;
  bool seen_phase = false;
  lacuna::homology_options p;
  p.control.stop = mid.get_token();
  p.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "reducing columns over a field") {
      seen_phase = true;
      mid.request_stop();
    }
  };
  CHECK_THROWS_AS(lacuna::homology<mod_p<3>>(m7, p), lacuna::computation_stopped);
  CHECK(seen_phase);
  // and a run after it gives the right answer
  CHECK(lacuna::homology<mod_p<3>>(m7, {.reduced = true})[1].rank == 1);
}

TEST_CASE("generators and keep_basis keep the old route, with the same dimensions") {
  const auto k = cell_list::klein_bottle();
  const auto h = lacuna::homology<mod_p<3>>(k, {.generators = true});
  CHECK(h.betti_numbers() == betti_t{1, 1, 0});
  CHECK(h[1].generators.size() == 1);
  CHECK(h.has_basis());
  const auto plain = lacuna::homology<mod_p<3>>(k);
  CHECK(!plain.has_basis());
  CHECK(plain.betti_numbers() == h.betti_numbers());
}

}  // namespace homology_field_route_test

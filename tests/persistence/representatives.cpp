// Representative cycles, judged by lacuna::homology (the engine, which knows nothing of
// filtrations) on subcomplexes. For every pair of dimension k with representative z:
//   * z is a k-cycle (its boundary, computed here from the complex's own boundaries, is 0);
//   * z contains the creating cell, and no cell entering after it (in the order (value,
//     dimension, index)): the class is born with that cell;
//   * z is not a boundary in the subcomplex of the cells entering before the destroying cell
//     (for an essential class: in the whole complex) — is_boundary of the engine's result;
//   * for a finite pair, z is a boundary once the destroying cell has entered.
// On random filtrations of every built-in kind (fixed seeds), for the matrix variants. The
// cubical variant pairs cells of equal value before the algebra, so its cycles (found on the
// Morse complex and lifted along the gradient) are judged by value: no cell of z enters after
// the birth value, z is not a boundary of the cells entering before the death value, and is
// one of those entering at it (its pairs all have positive persistence).
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <random>
#include <vector>

namespace persistence_representatives_test {

namespace support = persistence_test_support;

template <class R, class F, class Result>
void check_representatives(const F& f, const Result& r, const R& unit = lacuna::one<R>(), bool by_value = false) {
  REQUIRE(r.has_representatives());
  const auto order = lacuna::value_order(f);
  const auto whole = support::keep_cells(f, [](int, std::size_t) { return true; });
  std::size_t checked = 0;
  for (int k = 0; k <= r.max_dimension(); ++k) {
    REQUIRE(r.representatives[static_cast<std::size_t>(k)].size() == r[k].pairs.size());
    for (std::size_t j = 0; j < r[k].pairs.size(); ++j) {
      const auto& p = r[k].pairs[j];
      const auto& z = r.representatives[static_cast<std::size_t>(k)][j];
      CAPTURE(k);
      CAPTURE(j);
      CHECK(z.dimension == k);
      CHECK(support::boundary_of(f, z, unit).terms.empty());
      CHECK(!(z.coefficient_of(p.birth_cell) == lacuna::zero<R>()));
      const auto vb = lacuna::cell_value(f, k, p.birth_cell);
      for (const auto& t : z.terms) {
        const auto v = lacuna::cell_value(f, k, t.cell);
        CHECK((order(v, vb) || (!order(vb, v) && (by_value || t.cell <= p.birth_cell))));
      }
      if (by_value && !p.essential()) {
        CHECK(order(p.birth, *p.death));
        const auto below = support::keep_cells(f, [&](int d, std::size_t i) { return order(lacuna::cell_value(f, d, i), *p.death); });
        const auto upto = support::at_value(f, *p.death);
        const auto hb = lacuna::homology<R>(below.complex, {.keep_basis = true}, {}, unit);
        const auto hu = lacuna::homology<R>(upto.complex, {.keep_basis = true}, {}, unit);
        CHECK(!hb.is_boundary(*support::renumber(z, below)));
        CHECK(hu.is_boundary(*support::renumber(z, upto)));
        ++checked;
        continue;
      }
      const auto before = p.essential() ? whole : support::before_cell(f, k + 1, p.death_cell, false);
      const auto h = lacuna::homology<R>(before.complex, {.keep_basis = true}, {}, unit);
      const auto zb = support::renumber(z, before);
      REQUIRE(zb.has_value());
      CHECK(!h.is_boundary(*zb));
      if (!p.essential()) {
        const auto at = support::before_cell(f, k + 1, p.death_cell, true);
        const auto ha = lacuna::homology<R>(at.complex, {.keep_basis = true}, {}, unit);
        CHECK(ha.is_boundary(*support::renumber(z, at)));
      }
      ++checked;
    }
  }
  CHECK(checked > 0);
}

TEST_CASE("lower-star filtrations of simplicial complexes: representatives over Z/2 and Z/3") {
  std::mt19937_64 rng(515);
  for (int trial = 0; trial < 4; ++trial) {
    const auto c = support::random_complex(rng, 9, 12, 4);
    const auto f = lacuna::lower_star_filtration(c, support::random_values(rng, c.vertex_count(), 5));
    check_representatives<lacuna::z2>(f, lacuna::persistence<lacuna::z2>(f, {.representatives = true}));
    check_representatives<lacuna::mod_p<3>>(
        f, lacuna::persistence<lacuna::mod_p<3>>(f, {.representatives = true}, lacuna::standard_persistence{}));
    check_representatives<lacuna::mod_p<3>>(
        f, lacuna::persistence<lacuna::mod_p<3>>(f, {.representatives = true}, lacuna::cohomology_persistence{}));
  }
}

TEST_CASE("values on cell lists with torsion: representatives over Z/3 and Z/2") {
  std::mt19937_64 rng(516);
  for (const auto& c : {lacuna::cell_list::klein_bottle(), lacuna::cell_list::real_projective_space(3),
                        lacuna::cell_list::projective_plane()}) {
    for (int trial = 0; trial < 3; ++trial) {
      const lacuna::values_filtration<lacuna::cell_list, int> f(c, support::random_monotone_values(rng, c, 3));
      check_representatives<lacuna::mod_p<3>>(f, lacuna::persistence<lacuna::mod_p<3>>(f, {.representatives = true}));
      check_representatives<lacuna::z2>(f, lacuna::persistence<lacuna::z2>(f, {.representatives = true}));
    }
  }
}

TEST_CASE("cubical filtrations: representatives of the twist variant and lifted ones of the cubical variant") {
  std::mt19937_64 rng(517);
  for (int trial = 0; trial < 3; ++trial) {
    const auto samples = support::random_values(rng, 5 * 4, 4);
    for (const auto dir : {lacuna::level_sets::sublevel, lacuna::level_sets::superlevel}) {
      const lacuna::cubical_filtration<2, int> f({5, 4}, samples, dir);
      check_representatives<lacuna::z2>(f, lacuna::persistence(f, {.representatives = true}, lacuna::twist_persistence{}));
      check_representatives<lacuna::z2>(f, lacuna::persistence(f, {.representatives = true}), lacuna::z2(1), true);
      check_representatives<lacuna::mod_p<3>>(f, lacuna::persistence<lacuna::mod_p<3>>(f, {.representatives = true}),
                                              lacuna::mod_p<3>(1), true);
    }
  }
  const lacuna::cubical_filtration<3, int> v({3, 3, 3}, support::random_values(rng, 27, 4));
  check_representatives<lacuna::z2>(v, lacuna::persistence(v, {.representatives = true}), lacuna::z2(1), true);
  check_representatives<lacuna::z2>(v, lacuna::persistence(v, {.representatives = true}, lacuna::cohomology_persistence{}));
}

TEST_CASE("Vietoris–Rips: representatives over Z/2") {
  std::mt19937_64 rng(518);
  for (int trial = 0; trial < 2; ++trial) {
    const auto f = lacuna::rips_filtration::from_points(support::random_points(rng, 8, 2, 5), {.max_dimension = 2});
    check_representatives<lacuna::z2>(f, lacuna::persistence(f, {.max_dimension = 1, .representatives = true}));
  }
}

}  // namespace persistence_representatives_test

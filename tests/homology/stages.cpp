// The open stages of the elimination route (lacuna/algorithm/stages.hpp): stages written here,
// in the test — a pre-reduction that only counts, a pivot rule of its own, a core stage with
// its own Smith form — plugged into lacuna::homology next to the built-in ones. Every
// combination must give the groups of the textbook (sources beside each value) and of the
// dense reference (dense_elimination: whole boundary matrices, no reduction), and generators
// that pass verify_generators.
#include "random_properties.hpp"
#include "support.hpp"

#include <lacuna/algorithm/stages.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstdint>
#include <cstdlib>
#include <memory>
#include <random>
#include <stdexcept>
#include <utility>
#include <vector>

namespace homology_stages_test {

using namespace lacuna_test;
using lacuna::integer;

namespace {

group Z(std::size_t r, std::vector<std::string> t = {}) { return {r, std::move(t)}; }

/// A pre-reduction that does nothing but count the cells it is given (the example of
/// a user's stage): generic in the working coefficients, so the integers keep their 64-bit path.
struct counting_pre_reduction {
  std::shared_ptr<std::size_t> seen = std::make_shared<std::size_t>(0);
  template <class W>
  void reduce(lacuna::elimination_workspace<W>& rc, lacuna::elimination_log<W>*, const lacuna::run_control*) const {
    for (int L = 0; L < rc.levels(); ++L)
      for (std::uint32_t i = 0; i < rc.size(L); ++i)
        if (rc.alive(L, i)) ++*seen;
  }
};

/// A pre-reduction written for lacuna::integer only (not for the 64-bit working type): the
/// route must then run at lacuna::integer from the start.
struct integer_only_pre_reduction {
  std::shared_ptr<int> calls = std::make_shared<int>(0);
  void reduce(lacuna::elimination_workspace<integer>&, lacuna::elimination_log<integer>*, const lacuna::run_control*) const {
    ++*calls;
  }
};

/// A pivot rule of our own: the latest cell first, ignoring fill-in.
struct latest_cell_first {
  std::uint64_t cost(const lacuna::pivot_candidate& c) const { return ~std::uint64_t{c.a}; }
};

/// A core stage with a Smith form of its own: the textbook algorithm (Munkres, Elements of
/// Algebraic Topology, 1984, §11: move the least non-zero entry to the corner, reduce its row
/// and column by division, repeat until it divides the whole remaining block), on 64-bit
/// integers with every step checked; the test complexes keep entries small.
struct textbook_smith_core {
  std::shared_ptr<int> calls = std::make_shared<int>(0);

  /// a - q·b, or an exception when it does not fit 64 bits.
  static std::int64_t minus_multiple(std::int64_t a, std::int64_t q, std::int64_t b) {
    std::int64_t p = 0, r = 0;
    if (__builtin_mul_overflow(q, b, &p) || __builtin_sub_overflow(a, p, &r))
      throw std::overflow_error("textbook_smith_core: an entry passes 64 bits");
    return r;
  }

  lacuna::smith_invariants<integer> invariants(lacuna::dense_matrix<integer> core, const lacuna::run_control*) const {
    ++*calls;
    const std::size_t m = core.rows(), n = core.cols();
    std::vector<std::vector<std::int64_t>> a(m, std::vector<std::int64_t>(n));
    for (std::size_t i = 0; i < m; ++i)
      for (std::size_t j = 0; j < n; ++j) {
        if (!core(i, j).is_small()) throw std::overflow_error("textbook_smith_core: entry too large");
        a[i][j] = core(i, j).small_value();
      }
    lacuna::smith_invariants<integer> out;
    for (std::size_t t = 0; t < std::min(m, n); ++t) {
      for (;;) {
        // the least non-zero |entry| of the block t.., t..
        std::size_t bi = m, bj = n;
        for (std::size_t i = t; i < m; ++i)
          for (std::size_t j = t; j < n; ++j)
            if (a[i][j] != 0 && (bi == m || std::llabs(a[i][j]) < std::llabs(a[bi][bj]))) bi = i, bj = j;
        if (bi == m) return out;  // the block is zero: the rank is t
        std::swap(a[t], a[bi]);
        for (auto& row : a) std::swap(row[t], row[bj]);
        bool clean = true;
        for (std::size_t i = t + 1; i < m; ++i) {  // the column below the corner
          const std::int64_t q = a[i][t] / a[t][t];
          for (std::size_t j = t; j < n; ++j) a[i][j] = minus_multiple(a[i][j], q, a[t][j]);
          clean = clean && a[i][t] == 0;
        }
        for (std::size_t j = t + 1; j < n; ++j) {  // the row right of the corner
          const std::int64_t q = a[t][j] / a[t][t];
          for (std::size_t i = t; i < m; ++i) a[i][j] = minus_multiple(a[i][j], q, a[i][t]);
          clean = clean && a[t][j] == 0;
        }
        if (!clean) continue;  // a remainder is now smaller than the corner
        // The corner must divide the whole block; else add the offending row to row t.
        std::size_t bad = m;
        for (std::size_t i = t + 1; i < m && bad == m; ++i)
          for (std::size_t j = t + 1; j < n; ++j)
            if (a[i][j] % a[t][t] != 0) {
              bad = i;
              break;
            }
        if (bad == m) break;
        for (std::size_t j = t; j < n; ++j) a[t][j] = minus_multiple(a[t][j], -1, a[bad][j]);
      }
      out.factors.push_back(integer(std::llabs(a[t][t])));
      ++out.rank;
    }
    return out;
  }
};

static_assert(lacuna::reduction_stage<counting_pre_reduction, lacuna::checked_int64>);
static_assert(lacuna::reduction_stage<counting_pre_reduction, integer>);
static_assert(lacuna::reduction_stage<integer_only_pre_reduction, integer>);
static_assert(!lacuna::reduction_stage<integer_only_pre_reduction, lacuna::checked_int64>);
static_assert(lacuna::reduction_stage<lacuna::zero_fill_reduction, lacuna::checked_int64>);
static_assert(lacuna::reduction_stage<lacuna::unit_pivot_elimination<latest_cell_first>, integer>);
static_assert(lacuna::pivot_rule<latest_cell_first> && lacuna::pivot_rule<lacuna::markowitz_rule>);
static_assert(lacuna::core_stage<textbook_smith_core, integer>);
static_assert(!lacuna::core_stage<textbook_smith_core, lacuna::rational>);
static_assert(lacuna::core_stage<lacuna::smith_core, lacuna::rational>);
static_assert(lacuna::homology_algorithm<lacuna::staged_elimination<counting_pre_reduction>>);
static_assert(!lacuna::homology_algorithm<counting_pre_reduction>);

/// Homology over Z by `alg`, with generators (checked by verify_generators) and without;
/// both must give the same groups, which are returned.
template <class Alg, class C>
std::vector<group> staged_groups(const C& c, const Alg& alg, bool with_generators = true) {
  const auto plain = lacuna::homology<integer>(c, {}, alg);
  if (with_generators) {
    const auto h = lacuna::homology<integer>(c, {.generators = true}, alg);
    const auto rep = lacuna::verify_generators(c, h);
    INFO(rep.first_failure);
    CHECK(rep.ok);
    CHECK(groups_of(h) == groups_of(plain));
  }
  return groups_of(plain);
}

/// Every combination of stages: built-in and the test's own.
template <class C>
void every_combination_agrees(const C& c, const std::vector<group>& want) {
  using namespace lacuna;
  CHECK(staged_groups(c, staged_elimination<>{}) == want);
  CHECK(staged_groups(c, staged_elimination<no_reduction, no_reduction>{}) == want);
  CHECK(staged_groups(c, staged_elimination<zero_fill_reduction, no_reduction>{}) == want);
  CHECK(staged_groups(c, staged_elimination<no_reduction, unit_pivot_elimination<>>{}) == want);
  CHECK(staged_groups(c, staged_elimination<zero_fill_reduction, unit_pivot_elimination<>, dense_smith_core>{}) == want);
  CHECK(staged_groups(c, staged_elimination<>{.pre = {.coreductions = false}}) == want);
  CHECK(staged_groups(c, staged_elimination<counting_pre_reduction, unit_pivot_elimination<latest_cell_first>>{}) ==
        want);
  CHECK(staged_groups(c, staged_elimination<no_reduction, unit_pivot_elimination<latest_cell_first>>{}) == want);
  // The test's own Smith form finishes groups (with generators the route needs transforms).
  const textbook_smith_core own;
  CHECK(staged_groups(c, staged_elimination<no_reduction, no_reduction, textbook_smith_core>{.core = own}, false) == want);
  CHECK(*own.calls == lacuna::top_dimension(c));  // one call per boundary map ∂_1..∂_top
  CHECK(staged_groups(c, staged_elimination<counting_pre_reduction, unit_pivot_elimination<latest_cell_first>,
                                            textbook_smith_core>{},
                      false) == want);
}

}  // namespace

TEST_CASE("a pre-reduction written here that only counts: the same groups, and it saw every cell") {
  // RP^2: H_0 = Z, H_1 = Z/2, H_2 = 0 (Hatcher, Algebraic Topology, 2002, Example 2.42, from memory).
  const auto rp2 = six_vertex_rp2();
  const counting_pre_reduction pre;
  const lacuna::staged_elimination<counting_pre_reduction> alg{.pre = pre};
  CHECK(lacuna::homology<integer>(rp2, {}, alg).groups.size() == 3);
  CHECK(*pre.seen == lacuna::total_cell_count(rp2));  // 6 + 15 + 10 cells, each seen once
  CHECK(staged_groups(rp2, alg) == std::vector<group>{Z(1), Z(0, {"2"}), Z(0)});
  // The counting stage is generic in the working coefficients, so the route ran at 64 bits
  // and never repeated: three runs (one above, two in staged_groups), 31 cells each.
  CHECK(*pre.seen == 3 * lacuna::total_cell_count(rp2));
}

TEST_CASE("a stage written for lacuna::integer only runs at lacuna::integer") {
  // The torus: H = Z, Z^2, Z (Hatcher 2002, Example 2.3).
  const integer_only_pre_reduction pre;
  const auto h =
      lacuna::homology<integer>(seven_vertex_torus(), {}, lacuna::staged_elimination<integer_only_pre_reduction>{.pre = pre});
  CHECK(groups_of(h) == std::vector<group>{Z(1), Z(2), Z(1)});
  CHECK(*pre.calls == 1);
}

TEST_CASE("textbook complexes through every combination of stages") {
  // Hatcher 2002: the torus (Example 2.3), RP^2 (Example 2.42), the Möbius band (a circle up
  // to homotopy), the dunce hat (contractible; Zeeman 1964), spheres (Corollary 2.14).
  every_combination_agrees(seven_vertex_torus(), {Z(1), Z(2), Z(1)});
  every_combination_agrees(six_vertex_rp2(), {Z(1), Z(0, {"2"}), Z(0)});
  every_combination_agrees(five_vertex_moebius(), {Z(1), Z(1), Z(0)});
  every_combination_agrees(dunce_hat(), {Z(1), Z(0), Z(0)});
  every_combination_agrees(simplex_boundary_sphere(3), {Z(1), Z(0), Z(0), Z(1)});
  // The matching complex of K_7: H~_1 = Z/3 (Bouc 1992, from memory) and H_2 = Z^20 from the
  // Euler characteristic 21 − 105 + 105 = 21 = 1 − 0 + b_2 (21 edges, 105 matchings of two
  // edges and 105 of three).
  every_combination_agrees(matching_complex(7), {Z(1), Z(0, {"3"}), Z(20)});
}

TEST_CASE("the test's own core stage finishes the whole complex: torsion of presentation complexes") {
  // Hidden truth: random presentation complexes (one vertex, loops, 2-cells with random
  // coefficients) against the dense reference, which reduces nothing; and by the test's own
  // Smith form on the unreduced complex (no stage reduces anything there).
  std::mt19937_64 rng(20261203);
  for (int t = 0; t < 12; ++t) {
    CAPTURE(t);
    const auto c = random_test::random_presentation(rng, 2 + t % 3, 1 + t % 4, 9);
    const auto want = groups_of(lacuna::homology<integer>(c, {}, lacuna::dense_elimination{}));
    every_combination_agrees(c, want);
  }
}

TEST_CASE("cohomology, relative homology and other rings through the stages") {
  using namespace lacuna;
  const auto rp2 = six_vertex_rp2();
  const staged_elimination<counting_pre_reduction, unit_pivot_elimination<latest_cell_first>, dense_smith_core> alg{};
  // H^*(RP^2; Z) = Z, 0, Z/2 by universal coefficients (Hatcher 2002, Theorem 3.2):
  // H^2 = Hom(H_2, Z) ⊕ Ext(H_1, Z) = Ext(Z/2, Z) = Z/2.
  CHECK(groups_of(cohomology<integer>(rp2, {}, alg)) == std::vector<group>{Z(1), Z(0), Z(0, {"2"})});
  {
    const auto h = cohomology<integer>(rp2, {.generators = true}, alg);
    CHECK(groups_of(h) == std::vector<group>{Z(1), Z(0), Z(0, {"2"})});
  }
  // Over Z/2: dimensions 1, 1, 1; over Z/3 and Q: 1, 0, 0 (universal coefficients).
  CHECK(homology<z2>(rp2, {}, alg).betti_numbers() == std::vector<std::size_t>{1, 1, 1});
  CHECK(homology<mod_p<3>>(rp2, {}, alg).betti_numbers() == std::vector<std::size_t>{1, 0, 0});
  CHECK(homology<rational>(rp2, {}, alg).betti_numbers() == std::vector<std::size_t>{1, 0, 0});
  // The pair (disk, boundary circle): H_*(D^2, S^1) = 0, 0, Z, from the long exact sequence of
  // the pair with D^2 contractible and H_1(S^1) = Z (Hatcher 2002, §2.1). The disk: the cone
  // on a 5-cycle (apex 5); the subcomplex: the 5-cycle.
  std::vector<std::vector<int>> fs;
  for (int i = 0; i < 5; ++i) fs.push_back({5, i, (i + 1) % 5});
  const auto disk = facets(fs);
  const auto apex = *disk.vertex(5);
  std::vector<std::vector<bool>> rim(3);
  for (int k = 0; k <= 2; ++k) {
    rim[static_cast<std::size_t>(k)].assign(lacuna::cell_count(disk, k), false);
    for (std::size_t i = 0; i < lacuna::cell_count(disk, k); ++i) {
      bool on_rim = k < 2;
      for (const auto v : disk.vertices(k, i)) on_rim = on_rim && v != apex;
      rim[static_cast<std::size_t>(k)][i] = on_rim;
    }
  }
  CHECK(groups_of(relative_homology<integer>(disk, rim, {}, alg)) == std::vector<group>{Z(0), Z(0), Z(1)});
  CHECK(groups_of(relative_homology<integer>(disk, rim, {.generators = true}, alg)) ==
        std::vector<group>{Z(0), Z(0), Z(1)});
}

}  // namespace homology_stages_test

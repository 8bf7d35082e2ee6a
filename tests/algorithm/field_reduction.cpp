// lacuna::reduce_columns and reduce_chain_complex. Outside sources of truth:
//  - rank–nullity and the products A v == 0 / rank [A | image] == rank A (linear algebra);
//  - the Betti numbers of the torus (1, 2, 1 over every field) and of the real projective
//    plane (1, 1, 1 over Z/2; 1, 0, 0 over Z/p, p odd), theorems of algebraic topology, read
//    as ranks of boundary matrices: rank d1 = n0 - b0, rank d2 = n1 - b1 - rank d1;
//  - the fast variants against the reference variant: every variant performs the same column
//    additions, so pivots, kernels and images agree entry by entry (and the pivot pairs of a
//    left-to-right reduction are unique: the pairing lemma of Cohen-Steiner, Edelsbrunner &
//    Morozov 2006).
// FLINT's nmod_mat_rank is the reference in tests/reference/field_rank_flint.cpp.
#include "field_reduction_support.hpp"

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/ring/integer.hpp>

#include <limits>
#include <stdexcept>

namespace algorithm_field_reduction_test {

using namespace field_reduction_test;
using lacuna::bit_packed_z2;
using lacuna::mod_p;
using lacuna::mod_p_dynamic;
using lacuna::reduce_columns;
using lacuna::sparse_matrix;
using lacuna::standard_reduction;
using lacuna::word_mod_p;
using lacuna::z2;

namespace {

template <class F, class A>
concept can_reduce = requires(const sparse_matrix<F>& m, const A& a) { lacuna::reduce_columns(m, {}, a); };

static_assert(can_reduce<z2, bit_packed_z2>);
static_assert(!can_reduce<mod_p<3>, bit_packed_z2>);  // the bit-packed path is for z2 only
static_assert(!can_reduce<mod_p<2>, bit_packed_z2>);
static_assert(can_reduce<mod_p<3>, word_mod_p>);
static_assert(can_reduce<mod_p_dynamic, word_mod_p>);
static_assert(!can_reduce<z2, word_mod_p>);
static_assert(can_reduce<z2, standard_reduction>);
static_assert(!can_reduce<lacuna::integer, standard_reduction>);  // not a field

constexpr lacuna::field_reduction_options all{.kernel = true, .image = true};
constexpr std::size_t never = std::numeric_limits<std::size_t>::max();

/// Reference and every fast setting on one matrix; all checked, all equal.
template <class F>
void check_all_variants(const sparse_matrix<F>& A) {
  const auto ref = reduce_columns(A, all, standard_reduction{});
  check_result(A, ref);
  const auto automatic = reduce_columns(A, all);
  check_same(ref, automatic);
  if constexpr (std::same_as<F, z2>) {
    for (std::size_t t : {std::size_t{1}, std::size_t{4}, std::size_t{0}, never}) {
      INFO("dense_threshold ", t);
      check_same(ref, reduce_columns(A, all, bit_packed_z2{.dense_threshold = t}));
      CHECK(reduce_columns(A, {}, bit_packed_z2{.dense_threshold = t}).pivots == ref.pivots);
    }
  } else if constexpr (lacuna::detail::is_word_field<F>) {
    for (std::size_t t : {std::size_t{1}, std::size_t{4}, std::size_t{0}, never}) {
      INFO("dense_threshold ", t);
      check_same(ref, reduce_columns(A, all, word_mod_p{.dense_threshold = t}));
    }
  }
}

template <class F, class C>
std::vector<std::size_t> boundary_ranks(const C& c, const F& unit = lacuna::one<F>()) {
  std::vector<std::size_t> r;
  for (int k = 1; k <= lacuna::top_dimension(c); ++k) r.push_back(reduce_columns(lacuna::boundary_matrix<F>(c, k, unit)).rank);
  return r;
}

}  // namespace

TEST_CASE("random sparse matrices: every variant, every field, kernel and image checked") {
  std::uint64_t seed = 1;
  for (auto [rows, cols, density, bound] : {std::tuple{30, 40, 0.1, 0}, std::tuple{60, 50, 0.05, 0},
                                           std::tuple{50, 70, 0.3, 12}, std::tuple{80, 80, 0.08, 30},
                                           std::tuple{1, 5, 0.5, 0}, std::tuple{7, 1, 0.5, 0}}) {
    for (int rep = 0; rep < 3; ++rep) {
      const auto a = random_int_matrix(rows, cols, density, 5, seed++, bound);
      INFO("rows ", rows, " cols ", cols, " seed ", seed - 1);
      check_all_variants(over<z2>(a));
      check_all_variants(over<mod_p<3>>(a));
      check_all_variants(over<mod_p<65521>>(a));
      check_all_variants(over<mod_p<2147483647>>(a));  // lazy limit 4: exercises the periodic reduction
      check_all_variants(over<mod_p<4294967291>>(a));  // largest prime below 2^32: limit 1
      check_all_variants(over<mod_p<mersenne61>>(a));  // 128-bit products
      check_all_variants(over<mod_p_dynamic>(a, mod_p_dynamic(1, 65521)));
      check_all_variants(over<mod_p_dynamic>(a, mod_p_dynamic(1, mersenne61)));
    }
  }
}

TEST_CASE("a dense column absorbs many additions: the lazy sums stay exact") {
  // Lower-triangular-with-full-last-row structure: the last columns are reduced against
  // every earlier pivot, so the dense accumulator sees hundreds of additions.
  const std::size_t n = 300;
  int_matrix a{n, n + 3, std::vector<std::vector<std::pair<std::uint32_t, std::int64_t>>>(n + 3)};
  std::mt19937_64 gen(77);
  std::uniform_int_distribution<std::int64_t> val(1, 1000000);
  for (std::size_t j = 0; j < n; ++j) {
    a.columns[j].push_back({static_cast<std::uint32_t>(j), val(gen)});
    if (j + 1 < n) a.columns[j].push_back({static_cast<std::uint32_t>(j + 1), val(gen)});
  }
  for (std::size_t j = n; j < n + 3; ++j)
    for (std::size_t i = 0; i < n; ++i) a.columns[j].push_back({static_cast<std::uint32_t>(i), val(gen)});
  check_all_variants(over<mod_p<65521>>(a));
  check_all_variants(over<mod_p<2147483647>>(a));
  check_all_variants(over<mod_p<4294967291>>(a));
  check_all_variants(over<mod_p<mersenne61>>(a));
  check_all_variants(over<z2>(a));
}

TEST_CASE("tori: rank d1 = n0 - 1 and rank d2 = n2 - 1 over every field (b = 1, 2, 1)") {
  for (int k : {3, 5, 8, 13}) {
    const auto c = torus(k);
    const std::size_t n0 = c.cell_count(0), n2 = c.cell_count(2);
    const std::vector<std::size_t> want{n0 - 1, n2 - 1};
    CHECK(boundary_ranks<z2>(c) == want);
    CHECK(boundary_ranks<mod_p<3>>(c) == want);
    CHECK(boundary_ranks<mod_p<mersenne61>>(c) == want);
    CHECK(boundary_ranks<mod_p_dynamic>(c, mod_p_dynamic(1, 65521)) == want);
    if (k <= 8) {
      check_all_variants(lacuna::boundary_matrix<z2>(c, 2));
      check_all_variants(lacuna::boundary_matrix<mod_p<3>>(c, 2));
      check_all_variants(lacuna::boundary_matrix<mod_p_dynamic>(c, 1, mod_p_dynamic(1, 65521)));
    }
  }
  const auto t7 = seven_vertex_torus();
  CHECK(t7.cell_count(1) == 21);
  CHECK(boundary_ranks<z2>(t7) == std::vector<std::size_t>{6, 13});
  CHECK(boundary_ranks<mod_p<3>>(t7) == std::vector<std::size_t>{6, 13});
  check_all_variants(lacuna::boundary_matrix<z2>(t7, 2));
}

TEST_CASE("the projective plane: the characteristic decides (b2 = 1 over Z/2, 0 over Z/p odd)") {
  const auto c = projective_plane();
  REQUIRE(c.cell_count(0) == 6);
  REQUIRE(c.cell_count(1) == 15);
  REQUIRE(c.cell_count(2) == 10);
  // Z/2: b = 1, 1, 1 -> rank d1 = 5, rank d2 = 15 - 1 - 5 = 9. Odd p: b = 1, 0, 0 -> 5, 10.
  CHECK(boundary_ranks<z2>(c) == std::vector<std::size_t>{5, 9});
  CHECK(boundary_ranks<mod_p<3>>(c) == std::vector<std::size_t>{5, 10});
  CHECK(boundary_ranks<mod_p_dynamic>(c, mod_p_dynamic(1, mersenne61)) == std::vector<std::size_t>{5, 10});
  check_all_variants(lacuna::boundary_matrix<z2>(c, 2));
  check_all_variants(lacuna::boundary_matrix<mod_p<3>>(c, 2));
}

TEST_CASE("clearing: reduce_chain_complex gives the ranks of the matrices reduced alone") {
  for (std::uint64_t seed : {3, 4, 5}) {
    const auto c = random_clique_complex(24, 0.45, seed);
    std::vector<sparse_matrix<z2>> d2;
    std::vector<sparse_matrix<mod_p<3>>> d3;
    for (int k = 1; k <= c.top_dimension(); ++k) {
      d2.push_back(lacuna::boundary_matrix<z2>(c, k));
      d3.push_back(lacuna::boundary_matrix<mod_p<3>>(c, k));
    }
    INFO("seed ", seed, " top ", c.top_dimension());
    auto run = [](const auto& ds, const auto& alg) {
      const auto cleared = lacuna::reduce_chain_complex(ds, all, alg);
      REQUIRE(cleared.size() == ds.size());
      for (std::size_t i = 0; i < ds.size(); ++i) {
        const auto alone = reduce_columns(ds[i], all, standard_reduction{});
        CHECK(cleared[i].rank == alone.rank);
        CHECK(cleared[i].pivots == alone.pivots);  // the pairing lemma: the pairs are unique
        check_result(ds[i], cleared[i]);
      }
    };
    run(d2, standard_reduction{});
    run(d2, bit_packed_z2{});
    run(d3, standard_reduction{});
    run(d3, word_mod_p{});
  }
  // Cubical boundaries compose too.
  const auto cube = lacuna::cubical_complex<3>::from_predicate({5, 4, 3}, [](const auto& v) { return (v[0] * 7 + v[1] * 3 + v[2]) % 4 != 0; });
  std::vector<sparse_matrix<z2>> d;
  for (int k = 1; k <= 3; ++k) d.push_back(lacuna::boundary_matrix<z2>(cube, k));
  const auto r = lacuna::reduce_chain_complex(d, {.kernel = true});
  for (std::size_t i = 0; i < d.size(); ++i) {
    CHECK(r[i].rank == reduce_columns(d[i], {}, standard_reduction{}).rank);
    CHECK(r[i].kernel.size() + r[i].rank == d[i].cols);
    CHECK(r[i].image.empty());
  }
  CHECK_THROWS_AS(lacuna::reduce_chain_complex(std::vector<sparse_matrix<z2>>{d[0], d[2]}), std::invalid_argument);
}

TEST_CASE("mod_p_dynamic: the modulus comes from the entries") {
  sparse_matrix<mod_p_dynamic> m(2, 2);
  m.add(0, 0, mod_p_dynamic(1, 7));
  m.add(1, 1, mod_p_dynamic(1, 11));
  m.normalize();
  CHECK_THROWS_AS(reduce_columns(m), std::invalid_argument);
  sparse_matrix<mod_p_dynamic> u(2, 2);
  u.add(0, 0, mod_p_dynamic(3));  // unbound: no modulus anywhere
  u.normalize();
  CHECK_THROWS_AS(reduce_columns(u), std::invalid_argument);
  sparse_matrix<mod_p_dynamic> mixed(2, 2);  // unbound 14 is 0 mod 7: rank 1
  mixed.add(0, 0, mod_p_dynamic(2, 7));
  mixed.add(1, 1, mod_p_dynamic(14));
  mixed.normalize();
  CHECK(reduce_columns(mixed).rank == 1);
  CHECK(reduce_columns(sparse_matrix<mod_p_dynamic>(3, 4), all).kernel.size() == 4);
}

TEST_CASE("empty and zero matrices") {
  for (auto [r, c] : {std::pair{0, 0}, std::pair{0, 3}, std::pair{4, 0}, std::pair{3, 3}}) {
    const sparse_matrix<z2> m(r, c);
    const auto x = reduce_columns(m, all);
    CHECK(x.rank == 0);
    CHECK(x.kernel.size() == static_cast<std::size_t>(c));
    check_same(x, reduce_columns(m, all, standard_reduction{}));
  }
}

}  // namespace algorithm_field_reduction_test

// Ranks over Z/p from lacuna::reduce_columns (every variant) cross-checked with FLINT 2.9's
// nmod_mat_rank (an independent, dense implementation) on random sparse matrices over Z/2,
// Z/3, Z/65521 and Z/(2^61 - 1) with fixed seeds, and on boundary matrices of simplicial
// and cubical complexes: the 7-vertex torus, the 6-vertex projective plane, tori, random
// clique complexes and a random 3D volume.
#include "../algorithm/field_reduction_support.hpp"

#include <lacuna/complex/cubical_complex.hpp>

#include <flint/nmod_mat.h>

namespace reference_field_rank_flint_test {

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

std::size_t flint_rank(const int_matrix& a, std::uint64_t p) {
  nmod_mat_t A;
  nmod_mat_init(A, static_cast<slong>(a.rows), static_cast<slong>(a.cols), p);
  for (std::size_t j = 0; j < a.cols; ++j)
    for (const auto& [i, v] : a.columns[j]) {
      const std::int64_t r = v % static_cast<std::int64_t>(p);
      nmod_mat_entry(A, i, j) = static_cast<mp_limb_t>(r < 0 ? r + static_cast<std::int64_t>(p) : r);
    }
  const auto r = static_cast<std::size_t>(nmod_mat_rank(A));
  nmod_mat_clear(A);
  return r;
}

template <class C>
int_matrix int_boundary(const C& c, int k) {
  int_matrix m{lacuna::cell_count(c, k - 1), lacuna::cell_count(c, k), {}};
  m.columns.resize(m.cols);
  for (std::size_t j = 0; j < m.cols; ++j)
    for (auto&& v : lacuna::boundary(c, k, j)) {
      const auto f = lacuna::as_incidence(v);
      m.columns[j].push_back({static_cast<std::uint32_t>(f.face), f.coefficient});
    }
  return m;
}

/// FLINT's rank against every variant over the four fields.
void check_ranks(const int_matrix& a) {
  const std::size_t r2 = flint_rank(a, 2), r3 = flint_rank(a, 3), r65521 = flint_rank(a, 65521),
                    r61 = flint_rank(a, mersenne61);
  const auto m2 = over<z2>(a);
  CHECK(reduce_columns(m2, {}, standard_reduction{}).rank == r2);
  CHECK(reduce_columns(m2, {}, bit_packed_z2{}).rank == r2);
  CHECK(reduce_columns(m2, {}, bit_packed_z2{.dense_threshold = 1}).rank == r2);
  const auto m3 = over<mod_p<3>>(a);
  CHECK(reduce_columns(m3, {}, standard_reduction{}).rank == r3);
  CHECK(reduce_columns(m3, {}, word_mod_p{}).rank == r3);
  CHECK(reduce_columns(m3, {}, word_mod_p{.dense_threshold = 1}).rank == r3);
  const auto m65521 = over<mod_p<65521>>(a);
  CHECK(reduce_columns(m65521, {}, standard_reduction{}).rank == r65521);
  CHECK(reduce_columns(m65521, {}, word_mod_p{.dense_threshold = 1}).rank == r65521);
  const auto d65521 = over<mod_p_dynamic>(a, mod_p_dynamic(1, 65521));
  CHECK(reduce_columns(d65521).rank == r65521);
  const auto m61 = over<mod_p<mersenne61>>(a);
  CHECK(reduce_columns(m61, {}, standard_reduction{}).rank == r61);
  CHECK(reduce_columns(m61, {}, word_mod_p{.dense_threshold = 1}).rank == r61);
  const auto d61 = over<mod_p_dynamic>(a, mod_p_dynamic(1, mersenne61));
  CHECK(reduce_columns(d61, {}, word_mod_p{}).rank == r61);
  CHECK(reduce_columns(d61, {}, standard_reduction{}).rank == r61);
}

}  // namespace

TEST_CASE("random sparse matrices: ranks equal FLINT's over Z/2, Z/3, Z/65521, Z/(2^61-1)") {
  std::uint64_t seed = 1000;
  std::size_t differ = 0;  // matrices whose ranks depend on p: the cases are not all trivial
  for (auto [rows, cols, density, range, bound] :
       {std::tuple{40, 40, 0.08, 1, 0}, std::tuple{100, 60, 0.04, 3, 0}, std::tuple{70, 120, 0.2, 9, 25},
        std::tuple{150, 150, 0.03, 2, 0}, std::tuple{120, 90, 0.1, 100000, 40}, std::tuple{200, 200, 0.02, 6, 0}}) {
    for (int rep = 0; rep < 4; ++rep) {
      const auto a = random_int_matrix(rows, cols, density, range, seed++, bound);
      INFO("rows ", rows, " cols ", cols, " seed ", seed - 1);
      check_ranks(a);
      differ += flint_rank(a, 2) != flint_rank(a, 3);
    }
  }
  CHECK(differ > 0);
}

TEST_CASE("boundary matrices: ranks equal FLINT's") {
  for (int k = 1; k <= 2; ++k) {
    check_ranks(int_boundary(seven_vertex_torus(), k));
    check_ranks(int_boundary(projective_plane(), k));
    check_ranks(int_boundary(torus(9), k));
  }
  for (std::uint64_t seed : {11, 12}) {
    const auto c = random_clique_complex(30, 0.4, seed);
    for (int k = 1; k <= c.top_dimension(); ++k) check_ranks(int_boundary(c, k));
  }
  std::mt19937_64 gen(5);
  std::bernoulli_distribution on(0.6);
  const auto v = lacuna::cubical_complex<3>::from_predicate({6, 5, 4}, [&](const auto&) { return on(gen); });
  for (int k = 1; k <= 3; ++k) check_ranks(int_boundary(v, k));
}

}  // namespace reference_field_rank_flint_test

// Shared helpers of the FLINT cross-checks that work on matrices of any size
// (tests/reference/adversarial_arithmetic.cpp, random_boundaries_flint*.cpp): integer
// matrices held as cpp_int, FLINT's invariant factors (fmpz_mat_snf) and ranks mod p
// (nmod_mat_rank), exact boundary matrices of any complex, and the homology those predict.
//
// The prediction is the structure theorem for a chain complex of finitely generated free
// Z-modules (Munkres, Elements of Algebraic Topology, 1984, §11, Theorem 11.4 — from memory):
// with r_k = rank ∂_k and d_1 | ... | d_{r_{k+1}} the invariant factors of ∂_{k+1},
//   H_k = Z^(n_k - r_k - r_{k+1}) ⊕ Z/d_1 ⊕ ... (the factors that are not 1),
// and over a field F_p: dim H_k = n_k - rank_p ∂_k - rank_p ∂_{k+1}.
#pragma once

#include "../homology/support.hpp"

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/ring/big_integer.hpp>
#include <lacuna/ring/integer.hpp>

#include <flint/fmpz.h>
#include <flint/fmpz_mat.h>
#include <flint/nmod_mat.h>

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int

#include <cstdint>
#include <string>
#include <vector>

namespace flint_test {

using boost::multiprecision::cpp_int;
using lacuna::big_integer;
using lacuna::integer;
using lacuna_test::group;

/// A rows x cols integer matrix of any size (rows and cols kept apart: a matrix may have
/// no rows and still have columns).
struct bmatrix {
  std::size_t rows = 0, cols = 0;
  std::vector<std::vector<cpp_int>> a;  // a[i][j]
  bmatrix() = default;
  bmatrix(std::size_t r, std::size_t c) : rows(r), cols(c), a(r, std::vector<cpp_int>(c, 0)) {}
};

inline cpp_int to_cpp(const integer& x) { return x.is_small() ? cpp_int(x.small_value()) : x.to_big(); }

inline std::string fmpz_text(const fmpz_t x) {
  char* s = fmpz_get_str(nullptr, 10, x);
  std::string out(s);
  flint_free(s);
  return out;
}

/// FLINT's invariant factors: the non-zero diagonal of fmpz_mat_snf(A), as decimal strings.
inline std::vector<std::string> flint_invariants(const bmatrix& m) {
  fmpz_mat_t A, S;
  fmpz_mat_init(A, static_cast<slong>(m.rows), static_cast<slong>(m.cols));
  fmpz_mat_init(S, static_cast<slong>(m.rows), static_cast<slong>(m.cols));
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j)
      fmpz_set_str(fmpz_mat_entry(A, i, j), m.a[i][j].str().c_str(), 10);
  fmpz_mat_snf(S, A);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < std::min(m.rows, m.cols); ++i)
    if (!fmpz_is_zero(fmpz_mat_entry(S, i, i))) out.push_back(fmpz_text(fmpz_mat_entry(S, i, i)));
  fmpz_mat_clear(A);
  fmpz_mat_clear(S);
  return out;
}

/// FLINT's determinant of the minor of m on these rows and columns.
inline cpp_int flint_minor_determinant(const bmatrix& m, const std::vector<std::size_t>& rows, const std::vector<std::size_t>& cols) {
  const std::size_t n = rows.size();
  fmpz_mat_t A;
  fmpz_mat_init(A, static_cast<slong>(n), static_cast<slong>(n));
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < n; ++j) fmpz_set_str(fmpz_mat_entry(A, i, j), m.a[rows[i]][cols[j]].str().c_str(), 10);
  fmpz_t d;
  fmpz_init(d);
  fmpz_mat_det(d, A);
  const cpp_int out(fmpz_text(d));
  fmpz_clear(d);
  fmpz_mat_clear(A);
  return out;
}

/// The transpose of m.
inline bmatrix transpose(const bmatrix& m) {
  bmatrix t(m.cols, m.rows);
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j) t.a[j][i] = m.a[i][j];
  return t;
}

/// FLINT's rank of A mod p (nmod_mat_rank), p a word-size prime.
inline std::size_t flint_rank_mod(const bmatrix& m, std::uint64_t p) {
  if (m.rows == 0 || m.cols == 0) return 0;
  nmod_mat_t A;
  nmod_mat_init(A, static_cast<slong>(m.rows), static_cast<slong>(m.cols), p);
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j) {
      cpp_int r = m.a[i][j] % p;
      if (r < 0) r += p;
      nmod_mat_entry(A, i, j) = static_cast<mp_limb_t>(r.convert_to<std::uint64_t>());
    }
  const auto r = static_cast<std::size_t>(nmod_mat_rank(A));
  nmod_mat_clear(A);
  return r;
}

/// The k-th boundary matrix of c ((k-1)-cells by k-cells), read exactly.
template <class C>
bmatrix exact_boundary(const C& c, int k) {
  bmatrix m(k >= 1 ? lacuna::cell_count(c, k - 1) : 0, lacuna::cell_count(c, k));
  if (k < 1) return m;
  for (std::size_t j = 0; j < m.cols; ++j)
    for (auto&& v : lacuna::boundary(c, k, j)) {
      const auto f = lacuna::as_exact_incidence(v);
      m.a[f.face][j] += to_cpp(f.coefficient);
    }
  return m;
}

/// H_k(c; Z) for k = 0..top predicted from FLINT's Smith forms of the boundary matrices
/// (the structure theorem in the header comment).
template <class C>
std::vector<group> flint_homology(const C& c) {
  const int top = lacuna::top_dimension(c);
  std::vector<std::vector<std::string>> inv(static_cast<std::size_t>(top) + 2);
  for (int k = 1; k <= top; ++k) inv[static_cast<std::size_t>(k)] = flint_invariants(exact_boundary(c, k));
  std::vector<group> out;
  for (int k = 0; k <= top; ++k) {
    const auto& down = inv[static_cast<std::size_t>(k)];
    const auto& up = inv[static_cast<std::size_t>(k) + 1];
    group g{lacuna::cell_count(c, k) - down.size() - up.size(), {}};
    for (const auto& d : up)
      if (d != "1") g.torsion.push_back(d);
    out.push_back(g);
  }
  return out;
}

/// dim H_k(c; F_p), k = 0..top, from FLINT's ranks mod p.
template <class C>
std::vector<std::size_t> flint_betti_mod(const C& c, std::uint64_t p) {
  const int top = lacuna::top_dimension(c);
  std::vector<std::size_t> r(static_cast<std::size_t>(top) + 2, 0), out;
  for (int k = 1; k <= top; ++k) r[static_cast<std::size_t>(k)] = flint_rank_mod(exact_boundary(c, k), p);
  for (int k = 0; k <= top; ++k)
    out.push_back(lacuna::cell_count(c, k) - r[static_cast<std::size_t>(k)] - r[static_cast<std::size_t>(k) + 1]);
  return out;
}

/// The matrix over R (entries through lacuna::integer, so of any size).
template <class R>
lacuna::sparse_matrix<R> sparse_over(const bmatrix& m) {
  lacuna::sparse_matrix<R> s(m.rows, m.cols);
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j)
      if (m.a[i][j] != 0) {
        if constexpr (std::same_as<R, big_integer>)
          s.add(i, j, big_integer(m.a[i][j]));
        else
          s.add(i, j, R(m.a[i][j]));
      }
  s.normalize();
  return s;
}

template <class R>
std::vector<std::string> texts(const std::vector<R>& v) {
  std::vector<std::string> out;
  for (const auto& x : v) out.push_back(lacuna_test::text(x));
  return out;
}

/// Markowitz pivoting alone for a single matrix (no coreductions or collapses).
inline lacuna::sparse_elimination markowitz_matrix() {
  return lacuna::sparse_elimination{.elimination = {.coreductions = false, .collapses = false, .markowitz = true}};
}

/// The invariant factors of m by every Smith-form variant of the library over R: the dense
/// reference on the dense matrix, smith_normal_form with sparse_elimination{} (default and
/// Markowitz only) and dense_elimination{}. Checks that they agree; returns the first.
template <class R>
std::vector<std::string> every_smith_variant(const bmatrix& m) {
  const auto s = sparse_over<R>(m);
  const auto dense = texts(lacuna::dense_smith_form(s.to_dense()).diagonal);
  const auto sp = lacuna::smith_normal_form(s);
  CHECK(sp.rank == sp.factors.size());
  CHECK(texts(sp.factors) == dense);
  CHECK(texts(lacuna::smith_normal_form(s, markowitz_matrix()).factors) == dense);
  CHECK(texts(lacuna::smith_normal_form(s, lacuna::dense_elimination{}).factors) == dense);
  return dense;
}

/// The groups of c over R by the sparse default (with and without generators), Markowitz
/// only and the dense reference (when the complex is small); they must agree. Works with
/// incidence numbers of any size (unlike verify_generators, which reads them as int64).
template <class R, class C>
std::vector<group> engine_variants(const C& c, bool co = false, std::size_t dense_limit = 1200) {
  const auto run = [&](const auto& alg, bool gens) {
    const lacuna::homology_options o{.generators = gens};
    return co ? lacuna::cohomology<R>(c, o, alg) : lacuna::homology<R>(c, o, alg);
  };
  const auto g0 = lacuna_test::groups_of(run(lacuna::sparse_elimination{}, false));
  CHECK(lacuna_test::groups_of(run(lacuna::sparse_elimination{}, true)) == g0);
  CHECK(lacuna_test::groups_of(run(lacuna_test::markowitz_only(), false)) == g0);
  if (lacuna::total_cell_count(c) <= dense_limit)
    CHECK(lacuna_test::groups_of(run(lacuna::dense_elimination{}, false)) == g0);
  return g0;
}

}  // namespace flint_test

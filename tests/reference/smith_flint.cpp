// Invariant factors and ranks cross-checked with FLINT 2.9 (an independent implementation):
// fmpz_mat_snf against lacuna::dense_smith_form and against the homology engine's sparse
// path (the matrix wrapped as a two-level cell complex), on random matrices, on boundary
// matrices of the test complexes, and on matrices whose elimination needs more than 64 bits;
// nmod_mat_rank against ranks over lacuna::mod_p<P>.
#include "../homology/support.hpp"

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <flint/fmpz.h>
#include <flint/fmpz_mat.h>
#include <flint/nmod_mat.h>

#include <boost/multiprecision/cpp_int.hpp>

#include <random>

namespace reference_smith_flint_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

namespace {

/// A decimal number mod p.
unsigned cpp_mod(const std::string& d, std::uint64_t p) {
  return static_cast<unsigned>(boost::multiprecision::cpp_int(d) % p);
}

/// A matrix as int64 rows.
using imatrix = std::vector<std::vector<std::int64_t>>;

std::string fmpz_text(const fmpz_t x) {
  char* s = fmpz_get_str(nullptr, 10, x);
  std::string out(s);
  flint_free(s);
  return out;
}

/// FLINT's invariant factors (the non-zero diagonal of fmpz_mat_snf), as decimal strings.
std::vector<std::string> flint_snf(const imatrix& a, std::size_t rows, std::size_t cols) {
  fmpz_mat_t A, S;
  fmpz_mat_init(A, static_cast<slong>(rows), static_cast<slong>(cols));
  fmpz_mat_init(S, static_cast<slong>(rows), static_cast<slong>(cols));
  for (std::size_t i = 0; i < rows; ++i)
    for (std::size_t j = 0; j < cols; ++j) fmpz_set_si(fmpz_mat_entry(A, i, j), a[i][j]);
  fmpz_mat_snf(S, A);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < std::min(rows, cols); ++i)
    if (!fmpz_is_zero(fmpz_mat_entry(S, i, i))) out.push_back(fmpz_text(fmpz_mat_entry(S, i, i)));
  fmpz_mat_clear(A);
  fmpz_mat_clear(S);
  return out;
}

std::size_t flint_rank_mod(const imatrix& a, std::size_t rows, std::size_t cols, std::uint64_t p) {
  nmod_mat_t A;
  nmod_mat_init(A, static_cast<slong>(rows), static_cast<slong>(cols), p);
  for (std::size_t i = 0; i < rows; ++i)
    for (std::size_t j = 0; j < cols; ++j) {
      const std::int64_t v = a[i][j] % static_cast<std::int64_t>(p);
      nmod_mat_entry(A, i, j) = static_cast<mp_limb_t>(v < 0 ? v + static_cast<std::int64_t>(p) : v);
    }
  const auto r = static_cast<std::size_t>(nmod_mat_rank(A));
  nmod_mat_clear(A);
  return r;
}

std::vector<std::string> lacuna_snf(const imatrix& a, std::size_t rows, std::size_t cols) {
  lacuna::dense_matrix<integer> A(rows, cols);
  for (std::size_t i = 0; i < rows; ++i)
    for (std::size_t j = 0; j < cols; ++j) A(i, j) = integer(a[i][j]);
  std::vector<std::string> out;
  for (const auto& d : lacuna::dense_smith_form(A).diagonal) out.push_back(d.to_string());
  return out;
}

/// The matrix as a complex: `rows` vertices, one edge per column with that column as its
/// boundary. H_0 = coker = Z^(rows - r) + torsion (the non-unit factors), H_1 = ker.
cell_list as_complex(const imatrix& a, std::size_t rows, std::size_t cols) {
  cell_list c;
  for (std::size_t i = 0; i < rows; ++i) c.add_cell(0, "");
  for (std::size_t j = 0; j < cols; ++j) {
    std::vector<lacuna::incidence> t;
    for (std::size_t i = 0; i < rows; ++i)
      if (a[i][j] != 0) t.push_back({i, a[i][j]});
    c.add_cell(1, "", t);
  }
  return c;
}

/// Checks one matrix every way: FLINT, dense Smith form, the sparse engine (both variants).
void check_matrix(const imatrix& a, std::size_t rows, std::size_t cols) {
  const auto want = flint_snf(a, rows, cols);
  CHECK(lacuna_snf(a, rows, cols) == want);
  if (rows == 0) return;
  const auto c = as_complex(a, rows, cols);
  std::vector<std::string> tors;
  for (const auto& d : want)
    if (d != "1") tors.push_back(d);
  const group h0{rows - want.size(), tors};
  for (const auto& h : {lacuna::homology<integer>(c), lacuna::homology<integer>(c, {}, markowitz_only()),
                        lacuna::homology<integer>(c, {.generators = true})}) {
    const auto g = groups_of(h);
    if (cols == 0) continue;
    REQUIRE(g.size() == 2);
    CHECK(g[0] == h0);
    CHECK(g[1] == group{cols - want.size(), {}});
  }
}

/// The boundary matrix of dimension k (n_{k-1} x n_k) of a complex.
template <class C>
imatrix boundary_matrix(const C& c, int k) {
  imatrix m(lacuna::cell_count(c, k - 1), std::vector<std::int64_t>(lacuna::cell_count(c, k), 0));
  for (std::size_t j = 0; j < lacuna::cell_count(c, k); ++j)
    for (auto&& v : lacuna::boundary(c, k, j)) {
      const auto f = lacuna::as_incidence(v);
      m[f.face][j] += f.coefficient;
    }
  return m;
}

/// Ranks of the boundary maps over Z/P from dim H_k(X; Z/P): r_k = n_k - dim H_k - r_{k+1}.
template <std::uint64_t P, class C>
std::vector<std::size_t> ranks_mod(const C& c) {
  const auto h = lacuna::homology<lacuna::mod_p<P>>(c);
  const int top = lacuna::top_dimension(c);
  std::vector<std::size_t> r(static_cast<std::size_t>(top) + 2, 0);
  for (int k = top; k >= 1; --k)
    r[static_cast<std::size_t>(k)] = lacuna::cell_count(c, k) - h[k].rank - r[static_cast<std::size_t>(k) + 1];
  return r;
}

template <std::uint64_t P, class C>
void check_ranks_mod(const C& c) {
  const auto r = ranks_mod<P>(c);
  for (int k = 1; k <= lacuna::top_dimension(c); ++k) {
    const auto m = boundary_matrix(c, k);
    CAPTURE(k);
    CAPTURE(P);
    CHECK(r[static_cast<std::size_t>(k)] == flint_rank_mod(m, lacuna::cell_count(c, k - 1), lacuna::cell_count(c, k), P));
  }
}

template <class C>
void check_complex(const C& c) {
  const auto h = lacuna::homology<integer>(c);
  for (int k = 1; k <= lacuna::top_dimension(c); ++k) {
    CAPTURE(k);
    const std::size_t rows = lacuna::cell_count(c, k - 1), cols = lacuna::cell_count(c, k);
    const auto m = boundary_matrix(c, k);
    const auto want = flint_snf(m, rows, cols);
    if (rows * cols <= 40000) CHECK(lacuna_snf(m, rows, cols) == want);
    // torsion of H_{k-1} = the non-unit invariant factors of ∂_k
    std::vector<std::string> tors;
    for (const auto& d : want)
      if (d != "1") tors.push_back(d);
    CHECK(groups_of(h)[static_cast<std::size_t>(k - 1)].torsion == tors);
  }
  check_ranks_mod<2>(c);
  check_ranks_mod<3>(c);
  check_ranks_mod<5>(c);
  check_ranks_mod<1000000007>(c);
}

}  // namespace

TEST_CASE("random integer matrices: invariant factors agree with fmpz_mat_snf") {
  std::mt19937_64 rng(77);
  for (int trial = 0; trial < 300; ++trial) {
    std::uniform_int_distribution<std::size_t> dim(0, 7);
    const std::size_t rows = dim(rng), cols = dim(rng);
    const int spread = trial % 3 == 0 ? 2 : (trial % 3 == 1 ? 9 : 1000);
    std::uniform_int_distribution<std::int64_t> e(-spread, spread);
    std::bernoulli_distribution nz(trial % 2 == 0 ? 0.4 : 0.9);
    imatrix a(rows, std::vector<std::int64_t>(cols, 0));
    for (auto& row : a)
      for (auto& x : row) x = nz(rng) ? e(rng) : 0;
    // Low rank on purpose now and then: a row copied, scaled.
    if (rows >= 2 && trial % 5 == 0)
      for (std::size_t j = 0; j < cols; ++j) a[1][j] = 3 * a[0][j];
    CAPTURE(trial);
    check_matrix(a, rows, cols);
    if (rows > 0 && cols > 0) {
      for (std::uint64_t p : {2u, 3u, 7u}) {
        // rank over Z/p: r minus nothing = the number of factors not divisible by p
        std::size_t r = 0;
        for (const auto& d : flint_snf(a, rows, cols)) r += (cpp_mod(d, p) != 0);
        CHECK(r == flint_rank_mod(a, rows, cols, p));
      }
    }
  }
}

TEST_CASE("boundary matrices of the test complexes: Smith forms and ranks mod p") {
  check_complex(cell_list::klein_bottle());
  check_complex(cell_list::projective_plane());
  check_complex(cell_list::real_projective_space(7));
  check_complex(six_vertex_rp2());
  check_complex(seven_vertex_torus());
  check_complex(dunce_hat(4));
  check_complex(matching_complex(7));
  check_complex(lacuna::product(cell_list::projective_plane(), cell_list::projective_plane()));
  check_complex(lacuna::product(cell_list::klein_bottle(), cell_list::lens_space(3, 1)));
}

TEST_CASE("adversarial growth: entries near 2^62, intermediates beyond 64 bits") {
  std::mt19937_64 rng(4242);
  const std::int64_t top = (std::int64_t{1} << 62) - 1;
  for (int trial = 0; trial < 40; ++trial) {
    std::uniform_int_distribution<std::size_t> dim(2, 6);
    const std::size_t rows = dim(rng), cols = dim(rng);
    std::uniform_int_distribution<std::int64_t> e(-top, top);
    imatrix a(rows, std::vector<std::int64_t>(cols, 0));
    for (auto& row : a)
      for (auto& x : row) x = e(rng);
    if (trial % 4 == 0)  // a common factor, so the invariant factors are not all 1
      for (auto& row : a)
        for (auto& x : row) x = (x / 1000000007) * 1000000007;
    CAPTURE(trial);
    check_matrix(a, rows, cols);
  }
  // Products of big primes along a chain: the determinant is (p q)^n, far beyond 64 bits.
  const std::int64_t p = 1000000007, q = 998244353;
  imatrix chain(5, std::vector<std::int64_t>(5, 0));
  for (std::size_t i = 0; i < 5; ++i) {
    chain[i][i] = p * q;
    if (i + 1 < 5) chain[i][i + 1] = p;
    if (i + 1 < 5) chain[i + 1][i] = q;
  }
  check_matrix(chain, 5, 5);
}

}  // namespace reference_smith_flint_test

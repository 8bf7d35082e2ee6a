// lacuna::modular_smith_invariants (algorithm/modular_smith.hpp) against FLINT 2.9's
// fmpz_mat_snf, an independent implementation: every answer it gives must be FLINT's (rank
// and every invariant factor, units included), and it must give one on the inputs its proofs
// cover (full rank, cofactor placed by the adjugate proof). Inputs: random matrices of full
// rank with small, 19-digit and 20 000-digit entries, square and rectangular; planted torsion
// U diag(d) V with random unimodular U, V (repeated prime powers 2^5, 3^3, a large prime in
// one or two factors); rank-deficient matrices (rank proved by ranks mod enough primes), and
// smith_normal_form with its fallback on all of them.
#include "flint_support.hpp"

#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>

#include <random>

namespace reference_modular_smith_flint_test {

using namespace flint_test;
using lacuna::dense_matrix;

namespace {

dense_matrix<integer> to_dense(const bmatrix& m) {
  dense_matrix<integer> d(m.rows, m.cols);
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j) d(i, j) = integer(m.a[i][j]);
  return d;
}

/// A random matrix with entries of up to `digits` decimal digits (uniform sign).
bmatrix random_matrix(std::mt19937_64& rng, std::size_t r, std::size_t c, int digits) {
  bmatrix m(r, c);
  for (auto& row : m.a)
    for (auto& x : row) {
      cpp_int v = 0;
      for (int d = 0; d < digits; ++d) v = v * 10 + static_cast<int>(rng() % 10);
      x = (rng() & 1U) ? cpp_int(-v) : v;
    }
  return m;
}

/// A product of random elementary row operations: unimodular, entries of moderate size.
bmatrix unimodular(std::mt19937_64& rng, std::size_t n, int ops) {
  bmatrix u(n, n);
  for (std::size_t i = 0; i < n; ++i) u.a[i][i] = 1;
  for (int k = 0; k < ops && n > 1; ++k) {
    const std::size_t a = rng() % n, b = (a + 1 + rng() % (n - 1)) % n;
    const int s = static_cast<int>(rng() % 5) - 2;
    for (std::size_t j = 0; j < n; ++j) u.a[a][j] += s * u.a[b][j];
  }
  return u;
}

bmatrix product(const bmatrix& x, const bmatrix& y) {
  bmatrix z(x.rows, y.cols);
  for (std::size_t i = 0; i < x.rows; ++i)
    for (std::size_t k = 0; k < x.cols; ++k)
      if (x.a[i][k] != 0)
        for (std::size_t j = 0; j < y.cols; ++j) z.a[i][j] += x.a[i][k] * y.a[k][j];
  return z;
}

/// U diag(d) V (r x c, d.size() <= min(r, c)).
bmatrix planted(std::mt19937_64& rng, std::size_t r, std::size_t c, const std::vector<cpp_int>& d) {
  bmatrix D(r, c);
  for (std::size_t i = 0; i < d.size(); ++i) D.a[i][i] = d[i];
  return product(product(unimodular(rng, r, 4 * static_cast<int>(r)), D), unimodular(rng, c, 4 * static_cast<int>(c)));
}

std::vector<std::string> all_factors(const std::vector<integer>& f) {
  std::vector<std::string> out;
  for (const auto& x : f) out.push_back(x.to_string());
  return out;
}

/// Checks the modular answer against FLINT when there is one; returns whether there was.
bool agrees_with_flint(const bmatrix& m) {
  const auto got = lacuna::modular_smith_invariants(to_dense(m));
  if (!got) return false;
  const auto want = flint_invariants(m);  // fmpz_mat_snf's non-zero diagonal
  CHECK(got->rank == want.size());
  CHECK(got->factors.size() == got->rank);
  CHECK(all_factors(got->factors) == want);
  return true;
}

}  // namespace

TEST_CASE("modular Smith: random square matrices of full rank, small entries, agree with FLINT") {
  std::mt19937_64 rng(1401);
  int answered = 0, total = 0;
  for (std::size_t n : {1U, 2U, 3U, 5U, 8U, 13U, 21U, 40U})
    for (int rep = 0; rep < 4; ++rep) {
      const auto m = random_matrix(rng, n, n, 1);
      if (flint_invariants(m).size() < n) continue;  // singular: not this test's case
      ++total;
      answered += agrees_with_flint(m);
    }
  // Random square matrices: the determinant's large cofactor almost always lands in d_n
  // alone, so the adjugate proof goes through.
  CHECK(answered >= total - 2);
  CHECK(total >= 20);
}

TEST_CASE("modular Smith: rectangular full-rank matrices (both orientations) agree with FLINT") {
  std::mt19937_64 rng(1402);
  int answered = 0;
  for (auto [r, c] : std::vector<std::pair<std::size_t, std::size_t>>{{3, 7}, {7, 3}, {10, 16}, {16, 10}, {20, 21}, {30, 12}}) {
    const auto m = random_matrix(rng, r, c, 1);
    REQUIRE(flint_invariants(m).size() == std::min(r, c));
    answered += agrees_with_flint(m);
  }
  CHECK(answered >= 4);
}

TEST_CASE("modular Smith: 19-digit and 20 000-digit entries agree with FLINT") {
  std::mt19937_64 rng(1403);
  CHECK(agrees_with_flint(random_matrix(rng, 12, 12, 19)));
  CHECK(agrees_with_flint(random_matrix(rng, 9, 14, 19)));
  // Four 20 000-digit entries in a small matrix of small entries.
  auto m = random_matrix(rng, 6, 6, 1);
  for (int k = 0; k < 4; ++k) m.a[static_cast<std::size_t>(k)][static_cast<std::size_t>(k + 1) % 6] = random_matrix(rng, 1, 1, 20000).a[0][0];
  CHECK(agrees_with_flint(m));
}

TEST_CASE("modular Smith: planted torsion with repeated prime powers and a large prime") {
  std::mt19937_64 rng(1404);
  const cpp_int big_prime("1000000000000000000000000000057");  // a 31-digit prime (checked by FLINT below)
  {
    fmpz_t q;
    fmpz_init(q);
    fmpz_set_str(q, big_prime.str().c_str(), 10);
    REQUIRE(fmpz_is_prime(q) == 1);
    fmpz_clear(q);
  }
  const cpp_int p2 = 32, p3 = 27;
  // 2^5 and 3^3 repeated, the large prime in d_n only: every proof goes through.
  CHECK(agrees_with_flint(planted(rng, 8, 8, {1, 1, 2, p2, p2, p2 * p3, p2 * p3, p2 * p3 * big_prime})));
  CHECK(agrees_with_flint(planted(rng, 6, 9, {1, 3, p3, p3, 4 * p3, 4 * p3 * 5})));
  CHECK(agrees_with_flint(planted(rng, 9, 6, {2, 2, p2, p2 * 3, p2 * p3, p2 * p3 * 7})));
  // The large prime in two invariant factors: d_(n-1) shares it with the cofactor, the
  // adjugate proof fails; the answer is nullopt (or FLINT's, never another).
  const auto m = planted(rng, 7, 7, {1, 2, 2, p2, p2 * p3, p2 * p3 * big_prime, p2 * p3 * big_prime * 11});
  const bool answered = agrees_with_flint(m);
  CHECK_FALSE(answered);
  // ... and smith_normal_form still gets it right through its fallback.
  CHECK(texts(lacuna::smith_normal_form(sparse_over<integer>(m)).factors) == flint_invariants(m));
}

TEST_CASE("modular Smith: rank-deficient matrices: FLINT's answer or nullopt; smith_normal_form stays exact") {
  std::mt19937_64 rng(1405);
  int answered = 0;
  for (auto [r, c, k] : std::vector<std::tuple<std::size_t, std::size_t, std::size_t>>{
           {10, 10, 9}, {12, 9, 5}, {9, 14, 8}, {20, 20, 12}, {16, 30, 1}}) {
    const auto m = product(random_matrix(rng, r, k, 1), random_matrix(rng, k, c, 1));  // rank <= k
    answered += agrees_with_flint(m);
    CHECK(texts(lacuna::smith_normal_form(sparse_over<integer>(m)).factors) == flint_invariants(m));
  }
  // The rank is proved by ranks mod enough primes, the small primes by local Smith forms; a
  // large prime in G' but not in G (not placed exactly) gives nullopt, rarely.
  CHECK(answered >= 3);
  // Planted torsion at rank 6 of 9 x 11: small primes only, so every proof goes through.
  const auto planted_m = planted(rng, 9, 11, {1, 2, 6, 12, 12 * 9, 12 * 9 * 32});
  CHECK(agrees_with_flint(planted_m));
  // Zero rows: rank 0; the zero matrix is not proved zero modularly (nullopt).
  CHECK(lacuna::modular_smith_invariants(dense_matrix<integer>(0, 5))->rank == 0);
  CHECK_FALSE(lacuna::modular_smith_invariants(dense_matrix<integer>(3, 3)).has_value());
}

TEST_CASE("modular Smith: Lehmer's gcd agrees with FLINT's fmpz_gcd") {
  std::mt19937_64 rng(1406);
  auto to_fmpz_text = [](const cpp_int& a, const cpp_int& b) {
    fmpz_t x, y, g;
    fmpz_init(x), fmpz_init(y), fmpz_init(g);
    fmpz_set_str(x, a.str().c_str(), 10);
    fmpz_set_str(y, b.str().c_str(), 10);
    fmpz_gcd(g, x, y);
    auto out = fmpz_text(g);
    fmpz_clear(x), fmpz_clear(y), fmpz_clear(g);
    return out;
  };
  for (int digits : {1, 19, 40, 200, 3000}) {
    for (int rep = 0; rep < 6; ++rep) {
      const cpp_int common = random_matrix(rng, 1, 1, 1 + digits / 3).a[0][0];
      const cpp_int a = random_matrix(rng, 1, 1, digits).a[0][0] * (rep % 2 ? common : 1);
      const cpp_int b = random_matrix(rng, 1, 1, digits + rep).a[0][0] * (rep % 3 ? common : 1);
      CAPTURE(digits);
      CHECK(lacuna::detail::modular::lehmer_gcd(a, b).str() == to_fmpz_text(a, b));
      CHECK(lacuna::detail::modular::lehmer_gcd(b, 0).str() == to_fmpz_text(b, 0));
    }
  }
}

}  // namespace reference_modular_smith_flint_test

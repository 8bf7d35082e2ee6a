// lacuna::lattice_smith_invariants (algorithm/lattice_smith.hpp) against FLINT 2.9's
// fmpz_mat_snf, an independent implementation: every answer it gives must be FLINT's (rank and
// every invariant factor, units included), and it must give one on the inputs its proofs cover
// (full column rank, every torsion prime below 2^16 with word-size prime powers). Inputs: tall
// matrices with planted torsion — the rows of diag(d) V (V unimodular) and integer
// combinations of them, shuffled, so that the row lattice is that of diag(d) V and the
// invariant factors are d (structure theorem for finitely generated abelian groups) — with a
// product of invariant factors beyond 2^64 and one factor beyond 2^64; their transposes; and
// inputs it must decline (rank deficient, a torsion prime above 2^16, 2^70 in one factor),
// where finish_remainder falls back to the sparse route and still agrees with FLINT.
// Rank-deficient inputs (the bordering-minor proof of the rank): planted torsion with zero
// invariant factors, wide and tall, entries past 64 bits; products of random integer
// matrices (rank r < min(rows, cols) whenever FLINT says so); and a matrix whose rank
// modulo the route's first prime is below its rank over Q, which the rank proof must catch.
#include "flint_support.hpp"

#include <lacuna/algorithm/integral_reduction.hpp>
#include <lacuna/algorithm/lattice_smith.hpp>

#include <random>

namespace reference_lattice_smith_flint_test {

using namespace flint_test;

/// m x n with row lattice spanned by the rows of diag(d) V (d padded with ones to n; d = 0
/// entries make the lattice rank-deficient), V a product of random elementary operations.
bmatrix planted_tall(std::mt19937_64& rng, std::size_t m, std::size_t n, const std::vector<cpp_int>& d) {
  std::vector<std::vector<cpp_int>> b(n, std::vector<cpp_int>(n, 0));
  for (std::size_t i = 0; i < n; ++i) b[i][i] = i + d.size() >= n ? d[i + d.size() - n] : cpp_int(1);
  // V: column operations col_j += c col_k, a few per column, small c.
  for (std::size_t t = 0; t < 2 * n; ++t) {
    const std::size_t j = rng() % n, k = rng() % n;
    if (j == k) continue;
    const int c = (rng() & 1U) ? 1 : -1;
    for (std::size_t i = 0; i < n; ++i) b[i][j] += c * b[i][k];
  }
  std::vector<std::vector<cpp_int>> rows(b.begin(), b.end());
  while (rows.size() < m) {
    std::vector<cpp_int> r(n, 0);
    for (int t = 0; t < 3; ++t) {
      const std::size_t k = rng() % n;
      const int c = static_cast<int>(rng() % 7) - 3;
      for (std::size_t j = 0; j < n; ++j) r[j] += c * b[k][j];
    }
    rows.push_back(std::move(r));
  }
  std::shuffle(rows.begin(), rows.end(), rng);
  bmatrix out(m, n);
  for (std::size_t i = 0; i < m; ++i) out.a[i] = rows[i];
  return out;
}

bmatrix transposed(const bmatrix& a) {
  bmatrix t(a.cols, a.rows);
  for (std::size_t i = 0; i < a.rows; ++i)
    for (std::size_t j = 0; j < a.cols; ++j) t.a[j][i] = a.a[i][j];
  return t;
}

cpp_int power(int p, int e) {
  cpp_int x = 1;
  for (int i = 0; i < e; ++i) x *= p;
  return x;
}

/// The route's factors (units included) when it answers.
std::optional<std::vector<std::string>> route(const bmatrix& m) {
  const auto s = lacuna::lattice_smith_invariants(sparse_over<integer>(m));
  if (!s) return std::nullopt;
  CHECK(s->rank == s->factors.size());
  return texts(s->factors);
}

TEST_CASE("planted torsion beyond 2^64 in tall matrices: the route answers, and answers as fmpz_mat_snf") {
  std::mt19937_64 rng(4711);
  // 2^10 3^12 5^12 7^6 has about 74 bits; with the factors below it the product has about 105.
  const std::vector<cpp_int> d = {3, 15, 210, power(2, 3) * power(3, 5) * power(5, 4) * power(7, 3),
                                  power(2, 10) * power(3, 12) * power(5, 12) * power(7, 6)};
  for (const std::size_t n : {6U, 10U, 16U}) {
    for (const std::size_t m : {n, 4 * n}) {
      CAPTURE(n);
      CAPTURE(m);
      const auto a = planted_tall(rng, m, n, d);
      const auto want = flint_invariants(a);  // FLINT fmpz_mat_snf
      REQUIRE(want.size() == n);
      CHECK(want.back() == (power(2, 10) * power(3, 12) * power(5, 12) * power(7, 6)).str());  // as planted
      const auto got = route(a);
      REQUIRE(got.has_value());
      CHECK(*got == want);
      const auto got_t = route(transposed(a));  // a wide matrix: its columns are the vectors
      REQUIRE(got_t.has_value());
      CHECK(*got_t == want);
    }
  }
}

TEST_CASE("random tall matrices of small entries: whenever the route answers, fmpz_mat_snf agrees") {
  std::mt19937_64 rng(99);
  int answered = 0;
  for (int t = 0; t < 12; ++t) {
    const std::size_t n = 4 + rng() % 10, m = n + rng() % 40;
    bmatrix a(m, n);
    for (auto& row : a.a)
      for (auto& x : row) x = (rng() % 3 == 0) ? cpp_int(static_cast<int>(rng() % 9) - 4) : cpp_int(0);
    const auto want = flint_invariants(a);
    CAPTURE(t);
    if (const auto got = route(a)) {
      ++answered;
      CHECK(*got == want);
    }
    CHECK(texts(lacuna::finish_remainder(sparse_over<integer>(a), 0).factors) == want);
  }
  CHECK(answered >= 4);  // most of them have full rank and small torsion primes
}

TEST_CASE("inputs the proofs do not cover are declined, and finish_remainder still agrees with fmpz_mat_snf") {
  std::mt19937_64 rng(5);
  const std::vector<bmatrix> cases = {
      planted_tall(rng, 40, 10, {3, cpp_int(3) * 1000003}),      // the prime 1000003 > 2^16
      planted_tall(rng, 40, 10, {2, power(2, 70)}),              // v_2 = 70: 2^71 is not a word
  };
  for (std::size_t i = 0; i < cases.size(); ++i) {
    CAPTURE(i);
    CHECK_FALSE(route(cases[i]).has_value());
    const auto want = flint_invariants(cases[i]);
    CHECK(texts(lacuna::finish_remainder(sparse_over<integer>(cases[i]), 0).factors) == want);
    CHECK(texts(lacuna::finish_remainder(sparse_over<integer>(cases[i]), 0, nullptr, false).factors) == want);
  }
}

TEST_CASE("rank-deficient planted torsion, tall and wide, entries past 64 bits: the route answers as fmpz_mat_snf") {
  std::mt19937_64 rng(2718);
  const cpp_int big = power(2, 10) * power(3, 12) * power(5, 12) * power(7, 6);  // about 2^74
  const std::vector<std::vector<cpp_int>> plants = {
      {2, 6, 0},                                // rank n - 1
      {3, 15, 210, big, 0, 0, 0},               // rank n - 3, one factor past 2^64
      {0, 0, 4, 4, 12, power(2, 20) * 9},       // zero factors first in the list (d padded by ones)
  };
  for (const auto& d : plants)
    for (const std::size_t n : {8U, 14U})
      for (const std::size_t m : {n + 3, 3 * n}) {
        CAPTURE(n);
        CAPTURE(m);
        const auto a = planted_tall(rng, m, n, d);
        const auto want = flint_invariants(a);  // FLINT fmpz_mat_snf
        std::size_t zeros = 0;
        for (const auto& x : d) zeros += x == 0 ? 1 : 0;
        REQUIRE(want.size() == n - zeros);  // as planted: rank n - (zero factors)
        const auto got = route(a);
        REQUIRE(got.has_value());
        CHECK(*got == want);
        const auto got_t = route(transposed(a));  // wide
        REQUIRE(got_t.has_value());
        CHECK(*got_t == want);
      }
}

TEST_CASE("products of random integer matrices (rank deficient, wide and tall): whenever the route answers, fmpz_mat_snf agrees") {
  std::mt19937_64 rng(31337);
  int answered = 0;
  for (int t = 0; t < 16; ++t) {
    const std::size_t r = 2 + rng() % 6, m = r + 2 + rng() % 20, n = r + 1 + rng() % 30;
    bmatrix x(m, r), y(r, n), a(m, n);
    for (auto& row : x.a)
      for (auto& v : row) v = cpp_int(static_cast<int>(rng() % 7) - 3);
    for (auto& row : y.a)
      for (auto& v : row) v = (t % 4 == 0) ? cpp_int(static_cast<long long>(rng() >> 1U)) * 1000003 : cpp_int(static_cast<int>(rng() % 5) - 2);
    for (std::size_t i = 0; i < m; ++i)
      for (std::size_t j = 0; j < n; ++j)
        for (std::size_t k = 0; k < r; ++k) a.a[i][j] += x.a[i][k] * y.a[k][j];
    const auto want = flint_invariants(a);
    CAPTURE(t);
    REQUIRE(want.size() <= r);  // rank of a product of an m x r and an r x n matrix
    if (const auto got = route(a)) {
      ++answered;
      CHECK(*got == want);
    }
    if (const auto got = route(transposed(a))) CHECK(*got == want);
    CHECK(texts(lacuna::finish_remainder(sparse_over<integer>(a), 0).factors) == want);
  }
  CHECK(answered >= 8);  // the torsion primes of most products are small
}

TEST_CASE("a rank that the first prime underestimates: the rank proof fails and the route declines") {
  // Vectors of rank 5 over Z, plus p0 times a vector outside their span, where p0 is the
  // route's first prime: rank 5 mod p0 but 6 over Q. The bordering minors that contain the
  // extra vector are non-zero (multiples of p0), so the proof mod the next primes must fail.
  namespace dl = lacuna::detail::lattice_smith_impl;
  const std::uint64_t p0 = lacuna::detail::modular::prime_below(dl::small_word_limit);
  std::mt19937_64 rng(8);
  auto a = planted_tall(rng, 30, 12, {1, 1, 1, 1, 3, 0, 0, 0, 0, 0, 0, 0});
  REQUIRE(flint_invariants(a).size() == 5);
  std::vector<cpp_int> w(12);
  for (auto& v : w) v = cpp_int(static_cast<int>(rng() % 9) - 4) * p0;
  a.a.push_back(w);
  ++a.rows;
  const auto want = flint_invariants(a);
  REQUIRE(want.size() == 6);  // FLINT: rank 6 over Q
  REQUIRE(flint_rank_mod(a, p0) == 5);
  CHECK_FALSE(route(a).has_value());
  CHECK_FALSE(route(transposed(a)).has_value());
  CHECK(texts(lacuna::finish_remainder(sparse_over<integer>(a), 0).factors) == want);
  // The rank alone (rank_only) rests on the same proof: declined too, never answered 5.
  CHECK_FALSE(lacuna::lattice_smith_invariants(sparse_over<integer>(a), nullptr, {.rank_only = true}).has_value());
}

TEST_CASE("the rank alone (rank_only, the route of homology over Q): fmpz_mat_snf's number of non-zero factors, no factors") {
  // Full-rank (steps 0) and rank-deficient (R1-R2) inputs, tall and wide; the rank over Q is
  // the number of non-zero invariant factors FLINT reports.
  std::mt19937_64 rng(4242);
  const cpp_int big = power(3, 30) * power(7, 20);  // about 2^104
  const std::vector<std::vector<cpp_int>> plants = {{3, 3, big}, {2, 6, 0}, {3, 15, 0, 0, 0}};
  for (const auto& d : plants)
    for (const std::size_t n : {9U, 15U}) {
      CAPTURE(n);
      const auto a = planted_tall(rng, 3 * n, n, d);
      const std::size_t rank = flint_invariants(a).size();  // FLINT fmpz_mat_snf
      for (const auto& x : {a, transposed(a)}) {
        const auto s = lacuna::lattice_smith_invariants(sparse_over<integer>(x), nullptr, {.rank_only = true});
        REQUIRE(s.has_value());
        CHECK(s->rank == rank);
        CHECK(s->factors.empty());
        CHECK(lacuna::finish_remainder(sparse_over<integer>(x), 0, nullptr, true, true, true).rank == rank);
      }
    }
}

}  // namespace reference_lattice_smith_flint_test

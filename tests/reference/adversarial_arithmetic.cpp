// Arithmetic that must not lie (issue 7 §2): integer matrices and cell complexes built so
// that elimination must leave 64 bits — continuants whose unit pivots breed products near
// 2^124, Vandermonde matrices, U·D·V with unimodular U, V and invariant factors beyond 2^64,
// entries INT64_MIN and INT64_MAX, and cell lists whose incidence numbers are 2^62 + 1,
// 3·2^61, 2^63 - 1 or beyond int64. Every Smith-form variant (dense_smith_form, and
// smith_normal_form with sparse_elimination{} default and Markowitz only and with
// dense_elimination{}) over lacuna::integer and lacuna::big_integer, and the homology engine
// (every variant, homology and cohomology, both rings) are compared with FLINT 2.9's
// fmpz_mat_snf, or with a theorem where one gives the answer. Then: fixed-width arithmetic
// (checked_int64, mod_p_dynamic's unbound integers, the cellular product) reports overflow
// by an exception instead of wrapping, and lacuna::integer never wraps (against cpp_int).
// The sanitizer build (-fsanitize=address,undefined, no recovery) runs all of it.
#include "flint_support.hpp"

#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <algorithm>
#include <array>
#include <limits>
#include <random>
#include <stdexcept>

namespace reference_adversarial_arithmetic_test {

using namespace flint_test;
using lacuna::cell_list;
using lacuna::exact_incidence;

namespace {
constexpr std::int64_t i64max = std::numeric_limits<std::int64_t>::max();
constexpr std::int64_t i64min = std::numeric_limits<std::int64_t>::min();
const cpp_int two62 = cpp_int(1) << 62;

/// The matrix as a complex: one vertex per row, one edge per column with that column as its
/// boundary (coefficients of any size). H_0 = coker A, H_1 = ker A; H^1 = Z^(rows - r) ⊕ the
/// same torsion (Ext(H_0, Z), Hatcher 2002, Theorem 3.2) and H^0 = ker A^T.
cell_list as_complex(const bmatrix& m) {
  cell_list c;
  for (std::size_t i = 0; i < m.rows; ++i) c.add_cell(0, "");
  for (std::size_t j = 0; j < m.cols; ++j) {
    std::vector<exact_incidence> t;
    for (std::size_t i = 0; i < m.rows; ++i)
      if (m.a[i][j] != 0) t.push_back({i, integer(m.a[i][j])});
    c.add_cell(1, "", t);
  }
  return c;
}

/// Checks one matrix every way. `want`, when given, is the answer a theorem predicts; FLINT
/// must agree with it too.
void check_matrix(const bmatrix& m, const std::vector<std::string>* want = nullptr) {
  const auto flint = flint_invariants(m);  // FLINT fmpz_mat_snf
  if (want) CHECK(flint == *want);
  CHECK(every_smith_variant<integer>(m) == flint);
  CHECK(every_smith_variant<big_integer>(m) == flint);
  if (m.rows == 0 || m.cols == 0) return;
  // The engine on the matrix as a two-level complex (the structure theorem, flint_support.hpp).
  const auto c = as_complex(m);
  std::vector<std::string> tors;
  for (const auto& d : flint)
    if (d != "1") tors.push_back(d);
  const std::vector<group> h{{m.rows - flint.size(), tors}, {m.cols - flint.size(), {}}};
  CHECK(engine_variants<integer>(c) == h);
  CHECK(engine_variants<big_integer>(c) == h);
  const std::vector<group> co{{m.rows - flint.size(), {}}, {m.cols - flint.size(), tors}};
  CHECK(engine_variants<integer>(c, true) == co);
  CHECK(engine_variants<big_integer>(c, true) == co);
}

/// A random unimodular n x n matrix: a product of `steps` elementary operations (row j +=
/// s row i, with |s| up to `mult`) and row swaps; determinant ±1 by construction.
bmatrix random_unimodular(std::mt19937_64& rng, std::size_t n, int steps, std::int64_t mult) {
  bmatrix u(n, n);
  for (std::size_t i = 0; i < n; ++i) u.a[i][i] = 1;
  std::uniform_int_distribution<std::size_t> idx(0, n - 1);
  std::uniform_int_distribution<std::int64_t> s(-mult, mult);
  for (int t = 0; t < steps; ++t) {
    const std::size_t i = idx(rng), j = idx(rng);
    if (i == j) {
      std::swap(u.a[i], u.a[(i + 1) % n]);
      continue;
    }
    const cpp_int f = s(rng);
    for (std::size_t k = 0; k < n; ++k) u.a[j][k] += f * u.a[i][k];
  }
  return u;
}

bmatrix multiply(const bmatrix& x, const bmatrix& y) {
  bmatrix z(x.rows, y.cols);
  for (std::size_t i = 0; i < x.rows; ++i)
    for (std::size_t t = 0; t < x.cols; ++t)
      if (x.a[i][t] != 0)
        for (std::size_t j = 0; j < y.cols; ++j) z.a[i][j] += x.a[i][t] * y.a[t][j];
  return z;
}

cpp_int max_abs(const bmatrix& m) {
  cpp_int best = 0;
  for (const auto& row : m.a)
    for (const auto& x : row) best = std::max(best, cpp_int(abs(x)));
  return best;
}
}  // namespace

TEST_CASE("continuants: unit pivots whose fill-in passes 2^64 at the first step") {
  // Tridiagonal, 1 on the diagonal, c above and s·c below: eliminating the first unit pivot
  // leaves 1 - s·c^2 (about 2^124 for c near 2^62), and so on down the continuant.
  for (const cpp_int& c : std::vector<cpp_int>{two62 + 1, 3 * (cpp_int(1) << 61), cpp_int(i64max), cpp_int(3037000500)}) {
    for (int sign : {1, -1}) {
      for (std::size_t n : {2u, 3u, 6u}) {
        CAPTURE(n);
        CAPTURE(c.str());
        bmatrix m(n, n);
        for (std::size_t i = 0; i < n; ++i) {
          m.a[i][i] = 1;
          if (i + 1 < n) m.a[i][i + 1] = c, m.a[i + 1][i] = sign * c;
        }
        check_matrix(m);
      }
    }
  }
  // The 2 x 2 case by hand: [[1, c], [c, 1]] has invariant factors 1, c^2 - 1 (the gcd of the
  // entries is 1, the determinant is 1 - c^2: Smith's theorem, d_1 d_2 = |det|).
  const cpp_int c = two62 + 1;
  bmatrix m(2, 2);
  m.a = {{1, c}, {c, 1}};
  const std::vector<std::string> want{"1", cpp_int(c * c - 1).str()};
  check_matrix(m, &want);
}

TEST_CASE("Vandermonde matrices with nodes near 2^15: entries near 2^60, determinants near 2^150") {
  std::mt19937_64 rng(1615);
  std::uniform_int_distribution<std::int64_t> node(1 << 14, 1 << 15);
  for (int trial = 0; trial < 6; ++trial) {
    const std::size_t n = 3 + static_cast<std::size_t>(trial % 3);
    bmatrix m(n, n);
    std::vector<cpp_int> x;
    for (std::size_t i = 0; i < n; ++i) x.push_back(node(rng));
    for (std::size_t i = 0; i < n; ++i) {
      cpp_int p = 1;
      for (std::size_t j = 0; j < n; ++j, p *= x[i]) m.a[i][j] = p;
    }
    // d_1 ... d_n = |det| = Π_{i<j} |x_j - x_i| (the Vandermonde determinant), checked on
    // FLINT's factors; then every variant against FLINT.
    cpp_int det = 1;
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = i + 1; j < n; ++j) det *= abs(x[j] - x[i]);
    const auto f = flint_invariants(m);
    cpp_int prod = 1;
    for (const auto& d : f) prod *= cpp_int(d);
    CAPTURE(trial);
    CHECK(prod == det);
    check_matrix(m);
  }
}

TEST_CASE("U D V with unimodular U, V: the invariant factors are D's, far beyond 64 bits") {
  // Smith's theorem: U D V with U, V invertible over Z and D = diag(d_1 | d_2 | ...) has
  // exactly d_1, d_2, ... as invariant factors. Primes 2^61 - 1 and 2^62 - 57 from
  // tests/reference/ring_primality.cpp (FLINT n_is_prime).
  const cpp_int m61 = (cpp_int(1) << 61) - 1, p62 = two62 - 57;
  const std::vector<cpp_int> d{1, 2, 2 * m61, 2 * m61 * p62, 2 * m61 * p62 * p62};
  std::mt19937_64 rng(2718);
  for (int trial = 0; trial < 8; ++trial) {
    const std::size_t rows = 5 + static_cast<std::size_t>(trial % 2), cols = 5 + static_cast<std::size_t>(trial % 3);
    bmatrix D(rows, cols);
    for (std::size_t i = 0; i < d.size(); ++i) D.a[i][i] = d[i];
    const auto U = random_unimodular(rng, rows, 12, trial < 4 ? 3 : 1000);
    const auto V = random_unimodular(rng, cols, 12, trial < 4 ? 3 : 1000);
    const auto A = multiply(multiply(U, D), V);
    CAPTURE(trial);
    CHECK(max_abs(A) > two62);  // the input itself is adversarial, not only the intermediates
    std::vector<std::string> want;
    for (const auto& x : d) want.push_back(x.str());
    check_matrix(A, &want);
  }
}

TEST_CASE("entries INT64_MIN and INT64_MAX: |INT64_MIN| = 2^63 does not fit int64") {
  // 1 x 1: the invariant factor of (INT64_MIN) is 2^63 (normalization negates it).
  bmatrix one(1, 1);
  one.a[0][0] = i64min;
  const std::vector<std::string> w1{(cpp_int(1) << 63).str()};
  check_matrix(one, &w1);
  // [[min, max], [max, min]]: gcd of the entries 1, |det| = 2^126 - (2^63 - 1)^2 = 2^64 - 1
  // (by hand: (2^63 - 1)^2 = 2^126 - 2^64 + 1).
  bmatrix two(2, 2);
  two.a = {{i64min, i64max}, {i64max, i64min}};
  const std::vector<std::string> w2{"1", ((cpp_int(1) << 64) - 1).str()};
  check_matrix(two, &w2);
  // diag(min, min) and a row of them: factors 2^63, 2^63 and 2^63.
  bmatrix dd(2, 2);
  dd.a = {{i64min, 0}, {0, i64min}};
  const std::vector<std::string> w3{(cpp_int(1) << 63).str(), (cpp_int(1) << 63).str()};
  check_matrix(dd, &w3);
  bmatrix row(1, 3);
  row.a = {{i64min, i64min, i64min}};
  check_matrix(row, &w1);
  // Random matrices whose entries are drawn from the extremes and their neighbours.
  std::mt19937_64 rng(63);
  const std::vector<std::int64_t> pool{i64min, i64min + 1, i64max, i64max - 1, i64min / 2, i64max / 2 + 1,
                                       (std::int64_t{1} << 62) + 1, 3 * (std::int64_t{1} << 61), -1, 0, 1, 2};
  for (int trial = 0; trial < 30; ++trial) {
    const std::size_t rows = 1 + rng() % 4, cols = 1 + rng() % 4;
    bmatrix m(rows, cols);
    for (auto& r : m.a)
      for (auto& x : r) x = pool[rng() % pool.size()];
    CAPTURE(trial);
    check_matrix(m);
  }
}

TEST_CASE("a cell list with incidence numbers 2^62 + 1, 3·2^61 and 2^63 - 1: ∂∂ = 0 exactly") {
  // One vertex, three loops a, b, c (∂ = 0); with v = (v1, v2, v3) = (2^62 + 1, 3·2^61,
  // 2^63 - 1), 2-cells ∂R_1 = v2 a - v1 b, ∂R_2 = v3 a - v1 c, ∂R_3 = v3 b - v2 c, and a
  // 3-cell ∂X = v3 R_1 - v2 R_2 + v1 R_3, so ∂∂X = (v3 v2 - v2 v3) a + (-v3 v1 + v1 v3) b +
  // (v2 v1 - v1 v2) c = 0 (by hand; products near 2^125). Twins R'_j of the R_j and 3-cells
  // Y_j with ∂Y_j = k_j (R_j - R'_j), k_j near 2^63.
  const std::int64_t v1 = (std::int64_t{1} << 62) + 1, v2 = 3 * (std::int64_t{1} << 61), v3 = i64max;
  cell_list x;
  x.add_cell(0, "o");
  for (const char* name : {"a", "b", "c"}) x.add_cell(1, name, {{0, 1}, {0, -1}});
  const std::vector<std::vector<lacuna::incidence>> rel{{{0, v2}, {1, -v1}}, {{0, v3}, {2, -v1}}, {{1, v3}, {2, -v2}}};
  for (const auto& r : rel) x.add_cell(2, "", r);
  for (const auto& r : rel) x.add_cell(2, "", r);  // twins R'_1..R'_3 = cells 3..5
  x.add_cell(3, "X", {{0, v3}, {1, -v2}, {2, v1}});
  const std::vector<std::int64_t> ks{i64max, (std::int64_t{1} << 62) + 1, 3 * (std::int64_t{1} << 61)};
  for (std::size_t j = 0; j < 3; ++j) x.add_cell(3, "", {{j, ks[j]}, {j + 3, -ks[j]}});
  lacuna::validate(x);
  // ∂∂ = 0 in cpp_int, independently of validate.
  for (int k = 2; k <= 3; ++k) {
    const auto lo = exact_boundary(x, k - 1), hi = exact_boundary(x, k);
    const auto prod = multiply(lo, hi);
    for (const auto& r : prod.a)
      for (const auto& e : r) CHECK(e == 0);
  }
  const auto want = flint_homology(x);  // FLINT fmpz_mat_snf on ∂_1, ∂_2, ∂_3
  CHECK(engine_variants<integer>(x) == want);
  CHECK(engine_variants<big_integer>(x) == want);
  // By hand: H_3 = ker ∂_3 = 0 (X and the Y_j are independent); rank ∂_2 = 2 and rank ∂_3 =
  // 4 = dim ker ∂_2, so H_2 is finite, of order d_1 d_2 d_3 d_4 = the gcd of the 4 x 4
  // minors of ∂_3 (Smith's theorem: d_1 ... d_k is the k-th determinantal divisor),
  // computed here by Leibniz's formula in cpp_int.
  REQUIRE(want.size() == 4);
  CHECK(want[3] == group{0, {}});
  CHECK(want[2].rank == 0);
  {
    const auto d3 = exact_boundary(x, 3);
    cpp_int g = 0;
    for (unsigned mask = 0; mask < 64; ++mask) {
      if (__builtin_popcount(mask) != 4) continue;
      std::vector<std::size_t> r;
      for (std::size_t i = 0; i < 6; ++i)
        if (mask >> i & 1U) r.push_back(i);
      std::array<std::size_t, 4> perm{0, 1, 2, 3};
      cpp_int det = 0;
      do {
        int inversions = 0;
        for (std::size_t i = 0; i < 4; ++i)
          for (std::size_t j = i + 1; j < 4; ++j) inversions += perm[i] > perm[j];
        cpp_int t = inversions % 2 ? -1 : 1;
        for (std::size_t i = 0; i < 4; ++i) t *= d3.a[r[i]][perm[i]];
        det += t;
      } while (std::next_permutation(perm.begin(), perm.end()));
      g = boost::multiprecision::gcd(g, det);
    }
    cpp_int order = 1;
    for (const auto& t : want[2].torsion) order *= cpp_int(t);
    CHECK(order == abs(g));
    CHECK(g > 1);
  }
  // Cohomology: H^k ≅ Hom(H_k, Z) ⊕ Ext(H_{k-1}, Z) (Hatcher 2002, Theorem 3.2).
  const auto co = engine_variants<integer>(x, true);
  REQUIRE(co.size() == 4);
  for (std::size_t k = 0; k < 4; ++k) {
    CAPTURE(k);
    CHECK(co[k].rank == want[k].rank);
    CHECK(co[k].torsion == (k == 0 ? std::vector<std::string>{} : want[k - 1].torsion));
  }
}

TEST_CASE("a chain of rank-one boundaries u v^T with entries near 2^62") {
  // Two cells per dimension 0..5, ∂_k = u_k v_k^T (2 x 2, entries near 2^62). Then
  // ∂_{k-1} ∂_k = u_{k-1} (v_{k-1} · u_k) v_k^T = 0 because v_{k-1} ⟂ u_k by construction.
  // Gauss's lemma: the one invariant factor of u v^T is content(u) · content(v).
  std::mt19937_64 rng(31);
  for (int trial = 0; trial < 6; ++trial) {
    std::uniform_int_distribution<std::int64_t> g(1, 2047), st((std::int64_t{1} << 19), (std::int64_t{1} << 20));
    std::vector<std::array<cpp_int, 2>> u(6), v(6);
    for (std::size_t k = 1; k < 6; ++k) {
      const cpp_int gk = g(rng);
      cpp_int s = st(rng), t = st(rng);
      while (boost::multiprecision::gcd(s, t) != 1) ++t;
      u[k] = {gk * s, gk * t};
    }
    // v_k ⟂ u_{k+1}: v_k = (u_{k+1}[1], -u_{k+1}[0]) (content g_{k+1}); v_5 free.
    for (std::size_t k = 1; k < 5; ++k) v[k] = {u[k + 1][1], -u[k + 1][0]};
    v[5] = {cpp_int(st(rng)) * 1023, cpp_int(st(rng)) * 1023};
    cell_list c;
    c.add_cell(0, "");
    c.add_cell(0, "");
    for (int k = 1; k < 6; ++k)
      for (std::size_t j = 0; j < 2; ++j) {
        std::vector<exact_incidence> t;
        for (std::size_t i = 0; i < 2; ++i) t.push_back({i, integer(cpp_int(u[static_cast<std::size_t>(k)][i] * v[static_cast<std::size_t>(k)][j]))});
        c.add_cell(k, "", t);
      }
    lacuna::validate(c);
    CAPTURE(trial);
    for (int k = 1; k < 6; ++k) {
      const auto kk = static_cast<std::size_t>(k);
      const cpp_int want = boost::multiprecision::gcd(u[kk][0], u[kk][1]) * boost::multiprecision::gcd(v[kk][0], v[kk][1]);
      CHECK(flint_invariants(exact_boundary(c, k)) == std::vector<std::string>{want.str()});
      CHECK(every_smith_variant<integer>(exact_boundary(c, k)) == std::vector<std::string>{want.str()});
    }
    const auto h = flint_homology(c);
    CHECK(engine_variants<integer>(c) == h);
    CHECK(engine_variants<big_integer>(c) == h);
  }
}

TEST_CASE("checked_int64 throws coefficient_overflow exactly when cpp_int leaves int64") {
  const std::vector<std::int64_t> edge{i64min, i64min + 1, i64min / 2, -3037000500, -3037000499, -1, 0, 1,
                                       3037000499, 3037000500, i64max / 2, i64max / 2 + 1, i64max - 1, i64max};
  const auto fits = [](const cpp_int& r) { return r >= i64min && r <= i64max; };
  using lacuna::checked_int64;
  for (std::int64_t a : edge) {
    if (fits(-cpp_int(a)))
      CHECK((-checked_int64(a)).v == -a);
    else
      CHECK_THROWS_AS((void)(-checked_int64(a)), lacuna::coefficient_overflow);
    for (std::int64_t b : edge) {
      INFO("a = ", a, ", b = ", b);
      const cpp_int s = cpp_int(a) + b, d = cpp_int(a) - b, p = cpp_int(a) * b;
      if (fits(s)) CHECK(cpp_int((checked_int64(a) + checked_int64(b)).v) == s);
      else CHECK_THROWS_AS((void)(checked_int64(a) + checked_int64(b)), lacuna::coefficient_overflow);
      if (fits(d)) CHECK(cpp_int((checked_int64(a) - checked_int64(b)).v) == d);
      else CHECK_THROWS_AS((void)(checked_int64(a) - checked_int64(b)), lacuna::coefficient_overflow);
      if (fits(p)) CHECK(cpp_int((checked_int64(a) * checked_int64(b)).v) == p);
      else CHECK_THROWS_AS((void)(checked_int64(a) * checked_int64(b)), lacuna::coefficient_overflow);
      // lacuna::integer never wraps: the exact value, whatever the size.
      CHECK(to_cpp(integer(a) + integer(b)) == s);
      CHECK(to_cpp(integer(a) - integer(b)) == d);
      CHECK(to_cpp(integer(a) * integer(b)) == p);
      if (b != 0) {
        CHECK(to_cpp(integer(a) / integer(b)) == cpp_int(a) / b);  // truncating, as cpp_int
        CHECK(to_cpp(integer(a) % integer(b)) == cpp_int(a) % b);
      }
    }
  }
  CHECK(to_cpp(-integer(i64min)) == cpp_int(1) << 63);
  CHECK(to_cpp(abs(integer(i64min))) == cpp_int(1) << 63);
}

TEST_CASE("mod_p_dynamic's unbound integers: sums, differences and products past int64 throw") {
  using lacuna::mod_p_dynamic;
  CHECK_THROWS_AS(mod_p_dynamic(i64max) + mod_p_dynamic(1), std::overflow_error);
  CHECK_THROWS_AS(mod_p_dynamic(i64min) - mod_p_dynamic(1), std::overflow_error);
  CHECK_THROWS_AS(mod_p_dynamic(i64min) * mod_p_dynamic(-1), std::overflow_error);
  CHECK_THROWS_AS(-mod_p_dynamic(i64min), std::overflow_error);
  CHECK((mod_p_dynamic(i64max) + mod_p_dynamic(-1)).unbound_value() == i64max - 1);
  // Bound, the same values reduce instead: (2^63 - 1) + 1 = 2^63 = 2 (mod 3), by hand
  // (2^63 = 2 · 4^31 = 2 mod 3).
  CHECK((mod_p_dynamic(i64max, 3) + mod_p_dynamic(1)).value() == 2);
}

TEST_CASE("the cellular product of incidences INT64_MIN: exact, or refused, never wrapped") {
  // M = M(Z/2^63, 1): one vertex, a loop q, a 2-cell with ∂ = INT64_MIN q. In M × M the
  // cell q × r has the coefficient (-1)^1 · INT64_MIN = 2^63 on q × q, which does not fit.
  cell_list m;
  m.add_cell(0, "p");
  m.add_cell(1, "q", {{0, 1}, {0, -1}});
  m.add_cell(2, "r", {{0, i64min}});
  try {
    const auto pr = lacuna::product(m, m);
    // Künneth (Hatcher 2002, Theorem 3B.6), with H(M) = Z, Z/2^63, 0:
    // H(M × M) = Z, (Z/2^63)^2, Z/2^63 (tensor), Z/2^63 (Tor), 0.
    const std::string t = (cpp_int(1) << 63).str();
    const std::vector<group> want{{1, {}}, {0, {t, t}}, {0, {t}}, {0, {t}}, {0, {}}};
    CHECK(engine_variants<integer>(pr) == want);
    CHECK(flint_homology(pr) == want);
  } catch (const lacuna::invalid_complex& e) {
    MESSAGE("product refused: " << std::string(e.what()));
    CHECK(std::string(e.what()).find("overflow") != std::string::npos);
  }
}

}  // namespace reference_adversarial_arithmetic_test

// The rank invariant, on random filtrations of every built-in kind (fixed seeds):
//   * at every value t, the number of classes alive at t equals the Betti numbers of the
//     subcomplex of the cells entering by t, computed by lacuna::homology over the same field
//     (the engine: Smith forms after unit elimination, no filtration order involved);
//   * between values s <= t, the persistent Betti number equals the rank of
//     H_k(K_s) -> H_k(K_t), computed here by dense Gaussian elimination mod p written apart:
//     rank = dim Z_k(K_s) - dim (B_k(K_t) ∩ C_k(K_s)), and
//     dim (B_k(K_t) ∩ C_k(K_s)) = rank d_{k+1}(K_t) - rank of its rows outside K_s
//     (the image of the inclusion is the cycles of K_s modulo the boundaries of K_t that lie
//     in K_s; Edelsbrunner & Harer, "Computational Topology", 2010, §VII.1, from memory).
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <set>
#include <vector>

namespace persistence_rank_invariant_test {

namespace support = persistence_test_support;

/// The rank mod p of a dense integer matrix (rows of equal length), by Gaussian elimination.
inline std::size_t dense_rank(std::vector<std::vector<std::int64_t>> m, std::int64_t p) {
  std::size_t rank = 0;
  const std::size_t cols = m.empty() ? 0 : m[0].size();
  for (auto& row : m)
    for (auto& x : row) x = ((x % p) + p) % p;
  for (std::size_t c = 0; c < cols && rank < m.size(); ++c) {
    std::size_t piv = rank;
    while (piv < m.size() && m[piv][c] == 0) ++piv;
    if (piv == m.size()) continue;
    std::swap(m[piv], m[rank]);
    std::int64_t inv = 1;  // m[rank][c]^(p-2) mod p
    for (std::int64_t e = p - 2, b = m[rank][c]; e > 0; e >>= 1, b = b * b % p)
      if (e & 1) inv = inv * b % p;
    for (auto& x : m[rank]) x = x * inv % p;
    for (std::size_t r = 0; r < m.size(); ++r)
      if (r != rank && m[r][c] != 0) {
        const std::int64_t f = m[r][c];
        for (std::size_t j = 0; j < cols; ++j) m[r][j] = ((m[r][j] - f * m[rank][j]) % p + p) % p;
      }
    ++rank;
  }
  return rank;
}

/// rank of H_k(K_s) -> H_k(K_t) mod p, for s before or at t, by the formula of the file comment.
template <class F, class V>
std::size_t persistent_rank(const F& f, int k, const V& s, const V& t, std::int64_t p) {
  const auto order = lacuna::value_order(f);
  auto in = [&](int d, std::size_t i, const V& x) { return !order(x, lacuna::cell_value(f, d, i)); };
  // d_k restricted to K_s: rows (k-1)-cells of K_s, columns k-cells of K_s
  auto matrix = [&](int d, auto row_ok, auto col_ok) {
    std::vector<std::size_t> rows, cols;
    for (std::size_t i = 0; i < lacuna::cell_count(f, d - 1); ++i)
      if (row_ok(i)) rows.push_back(i);
    for (std::size_t j = 0; j < lacuna::cell_count(f, d); ++j)
      if (col_ok(j)) cols.push_back(j);
    std::vector<std::vector<std::int64_t>> m(rows.size(), std::vector<std::int64_t>(cols.size(), 0));
    for (std::size_t c = 0; c < cols.size(); ++c)
      for (auto&& e : lacuna::boundary(f, d, cols[c])) {
        const auto inc = lacuna::as_incidence(e);
        const auto it = std::lower_bound(rows.begin(), rows.end(), inc.face);
        if (it != rows.end() && *it == inc.face) m[static_cast<std::size_t>(it - rows.begin())][c] += inc.coefficient;
      }
    return m;
  };
  std::size_t cycles = 0;  // dim Z_k(K_s)
  for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) cycles += in(k, i, s);
  if (k >= 1)
    cycles -= dense_rank(matrix(k, [&](std::size_t i) { return in(k - 1, i, s); }, [&](std::size_t j) { return in(k, j, s); }), p);
  if (k + 1 > lacuna::top_dimension(f)) return cycles;
  const auto col_t = [&](std::size_t j) { return in(k + 1, j, t); };
  const std::size_t b_t = dense_rank(matrix(k + 1, [&](std::size_t i) { return in(k, i, t); }, col_t), p);
  const std::size_t outside = dense_rank(matrix(k + 1, [&](std::size_t i) { return in(k, i, t) && !in(k, i, s); }, col_t), p);
  return cycles - (b_t - outside);
}

/// Every value of f, and one before the first.
template <class F>
auto all_values(const F& f) {
  using V = lacuna::filtration_value_t<F>;
  const auto order = lacuna::value_order(f);
  std::vector<V> v;
  for (int k = 0; k <= lacuna::top_dimension(f); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) v.push_back(lacuna::cell_value(f, k, i));
  std::sort(v.begin(), v.end(), order);
  v.erase(std::unique(v.begin(), v.end(), [&](const V& a, const V& b) { return !order(a, b) && !order(b, a); }), v.end());
  return v;
}

/// Betti numbers at every value against the engine, over R.
template <class R, class F>
void check_betti_everywhere(const F& f, const R& unit = lacuna::one<R>()) {
  const auto r = lacuna::persistence<R>(f, {}, {}, unit);
  const auto dims = static_cast<std::size_t>(lacuna::top_dimension(f) + 1);
  for (const auto& t : all_values(f)) {
    const auto expected = support::betti_numbers<R>(support::at_value(f, t).complex, dims, unit);
    CHECK(r.betti_numbers(t) == expected);
  }
}

/// Persistent Betti numbers against the brute-force rank, for a sample of value pairs.
template <class R, class F>
void check_persistent_betti(const F& f, std::int64_t p, std::size_t step) {
  const auto r = lacuna::persistence<R>(f);
  const auto values = all_values(f);
  for (std::size_t a = 0; a < values.size(); a += step)
    for (std::size_t b = a; b < values.size(); b += step)
      for (int k = 0; k <= r.max_dimension(); ++k) {
        CAPTURE(k);
        CHECK(r.persistent_betti_number(k, values[a], values[b]) == persistent_rank(f, k, values[a], values[b], p));
      }
}

TEST_CASE("lower-star filtrations of random simplicial complexes: Z/2") {
  std::mt19937_64 rng(20240601);
  for (int trial = 0; trial < 6; ++trial) {
    const auto c = support::random_complex(rng, 10, 14, 4);
    const auto f = lacuna::lower_star_filtration(c, support::random_values(rng, c.vertex_count(), 6));
    check_betti_everywhere<lacuna::z2>(f);
    check_persistent_betti<lacuna::z2>(f, 2, 1);
  }
}

TEST_CASE("values on cell lists with torsion (Klein bottle, projective plane, lens space): Z/2 and Z/3") {
  std::mt19937_64 rng(31);
  for (const auto& c : {lacuna::cell_list::klein_bottle(), lacuna::cell_list::projective_plane(),
                        lacuna::cell_list::lens_space(3, 1), lacuna::cell_list::torus()}) {
    for (int trial = 0; trial < 4; ++trial) {
      const lacuna::values_filtration<lacuna::cell_list, int> f(c, support::random_monotone_values(rng, c, 3));
      check_betti_everywhere<lacuna::z2>(f);
      check_betti_everywhere<lacuna::mod_p<3>>(f);
      check_persistent_betti<lacuna::mod_p<3>>(f, 3, 1);
    }
  }
}

TEST_CASE("cubical sublevel and superlevel filtrations of random images and a volume") {
  std::mt19937_64 rng(4242);
  for (int trial = 0; trial < 3; ++trial) {
    const std::array<std::size_t, 2> n{5, 4};
    const auto samples = support::random_values(rng, 20, 5);
    const lacuna::cubical_filtration<2, int> up(n, samples);
    const lacuna::cubical_filtration<2, int> down(n, samples, lacuna::level_sets::superlevel);
    check_betti_everywhere<lacuna::z2>(up);
    check_betti_everywhere<lacuna::z2>(down);
    check_betti_everywhere<lacuna::mod_p<3>>(up);
    check_persistent_betti<lacuna::z2>(up, 2, 2);
    check_persistent_betti<lacuna::z2>(down, 2, 2);
  }
  const lacuna::cubical_filtration<3, int> vol({3, 3, 3}, support::random_values(rng, 27, 4));
  check_betti_everywhere<lacuna::z2>(vol);
}

TEST_CASE("Vietoris–Rips filtrations of random points and of a distance matrix") {
  std::mt19937_64 rng(99);
  for (int trial = 0; trial < 3; ++trial) {
    const auto pts = support::random_points(rng, 9, 2, 6);
    const auto f = lacuna::rips_filtration::from_points(pts, {.max_dimension = 3});
    check_betti_everywhere<lacuna::z2>(f);
    check_persistent_betti<lacuna::z2>(f, 2, 3);
    // a random metric: shortest paths of random edge weights (symmetric, zero diagonal)
    const std::size_t n = 8;
    std::vector<double> m(n * n, 0);
    std::uniform_int_distribution<int> w(1, 6);
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = a + 1; b < n; ++b) m[a * n + b] = m[b * n + a] = w(rng);
    for (std::size_t c = 0; c < n; ++c)
      for (std::size_t a = 0; a < n; ++a)
        for (std::size_t b = 0; b < n; ++b) m[a * n + b] = std::min(m[a * n + b], m[a * n + c] + m[c * n + b]);
    const auto g = lacuna::rips_filtration::from_distances(n, m, {.max_dimension = 3, .threshold = 4.0});
    check_betti_everywhere<lacuna::z2>(g);
  }
}

}  // namespace persistence_rank_invariant_test

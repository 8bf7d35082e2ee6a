// circle_rips_theorem.hpp — the Vietoris–Rips barcodes of a regular n-gon derived from
// Adamaszek's theorem (the derivation and its source are in circle_rips.cpp), shared by the
// tests of the explicit and of the implicit Vietoris–Rips routes.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <numbers>
#include <optional>
#include <utility>
#include <vector>

namespace persistence_circle_theorem {

using bar = std::pair<double, std::optional<double>>;

struct expectation {
  std::vector<std::vector<bar>> bars;  // per dimension, sorted
  int top = 0;                         // the highest dimension with a bar
  std::vector<std::pair<int, int>> odd_runs;  // (a, b): levels a..b share one odd sphere
};

/// The chords d_0 = 0, d_1, ..., d_{n/2}.
inline std::vector<double> chords(int n) {
  std::vector<double> d{0.0};
  for (int j = 1; j <= n / 2; ++j) d.push_back(2 * std::sin(std::numbers::pi * j / n));
  return d;
}

/// The homotopy type of Cl(C_n^k) by the theorem: (dimension, rank) of its reduced homology,
/// rank 0 when contractible.
inline std::pair<int, int> sphere_type(int n, int k) {
  if (2 * k >= n) return {0, 0};  // the complete graph: a simplex
  for (int l = 0;; ++l) {
    if (static_cast<long>(k) * (2 * l + 1) == static_cast<long>(l) * n) return {2 * l, n - 2 * k - 1};
    // l/(2l+1) < k/n < (l+1)/(2l+3)
    if (static_cast<long>(l) * n < static_cast<long>(k) * (2 * l + 1) &&
        static_cast<long>(k) * (2 * l + 3) < static_cast<long>(l + 1) * n)
      return {2 * l + 1, 1};
  }
}

inline expectation expected_bars(int n) {
  const auto d = chords(n);
  const int levels = n / 2;  // k = 0..levels; the complex is complete from k = levels on
  expectation e;
  auto add = [&](int dim, bar b) {
    if (static_cast<int>(e.bars.size()) <= dim) e.bars.resize(static_cast<std::size_t>(dim) + 1);
    e.bars[static_cast<std::size_t>(dim)].push_back(b);
    e.top = std::max(e.top, dim);
  };
  add(0, {0.0, std::nullopt});
  for (int i = 0; i + 1 < n; ++i) add(0, {0.0, d[1]});  // level 0: n points, the wedge of n-1 S^0
  for (int k = 1; k < levels; ++k) {
    const auto [dim, rank] = sphere_type(n, k);
    if (rank == 0) continue;
    if (dim % 2 == 0) {
      for (int i = 0; i < rank; ++i) add(dim, {d[static_cast<std::size_t>(k)], d[static_cast<std::size_t>(k + 1)]});
      continue;
    }
    int b = k;
    while (b + 1 < levels && sphere_type(n, b + 1) == std::pair<int, int>{dim, 1}) ++b;
    add(dim, {d[static_cast<std::size_t>(k)], d[static_cast<std::size_t>(b + 1)]});
    if (b > k) e.odd_runs.emplace_back(k, b);
    k = b;
  }
  for (auto& v : e.bars) std::sort(v.begin(), v.end());
  return e;
}

/// The n-gon's distance matrix with one double per chord.
inline std::vector<double> polygon_distances(int n) {
  const auto d = chords(n);
  std::vector<double> m(static_cast<std::size_t>(n * n));
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      const int j = std::min(std::abs(a - b), n - std::abs(a - b));
      m[static_cast<std::size_t>(a * n + b)] = d[static_cast<std::size_t>(j)];
    }
  return m;
}

}  // namespace persistence_circle_theorem

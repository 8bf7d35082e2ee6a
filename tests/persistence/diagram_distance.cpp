// Tests of lacuna/persistence/diagram_distance.hpp: the bottleneck and p-Wasserstein distances
// against
//   * small cases worked out by hand (each written out beside it);
//   * brute force over every matching of small random diagrams (written here, apart from the
//     library: every partial injection of the finite points, essential points only to essential
//     points of the same sign), fixed seeds;
//   * the stability theorem (Cohen-Steiner, Edelsbrunner & Harer 2007): the bottleneck distance
//     between the 0-dimensional sublevel diagrams of two functions on a path is at most the
//     largest difference of the functions (diagrams computed here by union-find, the elder rule);
//   * metric properties and bottleneck <= W_p <= N^(1/p) * bottleneck (N points in all).
// The matchings returned are checked as witnesses: a valid matching whose cost, recomputed
// here, is the distance returned.
#include <doctest/doctest.h>

#include <lacuna/persistence/diagram_distance.hpp>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <functional>
#include <limits>
#include <numeric>
#include <random>
#include <stdexcept>
#include <utility>
#include <vector>

namespace diagram_distance_test {

using diagram = std::vector<std::pair<double, double>>;
inline constexpr double inf = std::numeric_limits<double>::infinity();

/// The cost of matching x with y, or of x with the diagonal (y == nullptr); +inf if not allowed.
inline double cost(const std::pair<double, double>& x, const std::pair<double, double>* y) {
  const bool ex = !std::isfinite(x.second);
  if (!y) return ex ? inf : std::abs(x.second - x.first) / 2;
  const bool ey = !std::isfinite(y->second);
  if (ex != ey) return inf;
  if (ex) return x.second == y->second ? std::abs(x.first - y->first) : inf;
  return std::max(std::abs(x.first - y->first), std::abs(x.second - y->second));
}

/// Every matching of a and b (partial injections; the rest of both to the diagonal): the least
/// largest cost (p = 0) or the least sum of cost^p.
inline double brute_force(const diagram& a, const diagram& b, double p) {
  std::vector<char> used(b.size(), 0);
  double best = inf;
  std::vector<double> costs;
  std::function<void(std::size_t)> go = [&](std::size_t i) {
    if (i == a.size()) {
      std::vector<double> all = costs;
      for (std::size_t j = 0; j < b.size(); ++j)
        if (!used[j]) all.push_back(cost(b[j], nullptr));
      double v = 0;
      for (double c : all) v = p == 0 ? std::max(v, c) : v + std::pow(c, p);
      best = std::min(best, v);
      return;
    }
    costs.push_back(cost(a[i], nullptr));
    go(i + 1);
    costs.pop_back();
    for (std::size_t j = 0; j < b.size(); ++j) {
      if (used[j]) continue;
      used[j] = 1;
      costs.push_back(cost(a[i], &b[j]));
      go(i + 1);
      costs.pop_back();
      used[j] = 0;
    }
  };
  go(0);
  return p == 0 ? best : std::pow(best, 1 / p);
}

/// Checks that m is a matching of a and b and returns its cost, recomputed (p = 0: bottleneck).
inline double witness_cost(const diagram& a, const diagram& b, const lacuna::diagram_matching& m, double p) {
  constexpr auto diag = lacuna::diagram_matching::diagonal;
  REQUIRE(m.partner_of_a.size() == a.size());
  REQUIRE(m.partner_of_b.size() == b.size());
  std::vector<double> all;
  for (std::size_t i = 0; i < a.size(); ++i) {
    const auto j = m.partner_of_a[i];
    if (j == diag) {
      all.push_back(cost(a[i], nullptr));
    } else {
      REQUIRE(j < b.size());
      CHECK(m.partner_of_b[j] == i);
      all.push_back(cost(a[i], &b[j]));
    }
  }
  for (std::size_t j = 0; j < b.size(); ++j) {
    const auto i = m.partner_of_b[j];
    if (i == diag)
      all.push_back(cost(b[j], nullptr));
    else
      CHECK(m.partner_of_a[i] == j);
  }
  double v = 0;
  for (double c : all) v = p == 0 ? std::max(v, c) : v + std::pow(c, p);
  return p == 0 ? v : std::pow(v, 1 / p);
}

inline bool close(double x, double y) {
  if (x == y) return true;
  return std::abs(x - y) <= 1e-12 * std::max(std::abs(x), std::abs(y));
}

inline diagram random_diagram(std::mt19937_64& rng, std::size_t max_points, bool grid, int essential) {
  std::uniform_int_distribution<std::size_t> count(0, max_points);
  std::uniform_int_distribution<int> small(-3, 3);
  std::uniform_real_distribution<double> real(-2, 2);
  diagram d;
  const std::size_t n = count(rng);
  for (std::size_t k = 0; k < n; ++k) {
    double b = grid ? small(rng) : real(rng);
    double e = grid ? small(rng) : real(rng);
    if (b > e) std::swap(b, e);
    d.emplace_back(b, e);
  }
  for (int k = 0; k < essential; ++k) d.emplace_back(grid ? small(rng) : real(rng), inf);
  std::shuffle(d.begin(), d.end(), rng);
  return d;
}

/// The 0-dimensional sublevel diagram of f on the path 0 - 1 - ... - n-1 (vertex i enters at
/// f[i], edge {i, i+1} at max(f[i], f[i+1])), by union-find and the elder rule: when two
/// components meet, the younger one (the larger minimum) dies.
inline diagram path_diagram(const std::vector<double>& f) {
  const std::size_t n = f.size();
  std::vector<std::size_t> parent(n), order(n - 1);
  std::iota(parent.begin(), parent.end(), 0);
  std::vector<double> birth = f;  // the minimum of each root's component
  const std::function<std::size_t(std::size_t)> find = [&](std::size_t x) {
    return parent[x] == x ? x : parent[x] = find(parent[x]);
  };
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t x, std::size_t y) { return std::max(f[x], f[x + 1]) < std::max(f[y], f[y + 1]); });
  diagram d;
  for (const auto e : order) {
    auto r = find(e), s = find(e + 1);
    const double t = std::max(f[e], f[e + 1]);
    if (birth[r] > birth[s]) std::swap(r, s);  // r is the elder
    if (birth[s] < t) d.emplace_back(birth[s], t);
    parent[s] = r;
  }
  d.emplace_back(*std::min_element(f.begin(), f.end()), inf);
  return d;
}

}  // namespace diagram_distance_test

TEST_CASE("diagram distances: small cases by hand") {
  using namespace diagram_distance_test;
  using lacuna::bottleneck_distance;
  using lacuna::wasserstein_distance;
  const diagram empty;
  // one point against nothing: its distance to the diagonal, (2 - 0) / 2 = 1
  CHECK(bottleneck_distance(diagram{{0, 2}}, empty) == 1);
  CHECK(wasserstein_distance(diagram{{0, 2}}, empty, {.p = 1}) == 1);
  CHECK(wasserstein_distance(diagram{{0, 2}}, empty, {.p = 3}) == 1);
  CHECK(bottleneck_distance(empty, empty) == 0);
  CHECK(wasserstein_distance(empty, empty) == 0);
  // (0, 4) against (1, 4): matched, max(|0 - 1|, |4 - 4|) = 1; both to the diagonal: max(2, 1.5)
  CHECK(bottleneck_distance(diagram{{0, 4}}, diagram{{1, 4}}) == 1);
  CHECK(wasserstein_distance(diagram{{0, 4}}, diagram{{1, 4}}) == 1);
  // (0, 1), (0, 10) against (0, 10): the long bars match at 0, the short one to the diagonal, 0.5
  CHECK(bottleneck_distance(diagram{{0, 1}, {0, 10}}, diagram{{0, 10}}) == 0.5);
  CHECK(wasserstein_distance(diagram{{0, 1}, {0, 10}}, diagram{{0, 10}}, {.p = 1}) == 0.5);
  // (0, 2) against (3, 5): matched costs 3; both to the diagonal cost 1 and 1: bottleneck 1,
  // W_1 = 2, W_2 = sqrt(2)
  CHECK(bottleneck_distance(diagram{{0, 2}}, diagram{{3, 5}}) == 1);
  CHECK(wasserstein_distance(diagram{{0, 2}}, diagram{{3, 5}}, {.p = 1}) == 2);
  CHECK(close(wasserstein_distance(diagram{{0, 2}}, diagram{{3, 5}}), std::sqrt(2.0)));
  // two crossing choices: a = (0, 6), (2, 8); b = (2, 6), (0, 8). Straight: max(2, 2) = 2 each;
  // crossed: (0,6)-(0,8) costs 2, (2,8)-(2,6) costs 2. Bottleneck 2, W_1 = 4.
  CHECK(bottleneck_distance(diagram{{0, 6}, {2, 8}}, diagram{{2, 6}, {0, 8}}) == 2);
  CHECK(wasserstein_distance(diagram{{0, 6}, {2, 8}}, diagram{{2, 6}, {0, 8}}, {.p = 1}) == 4);
  // essential classes: births 0 and 3 at +inf cost 3; (1, 2) to the diagonal 0.5
  CHECK(bottleneck_distance(diagram{{0, inf}, {1, 2}}, diagram{{3, inf}}) == 3);
  CHECK(wasserstein_distance(diagram{{0, inf}, {1, 2}}, diagram{{3, inf}}, {.p = 1}) == 3.5);
  CHECK(close(wasserstein_distance(diagram{{0, inf}, {1, 2}}, diagram{{3, inf}}), std::sqrt(9.25)));
  // essential points are matched in order of birth: {0, 10} against {1, 11} costs 1, not 11
  CHECK(bottleneck_distance(diagram{{10, inf}, {0, inf}}, diagram{{1, inf}, {11, inf}}) == 1);
  // different numbers of essential classes: infinitely far apart
  CHECK(bottleneck_distance(diagram{{0, inf}}, empty) == inf);
  CHECK(wasserstein_distance(diagram{{0, inf}}, diagram{{0, inf}, {0, inf}}) == inf);
  CHECK(bottleneck_distance(diagram{{0, inf}}, diagram{{0, -inf}}) == inf);  // +inf and -inf deaths
  // superlevel diagrams (birth above death) work the same way: (5, 1) is 2 from the diagonal
  CHECK(bottleneck_distance(diagram{{5, 1}}, empty) == 2);
  CHECK(bottleneck_distance(diagram{{5, -inf}, {5, 1}}, diagram{{4, -inf}}) == 2);
}

TEST_CASE("diagram distances: huge values, and bad input") {
  using namespace diagram_distance_test;
  // the distance of (-1e308, 1e308) to the diagonal is 1e308, though 1e308 - (-1e308) overflows
  CHECK(lacuna::bottleneck_distance(diagram{{-1e308, 1e308}}, diagram{}) == 1e308);
  CHECK(lacuna::wasserstein_distance(diagram{{-1e308, 1e308}}, diagram{{-1e308, 1e308}}) == 0);
  CHECK(close(lacuna::wasserstein_distance(diagram{{-1e308, 1e308}}, diagram{}, {.p = 2}), 1e308));
  // two points whose difference overflows: each goes to the diagonal instead, at cost 0
  CHECK(lacuna::bottleneck_distance(diagram{{1e308, 1e308}}, diagram{{-1e308, -1e308}}) == 0);
  CHECK(lacuna::wasserstein_distance(diagram{{1e308, 1e308}}, diagram{{-1e308, -1e308}}) == 0);
  // tiny values: scaled, not lost
  CHECK(close(lacuna::wasserstein_distance(diagram{{0, 4e-320}}, diagram{}, {.p = 2}), 2e-320));
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_AS(lacuna::bottleneck_distance(diagram{{nan, 1}}, diagram{}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::bottleneck_distance(diagram{}, diagram{{0, nan}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::wasserstein_distance(diagram{{inf, inf}}, diagram{}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::wasserstein_distance(diagram{}, diagram{}, {.p = 0.5}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::wasserstein_distance(diagram{}, diagram{}, {.p = nan}), std::invalid_argument);
}

TEST_CASE("diagram distances: brute force over every matching, random small diagrams") {
  using namespace diagram_distance_test;
  std::mt19937_64 rng(1302);  // fixed seed
  for (int round = 0; round < 400; ++round) {
    const bool grid = round % 2 == 0;  // integer grids give many ties
    const int essential = round % 5 == 0 ? 1 : (round % 7 == 0 ? 2 : 0);
    const auto a = random_diagram(rng, 5, grid, essential);
    const auto b = random_diagram(rng, 4, grid, round % 11 == 0 ? essential + 1 : essential);
    CAPTURE(round);
    const auto mb = lacuna::bottleneck_matching(a, b);
    CHECK(mb.cost == brute_force(a, b, 0));  // exact: the same doubles, the same minimum
    CHECK(witness_cost(a, b, mb, 0) == mb.cost);
    for (const double p : {1.0, 2.0, 3.5}) {
      CAPTURE(p);
      const auto mw = lacuna::wasserstein_matching(a, b, {.p = p});
      CHECK(close(mw.cost, brute_force(a, b, p)));
      CHECK(close(witness_cost(a, b, mw, p), mw.cost));
    }
  }
}

TEST_CASE("diagram distances: the stability theorem on functions on a path") {
  using namespace diagram_distance_test;
  std::mt19937_64 rng(2007);  // fixed seed
  std::uniform_real_distribution<double> value(0, 10);
  for (int round = 0; round < 60; ++round) {
    std::uniform_int_distribution<std::size_t> length(2, 40);
    std::vector<double> f(length(rng));
    for (auto& x : f) x = value(rng);
    const double eps = round % 3 == 0 ? 0.01 : (round % 3 == 1 ? 0.5 : 3);
    std::uniform_real_distribution<double> noise(-eps, eps);
    std::vector<double> g = f;
    double sup = 0;
    for (auto& x : g) {
      x += noise(rng);
    }
    for (std::size_t i = 0; i < f.size(); ++i) sup = std::max(sup, std::abs(f[i] - g[i]));
    const auto df = path_diagram(f), dg = path_diagram(g);
    CAPTURE(round);
    // Cohen-Steiner, Edelsbrunner & Harer (2007): d_B(Dgm f, Dgm g) <= ||f - g||_inf
    CHECK(lacuna::bottleneck_distance(df, dg) <= sup);
    // the same diagram: distance 0
    CHECK(lacuna::bottleneck_distance(df, df) == 0);
    CHECK(lacuna::wasserstein_distance(df, df, {.p = 1}) == 0);
  }
}

TEST_CASE("diagram distances: metric properties and bottleneck <= W_p <= N^(1/p) bottleneck, larger diagrams") {
  using namespace diagram_distance_test;
  std::mt19937_64 rng(42);  // fixed seed
  for (int round = 0; round < 12; ++round) {
    const bool grid = round % 2 == 0;
    const auto a = random_diagram(rng, 40, grid, 1);
    const auto b = random_diagram(rng, 40, grid, 1);
    const auto c = random_diagram(rng, 40, grid, 1);
    CAPTURE(round);
    const double ab = lacuna::bottleneck_distance(a, b), ba = lacuna::bottleneck_distance(b, a);
    CHECK(ab == ba);
    CHECK(lacuna::bottleneck_distance(a, c) <= ab + lacuna::bottleneck_distance(b, c));
    for (const double p : {1.0, 2.0}) {
      const double w = lacuna::wasserstein_distance(a, b, {.p = p});
      CHECK(close(w, lacuna::wasserstein_distance(b, a, {.p = p})));
      CHECK(lacuna::wasserstein_distance(a, c, {.p = p}) <=
            (w + lacuna::wasserstein_distance(b, c, {.p = p})) * (1 + 1e-12));
      const double points = static_cast<double>(a.size() + b.size());
      CHECK(ab <= w * (1 + 1e-12));
      CHECK(w <= std::pow(points, 1 / p) * ab * (1 + 1e-12));
    }
    // W_p decreases as p grows
    CHECK(lacuna::wasserstein_distance(a, b, {.p = 3}) <= lacuna::wasserstein_distance(a, b, {.p = 1.5}) * (1 + 1e-12));
    // the witnesses
    const auto mb = lacuna::bottleneck_matching(a, b);
    CHECK(witness_cost(a, b, mb, 0) == mb.cost);
    const auto mw = lacuna::wasserstein_matching(a, b, {.p = 2});
    CHECK(close(witness_cost(a, b, mw, 2), mw.cost));
  }
}

TEST_CASE("diagram distances: the example of docs/persistence-io.md") {
  using namespace diagram_distance_test;
  const diagram a = {{0, 1}, {0, inf}}, b = {{0, 1.5}, {0.5, inf}};
  // by hand: the classes that never die differ by 0.5 in birth; (0, 1) against (0, 1.5) costs
  // 0.5, against the diagonal 0.5 and 0.75
  CHECK(lacuna::bottleneck_distance(a, b) == 0.5);
  CHECK(lacuna::wasserstein_distance(a, b, {.p = 1}) == 1);
  const auto m = lacuna::bottleneck_matching(a, b);
  CHECK(m.partner_of_a == std::vector<std::size_t>{0, 1});
}

// H_0 of a Vietoris–Rips filtration is single-linkage clustering: the deaths of the finite
// classes are the merge heights, i.e. the edge lengths of a minimum spanning tree (Gower &
// Ross 1969, single-linkage clustering and the minimum spanning tree; from memory), and the
// essential classes are the connected components of the graph of edges no longer than the
// threshold. The tree is computed here by Kruskal's algorithm with a union-find written in
// the test. With points in general position the tree is unique, so the edges that kill the
// classes must be its edges.
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <numeric>
#include <random>
#include <tuple>
#include <vector>

namespace persistence_single_linkage_test {

struct union_find {
  std::vector<std::size_t> parent;
  explicit union_find(std::size_t n) : parent(n) { std::iota(parent.begin(), parent.end(), std::size_t{0}); }
  std::size_t find(std::size_t x) {
    while (parent[x] != x) x = parent[x] = parent[parent[x]];
    return x;
  }
  bool unite(std::size_t a, std::size_t b) {
    a = find(a);
    b = find(b);
    if (a == b) return false;
    parent[a] = b;
    return true;
  }
};

struct forest {
  std::vector<std::tuple<double, std::size_t, std::size_t>> edges;  // length, a < b
  std::size_t components = 0;
};

/// Kruskal's minimum spanning forest of the edges no longer than `threshold`.
inline forest kruskal(const std::vector<double>& m, std::size_t n, double threshold) {
  std::vector<std::tuple<double, std::size_t, std::size_t>> all;
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = a + 1; b < n; ++b)
      if (m[a * n + b] <= threshold) all.emplace_back(m[a * n + b], a, b);
  std::sort(all.begin(), all.end());
  union_find uf(n);
  forest f;
  f.components = n;
  for (const auto& e : all)
    if (uf.unite(std::get<1>(e), std::get<2>(e))) {
      f.edges.push_back(e);
      --f.components;
    }
  return f;
}

TEST_CASE("H_0 deaths are the edge lengths of Kruskal's spanning tree, killed by its edges") {
  std::mt19937_64 rng(2718);
  std::uniform_real_distribution<double> u(0, 10);
  for (int trial = 0; trial < 8; ++trial) {
    const std::size_t n = 20 + 7 * static_cast<std::size_t>(trial);
    std::vector<double> coords(2 * n);
    for (auto& x : coords) x = u(rng);
    std::vector<double> m(n * n);
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < n; ++b)
        m[a * n + b] = lacuna::euclidean_distance(std::span<const double>(coords).subspan(2 * a, 2),
                                                  std::span<const double>(coords).subspan(2 * b, 2));
    for (const double threshold : {100.0, 2.0, 1.2}) {
      CAPTURE(threshold);
      const auto tree = kruskal(m, n, threshold);
      const auto f = lacuna::rips_filtration::from_points(coords, 2, {.max_dimension = 1, .threshold = threshold});
      const auto r = lacuna::persistence(f, {.max_dimension = 0});
      std::vector<double> deaths, lengths;
      std::vector<std::pair<std::size_t, std::size_t>> killers, tree_edges;
      std::size_t essential = 0;
      for (const auto& p : r[0].pairs) {
        CHECK(p.birth == 0.0);
        if (p.essential()) {
          ++essential;
          continue;
        }
        deaths.push_back(*p.death);
        const auto e = f.vertices(1, p.death_cell);
        killers.emplace_back(e[0], e[1]);
      }
      for (const auto& [len, a, b] : tree.edges) lengths.push_back(len), tree_edges.emplace_back(a, b);
      std::sort(deaths.begin(), deaths.end());
      std::sort(killers.begin(), killers.end());
      std::sort(tree_edges.begin(), tree_edges.end());
      CHECK(deaths == lengths);
      CHECK(killers == tree_edges);
      CHECK(essential == tree.components);
    }
  }
}

TEST_CASE("equal distances: the merge heights still match (a grid of points)") {
  // a 4 x 5 grid with spacing 1 and one far point: every tree has 19 edges of length 1, and
  // the far point joins at its distance to the nearest grid point
  std::vector<double> coords;
  for (int y = 0; y < 5; ++y)
    for (int x = 0; x < 4; ++x) coords.insert(coords.end(), {double(x), double(y)});
  coords.insert(coords.end(), {9.0, 2.0});
  const std::size_t n = coords.size() / 2;
  std::vector<double> m(n * n);
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b < n; ++b)
      m[a * n + b] = lacuna::euclidean_distance(std::span<const double>(coords).subspan(2 * a, 2),
                                                std::span<const double>(coords).subspan(2 * b, 2));
  const auto tree = kruskal(m, n, 100);
  const auto f = lacuna::rips_filtration::from_distances(n, m, {.max_dimension = 1});
  const auto r = lacuna::persistence(f, {.max_dimension = 0});
  std::vector<double> deaths, lengths;
  for (const auto& p : r[0].pairs)
    if (!p.essential()) deaths.push_back(*p.death);
  for (const auto& e : tree.edges) lengths.push_back(std::get<0>(e));
  std::sort(deaths.begin(), deaths.end());
  CHECK(deaths == lengths);
  CHECK(deaths.back() == 6.0);
  CHECK(r[0].essential_count() == 1);
}

}  // namespace persistence_single_linkage_test

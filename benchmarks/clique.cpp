// Clique complexes of graphs: the complex built in full and reduced by homology(), against
// clique_homology (lacuna/homology/clique_homology.hpp), which removes dominated vertices
// from the graph and builds only the core's clique complex. docs/performance.md records the
// figures.
//
// Graphs (fixed seeds, so every run sees the same data):
//   random:  G(n, p), each pair an edge with probability p (few dominated vertices);
//   torus:   the Vietoris–Rips graph of n points uniform in angle on the torus of radii 2 and
//            1 in R^3, joined closer than eps = 0.45 sqrt(4000 / n) (about 30 neighbours
//            each, whatever n; many dominated vertices; the space is a torus, H = Z, Z^2, Z).
// All complexes are cut at dimension 3, as in the target; H_3 of the cut complex is
// the group of 3-cycles.
// Variant: 0 homology(clique_complex(...)) with the default reduction; 1 clique_homology
// without removal; 2 clique_homology with dominated vertices removed (the default); 3
// clique_homology with dominated edges, then vertices, removed.
// Counters: b0..b3, cells (simplices of the whole cut complex), core_cells (what was built),
// peak_MB and bytes_per_cell (the rise of the resident high-water mark, one iteration).
#include "bench_support.hpp"

#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/homology/clique_homology.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>

#include <benchmark/benchmark.h>

#include <cmath>
#include <cstdint>
#include <random>
#include <string>
#include <utility>
#include <vector>

namespace {

struct graph {
  std::vector<std::uint32_t> vertices;
  std::vector<std::pair<std::uint32_t, std::uint32_t>> edges;
};

graph random_graph(std::uint32_t n, double p) {
  std::mt19937_64 rng(20261202);
  std::bernoulli_distribution edge(p);
  graph g;
  for (std::uint32_t i = 0; i < n; ++i) g.vertices.push_back(i);
  for (std::uint32_t i = 0; i < n; ++i)
    for (std::uint32_t j = i + 1; j < n; ++j)
      if (edge(rng)) g.edges.emplace_back(i, j);
  return g;
}

graph torus_graph(std::uint32_t n) {
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> angle(0.0, 2.0 * 3.14159265358979323846), unit(0.0, 1.0);
  struct point {
    double x, y, z;
  };
  std::vector<point> p;
  while (p.size() < n) {
    const double a = angle(rng), b = angle(rng);
    // Uniform on the surface: the area element is (2 + cos b) da db, at most 3 da db.
    if (3.0 * unit(rng) > 2.0 + std::cos(b)) continue;
    p.push_back({(2.0 + std::cos(b)) * std::cos(a), (2.0 + std::cos(b)) * std::sin(a), std::sin(b)});
  }
  const double eps = 0.6 * std::sqrt(4000.0 / static_cast<double>(n));
  // A grid of cells of side eps: only neighbouring cells are compared.
  const auto cell = [&](double v) { return static_cast<long>(std::floor((v + 3.0) / eps)); };
  const long m = cell(3.0) + 1;
  std::vector<std::vector<std::uint32_t>> bucket(static_cast<std::size_t>(m * m * m));
  const auto at = [&](long i, long j, long k) -> std::vector<std::uint32_t>& {
    return bucket[static_cast<std::size_t>((i * m + j) * m + k)];
  };
  for (std::uint32_t i = 0; i < n; ++i) at(cell(p[i].x), cell(p[i].y), cell(p[i].z)).push_back(i);
  graph g;
  for (std::uint32_t i = 0; i < n; ++i) g.vertices.push_back(i);
  for (std::uint32_t i = 0; i < n; ++i) {
    const long ci = cell(p[i].x), cj = cell(p[i].y), ck = cell(p[i].z);
    for (long a = ci - 1; a <= ci + 1; ++a)
      for (long b = cj - 1; b <= cj + 1; ++b)
        for (long c = ck - 1; c <= ck + 1; ++c) {
          if (a < 0 || b < 0 || c < 0 || a >= m || b >= m || c >= m) continue;
          for (const std::uint32_t j : at(a, b, c)) {
            if (j <= i) continue;
            const double dx = p[i].x - p[j].x, dy = p[i].y - p[j].y, dz = p[i].z - p[j].z;
            if (dx * dx + dy * dy + dz * dz < eps * eps) g.edges.emplace_back(i, j);
          }
        }
  }
  return g;
}

template <class Groups>
void betti_counters(benchmark::State& state, const Groups& groups) {
  for (std::size_t k = 0; k < groups.size() && k < 4; ++k)
    state.counters["b" + std::to_string(k)] = static_cast<double>(groups[k].rank);
}

void run(benchmark::State& state, const graph& g, std::int64_t variant) {
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    double cells = 0, core_cells = 0;
    if (variant == 0) {
      const auto c = lacuna::clique_complex(g.vertices, g.edges, 3);
      const auto h = lacuna::homology<lacuna::integer>(c, {.threads = 2});
      cells = core_cells = static_cast<double>(lacuna::total_cell_count(c));
      betti_counters(state, h.groups);
      benchmark::DoNotOptimize(h);
    } else {
      lacuna::clique_homology_options o;
      o.homology.threads = 2;
      o.reduction = variant == 1   ? lacuna::clique_reduction::none
                    : variant == 2 ? lacuna::clique_reduction::dominated_vertices
                                   : lacuna::clique_reduction::dominated_edges;
      const auto h = lacuna::clique_homology<lacuna::integer>(g.vertices, g.edges, 3, o);
      for (const auto n : h.cell_counts) cells += static_cast<double>(n);
      core_cells = static_cast<double>(lacuna::total_cell_count(h.core));
      betti_counters(state, h.groups);
      benchmark::DoNotOptimize(h);
    }
    lacuna_bench::report_peak(state, before, cells);
    state.counters["core_cells"] = core_cells;
  }
}

// G(n, p): args n, 1000 p, variant.
void BM_clique_random(benchmark::State& state) {
  const auto g = random_graph(static_cast<std::uint32_t>(state.range(0)), static_cast<double>(state.range(1)) / 1000.0);
  run(state, g, state.range(2));
}

// The torus's Vietoris–Rips graph: args n, variant.
void BM_clique_torus(benchmark::State& state) {
  const auto g = torus_graph(static_cast<std::uint32_t>(state.range(0)));
  state.counters["edges"] = static_cast<double>(g.edges.size());
  run(state, g, state.range(1));
}

}  // namespace

BENCHMARK(BM_clique_random)
    ->ArgsProduct({{2000}, {20}, {0, 1, 2, 3}})
    ->ArgNames({"n", "p1000", "variant"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_clique_torus)
    ->ArgsProduct({{4000}, {0, 1, 2, 3}})
    ->Args({16000, 3})
    ->Args({64000, 3})
    ->ArgNames({"n", "variant"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);

BENCHMARK_MAIN();

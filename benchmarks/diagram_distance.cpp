// Diagram distances (lacuna/persistence/diagram_distance.hpp) on random diagrams of n finite
// points each (births and deaths uniform in [0, 1), birth <= death; fixed seeds): the exact
// bottleneck distance (sorted candidate costs, binary search, Hopcroft-Karp) and the
// 2-Wasserstein distance (Hungarian method), to show how they grow with n.
#include <lacuna/persistence/diagram_distance.hpp>

#include <benchmark/benchmark.h>

#include <algorithm>
#include <random>
#include <utility>
#include <vector>

namespace {

std::vector<std::pair<double, double>> random_diagram(std::size_t n, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0, 1);
  std::vector<std::pair<double, double>> d;
  for (std::size_t i = 0; i < n; ++i) {
    double b = u(rng), e = u(rng);
    if (b > e) std::swap(b, e);
    d.emplace_back(b, e);
  }
  return d;
}

void bottleneck(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  const auto a = random_diagram(n, 1), b = random_diagram(n, 2);
  for (auto _ : state) benchmark::DoNotOptimize(lacuna::bottleneck_distance(a, b));
}
BENCHMARK(bottleneck)->Arg(50)->Arg(100)->Arg(200)->Arg(400)->Arg(800)->Unit(benchmark::kMillisecond);

void wasserstein(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  const auto a = random_diagram(n, 1), b = random_diagram(n, 2);
  for (auto _ : state) benchmark::DoNotOptimize(lacuna::wasserstein_distance(a, b, {.p = 2}));
}
BENCHMARK(wasserstein)->Arg(50)->Arg(100)->Arg(200)->Arg(400)->Arg(800)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();

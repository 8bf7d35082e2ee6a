// Vietoris–Rips persistence at scale (issue 17): the implicit route
// (lacuna/persistence/implicit_rips.hpp) against the explicit one (rips_filtration +
// lacuna::persistence) where the explicit one fits in memory.
//   * random points, uniform in the unit cube of R^3 (std::mt19937_64, seed 17):
//     BM_rips_implicit_cube/N/D/T is N points, H_0..H_D, T threads (n = 250..2000 up to H_2;
//     20 000 points for H_0 alone, Prim's route); no threshold given (the enclosing radius);
//   * points on the torus in R^3 with radii 2 and 1 (angles uniform, seed 19):
//     BM_rips_implicit_torus/N/D/T/U, edges up to U/100 (0: the enclosing radius).
// Over Z/2. One iteration per run (each is seconds). Counters: pairs = pairs of positive
// persistence in all dimensions, peak_MB = the rise of the resident high-water mark during the
// run (bench_support.hpp; the points themselves are made before it), maxrss_MB = the process's
// getrusage maxrss after the run (the whole process; meaningful with one benchmark per process,
// --benchmark_filter). With two threads, read the wall time (real_time): the CPU column is the
// main thread's. Figures and commands: docs/performance.md, section "Vietoris–Rips without
// building the complex".
#include "bench_support.hpp"

#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>
#include <sys/resource.h>

#include <cmath>
#include <cstddef>
#include <numbers>
#include <optional>
#include <random>
#include <vector>

namespace {

std::vector<double> cube_points(std::size_t n) {
  std::mt19937_64 rng(17);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<double> c(3 * n);
  for (auto& x : c) x = u(rng);
  return c;
}

std::vector<double> torus_points(std::size_t n) {
  std::mt19937_64 rng(19);
  std::uniform_real_distribution<double> angle(0.0, 2 * std::numbers::pi);
  std::vector<double> c;
  c.reserve(3 * n);
  for (std::size_t i = 0; i < n; ++i) {
    const double a = angle(rng), b = angle(rng);
    c.push_back((2 + std::cos(b)) * std::cos(a));
    c.push_back((2 + std::cos(b)) * std::sin(a));
    c.push_back(std::sin(b));
  }
  return c;
}

void report(benchmark::State& state, long before, double pairs, double n) {
  lacuna_bench::report_peak(state, before, n);
  struct rusage u {};
  getrusage(RUSAGE_SELF, &u);
  state.counters["maxrss_MB"] = static_cast<double>(u.ru_maxrss) / 1024.0;
  state.counters["pairs"] = pairs;
  state.counters.erase("bytes_per_cell");
  state.counters.erase("cells");
  state.counters["points"] = n;
}

template <class Result>
double positive_pairs(const Result& r) {
  double s = 0;
  for (const auto& d : lacuna::without_zero_persistence(r).diagrams) s += static_cast<double>(d.pairs.size());
  return s;
}

void run_implicit(benchmark::State& state, const std::vector<double>& c, int D, unsigned threads,
                  std::optional<double> threshold = std::nullopt) {
  const auto n = static_cast<double>(c.size() / 3);
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    const auto m = lacuna::rips_metric::from_points(c, 3);
    const auto r = lacuna::implicit_rips_persistence(m, {.max_dimension = D, .threshold = threshold, .threads = threads});
    benchmark::DoNotOptimize(r.diagrams.data());
    state.PauseTiming();
    report(state, before, positive_pairs(r), n);
    state.ResumeTiming();
  }
}

void run_explicit(benchmark::State& state, const std::vector<double>& c, int D) {
  const auto n = static_cast<double>(c.size() / 3);
  const double radius = lacuna::rips_metric::from_points(c, 3).enclosing_radius();
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    const auto f = lacuna::rips_filtration::from_points(c, 3, {.max_dimension = D + 1, .threshold = radius});
    const auto r = lacuna::persistence(f, {.max_dimension = D});
    benchmark::DoNotOptimize(r.diagrams.data());
    state.PauseTiming();
    report(state, before, positive_pairs(r), n);
    state.ResumeTiming();
  }
}

/// Implicit, random points in the cube: range(0) points, H_0..H_range(1), range(2) threads.
void BM_rips_implicit_cube(benchmark::State& state) {
  run_implicit(state, cube_points(static_cast<std::size_t>(state.range(0))), static_cast<int>(state.range(1)),
               static_cast<unsigned>(state.range(2)));
}
/// Explicit (rips_filtration cut at the enclosing radius, then lacuna::persistence), the same.
void BM_rips_explicit_cube(benchmark::State& state) {
  run_explicit(state, cube_points(static_cast<std::size_t>(state.range(0))), static_cast<int>(state.range(1)));
}
/// Implicit, points on a torus: range(0) points, H_0..H_range(1), range(2) threads, edges up
/// to range(3) / 100 (0: no threshold given, the enclosing radius).
void BM_rips_implicit_torus(benchmark::State& state) {
  const auto t = state.range(3) == 0 ? std::optional<double>{} : std::optional<double>{static_cast<double>(state.range(3)) / 100.0};
  run_implicit(state, torus_points(static_cast<std::size_t>(state.range(0))), static_cast<int>(state.range(1)),
               static_cast<unsigned>(state.range(2)), t);
}

}  // namespace

BENCHMARK(BM_rips_implicit_cube)
    ->Args({250, 1, 1})->Args({500, 1, 1})->Args({1000, 1, 1})->Args({2000, 1, 1})
    ->Args({100, 2, 1})->Args({250, 2, 1})->Args({500, 2, 1})->Args({1000, 2, 1})->Args({2000, 2, 1})
    ->Args({250, 2, 2})->Args({500, 2, 2})->Args({1000, 2, 2})->Args({2000, 2, 2})
    ->Args({20000, 0, 1})->Args({20000, 0, 2})
    ->Iterations(1)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_rips_explicit_cube)
    ->Args({250, 1})->Args({500, 1})->Args({100, 2})
    ->Iterations(1)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_rips_implicit_torus)
    ->Args({1000, 1, 1, 0})->Args({2000, 1, 1, 0})->Args({2000, 1, 2, 0})->Args({10000, 1, 2, 0})
    ->Args({10000, 1, 1, 50})->Args({10000, 1, 2, 50})
    ->Iterations(1)->Unit(benchmark::kMillisecond)->UseRealTime();

BENCHMARK_MAIN();

// The scale targets: Betti numbers of large volumes through the implicit Morse complex
// (pre_reduction::morse), the reduction variants side by side, generators of a 128^3 volume,
// and the clique complex of a random graph. docs/performance.md records the figures.
//
// Volumes (tests/cubical/volume_support.hpp): "porous" is an n^3 field of independent normal
// values blurred by a Gaussian of sigma = 2 voxels and thresholded at its median; "coin" has
// each voxel foreground with probability 1/2. Seeds are fixed, so every run sees the same data.
// Counters: b0 b1 b2 (the Betti numbers found), cells, and with one iteration peak_MB and
// bytes_per_cell (the rise of the resident high-water mark during the run; the complex is
// built before it and not counted — whole-process figures are in docs/performance.md).
//
// BM_volume_union_find is the plain reference pass, not lacuna's engine: union-find of the
// foreground (26-connected) and of the padded background (6-connected) plus the Euler
// characteristic counted from the voxels (Alexander duality; the independent check of
// tests/cubical/alexander_duality.cpp), run here in the same process for comparison.
//
// `bench_scale --write-volume KIND N FILE` writes one of these volumes as a raw uint8 NRRD
// file (for the whole-process runs of the command-line tool) and exits.
#include "../tests/cubical/volume_support.hpp"
#include "bench_support.hpp"

#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>

#include <cstdio>
#include <cstring>
#include <map>
#include <memory>
#include <random>
#include <string>
#include <utility>
#include <vector>

namespace {

const lacuna::sparse_elimination morse{.reduction = lacuna::pre_reduction::morse};

struct cached_volume {
  lacuna_volumes::volume voxels;
  lacuna::cubical_complex<3> complex;
};

lacuna_volumes::volume make_volume(int kind, std::size_t n) {
  return kind == 0 ? lacuna_volumes::porous_volume(n, 2.0, 20261202) : lacuna_volumes::coin_flip_volume(n, 0.5, 20261202);
}

// One volume at a time is kept (the large ones take hundreds of MB).
const cached_volume& volume(int kind, std::size_t n) {
  static std::pair<int, std::size_t> key{-1, 0};
  static std::unique_ptr<cached_volume> slot;
  if (!slot || key != std::pair{kind, n}) {
    slot.reset();
    auto v = make_volume(kind, n);
    auto c = lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
    slot = std::make_unique<cached_volume>(cached_volume{std::move(v), std::move(c)});
    key = {kind, n};
  }
  return *slot;
}

double cells_of(const lacuna::cubical_complex<3>& c) {
  double n = 0;
  for (int k = 0; k <= 3; ++k) n += static_cast<double>(c.cell_count(k));
  return n;
}

template <class R>
void betti_counters(benchmark::State& state, const lacuna::homology_result<R>& h) {
  for (int k = 0; k <= 2 && k <= h.top_dimension(); ++k) state.counters["b" + std::to_string(k)] = static_cast<double>(h[k].rank);
}

// Betti numbers through the Morse complex, over R, two threads; args: kind (0 porous, 1 coin), n.
template <class R>
void BM_volume(benchmark::State& state) {
  const auto& v = volume(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    auto h = lacuna::homology<R>(v.complex, {.threads = 2}, morse);
    lacuna_bench::report_peak(state, before, cells_of(v.complex));
    betti_counters(state, h);
    benchmark::DoNotOptimize(h);
  }
}

// The plain reference pass: two union-finds and the counted Euler characteristic.
void BM_volume_union_find(benchmark::State& state) {
  const auto& v = volume(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  for (auto _ : state) {
    const auto d = lacuna_volumes::duality_betti(v.voxels);
    state.counters["b0"] = static_cast<double>(d.b0);
    state.counters["b1"] = static_cast<double>(d.b1);
    state.counters["b2"] = static_cast<double>(d.b2);
    benchmark::DoNotOptimize(d);
  }
  state.counters["cells"] = cells_of(v.complex);
}

// The reduction variants on one volume, over Z/2; args: kind, n, variant
// (0 none, 1 collapses, 2 coreductions, 3 coreductions and collapses, 4 Morse).
void BM_volume_variants(benchmark::State& state) {
  const auto& v = volume(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  static constexpr lacuna::pre_reduction variants[] = {
      lacuna::pre_reduction::none, lacuna::pre_reduction::collapses, lacuna::pre_reduction::coreductions,
      lacuna::pre_reduction::coreductions_and_collapses, lacuna::pre_reduction::morse};
  const lacuna::sparse_elimination alg{.reduction = variants[state.range(2)]};
  for (auto _ : state) {
    auto h = lacuna::homology<lacuna::z2>(v.complex, {}, alg);
    betti_counters(state, h);
    benchmark::DoNotOptimize(h);
  }
  state.counters["cells"] = cells_of(v.complex);
}

// Integral homology with generators of H_1 and H_2 through the Morse complex.
void BM_volume_generators(benchmark::State& state) {
  const auto& v = volume(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    auto h = lacuna::homology<lacuna::integer>(v.complex, {.generators = true, .keep_basis = false, .threads = 2}, morse);
    lacuna_bench::report_peak(state, before, cells_of(v.complex));
    betti_counters(state, h);
    benchmark::DoNotOptimize(h);
  }
}

// The clique complex of a G(n, p) random graph up to dimension 3: args n, 1000 p, variant
// (0: the default reduction, 1: Morse). Timed: building the complex and its integral homology.
void BM_clique(benchmark::State& state) {
  const auto n = static_cast<std::uint32_t>(state.range(0));
  const double p = static_cast<double>(state.range(1)) / 1000.0;
  std::mt19937_64 rng(20261202);
  std::bernoulli_distribution edge(p);
  std::vector<std::pair<std::uint32_t, std::uint32_t>> edges;
  for (std::uint32_t i = 0; i < n; ++i)
    for (std::uint32_t j = i + 1; j < n; ++j)
      if (edge(rng)) edges.emplace_back(i, j);
  std::vector<std::uint32_t> vertices(n);
  for (std::uint32_t i = 0; i < n; ++i) vertices[i] = i;
  const lacuna::sparse_elimination alg{.reduction = state.range(2) == 0 ? lacuna::pre_reduction::coreductions_and_collapses
                                                                         : lacuna::pre_reduction::morse};
  for (auto _ : state) {
    const auto c = lacuna::clique_complex(vertices, edges, 3);
    auto h = lacuna::homology<lacuna::integer>(c, {.threads = 2}, alg);
    betti_counters(state, h);
    state.counters["cells"] = static_cast<double>(lacuna::total_cell_count(c));
    benchmark::DoNotOptimize(h);
  }
}

}  // namespace

// Time and memory against size: porous volumes of about 10^5, 10^6, 10^7, 8 10^7 and 10^8 cells.
BENCHMARK(BM_volume<lacuna::z2>)
    ->Args({0, 28})
    ->Args({0, 60})
    ->Args({0, 128})
    ->Args({0, 256})
    ->Args({0, 278})
    ->Args({1, 128})
    ->Args({1, 256})
    ->ArgNames({"coin", "n"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_volume<lacuna::integer>)
    ->Args({0, 128})
    ->Args({0, 256})
    ->Args({1, 128})
    ->Args({1, 256})
    ->ArgNames({"coin", "n"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_volume_union_find)
    ->Args({0, 128})
    ->Args({0, 256})
    ->Args({1, 256})
    ->ArgNames({"coin", "n"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_volume_variants)
    ->ArgsProduct({{0, 1}, {40}, {0, 1, 2, 3, 4}})
    ->ArgNames({"coin", "n", "variant"})
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_volume_generators)->Args({0, 128})->ArgNames({"coin", "n"})->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_clique)
    ->Args({2000, 20, 0})
    ->Args({2000, 20, 1})
    ->ArgNames({"n", "p1000", "morse"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);

int main(int argc, char** argv) {
  if (argc == 5 && std::strcmp(argv[1], "--write-volume") == 0) {
    const int kind = std::strcmp(argv[2], "coin") == 0 ? 1 : 0;
    if (kind == 0 && std::strcmp(argv[2], "porous") != 0) {
      std::fprintf(stderr, "bench_scale: KIND is porous or coin\n");
      return 2;
    }
    lacuna_volumes::write_nrrd(argv[4], make_volume(kind, std::stoul(argv[3])));
    return 0;
  }
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}

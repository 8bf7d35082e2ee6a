// Persistence variants side by side, and the scale targets of issue 13:
//   * sublevel persistence (all dimensions) of a 1024 x 1024 16-bit image in under 0.5 s;
//   * of a 256^3 8-bit volume in under 10 s and under 8 bytes per voxel;
//   * a lower-star filtration of a 10^6-triangle surface mesh in under 2 s.
// The data is made here, deterministically (our own scenario, no file): white Gaussian noise
// blurred by three passes of a box filter along every axis (close to a Gaussian blur; radius 4
// for images, sigma about 4.5 pixels, radius 2 for volumes, sigma about 2.4 voxels),
// quantized to the full range of the sample type; the mesh is the k x k torus of
// bench_support.hpp (2k^2 triangles) with a smooth function of the angles plus Gaussian noise
// on its vertices. Figures and commands: docs/performance.md, section "Persistence".
//
// Counters: pairs = pairs of positive persistence (all dimensions); peak_MB = the rise of the
// resident high-water mark during the run (the input built before it: the samples, 2 bytes per
// pixel or 1 per voxel, come on top), bytes_per_voxel = peak / voxels; morse_columns = the
// cubical variant's critical cells of dimension >= 1 (from its progress reports). CPU time is
// the process's (both threads).
#include "bench_support.hpp"

#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/persistence/values_filtration.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <map>
#include <memory>
#include <numbers>
#include <random>
#include <string>
#include <vector>

#include <time.h>

namespace {

/// White noise blurred by three box passes of radius r along every axis (wrapping around).
template <std::size_t D>
std::vector<float> smooth_noise(const std::array<std::size_t, D>& n, int r, std::uint64_t seed) {
  std::size_t total = 1;
  for (auto x : n) total *= x;
  std::vector<float> a(total), b(total);
  std::mt19937_64 rng(seed);
  std::normal_distribution<float> g;
  for (auto& x : a) x = g(rng);
  std::array<std::size_t, D> stride{};
  std::size_t s = 1;
  for (std::size_t d = 0; d < D; ++d) stride[d] = s, s *= n[d];
  for (int pass = 0; pass < 3; ++pass)
    for (std::size_t d = 0; d < D; ++d) {
      for (std::size_t i = 0; i < total; ++i) {
        const std::size_t x = (i / stride[d]) % n[d], base = i - x * stride[d];
        float sum = 0;
        for (int o = -r; o <= r; ++o)
          sum += a[base + ((x + n[d] + static_cast<std::size_t>(o + static_cast<int>(n[d]))) % n[d]) * stride[d]];
        b[i] = sum / static_cast<float>(2 * r + 1);
      }
      std::swap(a, b);
    }
  return a;
}

/// Quantized to 0..levels-1.
template <class T>
std::vector<T> quantize(const std::vector<float>& v, double levels) {
  const auto [lo, hi] = std::minmax_element(v.begin(), v.end());
  std::vector<T> out(v.size());
  for (std::size_t i = 0; i < v.size(); ++i)
    out[i] = static_cast<T>(std::floor((v[i] - *lo) / (*hi - *lo) * (levels - 1) + 0.5));
  return out;
}

/// A 16-bit n x n image (cached).
const std::vector<std::uint16_t>& image_samples(std::size_t n) {
  static std::map<std::size_t, std::vector<std::uint16_t>> cache;
  auto& v = cache[n];
  if (v.empty()) v = quantize<std::uint16_t>(smooth_noise<2>({n, n}, 4, 20261301 + n), 65536);
  return v;
}

/// An 8-bit n^3 volume (cached).
const std::vector<std::uint8_t>& volume_samples(std::size_t n) {
  static std::map<std::size_t, std::vector<std::uint8_t>> cache;
  auto& v = cache[n];
  if (v.empty()) v = quantize<std::uint8_t>(smooth_noise<3>({n, n, n}, 2, 20261302 + n), 256);
  return v;
}

enum variant : int { cubical = 0, twist = 1, standard = 2, cohomology = 3 };

/// CPU seconds of the process (every thread).
double process_cpu() {
  timespec t{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return static_cast<double>(t.tv_sec) + 1e-9 * static_cast<double>(t.tv_nsec);
}

template <class F>
auto run_variant(const F& f, int v, const lacuna::persistence_options& o) {
  switch (v) {
    case twist: return lacuna::persistence(f, o, lacuna::twist_persistence{});
    case standard: return lacuna::persistence(f, o, lacuna::standard_persistence{});
    case cohomology: return lacuna::persistence(f, o, lacuna::cohomology_persistence{});
    default:
      if constexpr (lacuna::is_cubical_filtration<F>)
        return lacuna::persistence(f, o, lacuna::cubical_morse_persistence{});
      else
        return lacuna::persistence(f, o, lacuna::twist_persistence{});
  }
}

template <class R>
std::size_t positive_pairs(const R& r) {
  std::size_t n = 0;
  for (const auto& d : lacuna::without_zero_persistence(r).diagrams) n += d.pairs.size();
  return n;
}

// Args: variant, threads, n
void BM_image(benchmark::State& state) {
  const auto v = static_cast<int>(state.range(0));
  const auto n = static_cast<std::size_t>(state.range(2));
  const lacuna::cubical_filtration<2, std::uint16_t> f({n, n}, image_samples(n));
  const lacuna::persistence_options o{.threads = static_cast<unsigned>(state.range(1))};
  std::size_t pairs = 0;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    auto r = run_variant(f, v, o);
    pairs = positive_pairs(r);
    benchmark::DoNotOptimize(r);
  }
  const long peak = lacuna_bench::status_kib("VmHWM");
  state.counters["pairs"] = static_cast<double>(pairs);
  state.counters["peak_MB"] = static_cast<double>(peak - before) / 1024.0;
  state.counters["bytes_per_voxel"] = static_cast<double>(peak - before) * 1024.0 / static_cast<double>(n * n);
}
BENCHMARK(BM_image)
    ->ArgNames({"variant", "threads", "n"})
    ->Args({cubical, 1, 1024})
    ->Args({cubical, 2, 1024})
    ->Args({cubical, 1, 256})
    ->Args({twist, 1, 256})
    ->Args({standard, 1, 256})
    ->Args({cohomology, 1, 256})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// Args: variant, threads, n
void BM_volume(benchmark::State& state) {
  const auto v = static_cast<int>(state.range(0));
  const auto n = static_cast<std::size_t>(state.range(2));
  const lacuna::cubical_filtration<3, std::uint8_t> f({n, n, n}, volume_samples(n));
  lacuna::persistence_options o{.threads = static_cast<unsigned>(state.range(1))};
  std::uint64_t columns = 0;  // the cubical variant's Morse columns: its critical cells of dimension >= 1
  // process CPU seconds per phase, charged at each change of phase
  std::map<std::string, double> phase_cpu;
  std::string phase;
  double since = process_cpu();
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "Morse boundaries") columns = r.total;
    if (r.phase != phase) {
      const double now = process_cpu();
      if (!phase.empty()) phase_cpu[phase] += now - since;
      phase = std::string(r.phase);
      since = now;
    }
  };
  std::size_t pairs = 0;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    auto r = run_variant(f, v, o);
    pairs = positive_pairs(r);
    benchmark::DoNotOptimize(r);
  }
  const long peak = lacuna_bench::status_kib("VmHWM");
  state.counters["pairs"] = static_cast<double>(pairs);
  state.counters["peak_MB"] = static_cast<double>(peak - before) / 1024.0;
  state.counters["bytes_per_voxel"] = static_cast<double>(peak - before) * 1024.0 / static_cast<double>(n * n * n);
  if (!phase.empty()) phase_cpu[phase] += process_cpu() - since;
  if (v == cubical) {
    state.counters["morse_columns"] = static_cast<double>(columns);
    state.counters["cpu_pairing"] = phase_cpu["pairing cubical cells"];
    state.counters["cpu_morse"] = phase_cpu["Morse boundaries"];
    state.counters["cpu_reducing"] = phase_cpu["reducing the boundary matrices"];
  }
}
BENCHMARK(BM_volume)
    ->ArgNames({"variant", "threads", "n"})
    ->Args({cubical, 2, 256})
    ->Args({cubical, 1, 256})
    ->Args({cubical, 1, 128})
    ->Args({cubical, 1, 32})
    ->Args({twist, 1, 32})
    ->Args({standard, 1, 32})
    ->Args({cohomology, 1, 32})
    ->Unit(benchmark::kMillisecond)
    ->Iterations(1)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

/// The k x k torus with a smooth function of the angles plus noise on its vertices.
struct mesh_input {
  const lacuna::simplicial_complex<int>* complex;
  std::vector<double> values;
};
const mesh_input& mesh(int k) {
  static std::map<int, mesh_input> cache;
  auto& m = cache[k];
  if (!m.complex) {
    m.complex = &lacuna_bench::torus(k);
    std::mt19937_64 rng(20261303);
    std::normal_distribution<double> noise(0, 0.05);
    m.values.resize(m.complex->vertex_count());
    for (std::size_t id = 0; id < m.values.size(); ++id) {
      const int label = m.complex->label(static_cast<std::uint32_t>(id));  // i k + j
      const double a = 2 * std::numbers::pi * (label / k) / k, b = 2 * std::numbers::pi * (label % k) / k;
      m.values[id] = std::sin(3 * a) * std::cos(5 * b) + noise(rng);
    }
  }
  return m;
}

// Args: variant, k (2k^2 triangles). The filtration is built inside the timed loop.
void BM_mesh(benchmark::State& state) {
  const auto v = static_cast<int>(state.range(0));
  const auto& m = mesh(static_cast<int>(state.range(1)));
  std::size_t pairs = 0;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    const auto f = lacuna::lower_star_filtration(*m.complex, m.values);
    auto r = run_variant(f, v, {});
    pairs = positive_pairs(r);
    benchmark::DoNotOptimize(r);
  }
  state.counters["pairs"] = static_cast<double>(pairs);
  state.counters["triangles"] = static_cast<double>(m.complex->cell_count(2));
  state.counters["peak_MB"] = static_cast<double>(lacuna_bench::status_kib("VmHWM") - before) / 1024.0;
}
BENCHMARK(BM_mesh)
    ->ArgNames({"variant", "k"})
    ->Args({twist, 708})
    ->Args({standard, 708})
    ->Args({cohomology, 708})
    ->Unit(benchmark::kMillisecond)
    ->Iterations(1)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

// Args: variant, points. Vietoris-Rips of points on a noisy circle in R^3 (diagrams 0 and 1).
void BM_rips(benchmark::State& state) {
  const auto v = static_cast<int>(state.range(0));
  const auto n = static_cast<std::size_t>(state.range(1));
  std::mt19937_64 rng(20261304);
  std::normal_distribution<double> noise(0, 0.1);
  std::vector<double> coords;
  for (std::size_t i = 0; i < n; ++i) {
    const double t = 2 * std::numbers::pi * static_cast<double>(i) / static_cast<double>(n);
    coords.insert(coords.end(), {std::cos(t) + noise(rng), std::sin(t) + noise(rng), noise(rng)});
  }
  std::size_t pairs = 0;
  for (auto _ : state) {
    const auto f = lacuna::rips_filtration::from_points(coords, 3, {.max_dimension = 2, .threshold = 0.8});
    auto r = run_variant(f, v, {.max_dimension = 1});
    pairs = positive_pairs(r);
    benchmark::DoNotOptimize(r);
  }
  state.counters["pairs"] = static_cast<double>(pairs);
}
BENCHMARK(BM_rips)
    ->ArgNames({"variant", "points"})
    ->Args({twist, 400})
    ->Args({standard, 400})
    ->Args({cohomology, 400})
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

}  // namespace

BENCHMARK_MAIN();

// Peak memory of the readers (.facets, .cells, OFF, NRRD) and of the homology engine on a
// 10^6-cell and a 10^7-cell input (k x k torus triangulations, 6 k^2 cells: k = 408 gives
// 998784 cells, k = 1291 gives 10000086; coin-flip volumes of 53^3 and 115^3 voxels),
// reported per cell as Google Benchmark counters:
//   peak_MB         the rise of the resident set's high-water mark during one run, in MiB;
//   bytes_per_cell  the same per cell of the complex.
// The high-water mark (VmHWM of /proc/self/status) is reset before each run by writing 5 to
// /proc/self/clear_refs (Linux 4.0 and later), after malloc_trim(0) has handed freed memory
// back, so each figure is that run's own peak above what was resident before it: for the
// reader, the complex it builds plus its working memory (the file's text is not counted, it
// is read from disk); for the engine, everything homology() allocates (the complex is not
// counted, it exists before). One iteration each: the figures are memory, not time.
#include "bench_support.hpp"

#include <lacuna/homology/homology.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/off.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <random>
#include <string>
#include <unistd.h>

namespace {

using lacuna_bench::begin_peak;
using lacuna_bench::report_peak;

const lacuna::simplicial_complex<std::string>& torus_complex(int k) {
  static std::map<int, std::unique_ptr<lacuna::simplicial_complex<std::string>>> cache;
  auto& slot = cache[k];
  if (!slot) slot = std::make_unique<lacuna::simplicial_complex<std::string>>(lacuna::io::read_facets(lacuna_bench::torus_facets_file(k)));
  return *slot;
}

double cells_of(int k) { return 6.0 * k * k; }

void BM_read_facets(benchmark::State& state) {
  const int k = static_cast<int>(state.range(0));
  const auto file = lacuna_bench::torus_facets_file(k);
  for (auto _ : state) {
    const long before = begin_peak();
    auto c = lacuna::io::read_facets(file);
    benchmark::DoNotOptimize(c);
    report_peak(state, before, cells_of(k));
  }
}

template <class C>
double cell_total(const C& c) {
  double n = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) n += static_cast<double>(lacuna::cell_count(c, k));
  return n;
}

/// A file in the temporary directory, written by `write(stream)` when first asked for.
template <class Write>
std::filesystem::path bench_file(const std::string& name, Write write) {
  const auto p = std::filesystem::temp_directory_path() / (name + "_" + std::to_string(::getpid()));
  if (!std::filesystem::exists(p)) {
    std::ofstream out(p, std::ios::binary);
    write(out);
  }
  return p;
}

void remove_bench_file(const std::filesystem::path& p) {
  std::error_code ec;
  std::filesystem::remove(p, ec);
}

/// Reads `file` with `read` in the timed loop, reports its peak per cell, removes the file.
template <class Read>
void measure_reader(benchmark::State& state, const std::filesystem::path& file, Read read) {
  for (auto _ : state) {
    const long before = begin_peak();
    auto c = read(file);
    report_peak(state, before, cell_total(c));
    benchmark::DoNotOptimize(c);
  }
  remove_bench_file(file);
}

// The torus as a cell list (.cells, written by write_cells): the same 6 k^2 cells.
void BM_read_cells(benchmark::State& state) {
  const int k = static_cast<int>(state.range(0));
  const auto file = bench_file(std::string("lacuna_bench_torus_") + std::to_string(k) + ".cells",
                               [&](std::ostream& out) { lacuna::io::write_cells(out, torus_complex(k)); });
  measure_reader(state, file, [](const std::filesystem::path& f) { return lacuna::io::read_cells(f); });
}

// The torus as an OFF triangle mesh: k^2 vertices, 2 k^2 triangles, 6 k^2 cells.
void BM_read_off(benchmark::State& state) {
  const int k = static_cast<int>(state.range(0));
  const auto file = bench_file(std::string("lacuna_bench_torus_") + std::to_string(k) + ".off", [&](std::ostream& out) {
    out << "OFF\n" << k * k << ' ' << 2 * k * k << " 0\n";
    for (int i = 0; i < k; ++i)
      for (int j = 0; j < k; ++j) out << i << ' ' << j << " 0\n";
    auto v = [k](int i, int j) { return (i % k) * k + (j % k); };
    for (int i = 0; i < k; ++i)
      for (int j = 0; j < k; ++j) {
        out << "3 " << v(i, j) << ' ' << v(i + 1, j) << ' ' << v(i + 1, j + 1) << '\n';
        out << "3 " << v(i, j) << ' ' << v(i, j + 1) << ' ' << v(i + 1, j + 1) << '\n';
      }
  });
  measure_reader(state, file, [](const std::filesystem::path& f) { return lacuna::io::read_off(f); });
}

// An n^3 raw uint8 NRRD volume, each voxel foreground with probability 1/2 (seed 7 + n).
void BM_read_nrrd(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  const auto file = bench_file(std::string("lacuna_bench_volume_") + std::to_string(n) + ".nrrd", [&](std::ostream& out) {
    out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: " << n << ' ' << n << ' ' << n << "\nencoding: raw\n\n";
    std::mt19937_64 gen(7 + n);
    for (std::size_t i = 0; i < n * n * n; ++i) out.put(static_cast<char>(gen() & 1U));
  });
  measure_reader(state, file, [](const std::filesystem::path& f) { return lacuna::io::read_nrrd<3>(f); });
}

template <class R>
void BM_homology(benchmark::State& state) {
  const int k = static_cast<int>(state.range(0));
  const bool generators = state.range(1) != 0;
  const auto& c = torus_complex(k);
  for (auto _ : state) {
    const long before = begin_peak();
    auto h = lacuna::homology<R>(c, {.generators = generators, .keep_basis = false, .threads = 2});
    benchmark::DoNotOptimize(h);
    report_peak(state, before, cells_of(k));
  }
}

}  // namespace

BENCHMARK(BM_read_facets)->Arg(408)->Arg(1291)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_read_cells)->Arg(408)->Arg(1291)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_read_off)->Arg(408)->Arg(1291)->Iterations(1)->Unit(benchmark::kMillisecond);
// n = 53 and 115: about 10^6 and 10^7 cells of the cubical complex of a coin-flip volume
BENCHMARK(BM_read_nrrd)->Arg(53)->Arg(115)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_homology<lacuna::integer>)
    ->Args({408, 0})
    ->Args({408, 1})
    ->Args({1291, 0})
    ->Args({1291, 1})
    ->ArgNames({"k", "generators"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);
BENCHMARK(BM_homology<lacuna::z2>)
    ->Args({408, 0})
    ->Args({1291, 0})
    ->ArgNames({"k", "generators"})
    ->Iterations(1)
    ->Unit(benchmark::kMillisecond);

int main(int argc, char** argv) {
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  lacuna_bench::remove_torus_facets_files();
  return 0;
}

// Shared inputs of the benchmarks: tori and random cubical volumes, built once per process
// and cached, so that the timed loops measure the algorithm only.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <benchmark/benchmark.h>
#include <malloc.h>
#include <unistd.h>

#include <cstdlib>

#include <cstdint>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <random>
#include <string>
#include <system_error>
#include <vector>

namespace lacuna_bench {

// ---- peak memory ------------------------------------------------------------------------
// The high-water mark (VmHWM of /proc/self/status) is reset before a run by writing 5 to
// /proc/self/clear_refs (Linux 4.0 and later), after malloc_trim(0) has handed freed memory
// back, so the figure is that run's own peak above what was resident before it.

/// A field of /proc/self/status in KiB (VmRSS, VmHWM); -1 if it cannot be read.
inline long status_kib(const std::string& key) {
  std::ifstream f("/proc/self/status");
  std::string line;
  while (std::getline(f, line))
    if (line.rfind(key + ":", 0) == 0) return std::strtol(line.c_str() + key.size() + 1, nullptr, 10);
  return -1;
}

/// Starts a measurement: frees what malloc keeps, resets the high-water mark, returns VmRSS.
inline long begin_peak() {
  malloc_trim(0);
  std::ofstream("/proc/self/clear_refs") << "5";
  return status_kib("VmRSS");
}

/// Counters peak_MB (the rise of the high-water mark), bytes_per_cell and cells.
inline void report_peak(benchmark::State& state, long rss_before_kib, double cells) {
  const long peak = status_kib("VmHWM");
  const double rise = static_cast<double>(peak - rss_before_kib) * 1024.0;
  state.counters["peak_MB"] = rise / (1024.0 * 1024.0);
  state.counters["bytes_per_cell"] = rise / cells;
  state.counters["cells"] = cells;
}

/// The k x k torus (the layout of examples/torus_facets.cpp: 2k^2 triangles, 3k^2 edges).
inline const lacuna::simplicial_complex<int>& torus(int k) {
  static std::map<int, std::unique_ptr<lacuna::simplicial_complex<int>>> cache;
  auto& slot = cache[k];
  if (!slot) {
    std::vector<std::vector<int>> f;
    f.reserve(2 * static_cast<std::size_t>(k) * static_cast<std::size_t>(k));
    auto v = [k](int i, int j) { return (i % k) * k + (j % k); };
    for (int i = 0; i < k; ++i)
      for (int j = 0; j < k; ++j) {
        f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
        f.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
      }
    slot = std::make_unique<lacuna::simplicial_complex<int>>(lacuna::simplicial_complex<int>::from_facets(f));
  }
  return *slot;
}

/// The k x k torus as a .facets file in the temporary directory, labels "i_j" (the layout of
/// examples/torus_facets.cpp); written when first asked for, or again if it was removed.
inline std::map<int, std::filesystem::path>& torus_facets_paths() {
  static std::map<int, std::filesystem::path> files;
  return files;
}
inline std::filesystem::path torus_facets_file(int k) {
  auto& p = torus_facets_paths()[k];
  if (p.empty() || !std::filesystem::exists(p)) {
    p = std::filesystem::temp_directory_path() /
        (std::string("lacuna_bench_torus_") + std::to_string(k) + "_" + std::to_string(::getpid()) + ".facets");
    std::ofstream out(p);
    auto v = [k](int i, int j) { return std::to_string(i % k) + "_" + std::to_string(j % k); };
    for (int i = 0; i < k; ++i)
      for (int j = 0; j < k; ++j) {
        out << v(i, j) << ' ' << v(i + 1, j) << ' ' << v(i + 1, j + 1) << '\n';
        out << v(i, j) << ' ' << v(i, j + 1) << ' ' << v(i + 1, j + 1) << '\n';
      }
  }
  return p;
}

/// Removes the files torus_facets_file wrote.
inline void remove_torus_facets_files() {
  for (const auto& [k, p] : torus_facets_paths()) {
    std::error_code ec;
    std::filesystem::remove(p, ec);
  }
}

/// An n x n x n volume, each voxel foreground with probability 1/2 (seed 2024 + n).
inline const lacuna::cubical_complex<3>& random_volume(std::size_t n) {
  static std::map<std::size_t, std::unique_ptr<lacuna::cubical_complex<3>>> cache;
  auto& slot = cache[n];
  if (!slot) {
    std::mt19937_64 gen(2024 + n);
    slot = std::make_unique<lacuna::cubical_complex<3>>(
        lacuna::cubical_complex<3>::from_predicate({n, n, n}, [&](const auto&) { return (gen() & 1U) != 0; }));
  }
  return *slot;
}

}  // namespace lacuna_bench

// Shared inputs of the benchmarks: tori and random cubical volumes, built once per process
// and cached, so that the timed loops measure the algorithm only.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <unistd.h>

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

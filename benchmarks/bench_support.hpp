// Shared inputs of the benchmarks: tori and random cubical volumes, built once per process
// and cached, so that the timed loops measure the algorithm only.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <cstdint>
#include <map>
#include <memory>
#include <random>
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

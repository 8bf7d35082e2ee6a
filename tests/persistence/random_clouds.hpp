// Random point clouds for the Vietoris–Rips tests (tests/persistence/): invented data of our
// own, made by a seeded generator.
#pragma once

#include <cstddef>
#include <random>
#include <vector>

namespace persistence_test_support {

/// `n` points of R^dim as coordinates, point after point: uniform in [0, 1)^dim, or on the
/// integer grid {0..3}^dim when `grid` (many equal distances, so tie rules and pairs of
/// persistence zero are exercised).
inline std::vector<double> random_cloud(std::mt19937_64& rng, std::size_t n, std::size_t dim, bool grid) {
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::uniform_int_distribution<int> g(0, 3);
  std::vector<double> c(n * dim);
  for (auto& x : c) x = grid ? g(rng) : u(rng);
  return c;
}

}  // namespace persistence_test_support

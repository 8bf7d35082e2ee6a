// Finishing a dense integral core: dense_smith_form (Euclidean elimination on lacuna::integer)
// beside modular_smith_invariants (algorithm/modular_smith.hpp) on the matrices of issue 14
// item 9, and on smaller square matrices of small entries to place the threshold of
// prefer_modular_smith. Matrices are built outside the timed loop (fixed seeds).
//   build/bin/bench_modular_smith
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/ring/integer.hpp>

#include <benchmark/benchmark.h>

#include <map>
#include <random>

namespace {

using lacuna::dense_matrix;
using lacuna::integer;
using big = boost::multiprecision::cpp_int;

/// A random integer of exactly `digits` decimal digits (leading digit non-zero), either sign.
big random_digits(std::mt19937_64& rng, int digits) {
  big v = 1 + static_cast<int>(rng() % 9);
  for (int d = 1; d < digits; ++d) v = v * 10 + static_cast<int>(rng() % 10);
  return (rng() & 1U) ? big(-v) : v;
}

/// Case 0: n x n, entries -9..9. Case 1: n x n, 19-digit entries. Case 2: n x n, entries
/// 2..9 off the diagonal pattern of item 9's file, four 20 000-digit entries on the diagonal.
/// Case 3: rank-deficient, X Y with X n x (n - n/10), Y (n - n/10) x n, entries -3..3.
const dense_matrix<integer>& input(int which, std::size_t n) {
  static std::map<std::pair<int, std::size_t>, dense_matrix<integer>> cache;
  auto it = cache.find({which, n});
  if (it != cache.end()) return it->second;
  std::mt19937_64 rng(9 + which);
  dense_matrix<integer> a(n, n);
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < n; ++j) {
      if (which == 0) a(i, j) = static_cast<std::int64_t>(rng() % 19) - 9;
      if (which == 1) a(i, j) = integer(random_digits(rng, 19));
      if (which == 2) a(i, j) = i == j ? integer(random_digits(rng, 20000)) : integer(static_cast<std::int64_t>(rng() % 8) + 2);
    }
  if (which == 3) {
    const std::size_t k = n - n / 10;
    std::vector<std::int64_t> x(n * k), y(k * n);
    for (auto& v : x) v = static_cast<std::int64_t>(rng() % 7) - 3;
    for (auto& v : y) v = static_cast<std::int64_t>(rng() % 7) - 3;
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = 0; j < n; ++j) {
        std::int64_t sum = 0;
        for (std::size_t t = 0; t < k; ++t) sum += x[i * k + t] * y[t * n + j];
        a(i, j) = sum;
      }
  }
  return cache.emplace(std::pair{which, n}, std::move(a)).first->second;
}

void old_route(benchmark::State& state) {
  const auto& a = input(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  for (auto _ : state) benchmark::DoNotOptimize(lacuna::dense_smith_form(a).rank);
}
void new_route(benchmark::State& state) {
  const auto& a = input(static_cast<int>(state.range(0)), static_cast<std::size_t>(state.range(1)));
  bool proved = false;
  for (auto _ : state) proved = lacuna::modular_smith_invariants(a).has_value();
  state.counters["proved"] = proved;
}

}  // namespace

// Item 9: {0, 150}, {1, 100}, {2, 4}; the rest places the threshold.
BENCHMARK(old_route)->Args({0, 4})->Args({0, 8})->Args({0, 16})->Args({0, 32})->Args({0, 64})->Args({0, 150})
    ->Args({1, 4})->Args({1, 8})->Args({1, 16})->Args({1, 100})->Args({2, 4})->Args({3, 40})->Args({3, 64})->Args({3, 100})->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(new_route)->Args({0, 4})->Args({0, 8})->Args({0, 16})->Args({0, 32})->Args({0, 64})->Args({0, 150})
    ->Args({1, 4})->Args({1, 8})->Args({1, 16})->Args({1, 100})->Args({2, 4})->Args({3, 40})->Args({3, 64})->Args({3, 100})->Unit(benchmark::kMillisecond);

BENCHMARK_MAIN();

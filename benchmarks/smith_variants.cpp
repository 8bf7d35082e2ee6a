// Smith normal forms of boundary matrices: lacuna's dense_elimination and sparse_elimination
// beside FLINT 2.9's dense fmpz_mat_snf on the same matrix. Inputs: d1 and d2 of k x k tori
// (simplicial_complex<int>, boundary_matrix<integer>) and d1..d3 of random n^3 cubical
// volumes. The matrix and FLINT's copy are built outside the timed loop.
//   build/bin/bench_smith_variants --benchmark_filter=torus
#include "bench_support.hpp"

#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/integer.hpp>

#include <benchmark/benchmark.h>
#include <flint/fmpz.h>
#include <flint/fmpz_mat.h>

#include <map>

namespace {

using lacuna::integer;
using lacuna::sparse_matrix;

const sparse_matrix<integer>& torus_boundary(int k, int d) {
  static std::map<std::pair<int, int>, sparse_matrix<integer>> cache;
  auto it = cache.find({k, d});
  if (it == cache.end()) it = cache.emplace(std::pair{k, d}, lacuna::boundary_matrix<integer>(lacuna_bench::torus(k), d)).first;
  return it->second;
}
const sparse_matrix<integer>& volume_boundary(int n, int d) {
  static std::map<std::pair<int, int>, sparse_matrix<integer>> cache;
  auto it = cache.find({n, d});
  if (it == cache.end())
    it = cache.emplace(std::pair{n, d}, lacuna::boundary_matrix<integer>(lacuna_bench::random_volume(static_cast<std::size_t>(n)), d)).first;
  return it->second;
}

template <class Alg>
void run_lacuna(benchmark::State& state, const sparse_matrix<integer>& m) {
  std::size_t rank = 0;
  for (auto _ : state) {
    auto s = lacuna::smith_normal_form(m, Alg{});
    rank = s.rank;
    benchmark::DoNotOptimize(s);
  }
  state.counters["rows"] = static_cast<double>(m.rows);
  state.counters["cols"] = static_cast<double>(m.cols);
  state.counters["rank"] = static_cast<double>(rank);
}

void run_flint(benchmark::State& state, const sparse_matrix<integer>& m) {
  fmpz_mat_t A, S;
  fmpz_mat_init(A, static_cast<slong>(m.rows), static_cast<slong>(m.cols));
  fmpz_mat_init(S, static_cast<slong>(m.rows), static_cast<slong>(m.cols));
  for (std::size_t j = 0; j < m.cols; ++j)
    for (const auto& e : m.columns[j]) fmpz_set_si(fmpz_mat_entry(A, e.index, j), e.value.small_value());
  std::size_t rank = 0;
  for (auto _ : state) {
    fmpz_mat_snf(S, A);
    rank = 0;
    for (std::size_t i = 0; i < std::min(m.rows, m.cols); ++i) rank += !fmpz_is_zero(fmpz_mat_entry(S, i, i));
  }
  fmpz_mat_clear(A);
  fmpz_mat_clear(S);
  state.counters["rows"] = static_cast<double>(m.rows);
  state.counters["cols"] = static_cast<double>(m.cols);
  state.counters["rank"] = static_cast<double>(rank);
}

// ---- tori: args {k, d} ----------------------------------------------------------------
void torus_sparse(benchmark::State& s) { run_lacuna<lacuna::sparse_elimination>(s, torus_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }
void torus_dense(benchmark::State& s) { run_lacuna<lacuna::dense_elimination>(s, torus_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }
void torus_flint(benchmark::State& s) { run_flint(s, torus_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }

BENCHMARK(torus_sparse)->ArgsProduct({{8, 16, 24, 64, 256}, {1, 2}})->Unit(benchmark::kMillisecond);
BENCHMARK(torus_dense)->ArgsProduct({{8, 12, 16}, {1, 2}})->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(torus_flint)->ArgsProduct({{8, 16, 24}, {1, 2}})->Unit(benchmark::kMillisecond)->Iterations(1);

// ---- random volumes: args {n, d} ------------------------------------------------------
void volume_sparse(benchmark::State& s) { run_lacuna<lacuna::sparse_elimination>(s, volume_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }
void volume_dense(benchmark::State& s) { run_lacuna<lacuna::dense_elimination>(s, volume_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }
void volume_flint(benchmark::State& s) { run_flint(s, volume_boundary(static_cast<int>(s.range(0)), static_cast<int>(s.range(1)))); }

BENCHMARK(volume_sparse)->ArgsProduct({{4, 6, 8, 32}, {1, 2, 3}})->Unit(benchmark::kMillisecond);
BENCHMARK(volume_dense)->ArgsProduct({{4, 6}, {1, 2, 3}})->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(volume_flint)->ArgsProduct({{4, 6, 8}, {1, 2, 3}})->Unit(benchmark::kMillisecond)->Iterations(1);

}  // namespace

BENCHMARK_MAIN();

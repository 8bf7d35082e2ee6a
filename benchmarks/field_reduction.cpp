// Ranks of d2 of k x k tori (3k^2 x 2k^2, rank 2k^2 - 1) over fields: lacuna::reduce_columns
// with each variant beside FLINT 2.9's dense nmod_mat_rank on the same matrix; and d1, d2
// together with clearing (reduce_chain_complex) against one at a time.
//   build/bin/bench_field_reduction --benchmark_filter=z2
#include "bench_support.hpp"

#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>
#include <flint/nmod_mat.h>

#include <limits>
#include <map>

namespace {

using lacuna::sparse_matrix;
constexpr std::uint64_t m61 = (std::uint64_t{1} << 61U) - 1;

template <class F>
const sparse_matrix<F>& torus_boundary(int k, int d, const F& ring_one = lacuna::one<F>()) {
  static std::map<std::pair<int, int>, sparse_matrix<F>> cache;
  auto it = cache.find({k, d});
  if (it == cache.end()) it = cache.emplace(std::pair{k, d}, lacuna::boundary_matrix<F>(lacuna_bench::torus(k), d, ring_one)).first;
  return it->second;
}

template <class F, class Alg>
void run(benchmark::State& state, const sparse_matrix<F>& m, const Alg& alg, lacuna::field_reduction_options o = {}) {
  std::size_t rank = 0;
  for (auto _ : state) {
    auto r = lacuna::reduce_columns(m, o, alg);
    rank = r.rank;
    benchmark::DoNotOptimize(r);
  }
  state.counters["cols"] = static_cast<double>(m.cols);
  state.counters["rank"] = static_cast<double>(rank);
}

int K(const benchmark::State& s) { return static_cast<int>(s.range(0)); }
constexpr std::size_t never = std::numeric_limits<std::size_t>::max();

// ---- Z/2 ------------------------------------------------------------------------------
void z2_standard(benchmark::State& s) { run(s, torus_boundary<lacuna::z2>(K(s), 2), lacuna::standard_reduction{}); }
void z2_bit_packed(benchmark::State& s) { run(s, torus_boundary<lacuna::z2>(K(s), 2), lacuna::bit_packed_z2{}); }
void z2_bit_packed_never_dense(benchmark::State& s) { run(s, torus_boundary<lacuna::z2>(K(s), 2), lacuna::bit_packed_z2{.dense_threshold = never}); }
// args {k, threshold}: where the switch to a bitset pays
void z2_bit_packed_threshold(benchmark::State& s) {
  run(s, torus_boundary<lacuna::z2>(K(s), 2), lacuna::bit_packed_z2{.dense_threshold = static_cast<std::size_t>(s.range(1))});
}
void p3_word_threshold(benchmark::State& s) {
  run(s, torus_boundary<lacuna::mod_p<3>>(K(s), 2), lacuna::word_mod_p{.dense_threshold = static_cast<std::size_t>(s.range(1))});
}
void z2_bit_packed_kernel(benchmark::State& s) { run(s, torus_boundary<lacuna::z2>(K(s), 2), lacuna::bit_packed_z2{}, {.kernel = true}); }
// ---- Z/p ------------------------------------------------------------------------------
void p3_standard(benchmark::State& s) { run(s, torus_boundary<lacuna::mod_p<3>>(K(s), 2), lacuna::standard_reduction{}); }
void p3_word(benchmark::State& s) { run(s, torus_boundary<lacuna::mod_p<3>>(K(s), 2), lacuna::word_mod_p{}); }
void p65521_dynamic_standard(benchmark::State& s) {
  run(s, torus_boundary<lacuna::mod_p_dynamic>(K(s), 2, lacuna::mod_p_dynamic(1, 65521)), lacuna::standard_reduction{});
}
void p65521_dynamic_word(benchmark::State& s) {
  run(s, torus_boundary<lacuna::mod_p_dynamic>(K(s), 2, lacuna::mod_p_dynamic(1, 65521)), lacuna::word_mod_p{});
}
void p61_word(benchmark::State& s) { run(s, torus_boundary<lacuna::mod_p<m61>>(K(s), 2), lacuna::word_mod_p{}); }

// ---- clearing: d1 and d2 of the torus over Z/2 ---------------------------------------------
void z2_chain_clearing(benchmark::State& s) {
  const std::vector<sparse_matrix<lacuna::z2>> d{torus_boundary<lacuna::z2>(K(s), 1), torus_boundary<lacuna::z2>(K(s), 2)};
  for (auto _ : s) benchmark::DoNotOptimize(lacuna::reduce_chain_complex(d));
}
void z2_chain_one_by_one(benchmark::State& s) {
  const auto& d1 = torus_boundary<lacuna::z2>(K(s), 1);
  const auto& d2 = torus_boundary<lacuna::z2>(K(s), 2);
  for (auto _ : s) {
    benchmark::DoNotOptimize(lacuna::reduce_columns(d2));
    benchmark::DoNotOptimize(lacuna::reduce_columns(d1));
  }
}

// ---- FLINT nmod_mat_rank on the same d2 ----------------------------------------------
void flint_rank(benchmark::State& state, std::uint64_t p) {
  const auto& m = torus_boundary<lacuna::mod_p<3>>(K(state), 2);  // entries +-1: the same for every p
  nmod_mat_t A, W;
  nmod_mat_init(A, static_cast<slong>(m.rows), static_cast<slong>(m.cols), p);
  nmod_mat_init(W, static_cast<slong>(m.rows), static_cast<slong>(m.cols), p);
  for (std::size_t j = 0; j < m.cols; ++j)
    for (const auto& e : m.columns[j]) nmod_mat_entry(A, e.index, j) = e.value.value() == 1 ? 1 : p - 1;
  slong rank = 0;
  for (auto _ : state) {
    state.PauseTiming();
    nmod_mat_set(W, A);  // nmod_mat_rank works in place on a copy it makes itself; keep A intact anyway
    state.ResumeTiming();
    rank = nmod_mat_rank(W);
  }
  nmod_mat_clear(A);
  nmod_mat_clear(W);
  state.counters["cols"] = static_cast<double>(m.cols);
  state.counters["rank"] = static_cast<double>(rank);
}
void flint_z2(benchmark::State& s) { flint_rank(s, 2); }
void flint_p3(benchmark::State& s) { flint_rank(s, 3); }
void flint_p65521(benchmark::State& s) { flint_rank(s, 65521); }
void flint_p61(benchmark::State& s) { flint_rank(s, m61); }

#define TORI ->Arg(16)->Arg(32)->Arg(64)->Arg(128)->Arg(256)->Unit(benchmark::kMillisecond)
BENCHMARK(z2_standard) TORI;
BENCHMARK(z2_bit_packed) TORI->Arg(1024);
BENCHMARK(z2_bit_packed_never_dense) TORI;
BENCHMARK(z2_bit_packed_threshold)->ArgsProduct({{256}, {4, 8, 16, 32, 64, 128, 256}})->Unit(benchmark::kMillisecond);
BENCHMARK(p3_word_threshold)->ArgsProduct({{256}, {4, 8, 16, 32, 64, 128, 256}})->Unit(benchmark::kMillisecond);
BENCHMARK(z2_bit_packed_kernel) TORI;
BENCHMARK(p3_standard) TORI;
BENCHMARK(p3_word) TORI->Arg(1024);
BENCHMARK(p65521_dynamic_standard) TORI;
BENCHMARK(p65521_dynamic_word) TORI;
BENCHMARK(p61_word) TORI;
BENCHMARK(z2_chain_clearing) TORI;
BENCHMARK(z2_chain_one_by_one) TORI;
#define FLINT_TORI ->Arg(16)->Arg(32)->Unit(benchmark::kMillisecond)
BENCHMARK(flint_z2) FLINT_TORI->Arg(48);
BENCHMARK(flint_p3) FLINT_TORI->Arg(48);
BENCHMARK(flint_p65521) FLINT_TORI;
BENCHMARK(flint_p61) FLINT_TORI;

}  // namespace

BENCHMARK_MAIN();

// Torsion-rich complexes of graphs and random 2-complexes (issue 12 §5), each variant side by
// side: over Z by the coboundary route (coboundary_reduction, algorithm/integral_reduction.hpp;
// `_Z_sparse`: the same without lattice_smith_invariants for large remainders)
// `_Z_fullrank`: the same with lattice_smith_invariants for remainders of full rank only, as
// before its rank-deficient steps R1-R4), and by the old route (sparse_elimination with unit elimination and dense Smith forms of the
// core, allow_coboundary_route = false), over Z/2 and Z/3 by the default field route, over Q
// (`_Q`) by the default route. The
// complexes are built outside the timed loop. Counters: cells, b (the sum of the ranks),
// tors (the number of torsion factors), peak_MB (the rise of the resident high-water mark
// during the run, bench_support.hpp), rank_s, bordering_s and local_s for z_new (wall seconds
// in the phases of lattice_smith_invariants, from the progress reports) and maxrss_MB (getrusage's ru_maxrss of the whole
// process so far: an upper bound, it never goes down).
//   build-rel/bin/bench_torsion --benchmark_filter='matching|chessboard|linial'
// Cases the old route does not finish in minutes are not registered for it.
#include "bench_support.hpp"

#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>
#include <sys/resource.h>

#include <chrono>
#include <map>
#include <memory>
#include <string>
#include <random>

namespace {

using complex_t = lacuna::simplicial_complex<int>;

const complex_t& matching(int n) {
  static std::map<int, std::unique_ptr<complex_t>> cache;
  auto& slot = cache[n];
  if (!slot) slot = std::make_unique<complex_t>(lacuna::matching_complex(n));
  return *slot;
}
const complex_t& chessboard(int n) {  // n x n
  static std::map<int, std::unique_ptr<complex_t>> cache;
  auto& slot = cache[n];
  if (!slot) slot = std::make_unique<complex_t>(lacuna::chessboard_complex(n, n));
  return *slot;
}
/// All edges on n vertices and each triangle with probability 3/n (Linial & Meshulam 2006),
/// past the threshold c/n (c ≈ 2.75) where H_1 over Q vanishes, so H_1 is finite and its
/// torsion large. Seed 12.
const complex_t& linial(int n) {
  static std::map<int, std::unique_ptr<complex_t>> cache;
  auto& slot = cache[n];
  if (!slot) {
    std::mt19937_64 rng(12);
    std::bernoulli_distribution keep(3.0 / n);
    std::vector<std::vector<int>> facets;
    for (int a = 0; a < n; ++a)
      for (int b = a + 1; b < n; ++b) facets.push_back({a, b});
    for (int a = 0; a < n; ++a)
      for (int b = a + 1; b < n; ++b)
        for (int d = b + 1; d < n; ++d)
          if (keep(rng)) facets.push_back({a, b, d});
    slot = std::make_unique<complex_t>(complex_t::from_facets(facets));
  }
  return *slot;
}

enum variant { z_new, z_new_fullrank, z_new_sparse, z_old, z2_field, z3_field, z2_new, q_ranks };

template <class C>
void run(benchmark::State& state, const C& c, variant v) {
  double b = 0, tors = 0;
  std::map<std::string, double> phase_seconds;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    b = tors = 0;
    auto take = [&](const auto& h) {
      for (const auto& g : h.groups) b += static_cast<double>(g.rank), tors += static_cast<double>(g.torsion.size());
    };
    switch (v) {
      case z_new: {
        // Wall time per progress phase (a phase lasts until a report of another phase).
        lacuna::homology_options o;
        std::string phase;
        auto since = std::chrono::steady_clock::now();
        o.control.progress = [&](const lacuna::progress_report& r) {
          if (r.phase == phase) return;
          const auto now = std::chrono::steady_clock::now();
          phase_seconds[phase] += std::chrono::duration<double>(now - since).count();
          phase = r.phase, since = now;
        };
        take(lacuna::homology<lacuna::integer>(c, o, lacuna::coboundary_reduction{}));
        break;
      }
      case z_new_fullrank:
        take(lacuna::homology<lacuna::integer>(c, {}, lacuna::coboundary_reduction{.lattice_rank_deficient = false}));
        break;
      case z_new_sparse:  // remainders past dense_limit by the sparse route only
        take(lacuna::homology<lacuna::integer>(c, {}, lacuna::coboundary_reduction{.lattice_smith = false}));
        break;
      case z_old: take(lacuna::homology<lacuna::integer>(c, {}, lacuna::sparse_elimination{.allow_coboundary_route = false})); break;
      case z2_field: take(lacuna::homology<lacuna::z2>(c)); break;
      case z3_field: take(lacuna::homology<lacuna::mod_p<3>>(c)); break;
      case z2_new: take(lacuna::homology<lacuna::z2>(c, {}, lacuna::coboundary_reduction{})); break;
      case q_ranks: take(lacuna::homology<lacuna::rational>(c)); break;  // the default route over Q
    }
  }
  double cells = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) cells += static_cast<double>(lacuna::cell_count(c, k));
  lacuna_bench::report_peak(state, before, cells);
  state.counters.erase("bytes_per_cell");
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  state.counters["maxrss_MB"] = static_cast<double>(u.ru_maxrss) / 1024.0;
  state.counters["b"] = b;
  state.counters["tors"] = tors;
  if (v == z_new) {
    state.counters["rank_s"] = phase_seconds["Smith form of the core: rank mod p"];
    state.counters["bordering_s"] = phase_seconds["Smith form of the core: bordering minors"];
    state.counters["local_s"] = phase_seconds["Smith form of the core: local Smith forms"];
  }
}

int A(const benchmark::State& s) { return static_cast<int>(s.range(0)); }

void matching_Z_new(benchmark::State& s) { run(s, matching(A(s)), z_new); }
void matching_Z_old(benchmark::State& s) { run(s, matching(A(s)), z_old); }
void matching_Z_fullrank(benchmark::State& s) { run(s, matching(A(s)), z_new_fullrank); }
void chessboard_Z_fullrank(benchmark::State& s) { run(s, chessboard(A(s)), z_new_fullrank); }
void matching_Z_sparse(benchmark::State& s) { run(s, matching(A(s)), z_new_sparse); }
void matching_Z2(benchmark::State& s) { run(s, matching(A(s)), z2_field); }
void matching_Z3(benchmark::State& s) { run(s, matching(A(s)), z3_field); }
void matching_Z2_new(benchmark::State& s) { run(s, matching(A(s)), z2_new); }
void matching_Q(benchmark::State& s) { run(s, matching(A(s)), q_ranks); }
void chessboard_Z_new(benchmark::State& s) { run(s, chessboard(A(s)), z_new); }
void chessboard_Z_old(benchmark::State& s) { run(s, chessboard(A(s)), z_old); }
void chessboard_Z2(benchmark::State& s) { run(s, chessboard(A(s)), z2_field); }
void chessboard_Z3(benchmark::State& s) { run(s, chessboard(A(s)), z3_field); }
void chessboard_Z2_new(benchmark::State& s) { run(s, chessboard(A(s)), z2_new); }
void chessboard_Q(benchmark::State& s) { run(s, chessboard(A(s)), q_ranks); }
void linial_Z_new(benchmark::State& s) { run(s, linial(A(s)), z_new); }
void linial_Z_old(benchmark::State& s) { run(s, linial(A(s)), z_old); }
void linial_Z2(benchmark::State& s) { run(s, linial(A(s)), z2_field); }
void linial_Z3(benchmark::State& s) { run(s, linial(A(s)), z3_field); }
void linial_Q(benchmark::State& s) { run(s, linial(A(s)), q_ranks); }

// The default rule's other side: tori and cubical volumes, old route against new.
void torus_Z_new(benchmark::State& s) { run(s, lacuna_bench::torus(A(s)), z_new); }
void torus_Z_old(benchmark::State& s) { run(s, lacuna_bench::torus(A(s)), z_old); }
void volume_Z_new(benchmark::State& s) { run(s, lacuna_bench::random_volume(static_cast<std::size_t>(A(s))), z_new); }
void volume_Z_old(benchmark::State& s) { run(s, lacuna_bench::random_volume(static_cast<std::size_t>(A(s))), z_old); }

#define ONCE ->Iterations(1)->Unit(benchmark::kMillisecond)
// The coboundary route's rank-deficient lattice step runs on two threads: CPU time of the
// whole process.
#define ONCE_PROCESS ->Iterations(1)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()
BENCHMARK(matching_Z_new)->DenseRange(9, 14) ONCE_PROCESS;
BENCHMARK(matching_Z_fullrank)->DenseRange(11, 12) ONCE;
BENCHMARK(chessboard_Z_fullrank)->DenseRange(7, 8) ONCE;
BENCHMARK(matching_Z_sparse)->DenseRange(11, 12) ONCE;
BENCHMARK(matching_Z_old)->DenseRange(9, 10) ONCE;
BENCHMARK(matching_Z2)->DenseRange(9, 14) ONCE;
BENCHMARK(matching_Z3)->DenseRange(9, 14) ONCE;
BENCHMARK(matching_Z2_new)->DenseRange(9, 12) ONCE;
BENCHMARK(matching_Q)->DenseRange(9, 13) ONCE_PROCESS;
BENCHMARK(chessboard_Z_new)->DenseRange(4, 8) ONCE_PROCESS;
BENCHMARK(chessboard_Z_old)->DenseRange(4, 6) ONCE;
BENCHMARK(chessboard_Z2)->DenseRange(4, 8) ONCE;
BENCHMARK(chessboard_Z3)->DenseRange(4, 7) ONCE;
BENCHMARK(chessboard_Z2_new)->DenseRange(4, 7) ONCE;
BENCHMARK(chessboard_Q)->DenseRange(4, 8) ONCE_PROCESS;
BENCHMARK(linial_Z_new)->Arg(30)->Arg(45)->Arg(60) ONCE;
BENCHMARK(linial_Z_old)->Arg(30)->Arg(45)->Arg(60) ONCE;
BENCHMARK(linial_Z2)->Arg(30)->Arg(45)->Arg(60) ONCE;
BENCHMARK(linial_Z3)->Arg(30)->Arg(45)->Arg(60) ONCE;
BENCHMARK(linial_Q)->Arg(30)->Arg(45)->Arg(60) ONCE_PROCESS;
BENCHMARK(torus_Z_new)->Arg(64)->Arg(256)->Arg(1024) ONCE;
BENCHMARK(torus_Z_old)->Arg(64)->Arg(256)->Arg(1024) ONCE;
BENCHMARK(volume_Z_new)->Arg(32)->Arg(64) ONCE;
BENCHMARK(volume_Z_old)->Arg(32)->Arg(64) ONCE;

}  // namespace

BENCHMARK_MAIN();

// Homology over Z/2 and Z/3 by the two routes of lacuna::homology, side by side:
//   old       sparse_elimination{.field_column_reduction = false}: unit pivots eliminated,
//             then dense Smith forms of the core (the route of the integers);
//   new       the default: the ranks of the boundary maps by column reduction with clearing
//             (lacuna/algorithm/field_ranks.hpp), direction chosen from the complex's shape;
// and, to choose the new route's settings, field_betti_numbers called directly on the chain
// complex (the build is outside the timed part there, inside it for old/new):
//   cob_pre / cob_nopre   coreductions and collapses first or not, then coboundary matrices
//   bd_pre / bd_nopre     the same, then boundary matrices
//   given_* / reversed_*  no pre-reduction, cells in the complex's order or reversed
// Complexes: chessboard 7x7 (non-attacking rook placements), matching complexes of K_11,
// K_12 and K_13 (K_13: new route and settings only), the 256 x 256 torus, a 128^3 coin-flip
// cubical volume; on volumes also the route of the command-line tool, old_morse / new_morse
// (pre_reduction::morse, then either route), at 128^3 and 256^3 (large complexes are built
// by the first run that needs them, before its timing and its peak_MB start). One iteration
// each; peak_MB is the rise of the resident high-water mark during the run
// (bench_support.hpp).
//   build-rel/bin/bench_field_homology
//   build-rel/bin/bench_field_homology --benchmark_filter='chessboard'
#include "bench_support.hpp"

#include <lacuna/algorithm/field_ranks.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <benchmark/benchmark.h>

#include <numeric>
#include <string>
#include <vector>

namespace {

using complex_t = lacuna::simplicial_complex<int>;

// matching_complex and chessboard_complex: the library's (complex/construct/graph_complexes.hpp)
using lacuna::chessboard_complex;
using lacuna::matching_complex;

template <class C>
double cell_total(const C& c) {
  std::size_t cells = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) cells += lacuna::cell_count(c, k);
  return static_cast<double>(cells);
}

template <class C>
void report_betti(benchmark::State& state, const std::vector<std::size_t>& b) {
  std::size_t total = std::accumulate(b.begin(), b.end(), std::size_t{0});
  state.counters["sum_betti"] = static_cast<double>(total);
}

template <class F, class C>
void route(benchmark::State& state, const C& c, bool field_column_reduction) {
  std::vector<std::size_t> betti;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    auto h = lacuna::homology<F>(c, {}, lacuna::sparse_elimination{.field_column_reduction = field_column_reduction});
    betti = h.betti_numbers();
    benchmark::DoNotOptimize(h);
  }
  lacuna_bench::report_peak(state, before, cell_total(c));
  report_betti<C>(state, betti);
}

/// The route of the command-line tool on images and volumes: the lower-star Morse complex
/// first (pre_reduction::morse), then either route on it.
template <class F, class C>
void morse_route(benchmark::State& state, const C& c, bool field_column_reduction) {
  std::vector<std::size_t> betti;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    auto h = lacuna::homology<F>(c, {}, lacuna::sparse_elimination{.reduction = lacuna::pre_reduction::morse,
                                                                      .field_column_reduction = field_column_reduction});
    betti = h.betti_numbers();
    benchmark::DoNotOptimize(h);
  }
  lacuna_bench::report_peak(state, before, cell_total(c));
  report_betti<C>(state, betti);
}

template <class F, class C>
void variant(benchmark::State& state, const C& c, bool pre, lacuna::reduction_direction direction) {
  std::vector<std::size_t> betti;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    state.PauseTiming();
    auto rc = lacuna::elimination_workspace<F>::build(c);
    state.ResumeTiming();
    lacuna::elimination_options e;
    e.markowitz = false;
    betti = lacuna::field_betti_numbers(rc, pre ? &e : nullptr, {.direction = direction});
    benchmark::DoNotOptimize(betti);
  }
  lacuna_bench::report_peak(state, before, cell_total(c));
  report_betti<C>(state, betti);
}

template <class F, class C>
void register_morse(const std::string& field_name, const std::string& complex_name, const C& c) {
  auto add = [&](const std::string& what, auto fn) {
    benchmark::RegisterBenchmark((what + "_" + field_name + "/" + complex_name).c_str(), fn)
        ->Iterations(1)
        ->Unit(benchmark::kMillisecond);
  };
  add("old_morse", [&c](benchmark::State& s) { morse_route<F>(s, c, false); });
  add("new_morse", [&c](benchmark::State& s) { morse_route<F>(s, c, true); });
}

template <class F, class C>
void order_variant(benchmark::State& state, const C& c, bool reversed, lacuna::reduction_direction direction) {
  std::vector<std::size_t> betti;
  const long before = lacuna_bench::begin_peak();
  for (auto _ : state) {
    state.PauseTiming();
    auto rc = lacuna::elimination_workspace<F>::build(c);
    state.ResumeTiming();
    betti = lacuna::field_betti_numbers(rc, nullptr, {.direction = direction, .reversed = reversed});
    benchmark::DoNotOptimize(betti);
  }
  lacuna_bench::report_peak(state, before, cell_total(c));
  report_betti<C>(state, betti);
}

template <class F, class C>
void register_order(const std::string& field_name, const std::string& complex_name, const C& c) {
  using lacuna::reduction_direction;
  for (bool rev : {false, true})
    for (auto dir : {reduction_direction::coboundary, reduction_direction::boundary}) {
      const std::string name = std::string(rev ? "reversed_" : "given_") +
                               (dir == reduction_direction::coboundary ? "cob_" : "bd_") + field_name + "/" + complex_name;
      benchmark::RegisterBenchmark(name.c_str(), [&c, rev, dir](benchmark::State& s) { order_variant<F>(s, c, rev, dir); })
          ->Iterations(1)
          ->Unit(benchmark::kMillisecond);
    }
}

template <class F, class C>
void register_all(const std::string& field_name, const std::string& complex_name, const C& c, bool with_old) {
  auto add = [&](const std::string& what, auto fn) {
    benchmark::RegisterBenchmark((what + "_" + field_name + "/" + complex_name).c_str(), fn)
        ->Iterations(1)
        ->Unit(benchmark::kMillisecond);
  };
  if (with_old) add("old", [&c](benchmark::State& s) { route<F>(s, c, false); });
  add("new", [&c](benchmark::State& s) { route<F>(s, c, true); });
  using lacuna::reduction_direction;
  add("cob_pre", [&c](benchmark::State& s) { variant<F>(s, c, true, reduction_direction::coboundary); });
  add("cob_nopre", [&c](benchmark::State& s) { variant<F>(s, c, false, reduction_direction::coboundary); });
  add("bd_pre", [&c](benchmark::State& s) { variant<F>(s, c, true, reduction_direction::boundary); });
  add("bd_nopre", [&c](benchmark::State& s) { variant<F>(s, c, false, reduction_direction::boundary); });
}

}  // namespace

int main(int argc, char** argv) {
  benchmark::Initialize(&argc, argv);
  // Built before any run, so that no run's peak includes them.
  static const complex_t chess = chessboard_complex(7, 7);
  static const complex_t m11 = matching_complex(11);
  static const complex_t m12 = matching_complex(12);
  const complex_t& torus = lacuna_bench::torus(256);
  const auto& volume = lacuna_bench::random_volume(128);
  using z3 = lacuna::mod_p<3>;
  register_all<lacuna::z2>("z2", "chessboard_7x7", chess, true);
  register_all<z3>("z3", "chessboard_7x7", chess, true);
  register_all<lacuna::z2>("z2", "matching_K11", m11, true);
  register_all<z3>("z3", "matching_K11", m11, true);
  register_all<lacuna::z2>("z2", "matching_K12", m12, true);
  register_all<z3>("z3", "matching_K12", m12, true);
  register_all<lacuna::z2>("z2", "torus_256", torus, true);
  register_all<z3>("z3", "torus_256", torus, true);
  register_all<lacuna::z2>("z2", "volume_128", volume, true);
  register_all<z3>("z3", "volume_128", volume, true);
  register_morse<lacuna::z2>("z2", "volume_128", volume);
  register_morse<z3>("z3", "volume_128", volume);
  register_order<lacuna::z2>("z2", "chessboard_7x7", chess);
  register_order<z3>("z3", "chessboard_7x7", chess);
  register_order<lacuna::z2>("z2", "matching_K12", m12);
  register_order<z3>("z3", "matching_K12", m12);
  register_order<lacuna::z2>("z2", "torus_256", torus);
  register_order<lacuna::z2>("z2", "volume_128", volume);
  // The matching complex of K_13 (568 503 cells): the new route and its settings only (the
  // old route does not finish in minutes); built by the first of these runs, before its
  // timing and peak_MB start.
  static const auto m13 = [] {
    static const complex_t m = matching_complex(13);
    return &m;
  };
  using lacuna::reduction_direction;
  auto add13 = [](const std::string& name, auto fn) {
    benchmark::RegisterBenchmark((name + "/matching_K13").c_str(), fn)->Iterations(1)->Unit(benchmark::kMillisecond);
  };
  add13("new_z2", [](benchmark::State& s) { route<lacuna::z2>(s, *m13(), true); });
  add13("new_z3", [](benchmark::State& s) { route<z3>(s, *m13(), true); });
  add13("given_cob_z2", [](benchmark::State& s) { order_variant<lacuna::z2>(s, *m13(), false, reduction_direction::coboundary); });
  add13("reversed_cob_z2", [](benchmark::State& s) { order_variant<lacuna::z2>(s, *m13(), true, reduction_direction::coboundary); });
  add13("cob_pre_z2", [](benchmark::State& s) { variant<lacuna::z2>(s, *m13(), true, reduction_direction::coboundary); });
  add13("given_cob_z3", [](benchmark::State& s) { order_variant<z3>(s, *m13(), false, reduction_direction::coboundary); });
  add13("reversed_cob_z3", [](benchmark::State& s) { order_variant<z3>(s, *m13(), true, reduction_direction::coboundary); });
  add13("cob_pre_z3", [](benchmark::State& s) { variant<z3>(s, *m13(), true, reduction_direction::coboundary); });
  // The 256^3 coin-flip volume (1.1e8 cells) through the Morse route only; built when first run.
  for (const char* f : {"z2", "z3"}) {
    const std::string field = f;
    benchmark::RegisterBenchmark(("old_morse_" + field + "/volume_256").c_str(),
                                 [field](benchmark::State& s) {
                                   const auto& v = lacuna_bench::random_volume(256);
                                   if (field == "z2") morse_route<lacuna::z2>(s, v, false);
                                   else morse_route<z3>(s, v, false);
                                 })
        ->Iterations(1)
        ->Unit(benchmark::kMillisecond);
    benchmark::RegisterBenchmark(("new_morse_" + field + "/volume_256").c_str(),
                                 [field](benchmark::State& s) {
                                   const auto& v = lacuna_bench::random_volume(256);
                                   if (field == "z2") morse_route<lacuna::z2>(s, v, true);
                                   else morse_route<z3>(s, v, true);
                                 })
        ->Iterations(1)
        ->Unit(benchmark::kMillisecond);
  }
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}

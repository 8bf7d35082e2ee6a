// The whole homology engine (lacuna::homology, sparse_elimination) on k x k tori up to
// k = 1024 (6.3 million cells) and on a 128^3 random cubical volume: over the integers with
// and without generators, and over Z/2. The complexes are built outside the timed loop,
// except in torus_file_*: there the timed loop reads the .facets file (written once, in the
// temporary directory) and computes with the options of the command-line tool (generators,
// no coordinate basis, two threads), the whole job of `lacuna homology --generators`.
//   build/bin/bench_homology --benchmark_filter=torus
#include "bench_support.hpp"

#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <lacuna/io/facets.hpp>

#include <benchmark/benchmark.h>

#include <filesystem>

namespace {

template <class R, class C>
void run(benchmark::State& state, const C& c, bool generators) {
  std::size_t b1 = 0;
  for (auto _ : state) {
    auto h = lacuna::homology<R>(c, {.generators = generators});
    b1 = h.groups.size() > 1 ? h.groups[1].rank : 0;
    benchmark::DoNotOptimize(h);
  }
  std::size_t cells = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) cells += lacuna::cell_count(c, k);
  state.counters["cells"] = static_cast<double>(cells);
  state.counters["b1"] = static_cast<double>(b1);
}

int K(const benchmark::State& s) { return static_cast<int>(s.range(0)); }

void torus_file_read(benchmark::State& s) {
  const auto file = lacuna_bench::torus_facets_file(K(s));
  for (auto _ : s) {
    auto c = lacuna::io::read_facets(file);
    benchmark::DoNotOptimize(c);
  }
  std::filesystem::remove(file);
}

void torus_file_integer_generators(benchmark::State& s) {
  const auto file = lacuna_bench::torus_facets_file(K(s));
  std::size_t b1 = 0;
  for (auto _ : s) {
    const auto c = lacuna::io::read_facets(file);
    auto h = lacuna::homology<lacuna::integer>(c, {.generators = true, .keep_basis = false, .threads = 2});
    b1 = h.groups[1].rank;
    benchmark::DoNotOptimize(h);
  }
  s.counters["b1"] = static_cast<double>(b1);
  std::filesystem::remove(file);
}

void torus_integer(benchmark::State& s) { run<lacuna::integer>(s, lacuna_bench::torus(K(s)), false); }
void torus_integer_generators(benchmark::State& s) { run<lacuna::integer>(s, lacuna_bench::torus(K(s)), true); }
void torus_z2(benchmark::State& s) { run<lacuna::z2>(s, lacuna_bench::torus(K(s)), false); }
void volume_integer(benchmark::State& s) { run<lacuna::integer>(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), false); }
void volume_integer_generators(benchmark::State& s) { run<lacuna::integer>(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), true); }
void volume_z2(benchmark::State& s) { run<lacuna::z2>(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), false); }

#define SMALL ->Arg(24)->Arg(64)->Arg(256)->Unit(benchmark::kMillisecond)
#define BIG ->Arg(1024)->Iterations(1)->Unit(benchmark::kMillisecond)
BENCHMARK(torus_integer) SMALL;
BENCHMARK(torus_integer) BIG;
BENCHMARK(torus_integer_generators) SMALL;
BENCHMARK(torus_integer_generators) BIG;
BENCHMARK(torus_z2) SMALL;
BENCHMARK(torus_z2) BIG;
BENCHMARK(torus_file_read)->Arg(256)->Arg(1024)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(torus_file_integer_generators)->Arg(256)->Arg(1024)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_integer)->Arg(32)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_integer)->Arg(128)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_integer_generators)->Arg(32)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_integer_generators)->Arg(128)->Iterations(1)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_z2)->Arg(32)->Unit(benchmark::kMillisecond);
BENCHMARK(volume_z2)->Arg(128)->Iterations(1)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();

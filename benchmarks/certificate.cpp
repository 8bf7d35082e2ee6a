// Certified homology (homology/certify.hpp) and its checker (homology/certificate.hpp) beside
// the computation of generators alone, over the integers, one thread: the k x k torus and
// porous and coin-flip volumes (tests/cubical/volume_support.hpp). Each case times one of
//   generators   lacuna::homology with generators (the elimination route, basis kept);
//   certify      lacuna::certified_homology (the same, plus cocycles, bounding chains and
//                the rank witnesses mod p);
//   check        lacuna::check_certificate on a certificate made outside the timed loop;
//   verify       lacuna::verify_generators (homology/verify.hpp: it makes a certificate of the
//                complex, checks it, and reads the result's generators in its cocycles) on a
//                result of lacuna::homology with generators made outside the timed loop.
// Counters: cells, b1, cocycle_terms (check), and the memory of the timed run: peak_MB, the
// rise of the resident high-water mark over what was resident before it (bench_support.hpp:
// for check, the certificate is made before the mark is reset), and peak_RSS_MB, the mark
// itself (the complex and, for check, the certificate included); for check, certify_cpu_s is
// the CPU time of making the certificate (untimed by the benchmark). porous/256 (78.6 M cells) is
// run alone, one case per process, so that each figure is that case's own:
//   build/bin/bench_certificate --benchmark_filter='torus/1024|porous/64'
//   build/bin/bench_certificate --benchmark_filter='porous_(generators|check)/256/'
#include "../tests/cubical/volume_support.hpp"
#include "bench_support.hpp"

#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/integer.hpp>

#include <benchmark/benchmark.h>

#include <ctime>
#include <map>
#include <optional>
#include <memory>

namespace {

using lacuna::integer;

const lacuna::cubical_complex<3>& porous(std::size_t n) {
  static std::map<std::size_t, std::unique_ptr<lacuna::cubical_complex<3>>> cache;
  auto& slot = cache[n];
  if (!slot) {
    const auto v = lacuna_volumes::porous_volume(n, 2.0, 7);
    slot = std::make_unique<lacuna::cubical_complex<3>>(lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels));
  }
  return *slot;
}

enum class what { generators, certify, check, verify };

template <class C>
void run(benchmark::State& s, const C& c, what w) {
  std::size_t b1 = 0, witness_terms = 0;
  std::optional<lacuna::homology_certificate<integer>> cert;
  double certify_cpu = 0;  // check: the CPU time of making its certificate (outside the timed loop)
  if (w == what::check) {
    const std::clock_t t0 = std::clock();
    cert = lacuna::certified_homology<integer>(c).certificate;
    certify_cpu = static_cast<double>(std::clock() - t0) / CLOCKS_PER_SEC;
  }
  std::optional<lacuna::homology_result<integer>> result;
  if (w == what::verify) result = lacuna::homology<integer>(c, {.generators = true});
  const long before = lacuna_bench::begin_peak();
  for (auto _ : s) {
    if (w == what::generators) {
      auto h = lacuna::homology<integer>(c, {.generators = true, .keep_basis = true});
      b1 = h.groups.size() > 1 ? h.groups[1].rank : 0;
      benchmark::DoNotOptimize(h);
    } else if (w == what::certify) {
      auto r = lacuna::certified_homology<integer>(c);
      b1 = r.result.groups.size() > 1 ? r.result.groups[1].rank : 0;
      benchmark::DoNotOptimize(r);
    } else if (w == what::verify) {
      const auto rep = lacuna::verify_generators(c, *result);
      if (!rep.ok) s.SkipWithError(rep.first_failure.c_str());
      b1 = result->groups.size() > 1 ? result->groups[1].rank : 0;
    } else {
      const auto rep = lacuna::check_certificate(c, *cert);
      if (!rep.ok) s.SkipWithError(rep.first_failure.c_str());
      b1 = cert->groups.size() > 1 ? cert->groups[1].rank : 0;
    }
  }
  if (cert)
    for (const auto& g : cert->groups)
      for (const auto& x : g.cocycles) witness_terms += x.terms.size();
  lacuna_bench::report_peak(s, before, static_cast<double>(lacuna::total_cell_count(c)));
  s.counters["peak_RSS_MB"] = static_cast<double>(lacuna_bench::status_kib("VmHWM")) / 1024.0;
  s.counters["b1"] = static_cast<double>(b1);
  if (cert) s.counters["cocycle_terms"] = static_cast<double>(witness_terms);
  if (cert) s.counters["certify_cpu_s"] = certify_cpu;
}

void torus_generators(benchmark::State& s) { run(s, lacuna_bench::torus(static_cast<int>(s.range(0))), what::generators); }
void torus_certify(benchmark::State& s) { run(s, lacuna_bench::torus(static_cast<int>(s.range(0))), what::certify); }
void torus_check(benchmark::State& s) { run(s, lacuna_bench::torus(static_cast<int>(s.range(0))), what::check); }
void porous_generators(benchmark::State& s) { run(s, porous(static_cast<std::size_t>(s.range(0))), what::generators); }
void porous_certify(benchmark::State& s) { run(s, porous(static_cast<std::size_t>(s.range(0))), what::certify); }
void porous_check(benchmark::State& s) { run(s, porous(static_cast<std::size_t>(s.range(0))), what::check); }
void coin_flip_generators(benchmark::State& s) {
  run(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), what::generators);
}
void coin_flip_certify(benchmark::State& s) {
  run(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), what::certify);
}
void coin_flip_check(benchmark::State& s) {
  run(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), what::check);
}
void torus_verify(benchmark::State& s) { run(s, lacuna_bench::torus(static_cast<int>(s.range(0))), what::verify); }
void porous_verify(benchmark::State& s) { run(s, porous(static_cast<std::size_t>(s.range(0))), what::verify); }
void coin_flip_verify(benchmark::State& s) {
  run(s, lacuna_bench::random_volume(static_cast<std::size_t>(s.range(0))), what::verify);
}

}  // namespace

BENCHMARK(torus_generators)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(torus_certify)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(torus_check)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(porous_generators)->Arg(64)->Arg(128)->Arg(256)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(porous_certify)->Arg(64)->Arg(128)->Arg(256)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(porous_check)->Arg(64)->Arg(128)->Arg(256)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(coin_flip_generators)->Arg(64)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(coin_flip_certify)->Arg(64)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(coin_flip_check)->Arg(64)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(torus_verify)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(porous_verify)->Arg(64)->Arg(128)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(coin_flip_generators)->Arg(24)->Arg(32)->Arg(40)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(coin_flip_verify)->Arg(24)->Arg(32)->Arg(40)->Arg(64)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK_MAIN();

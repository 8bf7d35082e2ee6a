// The scale study of the MPI part (lacuna/distributed/): homology of a porous volume over
// 1-4 processes, against the one-process engine on the same file. Run by mpiexec; every rank
// runs the same benchmarks with one iteration each (their collective calls must match), and
// rank 0 reports. Counters:
//   peak_MB_max_rank  the largest peak resident memory over the ranks (VmHWM, reset before
//                     the run, minus the resident memory before it: bench_support.hpp)
//   cpu_s_sum         CPU seconds of all ranks together (getrusage, user + system)
//   bytes_sent_sum    payload bytes sent over MPI by all ranks (counted by lacuna)
//   peak_MB_root      the root's peak (as above): with the reduction tree off, the root holds
//                     every slab's residual at once
//   residual_cells    critical cells of the slab reductions; glued_cells: cells of the complex
//                     the root hands to the engine
// Arguments of distributed_homology: slabs per rank, then 1 for the reduction tree
// (slab_reduction_tree.hpp), 0 for the one-step gather of every residual on the root.
// distributed_homology runs the explicit route (cubical_duality = false); distributed_duality
// the duality route (volume_duality.hpp), with getrusage's maximum resident set per rank too.
// The volume file is written once, apart from the measured runs:
//   bench_distributed_scale --write-volume=N FILE    (porous, sigma 2, seed 20261202)
// then LACUNA_SCALE_VOLUME=FILE mpiexec -n P bench_distributed_scale [--benchmark_filter=...]
#include <lacuna/distributed/volume_duality.hpp>
#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>

#include "../tests/cubical/volume_support.hpp"
#include "bench_support.hpp"

#include <benchmark/benchmark.h>
#include <mpi.h>
#include <sys/resource.h>

#include <cstdlib>
#include <cstring>
#include <iostream>
#include <string>

namespace {

double cpu_seconds() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) + 1e-6 * static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec);
}

std::string volume_file() {
  const char* f = std::getenv("LACUNA_SCALE_VOLUME");
  return f ? f : "";
}

template <class T>
T max_over_ranks(T v) {
  double d = static_cast<double>(v), m = 0;
  MPI_Allreduce(&d, &m, 1, MPI_DOUBLE, MPI_MAX, MPI_COMM_WORLD);
  return static_cast<T>(m);
}
// "b<k>" (appended, not "b" + std::to_string(k): GCC 12 at -O3 warns falsely, -Wrestrict, there)
std::string betti_counter(std::size_t k) {
  std::string name = "b";
  name += std::to_string(k);
  return name;
}
double sum_over_ranks(double v) {
  double s = 0;
  MPI_Allreduce(&v, &s, 1, MPI_DOUBLE, MPI_SUM, MPI_COMM_WORLD);
  return s;
}

// blocks per rank: state.range(0); reduction tree: state.range(1)
void distributed_homology(benchmark::State& state) {
  const std::string file = volume_file();
  lacuna::distributed::volume_run_statistics st;
  std::vector<std::size_t> betti;
  for (auto _ : state) {
    MPI_Barrier(MPI_COMM_WORLD);
    const long before = lacuna_bench::begin_peak();
    const double cpu0 = cpu_seconds();
    const auto r = lacuna::distributed::volume_homology<lacuna::integer>(
        MPI_COMM_WORLD, file, {.blocks_per_rank = static_cast<std::size_t>(state.range(0)), .reduction_tree = state.range(1) != 0,
                               .cubical_duality = false});
    const double cpu = cpu_seconds() - cpu0;
    st = r.statistics;
    if (r.has_result) betti = r.result.betti_numbers();
    const long peak = lacuna_bench::status_kib("VmHWM") - before;
    state.counters["peak_MB_max_rank"] = max_over_ranks(static_cast<double>(peak) / 1024.0);
    state.counters["peak_MB_root"] = max_over_ranks(r.has_result ? static_cast<double>(peak) / 1024.0 : 0.0);
    state.counters["cpu_s_sum"] = sum_over_ranks(cpu);
    MPI_Barrier(MPI_COMM_WORLD);
  }
  state.counters["bytes_sent_sum"] = sum_over_ranks(static_cast<double>(st.bytes_sent));
  state.counters["residual_cells"] = sum_over_ranks(static_cast<double>(st.residual_cells));
  state.counters["glued_cells"] = sum_over_ranks(static_cast<double>(st.glued_cells));
  for (std::size_t k = 0; k < betti.size(); ++k) state.counters[betti_counter(k)] = static_cast<double>(betti[k]);
}
BENCHMARK(distributed_homology)->Args({1, 1})->Args({4, 1})->Args({1, 0})->Args({4, 0})->Iterations(1)->UseRealTime()->Unit(benchmark::kSecond);

// The readers' limits for the study: 2^32 grid cells by default (io/read_limits.hpp) refuse a
// 1024³ volume ((2·1024 + 1)³ ≈ 8.6·10^9 cells); the study raises them to 2^36 cells and 2^36
// bytes, for the duality route and the one-process engine alike.
lacuna::io::read_limits scale_limits() {
  return {.max_cells = std::uint64_t{1} << 36, .max_bytes = std::uint64_t{1} << 36};
}

// The duality route (lacuna/distributed/volume_duality.hpp): labellings and χ, summaries joined
// in a reduction tree. maxrss_MB_*: getrusage's maximum resident set of each process, gathered
// (the whole process, MPI runtime included; run this benchmark alone in its mpiexec so that
// nothing before it raised the mark).
void distributed_duality(benchmark::State& state) {
  const std::string file = volume_file();
  lacuna::distributed::volume_duality_result d;
  for (auto _ : state) {
    MPI_Barrier(MPI_COMM_WORLD);
    const long before = lacuna_bench::begin_peak();
    const double cpu0 = cpu_seconds();
    d = lacuna::distributed::volume_duality(MPI_COMM_WORLD, file, {.limits = scale_limits()});
    const double cpu = cpu_seconds() - cpu0;
    const long peak = lacuna_bench::status_kib("VmHWM") - before;
    state.counters["peak_MB_max_rank"] = max_over_ranks(static_cast<double>(peak) / 1024.0);
    state.counters["cpu_s_sum"] = sum_over_ranks(cpu);
    MPI_Barrier(MPI_COMM_WORLD);
  }
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  const double maxrss = static_cast<double>(u.ru_maxrss) / 1024.0;  // KiB on Linux
  state.counters["maxrss_MB_max_rank"] = max_over_ranks(maxrss);
  state.counters["maxrss_MB_min_rank"] = -max_over_ranks(-maxrss);
  state.counters["bytes_sent_sum"] = sum_over_ranks(static_cast<double>(d.communication.bytes_sent));
  state.counters["bytes_sent_max_rank"] = max_over_ranks(static_cast<double>(d.communication.bytes_sent));
  state.counters["label_MB_max_rank"] = max_over_ranks(static_cast<double>(d.label_bytes) / 1048576.0);
  if (d.has_result)
    for (std::size_t k = 0; k < 4; ++k) state.counters[betti_counter(k)] = static_cast<double>(d.betti[k]);
}
BENCHMARK(distributed_duality)->Iterations(1)->UseRealTime()->Unit(benchmark::kSecond);

// The one-process engine on the same file (run with one process).
void one_process_homology(benchmark::State& state) {
  int size = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &size);
  if (size != 1) {
    state.SkipWithError("run with one process");
    return;
  }
  for (auto _ : state) {
    const long before = lacuna_bench::begin_peak();
    const double cpu0 = cpu_seconds();
    const auto r = lacuna::homology<lacuna::integer>(
        lacuna::io::read_nrrd<3>(std::filesystem::path(volume_file()), {.limits = scale_limits()}));
    state.counters["cpu_s_sum"] = cpu_seconds() - cpu0;
    state.counters["peak_MB_max_rank"] = static_cast<double>(lacuna_bench::status_kib("VmHWM") - before) / 1024.0;
    const auto b = r.betti_numbers();
    for (std::size_t k = 0; k < b.size(); ++k) state.counters[betti_counter(k)] = static_cast<double>(b[k]);
  }
}
BENCHMARK(one_process_homology)->Iterations(1)->UseRealTime()->Unit(benchmark::kSecond);

class silent_reporter : public benchmark::BenchmarkReporter {
 public:
  bool ReportContext(const Context&) override { return true; }
  void ReportRuns(const std::vector<Run>&) override {}
};

}  // namespace

int main(int argc, char** argv) {
  if (argc == 3 && std::strncmp(argv[1], "--write-volume=", 15) == 0) {
    const std::size_t n = std::stoul(argv[1] + 15);
    lacuna_volumes::write_nrrd(argv[2], lacuna_volumes::porous_volume(n, 2.0, 20261202));
    return 0;
  }
  MPI_Init(&argc, &argv);
  int rank = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  benchmark::Initialize(&argc, argv);
  if (volume_file().empty()) {
    if (rank == 0) std::cerr << "set LACUNA_SCALE_VOLUME to a volume written by --write-volume=N FILE\n";
    MPI_Finalize();
    return 2;
  }
  if (rank == 0) {
    benchmark::RunSpecifiedBenchmarks();
  } else {
    silent_reporter quiet;
    benchmark::RunSpecifiedBenchmarks(&quiet);
  }
  benchmark::Shutdown();
  MPI_Finalize();
  return 0;
}

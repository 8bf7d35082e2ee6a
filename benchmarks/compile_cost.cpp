// What every user pays in every translation unit: the time and memory the compiler takes on a
// program that includes a lacuna header and does nothing else. Each benchmark runs the
// compiler the project was configured with (the same flags a user's Release build passes:
// -std=c++20 -O2, compile only) as a child process on a one-line program, and reports
//   wall time per compile (the benchmark's real time), and
//   peak_MB   the compiler's peak resident set (getrusage of the child, ru_maxrss), in MiB.
// Cases: the umbrella <lacuna/lacuna.hpp>, the ring layer alone (Boost.Multiprecision's
// cpp_int is most of it), and the homology engine without the readers; the standard library
// headers alone as the floor. docs/performance.md, "Compile cost", has the figures.
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

extern char** environ;

namespace {

#ifndef LACUNA_CXX_COMPILER
#error "define LACUNA_CXX_COMPILER as the C++ compiler (benchmarks/CMakeLists.txt does)"
#endif
#ifndef LACUNA_INCLUDE_DIR
#error "define LACUNA_INCLUDE_DIR as the include/ folder of lacuna (benchmarks/CMakeLists.txt does)"
#endif

// Compiles `source` once; returns the child's peak resident set in KiB, or -1 on failure.
long compile_once(const std::filesystem::path& source, const std::filesystem::path& object) {
  std::vector<std::string> args = {LACUNA_CXX_COMPILER, "-std=c++20", "-O2", "-I" LACUNA_INCLUDE_DIR, "-c",
                                   source.string(), "-o", object.string()};
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  pid_t pid = 0;
  if (posix_spawnp(&pid, argv[0], nullptr, nullptr, argv.data(), environ) != 0) return -1;
  int status = 0;
  rusage usage{};
  if (wait4(pid, &status, 0, &usage) != pid || !WIFEXITED(status) || WEXITSTATUS(status) != 0) return -1;
  return usage.ru_maxrss;
}

void compile(benchmark::State& state, const std::string& program) {
  const auto dir = std::filesystem::temp_directory_path() / ("lacuna_compile_cost_" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const auto source = dir / "tu.cpp";
  std::ofstream(source) << program << "\nint main() { return 0; }\n";
  long peak = 0;
  for (auto _ : state) {
    const long kib = compile_once(source, dir / "tu.o");
    if (kib < 0) {
      state.SkipWithError("the compiler failed on the program");
      break;
    }
    peak = std::max(peak, kib);
  }
  state.counters["peak_MB"] = static_cast<double>(peak) / 1024.0;
  std::filesystem::remove_all(dir);
}

}  // namespace

BENCHMARK_CAPTURE(compile, lacuna_hpp, std::string("#include <lacuna/lacuna.hpp>"))
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(3);
BENCHMARK_CAPTURE(compile, homology_hpp, std::string("#include <lacuna/homology/homology.hpp>"))
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(3);
BENCHMARK_CAPTURE(compile, ring_hpp, std::string("#include <lacuna/ring/ring.hpp>"))
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(3);
BENCHMARK_CAPTURE(compile, standard_headers_only,
                  std::string("#include <algorithm>\n#include <iostream>\n#include <map>\n#include <optional>\n"
                              "#include <string>\n#include <unordered_map>\n#include <vector>"))
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(3);

BENCHMARK_MAIN();

// examples/cli/memory_budget.hpp — the memory budget of the lacuna tool (docs/cli.md, *Memory
// budget*), for every subcommand: set_memory_budget() once the input is known to exist and
// before it is read; budget.would_need(bytes) and budget.ran_out() are the one-line refusals;
// address_space_bytes() plus a library estimate (lacuna::estimate_homology_memory) is what a
// subcommand compares with budget.bytes before computing. std::bad_alloc anywhere after
// set_memory_budget is the process meeting its address-space limit: print budget.ran_out().
#pragma once

#include <malloc.h>
#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <cstdint>
#include <cstdio>
#include <optional>
#include <string>

namespace lacuna_cli {

/// The memory the tool may use (docs/cli.md, *Memory budget*): --max-memory, by default a
/// quarter of the machine's memory, and never more than an address-space limit the tool was
/// started under (ulimit -v). Before a computation the tool adds its estimate
/// (lacuna::estimate_homology_memory) to the address space the process holds and refuses
/// above the budget; the process's address space is also limited to the budget, so that
/// whatever the estimate missed ends in the same refusal (std::bad_alloc), never in a crash,
/// and the process never holds more than the budget.
struct memory_budget {
  std::uint64_t bytes = 0;
  std::uint64_t committed = 0;  ///< held and estimated at the last check
  std::string file;  ///< for messages

  /// "3.2", in GB of 2^30 bytes.
  static std::string gigabytes(std::uint64_t b) {
    char buf[32];
    const double g = static_cast<double>(b) / static_cast<double>(std::uint64_t{1} << 30);
    std::snprintf(buf, sizeof buf, g >= 10 ? "%.0f" : "%.1f", std::max(g, 0.1));
    return buf;
  }
  /// The one line of a refusal by estimate.
  std::string would_need(std::uint64_t needed) const {
    return file + ": would need about " + gigabytes(needed) + " GB; --max-memory raises the limit (now " +
           gigabytes(bytes) + " GB)";
  }
  /// The one line when an allocation failed at the limit.
  std::string ran_out() const {
    return (file.empty() ? std::string("lacuna") : file) + ": would need more than the limit of " +
           gigabytes(bytes) + " GB; --max-memory raises the limit";
  }
};

/// The budget of this process (set_memory_budget sets it).
inline memory_budget budget;

/// The address space this process holds now, in bytes (0 if unknown): what the limit counts.
inline std::uint64_t address_space_bytes() {
  std::FILE* f = std::fopen("/proc/self/statm", "r");
  if (!f) return 0;
  unsigned long long size = 0;
  const int got = std::fscanf(f, "%llu", &size);
  std::fclose(f);
  return got == 1 ? size * static_cast<std::uint64_t>(::sysconf(_SC_PAGESIZE)) : 0;
}

/// Touches a megabyte of stack, so that the stack never has to grow under the address-space
/// limit (a failed stack growth would be a crash, not an exception).
[[gnu::noinline]] inline void touch_stack() {
  volatile char block[1 << 20];
  for (std::size_t i = 0; i < sizeof block; i += 4096) block[i] = 0;
}

/// Sets the budget: `requested` (--max-memory) or a quarter of the machine's memory, within
/// what an address-space limit already in force leaves; then limits the address space.
inline void set_memory_budget(std::optional<std::uint64_t> requested, const std::string& file) {
  budget.file = file;
  const auto pages = ::sysconf(_SC_PHYS_PAGES), page = ::sysconf(_SC_PAGESIZE);
  const std::uint64_t machine = pages > 0 && page > 0 ? static_cast<std::uint64_t>(pages) * static_cast<std::uint64_t>(page) : 0;
  std::uint64_t b = requested ? *requested : (machine ? machine / 4 : std::uint64_t{4} << 30);
  rlimit now{};
  const bool known = ::getrlimit(RLIMIT_AS, &now) == 0;
  if (known && now.rlim_cur != RLIM_INFINITY) b = std::min<std::uint64_t>(b, now.rlim_cur);
  budget.bytes = b;
  // Few malloc arenas (each reserves 64 MB of address space), a stack that needs no growing.
  ::mallopt(M_ARENA_MAX, 2);
  touch_stack();
#ifndef LACUNA_CLI_NO_ADDRESS_LIMIT  // defined where main.cpp runs inside another program (a fuzzer)
  if (known && (now.rlim_cur == RLIM_INFINITY || b < now.rlim_cur)) {
    rlimit lim = now;
    lim.rlim_cur = b;
    ::setrlimit(RLIMIT_AS, &lim);  // if it fails, the estimate alone guards
  }
#endif
}

}  // namespace lacuna_cli

// lacuna/chain/parallel_chunks.hpp — work cut into numbered chunks, run on a few threads.
//
//   lacuna::detail::run_chunks(chunks, threads, control, "phase", total,
//                              [&](std::size_t c) -> std::uint64_t { ...; return steps; });
//
// Each chunk is run once, by whichever thread takes it next (chunks are taken in increasing
// order). What a chunk writes is the caller's: results kept per chunk and joined in chunk order
// do not depend on the number of threads, which is how callers keep their answers independent
// of it. The calling thread works too and is the only one to call the progress callback of
// run_control (it reports the steps the chunks returned, under `phase`); every thread checks
// the stop request before each chunk. The first exception a chunk throws (computation_stopped
// among them) stops the taking of new chunks and is rethrown once every thread has finished.
// When a thread cannot be started, the others do its share (the answer is the same).
#pragma once

#include <lacuna/chain/run_control.hpp>

#include <algorithm>
#include <atomic>
#include <cstddef>
#include <cstdint>
#include <exception>
#include <mutex>
#include <string_view>
#include <system_error>
#include <thread>
#include <vector>

namespace lacuna::detail {

/// Runs body(c) -> steps for c = 0..chunks-1 on up to `threads` threads (0 or 1: this thread
/// alone); see the file comment.
template <class Body>
void run_chunks(std::size_t chunks, unsigned threads, const run_control& control, std::string_view phase,
                std::uint64_t total, Body&& body) {
  control.report(phase, 0, total);
  std::atomic<std::size_t> next{0};
  std::atomic<std::uint64_t> done{0};
  std::atomic<bool> failed{false};
  std::exception_ptr error;
  std::mutex error_mutex;
  const auto work = [&](bool reporter) {
    try {
      for (;;) {
        if (failed.load(std::memory_order_relaxed)) return;
        const std::size_t c = next.fetch_add(1);
        if (c >= chunks) return;
        control.check();
        const std::uint64_t steps = body(c);
        const std::uint64_t now = done.fetch_add(steps) + steps;
        if (reporter) control.report(phase, std::min(now, total), total);
      }
    } catch (...) {
      const std::lock_guard lock(error_mutex);
      if (!error) error = std::current_exception();
      failed = true;
    }
  };
  std::vector<std::thread> pool;
  const std::size_t extra = threads <= 1 ? 0 : std::min<std::size_t>(threads, chunks) - std::min<std::size_t>(chunks, 1);
  for (std::size_t t = 0; t < extra; ++t) {
    try {
      pool.emplace_back(work, false);
    } catch (const std::system_error&) {
      break;  // fewer threads, the same chunks
    }
  }
  work(true);
  for (auto& t : pool) t.join();
  if (error) std::rethrow_exception(error);
  control.report(phase, total, total);
}

}  // namespace lacuna::detail

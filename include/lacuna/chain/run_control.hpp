// lacuna/chain/run_control.hpp — a stop request and a progress callback for long computations.
//
//   std::stop_source source;
//   lacuna::homology_options o;
//   o.control.stop = source.get_token();                       // another thread may stop it
//   o.control.progress = [](const lacuna::progress_report& r) { ... r.phase, r.done, r.total };
//   lacuna::homology<lacuna::integer>(c, o);                   // may throw computation_stopped
//
// The stop request is the standard library's std::stop_token (C++20). A computation looks at it
// every few thousand steps and, once a stop is requested, throws lacuna::computation_stopped:
// no partial result is ever returned. The progress callback is called from the calling thread
// only, a few hundred times per phase at most; it may itself throw (computation_stopped, say)
// to end the computation. Nothing here is global: each call has its own control.
#pragma once

#include <algorithm>
#include <cstdint>
#include <functional>
#include <stdexcept>
#include <stop_token>
#include <string>
#include <string_view>

namespace lacuna {

/// Where a long computation is: `phase` names the stage ("building the chain complex",
/// "eliminating unit pivots", "Smith form of the core", "lifting generators"), `done` of
/// `total` units of that stage (cells, rows or steps; done == total closes the stage).
struct progress_report {
  /// The stage.
  std::string_view phase;
  /// Units of the stage done so far.
  std::uint64_t done = 0;
  /// Units of the stage in all.
  std::uint64_t total = 0;
};

/// Thrown by a computation whose stop was requested. What it had computed is dropped.
class computation_stopped : public std::runtime_error {
 public:
  computation_stopped() : std::runtime_error("lacuna: the computation was stopped on request") {}
};

/// Thrown when a computation would need more memory than run_control::memory_limit (or a
/// caller's budget, lacuna/homology/memory_estimate.hpp) allows. Nothing was computed.
class memory_limit_exceeded : public std::runtime_error {
 public:
  /// What the computation named `what` needs, and the limit it passes (both in bytes).
  memory_limit_exceeded(std::uint64_t needed, std::uint64_t limit, const std::string& what)
      : std::runtime_error("lacuna: " + what + " would need about " + std::to_string(needed) +
                           " bytes, more than the limit of " + std::to_string(limit) + " bytes"),
        needed_(needed),
        limit_(limit) {}
  /// The estimate of what the computation needs, in bytes.
  std::uint64_t needed() const noexcept { return needed_; }
  /// The limit it passes.
  std::uint64_t limit() const noexcept { return limit_; }

 private:
  std::uint64_t needed_, limit_;
};

/// A stop request, a progress callback and a memory limit; all optional (the default stops
/// nothing, reports nothing and limits nothing, at the cost of one test per few thousand steps).
struct run_control {
  /// Stop request: a computation that sees it throws computation_stopped.
  std::stop_token stop{};
  /// Called with progress reports; empty: none.
  std::function<void(const progress_report&)> progress{};
  /// Bytes one large working allocation whose size is known only during the computation may
  /// take (0: no limit). Checked before the dense core of a Smith form is allocated (its
  /// matrix and transforms); what a computation needs before it starts is estimated by
  /// lacuna::estimate_homology_memory (lacuna/homology/memory_estimate.hpp).
  std::uint64_t memory_limit = 0;

  /// Throws memory_limit_exceeded if `bytes` pass memory_limit; `what` names the allocation.
  void require_memory(std::uint64_t bytes, const char* what) const {
    if (memory_limit != 0 && bytes > memory_limit) throw memory_limit_exceeded(bytes, memory_limit, what);
  }

  /// Throws computation_stopped if a stop was requested. Safe from any thread.
  void check() const {
    if (stop.stop_requested()) throw computation_stopped();
  }
  /// check(), then the callback (calling thread only).
  void report(std::string_view phase, std::uint64_t done, std::uint64_t total) const {
    check();
    if (progress) progress(progress_report{phase, done, total});
  }
};

namespace detail {

/// Counts the steps of one phase and reports about every 1/256 of `total` (at least every
/// 4096 steps it checks the stop request). A null control makes it a counter only.
class progress_ticker {
 public:
  /// `already`: units of the phase an earlier step did (the count starts there).
  progress_ticker(const run_control* control, std::string_view phase, std::uint64_t total, std::uint64_t already = 0)
      : control_(control), phase_(phase), total_(total), step_(std::max<std::uint64_t>(total / 256, 1)),
        done_(already), next_report_(already) {
    if (control_) control_->report(phase_, std::min(done_, total_), total_);
  }
  /// n more steps done.
  void operator()(std::uint64_t n = 1) {
    done_ += n;
    if (!control_) return;
    if (done_ >= next_report_) {
      next_report_ = done_ + step_;
      control_->report(phase_, std::min(done_, total_), total_);
    } else if ((done_ & 4095) < n) {
      control_->check();
    }
  }
  /// The phase is over: reports done == total.
  void finish() {
    if (control_) control_->report(phase_, total_, total_);
  }

 private:
  const run_control* control_;
  std::string_view phase_;
  std::uint64_t total_, step_;
  std::uint64_t done_ = 0, next_report_ = 0;
};

}  // namespace detail
}  // namespace lacuna

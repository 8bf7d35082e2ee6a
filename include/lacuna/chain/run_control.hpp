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
#include <string_view>

namespace lacuna {

/// Where a long computation is: `phase` names the stage ("building the chain complex",
/// "eliminating unit pivots", "Smith form of the core", "lifting generators"), `done` of
/// `total` units of that stage (cells, rows or steps; done == total closes the stage).
struct progress_report {
  std::string_view phase;
  std::uint64_t done = 0;
  std::uint64_t total = 0;
};

/// Thrown by a computation whose stop was requested. What it had computed is dropped.
class computation_stopped : public std::runtime_error {
 public:
  computation_stopped() : std::runtime_error("lacuna: the computation was stopped on request") {}
};

/// A stop request and a progress callback; both optional (the default stops nothing and
/// reports nothing, at the cost of one test per few thousand steps).
struct run_control {
  std::stop_token stop{};
  std::function<void(const progress_report&)> progress{};

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
  progress_ticker(const run_control* control, std::string_view phase, std::uint64_t total)
      : control_(control), phase_(phase), total_(total), step_(std::max<std::uint64_t>(total / 256, 1)) {
    if (control_) control_->report(phase_, 0, total_);
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

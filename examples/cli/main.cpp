// The lacuna command-line tool: the library's engine on files. docs/formats.md fixes the
// input formats, the JSON output and the error contract (exit status 2, one line
// "FILE:LINE: what is wrong"); docs/cli.md describes the rest.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/polygon_mesh.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/certificate_json.hpp>
#include <lacuna/homology/memory_estimate.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/cycle_svg.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/obj.hpp>
#include <lacuna/io/off.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include "homology_report.hpp"
#include "memory_budget.hpp"
#include "options.hpp"
#include "persistence.hpp"

#include <CLI/CLI.hpp>

#ifndef LACUNA_VERSION  // the project version, X.Y.Z, defined by examples/cli/CMakeLists.txt
#error "define LACUNA_VERSION as the project version (examples/cli/CMakeLists.txt does)"
#endif
#include <pthread.h>
#include <unistd.h>

#include <atomic>
#include <charconv>
#include <chrono>
#include <condition_variable>
#include <csignal>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <mutex>
#include <optional>
#include <sstream>
#include <stop_token>
#include <string>
#include <system_error>
#include <thread>
#include <variant>

namespace {

// the report and what it needs (homology_report.hpp, shared with lacuna-mpi)
using lacuna_cli::append_json_string;
using lacuna_cli::chain_coefficients;
using lacuna_cli::coefficients;
using lacuna_cli::group_text;
using lacuna_cli::marks_t;
using lacuna_cli::parse_coefficients;
using lacuna_cli::report;
using lacuna_cli::run_options;
using lacuna_cli::text_of;
using lacuna_cli::usage_error;

// ---- progress on a terminal ------------------------------------------------------------

/// Prints the current phase on stderr, once a second, after the first second, when stderr
/// is a terminal and --quiet is not given; with the library's progress reports, the part of
/// the phase that is done and, once the phase has run for a second, the time it has left at
/// the rate so far ("lacuna: eliminating unit pivots, 40%, about 5 s left (3 s)").
class progress_line {
 public:
  explicit progress_line(bool enabled) : enabled_(enabled && ::isatty(2)) {
    if (enabled_) worker_ = std::thread([this] { loop(); });
  }
  ~progress_line() { stop(); }
  void phase(const char* p) {
    std::lock_guard<std::mutex> lock(m_);
    text_ = p;
    phase_.clear();
    total_ = 0;
  }
  /// A lacuna::run_control progress callback.
  void report(const lacuna::progress_report& r) {
    if (!enabled_) return;
    std::lock_guard<std::mutex> lock(m_);
    if (r.phase != phase_ || r.done < done_) {  // a new phase (or the same one again): a new clock
      phase_.assign(r.phase);
      phase_start_ = std::chrono::steady_clock::now();
    }
    done_ = r.done;
    total_ = r.total;
    text_ = phase_;
  }
  void stop() {
    if (!enabled_) return;
    {
      std::lock_guard<std::mutex> lock(m_);
      done_flag_ = true;
    }
    cv_.notify_all();
    if (worker_.joinable()) worker_.join();
    if (printed_) std::fputs("\r\033[K", stderr);
    enabled_ = false;
  }

  /// The status text: the phase, the part done, and the time left at the rate so far (once
  /// the phase has run for a second and a part of it is done).
  static std::string status(const std::string& phase, std::uint64_t done, std::uint64_t total, double phase_seconds) {
    std::string t = phase;
    if (total <= 1) return t;
    t += ", " + std::to_string(done * 100 / total) + "%";
    if (done > 0 && done < total && phase_seconds >= 1.0) {
      const double left = phase_seconds * static_cast<double>(total - done) / static_cast<double>(done);
      char buf[64];
      if (left < 90)
        std::snprintf(buf, sizeof buf, ", about %.0f s left", std::max(left, 1.0));
      else if (left < 5400)
        std::snprintf(buf, sizeof buf, ", about %.0f min left", left / 60);
      else
        std::snprintf(buf, sizeof buf, ", about %.1f h left", left / 3600);
      t += buf;
    }
    return t;
  }

 private:
  void loop() {
    const auto start = std::chrono::steady_clock::now();
    std::unique_lock<std::mutex> lock(m_);
    while (!cv_.wait_for(lock, std::chrono::milliseconds(250), [this] { return done_flag_; })) {
      const auto now = std::chrono::steady_clock::now();
      const double s = std::chrono::duration<double>(now - start).count();
      if (s < 1.0) continue;
      const std::string line =
          phase_.empty() ? text_
                         : status(phase_, done_, total_, std::chrono::duration<double>(now - phase_start_).count());
      std::fprintf(stderr, "\r\033[Klacuna: %s (%.0f s)", line.c_str(), s);
      std::fflush(stderr);
      printed_ = true;
    }
  }
  bool enabled_;
  std::string text_ = "reading";
  std::string phase_;  // of the last report; empty: text_ alone
  std::chrono::steady_clock::time_point phase_start_{};
  std::uint64_t done_ = 0, total_ = 0;
  std::thread worker_;
  std::mutex m_;
  std::condition_variable cv_;
  bool done_flag_ = false;
  bool printed_ = false;
};

// ---- interruption ------------------------------------------------------------------------

/// SIGINT (Ctrl-C) and SIGTERM are blocked in every thread and taken by one watcher thread
/// with sigwait, so no code runs in a signal handler. The first signal requests a stop: the
/// computation throws lacuna::computation_stopped at its next check and the tool exits with
/// status 130, one line on stderr and nothing on stdout. Should the main thread not get there
/// within two seconds (it may be reading a large file, which does not look at the request),
/// or on a second signal, the watcher ends the process itself the same way, unless the
/// result is already being written (a result is printed whole or not at all).
class interrupt_watch {
 public:
  static constexpr const char* message = "lacuna: interrupted; no result was printed\n";
  interrupt_watch() {
    sigemptyset(&set_);
    sigaddset(&set_, SIGINT);
    sigaddset(&set_, SIGTERM);
    pthread_sigmask(SIG_BLOCK, &set_, nullptr);  // before any other thread starts
    std::thread([this] { watch(); }).detach();
  }
  std::stop_token token() const { return source_.get_token(); }
  /// Before the result goes out: false when an interrupt came first.
  bool begin_output() {
    if (source_.stop_requested()) return false;
    int expected = working;
    return state_.compare_exchange_strong(expected, writing);
  }
  /// The main thread's way out after an interrupt: prints the message and gives 130 (or
  /// waits for the watcher, which is already ending the process).
  int stopped() {
    int expected = working;
    if (!state_.compare_exchange_strong(expected, ending))
      for (;;) pause();
    say();
    return 130;
  }

 private:
  enum { working, writing, ending };
  static void say() {
    const ssize_t n = ::write(2, message, std::char_traits<char>::length(message));
    (void)n;
  }
  void watch() {
    int sig = 0;
    if (sigwait(&set_, &sig) != 0) return;
    source_.request_stop();
    const timespec grace{2, 0};
    sigtimedwait(&set_, nullptr, &grace);  // a second signal, or two seconds
    int expected = working;
    if (state_.compare_exchange_strong(expected, ending)) {
      say();
      std::_Exit(130);
    }
  }
  sigset_t set_{};
  std::stop_source source_;
  std::atomic<int> state_{working};
};

interrupt_watch* interrupts = nullptr;  // set by main for the subcommands that compute

void write_out(const std::string& out) {
  if (std::fwrite(out.data(), 1, out.size(), stdout) != out.size() || std::fflush(stdout) != 0)
    throw std::runtime_error("cannot write the result to standard output");
}

/// Writes the result unless an interrupt came first (then throws computation_stopped).
void write_result(const std::string& out) {
  if (interrupts && !interrupts->begin_output()) throw lacuna::computation_stopped();
  write_out(out);
}

/// Refuses (exit 2, one line) when what the process holds plus the estimate passes the
/// budget; otherwise leaves what is left of it to the dense core (run_control::memory_limit).
void reserve_memory(const lacuna::memory_estimate& e, lacuna::run_control& control) {
  const std::uint64_t needed = lacuna_cli::address_space_bytes() + e.bytes;
  lacuna_cli::budget.committed = needed;
  if (needed > lacuna_cli::budget.bytes) throw usage_error(lacuna_cli::budget.would_need(needed));
  control.memory_limit = std::max<std::uint64_t>(lacuna_cli::budget.bytes - needed, 1);
}

/// --check: the identities the groups `h` (over R, of FILE or of the pair) must satisfy. The
/// Euler characteristic from the cell counts against the alternating sum of the ranks (Hatcher,
/// Algebraic Topology, 2002, Theorem 2.44; it holds over any field and for the free ranks over
/// Z; for a pair the cells counted are those of the quotient; reduced, the augmented complex has
/// one more cell, in dimension -1). Over a field F, hz the integral groups of the same complex:
/// dim H_k(F) predicted by universal coefficients (Theorem 3A.3): over Q the free rank of H_k(Z),
/// over Z/p that plus the number of torsion factors of H_k(Z) and of H_{k-1}(Z) that p divides.
/// Both sides are exact integers, each computed on its own (cells counted, groups eliminated).
template <class R>
std::vector<lacuna::identity_check> group_checks(const lacuna::homology_result<R>& h, std::int64_t chi_cells,
                                                 const lacuna::homology_result<lacuna::integer>* hz,
                                                 const run_options& o) {
  std::vector<lacuna::identity_check> out;
  const std::string H = o.reduced ? "H~" : "H";
  std::int64_t alternating = 0;
  for (const auto& g : h.groups) alternating += (g.dimension % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(g.rank);
  const std::int64_t predicted = o.reduced ? chi_cells - 1 : chi_cells;
  out.push_back({std::string(o.reduced ? "χ − 1" : "χ") + " from the cells = Σ (-1)^k " +
                     (o.co.k == coefficients::integers ? "rank " : "dim ") + H + "_k",
                 std::to_string(predicted), std::to_string(alternating), predicted == alternating});
  if (!hz) return out;
  auto divisible = [&](const std::vector<lacuna::integer>& t) {
    std::size_t n = 0;
    for (const auto& x : t)
      if (lacuna::div_rem(x, lacuna::integer(static_cast<std::int64_t>(o.co.p))).remainder == lacuna::integer(0)) ++n;
    return n;
  };
  for (const auto& g : h.groups) {
    const int k = g.dimension;
    const auto& z = (*hz)[k];
    std::size_t p = z.rank;
    const std::string K = std::to_string(k);
    std::string why = "rank " + H + "_" + K + "(Z)";
    if (o.co.k == coefficients::mod_p) {
      const std::string P = std::to_string(o.co.p);
      p += divisible(z.torsion) + (k > 0 ? divisible((*hz)[k - 1].torsion) : 0);
      why += " + #{" + P + " | torsion of " + H + "_" + K + "(Z)}";
      if (k > 0) why += " + #{" + P + " | torsion of " + H + "_" + std::to_string(k - 1) + "(Z)}";
    }
    out.push_back({"dim " + H + "_" + K + "(" + o.co.text + ") = " + why, std::to_string(p), std::to_string(g.rank),
                   p == g.rank && g.torsion.empty()});
  }
  return out;
}

/// --picture: the SVG of the image with the generators of H_1 (lacuna/io/cycle_svg.hpp). Over
/// Z and Q the integer coefficients of chain_coefficients (over Q a primitive integer multiple
/// of the generator, still a cycle); over Z/2 the cycles are read mod 2.
template <class R, class C>
std::string picture_of(const C& cx, const lacuna::homology_result<R>& h, const run_options& o) {
  if constexpr (std::same_as<C, lacuna::cubical_complex<2>>) {
    std::vector<std::vector<lacuna::io::cycle_edge>> cycles;
    if (h.top_dimension() >= 1)
      for (const auto& ch : h[1].generators) {
        const auto coeffs = chain_coefficients(ch, o.co);
        std::vector<lacuna::io::cycle_edge> z;
        for (std::size_t j = 0; j < coeffs.size(); ++j) {
          std::int64_t c = 0;
          const auto r = std::from_chars(coeffs[j].data(), coeffs[j].data() + coeffs[j].size(), c);
          if (r.ec != std::errc() || r.ptr != coeffs[j].data() + coeffs[j].size())
            throw usage_error("lacuna: --picture: a generator has a coefficient too large to draw (" + coeffs[j] + ")");
          z.push_back({ch.terms[j].cell, c});
        }
        cycles.push_back(std::move(z));
      }
    const auto arithmetic = o.co.k == coefficients::mod_p ? lacuna::io::cycle_arithmetic::mod_2
                                                          : lacuna::io::cycle_arithmetic::integers;
    return lacuna::io::cycle_picture_svg(
        cx, cycles, {.title = "H_1 generators of " + o.file + " over " + o.co.text, .arithmetic = arithmetic});
  } else {
    throw usage_error("lacuna: --picture draws 2D images (.pbm, .pgm) only, not " + o.file);
  }
}

/// Writes the result, and with --picture the SVG first to a file beside OUT that is renamed to
/// OUT once the result is out: a run that fails or is interrupted leaves no picture behind.
void write_result_and_picture(const std::string& out, const std::string& svg, const run_options& o) {
  if (o.picture.empty()) return write_result(out);
  const std::string part = o.picture + ".part";
  {
    std::ofstream file(part, std::ios::binary | std::ios::trunc);
    if (!file) throw usage_error(o.picture + ": cannot be written");
    file << svg;
    file.flush();
    if (!file) {
      std::filesystem::remove(part);
      throw usage_error(o.picture + ": cannot be written");
    }
  }
  try {
    write_result(out);
  } catch (...) {
    std::error_code ignored;
    std::filesystem::remove(part, ignored);
    throw;
  }
  std::error_code ec;
  std::filesystem::rename(part, o.picture, ec);
  if (ec) throw usage_error(o.picture + ": cannot be written (" + ec.message() + ")");
}

template <class C>
void compute_and_report(const C& cx, const run_options& o, progress_line& progress, const marks_t* marks = nullptr) {
  // The augmented complex of the empty complex has its one group, Z, in dimension -1, which
  // the layout of docs/formats.md (dimensions 0 .. top) cannot hold: refused, not printed as [].
  if (o.reduced && lacuna::top_dimension(cx) < 0)
    throw usage_error(o.file + ": the complex is empty: its reduced homology is Z in dimension -1, which --reduced "
                               "does not print");
  progress.phase(o.cohomology ? "computing cohomology" : "computing homology");
  // Generators without coordinates: the tool never asks for classes of other cycles.
  // Both cores where the work splits: lacuna's own complexes are safe to read from two threads.
  // --picture needs the generators of H_1, computed whether or not they are printed
  lacuna::homology_options ho{.generators = o.generators || !o.picture.empty(), .reduced = o.reduced, .keep_basis = false, .threads = 2};
  if (interrupts) ho.control.stop = interrupts->token();
  ho.control.progress = [&progress](const lacuna::progress_report& r) { progress.report(r); };
  std::string out;  // nothing reaches stdout until the whole answer is known
  std::string svg;  // --picture
  if (!o.certificate.empty()) {
    // The certificate: over Z and Z/2, of homology, reduced homology (--reduced), the homology
    // of a pair (--relative) or cohomology (lacuna cohomology) (docs/certificates.md).
    if (o.co.k == coefficients::rationals || (o.co.k == coefficients::mod_p && o.co.p != 2))
      throw usage_error("lacuna: --certificate is offered over Z and Z/2, not over " + o.co.text);
    auto certify = [&]<class R>() {
      lacuna::homology_options co = ho;
      co.generators = co.witnesses = true;
      co.keep_basis = true;
      reserve_memory(lacuna::estimate_homology_memory<R>(cx, co, lacuna::sparse_elimination{}), ho.control);
      co.control = ho.control;
      auto r = marks          ? lacuna::certified_relative_homology<R>(cx, *marks, co)
               : o.cohomology ? lacuna::certified_cohomology<R>(cx, co)
                              : lacuna::certified_homology<R>(cx, co);
      std::ofstream file(o.certificate, std::ios::binary | std::ios::trunc);
      if (!file) throw usage_error(o.certificate + ": cannot be written");
      lacuna::io::write_certificate_json(file, cx, r.certificate, o.co.text, marks ? o.relative : std::string());
      file.flush();
      if (!file) throw usage_error(o.certificate + ": cannot be written");
      report(cx, r.result, o, out, marks);
    };
    if (o.co.k == coefficients::integers)
      certify.template operator()<lacuna::integer>();
    else
      certify.template operator()<lacuna::z2>();
    progress.stop();
    write_result(out);
    return;
  }
  auto go = [&]<class R>(const R& ring_one) {
    // Cohomology runs the same elimination on the dual (transposed) chain complex, of the same
    // size: the homology estimate is its estimate too.
    reserve_memory(lacuna::estimate_homology_memory<R>(cx, ho, algorithm_for<C>(o)), ho.control);
    if (o.cohomology) {
      report(cx, lacuna::cohomology<R>(cx, ho, algorithm_for<C>(o), ring_one), o, out);
      return;
    }
    auto compute = [&]<class S>(const S& u, const lacuna::homology_options& opt) {
      return marks ? lacuna::relative_homology<S>(cx, *marks, opt, algorithm_for<C>(o), u)
                   : lacuna::homology<S>(cx, opt, algorithm_for<C>(o), u);
    };
    const auto h = compute(ring_one, ho);
    if (!o.picture.empty()) svg = picture_of(cx, h, o);
    if (!o.check) return report(cx, h, o, out, marks);
    // --check: over a field, the integral groups too (ranks and torsion, no generators)
    std::optional<lacuna::homology_result<lacuna::integer>> hz;
    if constexpr (!std::same_as<R, lacuna::integer>) {
      lacuna::homology_options zo = ho;
      zo.generators = false;
      reserve_memory(lacuna::estimate_homology_memory<lacuna::integer>(cx, zo, algorithm_for<C>(o)), zo.control);
      hz = compute(lacuna::one<lacuna::integer>(), zo);
    }
    std::int64_t chi = 0;
    for (int k = 0; k <= lacuna::top_dimension(cx); ++k) {
      std::int64_t n = static_cast<std::int64_t>(lacuna::cell_count(cx, k));
      if (marks)
        for (bool b : (*marks)[static_cast<std::size_t>(k)]) n -= b ? 1 : 0;
      chi += (k % 2 == 0 ? 1 : -1) * n;
    }
    const auto checks = group_checks(h, chi, hz ? &*hz : nullptr, o);
    // A failed identity means a fault of the tool: no result is printed (exit status 2).
    for (const auto& c : checks)
      if (!c.holds)
        throw std::runtime_error("--check failed: " + c.statement + ": " + c.predicted + " predicted, " + c.computed +
                                 " computed; no result was printed (please report this)");
    report(cx, h, o, out, marks, &checks);
  };
  switch (o.co.k) {
    case coefficients::integers:
      go(lacuna::one<lacuna::integer>());
      break;
    case coefficients::rationals:
      go(lacuna::one<lacuna::rational>());
      break;
    case coefficients::mod_p:
      if (o.co.p == 2)
        go(lacuna::one<lacuna::z2>());
      else
        go(lacuna::mod_p_dynamic(1, o.co.p));
      break;
  }
  progress.stop();
  write_result_and_picture(out, svg, o);
}


// ---- subcomplexes named in a second file (--relative SUB, the sequence subcommand) -------

/// The lines of SUB that declare something: (line number, the line without its comment).
std::vector<std::pair<std::size_t, std::string>> content_lines(const std::string& sub) {
  std::ifstream in(sub, std::ios::binary);
  if (!in) throw usage_error(sub + ": cannot be read");
  std::vector<std::pair<std::size_t, std::string>> out;
  // the readers' own line reader, so that SUB's lines are numbered and split as FILE's are
  lacuna::io::line_reader lines(in, sub);
  for (std::string_view line; lines.next(line);) {
    line = lacuna::io::strip_comment(line);
    if (line.find_first_not_of(" \t") == std::string_view::npos) continue;
    out.emplace_back(lines.line_number(), std::string(line));
  }
  return out;
}

/// marks for SUB, a facet list, in X: every listed simplex must be a simplex of X (its faces
/// then are too, and SUB is closed by construction).
marks_t facets_marks(const lacuna::simplicial_complex<std::string>& X, const std::string& file, const std::string& sub,
                     const lacuna::simplicial_complex<std::string>& A) {
  for (const auto& [no, line] : content_lines(sub)) {
    std::istringstream words(line);
    std::vector<std::string> labels;
    for (std::string w; words >> w;) labels.push_back(w);
    if (!X.find_labels(labels)) {
      std::string name;
      for (const auto& l : labels) name += (name.empty() ? "" : " ") + l;
      throw usage_error(sub + ":" + std::to_string(no) + ": the simplex '" + name + "' is not a simplex of " + file);
    }
  }
  marks_t m(static_cast<std::size_t>(std::max(X.top_dimension() + 1, 0)));
  for (int k = 0; k <= X.top_dimension(); ++k) m[static_cast<std::size_t>(k)].assign(X.cell_count(k), false);
  for (int k = 0; k <= A.top_dimension(); ++k)
    for (std::size_t i = 0; i < A.cell_count(k); ++i) {
      std::vector<std::string> labels;
      for (auto v : A.vertices(k, i)) labels.push_back(A.label(v));
      m[static_cast<std::size_t>(k)][*X.find_labels(labels)] = true;
    }
  return m;
}

/// marks for SUB, a cell list, in X: every cell of SUB is a cell of X of the same dimension
/// and the same boundary, and every face of it in X is a cell of SUB.
marks_t cells_marks(const lacuna::cell_list& X, const std::string& file, const std::string& sub, const lacuna::cell_list& A) {
  std::map<std::string, std::size_t> line_of;
  for (const auto& [no, line] : content_lines(sub)) {
    std::size_t p = line.find_first_not_of(" \t");
    p = line.find_first_of(" \t", p);
    if (p == std::string::npos) continue;
    p = line.find_first_not_of(" \t", p);
    if (p == std::string::npos) continue;
    std::size_t e = p;
    while (e < line.size() && (std::isalnum(static_cast<unsigned char>(line[e])) || line[e] == '_' || line[e] == '.' ||
                               line[e] == '\''))
      ++e;
    line_of.emplace(line.substr(p, e - p), no);
  }
  auto where = [&](const std::string& name) {
    const auto it = line_of.find(name);
    return sub + (it == line_of.end() ? std::string() : ":" + std::to_string(it->second));
  };
  marks_t m(static_cast<std::size_t>(std::max(X.top_dimension() + 1, 0)));
  for (int k = 0; k <= X.top_dimension(); ++k) m[static_cast<std::size_t>(k)].assign(X.cell_count(k), false);
  std::vector<std::vector<std::size_t>> index_in_x(static_cast<std::size_t>(std::max(A.top_dimension() + 1, 0)));
  for (int k = 0; k <= A.top_dimension(); ++k)
    for (std::size_t i = 0; i < A.cell_count(k); ++i) {
      const std::string& name = A.cell_name(k, i);
      const auto f = X.find(name);
      if (!f) throw usage_error(where(name) + ": the cell '" + name + "' is not a cell of " + file);
      if (f->first != k)
        throw usage_error(where(name) + ": the cell '" + name + "' has dimension " + std::to_string(k) +
                          " here but " + std::to_string(f->first) + " in " + file);
      m[static_cast<std::size_t>(k)][f->second] = true;
      index_in_x[static_cast<std::size_t>(k)].push_back(f->second);
    }
  for (int k = 1; k <= A.top_dimension(); ++k)
    for (std::size_t i = 0; i < A.cell_count(k); ++i) {
      const std::string& name = A.cell_name(k, i);
      const std::size_t j = index_in_x[static_cast<std::size_t>(k)][i];
      std::map<std::size_t, lacuna::integer> in_x, in_a;
      // the faces as written in FILE, also those whose coefficients add up to zero (a cell
      // 's : q - q' has the face q): a SUB without q is not a subcomplex
      for (const std::size_t face : X.faces_as_written(k, j))
        if (!m[static_cast<std::size_t>(k - 1)][face])
          throw usage_error(where(name) + ": the cell '" + name + "' is not in a subcomplex: its face '" +
                            X.cell_name(k - 1, face) + "' in " + file + " is not a cell of " + sub);
      for (auto&& v : X.boundary(k, j)) {
        const auto t = lacuna::as_exact_incidence(v);
        in_x[t.face] += t.coefficient;
      }
      for (auto&& v : A.boundary(k, i)) {
        const auto t = lacuna::as_exact_incidence(v);
        in_a[index_in_x[static_cast<std::size_t>(k - 1)][t.face]] += t.coefficient;
      }
      std::erase_if(in_x, [](const auto& kv) { return kv.second == lacuna::integer(0); });
      std::erase_if(in_a, [](const auto& kv) { return kv.second == lacuna::integer(0); });
      if (in_x != in_a) throw usage_error(where(name) + ": the cell '" + name + "' has another boundary in " + file);
    }
  return m;
}

std::string extension_of(const std::string& file) {
  std::string ext = std::filesystem::path(file).extension().string();
  for (auto& ch : ext) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  return ext;
}

void check_input(const std::string& f) {
  if (!std::filesystem::exists(f)) throw usage_error(f + ": no such file");
  if (std::filesystem::is_directory(f)) throw usage_error(f + ": is a directory, not a file");
}

/// Reads FILE (and SUB, when o.relative is set) and hands them to fn(complex, marks or nullptr).
template <class Fn>
void with_input(const run_options& o, Fn&& fn) {
  check_input(o.file);
  const std::string ext = extension_of(o.file);
  lacuna::io::read_limits limits;
  if (o.max_cells) limits.max_cells = *o.max_cells;
  lacuna::io::cells_read_options cells_options;
  if (o.max_cells) cells_options.max_cells = static_cast<std::size_t>(*o.max_cells);
  lacuna::io::image_options image{.threshold = o.threshold, .limits = limits};
  if (o.threshold && ext != ".pbm" && ext != ".pgm" && ext != ".nrrd")
    throw usage_error("lacuna: --threshold applies to images and volumes (.pbm, .pgm, .nrrd), not to " + o.file);
  const bool known = ext == ".facets" || ext == ".cells" || ext == ".off" || ext == ".obj" || ext == ".pbm" ||
                     ext == ".pgm" || ext == ".nrrd";
  if (!known)
    throw usage_error(o.file + ": unknown file type '" + ext +
                      "' (expected .facets, .cells, .off, .obj, .pbm, .pgm or .nrrd)");
  if (!o.relative.empty()) {
    if (ext != ".facets" && ext != ".cells")
      throw usage_error("lacuna: a subcomplex (SUB) can be given for .facets and .cells files only, not for " + o.file);
    check_input(o.relative);
    if (extension_of(o.relative) != ext)
      throw usage_error(o.relative + ": SUB must be in the format of FILE (a " + ext + " file)");
  }
  // the budget, before anything is read (fuzz/fuzz_cli never gets here: it names no file)
  lacuna_cli::set_memory_budget(o.max_memory, o.file);
  if (ext == ".facets") {
    const auto X = lacuna::io::read_facets(std::filesystem::path(o.file), facets_options(o));
    if (o.relative.empty()) return fn(X, static_cast<const marks_t*>(nullptr));
    const auto A = lacuna::io::read_facets(std::filesystem::path(o.relative), facets_options(o));
    const marks_t m = facets_marks(X, o.file, o.relative, A);
    return fn(X, &m);
  } else if (ext == ".cells") {
    const auto X = lacuna::io::read_cells(std::filesystem::path(o.file), cells_options);
    if (o.relative.empty()) return fn(X, static_cast<const marks_t*>(nullptr));
    const auto A = lacuna::io::read_cells(std::filesystem::path(o.relative), cells_options);
    const marks_t m = cells_marks(X, o.file, o.relative, A);
    return fn(X, &m);
  } else if (ext == ".off") {
    fn(lacuna::io::read_off(std::filesystem::path(o.file), limits), static_cast<const marks_t*>(nullptr));
  } else if (ext == ".obj") {
    fn(lacuna::io::read_obj(std::filesystem::path(o.file), limits), static_cast<const marks_t*>(nullptr));
  } else if (ext == ".pbm" || ext == ".pgm") {
    fn(lacuna::io::read_netpbm(std::filesystem::path(o.file), image), static_cast<const marks_t*>(nullptr));
  } else {
    fn(lacuna::io::read_nrrd<3>(std::filesystem::path(o.file), image), static_cast<const marks_t*>(nullptr));
  }
}

void run_homology(const run_options& o) {
  progress_line progress(!o.quiet);
  with_input(o, [&](const auto& cx, const marks_t* marks) { compute_and_report(cx, o, progress, marks); });
}


// ---- the long exact sequence of a pair (lacuna sequence SUB FILE) -------------------------

/// An element of R as text: integers in decimal, Q as a or a/b, Z/p as 0 .. p-1.
template <class R>
std::string entry_text(const R& x, const coefficients& co) {
  if constexpr (std::same_as<R, lacuna::rational>)
    return x.value().str();
  else if constexpr (std::same_as<R, lacuna::mod_p_dynamic>)
    return text_of(x, co.p);
  else
    return text_of(x);
}

/// An element of R as JSON: a number, or over Q a string "a/b" when it is not an integer.
template <class R>
std::string entry_json(const R& x, const coefficients& co) {
  std::string t = entry_text(x, co);
  if (t.find('/') == std::string::npos) return t;
  std::string out;
  append_json_string(out, t);
  return out;
}

template <class R, class C>
void report_sequence(const C& X, const lacuna::pair_sequence<R>& p, const run_options& o, std::string& out) {
  const auto verdict = p.check();
  struct place {
    std::string name;  // H_n(A), H_n(X), H_n(X,A)
    std::string space;
    int n;
    const lacuna::homology_result<R>* h;
    bool in_a;
  };
  struct arrow {
    std::string name;
    int n;
    const lacuna::induced_homomorphism<R>* m;
  };
  std::vector<place> places;
  std::vector<arrow> arrows;  // arrows[i] : places[i] -> places[i+1]
  for (int n = p.top; n >= 0; --n) {
    const std::string k = std::to_string(n);
    const auto un = static_cast<std::size_t>(n);
    places.push_back({"H_" + k + "(A)", "A", n, &p.hA, true});
    arrows.push_back({"i_*", n, &p.i_star[un]});
    places.push_back({"H_" + k + "(X)", "X", n, &p.hX, false});
    arrows.push_back({"j_*", n, &p.j_star[un]});
    places.push_back({"H_" + k + "(X,A)", "X,A", n, &p.hXA, false});
    if (n > 0) arrows.push_back({"∂_*", n, &p.connecting[un]});
  }
  const lacuna::homology_group<R> none{};  // H_n of a complex whose top dimension is below n
  auto group_of = [&](const place& pl) -> const lacuna::homology_group<R>& {
    return pl.n <= pl.h->top_dimension() ? (*pl.h)[pl.n] : none;
  };
  auto torsion_texts = [&](const lacuna::homology_group<R>& g) {
    std::vector<std::string> t;
    for (const auto& x : g.torsion) t.push_back(entry_text(x, o.co));
    return t;
  };
  auto name_of = [&](const place& pl, int k, std::size_t cell) {
    return pl.in_a ? p.A.complex.cell_name(k, cell) : lacuna::cell_name(X, k, cell);
  };
  if (o.json) {
    out += "{\n  \"coefficients\": ";
    append_json_string(out, o.co.text);
    out += ",\n  \"space\": ";
    append_json_string(out, o.file);
    out += ",\n  \"subcomplex\": ";
    append_json_string(out, o.relative);
    out += ",\n  \"groups\": [";
    for (std::size_t g = 0; g < places.size(); ++g) {
      const auto& pl = places[g];
      const auto& hg = group_of(pl);
      out += g ? ",\n    {" : "\n    {";
      out += "\"name\": ";
      append_json_string(out, pl.name);
      out += ", \"space\": ";
      append_json_string(out, pl.space);
      out += ", \"dimension\": " + std::to_string(pl.n) + ", \"rank\": " + std::to_string(hg.rank) + ", \"torsion\": [";
      const auto tt = torsion_texts(hg);
      for (std::size_t i = 0; i < tt.size(); ++i) out += (i ? ", " : "") + tt[i];
      out += "], \"generators\": [";
      for (std::size_t i = 0; i < hg.generators.size(); ++i) {
        const auto& ch = hg.generators[i];
        out += i ? ", [" : "[";
        for (std::size_t j = 0; j < ch.terms.size(); ++j) {
          out += j ? ", [" : "[";
          out += entry_json(ch.terms[j].coefficient, o.co) + ", ";
          append_json_string(out, name_of(pl, ch.dimension, ch.terms[j].cell));
          out += "]";
        }
        out += "]";
      }
      out += "]}";
    }
    out += "\n  ],\n  \"maps\": [";
    for (std::size_t a = 0; a < arrows.size(); ++a) {
      const auto& m = arrows[a].m->matrix;
      out += a ? ",\n    {" : "\n    {";
      out += "\"name\": ";
      append_json_string(out, arrows[a].name);
      out += ", \"dimension\": " + std::to_string(arrows[a].n) + ", \"from\": " + std::to_string(a) +
             ", \"to\": " + std::to_string(a + 1) + ", \"matrix\": [";
      for (std::size_t i = 0; i < m.rows(); ++i) {
        out += i ? ", [" : "[";
        for (std::size_t j = 0; j < m.cols(); ++j) out += (j ? ", " : "") + entry_json(m(i, j), o.co);
        out += "]";
      }
      out += "]}";
    }
    out += "\n  ],\n  \"exact\": ";
    out += verdict.exact ? "true" : "false";
    out += ",\n  \"failures\": [";
    bool first = true;
    for (const auto& pl : verdict.places)
      if (!pl.exact) {
        out += first ? "" : ", ";
        first = false;
        append_json_string(out, pl.message);
      }
    out += "]\n}\n";
    return;
  }
  out += "long exact sequence of the pair (X, A) = (" + o.file + ", " + o.relative + ") over " + o.co.text + "\n";
  for (std::size_t g = 0; g < places.size(); ++g) {
    const auto& pl = places[g];
    const auto& hg = group_of(pl);
    out += pl.name + " = " + group_text(hg.rank, torsion_texts(hg), o.co) + "\n";
    for (std::size_t i = 0; i < hg.generators.size(); ++i) {
      const auto& ch = hg.generators[i];
      out += "  g" + std::to_string(i + 1) + " = ";
      for (std::size_t j = 0; j < ch.terms.size(); ++j) {
        std::string c = entry_text(ch.terms[j].coefficient, o.co);
        const bool neg = !c.empty() && c[0] == '-';
        if (neg) c = c.substr(1);
        out += j == 0 ? (neg ? "-" : "") : (neg ? " - " : " + ");
        if (c != "1") out += c + "*";
        out += "[" + name_of(pl, ch.dimension, ch.terms[j].cell) + "]";
      }
      out += "\n";
    }
    if (g < arrows.size()) {
      const auto& m = arrows[g].m->matrix;
      out += "    " + arrows[g].name + ": " + pl.name + " -> " + places[g + 1].name + " = [";
      for (std::size_t i = 0; i < m.rows(); ++i) {
        out += i ? "; " : "";
        for (std::size_t j = 0; j < m.cols(); ++j) out += (j ? " " : "") + entry_text(m(i, j), o.co);
      }
      out += "]\n";
    }
  }
  if (verdict.exact) {
    out += "exact at every place\n";
  } else {
    for (const auto& pl : verdict.places)
      if (!pl.exact) out += pl.message + "\n";
  }
}

void run_sequence(const run_options& o) {
  if (o.relative.empty()) throw usage_error("lacuna: sequence: SUB must be a file name");
  progress_line progress(!o.quiet);
  with_input(o, [&](const auto& cx, const marks_t* marks) {
    progress.phase("computing the long exact sequence");
    std::string out;
    auto go = [&]<class R>(const R& ring_one) {
      // the sequence computes the homology of X, A and (X, A) with generators: X's estimate
      // with generators, three times
      lacuna::run_control unused;
      auto e = lacuna::estimate_homology_memory<R>(cx, {.generators = true});
      e.bytes = e.bytes > ~std::uint64_t{0} / 3 ? ~std::uint64_t{0} : 3 * e.bytes;
      reserve_memory(e, unused);
      report_sequence(cx, lacuna::long_exact_sequence<R>(cx, *marks, ring_one), o, out);
    };
    switch (o.co.k) {
      case coefficients::integers: go(lacuna::one<lacuna::integer>()); break;
      case coefficients::rationals: go(lacuna::one<lacuna::rational>()); break;
      case coefficients::mod_p:
        if (o.co.p == 2)
          go(lacuna::one<lacuna::z2>());
        else
          go(lacuna::mod_p_dynamic(1, o.co.p));
        break;
    }
    progress.stop();
    write_result(out);
  });
}

/// An error message as one line: control characters (a newline in a file name, say) are
/// shown as '?', so that the message stays the single line docs/formats.md promises.
std::string one_line(std::string s) {
  for (auto& ch : s)
    if (static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f) ch = '?';
  return s;
}

/// The text of the options that homology and cohomology share, read once the command line is
/// parsed (numbers by lacuna_cli::parse_number, coefficients by parse_coefficients).
struct option_texts {
  std::string coefficients = "Z";
  std::optional<std::string> threshold, max_cells, max_facet, max_memory;
};

/// Adds the options that homology and cohomology share, in the order --help lists them.
void add_group_options(CLI::App* c, run_options& r, option_texts& t, const char* generators_help) {
  c->add_option("--coefficients", t.coefficients, "Z (default), Q, or Z/p for a prime p");
  c->add_flag("--generators", r.generators, generators_help);
  c->add_flag("--json", r.json, "one JSON object (docs/formats.md)");
  c->add_flag("--quiet", r.quiet, "no progress on stderr");
  c->add_option("--threshold", t.threshold, "images and volumes: foreground is a value >= T")->type_name("T");
  c->add_option("--max-facet-vertices", t.max_facet, ".facets: refuse a line of more labels than this (default 20)")
      ->type_name("N");
  c->add_option("--max-cells", t.max_cells, "refuse inputs announcing more cells than this")->type_name("N");
  c->add_option("--max-memory", t.max_memory,
                "refuse a computation that would need more memory than this (bytes, or with K, M, G, T; "
                "default: a quarter of the machine's memory)")
      ->type_name("SIZE");
  c->add_option("--reduction", r.reduction,
                "before the algebra: auto (default: morse for images and volumes, both otherwise), "
                "none, collapses, coreductions, both, morse")
      ->check(CLI::IsMember({"auto", "none", "collapses", "coreductions", "both", "morse"}));
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"lacuna: exact homology of cell complexes from files"};
  // LACUNA_VERSION is the project version of CMakeLists.txt (examples/cli/CMakeLists.txt)
  app.set_version_flag("--version", std::string("lacuna ") + LACUNA_VERSION, "print the version (lacuna X.Y.Z) and exit");
  // Numeric options are taken as text and read by lacuna_cli::parse_number (options.hpp), the
  // tool's one number parser: CLI11's own conversion reads 010 as octal and "" as no value.
  app.require_subcommand(1);
  run_options o;
  option_texts hom_texts;
  auto* hom = app.add_subcommand("homology", "homology groups (ranks and torsion), optionally with generators");
  add_group_options(hom, o, hom_texts, "print one cycle per free summand and per torsion factor");
  hom->add_flag("--reduced", o.reduced, "reduced homology (of the augmented complex): H_0 has one free summand fewer, the other groups are the same");
  hom->add_flag("--check", o.check,
                "also check the Euler characteristic against the ranks and, over Q or Z/p, each dimension "
                "against universal coefficients from the groups over Z");
  hom->add_option("--relative", o.relative, "homology of the pair (FILE, SUB), SUB a subcomplex in FILE's format")
      ->type_name("SUB");
  hom->add_option("--certificate", o.certificate,
                  "also write a certificate of the groups (over Z or Z/2; also with --reduced or --relative; "
                  "docs/certificates.md)")
      ->type_name("OUT.json");
  hom->add_option("--picture", o.picture,
                  "also draw the generators of H_1 on the image as SVG (2D images .pbm .pgm; over Z, Q or Z/2)")
      ->type_name("OUT.svg");
  hom->add_option("FILE", o.file, "input: .facets .cells .off .obj .pbm .pgm .nrrd")->required();
  run_options cob;
  cob.cohomology = true;
  option_texts coh_texts;
  auto* coh = app.add_subcommand("cohomology", "cohomology groups (ranks and torsion), optionally with cocycle generators");
  add_group_options(coh, cob, coh_texts, "print one cocycle per free summand and per torsion factor");
  // Not offered for cohomology; taken (and not listed by --help) to be refused with a reason.
  std::optional<std::string> coh_relative;
  bool coh_reduced = false;
  coh->add_option("--relative", coh_relative)->group("");
  coh->add_flag("--reduced", coh_reduced)->group("");
  coh->add_option("--certificate", cob.certificate,
                  "also write a certificate of the groups (over Z or Z/2; docs/certificates.md)")
      ->type_name("OUT.json");
  coh->add_option("FILE", cob.file, "input: .facets .cells .off .obj .pbm .pgm .nrrd")->required();
  run_options so;
  std::string seq_coeff_text = "Z";
  std::optional<std::string> seq_max_cells_text, seq_max_facet_text, seq_max_memory_text;
  auto* seq = app.add_subcommand("sequence", "the long exact sequence of the pair (FILE, SUB): groups, maps, exactness");
  seq->add_option("--coefficients", seq_coeff_text, "Z (default), Q, or Z/p for a prime p");
  seq->add_flag("--json", so.json, "one JSON object (docs/maps-and-sequences.md)");
  seq->add_flag("--quiet", so.quiet, "no progress on stderr");
  seq->add_option("--max-facet-vertices", seq_max_facet_text,
                  ".facets: refuse a line of more labels than this (default 20)")
      ->type_name("N");
  seq->add_option("--max-cells", seq_max_cells_text, "refuse inputs announcing more cells than this")->type_name("N");
  seq->add_option("--max-memory", seq_max_memory_text,
                  "refuse a computation that would need more memory than this (bytes, or with K, M, G, T; "
                  "default: a quarter of the machine's memory)")
      ->type_name("SIZE");
  seq->add_option("SUB", so.relative, "the subcomplex, in FILE's format (.facets or .cells)")->required();
  seq->add_option("FILE", so.file, "the complex: .facets or .cells")->required();
  // the numeric options, read once the command line is parsed
  const auto read_numbers = [](run_options& r, const std::optional<std::string>& threshold,
                               const std::optional<std::string>& max_cells, const std::optional<std::string>& max_facet,
                               const std::optional<std::string>& max_memory) {
    using lacuna_cli::parse_number;
    if (threshold) r.threshold = parse_number<std::int64_t>(*threshold, "--threshold");
    if (max_cells) r.max_cells = parse_number<std::uint64_t>(*max_cells, "--max-cells");
    if (max_facet) r.max_facet_vertices = parse_number<std::uint64_t>(*max_facet, "--max-facet-vertices");
    if (max_memory) {
      r.max_memory = lacuna_cli::parse_size(*max_memory, "--max-memory");
      if (*r.max_memory < (std::uint64_t{64} << 20))
        throw lacuna_cli::option_error("lacuna: --max-memory '" + *max_memory + "': at least 64M (the tool itself takes some)");
    }
  };
  lacuna_cli::persistence_command pers(app);
  try {
    try {
      app.parse(argc, argv);
    } catch (const CLI::CallForHelp&) {
      std::cout << app.help();
      return 0;
    } catch (const CLI::CallForAllHelp&) {
      std::cout << app.help("", CLI::AppFormatMode::All);
      return 0;
    } catch (const CLI::CallForVersion& e) {
      std::cout << e.what() << "\n";
      return 0;
    } catch (const CLI::ParseError& e) {
      std::string msg = e.what();
      if (auto nl = msg.find('\n'); nl != std::string::npos) msg = msg.substr(0, nl);
      throw usage_error("lacuna: " + msg + " (lacuna --help)");
    }
    if (hom->parsed()) {
      read_numbers(o, hom_texts.threshold, hom_texts.max_cells, hom_texts.max_facet, hom_texts.max_memory);
      o.co = parse_coefficients(hom_texts.coefficients);
      if (!o.picture.empty()) {
        // refused before anything is read or written
        const std::string ext = extension_of(o.file);
        if (ext != ".pbm" && ext != ".pgm")
          throw usage_error("lacuna: --picture draws 2D images (.pbm, .pgm) only, not " + o.file);
        if (!o.relative.empty())
          throw usage_error("lacuna: --picture is not offered with --relative (images have no subcomplex file)");
        if (!o.certificate.empty())
          throw usage_error("lacuna: --picture is not offered with --certificate (run the two apart)");
        if (o.co.k == coefficients::mod_p && o.co.p != 2)
          throw usage_error("lacuna: --picture draws cycles over Z, Q or Z/2, not over " + o.co.text +
                            " (for a planar image H_1 is free, so the cycles over Z are generators over every field)");
      }
      if (o.reduced && !o.relative.empty())
        throw usage_error("lacuna: --reduced does not apply to a pair (--relative): the homology of a pair is not "
                          "augmented, and for SUB not empty it is already the reduced one");
    }
    if (coh->parsed()) {
      if (coh_relative)
        throw usage_error("lacuna: cohomology: --relative is not offered (relative cohomology is not computed by the "
                          "tool; lacuna homology --relative gives relative homology)");
      if (coh_reduced)
        throw usage_error("lacuna: cohomology: --reduced is not offered (the library computes reduced homology only; "
                          "lacuna homology --reduced)");
      read_numbers(cob, coh_texts.threshold, coh_texts.max_cells, coh_texts.max_facet, coh_texts.max_memory);
      cob.co = parse_coefficients(coh_texts.coefficients);
    }
    if (seq->parsed()) read_numbers(so, std::nullopt, seq_max_cells_text, seq_max_facet_text, seq_max_memory_text);
    if (!interrupts) interrupts = new interrupt_watch;  // one per process, never deleted: its thread may outlive main
    if (pers.parsed()) {
      progress_line progress(!pers.quiet());
      const int status = pers.run({.stop = interrupts->token(),
                                   .begin_output = [&progress] {
                                     progress.stop();
                                     return interrupts->begin_output();
                                   },
                                   .interrupted = [] { return interrupts->stopped(); },
                                   .progress = [&progress](const lacuna::progress_report& r) { progress.report(r); }});
      progress.stop();
      return status;
    }
    if (hom->parsed()) run_homology(o);
    if (coh->parsed()) {
      o.file = cob.file;  // for messages
      run_homology(cob);
    }
    if (seq->parsed()) {
      o.file = so.file;  // for messages
      so.co = parse_coefficients(seq_coeff_text);
      so.generators = true;
      run_sequence(so);
    }
    return 0;
  } catch (const lacuna::computation_stopped&) {
    return interrupts ? interrupts->stopped() : 130;
  } catch (const usage_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const lacuna_cli::option_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const lacuna::parse_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const std::bad_alloc&) {
    std::cerr << one_line(lacuna_cli::budget.ran_out()) << "\n";
  } catch (const lacuna::memory_limit_exceeded& e) {  // the dense core, checked in the run
    std::cerr << one_line(lacuna_cli::budget.would_need(lacuna_cli::budget.committed + e.needed())) << "\n";
  } catch (const std::system_error& e) {  // a thread that cannot start at the limit, say
    if (e.code() == std::errc::not_enough_memory || e.code() == std::errc::resource_unavailable_try_again)
      std::cerr << one_line(lacuna_cli::budget.ran_out()) << "\n";
    else
      std::cerr << one_line(o.file + ": " + e.what()) << "\n";
  } catch (const std::exception& e) {
    std::cerr << one_line(o.file + ": " + e.what()) << "\n";
  }
  return 2;
}

// The `lacuna persistence` subcommand (examples/cli/persistence.cpp): its options are
// registered on the tool's CLI11 app by main.cpp, which then hands it the run.
#pragma once

#include <lacuna/chain/run_control.hpp>

#include <CLI/CLI.hpp>

#include <functional>
#include <optional>
#include <stop_token>
#include <string>

namespace lacuna_cli {

/// What main.cpp lends a subcommand for a run: the stop request of an interrupt, and the
/// interrupt watcher's two hooks.
struct run_context {
  std::stop_token stop{};
  /// Before the result goes out: false when an interrupt came first.
  std::function<bool()> begin_output{};
  /// The exit status after an interrupt (prints its line).
  std::function<int()> interrupted{};
  /// The library's progress reports (the tool's progress line), or none.
  std::function<void(const lacuna::progress_report&)> progress{};
};

/// `lacuna persistence [OPTIONS] FILE` (docs/persistence-cli.md).
class persistence_command {
 public:
  /// Registers the subcommand and its options on `app`.
  explicit persistence_command(CLI::App& app);
  // the options write into this object: it stays where it was made
  persistence_command(const persistence_command&) = delete;
  persistence_command& operator=(const persistence_command&) = delete;
  /// True when the command line chose this subcommand.
  bool parsed() const;
  /// True when --quiet was given (no progress line).
  bool quiet() const { return s_.quiet; }
  /// Runs it: prints the result and returns 0, or prints one line on stderr and returns 2 (a
  /// bad file or argument) or 130 (interrupted).
  int run(const run_context& context) const;

  struct settings {
    std::string file;
    std::string coefficients = "Z/2";
    std::optional<std::string> max_dimension_text{};  ///< as given; read by options.hpp
    std::optional<long long> max_dimension{};         ///< its value, set by run()
    std::optional<std::string> up_to{};
    std::string values;
    bool superlevel = false;
    bool json = false;
    bool cycles = false;  ///< --cycles: a representative cocycle per pair (Vietoris-Rips only)
    std::string diagram;
    std::string barcode;
    bool quiet = false;
  };

 private:
  CLI::App* sub_ = nullptr;
  settings s_;
};

}  // namespace lacuna_cli

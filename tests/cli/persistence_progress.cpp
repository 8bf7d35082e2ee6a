// `lacuna persistence` on long runs, as docs/persistence-cli.md and docs/cli.md promise: SIGINT
// and SIGTERM end the run with exit status 130, one line on stderr and nothing on stdout; on a
// terminal the progress line of `lacuna homology` appears (after a second) unless --quiet is
// given, and never reaches stdout. The clouds are random points of our own (a seeded
// generator), H_0..H_2 of their Vietoris–Rips filtration: seconds of work.
#include "run.hpp"

#include <pty.h>

#include <chrono>
#include <csignal>
#include <random>
#include <string>

namespace cli_persistence_progress_test {

using namespace cli_test;

namespace {

std::string cube_cloud(std::size_t n, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::string s;
  for (std::size_t i = 0; i < n; ++i) s += std::to_string(u(rng)) + " " + std::to_string(u(rng)) + " " + std::to_string(u(rng)) + "\n";
  return s;
}

}  // namespace

TEST_CASE("persistence: SIGINT and SIGTERM end a long Vietoris-Rips run with status 130 and no result") {
  temp_dir dir;
  const auto f = dir.write("cloud.points", cube_cloud(1500, 3));  // H_0..H_2: many seconds
  for (int sig : {SIGINT, SIGTERM}) {
    CAPTURE(sig);
    const auto t0 = std::chrono::steady_clock::now();
    const auto r = run({"persistence", "--json", "--max-dimension", "2", f}, std::nullopt, send_signal{sig, 400});
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    CHECK(r.status == 130);
    CHECK(r.out.empty());
    const auto lines = r.err_lines();
    REQUIRE(lines.size() == 1);
    CHECK(lines[0] == "lacuna: interrupted; no result was printed");
    MESSAGE("stopped after " << s << " s");
  }
}

TEST_CASE("persistence: a progress line on a terminal unless --quiet, and stdout untouched") {
  temp_dir dir;
  const auto f = dir.write("cloud.points", cube_cloud(650, 5));
  const auto plain = run({"persistence", "--json", "--max-dimension", "2", f});
  REQUIRE(plain.status == 0);
  CHECK(plain.err.empty());  // stderr not a terminal: nothing
  for (bool quiet : {false, true}) {
    CAPTURE(quiet);
    int master = -1, slave = -1;
    REQUIRE(::openpty(&master, &slave, nullptr, nullptr, nullptr) == 0);
    std::vector<std::string> args{"persistence", "--json", "--max-dimension", "2"};
    if (quiet) args.push_back("--quiet");
    args.push_back(f);
    const auto t0 = std::chrono::steady_clock::now();
    const auto r = run(args, slave);
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    ::close(slave);
    const std::string term = drain_terminal(master);
    ::close(master);
    CHECK(r.status == 0);
    CHECK(r.out == plain.out);
    if (quiet) {
      CHECK(term.empty());
    } else if (s > 1.6) {  // the first line is due after 1 to 1.25 s
      CHECK(term.find("lacuna: ") != std::string::npos);
      CHECK(term.find("Vietoris-Rips") != std::string::npos);  // the library's phase names
      CHECK(term.size() >= 4);
      CHECK(term.substr(term.size() - 4) == "\r\033[K");
    } else {
      MESSAGE("the run took " << s << " s, too short to require a progress line");
    }
  }
}

}  // namespace cli_persistence_progress_test

// Progress and --quiet: with stderr not a terminal nothing but errors appears on stderr; on a
// terminal, progress appears (after a second) unless --quiet is given.
#include "run.hpp"

#include <pty.h>

#include <chrono>
#include <string>

namespace cli_progress_test {

using namespace cli_test;

namespace {

/// A P4 image of n x n pixels, a deterministic pattern of many small components and holes, so
/// that the tool takes about a second or more.
std::string busy_image(std::size_t n) {
  std::string s = "P4\n" + std::to_string(n) + " " + std::to_string(n) + "\n";
  std::uint64_t x = 88172645463325252u;  // xorshift64 (Marsaglia 2003)
  for (std::size_t i = 0; i < n * ((n + 7) / 8); ++i) {
    x ^= x << 13;
    x ^= x >> 7;
    x ^= x << 17;
    s.push_back(static_cast<char>((x & (x >> 8)) | ((x >> 16) & (x >> 24))));
  }
  return s;
}

}  // namespace

TEST_CASE("stderr not a terminal: nothing on stderr, with or without --quiet") {
  temp_dir dir;
  const auto img = dir.write("busy.pbm", busy_image(1200));
  for (bool quiet : {false, true}) {
    CAPTURE(quiet);
    std::vector<std::string> args{"homology", "--json"};
    if (quiet) args.push_back("--quiet");
    args.push_back(img);
    const auto t0 = std::chrono::steady_clock::now();
    const auto r = run(args);
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    MESSAGE("the busy image took " << s << " s");
    CHECK(r.status == 0);
    CHECK(r.err.empty());
    CHECK(r.out.find("\"homology\"") != std::string::npos);
  }
  // small inputs of every kind: stderr empty too
  for (const char* name : {"torus.cells", "rp2_6.facets", "cube.obj"}) {
    CAPTURE(name);
    const auto r = run({"homology", "--generators", data(name).string()});
    CHECK(r.status == 0);
    CHECK(r.err.empty());
  }
}

TEST_CASE("stderr a terminal: progress unless --quiet, and stdout untouched") {
  temp_dir dir;
  const auto img = dir.write("busy.pbm", busy_image(1700));
  const auto plain = run({"homology", "--json", img});
  REQUIRE(plain.status == 0);
  for (bool quiet : {false, true}) {
    CAPTURE(quiet);
    int master = -1, slave = -1;
    REQUIRE(::openpty(&master, &slave, nullptr, nullptr, nullptr) == 0);
    std::vector<std::string> args{"homology", "--json"};
    if (quiet) args.push_back("--quiet");
    args.push_back(img);
    const auto t0 = std::chrono::steady_clock::now();
    const auto r = run(args, slave);
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    ::close(slave);
    const std::string term = drain_terminal(master);
    ::close(master);
    CHECK(r.status == 0);
    CHECK(r.out == plain.out);  // progress never reaches stdout
    if (quiet) {
      CHECK(term.empty());
    } else if (s > 1.6) {  // the first line is due after 1 to 1.25 s
      // docs/cli.md: a line "lacuna: PHASE (N s)" once a second after the first second,
      // erased at the end
      CHECK(term.find("lacuna: ") != std::string::npos);
      CHECK(term.find(" s)") != std::string::npos);
      CHECK(term.size() >= 4);
      CHECK(term.substr(term.size() - 4) == "\r\033[K");
    } else {
      MESSAGE("the run took " << s << " s, too short to require a progress line");
      CHECK(term.find('{') == std::string::npos);
    }
  }
}

}  // namespace cli_progress_test

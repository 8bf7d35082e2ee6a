// The progress line's estimate of the time left (docs/cli.md, *Progress*; issue 14): where the
// engine reports how much of a phase is done, the line says, once the phase has run for a
// second, "about N s left". Checked on a terminal (a pseudo-terminal) with a run of several
// seconds; no timing is asserted: the requirement applies only to lines the tool printed at
// least two seconds into a phase that it reported with a percentage.
#include "run.hpp"

#include <poll.h>
#include <pty.h>
#include <unistd.h>

#include <cstdlib>
#include <fstream>
#include <map>
#include <string>
#include <thread>
#include <vector>

namespace cli_progress_estimate_test {

/// A k x k torus triangulation as a facet list (2 k^2 triangles).
inline std::string torus_facets(int k) {
  std::string s;
  for (int i = 0; i < k; ++i)
    for (int j = 0; j < k; ++j) {
      const int a = i * k + j, b = i * k + (j + 1) % k, c = ((i + 1) % k) * k + j, d = ((i + 1) % k) * k + (j + 1) % k;
      s += std::to_string(a) + ' ' + std::to_string(b) + ' ' + std::to_string(d) + '\n';
      s += std::to_string(a) + ' ' + std::to_string(c) + ' ' + std::to_string(d) + '\n';
    }
  return s;
}

/// The status lines written to the terminal ("lacuna: ... (N s)", without \r and erase-line).
inline std::vector<std::string> status_lines(const std::string& term) {
  std::vector<std::string> out;
  std::string cur;
  for (std::size_t i = 0; i < term.size(); ++i) {
    if (term[i] == '\r') {
      if (!cur.empty()) out.push_back(cur);
      cur.clear();
    } else if (term.compare(i, 3, "\033[K") == 0) {
      i += 2;
    } else {
      cur += term[i];
    }
  }
  if (!cur.empty()) out.push_back(cur);
  return out;
}

}  // namespace cli_progress_estimate_test

TEST_CASE("progress: the time left, once a phase with a percentage has run for a second") {
  using namespace cli_progress_estimate_test;
  cli_test::temp_dir dir;
  const auto f = dir.write("torus.facets", torus_facets(700));
  int master = -1, slave = -1;
  REQUIRE(::openpty(&master, &slave, nullptr, nullptr, nullptr) == 0);
  // the terminal is read while the tool runs (a reader thread), so its buffer never fills
  std::string term;
  std::thread reader([&] {
    char buf[4096];
    for (;;) {
      pollfd p{master, POLLIN, 0};
      const int r = ::poll(&p, 1, 500);
      if (r < 0) break;
      if (r == 0) continue;
      const ssize_t n = ::read(master, buf, sizeof buf);
      if (n <= 0) break;
      term.append(buf, static_cast<std::size_t>(n));
    }
  });
  const auto r = cli_test::run({"homology", "--json", "--reduction", "none", f}, slave);
  ::close(slave);
  reader.join();
  ::close(master);
  REQUIRE(r.status == 0);
  // phase -> (second first seen); a line 2 s or more after it must carry the estimate
  std::map<std::string, long> first_seen;
  int checked = 0;
  for (const auto& line : status_lines(term)) {
    const auto pct = line.find('%');
    const auto open = line.rfind(" (");
    if (line.rfind("lacuna: ", 0) != 0 || pct == std::string::npos || open == std::string::npos) continue;
    const std::string phase = line.substr(8, line.find(',') - 8);
    const long sec = std::strtol(line.c_str() + open + 2, nullptr, 10);
    const auto [it, fresh] = first_seen.emplace(phase, sec);
    const bool done = line.find(", 100%") != std::string::npos || line.find(", 0%") != std::string::npos;
    if (!fresh && sec - it->second >= 2 && !done) {
      CAPTURE(line);
      CHECK(line.find(" left (") != std::string::npos);
      ++checked;
    }
  }
  if (checked == 0) MESSAGE("no phase with a percentage lasted two seconds: nothing to check");
}

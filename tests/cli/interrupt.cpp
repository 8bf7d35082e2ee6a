// SIGINT and SIGTERM: the tool stops with exit status 130, one line on stderr and nothing on
// stdout, whether the signal arrives while it reads the file (where the reader does not look
// at the request and the tool ends itself after two seconds) or while it computes (where the
// engine's stop request ends the computation).
#include "run.hpp"

#include <lacuna/complex/detail/concat.hpp>

#include <csignal>
#include <string>

namespace cli_interrupt_test {

using namespace cli_test;

namespace {

/// The k x k torus triangulation as a .facets file (2 k^2 triangles).
std::string torus_facets(int k) {
  std::string text;
  auto v = [k](int i, int j) { return lacuna::detail::concat("v", std::to_string(i % k), "_", std::to_string(j % k)); };
  for (int i = 0; i < k; ++i)
    for (int j = 0; j < k; ++j) {
      text += lacuna::detail::concat(v(i, j), " ", v(i + 1, j), " ", v(i + 1, j + 1), "\n");
      text += lacuna::detail::concat(v(i, j), " ", v(i, j + 1), " ", v(i + 1, j + 1), "\n");
    }
  return text;
}

void expect_interrupted(const result& r) {
  CHECK(r.status == 130);
  CHECK(r.out.empty());  // no partial result
  const auto lines = r.err_lines();
  REQUIRE(lines.size() == 1);
  CHECK(lines[0] == "lacuna: interrupted; no result was printed");
}

}  // namespace

TEST_CASE("SIGINT and SIGTERM end a long run with status 130 and no result") {
  temp_dir dir;
  // 1.4 million triangles: reading alone takes about a second in an optimized build
  const auto f = dir.write("torus.facets", torus_facets(840));
  for (int sig : {SIGINT, SIGTERM})
    for (int after_ms : {150, 1500}) {
      CAPTURE(sig);
      CAPTURE(after_ms);
      const auto r = run({"homology", "--json", "--generators", f}, std::nullopt, send_signal{sig, after_ms});
      // the run may have finished before a late signal on a fast machine: then it is whole
      if (r.status == 0) {
        CHECK(after_ms == 1500);
        CHECK(r.out.find("\"euler_characteristic\": 0") != std::string::npos);
        continue;
      }
      expect_interrupted(r);
    }
}

TEST_CASE("a run without a signal is not affected") {
  temp_dir dir;
  const auto f = dir.write("torus.facets", torus_facets(30));
  const auto r = run({"homology", "--json", f}, std::nullopt, send_signal{0, 0});  // signal 0: only a check
  CHECK(r.status == 0);
  CHECK(r.err.empty());
  CHECK(r.out.find("\"euler_characteristic\": 0") != std::string::npos);
}

}  // namespace cli_interrupt_test

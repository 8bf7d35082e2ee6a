// `lacuna persistence` on sparse distances (.links, docs/formats.md "Sparse distances"), checked
// against sources outside the implicit route:
//   - by hand: the flag complex of the cycle graph C_n (n >= 4) is an n-gon, a circle, so one
//     class of dimension 1 born with the last edge never dies; a chord of C_6 that makes no
//     triangle adds a second one (worked out beside the case);
//   - a .links file listing every pair of a small cloud gives the same output as the cloud's
//     .distances file (the sparse route against the dense one);
//   - the explicit route (--explicit-rips: every simplex built, a boundary reduction) on the
//     same .links files, byte for byte;
//   - one line with file, line and problem, exit status 2, for each bad file.
#include "json_checks.hpp"
#include "run.hpp"

#include <charconv>
#include <cmath>
#include <random>
#include <string>
#include <vector>

namespace persistence_links_cli_test {

inline std::string shortest(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

}  // namespace persistence_links_cli_test

TEST_CASE("persistence of .links: cycle graphs are circles, a chord splits the circle") {
  using namespace persistence_links_cli_test;
  cli_test::temp_dir dir;
  for (int n = 4; n <= 9; ++n) {
    CAPTURE(n);
    // C_n with edges of lengths 1, 2, ..., n: the components merge at 1, ..., n - 1 and the
    // loop closes with the edge of length n; no triangle (n >= 4), so it never dies
    std::string text = "points " + std::to_string(n) + "\n";
    for (int i = 1; i <= n; ++i) text += std::to_string(i) + " " + std::to_string(i % n + 1) + " " + std::to_string(i) + "\n";
    const auto file = dir.write("cycle" + std::to_string(n) + ".links", text);
    const auto r = cli_test::run({"persistence", "--json", file});
    INFO(r.err);
    REQUIRE(r.status == 0);
    const auto j = cli_test::ordered_json::parse(r.out);
    std::string zero;
    for (int i = 1; i < n; ++i) zero += "[0," + std::to_string(i) + "]";
    zero += "[0,null]";
    std::string got;
    for (const auto& p : j["diagrams"][0]["pairs"]) got += p.dump();
    CHECK(got == zero);
    CHECK(j["diagrams"][1]["pairs"].dump() == "[[" + std::to_string(n) + ",null]]");
    // the explicit route says the same, byte for byte
    CHECK(cli_test::run({"persistence", "--json", "--explicit-rips", file}).out == r.out);
  }
  // C_6 at unit lengths with the chord 1-4 at 2: at 1 the hexagon closes (one class); the
  // chord at 2 splits it into two 4-cycles, and the flag complex has no triangle (the chord's
  // ends have no common neighbour), so at 2 a second class is born; neither ever dies
  const auto chord = dir.write("chord.links", "points 6\n1 2 1\n2 3 1\n3 4 1\n4 5 1\n5 6 1\n6 1 1\n1 4 2\n");
  const auto c = cli_test::run({"persistence", "--json", chord});
  REQUIRE(c.status == 0);
  CHECK(cli_test::ordered_json::parse(c.out)["diagrams"][1]["pairs"].dump() == "[[1,null],[2,null]]");
  // --up-to 1.5: the chord is left out
  const auto u = cli_test::run({"persistence", "--json", "--up-to", "1.5", chord});
  CHECK(cli_test::ordered_json::parse(u.out)["diagrams"][1]["pairs"].dump() == "[[1,null]]");
  CHECK(cli_test::run({"persistence", "--json", "--up-to", "1.5", "--explicit-rips", chord}).out == u.out);
}

TEST_CASE("persistence of .links listing every pair equals the .distances of the same points") {
  using namespace persistence_links_cli_test;
  cli_test::temp_dir dir;
  std::mt19937_64 rng(61);
  std::uniform_real_distribution<double> coordinate(0.0, 1.0);
  for (int round = 0; round < 4; ++round) {
    const std::size_t n = 8 + static_cast<std::size_t>(round) * 4;
    std::vector<double> p(2 * n);
    for (auto& x : p) x = coordinate(rng);
    std::string matrix, links = "points " + std::to_string(n) + "\n";
    for (std::size_t i = 0; i < n; ++i) {
      for (std::size_t j = 0; j <= i; ++j) {
        const double d = std::sqrt((p[2 * i] - p[2 * j]) * (p[2 * i] - p[2 * j]) + (p[2 * i + 1] - p[2 * j + 1]) * (p[2 * i + 1] - p[2 * j + 1]));
        matrix += (j ? " " : "") + shortest(i == j ? 0.0 : d);
        if (j < i) links += std::to_string(j + 1) + " " + std::to_string(i + 1) + " " + shortest(d) + "\n";
      }
      matrix += "\n";
    }
    const auto m = dir.write("cloud" + std::to_string(round) + ".distances", matrix);
    const auto l = dir.write("cloud" + std::to_string(round) + ".links", links);
    const std::vector<std::vector<std::string>> options{{}, {"--max-dimension", "2"}, {"--up-to", "0.4"}, {"--coefficients", "Z/3"}};
    for (const auto& extra : options) {
      std::vector<std::string> a{"persistence", "--json"}, b;
      a.insert(a.end(), extra.begin(), extra.end());
      b = a;
      a.push_back(m);
      b.push_back(l);
      const auto rm = cli_test::run(a), rl = cli_test::run(b);
      INFO(rl.err);
      CHECK(rm.status == 0);
      CHECK(rl.status == 0);
      CHECK(rl.out == rm.out);
    }
  }
}

TEST_CASE("persistence of .links: bad files get one line with file, line and problem") {
  cli_test::temp_dir dir;
  const auto bad = [&](const std::string& name, const std::string& text, const std::string& message) {
    const auto file = dir.write(name, text);
    const auto r = cli_test::run({"persistence", file});
    CHECK(r.status == 2);
    CHECK(r.out.empty());
    CHECK(r.err == file + message + "\n");
  };
  bad("twice.links", "points 3\n1 2 1\n2 1 1\n",
      ":3: the pair of points 1 and 2 is listed again (first at line 2): each pair is listed once");
  bad("range.links", "points 3\n1 5 1\n",
      ":2: the second point '5' is not a point number (an integer from 1 to 3, the count of `points`)");
  bad("nocount.links", "1 2 1\n",
      ":1: expected `points N` (the number of points, a decimal integer >= 0) as the first line, found '1 2 1'");
}

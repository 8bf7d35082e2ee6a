// `lacuna persistence --cycles` (docs/persistence-cli.md, *Representative cocycles*): the
// existing keys byte for byte, the layout of "representatives", the listing for people, the
// refusals, and every printed cocycle judged against the Vietoris–Rips complex enumerated
// here by brute force from the distances the test wrote: a class born at b and dying at d is
// represented by a k-cocycle of K_t for t < d (persistent cohomology, de Silva, Morozov &
// Vejdemo-Johansson 2011, "Dualities in persistent (co)homology") — its coboundary vanishes on
// every (k+1)-simplex of value below d and not on some simplex of value d; it holds a simplex of
// value b and none of a smaller value; an essential class's coboundary vanishes on the whole
// complex. For a regular heptagon the H_1 cocycle takes a non-zero value on the polygon's cycle,
// so it is not a coboundary (<δf, c> = <f, ∂c> = 0 for a cycle c).
#include "json_checks.hpp"
#include "run.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <map>
#include <numbers>
#include <random>
#include <string>
#include <vector>

namespace persistence_cycles_cli_test {

inline std::string pdata(const std::string& name) {
  return (std::filesystem::path(LACUNA_TEST_DATA_DIR) / "persistence" / name).string();
}

using points_t = std::vector<int>;  // a simplex, points numbered from 1, increasing

/// A distance matrix as a .distances file: full rows, each number the shortest decimal that
/// reads back as the same double.
std::string matrix_text(const std::vector<std::vector<double>>& d) {
  std::string s;
  for (const auto& row : d) {
    for (std::size_t j = 0; j < row.size(); ++j) {
      char buf[64];
      const auto r = std::to_chars(buf, buf + sizeof buf, row[j]);
      s += (j ? " " : "") + std::string(buf, r.ptr);
    }
    s += "\n";
  }
  return s;
}

/// Residues mod p (p = 0: the integers, for Q scaled to integers).
long long reduce(long long x, long long p) { return p == 0 ? x : ((x % p) + p) % p; }

/// Every simplex of `size` points of value at most `limit` (value: the largest distance of
/// two of its points), with its value.
std::vector<std::pair<points_t, double>> simplices(const std::vector<std::vector<double>>& d, int size, double limit) {
  std::vector<std::pair<points_t, double>> out;
  points_t cur;
  const int n = static_cast<int>(d.size());
  auto rec = [&](auto&& self, int from) -> void {
    if (static_cast<int>(cur.size()) == size) {
      double v = 0;
      for (std::size_t i = 0; i < cur.size(); ++i)
        for (std::size_t j = i + 1; j < cur.size(); ++j)
          v = std::max(v, d[static_cast<std::size_t>(cur[i] - 1)][static_cast<std::size_t>(cur[j] - 1)]);
      if (v <= limit) out.emplace_back(cur, v);
      return;
    }
    for (int x = from; x <= n; ++x) {
      cur.push_back(x);
      self(self, x + 1);
      cur.pop_back();
    }
  };
  rec(rec, 1);
  return out;
}

/// Checks every cocycle of a --cycles --json result against the distances d; `limit` is the
/// largest edge value of the complex (the threshold). Returns the number of pairs checked.
std::size_t check_representatives(const cli_test::ordered_json& j, const std::vector<std::vector<double>>& d,
                                  long long p, double limit) {
  std::vector<std::string> keys;
  for (const auto& [k, v] : j.items()) keys.push_back(k);
  CHECK(keys == std::vector<std::string>{"coefficients", "filtration", "diagrams", "representatives"});
  REQUIRE(j["representatives"].size() == j["diagrams"].size());
  std::size_t checked = 0;
  for (std::size_t k = 0; k < j["diagrams"].size(); ++k) {
    CAPTURE(k);
    const auto& pairs = j["diagrams"][k]["pairs"];
    const auto& rep = j["representatives"][k];
    CHECK(rep["dimension"] == k);
    REQUIRE(rep["cocycles"].size() == pairs.size());
    const auto cofaces = simplices(d, static_cast<int>(k) + 2, limit);
    std::map<points_t, double> value_of;
    for (const auto& [s, v] : simplices(d, static_cast<int>(k) + 1, limit)) value_of.emplace(s, v);
    for (std::size_t i = 0; i < pairs.size(); ++i) {
      CAPTURE(i);
      const double birth = pairs[i][0].get<double>();
      const bool essential = pairs[i][1].is_null();
      const double death = essential ? 0.0 : pairs[i][1].get<double>();
      std::map<points_t, long long> z;
      bool has_birth = false;
      for (const auto& term : rep["cocycles"][i]) {
        REQUIRE(term.size() == 2);
        const long long c = term[0].get<long long>();
        if (p != 0) CHECK((c >= 1 && c < p));
        CHECK(c != 0);
        const points_t s = term[1].get<points_t>();
        REQUIRE(s.size() == k + 1);
        CHECK(std::is_sorted(s.begin(), s.end()));
        REQUIRE(value_of.count(s) == 1);  // a k-simplex of the complex, points 1..n
        CHECK(value_of.at(s) >= birth);   // nothing before the birth
        has_birth = has_birth || value_of.at(s) == birth;
        CHECK(z.emplace(s, c).second);
      }
      CHECK(has_birth);
      bool killed = false;
      for (const auto& [tau, v] : cofaces) {
        long long sum = 0;
        for (std::size_t f = 0; f < tau.size(); ++f) {
          points_t face = tau;
          face.erase(face.begin() + static_cast<std::ptrdiff_t>(f));
          if (const auto it = z.find(face); it != z.end()) sum += f % 2 == 0 ? it->second : -it->second;
        }
        sum = reduce(sum, p);
        if (essential || v < death) CHECK(sum == 0);
        if (!essential && v == death && sum != 0) killed = true;
      }
      CHECK((essential || killed));
      ++checked;
    }
  }
  return checked;
}

}  // namespace persistence_cycles_cli_test

TEST_CASE("persistence --cycles: the unit square, the layout exactly, the other keys unchanged") {
  using namespace persistence_cycles_cli_test;
  const auto plain = cli_test::run({"persistence", "--json", pdata("square.points")});
  const auto r = cli_test::run({"persistence", "--json", "--cycles", pdata("square.points")});
  REQUIRE(plain.status == 0);
  REQUIRE(r.status == 0);
  // the contract's keys byte for byte, then the extension
  REQUIRE(plain.out.size() > 3);
  CHECK(r.out.rfind(plain.out.substr(0, plain.out.size() - 3) + ",\n  \"representatives\": [", 0) == 0);
  // By hand, in the documented order (value, then the combinatorial number decreasing: the
  // sides of the square 1 (0,0), 2 (1,0), 3 (1,1), 4 (0,1) enter as 3 4, 1 4, 2 3, 1 2):
  // 3 4 joins point 3 to the older 4, 1 4 joins 1 to the component of 4, 2 3 joins 2 to it;
  // each dying point is its component's indicator, and the class that never dies is the
  // indicator of all four (the terms in the order of the filtration: 4 3 2 1). The side 1 2
  // closes the loop: the cochain 1 on [1 2] and 0 elsewhere is a cocycle until the diagonals
  // (no triangle before) and pairs to 1 with the loop 12 + 23 + 34 - 14.
  CHECK(r.out ==
        "{\n"
        "  \"coefficients\": \"Z/2\",\n"
        "  \"filtration\": \"vietoris-rips\",\n"
        "  \"diagrams\": [\n"
        "    {\"dimension\": 0, \"pairs\": [[0, 1], [0, 1], [0, 1], [0, null]]},\n"
        "    {\"dimension\": 1, \"pairs\": [[1, 1.4142135623730951]]}\n"
        "  ],\n"
        "  \"representatives\": [\n"
        "    {\"dimension\": 0, \"cocycles\": [\n"
        "      [[1, [1]]],\n"
        "      [[1, [2]]],\n"
        "      [[1, [3]]],\n"
        "      [[1, [4]], [1, [3]], [1, [2]], [1, [1]]]\n"
        "    ]},\n"
        "    {\"dimension\": 1, \"cocycles\": [\n"
        "      [[1, [1, 2]]]\n"
        "    ]}\n"
        "  ]\n"
        "}\n");
  // for people: a line per cocycle under its class
  const auto h = cli_test::run({"persistence", "--cycles", pdata("square.points")});
  CHECK(h.status == 0);
  CHECK(h.out == "persistence of " + pdata("square.points") +
                     " over Z/2 (vietoris-rips filtration)\n"
                     "dimension 0: 4 classes\n"
                     "  born 0, dies 1\n    cocycle: [1]\n"
                     "  born 0, dies 1\n    cocycle: [2]\n"
                     "  born 0, dies 1\n    cocycle: [3]\n"
                     "  born 0, never dies\n    cocycle: [4] + [3] + [2] + [1]\n"
                     "dimension 1: 1 class\n"
                     "  born 1, dies 1.4142135623730951\n    cocycle: [1 2]\n");
  // without --cycles nothing changes; the pictures are the same with it
  CHECK(cli_test::run({"persistence", "--json", pdata("square.points")}).out == plain.out);
  // an empty cloud: empty lists
  cli_test::temp_dir dir;
  const auto e = cli_test::run({"persistence", "--json", "--cycles", dir.write("empty.points", "# nothing\n")});
  CHECK(e.status == 0);
  const auto ej = cli_test::ordered_json::parse(e.out);
  CHECK(ej["representatives"].dump() == R"([{"dimension":0,"cocycles":[]},{"dimension":1,"cocycles":[]}])");
}

TEST_CASE("persistence --cycles: every cocycle of random distance matrices, Z/2, Z/3, Q, with and without --up-to") {
  using namespace persistence_cycles_cli_test;
  std::mt19937_64 rng(20261203);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::size_t checked = 0, higher = 0, essential = 0;
  cli_test::temp_dir dir;
  for (int round = 0; round < 4; ++round) {
    CAPTURE(round);
    const std::size_t n = 12 + static_cast<std::size_t>(round) * 2;
    std::vector<std::vector<double>> pts(n, std::vector<double>(2));
    for (auto& q : pts)
      for (auto& x : q) x = u(rng);
    std::vector<std::vector<double>> d(n, std::vector<double>(n, 0.0));
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < n; ++b) d[a][b] = std::hypot(pts[a][0] - pts[b][0], pts[a][1] - pts[b][1]);
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < a; ++b) d[b][a] = d[a][b];  // symmetric as written
    const std::string file = dir.write("cloud" + std::to_string(round) + ".distances", matrix_text(d));
    // the enclosing radius min_i max_j d(i, j): the tool's default cut (which changes no printed pair)
    double radius = std::numeric_limits<double>::infinity();
    for (const auto& row : d) radius = std::min(radius, *std::max_element(row.begin(), row.end()));
    const double low = 0.6 * radius;
    char buf[64];
    const std::string up_to(buf, std::to_chars(buf, buf + sizeof buf, low).ptr);
    for (const auto& [field, p] : std::vector<std::pair<std::string, long long>>{{"Z/2", 2}, {"Z/3", 3}, {"Q", 0}}) {
      CAPTURE(field);
      const std::string D = round % 2 == 0 ? "1" : "2";
      const auto r = cli_test::run({"persistence", "--json", "--cycles", "--coefficients", field, "--max-dimension", D, file});
      INFO(r.err);
      REQUIRE(r.status == 0);
      // the pairs are those printed without --cycles
      const auto plain = cli_test::run({"persistence", "--json", "--coefficients", field, "--max-dimension", D, file});
      CHECK(cli_test::ordered_json::parse(plain.out)["diagrams"] == cli_test::ordered_json::parse(r.out)["diagrams"]);
      checked += check_representatives(cli_test::ordered_json::parse(r.out), d, p, radius);
      const auto c = cli_test::run(
          {"persistence", "--json", "--cycles", "--coefficients", field, "--max-dimension", D, "--up-to", up_to, file});
      REQUIRE(c.status == 0);
      const auto cj = cli_test::ordered_json::parse(c.out);
      checked += check_representatives(cj, d, p, std::stod(up_to));
      for (std::size_t k = 1; k < cj["diagrams"].size(); ++k)
        for (const auto& pair : cj["diagrams"][k]["pairs"]) {
          ++higher;
          essential += pair[1].is_null();
        }
    }
  }
  CHECK(checked > 100);
  CHECK(higher > 5);
  CHECK(essential > 0);
}

TEST_CASE("persistence --cycles: the H_1 cocycle of a regular heptagon is not a coboundary") {
  using namespace persistence_cycles_cli_test;
  const int n = 7;
  std::vector<std::vector<double>> d(n, std::vector<double>(n, 0.0));
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      const int j = std::min(std::abs(a - b), n - std::abs(a - b));
      d[static_cast<std::size_t>(a)][static_cast<std::size_t>(b)] = 2 * std::sin(std::numbers::pi * j / n);
    }
  cli_test::temp_dir dir;
  const std::string file = dir.write("heptagon.distances", matrix_text(d));
  for (const auto& [field, p] : std::vector<std::pair<std::string, long long>>{{"Z/2", 2}, {"Z/3", 3}, {"Q", 0}}) {
    CAPTURE(field);
    const auto r = cli_test::run({"persistence", "--json", "--cycles", "--coefficients", field, file});
    REQUIRE(r.status == 0);
    const auto j = cli_test::ordered_json::parse(r.out);
    REQUIRE(j["representatives"][1]["cocycles"].size() == 1);  // one loop (Adamaszek 2013)
    // its value on the cycle [1 2] + [2 3] + ... + [6 7] - [1 7]
    long long value = 0;
    for (const auto& term : j["representatives"][1]["cocycles"][0]) {
      const auto s = term[1].get<points_t>();
      const long long c = term[0].get<long long>();
      if (s[1] == s[0] + 1) value += c;
      if (s[0] == 1 && s[1] == n) value -= c;
    }
    CHECK(reduce(value, p) != 0);
    double radius = std::numeric_limits<double>::infinity();
    for (const auto& row : d) radius = std::min(radius, *std::max_element(row.begin(), row.end()));
    check_representatives(j, d, p, radius);
  }
}

TEST_CASE("persistence --cycles: refused for images, complexes with values and the explicit route") {
  using namespace persistence_cycles_cli_test;
  cli_test::temp_dir dir;
  const auto img = dir.write("wells.pgm", "P2\n5 1\n9\n0 3 1 5 5\n");
  CHECK(cli_test::expect_error(cli_test::run({"persistence", "--cycles", img})) ==
        "lacuna: --cycles applies to point clouds and distance matrices (.points, .csv, .distances, .links), not to " + img);
  const auto facets = dir.write("t.facets", "a b\n");
  const auto values = dir.write("t.values", "a 0\nb 1\n");
  CHECK(cli_test::expect_error(cli_test::run({"persistence", "--cycles", "--values", values, facets})) ==
        "lacuna: --cycles applies to point clouds and distance matrices (.points, .csv, .distances, .links), not to " + facets);
  CHECK(cli_test::expect_error(cli_test::run({"persistence", "--cycles", "--explicit-rips", pdata("square.points")})) ==
        "lacuna: --cycles takes the cocycles of the implicit Vietoris-Rips route, not --explicit-rips");
}

// `lacuna homology` on .cells files whose coefficients do not fit in 64 bits (docs/formats.md: "a
// positive decimal integer of any size"). Expected values:
//   * M(Z/n, 1) = `0 p / 1 q : p - p / 2 r : n*q` has H_0 = Z, H_1 = Z/n, H_2 = 0 (cellular
//     homology; Hatcher, Algebraic Topology, 2002, Example 2.40 for the idea — from memory);
//   * over Z/p: H_1 = H_2 = Z/p when p | n, else a point; over Q a point (universal
//     coefficients, Hatcher 2002, Theorem 3A.3 — from memory);
//   * 2^70 = 1180591620717411303424 and 7^300 computed here in boost::multiprecision::cpp_int.
#include "json_checks.hpp"

#include <boost/multiprecision/cpp_int.hpp>

#include <string>
#include <vector>

namespace cli_big_coefficients_test {

using namespace cli_test;
using big = boost::multiprecision::cpp_int;

namespace {
std::string moore(const std::string& n) { return "0 p\n1 q : p - p\n2 r : " + n + "*q\n"; }
}  // namespace

TEST_CASE("M(Z/2^70, 1): \"torsion\": [1180591620717411303424], over Z/2 and Z/3 by universal coefficients") {
  const std::string two70 = (big(1) << 70).str();
  REQUIRE(two70 == "1180591620717411303424");
  temp_dir dir;
  const auto file = dir.write("moore.cells", moore(two70));

  auto r = run({"homology", "--json", file});
  auto j = parse_result(r);
  CHECK(r.out.find("\"torsion\": [1180591620717411303424]") != std::string::npos);
  CHECK(j["homology"][0]["rank"] == 1);
  CHECK(j["homology"][1]["rank"] == 0);
  REQUIRE(j["homology"][1]["torsion"].size() == 1);
  CHECK(j["homology"][2]["rank"] == 0);
  CHECK(j["homology"][2]["torsion"].empty());

  CHECK(groups_of(parse_result(run({"homology", "--json", "--coefficients", "Z/2", file}))) ==
        std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  CHECK(groups_of(parse_result(run({"homology", "--json", "--coefficients", "Z/3", file}))) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(groups_of(parse_result(run({"homology", "--json", "--coefficients", "Q", file}))) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(groups_of(parse_result(run({"homology", "--json", "--coefficients", "Z/65521", file}))) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {}}});  // 65521 is odd

  // --generators: the generator of H_1 is q (up to sign), of order 2^70
  r = run({"homology", "--json", "--generators", file});
  parse_result(r, true);
  const bool plus = r.out.find("{\"order\": " + two70 + ", \"chain\": [[1, \"q\"]]}") != std::string::npos;
  const bool minus = r.out.find("{\"order\": " + two70 + ", \"chain\": [[-1, \"q\"]]}") != std::string::npos;
  CHECK((plus || minus));

  // for people
  r = run({"homology", file});
  CHECK(r.status == 0);
  CHECK(r.out.find("H_1 = Z/" + two70 + "\n") != std::string::npos);
}

TEST_CASE("a coefficient of 254 digits, and errors that only big coefficients cause") {
  // (below 10^308: the JSON parser of the tests reads such integers as doubles)
  const big n = boost::multiprecision::pow(big(7), 300);
  const std::string digits = n.str();
  REQUIRE(digits.size() == 254);  // 300 log10(7) = 253.53...
  temp_dir dir;
  const auto file = dir.write("seven.cells", moore(digits));
  auto r = run({"homology", "--json", file});
  parse_result(r);
  CHECK(r.out.find("\"torsion\": [" + digits + "]") != std::string::npos);
  CHECK(groups_of(parse_result(run({"homology", "--json", "--coefficients", "Z/7", file}))) ==
        std::vector<group>{{1, {}}, {1, {}}, {1, {}}});

  // ∂∂ ≠ 0 only through a coefficient beyond int64: ∂r = 2^64*q with ∂q = p - w
  const auto bad = dir.write("bad.cells", "0 p\n0 w\n1 q : p - w\n2 r : 18446744073709551616*q\n");
  CHECK(expect_error(run({"homology", "--json", bad})) ==
        bad + ":4: the boundary of the boundary of 'r' is not zero (it has 'p' in it)");
  // a coefficient above the reader's limit of 100000 digits is refused, with its line
  const auto huge = dir.write("huge.cells", "0 p\n1 q : p - p\n2 r : " + std::string(100001, '9') + "*q\n");
  CHECK(expect_error(run({"homology", "--json", huge})) ==
        huge + ":3: a coefficient of 100001 digits in the boundary of 'r' is above the limit of 100000 digits "
               "(the limit of the reader)");
}

}  // namespace cli_big_coefficients_test

// --coefficients Q, Z/2, Z/3, Z/65521, Z/1000000007 against the universal coefficient theorem
// applied to the integral result; big torsion factors as exact JSON integers.
#include "json_checks.hpp"

#include <boost/multiprecision/cpp_int.hpp>

#include <string>

namespace cli_coefficients_test {

using namespace cli_test;
using big = boost::multiprecision::cpp_int;

namespace {

ordered_json homology_json(const std::string& coefficients, const std::string& file) {
  return parse_result(run({"homology", "--json", "--coefficients", coefficients, file}));
}

/// dim H_k(X; F_p) = rank H_k + #{factors of H_k divisible by p} + #{of H_{k-1}}, and
/// dim H_k(X; Q) = rank H_k (universal coefficients: Hatcher, Algebraic Topology, 2002,
/// Theorem 3A.3, from memory). p = 0 stands for Q.
std::vector<group> over_field(const std::vector<group>& z, std::uint64_t p) {
  std::vector<group> out;
  for (std::size_t k = 0; k < z.size(); ++k) {
    std::uint64_t d = z[k].rank;
    if (p != 0) {
      for (auto t : z[k].torsion) d += t % p == 0;
      if (k > 0)
        for (auto t : z[k - 1].torsion) d += t % p == 0;
    }
    out.push_back({d, {}});
  }
  return out;
}

}  // namespace

TEST_CASE("RP^2 over Z/2 is Z/2 in dimensions 0, 1, 2; over Q and Z/3 a point") {
  const auto f = data("projective_plane.cells").string();
  auto j = homology_json("Z/2", f);
  CHECK(j["coefficients"] == "Z/2");
  // H_*(RP^2; Z/2) = Z/2, Z/2, Z/2 (Hatcher, Algebraic Topology, 2002, Example 2.42 and the
  // cellular boundary 2 = 0 mod 2)
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  CHECK(cells_of(j) == std::vector<std::uint64_t>{1, 1, 1});
  for (const char* co : {"Q", "Z/3", "Z/65521"}) {
    CAPTURE(co);
    j = homology_json(co, f);
    CHECK(j["coefficients"] == co);
    // 2 is invertible: the homology of a point (universal coefficients, as above)
    CHECK(groups_of(j) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  }
}

TEST_CASE("every coefficient field agrees with universal coefficients on the integral result") {
  for (const char* name : {"projective_plane.cells", "torus.cells", "klein_bottle.cells", "torsion_mix.cells",
                           "rp2_6.facets", "hollow_triangle.facets", "big_prime.cells", "cube.off"}) {
    CAPTURE(name);
    const auto f = data(name).string();
    const auto z = groups_of(homology_json("Z", f));
    CHECK(groups_of(homology_json("Q", f)) == over_field(z, 0));
    for (std::uint64_t p : {2u, 3u, 65521u, 1000000007u}) {
      CAPTURE(p);
      CHECK(groups_of(homology_json("Z/" + std::to_string(p), f)) == over_field(z, p));
    }
  }
}

TEST_CASE("the integral results used above, from outside") {
  // Klein bottle: Z, Z + Z/2, 0 (Hatcher, Algebraic Topology, 2002, Example 2.37 with g = 2, from memory)
  CHECK(groups_of(homology_json("Z", data("klein_bottle.cells").string())) ==
        std::vector<group>{{1, {}}, {1, {2}}, {0, {}}});
  // Z/6 + Z/4 + Z/2 has invariant factors 2 | 2 | 12 (6 = 2*3, 4, 2: the 2-parts 2, 4, 2 and
  // the 3-part 3 combine to 2, 2, 12; by hand)
  CHECK(groups_of(homology_json("Z", data("torsion_mix.cells").string())) ==
        std::vector<group>{{1, {}}, {0, {2, 2, 12}}, {0, {}}});
  // ... so over Z/3 only the factor 12 counts: dimensions 1, 1, 1 (by hand)
  CHECK(groups_of(homology_json("Z/3", data("torsion_mix.cells").string())) ==
        std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  // over Z/2 all three: 1, 3, 3 (by hand)
  CHECK(groups_of(homology_json("Z/2", data("torsion_mix.cells").string())) ==
        std::vector<group>{{1, {}}, {3, {}}, {3, {}}});
}

TEST_CASE("Z/p spellings: the prime is written without leading zeros") {
  // "Z/p for a prime p" (docs/formats.md); 002 is the prime 2
  const auto j = homology_json("Z/002", data("projective_plane.cells").string());
  CHECK(j["coefficients"] == "Z/2");
  CHECK(groups_of(j) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  // the largest prime below 2^62 is 2^62 - 57 (from memory); the tool allows primes below 2^62
  const auto k = homology_json("Z/4611686018427387847", data("projective_plane.cells").string());
  CHECK(groups_of(k) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
}

TEST_CASE("big torsion: a JSON integer of any size, with exact digits") {
  // M(Z/1000000007, 1): torsion [1000000007] (the cellular boundary 1000000007*q; by hand)
  auto r = run({"homology", "--json", data("big_prime.cells").string()});
  auto j = parse_result(r);
  CHECK(j["homology"][1]["torsion"] == ordered_json::parse("[1000000007]"));
  CHECK(j["homology"][1]["torsion"][0].is_number_unsigned());

  // three coprime primes: one cyclic factor, their product (Chinese remainder theorem)
  const big product = big(1000000007) * big(998244353) * big(1000000009);
  const std::string digits = product.str();
  REQUIRE(digits == "998244368971909710889394239");  // beyond 2^64 = 18446744073709551616
  r = run({"homology", "--json", data("big_product.cells").string()});
  j = parse_result(r);
  CHECK(j["homology"][1]["rank"] == 0);
  REQUIRE(j["homology"][1]["torsion"].size() == 1);
  // nlohmann reads integers beyond 64 bits as floating point: a number, but check the text
  CHECK(j["homology"][1]["torsion"][0].is_number());
  CHECK(r.out.find("\"torsion\": [" + digits + "]") != std::string::npos);
  CHECK(r.out.find("\"" + digits + "\"") == std::string::npos);  // not as a string

  // and with --generators: "order" carries the same exact integer
  r = run({"homology", "--json", "--generators", data("big_product.cells").string()});
  parse_result(r, true);
  CHECK(r.out.find("{\"order\": " + digits + ", \"chain\": [") != std::string::npos);

  // human-readable: H_1 = Z/998244368971909710889394239
  r = run({"homology", data("big_product.cells").string()});
  CHECK(r.status == 0);
  CHECK(r.out.find("H_1 = Z/" + digits + "\n") != std::string::npos);
}

}  // namespace cli_coefficients_test

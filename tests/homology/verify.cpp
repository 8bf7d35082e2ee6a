// verify_generators must reject what is wrong (so the passing checks elsewhere mean
// something), and cohomology with cocycle generators of textbook spaces.
#include "support.hpp"

#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

namespace homology_verify_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

TEST_CASE("verify_generators rejects tampered generators") {
  const auto torus = cell_list::torus();
  const auto good = lacuna::homology<integer>(torus, {.generators = true});
  REQUIRE(lacuna::verify_generators(torus, good).ok);

  SUBCASE("twice a generator spans an index-2 subgroup") {
    auto bad = good;
    bad.groups[1].generators[0] = lacuna::scaled(integer(2), bad.groups[1].generators[0]);
    const auto rep = lacuna::verify_generators(torus, bad);
    CHECK(!rep.ok);
    CHECK(rep.first_failure.find("H_1") != std::string::npos);
  }
  SUBCASE("the same generator twice") {
    auto bad = good;
    bad.groups[1].generators[1] = bad.groups[1].generators[0];
    CHECK(!lacuna::verify_generators(torus, bad).ok);
  }
  SUBCASE("a chain that is not a cycle") {
    auto bad = good;
    bad.groups[2].generators[0].terms.pop_back();  // one triangle of the fundamental class
    const auto rep = lacuna::verify_generators(torus, bad);
    CHECK(!rep.ok);
    CHECK(rep.first_failure.find("not a cycle") != std::string::npos);
  }
  SUBCASE("a missing generator") {
    auto bad = good;
    bad.groups[1].generators.pop_back();
    CHECK(!lacuna::verify_generators(torus, bad).ok);
  }

  // RP^2: the torsion generator replaced by a boundary-equivalent multiple (3z ~ z mod 2 is
  // still fine: it generates Z/2), and by 2z (a boundary).
  const auto rp2 = cell_list::projective_plane();
  const auto h = lacuna::homology<integer>(rp2, {.generators = true});
  REQUIRE(h[1].torsion.size() == 1);
  REQUIRE(lacuna::verify_generators(rp2, h).ok);
  {
    auto alt = h;
    alt.groups[1].generators[0] = lacuna::scaled(integer(3), alt.groups[1].generators[0]);
    CHECK(lacuna::verify_generators(rp2, alt).ok);
  }
  {
    auto bad = h;
    bad.groups[1].generators[0] = lacuna::scaled(integer(2), bad.groups[1].generators[0]);
    const auto rep = lacuna::verify_generators(rp2, bad);
    CHECK(!rep.ok);
    CHECK(rep.first_failure.find("H_1 generator 0") != std::string::npos);
  }
  {
    auto bad = h;  // a torsion factor claimed for the wrong order
    bad.groups[1].orders[0] = integer(4);
    CHECK(!lacuna::verify_generators(rp2, bad).ok);
  }
  // The dense cross-check alone catches a free generator of H_1(torus) replaced by a cycle
  // whose class is the other generator plus twice itself (still a basis? no: det 2).
  {
    auto bad = good;
    bad.groups[1].generators[0] = lacuna::add_scaled(good.groups[1].generators[1], integer(2), good.groups[1].generators[0]);
    bad.groups[1].generators[1] = lacuna::add_scaled(good.groups[1].generators[0], integer(0), good.groups[1].generators[0]);
    // classes (2, 1) and (1, 0): det = -1, a basis, but not unit-diagonal in own coordinates.
    const auto rep = lacuna::verify_generators(torus, bad);
    CHECK(!rep.ok);
    CHECK(rep.first_failure.find("coordinate") != std::string::npos);
  }
  CHECK_THROWS_AS(lacuna::verify_generators(torus, lacuna::homology<integer>(torus)), std::invalid_argument);
}

TEST_CASE("reduced homology: a generator of H~_0 must have augmentation zero") {
  const auto s0 = cell_list::sphere(0);
  const auto h = lacuna::homology<integer>(s0, {.generators = true, .reduced = true});
  REQUIRE(lacuna::verify_generators(s0, h).ok);
  auto bad = h;
  bad.groups[0].generators[0] = lacuna::chain<integer>{0, {{0, integer(1)}}};  // a point
  CHECK(!lacuna::verify_generators(s0, bad).ok);
}

TEST_CASE("cohomology of the torus, RP^2 and the Klein bottle, with cocycles") {
  // H^n(X; Z) = Hom(H_n, Z) + Ext(H_{n-1}, Z) (Hatcher 2002, Theorem 3.2): free part of H_n,
  // torsion of H_{n-1}. Torus: Z, Z^2, Z. RP^2: Z, 0, Z/2. Klein bottle: Z, Z, Z/2
  // (Hatcher 2002, §3.1, the examples after Theorem 3.2).
  CHECK(all_variants<integer>(cell_list::torus(), true) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(all_variants<integer>(seven_vertex_torus(), true) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(all_variants<integer>(cell_list::projective_plane(), true) == std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}});
  CHECK(all_variants<integer>(six_vertex_rp2(), true) == std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}});
  CHECK(all_variants<integer>(cell_list::klein_bottle(), true) == std::vector<group>{{1, {}}, {1, {}}, {0, {"2"}}});
  // Over Z/2: RP^2 has H^k = Z/2 for k = 0, 1, 2 (Hatcher 2002, Theorem 3.12 for n = 2).
  CHECK(all_variants<lacuna::z2>(six_vertex_rp2(), true) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  // RP^5: H^k = Z, 0, Z/2, 0, Z/2, Z (Hatcher 2002, Example 2.42 with Theorem 3.2).
  CHECK(all_variants<integer>(cell_list::real_projective_space(5), true) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}, {0, {}}, {0, {"2"}}, {1, {}}});
}

TEST_CASE("verify_generators rejects a cochain that is not a cocycle") {
  const auto t = seven_vertex_torus();
  const auto h = lacuna::cohomology<integer>(t, {.generators = true});
  REQUIRE(lacuna::verify_generators(t, h).ok);
  auto bad = h;
  bad.groups[1].generators[0] = lacuna::chain<integer>{1, {{0, integer(1)}}};  // one edge
  const auto rep = lacuna::verify_generators(t, bad);
  CHECK(!rep.ok);
  CHECK(rep.first_failure.find("cocycle") != std::string::npos);
}

}  // namespace homology_verify_test

// verify_generators must reject what is wrong (so the passing checks elsewhere mean
// something), and cohomology with cocycle generators of textbook spaces.
#include "support.hpp"
#include "homology/verify_mutations.hpp"
#include "homology/subcomplex_marks.hpp"

#include <lacuna/complex/construct/product.hpp>

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
    CHECK(rep.dimension == 1);
    CHECK(rep.generator == 0);  // torsion factor 0 (rank 0)
    CHECK(rep.first_failure.find("H_1 torsion factor 0 (order 2): the generator is a boundary") != std::string::npos);
  }
  {
    auto bad = h;  // a torsion factor claimed for the wrong order
    bad.groups[1].orders[0] = integer(4);
    CHECK(!lacuna::verify_generators(rp2, bad).ok);
  }
  // Another basis of H_1(torus): classes (2, 1) and (1, 0) in the certified basis, det = -1,
  // is accepted (the dense test of the certified coordinates); (2, 1) and (0, 1), det = 2, is
  // not: the two span a subgroup of index 2.
  {
    auto alt = good;
    alt.groups[1].generators[0] = lacuna::add_scaled(good.groups[1].generators[1], integer(2), good.groups[1].generators[0]);
    alt.groups[1].generators[1] = good.groups[1].generators[0];
    const auto rep = lacuna::verify_generators(torus, alt);
    INFO(rep.first_failure);
    CHECK(rep.ok);
    auto bad = good;
    bad.groups[1].generators[0] = alt.groups[1].generators[0];
    const auto rep2 = lacuna::verify_generators(torus, bad);
    CHECK(!rep2.ok);
    CHECK(rep2.dimension == 1);
    CHECK(rep2.first_failure.find("index 2") != std::string::npos);
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

/// A circle of n vertices and n edges.
cell_list circle_of(std::size_t n) {
  cell_list c;
  for (std::size_t i = 0; i < n; ++i) c.add_cell(0, "v" + std::to_string(i));
  for (std::size_t i = 0; i < n; ++i) c.add_cell(1, "e" + std::to_string(i), {{(i + 1) % n, 1}, {i, -1}});
  return c;
}

TEST_CASE("verify_generators refuses H_1 = Z + Z/4 for Z + Z/2 at every size") {
  // The older check (through the engine's coordinates, dense cross-check up to 2000 cells)
  // refused this at 62 cells and accepted it at 2170. H_1(RP^2 x S^1) = Z + Z/2 by Künneth
  // (Hatcher 2002, Theorem 3B.6, from memory: H_1 = H_1(RP^2) + H_1(S^1)).
  for (std::size_t n : {1, 35, 70}) {
    const auto x = lacuna::product(six_vertex_rp2(), circle_of(n));
    CAPTURE(lacuna::total_cell_count(x));
    const auto h = lacuna::homology<integer>(x, {.generators = true});
    REQUIRE(h[1].rank == 1);
    REQUIRE(h[1].torsion == std::vector<integer>{integer(2)});
    REQUIRE(lacuna::verify_generators(x, h).ok);
    auto bad = h;
    bad.groups[1].torsion[0] = integer(4);
    bad.groups[1].orders[1] = integer(4);
    const auto rep = lacuna::verify_generators(x, bad);
    INFO(rep.first_failure);
    CHECK(!rep.ok);
    CHECK(rep.dimension == 1);
    CHECK(rep.generator == 1);  // torsion factor 0, after the one free generator
    CHECK(rep.first_failure.find("H_1 torsion factor 0: the result claims order 4, the certificate proves order 2") !=
          std::string::npos);
  }
}

TEST_CASE("verify_generators refuses every mutation of a result, naming the group and factor") {
  using verify_mutations::result_mutations_rejected;
  // RP^2 x S^1 (Künneth, above), the torus (H_1 = Z^2, Hatcher 2002 Example 2.36), RP^2 x RP^2
  // (H_1 = Z/2 + Z/2, Künneth, from memory), the cell list of three torsion factors.
  CHECK(result_mutations_rejected(lacuna::product(six_vertex_rp2(), circle_of(35))) >= 9);
  CHECK(result_mutations_rejected(seven_vertex_torus()) >= 6);
  CHECK(result_mutations_rejected(lacuna::product(six_vertex_rp2(), six_vertex_rp2())) >= 5);
  CHECK(result_mutations_rejected(torsion_2_4_12()) >= 11);
}

TEST_CASE("verify_generators: a torsion summand left out is named, and another basis is accepted") {
  // RP^2 x RP^2: H_1 = Z/2 + Z/2 (Künneth, from memory). Claiming one Z/2 is refused.
  const auto x = lacuna::product(six_vertex_rp2(), six_vertex_rp2());
  const auto h = lacuna::homology<integer>(x, {.generators = true});
  REQUIRE(h[1].torsion == std::vector<integer>{integer(2), integer(2)});
  auto bad = h;
  bad.groups[1].torsion.pop_back();
  bad.groups[1].generators.pop_back();
  bad.groups[1].orders.pop_back();
  const auto rep = lacuna::verify_generators(x, bad);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 1);
  CHECK(rep.generator == 1);
  CHECK(rep.first_failure.find("H_1 torsion factor 1: the certificate proves a factor of order 2, the result leaves it out") !=
        std::string::npos);
  // The two Z/2 generators replaced by z_0 + z_1 and z_1: still a basis of Z/2 + Z/2.
  auto alt = h;
  alt.groups[1].generators[0] = lacuna::add_scaled(h[1].generators[0], integer(1), h[1].generators[1]);
  const auto ok = lacuna::verify_generators(x, alt);
  INFO(ok.first_failure);
  CHECK(ok.ok);
}

/// Mutations of the reduced, relative or cohomology result of c over Z, through verify_generators.
template <class C>
int kind_result_mutations_rejected(const C& c, lacuna::certificate_kind kind, const subcomplex_marks::marks_t* a = nullptr) {
  using lacuna::certificate_kind;
  const auto good = kind == certificate_kind::relative     ? lacuna::relative_homology<integer>(c, *a, {.generators = true})
                    : kind == certificate_kind::cohomology ? lacuna::cohomology<integer>(c, {.generators = true})
                                                           : lacuna::homology<integer>(c, {.generators = true, .reduced = true});
  auto verify = [&](const verify_mutations::result_t& x) {
    return a ? lacuna::verify_generators(c, *a, x) : lacuna::verify_generators(c, x);
  };
  auto bnd = [&](int f) { return subcomplex_marks::kind_boundary(c, kind, a, f); };
  return verify_mutations::result_mutations_rejected_by(c, good, verify, bnd);
}

TEST_CASE("verify_generators checks reduced, relative and cohomology results through certificates") {
  using lacuna::certificate_kind;
  using namespace subcomplex_marks;
  // Groups: reduced RP^2 0, Z/2, 0 and reduced torus 0, Z^2, Z (Hatcher 2002, §2.1 and
  // Example 2.42, from memory); the Möbius band rel its rim 0, Z/2, 0 (the long exact sequence
  // of the pair: H_1(∂M) → H_1(M) is multiplication by 2); the torus rel a point 0, Z^2, Z;
  // cohomology of RP^2 Z, 0, Z/2 and of the Klein bottle Z, Z, Z/2 (universal coefficients,
  // Hatcher 2002, Theorem 3.2); the cell list of three torsion factors has H^2 = Z/2 + Z/4 + Z/12.
  CHECK(kind_result_mutations_rejected(six_vertex_rp2(), certificate_kind::reduced) >= 4);
  CHECK(kind_result_mutations_rejected(seven_vertex_torus(), certificate_kind::reduced) >= 5);
  CHECK(kind_result_mutations_rejected(torsion_2_4_12(), certificate_kind::reduced) >= 10);
  const auto m = five_vertex_moebius();
  const auto rim = marks_of(m, moebius_rim());
  CHECK(kind_result_mutations_rejected(m, certificate_kind::relative, &rim) >= 4);
  const auto t = seven_vertex_torus();
  const auto point = marks_of(t, {{1}});
  CHECK(kind_result_mutations_rejected(t, certificate_kind::relative, &point) >= 5);
  CHECK(kind_result_mutations_rejected(six_vertex_rp2(), certificate_kind::cohomology) >= 4);
  CHECK(kind_result_mutations_rejected(cell_list::klein_bottle(), certificate_kind::cohomology) >= 6);
  CHECK(kind_result_mutations_rejected(torsion_2_4_12(), certificate_kind::cohomology) >= 8);
  // H^2(RP^2) = Z/2 claimed as Z/4: refused, naming H^2 and its torsion factor 0.
  const auto rp2 = six_vertex_rp2();
  auto h = lacuna::cohomology<integer>(rp2, {.generators = true});
  REQUIRE(h[2].torsion == std::vector<integer>{integer(2)});
  h.groups[2].torsion[0] = integer(4);
  h.groups[2].orders[0] = integer(4);
  auto rep = lacuna::verify_generators(rp2, h);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 2);
  CHECK(rep.generator == 0);
  CHECK(rep.first_failure.find("H^2 torsion factor 0: the result claims order 4, the certificate proves order 2") !=
        std::string::npos);
  // H_1(M, ∂M) = Z/2 claimed as Z (rank 1): refused, naming H_1(X, A).
  auto r = lacuna::relative_homology<integer>(m, rim, {.generators = true});
  REQUIRE(r[1].torsion == std::vector<integer>{integer(2)});
  r.groups[1].torsion.clear();
  r.groups[1].rank = 1;
  r.groups[1].orders[0] = integer(0);
  rep = lacuna::verify_generators(m, rim, r);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 1);
  CHECK(rep.first_failure.find("H_1(X, A): the result claims rank 1, the certificate proves rank 0") != std::string::npos);
  // A relative result needs its subcomplex; an absolute result is not relative.
  CHECK_THROWS_AS(lacuna::verify_generators(m, lacuna::relative_homology<integer>(m, rim, {.generators = true})),
                  std::invalid_argument);
  CHECK_THROWS_AS(lacuna::verify_generators(m, rim, lacuna::homology<integer>(m, {.generators = true})), std::invalid_argument);
  // H̃_0 of S^0 claimed as rank 2 (the absolute b_0): refused, naming H̃_0.
  const auto s0 = cell_list::sphere(0);
  auto red = lacuna::homology<integer>(s0, {.generators = true, .reduced = true});
  REQUIRE(lacuna::verify_generators(s0, red).ok);
  red.groups[0].rank = 2;
  red.groups[0].generators.push_back(lacuna::chain<integer>{0, {{0, integer(1)}}});
  red.groups[0].orders.push_back(integer(0));
  rep = lacuna::verify_generators(s0, red);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 0);
  CHECK(rep.first_failure.find("H̃_0: the result claims rank 2, the certificate proves rank 1") != std::string::npos);
}

}  // namespace homology_verify_test

// Certificates of reduced homology, relative homology and cohomology (homology/certify.hpp,
// certified_relative_homology, certified_cohomology; checked by homology/certificate.hpp on the
// augmented complex, the quotient C(X)/C(A) and the cochain complex): textbook groups check
// valid, and every mutation of a certificate (a torsion factor changed, a generator dropped,
// duplicated or replaced by a boundary, a witness coefficient perturbed, the torsion witness's
// minors changed) is refused, naming the group (in the degrees of the result) and the factor.
#include "homology/support.hpp"
#include "homology/certificate_mutations.hpp"
#include "homology/subcomplex_marks.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/ring/z2.hpp>

#include <set>

namespace homology_certificate_kinds_test {

using namespace lacuna_test;
using namespace certificate_mutations;
using lacuna::cell_list;
using lacuna::certificate_kind;
using lacuna::integer;
using namespace subcomplex_marks;

template <class R>
std::vector<group> groups_in(const lacuna::homology_certificate<R>& cert) {
  std::vector<group> out;
  for (const auto& g : cert.groups) {
    group x{g.rank, {}};
    for (const auto& t : g.torsion) x.torsion.push_back(text(t));
    out.push_back(x);
  }
  return out;
}

/// Two points (S^0) and one point.
cell_list points(int n) {
  cell_list c;
  for (int i = 0; i < n; ++i) c.add_cell(0, "p" + std::to_string(i));
  return c;
}

template <class R, class C>
std::vector<group> reduced(const C& c) {
  const auto r = lacuna::certified_homology<R>(c, {.reduced = true});
  CHECK(r.certificate.kind == certificate_kind::reduced);
  const auto rep = lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  CHECK(rep.ok);
  CHECK(rep.checks > 0);
  const auto gs = groups_in(r.certificate);
  CHECK(gs == groups_of(lacuna::homology<R>(c, {.reduced = true})));
  return gs;
}

template <class R, class C>
std::vector<group> relative(const C& c, const marks_t& a) {
  const auto r = lacuna::certified_relative_homology<R>(c, a);
  CHECK(r.certificate.kind == certificate_kind::relative);
  const auto rep = lacuna::check_certificate(c, r.certificate, a);
  INFO(rep.first_failure);
  CHECK(rep.ok);
  CHECK(rep.checks > 0);
  CHECK(!lacuna::check_certificate(c, r.certificate).ok);  // the subcomplex is needed
  const auto gs = groups_in(r.certificate);
  CHECK(gs == groups_of(lacuna::relative_homology<R>(c, a)));
  return gs;
}

template <class R, class C>
std::vector<group> certified_cohomology_groups(const C& c) {
  const auto r = lacuna::certified_cohomology<R>(c);
  CHECK(r.certificate.kind == certificate_kind::cohomology);
  const auto rep = lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  CHECK(rep.ok);
  CHECK(rep.checks > 0);
  const auto gs = groups_in(r.certificate);
  CHECK(gs == groups_of(lacuna::cohomology<R>(c)));
  return gs;
}

TEST_CASE("certificates of reduced homology: a point, S^0 and textbook spaces") {
  // The reduced homology of a point is 0, of S^0 Z in degree 0 (Hatcher 2002, §2.1, from
  // memory: H̃_0 has rank b_0 − 1, H̃_k = H_k for k > 0).
  CHECK(reduced<integer>(points(1)) == std::vector<group>{{0, {}}});
  CHECK(reduced<integer>(points(2)) == std::vector<group>{{1, {}}});
  CHECK(reduced<integer>(points(5)) == std::vector<group>{{4, {}}});
  // RP^2: H̃ = 0, Z/2, 0; torus 0, Z^2, Z (Hatcher 2002, Example 2.42 and §2.1, from memory).
  CHECK(reduced<integer>(six_vertex_rp2()) == std::vector<group>{{0, {}}, {0, {"2"}}, {0, {}}});
  CHECK(reduced<integer>(seven_vertex_torus()) == std::vector<group>{{0, {}}, {2, {}}, {1, {}}});
  CHECK(reduced<integer>(torsion_2_4_12()) == std::vector<group>{{0, {}}, {1, {"2", "4", "12"}}, {0, {}}});
  // Over Z/2: RP^2 has H̃ = 0, Z/2, Z/2 (universal coefficients).
  CHECK(reduced<lacuna::z2>(six_vertex_rp2()) == std::vector<group>{{0, {}}, {1, {}}, {1, {}}});
  // The empty complex has no reduced certificate (H̃_{−1}(∅) = Z has no degree in the layout).
  CHECK_THROWS_AS(lacuna::certified_homology<integer>(cell_list{}, {.reduced = true}), std::invalid_argument);
}

TEST_CASE("certificates of relative homology: a disk and a ball rel their boundary, the Möbius band rel its rim") {
  // H_n(D^n, S^{n−1}) = Z in degree n, 0 elsewhere (Hatcher 2002, Example 2.23, from memory).
  const auto disk = cone_disk(6);
  CHECK(relative<integer>(disk, marks_of(disk, cone_rim(6))) == std::vector<group>{{0, {}}, {0, {}}, {1, {}}});
  const auto ball = cone_ball();
  CHECK(relative<integer>(ball, marks_of(ball, {{1, 2, 3}, {1, 2, 4}, {1, 3, 4}, {2, 3, 4}})) ==
        std::vector<group>{{0, {}}, {0, {}}, {0, {}}, {1, {}}});
  // The Möbius band M rel its boundary circle ∂M: the long exact sequence of the pair, with
  // H_1(∂M) = Z → H_1(M) = Z multiplication by 2 (the rim runs twice around the core) and
  // H_0(∂M) → H_0(M) an isomorphism, gives H_2(M, ∂M) = ker 2 = 0, H_1(M, ∂M) = coker 2 = Z/2,
  // H_0(M, ∂M) = 0.
  const auto m = five_vertex_moebius();
  CHECK(relative<integer>(m, marks_of(m, moebius_rim())) == std::vector<group>{{0, {}}, {0, {"2"}}, {0, {}}});
  // Rel a point: H_0 = 0, the rest as the absolute groups (the long exact sequence).
  const auto rp2 = six_vertex_rp2();
  CHECK(relative<integer>(rp2, marks_of(rp2, {{1}})) == std::vector<group>{{0, {}}, {0, {"2"}}, {0, {}}});
  // Over Z/2, the Möbius band rel its rim: 0, Z/2, Z/2 (universal coefficients).
  CHECK(relative<lacuna::z2>(m, marks_of(m, moebius_rim())) == std::vector<group>{{0, {}}, {1, {}}, {1, {}}});
}

TEST_CASE("a relative certificate is refused against marks that are not a subcomplex or not its own") {
  const auto m = five_vertex_moebius();
  const auto a = marks_of(m, moebius_rim());
  const auto r = lacuna::certified_relative_homology<integer>(m, a);
  auto not_closed = a;
  not_closed[2][0] = true;  // a triangle, {0, 1, 2}, whose edges {0, 1} and {1, 2} are not in A
  auto rep = lacuna::check_certificate(m, r.certificate, not_closed);
  CHECK(!rep.ok);
  CHECK(rep.first_failure.find("not closed under faces") != std::string::npos);
  auto short_marks = a;
  short_marks.pop_back();
  rep = lacuna::check_certificate(m, r.certificate, short_marks);
  CHECK(!rep.ok);
  CHECK(rep.first_failure.find("marks") != std::string::npos);
  // The certificate of M rel its rim against M rel a point: the groups differ, so it fails.
  rep = lacuna::check_certificate(m, r.certificate, marks_of(m, {{0}}));
  CHECK(!rep.ok);
  CHECK_THROWS_AS(lacuna::certified_relative_homology<integer>(m, not_closed), std::invalid_argument);
}

TEST_CASE("certificates of cohomology: the universal coefficient theorem's groups") {
  // H^k ≅ Hom(H_k, Z) ⊕ Ext(H_{k−1}, Z) (Hatcher 2002, Theorem 3.2, from memory): RP^2 has
  // H^0 = Z, H^1 = 0, H^2 = Z/2; the Klein bottle Z, Z, Z/2; the torus Z, Z^2, Z; H^2 of the
  // torsion mix is Z/2 ⊕ Z/4 ⊕ Z/12.
  CHECK(certified_cohomology_groups<integer>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}});
  CHECK(certified_cohomology_groups<integer>(cell_list::projective_plane()) == std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}});
  CHECK(certified_cohomology_groups<integer>(cell_list::klein_bottle()) == std::vector<group>{{1, {}}, {1, {}}, {0, {"2"}}});
  CHECK(certified_cohomology_groups<integer>(seven_vertex_torus()) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(certified_cohomology_groups<integer>(torsion_2_4_12()) == std::vector<group>{{1, {}}, {1, {}}, {0, {"2", "4", "12"}}});
  // RP^5: Z, 0, Z/2, 0, Z/2, Z (UCT from H_* = Z, Z/2, 0, Z/2, 0, Z).
  CHECK(certified_cohomology_groups<integer>(cell_list::real_projective_space(5)) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {"2"}}, {0, {}}, {0, {"2"}}, {1, {}}});
  // Over Z/2: RP^2 has dimensions 1, 1, 1.
  CHECK(certified_cohomology_groups<lacuna::z2>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  // A cohomology certificate read as one of homology (or the other way) does not check.
  auto r = lacuna::certified_cohomology<integer>(six_vertex_rp2());
  r.certificate.kind = certificate_kind::absolute;
  CHECK(!lacuna::check_certificate(six_vertex_rp2(), r.certificate).ok);
}

template <class C>
int kind_mutations_rejected(const C& c, certificate_kind kind, const marks_t* a = nullptr) {
  using cert_t = lacuna::homology_certificate<integer>;
  const auto good = kind == certificate_kind::relative     ? lacuna::certified_relative_homology<integer>(c, *a).certificate
                    : kind == certificate_kind::cohomology ? lacuna::certified_cohomology<integer>(c).certificate
                                                           : lacuna::certified_homology<integer>(c, {.reduced = true}).certificate;
  auto check = [&](const cert_t& x) { return a ? lacuna::check_certificate(c, x, *a) : lacuna::check_certificate(c, x); };
  auto bnd = [&](int f) { return kind_boundary(c, kind, a, f); };
  return mutations_rejected_by(c, good, check, bnd);
}

TEST_CASE("mutations of reduced, relative and cohomology certificates are rejected, naming the group and factor") {
  CHECK(kind_mutations_rejected(six_vertex_rp2(), certificate_kind::reduced) >= 5);
  CHECK(kind_mutations_rejected(seven_vertex_torus(), certificate_kind::reduced) >= 5);
  CHECK(kind_mutations_rejected(torsion_2_4_12(), certificate_kind::reduced) >= 10);
  const auto m = five_vertex_moebius();
  const auto rim = marks_of(m, moebius_rim());
  CHECK(kind_mutations_rejected(m, certificate_kind::relative, &rim) >= 5);
  const auto disk = cone_disk(6);
  const auto disk_rim = marks_of(disk, cone_rim(6));
  CHECK(kind_mutations_rejected(disk, certificate_kind::relative, &disk_rim) >= 3);
  const auto t = seven_vertex_torus();
  const auto t_point = marks_of(t, {{1}});
  CHECK(kind_mutations_rejected(t, certificate_kind::relative, &t_point) >= 5);
  CHECK(kind_mutations_rejected(six_vertex_rp2(), certificate_kind::cohomology) >= 5);
  CHECK(kind_mutations_rejected(cell_list::klein_bottle(), certificate_kind::cohomology) >= 8);
  CHECK(kind_mutations_rejected(torsion_2_4_12(), certificate_kind::cohomology) >= 10);
  CHECK(kind_mutations_rejected(cell_list::real_projective_space(5), certificate_kind::cohomology) >= 5);
}

/// The result of a derived kind is built from the one run on the derived complex (no second
/// run of the engine): its groups and flags are those of the engine's own result of the kind
/// (homology with reduced, relative_homology, cohomology: a separate run), its coordinates()
/// send the i-th generator to e_i (the residue 1 for a torsion generator), boundaries of the
/// kind to 0, and the engine's own generators to non-zero classes.
template <class C>
int result_from_one_run(const C& c, certificate_kind kind, const marks_t* a = nullptr) {
  const auto r = kind == certificate_kind::relative     ? lacuna::certified_relative_homology<integer>(c, *a)
                 : kind == certificate_kind::cohomology ? lacuna::certified_cohomology<integer>(c)
                                                        : lacuna::certified_homology<integer>(c, {.reduced = true});
  const auto own = kind == certificate_kind::relative     ? lacuna::relative_homology<integer>(c, *a, {.generators = true})
                   : kind == certificate_kind::cohomology ? lacuna::cohomology<integer>(c, {.generators = true})
                                                          : lacuna::homology<integer>(c, {.generators = true, .reduced = true});
  CHECK(groups_of(r.result) == groups_of(own));
  CHECK(r.result.reduced == own.reduced);
  CHECK(r.result.relative == own.relative);
  CHECK(r.result.cohomology == own.cohomology);
  REQUIRE(r.result.has_basis());
  int checked = 0;
  for (int k = 0; k <= r.result.top_dimension(); ++k) {
    const auto& gens = r.result[k].generators;
    REQUIRE(gens.size() == r.certificate.groups[static_cast<std::size_t>(k)].generators.size());
    for (std::size_t i = 0; i < gens.size(); ++i) {
      const auto x = r.result.coordinates(c, gens[i]);
      REQUIRE(x.size() == gens.size());
      INFO("kind " << static_cast<int>(kind) << ", degree " << k << ", generator " << i);
      for (std::size_t j = 0; j < x.size(); ++j) CHECK(x[j] == integer(i == j ? 1 : 0));
      ++checked;
    }
    const auto b = kind_boundary(c, kind, a, k);
    if (!b.terms.empty()) {
      CHECK(r.result.is_boundary(c, b));
      ++checked;
    }
    for (const auto& z : own[k].generators) CHECK(!r.result.is_boundary(c, z));
  }
  return checked;
}

TEST_CASE("a derived kind's result comes from the one run on the derived complex, with working coordinates") {
  CHECK(result_from_one_run(six_vertex_rp2(), certificate_kind::reduced) >= 2);
  CHECK(result_from_one_run(seven_vertex_torus(), certificate_kind::reduced) >= 4);
  CHECK(result_from_one_run(torsion_2_4_12(), certificate_kind::reduced) >= 4);
  const auto m = five_vertex_moebius();
  const auto rim = marks_of(m, moebius_rim());
  CHECK(result_from_one_run(m, certificate_kind::relative, &rim) >= 2);
  const auto disk = cone_disk(6);
  const auto disk_rim = marks_of(disk, cone_rim(6));
  CHECK(result_from_one_run(disk, certificate_kind::relative, &disk_rim) >= 2);
  const auto t = seven_vertex_torus();
  const auto t_point = marks_of(t, {{1}});
  CHECK(result_from_one_run(t, certificate_kind::relative, &t_point) >= 4);
  CHECK(result_from_one_run(six_vertex_rp2(), certificate_kind::cohomology) >= 2);
  CHECK(result_from_one_run(cell_list::klein_bottle(), certificate_kind::cohomology) >= 3);
  CHECK(result_from_one_run(torsion_2_4_12(), certificate_kind::cohomology) >= 4);
  CHECK(result_from_one_run(cell_list::real_projective_space(5), certificate_kind::cohomology) >= 4);
}

TEST_CASE("reduced homology of S^0: a vertex is a cycle, but not a reduced one") {
  // H̃_0(S^0) = Z generated by p1 − p0 (Hatcher 2002, §2.1, from memory); p0 alone has
  // augmentation 1, so it is no cycle of the augmented complex.
  const auto s0 = points(2);
  const auto good = lacuna::certified_homology<integer>(s0, {.reduced = true}).certificate;
  REQUIRE(lacuna::check_certificate(s0, good).ok);
  auto bad = good;
  bad.groups[0].generators[0] = lacuna::chain<integer>{0, {{0, integer(1)}}};
  auto rep = lacuna::check_certificate(s0, bad);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 0);
  CHECK(rep.generator == 0);
  CHECK(rep.first_failure.find("H̃_0 free generator 0") != std::string::npos);
  CHECK(rep.first_failure.find("the augmentation cell") != std::string::npos);
  // H̃_0 claimed to have rank 2 (the absolute b_0), with a second generator and cochain.
  bad = good;
  bad.groups[0].rank = 2;
  bad.groups[0].generators.push_back(lacuna::chain<integer>{0, {{0, integer(1)}, {1, integer(1)}}});
  bad.groups[0].cocycles.push_back(lacuna::chain<integer>{0, {}});
  rep = lacuna::check_certificate(s0, bad);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 0);
  // The rank witness of ε removed: H̃_{−1} = 0 and the free rank of H̃_0 are no longer proved.
  bad = good;
  bad.ranks[0] = {};
  rep = lacuna::check_certificate(s0, bad);
  CHECK(!rep.ok);
}

}  // namespace homology_certificate_kinds_test

// Certificates of homology (homology/certify.hpp, homology/certificate.hpp): the certificates
// of textbook spaces check valid and give the textbook groups, and every mutation of a
// certificate — a torsion factor changed, a generator dropped, duplicated or replaced by a
// boundary, two orders swapped, one coefficient of a witness perturbed — is rejected, naming
// the group (and the generator or torsion factor) that is wrong.
#include "homology/support.hpp"
#include "homology/certificate_mutations.hpp"

#include "cubical/volume_support.hpp"

#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <functional>

namespace homology_certificate_test {

using namespace lacuna_test;
using namespace certificate_mutations;
using lacuna::cell_list;
using lacuna::integer;

template <class R>
std::vector<group> certified_groups(const lacuna::homology_certificate<R>& cert) {
  std::vector<group> out;
  for (const auto& g : cert.groups) {
    group x{g.rank, {}};
    for (const auto& t : g.torsion) x.torsion.push_back(text(t));
    out.push_back(x);
  }
  return out;
}

/// Certifies c over R, checks the certificate, and returns its groups (also compared with
/// the plain homology() of the default route, which certifies nothing).
template <class R, class C>
std::vector<group> certified(const C& c) {
  const auto r = lacuna::certified_homology<R>(c);
  const auto rep = lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  CHECK(rep.ok);
  CHECK(rep.checks > 0);
  const auto gs = certified_groups(r.certificate);
  CHECK(gs == groups_of(lacuna::homology<R>(c)));
  return gs;
}

/// A cell list with H_1 = Z ⊕ Z/2 ⊕ Z/4 ⊕ Z/12: loops a..d at one vertex, 2-cells attached
/// along 2b, 4c and 12d (the cellular chain complex gives the groups at once).
cell_list torsion_mix() {
  cell_list c;
  c.add_cell(0, "v");
  for (const char* e : {"a", "b", "c", "d"}) c.add_cell(1, e, {{0, 1}, {0, -1}});
  c.add_cell(2, "B", {{1, 2}});
  c.add_cell(2, "C", {{2, 4}});
  c.add_cell(2, "D", {{3, 12}});
  return c;
}

/// A circle of n vertices and n edges.
cell_list polygon(std::size_t n) {
  cell_list c;
  for (std::size_t i = 0; i < n; ++i) c.add_cell(0, "v" + std::to_string(i));
  for (std::size_t i = 0; i < n; ++i) c.add_cell(1, "e" + std::to_string(i), {{(i + 1) % n, 1}, {i, -1}});
  return c;
}

/// A 2-cell attached by degree `order` (a decimal of any size) to a loop: H_1 = Z/order.
cell_list moore_space(const std::string& order) {
  cell_list c;
  c.add_cell(0, "v");
  c.add_cell(1, "e", {{0, 1}, {0, -1}});
  c.add_cell(2, "d", std::vector<lacuna::exact_incidence>{{0, integer(lacuna::integer::big_type(order))}});
  return c;
}

/// Loops a, b, c at one vertex and 2-cells along 2^70·a and 2^71·b: H_1 = Z + Z/2^70 + Z/2^71.
cell_list big_torsion_mix() {
  cell_list c;
  c.add_cell(0, "v");
  for (const char* e : {"a", "b", "c"}) c.add_cell(1, e, {{0, 1}, {0, -1}});
  c.add_cell(2, "A", std::vector<lacuna::exact_incidence>{{0, integer(lacuna::integer::big_type("1180591620717411303424"))}});
  c.add_cell(2, "B", std::vector<lacuna::exact_incidence>{{1, integer(lacuna::integer::big_type("2361183241434822606848"))}});
  return c;
}

/// A binary volume as a cubical complex.
lacuna::cubical_complex<3> cubical(const lacuna_volumes::volume& v) {
  return lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
}

TEST_CASE("certificates of textbook spaces over Z check valid and give the textbook groups") {
  // Hatcher 2002, §2.1 and Example 2.42 (from memory): torus Z, Z^2, Z; Klein bottle Z, Z+Z/2, 0;
  // RP^2 Z, Z/2, 0; RP^5 Z, Z/2, 0, Z/2, 0, Z; lens space L(5,2): Z, Z/5, 0, Z (Hatcher 2002,
  // Example 2.43).
  CHECK(certified<integer>(cell_list::torus()) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(certified<integer>(cell_list::klein_bottle()) == std::vector<group>{{1, {}}, {1, {"2"}}, {0, {}}});
  CHECK(certified<integer>(cell_list::projective_plane()) == std::vector<group>{{1, {}}, {0, {"2"}}, {0, {}}});
  CHECK(certified<integer>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {0, {"2"}}, {0, {}}});
  CHECK(certified<integer>(seven_vertex_torus()) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  CHECK(certified<integer>(cell_list::real_projective_space(5)) ==
        std::vector<group>{{1, {}}, {0, {"2"}}, {0, {}}, {0, {"2"}}, {0, {}}, {1, {}}});
  CHECK(certified<integer>(cell_list::lens_space(5, 2)) == std::vector<group>{{1, {}}, {0, {"5"}}, {0, {}}, {1, {}}});
  // The dunce hat is contractible (Zeeman 1964): Z, 0, 0.
  CHECK(certified<integer>(dunce_hat()) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  // Invariant factors of Z/2 + Z/4 + Z/12 (structure theorem): 2 | 4 | 12.
  CHECK(certified<integer>(torsion_mix()) == std::vector<group>{{1, {}}, {1, {"2", "4", "12"}}, {0, {}}});
  // The matching complex of K_7 has H_1 = Z/3 + ... (checked against the plain route only).
  certified<integer>(matching_complex(7));
}

TEST_CASE("certificates over fields: Z/2, Z/3 and Q") {
  // RP^2 over Z/2: dimensions 1, 1, 1; over Z/3 and Q: 1, 0, 0 (universal coefficients).
  CHECK(certified<lacuna::z2>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  CHECK(certified<lacuna::mod_p<3>>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(certified<lacuna::rational>(six_vertex_rp2()) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(certified<lacuna::z2>(seven_vertex_torus()) == std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
  // A claimed dimension one too small (a generator dropped with its cocycle) is refused by
  // the rank witnesses.
  auto r = lacuna::certified_homology<lacuna::z2>(six_vertex_rp2());
  auto& g = r.certificate.groups[1];
  g.rank = 0;
  g.generators.clear();
  g.cocycles.clear();
  const auto rep = lacuna::check_certificate(six_vertex_rp2(), r.certificate);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 1);
  CHECK(rep.first_failure.find("free rank") != std::string::npos);
}

TEST_CASE("certificates of larger complexes, big torsion and volumes check valid") {
  // RP^2 × S^1 with 2170 cells (the six-vertex RP^2 times a 35-gon): Künneth (Hatcher 2002,
  // Theorem 3B.6, from memory) gives Z, Z + Z/2, Z/2, 0.
  const auto x = lacuna::product(six_vertex_rp2(), polygon(35));
  REQUIRE(lacuna::total_cell_count(x) == 2170);
  CHECK(certified<integer>(x) == std::vector<group>{{1, {}}, {1, {"2"}}, {0, {"2"}}, {0, {}}});
  // Torsion beyond 2^64: H_1 = Z/(2^70 + 1), and Z + Z/2^70 + Z/2^71 (the cellular chain complex).
  CHECK(certified<integer>(moore_space("1180591620717411303425")) ==
        std::vector<group>{{1, {}}, {0, {"1180591620717411303425"}}, {0, {}}});
  CHECK(certified<integer>(big_torsion_mix()) ==
        std::vector<group>{{1, {}}, {1, {"1180591620717411303424", "2361183241434822606848"}}, {0, {}}});
  // Volumes: Betti numbers from the independent count of volume_support.hpp (connected
  // components and Alexander duality).
  for (const auto& v : {lacuna_volumes::porous_volume(24, 2.0, 3), lacuna_volumes::coin_flip_volume(14, 0.5, 5)}) {
    const auto d = lacuna_volumes::duality_betti(v);
    CHECK(certified<integer>(cubical(v)) == std::vector<group>{{d.b0, {}}, {d.b1, {}}, {d.b2, {}}, {0, {}}});
  }
}

TEST_CASE("mutations of certificates are rejected, naming the group and factor") {
  CHECK(mutations_rejected(cell_list::projective_plane()) >= 5);
  CHECK(mutations_rejected(cell_list::klein_bottle()) >= 8);
  CHECK(mutations_rejected(six_vertex_rp2()) >= 5);
  CHECK(mutations_rejected(seven_vertex_torus()) >= 5);
  CHECK(mutations_rejected(torsion_mix()) >= 10);
  CHECK(mutations_rejected(cell_list::real_projective_space(5)) >= 5);
  // The size at which the coordinates-based check accepted Z/4 for Z/2.
  CHECK(mutations_rejected(lacuna::product(six_vertex_rp2(), polygon(35))) >= 10);
  CHECK(mutations_rejected(moore_space("1180591620717411303425")) >= 5);
  CHECK(mutations_rejected(big_torsion_mix()) >= 10);
  CHECK(mutations_rejected(cubical(lacuna_volumes::porous_volume(24, 2.0, 3))) >= 5);
  CHECK(mutations_rejected(cubical(lacuna_volumes::coin_flip_volume(14, 0.5, 5))) >= 5);
}

TEST_CASE("a certificate is refused for a complex whose boundary of a boundary is not zero") {
  const auto good = lacuna::certified_homology<integer>(cell_list::projective_plane()).certificate;
  cell_list bad;  // RP^2 with ∂U = a + b + c: ∂∂U = 2w − 2v
  bad.add_cell(0, "v");
  bad.add_cell(0, "w");
  bad.add_cell(1, "a", {{1, 1}, {0, -1}});
  bad.add_cell(1, "b", {{1, 1}, {0, -1}});
  bad.add_cell(1, "c", {{0, 1}, {0, -1}});
  bad.add_cell(2, "U", {{0, 1}, {1, 1}, {2, 1}});
  bad.add_cell(2, "L", {{0, 1}, {1, -1}, {2, 1}});
  const auto rep = lacuna::check_certificate(bad, good);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 2);
  CHECK(rep.first_failure.find("not a chain complex") != std::string::npos);
}

}  // namespace homology_certificate_test

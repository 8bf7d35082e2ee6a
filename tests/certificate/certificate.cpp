// Certificates of homology (homology/certify.hpp, homology/certificate.hpp): the certificates
// of textbook spaces check valid and give the textbook groups, and every mutation of a
// certificate — a torsion factor changed, a generator dropped, duplicated or replaced by a
// boundary, two orders swapped, one coefficient of a witness perturbed — is rejected, naming
// the group (and the generator or torsion factor) that is wrong.
#include "homology/support.hpp"

#include "cubical/volume_support.hpp"

#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <functional>

namespace certificate_certificate_test {

using namespace lacuna_test;
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

/// A mutation of a certificate, and where its checker must find the fault.
template <class R>
struct mutation {
  std::string name;
  std::function<bool(lacuna::homology_certificate<R>&)> apply;  // false: does not apply here
  int dimension;
  std::ptrdiff_t generator;  // -2: any
  std::string words;         // a phrase of the failure
};

/// The index of the first group with torsion, or -1.
template <class R>
int torsion_degree(const lacuna::homology_certificate<R>& c) {
  for (const auto& g : c.groups)
    if (!g.torsion.empty()) return g.dimension;
  return -1;
}
template <class R>
int free_degree(const lacuna::homology_certificate<R>& c) {
  for (const auto& g : c.groups)
    if (g.dimension > 0 && g.rank > 0) return g.dimension;
  return -1;
}

/// Runs every mutation that applies to c's certificate and checks it is rejected where
/// expected. Returns how many applied.
template <class C>
int mutations_rejected(const C& c) {
  const auto good = lacuna::certified_homology<integer>(c).certificate;
  REQUIRE(lacuna::check_certificate(c, good).ok);
  const int t = torsion_degree(good), f = free_degree(good);
  using cert_t = lacuna::homology_certificate<integer>;
  std::vector<mutation<integer>> ms;
  if (t >= 0) {
    const std::size_t r = good.groups[t].rank;
    const std::ptrdiff_t last = static_cast<std::ptrdiff_t>(r + good.groups[t].torsion.size() - 1);
    // The report's case: the largest torsion factor doubled, generators left alone (and the
    // bounding chain doubled too, so that ∂w = d·z still holds): no cocycle mod 2d takes a
    // unit value on a class of order d.
    ms.push_back({"torsion factor doubled", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    g.torsion.back() = g.torsion.back() * 2;
                    g.bounding_chains.back() = lacuna::scaled(integer(2), g.bounding_chains.back());
                    return true;
                  }, t, last, ""});
    ms.push_back({"torsion factor doubled, witnesses left alone", [t](cert_t& x) {
                    x.groups[t].torsion.back() = x.groups[t].torsion.back() * 2;
                    return true;
                  }, t, last, "bounding chain"});
    ms.push_back({"torsion generator replaced by a boundary", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    // d·z = ∂w is a boundary; its bounding chain d·w keeps (b) true, so the
                    // cocycle's value d ≡ 0 must give it away
                    g.generators.back() = lacuna::scaled(g.torsion.back(), g.generators.back());
                    g.bounding_chains.back() = lacuna::scaled(g.torsion.back(), g.bounding_chains.back());
                    return true;
                  }, t, last, "not 1 modulo"});
    ms.push_back({"one coefficient of a torsion cocycle perturbed", [t](cert_t& x) {
                    auto& phi = x.groups[t].cocycles.back();
                    phi.terms.front().coefficient += 1;
                    if (phi.terms.front().coefficient == x.groups[t].torsion.back()) phi.terms.front().coefficient = 0;
                    phi.normalize_terms();
                    return true;
                  }, t, -2, ""});
    ms.push_back({"one coefficient of a bounding chain perturbed", [t](cert_t& x) {
                    x.groups[t].bounding_chains.back().terms.front().coefficient += 1;
                    x.groups[t].bounding_chains.back().normalize_terms();
                    return true;
                  }, t, last, "bounding chain"});
    if (good.groups[t].torsion.size() >= 2)
      ms.push_back({"two orders swapped", [t](cert_t& x) {
                      auto& g = x.groups[t];
                      std::swap(g.torsion[0], g.torsion[1]);
                      return true;
                    }, t, -2, ""});
    ms.push_back({"a torsion generator duplicated over another", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    if (g.generators.size() < 2) return false;
                    g.generators[g.generators.size() - 2] = g.generators.back();
                    return true;
                  }, t, -2, ""});
  }
  if (f >= 0) {
    ms.push_back({"free generator dropped (rank one less)", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    g.rank -= 1;
                    g.generators.erase(g.generators.begin());
                    g.cocycles.erase(g.cocycles.begin());
                    return true;
                  }, f, -1, "free rank"});
    ms.push_back({"free generator duplicated", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    if (g.rank < 2) return false;
                    g.generators[1] = g.generators[0];
                    return true;
                  }, f, -2, ""});
    ms.push_back({"free generator doubled", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    g.generators[0] = lacuna::scaled(integer(2), g.generators[0]);
                    return true;
                  }, f, 0, "not 1"});
    ms.push_back({"free generator replaced by a boundary", [f, &c](cert_t& x) {
                    auto& g = x.groups[f];
                    if (lacuna::cell_count(c, f + 1) == 0) return false;
                    lacuna::chain<integer> b{f, {}};
                    for (auto&& v : lacuna::boundary(c, f + 1, 0))
                      b.terms.push_back({lacuna::incidence_face(v), lacuna::coefficient_as_integer(v)});
                    b.normalize_terms();
                    if (b.is_zero()) return false;
                    g.generators[0] = b;
                    return true;
                  }, f, 0, ""});
    ms.push_back({"one coefficient of a free cocycle perturbed", [f](cert_t& x) {
                    auto& phi = x.groups[f].cocycles[0];
                    phi.terms.front().coefficient += 1;
                    phi.normalize_terms();
                    return true;
                  }, f, -2, ""});
    ms.push_back({"a rank witness loses a pivot", [f](cert_t& x) {
                    auto& w = x.ranks[static_cast<std::size_t>(f + 1 < static_cast<int>(x.ranks.size()) ? f + 1 : f)];
                    if (w.rows.empty()) return false;
                    w.rows.pop_back(), w.columns.pop_back();
                    return true;
                  }, -3, -1, ""});
  }
  int applied = 0;
  for (auto& m : ms) {
    auto bad = good;
    if (!m.apply(bad)) continue;
    ++applied;
    const auto rep = lacuna::check_certificate(c, bad);
    INFO(m.name << ": " << rep.first_failure);
    CHECK(!rep.ok);
    if (m.dimension != -3) CHECK(rep.dimension == m.dimension);
    if (m.generator != -2) CHECK(rep.generator == m.generator);
    if (!m.words.empty()) CHECK(rep.first_failure.find(m.words) != std::string::npos);
  }
  return applied;
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

}  // namespace certificate_certificate_test

// Certificates of homology (homology/certify.hpp, homology/certificate.hpp): the certificates
// of textbook spaces check valid and give the textbook groups, and every mutation of a
// certificate — a torsion factor changed, a generator dropped, duplicated or replaced by a
// boundary, two orders swapped, one coefficient of a witness perturbed, a whole torsion summand
// left out with its generator, a torsion witness's minors changed — is rejected, naming the
// group (and the generator or torsion factor) that is wrong.
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

#include <algorithm>
#include <bit>
#include <functional>
#include <numeric>
#include <random>

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
  CHECK(certified<integer>(torsion_2_4_12()) == std::vector<group>{{1, {}}, {1, {"2", "4", "12"}}, {0, {}}});
  // The matching complex of K_7: H_1 = Z/3 (Bouc 1992, from memory).
  CHECK(certified<integer>(matching_complex(7))[1] == group{0, {"3"}});
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
  CHECK(mutations_rejected(torsion_2_4_12()) >= 10);
  CHECK(mutations_rejected(cell_list::real_projective_space(5)) >= 5);
  // The size at which the coordinates-based check accepted Z/4 for Z/2.
  CHECK(mutations_rejected(lacuna::product(six_vertex_rp2(), polygon(35))) >= 10);
  CHECK(mutations_rejected(moore_space("1180591620717411303425")) >= 5);
  CHECK(mutations_rejected(big_torsion_mix()) >= 10);
  CHECK(mutations_rejected(cubical(lacuna_volumes::porous_volume(24, 2.0, 3))) >= 5);
  CHECK(mutations_rejected(cubical(lacuna_volumes::coin_flip_volume(14, 0.5, 5))) >= 5);
}

/// The certificate of c over Z with the first torsion summand of H_k (its factor, generator,
/// cocycle and bounding chain) left out.
template <class C>
lacuna::homology_certificate<integer> summand_dropped(const C& c, int k) {
  auto cert = lacuna::certified_homology<integer>(c).certificate;
  auto& g = cert.groups[static_cast<std::size_t>(k)];
  REQUIRE(!g.torsion.empty());
  g.torsion.erase(g.torsion.begin());
  g.generators.erase(g.generators.begin() + static_cast<std::ptrdiff_t>(g.rank));
  g.cocycles.erase(g.cocycles.begin() + static_cast<std::ptrdiff_t>(g.rank));
  g.bounding_chains.erase(g.bounding_chains.begin());
  return cert;
}

/// check_certificate refuses cert for c at degree k because the torsion witness's gcd is not
/// the product of the claimed factors, and names both numbers.
template <class C>
void refused_for_torsion(const C& c, const lacuna::homology_certificate<integer>& cert, int k, const std::string& gcd,
                         const std::string& product) {
  const auto rep = lacuna::check_certificate(c, cert);
  INFO(rep.first_failure);
  CHECK(!rep.ok);
  CHECK(!rep.torsion_unproved);
  CHECK(rep.dimension == k);
  CHECK(rep.first_failure.find("H_" + std::to_string(k) + ": the torsion witness") == 0);
  CHECK(rep.first_failure.find("minors is " + gcd + ", not the product " + product) != std::string::npos);
}

TEST_CASE("a torsion summand left out with its generator is refused by the torsion witness") {
  // RP^2 × RP^2: Künneth (Hatcher 2002, Theorem 3B.6, from memory) with H(RP^2) = Z, Z/2, 0
  // gives Z, Z/2 + Z/2, Z/2 (H_1 ⊗ H_1), Z/2 (Tor(H_1, H_1)), 0.
  const auto rp2 = cell_list::projective_plane();
  const auto x = lacuna::product(rp2, rp2);
  CHECK(certified<integer>(x) ==
        std::vector<group>{{1, {}}, {0, {"2", "2"}}, {0, {"2"}}, {0, {"2"}}, {0, {}}});
  // Claimed H_1 = Z/2: the torsion has order 4 (the determinantal divisor d_1 d_2 of ∂_2).
  refused_for_torsion(x, summand_dropped(x, 1), 1, "4", "2");
  refused_for_torsion(x, summand_dropped(x, 3), 3, "2", "1");
  // RP^2 claimed simply connected in homology: H_1 = 0 where it is Z/2 (Hatcher 2002, §2.1).
  refused_for_torsion(rp2, summand_dropped(rp2, 1), 1, "2", "1");
  // The lens space L(3,1): H_1 = Z/3 (Hatcher 2002, Example 2.43) claimed as 0.
  const auto lens = cell_list::lens_space(3, 1);
  CHECK(certified<integer>(lens) == std::vector<group>{{1, {}}, {0, {"3"}}, {0, {}}, {1, {}}});
  refused_for_torsion(lens, summand_dropped(lens, 1), 1, "3", "1");
  // The matching complex of K_7: H_1 = Z/3 (Bouc 1992, from memory), claimed as 0.
  const auto m7 = matching_complex(7);
  const auto m7_groups = certified<integer>(m7);
  REQUIRE(m7_groups.size() >= 2);
  CHECK(m7_groups[1] == group{0, {"3"}});
  refused_for_torsion(m7, summand_dropped(m7, 1), 1, "3", "1");
  // Z + Z/2 + Z/4 + Z/12 (the cellular chain complex of torsion_mix) with the Z/2 left out:
  // the order 96 of the torsion against 48.
  refused_for_torsion(torsion_2_4_12(), summand_dropped(torsion_2_4_12(), 1), 1, "96", "48");
}

TEST_CASE("a torsion witness needs several minors when no one minor has the gcd") {
  // One loop e and two 2-cells along 2e and 3e: the cellular chain complex gives ∂_2 = (2 3),
  // so H_1 = Z/gcd(2, 3) = 0 and H_2 = Z (its kernel). No pivot is a unit; the 1×1 minors are
  // 2 and 3, and only both together prove that H_1 has no torsion.
  cell_list c;
  c.add_cell(0, "v");
  c.add_cell(1, "e", {{0, 1}, {0, -1}});
  c.add_cell(2, "A", {{0, 2}});
  c.add_cell(2, "B", {{0, 3}});
  CHECK(certified<integer>(c) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  auto cert = lacuna::certified_homology<integer>(c).certificate;
  REQUIRE(cert.torsion.size() == 3);
  CHECK(cert.torsion[1].pivot_rows.empty());
  CHECK(cert.torsion[1].minors.size() == 2);
  // Either minor alone leaves the gcd at 2 or 3: refused.
  for (std::size_t i = 0; i < cert.torsion[1].minors.size(); ++i) {
    auto one = cert;
    one.torsion[1].minors = {cert.torsion[1].minors[i]};
    const auto rep = lacuna::check_certificate(c, one);
    INFO(rep.first_failure);
    CHECK(!rep.ok);
    CHECK(rep.dimension == 1);
    CHECK(rep.first_failure.find(", not the product 1") != std::string::npos);
  }
}

/// The determinant of a small square matrix by Laplace expansion along the first column
/// (independent of the checker's elimination).
std::int64_t laplace_determinant(const std::vector<std::vector<std::int64_t>>& a) {
  const std::size_t n = a.size();
  if (n == 0) return 1;
  std::int64_t det = 0;
  for (std::size_t i = 0; i < n; ++i) {
    if (a[i][0] == 0) continue;
    std::vector<std::vector<std::int64_t>> minor;
    for (std::size_t r = 0; r < n; ++r)
      if (r != i) minor.emplace_back(a[r].begin() + 1, a[r].end());
    det += (i % 2 ? -1 : 1) * a[i][0] * laplace_determinant(minor);
  }
  return det;
}

TEST_CASE("certificates of random presentations: the torsion is the gcd of the minors") {
  // One vertex, n loops and m 2-cells with random boundaries (∂∂ = 0 as the loops are cycles).
  // Theorems checked beside the certificate: the Euler characteristic 1 − n + m = Σ (−1)^k r_k;
  // the order of the torsion of H_1 is the gcd of all ρ×ρ minors of ∂_2, ρ = m − r_2 (the
  // determinantal divisors of the Smith form), here by brute force over all minors with
  // Laplace expansion. Leaving out a torsion summand is refused.
  std::mt19937_64 random(2026);
  int with_torsion = 0;
  for (int trial = 0; trial < 80; ++trial) {
    const std::size_t n = 1 + random() % 5, m = 1 + random() % 5;
    cell_list c;
    c.add_cell(0, "v");
    for (std::size_t i = 0; i < n; ++i) c.add_cell(1, "e" + std::to_string(i), {{0, 1}, {0, -1}});
    std::vector<std::vector<std::int64_t>> d(n, std::vector<std::int64_t>(m, 0));  // ∂_2
    for (std::size_t j = 0; j < m; ++j) {
      std::vector<lacuna::incidence> b;
      for (std::size_t i = 0; i < n; ++i) {
        std::int64_t v = static_cast<std::int64_t>(random() % 9) - 4;
        if (random() % 3 == 0) v *= 6;
        d[i][j] = v;
        if (v != 0) b.push_back({i, v});
      }
      c.add_cell(2, "f" + std::to_string(j), b);
    }
    const auto r = lacuna::certified_homology<integer>(c);
    const auto rep = lacuna::check_certificate(c, r.certificate);
    INFO("trial " << trial << ": " << rep.first_failure);
    REQUIRE(rep.ok);
    const auto& gs = r.certificate.groups;
    CHECK(1 - static_cast<std::int64_t>(n) + static_cast<std::int64_t>(m) ==
          static_cast<std::int64_t>(gs[0].rank) - static_cast<std::int64_t>(gs[1].rank) + static_cast<std::int64_t>(gs[2].rank));
    const std::size_t rho = m - gs[2].rank;
    std::int64_t delta = 0;
    for (std::uint32_t rows = 0; rows < (1u << n); ++rows)
      for (std::uint32_t cols = 0; cols < (1u << m); ++cols) {
        if (static_cast<std::size_t>(std::popcount(rows)) != rho || static_cast<std::size_t>(std::popcount(cols)) != rho) continue;
        std::vector<std::vector<std::int64_t>> a;
        for (std::size_t i = 0; i < n; ++i) {
          if (!(rows >> i & 1u)) continue;
          a.emplace_back();
          for (std::size_t j = 0; j < m; ++j)
            if (cols >> j & 1u) a.back().push_back(d[i][j]);
        }
        delta = std::gcd(delta, laplace_determinant(a));
      }
    integer order(1);
    for (const auto& t : gs[1].torsion) order = order * t;
    CHECK(order == integer(delta));
    if (!gs[1].torsion.empty()) {
      ++with_torsion;
      const auto bad = summand_dropped(c, 1);
      const auto rb = lacuna::check_certificate(c, bad);
      CHECK(!rb.ok);
      CHECK(rb.dimension == 1);
      CHECK(rb.first_failure.find("torsion witness") != std::string::npos);
    }
  }
  CHECK(with_torsion >= 10);
}

TEST_CASE("no choice of minors proves a torsion summand left out absent") {
  // RP^2 × RP^2 with H_1 claimed Z/2 (Künneth: Z/2 + Z/2): every block of the core of ∂_2, with
  // the unit pivots of the witness, gives a certificate that is refused — the gcd of all the
  // minors of ∂_2 of its rank is 4 (the determinantal divisor), never 2.
  const auto rp2 = cell_list::projective_plane();
  const auto x = lacuna::product(rp2, rp2);
  const auto bad = summand_dropped(x, 1);
  const auto& tw = bad.torsion[1];
  REQUIRE(!tw.minors.empty());
  const std::size_t s = tw.minors[0].rows.size();
  std::vector<std::size_t> rows, columns;  // the cells not among the pivots
  for (std::size_t i = 0; i < lacuna::cell_count(x, 1); ++i)
    if (std::find(tw.pivot_rows.begin(), tw.pivot_rows.end(), i) == tw.pivot_rows.end()) rows.push_back(i);
  for (std::size_t i = 0; i < lacuna::cell_count(x, 2); ++i)
    if (std::find(tw.pivot_columns.begin(), tw.pivot_columns.end(), i) == tw.pivot_columns.end()) columns.push_back(i);
  REQUIRE(rows.size() <= 12);
  REQUIRE(columns.size() <= 12);
  auto subsets = [s](std::size_t n) {  // every s-subset of 0..n-1, as bit masks
    std::vector<std::vector<std::size_t>> out;
    for (std::uint32_t mask = 0; mask < (1u << n); ++mask)
      if (static_cast<std::size_t>(std::popcount(mask)) == s) {
        std::vector<std::size_t> v;
        for (std::size_t i = 0; i < n; ++i)
          if (mask >> i & 1u) v.push_back(i);
        out.push_back(v);
      }
    return out;
  };
  std::size_t tried = 0, all_minors_gcd_seen = 0;
  auto together = bad;  // every block at once: the gcd of all the minors
  together.torsion[1].minors.clear();
  for (const auto& rs : subsets(rows.size()))
    for (const auto& cs : subsets(columns.size())) {
      lacuna::minor_block b;
      for (std::size_t i : rs) b.rows.push_back(rows[i]);
      for (std::size_t j : cs) b.columns.push_back(columns[j]);
      auto one = bad;
      one.torsion[1].minors = {b};
      together.torsion[1].minors.push_back(b);
      const auto rep = lacuna::check_certificate(x, one);
      CHECK(!rep.ok);
      CHECK(rep.dimension == 1);
      ++tried;
    }
  CHECK(tried >= 1);
  const auto rep = lacuna::check_certificate(x, together);
  INFO(rep.first_failure);
  CHECK(!rep.ok);
  all_minors_gcd_seen += rep.first_failure.find("minors is 4, not the product 2") != std::string::npos;
  CHECK(all_minors_gcd_seen == 1);
}

TEST_CASE("a torsion witness whose pivots are not unit pivots is refused, naming the pivot") {
  // RP^2 from one cell per dimension: ∂d = 2e, so ∂_2 has no unit pivot and the witness of H_1
  // is the block (e, d) of determinant 2 = the claimed order (Hatcher 2002, §2.1).
  const auto rp2 = moore_space("2");
  auto cert = lacuna::certified_homology<integer>(rp2).certificate;
  REQUIRE(lacuna::check_certificate(rp2, cert).ok);
  auto& tw = cert.torsion[1];
  REQUIRE(tw.pivot_rows.empty());
  REQUIRE(tw.minors.size() == 1);
  REQUIRE(tw.minors[0].rows.size() == 1);
  // The block moved into the pivots: the pivot is 2, not ±1, and the checker says so.
  tw.pivot_rows = tw.minors[0].rows;
  tw.pivot_columns = tw.minors[0].columns;
  tw.minors[0] = {};
  const auto rep = lacuna::check_certificate(rp2, cert);
  INFO(rep.first_failure);
  CHECK(!rep.ok);
  CHECK(rep.dimension == 1);
  CHECK(rep.first_failure.find("is 2 after elimination by the pivots before it, not ±1") != std::string::npos);
}

TEST_CASE("a certificate without torsion witnesses proves the groups only up to a finite summand") {
  // The torus (Hatcher 2002, §2.1): a certificate of the older layout passes every other check,
  // and the report says that only the torsion is not proved.
  auto cert = lacuna::certified_homology<integer>(cell_list::torus()).certificate;
  cert.torsion.clear();
  const auto rep = lacuna::check_certificate(cell_list::torus(), cert);
  CHECK(!rep.ok);
  CHECK(rep.torsion_unproved);
  CHECK(rep.first_failure.find("no torsion witnesses") != std::string::npos);
  // Over a field nothing more is needed: Z/2 certificates carry none.
  const auto f = lacuna::certified_homology<lacuna::z2>(six_vertex_rp2()).certificate;
  CHECK(f.torsion.empty());
  CHECK(lacuna::check_certificate(six_vertex_rp2(), f).ok);
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

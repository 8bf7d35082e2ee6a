// Derived truths: the Künneth formula on products (cellular and simplicial), the universal
// coefficient theorem and χ on textbook and random complexes (fixed seeds), invariance under
// barycentric subdivision and across cell structures of one space.
#include "support.hpp"

#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/construct/simplicial_product.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/universal_coefficients.hpp>

#include <random>

namespace homology_derived_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

namespace {

/// The Künneth prediction for H_n(X × Y; Z) from the factors' integral groups
/// (Hatcher 2002, Theorem 3B.6): ⊕_{i+j=n} H_i(X) ⊗ H_j(Y) ⊕ ⊕_{i+j=n-1} Tor(H_i(X), H_j(Y)),
/// with Z^a ⊗ Z^b = Z^ab, Z^a ⊗ Z/t = (Z/t)^a, Z/s ⊗ Z/t = Tor(Z/s, Z/t) = Z/gcd(s, t).
std::vector<group> kunneth(const lacuna::homology_result<integer>& x, const lacuna::homology_result<integer>& y) {
  const int top = x.top_dimension() + y.top_dimension();
  std::vector<group> out;
  for (int n = 0; n <= top; ++n) {
    std::size_t rank = 0;
    std::vector<integer> cyc;
    for (int i = 0; i <= x.top_dimension(); ++i) {
      const int j = n - i;
      if (j >= 0 && j <= y.top_dimension()) {
        const auto &a = x[i], &b = y[j];
        rank += a.rank * b.rank;
        for (const auto& t : a.torsion)
          for (std::size_t r = 0; r < b.rank; ++r) cyc.push_back(t);
        for (const auto& t : b.torsion)
          for (std::size_t r = 0; r < a.rank; ++r) cyc.push_back(t);
        for (const auto& s : a.torsion)
          for (const auto& t : b.torsion) cyc.push_back(lacuna::gcd(s, t));
      }
      const int jt = n - 1 - i;  // Tor terms
      if (jt >= 0 && jt <= y.top_dimension())
        for (const auto& s : x[i].torsion)
          for (const auto& t : y[jt].torsion) cyc.push_back(lacuna::gcd(s, t));
    }
    out.push_back({rank, invariant_factors(cyc)});
  }
  return out;
}

template <class C>
void check_uct(const C& c) {
  const auto rep = lacuna::check_universal_coefficients<2, 3, 5, 7>(c);
  // χ over Z, then per ring (Q, Z/2, Z/3, Z/5, Z/7): one identity per degree and χ; then two
  // cohomology identities per degree.
  const std::size_t degrees = static_cast<std::size_t>(lacuna::top_dimension(c) + 1);
  CHECK(rep.identities.size() == 1 + 5 * (degrees + 1) + 2 * degrees);
  for (const auto& id : rep.identities) {
    INFO(id.statement, ": predicted ", id.predicted, ", computed ", id.computed);
    CHECK(id.holds);
  }
  const auto dense = lacuna::check_universal_coefficients<2, 3>(c, lacuna::dense_elimination{});
  CHECK(dense.ok());
}

/// A random presentation complex with torsion in H_1 and H_2: one vertex, g loops, r 2-cells
/// with random boundary coefficients, some 2-cells doubled and each pair joined by a 3-cell
/// of random degree k (∂ = k(R - R')), so H_2 gets torsion and the Tor term of the UCT in
/// degree 3 matters.
cell_list random_presentation(std::mt19937_64& rng) {
  cell_list c;
  c.add_cell(0, "v");
  std::uniform_int_distribution<int> gd(1, 4), rd(0, 4), coef(-6, 6), deg(1, 6);
  const int g = gd(rng), r = rd(rng);
  for (int i = 0; i < g; ++i) c.add_cell(1, "", {{0, 1}, {0, -1}});
  std::vector<std::vector<lacuna::incidence>> rel;
  for (int j = 0; j < r; ++j) {
    std::vector<lacuna::incidence> t;
    for (int i = 0; i < g; ++i) t.push_back({static_cast<std::size_t>(i), coef(rng)});
    rel.push_back(t);
    c.add_cell(2, "", t);
  }
  std::vector<std::pair<std::size_t, std::size_t>> twins;
  for (int j = 0; j < r; ++j)
    if (rng() % 2 == 1) twins.push_back({static_cast<std::size_t>(j), c.add_cell(2, "", rel[static_cast<std::size_t>(j)])});
  for (auto [a, b] : twins) {
    const std::int64_t k = deg(rng);
    c.add_cell(3, "", {{a, k}, {b, -k}});
  }
  return c;
}

/// A random simplicial complex: random facets of dimension 1..3 on 7 vertices.
lacuna::simplicial_complex<int> random_simplicial(std::mt19937_64& rng) {
  std::vector<std::vector<int>> fs;
  std::uniform_int_distribution<int> nf(3, 12), dim(1, 3);
  const int n = nf(rng);
  for (int i = 0; i < n; ++i) {
    std::vector<int> vs{0, 1, 2, 3, 4, 5, 6};
    std::shuffle(vs.begin(), vs.end(), rng);
    vs.resize(static_cast<std::size_t>(dim(rng) + 1));
    fs.push_back(vs);
  }
  return facets(fs);
}

/// A hollow torus of voxels: a square solid torus (7 x 7 minus the centre voxel, 5 layers)
/// with a concentric cavity one voxel inside every wall. It is T^2 x I, homotopy equivalent
/// to T^2 (by construction).
lacuna::cubical_complex<3> voxel_torus_shell() {
  return lacuna::cubical_complex<3>::from_predicate({7, 7, 5}, [](const std::array<std::size_t, 3>& v) {
    const auto ring = [](std::size_t x, std::size_t y) {  // Chebyshev distance from the centre (3,3)
      const std::size_t dx = x > 3 ? x - 3 : 3 - x, dy = y > 3 ? y - 3 : 3 - y;
      return std::max(dx, dy);
    };
    const std::size_t d = ring(v[0], v[1]);
    if (d == 0) return false;                              // the hole of the solid torus
    const bool cavity = d == 2 && v[2] >= 1 && v[2] <= 3;  // strictly inside the walls
    return !cavity;
  });
}

}  // namespace

TEST_CASE("Künneth on cellular products, Tor terms included") {
  const std::vector<std::pair<cell_list, cell_list>> pairs{
      {cell_list::projective_plane(), cell_list::projective_plane()},
      {cell_list::real_projective_space(2), cell_list::real_projective_space(3)},
      {cell_list::klein_bottle(), cell_list::projective_plane()},
      {cell_list::lens_space(4, 1), cell_list::real_projective_space(2)},
      {cell_list::lens_space(3, 1), cell_list::lens_space(6, 1)},
      {cell_list::torus(), cell_list::klein_bottle()},
      {cell_list::circle(), cell_list::sphere(2)},
  };
  for (const auto& [x, y] : pairs) {
    const auto hx = lacuna::homology<integer>(x), hy = lacuna::homology<integer>(y);
    const auto want = kunneth(hx, hy);
    const auto p = lacuna::product(x, y);
    INFO("predicted ", show(want));
    CHECK(all_variants<integer>(p) == want);
  }
  // The Tor term is really exercised: H_3(RP^2 x RP^2) = Tor(Z/2, Z/2) = Z/2 and
  // H_2 = Z/2 ⊗ Z/2 = Z/2 (from memory: H(RP^2 x RP^2) = Z, Z/2 + Z/2,
  // Z/2, Z/2, 0).
  const auto rp = cell_list::projective_plane();
  CHECK(kunneth(lacuna::homology<integer>(rp), lacuna::homology<integer>(rp)) ==
        std::vector<group>{{1, {}}, {0, {"2", "2"}}, {0, {"2"}}, {0, {"2"}}, {0, {}}});
}

TEST_CASE("Künneth on simplicial products") {
  const auto circle = simplex_boundary_sphere(1);
  const auto rp2 = six_vertex_rp2();
  const auto mb = five_vertex_moebius();
  for (const auto& [x, y] : std::vector<std::pair<lacuna::simplicial_complex<int>, lacuna::simplicial_complex<int>>>{
           {rp2, circle}, {mb, circle}, {circle, circle}, {rp2, rp2}}) {
    const auto want = kunneth(lacuna::homology<integer>(x), lacuna::homology<integer>(y));
    const auto p = lacuna::simplicial_product(x, y);
    CHECK(lacuna::euler_characteristic(p) == lacuna::euler_characteristic(x) * lacuna::euler_characteristic(y));
    INFO("predicted ", show(want));
    CHECK(all_variants<integer>(p) == want);
  }
}

TEST_CASE("universal coefficients and χ on textbook complexes") {
  check_uct(cell_list::torus());
  check_uct(cell_list::klein_bottle());
  check_uct(cell_list::projective_plane());
  check_uct(cell_list::real_projective_space(6));
  check_uct(cell_list::lens_space(6, 1));
  check_uct(six_vertex_rp2());
  check_uct(matching_complex(7));
  check_uct(lacuna::product(cell_list::projective_plane(), cell_list::lens_space(3, 1)));
}

TEST_CASE("universal coefficients and χ on random complexes (fixed seeds)") {
  std::mt19937_64 rng(20240611);
  int torsion1 = 0, torsion2 = 0;
  for (int trial = 0; trial < 40; ++trial) {
    CAPTURE(trial);
    const auto c = random_presentation(rng);
    check_uct(c);
    const auto g = all_variants<integer>(c);
    all_variants<integer>(c, true);
    torsion1 += !g[1].torsion.empty();
    torsion2 += g.size() > 2 && !g[2].torsion.empty();
  }
  // The sample exercises the torsion terms of the theorem in both degrees.
  CHECK(torsion1 >= 10);
  CHECK(torsion2 >= 5);
  for (int trial = 0; trial < 20; ++trial) {
    CAPTURE(trial);
    const auto s = random_simplicial(rng);
    check_uct(s);
    all_variants<integer>(s);
  }
}

TEST_CASE("invariance under barycentric subdivision") {
  // Homology is a topological invariant (Hatcher 2002, Theorem 2.27 with §2.1); sd X ≅ X.
  const std::vector<lacuna::simplicial_complex<int>> spaces{seven_vertex_torus(), six_vertex_rp2(), five_vertex_moebius(),
                                                            dunce_hat(3), simplex_boundary_sphere(3)};
  for (const auto& x : spaces) {
    const auto want = groups_of(lacuna::homology<integer>(x));
    const auto sd = lacuna::barycentric_subdivision(x);
    CHECK(lacuna::euler_characteristic(sd) == lacuna::euler_characteristic(x));
    CHECK(all_variants<integer>(sd) == want);
    CHECK(all_variants<integer>(lacuna::barycentric_subdivision(sd), false, false, 0) == want);
  }
  const auto m7 = matching_complex(7);
  CHECK(all_variants<integer>(lacuna::barycentric_subdivision(m7), false, true, 0) ==
        groups_of(lacuna::homology<integer>(m7, {.reduced = true})));
}

TEST_CASE("one space, several cell structures") {
  // The torus: the Delta-complex, Möbius's triangulation, S^1 x S^1 as a cellular and as a
  // simplicial product, and a hollow voxel torus.
  const std::vector<group> torus = groups_of(lacuna::homology<integer>(cell_list::torus()));
  CHECK(all_variants<integer>(seven_vertex_torus()) == torus);
  CHECK(all_variants<integer>(lacuna::product(cell_list::circle(), cell_list::circle())) == torus);
  CHECK(all_variants<integer>(lacuna::simplicial_product(simplex_boundary_sphere(1), simplex_boundary_sphere(1))) ==
        torus);
  const auto shell = voxel_torus_shell();
  auto shell_groups = all_variants<integer>(shell, false, false, 0);
  REQUIRE(shell_groups.size() == 4);
  CHECK(shell_groups[3] == group{});
  shell_groups.pop_back();
  CHECK(shell_groups == torus);
  // RP^2: the Delta-complex, one cell per dimension, the 6-vertex triangulation.
  const auto rp2 = groups_of(lacuna::homology<integer>(cell_list::projective_plane()));
  CHECK(all_variants<integer>(cell_list::real_projective_space(2)) == rp2);
  CHECK(all_variants<integer>(six_vertex_rp2()) == rp2);
  // The circle: one loop, and the boundary of a triangle.
  CHECK(all_variants<integer>(cell_list::circle()) == all_variants<integer>(simplex_boundary_sphere(1)));
}

}  // namespace homology_derived_test

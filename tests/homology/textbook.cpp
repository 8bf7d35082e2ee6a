// Homology of textbook spaces over Z, each value from the source named beside it; every
// variant of the engine must agree and every generator must pass verify_generators.
#include "support.hpp"

#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

namespace homology_textbook_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

namespace {
group Z(std::size_t r, std::vector<std::string> t = {}) { return {r, std::move(t)}; }
}  // namespace

TEST_CASE("spheres: the boundary of a simplex and the two-cell sphere") {
  // H_k(S^n) = Z for k = 0, n, else 0 (Hatcher, Algebraic Topology, 2002, Corollary 2.14).
  for (int n = 1; n <= 4; ++n) {
    CAPTURE(n);
    std::vector<group> want(static_cast<std::size_t>(n) + 1, Z(0));
    want[0] = Z(1);
    want[static_cast<std::size_t>(n)] = Z(1);
    CHECK(all_variants<integer>(simplex_boundary_sphere(n)) == want);
    CHECK(all_variants<integer>(cell_list::sphere(n)) == want);
    // Reduced: only H~_n = Z (Hatcher 2002, §2.1, reduced homology).
    std::vector<group> red(static_cast<std::size_t>(n) + 1, Z(0));
    red[static_cast<std::size_t>(n)] = Z(1);
    CHECK(all_variants<integer>(simplex_boundary_sphere(n), false, true) == red);
  }
  // S^0: two points; H_0 = Z^2, reduced H~_0 = Z (Hatcher 2002, §2.1).
  CHECK(all_variants<integer>(cell_list::sphere(0)) == std::vector<group>{Z(2)});
  CHECK(all_variants<integer>(cell_list::sphere(0), false, true) == std::vector<group>{Z(1)});
}

TEST_CASE("the torus, as a Delta-complex and as Möbius's 7-vertex triangulation") {
  // H(T^2) = Z, Z^2, Z (Hatcher 2002, Example 2.3 / §2.1).
  const std::vector<group> want{Z(1), Z(2), Z(1)};
  CHECK(all_variants<integer>(cell_list::torus()) == want);
  const auto t7 = seven_vertex_torus();
  // Validation of the triangulation: 7 vertices, 21 edges, 14 triangles, every edge in two.
  CHECK(t7.cell_count(0) == 7);
  CHECK(t7.cell_count(1) == 21);
  CHECK(t7.cell_count(2) == 14);
  for (auto [e, d] : edge_degrees(t7)) CHECK(d == 2);
  CHECK(all_variants<integer>(t7) == want);
}

TEST_CASE("the Klein bottle: H_1 = Z + Z/2") {
  // Hatcher 2002, §2.1, the Klein bottle example: H_0 = Z, H_1 = Z + Z/2, H_2 = 0.
  CHECK(all_variants<integer>(cell_list::klein_bottle()) == std::vector<group>{Z(1), Z(1, {"2"}), Z(0)});
}

TEST_CASE("the projective plane: H_1 = Z/2, as a Delta-complex and the 6-vertex RP^2") {
  // Hatcher 2002, §2.1, the RP^2 example: H_0 = Z, H_1 = Z/2, H_2 = 0.
  const std::vector<group> want{Z(1), Z(0, {"2"}), Z(0)};
  CHECK(all_variants<integer>(cell_list::projective_plane()) == want);
  const auto p6 = six_vertex_rp2();
  CHECK(p6.cell_count(0) == 6);
  CHECK(p6.cell_count(1) == 15);
  CHECK(p6.cell_count(2) == 10);
  for (auto [e, d] : edge_degrees(p6)) CHECK(d == 2);
  CHECK(all_variants<integer>(p6) == want);
  // Over Z/2 every degree has dimension 1 (Hatcher 2002, Example 3.41 / UCT).
  CHECK(all_variants<lacuna::z2>(p6) == std::vector<group>{Z(1), Z(1), Z(1)});
}

TEST_CASE("RP^n from one cell per dimension") {
  // Hatcher 2002, Example 2.42: H_k(RP^n) = Z for k = 0 and for k = n odd, Z/2 for k odd,
  // 0 < k < n, and 0 otherwise.
  for (int n = 1; n <= 9; ++n) {
    CAPTURE(n);
    std::vector<group> want;
    for (int k = 0; k <= n; ++k) {
      if (k == 0 || (k == n && k % 2 == 1))
        want.push_back(Z(1));
      else if (k % 2 == 1)
        want.push_back(Z(0, {"2"}));
      else
        want.push_back(Z(0));
    }
    CHECK(all_variants<integer>(cell_list::real_projective_space(n)) == want);
  }
}

TEST_CASE("lens spaces: H_1 = Z/p") {
  // Hatcher 2002, Example 2.43: H(L(p, q)) = Z, Z/p, 0, Z.
  for (auto [p, q] : std::vector<std::pair<int, int>>{{2, 1}, {3, 1}, {5, 2}, {7, 3}, {12, 5}}) {
    CAPTURE(p);
    CHECK(all_variants<integer>(cell_list::lens_space(p, q)) ==
          std::vector<group>{Z(1), Z(0, {std::to_string(p)}), Z(0), Z(1)});
  }
}

TEST_CASE("the Möbius band: H_1 = Z, and its boundary circle is twice the core") {
  const auto m = five_vertex_moebius();
  // χ = 5 - 10 + 5 = 0; the edges {i, i+2} lie in one triangle each (the boundary), the
  // edges {i, i+1} in two.
  CHECK(lacuna::euler_characteristic(m) == 0);
  int boundary_edges = 0;
  for (auto [e, d] : edge_degrees(m)) {
    CHECK((d == 1 || d == 2));
    boundary_edges += d == 1;
  }
  CHECK(boundary_edges == 5);
  // It deformation retracts onto its core circle: Z, Z, 0 (from memory).
  CHECK(all_variants<integer>(m) == std::vector<group>{Z(1), Z(1), Z(0)});
  // The boundary circle 0-2-4-1-3-0 is ±2 times the generator of H_1 (from memory: the
  // boundary of the Möbius band wraps twice around the core).
  const auto h = lacuna::homology<integer>(m, {.generators = true});
  lacuna::chain<integer> circle{1, {}};
  const int cyc[6] = {0, 2, 4, 1, 3, 0};
  for (int s = 0; s < 5; ++s) {
    const auto u = static_cast<std::uint32_t>(cyc[s]), v = static_cast<std::uint32_t>(cyc[s + 1]);
    const auto e = m.find({std::min(u, v), std::max(u, v)});
    REQUIRE(e.has_value());
    circle.terms.push_back({*e, integer(u < v ? 1 : -1)});  // an edge [a,b], a<b, runs a -> b
  }
  circle.normalize_terms();
  const auto x = h.coordinates(circle);
  REQUIRE(x.size() == 1);
  CHECK((x[0] == integer(2) || x[0] == integer(-2)));
}

TEST_CASE("the dunce hat is acyclic") {
  // Contractible (Zeeman 1964, "On the dunce hat"): H = Z, 0, 0; reduced homology vanishes.
  const auto d = dunce_hat(4);
  CHECK(lacuna::euler_characteristic(d) == 1);
  // The three sides are glued along the word a a a^-1: the four edges of a lie in three
  // triangles each, every other edge in two.
  int triple = 0;
  for (auto [e, deg] : edge_degrees(d)) {
    CHECK((deg == 2 || deg == 3));
    triple += deg == 3;
  }
  CHECK(triple == 4);
  CHECK(all_variants<integer>(d) == std::vector<group>{Z(1), Z(0), Z(0)});
  CHECK(all_variants<integer>(d, false, true) == std::vector<group>{Z(0), Z(0), Z(0)});
  // The same space from one cell per dimension: vertex v, loop a, a triangle with
  // ∂ = a + a - a (the definition of the dunce hat as a quotient of a triangle).
  cell_list c;
  c.add_cell(0, "v");
  c.add_cell(1, "a", {{0, 1}, {0, -1}});
  c.add_cell(2, "D", {{0, 1}, {0, 1}, {0, -1}});
  CHECK(all_variants<integer>(c) == std::vector<group>{Z(1), Z(0), Z(0)});
}

TEST_CASE("torsion in combinatorics: the matching complex of K_7") {
  const auto m7 = matching_complex(7);
  // 21 edges of K_7, 105 matchings of two edges, 105 of three; no matching of four.
  CHECK(m7.top_dimension() == 2);
  CHECK(m7.cell_count(0) == 21);
  CHECK(m7.cell_count(1) == 105);
  CHECK(m7.cell_count(2) == 105);
  // Reduced H_1 = Z/3 (Bouc 1992, "Homologie de certains ensembles de 2-sous-groupes des
  // groupes symétriques"; from memory); H~_0 = 0 (connected); then rank H~_2 = χ~ = 20 by the
  // Euler characteristic (21 - 105 + 105 - 1).
  CHECK(all_variants<integer>(m7, false, true) == std::vector<group>{Z(0), Z(0, {"3"}), Z(20)});
  // Over Z/3 the torsion shows in H_1 and H_2 (UCT); over Z/2 and Q it does not.
  CHECK(all_variants<lacuna::mod_p<3>>(m7, false, true) == std::vector<group>{Z(0), Z(1), Z(21)});
  CHECK(all_variants<lacuna::mod_p<2>>(m7, false, true) == std::vector<group>{Z(0), Z(0), Z(20)});
  CHECK(all_variants<lacuna::rational>(m7, false, true) == std::vector<group>{Z(0), Z(0), Z(20)});
}

TEST_CASE("wedges of torsion: RP^2 and a lens space side by side") {
  // H_1(X v Y) = H_1(X) + H_1(Y) for reduced homology of a wedge (Hatcher 2002, Corollary 2.25).
  cell_list c = cell_list::projective_plane();
  // A second projective plane glued at the vertex 0 through a 2-cell of degree 2 on a new loop.
  c.add_cell(1, "x", {{0, 1}, {0, -1}});
  c.add_cell(2, "X", {{3, 2}});
  CHECK(all_variants<integer>(c) == std::vector<group>{Z(1), Z(0, {"2", "2"}), Z(0)});
  c.add_cell(1, "y", {{0, 1}, {0, -1}});
  c.add_cell(2, "Y", {{4, 3}});
  // Z/2 + Z/2 + Z/3 = Z/2 + Z/6 in invariant factors.
  CHECK(all_variants<integer>(c) == std::vector<group>{Z(1), Z(0, {"2", "6"}), Z(0)});
}

}  // namespace homology_textbook_test

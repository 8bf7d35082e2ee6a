// A user's translation unit compiled with -Wall -Wextra -Wpedantic -Wconversion
// -Wsign-conversion -Wshadow -Werror (tests/CMakeLists.txt): it calls the main public API
// so that the headers' templates are instantiated, and fails to build if any of them warns.
// It also checks a few results, each against the source named beside it.
#include <lacuna/lacuna.hpp>
#include <lacuna/io/links.hpp>
#include <lacuna/persistence.hpp>
#include <lacuna/persistence/implicit_rips.hpp>

#include <doctest/doctest.h>

#include <cmath>
#include <cstdint>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

namespace build_strict_warnings_test {

using lacuna::integer;

// The boundary of a tetrahedron, a triangulated 2-sphere.
lacuna::simplicial_complex<int> sphere() {
  return lacuna::simplicial_complex<int>::from_facets(
      std::vector<std::vector<int>>{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}});
}

template <class R>
void check_sphere_over() {
  const auto s = sphere();
  // H_*(S^2; R) = R, 0, R: the 2-sphere, Hatcher 2002 Cor. 2.14 (from memory), and the universal
  // coefficient theorem for the field coefficients.
  for (bool generators : {false, true}) {
    const auto h = lacuna::homology<R>(s, {.generators = generators});
    CHECK(h[0].rank == 1);
    CHECK(h[1].rank == 0);
    CHECK(h[2].rank == 1);
    CHECK(h[2].torsion.empty());
    if (generators) CHECK(h[2].generators.size() == 1);
    const auto co = lacuna::cohomology<R>(s, {.generators = generators});
    CHECK(co[0].rank == 1);
    CHECK(co[2].rank == 1);
  }
}

TEST_CASE("homology and cohomology of the 2-sphere over Z, Q, Z/2, Z/3") {
  check_sphere_over<integer>();
  check_sphere_over<lacuna::rational>();
  check_sphere_over<lacuna::z2>();
  check_sphere_over<lacuna::mod_p<3>>();
}

TEST_CASE("the Klein bottle and the projective plane: torsion") {
  // H_1(K) = Z + Z/2, H_2(K) = 0: Hatcher 2002 §2.2, the cellular homology of the
  // nonorientable surfaces (from memory).
  const auto klein = lacuna::cell_list::klein_bottle();
  const auto h = lacuna::homology<integer>(klein, {.generators = true});
  CHECK(h[1].rank == 1);
  REQUIRE(h[1].torsion.size() == 1);
  CHECK(h[1].torsion[0] == integer(2));
  CHECK(lacuna::verify_generators(klein, h).ok);
  // H^2(RP^2; Z) = Z/2: universal coefficients from H_1(RP^2) = Z/2 (Hatcher 2002 Example 2.42, from memory).
  const auto co = lacuna::cohomology<integer>(lacuna::cell_list::projective_plane(), {.generators = true});
  REQUIRE(co[2].torsion.size() == 1);
  CHECK(co[2].torsion[0] == integer(2));
  const auto uct = lacuna::check_universal_coefficients<2, 3>(klein);
  CHECK(uct.ok());
  // a certificate of the Klein bottle's groups over Z and over Z/2, checked (docs/certificates.md)
  const auto cz = lacuna::certified_homology<integer>(klein);
  CHECK(lacuna::check_certificate(klein, cz.certificate).ok);
  const auto c2 = lacuna::certified_homology<lacuna::z2>(klein);
  CHECK(lacuna::check_certificate(klein, c2.certificate).ok);
}

TEST_CASE("relative homology, an induced map and the long exact sequence of a pair") {
  // The annulus X (two triangles around each of three sides) and its boundary A, two circles.
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < 3; ++i) {
    const int j = (i + 1) % 3;
    facets.push_back({i, j, 3 + i});
    facets.push_back({j, 3 + i, 3 + j});
  }
  const auto X = lacuna::simplicial_complex<int>::from_facets(facets);
  std::vector<std::vector<bool>> in_A(3);
  for (int k = 0; k <= 2; ++k)
    for (std::size_t i = 0; i < X.cell_count(k); ++i) {
      const auto vs = X.vertices(k, i);
      bool in = k == 0;
      if (k == 1) in = (X.label(vs[0]) < 3) == (X.label(vs[1]) < 3);
      in_A[static_cast<std::size_t>(k)].push_back(in);
    }
  // H_*(X, A) = 0, Z, Z: Lefschetz duality for the compact orientable surface X with boundary A
  // (Hatcher 2002 §3.3, from memory): H_k(X, A) = H^{2-k}(X) = H^{2-k}(S^1).
  for (bool generators : {false, true}) {
    const auto rel = lacuna::relative_homology<integer>(X, in_A, {.generators = generators});
    CHECK(rel[0].rank == 0);
    CHECK(rel[1].rank == 1);
    CHECK(rel[2].rank == 1);
    const auto rel2 = lacuna::relative_homology<lacuna::z2>(X, in_A, {.generators = generators});
    CHECK(rel2[2].rank == 1);
  }
  const auto pair = lacuna::long_exact_sequence<integer>(X, in_A);
  CHECK(pair.check().exact);  // the long exact sequence of a pair is exact (Hatcher 2002 §2.1, from memory)
  CHECK(pair.sequence().groups.size() > 0);

  // A rotation of the annulus, homotopic to the identity: its Lefschetz number is the trace of the
  // identity on H_*(X; Q), the Euler characteristic χ(X) = 0 (Hatcher 2002 §2.2 and §2.C, from memory).
  const auto rotation =
      lacuna::simplicial_chain_map(X, X, [](int v) { return v < 3 ? (v + 1) % 3 : 3 + (v - 2) % 3; });
  CHECK(lacuna::check_chain_map(rotation, X, X).ok);
  CHECK(lacuna::lefschetz_number(rotation, X) == lacuna::rational(0));
  const auto maps = lacuna::induced_maps<integer>(rotation, X, X);
  REQUIRE(maps.size() >= 2);
  const auto maps3 = lacuna::induced_maps<lacuna::mod_p<3>>(rotation, X, X);
  CHECK(maps3.size() == maps.size());
  // The identity of the sphere has degree 1 (Hatcher 2002 §2.2, from memory).
  const auto s = sphere();
  CHECK(lacuna::degree(lacuna::simplicial_chain_map(s, s, [](int v) { return v; }), s) == integer(1));
  const auto euler = lacuna::euler_checks(X, {.primes = {2, 3}, .subcomplex = in_A, .cover = std::nullopt});
  CHECK(euler.ok);
}

TEST_CASE("a cubical complex: the homology of a binary image") {
  // A 3 x 3 ring of pixels around a hole retracts onto a circle: H_0 = Z, H_1 = Z (homotopy
  // invariance, Hatcher 2002 §2.1, from memory).
  const std::vector<std::uint8_t> ring = {1, 1, 1, 1, 0, 1, 1, 1, 1};
  const auto c = lacuna::cubical_complex<2>::from_bytes({3, 3}, ring);
  for (bool generators : {false, true}) {
    const auto h = lacuna::homology<integer>(c, {.generators = generators});
    CHECK(h[0].rank == 1);
    CHECK(h[1].rank == 1);
    const auto h2 = lacuna::homology<lacuna::z2>(c, {.generators = generators});
    CHECK(h2[1].rank == 1);
    const auto co = lacuna::cohomology<integer>(c, {.generators = generators});
    CHECK(co[1].rank == 1);
  }
  // The same ring read from a plain PBM file (1 = black = foreground).
  std::istringstream pbm("P1\n3 3\n1 1 1\n1 0 1\n1 1 1\n");
  const auto image = lacuna::io::read_netpbm(pbm, "ring.pbm");
  CHECK(lacuna::homology<integer>(image)[1].rank == 1);
}

TEST_CASE("the readers on small inputs") {
  std::istringstream facets("a b c\na b d\na c d\nb c d\n");
  const auto f = lacuna::io::read_facets(facets, "sphere.facets");
  CHECK(lacuna::homology<integer>(f)[2].rank == 1);  // the 2-sphere, Hatcher 2002 Cor. 2.14 (from memory)

  // RP^2 with one cell per dimension: H_1 = Z/2 (Hatcher 2002 Example 2.42, from memory).
  std::istringstream cells("0 p\n1 q : p - p\n2 r : 2*q\n");
  const auto rp2 = lacuna::io::read_cells(cells, "rp2.cells");
  const auto h = lacuna::homology<integer>(rp2);
  REQUIRE(h[1].torsion.size() == 1);
  CHECK(h[1].torsion[0] == integer(2));

  // A tetrahedron's surface as a mesh: the 2-sphere again, H_2 = Z.
  std::istringstream off("OFF\n4 4 6\n0 0 0\n1 0 0\n0 1 0\n0 0 1\n3 0 1 2\n3 0 1 3\n3 0 2 3\n3 1 2 3\n");
  const auto mesh = lacuna::io::read_off(off, "tetra.off");
  CHECK(lacuna::homology<integer>(mesh)[2].rank == 1);

  std::istringstream points("0 0\n1 0\n1 1\n0 1\n");
  const auto cloud = lacuna::io::read_points(points, "square.points");
  CHECK(cloud.size() == 4);
  CHECK(cloud.dimension == 2);

  std::istringstream distances("0\n1 0\n2 1 0\n");
  const auto d = lacuna::io::read_distances(distances, "path.distances");
  CHECK(d.size() == 3);
  CHECK(d(0, 2) == 2);

  std::istringstream links("points 3\n1 2 0.5\n2 3 1.25\n");
  const auto l = lacuna::io::read_links(links, "path.links");
  CHECK(l.points == 3);
  CHECK(l.pairs.size() == 2);

  std::istringstream values("p 0\nq 1\nr 2\n");
  const auto v = lacuna::io::read_values(values, "rp2.values");
  CHECK(v.size() == 3);
  CHECK(lacuna::io::resolve_values(v, rp2, "rp2.cells").size() == 3);
}

TEST_CASE("persistence: a Vietoris-Rips filtration, a cubical filtration, the implicit route, a distance") {
  // Four corners of a 2 x 1 rectangle: one loop, born at 2 and killed at the diagonal sqrt 5
  // (the Vietoris-Rips complex at scale r has an edge for every pair at distance <= r).
  const std::vector<std::vector<double>> corners = {{0, 0}, {2, 0}, {2, 1}, {0, 1}};
  const auto rect = lacuna::rips_filtration::from_points(corners, {.max_dimension = 2});
  const auto q = lacuna::without_zero_persistence(lacuna::persistence(rect, {.max_dimension = 1}));
  REQUIRE(q[1].pairs.size() == 1);
  CHECK(q[1].pairs[0].death == std::sqrt(5.0));
  const auto q3 = lacuna::persistence<lacuna::mod_p<3>>(rect, {.max_dimension = 1, .representatives = true});
  CHECK(q3[0].pairs.size() == 4);

  // The implicit route gives the same loop as the explicit one (it leaves out the pairs of
  // persistence zero).
  const auto metric = lacuna::rips_metric::from_points(corners);
  const auto implicit = lacuna::implicit_rips_persistence(metric, {.max_dimension = 1});
  const auto implicit3 = lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(metric, {.max_dimension = 1});
  REQUIRE(implicit[1].pairs.size() == 1);
  CHECK(implicit[1].pairs[0].death == q[1].pairs[0].death);
  CHECK(implicit3[0].pairs.size() == 4);
  const auto cocycles = lacuna::implicit_rips_persistence_with_cocycles(metric, {.max_dimension = 1});
  CHECK(cocycles.persistence[1].pairs.size() == implicit[1].pairs.size());

  // A height map with a ring of low values around a peak: one class of H_1 from 2 to 9.
  const std::vector<int> heights = {6, 6, 6, 6, 6, 6, 6,  //
                                    6, 1, 2, 2, 3, 6, 6,  //
                                    6, 2, 9, 9, 2, 6, 4,  //
                                    6, 3, 2, 2, 2, 6, 6,  //
                                    6, 6, 6, 6, 6, 6, 6};
  const lacuna::cubical_filtration<2, int> map({7, 5}, heights);
  const auto r = lacuna::persistence(map, {.representatives = true});
  REQUIRE(r[1].pairs.size() == 1);
  CHECK(r[1].pairs[0].birth == 2);
  CHECK(r[1].pairs[0].death == 9);

  // One point (0, 4) against (1, 4): matched to each other at sup-norm cost 1, cheaper than to the
  // diagonal (cost 2), so both distances are 1 (the definitions in diagram_distance.hpp).
  const std::vector<std::pair<double, double>> a = {{0, 4}}, b = {{1, 4}};
  CHECK(lacuna::bottleneck_distance(a, b) == 1);
  CHECK(lacuna::wasserstein_distance(a, b) == 1);
}

TEST_CASE("variants: reduced homology, two threads, the dense and coboundary routes, Mayer-Vietoris, clique homology") {
  const auto s = sphere();
  // Reduced homology of S^2: 0, 0, Z (Hatcher 2002 Cor. 2.14, from memory); the other routes agree.
  const auto reduced = lacuna::homology<integer>(s, {.reduced = true, .threads = 2});
  CHECK(reduced[0].rank == 0);
  CHECK(reduced[2].rank == 1);
  CHECK(lacuna::homology<integer>(s, {}, lacuna::dense_elimination{})[2].rank == 1);
  CHECK(lacuna::homology<integer>(s, {}, lacuna::coboundary_reduction{})[2].rank == 1);
  CHECK(lacuna::homology<lacuna::rational>(s, {.generators = true, .threads = 2})[2].generators.size() == 1);

  // S^2 as the union of two closed discs, A (every cell but the triangle 123) and B (the closed
  // triangle 123), meeting in the circle of its boundary (Mayer-Vietoris, Hatcher 2002 §2.2,
  // from memory; a disc is contractible and a circle has H_1 = Z).
  std::vector<std::vector<bool>> in_a(3), in_b(3);
  for (int k = 0; k <= 2; ++k)
    for (std::size_t i = 0; i < s.cell_count(k); ++i) {
      bool has0 = false;
      for (const auto v : s.vertices(k, i)) has0 = has0 || s.label(v) == 0;
      in_a[static_cast<std::size_t>(k)].push_back(k < 2 || has0);
      in_b[static_cast<std::size_t>(k)].push_back(!has0);
    }
  const auto mv = lacuna::mayer_vietoris<integer>(s, in_a, in_b);
  CHECK(mv.hX[2].rank == 1);
  CHECK(mv.hA[1].rank == 0);
  CHECK(mv.hC[1].rank == 1);

  // The clique complex of a 4-cycle is the cycle itself: H_1 = Z (the circle, Hatcher 2002 §2.1,
  // from memory).
  const std::vector<std::pair<int, int>> square = {{0, 1}, {1, 2}, {2, 3}, {3, 0}};
  const auto ch = lacuna::clique_homology<integer>(square, 2);
  CHECK(ch.groups[1].rank == 1);

  // The projective plane, one cell per dimension, filtered by dimension: over Z/2 the 2-cell
  // creates H_2, over Z/3 it kills the class of the 1-cell (H_1(RP^2; Z/p) for p = 2, 3,
  // universal coefficients from H_1(RP^2) = Z/2, Hatcher 2002 Example 2.42, from memory).
  const auto rp2 = lacuna::cell_list::real_projective_space(2);
  const lacuna::values_filtration<lacuna::cell_list, int> g(rp2, {{0}, {1}, {2}});
  const auto two = lacuna::persistence<lacuna::z2>(g);
  const auto three = lacuna::persistence<lacuna::mod_p<3>>(g, {.representatives = true});
  CHECK(two[2].essential_count() == 1);
  REQUIRE(three[1].pairs.size() == 1);
  CHECK(three[1].pairs[0].death == 2);
}

}  // namespace build_strict_warnings_test

// Tests of lacuna/complex/construct/*.hpp: cell counts of small cases, and the Euler
// characteristic formulas on several inputs each, with ∂∂ = 0 (lacuna::validate) on every
// result, random inputs included (fixed seeds).
#include <doctest/doctest.h>

#include "support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>

#include <string>
#include <vector>

namespace complex_construct_test {

using lacuna::cell_list;
using lacuna::euler_characteristic;
using lacuna::simplicial_complex;
using test_support::counts;

namespace {
std::vector<cell_list> cell_inputs() {
  std::vector<cell_list> v{cell_list::circle(),       cell_list::torus(),
                           cell_list::klein_bottle(), cell_list::projective_plane(),
                           cell_list::real_projective_space(3), cell_list::lens_space(5, 2),
                           cell_list::sphere(2),      cell_list::sphere(0)};
  for (unsigned seed = 1; seed <= 3; ++seed)
    v.push_back(lacuna::to_cell_list(test_support::random_simplicial(seed, 7, 6, 4)));
  return v;
}
std::vector<simplicial_complex<int>> simplicial_inputs() {
  std::vector<simplicial_complex<int>> v{test_support::simplex_boundary_sphere(2),
                                         test_support::simplex_boundary_sphere(3),
                                         simplicial_complex<int>{{1, 2, 3}, {1, 3, 4}, {1, 4, 5}, {1, 5, 6}, {1, 2, 6},
                                                                 {2, 3, 5}, {2, 4, 5}, {2, 4, 6}, {3, 4, 6}, {3, 5, 6}},
                                         simplicial_complex<int>{{0}, {1}}};
  for (unsigned seed = 10; seed <= 13; ++seed) v.push_back(test_support::random_simplicial(seed, 6, 5, 3));
  return v;
}
}  // namespace

TEST_CASE("cellular product: T = S^1 x S^1, and chi(X x Y) = chi(X) chi(Y)") {
  const auto t = lacuna::product(cell_list::circle(), cell_list::circle());
  CHECK(counts(t) == std::vector<std::size_t>{1, 2, 1});  // the CW torus: one 0-cell, two 1-cells, one 2-cell (Hatcher 2002, §2.2)
  CHECK(t.cell_name(1, 0) == "v×a");  // dimension of the first factor increasing
  CHECK(t.cell_name(1, 1) == "a×v");
  CHECK(t.boundary(2, 0).empty());  // ∂(a×a) = 0: all cellular boundaries of T vanish (Hatcher 2002, §2.2, cellular homology of the torus)
  lacuna::validate(t);
  const auto in = cell_inputs();
  for (std::size_t i = 0; i < in.size(); ++i)
    for (std::size_t j = 0; j < in.size(); j += 3) {
      CAPTURE(i);
      CAPTURE(j);
      const auto p = lacuna::product(in[i], in[j]);
      // chi(X x Y) = chi(X) chi(Y) (Hatcher 2002, §2.2, exercise on products; from cell counts)
      CHECK(euler_characteristic(p) == euler_characteristic(in[i]) * euler_characteristic(in[j]));
      lacuna::validate(p);
    }
}

TEST_CASE("simplicial product: prisms and chi(X x Y) = chi(X) chi(Y)") {
  const simplicial_complex<int> edge{{0, 1}}, tri{{0, 1, 2}};
  const auto sq = lacuna::simplicial_product(edge, edge);
  CHECK(counts(sq) == std::vector<std::size_t>{4, 5, 2});  // a square cut by one diagonal
  const auto prism = lacuna::simplicial_product(tri, edge);
  // Δ^2 x Δ^1 is cut into 3 tetrahedra (Hatcher 2002, §2.1, the prism operator)
  CHECK(counts(prism) == std::vector<std::size_t>{6, 12, 10, 3});
  CHECK(prism.label(1) == "(0,1)");
  lacuna::validate(prism);
  const auto in = simplicial_inputs();
  for (std::size_t i = 0; i < in.size(); ++i)
    for (std::size_t j = i; j < in.size(); j += 2) {
      CAPTURE(i);
      CAPTURE(j);
      const auto p = lacuna::simplicial_product(in[i], in[j]);
      CHECK(euler_characteristic(p) == euler_characteristic(in[i]) * euler_characteristic(in[j]));
      lacuna::validate(p);
    }
}

TEST_CASE("suspension: chi(SX) = 2 - chi(X)") {
  const auto s2 = lacuna::suspension(cell_list::circle());
  CHECK(counts(s2) == std::vector<std::size_t>{2, 1, 1});
  CHECK(euler_characteristic(s2) == 2);  // S S^1 = S^2 (Hatcher 2002, §0, suspension)
  for (const auto& x : cell_inputs()) {
    const auto s = lacuna::suspension(x);
    CHECK(euler_characteristic(s) == 2 - euler_characteristic(x));  // from the cells: n + s, then one per cell
    lacuna::validate(s);
  }
  for (const auto& x : simplicial_inputs()) {
    const auto s = lacuna::suspension(x);
    CHECK(euler_characteristic(s) == 2 - euler_characteristic(x));
    lacuna::validate(s);
  }
  CHECK(counts(lacuna::suspension(cell_list{})) == std::vector<std::size_t>{2});  // S(empty) = S^0
  cell_list bad;  // a chain complex that is not a CW complex: ∂q = 2p
  bad.add_cell(0, "p");
  bad.add_cell(1, "q", {{0, 2}});
  CHECK_THROWS_WITH_AS(lacuna::suspension(bad),
                       "suspension: the boundary of 1-cell 0 ('q') has coefficient sum other than 0, so the result "
                       "would have ∂∂ ≠ 0",
                       lacuna::invalid_complex);
}

TEST_CASE("cone is contractible: chi(CX) = 1") {
  for (const auto& x : cell_inputs()) {
    const auto c = lacuna::cone(x);
    CHECK(euler_characteristic(c) == 1);  // a cone is contractible (Hatcher 2002, §0)
    CHECK(lacuna::total_cell_count(c) == 2 * lacuna::total_cell_count(x) + 1);
    lacuna::validate(c);
  }
}

TEST_CASE("join: S^0 * S^0 = S^1 and chi(X*Y) = chi(X) + chi(Y) - chi(X) chi(Y)") {
  const simplicial_complex<std::string> s0{{"a"}, {"b"}};
  const auto c = lacuna::join(s0, s0);
  CHECK(counts(c) == std::vector<std::size_t>{4, 4});  // S^p * S^q = S^{p+q+1} (from memory): a square
  CHECK(c.label(2) == "a'");
  const auto in = simplicial_inputs();
  for (std::size_t i = 0; i < in.size(); ++i)
    for (std::size_t j = 0; j < in.size(); j += 3) {
      CAPTURE(i);
      CAPTURE(j);
      const auto jn = lacuna::join(in[i], in[j]);
      const auto a = euler_characteristic(in[i]), b = euler_characteristic(in[j]);
      // 1 - chi(X*Y) = (1 - chi X)(1 - chi Y): reduced chi is multiplicative up to sign (from memory)
      CHECK(euler_characteristic(jn) == a + b - a * b);
      lacuna::validate(jn);
    }
}

TEST_CASE("barycentric subdivision: counts of sd(triangle) and chi(sd X) = chi(X)") {
  const auto sd = lacuna::barycentric_subdivision(simplicial_complex<int>{{0, 1, 2}});
  CHECK(counts(sd) == std::vector<std::size_t>{7, 12, 6});  // (n+1)! = 6 triangles (Hatcher 2002, §2.1)
  CHECK(sd.label(6) == "{0,1,2}");
  for (const auto& x : simplicial_inputs()) {
    const auto s = lacuna::barycentric_subdivision(x);
    CHECK(euler_characteristic(s) == euler_characteristic(x));  // subdivision does not change chi
    lacuna::validate(s);
    CHECK(euler_characteristic(lacuna::barycentric_subdivision(s)) == euler_characteristic(x));
  }
}

TEST_CASE("disjoint union and wedge") {
  const auto t = cell_list::torus();
  const auto u = lacuna::disjoint_union(t, t);
  CHECK(counts(u) == std::vector<std::size_t>{2, 6, 4});
  CHECK(u.cell_name(1, 3) == "a'");
  lacuna::validate(u);
  for (const auto& x : cell_inputs())
    for (const auto& y : cell_inputs()) {
      CHECK(euler_characteristic(lacuna::disjoint_union(x, y)) == euler_characteristic(x) + euler_characteristic(y));
      if (lacuna::cell_count(y, 0) > 1) {
        const auto w = lacuna::wedge(x, y, 0, 1);
        CHECK(euler_characteristic(w) == euler_characteristic(x) + euler_characteristic(y) - 1);  // one point shared
        lacuna::validate(w);
      }
    }
  // S^1 v S^1: the 1-skeleton of the CW torus (Hatcher 2002, §0)
  CHECK(counts(lacuna::wedge(cell_list::circle(), cell_list::circle())) == std::vector<std::size_t>{1, 2});
  CHECK_THROWS_AS(lacuna::wedge(t, cell_list{}), std::invalid_argument);
}

TEST_CASE("skeleton and subcomplex") {
  const auto s = test_support::simplex_boundary_sphere(4);  // S^3 with 5 vertices
  const auto k1 = lacuna::skeleton(s, 1);
  CHECK(counts(k1) == std::vector<std::size_t>{5, 10});  // the complete graph K5
  CHECK(euler_characteristic(k1) == -5);                  // chi(K5) = 5 - 10
  lacuna::validate(lacuna::skeleton(s, 2));
  CHECK(lacuna::top_dimension(lacuna::skeleton(s, -1)) == -1);
  // the closed star of vertex 0 in ∂Δ^2 (a path of two edges)
  const simplicial_complex<std::string> tri{{"x", "y"}, {"y", "z"}, {"z", "x"}};
  const auto path = lacuna::subcomplex(tri, [&](int k, std::size_t i) {
    return k == 0 || tri.cell_name(k, i) != "y z";
  });
  CHECK(counts(path) == std::vector<std::size_t>{3, 2});
  CHECK(euler_characteristic(path) == 1);  // a tree
  lacuna::validate(path);
  try {
    lacuna::subcomplex(tri, std::vector<std::pair<int, std::size_t>>{{0, 0}, {1, 2}});
    FAIL("a subcomplex that is not closed must throw");
  } catch (const lacuna::invalid_complex& e) {
    CHECK(std::string(e.what()) == "subcomplex: 1-cell 2 ('y z') is chosen but its face, 0-cell 2 ('z'), is not");
    CHECK(e.dimension() == 1);
    CHECK(e.index() == 2);
  }
  CHECK_THROWS_AS(lacuna::subcomplex(tri, std::vector<std::pair<int, std::size_t>>{{3, 0}}), lacuna::invalid_complex);
}

TEST_CASE("quotient: chi(X/A) = chi(X) - chi(A) + 1") {
  const auto t = cell_list::torus();
  const auto q = lacuna::quotient(t, [](int k, std::size_t) { return k <= 1; });
  CHECK(counts(q) == std::vector<std::size_t>{1, 0, 2});  // T/T^1 = S^2 v S^2 (Hatcher 2002, §0)
  CHECK(euler_characteristic(q) == 3);
  // the circle as an interval with its end points collapsed
  const simplicial_complex<int> interval{{0, 1}};
  const auto c = lacuna::quotient(interval, std::vector<std::pair<int, std::size_t>>{{0, 0}, {0, 1}});
  CHECK(counts(c) == std::vector<std::size_t>{1, 1});
  CHECK(c.boundary(1, 0).empty());  // 1 - 1 on the point
  CHECK(euler_characteristic(c) == 0);  // the circle
  for (unsigned seed = 20; seed < 26; ++seed) {
    const auto x = test_support::random_simplicial(seed, 8, 7, 4);
    const auto a = [&](int k, std::size_t i) {  // the full subcomplex on the vertices 0..3
      for (auto v : x.vertices(k, i))
        if (x.label(v) > 3) return false;
      return true;
    };
    const auto sub = lacuna::subcomplex(x, a);
    const auto xa = lacuna::quotient(x, a);
    // H~(X/A) = H(X, A) (Hatcher 2002, Prop. 2.22), so chi(X/A) - 1 = chi(X) - chi(A)
    CHECK(euler_characteristic(xa) == euler_characteristic(x) - euler_characteristic(sub) + 1);
    lacuna::validate(xa);
  }
  CHECK(counts(lacuna::quotient(t, [](int, std::size_t) { return false; })) ==
        std::vector<std::size_t>{2, 3, 2});  // X/∅ = X ⊔ point
}

TEST_CASE("barycentric subdivision of regular cell complexes (the order complex of the face poset)") {
  // through a cell list, a simplicial complex gives exactly the simplicial subdivision
  for (const auto& x : simplicial_inputs()) {
    const auto direct = lacuna::barycentric_subdivision(x);
    const auto generic = lacuna::barycentric_subdivision(lacuna::to_cell_list(x));
    CHECK(generic == direct);
  }
  // a square as one 2-cell, four edges, four vertices (regular): sd has 9 vertices, 8 triangles
  cell_list sq;
  for (const char* v : {"p", "q", "r", "s"}) sq.add_cell(0, v);
  sq.add_cell(1, "a", {{1, 1}, {0, -1}});
  sq.add_cell(1, "b", {{2, 1}, {1, -1}});
  sq.add_cell(1, "c", {{3, 1}, {2, -1}});
  sq.add_cell(1, "d", {{0, 1}, {3, -1}});
  sq.add_cell(2, "F", {{0, 1}, {1, 1}, {2, 1}, {3, 1}});
  lacuna::validate(sq);
  const auto sd = lacuna::barycentric_subdivision(sq);
  CHECK(counts(sd) == std::vector<std::size_t>{9, 16, 8});  // 2 triangles per (edge, vertex) flag: 4 * 2
  CHECK(euler_characteristic(sd) == 1);                      // a disk
  // products of regular complexes are regular: chi is kept
  const auto p = lacuna::product(sq, lacuna::to_cell_list(simplicial_complex<int>{{0, 1}, {1, 2}, {2, 0}}));
  const auto sdp = lacuna::barycentric_subdivision(p);
  CHECK(euler_characteristic(sdp) == euler_characteristic(p));  // disk x circle: chi = 0
  CHECK(euler_characteristic(p) == 0);
  lacuna::validate(sdp);
  CHECK(test_support::closed_pseudomanifold(lacuna::barycentric_subdivision(lacuna::product(
      lacuna::to_cell_list(test_support::simplex_boundary_sphere(2)), lacuna::to_cell_list(test_support::simplex_boundary_sphere(2))))));
}

}  // namespace complex_construct_test

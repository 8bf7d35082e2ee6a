// Tests of lacuna/complex/simplicial_complex.hpp: cell counts, Euler characteristics and
// structure of standard triangulations, each checked against the source named beside it.
#include <doctest/doctest.h>

#include "support.hpp"

#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/complex/validate.hpp>

#include <string>
#include <vector>

namespace complex_simplicial_complex_test {

using lacuna::simplicial_complex;
using test_support::binomial;
using test_support::counts;

namespace {
struct opaque {  // equality only: no hash, no order
  int x;
  bool operator==(const opaque&) const = default;
};
}  // namespace

static_assert(lacuna::cell_complex<simplicial_complex<>>);
static_assert(lacuna::cell_complex<simplicial_complex<int>>);
static_assert(!lacuna::complex_with_coboundary<simplicial_complex<int>>);
static_assert(lacuna::simplex_label<std::string> && lacuna::simplex_label<long>);
static_assert(!lacuna::simplex_label<opaque>);

TEST_CASE("hollow triangle: numbering, orientation, names, boundaries") {
  const simplicial_complex<std::string> c{{"x", "y"}, {"y", "z"}, {"z", "x"}};
  CHECK(counts(c) == std::vector<std::size_t>{3, 3});  // three edges, no 2-simplex
  CHECK(lacuna::euler_characteristic(c) == 0);         // a circle: chi = 0 (Hatcher 2002, §2.2)
  CHECK(c.label(0) == "x");  // numbered in order of first appearance (docs/formats.md)
  CHECK(c.label(2) == "z");
  // edges in lexicographic order of vertex ids: [0 1], [0 2], [1 2]
  CHECK(c.cell_name(1, 0) == "x y");
  CHECK(c.cell_name(1, 1) == "x z");  // "z x" is oriented by increasing vertex number
  CHECK(c.cell_name(1, 2) == "y z");
  const auto d = c.boundary(1, 1);  // ∂[x z] = z - x
  REQUIRE(d.size() == 2);
  CHECK(d[0] == lacuna::incidence{2, 1});
  CHECK(d[1] == lacuna::incidence{0, -1});
  CHECK(c.find({2, 0}) == std::optional<std::size_t>{1});
  CHECK(c.find_labels(std::vector<std::string>{"z", "y"}) == std::optional<std::size_t>{2});
  CHECK_FALSE(c.find({0, 1, 2}).has_value());
  CHECK_FALSE(c.vertex("w").has_value());
  lacuna::validate(c);
}

TEST_CASE("boundary of a 2-simplex follows sum (-1)^j [.. v^j ..]") {
  const simplicial_complex<int> c{{10, 20, 30}};
  const auto d = c.boundary(2, 0);  // ∂[0 1 2] = [1 2] - [0 2] + [0 1]  (Hatcher 2002, §2.1)
  REQUIRE(d.size() == 3);
  CHECK(c.cell_name(1, d[0].face) == "20 30");
  CHECK(d[0].coefficient == 1);
  CHECK(c.cell_name(1, d[1].face) == "10 30");
  CHECK(d[1].coefficient == -1);
  CHECK(c.cell_name(1, d[2].face) == "10 20");
  CHECK(d[2].coefficient == 1);
}

TEST_CASE("listing a face changes nothing; repeated labels are an error") {
  const simplicial_complex<int> a{{1, 2, 3}};
  const simplicial_complex<int> b{{1, 2, 3}, {2, 3}, {1}, {3, 2, 1}};
  CHECK(a == b);  // docs/formats.md: listing a face of a listed simplex changes nothing
  simplicial_complex<std::string>::builder bad;
  bad.add_facet({"p", "q"});
  try {
    bad.add_facet({"p", "q", "p"});
    FAIL("a repeated label must throw");
  } catch (const lacuna::invalid_complex& e) {
    CHECK(std::string(e.what()) == "simplicial complex: label 'p' repeated within facet number 2");
  }
}

TEST_CASE("empty complex and isolated vertices") {
  const simplicial_complex<int> e;
  CHECK(lacuna::top_dimension(e) == -1);  // docs/formats.md: the empty complex
  CHECK(lacuna::total_cell_count(e) == 0);
  simplicial_complex<int>::builder b;
  b.vertex(7);
  b.vertex(8);
  const auto c = std::move(b).finalize();
  CHECK(counts(c) == std::vector<std::size_t>{2});  // two points: chi = 2
  CHECK(lacuna::euler_characteristic(c) == 2);
}

TEST_CASE("boundaries of simplices are spheres") {
  for (int n = 1; n <= 9; ++n) {
    CAPTURE(n);
    const auto s = test_support::simplex_boundary_sphere(n);
    REQUIRE(lacuna::top_dimension(s) == n - 1);
    for (int k = 0; k < n; ++k)  // f_k of ∂Δ^n is C(n+1, k+1) (the (k+1)-subsets of n+1 vertices)
      CHECK(lacuna::cell_count(s, k) == binomial(static_cast<std::uint64_t>(n + 1), static_cast<std::uint64_t>(k + 1)));
    // chi(S^{n-1}) = 1 + (-1)^{n-1} (Hatcher 2002, §2.2, Euler characteristic)
    CHECK(lacuna::euler_characteristic(s) == 1 + ((n - 1) % 2 == 0 ? 1 : -1));
    lacuna::validate(s);
    if (n >= 2) CHECK(test_support::closed_pseudomanifold(s));
  }
}

TEST_CASE("boundaries of cross-polytopes are spheres") {
  for (int n = 1; n <= 8; ++n) {
    CAPTURE(n);
    const auto s = test_support::cross_polytope_sphere(n);
    for (int k = 0; k < n; ++k)  // f_k = 2^{k+1} C(n, k+1) (Ziegler, Lectures on Polytopes, 1995, from memory)
      CHECK(lacuna::cell_count(s, k) == (std::uint64_t{1} << (k + 1)) * binomial(static_cast<std::uint64_t>(n), static_cast<std::uint64_t>(k + 1)));
    CHECK(lacuna::euler_characteristic(s) == 1 + ((n - 1) % 2 == 0 ? 1 : -1));  // chi(S^{n-1})
    lacuna::validate(s);
    if (n >= 2) {
      CHECK(test_support::closed_pseudomanifold(s));
      CHECK(test_support::orientable(s));  // spheres are orientable
    }
  }
}

TEST_CASE("the 7-vertex torus (Moebius, Csaszar)") {
  // triangles {i, i+1, i+3} and {i, i+2, i+3} mod 7 (from memory: the Csaszar torus)
  simplicial_complex<int>::builder b;
  for (int i = 0; i < 7; ++i) {
    b.add_facet({i, (i + 1) % 7, (i + 3) % 7});
    b.add_facet({i, (i + 2) % 7, (i + 3) % 7});
  }
  const auto t = std::move(b).finalize();
  CHECK(counts(t) == std::vector<std::size_t>{7, 21, 14});  // K7 on the torus: 7, 21, 14 (from memory)
  CHECK(lacuna::euler_characteristic(t) == 0);               // chi(T^2) = 0 (Hatcher 2002, §2.2)
  CHECK(test_support::closed_pseudomanifold(t));
  CHECK(test_support::orientable(t));  // the torus is orientable
  lacuna::validate(t);
}

TEST_CASE("the 6-vertex projective plane (hemi-icosahedron)") {
  // from memory: the minimal triangulation of RP^2, 10 triangles on 6 vertices
  const simplicial_complex<int> p{{1, 2, 3}, {1, 3, 4}, {1, 4, 5}, {1, 5, 6}, {1, 2, 6},
                                  {2, 3, 5}, {2, 4, 5}, {2, 4, 6}, {3, 4, 6}, {3, 5, 6}};
  CHECK(counts(p) == std::vector<std::size_t>{6, 15, 10});  // every pair of vertices is an edge
  CHECK(lacuna::euler_characteristic(p) == 1);              // chi(RP^2) = 1 (Hatcher 2002, §2.2)
  CHECK(test_support::closed_pseudomanifold(p));
  CHECK_FALSE(test_support::orientable(p));  // RP^2 is not orientable (Hatcher 2002, §3.3)
  lacuna::validate(p);
}

TEST_CASE("3x3 grid triangulations of the torus and the Klein bottle") {
  const auto t = test_support::grid_surface(false);
  const auto k = test_support::grid_surface(true);
  for (const auto* s : {&t, &k}) {
    CHECK(counts(*s) == std::vector<std::size_t>{9, 27, 18});  // 9 vertices, 3 edges and 2 triangles per square
    CHECK(lacuna::euler_characteristic(*s) == 0);               // chi(T^2) = chi(K) = 0 (Hatcher 2002, §2.2)
    CHECK(test_support::closed_pseudomanifold(*s));
    lacuna::validate(*s);
  }
  CHECK(test_support::orientable(t));
  CHECK_FALSE(test_support::orientable(k));  // the Klein bottle is not orientable
}

TEST_CASE("facets() lists the maximal simplices") {
  const simplicial_complex<int> c{{1, 2, 3}, {3, 4}, {5}, {2, 3}};
  const auto f = c.facets();
  REQUIRE(f.size() == 3);  // [1 2 3], [3 4], [5] by construction
  CHECK(c.cell_name(f[0].first, f[0].second) == "5");
  CHECK(c.cell_name(f[1].first, f[1].second) == "3 4");
  CHECK(c.cell_name(f[2].first, f[2].second) == "1 2 3");
}

TEST_CASE("boundary does not heap-allocate below dimension 8; wide simplices still work") {
  const auto s = test_support::simplex_boundary_sphere(12);  // 11-dimensional simplices
  const auto d = s.boundary(11, 0);
  CHECK(d.size() == 12);
  lacuna::validate(s);
  static_assert(lacuna::simplex_boundary::inline_capacity == 8);
}

}  // namespace complex_simplicial_complex_test

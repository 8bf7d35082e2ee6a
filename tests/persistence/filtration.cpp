// The built-in filtrations and the result helpers, checked against rules written apart:
//   * values and lower-star filtrations: a simplex takes the largest value of its vertices
//     (the definition of the lower star, recomputed here from the vertex lists); a cell of a
//     cell list takes the latest of the faces written in its boundary, even when their
//     coefficients cancel (the file format's rule: the faces of `1 q : p - p` are p); the
//     errors name the cell;
//   * cubical filtrations: the numbering, boundaries and coboundaries are those of
//     lacuna::cubical_complex of the all-foreground image (the same doubled-grid layout, an
//     independent implementation), and a cell's value is the least (largest) sample of the
//     voxels containing it, found here by scanning all voxels;
//   * Vietoris–Rips: a simplex's value is the largest distance between two of its points,
//     recomputed from the points; the distance is the IEEE square root of the sum of squares in
//     coordinate order (the bits compared with that sum done step by step here);
//   * the rank invariant of a hand-made diagram, without_zero_persistence and up_to.
#include "support.hpp"

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/persistence/persistence.hpp>

#include <doctest/doctest.h>

#include <bit>
#include <cmath>
#include <cstdint>
#include <limits>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace persistence_filtration_test {

namespace support = persistence_test_support;
using simplices = lacuna::simplicial_complex<int>;
using int_values = lacuna::values_filtration<simplices, int>;
using double_values = lacuna::values_filtration<simplices, double>;
using image = lacuna::cubical_filtration<2, int>;
using signal = lacuna::cubical_filtration<1, double>;

static_assert(lacuna::filtration<lacuna::values_filtration<simplices, double>>);
static_assert(lacuna::filtration<lacuna::values_filtration<lacuna::cell_list, int, std::greater<int>>>);
static_assert(lacuna::filtration<lacuna::cubical_filtration<3, std::uint8_t>>);
static_assert(lacuna::filtration<lacuna::cubical_filtration<1, float>>);
static_assert(lacuna::filtration<lacuna::rips_filtration>);
static_assert(lacuna::complex_with_coboundary<lacuna::cubical_filtration<2, int>>);
static_assert(!lacuna::filtration<simplices>);  // a complex without values
static_assert(!lacuna::filtration<lacuna::cell_list>);

/// A user's value type: totally ordered, not a number type.
struct level {
  int major = 0, minor = 0;
  friend auto operator<=>(const level&, const level&) = default;
};
static_assert(lacuna::filtration<lacuna::values_filtration<simplices, level>>);

TEST_CASE("lower-star filtration of a simplicial complex: a simplex takes the largest value of its vertices") {
  std::mt19937_64 rng(1301);
  for (int trial = 0; trial < 5; ++trial) {
    const auto c = support::random_complex(rng, 9, 12, 4);
    std::vector<double> vertex_values;
    for (int v : support::random_values(rng, c.vertex_count(), 5)) vertex_values.push_back(0.25 * v);
    const auto f = lacuna::lower_star_filtration(c, vertex_values);
    for (int k = 0; k <= c.top_dimension(); ++k)
      for (std::size_t i = 0; i < c.cell_count(k); ++i) {
        double expected = -1;
        for (auto v : c.vertices(k, i)) expected = std::max(expected, vertex_values[v]);
        CHECK(f.cell_value(k, i) == expected);
      }
    CHECK_NOTHROW(lacuna::check_filtration(f));
  }
}

TEST_CASE("values of a user's ordered type, and a descending order") {
  const simplices c{{0, 1}};
  const lacuna::values_filtration<simplices, level> f(c, {{level{1, 0}, level{1, 2}}, {level{1, 2}}});
  CHECK(f.cell_value(1, 0) == level{1, 2});
  const auto r = lacuna::persistence(f);
  REQUIRE(r[0].pairs.size() == 2);
  CHECK(r[0].pairs[0].essential());
  CHECK(r[0].pairs[1].birth == level{1, 2});
  CHECK(*r[0].pairs[1].death == level{1, 2});
  // descending: the vertex of value 5 enters first, so the one of value 3 is the one killed
  const lacuna::values_filtration<simplices, int, std::greater<int>> g(c, {{3, 5}, {3}});
  const auto s = lacuna::persistence(g);
  REQUIRE(s[0].pairs.size() == 2);
  CHECK(s[0].pairs[0].birth == 5);
  CHECK(s[0].pairs[0].essential());
  CHECK(s[0].pairs[1].birth == 3);
  CHECK(s.betti_number(0, 4) == 1);  // only the vertex of value 5 is in at 4
  CHECK(s.betti_number(0, 3) == 1);
}

TEST_CASE("a cell list: a cell waits for the faces written in its boundary, even when they cancel") {
  // The projective plane with one cell per dimension: the faces of
  // q : p - p are p, and of r : 2*q, q.
  std::istringstream in("0 p\n1 q : p - p\n2 r : 2*q\n");
  const auto c = lacuna::io::read_cells(in, "rp2.cells");
  CHECK(c.boundary(1, 0).size() == 0);
  CHECK(c.faces_as_written(1, 0) == std::vector<std::size_t>{0});
  CHECK(lacuna::faces_as_written(c, 2, 0) == std::vector<std::size_t>{0});
  const auto f = lacuna::lower_star_filtration(c, std::vector<int>{7});
  CHECK(f.cell_value(1, 0) == 7);
  CHECK(f.cell_value(2, 0) == 7);
  // q listed before its face p: an error naming q and p
  try {
    lacuna::values_filtration<lacuna::cell_list, int> bad(c, {{3}, {2}, {4}});
    FAIL("expected a filtration_error");
  } catch (const lacuna::filtration_error& e) {
    CHECK(e.dimension() == 1);
    CHECK(e.index() == 0);
    CHECK(e.face_index() == 0);
    CHECK(std::string(e.what()).find("'q'") != std::string::npos);
    CHECK(std::string(e.what()).find("'p'") != std::string::npos);
  }
  // a cell added by hand with cancelling terms keeps its written faces too
  lacuna::cell_list d;
  d.add_cell(0, "a");
  d.add_cell(0, "b");
  d.add_cell(1, "loop", {{1, 1}, {1, -1}});
  d.add_cell(1, "ab", {{0, -1}, {1, 1}});
  CHECK(d.faces_as_written(1, 0) == std::vector<std::size_t>{1});
  CHECK(d.faces_as_written(1, 1) == std::vector<std::size_t>{0, 1});
  const auto g = lacuna::lower_star_filtration(d, std::vector<double>{1.0, 2.5});
  CHECK(g.cell_value(1, 0) == 2.5);
}

TEST_CASE("partial values: listed cells keep theirs, others take the latest face; errors name the cell") {
  const simplices c{{0, 1, 2}, {2, 3}};
  // vertices 0..3 at 0, 1, 2, 3; the triangle listed at 10; the rest from faces
  std::vector<std::vector<std::optional<int>>> partial(3);
  partial[0] = {0, 1, 2, 3};
  partial[2] = {10};
  const auto f = int_values::from_partial_values(c, partial);
  CHECK(f.cell_value(2, 0) == 10);
  CHECK(f.cell_value(1, *c.find({2, 3})) == 3);
  CHECK(f.cell_value(1, *c.find({0, 1})) == 1);
  // a vertex without a value has no face to take one from
  std::vector<std::vector<std::optional<int>>> missing(1);
  missing[0] = {0, 1, std::nullopt, 3};
  try {
    (void)int_values::from_partial_values(c, missing);
    FAIL("expected a filtration_error");
  } catch (const lacuna::filtration_error& e) {
    CHECK(e.dimension() == 0);
    CHECK(e.index() == 2);
    CHECK(std::string(e.what()).find("no value and no faces") != std::string::npos);
  }
  // a triangle listed before its edge
  std::vector<std::vector<std::optional<int>>> early(3);
  early[0] = {0, 1, 2, 3};
  early[2] = {1};
  CHECK_THROWS_AS((void)int_values::from_partial_values(c, early), lacuna::filtration_error);
  // NaN is refused
  std::vector<std::vector<std::optional<double>>> nan(1);
  nan[0] = {0.0, 1.0, std::numeric_limits<double>::quiet_NaN(), 3.0};
  CHECK_THROWS_AS((void)double_values::from_partial_values(c, nan), lacuna::filtration_error);
  CHECK_THROWS_AS((void)lacuna::lower_star_filtration(c, std::vector<int>{1, 2}), std::invalid_argument);
}

TEST_CASE("cubical filtration: the layout of cubical_complex, and values from the voxels containing a cell") {
  const std::array<std::size_t, 3> n{3, 2, 4};
  std::mt19937_64 rng(77);
  const auto samples = support::random_values(rng, 24, 6);
  const lacuna::cubical_filtration<3, int> up(n, samples);
  const lacuna::cubical_filtration<3, int> down(n, samples, lacuna::level_sets::superlevel);
  const auto full = lacuna::cubical_complex<3>::from_predicate(n, [](const auto&) { return true; });
  for (int k = 0; k <= 3; ++k) {
    REQUIRE(up.cell_count(k) == full.cell_count(k));
    for (std::size_t i = 0; i < up.cell_count(k); ++i) {
      const auto p = up.position(k, i);
      CHECK(p == full.position(k, i));
      CHECK(up.index_of(p) == i);
      const auto b1 = up.boundary(k, i);
      const auto b2 = full.boundary(k, i);
      CHECK(std::vector<lacuna::incidence>(b1.begin(), b1.end()) == std::vector<lacuna::incidence>(b2.begin(), b2.end()));
      const auto c1 = up.coboundary(k, i);
      const auto c2 = full.coboundary(k, i);
      CHECK(std::vector<lacuna::incidence>(c1.begin(), c1.end()) == std::vector<lacuna::incidence>(c2.begin(), c2.end()));
      CHECK(up.cell_name(k, i) == full.cell_name(k, i));
      // the voxels containing the cell: those v with |2v+1 - p_a| <= 1 on every axis
      int lo = std::numeric_limits<int>::max(), hi = std::numeric_limits<int>::min();
      for (std::size_t v = 0; v < samples.size(); ++v) {
        const std::array<std::size_t, 3> x{v % 3, (v / 3) % 2, v / 6};
        bool contains = true;
        for (std::size_t a = 0; a < 3; ++a) {
          const auto c = static_cast<long>(2 * x[a] + 1), q = static_cast<long>(p[a]);
          contains = contains && (c - q <= 1 && q - c <= 1);
        }
        if (contains) {
          lo = std::min(lo, samples[v]);
          hi = std::max(hi, samples[v]);
        }
      }
      CHECK(up.cell_value(k, i) == lo);
      CHECK(down.cell_value(k, i) == hi);
    }
  }
  CHECK_NOTHROW(lacuna::check_filtration(up));
  CHECK_NOTHROW(lacuna::check_filtration(down));
  CHECK(image({0, 5}, {}).top_dimension() == -1);
  CHECK_THROWS_AS(image({2, 2}, {1, 2, 3}), std::invalid_argument);
  CHECK_THROWS_AS(signal({2}, {1.0, std::nan("")}), std::invalid_argument);
}

TEST_CASE("Euclidean distance: the IEEE square root of the sum of squares, in coordinate order") {
  std::mt19937_64 rng(5);
  std::uniform_real_distribution<double> u(-10, 10);
  for (int t = 0; t < 200; ++t) {
    std::vector<double> a(5), b(5);
    for (auto& x : a) x = u(rng);
    for (auto& x : b) x = u(rng);
    // each square rounded to a double (volatile keeps it in memory), then each addition
    volatile double sum = 0;
    for (std::size_t i = 0; i < 5; ++i) {
      volatile double d = a[i] - b[i];
      volatile double sq = d * d;
      sum = sum + sq;
    }
    CHECK(std::bit_cast<std::uint64_t>(lacuna::euclidean_distance(a, b)) == std::bit_cast<std::uint64_t>(std::sqrt(sum)));
  }
}

TEST_CASE("Vietoris–Rips: a simplex enters at the largest distance between two of its points") {
  std::mt19937_64 rng(11);
  const auto pts = support::random_points(rng, 9, 2, 5);
  const auto f = lacuna::rips_filtration::from_points(pts, {.max_dimension = 3, .threshold = 1.6});
  std::size_t edges = 0;
  for (std::size_t a = 0; a < pts.size(); ++a)
    for (std::size_t b = a + 1; b < pts.size(); ++b) edges += lacuna::euclidean_distance(pts[a], pts[b]) <= 1.6;
  CHECK(f.cell_count(1) == edges);
  CHECK(f.cell_count(0) == 9);
  for (int k = 0; k <= f.top_dimension(); ++k)
    for (std::size_t i = 0; i < f.cell_count(k); ++i) {
      double v = 0;
      const auto vs = f.vertices(k, i);
      for (std::size_t x = 0; x < vs.size(); ++x)
        for (std::size_t y = x + 1; y < vs.size(); ++y) {
          const double d = lacuna::euclidean_distance(pts[vs[x]], pts[vs[y]]);
          CHECK(d <= 1.6);
          v = std::max(v, d);
        }
      CHECK(f.cell_value(k, i) == v);
    }
  // the same through the distance matrix
  std::vector<double> m(81);
  for (std::size_t a = 0; a < 9; ++a)
    for (std::size_t b = 0; b < 9; ++b) m[a * 9 + b] = lacuna::euclidean_distance(pts[a], pts[b]);
  const auto g = lacuna::rips_filtration::from_distances(9, m, {.max_dimension = 3, .threshold = 1.6});
  CHECK(g.values() == f.values());
  CHECK(g.cell_name(1, 0) == f.cell_name(1, 0));
  // bad matrices
  m[1] = -1;
  CHECK_THROWS_AS((void)lacuna::rips_filtration::from_distances(9, m), std::invalid_argument);
  m[1] = m[9] + 1;
  CHECK_THROWS_AS((void)lacuna::rips_filtration::from_distances(9, m), std::invalid_argument);
  CHECK_THROWS_AS((void)lacuna::rips_filtration::from_points(std::vector<double>{1, 2, 3}, 2), std::invalid_argument);
  CHECK_THROWS_AS((void)lacuna::rips_filtration::from_points(pts, {.max_dimension = 3, .max_cells = 10}), std::length_error);
}

TEST_CASE("rank invariant, zero persistence and cutting of a hand-made diagram") {
  // dimension 0: [0, inf), [1, 3), [2, 2); the betti numbers of a filtration with those classes
  lacuna::persistence_result<int, lacuna::z2> r;
  r.diagrams.resize(1);
  r.diagrams[0].pairs = {{0, std::nullopt, 0, lacuna::no_cell}, {1, 3, 1, 0}, {2, 2, 2, 1}};
  CHECK(r.betti_number(0, 0) == 1);
  CHECK(r.betti_number(0, 1) == 2);
  CHECK(r.betti_number(0, 2) == 2);  // the class born at 2 dies at 2
  CHECK(r.betti_number(0, 3) == 1);
  CHECK(r.persistent_betti_number(0, 1, 2) == 2);
  CHECK(r.persistent_betti_number(0, 1, 3) == 1);
  CHECK_THROWS_AS((void)r.persistent_betti_number(0, 3, 1), std::invalid_argument);
  const auto nz = lacuna::without_zero_persistence(r);
  CHECK(nz[0].pairs.size() == 2);
  const auto cut = lacuna::up_to(r, 2);
  REQUIRE(cut[0].pairs.size() == 3);
  CHECK(cut[0].pairs[1].birth == 1);
  CHECK(cut[0].pairs[1].essential());  // alive at 2: never dies in the cut filtration
  CHECK(cut[0].pairs[2].death == 2);
  CHECK(lacuna::up_to(r, 0)[0].pairs.size() == 1);
}

}  // namespace persistence_filtration_test

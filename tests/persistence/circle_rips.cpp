// Vietoris–Rips barcodes of the vertices of a regular n-gon, derived from a theorem.
//
// Source: M. Adamaszek, "Clique complexes and graph powers", Israel J. Math. 196 (2013).
// The statement, from memory: the clique complex of the k-th power C_n^k of the n-cycle
// (vertices joined when their cyclic distance is at most k) is homotopy equivalent to
//     S^(2l+1)                    when l/(2l+1) < k/n < (l+1)/(2l+3),
//     a wedge of n-2k-1 S^(2l)    when k/n = l/(2l+1).
// The n-gon's distances are the chords d_j = 2 sin(pi j / n), increasing in j = 1..n/2, so for
// d_k <= r < d_{k+1} its Rips complex is the clique complex of C_n^k (d_0 = 0: n points).
// The barcode follows once the inclusions inside a run of equal odd spheres are isomorphisms
// (maps between spheres of different dimensions are zero in homology): that we check here with
// the relative homology of each step, computed by lacuna's engine (reduced homology of both in
// one degree m: the inclusion is an isomorphism iff H_*(K_{k+1}, K_k) = 0). Hence:
//   dimension 0: n - 1 bars [0, d_1) and one [0, inf);
//   a run k = a..b of S^(2l+1):  one bar [d_a, d_{b+1}) in dimension 2l+1;
//   k/n = l/(2l+1), l >= 1:     n-2k-1 bars [d_k, d_{k+1}) in dimension 2l.
// The distance matrix repeats one double per chord, so equal chords are equal and every
// endpoint is exact. From the points themselves (cos, sin), equal chords differ in the last
// bits; by the stability theorem (Cohen-Steiner, Edelsbrunner & Harer 2007) the bars then move
// by at most that much, and the other bars are shorter than twice that.
#include "circle_rips_theorem.hpp"
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <optional>
#include <utility>
#include <vector>

namespace persistence_circle_rips_test {

namespace support = persistence_test_support;
using namespace persistence_circle_theorem;

/// The bars of positive persistence per dimension, sorted as the expectations are.
template <class R>
std::vector<std::vector<bar>> bars_of(const lacuna::persistence_result<double, R, std::less<double>>& r) {
  std::vector<std::vector<bar>> out;
  for (const auto& dgm : lacuna::without_zero_persistence(r).diagrams) {
    out.emplace_back();
    for (const auto& p : dgm.pairs) out.back().emplace_back(p.birth, p.death);
    std::sort(out.back().begin(), out.back().end());
  }
  while (!out.empty() && out.back().empty()) out.pop_back();
  return out;
}

TEST_CASE("the theorem's types: a few values worked by hand") {
  CHECK(sphere_type(9, 3) == std::pair<int, int>{2, 2});   // 3/9 = 1/3: two 2-spheres
  CHECK(sphere_type(13, 5) == std::pair<int, int>{3, 1});  // 1/3 < 5/13 < 2/5: S^3
  CHECK(sphere_type(15, 6) == std::pair<int, int>{4, 2});  // 6/15 = 2/5: two 4-spheres
  CHECK(sphere_type(7, 2) == std::pair<int, int>{1, 1});   // 2/7 < 1/3: S^1
  CHECK(sphere_type(8, 3) == std::pair<int, int>{3, 1});   // 1/3 < 3/8 < 2/5: S^3
}

TEST_CASE("regular n-gons, n = 4..13, from their distance matrices: exact barcodes over Z/2 and Z/3") {
  for (int n = 4; n <= 13; ++n) {
    CAPTURE(n);
    const auto e = expected_bars(n);
    const auto m = polygon_distances(n);
    const auto f = lacuna::rips_filtration::from_distances(static_cast<std::size_t>(n), m, {.max_dimension = e.top + 1});
    auto expect = e.bars;
    for (int field = 0; field < 2; ++field) {
      const auto got = field == 0 ? bars_of(lacuna::persistence<lacuna::z2>(f, {.max_dimension = e.top}))
                                  : bars_of(lacuna::persistence<lacuna::mod_p<3>>(f, {.max_dimension = e.top}));
      CHECK(got == expect);
    }
    // the inclusions inside a run of one odd sphere are isomorphisms: H_*(K_{k+1}, K_k) = 0
    const auto d = chords(n);
    for (const auto& [a, b] : e.odd_runs)
      for (int k = a; k < b; ++k) {
        const auto big = support::at_value(f, d[static_cast<std::size_t>(k + 1)]);
        std::vector<std::vector<bool>> small(static_cast<std::size_t>(big.complex.top_dimension() + 1));
        for (std::size_t dim = 0; dim < small.size(); ++dim) {
          small[dim].assign(big.complex.cell_count(static_cast<int>(dim)), false);
          for (std::size_t i = 0; i < big.new_index[dim].size(); ++i)
            if (big.new_index[dim][i] != lacuna::cell_selection::npos &&
                f.cell_value(static_cast<int>(dim), i) <= d[static_cast<std::size_t>(k)])
              small[dim][big.new_index[dim][i]] = true;
        }
        const auto rel = lacuna::relative_homology<lacuna::z2>(big.complex, small);
        for (const auto& g : rel.groups) CHECK(g.rank == 0);
      }
  }
}

TEST_CASE("a 15-gon: two 4-spheres at k = 6, four 2-spheres at k = 5") {
  const auto e = expected_bars(15);
  REQUIRE(e.top == 4);
  CHECK(e.bars[2].size() == 4);
  CHECK(e.bars[4].size() == 2);
  const auto f = lacuna::rips_filtration::from_distances(15, polygon_distances(15), {.max_dimension = 5});
  CHECK(bars_of(lacuna::persistence(f, {.max_dimension = 4})) == e.bars);
}

TEST_CASE("regular n-gons from their points: the same bars up to rounding, nothing else") {
  for (int n : {6, 7, 9, 10}) {
    CAPTURE(n);
    const auto e = expected_bars(n);
    std::vector<std::vector<double>> pts;
    for (int i = 0; i < n; ++i)
      pts.push_back({std::cos(2 * std::numbers::pi * i / n), std::sin(2 * std::numbers::pi * i / n)});
    const auto f = lacuna::rips_filtration::from_points(pts, {.max_dimension = e.top + 1});
    const auto r = lacuna::persistence(f, {.max_dimension = e.top});
    constexpr double eps = 1e-9;
    for (int k = 0; k <= e.top; ++k) {
      CAPTURE(k);
      std::vector<bar> long_bars;
      for (const auto& p : r[k].pairs) {
        if (p.essential() || *p.death - p.birth > eps)
          long_bars.emplace_back(p.birth, p.death);
        else
          CHECK(*p.death - p.birth >= 0);
      }
      std::sort(long_bars.begin(), long_bars.end());
      const auto& want = e.bars.size() > static_cast<std::size_t>(k) ? e.bars[static_cast<std::size_t>(k)] : std::vector<bar>{};
      REQUIRE(long_bars.size() == want.size());
      for (std::size_t i = 0; i < want.size(); ++i) {
        CHECK(std::abs(long_bars[i].first - want[i].first) < eps);
        REQUIRE(long_bars[i].second.has_value() == want[i].second.has_value());
        if (want[i].second) CHECK(std::abs(*long_bars[i].second - *want[i].second) < eps);
      }
    }
  }
}

}  // namespace persistence_circle_rips_test

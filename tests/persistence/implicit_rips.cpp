// The implicit Vietoris–Rips route (lacuna/persistence/implicit_rips.hpp) against sources
// outside it:
//   - lacuna::persistence on the explicit rips_filtration (every simplex built, a boundary
//     matrix reduction; a different algorithm on a different numbering of the simplices):
//     the same (birth, death) values, dimension by dimension, over Z/2, Z/3 and Z/5 chosen at
//     run time, on random clouds (also on integer grids, where equal distances abound, so the
//     tie rules and the pairs of persistence zero are exercised);
//   - the barcodes of regular polygons derived from Adamaszek (2013) in circle_rips_theorem.hpp
//     (the derivation and its check are in circle_rips.cpp);
//   - H_0 against single-linkage merge heights: the edge lengths of a minimum spanning tree
//     (Gower & Ross 1969, from memory) by a Kruskal pass written here;
//   - the enclosing radius: cutting there changes no pair of positive persistence (the cone
//     argument of implicit_rips.hpp), checked against threshold = infinity;
//   - the combinatorial number system (Knuth, TAOCP 4A, 7.2.1.3, from memory): the k-subsets in
//     colexicographic order get the numbers 0, 1, 2, ... in turn.
#include "circle_rips_theorem.hpp"
#include "random_clouds.hpp"

#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <numbers>
#include <numeric>
#include <optional>
#include <random>
#include <stop_token>
#include <string>
#include <utility>
#include <vector>

namespace persistence_implicit_rips_test {

using value_bar = std::pair<double, std::optional<double>>;
using bars = std::vector<std::vector<value_bar>>;  // per dimension 0..D, sorted

/// The (birth, death) values of dimensions 0..D, sorted (a missing diagram is empty).
template <class Result>
bars values_of(const Result& r, int D) {
  bars out(static_cast<std::size_t>(D + 1));
  for (const auto& d : r.diagrams) {
    if (d.dimension > D) continue;
    for (const auto& p : d.pairs) out[static_cast<std::size_t>(d.dimension)].emplace_back(p.birth, p.death);
  }
  for (auto& v : out) std::sort(v.begin(), v.end());
  return out;
}

using persistence_test_support::random_cloud;

/// The explicit route: lacuna::persistence of rips_filtration, diagrams 0..D.
template <class R>
bars explicit_values(const std::vector<double>& coordinates, std::size_t dim, int D, std::optional<double> threshold,
                     bool zero_persistence, const R& unit = lacuna::one<R>()) {
  const auto f = lacuna::rips_filtration::from_points(coordinates, dim, {.max_dimension = D + 1, .threshold = threshold});
  auto r = lacuna::persistence<R>(f, {.max_dimension = D}, lacuna::automatic_persistence{}, unit);
  return zero_persistence ? values_of(r, D) : values_of(lacuna::without_zero_persistence(std::move(r)), D);
}

template <class R>
bars implicit_values(const lacuna::rips_metric& m, int D, std::optional<double> threshold, bool zero_persistence,
                     const R& unit = lacuna::one<R>()) {
  lacuna::implicit_rips_options o{.max_dimension = D, .threshold = threshold, .zero_persistence = zero_persistence};
  const auto r = lacuna::implicit_rips_persistence<R>(m, o, unit);
  REQUIRE(r.max_dimension() == D);
  return values_of(r, D);
}

/// One random cloud through both routes, over Z/2, Z/3 (compile-time modulus) and Z/5 (run time).
void compare_cloud(std::mt19937_64& rng, std::size_t n, std::size_t dim, int D, bool grid) {
  CAPTURE(n);
  CAPTURE(dim);
  CAPTURE(D);
  CAPTURE(grid);
  const auto c = random_cloud(rng, n, dim, grid);
  const auto m = lacuna::rips_metric::from_points(c, dim);
  const double radius = m.enclosing_radius();
  // no threshold given: the enclosing radius; the explicit route gets it explicitly
  CHECK(implicit_values<lacuna::z2>(m, D, std::nullopt, false) == explicit_values<lacuna::z2>(c, dim, D, radius, false));
  CHECK(implicit_values<lacuna::mod_p<3>>(m, D, std::nullopt, false) ==
        explicit_values<lacuna::mod_p<3>>(c, dim, D, radius, false));
  // pairs of persistence zero kept: the full result of the explicit route below the threshold
  CHECK(implicit_values<lacuna::z2>(m, D, radius, true) == explicit_values<lacuna::z2>(c, dim, D, radius, true));
  const lacuna::mod_p_dynamic five(1, 5);
  CHECK(implicit_values(m, D, radius, true, five) == explicit_values(c, dim, D, radius, true, five));
  // a threshold below the enclosing radius (essential classes in dimensions >= 1 appear)
  const double low = radius * 0.6;
  CHECK(implicit_values<lacuna::mod_p<3>>(m, D, low, false) == explicit_values<lacuna::mod_p<3>>(c, dim, D, low, false));
}

TEST_CASE("random clouds in R^1..R^3 against the explicit route, H_0..H_D for D = 1..3, Z/2, Z/3, Z/5") {
  std::mt19937_64 rng(20260317);
  for (std::size_t dim = 1; dim <= 3; ++dim) {
    compare_cloud(rng, 60, dim, 1, false);
    compare_cloud(rng, 24, dim, 2, false);
    compare_cloud(rng, 12, dim, 3, false);
    compare_cloud(rng, 40, dim, 1, true);
    compare_cloud(rng, 18, dim, 2, true);
    compare_cloud(rng, 11, dim, 3, true);
  }
}

TEST_CASE("small and degenerate clouds: no points, one point, repeated points, fewer points than dimensions") {
  std::mt19937_64 rng(7);
  CHECK(lacuna::implicit_rips_persistence(lacuna::rips_metric{}, {.max_dimension = 2}).max_dimension() == 2);
  CHECK(lacuna::implicit_rips_persistence(lacuna::rips_metric{}, {.max_dimension = 2})[0].pairs.empty());
  for (std::size_t n : {1, 2, 3}) compare_cloud(rng, n, 2, 3, false);
  const std::vector<double> twice{0, 0, 1, 0, 0, 0, 1, 0, 0, 1};  // (0,0) and (1,0) twice, (0,1)
  const auto m = lacuna::rips_metric::from_points(twice, 2);
  CHECK(implicit_values<lacuna::z2>(m, 2, std::nullopt, true) == explicit_values<lacuna::z2>(twice, 2, 2, m.enclosing_radius(), true));
  CHECK(implicit_values<lacuna::z2>(m, 2, std::nullopt, false) == explicit_values<lacuna::z2>(twice, 2, 2, m.enclosing_radius(), false));
}

TEST_CASE("distance-matrix input equals point input on the same points") {
  std::mt19937_64 rng(11);
  for (int round = 0; round < 4; ++round) {
    const std::size_t n = 30, dim = 2 + static_cast<std::size_t>(round % 2);
    const auto c = random_cloud(rng, n, dim, round >= 2);
    const auto from_points = lacuna::rips_metric::from_points(c, dim);
    std::vector<double> matrix(n * n);
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < n; ++b)
        matrix[a * n + b] = lacuna::euclidean_distance(std::span<const double>(c).subspan(a * dim, dim),
                                                       std::span<const double>(c).subspan(b * dim, dim));
    const auto from_matrix = lacuna::rips_metric::from_distances(n, matrix);
    const auto p = lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(from_points, {.max_dimension = 2});
    const auto q = lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(from_matrix, {.max_dimension = 2});
    CHECK(p.diagrams == q.diagrams);  // pairs, cells included
    CHECK(p.diagrams[1].pairs.size() + p.diagrams[2].pairs.size() > 0);  // not a vacuous check
  }
}

TEST_CASE("regular n-gons: Adamaszek's barcodes up to dimension 3, n = 4..40, and the explicit route up to n = 16") {
  namespace theorem = persistence_circle_theorem;
  for (int n = 4; n <= 40; ++n) {
    CAPTURE(n);
    const auto e = theorem::expected_bars(n);
    const int D = std::min(e.top, 3);
    const auto matrix = theorem::polygon_distances(n);
    const auto m = lacuna::rips_metric::from_distances(static_cast<std::size_t>(n), matrix);
    bars want(static_cast<std::size_t>(D + 1));
    for (int k = 0; k <= D && k < static_cast<int>(e.bars.size()); ++k) want[static_cast<std::size_t>(k)] = e.bars[static_cast<std::size_t>(k)];
    for (auto& v : want) std::sort(v.begin(), v.end());
    CHECK(implicit_values<lacuna::z2>(m, D, std::nullopt, false) == want);
    CHECK(implicit_values<lacuna::mod_p<3>>(m, D, std::nullopt, false) == want);
    if (n <= 16) {
      const auto f = lacuna::rips_filtration::from_distances(static_cast<std::size_t>(n), matrix, {.max_dimension = D + 1});
      CHECK(values_of(lacuna::persistence<lacuna::z2>(f, {.max_dimension = D}), D) ==
            implicit_values<lacuna::z2>(m, D, std::numeric_limits<double>::infinity(), true));
    }
  }
}

/// Single-linkage merge heights: the edge lengths of a minimum spanning tree, by Kruskal's
/// algorithm over all pairs sorted by length, with a union-find of its own.
std::vector<double> spanning_tree_lengths(const std::vector<double>& c, std::size_t dim) {
  const std::size_t n = c.size() / dim;
  std::vector<std::tuple<double, std::size_t, std::size_t>> edges;
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = a + 1; b < n; ++b) {
      double s = 0;
      for (std::size_t i = 0; i < dim; ++i) {
        const double d = c[a * dim + i] - c[b * dim + i];
        s += lacuna::detail::unfused(d * d);  // the contract's distance (FORMATS.md)
      }
      edges.emplace_back(std::sqrt(s), a, b);
    }
  std::sort(edges.begin(), edges.end());
  std::vector<std::size_t> up(n);
  std::iota(up.begin(), up.end(), std::size_t{0});
  auto root = [&](std::size_t x) {
    while (up[x] != x) x = up[x];
    return x;
  };
  std::vector<double> out;
  for (const auto& [d, a, b] : edges) {
    const auto ra = root(a), rb = root(b);
    if (ra == rb) continue;
    up[ra] = rb;
    out.push_back(d);
  }
  return out;
}

TEST_CASE("H_0 is single linkage: the deaths are the lengths of a minimum spanning tree") {
  std::mt19937_64 rng(5);
  for (std::size_t n : {2, 10, 100, 300}) {
    for (bool grid : {false, true}) {
      CAPTURE(n);
      CAPTURE(grid);
      const auto c = random_cloud(rng, n, 3, grid);
      const auto r = lacuna::implicit_rips_persistence(lacuna::rips_metric::from_points(c, 3),
                                                       {.max_dimension = 0, .zero_persistence = true});
      std::vector<double> deaths;
      std::size_t essential = 0;
      for (const auto& p : r[0].pairs) {
        CHECK(p.birth == 0.0);
        if (p.essential()) ++essential; else deaths.push_back(*p.death);
      }
      std::sort(deaths.begin(), deaths.end());
      CHECK(essential == 1);  // the enclosing radius keeps the graph connected
      CHECK(deaths == spanning_tree_lengths(c, 3));
    }
  }
}

TEST_CASE("the enclosing radius changes no pair of positive persistence (threshold = infinity for comparison)") {
  std::mt19937_64 rng(13);
  for (int round = 0; round < 6; ++round) {
    const std::size_t n = 14 + static_cast<std::size_t>(round);
    const auto c = random_cloud(rng, n, 2 + static_cast<std::size_t>(round % 2), round % 3 == 2);
    const auto m = lacuna::rips_metric::from_points(c, 2 + static_cast<std::size_t>(round % 2));
    const double inf = std::numeric_limits<double>::infinity();
    CHECK(implicit_values<lacuna::z2>(m, 2, std::nullopt, false) == implicit_values<lacuna::z2>(m, 2, inf, false));
    CHECK(implicit_values<lacuna::mod_p<3>>(m, 3, std::nullopt, false) == implicit_values<lacuna::mod_p<3>>(m, 3, inf, false));
    CHECK(implicit_values<lacuna::z2>(m, 2, inf, true) == explicit_values<lacuna::z2>(c, 2 + static_cast<std::size_t>(round % 2), 2, std::nullopt, true));
  }
}

TEST_CASE("the combinatorial number system: colexicographic order, decoding, cells of the pairs") {
  // the 3-subsets of {0..7} in colexicographic order (compare the largest element, then the
  // next): numbers 0, 1, 2, ...
  const lacuna::simplex_numbering table(8, 3);
  std::vector<std::vector<std::uint32_t>> subsets;
  for (std::uint32_t a = 0; a < 8; ++a)
    for (std::uint32_t b = a + 1; b < 8; ++b)
      for (std::uint32_t c = b + 1; c < 8; ++c) subsets.push_back({c, b, a});
  std::sort(subsets.begin(), subsets.end());  // decreasing lists sorted lexicographically: colex
  for (std::size_t i = 0; i < subsets.size(); ++i) {
    CHECK(table.number(subsets[i]) == i);
    std::vector<std::uint32_t> back;
    table.vertices(i, 2, back);
    CHECK(back == subsets[i]);
  }
  CHECK(subsets.size() == 56);  // C(8, 3)
  CHECK(lacuna::implicit_rips_vertices(8, 2, 0) == std::vector<std::uint32_t>{0, 1, 2});
  CHECK(lacuna::implicit_rips_vertices(8, 2, 55) == std::vector<std::uint32_t>{5, 6, 7});
  CHECK_THROWS_AS(lacuna::implicit_rips_vertices(8, 2, 56), std::invalid_argument);

  // the cells of a pair: a birth edge is an edge of that length, a death triangle has that value
  std::mt19937_64 rng(3);
  const auto c = random_cloud(rng, 20, 2, false);
  const auto m = lacuna::rips_metric::from_points(c, 2);
  const auto r = lacuna::implicit_rips_persistence(m, {.max_dimension = 1});
  REQUIRE(!r[1].pairs.empty());
  for (const auto& p : r[1].pairs) {
    const auto e = lacuna::implicit_rips_vertices(20, 1, p.birth_cell);
    CHECK(m.distance(e[0], e[1]) == p.birth);
    REQUIRE(!p.essential());
    const auto t = lacuna::implicit_rips_vertices(20, 2, p.death_cell);
    CHECK(std::max({m.distance(t[0], t[1]), m.distance(t[0], t[2]), m.distance(t[1], t[2])}) == *p.death);
  }
}

TEST_CASE("refusals: numbers beyond 63 bits, bad options, bad input; stop and progress") {
  CHECK_THROWS_AS(lacuna::simplex_numbering(1'000'000, 5), std::length_error);  // C(10^6, 5) ~ 8e27
  CHECK_NOTHROW(lacuna::simplex_numbering(1'000'000, 3));                       // C(10^6, 3) ~ 1.7e17
  std::vector<double> line(3000);
  std::iota(line.begin(), line.end(), 0.0);
  const auto m = lacuna::rips_metric::from_points(line, 1);
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence(m, {.max_dimension = 6}), std::length_error);  // C(3000, 8) ~ 1.6e23
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence(m, {.max_dimension = -1}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence(m, {.threshold = std::nan("")}), std::invalid_argument);
  const std::vector<double> five{0, 1, 2, 3, 4};
  CHECK_THROWS_AS(lacuna::rips_metric::from_points(five, 2), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::rips_metric::from_distances(2, std::vector<double>{0, 1, 2, 0}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::rips_metric::from_distances(2, std::vector<double>{0, -1, -1, 0}), std::invalid_argument);

  std::stop_source source;
  source.request_stop();
  lacuna::implicit_rips_options o{.max_dimension = 1};
  o.control.stop = source.get_token();
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence(m, o), lacuna::computation_stopped);

  // a memory limit on the stored columns: 1 byte is passed as soon as one column is kept
  lacuna::implicit_rips_options tight{.max_dimension = 2};
  tight.control.memory_limit = 1;
  std::mt19937_64 rng0(2);
  const auto cloud = random_cloud(rng0, 40, 3, false);
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence(lacuna::rips_metric::from_points(cloud, 3), tight),
                  lacuna::memory_limit_exceeded);
  tight.control.memory_limit = 0;  // no limit
  CHECK_NOTHROW(lacuna::implicit_rips_persistence(lacuna::rips_metric::from_points(cloud, 3), tight));

  std::vector<std::string> phases;
  lacuna::implicit_rips_options p{.max_dimension = 2};
  p.control.progress = [&](const lacuna::progress_report& r) {
    if (phases.empty() || phases.back() != r.phase) phases.emplace_back(r.phase);
  };
  std::mt19937_64 rng(1);
  const auto c = random_cloud(rng, 30, 3, false);
  lacuna::implicit_rips_persistence(lacuna::rips_metric::from_points(c, 3), p);
  CHECK(phases == std::vector<std::string>{"Vietoris-Rips distances", "H_0 by union-find",
                                           "Vietoris-Rips columns of dimension 1", "reducing the coboundary of dimension 1",
                                           "Vietoris-Rips columns of dimension 2", "reducing the coboundary of dimension 2"});
}

}  // namespace persistence_implicit_rips_test

// The implicit Vietoris–Rips route's ways of getting to the same answer, each against a source
// outside the code it checks:
//   - threads: the result with 2 and 3 threads equals the result with one, pair for pair and
//     cell for cell, representative cocycles included (the promise of
//     implicit_rips_options::threads);
//   - diagram 0 alone comes from Prim's minimum spanning forest; it must equal diagram 0 of a
//     run in higher dimensions, which is Kruskal's pass over every edge — the same pairs and
//     cells, because a minimum spanning forest under a strict total order of the edges is
//     unique (the cycle property; Cormen, Leiserson, Rivest & Stein, "Introduction to
//     Algorithms", ch. 23, from memory);
//   - sparse distances (rips_metric::from_links): the Vietoris–Rips filtration of a weighted
//     graph is the flag complex of the edges listed; it is checked against the explicit route
//     (rips_filtration built from a full matrix in which the missing pairs are longer than every
//     listed one and cut off by the threshold, then lacuna::persistence: a different algorithm
//     on a different numbering), and against the dense implicit route on the pairs within a
//     threshold;
//   - the refusals of from_links.
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
#include <optional>
#include <random>
#include <stdexcept>
#include <tuple>
#include <utility>
#include <vector>

namespace persistence_implicit_rips_routes_test {

using full_pair = std::tuple<double, std::optional<double>, std::uint64_t, std::uint64_t>;

/// Every pair of every diagram, in the result's order, cells included.
template <class Result>
std::vector<std::vector<full_pair>> pairs_of(const Result& r) {
  std::vector<std::vector<full_pair>> out;
  for (const auto& d : r.diagrams) {
    out.emplace_back();
    for (const auto& p : d.pairs) out.back().emplace_back(p.birth, p.death, p.birth_cell, p.death_cell);
  }
  return out;
}

/// The (birth, death) values per dimension, sorted.
template <class Result>
std::vector<std::vector<std::pair<double, std::optional<double>>>> values_of(const Result& r) {
  std::vector<std::vector<std::pair<double, std::optional<double>>>> out;
  for (const auto& d : r.diagrams) {
    out.emplace_back();
    for (const auto& p : d.pairs) out.back().emplace_back(p.birth, p.death);
    std::sort(out.back().begin(), out.back().end());
  }
  return out;
}
/// The same, with empty diagrams up to dimension D (the explicit route has none above the
/// top dimension of its complex).
template <class Result>
std::vector<std::vector<std::pair<double, std::optional<double>>>> values_of(const Result& r, int D) {
  auto out = values_of(r);
  out.resize(static_cast<std::size_t>(D + 1));
  return out;
}

using persistence_test_support::random_cloud;

/// The cocycles of two results with cocycles are the same, term for term.
template <class A, class B>
void check_same_cocycles(const A& a, const B& b) {
  REQUIRE(a.cocycles.size() == b.cocycles.size());
  for (std::size_t k = 0; k < a.cocycles.size(); ++k) {
    REQUIRE(a.cocycles[k].size() == b.cocycles[k].size());
    for (std::size_t j = 0; j < a.cocycles[k].size(); ++j) {
      CHECK(a.cocycles[k][j].vertices == b.cocycles[k][j].vertices);
      CHECK(a.cocycles[k][j].coefficients == b.cocycles[k][j].coefficients);
    }
  }
}


TEST_CASE("two and three threads give the result of one, cell for cell") {
  std::mt19937_64 rng(41);
  for (int round = 0; round < 6; ++round) {
    const bool grid = round % 2 == 1;
    const std::size_t n = round < 4 ? 40 : 400;
    const int D = round < 4 ? 2 : 1;
    CAPTURE(round);
    const auto c = random_cloud(rng, n, 3, grid);
    const auto m = lacuna::rips_metric::from_points(c, 3);
    for (const bool zero : {false, true}) {
      lacuna::implicit_rips_options o{.max_dimension = D, .zero_persistence = zero};
      const auto one = lacuna::implicit_rips_persistence(m, o);
      o.threads = 2;
      CHECK(pairs_of(lacuna::implicit_rips_persistence(m, o)) == pairs_of(one));
      o.threads = 3;
      CHECK(pairs_of(lacuna::implicit_rips_persistence(m, o)) == pairs_of(one));
      // the representative cocycles too, term for term
      if (n <= 40) {
        o.threads = 1;
        const auto c1 = lacuna::implicit_rips_persistence_with_cocycles(m, o);
        o.threads = 2;
        const auto c2 = lacuna::implicit_rips_persistence_with_cocycles(m, o);
        CHECK(pairs_of(c2.persistence) == pairs_of(c1.persistence));
        check_same_cocycles(c2, c1);
      }
      lacuna::implicit_rips_options o3{.max_dimension = D, .zero_persistence = zero};
      const auto one3 = lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(m, o3);
      o3.threads = 2;
      CHECK(pairs_of(lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(m, o3)) == pairs_of(one3));
    }
  }
}

TEST_CASE("diagram 0 alone (Prim's forest) equals diagram 0 of a higher run (Kruskal over every edge)") {
  std::mt19937_64 rng(43);
  for (int round = 0; round < 12; ++round) {
    const bool grid = round % 2 == 1;
    const std::size_t n = 2 + static_cast<std::size_t>(round) * 17;
    CAPTURE(round);
    const auto c = random_cloud(rng, n, 2, grid);
    const auto m = lacuna::rips_metric::from_points(c, 2);
    // no threshold (a tree), and a low one (a forest with several trees)
    for (const std::optional<double> t : {std::optional<double>{}, std::optional<double>{grid ? 1.0 : 0.15}}) {
      for (const bool zero : {false, true}) {
        const auto alone = lacuna::implicit_rips_persistence(m, {.max_dimension = 0, .threshold = t, .zero_persistence = zero});
        const auto higher = lacuna::implicit_rips_persistence(m, {.max_dimension = 1, .threshold = t, .zero_persistence = zero});
        REQUIRE(alone.diagrams.size() == 1);
        CHECK(pairs_of(alone)[0] == pairs_of(higher)[0]);
      }
    }
  }
}

/// A random weighted graph on n points: each pair listed with probability p, at a distance
/// drawn from {1..8} (ties abound; not a metric, which the filtration does not need).
std::vector<lacuna::rips_metric::link> random_links(std::mt19937_64& rng, std::size_t n, double p) {
  std::bernoulli_distribution keep(p);
  std::uniform_int_distribution<int> length(1, 8);
  std::vector<lacuna::rips_metric::link> links;
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = a + 1; b < n; ++b)
      if (keep(rng)) links.push_back(rng() % 2 == 0 ? lacuna::rips_metric::link{a, b, double(length(rng))}
                                                      : lacuna::rips_metric::link{b, a, double(length(rng))});
  std::shuffle(links.begin(), links.end(), rng);
  return links;
}

TEST_CASE("sparse distances: the flag complex of the listed pairs, against the explicit route") {
  std::mt19937_64 rng(47);
  for (int round = 0; round < 10; ++round) {
    const std::size_t n = 6 + static_cast<std::size_t>(round) * 2;
    const double p = round % 2 == 0 ? 0.5 : 0.8;
    CAPTURE(round);
    const auto links = random_links(rng, n, p);
    const auto sparse = lacuna::rips_metric::from_links(n, links);
    CHECK(sparse.sparse());
    // the explicit route: missing pairs at 100, cut off by the threshold 50
    std::vector<double> full(n * n, 100.0);
    for (std::size_t i = 0; i < n; ++i) full[i * n + i] = 0;
    for (const auto& l : links) full[l.a * n + l.b] = full[l.b * n + l.a] = l.distance;
    const auto f = lacuna::rips_filtration::from_distances(n, full, {.max_dimension = 3, .threshold = 50.0});
    for (const bool zero : {false, true}) {
      auto e2 = lacuna::persistence<lacuna::z2>(f, {.max_dimension = 2});
      auto e3 = lacuna::persistence<lacuna::mod_p<3>>(f, {.max_dimension = 2});
      if (!zero) {
        e2 = lacuna::without_zero_persistence(std::move(e2));
        e3 = lacuna::without_zero_persistence(std::move(e3));
      }
      // no threshold given: no point is linked to every other (or if one is, the enclosing
      // radius still changes no pair of positive persistence); give +infinity to keep all
      const double inf = std::numeric_limits<double>::infinity();
      CHECK(values_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = 2, .threshold = inf, .zero_persistence = zero})) ==
            values_of(e2, 2));
      CHECK(values_of(lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(
                sparse, {.max_dimension = 2, .threshold = inf, .zero_persistence = zero})) == values_of(e3, 2));
      CHECK(values_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = 2, .threshold = inf, .zero_persistence = zero,
                                                                 .threads = 2})) == values_of(e2, 2));
    }
    // threshold 4 on both routes
    const auto f4 = lacuna::rips_filtration::from_distances(n, full, {.max_dimension = 3, .threshold = 4.0});
    CHECK(values_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = 2, .threshold = 4.0}), 2) ==
          values_of(lacuna::without_zero_persistence(lacuna::persistence<lacuna::z2>(f4, {.max_dimension = 2})), 2));
  }
}

TEST_CASE("sparse distances of the pairs within a threshold equal the dense route cut there, cell for cell") {
  std::mt19937_64 rng(53);
  for (int round = 0; round < 6; ++round) {
    const bool grid = round % 2 == 1;
    const std::size_t n = 30 + static_cast<std::size_t>(round) * 5;
    CAPTURE(round);
    const auto c = random_cloud(rng, n, 3, grid);
    const auto dense = lacuna::rips_metric::from_points(c, 3);
    const double t = dense.enclosing_radius() * 0.7;
    std::vector<lacuna::rips_metric::link> links;
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < a; ++b)
        if (dense.distance(a, b) <= t) links.push_back({a, b, dense.distance(a, b)});
    const auto sparse = lacuna::rips_metric::from_links(n, links);
    for (std::size_t a = 0; a < n; ++a)
      for (std::size_t b = 0; b < n; ++b)
        if (dense.distance(a, b) <= t) {
          REQUIRE(sparse.distance(a, b) == dense.distance(a, b));
        } else {
          REQUIRE(std::isinf(sparse.distance(a, b)));
        }
    for (const bool zero : {false, true}) {
      const double inf = std::numeric_limits<double>::infinity();
      for (const int D : {0, 2}) {
        CAPTURE(D);
        const auto d = lacuna::implicit_rips_persistence(dense, {.max_dimension = D, .threshold = t, .zero_persistence = zero});
        CHECK(pairs_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = D, .threshold = inf, .zero_persistence = zero})) ==
              pairs_of(d));
        // the representative cocycles too, term for term
        const auto cd = lacuna::implicit_rips_persistence_with_cocycles(dense, {.max_dimension = D, .threshold = t, .zero_persistence = zero});
        const auto cs = lacuna::implicit_rips_persistence_with_cocycles(sparse, {.max_dimension = D, .threshold = inf, .zero_persistence = zero});
        check_same_cocycles(cs, cd);
        // no threshold given: the sparse enclosing radius (infinite unless a point is linked to all)
        CHECK(pairs_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = D, .zero_persistence = zero})) ==
              pairs_of(lacuna::implicit_rips_persistence(sparse, {.max_dimension = D, .threshold = sparse.enclosing_radius(),
                                                                   .zero_persistence = zero})));
      }
    }
  }
}

TEST_CASE("sparse distances: the enclosing radius, and the refusals of from_links") {
  using link = lacuna::rips_metric::link;
  // a path 0 - 1 - 2 - 3: no point is linked to all three others
  const std::vector<link> path{{0, 1, 1.0}, {1, 2, 2.0}, {2, 3, 1.5}};
  CHECK(std::isinf(lacuna::rips_metric::from_links(4, path).enclosing_radius()));
  // a triangle: every point is linked to the others; min over points of the largest distance
  const std::vector<link> triangle{{0, 1, 1.0}, {1, 2, 2.0}, {2, 0, 3.0}};
  CHECK(lacuna::rips_metric::from_links(3, triangle).enclosing_radius() == 2.0);
  // isolated points are classes of their own
  const auto r = lacuna::implicit_rips_persistence(lacuna::rips_metric::from_links(6, path), {.max_dimension = 1});
  CHECK(std::count_if(r[0].pairs.begin(), r[0].pairs.end(), [](const auto& p) { return p.essential(); }) == 3);

  const auto refused = [](std::size_t n, std::vector<link> links) {
    CHECK_THROWS_AS(lacuna::rips_metric::from_links(n, links), std::invalid_argument);
  };
  refused(3, {{0, 3, 1.0}});                                               // beyond the points
  refused(3, {{1, 1, 1.0}});                                               // a point twice
  refused(3, {{0, 1, -1.0}});                                              // negative
  refused(3, {{0, 1, std::numeric_limits<double>::infinity()}});          // not finite
  refused(3, {{0, 1, std::nan("")}});
  refused(3, {{0, 1, 1.0}, {1, 2, 1.0}, {1, 0, 1.0}});                     // listed twice
  try {
    lacuna::rips_metric::from_links(3, std::vector<link>{{0, 1, 1.0}, {1, 2, 1.0}, {1, 0, 2.0}});
    FAIL("a pair listed twice was accepted");
  } catch (const std::invalid_argument& e) {
    CHECK(std::string(e.what()).find("link 2 (points 1 and 0) lists a pair already listed") != std::string::npos);
  }
  CHECK_NOTHROW(lacuna::rips_metric::from_links(3, std::vector<link>{{0, 1, -0.0}}));
}

}  // namespace persistence_implicit_rips_routes_test

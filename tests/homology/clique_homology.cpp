// Tests of lacuna/algorithm/dominated_vertices.hpp and lacuna/homology/clique_homology.hpp:
// the homology of a clique complex from the core left by removing dominated vertices, with
// the top dimension of a truncated complex from counted cliques. What is checked, and why it
// must hold:
//   * the groups are those homology() gives on the clique complex built in full, over Z,
//     Z/2 and Z/3, in every dimension including the top, on random geometric graphs (which
//     have many dominated vertices) and random graphs: Barmak & Minian 2012 (a strong
//     collapse is a homotopy equivalence) below the top, Euler–Poincaré at the top;
//   * textbook values: the octahedron (S^2), a cycle (S^1), skeleta of a simplex (a wedge of
//     C(n-1, d+1) spheres of dimension d, from the Euler characteristic of the skeleton and
//     its (d-1)-connectedness; from memory), the barycentric subdivisions of the 6-vertex
//     projective plane and the 7-vertex torus, which are flag complexes (Hatcher 2002, §2.2:
//     H(RP^2) = Z, Z/2, 0; H(T^2) = Z, Z^2, Z);
//   * generators are cycles of the whole clique complex, and both ways between the core's
//     basis and the whole complex's basis the free coordinates form unimodular matrices (the
//     inclusion and the retraction are inverse isomorphisms on homology below the top);
//   * the retraction sends every vertex to a kept one along dominations; nothing is removed
//     from graphs without dominated vertices; bad adjacency lists, bad chains and a stop
//     request are errors.
#include "support.hpp"

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/dominated_vertices.hpp>
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/homology/clique_homology.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <random>
#include <set>
#include <stop_token>
#include <string>
#include <utility>
#include <vector>

namespace homology_clique_homology_test {

using lacuna::integer;
using lacuna_test::group;
using lacuna_test::groups_of;

namespace {

using edge_list = std::vector<std::pair<int, int>>;

struct graph {
  std::vector<int> vertices;
  edge_list edges;
};

std::size_t binomial(std::uint64_t n, std::uint64_t k) {
  std::uint64_t b = 1;
  for (std::uint64_t i = 1; i <= k; ++i) b = b * (n - k + i) / i;
  return b;
}

/// n points uniform in the unit square, joined when closer than `radius` (fixed seed).
graph geometric_graph(int n, double radius, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<std::pair<double, double>> p;
  graph g;
  for (int i = 0; i < n; ++i) {
    p.emplace_back(u(rng), u(rng));
    g.vertices.push_back(i);
  }
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n; ++j)
      if (std::hypot(p[i].first - p[j].first, p[i].second - p[j].second) < radius) g.edges.emplace_back(i, j);
  return g;
}

graph random_graph(int n, double prob, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::bernoulli_distribution coin(prob);
  graph g;
  for (int i = 0; i < n; ++i) g.vertices.push_back(i);
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n; ++j)
      if (coin(rng)) g.edges.emplace_back(i, j);
  return g;
}

/// The random graphs of the comparisons: every third seed G(24, p), the others geometric
/// graphs of 60 points at growing radii.
graph test_graph(std::uint64_t seed, double p) {
  return seed % 3 == 0 ? random_graph(24, p, seed) : geometric_graph(60, 0.2 + 0.01 * static_cast<double>(seed), seed);
}

/// The graph of the 1-skeleton of a simplicial complex.
template <class L>
std::pair<std::vector<L>, std::vector<std::pair<L, L>>> one_skeleton(const lacuna::simplicial_complex<L>& c) {
  std::vector<L> vs(c.labels());
  std::vector<std::pair<L, L>> es;
  for (std::size_t i = 0; i < lacuna::cell_count(c, 1); ++i) {
    const auto v = c.vertices(1, i);
    es.emplace_back(c.label(v[0]), c.label(v[1]));
  }
  return {vs, es};
}

/// homology() of the clique complex built in full.
template <class R, class L>
std::vector<group> built_in_full(const std::vector<L>& vs, const std::vector<std::pair<L, L>>& es, int d) {
  return groups_of(lacuna::homology<R>(lacuna::clique_complex(vs, es, d)));
}

/// The chain of `c` as labelled simplices.
template <class R, class L>
std::vector<std::pair<std::vector<L>, R>> labelled(const lacuna::simplicial_complex<L>& c, const lacuna::chain<R>& z) {
  std::vector<std::pair<std::vector<L>, R>> out;
  for (const auto& t : z.terms) {
    std::vector<L> ls;
    for (const auto v : c.vertices(z.dimension, t.cell)) ls.push_back(c.label(v));
    out.emplace_back(ls, t.coefficient);
  }
  return out;
}

/// The chain of `c` named by labelled simplices (each in increasing vertex order of c).
template <class R, class L>
lacuna::chain<R> on(const lacuna::simplicial_complex<L>& c, int k, const std::vector<std::pair<std::vector<L>, R>>& s) {
  lacuna::chain<R> z{k, {}};
  for (const auto& [ls, coefficient] : s) {
    const auto at = c.find_labels(ls);
    REQUIRE(at.has_value());
    z.terms.push_back({*at, coefficient});
  }
  z.normalize_terms();
  return z;
}

/// K_{2,2,2}: every pair of 0..5 but the antipodal ones (u, u + 3); its clique complex is the
/// octahedron, S^2.
std::vector<std::pair<int, int>> octahedron_graph() {
  std::vector<std::pair<int, int>> oct;
  for (int u = 0; u < 6; ++u)
    for (int v = u + 1; v < 6; ++v)
      if (v != u + 3) oct.emplace_back(u, v);
  return oct;
}

/// Generators both ways, over Z, in every dimension below the top (or every dimension when
/// the bound does not bite): see the head of the file.
template <class L>
void check_generators(const std::vector<L>& vs, const std::vector<std::pair<L, L>>& es, int d) {
  const auto full = lacuna::clique_complex(vs, es, d);
  const auto hf = lacuna::homology<integer>(full, {.generators = true});
  lacuna::clique_homology_options o;
  o.homology.generators = true;
  const auto hc = lacuna::clique_homology<integer>(vs, es, d, o);
  REQUIRE(groups_of(hc.groups) == groups_of(hf));
  const int below = hc.top_from_counts ? hc.top_dimension() : hc.top_dimension() + 1;
  for (int k = 0; k < below; ++k) {
    CAPTURE(k);
    const auto& g = hc.groups[static_cast<std::size_t>(k)];
    const std::size_t r = g.rank;
    REQUIRE(g.generators.size() == r + g.torsion.size());
    // The core's generators, read as chains of the whole complex: cycles, and a basis there.
    std::vector<std::vector<integer>> rows;
    for (const auto& z : g.generators) {
      const auto on_full = on(full, k, labelled(hc.core, z));
      rows.push_back(hf.coordinates(full, on_full));  // checks that it is a cycle of the whole
    }
    lacuna_test::check_free_block_unimodular(rows, r);
    // The whole complex's generators through the retraction: a basis of the core's homology.
    rows.clear();
    for (const auto& z : hf[k].generators) rows.push_back(hc.coordinates(k, labelled(full, z)));
    lacuna_test::check_free_block_unimodular(rows, r);
    // Torsion generators keep their orders both ways (Z/2 in the projective plane).
    for (std::size_t i = r; i < rows.size(); ++i)
      for (std::size_t j = 0; j < r; ++j) CHECK(rows[i][j] == integer(0));
  }
}

}  // namespace

TEST_CASE("remove_dominated_vertices on small graphs") {
  using adjacency = std::vector<std::vector<std::uint32_t>>;
  // A path 0-1-2-3 collapses to one vertex; every vertex is sent to it.
  const auto path = lacuna::remove_dominated_vertices(adjacency{{1}, {0, 2}, {1, 3}, {2}});
  CHECK(path.kept_count() == 1);
  CHECK(path.removed.size() == 3);
  for (std::uint32_t v = 0; v < 4; ++v) CHECK(path.kept(path.image[v]));
  // A cycle of 5 vertices has no dominated vertex (its clique complex is a circle, minimal).
  const auto c5 = lacuna::remove_dominated_vertices(adjacency{{1, 4}, {0, 2}, {1, 3}, {2, 4}, {0, 3}});
  CHECK(c5.kept_count() == 5);
  CHECK(c5.removed.empty());
  // K_4: three of four go; isolated vertices stay.
  const auto k4 = lacuna::remove_dominated_vertices(adjacency{{1, 2, 3}, {0, 2, 3}, {0, 1, 3}, {0, 1, 2}, {}});
  CHECK(k4.kept_count() == 2);
  CHECK(k4.kept(4));
  // Lists that are not a simple undirected graph.
  CHECK_THROWS_AS(lacuna::remove_dominated_vertices(adjacency{{1}, {}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::remove_dominated_vertices(adjacency{{0}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::remove_dominated_vertices(adjacency{{2, 1}, {0}, {0}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::remove_dominated_vertices(adjacency{{5}}), std::invalid_argument);
}

TEST_CASE("each removal is a domination in the graph left at that time") {
  for (std::uint64_t seed = 1; seed <= 6; ++seed) {
    const auto g = geometric_graph(80, 0.22, seed);
    std::vector<std::vector<std::uint32_t>> adj(g.vertices.size());
    for (const auto& [u, v] : g.edges) {
      adj[static_cast<std::size_t>(u)].push_back(static_cast<std::uint32_t>(v));
      adj[static_cast<std::size_t>(v)].push_back(static_cast<std::uint32_t>(u));
    }
    for (auto& a : adj) std::sort(a.begin(), a.end());
    const auto r = lacuna::remove_dominated_vertices(adj);
    CHECK(r.removed.size() > 0);
    // Replay: when v goes, some live neighbour's closed neighbourhood holds v's.
    std::vector<bool> alive(adj.size(), true);
    for (const auto v : r.removed) {
      std::set<std::uint32_t> nv{v};
      for (const auto w : adj[v])
        if (alive[w]) nv.insert(w);
      bool dominated = false;
      for (const auto u : adj[v]) {
        if (!alive[u]) continue;
        std::set<std::uint32_t> nu{u};
        for (const auto w : adj[u])
          if (alive[w]) nu.insert(w);
        dominated = dominated || std::includes(nu.begin(), nu.end(), nv.begin(), nv.end());
      }
      CHECK(dominated);
      alive[v] = false;
    }
    // What is left has no dominated vertex.
    for (std::uint32_t v = 0; v < adj.size(); ++v) {
      if (!alive[v]) continue;
      CHECK(r.kept(v));
      std::set<std::uint32_t> nv{v};
      for (const auto w : adj[v])
        if (alive[w]) nv.insert(w);
      for (const auto u : adj[v]) {
        if (!alive[u]) continue;
        std::set<std::uint32_t> nu{u};
        for (const auto w : adj[u])
          if (alive[w]) nu.insert(w);
        CHECK_FALSE(std::includes(nu.begin(), nu.end(), nv.begin(), nv.end()));
      }
    }
  }
}

TEST_CASE("clique_counts: the cell counts of the complex built in full") {
  for (std::uint64_t seed = 1; seed <= 5; ++seed) {
    const auto g = random_graph(30, 0.35, seed);
    for (int d = 0; d <= 4; ++d) {
      const auto c = lacuna::clique_complex(g.vertices, g.edges, d);
      std::vector<std::size_t> n;
      for (int k = 0; k <= lacuna::top_dimension(c); ++k) n.push_back(lacuna::cell_count(c, k));
      CHECK(lacuna::clique_counts(g.vertices, g.edges, d) == n);
    }
  }
}

TEST_CASE("textbook clique complexes") {
  // K_{2,2,2}: the octahedron, S^2 (no vertex is dominated).
  auto oct = octahedron_graph();
  for (int d : {2, 3, 5}) {
    const auto h = lacuna::clique_homology<integer>(oct, d);
    CHECK(groups_of(h.groups) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
    CHECK(h.core.vertex_count() == 6);
    CHECK_FALSE(h.top_from_counts);  // no clique of 4 vertices: the bound never bites
  }
  // A cycle of 7 vertices: S^1.
  std::vector<std::pair<int, int>> c7;
  for (int i = 0; i < 7; ++i) c7.emplace_back(i, (i + 1) % 7);
  CHECK(groups_of(lacuna::clique_homology<integer>(c7, 3).groups) == std::vector<group>{{1, {}}, {1, {}}});
  // K_n up to dimension d < n - 1: the d-skeleton of a simplex, a wedge of C(n-1, d+1)
  // d-spheres. Domination leaves one vertex; the top group comes from the counts.
  for (int n = 2; n <= 9; ++n)
    for (int d = 0; d < n - 1; ++d) {
      CAPTURE(n);
      CAPTURE(d);
      std::vector<std::pair<int, int>> e;
      for (int u = 0; u < n; ++u)
        for (int v = u + 1; v < n; ++v) e.emplace_back(u, v);
      const auto h = lacuna::clique_homology<integer>(e, d);
      CHECK(h.core.vertex_count() == 1);
      CHECK(h.top_from_counts);
      std::vector<group> want(static_cast<std::size_t>(d) + 1);
      want[0].rank = 1;
      want[static_cast<std::size_t>(d)].rank +=
          binomial(static_cast<std::uint64_t>(n - 1), static_cast<std::uint64_t>(d + 1));
      CHECK(groups_of(h.groups) == want);
      // Reduced homology: H~_0 loses the one.
      lacuna::clique_homology_options o;
      o.homology.reduced = true;
      const auto hr = lacuna::clique_homology<integer>(e, d, o);
      want[0].rank -= 1;
      CHECK(groups_of(hr.groups) == want);
    }
  // The barycentric subdivision of a complex is a flag complex with the same space.
  const auto rp2 = lacuna::barycentric_subdivision(lacuna_test::six_vertex_rp2());
  const auto [rv, re] = one_skeleton(rp2);
  CHECK(groups_of(lacuna::clique_homology<integer>(rv, re, 3).groups) ==
        std::vector<group>{{1, {}}, {0, {"2"}}, {0, {}}});
  CHECK(groups_of(lacuna::clique_homology<lacuna::z2>(rv, re, 3).groups) ==
        std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  const auto torus = lacuna::barycentric_subdivision(lacuna_test::seven_vertex_torus());
  const auto [tv, te] = one_skeleton(torus);
  CHECK(groups_of(lacuna::clique_homology<integer>(tv, te, 2).groups) ==
        std::vector<group>{{1, {}}, {2, {}}, {1, {}}});
}

TEST_CASE("the same groups as the complex built in full, with and without the removal") {
  int removed_somewhere = 0;
  for (std::uint64_t seed = 1; seed <= 12; ++seed) {
    CAPTURE(seed);
    const auto g = test_graph(seed, 0.3);
    for (int d = 1; d <= 3; ++d) {
      CAPTURE(d);
      const auto want = built_in_full<integer>(g.vertices, g.edges, d);
      const auto h = lacuna::clique_homology<integer>(g.vertices, g.edges, d);
      CHECK(groups_of(h.groups) == want);
      lacuna::clique_homology_options none;
      none.reduction = lacuna::clique_reduction::none;
      const auto hn = lacuna::clique_homology<integer>(g.vertices, g.edges, d, none);
      CHECK(groups_of(hn.groups) == want);
      CHECK(hn.core.vertex_count() == g.vertices.size());
      CHECK(groups_of(lacuna::clique_homology<lacuna::z2>(g.vertices, g.edges, d).groups) ==
            built_in_full<lacuna::z2>(g.vertices, g.edges, d));
      CHECK(groups_of(lacuna::clique_homology<lacuna::mod_p<3>>(g.vertices, g.edges, d).groups) ==
            built_in_full<lacuna::mod_p<3>>(g.vertices, g.edges, d));
      // The counts are those of the complex built in full.
      CHECK(h.cell_counts == lacuna::clique_counts(g.vertices, g.edges, d));
      if (!h.retraction.removed.empty()) ++removed_somewhere;
    }
  }
  CHECK(removed_somewhere >= 20);  // the geometric graphs do lose vertices
}

TEST_CASE("generators: cycles of the whole complex, bases both ways") {
  for (std::uint64_t seed = 1; seed <= 6; ++seed) {
    CAPTURE(seed);
    const auto g = geometric_graph(50, 0.24, seed);
    for (int d = 1; d <= 3; ++d) check_generators(g.vertices, g.edges, d);
  }
  // Torsion: the subdivided projective plane, its Z/2 generator both ways.
  const auto rp2 = lacuna::barycentric_subdivision(lacuna_test::six_vertex_rp2());
  const auto [rv, re] = one_skeleton(rp2);
  check_generators(rv, re, 3);
  // An octahedron with a pendant path: the path goes, S^2 stays, with its generator.
  auto oct = octahedron_graph();
  oct.emplace_back(0, 6);
  oct.emplace_back(6, 7);
  check_generators(std::vector<int>{}, oct, 3);
}

TEST_CASE("remove_dominated_edges: each removal a domination at its time, none left") {
  for (std::uint64_t seed = 1; seed <= 6; ++seed) {
    CAPTURE(seed);
    const auto g = seed % 2 == 0 ? geometric_graph(70, 0.25, seed) : random_graph(30, 0.4, seed);
    std::vector<std::set<std::uint32_t>> adj(g.vertices.size());
    for (const auto& [u, v] : g.edges) {
      adj[static_cast<std::size_t>(u)].insert(static_cast<std::uint32_t>(v));
      adj[static_cast<std::size_t>(v)].insert(static_cast<std::uint32_t>(u));
    }
    std::vector<std::vector<std::uint32_t>> lists;
    for (const auto& a : adj) lists.emplace_back(a.begin(), a.end());
    const auto r = lacuna::remove_dominated_edges(lists);
    CHECK(r.removed.size() > 0);
    // closed neighbourhoods, in the graph of the moment
    const auto closed = [&](std::uint32_t v) {
      auto s = adj[v];
      s.insert(v);
      return s;
    };
    const auto is_dominated = [&](std::uint32_t u, std::uint32_t v) {
      std::set<std::uint32_t> both;
      const auto nu = closed(u), nv = closed(v);
      std::set_intersection(nu.begin(), nu.end(), nv.begin(), nv.end(), std::inserter(both, both.end()));
      for (const auto w : both) {
        if (w == u || w == v) continue;
        const auto nw = closed(w);
        if (std::includes(nw.begin(), nw.end(), both.begin(), both.end())) return true;
      }
      return false;
    };
    for (const auto& [u, v] : r.removed) {
      REQUIRE(adj[u].count(v) == 1);
      CHECK(is_dominated(u, v));
      adj[u].erase(v);
      adj[v].erase(u);
    }
    for (std::uint32_t v = 0; v < adj.size(); ++v) {
      CHECK(std::vector<std::uint32_t>(adj[v].begin(), adj[v].end()) == r.neighbours[v]);
      for (const auto w : adj[v])
        if (v < w) CHECK_FALSE(is_dominated(v, w));
    }
  }
  CHECK_THROWS_AS(lacuna::remove_dominated_edges({{1}, {}}), std::invalid_argument);
}

TEST_CASE("dominated edges: the same groups, generators cycles of the whole complex") {
  lacuna::clique_homology_options edges;
  edges.reduction = lacuna::clique_reduction::dominated_edges;
  int removed_somewhere = 0;
  for (std::uint64_t seed = 1; seed <= 10; ++seed) {
    CAPTURE(seed);
    const auto g = test_graph(seed, 0.35);
    for (int d = 1; d <= 3; ++d) {
      CAPTURE(d);
      const auto h = lacuna::clique_homology<integer>(g.vertices, g.edges, d, edges);
      CHECK(groups_of(h.groups) == built_in_full<integer>(g.vertices, g.edges, d));
      CHECK(groups_of(lacuna::clique_homology<lacuna::z2>(g.vertices, g.edges, d, edges).groups) ==
            built_in_full<lacuna::z2>(g.vertices, g.edges, d));
      if (h.removed_edges > 0) ++removed_somewhere;
    }
    // Generators, below the top: cycles of the whole complex, unimodular in its basis.
    edges.homology.generators = true;
    const auto full = lacuna::clique_complex(g.vertices, g.edges, 3);
    const auto hf = lacuna::homology<integer>(full, {.generators = true});
    const auto h = lacuna::clique_homology<integer>(g.vertices, g.edges, 3, edges);
    const int below = h.top_from_counts ? h.top_dimension() : h.top_dimension() + 1;
    for (int k = 0; k < below; ++k) {
      std::vector<std::vector<integer>> rows;
      for (const auto& z : h.groups[static_cast<std::size_t>(k)].generators)
        rows.push_back(hf.coordinates(full, on(full, k, labelled(h.core, z))));
      lacuna_test::check_free_block_unimodular(rows, h.groups[static_cast<std::size_t>(k)].rank);
    }
    if (h.removed_edges > 0) {
      using S = std::vector<std::pair<std::vector<int>, integer>>;
      CHECK_THROWS_AS(h.retract(0, S{{{0}, integer(1)}}), std::logic_error);
    }
    edges.homology.generators = false;
  }
  CHECK(removed_somewhere >= 20);
}

TEST_CASE("two threads count the same cliques") {
  for (std::uint64_t seed = 1; seed <= 4; ++seed) {
    const auto g = geometric_graph(90, 0.3, seed);
    for (int d = 0; d <= 4; ++d) {
      lacuna::clique_homology_options one, two;
      two.homology.threads = 2;
      const auto a = lacuna::clique_homology<integer>(g.vertices, g.edges, d, one);
      const auto b = lacuna::clique_homology<integer>(g.vertices, g.edges, d, two);
      CHECK(a.cell_counts == b.cell_counts);
      CHECK(a.top_from_counts == b.top_from_counts);
      CHECK(groups_of(a.groups) == groups_of(b.groups));
    }
  }
}

TEST_CASE("errors") {
  const std::vector<std::pair<int, int>> tri{{0, 1}, {1, 2}, {2, 0}, {2, 3}};
  CHECK_THROWS_AS(lacuna::clique_homology<integer>(tri, -1), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::clique_homology<integer>(std::vector<std::pair<int, int>>{{4, 4}}, 2),
                  lacuna::invalid_complex);
  lacuna::clique_homology_options o;
  o.homology.generators = true;
  const auto h = lacuna::clique_homology<integer>(tri, 1, o);  // a filled triangle cut at dimension 1
  REQUIRE(h.top_from_counts);
  CHECK(h.groups[1].rank == 1);  // the triangle's boundary, a 1-cycle of the 1-skeleton
  CHECK(h.groups[1].generators.empty());
  using S = std::vector<std::pair<std::vector<int>, integer>>;
  CHECK_THROWS_AS(h.coordinates(1, S{{{0, 1}, integer(1)}}), std::invalid_argument);  // top from counts
  const auto h2 = lacuna::clique_homology<integer>(tri, 2, o);
  CHECK_THROWS_AS(h2.retract(1, S{{{0, 9}, integer(1)}}), std::invalid_argument);     // no vertex 9
  CHECK_THROWS_AS(h2.coordinates(3, S{}), std::invalid_argument);                     // above the top
  CHECK_THROWS_AS(h2.retract(1, S{{{0, 0}, integer(1)}}), std::invalid_argument);     // repeated
  CHECK_THROWS_AS(h2.retract(1, S{{{0, 1, 2}, integer(1)}}), std::invalid_argument);  // wrong size
  CHECK_THROWS_AS(h2.retract(1, S{{{0, 3}, integer(1)}}), std::invalid_argument);     // not an edge
  // A non-cycle whose image is a non-cycle is caught (the octahedron keeps every vertex).
  auto oct = octahedron_graph();
  const auto ho = lacuna::clique_homology<integer>(oct, 3, o);
  CHECK_THROWS_AS(ho.coordinates(1, S{{{0, 1}, integer(1)}}), std::invalid_argument);
  CHECK(ho.coordinates(1, S{{{0, 1}, integer(1)}, {{1, 2}, integer(1)}, {{2, 0}, integer(1)}}) ==
        std::vector<integer>{});  // a triangle's boundary: H_1 = 0
  // A stop request: nothing is returned.
  std::stop_source source;
  source.request_stop();
  lacuna::clique_homology_options stopped;
  stopped.homology.control.stop = source.get_token();
  CHECK_THROWS_AS(lacuna::clique_homology<integer>(tri, 2, stopped), lacuna::computation_stopped);
  stopped.homology.threads = 2;
  CHECK_THROWS_AS(lacuna::clique_homology<integer>(tri, 2, stopped), lacuna::computation_stopped);
  stopped.reduction = lacuna::clique_reduction::dominated_edges;
  CHECK_THROWS_AS(lacuna::clique_homology<integer>(tri, 2, stopped), lacuna::computation_stopped);
}

}  // namespace homology_clique_homology_test

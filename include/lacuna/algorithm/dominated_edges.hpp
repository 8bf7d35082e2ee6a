// lacuna/algorithm/dominated_edges.hpp — removal of dominated edges from a graph, a homotopy
// equivalence of its clique complex found on the graph alone.
//
// An edge uv is dominated by a vertex w ∉ {u, v} when N[u] ∩ N[v] ⊆ N[w] (closed
// neighbourhoods); then w is a common neighbour of u and v. The clique complex of the graph
// then collapses onto that of the graph without the edge (Boissonnat & Pritam, "Edge collapse
// and persistence of flag complexes", SoCG 2020), so the inclusion of the smaller clique
// complex is a homotopy equivalence. On Vietoris–Rips graphs of sampled spaces most edges go.
// Unlike the removal of a dominated vertex (dominated_vertices.hpp), this step has no
// simplicial retraction: cycles of the smaller complex are cycles of the larger one, but a
// cycle of the larger one has no image computed here.
//
//   auto kept = lacuna::remove_dominated_edges(neighbours);  // neighbours[v]: sorted
//   kept.neighbours[v];  kept.removed;
//
// Method: in rounds. The first examines every edge in order (u, then v increasing); each
// later one the edges at a vertex that lost an edge in the round before (only then can an
// edge's common neighbourhood shrink), until a round removes nothing. One
// examination: the common neighbours C = N(u) ∩ N(v) by a merge, then for each w ∈ C whether
// C ⊆ N[w], by a merge; cost O(|C| (deg u + deg v + max deg w)). Memory: the adjacency lists
// (a copy, edited in place) and the round's edges, O(edges). Deterministic, so the result is too.
#pragma once

#include <lacuna/algorithm/dominated_vertices.hpp>
#include <lacuna/chain/run_control.hpp>

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// The outcome of remove_dominated_edges.
struct edge_reduction {
  /// The graph that is left: for each vertex its neighbours, sorted.
  std::vector<std::vector<std::uint32_t>> neighbours;
  /// The edges removed (smaller end first), in the order they were removed.
  std::vector<std::pair<std::uint32_t, std::uint32_t>> removed;
};

/// Removes dominated edges from the simple graph with these adjacency lists (neighbours[v]
/// sorted, without repeats or v itself, symmetric) until none is left. Throws
/// std::invalid_argument for lists that break this, computation_stopped on a stop request
/// of `control` (may be null).
inline edge_reduction remove_dominated_edges(std::vector<std::vector<std::uint32_t>> neighbours,
                                             const run_control* control = nullptr) {
  detail::check_adjacency(neighbours, "remove_dominated_edges");
  const auto n = static_cast<std::uint32_t>(neighbours.size());
  edge_reduction out;
  auto& a = neighbours;
  const auto adjacent = [&](std::uint32_t x, std::uint32_t y) { return std::binary_search(a[x].begin(), a[x].end(), y); };

  std::size_t edges = 0;
  for (std::uint32_t u = 0; u < n; ++u) edges += a[u].size();
  edges /= 2;
  detail::progress_ticker tick(control, "removing dominated edges", edges);

  std::vector<std::uint32_t> common;
  const auto dominated = [&](std::uint32_t u, std::uint32_t v) {
    common.clear();
    std::set_intersection(a[u].begin(), a[u].end(), a[v].begin(), a[v].end(), std::back_inserter(common));
    for (const std::uint32_t w : common) {
      // C ⊆ N[w]: every other common neighbour is adjacent to w (both sorted: one sweep).
      const auto& aw = a[w];
      auto it = aw.begin();
      bool all = true;
      for (const std::uint32_t x : common) {
        if (x == w) continue;
        it = std::lower_bound(it, aw.end(), x);
        if (it == aw.end() || *it != x) {
          all = false;
          break;
        }
      }
      if (all) return true;
    }
    return false;
  };
  // Rounds: every edge at a vertex that lost an edge in the last round (all, at first) is
  // examined once, in order; the round's removals mark the vertices of the next.
  std::vector<std::uint8_t> dirty(n, 1), next_dirty(n, 0);
  std::vector<std::pair<std::uint32_t, std::uint32_t>> round;
  bool first = true;
  std::uint64_t steps = 0;
  for (;;) {
    round.clear();
    for (std::uint32_t u = 0; u < n; ++u)
      for (const std::uint32_t v : a[u])
        if (u < v && (dirty[u] || dirty[v])) round.emplace_back(u, v);
    if (round.empty()) break;
    std::fill(next_dirty.begin(), next_dirty.end(), 0);
    bool removed_any = false;
    for (const auto& [u, v] : round) {
      if (first)
        tick();  // progress over the first round; later ones only look at the stop request
      else if (control && (++steps & 4095U) == 0)
        control->check();
      if (!adjacent(u, v) || !dominated(u, v)) continue;
      a[u].erase(std::lower_bound(a[u].begin(), a[u].end(), v));
      a[v].erase(std::lower_bound(a[v].begin(), a[v].end(), u));
      out.removed.emplace_back(u, v);
      next_dirty[u] = next_dirty[v] = 1;
      removed_any = true;
    }
    if (control) control->check();
    first = false;
    if (!removed_any) break;
    dirty.swap(next_dirty);
  }
  tick.finish();
  out.neighbours = std::move(neighbours);
  return out;
}

}  // namespace lacuna

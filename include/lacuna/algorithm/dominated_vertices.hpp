// lacuna/algorithm/dominated_vertices.hpp — removal of dominated vertices from a graph, a
// homotopy equivalence of its clique complex that is found on the graph alone.
//
// A vertex v is dominated by a neighbour u when its closed neighbourhood lies in u's:
// N[v] ⊆ N[u]. Then every maximal clique through v contains u, the clique complex of the
// graph collapses strongly onto that of the graph without v, and the vertex map v ↦ u
// (every other vertex fixed) is a simplicial retraction, a homotopy inverse of the inclusion
// (Barmak & Minian, "Strong homotopy types, nerves and collapses", Discrete Comput. Geom. 47,
// 2012; used on graphs for flag complexes by Boissonnat, Pritam & Pareek, "Strong collapse for
// persistence", ESA 2018). Repeating the step until no vertex is dominated leaves a core on
// which homology is computed; the clique complex of the full graph is never built.
//
//   const auto r = lacuna::remove_dominated_vertices(neighbours);  // neighbours[v]: sorted
//   r.kept(v);  r.image[v];  r.kept_count();
//
// The retraction is the composite of the one-vertex steps: image[v] is where v ends, a kept
// vertex (image[v] == v exactly for kept ones). Simplices of any bounded dimension go to
// simplices (a clique through v lies in N[v] ⊆ N[u]), so the map also acts on truncated
// clique complexes; lacuna/homology/clique_homology.hpp says which groups it preserves there.
//
// Cost: a vertex is examined when it is first met and again each time a neighbour is
// removed; one examination of v costs the sum of the degrees of v's neighbours (a mark array
// over N[v], then a count over each N[u]). Memory: the flags, degrees and images, O(vertices).
// The order is deterministic (a first-in-first-out queue from vertex 0), so the core is too.
#pragma once

#include <lacuna/chain/run_control.hpp>

#include <algorithm>
#include <cstdint>
#include <deque>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna {

namespace detail {
/// Throws std::invalid_argument unless the lists are a simple undirected graph (sorted,
/// no repeats, no loops, symmetric).
inline void check_adjacency(const std::vector<std::vector<std::uint32_t>>& a, const char* who) {
  const auto n = a.size();
  if (n > UINT32_MAX) throw std::invalid_argument(std::string(who) + ": more than 2^32 - 1 vertices");
  for (std::size_t v = 0; v < n; ++v)
    for (std::size_t i = 0; i < a[v].size(); ++i) {
      const std::uint32_t w = a[v][i];
      if (w >= n || w == v || (i > 0 && w <= a[v][i - 1]))
        throw std::invalid_argument(std::string(who) + ": the neighbours of vertex " + std::to_string(v) +
                                    " are not a sorted list of other vertices");
      if (!std::binary_search(a[w].begin(), a[w].end(), static_cast<std::uint32_t>(v)))
        throw std::invalid_argument(std::string(who) + ": vertex " + std::to_string(v) + " lists " +
                                    std::to_string(w) + " as a neighbour but not the other way round");
    }
}
}  // namespace detail

/// The outcome of remove_dominated_vertices.
struct vertex_retraction {
  /// image[v]: the kept vertex the retraction sends v to; image[v] == v for kept vertices.
  std::vector<std::uint32_t> image;
  /// The removed vertices in the order they were removed.
  std::vector<std::uint32_t> removed;

  /// True if v was kept (not removed).
  bool kept(std::uint32_t v) const { return image.at(v) == v; }
  /// The number of kept vertices.
  std::size_t kept_count() const noexcept { return image.size() - removed.size(); }
};

/// Removes dominated vertices from the simple graph with these adjacency lists (neighbours[v]
/// the neighbours of v, sorted, without repeats or v itself; the graph undirected) until none
/// is left. Throws std::invalid_argument for lists that break this, computation_stopped on a
/// stop request of `control` (may be null).
inline vertex_retraction remove_dominated_vertices(const std::vector<std::vector<std::uint32_t>>& neighbours,
                                                   const run_control* control = nullptr) {
  detail::check_adjacency(neighbours, "remove_dominated_vertices");
  const auto n = static_cast<std::uint32_t>(neighbours.size());
  std::vector<std::uint32_t> degree(n);
  for (std::uint32_t v = 0; v < n; ++v) degree[v] = static_cast<std::uint32_t>(neighbours[v].size());

  vertex_retraction r;
  r.image.resize(n);
  for (std::uint32_t v = 0; v < n; ++v) r.image[v] = v;
  std::vector<std::uint8_t> alive(n, 1), queued(n, 1);
  std::vector<std::uint32_t> mark(n, UINT32_MAX);  // mark[w] == v: w is in N[v]
  std::deque<std::uint32_t> queue;
  for (std::uint32_t v = 0; v < n; ++v) queue.push_back(v);
  detail::progress_ticker tick(control, "removing dominated vertices", n);

  // A live neighbour u of v with N[v] ⊆ N[u], or v itself when there is none.
  const auto dominator = [&](std::uint32_t v) {
    const std::uint32_t size = degree[v] + 1;  // |N[v]|
    mark[v] = v;
    for (const std::uint32_t w : neighbours[v])
      if (alive[w]) mark[w] = v;
    for (const std::uint32_t u : neighbours[v]) {
      if (!alive[u] || degree[u] + 1 < size) continue;
      std::uint32_t common = 1;  // u itself lies in N[v] and in N[u]
      for (const std::uint32_t w : neighbours[u])
        if (alive[w] && mark[w] == v) ++common;
      if (common == size) return u;
    }
    return v;
  };

  while (!queue.empty()) {
    const std::uint32_t v = queue.front();
    queue.pop_front();
    queued[v] = 0;
    tick();
    if (!alive[v]) continue;
    const std::uint32_t u = dominator(v);
    if (u == v) continue;
    alive[v] = 0;
    r.image[v] = u;
    r.removed.push_back(v);
    for (const std::uint32_t w : neighbours[v]) {
      if (!alive[w]) continue;
      --degree[w];
      if (!queued[w]) {
        queued[w] = 1;
        queue.push_back(w);
      }
    }
  }
  // v was sent to a vertex alive at the time, removed later if at all: resolve the chains
  // from the last removal back.
  for (auto it = r.removed.rbegin(); it != r.removed.rend(); ++it) {
    const std::uint32_t u = r.image[*it];
    r.image[*it] = r.image[u];
  }
  tick.finish();
  return r;
}

}  // namespace lacuna

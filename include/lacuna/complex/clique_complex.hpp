// lacuna/complex/clique_complex.hpp — the clique (flag) complex of a graph.
//
// The simplices are the sets of pairwise adjacent vertices, up to a chosen dimension. The
// cliques are enumerated by extending each clique only by common neighbours of higher vertex
// number (each clique is visited exactly once; no subset of a non-clique is ever formed), and
// only the cliques that cannot be extended within the dimension bound are handed to the
// builder as facets. Time O(sum over cliques of degree), memory as the complex.
//
// clique_counts() runs a census over the same enumeration that never lists the cliques of
// the top size and stores no simplex: the number of simplices per dimension in memory
// O(graph). lacuna/homology/clique_homology.hpp uses it
// for the clique complex it never builds.
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <algorithm>
#include <cstdint>
#include <iterator>
#include <ranges>
#include <tuple>
#include <utility>
#include <vector>

namespace lacuna {

namespace detail {
/// Visits every clique that extends `clique` by vertices of `candidates` (the common
/// neighbours of higher number), `clique` itself first, each once, up to max_size vertices:
/// visit(clique, candidates), candidates the vertices of higher number that extend it (those
/// of a clique of max_size vertices are not followed).
template <class Visit>
void extend_cliques(std::vector<std::uint32_t>& clique, const std::vector<std::uint32_t>& candidates,
                    const std::vector<std::vector<std::uint32_t>>& higher, std::size_t max_size, Visit& visit) {
  visit(std::as_const(clique), candidates);
  if (candidates.empty() || clique.size() == max_size) return;
  std::vector<std::uint32_t> next;
  for (const std::uint32_t c : candidates) {
    next.clear();
    const auto& h = higher[c];
    std::set_intersection(candidates.begin(), candidates.end(), h.begin(), h.end(), std::back_inserter(next));
    clique.push_back(c);
    extend_cliques(clique, next, higher, max_size, visit);
    clique.pop_back();
  }
}

/// Every clique of at most max_size vertices of the graph whose neighbours of higher number
/// are `higher` (sorted lists), once each, by vertex: visit(clique, candidates) as above.
template <class Visit>
void for_each_clique(const std::vector<std::vector<std::uint32_t>>& higher, std::size_t max_size, Visit&& visit) {
  std::vector<std::uint32_t> clique;
  for (std::uint32_t v = 0; v < higher.size(); ++v) {
    clique.assign(1, v);
    extend_cliques(clique, higher[v], higher, max_size, visit);
  }
}

/// Hands every clique of at most max_size vertices that nothing of higher number extends
/// within the bound to `b` as a facet (the closure then holds every clique of that size).
template <class Builder>
void add_clique_facets(const std::vector<std::vector<std::uint32_t>>& higher, std::size_t max_size, Builder& b) {
  for_each_clique(higher, max_size, [&](const std::vector<std::uint32_t>& clique, const std::vector<std::uint32_t>& up) {
    if (up.empty() || clique.size() == max_size) b.add_facet_ids(clique);
  });
}

/// The number of cliques of each size 1..max_size, and whether a clique of max_size + 1
/// vertices exists (the dimension bound cuts the complex).
struct clique_census {
  std::vector<std::size_t> counts;
  bool larger = false;
};

/// Counts below a clique of `size` vertices whose extensions are `candidates`, into `out`;
/// buffers[s] holds the candidates of the cliques of s + 1 vertices met on the way.
inline void count_extensions(const std::vector<std::vector<std::uint32_t>>& higher, const std::vector<std::uint32_t>& candidates,
                             std::size_t size, std::size_t max_size, std::vector<std::vector<std::uint32_t>>& buffers,
                             clique_census& out) {
  if (size + 1 == max_size) {  // the extensions are cliques of max_size vertices: no need to list them
    out.counts[size] += candidates.size();
    if (!out.larger)
      for (auto it = candidates.begin(); it != candidates.end() && !out.larger; ++it) {
        const auto& h = higher[*it];
        auto a = it + 1;
        auto b = h.begin();
        while (a != candidates.end() && b != h.end()) {
          if (*a < *b) ++a;
          else if (*b < *a) ++b;
          else { out.larger = true; break; }
        }
      }
    return;
  }
  auto& next = buffers[size];
  for (const std::uint32_t c : candidates) {
    next.clear();
    const auto& h = higher[c];
    std::set_intersection(candidates.begin(), candidates.end(), h.begin(), h.end(), std::back_inserter(next));
    ++out.counts[size];
    if (!next.empty()) count_extensions(higher, next, size + 1, max_size, buffers, out);
  }
}

/// The census of the cliques of at most max_size vertices (max_size >= 1) whose first vertex
/// v has v % stride == offset. Calls tick() once per first vertex.
template <class Tick>
clique_census census_of_cliques(const std::vector<std::vector<std::uint32_t>>& higher, std::size_t max_size,
                                std::size_t offset, std::size_t stride, Tick&& tick) {
  clique_census out;
  out.counts.assign(max_size, 0);
  std::vector<std::vector<std::uint32_t>> buffers(max_size);
  for (std::size_t v = offset; v < higher.size(); v += stride) {
    tick();
    ++out.counts[0];
    const auto& h = higher[v];
    if (max_size == 1)
      out.larger = out.larger || !h.empty();
    else if (!h.empty())
      count_extensions(higher, h, 1, max_size, buffers, out);
  }
  while (!out.counts.empty() && out.counts.back() == 0) out.counts.pop_back();
  return out;
}

/// Numbers the vertices of a graph in `b` (the given vertices first, then edge endpoints in
/// order of first appearance) and returns, per vertex, its neighbours of higher number,
/// sorted and without repeats. Throws invalid_complex for an edge from a vertex to itself.
template <simplex_label Label, std::ranges::input_range Edges>
std::vector<std::vector<std::uint32_t>> index_graph(const std::vector<Label>& vertices, const Edges& edges,
                                                    typename simplicial_complex<Label>::builder& b,
                                                    const char* who) {
  for (const auto& v : vertices) b.vertex(v);
  std::vector<std::pair<std::uint32_t, std::uint32_t>> e;
  std::size_t number = 0;
  for (const auto& edge : edges) {
    ++number;
    const Label& x = std::get<0>(edge);
    const Label& y = std::get<1>(edge);
    const auto u = b.vertex(x), v = b.vertex(y);
    if (u == v)
      throw invalid_complex(std::string(who) + ": edge number " + std::to_string(number) + " joins vertex '" +
                            detail::label_to_string(x) + "' to itself");
    e.emplace_back(std::min(u, v), std::max(u, v));
  }
  std::vector<std::vector<std::uint32_t>> higher(b.vertex_count());
  for (const auto& [u, v] : e) higher[u].push_back(v);
  for (auto& h : higher) {
    std::sort(h.begin(), h.end());
    h.erase(std::unique(h.begin(), h.end()), h.end());
  }
  return higher;
}
}  // namespace detail

/// The clique complex of the graph with these vertices (in this order, numbered first) and
/// edges (pairs of labels; endpoints not among `vertices` are added in order of first
/// appearance), keeping the simplices of dimension <= max_dimension.
/// Throws lacuna::invalid_complex for an edge from a vertex to itself, std::invalid_argument
/// if max_dimension < 0.
template <simplex_label Label, std::ranges::input_range Edges>
simplicial_complex<Label> clique_complex(const std::vector<Label>& vertices, const Edges& edges, int max_dimension) {
  if (max_dimension < 0) throw std::invalid_argument("clique_complex: negative dimension bound");
  typename simplicial_complex<Label>::builder b;
  const auto higher = detail::index_graph(vertices, edges, b, "clique_complex");
  detail::add_clique_facets(higher, static_cast<std::size_t>(max_dimension) + 1, b);
  return std::move(b).finalize();
}

/// The clique complex of the graph with these edges (vertices in order of first appearance).
template <simplex_label Label>
simplicial_complex<Label> clique_complex(const std::vector<std::pair<Label, Label>>& edges, int max_dimension) {
  return clique_complex(std::vector<Label>{}, edges, max_dimension);
}

/// The number of k-simplices of clique_complex(vertices, edges, max_dimension), k = 0..top
/// (the vector is as long as the complex has dimensions), counted without building it:
/// memory O(vertices + edges). Errors as for clique_complex.
template <simplex_label Label, std::ranges::input_range Edges>
std::vector<std::size_t> clique_counts(const std::vector<Label>& vertices, const Edges& edges, int max_dimension) {
  if (max_dimension < 0) throw std::invalid_argument("clique_counts: negative dimension bound");
  typename simplicial_complex<Label>::builder b;
  const auto higher = detail::index_graph(vertices, edges, b, "clique_counts");
  return detail::census_of_cliques(higher, static_cast<std::size_t>(max_dimension) + 1, 0, 1, [] {}).counts;
}

}  // namespace lacuna

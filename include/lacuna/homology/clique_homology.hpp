// lacuna/homology/clique_homology.hpp — homology of the clique complex of a graph, computed
// without building that complex: on the clique complex of the graph's core after the removal
// of dominated vertices (lacuna/algorithm/dominated_vertices.hpp), with the top dimension of
// a truncated complex from counts.
//
//   auto r = lacuna::clique_homology<lacuna::integer>(vertices, edges, 3);
//   r.groups[1].rank;  r.core.cell_count(2);  r.cell_counts;  r.coordinates(cycle);
//
// What is preserved. Let K be clique_complex(vertices, edges, d) and K' the clique complex of
// the core, also up to d. The removal is a strong collapse of the whole clique complex
// (Barmak & Minian 2012), so the inclusion K' ⊂ K and the vertex retraction r: K → K' are
// inverse isomorphisms on H_k for k < d: the homotopy between i∘r and the identity runs
// through simplices one dimension up, which the d-skeleton has below d. In dimension d the
// skeleton's group is the group Z_d of d-cycles, free, and its rank follows from the Euler
// characteristic (Euler–Poincaré: Σ (-1)^k n_k = Σ (-1)^k rank H_k over any field, ranks of
// free parts over a domain):
//   rank H_d(K) = (-1)^d (χ(K) - Σ_{k<d} (-1)^k rank H_k(K)),  χ(K) from counted cliques.
// When the graph has no clique of d + 2 vertices the bound does not bite: K is the whole
// clique complex, and every group, the top one included, comes from K' with torsion and
// generators.
//
// clique_reduction::dominated_edges first removes dominated edges (Boissonnat & Pritam 2020;
// lacuna/algorithm/dominated_edges.hpp), then dominated vertices. The clique complex of the
// graph that is left is a subcomplex of the whole one onto which the whole one collapses, so
// the inclusion is again an isomorphism below the top and generators are again cycles of K;
// but there is no simplicial retraction, so retract() and coordinates() are not offered.
//
// Generators are chains of `core`, whose simplices are cliques of the input graph: cycles of
// K as they stand. The top group of a truncated complex has none (`top_from_counts`); raise
// the bound by one to get them. coordinates() takes a cycle of K given by vertex labels,
// sends it through r and reads it in the basis of the core's generators.
//
// Cost: the cliques of K are enumerated once to count them (memory O(graph)); the core's
// complex is built and reduced as by homology(). With clique_reduction::none the core is
// the whole graph and this is homology(clique_complex(...)) with the top from counts.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/algorithm/dominated_edges.hpp>
#include <lacuna/algorithm/dominated_vertices.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstdint>
#include <exception>
#include <stdexcept>
#include <string>
#include <thread>
#include <utility>
#include <vector>

namespace lacuna {

/// What is removed from the graph before its clique complex is built.
enum class clique_reduction {
  none,                ///< nothing: the clique complex of the whole graph
  dominated_vertices,  ///< dominated vertices, until none is left (the default)
  /// dominated edges until none is left, then dominated vertices: a much smaller core on
  /// graphs of sampled spaces, but no retraction (retract() and coordinates() throw when an
  /// edge went)
  dominated_edges,
};

/// Options of clique_homology.
struct clique_homology_options {
  homology_options homology{};  ///< generators, reduced, keep_basis, threads, control
  /// Which graph reduction runs before the clique complex is built.
  clique_reduction reduction = clique_reduction::dominated_vertices;
  sparse_elimination algorithm{};  ///< for the core's complex
};

/// What clique_homology computes: the groups of the clique complex of a graph, and the smaller complex (the core) they were computed on.
template <euclidean_domain R, simplex_label Label>
struct clique_homology_result {
  /// H_0..H_top of clique_complex(vertices, edges, max_dimension), top its dimension.
  /// Generators (on request) are chains of `core`.
  std::vector<homology_group<R>> groups;
  /// True when the top group was found from the counts: it is free, and has no generators.
  bool top_from_counts = false;
  /// The clique complex, up to max_dimension, of the graph that is left.
  simplicial_complex<Label> core;
  /// The homology of `core`; the same groups as `groups` below the top dimension.
  homology_result<R> core_homology;
  /// The number of k-simplices of the whole clique complex, k = 0..top (counted, not stored).
  std::vector<std::size_t> cell_counts;
  /// The vertices of the input graph in their numbering (given vertices, then endpoints in
  /// order of first appearance), as a complex of vertices: input.label(v), input.vertex(l).
  simplicial_complex<Label> input;
  /// The retraction onto the core, by input vertex (of the graph left by the removal of
  /// edges, when there was one).
  vertex_retraction retraction;
  /// The number of edges removed (clique_reduction::dominated_edges).
  std::size_t removed_edges = 0;
  /// The input graph: for each input vertex its neighbours of higher number, sorted.
  std::vector<std::vector<std::uint32_t>> adjacency;

  /// The top dimension of `groups`.
  int top_dimension() const { return static_cast<int>(groups.size()) - 1; }
  /// The ranks of the groups, by dimension.
  std::vector<std::size_t> betti_numbers() const {
    std::vector<std::size_t> b;
    for (const auto& g : groups) b.push_back(g.rank);
    return b;
  }

  /// r_#: the image in `core` of a k-chain of the clique complex, each simplex given by its
  /// vertex labels in the order of its orientation. Simplices that r flattens vanish.
  /// Throws std::invalid_argument for an unknown label, a repeated vertex, a simplex of the
  /// wrong size or one that is not a clique.
  chain<R> retract(int k, const std::vector<std::pair<std::vector<Label>, R>>& simplices) const {
    if (k < 0) throw std::invalid_argument("clique_homology: a chain of negative dimension");
    if (removed_edges > 0)
      throw std::logic_error("clique_homology: dominated edges were removed, so there is no retraction onto the core");
    chain<R> out{k, {}};
    std::vector<std::uint32_t> ids, sorted;
    for (const auto& [labels, coefficient] : simplices) {
      if (labels.size() != static_cast<std::size_t>(k) + 1)
        throw std::invalid_argument("clique_homology: a " + std::to_string(k) + "-chain names a simplex of " +
                                    std::to_string(labels.size()) + " vertices");
      ids.clear();
      for (const auto& l : labels) {
        const auto v = input.vertex(l);
        if (!v) throw std::invalid_argument("clique_homology: no vertex '" + detail::label_to_string(l) + "'");
        ids.push_back(*v);
      }
      sorted = ids;
      std::sort(sorted.begin(), sorted.end());
      if (std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end())
        throw std::invalid_argument("clique_homology: a vertex repeated within a simplex");
      for (std::size_t i = 0; i < sorted.size(); ++i)
        for (std::size_t j = i + 1; j < sorted.size(); ++j)
          if (!std::binary_search(adjacency[sorted[i]].begin(), adjacency[sorted[i]].end(), sorted[j]))
            throw std::invalid_argument("clique_homology: a chain names a simplex that is not a clique of the graph");
      // The image, as core vertex ids in the order given.
      for (auto& v : ids) v = *core.vertex(input.label(retraction.image[v]));
      sorted = ids;
      std::sort(sorted.begin(), sorted.end());
      if (std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end()) continue;  // flattened
      const auto at = core.find(sorted);
      if (!at) throw std::logic_error("clique_homology: the retraction sent a clique out of the core");
      std::size_t inversions = 0;
      for (std::size_t i = 0; i < ids.size(); ++i)
        for (std::size_t j = i + 1; j < ids.size(); ++j) inversions += ids[i] > ids[j] ? 1 : 0;
      out.terms.push_back({*at, inversions % 2 == 0 ? coefficient : R(-coefficient)});
    }
    out.normalize_terms();
    return out;
  }

  /// The class of a k-cycle of the clique complex (given as for retract) in the basis of
  /// generators, as homology_result::coordinates. Needs keep_basis or generators. Throws
  /// std::invalid_argument when the image in the core is not a cycle (the chain is not
  /// checked on the complex that is never built), and for the top dimension when
  /// top_from_counts.
  std::vector<R> coordinates(int k, const std::vector<std::pair<std::vector<Label>, R>>& cycle) const {
    if (k < 0 || k > top_dimension())
      throw std::invalid_argument("clique_homology: the complex has no simplices of dimension " + std::to_string(k));
    if (top_from_counts && k == top_dimension())
      throw std::invalid_argument("clique_homology: the top group was found from counts; it has no basis");
    const chain<R> image = retract(k, cycle);
    if (k > lacuna::top_dimension(core)) {
      if (!image.terms.empty()) throw std::logic_error("clique_homology: a chain retracts above the core");
      return {};
    }
    return core_homology.coordinates(core, image);
  }
};

/// The homology over R of clique_complex(vertices, edges, max_dimension) without building it
/// (see the head of this file). Errors as for clique_complex; coefficient_overflow and
/// computation_stopped as for homology(). Progress phases: "counting cliques", "removing
/// dominated edges" (with that reduction), "removing dominated vertices", "building the
/// core", then those of homology().
template <euclidean_domain R, simplex_label Label, std::ranges::input_range Edges>
clique_homology_result<R, Label> clique_homology(const std::vector<Label>& vertices, const Edges& edges,
                                                 int max_dimension, const clique_homology_options& options = {},
                                                 const R& ring_one = one<R>()) {
  if (max_dimension < 0) throw std::invalid_argument("clique_homology: negative dimension bound");
  const run_control* control = &options.homology.control;
  clique_homology_result<R, Label> out;
  typename simplicial_complex<Label>::builder b;
  out.adjacency = detail::index_graph(vertices, edges, b, "clique_homology");
  const auto& higher = out.adjacency;
  const auto n = static_cast<std::uint32_t>(higher.size());
  const auto max_size = static_cast<std::size_t>(max_dimension) + 1;
  bool truncated = false;  // the bound bites: some clique has more than max_size vertices
  {
    // With two threads, the cliques are split by the parity of their first vertex; the
    // second thread only looks at the stop request (progress comes from this thread).
    const std::size_t stride = options.homology.threads >= 2 ? 2 : 1;
    detail::progress_ticker tick(control, "counting cliques", (n + stride - 1) / stride);
    detail::clique_census other;
    std::exception_ptr failed;
    std::thread helper;
    if (stride == 2)
      helper = std::thread([&] {
        try {
          std::uint32_t steps = 0;
          other = detail::census_of_cliques(higher, max_size, 1, 2, [&] {
            if ((++steps & 1023U) == 0) control->check();
          });
        } catch (...) {
          failed = std::current_exception();
        }
      });
    detail::clique_census mine;
    try {
      mine = detail::census_of_cliques(higher, max_size, 0, stride, [&] { tick(); });
    } catch (...) {
      if (helper.joinable()) helper.join();
      throw;
    }
    if (helper.joinable()) helper.join();
    if (failed) std::rethrow_exception(failed);
    out.cell_counts = std::move(mine.counts);
    if (out.cell_counts.size() < other.counts.size()) out.cell_counts.resize(other.counts.size(), 0);
    for (std::size_t k = 0; k < other.counts.size(); ++k) out.cell_counts[k] += other.counts[k];
    truncated = mine.larger || other.larger;
    tick.finish();
  }
  out.input = std::move(b).finalize();

  // The graph the core is taken from: the input, or what the removal of edges leaves.
  std::vector<std::vector<std::uint32_t>> reduced_higher;
  if (options.reduction != clique_reduction::none) {
    std::vector<std::vector<std::uint32_t>> neighbours(n);
    for (std::uint32_t u = 0; u < n; ++u)
      for (const std::uint32_t v : higher[u]) {
        neighbours[u].push_back(v);
        neighbours[v].push_back(u);
      }
    for (auto& a : neighbours) std::sort(a.begin(), a.end());
    if (options.reduction == clique_reduction::dominated_edges) {
      auto e = remove_dominated_edges(std::move(neighbours), control);
      out.removed_edges = e.removed.size();
      neighbours = std::move(e.neighbours);
      reduced_higher.resize(n);
      for (std::uint32_t u = 0; u < n; ++u)
        for (const std::uint32_t v : neighbours[u])
          if (v > u) reduced_higher[u].push_back(v);
    }
    out.retraction = remove_dominated_vertices(neighbours, control);
  } else {
    out.retraction.image.resize(n);
    for (std::uint32_t v = 0; v < n; ++v) out.retraction.image[v] = v;
  }
  const auto& graph = out.removed_edges > 0 ? reduced_higher : higher;

  {
    detail::progress_ticker tick(control, "building the core", n);
    typename simplicial_complex<Label>::builder cb;
    std::vector<std::uint32_t> core_id(n, UINT32_MAX);
    for (std::uint32_t v = 0; v < n; ++v)
      if (out.retraction.image[v] == v) core_id[v] = cb.vertex(out.input.label(v));
    std::vector<std::vector<std::uint32_t>> core_higher(cb.vertex_count());
    for (std::uint32_t u = 0; u < n; ++u) {
      if (core_id[u] == UINT32_MAX) continue;
      auto& h = core_higher[core_id[u]];
      for (const std::uint32_t v : graph[u])
        if (core_id[v] != UINT32_MAX) h.push_back(core_id[v]);  // increasing: ids keep the order
      tick();
    }
    detail::add_clique_facets(core_higher, max_size, cb);
    out.core = std::move(cb).finalize();
  }
  out.core_homology = homology<R>(out.core, options.homology, options.algorithm, ring_one);

  // Assemble: the groups of the core, zero up to the complex's top, the top from counts
  // when the bound bites.
  const int top = static_cast<int>(out.cell_counts.size()) - 1;
  if (top < 0) {
    out.groups = out.core_homology.groups;
    return out;
  }
  for (int k = 0; k <= top; ++k) {
    if (k < static_cast<int>(out.core_homology.groups.size()) && !(truncated && k == top)) {
      out.groups.push_back(out.core_homology.groups[static_cast<std::size_t>(k)]);
      continue;
    }
    homology_group<R> g;
    g.dimension = k;
    out.groups.push_back(std::move(g));
  }
  if (truncated) {
    // Σ (-1)^k n_k = Σ (-1)^k rank H_k (with reduced homology the left side loses the
    // empty simplex's 1), as (-1)^top rank = A - B with A and B sums of naturals, checked.
    std::uint64_t A = 0, B = options.homology.reduced ? 1 : 0;
    const auto add = [](std::uint64_t& s, std::uint64_t x) {
      if (checked_add(s, x, s)) throw std::overflow_error("clique_homology: the Euler characteristic passes 64 bits");
    };
    for (int k = 0; k <= top; ++k) add(k % 2 == 0 ? A : B, out.cell_counts[static_cast<std::size_t>(k)]);
    for (int k = 0; k < top; ++k) add(k % 2 == 0 ? B : A, out.groups[static_cast<std::size_t>(k)].rank);
    const bool even = top % 2 == 0;
    if (even ? A < B : B < A) throw std::logic_error("clique_homology: a negative rank from the Euler characteristic");
    const std::uint64_t rank = even ? A - B : B - A;
    out.groups.back().rank = static_cast<std::size_t>(rank);
    out.top_from_counts = true;
  }
  return out;
}

/// The same, for the graph with these edges (vertices in order of first appearance).
template <euclidean_domain R, simplex_label Label>
clique_homology_result<R, Label> clique_homology(const std::vector<std::pair<Label, Label>>& edges, int max_dimension,
                                                 const clique_homology_options& options = {},
                                                 const R& ring_one = one<R>()) {
  return clique_homology<R>(std::vector<Label>{}, edges, max_dimension, options, ring_one);
}

}  // namespace lacuna

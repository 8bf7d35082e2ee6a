// lacuna/persistence/diagram_distance.hpp — distances between persistence diagrams.
//
//   bottleneck_matching(a, b)             -> diagram_matching   (cost: the bottleneck distance)
//   bottleneck_distance(a, b)             -> double
//   wasserstein_matching(a, b [, options]) -> diagram_matching  (cost: the p-Wasserstein distance)
//   wasserstein_distance(a, b [, options]) -> double
//
// A diagram is a sequence of (birth, death) pairs of doubles; a death of +infinity (or
// -infinity, for diagrams of a superlevel filtration) marks an essential class, one that never
// dies. Points are compared in the L-infinity norm, d((b, d), (b', d')) = max(|b - b'|, |d - d'|);
// a finite point may be matched to the diagonal at the cost of its distance to it, |d - b| / 2;
// an essential point only to an essential point with the same infinite death, at the cost
// |b - b'|. The bottleneck distance is the least, over matchings, of the largest cost; the
// p-Wasserstein distance the least of (sum of cost^p)^(1/p) (Cohen-Steiner, Edelsbrunner, Harer
// & Mileyko 2010, with the L-infinity ground distance). Diagrams with different numbers of
// essential classes (of either sign) are at distance +infinity.
//
// Methods. Both problems are put on the usual bipartite graph (Efrat, Itai & Katz 2001; Kerber,
// Morozov & Nigmetov 2017): the points of a and the diagonal projections of the points of b on
// one side, the points of b and the projections of a on the other, any two projections at cost 0.
//   * Bottleneck: the answer is one of the costs of the graph's edges. They are sorted, and a
//     binary search finds the least cost t for which the edges of cost <= t have a perfect
//     matching, decided by Hopcroft & Karp (1973). The result is exact: the least largest cost
//     over all matchings, where each cost is the double computed by the formulas above.
//     Time O(n^2 log n) for sorting the candidates and O(n^2.5 log n) for the matchings,
//     memory O(n^2) for the candidates (n = the number of finite points of a and b together).
//     The essential points are matched in sorted order of birth, which is optimal on a line.
//   * Wasserstein: the assignment problem on that graph, solved by the Hungarian method (Kuhn
//     1955, Munkres 1957) in its shortest-augmenting-path form with potentials: time O(n^3),
//     memory O(n). Costs are scaled by the largest one before they are raised to the power p,
//     so huge values do not overflow. The matching is optimal; its cost is a sum of doubles.
//
// Both throw std::invalid_argument for a NaN anywhere, an infinite birth, or p < 1.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <span>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// A matching between two persistence diagrams and its cost (the distance it attains).
struct diagram_matching {
  /// The partner of a point matched to the diagonal.
  static constexpr std::size_t diagonal = std::numeric_limits<std::size_t>::max();
  /// The bottleneck or p-Wasserstein cost of the matching (+infinity when the diagrams have
  /// different numbers of essential classes).
  double cost = 0;
  /// For each point of a, the index of its partner in b, or `diagonal`. (When the cost is
  /// infinite, the essential points left over are also marked `diagonal`.)
  std::vector<std::size_t> partner_of_a;
  /// For each point of b, the index of its partner in a, or `diagonal`.
  std::vector<std::size_t> partner_of_b;
};

/// Options of the Wasserstein distance: `wasserstein_options{.p = 1}`.
struct wasserstein_options {
  /// The exponent, p >= 1.
  double p = 2;
};

namespace diagram_distance_detail {

using point = std::pair<double, double>;
inline constexpr double infinity = std::numeric_limits<double>::infinity();

/// The L-infinity distance between two finite points.
inline double point_cost(const point& x, const point& y) {
  return std::max(std::abs(x.first - y.first), std::abs(x.second - y.second));
}
/// The L-infinity distance to the diagonal, computed without overflow when it is finite.
inline double diagonal_cost(const point& x) {
  const double d = std::abs(x.second - x.first) / 2;
  return std::isfinite(d) ? d : std::abs(x.second / 2 - x.first / 2);
}

inline void check(std::span<const point> d, const char* which) {
  for (std::size_t i = 0; i < d.size(); ++i)
    if (std::isnan(d[i].first) || std::isnan(d[i].second) || !std::isfinite(d[i].first))
      throw std::invalid_argument(std::string("diagram distance: point ") + std::to_string(i) + " of diagram " + which +
                                  " has a NaN or an infinite birth");
}

/// The finite points of both diagrams, and the essential ones matched in sorted order.
struct split {
  std::vector<std::size_t> a, b;  // indices of the finite points
  double essential_bottleneck = 0;
  double essential_sum = 0;  // sum of cost^p, scaled by `scale`
  bool infinite = false;
  std::vector<std::pair<std::size_t, std::size_t>> essential_pairs;
};

inline split separate(std::span<const point> a, std::span<const point> b) {
  split s;
  std::vector<std::size_t> ea[2], eb[2];  // essential points dying at +inf, -inf
  for (std::size_t i = 0; i < a.size(); ++i) {
    if (std::isfinite(a[i].second))
      s.a.push_back(i);
    else
      ea[a[i].second < 0].push_back(i);
  }
  for (std::size_t j = 0; j < b.size(); ++j) {
    if (std::isfinite(b[j].second))
      s.b.push_back(j);
    else
      eb[b[j].second < 0].push_back(j);
  }
  for (int sign = 0; sign < 2; ++sign) {
    auto by_birth = [](std::span<const point> d) {
      return [d](std::size_t x, std::size_t y) { return d[x].first < d[y].first; };
    };
    std::sort(ea[sign].begin(), ea[sign].end(), by_birth(a));
    std::sort(eb[sign].begin(), eb[sign].end(), by_birth(b));
    if (ea[sign].size() != eb[sign].size()) {
      s.infinite = true;
      continue;
    }
    for (std::size_t k = 0; k < ea[sign].size(); ++k) {
      s.essential_pairs.emplace_back(ea[sign][k], eb[sign][k]);
      s.essential_bottleneck =
          std::max(s.essential_bottleneck, std::abs(a[ea[sign][k]].first - b[eb[sign][k]].first));
    }
  }
  return s;
}

/// The cost of left vertex i against right vertex j in the bipartite graph of n points of a
/// and m points of b: left 0..n-1 the points of a, n..n+m-1 the projections of b; right
/// 0..m-1 the points of b, m..m+n-1 the projections of a. A point meets only its own
/// projection (+infinity elsewhere), and projections meet each other at cost 0.
class graph {
 public:
  graph(std::span<const point> a, std::span<const point> b, const split& s) : n_(s.a.size()), m_(s.b.size()) {
    for (auto i : s.a) a_.push_back(a[i]);
    for (auto j : s.b) b_.push_back(b[j]);
    for (const auto& x : a_) da_.push_back(diagonal_cost(x));
    for (const auto& y : b_) db_.push_back(diagonal_cost(y));
  }
  std::size_t size() const noexcept { return n_ + m_; }
  std::size_t n() const noexcept { return n_; }
  std::size_t m() const noexcept { return m_; }
  double cost(std::size_t i, std::size_t j) const {
    if (i < n_) {
      if (j < m_) return point_cost(a_[i], b_[j]);
      return j - m_ == i ? da_[i] : infinity;
    }
    if (j < m_) return i - n_ == j ? db_[j] : infinity;
    return 0;
  }
  /// Every finite cost of the graph, sorted, without repeats.
  std::vector<double> candidates() const {
    std::vector<double> c;
    c.reserve(n_ * m_ + n_ + m_ + 1);
    c.push_back(0);
    for (std::size_t i = 0; i < n_; ++i)
      for (std::size_t j = 0; j < m_; ++j) c.push_back(point_cost(a_[i], b_[j]));
    c.insert(c.end(), da_.begin(), da_.end());
    c.insert(c.end(), db_.begin(), db_.end());
    std::sort(c.begin(), c.end());
    c.erase(std::unique(c.begin(), c.end()), c.end());
    while (!std::isfinite(c.back())) c.pop_back();  // an overflowing difference: never the answer
    return c;
  }

 private:
  std::size_t n_, m_;
  std::vector<point> a_, b_;
  std::vector<double> da_, db_;
};

/// Hopcroft & Karp (1973): a maximum matching of the edges of cost <= t, with neighbours
/// found by scanning (no adjacency lists: the graph is dense). Returns the right partner of
/// each left vertex (or npos) and whether the matching is perfect.
inline bool perfect_matching(const graph& g, double t, std::vector<std::size_t>& match_left) {
  constexpr std::size_t none = std::numeric_limits<std::size_t>::max();
  const std::size_t v = g.size();
  match_left.assign(v, none);
  std::vector<std::size_t> match_right(v, none), layer(v), next(v), stack;
  std::vector<std::size_t> queue;
  std::size_t matched = 0;
  for (;;) {
    // BFS from the free left vertices, in layers
    constexpr std::size_t unreached = std::numeric_limits<std::size_t>::max();
    queue.clear();
    for (std::size_t i = 0; i < v; ++i) {
      layer[i] = match_left[i] == none ? 0 : unreached;
      if (layer[i] == 0) queue.push_back(i);
    }
    bool found = false;
    for (std::size_t q = 0; q < queue.size(); ++q) {
      const std::size_t i = queue[q];
      for (std::size_t j = 0; j < v; ++j) {
        if (g.cost(i, j) > t) continue;
        const std::size_t k = match_right[j];
        if (k == none)
          found = true;
        else if (layer[k] == unreached) {
          layer[k] = layer[i] + 1;
          queue.push_back(k);
        }
      }
    }
    if (!found) break;
    // DFS along the layers from each free left vertex (iterative: next[i] is where vertex i's
    // scan of the right side resumes)
    std::fill(next.begin(), next.end(), 0);
    for (std::size_t root = 0; root < v; ++root) {
      if (match_left[root] != none) continue;
      stack.assign(1, root);
      while (!stack.empty()) {
        const std::size_t i = stack.back();
        bool advanced = false;
        for (std::size_t& j = next[i]; j < v; ++j) {
          if (g.cost(i, j) > t) continue;
          const std::size_t k = match_right[j];
          if (k == none) {
            // augment along the stack: each vertex on it takes the right vertex it scans now
            for (std::size_t s = stack.size(); s-- > 0;) {
              const std::size_t u = stack[s];
              const std::size_t w = next[u];
              match_left[u] = w;
              match_right[w] = u;
            }
            ++matched;
            stack.clear();
            advanced = true;
            break;
          }
          if (layer[k] == layer[i] + 1) {
            stack.push_back(k);
            advanced = true;
            break;
          }
        }
        if (!advanced) {
          layer[i] = unreached;  // a dead end for this phase
          stack.pop_back();
          if (!stack.empty()) ++next[stack.back()];
        }
      }
    }
  }
  return matched == v;
}

/// Fills the partner arrays from a matching of the graph (left -> right).
inline void record(const graph& g, const split& s, const std::vector<std::size_t>& match_left, diagram_matching& out,
                   std::size_t na, std::size_t nb) {
  out.partner_of_a.assign(na, diagram_matching::diagonal);
  out.partner_of_b.assign(nb, diagram_matching::diagonal);
  for (std::size_t i = 0; i < g.n(); ++i)
    if (match_left[i] < g.m()) {
      out.partner_of_a[s.a[i]] = s.b[match_left[i]];
      out.partner_of_b[s.b[match_left[i]]] = s.a[i];
    }
  for (const auto& [i, j] : s.essential_pairs) {
    out.partner_of_a[i] = j;
    out.partner_of_b[j] = i;
  }
}

}  // namespace diagram_distance_detail

/// The bottleneck distance between diagrams a and b and a matching that attains it.
/// Exact (see the top of this header). Throws std::invalid_argument for NaN or an infinite birth.
inline diagram_matching bottleneck_matching(std::span<const std::pair<double, double>> a,
                                            std::span<const std::pair<double, double>> b) {
  namespace d = diagram_distance_detail;
  d::check(a, "a");
  d::check(b, "b");
  const auto s = d::separate(a, b);
  const d::graph g(a, b, s);
  const auto candidates = g.candidates();
  // the least candidate with a perfect matching; the largest always has one (every point
  // against its own projection, the projections against each other)
  std::size_t lo = 0, hi = candidates.size() - 1;
  std::vector<std::size_t> match;
  while (lo < hi) {
    const std::size_t mid = lo + (hi - lo) / 2;
    if (d::perfect_matching(g, candidates[mid], match))
      hi = mid;
    else
      lo = mid + 1;
  }
  d::perfect_matching(g, candidates[lo], match);
  diagram_matching out;
  d::record(g, s, match, out, a.size(), b.size());
  out.cost = s.infinite ? d::infinity : std::max(candidates[lo], s.essential_bottleneck);
  return out;
}

/// The bottleneck distance between diagrams a and b (see bottleneck_matching).
inline double bottleneck_distance(std::span<const std::pair<double, double>> a,
                                  std::span<const std::pair<double, double>> b) {
  return bottleneck_matching(a, b).cost;
}

/// The p-Wasserstein distance between diagrams a and b and a matching that attains it
/// (Hungarian method; see the top of this header). Throws std::invalid_argument for NaN, an
/// infinite birth, or p < 1 (p = +infinity is the bottleneck distance: use that).
inline diagram_matching wasserstein_matching(std::span<const std::pair<double, double>> a,
                                             std::span<const std::pair<double, double>> b,
                                             const wasserstein_options& options = {}) {
  namespace d = diagram_distance_detail;
  const double p = options.p;
  if (!(p >= 1) || !std::isfinite(p))
    throw std::invalid_argument("wasserstein_distance: p must be a finite number >= 1 (use bottleneck_distance for p = infinity)");
  d::check(a, "a");
  d::check(b, "b");
  const auto s = d::separate(a, b);
  const d::graph g(a, b, s);
  const std::size_t n = g.size();
  // scale: the largest finite cost of the graph, so that every cost / scale is at most 1 (an
  // edge between two points can be +infinity when a difference overflows; the Hungarian
  // method then never takes it, as the diagonal always offers finite costs)
  double scale = 0;
  const auto widen = [&scale](double c) {
    if (std::isfinite(c)) scale = std::max(scale, c);
  };
  for (std::size_t i = 0; i < g.n(); ++i) {
    widen(g.cost(i, g.m() + i));
    for (std::size_t j = 0; j < g.m(); ++j) widen(g.cost(i, j));
  }
  for (std::size_t j = 0; j < g.m(); ++j) widen(g.cost(g.n() + j, j));
  double essential = 0;  // the largest cost of an essential pair
  for (const auto& [i, j] : s.essential_pairs) essential = std::max(essential, std::abs(a[i].first - b[j].first));
  const bool overflow = !std::isfinite(essential);  // beyond the doubles: so is the distance
  if (!overflow) scale = std::max(scale, essential);
  const auto weight = [&](std::size_t i, std::size_t j) {
    // a point against any projection costs its own distance to the diagonal: the projections
    // are interchangeable, since they meet each other at cost 0
    if (i < g.n() && j >= g.m()) return std::pow(g.cost(i, g.m() + i) / scale, p);
    if (i >= g.n() && j < g.m()) return std::pow(g.cost(g.n() + j, j) / scale, p);
    if (i >= g.n()) return 0.0;
    return std::pow(g.cost(i, j) / scale, p);
  };
  // Hungarian method, shortest augmenting paths with potentials u (rows) and v (columns),
  // 1-based with column 0 as the root of each search
  std::vector<double> u(n + 1, 0), v(n + 1, 0), min_to(n + 1);
  std::vector<std::size_t> row_of(n + 1, 0), way(n + 1, 0);
  std::vector<char> used(n + 1);
  if (scale > 0 && !overflow)
    for (std::size_t i = 1; i <= n; ++i) {
      row_of[0] = i;
      std::size_t j0 = 0;
      std::fill(min_to.begin(), min_to.end(), d::infinity);
      std::fill(used.begin(), used.end(), 0);
      do {
        used[j0] = 1;
        const std::size_t i0 = row_of[j0];
        double delta = d::infinity;
        std::size_t j1 = 0;
        for (std::size_t j = 1; j <= n; ++j) {
          if (used[j]) continue;
          const double cur = weight(i0 - 1, j - 1) - u[i0] - v[j];
          if (cur < min_to[j]) {
            min_to[j] = cur;
            way[j] = j0;
          }
          if (min_to[j] < delta) {
            delta = min_to[j];
            j1 = j;
          }
        }
        for (std::size_t j = 0; j <= n; ++j) {
          if (used[j]) {
            u[row_of[j]] += delta;
            v[j] -= delta;
          } else {
            min_to[j] -= delta;
          }
        }
        j0 = j1;
      } while (row_of[j0] != 0);
      do {
        const std::size_t j1 = way[j0];
        row_of[j0] = row_of[j1];
        j0 = j1;
      } while (j0 != 0);
    }
  std::vector<std::size_t> match(n, std::numeric_limits<std::size_t>::max());
  if (scale > 0 && !overflow)
    for (std::size_t j = 1; j <= n; ++j) match[row_of[j] - 1] = j - 1;
  else
    for (std::size_t i = 0; i < n; ++i) match[i] = i < g.n() ? g.m() + i : i - g.n();  // all to the diagonal
  diagram_matching out;
  d::record(g, s, match, out, a.size(), b.size());
  if (s.infinite || overflow) {
    out.cost = d::infinity;
    return out;
  }
  if (scale == 0) {
    out.cost = 0;
    return out;
  }
  // the cost of the matching found, summed in one order (finite part, then essential part)
  double sum = 0;
  for (std::size_t i = 0; i < n; ++i) sum += weight(i, match[i]);
  for (const auto& [i, j] : s.essential_pairs) sum += std::pow(std::abs(a[i].first - b[j].first) / scale, p);
  out.cost = scale * std::pow(sum, 1 / p);
  return out;
}

/// The p-Wasserstein distance between diagrams a and b (see wasserstein_matching).
inline double wasserstein_distance(std::span<const std::pair<double, double>> a,
                                   std::span<const std::pair<double, double>> b,
                                   const wasserstein_options& options = {}) {
  return wasserstein_matching(a, b, options).cost;
}

}  // namespace lacuna

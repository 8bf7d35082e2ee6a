// lacuna/persistence/implicit_rips.hpp — persistence of the Vietoris–Rips filtration of a
// point cloud or a distance matrix without building the complex.
//
//   auto m = lacuna::rips_metric::from_points(coordinates, 3);     // or ::from_distances(n, matrix)
//   auto r = lacuna::implicit_rips_persistence(m, {.max_dimension = 2});              // Z/2
//   auto q = lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(m, {.max_dimension = 1});
//   lacuna::implicit_rips_vertices(m.size(), 2, r[1].pairs[0].death_cell)  // {0, 4, 7}
//
// The filtration is that of lacuna::rips_filtration (rips_filtration.hpp): a simplex enters at
// the largest distance between two of its points (the same doubles: euclidean_distance), a
// point at 0, and only edges no longer than the threshold exist. Nothing of it is stored:
//
// Simplices are numbered by the combinatorial number system (Knuth, TAOCP 4A, 7.2.1.3): the
// k-simplex with vertices v_0 > v_1 > ... > v_k has the number  sum_i C(v_i, k + 1 - i), a
// bijection between the k-subsets of {0..n-1} and 0..C(n, k+1)-1. Its facets and cofacets are
// computed from the number and a binomial table when they are needed. Numbers must fit in 63
// bits (the binomial C(n, D + 2) for diagrams up to D); beyond that the call is refused
// (std::length_error), never wrapped.
//
// The total order of the filtration (a valid filtration: a face never after its coface,
// since its value is at most the coface's and its dimension smaller):
//     by value, then by dimension, then by the combinatorial number DEcreasing.
// The last rule is a choice: cofacets are enumerated with their numbers decreasing, so the
// oldest cofacet of equal value is the first one met and the search for it stops there.
// lacuna::persistence on the explicit rips_filtration breaks ties by its own cell indices;
// the pairs' values do not depend on how ties are broken (the number of k-classes born at a
// value a and dying at b is a rank of the persistence module of the values, and the pairs of
// persistence zero at a are what is left of the k-simplices entering at a, whose number of
// positive and negative ones are dimensions of cycle and boundary spaces), so the two routes
// give the same (birth, death) values, pair for pair after sorting. The tests check it.
//
// The computation (all of it exact: values are the input doubles compared as such, the
// algebra is over the field R):
//   H_0: Kruskal's union-find over the edges in filtration order; an edge joining two
//        components kills the younger one (whose oldest vertex is younger: all vertices enter
//        at 0, so the one with the smaller number), an essential class per component left.
//        Diagram 0 alone of points or a full matrix: over the edges of the minimum spanning
//        forest only, found by Prim's algorithm (O(n^2) time, O(n) memory; see spanning_edges
//        for why the pairs and cells are those of the pass over every edge).
//   H_k, k = 1..D: the coboundary matrix of dimension k reduced with clearing (de Silva,
//        Morozov & Vejdemo-Johansson 2011, "Dualities in persistent (co)homology"; Chen &
//        Kerber 2011): columns are the k-simplices in reverse filtration order, the pivot of
//        a column is its OLDEST cofacet (the lowest row of the anti-transposed boundary
//        matrix, whose rows also run backwards in time); a pivot (sigma, tau) is the pair
//        born at sigma, killed by tau (their Proposition 2.4: the pairs of homology). The
//        k-simplices that were pivots of the pass k - 1 are deaths and are never columns
//        (clearing). Before any algebra:
//          - apparent pairs (a gradient pair of a discrete Morse function, Forman 1998): sigma
//            and tau of the same value where tau is the oldest cofacet of sigma and sigma the
//            youngest facet of tau; such a pair is a persistence pair (the boundary column of
//            tau and the coboundary column of sigma are both reduced with these pivots as
//            they stand, and a pivot of a reduced matrix is the pivot of every reduction of
//            it); neither sigma nor tau ever becomes a column;
//          - emergent pairs: a column whose oldest cofacet is nobody's pivot yet is reduced
//            as it stands; nothing of it is stored.
//        Only columns that needed additions keep their combination of simplices (the column
//        of the reduction matrix V, from which the reduced coboundary is regenerated on
//        demand); the working coboundary is a heap of cofacets, equal ones summed when they
//        reach the top. So memory grows with the columns actually reduced, the pivots, and
//        the list of k-simplices (only those not already paired by a shortcut, and all
//        k-simplices when k < D, to enumerate the (k+1)-simplices from).
//
// Threads (options.threads): the edges, the enumeration of the k-simplices with their shortcut
// tests, and the sorts are cut into chunks (chain/parallel_chunks.hpp) whose lists are joined
// in chunk order, so the result is the same for any number of threads. A sparse metric
// (rips_metric::from_links) lists its pairs in neighbour lists; the cofacets of a simplex are
// then looked for among the neighbours of its vertex with the fewest, and a pair not listed
// has no edge.
//
// The threshold. None given: the enclosing radius r = min_i max_j d(i, j). Beyond r the
// complex is a cone: if c is a point with max_j d(c, j) = r, then for s >= r every simplex
// sigma of K_s gives sigma + c of value max(value(sigma), max_j d(c, j)) <= s in K_s, so K_s
// (and its (D+1)-skeleton, in dimensions <= D) has the homology of a point. Hence every class
// of dimension <= D born before r is dead by r, none born at s >= r outlives s, and cutting
// at r changes no pair of positive persistence (pairs ending by r are decided by K_r); only
// pairs of persistence zero at values above r disappear, with the simplices.
//
// Result: persistence_result<double, R> with diagrams 0..D (empty ones where there are no
// simplices), sorted as diagram.hpp says. birth_cell and death_cell are the combinatorial
// numbers of the simplices (implicit_rips_vertices decodes one), not the indices of the
// explicit rips_filtration. Pairs of persistence zero are dropped by default — the result is
// then that of lacuna::without_zero_persistence(lacuna::persistence(explicit)), which is what
// the command-line tool prints — and kept with options.zero_persistence (then equal to
// lacuna::persistence(explicit) itself, below the threshold). Representatives are cocycles, on
// request: implicit_rips_persistence_with_cocycles (the cohomology reduction's own
// representatives; the cycles of the homology would need another reduction).
#pragma once

#include <lacuna/chain/parallel_chunks.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/z2.hpp>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <limits>
#include <numeric>
#include <optional>
#include <span>
#include <stdexcept>
#include <string>
#include <system_error>
#include <thread>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// A finite metric space for implicit_rips_persistence: points of R^d with the Euclidean
/// distance (computed as lacuna::euclidean_distance does), a full distance matrix, or a sparse
/// one: only the pairs listed have a distance, every other pair none (its edge never enters,
/// as if its distance were +infinity).
/// Distances of points are stored (lower triangle) up to 8192 points and computed again
/// when needed beyond, so that memory stays O(n) there; a sparse metric keeps its pairs in
/// neighbour lists, O(n + pairs).
class rips_metric {
 public:
  /// One listed distance of a sparse metric: points a and b (0-based, distinct) at `distance`.
  struct link {
    ///@{
    /// The two points.
    std::size_t a = 0, b = 0;
    ///@}
    /// Their distance.
    double distance = 0;
  };

  /// No points.
  rips_metric() = default;

  /// Points given by their coordinates, `dimension` (>= 1) numbers per point. Throws
  /// std::invalid_argument when the coordinates do not split into points or one is not finite.
  static rips_metric from_points(std::span<const double> coordinates, std::size_t dimension) {
    detail::check_point_coordinates(coordinates, dimension, "lacuna::rips_metric");
    rips_metric m;
    m.n_ = coordinates.size() / dimension;
    m.dimension_ = dimension;
    m.coordinates_.assign(coordinates.begin(), coordinates.end());
    if (m.n_ <= stored_limit) {
      m.lower_.resize(m.n_ * (m.n_ - (m.n_ > 0)) / 2);
      for (std::size_t a = 1; a < m.n_; ++a)
        for (std::size_t b = 0; b < a; ++b) m.lower_[a * (a - 1) / 2 + b] = m.computed(a, b);
      m.stored_ = true;
    }
    return m;
  }
  /// The same for points given as vectors (all of one dimension).
  static rips_metric from_points(const std::vector<std::vector<double>>& points) {
    if (points.empty()) return {};
    const auto flat = detail::flatten_points(points, "lacuna::rips_metric");
    const std::size_t dimension = points.front().size();
    return from_points(flat, dimension);
  }
  /// A distance matrix: n x n numbers, row after row, finite, not negative, zero on the
  /// diagonal, symmetric (equal as given) — the rules of rips_filtration::from_distances.
  /// Throws std::invalid_argument naming the first entry that breaks one.
  static rips_metric from_distances(std::size_t n, std::span<const double> matrix) {
    detail::check_distance_matrix(n, matrix, "lacuna::rips_metric");
    rips_metric m;
    m.n_ = n;
    m.lower_.resize(n * (n - (n > 0)) / 2);
    for (std::size_t a = 1; a < n; ++a)
      for (std::size_t b = 0; b < a; ++b) m.lower_[a * (a - 1) / 2 + b] = matrix[a * n + b];
    m.stored_ = true;
    return m;
  }
  /// A sparse distance matrix on n points: only the pairs listed have a distance (finite, not
  /// negative; -0 counts as 0), each unordered pair at most once, in any order. Throws
  /// std::invalid_argument naming the first link (0-based, in the order given) that names a
  /// point >= n, a point twice, a distance that is not finite or is negative, or a pair
  /// already listed. Memory: 24 bytes per link plus 8 per point.
  static rips_metric from_links(std::size_t n, std::span<const link> links) {
    const std::string who = "lacuna::rips_metric::from_links";
    if (n >= std::numeric_limits<std::uint32_t>::max())
      throw std::invalid_argument(who + ": " + std::to_string(n) + " points, more than 2^32 - 2");
    rips_metric m;
    m.n_ = n;
    m.sparse_ = true;
    m.offsets_.assign(n + 1, 0);
    for (std::size_t i = 0; i < links.size(); ++i) {
      const link& l = links[i];
      const std::string at = "link " + std::to_string(i) + " (points " + std::to_string(l.a) + " and " +
                             std::to_string(l.b) + ")";
      if (l.a >= n || l.b >= n)
        throw std::invalid_argument(who + ": " + at + " names a point beyond the " + std::to_string(n) + " points");
      if (l.a == l.b) throw std::invalid_argument(who + ": " + at + " joins a point to itself");
      if (!std::isfinite(l.distance) || l.distance < 0)
        throw std::invalid_argument(who + ": " + at + " has a distance that is " +
                                    (std::isfinite(l.distance) ? "negative" : "not finite"));
      ++m.offsets_[l.a + 1];
      ++m.offsets_[l.b + 1];
    }
    for (std::size_t v = 0; v < n; ++v) m.offsets_[v + 1] += m.offsets_[v];
    m.neighbors_.resize(2 * links.size());
    m.neighbor_distances_.resize(2 * links.size());
    {
      std::vector<std::size_t> fill(m.offsets_.begin(), m.offsets_.end() - 1);
      for (const link& l : links) {
        const double d = l.distance == 0 ? 0.0 : l.distance;  // -0 as 0
        m.neighbors_[fill[l.a]] = static_cast<std::uint32_t>(l.b);
        m.neighbor_distances_[fill[l.a]++] = d;
        m.neighbors_[fill[l.b]] = static_cast<std::uint32_t>(l.a);
        m.neighbor_distances_[fill[l.b]++] = d;
      }
    }
    // each list by neighbour decreasing; a pair listed twice shows as a repeated neighbour
    std::vector<std::pair<std::uint32_t, double>> row;
    for (std::size_t v = 0; v < n; ++v) {
      row.clear();
      for (std::size_t e = m.offsets_[v]; e < m.offsets_[v + 1]; ++e)
        row.emplace_back(m.neighbors_[e], m.neighbor_distances_[e]);
      std::sort(row.begin(), row.end(), [](const auto& x, const auto& y) { return x.first > y.first; });
      for (std::size_t e = 1; e < row.size(); ++e)
        if (row[e].first == row[e - 1].first) {
          // name the second listing of the pair, in the order given
          const std::size_t w = row[e].first;
          std::size_t seen = 0;
          for (std::size_t i = 0; i < links.size(); ++i)
            if ((links[i].a == v && links[i].b == w) || (links[i].a == w && links[i].b == v))
              if (++seen == 2)
                throw std::invalid_argument(who + ": link " + std::to_string(i) + " (points " +
                                            std::to_string(links[i].a) + " and " + std::to_string(links[i].b) +
                                            ") lists a pair already listed");
        }
      for (std::size_t e = 0; e < row.size(); ++e) {
        m.neighbors_[m.offsets_[v] + e] = row[e].first;
        m.neighbor_distances_[m.offsets_[v] + e] = row[e].second;
      }
    }
    return m;
  }

  /// The number of points.
  std::size_t size() const noexcept { return n_; }
  /// True for a metric made by from_links.
  bool sparse() const noexcept { return sparse_; }
  /// The distance of points a and b (< size()); +infinity for a pair a sparse metric does not
  /// list.
  double distance(std::size_t a, std::size_t b) const {
    if (a == b) return 0.0;
    if (a < b) std::swap(a, b);
    if (stored_) return lower_[a * (a - 1) / 2 + b];
    return sparse_ ? listed(a, b) : computed(a, b);
  }
  /// A sparse metric's neighbours of v, decreasing (empty for a dense metric).
  std::span<const std::uint32_t> neighbors(std::size_t v) const noexcept {
    if (!sparse_) return {};
    return std::span<const std::uint32_t>(neighbors_).subspan(offsets_[v], offsets_[v + 1] - offsets_[v]);
  }
  /// Their distances, in the same order.
  std::span<const double> neighbor_distances(std::size_t v) const noexcept {
    if (!sparse_) return {};
    return std::span<const double>(neighbor_distances_).subspan(offsets_[v], offsets_[v + 1] - offsets_[v]);
  }
  /// The enclosing radius min_i max_j d(i, j) (0 for fewer than two points; +infinity for a
  /// sparse metric where no point has a distance to every other). O(n^2), O(pairs) if sparse.
  double enclosing_radius() const {
    if (n_ < 2) return 0.0;
    double best = std::numeric_limits<double>::infinity();
    if (sparse_) {
      for (std::size_t i = 0; i < n_; ++i) {
        if (offsets_[i + 1] - offsets_[i] != n_ - 1) continue;
        double far = 0;
        for (const double d : neighbor_distances(i)) far = std::max(far, d);
        best = std::min(best, far);
      }
      return best;
    }
    for (std::size_t i = 0; i < n_; ++i) {
      double far = 0;
      for (std::size_t j = 0; j < n_ && far < best; ++j) far = std::max(far, distance(i, j));
      best = std::min(best, far);
    }
    return best;
  }

  /// Up to this many points, the distances of points are computed once and stored.
  static constexpr std::size_t stored_limit = 8192;

 private:
  /// A sparse metric's distance of a and b, +infinity when not listed (a search of the
  /// shorter of the two lists, each decreasing).
  double listed(std::size_t a, std::size_t b) const {
    if (offsets_[a + 1] - offsets_[a] > offsets_[b + 1] - offsets_[b]) std::swap(a, b);
    const auto first = neighbors_.begin() + static_cast<std::ptrdiff_t>(offsets_[a]);
    const auto last = neighbors_.begin() + static_cast<std::ptrdiff_t>(offsets_[a + 1]);
    const auto it = std::lower_bound(first, last, static_cast<std::uint32_t>(b), std::greater<>());
    if (it == last || *it != b) return std::numeric_limits<double>::infinity();
    return neighbor_distances_[static_cast<std::size_t>(it - neighbors_.begin())];
  }
  double computed(std::size_t a, std::size_t b) const {
    // lacuna::euclidean_distance, without its check of the dimensions (equal here)
    return detail::euclidean_distance_of(coordinates_.data() + a * dimension_, coordinates_.data() + b * dimension_,
                                         dimension_);
  }

  std::size_t n_ = 0, dimension_ = 0;
  std::vector<double> coordinates_;
  std::vector<double> lower_;  // d(a, b), a > b, at a(a-1)/2 + b
  bool stored_ = false;
  // sparse: the neighbours of v, decreasing, at offsets_[v] .. offsets_[v + 1]
  bool sparse_ = false;
  std::vector<std::size_t> offsets_;
  std::vector<std::uint32_t> neighbors_;
  std::vector<double> neighbor_distances_;
};

/// Options of implicit_rips_persistence.
struct implicit_rips_options {
  /// Diagrams of dimensions 0..max_dimension (>= 0); simplices up to max_dimension + 1 are read.
  int max_dimension = 1;
  /// Only edges no longer than this (and the simplices they span). None: the enclosing radius
  /// (which changes no pair of positive persistence; see the file comment). +infinity: all.
  std::optional<double> threshold{};
  /// Keep the pairs of persistence zero (default: dropped, as without_zero_persistence does).
  bool zero_persistence = false;
  /// Threads for the work that splits (distances, the enumeration of the simplices and their
  /// shortcut tests, sorting); the result does not depend on it. 0 and 1: this thread alone.
  unsigned threads = 1;
  /// A stop request and a progress callback. Phases: "Vietoris-Rips distances" (points),
  /// "H_0 by union-find" (edges), "Vietoris-Rips columns of dimension k" (simplices),
  /// "reducing the coboundary of dimension k" (columns), and with cocycles "H_0 cocycles by
  /// union-find" (edges). Its memory_limit bounds the columns the reduction stores (those that
  /// needed additions), its working column and the cocycles asked for: past it,
  /// lacuna::memory_limit_exceeded (the part that grows fastest on large clouds, see
  /// docs/performance.md).
  run_control control{};
};

/// The combinatorial number system of the simplices on n vertices up to `top_vertices`
/// vertices: a binomial table C(v, m), v = 0..n, m = 0..top_vertices. Throws std::length_error
/// when some number of a simplex with at most top_vertices vertices would not fit in 63 bits.
class simplex_numbering {
 public:
  /// The table for n vertices and simplices of up to top_vertices vertices; throws std::length_error as said above.
  simplex_numbering(std::size_t n, int top_vertices) : n_(n), top_(top_vertices) {
    constexpr std::uint64_t limit = std::uint64_t{1} << 63U;
    table_.assign(static_cast<std::size_t>(top_ + 1) * (n_ + 1), 0);
    for (std::size_t v = 0; v <= n_; ++v) {
      at(v, 0) = 1;
      for (int m = 1; m <= top_; ++m) {
        if (v == 0) continue;
        const std::uint64_t s = at(v - 1, m - 1) + at(v - 1, m);
        if (s >= limit || s < at(v - 1, m))
          throw std::length_error("lacuna::implicit_rips_persistence: " + std::to_string(n) +
                                  " points and simplices of " + std::to_string(top_vertices) +
                                  " vertices: the simplex numbers C(n, " + std::to_string(top_vertices) +
                                  ") do not fit in 63 bits; use fewer points or a lower dimension");
        at(v, m) = s;
      }
    }
  }
  /// C(v, m) for v <= n, m <= top_vertices.
  std::uint64_t binomial(std::size_t v, int m) const noexcept {
    return table_[static_cast<std::size_t>(m) * (n_ + 1) + v];
  }
  /// The number of the simplex with the given vertices, decreasing.
  std::uint64_t number(std::span<const std::uint32_t> decreasing) const {
    const int k = static_cast<int>(decreasing.size()) - 1;
    std::uint64_t s = 0;
    for (int i = 0; i <= k; ++i) s += binomial(decreasing[static_cast<std::size_t>(i)], k + 1 - i);
    return s;
  }
  /// The vertices, decreasing, of the k-simplex with number `number` (appended to out).
  void vertices(std::uint64_t number, int k, std::vector<std::uint32_t>& out) const {
    std::size_t top = n_;  // vertices are below this
    for (int i = 0; i <= k; ++i) {
      const int m = k + 1 - i;
      // the largest v < top with C(v, m) <= number
      std::size_t lo = static_cast<std::size_t>(m - 1), hi = top;  // C(lo, m) = 0 <= number
      while (hi - lo > 1) {
        const std::size_t mid = lo + (hi - lo) / 2;
        if (binomial(mid, m) <= number) lo = mid; else hi = mid;
      }
      out.push_back(static_cast<std::uint32_t>(lo));
      number -= binomial(lo, m);
      top = lo;
    }
  }
  /// The number n of vertices.
  std::size_t point_count() const noexcept { return n_; }

 private:
  std::uint64_t& at(std::size_t v, int m) { return table_[static_cast<std::size_t>(m) * (n_ + 1) + v]; }
  std::uint64_t at(std::size_t v, int m) const { return table_[static_cast<std::size_t>(m) * (n_ + 1) + v]; }
  std::size_t n_;
  int top_;
  std::vector<std::uint64_t> table_;
};

/// The points of the k-simplex with combinatorial number `number` among n points, increasing
/// (a birth_cell or death_cell of implicit_rips_persistence). Throws std::invalid_argument for
/// a number that names no k-simplex of n points, std::length_error as simplex_numbering.
inline std::vector<std::uint32_t> implicit_rips_vertices(std::size_t n, int k, std::uint64_t number) {
  if (k < 0 || static_cast<std::size_t>(k) >= n)
    throw std::invalid_argument("lacuna::implicit_rips_vertices: no " + std::to_string(k) + "-simplex on " +
                                std::to_string(n) + " points");
  const simplex_numbering table(n, k + 1);
  if (number >= table.binomial(n, k + 1))
    throw std::invalid_argument("lacuna::implicit_rips_vertices: " + std::to_string(number) + " numbers no " +
                                std::to_string(k) + "-simplex on " + std::to_string(n) + " points");
  std::vector<std::uint32_t> v;
  table.vertices(number, k, v);
  std::reverse(v.begin(), v.end());
  return v;
}

/// A cochain of the Vietoris–Rips complex on the points 0..n-1 with coefficients in R (a
/// field): simplices of one dimension given by their points, each with a non-zero coefficient.
/// Term i is the simplex simplex(i) (dimension + 1 points, increasing) with coefficient(i).
template <class R>
struct rips_cochain {
  /// The dimension of the simplices.
  int dimension = 0;
  /// The points of the simplices, dimension + 1 per term, each simplex increasing.
  std::vector<std::uint32_t> vertices;
  /// The coefficients, one per term, none zero.
  std::vector<R> coefficients;

  /// The number of terms.
  std::size_t size() const noexcept { return coefficients.size(); }
  /// The points of term i, increasing.
  std::span<const std::uint32_t> simplex(std::size_t i) const {
    const auto w = static_cast<std::size_t>(dimension) + 1;
    return std::span<const std::uint32_t>(vertices).subspan(i * w, w);
  }
  /// The coefficient of term i.
  const R& coefficient(std::size_t i) const { return coefficients[i]; }
};

/// The result of implicit_rips_persistence_with_cocycles: the persistence of
/// implicit_rips_persistence, and one representative cocycle per reported pair,
/// cocycles[k][j] for persistence[k].pairs[j] (see that function for what they satisfy).
template <class R>
struct implicit_rips_cocycles {
  /// The persistence, as implicit_rips_persistence computes it.
  persistence_result<double, R> persistence;
  /// cocycles[k][j]: a representative cocycle of persistence[k].pairs[j].
  std::vector<std::vector<rips_cochain<R>>> cocycles;
};

namespace detail {

/// A simplex of the implicit filtration: its value and combinatorial number.
struct rips_simplex {
  double value;
  std::uint64_t number;
};
/// a enters before b (same dimension): value, then number decreasing.
inline bool rips_before(const rips_simplex& a, const rips_simplex& b) noexcept {
  return a.value < b.value || (a.value == b.value && a.number > b.number);
}

template <class R>
struct rips_term {
  rips_simplex simplex;
  R coefficient;
};

/// The engine of implicit_rips_persistence (one object per call).
template <class R>
class implicit_rips_engine {
 public:
  implicit_rips_engine(const rips_metric& metric, const implicit_rips_options& o, const R& ring_one)
      : m_(metric),
        o_(o),
        ring_one_(ring_one),
        n_(metric.size()),
        // simplices have at most n vertices, so numbers need C(v, m) for m <= min(D + 2, n + 1)
        numbering_(metric.size(), static_cast<int>(std::min<std::size_t>(static_cast<std::size_t>(o.max_dimension) + 2,
                                                                         metric.size() + 1))) {
    threshold_ = o.threshold ? *o.threshold : m_.enclosing_radius();
    // every distance is finite, so +infinity keeps the same edges as the largest double; a
    // pair a sparse metric does not list has distance +infinity, which is then beyond it
    threshold_ = std::min(threshold_, std::numeric_limits<double>::max());
  }

  persistence_result<double, R> run() {
    persistence_result<double, R> out;
    const int D = o_.max_dimension;
    out.diagrams.resize(static_cast<std::size_t>(D + 1));
    for (int k = 0; k <= D; ++k) out.diagrams[static_cast<std::size_t>(k)].dimension = k;
    if (want_cocycles_) cocycles_.assign(static_cast<std::size_t>(D + 1), {});
    if (n_ == 0) return out;

    // ---- the edges within the threshold, in filtration order --------------------------
    // Diagram 0 alone of points or a full matrix: only the edges of the minimum spanning
    // forest, found without listing the others (O(n) memory).
    std::vector<rips_simplex> simplices = D == 0 && !m_.sparse() ? spanning_edges() : edges();

    // ---- H_0: Kruskal's union-find (the elder rule) -------------------------------------
    std::vector<char> edge_killed(simplices.size(), 0);
    {
      auto& d0 = out.diagrams[0].pairs;
      std::vector<std::uint32_t> parent(n_);
      std::iota(parent.begin(), parent.end(), std::uint32_t{0});
      // a root is the oldest vertex of its component: the largest number (all enter at 0)
      auto find = [&](std::uint32_t x) {
        while (parent[x] != x) x = parent[x] = parent[parent[x]];
        return x;
      };
      detail::progress_ticker tick(&o_.control, "H_0 by union-find", simplices.size());
      std::vector<std::uint32_t> v;
      for (std::size_t e = 0; e < simplices.size(); ++e) {
        v.clear();
        numbering_.vertices(simplices[e].number, 1, v);
        const std::uint32_t a = find(v[0]), b = find(v[1]);
        tick();
        if (a == b) continue;
        const std::uint32_t younger = std::min(a, b), elder = std::max(a, b);
        parent[younger] = elder;
        edge_killed[e] = 1;
        if (o_.zero_persistence || simplices[e].value > 0.0)
          d0.push_back({0.0, simplices[e].value, younger, simplices[e].number});
      }
      tick.finish();
      for (std::uint32_t x = 0; x < n_; ++x)
        if (parent[x] == x) d0.push_back({0.0, std::nullopt, x, no_cell});
    }

    // ---- H_k, k >= 1: coboundary reduction with clearing --------------------------------
    std::unordered_map<std::uint64_t, pivot_entry> pivots;  // of the pass k - 1 (cleared)
    for (int k = 1; k <= D && static_cast<std::size_t>(k) < n_; ++k) {
      const std::string phase_columns = "Vietoris-Rips columns of dimension " + std::to_string(k);
      auto& dk = out.diagrams[static_cast<std::size_t>(k)].pairs;
      // The k-simplices are looked at in chunks (of the edges for k = 1, of the (k-1)-simplices
      // they are made from otherwise), on o_.threads threads; each chunk keeps its own lists,
      // joined in chunk order, so the lists are those of one thread.
      struct chunk_lists {
        std::vector<rips_simplex> columns, next;  // next: all k-simplices, kept when k < D
        std::vector<persistence_pair<double>> zero;
      };
      const std::size_t items = simplices.size();
      const std::size_t chunks = std::min<std::size_t>(items, 256);
      std::vector<chunk_lists> lists(chunks);
      const auto chunk_begin = [&](std::size_t c) { return items * c / chunks; };
      run_chunks(chunks, o_.threads, o_.control, phase_columns, items, [&](std::size_t c) -> std::uint64_t {
        chunk_lists mine;  // filled here, moved to lists[c] at the end (no shared cache lines)
        scratch_space work;
        auto consider = [&](const rips_simplex& s, std::span<const std::uint32_t> sv) {
          // clearing: a death of the pass k - 1 (a pivot, or the upper half of an apparent pair)
          // (a set of the latter, kept from the pass k - 1, was tried: its lookups cost more
          // than the test, a few distances of points close in memory)
          if (k >= 2 && (pivots.count(s.number) != 0 || apparent_facet_of(s, sv, work))) return;
          if (const auto t = apparent_cofacet(s, sv, work)) {
            if (o_.zero_persistence) mine.zero.push_back({s.value, t->value, s.number, t->number});
            return;
          }
          mine.columns.push_back(s);
        };
        std::vector<std::uint32_t> v, sv;
        for (std::size_t e = chunk_begin(c); e < chunk_begin(c + 1); ++e) {
          const rips_simplex& f = simplices[e];
          if (k == 1) {
            if (!edge_killed[e]) {
              v.clear();
              numbering_.vertices(f.number, 1, v);
              consider(f, v);
            }
            continue;
          }
          // the k-simplices from their facet without the largest vertex: the new vertex w
          // above all of the facet's, in position 0, so that the number is C(w, k + 1) + facet's
          v.clear();
          numbering_.vertices(f.number, k - 1, v);
          sv.assign(1, 0);
          sv.insert(sv.end(), v.begin(), v.end());
          for_higher_vertices(v[0], [&](std::uint32_t w) {
            double value = f.value;
            for (std::uint32_t u : v) {
              value = std::max(value, m_.distance(w, u));
              if (value > threshold_) return;
            }
            const rips_simplex s{value, numbering_.binomial(w, k + 1) + f.number};
            if (k < D) mine.next.push_back(s);
            sv[0] = w;
            consider(s, sv);
          });
        }
        lists[c] = std::move(mine);
        return chunk_begin(c + 1) - chunk_begin(c);
      });
      std::vector<rips_simplex> columns, next;
      if (k == 1) {
        std::vector<char>().swap(edge_killed);
        if (k < D) next = std::move(simplices);
      }
      for (auto& l : lists) {
        columns.insert(columns.end(), l.columns.begin(), l.columns.end());
        next.insert(next.end(), l.next.begin(), l.next.end());
        dk.insert(dk.end(), l.zero.begin(), l.zero.end());
        // the cocycle of an apparent pair (s, t) is s alone; kept in the order of the pairs
        if (want_cocycles_)
          for (const auto& z : l.zero) keep_cocycle(k, rips_simplex{z.birth, z.birth_cell}, {});
        l = chunk_lists{};
      }
      if (k >= 2 && k < D) sort_in_order(next, rips_before);
      std::vector<rips_simplex>().swap(simplices);
      pivots.clear();
      // reverse filtration order: value decreasing, number increasing
      sort_in_order(columns, [](const auto& a, const auto& b) { return rips_before(b, a); });
      reduce(columns, k, pivots, dk);
      simplices = std::move(next);
    }
    for (auto& d : out.diagrams) d.order = out.order;
    if (want_cocycles_) finish_cocycles(out);
    detail::sort_pairs(out);
    return out;
  }

  /// run(), with the representative cocycle of every reported pair (see
  /// implicit_rips_persistence_with_cocycles).
  implicit_rips_cocycles<R> run_with_cocycles() {
    want_cocycles_ = true;
    implicit_rips_cocycles<R> r;
    r.persistence = run();
    r.cocycles.resize(r.persistence.diagrams.size());
    std::vector<std::uint32_t> v;
    for (std::size_t k = 0; k < cocycles_.size() && k < r.cocycles.size(); ++k) {
      for (auto& terms : cocycles_[k]) {
        // the terms in the order of the filtration, oldest first
        std::sort(terms.begin(), terms.end(), [](const auto& a, const auto& b) { return rips_before(a.simplex, b.simplex); });
        rips_cochain<R> z;
        z.dimension = static_cast<int>(k);
        z.vertices.reserve(terms.size() * (k + 1));
        z.coefficients.reserve(terms.size());
        for (const auto& t : terms) {
          v.clear();
          numbering_.vertices(t.simplex.number, static_cast<int>(k), v);
          z.vertices.insert(z.vertices.end(), v.rbegin(), v.rend());
          z.coefficients.push_back(t.coefficient);
        }
        std::vector<heap_entry>().swap(terms);
        r.cocycles[k].push_back(std::move(z));
      }
    }
    return r;
  }

 private:
  struct pivot_entry {
    rips_simplex column;       // the simplex of the column
    R coefficient;             // of the pivot in the reduced column
    std::size_t begin = 0, end = 0;  // its extra terms in stored_ (the rest of the column of V)
  };
  /// Working vectors of the shortcut tests, one set per thread.
  struct scratch_space {
    std::vector<std::uint32_t> tv, fv;
  };

  /// Sorts by `before` (a strict total order on simplices of one dimension: every order of
  /// the input gives the same output), in two halves on two threads when o_.threads >= 2.
  template <class Before>
  void sort_in_order(std::vector<rips_simplex>& s, Before before) const {
    if (o_.threads < 2 || s.size() < (std::size_t{1} << 16)) {
      std::sort(s.begin(), s.end(), before);
      return;
    }
    const auto middle = s.begin() + static_cast<std::ptrdiff_t>(s.size() / 2);
    std::thread other;
    try {
      other = std::thread([&] { std::sort(s.begin(), middle, before); });
    } catch (const std::system_error&) {
      std::sort(s.begin(), s.end(), before);
      return;
    }
    std::sort(middle, s.end(), before);
    other.join();
    std::inplace_merge(s.begin(), middle, s.end(), before);
  }

  /// The edges within the threshold, in filtration order. Points and full matrices: the
  /// pairs (a, b), b < a, computed in chunks of rows (on o_.threads threads); sparse: the
  /// pairs listed.
  std::vector<rips_simplex> edges() const {
    std::vector<rips_simplex> out;
    if (m_.sparse()) {
      detail::progress_ticker tick(&o_.control, "Vietoris-Rips distances", n_);
      for (std::size_t a = 1; a < n_; ++a) {
        const auto nb = m_.neighbors(a);
        const auto nd = m_.neighbor_distances(a);
        for (std::size_t e = 0; e < nb.size(); ++e)
          if (nb[e] < a && nd[e] <= threshold_) out.push_back({nd[e], numbering_.binomial(a, 2) + nb[e]});
        tick();
      }
      tick.finish();
    } else {
      // rows a in [row(c), row(c + 1)), with about as many pairs in each chunk (row a has a)
      const std::size_t chunks = std::min<std::size_t>(n_, 256);
      const auto row = [&](std::size_t c) {
        return static_cast<std::size_t>(static_cast<double>(n_) * std::sqrt(static_cast<double>(c) / static_cast<double>(chunks)));
      };
      std::vector<std::vector<rips_simplex>> lists(chunks);
      run_chunks(chunks, o_.threads, o_.control, "Vietoris-Rips distances", n_, [&](std::size_t c) -> std::uint64_t {
        const std::size_t first = std::max<std::size_t>(row(c), 1), last = c + 1 == chunks ? n_ : row(c + 1);
        std::vector<rips_simplex> mine;  // moved to lists[c] at the end (no shared cache lines)
        for (std::size_t a = first; a < last; ++a)
          for (std::size_t b = 0; b < a; ++b) {
            const double d = m_.distance(a, b);
            if (d <= threshold_) mine.push_back({d, numbering_.binomial(a, 2) + b});
          }
        lists[c] = std::move(mine);
        return last > first ? last - first : 0;
      });
      std::size_t total = 0;
      for (const auto& l : lists) total += l.size();
      out.reserve(total);
      for (auto& l : lists) {
        out.insert(out.end(), l.begin(), l.end());
        std::vector<rips_simplex>().swap(l);
      }
    }
    sort_in_order(out, rips_before);
    return out;
  }

  /// The edges of the minimum spanning forest of the edges within the threshold, in
  /// filtration order, by Prim's algorithm (Prim 1957; O(n^2) distances, O(n) memory).
  /// Under the strict total order of the edges (rips_before: value, then number decreasing)
  /// that forest is unique, so it is the forest of Kruskal's pass over all the edges, and
  /// the union-find pass over it alone gives the same pairs: an edge outside it joins two
  /// vertices already joined when Kruskal's pass reaches it (the cycle property).
  std::vector<rips_simplex> spanning_edges() const {
    constexpr double none = std::numeric_limits<double>::infinity();  // no edge yet (values are finite)
    std::vector<std::uint32_t> outside(n_);
    std::iota(outside.begin(), outside.end(), std::uint32_t{0});
    std::vector<rips_simplex> key(n_, rips_simplex{none, 0});  // the best edge into the tree
    std::vector<rips_simplex> tree;
    tree.reserve(n_ - 1);
    detail::progress_ticker tick(&o_.control, "H_0 by a minimum spanning tree", n_);
    std::size_t current_at = 0;  // position in `outside` of the vertex joining the tree
    while (!outside.empty()) {
      const std::uint32_t current = outside[current_at];
      outside[current_at] = outside.back();
      outside.pop_back();
      tick();
      std::size_t best = outside.size();
      for (std::size_t i = 0; i < outside.size(); ++i) {
        const std::uint32_t w = outside[i];
        const double d = m_.distance(current, w);
        if (d <= threshold_) {
          const rips_simplex e{d, numbering_.binomial(std::max(current, w), 2) + std::min(current, w)};
          if (key[w].value == none || rips_before(e, key[w])) key[w] = e;
        }
        if (key[w].value != none && (best == outside.size() || rips_before(key[w], key[outside[best]]))) best = i;
      }
      if (best == outside.size()) {
        current_at = 0;  // a new tree of the forest (or the end)
        continue;
      }
      tree.push_back(key[outside[best]]);
      current_at = best;
    }
    tick.finish();
    std::sort(tree.begin(), tree.end(), rips_before);
    return tree;
  }

  /// Calls visit(w) for every point w > v that may share a simplex with v: all of them, or
  /// a sparse metric's neighbours of v above it.
  template <class Visit>
  void for_higher_vertices(std::uint32_t v, Visit&& visit) const {
    if (!m_.sparse()) {
      for (std::size_t w = std::size_t{v} + 1; w < n_; ++w) visit(static_cast<std::uint32_t>(w));
      return;
    }
    for (const std::uint32_t w : m_.neighbors(v)) {
      if (w <= v) break;  // decreasing
      visit(w);
    }
  }

  /// Calls visit(w) for the points w that may be added to the simplex with vertices sv,
  /// decreasing, until it returns false: all points (those of sv among them), or for a
  /// sparse metric the neighbours of the vertex of sv with the fewest.
  template <class Visit>
  void for_candidates(std::span<const std::uint32_t> sv, Visit&& visit) const {
    if (!m_.sparse()) {
      for (std::size_t w = n_; w-- > 0;)
        if (!visit(static_cast<std::uint32_t>(w))) return;
      return;
    }
    std::uint32_t u = sv[0];
    for (const std::uint32_t x : sv)
      if (m_.neighbors(x).size() < m_.neighbors(u).size()) u = x;
    for (const std::uint32_t w : m_.neighbors(u))
      if (!visit(w)) return;
  }

  /// The cofacets of the simplex s with vertices sv (decreasing) within the threshold,
  /// numbers decreasing: visit(cofacet, j, w) for the vertex w inserted at position j (the
  /// incidence of s in it is (-1)^j); visit returns false to stop.
  template <class Visit>
  void cofacets_of(const rips_simplex& s, std::span<const std::uint32_t> sv, Visit&& visit) const {
    const int k = static_cast<int>(sv.size()) - 1;
    std::uint64_t above = 0, below = s.number;
    std::size_t j = 0;  // vertices sv[0..j) are above w
    for_candidates(sv, [&](std::uint32_t w) {
      while (j < sv.size() && sv[j] > w) {
        below -= numbering_.binomial(sv[j], k + 1 - static_cast<int>(j));
        above += numbering_.binomial(sv[j], k + 2 - static_cast<int>(j));
        ++j;
      }
      if (j < sv.size() && sv[j] == w) return true;  // a vertex of s
      double value = s.value;
      for (std::uint32_t u : sv) {
        value = std::max(value, m_.distance(w, u));
        if (value > threshold_) return true;
      }
      return visit(rips_simplex{value, above + numbering_.binomial(w, k + 2 - static_cast<int>(j)) + below}, j, w);
    });
  }
  /// The same with the incidence sign (true: -1), the vertices decoded into v.
  template <class Visit>
  void cofacets(const rips_simplex& s, int k, std::vector<std::uint32_t>& v, Visit&& visit) const {
    v.clear();
    numbering_.vertices(s.number, k, v);
    cofacets_of(s, v, [&](const rips_simplex& c, std::size_t j, std::uint32_t) { return visit(c, j % 2 == 1); });
  }

  struct found_cofacet {
    rips_simplex simplex;
    std::size_t position;  // where its new vertex sits
    std::uint32_t vertex;
  };
  /// The oldest cofacet of s if it is of the value of s (the first one met); none otherwise.
  /// (cofacets_of, with the search for a point within s.value of every vertex of s written
  /// out: the first distance beyond it ends the test of a point.)
  std::optional<found_cofacet> oldest_equal_cofacet(const rips_simplex& s, std::span<const std::uint32_t> sv) const {
    const int k = static_cast<int>(sv.size()) - 1;
    std::uint64_t above = 0, below = s.number;
    std::size_t j = 0;
    if (!m_.sparse()) {  // the loop of for_candidates written out: the hottest loop of the engine
      for (std::size_t w = n_; w-- > 0;) {
        if (j < sv.size() && w == sv[j]) {
          below -= numbering_.binomial(w, k + 1 - static_cast<int>(j));
          above += numbering_.binomial(w, k + 2 - static_cast<int>(j));
          ++j;
          continue;
        }
        bool near = true;
        for (std::uint32_t u : sv)
          if (m_.distance(w, u) > s.value) {
            near = false;
            break;
          }
        if (near)  // s.value <= the threshold: the cofacet exists
          return found_cofacet{rips_simplex{s.value, above + numbering_.binomial(w, k + 2 - static_cast<int>(j)) + below}, j,
                               static_cast<std::uint32_t>(w)};
      }
      return std::nullopt;
    }
    std::optional<found_cofacet> found;
    for_candidates(sv, [&](std::uint32_t w) {
      while (j < sv.size() && sv[j] > w) {
        below -= numbering_.binomial(sv[j], k + 1 - static_cast<int>(j));
        above += numbering_.binomial(sv[j], k + 2 - static_cast<int>(j));
        ++j;
      }
      if (j < sv.size() && sv[j] == w) return true;
      for (std::uint32_t u : sv)
        if (m_.distance(w, u) > s.value) return true;
      // s.value <= the threshold: the cofacet exists
      found = found_cofacet{rips_simplex{s.value, above + numbering_.binomial(w, k + 2 - static_cast<int>(j)) + below}, j, w};
      return false;
    });
    return found;
  }
  static void insert_vertex(std::span<const std::uint32_t> sv, std::size_t j, std::uint32_t w, std::vector<std::uint32_t>& out) {
    out.assign(sv.begin(), sv.end());
    out.insert(out.begin() + static_cast<std::ptrdiff_t>(j), w);
  }

  /// The oldest cofacet of s if it has the value of s and s is its youngest facet (an
  /// apparent pair); none otherwise.
  std::optional<rips_simplex> apparent_cofacet(const rips_simplex& s, std::span<const std::uint32_t> sv,
                                               scratch_space& work) const {
    const auto first = oldest_equal_cofacet(s, sv);
    if (!first) return std::nullopt;
    insert_vertex(sv, first->position, first->vertex, work.tv);
    const auto f = youngest_equal_facet(first->simplex, work.tv);
    if (f && f->first.number == s.number) return first->simplex;
    return std::nullopt;
  }

  /// The youngest facet of t (vertices tv) if it is of the value of t and t is its oldest
  /// cofacet, with the incidence of that facet in t; none otherwise.
  std::optional<std::pair<rips_simplex, R>> apparent_facet_of(const rips_simplex& t, std::span<const std::uint32_t> tv,
                                                               scratch_space& work) const {
    const auto f = youngest_equal_facet(t, tv);
    if (!f) return std::nullopt;
    work.fv.assign(tv.begin(), tv.end());
    work.fv.erase(work.fv.begin() + static_cast<std::ptrdiff_t>(f->second));
    const auto first = oldest_equal_cofacet(f->first, work.fv);
    if (first && first->simplex.number == t.number)
      return std::pair<rips_simplex, R>{f->first, f->second % 2 == 1 ? -ring_one_ : ring_one_};
    return std::nullopt;
  }
  /// The same with this thread's working vectors (the reduction).
  std::optional<std::pair<rips_simplex, R>> apparent_facet_of(const rips_simplex& t, std::span<const std::uint32_t> tv) {
    return apparent_facet_of(t, tv, work_);
  }

  /// Among the facets of t (vertices tv, decreasing) of the value of t, the youngest (the
  /// smallest number), with the position of the vertex it lacks; none when every facet is
  /// older in value.
  std::optional<std::pair<rips_simplex, std::size_t>> youngest_equal_facet(const rips_simplex& t,
                                                                            std::span<const std::uint32_t> tv) const {
    const int k = static_cast<int>(tv.size()) - 1;
    std::optional<std::pair<rips_simplex, std::size_t>> best;
    for (int j = 0; j <= k; ++j) {
      double value = 0;
      std::uint64_t number = 0;
      int pos = 0;
      for (int i = 0; i <= k; ++i) {
        if (i == j) continue;
        number += numbering_.binomial(tv[static_cast<std::size_t>(i)], k - pos);
        ++pos;
        for (int h = i + 1; h <= k; ++h)
          if (h != j) value = std::max(value, m_.distance(tv[static_cast<std::size_t>(i)], tv[static_cast<std::size_t>(h)]));
      }
      if (value == t.value && (!best || number < best->first.number))
        best = std::pair<rips_simplex, std::size_t>{rips_simplex{value, number}, static_cast<std::size_t>(j)};
    }
    return best;
  }

  // ---- the reduction of one dimension ---------------------------------------------------

  struct heap_entry {
    rips_simplex simplex;
    R coefficient;
  };
  /// Heap order: the oldest simplex on top.
  static bool heap_less(const heap_entry& a, const heap_entry& b) noexcept { return rips_before(b.simplex, a.simplex); }

  void push_coboundary(const rips_simplex& s, int k, const R& factor) {
    cofacets(s, k, scratch_, [&](const rips_simplex& c, bool negative) {
      heap_.push_back({c, negative ? -factor : factor});
      std::push_heap(heap_.begin(), heap_.end(), heap_less);
      return true;
    });
  }
  /// The oldest cofacet of the working column with a non-zero coefficient (summing equal
  /// ones), left on the heap; none when the column is zero.
  std::optional<heap_entry> pivot_of_heap() {
    while (!heap_.empty()) {
      std::pop_heap(heap_.begin(), heap_.end(), heap_less);
      heap_entry top = heap_.back();
      heap_.pop_back();
      while (!heap_.empty() && heap_.front().simplex.number == top.simplex.number) {
        std::pop_heap(heap_.begin(), heap_.end(), heap_less);
        top.coefficient = top.coefficient + heap_.back().coefficient;
        heap_.pop_back();
      }
      if (top.coefficient == zero<R>()) continue;
      heap_.push_back(top);
      std::push_heap(heap_.begin(), heap_.end(), heap_less);
      return top;
    }
    return std::nullopt;
  }

  /// Appends to `out` the terms summed by simplex (equal simplices added up, zero sums left
  /// out); `terms` is sorted on the way.
  static void append_summed(std::vector<heap_entry>& terms, std::vector<heap_entry>& out) {
    std::sort(terms.begin(), terms.end(), [](const auto& a, const auto& b) { return a.simplex.number < b.simplex.number; });
    for (std::size_t t = 0; t < terms.size();) {
      heap_entry sum = terms[t++];
      while (t < terms.size() && terms[t].simplex.number == sum.simplex.number)
        sum.coefficient = sum.coefficient + terms[t++].coefficient;
      if (!(sum.coefficient == zero<R>())) out.push_back(sum);
    }
  }

  // ---- representative cocycles ------------------------------------------------------------
  //
  // The column of the reduction matrix V of a k-simplex s, z = s + (the columns added to it),
  // is a k-cochain with δz = R, the reduced column (the reduction is R = δV, de Silva, Morozov
  // & Vejdemo-Johansson 2011, "Dualities in persistent (co)homology"). Every column added to
  // s's belongs to a simplex younger than s: a stored pivot's simplex was processed before s,
  // and the facet f of an apparent pair (f, p) added for the pivot p is p's youngest facet,
  // so at least as young as the term of the working column that has p as a cofacet (and not
  // s, which would then be f and never a column). So s is the oldest term of z, with
  // coefficient 1. For a pair (s, p), p is the oldest (k+1)-simplex where δz is not zero: z
  // restricted to K_t is a cocycle for every t before p, and its class is the pair's class in
  // the persistent cohomology, whose barcode is that of homology. For an essential class
  // δz = 0. A column reduced as it stands (an emergent or apparent pair) has z = s.

  /// Keeps the cocycle s + terms of the pair just reported in dimension k.
  void keep_cocycle(int k, const rips_simplex& s, std::span<const heap_entry> terms) {
    auto& z = cocycles_[static_cast<std::size_t>(k)].emplace_back();
    z.reserve(terms.size() + 1);
    z.push_back({s, ring_one_});
    z.insert(z.end(), terms.begin(), terms.end());
    cocycle_bytes_ += z.size() * sizeof(heap_entry);
    o_.control.require_memory(stored_.size() * sizeof(heap_entry) + cocycle_bytes_,
                              "the representative cocycles of the implicit Vietoris-Rips reduction");
  }

  /// The cocycles of H_0, then every diagram sorted with its cocycles (the order of
  /// detail::sort_pairs, which is total here: no two pairs of a dimension share a birth cell,
  /// so sort_pairs keeps it).
  ///
  /// H_0: for a pair born at vertex b and killed by the edge e, the indicator of the
  /// component of b in the graph of the edges before e (filtration order); for an essential
  /// class, of its component in the graph of every edge. δ of the indicator of a union of
  /// components vanishes on every edge of the graph; e joins the component of b (b is the
  /// younger of the two components e merges) to another, so δz(e) = ±1. The cocycles of the
  /// classes alive at t are independent: at any time each component holds the birth vertex
  /// of exactly one living class, so the cocycle of a class is 1 on its own birth vertex and 0
  /// on that of every class dying later (a triangular matrix with ones on the diagonal).
  /// The edges are enumerated here again, so this needs nothing of run()'s own pass but the
  /// pairs: b is their birth cell, e their death cell.
  void finish_cocycles(persistence_result<double, R>& out) {
    if (n_ > 0 && !out.diagrams.empty()) {
      const auto& d0 = out.diagrams[0].pairs;
      auto& z0 = cocycles_[0];
      z0.assign(d0.size(), {});
      // every edge within the threshold, in filtration order (also for a sparse metric, and
      // also after Prim's route, which lists only the spanning forest)
      const std::vector<rips_simplex> edges = this->edges();
      std::unordered_map<std::uint64_t, std::size_t> killed_by;  // death edge -> pair
      for (std::size_t j = 0; j < d0.size(); ++j)
        if (!d0[j].essential()) killed_by.emplace(d0[j].death_cell, j);
      std::vector<std::uint32_t> parent(n_);
      std::iota(parent.begin(), parent.end(), std::uint32_t{0});
      std::vector<std::vector<std::uint32_t>> members(n_);
      for (std::uint32_t x = 0; x < n_; ++x) members[x].assign(1, x);
      auto find = [&](std::uint32_t x) {
        while (parent[x] != x) x = parent[x] = parent[parent[x]];
        return x;
      };
      auto indicator = [&](std::uint32_t root, std::vector<heap_entry>& z) {
        z.reserve(members[root].size());
        for (std::uint32_t x : members[root]) z.push_back({rips_simplex{0.0, x}, ring_one_});
        cocycle_bytes_ += z.size() * sizeof(heap_entry);
        o_.control.require_memory(cocycle_bytes_, "the representative cocycles of the implicit Vietoris-Rips reduction");
      };
      std::vector<std::uint32_t> v;
      detail::progress_ticker tick(&o_.control, "H_0 cocycles by union-find", edges.size());
      for (const auto& e : edges) {
        tick();
        v.clear();
        numbering_.vertices(e.number, 1, v);
        std::uint32_t a = find(v[0]), b = find(v[1]);
        if (const auto j = killed_by.find(e.number); j != killed_by.end())
          indicator(find(static_cast<std::uint32_t>(d0[j->second].birth_cell)), z0[j->second]);
        if (a == b) continue;
        if (members[a].size() < members[b].size()) std::swap(a, b);  // the smaller joins the larger
        parent[b] = a;
        members[a].insert(members[a].end(), members[b].begin(), members[b].end());
        std::vector<std::uint32_t>().swap(members[b]);
      }
      tick.finish();
      for (std::size_t j = 0; j < d0.size(); ++j)
        if (d0[j].essential()) indicator(find(static_cast<std::uint32_t>(d0[j].birth_cell)), z0[j]);
    }
    for (std::size_t k = 0; k < out.diagrams.size() && k < cocycles_.size(); ++k) {
      auto& pairs = out.diagrams[k].pairs;
      auto& z = cocycles_[k];
      if (z.size() != pairs.size())
        throw std::logic_error("lacuna::implicit_rips_persistence_with_cocycles: cocycles and pairs out of step");
      std::vector<std::size_t> perm(pairs.size());
      std::iota(perm.begin(), perm.end(), std::size_t{0});
      std::sort(perm.begin(), perm.end(),
                [&](std::size_t a, std::size_t b) { return detail::pair_before(pairs[a], pairs[b], out.order); });
      std::vector<persistence_pair<double>> sorted_pairs;
      std::vector<std::vector<heap_entry>> sorted_z;
      sorted_pairs.reserve(perm.size());
      sorted_z.reserve(perm.size());
      for (std::size_t j : perm) {
        sorted_pairs.push_back(pairs[j]);
        sorted_z.push_back(std::move(z[j]));
      }
      pairs = std::move(sorted_pairs);
      z = std::move(sorted_z);
    }
  }

  void reduce(const std::vector<rips_simplex>& columns, int k, std::unordered_map<std::uint64_t, pivot_entry>& pivots,
              std::vector<persistence_pair<double>>& pairs) {
    const std::string phase = "reducing the coboundary of dimension " + std::to_string(k);
    detail::progress_ticker tick(&o_.control, phase, columns.size());
    stored_.clear();
    std::vector<heap_entry> v_terms;  // the column of V beyond the simplex itself
    for (const auto& s : columns) {
      tick();
      // emergent pair: the oldest cofacet, if of the same value, found first; if nobody's
      // pivot, the column is reduced as it stands
      sv_.clear();
      numbering_.vertices(s.number, k, sv_);
      if (const auto first = oldest_equal_cofacet(s, sv_); first && pivots.count(first->simplex.number) == 0) {
        insert_vertex(sv_, first->position, first->vertex, tv_);
        if (!apparent_facet_of(first->simplex, tv_)) {
          // the coefficient of the pivot: the incidence of s in it
          pivots.emplace(first->simplex.number, pivot_entry{s, first->position % 2 == 1 ? -ring_one_ : ring_one_, 0, 0});
          if (o_.zero_persistence) {
            pairs.push_back({s.value, s.value, s.number, first->simplex.number});
            if (want_cocycles_) keep_cocycle(k, s, {});
          }
          continue;
        }
      }
      heap_.clear();
      v_terms.clear();
      push_coboundary(s, k, ring_one_);
      for (;;) {
        const auto p = pivot_of_heap();
        if (!p) {  // a cocycle that never becomes a coboundary: an essential class born at s
          pairs.push_back({s.value, std::nullopt, s.number, no_cell});
          if (want_cocycles_) {
            summed_.clear();
            append_summed(v_terms, summed_);
            keep_cocycle(k, s, summed_);
          }
          break;
        }
        const auto found = pivots.find(p->simplex.number);
        if (found != pivots.end()) {
          const pivot_entry& e = found->second;
          const R factor = -(p->coefficient * lacuna::inverse(e.coefficient));
          push_coboundary(e.column, k, factor);
          v_terms.push_back({e.column, factor});
          for (std::size_t t = e.begin; t < e.end; ++t) {
            const R c = factor * stored_[t].coefficient;
            push_coboundary(stored_[t].simplex, k, c);
            v_terms.push_back({stored_[t].simplex, c});
          }
          continue;
        }
        pv_.clear();
        numbering_.vertices(p->simplex.number, k + 1, pv_);
        if (const auto f = apparent_facet_of(p->simplex, pv_)) {
          // the pivot belongs to the column of an apparent pair (f, pivot): f's coboundary
          // is reduced as it stands, with the incidence of f in the pivot there
          const R factor = -(p->coefficient * lacuna::inverse(f->second));
          push_coboundary(f->first, k, factor);
          v_terms.push_back({f->first, factor});
          continue;
        }
        // a new pivot: the pair (s, p), the column of V kept (equal terms summed)
        pivot_entry e{s, p->coefficient, stored_.size(), stored_.size()};
        append_summed(v_terms, stored_);
        e.end = stored_.size();
        o_.control.require_memory((stored_.size() + heap_.size()) * sizeof(heap_entry) + cocycle_bytes_,
                                  "the stored columns of the implicit Vietoris-Rips reduction");
        pivots.emplace(p->simplex.number, e);
        if (o_.zero_persistence || s.value < p->simplex.value) {
          pairs.push_back({s.value, p->simplex.value, s.number, p->simplex.number});
          // the column of V: s and the stored terms (the theory is at keep_cocycle)
          if (want_cocycles_)
            keep_cocycle(k, s, std::span<const heap_entry>(stored_).subspan(e.begin, e.end - e.begin));
        }
        break;
      }
    }
    tick.finish();
    heap_.clear();
    heap_.shrink_to_fit();
  }

  const rips_metric& m_;
  const implicit_rips_options& o_;
  R ring_one_;
  std::size_t n_;
  simplex_numbering numbering_;
  double threshold_ = 0;
  std::vector<heap_entry> heap_;
  std::vector<heap_entry> stored_;
  // representative cocycles, only when asked for: per dimension, one per reported pair
  bool want_cocycles_ = false;
  std::vector<std::vector<std::vector<heap_entry>>> cocycles_;
  std::vector<heap_entry> summed_;
  std::size_t cocycle_bytes_ = 0;
  std::vector<std::uint32_t> scratch_, sv_, tv_, pv_;
  scratch_space work_;
};

}  // namespace detail

namespace detail {
template <class R>
void check_implicit_rips_arguments(const rips_metric& metric, const implicit_rips_options& options, const R& ring_one) {
  if (options.max_dimension < 0)
    throw std::invalid_argument("lacuna::implicit_rips_persistence: negative max_dimension");
  if (options.threshold && std::isnan(*options.threshold))
    throw std::invalid_argument("lacuna::implicit_rips_persistence: the threshold is not a number");
  if (ring_one == zero<R>()) throw std::invalid_argument("lacuna::implicit_rips_persistence: the unit of the field is zero");
  if (metric.size() >= std::numeric_limits<std::uint32_t>::max())
    throw std::length_error("lacuna::implicit_rips_persistence: more than 2^32 - 2 points");
}
}  // namespace detail

/// The persistent homology over the field R (default Z/2) of the Vietoris–Rips filtration of
/// `metric`, diagrams of dimensions 0..options.max_dimension, computed without building the
/// complex (see the file comment for the method, the order, the threshold and the cells).
/// `ring_one` is the one of R (mod_p_dynamic(1, p)). Throws std::invalid_argument for a negative
/// max_dimension, a threshold that is not a number, or a zero unit; std::length_error when
/// simplex numbers would pass 63 bits; computation_stopped on a stop request;
/// memory_limit_exceeded past options.control.memory_limit.
/// Cost: O(n^2) distances and edges, then per dimension the simplices enumerated once and the
/// columns that are not paired by a shortcut reduced (each coboundary O(n k) to enumerate).
template <field R = z2>
persistence_result<double, R> implicit_rips_persistence(const rips_metric& metric,
                                                        const implicit_rips_options& options = {},
                                                        const R& ring_one = one<R>()) {
  detail::check_implicit_rips_arguments(metric, options, ring_one);
  detail::implicit_rips_engine<R> engine(metric, options, ring_one);
  return engine.run();
}

/// implicit_rips_persistence with a representative cocycle for every pair it reports:
/// cocycles[k][j] belongs to persistence[k].pairs[j] (sorted together). For a k-class born
/// at the k-simplex b (birth_cell) and killed at the (k+1)-simplex p (death_cell), z is a
/// k-cochain with coefficient 1 on b, of simplices entering no earlier than b (for k >= 1;
/// all vertices enter at 0), whose coboundary vanishes on every (k+1)-simplex entering before
/// p and not on p: restricted to K_t, birth <= t < death, z is a cocycle whose cohomology
/// class is not zero, and these classes of the pairs alive at t form a basis of H^k(K_t; R)
/// (de Silva, Morozov & Vejdemo-Johansson 2011). For an essential class δz = 0 on the whole
/// complex (within the threshold). k >= 1: the column of the coboundary reduction (see the
/// engine); k = 0: the indicator (coefficient 1 on each vertex) of the component of b just
/// before p enters, or at the threshold for an essential class. Terms are in the order of
/// the filtration, oldest first (for k >= 1, b first). Pairs of persistence zero are
/// dropped, with their cocycles, unless options.zero_persistence.
/// Cost beyond implicit_rips_persistence: the terms of the cocycles (their columns are kept
/// anyway when they needed additions), which options.control.memory_limit also bounds, and
/// for H_0 a second union-find pass over the edges; the H_0 cocycles hold together the sum
/// of the sizes of the dying components, at most n(n+1)/2 vertices.
template <field R = z2>
implicit_rips_cocycles<R> implicit_rips_persistence_with_cocycles(const rips_metric& metric,
                                                                 const implicit_rips_options& options = {},
                                                                 const R& ring_one = one<R>()) {
  detail::check_implicit_rips_arguments(metric, options, ring_one);
  detail::implicit_rips_engine<R> engine(metric, options, ring_one);
  return engine.run_with_cocycles();
}

}  // namespace lacuna

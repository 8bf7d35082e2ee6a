// lacuna/persistence/rips_filtration.hpp — the Vietoris–Rips filtration of a point cloud
// (Euclidean distances) or of a distance matrix, built explicitly.
//
// A simplex enters at the largest distance between two of its points, a point at 0. The
// complex holds every simplex of dimension <= max_dimension whose edges are no longer than
// the threshold (all of them without one): the clique complex of the graph of short edges
// (lacuna::clique_complex), with vertex i the i-th point, so that a simplex is named by its
// point numbers from 0 ("0 4 7"). Values: an edge's distance, and for a simplex of dimension
// >= 2 the largest value of its facets (every edge lies in a facet).
//
// Distances of points are computed exactly as the file formats of lacuna say: in IEEE double
// precision, the square root of the sum, in coordinate order, of the squared differences —
// never contracted into fused multiply-adds, so that equal configurations give equal bits.
//
// This is the explicit construction, for small and medium inputs: O(n^2) distances, then
// every simplex of the complex stored (4(k+1) + 8 bytes per k-simplex).
#pragma once

#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/persistence/filtration.hpp>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <optional>
#include <span>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

namespace detail {
/// x, through a register the optimizer cannot see into: keeps a product from being fused
/// with the addition that follows it (an FMA rounds once, the contract rounds twice).
inline double unfused(double x) noexcept {
#if defined(__GNUC__) && defined(__x86_64__)
  __asm__("" : "+x"(x));
#elif defined(__GNUC__) && defined(__aarch64__)
  __asm__("" : "+w"(x));
#endif
  return x;
}

/// The distance of euclidean_distance for two points of `dimension` coordinates each (no
/// check): the square root of the sum, in coordinate order, of the rounded squares.
inline double euclidean_distance_of(const double* a, const double* b, std::size_t dimension) noexcept {
  double sum = 0.0;
  for (std::size_t i = 0; i < dimension; ++i) {
    const double d = a[i] - b[i];
    sum += unfused(d * d);
  }
  return std::sqrt(sum);
}

/// The input rules of point clouds and distance matrices, shared by rips_filtration and
/// rips_metric (persistence/implicit_rips.hpp); `who` starts each message.
/// Points: dimension >= 1, the coordinates split into points, every one finite.
inline void check_point_coordinates(std::span<const double> coordinates, std::size_t dimension, const std::string& who) {
  if (dimension == 0) throw std::invalid_argument(who + ": points of dimension 0");
  if (coordinates.size() % dimension != 0)
    throw std::invalid_argument(who + ": " + std::to_string(coordinates.size()) +
                                " coordinates do not make points of dimension " + std::to_string(dimension));
  for (std::size_t i = 0; i < coordinates.size(); ++i)
    if (!std::isfinite(coordinates[i]))
      throw std::invalid_argument(who + ": coordinate " + std::to_string(i % dimension) + " of point " +
                                  std::to_string(i / dimension) + " is not finite");
}
/// Points given as vectors, all of the dimension of the first, one after the other.
inline std::vector<double> flatten_points(const std::vector<std::vector<double>>& points, const std::string& who) {
  std::vector<double> flat;
  if (points.empty()) return flat;
  const std::size_t dimension = points.front().size();
  flat.reserve(points.size() * dimension);
  for (std::size_t i = 0; i < points.size(); ++i) {
    if (points[i].size() != dimension)
      throw std::invalid_argument(who + ": point " + std::to_string(i) + " has " + std::to_string(points[i].size()) +
                                  " coordinates, point 0 has " + std::to_string(dimension));
    flat.insert(flat.end(), points[i].begin(), points[i].end());
  }
  return flat;
}
/// A distance matrix: n x n numbers, row after row, finite, not negative, zero on the
/// diagonal and symmetric (equal as given).
inline void check_distance_matrix(std::size_t n, std::span<const double> matrix, const std::string& who) {
  if (matrix.size() != n * n)
    throw std::invalid_argument(who + ": " + std::to_string(matrix.size()) + " distances for a matrix of " +
                                std::to_string(n) + " points");
  auto where = [](std::size_t i, std::size_t j) {
    return "the distance in row " + std::to_string(i) + ", column " + std::to_string(j);
  };
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < n; ++j) {
      const double d = matrix[i * n + j];
      if (!std::isfinite(d)) throw std::invalid_argument(who + ": " + where(i, j) + " is not finite");
      if (d < 0) throw std::invalid_argument(who + ": " + where(i, j) + " is negative");
      if (i == j && d != 0) throw std::invalid_argument(who + ": " + where(i, j) + " is not zero");
      if (d != matrix[j * n + i]) throw std::invalid_argument(who + ": " + where(i, j) + " differs from " + where(j, i));
    }
}
}  // namespace detail

/// The Euclidean distance of two points of the same dimension: the IEEE double square root of
/// the sum, in coordinate order, of the squared differences (each square rounded, then each
/// addition). Throws std::invalid_argument for points of different dimensions.
inline double euclidean_distance(std::span<const double> a, std::span<const double> b) {
  if (a.size() != b.size())
    throw std::invalid_argument("lacuna::euclidean_distance: points of dimensions " + std::to_string(a.size()) +
                                " and " + std::to_string(b.size()));
  return detail::euclidean_distance_of(a.data(), b.data(), a.size());
}

/// How a Vietoris–Rips filtration is built.
struct rips_options {
  /// Simplices of dimension 0..max_dimension (>= 0). To get diagrams up to dimension D,
  /// build up to D + 1.
  int max_dimension = 2;
  /// Only edges no longer than this (and the simplices they span); none: every edge.
  std::optional<double> threshold{};
  /// Refuse (std::length_error) to build more simplices than this; the count is made first,
  /// without building anything. Default: no limit.
  std::size_t max_cells = std::numeric_limits<std::size_t>::max();
  /// A stop request, looked at while the distances are computed (null: none).
  const run_control* control = nullptr;
};

/// The Vietoris–Rips filtration of a finite metric space, explicit. Models lacuna::filtration
/// (values double, ascending); the complex is a simplicial_complex<std::uint32_t> whose vertex
/// i is the i-th point.
class rips_filtration {
 public:
  /// The complex: vertex i is the i-th point.
  using complex_type = simplicial_complex<std::uint32_t>;
  /// The values: distances.
  using value_type = double;

  /// The empty filtration.
  rips_filtration() = default;

  /// The filtration of points given by their coordinates, `dimension` numbers per point, one
  /// point after the other. Throws std::invalid_argument when the coordinates do not split
  /// into points of `dimension` (>= 1) numbers or one is not finite; std::length_error past
  /// options.max_cells.
  static rips_filtration from_points(std::span<const double> coordinates, std::size_t dimension,
                                     const rips_options& options = {}) {
    detail::check_point_coordinates(coordinates, dimension, "lacuna::rips_filtration");
    const std::size_t n = coordinates.size() / dimension;
    return build(n, [&](std::size_t a, std::size_t b) {
      return euclidean_distance(coordinates.subspan(a * dimension, dimension), coordinates.subspan(b * dimension, dimension));
    }, options);
  }
  /// The same for points given as vectors (all of one dimension).
  static rips_filtration from_points(const std::vector<std::vector<double>>& points, const rips_options& options = {}) {
    if (points.empty()) return build(0, [](std::size_t, std::size_t) { return 0.0; }, options);
    const auto flat = detail::flatten_points(points, "lacuna::rips_filtration");
    const std::size_t dimension = points.front().size();
    return from_points(flat, dimension, options);
  }
  /// The filtration of a distance matrix: n x n numbers, row after row, finite, not negative,
  /// zero on the diagonal and symmetric (equal as given). Throws std::invalid_argument naming
  /// the first entry that breaks a rule; std::length_error past options.max_cells.
  static rips_filtration from_distances(std::size_t n, std::span<const double> matrix, const rips_options& options = {}) {
    detail::check_distance_matrix(n, matrix, "lacuna::rips_filtration");
    return build(n, [&](std::size_t a, std::size_t b) { return matrix[a * n + b]; }, options);
  }

  // ---- the cell_complex interface (that of the simplicial complex) -----------------------
  ///@{
  /// The cell_complex interface, that of the simplicial complex.
  int top_dimension() const noexcept { return complex_.top_dimension(); }
  std::size_t cell_count(int k) const noexcept { return complex_.cell_count(k); }
  simplex_boundary boundary(int k, std::size_t i) const { return complex_.boundary(k, i); }
  ///@}
  /// The point numbers of the simplex, increasing, joined by single spaces ("0 4 7").
  std::string cell_name(int k, std::size_t i) const { return complex_.cell_name(k, i); }

  // ---- the filtration ---------------------------------------------------------------------
  /// The value of the i-th k-simplex: the largest distance between two of its points.
  double cell_value(int k, std::size_t i) const { return values_[static_cast<std::size_t>(k)][i]; }

  /// The simplicial complex (vertex i is point i).
  const complex_type& complex() const noexcept { return complex_; }
  /// The points of the i-th k-simplex, increasing.
  std::span<const std::uint32_t> vertices(int k, std::size_t i) const { return complex_.vertices(k, i); }
  /// The number of points.
  std::size_t point_count() const noexcept { return complex_.vertex_count(); }
  /// All values, values()[k][i].
  const std::vector<std::vector<double>>& values() const noexcept { return values_; }

 private:
  template <class Distance>
  static rips_filtration build(std::size_t n, Distance&& distance, const rips_options& options) {
    if (options.max_dimension < 0) throw std::invalid_argument("lacuna::rips_filtration: negative max_dimension");
    if (options.threshold && std::isnan(*options.threshold))
      throw std::invalid_argument("lacuna::rips_filtration: the threshold is not a number");
    if (n >= std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("lacuna::rips_filtration: more than 2^32 - 2 points");
    std::vector<std::uint32_t> vertices(n);
    for (std::size_t i = 0; i < n; ++i) vertices[i] = static_cast<std::uint32_t>(i);
    std::vector<std::pair<std::uint32_t, std::uint32_t>> edges;
    if (options.max_dimension >= 1) {
      detail::progress_ticker tick(options.control, "Vietoris-Rips distances", n);
      for (std::size_t a = 0; a < n; ++a) {
        for (std::size_t b = a + 1; b < n; ++b)
          if (!options.threshold || distance(a, b) <= *options.threshold)
            edges.emplace_back(static_cast<std::uint32_t>(a), static_cast<std::uint32_t>(b));
        tick();
      }
      tick.finish();
    }
    if (options.max_cells != std::numeric_limits<std::size_t>::max()) {
      std::size_t total = 0;
      for (std::size_t c : clique_counts(vertices, edges, options.max_dimension)) total += c;
      if (total > options.max_cells)
        throw std::length_error("lacuna::rips_filtration: " + std::to_string(total) + " simplices, more than the limit of " +
                                std::to_string(options.max_cells));
    }
    rips_filtration r;
    r.complex_ = clique_complex(vertices, edges, options.max_dimension);
    std::vector<std::pair<std::uint32_t, std::uint32_t>>().swap(edges);
    const int top = r.complex_.top_dimension();
    r.values_.resize(static_cast<std::size_t>(top + 1));
    if (top >= 0) r.values_[0].assign(r.complex_.cell_count(0), 0.0);
    if (top >= 1) {
      auto& v1 = r.values_[1];
      v1.reserve(r.complex_.cell_count(1));
      for (std::size_t i = 0; i < r.complex_.cell_count(1); ++i) {
        const auto e = r.complex_.vertices(1, i);
        v1.push_back(distance(e[0], e[1]));
      }
    }
    for (int k = 2; k <= top; ++k) {
      auto& vk = r.values_[static_cast<std::size_t>(k)];
      const auto& below = r.values_[static_cast<std::size_t>(k - 1)];
      vk.reserve(r.complex_.cell_count(k));
      for (std::size_t i = 0; i < r.complex_.cell_count(k); ++i) {
        double v = 0;
        for (int j = 0; j <= k; ++j) v = std::max(v, below[r.complex_.face_index(k, i, j)]);
        vk.push_back(v);
      }
    }
    return r;
  }

  complex_type complex_;
  std::vector<std::vector<double>> values_;
};

}  // namespace lacuna

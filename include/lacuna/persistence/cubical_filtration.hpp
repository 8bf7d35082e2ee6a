// lacuna/persistence/cubical_filtration.hpp — the sublevel and superlevel filtrations of an
// image or a volume of any dimension on the full cubical grid, without a cell object per cube.
//
// Every pixel (voxel) is a top cell that enters at its sample value, and every other cell
// enters with the first top cell containing it: the least of their values for the sublevel
// filtration, the largest for the superlevel one (whose order runs from the largest value
// down, so that a pair's birth is then at least its death). Every cell of the grid is present.
//
// Layout: the doubled grid of cubical_complex.hpp — for voxel extents n_1..n_D the grid has
// (2n_1+1) x ... x (2n_D+1) positions, voxel v sits at 2v+1, and a position's dimension is
// its number of odd coordinates. The k-cells are numbered by parity class (the set of odd
// axes, ascending as a bit mask), then by place in the class's sub-grid, axis 0 fastest —
// the numbering of cubical_complex when every cell is present, computed here by arithmetic:
// index <-> position is O(D), a cell's value O(2^(D-k)) sample reads, and the filtration
// holds nothing but the samples (and a few numbers per parity class).
// Orientation and names are those of cubical_complex: a cube whose free axes are
// a_1 < ... < a_k has boundary sum_j (-1)^(j-1) (upper face along a_j - lower face along
// a_j); "[2,3]x[5]" names the edge spanning 2..3 along axis 0, at 5 on axis 1.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/persistence/filtration.hpp>

#include <algorithm>
#include <array>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

/// Which way a filtration of samples runs.
enum class level_sets {
  sublevel,   ///< from the least value up
  superlevel  ///< from the largest value down
};

/// The order of sample values: a < b when ascending, a > b when descending (superlevel).
template <class T>
struct sample_order {
  /// True for the superlevel order (largest first).
  bool descending = false;
  /// a comes before b.
  constexpr bool operator()(const T& a, const T& b) const { return descending ? b < a : a < b; }
};

/// The sublevel or superlevel filtration of a D-dimensional image of samples of type T
/// (T models filtration_value; 1 <= D <= 8) on the full cubical grid. Models
/// lacuna::filtration and lacuna::complex_with_coboundary.
template <std::size_t D, filtration_value T>
class cubical_filtration {
  static_assert(D >= 1 && D <= 8, "cubical_filtration supports dimensions 1 to 8");

 public:
  /// The sample type T.
  using value_type = T;
  /// Voxel extents n_1..n_D (axis 0 first).
  using extents_type = std::array<std::size_t, D>;
  /// A position in the doubled grid (odd coordinates are free axes).
  using position_type = std::array<std::size_t, D>;
  /// The boundary range: inline storage, no heap allocation.
  using boundary_range = detail::small_incidence_range<2 * D>;
  /// The coboundary range: inline storage, no heap allocation.
  using coboundary_range = detail::small_incidence_range<2 * D>;
  /// The dimension D of the grid.
  static constexpr std::size_t dimension = D;
  /// The number of parity classes, 2^D.
  static constexpr unsigned class_count = 1u << D;

  /// The empty filtration.
  cubical_filtration() : cubical_filtration(extents_type{}, {}) {}

  /// The filtration of the samples (voxel v at v_1 + n_1 (v_2 + n_2 (...)), axis 0 fastest),
  /// running as `direction` says. Throws std::invalid_argument when the number of samples is
  /// not the product of the extents or a sample is not ordered against itself (a NaN),
  /// std::length_error when the grid overflows std::size_t.
  cubical_filtration(const extents_type& extents, std::vector<T> samples, level_sets direction = level_sets::sublevel)
      : extents_(extents), samples_(std::move(samples)), order_{direction == level_sets::superlevel} {
    std::size_t voxels = 1;
    for (std::size_t a = 0; a < D; ++a) {
      if (extents[a] > (std::numeric_limits<std::size_t>::max() - 1) / 2)
        throw std::length_error("cubical_filtration: the grid size overflows std::size_t");
      const auto v = detail::checked_mul(voxels, extents[a]);
      if (!v) throw std::length_error("cubical_filtration: the grid size overflows std::size_t");
      voxels = *v;
      stride_[a] = a == 0 ? 1 : stride_[a - 1] * extents[a - 1];
    }
    if (samples_.size() != voxels)
      throw std::invalid_argument("cubical_filtration: " + std::to_string(samples_.size()) + " samples for " +
                                  std::to_string(voxels) + " voxels");
    for (std::size_t v = 0; v < samples_.size(); ++v)
      if (!(samples_[v] == samples_[v]))
        throw std::invalid_argument("cubical_filtration: sample " + std::to_string(v) + " is not a number");
    empty_ = voxels == 0;
    std::array<unsigned, class_count> masks{};
    for (unsigned m = 0; m < class_count; ++m) masks[m] = m;
    std::stable_sort(masks.begin(), masks.end(), [](unsigned x, unsigned y) { return std::popcount(x) < std::popcount(y); });
    counts_.fill(0);
    for (unsigned m : masks) {
      const auto k = static_cast<std::size_t>(std::popcount(m));
      std::size_t size = 1;
      for (std::size_t a = 0; a < D; ++a) {
        sub_stride_[m][a] = size;
        const std::size_t e = ((m >> a) & 1u) ? extents_[a] : extents_[a] + 1;
        const auto s = detail::checked_mul(size, e);
        if (!s) throw std::length_error("cubical_filtration: the grid size overflows std::size_t");
        size = *s;
      }
      if (empty_) size = 0;
      first_index_[m] = counts_[k];
      class_size_[m] = size;
      counts_[k] += size;
      masks_by_dimension_[k].push_back(m);
    }
  }

  // ---- the cell_complex interface ---------------------------------------------------------

  /// D, or -1 when there is no voxel.
  int top_dimension() const noexcept { return empty_ ? -1 : static_cast<int>(D); }
  /// The number of k-cells; 0 outside 0..D.
  std::size_t cell_count(int k) const noexcept {
    return (k < 0 || k > static_cast<int>(D)) ? 0 : counts_[static_cast<std::size_t>(k)];
  }
  /// The boundary of the i-th k-cell: per free axis (ascending) the lower face, then the upper.
  boundary_range boundary(int k, std::size_t i) const { return boundary_at(position(k, i)); }
  /// The boundary of the cell at position p (see boundary()).
  boundary_range boundary_at(const position_type& p) const noexcept {
    boundary_range out;
    std::int64_t sign = 1;
    for (std::size_t a = 0; a < D; ++a) {
      if ((p[a] & 1) == 0) continue;
      position_type q = p;
      q[a] = p[a] - 1;
      out.push_back({index_of(q), -sign});
      q[a] = p[a] + 1;
      out.push_back({index_of(q), sign});
      sign = -sign;
    }
    return out;
  }
  /// The (k+1)-cells with the i-th k-cell as a face, with the coefficients of their
  /// boundaries: per bound axis (ascending) the coface below, then the one above.
  coboundary_range coboundary(int k, std::size_t i) const { return coboundary_at(position(k, i)); }
  /// The coboundary of the cell at position p (see coboundary()).
  coboundary_range coboundary_at(const position_type& p) const noexcept {
    coboundary_range out;
    unsigned odd_below = 0;
    for (std::size_t a = 0; a < D; ++a) {
      if (p[a] & 1) {
        ++odd_below;
        continue;
      }
      const std::int64_t sign = (odd_below % 2 == 0) ? 1 : -1;
      position_type q = p;
      if (p[a] > 0) {
        q[a] = p[a] - 1;
        out.push_back({index_of(q), sign});
      }
      if (p[a] < 2 * extents_[a]) {
        q[a] = p[a] + 1;
        out.push_back({index_of(q), -sign});
      }
    }
    return out;
  }
  /// "[2,3]x[5]": per axis (axis 0 first) the interval of voxel-corner coordinates.
  std::string cell_name(int k, std::size_t i) const { return position_name(position(k, i)); }
  /// The name of a grid position (see cell_name).
  static std::string position_name(const position_type& p) {
    std::string s;
    for (std::size_t a = 0; a < D; ++a) {
      if (a > 0) s += 'x';
      s += '[';
      s += std::to_string(p[a] / 2);
      if (p[a] & 1) {
        s += ',';
        s += std::to_string(p[a] / 2 + 1);
      }
      s += ']';
    }
    return s;
  }

  // ---- the filtration ---------------------------------------------------------------------

  /// The value of the i-th k-cell: the first (least, or largest for superlevel) sample of
  /// the voxels containing it.
  T cell_value(int k, std::size_t i) const { return value_at(position(k, i)); }
  /// The order of the values: ascending for sublevel, descending for superlevel.
  sample_order<T> value_order() const noexcept { return order_; }
  /// Which way the filtration runs.
  level_sets direction() const noexcept { return order_.descending ? level_sets::superlevel : level_sets::sublevel; }

  /// The value of the cell at grid position p.
  T value_at(const position_type& p) const {
    // The voxels containing p: along an odd axis the one voxel (p-1)/2, along an even axis
    // those at p/2 - 1 and p/2 that exist.
    std::array<std::size_t, D> lo{}, count{};
    for (std::size_t a = 0; a < D; ++a) {
      if (p[a] & 1) {
        lo[a] = (p[a] - 1) / 2;
        count[a] = 1;
      } else {
        const std::size_t x = p[a] / 2;
        lo[a] = x > 0 ? x - 1 : 0;
        count[a] = static_cast<std::size_t>((x > 0 ? 1 : 0) + (x < extents_[a] ? 1 : 0));
      }
    }
    std::size_t base = 0;
    for (std::size_t a = 0; a < D; ++a) base += lo[a] * stride_[a];
    const T* best = &samples_[base];
    std::array<std::size_t, D> t{};
    for (;;) {
      std::size_t a = 0;
      for (; a < D; ++a) {
        if (++t[a] < count[a]) break;
        t[a] = 0;
      }
      if (a == D) break;
      std::size_t v = base;
      for (std::size_t b = 0; b < D; ++b) v += t[b] * stride_[b];
      if (order_(samples_[v], *best)) best = &samples_[v];
    }
    return *best;
  }

  // ---- positions --------------------------------------------------------------------------

  /// Voxel extents n_1..n_D.
  const extents_type& extents() const noexcept { return extents_; }
  /// The samples, axis 0 fastest.
  const std::vector<T>& samples() const noexcept { return samples_; }
  /// The sample of voxel v (voxel coordinates).
  const T& sample(const extents_type& v) const {
    std::size_t i = 0;
    for (std::size_t a = 0; a < D; ++a) i += v[a] * stride_[a];
    return samples_[i];
  }
  /// The dimension of a grid position: its number of odd coordinates.
  static int dimension_of(const position_type& p) noexcept {
    int d = 0;
    for (auto x : p) d += static_cast<int>(x & 1);
    return d;
  }
  /// The index (within its dimension) of the cell at grid position p. Precondition: p lies in
  /// the grid (p_a <= 2 n_a).
  std::size_t index_of(const position_type& p) const noexcept {
    unsigned m = 0;
    for (std::size_t a = 0; a < D; ++a) m |= static_cast<unsigned>(p[a] & 1) << a;
    std::size_t sub = 0;
    for (std::size_t a = 0; a < D; ++a) sub += (p[a] >> 1) * sub_stride_[m][a];
    return first_index_[m] + sub;
  }
  /// The grid position of the i-th k-cell. Throws std::out_of_range for a bad (k, i).
  position_type position(int k, std::size_t i) const {
    if (k < 0 || k > static_cast<int>(D) || i >= counts_[static_cast<std::size_t>(k)])
      throw std::out_of_range("cubical_filtration: no cell " + std::to_string(i) + " in dimension " + std::to_string(k));
    const auto& ms = masks_by_dimension_[static_cast<std::size_t>(k)];
    std::size_t s = 0;
    while (s + 1 < ms.size() && first_index_[ms[s + 1]] <= i) ++s;
    const unsigned m = ms[s];
    std::size_t sub = i - first_index_[m];
    position_type p{};
    for (std::size_t a = 0; a < D; ++a) {
      const std::size_t e = ((m >> a) & 1u) ? extents_[a] : extents_[a] + 1;
      p[a] = 2 * (sub % e) + ((m >> a) & 1u);
      sub /= e;
    }
    return p;
  }
  /// The index of the first cell of the parity class `odd_axes` among the cells of its
  /// dimension, and the class's size and sub-grid strides (axis 0 fastest).
  std::size_t class_first_index(unsigned odd_axes) const noexcept { return first_index_[odd_axes]; }
  /// The number of cells of the parity class `odd_axes`.
  std::size_t class_size(unsigned odd_axes) const noexcept { return class_size_[odd_axes]; }
  /// The strides of the sub-grid of the parity class `odd_axes` (axis 0 fastest).
  const std::array<std::size_t, D>& class_strides(unsigned odd_axes) const noexcept { return sub_stride_[odd_axes]; }
  /// The voxel strides (axis 0 fastest).
  const std::array<std::size_t, D>& voxel_strides() const noexcept { return stride_; }

 private:
  extents_type extents_{};
  std::vector<T> samples_;
  sample_order<T> order_{};
  bool empty_ = true;
  std::array<std::size_t, D> stride_{};
  std::array<std::array<std::size_t, D>, class_count> sub_stride_{};
  std::array<std::size_t, class_count> first_index_{};
  std::array<std::size_t, class_count> class_size_{};
  std::array<std::size_t, D + 1> counts_{};
  std::array<std::vector<unsigned>, D + 1> masks_by_dimension_{};
};

}  // namespace lacuna

// lacuna/chain/reducible_complex.hpp — a sparse chain complex over R laid out for
// elimination, built from any lacuna::cell_complex.
//
// Layout, and why: every cell keeps its boundary as a short vector of (face, coefficient)
// sorted by face, and its cofaces as a vector of indices. Elimination of a pivot (a, b)
// touches the cofaces of b (their boundaries absorb a multiple of the boundary of a), the
// cofaces of a (which lose a), and the faces of a and b (whose coface lists lose them).
// Both directions are therefore needed; boundary matrices by columns alone would make the
// coface step a search. Indices are 32-bit: a dimension holds fewer than 2^32 cells.
//
// Internal levels: level L holds the cells of dimension L + offset. offset is 0, or -1 when
// the complex is augmented with the empty cell in dimension -1 (reduced homology), whose
// coboundary is the sum of all vertices.
//
// The same structure is built "dual" (cohomology): level L then holds the cells of
// dimension top - L, and the boundary of a cell is its coboundary.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna {

/// One non-zero entry of a sparse column or row.
template <class R>
struct sparse_entry {
  std::uint32_t index;
  R value;
};

/// How to build a reducible_complex from a cell complex.
struct reducible_build_options {
  bool augmented = false;  ///< add the empty cell in dimension -1 (reduced homology)
  bool dual = false;       ///< coboundaries as boundaries: level L = dimension top - L
  /// Cells to leave out, for the quotient chain complex C(X)/C(A) (relative homology):
  /// excluded[k][i] true drops the i-th k-cell and every term in it. Empty: keep all.
  const std::vector<std::vector<bool>>* excluded = nullptr;
};

/// A mutable sparse chain complex. R models commutative_ring (the working coefficients).
template <class R>
class reducible_complex {
 public:
  enum class state : std::uint8_t { active, eliminated, critical };

  /// Levels 0..levels()-1.
  int levels() const { return static_cast<int>(bd_.size()); }
  /// The dimension of the cells at a level.
  int dimension_of_level(int level) const { return dual_ ? top_ - level : level + offset_; }
  /// The level of a dimension (may be outside 0..levels()-1).
  int level_of_dimension(int dim) const { return dual_ ? top_ - dim : dim - offset_; }
  bool is_dual() const { return dual_; }
  std::size_t size(int level) const { return bd_[level].size(); }

  std::vector<sparse_entry<R>>& boundary(int level, std::uint32_t i) { return bd_[level][i]; }
  const std::vector<sparse_entry<R>>& boundary(int level, std::uint32_t i) const { return bd_[level][i]; }
  std::vector<std::uint32_t>& cofaces(int level, std::uint32_t i) { return cob_[level][i]; }
  const std::vector<std::uint32_t>& cofaces(int level, std::uint32_t i) const { return cob_[level][i]; }
  state& cell_state(int level, std::uint32_t i) { return state_[level][i]; }
  state cell_state(int level, std::uint32_t i) const { return state_[level][i]; }
  bool alive(int level, std::uint32_t i) const { return state_[level][i] != state::eliminated; }

  /// Maps an original cell index to this complex (identity unless cells were excluded) and back.
  std::uint32_t original_index(int level, std::uint32_t i) const {
    return to_original_[level].empty() ? i : to_original_[level][i];
  }
  const std::vector<std::uint32_t>& original_indices(int level) const { return to_original_[level]; }
  /// Original index -> local index (-1: excluded); empty when the level is the identity.
  const std::vector<std::int64_t>& local_indices(int level) const { return from_original_[level]; }
  /// -1 when the original cell was excluded.
  std::int64_t local_index(int level, std::size_t original) const {
    return from_original_[level].empty() ? static_cast<std::int64_t>(original) : from_original_[level][original];
  }

  /// Builds the complex of c, mapping an integer incidence n into R as from_integer<R>(n) *
  /// unit. `unit` is the one of R; it matters for rings whose modulus lives in the elements
  /// (mod_p_dynamic: pass a bound one, mod_p_dynamic(1, p)).
  template <cell_complex C>
  static reducible_complex build(const C& c, reducible_build_options opt = {}, const R& unit = one<R>()) {
    reducible_complex rc;
    const int top = lacuna::top_dimension(c);
    rc.top_ = top;
    rc.dual_ = opt.dual;
    rc.offset_ = opt.augmented ? -1 : 0;
    const int nlev = top < 0 ? (opt.augmented ? 1 : 0) : top + 1 + (opt.augmented ? 1 : 0);
    rc.bd_.resize(nlev);
    rc.cob_.resize(nlev);
    rc.state_.resize(nlev);
    rc.to_original_.resize(nlev);
    rc.from_original_.resize(nlev);
    if (opt.dual && opt.augmented) throw std::invalid_argument("reducible_complex: dual and augmented together");

    // Per dimension: which cells are kept, and their local indices.
    std::vector<std::vector<std::int64_t>> local(top + 1);
    std::vector<std::size_t> kept(top + 1, 0);
    for (int k = 0; k <= top; ++k) {
      const std::size_t n = lacuna::cell_count(c, k);
      if (n >= std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: more than 2^32-1 cells of dimension " + std::to_string(k));
      const bool has_excl = opt.excluded && static_cast<std::size_t>(k) < opt.excluded->size() &&
                            !(*opt.excluded)[k].empty();
      if (has_excl) {
        local[k].assign(n, -1);
        for (std::size_t i = 0; i < n; ++i)
          if (!(*opt.excluded)[k][i]) local[k][i] = static_cast<std::int64_t>(kept[k]++);
      } else {
        kept[k] = n;
      }
    }
    auto lvl = [&](int dim) { return rc.level_of_dimension(dim); };
    for (int k = 0; k <= top; ++k) {
      const int L = lvl(k);
      rc.bd_[L].resize(kept[k]);
      rc.cob_[L].resize(kept[k]);
      rc.state_[L].assign(kept[k], state::active);
      if (!local[k].empty()) {
        rc.from_original_[L] = local[k];
        rc.to_original_[L].resize(kept[k]);
        for (std::size_t i = 0; i < local[k].size(); ++i)
          if (local[k][i] >= 0) rc.to_original_[L][static_cast<std::size_t>(local[k][i])] = static_cast<std::uint32_t>(i);
      }
    }
    if (opt.augmented) {
      rc.bd_[0].resize(1);
      rc.cob_[0].resize(1);
      rc.state_[0].assign(1, state::active);
    }
    // Boundaries (or coboundaries, when dual) from the complex's incidences.
    std::vector<sparse_entry<std::int64_t>> scratch;
    for (int k = 1; k <= top; ++k) {
      const std::size_t n = lacuna::cell_count(c, k);
      const std::size_t nf = lacuna::cell_count(c, k - 1);
      for (std::size_t i = 0; i < n; ++i) {
        std::int64_t li = local[k].empty() ? static_cast<std::int64_t>(i) : local[k][i];
        if (li < 0) continue;
        scratch.clear();
        for (auto&& v : lacuna::boundary(c, k, i)) {
          const incidence inc = as_incidence(v);
          if (inc.face >= nf)
            throw invalid_complex("cell '" + lacuna::cell_name(c, k, i) + "' (dimension " + std::to_string(k) +
                                      "): face index " + std::to_string(inc.face) + " is out of range (" +
                                      std::to_string(nf) + " cells of dimension " + std::to_string(k - 1) + ")",
                                  k, i);
          std::int64_t lf = local[k - 1].empty() ? static_cast<std::int64_t>(inc.face) : local[k - 1][inc.face];
          if (lf < 0 || inc.coefficient == 0) continue;
          scratch.push_back({static_cast<std::uint32_t>(lf), inc.coefficient});
        }
        std::sort(scratch.begin(), scratch.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
        const auto cell = static_cast<std::uint32_t>(li);
        // Add up repeated faces; an overflowing sum is an error, never a silent wrap.
        for (std::size_t s = 0; s < scratch.size();) {
          std::size_t t = s;
          std::int64_t sum = 0;
          for (; t < scratch.size() && scratch[t].index == scratch[s].index; ++t)
            if (__builtin_add_overflow(sum, scratch[t].value, &sum))
              throw invalid_complex("cell '" + lacuna::cell_name(c, k, i) + "' (dimension " + std::to_string(k) +
                                      "): its incidence numbers overflow 64 bits", k, i);
          if (sum != 0) {
            const R val = from_integer<R>(sum) * unit;
            if (!(val == zero<R>())) {
              if (!opt.dual) {
                rc.bd_[lvl(k)][cell].push_back({scratch[s].index, val});
                rc.cob_[lvl(k - 1)][scratch[s].index].push_back(cell);
              } else {  // the coboundary of the face gains this cell
                rc.bd_[lvl(k - 1)][scratch[s].index].push_back({cell, val});
                rc.cob_[lvl(k)][cell].push_back(scratch[s].index);
              }
            }
          }
          s = t;
        }
      }
    }
    if (opt.dual) {  // coboundaries were appended in cell order: already sorted by index
      for (auto& level : rc.bd_)
        for (auto& col : level) col.shrink_to_fit();
    }
    if (opt.augmented && top >= 0) {  // the empty cell is the common face of all vertices
      const int L0 = lvl(0);
      for (std::uint32_t v = 0; v < rc.bd_[L0].size(); ++v) {
        rc.bd_[L0][v].push_back({0, unit});
        rc.cob_[0][0].push_back(v);
      }
    }
    return rc;
  }

  /// A matrix as a complex of two levels: level 0 its rows, level 1 its columns, the
  /// boundary of column j its entries. `convert` maps an entry to R (and may throw
  /// coefficient_overflow). This is how the elimination of one matrix reuses the engine.
  template <class Matrix, class Convert>
  static reducible_complex from_matrix(const Matrix& m, Convert convert) {
    reducible_complex rc;
    rc.top_ = 1;
    rc.bd_.resize(2);
    rc.cob_.resize(2);
    rc.state_.resize(2);
    rc.to_original_.resize(2);
    rc.from_original_.resize(2);
    if (m.rows >= std::numeric_limits<std::uint32_t>::max() || m.cols >= std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("lacuna: a matrix side of 2^32 or more");
    rc.bd_[0].resize(m.rows);
    rc.cob_[0].resize(m.rows);
    rc.state_[0].assign(m.rows, state::active);
    rc.bd_[1].resize(m.cols);
    rc.cob_[1].resize(m.cols);
    rc.state_[1].assign(m.cols, state::active);
    for (std::uint32_t j = 0; j < m.cols; ++j)
      for (const auto& e : m.columns[j]) {
        rc.bd_[1][j].push_back({e.index, convert(e.value)});
        rc.cob_[0][e.index].push_back(j);
      }
    return rc;
  }

 private:
  int top_ = -1, offset_ = 0;
  bool dual_ = false;
  std::vector<std::vector<std::vector<sparse_entry<R>>>> bd_;
  std::vector<std::vector<std::vector<std::uint32_t>>> cob_;
  std::vector<std::vector<state>> state_;
  std::vector<std::vector<std::uint32_t>> to_original_;
  std::vector<std::vector<std::int64_t>> from_original_;
};

}  // namespace lacuna

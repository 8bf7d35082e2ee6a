// lacuna/chain/elimination_workspace.hpp — a sparse chain complex over R laid out for
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

#include <lacuna/ring/checked.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/term.hpp>
#include <lacuna/chain/side_by_side.hpp>
#include <lacuna/chain/slotted_lists.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstdint>
#include <limits>
#include <span>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna {

/// One non-zero entry of a sparse column or row: `index` is its row (or column), `value` is
/// non-zero. The one term type (chain/term.hpp) with 32-bit indices.
template <class R>
using sparse_entry = term<std::uint32_t, R>;

/// How to build an elimination_workspace from a cell complex.
struct workspace_build_options {
  bool augmented = false;  ///< add the empty cell in dimension -1 (reduced homology)
  bool dual = false;       ///< coboundaries as boundaries: level L = dimension top - L
  /// Cells to leave out, for the quotient chain complex C(X)/C(A) (relative homology):
  /// excluded[k][i] true drops the i-th k-cell and every term in it. Empty: keep all.
  const std::vector<std::vector<bool>>* excluded = nullptr;
  /// Threads for the build (1: the calling thread only). With 2 or more, the boundary()
  /// of the complex is called from two threads at once.
  unsigned threads = 1;
  /// Stop request (checked every 4096 cells, from either thread); may be null.
  const run_control* control = nullptr;
};

/// The former name of workspace_build_options (it built a reducible_complex, now
/// elimination_workspace).
using reducible_build_options [[deprecated("lacuna: use workspace_build_options")]] = workspace_build_options;

/// A mutable sparse chain complex. R models commutative_ring (the working coefficients).
template <class R>
class elimination_workspace {
 public:
  /// What a reduction did with a cell: still active, eliminated in a pivot pair, or set aside as critical.
  enum class state : std::uint8_t { active, eliminated, critical };
  /// An entry of a boundary.
  using entry = sparse_entry<R>;

  /// Levels 0..levels()-1.
  int levels() const { return static_cast<int>(bd_.size()); }
  /// The dimension of the cells at a level.
  int dimension_of_level(int level) const { return dual_ ? top_ - level : level + offset_; }
  /// The level of a dimension (may be outside 0..levels()-1).
  int level_of_dimension(int dim) const { return dual_ ? top_ - dim : dim - offset_; }
  /// True if the levels hold coboundaries (level L = dimension top - L).
  bool is_dual() const { return dual_; }
  /// The number of cells at a level.
  std::size_t size(int level) const { return state_[index(level)].size(); }

  /// The boundary of a cell, sorted by face. Valid until the next change of a boundary.
  std::span<const entry> boundary(int level, std::uint32_t i) const { return bd_[index(level)][i]; }
  /// The cofaces of a cell, in no order. Valid until the next change of a coface list.
  std::span<const std::uint32_t> cofaces(int level, std::uint32_t i) const { return cob_[index(level)][i]; }
  ///@{
  /// The state of a cell; alive: not eliminated.
  state& cell_state(int level, std::uint32_t i) { return state_[index(level)][i]; }
  state cell_state(int level, std::uint32_t i) const { return state_[index(level)][i]; }
  bool alive(int level, std::uint32_t i) const { return state_[index(level)][i] != state::eliminated; }
  ///@}

  // ---- changes (for reductions) ----
  /// Replaces the boundary of a cell (entries sorted by face).
  void set_boundary(int level, std::uint32_t i, std::span<const entry> b) { bd_[index(level)].assign(i, b); }
  /// Removes the term of a face from a boundary, if present.
  void erase_face(int level, std::uint32_t i, std::uint32_t face) {
    auto b = bd_[index(level)][i];
    auto it = std::lower_bound(b.begin(), b.end(), face, [](const entry& e, std::uint32_t f) { return e.index < f; });
    if (it != b.end() && it->index == face) bd_[index(level)].erase_at(i, static_cast<std::size_t>(it - b.begin()));
  }
  /// Removes the term of a face from a boundary and returns its coefficient (zero if absent).
  R take_face(int level, std::uint32_t i, std::uint32_t face) {
    auto b = bd_[index(level)][i];
    auto it = std::lower_bound(b.begin(), b.end(), face, [](const entry& e, std::uint32_t f) { return e.index < f; });
    if (it == b.end() || it->index != face) return zero<R>();
    R v = it->value;
    bd_[index(level)].erase_at(i, static_cast<std::size_t>(it - b.begin()));
    return v;
  }
  /// Gives up the storage of a boundary (the cell was eliminated).
  void release_boundary(int level, std::uint32_t i) { bd_[index(level)].release(i); }
  /// Adds a coface to the coface list of a cell.
  void add_coface(int level, std::uint32_t i, std::uint32_t coface) { cob_[index(level)].push_back(i, coface); }
  /// Removes a coface from a coface list, if present.
  void remove_coface(int level, std::uint32_t i, std::uint32_t coface) {
    auto c = cob_[index(level)][i];
    auto it = std::find(c.begin(), c.end(), coface);
    if (it != c.end()) cob_[index(level)].swap_remove(i, static_cast<std::size_t>(it - c.begin()));
  }
  /// Empties the coface list of a cell.
  void clear_cofaces(int level, std::uint32_t i) { cob_[index(level)].clear(i); }
  /// Gives up the storage of a coface list.
  void release_cofaces(int level, std::uint32_t i) { cob_[index(level)].release(i); }
  /// Gives up the storage of every boundary and coface list at once; the levels, sizes, states
  /// and index maps stay. For a caller that needs only those after a reduction (the maps of
  /// the elimination log are read from the log, not from here).
  void release_incidences() {
    for (auto& b : bd_) b = slotted_lists<entry>();
    for (auto& c : cob_) c = slotted_lists<std::uint32_t>();
  }
  /// The bytes held by the boundaries, coface lists and states.
  std::size_t memory_bytes() const {
    std::size_t n = 0;
    for (int L = 0; L < levels(); ++L) n += bd_[L].memory_bytes() + cob_[L].memory_bytes() + state_[L].capacity();
    return n;
  }

  /// Maps an original cell index to this complex (identity unless cells were excluded) and back.
  std::uint32_t original_index(int level, std::uint32_t i) const {
    return to_original_[index(level)].empty() ? i : to_original_[index(level)][i];
  }
  /// Local index -> original index at a level; empty when the level is the identity.
  const std::vector<std::uint32_t>& original_indices(int level) const { return to_original_[level]; }
  /// Original index -> local index (-1: excluded); empty when the level is the identity.
  const std::vector<std::int64_t>& local_indices(int level) const { return from_original_[index(level)]; }
  /// -1 when the original cell was excluded.
  std::int64_t local_index(int level, std::size_t original) const {
    return from_original_[level].empty() ? static_cast<std::int64_t>(original) : from_original_[level][original];
  }

  /// Builds the complex of c, mapping an integer incidence n into R as from_integer<R>(n) *
  /// unit. `ring_one` is the one of R; it matters for rings whose modulus lives in the elements
  /// (mod_p_dynamic: pass a bound one, mod_p_dynamic(1, p)).
  template <cell_complex C>
  static elimination_workspace build(const C& c, workspace_build_options opt = {}, const R& ring_one = one<R>()) {
    if (opt.dual && opt.augmented) throw std::invalid_argument("elimination_workspace: dual and augmented together");
    elimination_workspace rc;
    const int top = lacuna::top_dimension(c);
    rc.top_ = top;
    rc.dual_ = opt.dual;
    rc.offset_ = opt.augmented ? -1 : 0;
    const int nlev = top < 0 ? (opt.augmented ? 1 : 0) : top + 1 + (opt.augmented ? 1 : 0);
    rc.resize_levels(nlev);

    // Per dimension: which cells are kept, and their local indices.
    std::vector<std::vector<std::int64_t>> local(index(top + 1));
    std::vector<std::size_t> kept(index(top + 1), 0);
    for (int k = 0; k <= top; ++k) {
      const std::size_t n = lacuna::cell_count(c, k);
      if (n >= std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: more than 2^32-1 cells of dimension " + std::to_string(k));
      const bool has_excl = opt.excluded && static_cast<std::size_t>(k) < opt.excluded->size() &&
                            !(*opt.excluded)[index(k)].empty();
      if (has_excl) {
        local[index(k)].assign(n, -1);
        for (std::size_t i = 0; i < n; ++i)
          if (!(*opt.excluded)[index(k)][i]) local[index(k)][i] = static_cast<std::int64_t>(kept[index(k)]++);
      } else {
        kept[index(k)] = n;
      }
    }
    auto lvl = [&](int dim) { return rc.level_of_dimension(dim); };
    for (int k = 0; k <= top; ++k) {
      const int L = lvl(k);
      rc.state_[index(L)].assign(kept[index(k)], state::active);
      if (!local[index(k)].empty()) {
        rc.from_original_[index(L)] = local[index(k)];
        rc.to_original_[index(L)].resize(kept[index(k)]);
        for (std::size_t i = 0; i < local[index(k)].size(); ++i)
          if (local[index(k)][i] >= 0)
            rc.to_original_[index(L)][static_cast<std::size_t>(local[index(k)][i])] = static_cast<std::uint32_t>(i);
      }
    }
    if (opt.augmented) rc.state_[0].assign(1, state::active);

    // For each k >= 1, the k-th boundary in CSR (columns: k-cells), then its transpose.
    std::vector<std::vector<entry>> down_data(index(top + 1));
    std::vector<std::vector<std::uint64_t>> down_off(index(top + 1));
    auto build_dimension = [&](int k) {
      std::vector<sparse_entry<std::int64_t>> scratch;
      std::vector<sparse_entry<integer>> exact;  // terms beyond int64, and every term of a cell summed exactly
      const std::size_t n = lacuna::cell_count(c, k);
      const std::size_t nf = lacuna::cell_count(c, k - 1);
      auto& data = down_data[index(k)];
      auto& off = down_off[index(k)];
      off.reserve(kept[index(k)] + 1);
      off.push_back(0);
      for (std::size_t i = 0; i < n; ++i) {
        if (opt.control && (i & 4095) == 0) opt.control->check();
        const std::int64_t li = local[index(k)].empty() ? static_cast<std::int64_t>(i) : local[index(k)][i];
        if (li < 0) continue;
        scratch.clear();
        exact.clear();
        for (auto&& v : lacuna::boundary(c, k, i)) {
          const std::size_t face = incidence_face(v);
          if (face >= nf)
            throw invalid_complex("cell '" + lacuna::cell_name(c, k, i) + "' (dimension " + std::to_string(k) +
                                      "): face index " + std::to_string(face) + " is out of range (" +
                                      std::to_string(nf) + " cells of dimension " + std::to_string(k - 1) + ")",
                                  k, i);
          const std::int64_t lf = local[index(k - 1)].empty() ? static_cast<std::int64_t>(face) : local[index(k - 1)][face];
          if (lf < 0) continue;
          if constexpr (small_incidence_like<std::remove_cvref_t<decltype(v)>>) {
            const std::int64_t incidence = as_incidence(v).coefficient;
            if (incidence != 0) scratch.push_back({static_cast<std::uint32_t>(lf), incidence});
          } else {  // coefficients of any size: the int64 ones on the fast path, the others exact
            integer incidence = coefficient_as_integer(v);
            if (!incidence.is_small())
              exact.push_back({static_cast<std::uint32_t>(lf), std::move(incidence)});
            else if (incidence.small_value() != 0)
              scratch.push_back({static_cast<std::uint32_t>(lf), incidence.small_value()});
          }
        }
        std::sort(scratch.begin(), scratch.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
        // Add up repeated faces in int64 while every sum fits; otherwise exactly, in lacuna::integer.
        bool exact_sum = !exact.empty();
        for (std::size_t s = 0; s < scratch.size() && !exact_sum;) {
          std::size_t t = s;
          std::int64_t sum = 0;
          for (; t < scratch.size() && scratch[t].index == scratch[s].index && !exact_sum; ++t)
            exact_sum = checked_add(sum, scratch[t].value, sum);
          if (!exact_sum && sum != 0) {
            R val = from_integer<R>(sum) * ring_one;
            if (!(val == zero<R>())) data.push_back({scratch[s].index, std::move(val)});
          }
          s = t;
        }
        if (exact_sum) {
          // A big integer maps into R by coefficient_in (checked_int64 throws coefficient_overflow).
          data.erase(data.begin() + static_cast<std::ptrdiff_t>(off.back()), data.end());
          for (const auto& e : scratch) exact.push_back({e.index, integer(e.value)});
          std::stable_sort(exact.begin(), exact.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
          for (std::size_t s = 0; s < exact.size();) {
            std::size_t t = s;
            integer sum;
            for (; t < exact.size() && exact[t].index == exact[s].index; ++t) sum += exact[t].value;
            if (sum.sign() != 0) {
              R val = coefficient_in<R>(sum, ring_one);
              if (!(val == zero<R>())) data.push_back({exact[s].index, std::move(val)});
            }
            s = t;
          }
        }
        off.push_back(data.size());
      }
    };
    // Dimensions are independent: with threads, the largest one runs beside the others
    // (the result is the same; the complex's boundary() must then be safe to call from two
    // threads at once, as it is for lacuna's own complexes).
    if (opt.threads >= 2 && top >= 2) {
      int big = 1;
      std::size_t best = 0;
      for (int k = 1; k <= top; ++k) {
        const std::size_t w = kept[index(k)] * static_cast<std::size_t>(k + 1);
        if (w > best) best = w, big = k;
      }
      detail::side_by_side([&] { build_dimension(big); },
                           [&] {
                             for (int k = 1; k <= top; ++k)
                               if (k != big) build_dimension(k);
                           });
    } else {
      for (int k = 1; k <= top; ++k) build_dimension(k);
    }
    for (int k = 0; k <= top; ++k) {
      // The transpose of the (k+1)-th boundary: for each k-cell, its cofaces with values.
      const std::size_t nk = kept[index(k)];
      std::vector<std::uint64_t> up_off(nk + 1, 0);
      std::vector<entry> up_data;
      if (k + 1 <= top) {
        for (const auto& e : down_data[index(k + 1)]) ++up_off[e.index + 1];
        for (std::size_t i = 0; i < nk; ++i) up_off[i + 1] += up_off[i];
        up_data.resize(down_data[index(k + 1)].size(), entry{0, zero<R>()});
        std::vector<std::uint64_t> fill(up_off.begin(), up_off.end() - 1);
        const auto& off = down_off[index(k + 1)];
        for (std::size_t j = 0; j + 1 < off.size(); ++j)
          for (std::uint64_t t = off[j]; t < off[j + 1]; ++t) {
            const auto& e = down_data[index(k + 1)][t];
            up_data[fill[e.index]++] = {static_cast<std::uint32_t>(j), e.value};
          }
      }
      const int L = lvl(k);
      if (!opt.dual) {
        // boundary(level k) = down_data[k]; cofaces(level k) = indices of up_data
        if (k >= 1)
          rc.bd_[index(L)] = slotted_lists<entry>(std::move(down_data[index(k)]), down_off[index(k)]);
        else
          rc.bd_[index(L)] = slotted_lists<entry>(nk);
        std::vector<std::uint32_t> idx(up_data.size());
        for (std::size_t t = 0; t < up_data.size(); ++t) idx[t] = up_data[t].index;
        rc.cob_[index(L)] = slotted_lists<std::uint32_t>(std::move(idx), up_off);
      } else {
        // dual: boundary(level of k) = coboundary (up_data); cofaces = faces (down indices)
        rc.bd_[index(L)] = slotted_lists<entry>(std::move(up_data), up_off);
        if (k >= 1) {
          std::vector<std::uint32_t> idx(down_data[index(k)].size());
          for (std::size_t t = 0; t < down_data[index(k)].size(); ++t) idx[t] = down_data[index(k)][t].index;
          rc.cob_[index(L)] = slotted_lists<std::uint32_t>(std::move(idx), down_off[index(k)]);
          std::vector<entry>().swap(down_data[index(k)]);
        } else {
          rc.cob_[index(L)] = slotted_lists<std::uint32_t>(nk);
        }
      }
    }
    if (opt.augmented) {  // the empty cell is the common face of all vertices
      rc.bd_[0] = slotted_lists<entry>(1);
      rc.cob_[0] = slotted_lists<std::uint32_t>(1);
      if (top >= 0) {
        const int L0 = lvl(0);
        const std::size_t nv = rc.size(L0);
        for (std::uint32_t v = 0; v < nv; ++v) {
          const entry e{0, ring_one};
          std::vector<entry> b(rc.bd_[index(L0)][v].begin(), rc.bd_[index(L0)][v].end());
          b.insert(b.begin(), e);
          rc.bd_[index(L0)].assign(v, b);
          rc.cob_[0].push_back(0, v);
        }
      }
    }
    return rc;
  }

  /// A matrix as a complex of two levels: level 0 its rows, level 1 its columns, the
  /// boundary of column j its entries. `convert` maps an entry to R (and may throw
  /// coefficient_overflow). This is how the elimination of one matrix reuses the engine.
  template <class Matrix, class Convert>
  static elimination_workspace from_matrix(const Matrix& m, Convert convert) {
    if (m.rows >= std::numeric_limits<std::uint32_t>::max() || m.cols >= std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("lacuna: a matrix side of 2^32 or more");
    elimination_workspace rc;
    rc.top_ = 1;
    rc.resize_levels(2);
    rc.state_[0].assign(m.rows, state::active);
    rc.state_[1].assign(m.cols, state::active);
    std::vector<entry> data;
    std::vector<std::uint64_t> off{0};
    std::vector<std::uint64_t> up_off(m.rows + 1, 0);
    for (std::uint32_t j = 0; j < m.cols; ++j) {
      for (const auto& e : m.columns[j]) {
        data.push_back({e.index, convert(e.value)});
        ++up_off[e.index + 1];
      }
      off.push_back(data.size());
    }
    for (std::size_t i = 0; i < m.rows; ++i) up_off[i + 1] += up_off[i];
    std::vector<std::uint32_t> idx(data.size());
    std::vector<std::uint64_t> fill(up_off.begin(), up_off.end() - 1);
    for (std::uint32_t j = 0; j < m.cols; ++j)
      for (std::uint64_t t = off[j]; t < off[j + 1]; ++t) idx[fill[data[t].index]++] = j;
    rc.bd_[0] = slotted_lists<entry>(m.rows);
    rc.bd_[1] = slotted_lists<entry>(std::move(data), off);
    rc.cob_[0] = slotted_lists<std::uint32_t>(std::move(idx), up_off);
    rc.cob_[1] = slotted_lists<std::uint32_t>(m.cols);
    return rc;
  }

 private:
  /// A level (or, in build, a dimension >= 0) as an index of the per-level vectors.
  static std::size_t index(int level) { return static_cast<std::size_t>(level); }
  void resize_levels(int n) {
    bd_.resize(index(n));
    cob_.resize(index(n));
    state_.resize(index(n));
    to_original_.resize(index(n));
    from_original_.resize(index(n));
  }
  int top_ = -1, offset_ = 0;
  bool dual_ = false;
  std::vector<slotted_lists<entry>> bd_;
  std::vector<slotted_lists<std::uint32_t>> cob_;
  std::vector<std::vector<state>> state_;
  std::vector<std::vector<std::uint32_t>> to_original_;
  std::vector<std::vector<std::int64_t>> from_original_;
};

/// The former name of elimination_workspace (renamed because the object is the working state
/// of an elimination, not a kind of complex); kept so that stages written against it compile.
template <class R>
using reducible_complex [[deprecated("lacuna::reducible_complex is now lacuna::elimination_workspace")]] =
    elimination_workspace<R>;

}  // namespace lacuna

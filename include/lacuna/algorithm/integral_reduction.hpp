// lacuna/algorithm/integral_reduction.hpp — ranks and invariant factors of every boundary
// matrix of a chain complex over a Euclidean domain, by column reduction of the coboundary
// matrices with unit pivots only and clearing, and a Smith form of what is left.
//
// The method. For each level k = 0, 1, 2, ... in order, the coboundary δ_k = ∂_{k+1}^T
// (columns: cells of level k, rows: cells of level k+1; the "low" of a column is its largest
// row index) is reduced column by column, as persistence reduces boundary matrices (Edelsbrunner,
// Letscher & Zomorodian 2002) but keeping a pivot only where the low entry is a unit:
//   - while the low row of a column has a unit pivot u, the column takes col -= (a/u)·pivot;
//   - a unit low in a row without a pivot makes the column that row's pivot (the set U);
//   - a non-unit low in a row without a unit pivot defers the column, as it is, to Rest.
// Clearing (Chen & Kerber 2011, "twist"; in the coboundary direction de Silva, Morozov &
// Vejdemo-Johansson 2011): a column of δ_k with unit low at cell i of level k+1 makes the
// column i of δ_{k+1} skipped. Over Z this holds for unit lows only; the proof is at
// clearing_is_sound below. After the pass, every Rest column is reduced fully against U
// (Rest'); then SNF(δ_k) = I_|U| ⊕ SNF(Rest' on the rows that are not lows of U) (proof at
// finish_level), and that small remainder goes to finish_remainder (a modular or dense Smith
// form when small, else the sparse elimination of lacuna/algorithm/smith_normal_form.hpp).
//
// Why coboundaries and unit pivots: on complexes of graphs (matching and chessboard
// complexes; Dumas, Heckenbach, Saunders & Welker 2003 computed them by elimination) almost
// every coboundary column reduces with unit pivots, clearing skips about half the columns,
// and the few non-unit columns are left for a Smith form; no dense core of the whole
// complex is ever formed.
//
// The work, as the field route's column reduction (algorithm/field_reduction.hpp) does it: a
// working column is a sorted vector while short and a dense array with a bitset of touched
// rows once it and the pivot added to it pass 128 entries (each addition then costs the
// pivot's length only); with 64-bit coefficients the deferred columns are reduced 8 at a
// time, interleaved row by row, so that each unit pivot is read once for 8 columns. Both
// give exactly the columns the plain sorted merge gives (the same operations in the same
// order), so U, Rest' and every reported number are unchanged by them.
//
// Exactness: every reported number is a rank or an invariant factor of the exact matrix,
// obtained by unimodular column operations (and, in the proof only, row operations) and an
// exact Smith form; nothing is probabilistic. Working coefficients W are the caller's
// choice: checked_int64 throws coefficient_overflow instead of wrapping (the caller repeats
// with lacuna::integer), and any exact euclidean_domain works as itself.
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/lattice_smith.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <bit>
#include <type_traits>
#include <cstdint>
#include <limits>
#include <span>
#include <vector>

namespace lacuna {

/// The policy value of the coboundary route of lacuna::homology (ranks and torsion only):
/// unit-pivot column reduction of the coboundary matrices with clearing, then a Smith form
/// of the non-unit remainder. Routes asking for what it cannot give (generators,
/// coordinates, cohomology) run sparse_elimination{} instead (docs/homology.md).
struct coboundary_reduction {
  /// Remainders with at most this many entries (rows × columns) are finished by
  /// dense_smith_form, larger ones by smith_normal_form(..., sparse_elimination{}).
  std::size_t dense_limit = 40000;
  /// Over the integers, remainders larger than dense_limit try lattice_smith_invariants
  /// first (lacuna/algorithm/lattice_smith.hpp: the rank proved by a minor non-zero mod a
  /// prime and, below full rank, by vanishing bordering minors; then three largest minors
  /// and local Smith forms; exact, or it declines and the sparse route runs).
  /// Measured: the 17 007 x 137 remainder of the matching complex of K_12 in 0.6 s instead
  /// of about 12 s (docs/performance.md). false: the sparse route only.
  bool lattice_smith = true;
  /// With lattice_smith, remainders of rank below min(rows, cols) too (the bordering-minor
  /// proof of lattice_smith.hpp, steps R1-R4). Measured: the 3 485 x 8 712 remainder of the
  /// 8 x 8 chessboard complex and the 1 281 x 24 000 one of M(K_13) (docs/performance.md).
  /// false: they go to the sparse route, as before.
  bool lattice_rank_deficient = true;
  /// The ranks only, no torsion (homology over Q sets it: H_k(C; Q) has the free ranks over
  /// Z as dimensions). Every rank is proved as without it; the lattice route then stops once
  /// the remainder's rank is proved (lattice_smith_options::rank_only), and no torsion is
  /// reported. Measured in docs/performance.md (bench_torsion, `_Q`).
  bool ranks_only = false;
};

/// What the reduction finds for the coboundary δ_L out of level L (the boundary into level L).
template <euclidean_domain R>
struct coboundary_invariants {
  std::size_t rank = 0;          ///< rank of δ_L (= rank of the boundary from level L+1)
  std::vector<R> torsion;        ///< its invariant factors that are not units, d_1 | d_2 | ...
  std::size_t unit_pivots = 0;   ///< |U|
  std::size_t cleared = 0;       ///< columns skipped by clearing
  std::size_t deferred = 0;      ///< |Rest| (columns with a non-unit low)
  std::size_t widened = 0;       ///< Rest columns reduced over lacuna::integer (past 64 bits)
  /// The shape of the matrix given to finish_remainder.
  std::size_t remainder_rows = 0, remainder_cols = 0;  ///< the matrix given to finish_remainder
};

namespace detail {

template <class W>
using coboundary_column = std::vector<sparse_entry<W>>;

template <class W>
bool working_is_unit(const W& x) {
  if constexpr (std::same_as<W, checked_int64>)
    return x.v == 1 || x.v == -1;
  else if constexpr (field<W>)
    return !(x == zero<W>());
  else
    return lacuna::is_unit(x);
}

/// a / u for a unit u (exact).
template <class W>
W divide_by_unit(const W& a, const W& u) {
  if constexpr (std::same_as<W, checked_int64>)
    return u.v == 1 ? a : -a;  // u = ±1 is its own inverse
  else
    return div_rem(a, u).quotient;
}

template <class R, class W>
R working_to_ring(W w) {
  if constexpr (std::same_as<W, checked_int64>)
    return R(w.v);
  else
    return R(std::move(w));
}

/// out = a - q·b, both sorted by index; zero terms dropped. The one merge of this header.
template <class W>
void subtract_multiple(const coboundary_column<W>& a, const W& q, std::span<const sparse_entry<W>> b,
                       coboundary_column<W>& out) {
  out.clear();
  out.reserve(a.size() + b.size());
  std::size_t i = 0, j = 0;
  if constexpr (std::same_as<W, checked_int64>) {
    if (q.v == 1 || q.v == -1) {  // the usual case: no multiplications
      const bool add = q.v == -1;
      while (i < a.size() && j < b.size()) {
        if (a[i].index < b[j].index) {
          out.push_back(a[i++]);
        } else if (b[j].index < a[i].index) {
          out.push_back({b[j].index, add ? b[j].value : -b[j].value});
          ++j;
        } else {
          const checked_int64 v = add ? a[i].value + b[j].value : a[i].value - b[j].value;
          if (v.v != 0) out.push_back({a[i].index, v});
          ++i, ++j;
        }
      }
      for (; i < a.size(); ++i) out.push_back(a[i]);
      for (; j < b.size(); ++j) out.push_back({b[j].index, add ? b[j].value : -b[j].value});
      return;
    }
  }
  while (i < a.size() && j < b.size()) {
    if (a[i].index < b[j].index) {
      out.push_back(a[i++]);
    } else if (b[j].index < a[i].index) {
      out.push_back({b[j].index, -(q * b[j].value)});
      ++j;
    } else {
      W v = a[i].value - q * b[j].value;
      if (!(v == zero<W>())) out.push_back({a[i].index, std::move(v)});
      ++i, ++j;
    }
  }
  for (; i < a.size(); ++i) out.push_back(a[i]);
  for (; j < b.size(); ++j) out.push_back({b[j].index, -(q * b[j].value)});
}

/// A working column held dense, the form field_reduction.hpp's accumulators give a long
/// column: values by row, and a bitset of the rows that may be non-zero. Subtracting a pivot
/// then costs the pivot's length, not the working column's (a sorted merge costs both); the
/// low (largest non-zero row) only moves down while pivots are subtracted, so finding it is
/// one downward scan of the bitset per column. The arithmetic is W's own: with
/// checked_int64 every entry is checked, so an overflow throws coefficient_overflow as in
/// the sparse merge.
template <class W>
class dense_coboundary_column {
 public:
  explicit dense_coboundary_column(std::size_t rows) : acc_(rows, zero<W>()), flags_((rows + 63) / 64 + 1, 0) {}
  /// Takes a (sorted, non-empty, no zeros) as the working column; the accumulator is empty.
  void load(std::span<const sparse_entry<W>> a) {
    lo_ = a.front().index / 64;
    hi_ = a.back().index / 64;
    for (const auto& e : a) {
      mark(e.index);
      acc_[e.index] = e.value;
    }
  }
  /// column -= q·b (b sorted, non-empty, its rows at or below the current low).
  void subtract(const W& q, std::span<const sparse_entry<W>> b) {
    lo_ = std::min<std::size_t>(lo_, b.front().index / 64);
    if constexpr (std::same_as<W, checked_int64>) {
      if (q.v == 1 || q.v == -1) {  // the usual case: no multiplications
        const bool add = q.v == -1;
        for (const auto& e : b) {
          mark(e.index);
          acc_[e.index] = add ? acc_[e.index] + e.value : acc_[e.index] - e.value;
        }
        return;
      }
    }
    for (const auto& e : b) {
      mark(e.index);
      acc_[e.index] = acc_[e.index] - q * e.value;
    }
  }
  /// The largest row with a non-zero value, or -1 for a zero column.
  std::int64_t low() {
    for (;;) {
      for (;;) {
        if (flags_[hi_] != 0) break;
        if (hi_ == lo_) return -1;
        --hi_;
      }
      const std::size_t r = hi_ * 64 + 63 - static_cast<std::size_t>(std::countl_zero(flags_[hi_]));
      if (!(acc_[r] == zero<W>())) return static_cast<std::int64_t>(r);
      flags_[r / 64] &= ~(std::uint64_t{1} << (r % 64));
    }
  }
  const W& operator[](std::size_t r) const { return acc_[r]; }
  /// Moves the column out (sorted, no zeros) and leaves the accumulator empty.
  void extract(coboundary_column<W>& out) {
    out.clear();
    for (std::size_t w = lo_; w <= hi_; ++w) {
      for (std::uint64_t bits = flags_[w]; bits != 0; bits &= bits - 1) {
        const std::size_t r = w * 64 + static_cast<std::size_t>(std::countr_zero(bits));
        if (!(acc_[r] == zero<W>())) out.push_back({static_cast<std::uint32_t>(r), std::move(acc_[r])});
        acc_[r] = zero<W>();
      }
      flags_[w] = 0;
    }
  }
  /// The largest row below `limit` with a non-zero value, or -1 (flags of zero values seen
  /// on the way are dropped; the low is left as it is).
  std::int64_t previous(std::size_t limit) {
    while (limit > lo_ * 64) {
      const std::size_t w = (limit - 1) / 64;
      const unsigned keep = static_cast<unsigned>((limit - 1) % 64) + 1;  // bits 0..keep-1 of word w
      const std::uint64_t mask = keep == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << keep) - 1;
      if (const std::uint64_t bits = flags_[w] & mask; bits != 0) {
        const std::size_t r = w * 64 + 63 - static_cast<std::size_t>(std::countl_zero(bits));
        if (!(acc_[r] == zero<W>())) return static_cast<std::int64_t>(r);
        flags_[w] &= ~(std::uint64_t{1} << (r % 64));
        limit = r;  // the same word again, below r
        continue;
      }
      limit = w * 64;
    }
    return -1;
  }
  /// Empties the accumulator without reading it (after an overflow mid-subtraction).
  void discard() {
    for (std::size_t w = lo_; w <= hi_; ++w) {
      for (std::uint64_t bits = flags_[w]; bits != 0; bits &= bits - 1)
        acc_[w * 64 + static_cast<std::size_t>(std::countr_zero(bits))] = zero<W>();
      flags_[w] = 0;
    }
  }

 private:
  // Every row ever given a value lies in words lo_..hi_ and is flagged until read as zero.
  void mark(std::uint32_t r) { flags_[r / 64] |= std::uint64_t{1} << (r % 64); }
  std::vector<W> acc_;
  std::vector<std::uint64_t> flags_;
  std::size_t lo_ = 0, hi_ = 0;
};

/// Working columns switch to the dense form once they and the pivot subtracted from them
/// have more entries than this (field_reduction.hpp's automatic_threshold, measured there).
inline constexpr std::size_t coboundary_dense_threshold = 128;

}  // namespace detail

namespace detail {

/// One unit-pivot pass over the columns of a matrix with `nrow` rows (column(j) gives column j
/// sorted by row; skip[j] set: the column is cleared). Returns the number of unit pivots |U|,
/// the rows that are their lows, and the deferred columns reduced fully against U (Rest': no
/// entry in a row of `pivot_rows`).
/// The coefficients of Rest': W itself, except that 64-bit working coefficients give way to
/// lacuna::integer there (a deferred column may pass 64 bits while the unit pivots never do).
template <class W>
using rest_coefficient = std::conditional_t<std::same_as<W, checked_int64>, integer, W>;

template <class W>
struct unit_pass_result {
  std::size_t units = 0, cleared = 0, deferred = 0;
  std::size_t widened = 0;  ///< Rest columns whose reduction passed 64 bits and was redone over lacuna::integer
  std::vector<bool> pivot_rows;
  std::vector<coboundary_column<rest_coefficient<W>>> rest;
};

template <class W, class Column>
unit_pass_result<W> unit_pass(std::size_t ncol, std::size_t nrow, Column column, const std::vector<bool>* skip,
                              progress_ticker* tick, const run_control* control) {
  using entry = sparse_entry<W>;
  using col_t = coboundary_column<W>;
  unit_pass_result<W> out;
  out.pivot_rows.assign(nrow, false);
  std::vector<std::int64_t> pivot_of_row(nrow, -1);  // row -> pivot number
  // The unit pivots side by side in one array (pivot t: entries pivot_off[t] .. pivot_off[t+1]).
  std::vector<col_t> pivots;
  auto pivot = [&](std::int64_t t) {
    return std::span<const entry>(pivots[static_cast<std::size_t>(t)]);
  };
  std::vector<col_t> deferred_columns;  // Rest, as the pass leaves them
  col_t work, scratch;
  dense_coboundary_column<W> dense(nrow);
  // Columns in index order: measured faster than the reverse order on M(K_11) (1.4 s
  // against 3.7 s), and the low at the largest row faster than at the smallest.
  for (std::size_t j = 0; j < ncol; ++j) {
    if (tick) (*tick)();
    if (skip && (*skip)[j]) {
      ++out.cleared;
      continue;
    }
    const std::span<const entry> c = column(j);
    work.assign(c.begin(), c.end());
    // The same column operations as a sorted merge would do, on the dense form once the
    // column is long: the reduced column, and so every pivot and Rest column, is the same.
    bool is_dense = false;
    std::int64_t low = work.empty() ? -1 : static_cast<std::int64_t>(work.back().index);
    while (low >= 0) {
      const W& lowv = is_dense ? dense[static_cast<std::size_t>(low)] : work.back().value;
      const std::int64_t p = pivot_of_row[static_cast<std::size_t>(low)];
      if (p >= 0) {
        const auto P = pivot(p);
        const W q = divide_by_unit(lowv, P.back().value);
        if (!is_dense && work.size() + P.size() > coboundary_dense_threshold) {
          dense.load(work);
          is_dense = true;
        }
        if (is_dense) {
          dense.subtract(q, P);
          low = dense.low();
        } else {
          subtract_multiple(work, q, P, scratch);
          work.swap(scratch);
          low = work.empty() ? -1 : static_cast<std::int64_t>(work.back().index);
        }
        continue;
      }
      if (is_dense) dense.extract(work);
      if (working_is_unit(work.back().value)) {
        pivot_of_row[static_cast<std::size_t>(low)] = static_cast<std::int64_t>(pivots.size());
        // clearing_is_sound: let z_j be the k-cochain whose coboundary is this reduced
        // column c = δ_k z_j (z_j = e_j plus multiples of earlier columns: the column
        // operations are unimodular). c = u·e_i + (terms of rows below i), u a unit. In
        // C^{k+1}, replace each such e_i by δ_k z_j: distinct pivots have distinct i, so
        // the new basis is the old one times a triangular matrix (in row order) whose
        // diagonal entries are 1 or such a u — a unimodular change of basis. In the new
        // basis the column of δ_{k+1} at e_i is δ_{k+1}δ_k z_j = 0, and the other columns
        // are unchanged; a zero column changes no invariant factor, so SNF(δ_{k+1}) is the
        // SNF of δ_{k+1} without the columns i. Over Z the step needs u to be a unit: with
        // a non-unit u the matrix would not be unimodular (Rest lows are never cleared).
        out.pivot_rows[static_cast<std::size_t>(low)] = true;
        pivots.push_back(std::move(work));
        work = col_t{};
      } else {
        deferred_columns.push_back(std::move(work));
        work = col_t{};
      }
      is_dense = false;
      break;
    }
    if (is_dense) dense.extract(work);  // a zero column: leaves the accumulator empty
  }
  out.units = pivots.size();
  out.deferred = deferred_columns.size();

  // finish_level: reduce every Rest column fully against U, from the bottom up (a pivot
  // column has no entry below its low, so each step only changes rows above the one it
  // clears). The result Rest' is zero in every row that is a low of U. Proof that
  // SNF(δ_k) = I_|U| ⊕ SNF(B), B = Rest' on the rows that are not lows of U: the reduced
  // matrix [U | Rest'] is δ_k times a unimodular matrix (column operations), so it has the
  // invariant factors of δ_k. For each U column c with low p (a unit u), add multiples of
  // row p to the other rows to clear c's other entries: row p of Rest' is zero, so Rest'
  // does not change; a U column already reduced to its single entry at its own low p' has
  // a zero in row p, so it does not change either. Afterwards each U column is u·e_p with
  // distinct p, every other entry of those rows is zero, and the matrix is, up to
  // permuting rows and columns, diag(units) ⊕ B. Row and column operations are invertible
  // over the ring, so the invariant factors are |U| ones followed by those of B.
  // The columns are held dense here: each step then costs the length of the pivot column
  // only, not of the (filling) deferred column.
  // With 64-bit working coefficients a Rest column may pass 64 bits (M(K_13), level 5: some
  // of its 24 123 deferred columns do) while the unit pivots, formed without overflow and
  // with lows ±1, fit: such a column alone is reduced again from its start over
  // lacuna::integer (same operations, exact), instead of the whole route restarting.
  using rest_t = rest_coefficient<W>;
  out.rest.reserve(deferred_columns.size());
  if (!deferred_columns.empty()) {
    if (control) control->report("reducing deferred columns", 0, deferred_columns.size());
    std::vector<integer> wide;  // the dense column over lacuna::integer (W = checked_int64 only)
    // One column over lacuna::integer (W = checked_int64, a column that passed 64 bits).
    auto reduce_wide = [&](const col_t& c) {
      coboundary_column<rest_t> reduced;
      if constexpr (std::same_as<W, checked_int64>) {
        ++out.widened;
        const std::size_t top = c.back().index + 1;
        if (wide.empty()) wide.assign(nrow, integer(0));
        for (const auto& e : c) wide[e.index] = integer(e.value.v);
        for (std::size_t r = top; r-- > 0;) {
          if (wide[r] == integer(0)) continue;
          const std::int64_t p = pivot_of_row[r];
          if (p < 0) continue;
          const auto P = pivot(p);
          const integer q = P.back().value.v == 1 ? wide[r] : -wide[r];  // the low is ±1
          for (const auto& e : P) wide[e.index] -= q * integer(e.value.v);
        }
        for (std::size_t r = 0; r < top; ++r)
          if (!(wide[r] == integer(0))) {
            reduced.push_back({static_cast<std::uint32_t>(r), std::move(wide[r])});
            wide[r] = integer(0);
          }
      }
      return reduced;
    };
    // One column alone: the dense form over W, and over lacuna::integer if W overflows.
    auto reduce_one = [&](const col_t& c) {
      coboundary_column<rest_t> reduced;
      if (c.empty()) return reduced;
      const std::size_t top = c.back().index + 1;
      bool done = false;
      try {
        dense.load(c);
        for (std::int64_t r = dense.previous(top); r >= 0; r = dense.previous(static_cast<std::size_t>(r))) {
          const std::int64_t p = pivot_of_row[static_cast<std::size_t>(r)];
          if (p < 0) continue;
          const auto P = pivot(p);
          const W q = divide_by_unit(dense[static_cast<std::size_t>(r)], P.back().value);
          dense.subtract(q, P);
        }
        done = true;
      } catch (const coefficient_overflow&) {
        if constexpr (!std::same_as<W, checked_int64>) throw;
        dense.discard();
      }
      if (done) {
        dense.extract(work);
        reduced.reserve(work.size());
        for (auto& e : work) reduced.push_back({e.index, working_to_ring<rest_t>(e.value)});
      } else if constexpr (std::same_as<W, checked_int64>) {
        reduced = reduce_wide(c);
      }
      return reduced;
    };
    if constexpr (std::same_as<W, checked_int64>) {
      // Over 64 bits, `lanes` Rest columns at a time, interleaved row by row (block[r·lanes +
      // b] is row r of the b-th column of the block): each pivot is read once for the whole
      // block, and its subtraction from the block touches one cache line per entry. Every
      // column undergoes exactly the operations it would alone (a zero multiple of a pivot
      // changes nothing), so Rest' is the same. Overflow: each product and difference is
      // checked and an overflow flags its lane (columns do not mix, so the other lanes stay
      // exact); a flagged column's values are dropped and it is reduced again from its start
      // over lacuna::integer, so no wrapped value is ever kept.
      constexpr std::size_t lanes = 8;
      std::vector<std::int64_t> block(nrow * lanes, 0);
      for (std::size_t first = 0; first < deferred_columns.size(); first += lanes) {
        if (control) control->check();
        const std::size_t n = std::min(lanes, deferred_columns.size() - first);
        std::size_t top = 0;
        for (std::size_t b = 0; b < n; ++b) {
          const col_t& c = deferred_columns[first + b];
          for (const auto& e : c) block[e.index * lanes + b] = e.value.v;
          if (!c.empty()) top = std::max<std::size_t>(top, c.back().index + 1);
        }
        // Per lane: the sign bits of the ±1 additions' overflow tests, and other overflows.
        std::uint64_t signs[lanes] = {};
        bool overflow[lanes] = {};
        for (std::size_t r = top; r-- > 0;) {
          const std::int64_t p = pivot_of_row[r];
          if (p < 0) continue;
          std::int64_t* const row = block.data() + r * lanes;
          const auto P = pivot(p);
          const bool negate = P.back().value.v == -1;  // q = row / low, the low ±1
          std::int64_t q[lanes];
          bool any = false;
          for (std::size_t b = 0; b < lanes; ++b) {
            overflow[b] |= __builtin_sub_overflow(std::int64_t{0}, row[b], &q[b]) && negate;
            if (!negate) q[b] = row[b];
            any |= q[b] != 0;
          }
          if (!any) continue;
          // t -= v·q lane by lane. For v = ±1 (nearly every entry) the difference is taken
          // modulo 2^64 and its overflow read from the signs, (a ^ q) & (a ^ d) < 0 for
          // d = a - q and ~(a ^ q) & (a ^ d) < 0 for d = a + q (Warren, Hacker's Delight,
          // 2-13), collected in `signs` so that the loop has no branch; other v multiply with
          // __builtin_mul_overflow.
          for (const auto& e : P) {
            std::int64_t* const t = block.data() + std::size_t{e.index} * lanes;
            const std::int64_t v = e.value.v;
            if (v == 1) {
              for (std::size_t b = 0; b < lanes; ++b) {
                const auto a = static_cast<std::uint64_t>(t[b]), x = static_cast<std::uint64_t>(q[b]);
                const std::uint64_t d = a - x;
                signs[b] |= (a ^ x) & (a ^ d);
                t[b] = static_cast<std::int64_t>(d);
              }
            } else if (v == -1) {
              for (std::size_t b = 0; b < lanes; ++b) {
                const auto a = static_cast<std::uint64_t>(t[b]), x = static_cast<std::uint64_t>(q[b]);
                const std::uint64_t d = a + x;
                signs[b] |= ~(a ^ x) & (a ^ d);
                t[b] = static_cast<std::int64_t>(d);
              }
            } else {
              for (std::size_t b = 0; b < lanes; ++b) {
                std::int64_t prod, diff;
                overflow[b] |= __builtin_mul_overflow(q[b], v, &prod);
                overflow[b] |= __builtin_sub_overflow(t[b], prod, &diff);
                t[b] = diff;
              }
            }
          }
        }
        // The block read out row by row (one pass over it for all its columns, which are
        // counted first so that each is allocated once).
        for (std::size_t b = 0; b < lanes; ++b) overflow[b] |= (signs[b] >> 63) != 0;
        const std::size_t base = out.rest.size();
        out.rest.resize(base + n);
        std::size_t count[lanes] = {};
        for (std::size_t r = 0; r < top; ++r)
          for (std::size_t b = 0; b < lanes; ++b) count[b] += block[r * lanes + b] != 0;
        for (std::size_t b = 0; b < n; ++b)
          if (!overflow[b]) out.rest[base + b].reserve(count[b]);
        for (std::size_t r = 0; r < top; ++r)
          for (std::size_t b = 0; b < n; ++b)
            if (const std::int64_t v = block[r * lanes + b]; v != 0 && !overflow[b])
              out.rest[base + b].push_back({static_cast<std::uint32_t>(r), rest_t(v)});
        std::fill(block.begin(), block.begin() + static_cast<std::ptrdiff_t>(top * lanes), 0);
        for (std::size_t b = 0; b < n; ++b) {
          col_t& c = deferred_columns[first + b];
          if (overflow[b]) out.rest[base + b] = reduce_wide(c);
          col_t().swap(c);
        }
      }
    } else {
      for (auto& c : deferred_columns) {
        if (control) control->check();
        out.rest.push_back(reduce_one(c));
        col_t().swap(c);
      }
    }
    if (control) control->report("reducing deferred columns", deferred_columns.size(), deferred_columns.size());
  }
  return out;
}

/// Rest' as a matrix over R on the rows it meets (zero columns dropped).
template <class R, class W>
sparse_matrix<R> compact_remainder(std::vector<coboundary_column<W>>& rest, std::size_t nrow) {
  std::vector<std::int64_t> row_position(nrow, -1);
  std::size_t brows = 0, bcols = 0;
  for (const auto& c : rest) {
    if (!c.empty()) ++bcols;
    for (const auto& e : c)
      if (row_position[e.index] < 0) row_position[e.index] = static_cast<std::int64_t>(brows++);
  }
  sparse_matrix<R> B(brows, bcols);
  std::size_t bc = 0;
  for (auto& c : rest) {
    if (c.empty()) continue;
    if constexpr (std::same_as<W, R>) {  // the column itself, renumbered: no new memory
      for (auto& e : c) e.index = static_cast<std::uint32_t>(row_position[e.index]);
      std::sort(c.begin(), c.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
      B.columns[bc++] = std::move(c);
      continue;
    }
    B.columns[bc].reserve(c.size());
    for (auto& e : c)
      B.columns[bc].push_back({static_cast<std::uint32_t>(row_position[e.index]), working_to_ring<R>(std::move(e.value))});
    std::sort(B.columns[bc].begin(), B.columns[bc].end(), [](const auto& x, const auto& y) { return x.index < y.index; });
    ++bc;
    coboundary_column<W>().swap(c);
  }
  return B;
}

}  // namespace detail

/// The Smith form of a remainder matrix, the one place that chooses how: when it has at most
/// `dense_limit` entries, over the integers the modular Smith form where prefer_modular_smith
/// says it pays (lacuna/algorithm/modular_smith.hpp; exact, or it declines), else
/// dense_smith_form; larger remainders, over the integers, first lattice_smith_invariants
/// when `lattice` is set (lacuna/algorithm/lattice_smith.hpp; exact, or it declines; rank-
/// deficient ones only when `lattice_rank_deficient` is set too), then
/// the sparse unit elimination of smith_normal_form (lacuna/algorithm/smith_normal_form.hpp),
/// whose core takes the same modular hook. With `rank_only` the rank is exact and the
/// factors may be left out (the lattice route stops once the rank is proved).
template <euclidean_domain R>
smith_invariants<R> finish_remainder(const sparse_matrix<R>& A, std::size_t dense_limit,
                                     const run_control* control = nullptr, bool lattice = true,
                                     bool lattice_rank_deficient = true, bool rank_only = false) {
  if (A.rows == 0 || A.cols == 0) return {};
  if (static_cast<double>(A.rows) * static_cast<double>(A.cols) <= static_cast<double>(dense_limit)) {
    auto dense = A.to_dense();
    if constexpr (std::same_as<R, integer>)  // exact modular Smith forms where they pay (modular_smith.hpp)
      if (auto m = prefer_modular_smith(dense) ? modular_smith_invariants(dense, control) : std::nullopt) return *m;
    const auto d = dense_smith_form(std::move(dense), {.control = control});
    return {d.rank, d.diagonal};
  }
  if (control) control->report("Smith form of the core", 0, 1);
  if constexpr (std::same_as<R, integer>)
    if (lattice)
      if (auto l = lattice_smith_invariants(A, control,
                                            {.rank_deficient = lattice_rank_deficient, .rank_only = rank_only})) {
        if (control) control->report("Smith form of the core", 1, 1);
        return *l;
      }
  auto s = smith_normal_form(A, sparse_elimination{}, control);  // stoppable: a large remainder can take long
  if (control) control->report("Smith form of the core", 1, 1);
  return s;
}

/// Reduces the coboundaries of every level of `rc` (R models euclidean_domain: the ring of
/// the answer; W the working coefficients of rc, R itself or checked_int64 for R = integer).
/// Returns, per level L, the rank and non-unit invariant factors of δ_L (the last level's
/// entry is empty). Then rank H at level L = size(L) − rank δ_{L−1} − rank δ_L, and the
/// torsion at level L is the torsion of δ_L. Throws coefficient_overflow (W = checked_int64)
/// when a coefficient passes 64 bits, computation_stopped on a stop request.
/// Cost: one sparse column reduction per level (clearing skips the columns of unit pivots),
/// the deferred columns reduced against the unit pivots (fill-in: a deferred column may fill
/// thousands of rows), then finish_remainder. Measured: unit passes on the transpose of a
/// large remainder found few units and left a denser matrix (matching complex of K_12: the
/// 17 007 x 137 remainder became 113 x 16 952 and its Smith form slower), so none is made.
template <euclidean_domain R, class W>
std::vector<coboundary_invariants<R>> reduce_coboundaries(const elimination_workspace<W>& rc,
                                                          const coboundary_reduction& options = {},
                                                          const run_control* control = nullptr) {
  using entry = sparse_entry<W>;
  const int nl = rc.levels();
  std::vector<coboundary_invariants<R>> out(static_cast<std::size_t>(std::max(nl, 0)));
  std::uint64_t total = 0;
  for (int L = 0; L + 1 < nl; ++L) total += rc.size(L);
  detail::progress_ticker tick(control, "reducing coboundaries", total);

  std::vector<bool> skip;  // columns of this level cleared by the previous level's unit pivots
  for (int L = 0; L + 1 < nl; ++L) {
    const std::size_t ncol = rc.size(L), nrow = rc.size(L + 1);
    skip.resize(ncol, false);
    // δ_L in compressed columns: column j lists the cofaces i of cell j with the coefficient
    // of j in ∂i. Visiting the cofaces i in increasing order leaves each column sorted.
    std::vector<std::uint64_t> off(ncol + 1, 0);
    for (std::uint32_t i = 0; i < nrow; ++i)
      for (const auto& e : rc.boundary(L + 1, i)) ++off[e.index + 1];
    for (std::size_t j = 0; j < ncol; ++j) off[j + 1] += off[j];
    std::vector<entry> data(off[ncol], entry{0, zero<W>()});
    {
      std::vector<std::uint64_t> fill(off.begin(), off.end() - 1);
      for (std::uint32_t i = 0; i < nrow; ++i)
        for (const auto& e : rc.boundary(L + 1, i)) data[fill[e.index]++] = {i, e.value};
    }
    auto pass = detail::unit_pass<W>(
        ncol, nrow,
        [&](std::size_t j) { return std::span<const entry>(data.data() + off[j], data.data() + off[j + 1]); }, &skip,
        &tick, control);
    std::vector<entry>().swap(data);
    std::vector<std::uint64_t>().swap(off);
    auto& res = out[static_cast<std::size_t>(L)];
    res.unit_pivots = pass.units;
    res.cleared = pass.cleared;
    res.deferred = pass.deferred;
    res.widened = pass.widened;
    sparse_matrix<R> B = detail::compact_remainder<R>(pass.rest, nrow);
    const std::size_t units = pass.units;
    res.remainder_rows = B.rows;
    res.remainder_cols = B.cols;
    const auto s = finish_remainder(B, options.dense_limit, control, options.lattice_smith, options.lattice_rank_deficient,
                                    options.ranks_only);
    res.rank = units + s.rank;
    if (!options.ranks_only)
      for (const auto& d : s.factors)
        if (!detail::working_is_unit(d)) res.torsion.push_back(d);
    skip = std::move(pass.pivot_rows);
  }
  tick.finish();
  return out;
}

}  // namespace lacuna

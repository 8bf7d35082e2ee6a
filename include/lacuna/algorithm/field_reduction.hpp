// lacuna/algorithm/field_reduction.hpp — rank, kernel and image of a sparse matrix over a
// field by column reduction.
//
// The method: columns are reduced left to right; while the lowest non-zero row ("low") of
// column j is the low of an earlier reduced column i, a multiple of column i is added to
// column j so that its low entry cancels. Reduced columns with a low are pivots: their lows
// are distinct, so they are independent and span the column space (the image); zero
// columns give, through the recorded column operations R = A V, the kernel basis V_j.
// This is the reduction of Edelsbrunner, Letscher & Zomorodian (2002) and Zomorodian &
// Carlsson (2005) for any field. For a chain complex, reduce_chain_complex adds clearing
// (Chen & Kerber 2011): a column of d_k that is the low of a pivot of d_{k+1} is a boundary's
// image and reduces to zero, so it is skipped without work.
//
// Variants are policy values (passed last):
//   automatic_reduction{}  the default: bit_packed_z2 for z2, word_mod_p for mod_p<P> and
//                          mod_p_dynamic, standard_reduction for any other field;
//   standard_reduction{}   the reference: sorted sparse columns of F, F's own operators;
//   bit_packed_z2{}        z2 only: columns as sorted row lists, added by symmetric
//                          difference; a column that grows long is reduced in a 64-bit-word
//                          bitset instead (its low only moves down, so the scan is linear);
//   word_mod_p{}           mod_p<P> / mod_p_dynamic: the modulus is read once and the work is
//                          on raw 64-bit residues; a long column goes to a dense accumulator
//                          where, for p < 2^32, products are summed unreduced in 64 bits
//                          and reduced only when a sum could overflow or a low is read.
// Both fast variants take dense_threshold: a working column switches to the dense form once
// it and the column added to it have more entries than this (0: automatic).
// field_reduction_options::control takes a stop request and a progress callback (run_control).
#pragma once

#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/chain/term.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/z2.hpp>

#include <algorithm>
#include <bit>
#include <concepts>
#include <cstdint>
#include <limits>
#include <string>
#include <string_view>
#include <stdexcept>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

// ---- policies ---------------------------------------------------------------------------

/// The reference variant: sparse columns of F reduced with F's operators (any field).
struct standard_reduction {};
/// Z/2 only: columns as sorted row lists (symmetric difference), dense bitsets when long.
struct bit_packed_z2 {
  std::size_t dense_threshold = 0;  ///< switch to a bitset above this many entries (0: automatic)
};
/// mod_p<P> and mod_p_dynamic: raw 64-bit residues, lazy reduction for p < 2^32 when dense.
struct word_mod_p {
  std::size_t dense_threshold = 0;  ///< switch to a dense accumulator above this (0: automatic)
};
/// The default: the fastest variant that applies to F.
struct automatic_reduction {};

namespace detail {
template <class F>
inline constexpr bool is_word_field = false;
template <std::uint64_t P>
inline constexpr bool is_word_field<mod_p<P>> = true;
template <>
inline constexpr bool is_word_field<mod_p_dynamic> = true;
}  // namespace detail

/// Algorithm is a field-reduction policy that applies to the field F.
template <class Algorithm, class F>
concept field_reduction_algorithm_for =
    field<F> && (std::same_as<Algorithm, standard_reduction> || std::same_as<Algorithm, automatic_reduction> ||
                 (std::same_as<Algorithm, bit_packed_z2> && std::same_as<F, z2>) ||
                 (std::same_as<Algorithm, word_mod_p> && detail::is_word_field<F>));

// ---- options and result -----------------------------------------------------------------

/// What reduce_columns keeps besides the rank and the pivots, and how it reports.
struct field_reduction_options {
  bool kernel = false;  ///< a kernel basis (records the column operations)
  bool image = false;   ///< an image basis (the reduced pivot columns)
  /// A stop request and a progress callback (lacuna/chain/run_control.hpp), looked at every
  /// few thousand columns; null: none. A stopped reduction throws computation_stopped.
  const run_control* control = nullptr;
  std::string_view phase = "reducing columns";  ///< the phase named in progress reports (units: columns)
};

/// A pivot of the reduction: the reduced column `column` has its lowest non-zero in `row`.
struct pivot_pair {
  /// The row of the lowest non-zero.
  std::uint32_t row;
  /// The reduced column.
  std::uint32_t column;
  /// Same row and column.
  friend bool operator==(const pivot_pair&, const pivot_pair&) = default;
};

/// A sparse vector: entries sorted by index, no zeros.
template <class F>
using sparse_vector = std::vector<sparse_entry<F>>;

/// The result of reduce_columns on a rows x cols matrix A over F (models field).
template <field F>
struct field_reduction_result {
  ///@{
  /// The shape of A.
  std::size_t rows = 0, cols = 0;
  ///@}
  /// The rank of A (the number of pivots).
  std::size_t rank = 0;
  /// One per pivot, by increasing column; rows are distinct.
  std::vector<pivot_pair> pivots;
  /// With options.kernel: cols - rank vectors v of F^cols with A v = 0, independent (the
  /// k-th one has its highest entry, a unit, at the k-th non-pivot column). Else empty.
  std::vector<sparse_vector<F>> kernel;
  /// With options.image: rank vectors of F^rows spanning the column space of A, in echelon
  /// form — image[t] has its lowest entry, equal to one, at pivots[t].row. Else empty.
  std::vector<sparse_vector<F>> image;
};

namespace detail::field_red {

template <class V>
using term = lacuna::term<std::uint32_t, V>;
template <class V>
using column = std::vector<term<V>>;

// ---- arithmetic back ends ---------------------------------------------------------------

template <field F>
struct generic_ops {
  using value = F;
  F zero_v = zero<F>();
  F one_v = one<F>();
  bool is_zero(const F& a) const { return a == zero_v; }
  F neg(const F& a) const { return -a; }
  F inv(const F& a) const { return lacuna::inverse(a); }
  F mul(const F& a, const F& b) const { return a * b; }
  F fma(const F& a, const F& c, const F& b) const { return a + c * b; }  // a + c b
  F to_field(const F& a) const { return a; }
};

template <std::uint64_t P>
struct static_modulus {
  static constexpr std::uint64_t value() noexcept { return P; }
};
struct runtime_modulus {
  std::uint64_t p;
  constexpr std::uint64_t value() const noexcept { return p; }
};

inline constexpr std::uint64_t small_modulus_bound = std::uint64_t{1} << 32U;

/// Raw residues in [0, p). For p <= 2^32, a + c b < p^2 fits in 64 bits: one % per entry.
template <class F, class Mod>
struct word_ops {
  using value = std::uint64_t;
  Mod mod;
  value one_v = 1;
  std::uint64_t p() const noexcept { return mod.value(); }
  bool is_zero(value a) const noexcept { return a == 0; }
  value neg(value a) const noexcept { return a == 0 ? 0 : p() - a; }
  value inv(value a) const noexcept { return inv_mod(a, p()); }
  value mul(value a, value b) const noexcept { return mul_mod(a, b, p()); }
  value fma(value a, value c, value b) const noexcept {
    if (p() <= small_modulus_bound) return (a + c * b) % p();
    return add_mod(a, mul_mod_u64(c, b, p()), p());
  }
  F to_field(value a) const {
    if constexpr (std::same_as<F, mod_p_dynamic>)
      return mod_p_dynamic(static_cast<std::int64_t>(a), prime);
    else
      return F::from_residue(a);
  }
  // mod_p_dynamic only: the checked modulus, to build elements without re-checking.
  std::conditional_t<std::same_as<F, mod_p_dynamic>, prime_modulus, char> prime;
};

/// out = a + c b (sorted merge, zeros dropped); scratch is reused storage.
template <class Ops>
void axpy(column<typename Ops::value>& a, const typename Ops::value& c, const column<typename Ops::value>& b,
          column<typename Ops::value>& scratch, const Ops& ops) {
  scratch.clear();
  scratch.reserve(a.size() + b.size());
  std::size_t i = 0, k = 0;
  while (i < a.size() && k < b.size()) {
    if (a[i].index < b[k].index) {
      scratch.push_back(std::move(a[i++]));
    } else if (b[k].index < a[i].index) {
      scratch.push_back({b[k].index, ops.mul(c, b[k].value)});
      ++k;
    } else {
      auto v = ops.fma(a[i].value, c, b[k].value);
      if (!ops.is_zero(v)) scratch.push_back({a[i].index, std::move(v)});
      ++i, ++k;
    }
  }
  for (; i < a.size(); ++i) scratch.push_back(std::move(a[i]));
  for (; k < b.size(); ++k) scratch.push_back({b[k].index, ops.mul(c, b[k].value)});
  std::swap(a, scratch);
}

template <class Ops>
void scale(column<typename Ops::value>& a, const typename Ops::value& c, const Ops& ops) {
  for (auto& t : a) t.value = ops.mul(c, t.value);
}

/// Highest set bit at or below word hi, scanning down to word lo; -1 if none.
inline std::int64_t top_bit(const std::vector<std::uint64_t>& w, std::size_t& hi, std::size_t lo) {
  for (;;) {
    if (w[hi] != 0) return static_cast<std::int64_t>(hi * 64 + 63 - static_cast<std::size_t>(std::countl_zero(w[hi])));
    if (hi == lo) return -1;
    --hi;
  }
}

/// A dense working column of raw residues with a bitset of touched rows. For p < 2^32 the
/// additions are lazy: acc[r] += c b unreduced, at most `limit` times between full
/// reductions, so that (p-1) + limit (p-1)^2 < 2^64.
template <class Ops>
class word_accumulator {
 public:
  explicit word_accumulator(std::size_t rows, const Ops& ops)
      : ops_(ops), acc_(rows, 0), flags_((rows + 63) / 64 + 1, 0) {
    const std::uint64_t q = ops.p() - 1;
    if (ops.p() <= small_modulus_bound && q != 0)
      limit_ = (std::numeric_limits<std::uint64_t>::max() - q) / (q * q);
  }
  bool empty() const noexcept { return !active_; }
  void load(const column<std::uint64_t>& a) {
    active_ = true;
    count_ = 0;
    lo_ = a.front().index / 64;
    hi_ = a.back().index / 64;
    for (const auto& t : a) {
      acc_[t.index] = t.value;
      flags_[t.index / 64] |= std::uint64_t{1} << (t.index % 64);
    }
  }
  /// acc += c b; b's rows are at or below the current low.
  void add(std::uint64_t c, const column<std::uint64_t>& b) {
    if (limit_ != 0 && count_ == limit_) reduce_all();
    lo_ = std::min<std::size_t>(lo_, b.front().index / 64);
    for (const auto& t : b) {
      flags_[t.index / 64] |= std::uint64_t{1} << (t.index % 64);
      if (limit_ != 0)
        acc_[t.index] += c * t.value;
      else
        acc_[t.index] = ops_.fma(acc_[t.index], c, t.value);
    }
    ++count_;
  }
  /// The lowest non-zero row (its value reduced into v), or -1 for a zero column.
  std::int64_t low(std::uint64_t& v) {
    for (;;) {
      const std::int64_t r = top_bit(flags_, hi_, lo_);
      if (r < 0) return -1;
      const auto ur = static_cast<std::size_t>(r);
      v = acc_[ur] % ops_.p();
      acc_[ur] = v;
      if (v != 0) return r;
      flags_[ur / 64] &= ~(std::uint64_t{1} << (ur % 64));
    }
  }
  /// Moves the column out (sorted, reduced, no zeros) and clears the accumulator.
  void extract(column<std::uint64_t>& out) {
    out.clear();
    if (!active_) return;
    for (std::size_t w = lo_; w <= hi_; ++w) {
      for (std::uint64_t bits = flags_[w]; bits != 0; bits &= bits - 1) {
        const std::size_t r = w * 64 + static_cast<std::size_t>(std::countr_zero(bits));
        const std::uint64_t v = acc_[r] % ops_.p();
        acc_[r] = 0;
        if (v != 0) out.push_back({static_cast<std::uint32_t>(r), v});
      }
      flags_[w] = 0;
    }
    active_ = false;
  }

 private:
  void reduce_all() {
    for (std::size_t w = lo_; w <= hi_; ++w)
      for (std::uint64_t bits = flags_[w]; bits != 0; bits &= bits - 1) {
        const std::size_t r = w * 64 + static_cast<std::size_t>(std::countr_zero(bits));
        acc_[r] %= ops_.p();
      }
    count_ = 0;
  }
  Ops ops_;
  std::vector<std::uint64_t> acc_;
  std::vector<std::uint64_t> flags_;
  std::size_t lo_ = 0, hi_ = 0, count_ = 0, limit_ = 0;
  bool active_ = false;
};

/// Default switch to the dense form. Measured (docs/performance.md, bench_field_reduction
/// *_threshold on d2 of the 256 x 256 torus): any value from 8 to 256 is within 5% of the
/// best, and 20x faster than never switching; a bound that grew with the number of rows
/// (rows / 32) left the long columns of large tori in the sparse merge, whose cost per
/// addition is the length of the working column rather than that of the column added.
inline std::size_t automatic_threshold(std::size_t /*rows*/) { return 128; }

/// Per-matrix state shared by the reductions: pivot slot of each row, columns of V.
template <class V>
struct reduction_state {
  std::vector<std::int64_t> slot_of_row;  // -1: no pivot with this low
  std::vector<column<V>> reduced;         // pivot columns, low entry one
  std::vector<column<V>> ops_of_pivot;    // V columns of the pivots (kernel only)
};

/// The value-carrying reduction (generic fields and raw residues). `skip[j]` true: column j
/// is known to reduce to zero (clearing) and `known_kernel(j)` gives its kernel vector.
template <field F, class Ops, class Convert, class Known>
field_reduction_result<F> reduce_values(const sparse_matrix<F>& A, const Ops& ops, Convert convert,
                                        field_reduction_options opt, std::size_t threshold,
                                        const std::vector<bool>* skip, Known known_kernel) {
  using V = typename Ops::value;
  constexpr bool words = std::same_as<V, std::uint64_t>;
  field_reduction_result<F> out;
  out.rows = A.rows;
  out.cols = A.cols;
  reduction_state<V> st;
  st.slot_of_row.assign(A.rows, -1);
  column<V> col, vcol, scratch, vscratch;
  std::conditional_t<words, word_accumulator<Ops>, char> dense = [&] {
    if constexpr (words)
      return word_accumulator<Ops>(A.rows, ops);
    else
      return char{};
  }();
  if (threshold == 0) threshold = automatic_threshold(A.rows);

  auto to_vector = [&](const column<V>& c) {
    sparse_vector<F> v;
    v.reserve(c.size());
    for (const auto& t : c) v.push_back({t.index, ops.to_field(t.value)});
    return v;
  };

  progress_ticker tick(opt.control, opt.phase, A.cols);
  for (std::uint32_t j = 0; j < A.cols; ++j) {
    tick();
    if (skip && (*skip)[j]) {
      if (opt.kernel) out.kernel.push_back(known_kernel(j));
      continue;
    }
    col.clear();
    for (const auto& e : A.columns[j]) {
      V v = convert(e.value);
      if (!ops.is_zero(v)) col.push_back({e.index, std::move(v)});
    }
    if (opt.kernel) {
      vcol.clear();
      vcol.push_back({j, ops.one_v});
    }
    bool is_dense = false;
    std::int64_t low = -1;
    V lowv{};
    for (;;) {
      if (is_dense) {
        if constexpr (words) low = dense.low(lowv);
      } else if (col.empty()) {
        low = -1;
      } else {
        low = col.back().index;
        lowv = col.back().value;
      }
      if (low < 0) break;
      const std::int64_t s = st.slot_of_row[static_cast<std::size_t>(low)];
      if (s < 0) break;
      const V c = ops.neg(lowv);
      const auto& piv = st.reduced[static_cast<std::size_t>(s)];
      if constexpr (words) {
        if (!is_dense && col.size() + piv.size() > threshold) {
          dense.load(col);
          is_dense = true;
        }
        if (is_dense)
          dense.add(c, piv);
        else
          axpy(col, c, piv, scratch, ops);
      } else {
        axpy(col, c, piv, scratch, ops);
      }
      if (opt.kernel) axpy(vcol, c, st.ops_of_pivot[static_cast<std::size_t>(s)], vscratch, ops);
    }
    if constexpr (words) {
      if (is_dense) dense.extract(col);
    }
    if (low < 0) {
      if (opt.kernel) out.kernel.push_back(to_vector(vcol));
      continue;
    }
    // A pivot: normalize the low entry to one.
    if (!(lowv == ops.one_v)) {
      const V inv = ops.inv(lowv);
      scale(col, inv, ops);
      if (opt.kernel) scale(vcol, inv, ops);
    }
    st.slot_of_row[static_cast<std::size_t>(low)] = static_cast<std::int64_t>(st.reduced.size());
    out.pivots.push_back({static_cast<std::uint32_t>(low), j});
    st.reduced.push_back(col);
    if (opt.kernel) st.ops_of_pivot.push_back(vcol);
  }
  tick.finish();
  out.rank = out.pivots.size();
  if (opt.image)
    for (const auto& c : st.reduced) out.image.push_back(to_vector(c));
  return out;
}

// ---- Z/2 ------------------------------------------------------------------------------

using index_column = std::vector<std::uint32_t>;

/// a ^= b on sorted row lists.
inline void symmetric_difference(index_column& a, const index_column& b, index_column& scratch) {
  scratch.clear();
  scratch.reserve(a.size() + b.size());
  std::size_t i = 0, k = 0;
  while (i < a.size() && k < b.size()) {
    if (a[i] < b[k])
      scratch.push_back(a[i++]);
    else if (b[k] < a[i])
      scratch.push_back(b[k++]);
    else
      ++i, ++k;
  }
  scratch.insert(scratch.end(), a.begin() + static_cast<std::ptrdiff_t>(i), a.end());
  scratch.insert(scratch.end(), b.begin() + static_cast<std::ptrdiff_t>(k), b.end());
  std::swap(a, scratch);
}

/// A dense Z/2 working column: one bit per row; additions flip bits.
class bit_accumulator {
 public:
  explicit bit_accumulator(std::size_t rows) : bits_((rows + 63) / 64 + 1, 0) {}
  void load(const index_column& a) {
    lo_ = a.front() / 64;
    hi_ = a.back() / 64;
    for (auto r : a) bits_[r / 64] ^= std::uint64_t{1} << (r % 64);
  }
  void add(const index_column& b) {
    lo_ = std::min<std::size_t>(lo_, b.front() / 64);
    for (auto r : b) bits_[r / 64] ^= std::uint64_t{1} << (r % 64);
  }
  std::int64_t low() { return top_bit(bits_, hi_, lo_); }
  void extract(index_column& out) {
    out.clear();
    for (std::size_t w = lo_; w <= hi_; ++w) {
      for (std::uint64_t b = bits_[w]; b != 0; b &= b - 1)
        out.push_back(static_cast<std::uint32_t>(w * 64 + static_cast<std::size_t>(std::countr_zero(b))));
      bits_[w] = 0;
    }
  }

 private:
  std::vector<std::uint64_t> bits_;
  std::size_t lo_ = 0, hi_ = 0;
};

template <class Known>
field_reduction_result<z2> reduce_z2(const sparse_matrix<z2>& A, field_reduction_options opt, std::size_t threshold,
                                     const std::vector<bool>* skip, Known known_kernel) {
  field_reduction_result<z2> out;
  out.rows = A.rows;
  out.cols = A.cols;
  std::vector<std::int64_t> slot_of_row(A.rows, -1);
  std::vector<index_column> reduced, ops_of_pivot;
  index_column col, vcol, scratch, vscratch;
  bit_accumulator dense(A.rows);
  if (threshold == 0) threshold = automatic_threshold(A.rows);
  auto to_vector = [](const index_column& c) {
    sparse_vector<z2> v;
    v.reserve(c.size());
    for (auto r : c) v.push_back({r, z2(1)});
    return v;
  };
  progress_ticker tick(opt.control, opt.phase, A.cols);
  for (std::uint32_t j = 0; j < A.cols; ++j) {
    tick();
    if (skip && (*skip)[j]) {
      if (opt.kernel) out.kernel.push_back(known_kernel(j));
      continue;
    }
    col.clear();
    for (const auto& e : A.columns[j])
      if (e.value.value()) col.push_back(e.index);
    if (opt.kernel) vcol.assign(1, j);
    bool is_dense = false;
    std::int64_t low = -1;
    for (;;) {
      low = is_dense ? dense.low() : (col.empty() ? -1 : static_cast<std::int64_t>(col.back()));
      if (low < 0) break;
      const std::int64_t s = slot_of_row[static_cast<std::size_t>(low)];
      if (s < 0) break;
      const auto& piv = reduced[static_cast<std::size_t>(s)];
      if (!is_dense && col.size() + piv.size() > threshold) {
        dense.load(col);
        is_dense = true;
      }
      if (is_dense)
        dense.add(piv);
      else
        symmetric_difference(col, piv, scratch);
      if (opt.kernel) symmetric_difference(vcol, ops_of_pivot[static_cast<std::size_t>(s)], vscratch);
    }
    if (is_dense) dense.extract(col);
    if (low < 0) {
      if (opt.kernel) out.kernel.push_back(to_vector(vcol));
      continue;
    }
    slot_of_row[static_cast<std::size_t>(low)] = static_cast<std::int64_t>(reduced.size());
    out.pivots.push_back({static_cast<std::uint32_t>(low), j});
    reduced.push_back(col);
    if (opt.kernel) ops_of_pivot.push_back(vcol);
  }
  tick.finish();
  out.rank = out.pivots.size();
  if (opt.image)
    for (const auto& c : reduced) out.image.push_back(to_vector(c));
  return out;
}

// ---- dispatch -------------------------------------------------------------------------

/// The modulus of a mod_p_dynamic matrix: that of its bound entries (all must agree).
inline std::uint64_t dynamic_modulus(const sparse_matrix<mod_p_dynamic>& A) {
  std::uint64_t p = 0;
  bool unbound_nonzero = false;
  for (const auto& c : A.columns)
    for (const auto& e : c) {
      if (!e.value.is_bound()) {
        unbound_nonzero = unbound_nonzero || e.value.unbound_value() != 0;
        continue;
      }
      if (p == 0) p = e.value.modulus();
      if (e.value.modulus() != p)
        throw std::invalid_argument("lacuna::reduce_columns: entries of different moduli (" + std::to_string(p) +
                                    " and " + std::to_string(e.value.modulus()) + ")");
    }
  if (p == 0 && unbound_nonzero)
    throw std::invalid_argument("lacuna::reduce_columns: a mod_p_dynamic matrix whose entries carry no modulus");
  return p;
}

template <field F, class Algorithm, class Known>
field_reduction_result<F> reduce(const sparse_matrix<F>& A, field_reduction_options opt, const Algorithm& alg,
                                 const std::vector<bool>* skip, Known known) {
  constexpr bool want_z2 = std::same_as<Algorithm, bit_packed_z2> ||
                           (std::same_as<Algorithm, automatic_reduction> && std::same_as<F, z2>);
  constexpr bool want_words = std::same_as<Algorithm, word_mod_p> ||
                              (std::same_as<Algorithm, automatic_reduction> && is_word_field<F>);
  std::size_t threshold = 0;
  if constexpr (requires { alg.dense_threshold; }) threshold = alg.dense_threshold;
  if constexpr (want_z2) {
    return reduce_z2(A, opt, threshold, skip, known);
  } else if constexpr (want_words && std::same_as<F, mod_p_dynamic>) {
    const std::uint64_t p = dynamic_modulus(A);
    if (p == 0)  // no non-zero entry: nothing to reduce, and no modulus to work with
      return reduce_values<F>(A, generic_ops<F>{}, [](const F& x) { return x; }, opt, 0, skip, known);
    word_ops<F, runtime_modulus> ops{.mod = {p}, .prime = prime_modulus(p)};
    return reduce_values<F>(
        A, ops,
        [p](const F& x) { return x.is_bound() ? x.value() : reduce_signed(x.unbound_value(), p); }, opt, threshold,
        skip, known);
  } else if constexpr (want_words) {
    word_ops<F, static_modulus<F::modulus()>> ops{};
    return reduce_values<F>(A, ops, [](const F& x) { return x.value(); }, opt, threshold, skip, known);
  } else {
    return reduce_values<F>(A, generic_ops<F>{}, [](const F& x) { return x; }, opt, 0, skip, known);
  }
}

}  // namespace detail::field_red

/// Reduces the columns of A (F models field) with the chosen variant and returns the rank,
/// the pivots and, on request, kernel and image bases (see field_reduction_result).
/// Precondition: A's columns are sorted without zeros (sparse_matrix::normalize). Cost:
/// O(sum over additions of the lengths of the columns added) — near linear for boundary
/// matrices, whose reduced columns stay short; worst case O(rows * cols * rank).
/// See also reduce_chain_complex (clearing), smith_normal_form (over Euclidean domains).
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
field_reduction_result<F> reduce_columns(const sparse_matrix<F>& A, field_reduction_options options = {},
                                         const Algorithm& algorithm = {}) {
  return detail::field_red::reduce<F>(A, options, algorithm, nullptr,
                                      [](std::uint32_t) -> sparse_vector<F> { return {}; });
}

/// The rank of A over F (reduce_columns without kernel or image).
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
std::size_t field_rank(const sparse_matrix<F>& A, const Algorithm& algorithm = {}) {
  return reduce_columns(A, {}, algorithm).rank;
}

/// One step of reduce_chain_complex, for callers that build their matrices one at a time:
/// reduces A with clearing (Chen & Kerber 2011) by `above`, the reduction of the matrix
/// above A in a chain complex (its rows are A's columns, and it composes with A to zero — a
/// precondition that is not checked). A column of A that is the low of a pivot of `above`
/// is skipped without being read (it may be left empty); with options.kernel its kernel
/// vector is that pivot's reduced column, so `above` must then hold its image.
/// Throws std::invalid_argument if the sizes do not compose.
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
field_reduction_result<F> reduce_columns_after(const sparse_matrix<F>& A, const field_reduction_result<F>& above,
                                               field_reduction_options options = {}, const Algorithm& algorithm = {}) {
  if (above.rows != A.cols)
    throw std::invalid_argument("lacuna::reduce_columns_after: the matrix above has " + std::to_string(above.rows) +
                                " rows, this one " + std::to_string(A.cols) + " columns");
  if (options.kernel && above.image.size() != above.pivots.size())
    throw std::invalid_argument("lacuna::reduce_columns_after: kernels need the image of the matrix above");
  std::vector<bool> skip(A.cols, false);
  std::vector<std::int64_t> image_of(A.cols, -1);
  for (std::size_t s = 0; s < above.pivots.size(); ++s) {
    skip[above.pivots[s].row] = true;
    image_of[above.pivots[s].row] = static_cast<std::int64_t>(s);
  }
  return detail::field_red::reduce<F>(A, options, algorithm, &skip,
                                      [&](std::uint32_t j) { return above.image[static_cast<std::size_t>(image_of[j])]; });
}

/// Reduces the boundary matrices of a chain complex with clearing (Chen & Kerber 2011).
/// boundaries[i] maps C_{i+1} to C_i in the caller's numbering; consecutive matrices must
/// compose (boundaries[i].cols == boundaries[i+1].rows) to zero — a precondition that is
/// not checked (clearing relies on it). The matrices are reduced from the last to the
/// first; a column of boundaries[i] that is the low of a pivot of boundaries[i+1] is
/// skipped, and its kernel vector is that pivot's reduced column. Result i belongs to
/// boundaries[i]. Asking for kernels of boundaries[i] makes boundaries[i+1] keep its image.
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
std::vector<field_reduction_result<F>> reduce_chain_complex(const std::vector<sparse_matrix<F>>& boundaries,
                                                            field_reduction_options options = {},
                                                            const Algorithm& algorithm = {}) {
  const std::size_t n = boundaries.size();
  for (std::size_t i = 0; i + 1 < n; ++i)
    if (boundaries[i].cols != boundaries[i + 1].rows)
      throw std::invalid_argument("lacuna::reduce_chain_complex: boundary matrices " + std::to_string(i) + " and " +
                                  std::to_string(i + 1) + " do not compose");
  std::vector<field_reduction_result<F>> out(n);
  for (std::size_t t = n; t-- > 0;) {
    field_reduction_options o = options;
    if (options.kernel && t > 0) o.image = true;  // the next matrix down needs its cleared kernels
    if (t + 1 == n) {
      out[t] = detail::field_red::reduce<F>(boundaries[t], o, algorithm, nullptr,
                                            [](std::uint32_t) -> sparse_vector<F> { return {}; });
    } else {
      out[t] = reduce_columns_after(boundaries[t], out[t + 1], o, algorithm);
    }
    if (t + 1 < n && !options.image) out[t + 1].image.clear();
  }
  if (n > 0 && !options.image) out[0].image.clear();
  return out;
}

}  // namespace lacuna

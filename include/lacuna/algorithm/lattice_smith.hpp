// lacuna/algorithm/lattice_smith.hpp — the invariant factors of an integer matrix (typically
// tall or wide: many more rows than columns, or the reverse) from three of its largest
// non-zero minors and one local Smith form per prime that can divide them; its rank proved
// by a non-zero minor (below) and, when the rank is not full, by vanishing bordering minors
// (steps R1-R4); nullopt when a proof does not go through.
//
// Why. The coboundary route (integral_reduction.hpp) leaves remainders like 17 007 x 137 with
// rank 137 (matching complex of K_12); their Smith form by sparse or dense elimination over Z
// lets coefficients grow and takes seconds to minutes. The invariant factors of such a matrix
// are those of the lattice spanned by its rows in Z^n (n = 137), whose index is a divisor of
// any n x n minor; locally at each prime p dividing that index the lattice has a Hermite basis
// with entries modulo p^k, found by inserting the rows one by one with word arithmetic.
//
// The method (A is m x n after transposing so that m >= n; "vectors" are its m rows, of
// length n; the invariant factors of A and A^T agree):
//  1. Full rank. The vectors are inserted, in three orders (step 0's greedy order, smallest
//     norms first, and twice the same with the vectors chosen before moved last), into a row
//     echelon basis modulo a prime p below 2^27 until n of them are independent mod p: the
//     n x n minor M_t = det A[I_t, :] of those vectors is non-zero mod p, so non-zero, and
//     the rank over Q is n. If fewer than n are independent the route declines (the rank may
//     still be n, but it is not proved here).
//  2. Candidate primes. G = d_1 d_2 ... d_n, the product of the invariant factors, is the gcd
//     of all n x n minors (determinantal divisors; Newman, "Integral Matrices", 1972, §II.3 —
//     from memory), so G divides G' = gcd(M_1, M_2, M_3). The M_t are found exactly by the
//     Chinese remainder theorem over 62-bit primes past twice Hadamard's bound, the
//     determinant-modulus idea of Domich, Kannan & Trotter (1987) and Hafner & McCurley
//     (1991). G' is trial-divided by the primes below 2^16; if a cofactor c > 1 remains (a
//     prime factor of G' that is not known) the route declines. So every prime dividing G is
//     one of the small primes q found, with v_q(G) <= e_q = v_q(G').
//  3. Local Smith forms. For each such q, with Q = q^k, k = e_q + 1 (or the largest k with
//     q^k < 2^62 when that is smaller), the m vectors are reduced modulo Q into an upper
//     triangular basis H (n x n) of the image of the row lattice in (Z/Q)^n, by insertion
//     with row operations invertible over Z localized at q: a pivot is kept where the
//     q-valuation is least (a swap when the incoming entry has a smaller one), otherwise the
//     incoming vector takes a multiple of the pivot row that clears the entry. Vectors that
//     reach zero mod Q are dropped (they lie in Q Z^n). The Smith form of A over the local
//     ring Z/Q (unique there) is diag(q^min(v_i, k)) with v_i = v_q(d_i), and it is the Smith
//     form of H, found by elimination with pivots of least valuation
//     (detail::modular::local_valuations; Dumas, Saunders & Villard 2001; Dumas, Heckenbach,
//     Saunders & Welker 2003). When H has n pivots that are non-zero mod Q, every
//     min(v_i, k) < k, so the valuations found are v_q(d_1) <= ... <= v_q(d_n) exactly;
//     otherwise the route declines. Their sum must be at most e_q (a check of the proof).
//     Before that, the rank r_q of all vectors mod q: r_q = n proves v_q(G) = 0 (an n x n
//     minor prime to q), and no local basis is needed for such a q; otherwise n - r_q of the
//     d_i are divisible by q, so v_q(G) >= n - r_q, and the insertion stops as soon as the
//     basis has n pivots whose valuations add up to n - r_q (its lattice, inside that of
//     all vectors modulo Q, then has the same index, so it is that lattice). Measured on the
//     17 007 x 137 remainder of M(K_12) (56 factors 3): 31 ms instead of 157 ms, the same H.
//  4. d_i = product over the q of q^v_q(d_i); primes not among the q divide no d_i.
//
// Step 0 first: the rank mod a prime p_0 below 2^27, the vectors inserted smallest first
// (Euclidean norm) into a reduced echelon basis, in blocks (residual_kernel below). Rank n
// goes on with steps 1-4. Rank r < n (rank-deficient; the remainders of M(K_11), M(K_13) and
// of the chessboard complexes) goes to:
//  R1. Rank >= r: the r vectors I kept mod p_0 and the pivot coordinates J (the coordinates
//     of smallest norm first) give A[I, J] non-singular mod p_0, so det A[I, J] != 0. Two
//     more minors A[I_t, J_t] by the same greedy insertion with the vectors already chosen
//     moved last. Smallest vectors first keeps Hadamard's bounds small (M(K_13): about 2 800
//     bits instead of tens of thousands).
//  R2. Rank <= r: by the bordering-minors theorem, a non-zero r-minor all of whose bordering
//     (r+1)-minors (rows I + i, columns J + c) vanish proves the rank is r (Gantmacher, "The
//     Theory of Matrices", 1959, ch. I §4 — from memory). Each bordering minor is det A[I, J]
//     times the entry (i, c) of the Schur complement A - A[:, J] A[I, J]^-1 A[I, :], so it is
//     0 mod p when A[I, J] is invertible mod p and every vector lies in the span of the
//     vectors I mod p. That is checked for primes p < 2^27 (bordering_mod_p: the reduced
//     echelon basis A[I, J]^-1 A[I, :] mod p, then every vector's residual against it, by
//     blocked products with delayed reduction, m n r word operations per prime, the primes
//     shared by two threads) until their product passes twice Hadamard's bound of the
//     bordering minors (the product of the norms of the vectors I times the largest other
//     vector's, or the same by coordinates, the smaller). Then every bordering minor is 0. A
//     prime dividing det A[I, J] is skipped; a vector outside the span mod some prime means
//     rank > r over Q (p_0 divides every (r+1)-minor): declined.
//  R3. Candidate primes: G = d_1 ... d_r, the gcd of the r x r minors (Newman, as in step 2),
//     divides the gcd G' of the three minors, found exactly by CRT from their residues mod
//     the same primes, and mod further primes (determinants only) while the product has not
//     passed twice their own Hadamard bounds (by rows or by columns, the smaller). Trial
//     division below 2^16, cofactor 1 or decline, as in step 2.
//  R4. For each such q: r vectors independent mod q (greedy, as R1) prove v_q(G) = 0.
//     Otherwise the local Hermite basis of all vectors mod Q = q^k (k = e_q + 1 capped as in
//     step 3), which may now miss pivots, and its Smith form over Z/Q with pivots of least
//     valuation (Dumas, Saunders & Villard 2001; Dumas, Heckenbach, Saunders & Welker 2003):
//     exactly r invariant factors must be non-zero mod Q (the other n - r are the zero ones,
//     the rank being r; if more vanish some v_q(d_i) >= k and the route declines), and their
//     valuations add up to at most e_q.
//
// Nothing probabilistic reaches the result: the shuffle (fixed seed) and the choice of primes
// only decide whether the proofs succeed. Cost: step 1 about n^2 word operations per vector
// inserted (usually only the first few times n), step 2 about (bits of Hadamard's bound)/61
// determinants of n x n matrices, step 3 at most m n^2 / 2 word operations per prime q.
#pragma once

#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/side_by_side.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <concepts>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <random>
#include <utility>
#include <vector>

namespace lacuna {
namespace detail::lattice_smith_impl {

using modular::u64;

/// x mod q in [0, q), for an integer ring Int with small and big values (lacuna::integer).
/// Word operations (m n^2 / 2, the local Hermite insertion of m vectors of length n) beyond
/// which lattice_smith_invariants declines at once: about 2-4 s on one core. Measured: the
/// 3 485 x 8 712 remainder of the 8 x 8 chessboard complex (rank deficient) spent 11 s in the
/// rank step before declining; the 17 007 x 137 one of M(K_12) needs 1.6e8.
inline constexpr double work_limit = 2e9;
/// Word operations (m n r per prime of the bordering-minor proof, times the primes) beyond
/// which a rank-deficient matrix is declined: a few minutes on two cores. The 1 281 x 24 000
/// remainder of M(K_13) (rank 397, bound about 2 900 bits) needs about 1.3e12.
inline constexpr double rank_deficient_work_limit = 4e12;
/// m n^2 beyond which the rank step itself (up to m n r word operations) is not started.
inline constexpr double rank_step_limit = 2e11;

template <class Int>
u64 residue(const Int& x, u64 q) {
  if (x.is_small()) return detail::reduce_signed(x.small_value(), q);
  const u64 r = modular::abs_mod(x.to_big(), q);
  return (x.sign() < 0 && r != 0) ? q - r : r;
}

/// An upper bound of log2 |x| (-inf for zero).
template <class Int>
double log2_abs(const Int& x) {
  if (x.is_small()) {
    if (x.small_value() == 0) return -INFINITY;
    return std::log2(std::fabs(static_cast<double>(x.small_value()))) + 1e-9;
  }
  return static_cast<double>(boost::multiprecision::msb(boost::multiprecision::abs(x.to_big())) + 1);
}

/// The matrix as its m vectors of length n (m >= n), each a sparse list of (position, value).
template <class Int>
struct vectors {
  std::size_t n = 0;
  std::vector<std::vector<std::pair<std::uint32_t, Int>>> v;
  void dense_residues(std::size_t i, u64 q, std::vector<u64>& out) const {
    out.assign(n, 0);
    for (const auto& [j, x] : v[i]) out[j] = residue(x, q);
  }
};

template <class Int>
vectors<Int> as_vectors(const sparse_matrix<Int>& A) {
  vectors<Int> out;
  if (A.rows >= A.cols) {  // the rows, gathered from the columns
    out.n = A.cols;
    out.v.resize(A.rows);
    {  // each row's length first: no reallocation while gathering (measured: 145 ms of
       // growth on the 1.3e6 entries of M(K_12)'s remainder)
      std::vector<std::uint32_t> len(A.rows, 0);
      for (const auto& c : A.columns)
        for (const auto& e : c) ++len[e.index];
      for (std::size_t i = 0; i < A.rows; ++i) out.v[i].reserve(len[i]);
    }
    for (std::size_t j = 0; j < A.cols; ++j)
      for (const auto& e : A.columns[j]) out.v[e.index].emplace_back(static_cast<std::uint32_t>(j), e.value);
  } else {  // the columns themselves
    out.n = A.rows;
    out.v.resize(A.cols);
    for (std::size_t j = 0; j < A.cols; ++j)
      for (const auto& e : A.columns[j]) out.v[j].emplace_back(e.index, e.value);
  }
  return out;
}

/// The n x n basis matrix H (row-major, entries mod Q) of the image of the lattice spanned
/// by all vectors in (Z/Q)^n, Q = q^k, upper triangular with a pivot of least q-valuation in
/// each column; nullopt when some column has no pivot (then some v_q(d_i) >= k).
template <class Int>
std::optional<std::vector<u64>> local_hermite_basis(const vectors<Int>& V, u64 q, u64 Q, const run_control* control,
                                                    bool full_rank = true, int enough = -1,
                                                    std::size_t rank = 0) {
  const std::size_t n = V.n;
  std::vector<u64> H(n * n, 0);
  std::vector<char> has(n, 0);
  std::vector<int> val(n, 0);
  std::size_t pivots = 0;
  long valuation_sum = 0;  // sum of val[c] over the columns with a pivot
  std::vector<u64> qpow(n, 1);                                     // q^val[c]
  std::vector<modular::fixed_factor> uinv(n, modular::fixed_factor(0, Q));  // (pivot / q^val)^-1 mod Q
  auto valuation = [q](u64 x) {
    int v = 0;
    while (x % q == 0) x /= q, ++v;
    return v;
  };
  auto set_pivot = [&](std::size_t c) {
    const u64 x = H[c * n + c];
    valuation_sum -= val[c];
    val[c] = valuation(x);
    valuation_sum += val[c];
    u64 pv = 1;
    for (int t = 0; t < val[c]; ++t) pv *= q;
    qpow[c] = pv;
    uinv[c] = modular::fixed_factor(detail::inv_mod((x / pv) % Q, Q), Q);  // x / pv is prime to q
  };
  std::vector<u64> x;
  for (std::size_t i = 0; i < V.v.size(); ++i) {
    if (control && (i & 255U) == 0) control->check();
    V.dense_residues(i, Q, x);
    for (std::size_t c = 0; c < n; ++c) {
      if (x[c] == 0) continue;
      u64* h = &H[c * n];
      if (!has[c]) {  // x is zero before c: it becomes the pivot row of column c
        std::copy(x.begin() + static_cast<std::ptrdiff_t>(c), x.end(), h + c);
        has[c] = 1;
        ++pivots;
        val[c] = 0;
        set_pivot(c);
        break;
      }
      if (valuation(x[c]) < val[c]) {  // the smaller valuation becomes the pivot (a swap)
        for (std::size_t j = c; j < n; ++j) std::swap(x[j], h[j]);
        set_pivot(c);
      }
      // x[c] = q^v' w with v' >= val[c]: x -= (x[c] / q^val[c]) u^-1 h clears column c.
      const modular::fixed_factor f(uinv[c].times((x[c] / qpow[c]) % Q, Q), Q);
      for (std::size_t j = c; j < n; ++j)
        if (h[j] != 0) x[j] = modular::sub(x[j], f.times(h[j], Q), Q);
    }
    // Early end (`enough` >= 0 a lower bound of v_q(d_1 ... d_r), r = `rank` the rank of all
    // the vectors over Q, n when 0): with r pivots of valuations below k, the vectors so far
    // span, with Q Z^n, a lattice L' of index q^(valuation_sum + (n - r) k) in Z^n (the
    // columns without a pivot count k each), inside L + Q Z^n (L: all the vectors), whose
    // index is q to the sum of min(v_q(d_i), k) over the r non-zero d_i, plus (n - r) k —
    // at least q^(enough + (n - r) k). Equal indices and L' inside: L' = L + Q Z^n, and the
    // further vectors change neither the lattice nor its local Smith form.
    if (enough >= 0 && pivots == (rank == 0 ? n : rank) && valuation_sum <= enough) break;
  }
  for (std::size_t c = 0; c < n && full_rank; ++c)
    if (!has[c]) return std::nullopt;
  return H;
}

/// H as a source of detail::modular::local_valuations (entries already reduced mod Q).
struct square_source {
  std::size_t n = 0, m = 0;
  const std::vector<u64>* H = nullptr;
  u64 residue(std::size_t i, std::size_t j, u64) const { return (*H)[i * m + j]; }
};

// ---- Rank-deficient matrices (steps R1-R4 of the header comment) ------------------------

/// Primes below 2^27 for the bordering-minor proof: products of two residues stay below
/// 2^54, so about 1000 of them add up in a 64-bit word before one reduction (delayed
/// modular reduction), and a residue fits 32 bits (one widening multiply per term).
inline constexpr u64 small_word_limit = u64{1} << 27U;

/// x mod p for any 64-bit x and a fixed p < 2^32, by the precomputed reciprocal
/// floor((2^64 - 1) / p): the quotient estimate is short by at most 2 (Granlund &
/// Montgomery 1994, division by invariant integers, in its simplest form).
struct word_reducer {
  u64 p = 1, inv = 0;
  explicit word_reducer(u64 p_) : p(p_), inv(~u64{0} / p_) {}
  u64 operator()(u64 x) const {
    const u64 q = static_cast<u64>((static_cast<modular::u128>(x) * inv) >> 64U);
    u64 r = x - q * p;
    while (r >= p) r -= p;
    return r;
  }
  u64 signed_residue(std::int64_t a) const {
    if (a >= 0) return (*this)(static_cast<u64>(a));
    const u64 r = (*this)(u64{0} - static_cast<u64>(a));
    return r == 0 ? 0 : p - r;
  }
};

/// Dense residues mod R.p of vector i into out[0, n) (zeros elsewhere).
template <class Int>
void fill_residues(const vectors<Int>& V, std::size_t i, const word_reducer& R, u64* out) {
  std::fill(out, out + V.n, u64{0});
  for (const auto& [j, x] : V.v[i]) out[j] = x.is_small() ? R.signed_residue(x.small_value()) : residue(x, R.p);
}

/// x_b -= sum_k x_b[cols[k]] rows[k] mod p for the b dense vectors x (b x n, residues < p),
/// rows (r x n, residues < p < 2^27, zero at cols[j] for j != k and 1 at cols[k]: reduced
/// row echelon form). Afterwards x_b is zero at every cols[k], and zero everywhere iff x_b
/// lies in the span of the rows mod p. Blocked over columns so the accumulators stay in
/// the first-level cache; products are added unreduced (each < 2^54) and reduced once per
/// `chunk` terms. The AVX2 twin is chosen at run time when the processor has it.
struct residual_kernel {
  static constexpr std::size_t block = 8, tile = 256;
  [[gnu::always_inline]] static inline void run(const std::uint32_t* rows, const std::uint32_t* cols, std::size_t r,
                                               std::size_t n, u64* x, std::size_t b, const word_reducer& R) {
    const u64 p = R.p;
    const std::size_t chunk = static_cast<std::size_t>((~u64{0} - p) / ((p - 1) * (p - 1) + 1));
    std::uint32_t coef[block * 1024];  // b x min(r, 1024) at a time
    alignas(64) u64 acc[block][tile];
    for (std::size_t k0 = 0; k0 < r; k0 += 1024) {
      const std::size_t k1 = std::min(r, k0 + 1024);
      for (std::size_t bb = 0; bb < b; ++bb)
        for (std::size_t k = k0; k < k1; ++k) coef[bb * 1024 + (k - k0)] = static_cast<std::uint32_t>(x[bb * n + cols[k]]);
      for (std::size_t j0 = 0; j0 < n; j0 += tile) {
        const std::size_t w = std::min(n, j0 + tile) - j0;
        for (std::size_t bb = 0; bb < b; ++bb)
          for (std::size_t j = 0; j < w; ++j) acc[bb][j] = 0;
        std::size_t pending = 0;
        for (std::size_t k = k0; k < k1; ++k) {
          const std::uint32_t* y = rows + k * n + j0;
          for (std::size_t bb = 0; bb < b; ++bb) {
            const u64 f = coef[bb * 1024 + (k - k0)];
            if (f == 0) continue;
            u64* a = acc[bb];
            for (std::size_t j = 0; j < w; ++j) a[j] += f * static_cast<u64>(y[j]);
          }
          if (++pending == chunk) {
            for (std::size_t bb = 0; bb < b; ++bb)
              for (std::size_t j = 0; j < w; ++j) acc[bb][j] = R(acc[bb][j]);
            pending = 0;
          }
        }
        for (std::size_t bb = 0; bb < b; ++bb)
          for (std::size_t j = 0; j < w; ++j) {
            u64& t = x[bb * n + j0 + j];
            t = modular::sub(t, R(acc[bb][j]), p);
          }
      }
    }
  }
#if defined(__x86_64__) || defined(__i386__)
  [[gnu::target("avx2")]] static void run_avx2(const std::uint32_t* rows, const std::uint32_t* cols, std::size_t r,
                                               std::size_t n, u64* x, std::size_t b, const word_reducer& R) {
    run(rows, cols, r, n, x, b, R);
  }
#endif
  static void run_default(const std::uint32_t* rows, const std::uint32_t* cols, std::size_t r, std::size_t n, u64* x,
                          std::size_t b, const word_reducer& R) {
    run(rows, cols, r, n, x, b, R);
  }
  static void apply(const std::uint32_t* rows, const std::uint32_t* cols, std::size_t r, std::size_t n, u64* x,
                    std::size_t b, const word_reducer& R) {
    if (r == 0) return;
#if defined(__x86_64__) || defined(__i386__)
    static const bool avx2 = __builtin_cpu_supports("avx2");
    if (avx2) return run_avx2(rows, cols, r, n, x, b, R);
#endif
    run_default(rows, cols, r, n, x, b, R);
  }
};

/// A basis in reduced row echelon form mod a prime p < 2^27 of the span of some vectors:
/// rows (r x n, as 32-bit residues), their pivot columns, and the vectors they came from.
struct echelon_mod_p {
  u64 p = 0;
  std::size_t n = 0;
  std::vector<std::uint32_t> rows, cols;
  std::vector<std::size_t> from;
  std::size_t rank() const { return cols.size(); }
  /// Adds the residual x (zero at every pivot column, not zero) as a new row, pivot at c.
  void add(std::vector<u64>& x, std::size_t c, std::size_t source) {
    const modular::fixed_factor inv(detail::inv_mod(x[c], p), p);
    for (std::size_t j = 0; j < n; ++j)
      if (x[j] != 0) x[j] = inv.times(x[j], p);
    // Clear column c in the old rows (keeps the form reduced): row_k -= row_k[c] x.
    for (std::size_t k = 0; k < rank(); ++k) {
      std::uint32_t* row = &rows[k * n];
      const u64 f = row[c];
      if (f == 0) continue;
      const modular::fixed_factor ff(f, p);
      for (std::size_t j = 0; j < n; ++j)
        if (x[j] != 0) row[j] = static_cast<std::uint32_t>(modular::sub(row[j], ff.times(x[j], p), p));
    }
    for (std::size_t j = 0; j < n; ++j) rows.push_back(static_cast<std::uint32_t>(x[j]));
    cols.push_back(static_cast<std::uint32_t>(c));
    from.push_back(source);
  }
};

/// Grows an echelon basis mod p over the vectors in `order`, in blocks (residuals of a
/// block against the basis by residual_kernel, then one by one against the rows added
/// within the block). The pivot of a new row is its non-zero position of least
/// `coord_rank` (columns of small norm first, which keeps the Hadamard bounds of the chosen
/// minor small). Stops when the rank reaches `stop_at`. The vectors of `from` are
/// independent mod p, so independent: rank over Q >= rank().
template <class Int>
echelon_mod_p grow_echelon(const vectors<Int>& V, const std::vector<std::size_t>& order, u64 p,
                           const std::vector<std::uint32_t>& coord_rank, std::size_t stop_at, const run_control* control) {
  const std::size_t n = V.n, B = residual_kernel::block;
  echelon_mod_p E;
  E.p = p;
  E.n = n;
  const word_reducer R(p);
  std::vector<u64> x(B * n), one(n);
  for (std::size_t s = 0; s < order.size() && E.rank() < stop_at; s += B) {
    if (control) control->check();
    const std::size_t b = std::min(B, order.size() - s);
    for (std::size_t bb = 0; bb < b; ++bb) fill_residues(V, order[s + bb], R, &x[bb * n]);
    const std::size_t before = E.rank();
    residual_kernel::apply(E.rows.data(), E.cols.data(), before, n, x.data(), b, R);
    for (std::size_t bb = 0; bb < b && E.rank() < stop_at; ++bb) {
      std::copy(x.begin() + static_cast<std::ptrdiff_t>(bb * n), x.begin() + static_cast<std::ptrdiff_t>(bb * n + n), one.begin());
      for (std::size_t k = before; k < E.rank(); ++k) {
        const u64 f = one[E.cols[k]];
        if (f == 0) continue;
        const modular::fixed_factor ff(f, p);
        const std::uint32_t* row = &E.rows[k * n];
        for (std::size_t j = 0; j < n; ++j)
          if (row[j] != 0) one[j] = modular::sub(one[j], ff.times(row[j], p), p);
      }
      std::size_t c = n;
      for (std::size_t j = 0; j < n; ++j)
        if (one[j] != 0 && (c == n || coord_rank[j] < coord_rank[c])) c = j;
      if (c == n) continue;
      E.add(one, c, order[s + bb]);
    }
  }
  return E;
}

/// For one prime p < 2^27: whether A[I, J] is invertible mod p and every vector lies in the
/// span of the vectors I mod p (then every (r+1)-minor bordering A[I, J] is 0 mod p: the
/// Schur complement A - A[:, J] A[I, J]^-1 A[I, :] is 0 mod p, and each bordering minor is
/// det A[I, J] times an entry of it). Also det A[I_t, J_t] mod p for every given pair
/// (dets[0] is that of I, J). Returns false when A[I, J] is singular mod p (the prime is not
/// used); throws nothing else; `spanned` tells whether every vector lay in the span.
/// With check_span false, only the determinants (spanned untouched).
template <class Int>
bool bordering_mod_p(const vectors<Int>& V, const std::vector<std::size_t>& I, const std::vector<std::uint32_t>& J,
                     const std::vector<std::pair<std::vector<std::size_t>, std::vector<std::uint32_t>>>& minors, u64 p,
                     std::vector<u64>& dets, bool& spanned, const run_control* control, bool check_span = true) {
  const std::size_t n = V.n, r = I.size(), B = residual_kernel::block;
  const word_reducer R(p);
  std::vector<u64> a;
  std::vector<u64> row(n);
  auto minor_rows = [&](const std::vector<std::size_t>& rows, const std::vector<std::uint32_t>& cols, std::size_t extra) {
    a.assign(r * (r + extra), 0);
    for (std::size_t i = 0; i < r; ++i) {
      fill_residues(V, rows[i], R, row.data());
      for (std::size_t k = 0; k < r; ++k) a[i * (r + extra) + k] = row[cols[k]];
      if (extra) a[i * (r + extra) + r + i] = 1;
    }
  };
  dets.assign(minors.size(), 0);
  for (std::size_t t = check_span ? 1 : 0; t < minors.size(); ++t) {
    minor_rows(minors[t].first, minors[t].second, 0);
    dets[t] = modular::det_and_adjugate_solve(a, r, 0, p);
  }
  if (!check_span) return dets[0] != 0;
  // adj(A[I, J]) = det * A[I, J]^-1 from [A[I, J] | 1].
  minor_rows(I, J, r);
  const u64 det = modular::det_and_adjugate_solve(a, r, r, p);
  dets[0] = det;
  if (det == 0) return false;
  if (control) control->check();
  // rows = A[I, J]^-1 A[I, :]: reduced echelon form with pivots J.
  std::vector<std::uint32_t> AI(r * n), rows(r * n);
  for (std::size_t i = 0; i < r; ++i) {
    fill_residues(V, I[i], R, row.data());
    for (std::size_t j = 0; j < n; ++j) AI[i * n + j] = static_cast<std::uint32_t>(row[j]);
  }
  {
    const modular::fixed_factor dinv(detail::inv_mod(det, p), p);
    std::vector<std::uint32_t> inv(r * r), id(r);
    for (std::size_t i = 0; i < r; ++i) {
      id[i] = static_cast<std::uint32_t>(i);
      for (std::size_t k = 0; k < r; ++k) inv[i * r + k] = static_cast<std::uint32_t>(dinv.times(a[i * 2 * r + r + k], p));
    }
    // rows = 0 - (-inv) A[I, :]: the kernel subtracts x[cols] * rows, with x = [-inv | 0].
    std::vector<u64> x(B * (r + n));
    std::vector<std::uint32_t> ext(r * (r + n), 0);
    for (std::size_t k = 0; k < r; ++k) std::copy(&AI[k * n], &AI[k * n] + n, &ext[k * (r + n) + r]);
    for (std::size_t i0 = 0; i0 < r; i0 += B) {
      const std::size_t b = std::min(B, r - i0);
      // Work in coordinates (k, j) -> one long vector of length r + n: the first r entries
      // hold the coefficients, the kernel's rows are [0 | A[I, :]] with pivot "columns" k.
      std::fill(x.begin(), x.end(), u64{0});
      for (std::size_t bb = 0; bb < b; ++bb)
        for (std::size_t k = 0; k < r; ++k) {
          const u64 v = inv[(i0 + bb) * r + k];
          x[bb * (r + n) + k] = v == 0 ? 0 : p - v;
        }
      residual_kernel::apply(ext.data(), id.data(), r, r + n, x.data(), b, R);
      for (std::size_t bb = 0; bb < b; ++bb)
        for (std::size_t j = 0; j < n; ++j) rows[(i0 + bb) * n + j] = static_cast<std::uint32_t>(x[bb * (r + n) + r + j]);
    }
  }
  // Every vector against the rows.
  spanned = true;
  std::vector<u64> x(B * n);
  const std::size_t m = V.v.size();
  for (std::size_t s = 0; s < m && spanned; s += B) {
    if (control && (s & 1023U) == 0) control->check();
    const std::size_t b = std::min(B, m - s);
    for (std::size_t bb = 0; bb < b; ++bb) fill_residues(V, s + bb, R, &x[bb * n]);
    residual_kernel::apply(rows.data(), J.data(), r, n, x.data(), b, R);
    for (std::size_t t = 0; t < b * n; ++t)
      if (x[t] != 0) {
        spanned = false;
        break;
      }
  }
  return true;
}

/// The primes q below 2^16 dividing G > 0 with their exponents e_q, by trial division;
/// nullopt when a cofactor above 1 remains (a prime factor that is not placed).
template <class Big>
std::optional<std::vector<std::pair<u64, int>>> small_prime_factors(Big G) {
  std::vector<std::pair<u64, int>> primes;
  for (const u64 q : modular::small_primes()) {
    if (G == 1) break;
    if (static_cast<u64>(G % q) != 0) continue;
    int e = 0;
    while (static_cast<u64>(G % q) == 0) G /= q, ++e;
    primes.emplace_back(q, e);
  }
  if (G != 1) return std::nullopt;
  return primes;
}

/// Steps R1-R4 of the header comment for V (m vectors of length n) of rank r < n mod the
/// prime E1.p, E1 grown over all vectors in `order`. nullopt when a proof does not go through.
template <class Int>
std::optional<smith_invariants<Int>> rank_deficient(const vectors<Int>& V, const echelon_mod_p& E1,
                                                    const std::vector<std::size_t>& order,
                                                    const std::vector<double>& vec_log,
                                                    const std::vector<double>& coord_log,
                                                    const std::vector<std::uint32_t>& coord_rank,
                                                    const run_control* control, bool rank_only = false) {
  namespace md = detail::modular;
  using big = md::big_of<Int>;
  const std::size_t n = V.n, m = V.v.size(), r = E1.rank();
  smith_invariants<Int> out;
  if (r == 0) {  // zero mod p; the rank over Q is 0 only if every entry is 0
    for (const auto& v : V.v)
      if (!v.empty()) return std::nullopt;
    return out;
  }
  // R1. Three r x r minors non-zero mod p: I_1 from E1 (greedy, smallest vectors first),
  //     I_2 and I_3 from the same greedy order with the vectors chosen before moved last.
  using minor_t = std::pair<std::vector<std::size_t>, std::vector<std::uint32_t>>;
  std::vector<minor_t> minors;
  minors.emplace_back(E1.from, E1.cols);
  {
    std::vector<char> used(m, 0);
    for (int t = 1; t < 3; ++t) {
      for (const std::size_t i : minors.back().first) used[i] = 1;
      std::vector<std::size_t> o;
      o.reserve(m);
      for (const std::size_t i : order)
        if (!used[i]) o.push_back(i);
      for (const std::size_t i : order)
        if (used[i]) o.push_back(i);
      const echelon_mod_p E = grow_echelon(V, o, E1.p, coord_rank, r, control);
      if (E.rank() != r) return std::nullopt;  // cannot happen: the rank mod p is r
      minors.emplace_back(E.from, E.cols);
    }
  }
  const auto& I = minors[0].first;
  const auto& J = minors[0].second;

  // Hadamard bounds (log2, rounded up): an r-minor A[I_t, J_t] by its rows (each at most
  // the norm of its whole vector) or by its columns (each at most the norm of the whole
  // coordinate), the smaller; a bordering (r+1)-minor the same with the largest other
  // vector (coordinate) added.
  auto sum_of = [](const auto& idx, const std::vector<double>& l) {
    double s = 0;
    for (const auto i : idx) s += std::max(l[i], 0.0);
    return s;
  };
  auto max_outside = [](const auto& idx, const std::vector<double>& l) {
    std::vector<char> in(l.size(), 0);
    for (const auto i : idx) in[i] = 1;
    double b = 0;
    for (std::size_t i = 0; i < l.size(); ++i)
      if (!in[i]) b = std::max(b, l[i]);
    return b;
  };
  const double bits = std::min(sum_of(I, vec_log) + max_outside(I, vec_log), sum_of(J, coord_log) + max_outside(J, coord_log));
  double bits_minors = 0;
  for (const auto& [It, Jt] : minors) bits_minors = std::max(bits_minors, std::min(sum_of(It, vec_log), sum_of(Jt, coord_log)));
  // The primes' product passes 2^(bits + 1) with a margin: twice the bound, so a value below
  // it in absolute value is recovered from its residues (and is 0 when they are).
  const double need = bits * (1 + 1e-9) + 8, need_minors = bits_minors * (1 + 1e-9) + 8;
  {
    const double primes = need / 26.9 + 1;
    const double cost = primes * (static_cast<double>(m) * static_cast<double>(n) * static_cast<double>(r) +
                                  3 * static_cast<double>(r) * static_cast<double>(r) * static_cast<double>(r));
    if (cost > rank_deficient_work_limit) return std::nullopt;
  }

  // R2. The bordering minors vanish mod primes p < 2^27 whose product passes twice their
  //     bound, so they are 0 and the rank over Q is r; the same primes give the three
  //     minors exactly by CRT (R3). Two threads take the primes in turn.
  if (control) control->report("Smith form of the core: bordering minors", 0, static_cast<std::uint64_t>(need / 26.9) + 1);
  md::crt_values<big> crt(minors.size());
  double have = 0;
  u64 p = small_word_limit;
  std::size_t skipped = 0;
  while (have < need) {
    std::vector<u64> batch;
    for (double b = have; b < need; b += 26.9) batch.push_back(p = md::prime_below(p));
    std::vector<std::vector<u64>> dets(batch.size());
    std::vector<char> usable(batch.size(), 0), spanned(batch.size(), 1);
    std::atomic<std::size_t> next{0};
    auto worker = [&] {
      for (std::size_t k; (k = next.fetch_add(1)) < batch.size();) {
        bool s = true;
        usable[k] = bordering_mod_p(V, I, J, minors, batch[k], dets[k], s, control) ? 1 : 0;
        spanned[k] = s ? 1 : 0;
        if (!s) next.store(batch.size());  // the rank mod this prime exceeds r: stop early
      }
    };
    detail::side_by_side(worker, worker);
    for (std::size_t k = 0; k < batch.size(); ++k) {
      if (!usable[k]) {
        if (++skipped > 64) return std::nullopt;
        continue;
      }
      // A vector outside the span: the rank mod batch[k], so over Q, is above r; the
      // greedy basis mod E1.p missed it (E1.p divides a minor). Not handled: decline.
      if (!spanned[k]) return std::nullopt;
      crt.add(dets[k], batch[k]);
      have += std::log2(static_cast<double>(batch[k]));
    }
  }
  // The rank over Q is r (R1 and R2); with rank_only, that is all the caller asked for.
  if (rank_only) {
    out.rank = r;
    return out;
  }
  // The three minors alone, when their bound passes the bordering one (r^3 word operations
  // per prime instead of m n r): residues mod further primes, zero residues included.
  for (std::vector<u64> d; have < need_minors;) {
    p = md::prime_below(p);
    bool unused = true;
    bordering_mod_p(V, I, J, minors, p, d, unused, control, false);
    crt.add(d, p);
    have += std::log2(static_cast<double>(p));
  }
  big G = 0;
  for (std::size_t t = 0; t < minors.size(); ++t) G = md::lehmer_gcd(G, crt.symmetric(t));
  if (G == 0) return std::nullopt;  // cannot happen: det A[I, J] is non-zero mod a prime
  const auto primes_found = small_prime_factors(std::move(G));
  if (!primes_found) return std::nullopt;  // a prime factor above 2^16 that cannot be placed
  const auto& primes = *primes_found;

  // R4. Local Smith forms at each candidate q.
  if (control) control->report("Smith form of the core: local Smith forms", 0, primes.size());
  out.rank = r;
  out.factors.assign(r, Int(1));
  for (const auto& [q, e] : primes) {
    // r vectors independent mod q: an r-minor prime to q, so v_q(G) = 0.
    // Otherwise r - r_q of the r non-zero d_i are divisible by q (r_q: the rank mod q of all
    // vectors), a lower bound of v_q(G) that ends the insertion early (local_hermite_basis).
    const std::size_t rq = grow_echelon(V, order, q, coord_rank, r, control).rank();
    if (rq == r) continue;
    int k = 0;
    u64 Q = 1;
    while (k < e + 1 && Q <= (mod_p_modulus_limit - 1) / q) Q *= q, ++k;
    const auto H = local_hermite_basis(V, q, Q, control, false, static_cast<int>(r - rq), r);
    if (!H) return std::nullopt;
    const square_source s{n, n, &*H};
    // Exactly r invariant factors non-zero mod Q (the other n - r are the zero ones, as the
    // rank is r); more zero ones mean some v_q(d_i) >= k: declined.
    const auto v = md::local_valuations(s, q, k, Q, r, control);
    if (!v) return std::nullopt;
    int sum = 0;
    for (const int x : *v) sum += x;
    if (sum > e) return std::nullopt;  // v_q(G) <= v_q(G'): cannot happen when the proof holds
    for (std::size_t i = 0; i < r; ++i)
      for (int t = 0; t < (*v)[i]; ++t) out.factors[i] *= Int(static_cast<std::int64_t>(q));
  }
  return out;
}

}  // namespace detail::lattice_smith_impl

/// Options of lattice_smith_invariants.
struct lattice_smith_options {
  /// Finish matrices of rank below min(rows, cols) (steps R1-R4: the bordering-minor proof
  /// of the rank); false: decline them, as before that proof existed.
  bool rank_deficient = true;
  /// The rank over Q only (what homology over the rationals needs): the result's rank is
  /// proved as without this option — full rank by n vectors independent mod a prime (step
  /// 0), a lower rank r by the bordering minors (R1-R2) — and its `factors` are left empty;
  /// the candidate primes and local Smith forms (steps 1-4, R3-R4) are not computed.
  bool rank_only = false;
};

/// The rank and invariant factors of the integer matrix A when every prime dividing its
/// invariant factors is below 2^16, by the minor and local Smith form proofs of the header
/// comment (steps 1-4 at full rank min(rows, cols), R1-R4 below it, unless
/// options.rank_deficient is false); nullopt when a proof does not go through (a rank mod
/// the first prime below the rank over Q, a prime factor that cannot be placed, a valuation
/// beyond word-size prime powers, or the work limits). A returned value is always exact; on
/// nullopt the caller uses another route. Stop requests and the phases ("Smith form of the
/// core: rank mod p", "...: bordering minors", "...: local Smith forms") through `control`.
/// Meant for tall or wide matrices: on a square one it costs like modular_smith_invariants
/// and declines more often. Declines at once when m n^2 (m vectors of length n, n =
/// min(rows, cols)) passes 2e11, at full rank when m n^2 / 2 passes 2e9, below full rank when
/// the bordering-minor proof would pass 4e12 word operations. Uses a second thread for the
/// bordering-minor proof.
template <class Int>
  requires std::same_as<Int, integer>
std::optional<smith_invariants<Int>> lattice_smith_invariants(const sparse_matrix<Int>& A,
                                                              const run_control* control = nullptr,
                                                              const lattice_smith_options& options = {}) {
  namespace md = detail::modular;
  namespace dl = detail::lattice_smith_impl;
  using big = md::big_of<Int>;
  using md::u64;
  smith_invariants<Int> out;
  if (A.rows == 0 || A.cols == 0) return out;
  const dl::vectors<Int> V = dl::as_vectors(A);
  const std::size_t n = V.n, m = V.v.size();
  const double dm = static_cast<double>(m), dn = static_cast<double>(n);
  if (dm * dn * dn > dl::rank_step_limit) return std::nullopt;

  // 0. The rank mod a prime below 2^27, vectors inserted smallest first (Euclidean norm),
  //    pivots in the coordinates of smallest norm first. Rank n: the full-rank steps 1-4;
  //    below n: steps R1-R4 (rank-deficient).
  std::vector<std::size_t> order0;         // the insertion order, kept for step 3
  std::vector<std::uint32_t> coord_rank0;  // the coordinates' order, likewise
  std::vector<std::size_t> first_set;      // n vectors independent mod step 0's prime
  {
    std::vector<double> vec_log(m), coord_sq(n, 0.0), coord_log(n);
    std::vector<double> l;
    for (std::size_t i = 0; i < m; ++i) {
      l.clear();
      for (const auto& [j, x] : V.v[i]) {
        const double b = dl::log2_abs(x);
        l.push_back(b);
        coord_sq[j] += std::exp2(2 * b);
      }
      vec_log[i] = md::log2_norm(l);
    }
    // log2 of the coordinate norms, rounded up: each term's log2 is an upper bound, and the
    // double sum's relative rounding error (below m 2^-53) is covered by the margin.
    for (std::size_t j = 0; j < n; ++j)
      coord_log[j] = coord_sq[j] == 0 ? -INFINITY : 0.5 * std::log2(coord_sq[j]) + 1e-6;
    std::vector<std::size_t> order(m);
    for (std::size_t i = 0; i < m; ++i) order[i] = i;
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return vec_log[a] < vec_log[b]; });
    std::vector<std::size_t> by_coord(n);
    for (std::size_t j = 0; j < n; ++j) by_coord[j] = j;
    std::stable_sort(by_coord.begin(), by_coord.end(), [&](std::size_t a, std::size_t b) { return coord_log[a] < coord_log[b]; });
    std::vector<std::uint32_t> coord_rank(n);
    for (std::size_t t = 0; t < n; ++t) coord_rank[by_coord[t]] = static_cast<std::uint32_t>(t);
    if (control) control->report("Smith form of the core: rank mod p", 0, 1);
    const dl::echelon_mod_p E = dl::grow_echelon(V, order, md::prime_below(dl::small_word_limit), coord_rank, n, control);
    if (E.rank() < n) {
      if (!options.rank_deficient) return std::nullopt;
      return dl::rank_deficient(V, E, order, vec_log, coord_log, coord_rank, control, options.rank_only);
    }
    if (options.rank_only) {  // n vectors independent mod a prime: an n-minor is non-zero, rank n
      out.rank = n;
      return out;
    }
    order0 = std::move(order);
    coord_rank0 = std::move(coord_rank);
    first_set = E.from;
  }
  if (0.5 * dm * dn * dn > dl::work_limit) return std::nullopt;

  // 1. Three sets of n vectors independent mod a prime (full rank proved by the first, step
  //    0's): the second and third by the same greedy order (smallest norms first) with the
  //    vectors chosen before moved last, so that the three minors differ and their Hadamard
  //    bounds stay small, as R1 does.
  u64 p = md::prime_below(mod_p_modulus_limit);
  std::vector<std::vector<std::size_t>> sets{std::move(first_set)};
  {
    std::vector<char> used(m, 0);
    std::vector<std::size_t> o;
    o.reserve(m);
    for (int t = 1; t < 3; ++t) {
      for (const std::size_t i : sets.back()) used[i] = 1;
      o.clear();
      for (const std::size_t i : order0)
        if (!used[i]) o.push_back(i);
      for (const std::size_t i : order0)
        if (used[i]) o.push_back(i);
      const dl::echelon_mod_p E = dl::grow_echelon(V, o, md::prime_below(dl::small_word_limit), coord_rank0, n, control);
      if (E.rank() != n) return std::nullopt;  // cannot happen: the rank mod that prime is n
      sets.push_back(E.from);
    }
  }

  // 2. The minors M_t = det A[I_t, :] exactly, by CRT past twice the largest Hadamard bound
  //    (product of the vectors' Euclidean norms, log2 rounded up with a margin).
  double bits = 0;
  for (const auto& I : sets) {
    double b = 0;
    for (const std::size_t i : I) {
      std::vector<double> l;
      for (const auto& e : V.v[i]) l.push_back(dl::log2_abs(e.second));
      b += std::max(md::log2_norm(l), 0.0);
    }
    bits = std::max(bits, b);
  }
  const double need = bits * (1 + 1e-9) + 8;
  md::crt_values<big> crt(sets.size());
  std::vector<u64> res(sets.size()), a, row;
  double have = 0;
  while (have < need) {
    if (control) control->check();
    p = md::prime_below(p);
    for (std::size_t t = 0; t < sets.size(); ++t) {
      a.clear();
      for (const std::size_t i : sets[t]) {
        V.dense_residues(i, p, row);
        a.insert(a.end(), row.begin(), row.end());
      }
      res[t] = md::det_and_adjugate_solve(a, n, 0, p);
    }
    crt.add(res, p);
    have += std::log2(static_cast<double>(p));
  }
  big G = 0;
  for (std::size_t t = 0; t < sets.size(); ++t) G = md::lehmer_gcd(G, crt.symmetric(t));
  if (G == 0) return std::nullopt;  // cannot happen: M_1 is non-zero mod a prime

  // Trial division: the small primes q of G' with e_q = v_q(G'), and the cofactor.
  const auto primes_found = dl::small_prime_factors(std::move(G));
  if (!primes_found) return std::nullopt;  // a prime factor above 2^16 that cannot be placed
  const auto& primes = *primes_found;

  // 3. Local Smith forms from local Hermite bases.
  out.rank = n;
  out.factors.assign(n, Int(1));
  for (const auto& [q, e] : primes) {
    // The rank r_q of all vectors mod q (step 0's blocked elimination). r_q = n: an n x n
    // minor prime to q, so v_q(G) = 0 (a q of G' that divides no d_i, a common factor of the
    // three minors only). Otherwise n - r_q of the d_i are divisible by q, so v_q(G) >=
    // n - r_q: the local basis below may stop once its vectors reach that index (when every
    // such d_i has v_q = 1, as on the matching complexes, after a few hundred vectors).
    const std::size_t rq = dl::grow_echelon(V, order0, q, coord_rank0, n, control).rank();
    if (rq == n) continue;
    int k = 0;
    u64 Q = 1;
    while (k < e + 1 && Q <= (mod_p_modulus_limit - 1) / q) Q *= q, ++k;
    const auto H = dl::local_hermite_basis(V, q, Q, control, true, static_cast<int>(n - rq));
    if (!H) return std::nullopt;
    const dl::square_source s{n, n, &*H};
    const auto v = md::local_valuations(s, q, k, Q, n, control);
    if (!v) return std::nullopt;
    int sum = 0;
    for (const int x : *v) sum += x;
    if (sum > e) return std::nullopt;  // v_q(G) <= v_q(G'): cannot happen when the proof holds
    // 4. d_i takes q^v_i.
    for (std::size_t i = 0; i < n; ++i)
      for (int t = 0; t < (*v)[i]; ++t) out.factors[i] *= Int(static_cast<std::int64_t>(q));
  }
  return out;
}

}  // namespace lacuna

// lacuna/algorithm/modular_smith.hpp — the invariant factors of a dense integer matrix by
// modular arithmetic, every number proved; nullopt when a proof does not go through.
//
// Dense Euclidean elimination on integers (dense_smith.hpp) lets coefficients grow; on a
// 150 x 150 matrix of small entries, or a matrix of huge entries, it is slow. This route keeps
// every computation in 62-bit words or in a few exact determinant-sized integers:
//
//  1. Rank. The rank r mod a prime p is a lower bound of the rank over Q (a minor that is
//     non-zero mod p is non-zero), so r = min(rows, cols) is proved at once. For smaller r,
//     the rank mod every prime of step 2 must be r as well: every (r+1)-minor is then 0
//     modulo primes whose product passes twice its Hadamard bound, so it is 0, and the rank
//     over Q is r. The matrix is transposed so that n = rows <= cols = m (the invariant
//     factors of A and A^T agree). The elimination mod p picks rows I and columns J with
//     B = A[I, J] (r x r) non-singular mod p, hence det B != 0.
//  2. A multiple of d_1 ... d_r. The product of the invariant factors is the gcd G of the
//     r x r minors of A (the determinantal divisors; Newman, "Integral Matrices", 1972,
//     §II.3 — from memory). D = det B is one of them, so G | D; G = |D| when A is square of
//     full rank. Otherwise det(P A Q) for integer P (r x n; the identity when r == n) and Q
//     (m x r) is, by Cauchy–Binet, an integer combination of r x r minors of A, so
//     G | gcd(D, det(P_1 A Q_1), det(P_2 A Q_2)) =: G'. Determinants are found exactly by the
//     Chinese remainder theorem over 62-bit primes until the product of the primes passes
//     twice Hadamard's bound (a log2 upper bound with a margin), as in the determinant-modulus
//     methods of Domich, Kannan & Trotter (1987) and Hafner & McCurley (1991).
//  3. Small primes. G' is trial-divided by the primes below 2^16. For each such p with
//     e = v_p(G'), the Smith form of A over Z/p^(e+1) is found by elimination with pivots of
//     least p-valuation (local Smith forms, Dumas, Saunders & Villard 2001; Dumas,
//     Heckenbach, Saunders & Welker 2003). Since v_p(d_1...d_r) <= e, no d_i vanishes mod
//     p^(e+1) and the pivot valuations are exactly v_p(d_1) <= ... <= v_p(d_r). (The route
//     returns nullopt if p^(e+1) >= 2^62, if the number of pivots is not r, or if the
//     valuations do not add up: at most e, and exactly e when G = |D|.)
//  4. The cofactor c: G' without its primes below 2^16 (1, or a number whose factorization
//     is not known). The adjugate proof: y = adj(B) b for random small integer vectors b is
//     found by the same CRT (y = det B * B^-1 b mod each prime). Every entry of adj(B) is an
//     (r-1)-minor of A, so d_1 ... d_(r-1) divides every y_i and so their gcd g. If
//     gcd(g, c) = 1, no prime of c divides d_1 ... d_(r-1): all of the c-part of G belongs to
//     d_r. When G = |D| that c-part is c itself. When G' is only a multiple of G and c > 1,
//     the c-part of G is not known exactly and the route returns nullopt; so it does when
//     gcd(g, c) != 1.
//
// Nothing probabilistic reaches the result: random choices (primes, b, P, Q) only decide
// whether the proofs succeed. The primes are taken downward from 2^62 and the random numbers
// come from a fixed seed, so the route is deterministic.
#pragma once

#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>

#include <lacuna/ring/detail/cpp_int.hpp>

#include <algorithm>
#include <cmath>
#include <concepts>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <random>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {
namespace detail::modular {

using u64 = std::uint64_t;
__extension__ using u128 = unsigned __int128;
using big = boost::multiprecision::cpp_int;

/// Multiplication by a fixed w modulo q < 2^63 with a precomputed quotient (Shoup's trick,
/// as in NTL's MulModPrecon): two word products and one correction instead of a division.
struct fixed_factor {
  u64 w, w_shoup;
  fixed_factor(u64 w_, u64 q) : w(w_), w_shoup(static_cast<u64>((static_cast<u128>(w_) << 64U) / q)) {}
  u64 times(u64 x, u64 q) const {
    const u64 h = static_cast<u64>((static_cast<u128>(w_shoup) * x) >> 64U);
    u64 r = w * x - h * q;
    return r >= q ? r - q : r;
  }
};

inline u64 sub(u64 a, u64 b, u64 q) { return a >= b ? a - b : a + q - b; }

/// Word operations beyond which modular_smith_invariants declines at once (a few seconds on
/// one core): the item-9 matrices need at most 3e8, a 100 x 100 rank-deficient one 2e8.
inline constexpr double modular_work_limit = 4e9;

/// |x| mod q for 1 < q < 2^62: Horner over the 64-bit limbs, most significant first, with a
/// precomputed multiplication by 2^64 mod q (a word product per limb instead of a division).
template <class Big>
u64 abs_mod(const Big& x, u64 q) {
  const auto& b = x.backend();
  const std::size_t k = b.size();
  const auto* limb = b.limbs();
  static_assert(sizeof(*limb) == sizeof(u64), "64-bit limbs");
  const fixed_factor base(static_cast<u64>((static_cast<u128>(1) << 64U) % q), q);
  u64 r = 0;
  for (std::size_t i = k; i-- > 0;) {
    u64 l = static_cast<u64>(limb[i]);
    if (q > (u64{1} << 61U))
      while (l >= q) l -= q;  // at most 7 steps
    else
      l %= q;
    r = base.times(r, q) + l;
    if (r >= q) r -= q;
  }
  return r;
}

/// gcd(|a|, |b|) by Lehmer's method (Knuth, TAOCP vol. 2, §4.5.2, Algorithm L): Euclid's
/// quotients simulated on the leading 62 bits while both bounds agree, then applied to the
/// full numbers as one 2 x 2 matrix. Each applied matrix is a product of [[0, 1], [1, -q]],
/// so of determinant +-1: the gcd is preserved whatever the quotients (absolute values and
/// order are restored after each step). boost's gcd of cpp_int is binary (a shift and a
/// subtraction per bit), quadratic with a large constant on numbers of 10^5 bits.
template <class Big>
Big lehmer_gcd(Big a, std::type_identity_t<Big> b) {  // b converts to Big, as a plain parameter would
  __extension__ using i128 = __int128;
  a = boost::multiprecision::abs(a);
  b = boost::multiprecision::abs(b);
  if (a < b) std::swap(a, b);
  while (b != 0) {
    const std::size_t na = boost::multiprecision::msb(a);
    if (na < 128) return boost::multiprecision::gcd(a, b);
    const std::size_t shift = na - 61;  // x < 2^62, y <= x
    const auto x0 = static_cast<u64>(big(a >> shift)), y0 = static_cast<u64>(big(b >> shift));
    i128 x = x0, y = y0, A = 1, B = 0, C = 0, D = 1;
    while (y + C != 0 && y + D != 0) {
      const i128 q1 = (x + A) / (y + C), q2 = (x + B) / (y + D);
      if (q1 != q2) break;
      i128 t = A - q1 * C;
      A = C, C = t;
      t = B - q1 * D;
      B = D, D = t;
      t = x - q1 * y;
      x = y, y = t;
    }
    if (B == 0) {
      big r = a % b;
      a = std::move(b);
      b = std::move(r);
      continue;
    }
    // |A|, |B|, |C|, |D| <= 2^62 here: the cofactors of x0, y0 < 2^62.
    big na_ = big(static_cast<std::int64_t>(A)) * a + big(static_cast<std::int64_t>(B)) * b;
    big nb_ = big(static_cast<std::int64_t>(C)) * a + big(static_cast<std::int64_t>(D)) * b;
    a = boost::multiprecision::abs(na_);
    b = boost::multiprecision::abs(nb_);
    if (a < b) std::swap(a, b);
  }
  return a;
}

/// The big-integer type of an integer ring Int (cpp_int for lacuna::integer).
template <class Int>
using big_of = std::remove_cvref_t<decltype(std::declval<const Int&>().to_big())>;

/// The matrix, transposed so that rows <= cols, with its big entries kept as cpp_int once.
template <class Int>
struct source {
  using big = big_of<Int>;
  std::size_t n = 0, m = 0;
  const dense_matrix<Int>* A = nullptr;
  bool transposed = false;
  std::vector<std::int64_t> small;  // n x m; valid where is_big is 0
  std::vector<char> is_big;
  std::vector<big> bigs;            // |entry| for big entries, in row-major order
  std::vector<std::uint32_t> big_index;
  std::vector<char> big_negative;

  const Int& at(std::size_t i, std::size_t j) const { return transposed ? (*A)(j, i) : (*A)(i, j); }

  explicit source(const dense_matrix<Int>& a) : A(&a) {
    transposed = a.rows() > a.cols();
    n = transposed ? a.cols() : a.rows();
    m = transposed ? a.rows() : a.cols();
    small.assign(n * m, 0);
    is_big.assign(n * m, 0);
    big_index.assign(n * m, 0);
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = 0; j < m; ++j) {
        const Int& x = at(i, j);
        if (x.is_small()) {
          small[i * m + j] = x.small_value();
        } else {
          is_big[i * m + j] = 1;
          big_index[i * m + j] = static_cast<std::uint32_t>(bigs.size());
          big_negative.push_back(x.sign() < 0);
          bigs.push_back(boost::multiprecision::abs(x.to_big()));
        }
      }
  }
  /// Entry (i, j) mod q, in [0, q).
  u64 residue(std::size_t i, std::size_t j, u64 q) const {
    const std::size_t k = i * m + j;
    if (!is_big[k]) return detail::reduce_signed(small[k], q);
    const u64 r = abs_mod(bigs[big_index[k]], q);
    return (big_negative[big_index[k]] && r != 0) ? q - r : r;
  }
  /// An upper bound of log2 |entry (i, j)| (-inf for zero).
  double log2_abs(std::size_t i, std::size_t j) const {
    const std::size_t k = i * m + j;
    if (!is_big[k]) {
      if (small[k] == 0) return -INFINITY;
      const double a = std::fabs(static_cast<double>(small[k]));  // rounding: relative 2^-53
      return std::log2(a) + 1e-9;
    }
    return static_cast<double>(boost::multiprecision::msb(bigs[big_index[k]]) + 1);
  }
};

/// log2 of sqrt(sum 2^(2 l_i)) for the given log2 magnitudes, rounded up (with a margin).
inline double log2_norm(const std::vector<double>& l) {
  double top = -INFINITY;
  for (double x : l) top = std::max(top, x);
  if (top == -INFINITY) return -INFINITY;
  double s = 0;
  for (double x : l)
    if (x != -INFINITY) s += std::exp2(2 * (x - top));
  return top + 0.5 * std::log2(s) + 1e-6;
}

/// The next prime below p (p > 2^61 in practice).
inline u64 prime_below(u64 p) {
  do --p;
  while (!is_prime(p));
  return p;
}

/// Rows I and columns J of a non-singular r x r submatrix of the n x m matrix a mod p, r its
/// rank mod p. Row echelon form row by row: O(n^2 m).
struct pivots_mod_p {
  std::vector<std::size_t> cols, rows;
};
inline pivots_mod_p pivot_columns(std::vector<u64> a, std::size_t n, std::size_t m, u64 p, const run_control* control) {
  std::vector<std::size_t> cols, rows;  // pivot column and row (normalized to 1 there)
  for (std::size_t i = 0; i < n; ++i) {
    if (control) control->check();
    u64* r = &a[i * m];
    for (std::size_t k = 0; k < cols.size(); ++k) {
      const u64 f = r[cols[k]];
      if (f == 0) continue;
      const fixed_factor ff(f, p);
      const u64* s = &a[rows[k] * m];
      for (std::size_t j = 0; j < m; ++j)
        if (s[j] != 0) r[j] = sub(r[j], ff.times(s[j], p), p);
    }
    std::size_t c = 0;
    while (c < m && r[c] == 0) ++c;
    if (c == m) continue;
    const fixed_factor inv(detail::inv_mod(r[c], p), p);
    for (std::size_t j = 0; j < m; ++j) r[j] = inv.times(r[j], p);
    cols.push_back(c);
    rows.push_back(i);
  }
  return {cols, rows};
}

/// Gaussian elimination mod p on the k x k matrix b (row-major) with `extra` right-hand
/// columns appended to each row (row stride k + extra). Returns det b mod p; when it is not
/// zero, the right-hand columns are replaced by det(b) * b^-1 * rhs = adj(b) * rhs mod p.
inline u64 det_and_adjugate_solve(std::vector<u64>& a, std::size_t k, std::size_t extra, u64 p) {
  const std::size_t w = k + extra;
  u64 det = 1;
  for (std::size_t t = 0; t < k; ++t) {
    std::size_t piv = t;
    while (piv < k && a[piv * w + t] == 0) ++piv;
    if (piv == k) return 0;
    if (piv != t) {
      std::swap_ranges(a.begin() + static_cast<std::ptrdiff_t>(t * w), a.begin() + static_cast<std::ptrdiff_t>(t * w + w),
                       a.begin() + static_cast<std::ptrdiff_t>(piv * w));
      det = det == 0 ? 0 : p - det;
    }
    const u64 pv = a[t * w + t];
    det = detail::mul_mod_u64(det, pv, p);
    const u64 inv = detail::inv_mod(pv, p);
    const fixed_factor finv(inv, p);
    u64* rt = &a[t * w];
    for (std::size_t j = t; j < w; ++j) rt[j] = finv.times(rt[j], p);  // pivot row normalized
    for (std::size_t i = t + 1; i < k; ++i) {
      u64* ri = &a[i * w];
      const u64 f = ri[t];
      if (f == 0) continue;
      const fixed_factor ff(f, p);
      for (std::size_t j = t; j < w; ++j) ri[j] = sub(ri[j], ff.times(rt[j], p), p);
    }
  }
  // Back substitution on the unit upper triangle, then scale by det.
  for (std::size_t t = k; t-- > 0;) {
    for (std::size_t i = 0; i < t; ++i) {
      u64* ri = &a[i * w];
      const u64 f = ri[t];
      if (f == 0) continue;
      const fixed_factor ff(f, p);
      for (std::size_t j = k; j < w; ++j) ri[j] = sub(ri[j], ff.times(a[t * w + j], p), p);
    }
  }
  const fixed_factor fd(det, p);
  for (std::size_t i = 0; i < k; ++i)
    for (std::size_t j = k; j < w; ++j) a[i * w + j] = fd.times(a[i * w + j], p);
  return det;
}

/// Values reconstructed together from residues mod distinct primes (Garner's incremental
/// Chinese remaindering): after each add, X_i is the residue of value i in [0, M).
template <class Big>
struct crt_values {
  using big = Big;
  big M = 1;
  std::vector<big> X;
  explicit crt_values(std::size_t count) : X(count, big(0)) {}
  void add(const std::vector<u64>& r, u64 p) {
    const u64 m_mod = abs_mod(M, p);
    const fixed_factor minv(detail::inv_mod(m_mod, p), p);
    for (std::size_t i = 0; i < X.size(); ++i) {
      const u64 x_mod = abs_mod(X[i], p);
      const u64 t = minv.times(sub(r[i], x_mod, p), p);
      if (t != 0) X[i] += M * t;
    }
    M *= p;
  }
  /// Value i in (-M/2, M/2]: the value itself when |value| < M/2.
  big symmetric(std::size_t i) const {
    big h = M >> 1;
    return X[i] > h ? big(X[i] - M) : X[i];
  }
};

/// The primes below 2^16, by a sieve. Deliberately not constexpr (nor a lambda, which would
/// be implicitly constexpr): GCC tries to constant-initialize a static from a constexpr
/// callable, running the whole sieve in the compiler in every translation unit that includes
/// this header (about a quarter of the compile cost of <lacuna/lacuna.hpp>).
inline std::vector<u64> sieve_small_primes() {
  constexpr std::size_t limit = 1U << 16U;
  std::vector<char> composite(limit, 0);
  std::vector<u64> out;
  for (std::size_t i = 2; i < limit; ++i) {
    if (composite[i]) continue;
    out.push_back(i);
    for (std::size_t j = i * i; j < limit; j += i) composite[j] = 1;
  }
  return out;
}

/// The primes below 2^16 (computed once; a constant table, not state).
inline const std::vector<u64>& small_primes() {
  static const std::vector<u64> table = sieve_small_primes();
  return table;
}

/// The p-valuations of the r non-zero invariant factors of the n x m matrix mod q = p^k
/// (n <= m), by elimination with a pivot of least valuation; nullopt unless exactly r pivots
/// are non-zero mod q (the caller's bounds say that every v_p(d_i) < k and the rank is r).
template <class Source>
std::optional<std::vector<int>> local_valuations(const Source& s, u64 p, int k, u64 q, std::size_t r,
                                                         const run_control* control) {
  const std::size_t n = s.n, m = s.m;
  std::vector<u64> a(n * m);
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < m; ++j) a[i * m + j] = s.residue(i, j, q);
  auto valuation = [&](u64 x) {
    int v = 0;
    while (x % p == 0) x /= p, ++v;
    return v;
  };
  std::vector<std::size_t> col(m);
  for (std::size_t j = 0; j < m; ++j) col[j] = j;
  std::vector<int> out;
  for (std::size_t t = 0; t < n; ++t) {
    if (control) control->check();
    int best_v = k;
    std::size_t bi = 0, bj = 0;
    for (std::size_t i = t; i < n && best_v > 0; ++i)
      for (std::size_t jj = t; jj < m; ++jj) {
        const u64 x = a[i * m + col[jj]];
        if (x == 0) continue;
        const int v = valuation(x);
        if (v < best_v) {
          best_v = v, bi = i, bj = jj;
          if (v == 0) break;
        }
      }
    if (best_v >= k) {  // the rest is zero mod q
      if (t != r) return std::nullopt;
      return out;
    }
    if (t >= r) return std::nullopt;
    if (bi != t)
      std::swap_ranges(a.begin() + static_cast<std::ptrdiff_t>(t * m), a.begin() + static_cast<std::ptrdiff_t>(t * m + m),
                       a.begin() + static_cast<std::ptrdiff_t>(bi * m));
    std::swap(col[t], col[bj]);
    u64 pv = 1;
    for (int i = 0; i < best_v; ++i) pv *= p;
    const u64* rt = &a[t * m];
    const u64 unit = rt[col[t]] / pv;  // pivot = p^v * unit, unit prime to p
    const fixed_factor uinv(detail::inv_mod(unit % q, q), q);
    for (std::size_t i = t + 1; i < n; ++i) {
      u64* ri = &a[i * m];
      const u64 x = ri[col[t]];
      if (x == 0) continue;
      // x has valuation >= v, so x = p^v * (x / p^v) and row_i -= (x / p^v) unit^-1 row_t
      // clears it.
      const fixed_factor ff(uinv.times((x / pv) % q, q), q);
      for (std::size_t jj = t; jj < m; ++jj) {
        const std::size_t j = col[jj];
        if (rt[j] != 0) ri[j] = sub(ri[j], ff.times(rt[j], q), q);
      }
    }
    out.push_back(best_v);
  }
  if (out.size() != r) return std::nullopt;
  return out;
}

}  // namespace detail::modular

/// Whether modular_smith_invariants is worth trying on A before dense_smith_form, by
/// measurement (benchmarks/modular_smith.cpp, docs/performance.md): dense elimination wins
/// on square matrices below about 32 with one-digit entries and below about 8 with 19-digit
/// entries; on rank-deficient ones (whose proofs cost the route a rank per prime and two
/// compressed determinants) below about 64 (X·Y of rank 0.9 n: 8.3 against 14.2 ms at n = 40,
/// 138 against 95 ms at n = 64; the 103 x 47 remainder of rank 46 of a random 2-complex, 4
/// against 60 ms). So: any entry beyond 64 bits (where dense elimination grows fastest), or
/// >= 8 with an entry beyond 32 bits, or min(rows, cols) >= 64, or >= 32 when A has full
/// rank min(rows, cols) modulo a prime near 2^62 (a rank mod p is a lower bound of the rank,
/// so full rank mod p is full rank; the check costs O(k^2 max(rows, cols)) word operations,
/// little beside either route).
inline bool prefer_modular_smith(const dense_matrix<integer>& A) {
  const std::size_t k = std::min(A.rows(), A.cols());
  bool wide_entry = false;
  for (std::size_t i = 0; i < A.rows(); ++i)
    for (std::size_t j = 0; j < A.cols(); ++j) {
      const integer& x = A(i, j);
      if (!x.is_small()) return true;
      const std::int64_t v = x.small_value();
      wide_entry = wide_entry || v > (std::int64_t{1} << 32) || v < -(std::int64_t{1} << 32);
    }
  if (wide_entry && k >= 8) return true;
  if (k >= 64) return true;
  if (k < 32) return false;
  namespace md = detail::modular;
  const md::source<integer> s(A);  // transposed so that s.n <= s.m
  const md::u64 p = md::prime_below(mod_p_modulus_limit);
  std::vector<md::u64> a(s.n * s.m);
  for (std::size_t i = 0; i < s.n; ++i)
    for (std::size_t j = 0; j < s.m; ++j) a[i * s.m + j] = s.residue(i, j, p);
  return md::pivot_columns(std::move(a), s.n, s.m, p, nullptr).cols.size() == k;
}

/// The rank and invariant factors of the integer matrix A (any shape), or nullopt when the
/// modular proofs of the header comment do not go through (a cofactor that cannot be placed,
/// a prime power beyond 62 bits, a rank that differs between primes). The caller then uses
/// another route (dense_smith_form); a returned value is always exact. Stop requests and
/// progress through `control` (phase "Smith form of the core", units: primes).
/// Cost: O(n^2 m) word operations per prime, with about (log2 of Hadamard's bound) / 61
/// primes, plus one local elimination per small prime dividing the determinant.
template <class Int>
  requires std::same_as<Int, integer>
std::optional<smith_invariants<Int>> modular_smith_invariants(const dense_matrix<Int>& A,
                                                              const run_control* control = nullptr) {
  namespace md = detail::modular;
  using big = md::big_of<Int>;
  using md::u64;
  const md::source<Int> s(A);
  const std::size_t n = s.n, m = s.m;
  smith_invariants<Int> out;
  if (n == 0) return out;
  auto residues = [&](u64 q) {
    std::vector<u64> a(n * m);
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = 0; j < m; ++j) a[i * m + j] = s.residue(i, j, q);
    return a;
  };

  // 1. The rank r mod a prime, rows I and columns J of a submatrix B non-singular mod p
  //    (so det B != 0 and r <= rank over Q). Full rank (r == n) is then proved; for r < n
  //    the rank over Q is proved below by the same rank mod enough primes.
  u64 p = md::prime_below(mod_p_modulus_limit);
  const md::pivots_mod_p piv = md::pivot_columns(residues(p), n, m, p, control);
  const std::size_t r = piv.cols.size();
  const std::vector<std::size_t>& I = piv.rows;
  const std::vector<std::size_t>& J = piv.cols;
  if (r == 0) return std::nullopt;  // zero mod p: not proved zero here
  const bool exact_product = r == n && n == m;  // then G = |det B| exactly
  if (n == 1) {  // r == 1: d_1 = gcd of the entries, exactly
    Int g = 0;
    for (std::size_t j = 0; j < m; ++j) g = gcd(g, s.at(0, j));
    out.rank = 1;
    out.factors = {normalize(g)};
    return out;
  }

  // 2. By CRT past twice Hadamard's bound, with 62-bit primes: D = det B, y = adj(B) b for
  //    two vectors b, and det(P A Q) for two pairs P (r x n; the identity when r == n) and
  //    Q (m x r; only when B is not all of A): by Cauchy–Binet, an integer combination of
  //    r x r minors of A, so G = d_1...d_r divides G' = gcd(D, det(P A Q)...). For r < n, the
  //    rank mod each prime must be r: then every (r+1)-minor is 0 mod primes whose product
  //    passes twice its Hadamard bound, so it is 0, and the rank over Q is r.
  std::mt19937_64 rng(0x5eed'0001'2026ULL);
  constexpr int n_b = 2, n_q = 2;
  std::vector<std::vector<std::int64_t>> bvec(n_b, std::vector<std::int64_t>(r));
  for (auto& b : bvec)
    for (auto& x : b) x = static_cast<std::int64_t>(rng() % 101) - 50;
  const bool compress = !exact_product;
  const bool square_p = r == n;  // P = identity
  std::vector<std::vector<std::int64_t>> pmat(compress && !square_p ? n_q : 0, std::vector<std::int64_t>(r * n));
  std::vector<std::vector<std::int64_t>> qmat(compress ? n_q : 0, std::vector<std::int64_t>(m * r));
  for (auto& x_ : pmat)
    for (auto& x : x_) x = static_cast<std::int64_t>(rng() % 7) - 3;
  for (auto& x_ : qmat)
    for (auto& x : x_) x = static_cast<std::int64_t>(rng() % 7) - 3;
  std::vector<double> row_log(n);
  for (std::size_t i = 0; i < n; ++i) {
    std::vector<double> l(m);
    for (std::size_t j = 0; j < m; ++j) l[j] = s.log2_abs(i, j);
    row_log[i] = std::max(md::log2_norm(l), 0.0);
  }
  // y_i = det(B with column i replaced by b): Hadamard by columns, each at most
  // max(||B_j||, ||b||), ||b|| <= 50 sqrt(r).
  const double log2_b = std::log2(50.0) + 0.5 * std::log2(static_cast<double>(r)) + 1e-6;
  double bits = 0;
  for (std::size_t jj = 0; jj < r; ++jj) {
    std::vector<double> l(r);
    for (std::size_t ii = 0; ii < r; ++ii) l[ii] = s.log2_abs(I[ii], J[jj]);
    bits += std::max(md::log2_norm(l), log2_b);
  }
  if (compress) {
    // |det(P A Q)| <= prod_i ||row i of P A Q|| <= prod_i ||p_i|| ||A||_F ||Q||_F, with
    // ||p_i|| <= 3 sqrt(n) (1 for the identity), ||Q||_F <= 3 sqrt(m r).
    double log2_af = 0;
    {
      std::vector<double> l(row_log);
      log2_af = md::log2_norm(l);
    }
    const double log2_p = square_p ? 0.0 : std::log2(3.0) + 0.5 * std::log2(static_cast<double>(n)) + 1e-6;
    const double log2_q = std::log2(3.0) + 0.5 * std::log2(static_cast<double>(m) * static_cast<double>(r)) + 1e-6;
    double bits_pq = static_cast<double>(r) * (log2_p + std::max(log2_af, 0.0) + log2_q);
    if (square_p) {  // the sharper bound prod_i ||a_i|| ||Q||_F when P is the identity
      bits_pq = 0;
      for (std::size_t i = 0; i < n; ++i) bits_pq += row_log[i] + log2_q;
    }
    bits = std::max(bits, bits_pq);
  }
  if (r < n) {  // (r+1)-minors: the r+1 largest row norms
    std::vector<double> sorted(row_log);
    std::sort(sorted.rbegin(), sorted.rend());
    double bits_rank = 0;
    for (std::size_t i = 0; i <= r; ++i) bits_rank += sorted[i];
    bits = std::max(bits, bits_rank);
  }
  // Each prime is above 2^61; the product must exceed 2 * bound (+ a margin for rounding).
  const double need = bits * (1 + 1e-9) + 8;
  // The route's cost is about (number of primes) x (word operations per prime). It declines
  // before starting when that passes modular_work_limit: a large rank-deficient core (r n m
  // per prime for P A, and about r log(entries) / 61 primes) would cost far more than a
  // dense elimination that finds small pivots, so the caller's route is kept for it.
  {
    const double primes = need / 61 + 1, dr = static_cast<double>(r), dn = static_cast<double>(n),
                 dm = static_cast<double>(m);
    double per_prime = dr * dr * dr / 3 + (r < n ? dn * dn * dm : 0);
    if (compress) per_prime += n_q * ((square_p ? 0 : dr * dn * dm) + dr * dm * dr + dr * dr * dr / 3);
    if (primes * per_prime > md::modular_work_limit) return std::nullopt;
  }
  const std::size_t values = 1 + n_b * r + (compress ? n_q : 0);
  md::crt_values<big> crt(values);
  double have = 0;
  detail::progress_ticker ticker(control, "Smith form of the core", static_cast<std::uint64_t>(need / 61) + 1);
  std::vector<u64> res(values), work, pa, paq;
  std::size_t skipped = 0;
  while (have < need) {
    p = md::prime_below(p);
    ticker();
    const std::vector<u64> ap = residues(p);
    if (r < n && md::pivot_columns(ap, n, m, p, control).cols.size() != r) return std::nullopt;
    // B | b_1 | b_2 mod p.
    const std::size_t w = r + n_b;
    work.assign(r * w, 0);
    for (std::size_t ii = 0; ii < r; ++ii) {
      for (std::size_t jj = 0; jj < r; ++jj) work[ii * w + jj] = ap[I[ii] * m + J[jj]];
      for (std::size_t k = 0; k < n_b; ++k) work[ii * w + r + k] = detail::reduce_signed(bvec[k][ii], p);
    }
    const u64 det = md::det_and_adjugate_solve(work, r, n_b, p);
    if (det == 0) {  // p | det B: adj(B) b is not found this way; take another prime
      if (++skipped > 64) return std::nullopt;
      continue;
    }
    res[0] = det;
    for (std::size_t k = 0; k < n_b; ++k)
      for (std::size_t ii = 0; ii < r; ++ii) res[1 + k * r + ii] = work[ii * w + r + k];
    for (std::size_t k = 0; compress && k < n_q; ++k) {
      // P A (r x m), then (P A) Q (r x r), mod p.
      if (square_p) {
        pa = ap;
      } else {
        pa.assign(r * m, 0);
        for (std::size_t i = 0; i < r; ++i)
          for (std::size_t t = 0; t < n; ++t) {
            const u64 f = detail::reduce_signed(pmat[k][i * n + t], p);
            if (f == 0) continue;
            const md::fixed_factor ff(f, p);
            for (std::size_t j = 0; j < m; ++j) pa[i * m + j] = detail::add_mod(pa[i * m + j], ff.times(ap[t * m + j], p), p);
          }
      }
      paq.assign(r * r, 0);
      for (std::size_t i = 0; i < r; ++i)
        for (std::size_t j = 0; j < m; ++j) {
          const u64 x = pa[i * m + j];
          if (x == 0) continue;
          const md::fixed_factor fx(x, p);
          for (std::size_t c = 0; c < r; ++c)
            paq[i * r + c] = detail::add_mod(paq[i * r + c], fx.times(detail::reduce_signed(qmat[k][j * r + c], p), p), p);
        }
      res[1 + n_b * r + k] = md::det_and_adjugate_solve(paq, r, 0, p);
    }
    crt.add(res, p);
    have += std::log2(static_cast<double>(p));
  }
  ticker.finish();
  const big D = crt.symmetric(0);
  if (D == 0) return std::nullopt;  // cannot happen: B is non-singular mod a prime
  big Gc = boost::multiprecision::abs(D);
  for (std::size_t k = 0; compress && k < n_q; ++k)
    Gc = md::lehmer_gcd(Gc, crt.symmetric(1 + n_b * r + k));
  big g = 0;
  for (std::size_t i = 1; i < 1 + n_b * r; ++i) g = md::lehmer_gcd(g, crt.symmetric(i));

  // 3. Primes below 2^16: valuations from local Smith forms.
  std::vector<std::vector<int>> val;  // per small prime dividing G', valuations of d_1..d_r
  std::vector<u64> val_prime;
  big c = Gc;
  {
    const auto& primes = md::small_primes();
    for (std::size_t i = 0; i < primes.size();) {
      // Three primes at a time: one pass over c for their product (< 2^48).
      std::size_t e = std::min(primes.size(), i + 3);
      u64 prod = 1;
      for (std::size_t k = i; k < e; ++k) prod *= primes[k];
      const u64 rem = static_cast<u64>(c % prod);
      for (std::size_t k = i; k < e; ++k) {
        const u64 q = primes[k];
        if (rem % q != 0) continue;
        int ev = 0;
        while (c % q == 0) c /= q, ++ev;
        // Z/q^(ev+1) must fit the word arithmetic.
        u64 qk = 1;
        for (int t = 0; t <= ev; ++t) {
          if (qk > (mod_p_modulus_limit - 1) / q) return std::nullopt;
          qk *= q;
        }
        auto v = md::local_valuations(s, q, ev + 1, qk, r, control);
        if (!v) return std::nullopt;
        int sum = 0;
        for (int x : *v) sum += x;
        // v_q(G) = sum <= v_q(G') = ev, with equality when G = |D| = G'.
        if (sum > ev || (exact_product && sum != ev)) return std::nullopt;
        val.push_back(std::move(*v));
        val_prime.push_back(q);
      }
      i = e;
    }
  }

  // 4. The cofactor: all of it in d_r when the adjugate proof holds, and only when G = |D|
  //    (otherwise the c-part of G is not known exactly).
  if (c != 1) {
    if (!exact_product) return std::nullopt;
    if (md::lehmer_gcd(g, c) != 1) return std::nullopt;
  }
  out.rank = r;
  out.factors.assign(r, Int(1));
  for (std::size_t t = 0; t < val.size(); ++t)
    for (std::size_t i = 0; i < r; ++i)
      for (int k = 0; k < val[t][i]; ++k) out.factors[i] *= Int(static_cast<std::int64_t>(val_prime[t]));
  if (c != 1) out.factors[r - 1] *= Int(c);
  return out;
}

}  // namespace lacuna

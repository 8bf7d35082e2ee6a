// lacuna/algorithm/lattice_smith.hpp — the invariant factors of an integer matrix of full rank
// min(rows, cols) (typically tall: many more rows than columns) from three of its maximal
// minors and one local Hermite basis per prime that can divide them; nullopt when a proof
// does not go through.
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
//  1. Full rank. The vectors are inserted, in three orders (as given, reversed, and a fixed
//     pseudo-random shuffle), into a row echelon basis modulo a prime p near 2^62 until n of
//     them are independent mod p: the n x n minor M_t = det A[I_t, :] of those vectors is
//     non-zero mod p, so non-zero, and the rank over Q is n. If fewer than n are independent
//     the route declines (the rank may still be n, but it is not proved here).
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
//     Before that, n of the vectors independent mod q (among 4n tried) prove v_q(G) = 0
//     (an n x n minor prime to q): no local basis is needed for such a q.
//  4. d_i = product over the q of q^v_q(d_i); primes not among the q divide no d_i.
//
// Nothing probabilistic reaches the result: the shuffle (fixed seed) and the choice of primes
// only decide whether the proofs succeed. Cost: step 1 about n^2 word operations per vector
// inserted (usually only the first few times n), step 2 about (bits of Hadamard's bound)/61
// determinants of n x n matrices, step 3 at most m n^2 / 2 word operations per prime q.
#pragma once

#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <algorithm>
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

/// The first n vectors, in the given order, that are independent mod the prime p; fewer
/// when the vectors have rank < n mod p. Row echelon basis with normalized pivots.
template <class Int>
std::vector<std::size_t> independent_mod_p(const vectors<Int>& V, const std::vector<std::size_t>& order, u64 p,
                                           const run_control* control) {
  const std::size_t n = V.n;
  std::vector<u64> basis;  // rows of length n, each normalized to 1 at its pivot column
  std::vector<std::size_t> cols, chosen;
  std::vector<u64> r;
  std::size_t seen = 0, dependent = 0;
  for (const std::size_t i : order) {
    if (chosen.size() == n) break;
    if (dependent > order.size() - n) break;  // n independent ones can no longer be found
    if (control && (++seen & 255U) == 0) control->check();
    V.dense_residues(i, p, r);
    for (std::size_t k = 0; k < cols.size(); ++k) {
      const u64 f = r[cols[k]];
      if (f == 0) continue;
      const modular::fixed_factor ff(f, p);
      const u64* s = &basis[k * n];
      for (std::size_t j = 0; j < n; ++j)
        if (s[j] != 0) r[j] = modular::sub(r[j], ff.times(s[j], p), p);
    }
    std::size_t c = 0;
    while (c < n && r[c] == 0) ++c;
    if (c == n) {
      ++dependent;
      continue;
    }
    const modular::fixed_factor inv(detail::inv_mod(r[c], p), p);
    for (std::size_t j = 0; j < n; ++j) r[j] = inv.times(r[j], p);
    basis.insert(basis.end(), r.begin(), r.end());
    cols.push_back(c);
    chosen.push_back(i);
  }
  return chosen;
}

/// The n x n basis matrix H (row-major, entries mod Q) of the image of the lattice spanned
/// by all vectors in (Z/Q)^n, Q = q^k, upper triangular with a pivot of least q-valuation in
/// each column; nullopt when some column has no pivot (then some v_q(d_i) >= k).
template <class Int>
std::optional<std::vector<u64>> local_hermite_basis(const vectors<Int>& V, u64 q, u64 Q, const run_control* control) {
  const std::size_t n = V.n;
  std::vector<u64> H(n * n, 0);
  std::vector<char> has(n, 0);
  std::vector<int> val(n, 0);
  std::vector<u64> qpow(n, 1);                                     // q^val[c]
  std::vector<modular::fixed_factor> uinv(n, modular::fixed_factor(0, Q));  // (pivot / q^val)^-1 mod Q
  auto valuation = [q](u64 x) {
    int v = 0;
    while (x % q == 0) x /= q, ++v;
    return v;
  };
  auto set_pivot = [&](std::size_t c) {
    const u64 x = H[c * n + c];
    val[c] = valuation(x);
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
  }
  for (std::size_t c = 0; c < n; ++c)
    if (!has[c]) return std::nullopt;
  return H;
}

/// H as a source of detail::modular::local_valuations (entries already reduced mod Q).
struct square_source {
  std::size_t n = 0, m = 0;
  const std::vector<u64>* H = nullptr;
  u64 residue(std::size_t i, std::size_t j, u64) const { return (*H)[i * m + j]; }
};

}  // namespace detail::lattice_smith_impl

/// The rank and invariant factors of the integer matrix A when its rank is min(rows, cols)
/// and every prime dividing its invariant factors is below 2^16, by the maximal-minor and
/// local Hermite proofs of the header comment; nullopt when a proof does not go through (rank
/// not proved full, a prime factor that cannot be placed, a valuation beyond word-size
/// prime powers). A returned value is always exact; on nullopt the caller uses another route.
/// Stop requests through `control`. Meant for tall (or wide) matrices: on a square one it
/// costs like modular_smith_invariants and declines more often. Declines at once when
/// m n^2 / 2 (m vectors of length n, n = min(rows, cols)) passes 2e9 word operations.
template <class Int>
  requires std::same_as<Int, integer>
std::optional<smith_invariants<Int>> lattice_smith_invariants(const sparse_matrix<Int>& A,
                                                              const run_control* control = nullptr) {
  namespace md = detail::modular;
  namespace dl = detail::lattice_smith_impl;
  using big = md::big_of<Int>;
  using md::u64;
  smith_invariants<Int> out;
  if (A.rows == 0 || A.cols == 0) return out;
  const dl::vectors<Int> V = dl::as_vectors(A);
  const std::size_t n = V.n, m = V.v.size();
  if (0.5 * static_cast<double>(m) * static_cast<double>(n) * static_cast<double>(n) > dl::work_limit) return std::nullopt;

  // 1. Three sets of n vectors independent mod p (full rank proved by the first).
  u64 p = md::prime_below(mod_p_modulus_limit);
  std::vector<std::vector<std::size_t>> sets;
  {
    std::vector<std::size_t> order(m);
    for (std::size_t i = 0; i < m; ++i) order[i] = i;
    sets.push_back(dl::independent_mod_p(V, order, p, control));
    if (sets[0].size() < n) return std::nullopt;
    std::reverse(order.begin(), order.end());
    sets.push_back(dl::independent_mod_p(V, order, p, control));
    std::mt19937_64 rng(0x1a77'1ce5'2026ULL);
    std::shuffle(order.begin(), order.end(), rng);
    sets.push_back(dl::independent_mod_p(V, order, p, control));
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
  std::vector<std::pair<u64, int>> primes;
  for (const u64 q : md::small_primes()) {
    if (G == 1) break;
    if (static_cast<u64>(G % q) != 0) continue;
    int e = 0;
    while (static_cast<u64>(G % q) == 0) G /= q, ++e;
    primes.emplace_back(q, e);
  }
  if (G != 1) return std::nullopt;  // a prime factor above 2^16 that cannot be placed

  // 3. Local Smith forms from local Hermite bases.
  out.rank = n;
  out.factors.assign(n, Int(1));
  std::vector<std::size_t> probe(sets[2]);  // n vectors independent mod p, then a few more
  for (std::size_t i = 0; i < m && probe.size() < 4 * n; ++i) probe.push_back((i * 2654435761U) % m);
  for (const auto& [q, e] : primes) {
    // A q of G' that divides no d_i (a common factor of the three minors only): n vectors
    // independent mod q give an n x n minor prime to q, so v_q(G) = 0. Tried on 4n vectors
    // only (cheap); when it fails, the local basis below decides.
    if (dl::independent_mod_p(V, probe, q, control).size() == n) continue;
    int k = 0;
    u64 Q = 1;
    while (k < e + 1 && Q <= (mod_p_modulus_limit - 1) / q) Q *= q, ++k;
    const auto H = dl::local_hermite_basis(V, q, Q, control);
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

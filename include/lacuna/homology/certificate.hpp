// lacuna/homology/certificate.hpp — certificates of homology groups, and their checker.
//
// A certificate states the groups H_k(X; R) of a cell complex X (R the integers or a field)
// with generators, and carries witnesses that make the statement checkable from the complex's
// own boundaries alone, with exact arithmetic and one elimination modulo a prime per boundary
// map. This header holds the certificate and check_certificate; it includes nothing of the
// engine (homology.hpp): the witnesses are produced by homology/certify.hpp, and what they
// prove, with the proofs, is in docs/certificates.md. In short, for every degree k, with
// generators z_1..z_r (free) and z_{r+1}..z_{r+m} (torsion, orders d_1 | ... | d_m):
//   (a) every z_j is a cycle: ∂z_j = 0;
//   (b) every torsion generator has a bounding chain w_i with ∂w_i = d_i·z_{r+i};
//   (c) every generator has a cochain φ_j: free ones integral cocycles (δφ_j = 0), torsion
//       ones cocycles modulo d_i (δφ ≡ 0 mod d_i), and the pairing φ_j(z_l) is the identity
//       matrix (torsion rows modulo their d_i). Then ι: Z^r ⊕ ⊕ Z/d_i → H_k, standard basis to
//       the generators, is well defined by (a), (b), and the φ_j induce Φ: H_k → Z^r ⊕ ⊕ Z/d_i
//       with Φ∘ι = identity: ι is injective and its image a direct summand, H_k = im ι ⊕ ker Φ;
//   (d) rank witnesses: for each boundary map ∂_k a prime p and a sequence of pivot positions
//       (rows I, columns J) along which Gaussian elimination of the minor ∂_k[I, J] modulo p
//       meets no zero pivot, so det ∂_k[I, J] ≢ 0 mod p; so rank ∂_k ≥ |J| (over Q, and over F_p). Then
//       n_k − |J_k| − |J_{k+1}| = r_k bounds the free rank (the dimension over a field) of H_k
//       by r_k, so ker Φ has rank 0.
// Over a field, ker Φ = 0 and the generators are a basis of H_k. Over the integers, (a)-(d)
// give H_k = Z^r ⊕ ⊕ Z/d_i ⊕ K with K a finite group (the claimed summands, each generator of
// exactly its order, are a direct summand), and
//   (e) torsion witnesses: minors of ∂_{k+1} of size ρ_{k+1} (which (d) forces to be
//       rank ∂_{k+1} exactly), whose determinants the checker computes exactly — the given
//       pivots eliminated over Z, each ±1 in its turn, then the block left by Bareiss
//       elimination — and whose gcd must be P = ∏ d_i. The torsion of H_k has order
//       Δ = d_1⋯d_ρ(∂_{k+1}), the gcd of all ρ×ρ minors, so Δ | P, while P·|K| = Δ: K = 0.
// So a passing check over Z proves H_k ≅ Z^r ⊕ ⊕ Z/d_i exactly, with no torsion left out
// (docs/certificates.md, "What a passing check proves").
//
// The checker also verifies ∂∂ = 0 on the complex (over R), so nothing is assumed of it.
//
// Reduced homology, the homology of a pair (X, A) and cohomology (certificate_kind): the same
// witnesses of a derived chain complex D that the checker builds from X — the augmented complex
// (one cell in degree −1, ε the sum of the vertices), the quotient C(X)/C(A) (after checking
// that A's marks are closed under faces), or the dual complex (δ_k = ∂_{k+1}ᵀ: cocycles as
// generators, chains as the dual witnesses, bounding cochains δw = d·φ, rank witnesses of the
// coboundaries, minors of δ_{k−1} for the torsion of H^k) — and (a)-(e) checked on D prove the
// same of H(D) = H̃(X), H(X, A) or H^*(X) (docs/certificates.md, "Reduced, relative and cohomology").
//
// Cost of the check: one pass over the faces of the faces of every cell (∂∂ = 0); one pass
// over the boundaries of the cells the chains meet (cycles and bounding chains); one pass
// over the (k+1)-cells for the cocycles, each face looking up the cochains that are non-zero
// on it (the sparse product δΦ); the pairing as the sparse product Φᵀ Z (only the cells where
// a cochain and a generator meet: no dense matrix of generators by generators); one sparse
// column elimination mod p per boundary map; over Z, one sparse elimination over the integers
// per boundary map along the torsion witness's pivots, and a dense determinant per block.
#pragma once

#include <lacuna/chain/chain.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <ranges>
#include <type_traits>
#include <span>
#include <sstream>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// One group of a certificate: H_k = R^rank ⊕ R/torsion[0] ⊕ ... with its generators and
/// witnesses. generators: rank free ones, then one per torsion factor; cocycles: one per
/// generator, in the same order (values on k-cells; for a torsion generator of order d, the
/// values matter modulo d); bounding_chains: one (k+1)-chain per torsion generator.
template <class R>
struct certified_group {
  /// The degree k.
  int dimension = 0;
  /// The number of free generators.
  std::size_t rank = 0;
  /// The torsion factors, d_1 | d_2 | ..., non-units.
  std::vector<R> torsion;
  /// Cycles: rank free generators, then one per torsion factor.
  std::vector<chain<R>> generators;
  /// One cocycle per generator, in the same order.
  std::vector<chain<R>> cocycles;
  /// One (k+1)-chain per torsion generator g, whose boundary is d g.
  std::vector<chain<R>> bounding_chains;
};

/// A lower bound of the rank of one boundary map ∂_k: the square submatrix of ∂_k on the
/// (k−1)-cells `rows[i]` and the k-cells `columns[i]` is non-singular modulo `prime`.
struct rank_witness {
  /// The prime modulo which the submatrix is non-singular.
  std::uint64_t prime = 0;
  ///@{
  /// The (k-1)-cells and the k-cells of the submatrix, in matching order.
  std::vector<std::size_t> rows, columns;
  ///@}
};

/// A square block of a minor (torsion_witness): (k)-cells `rows` and (k+1)-cells `columns` of
/// ∂_{k+1}, as many of each, in no particular order.
struct minor_block {
  ///@{
  /// The rows (k-cells) and the columns ((k+1)-cells) of the block.
  std::vector<std::size_t> rows, columns;
  ///@}
};

/// A proof that the torsion of H_k is no larger than claimed (over the integers): minors of
/// ∂_{k+1} of size ρ = rank ∂_{k+1} whose determinants have as gcd the product of the claimed
/// torsion factors. Minor i has the rows pivot_rows ∪ minors[i].rows and the columns
/// pivot_columns ∪ minors[i].columns; its determinant is found by eliminating the pivots
/// (pivot_rows[j], pivot_columns[j]) in this order, each ±1 after the ones before it, then the
/// determinant of what is left on the block (docs/certificates.md, "Determinant witnesses").
struct torsion_witness {
  ///@{
  /// The shared pivots of every minor (k-cells, (k+1)-cells), in elimination order.
  std::vector<std::size_t> pivot_rows, pivot_columns;
  ///@}
  /// The blocks that complete the pivots to minors of size ρ, one per minor.
  std::vector<minor_block> minors;
};

/// The kind of result a certificate states (homology_certificate::kind). Each is the
/// homology of a chain complex built from X, on which the witnesses are checked as for
/// absolute homology (docs/certificates.md, "Reduced, relative and cohomology"):
enum class certificate_kind {
  absolute,    ///< H_k(X): the cellular chain complex of X
  reduced,     ///< H̃_k(X): the augmented complex, one cell in degree −1 and ε = the sum of the vertices
  relative,    ///< H_k(X, A): the quotient C(X)/C(A), A a subcomplex given by marks
  cohomology,  ///< H^k(X): the cochain complex, δ_k = ∂_{k+1}ᵀ
};

/// The name of a kind, as the JSON layout writes it ("absolute", "reduced", ...).
inline const char* certificate_kind_name(certificate_kind k) {
  switch (k) {
    case certificate_kind::reduced: return "reduced";
    case certificate_kind::relative: return "relative";
    case certificate_kind::cohomology: return "cohomology";
    default: return "absolute";
  }
}

/// A certificate of the homology of a complex over R (lacuna::integer or a field):
/// groups[k] for k = 0..top, ranks[k] for ∂_k, k = 0..top (ranks[0] empty: ∂_0 = 0), and over
/// the integers torsion[k] for H_k (the minors of ∂_{k+1}), k = 0..top.
///
/// The other kinds keep this layout with indices of X's cells (docs/formats.md):
///   reduced    groups[k] = H̃_k; ranks[0] witnesses ε (rows: the augmentation cell 0;
///              columns: vertices), ranks[k] ∂_k; torsion[k] minors of ∂_{k+1};
///   relative   as absolute, on the cells of X that are not in A (chains' terms on cells of A
///              are zero in the quotient); rows and columns must not be cells of A;
///   cohomology groups[k] = H^k: generators are k-cochains (cocycles); `cocycles` holds the
///              dual witnesses, k-chains (cycles, modulo d for torsion) pairing to the
///              identity; `bounding_chains` (k−1)-cochains w with δw = d·φ; ranks[k]
///              witnesses δ_k: C^k → C^{k+1} (rows: (k+1)-cells, columns: k-cells; ranks[top]
///              unused); torsion[k] minors of δ_{k−1} (rows: k-cells; torsion[0] unused).
template <class R>
struct homology_certificate {
  /// The kind of result stated.
  certificate_kind kind = certificate_kind::absolute;
  /// groups[k] for k = 0..top.
  std::vector<certified_group<R>> groups;
  /// ranks[k]: a witness of a lower bound of the rank of the boundary map ∂_k.
  std::vector<rank_witness> ranks;
  /// torsion[k]: over the integers, the minors of ∂_{k+1} that bound the order of the torsion
  /// of H_k by the product of the claimed factors (empty for the top degree, whose ∂_{k+1} is
  /// zero). An empty vector: none given (a certificate of an older lacuna); over the integers
  /// the check then fails with certificate_report::torsion_unproved set. Unused over a field.
  std::vector<torsion_witness> torsion;
};

/// The outcome of check_certificate. On failure, `dimension` is the degree k of the group
/// found wrong (or of the boundary map ∂_k, for a rank witness), `generator` the index of
/// the generator concerned (torsion factor i is generator rank + i; -1: none), and
/// first_failure says what failed, in words.
struct certificate_report {
  /// True if every check passed.
  bool ok = true;
  /// What failed, in words; empty when ok.
  std::string first_failure;
  /// The degree k concerned, -1 if none.
  int dimension = -1;
  /// The index of the generator concerned, -1 if none.
  std::ptrdiff_t generator = -1;
  std::size_t checks = 0;  ///< facts verified (a test can see that something was checked)
  /// True when the only failure is that a certificate over the integers has no torsion
  /// witnesses (an older layout): everything else passed, so the groups are proved up to a
  /// finite summand K, but K = 0 is not.
  bool torsion_unproved = false;
  /// ok.
  explicit operator bool() const noexcept { return ok; }
};

namespace detail::cert {

template <class T>
std::string text(const T& x) {
  if constexpr (requires { { x.to_string() } -> std::convertible_to<std::string>; }) {
    return x.to_string();
  } else {
    std::ostringstream os;
    os << x;
    return os.str();
  }
}

template <class R>
bool unit(const R& x) {
  if constexpr (field<R>)
    return !(x == zero<R>());
  else
    return !(x == zero<R>()) && lacuna::is_unit(x);
}

/// x ≡ y modulo d (d = 0: x == y).
template <class R>
bool congruent(const R& x, const R& y, const R& d) {
  if (d == zero<R>()) return x == y;
  return div_rem(x - y, d).remainder == zero<R>();
}

/// Trial division: enough for the primes below 2^32 that the rank witnesses use.
inline bool small_prime(std::uint64_t p) {
  if (p < 2 || p >= (std::uint64_t{1} << 32)) return false;
  for (std::uint64_t q = 2; q * q <= p; ++q)
    if (p % q == 0) return false;
  return true;
}

/// One incidence of the complex as (face, value in R), exact whatever its size.
template <class R, class V>
std::pair<std::size_t, R> term_of(const V& v) {
  if constexpr (small_incidence_like<std::remove_cvref_t<V>>) {
    const incidence f = as_incidence(v);
    return {f.face, from_integer<R>(f.coefficient)};
  } else {
    return {incidence_face(v), coefficient_in<R>(coefficient_as_integer(v), one<R>())};
  }
}

/// An incidence modulo p < 2^32, as a residue in [0, p).
template <class V>
std::pair<std::size_t, std::uint64_t> residue_of(const V& v, std::uint64_t p) {
  if constexpr (small_incidence_like<std::remove_cvref_t<V>>) {
    const incidence f = as_incidence(v);
    const std::int64_t m = f.coefficient % static_cast<std::int64_t>(p);
    return {f.face, static_cast<std::uint64_t>(m < 0 ? m + static_cast<std::int64_t>(p) : m)};
  } else {
    integer m = div_rem(coefficient_as_integer(v), integer(static_cast<std::int64_t>(p))).remainder;
    if (m.sign() < 0) m += integer(static_cast<std::int64_t>(p));
    return {incidence_face(v), static_cast<std::uint64_t>(m.small_value())};
  }
}

/// The boundary of a chain of k-cells, summed from lacuna::boundary of the complex.
template <class R, cell_complex C>
std::unordered_map<std::size_t, R> boundary_of(const C& c, const chain<R>& z) {
  std::unordered_map<std::size_t, R> out;
  const int k = z.dimension;
  if (k == 0) return out;
  for (const auto& t : z.terms)
    for (auto&& v : lacuna::boundary(c, k, t.cell)) {
      const auto [face, e] = term_of<R>(v);
      auto [it, fresh] = out.try_emplace(face, zero<R>());
      it->second += e * t.coefficient;
    }
  return out;
}

/// The minor of ∂_k on these rows and columns is non-zero modulo p, shown by Gaussian
/// elimination mod p with the pivots in the order given: pivot i at (rows[i], columns[i]).
/// Column i is reduced by the earlier pivot columns, in increasing pivot order (a min-heap of
/// the pivot indices it meets: left-looking elimination), and must then be non-zero at
/// rows[i]; then every leading principal minor, and so the whole minor, is non-zero (the
/// determinant is the product of the pivots). A minor whose leading minors vanish in this
/// order is refused, even if it is non-singular: the certificate names its order. Entries
/// are residues below p < 2^32, so products fit in 64 bits. Cost: that of the elimination,
/// as the reduction that chose the pivots.
template <cell_complex C>
bool minor_nonsingular(const C& c, int k, const rank_witness& w, std::string& why) {
  const std::uint64_t p = w.prime;
  const std::size_t n = w.rows.size();
  constexpr std::uint32_t none = ~std::uint32_t{0};
  std::vector<std::uint32_t> row_pos(lacuna::cell_count(c, k - 1), none);  // (k-1)-cell -> its pivot index
  for (std::size_t i = 0; i < n; ++i) row_pos[w.rows[i]] = static_cast<std::uint32_t>(i);
  auto inverse = [p](std::uint64_t a) {  // a^(p-2) mod p
    std::uint64_t r = 1, b = a % p, e = p - 2;
    for (; e; e >>= 1, b = b * b % p)
      if (e & 1) r = r * b % p;
    return r;
  };
  // Reduced pivot columns: entries at pivot indices >= their own; the first is the pivot.
  // One array, pivot i's entries [start[i], start[i+1]) (column i is pivot i: appended in order).
  std::vector<std::pair<std::uint32_t, std::uint64_t>> reduced;
  std::vector<std::size_t> start{0};
  start.reserve(n + 1);
  std::vector<std::uint64_t> pivot_inverse(n, 0);
  std::vector<std::uint64_t> acc(n, 0);
  std::vector<char> seen(n, 0);
  std::vector<std::uint32_t> touched, heap;
  auto greater = [](std::uint32_t a, std::uint32_t b) { return a > b; };
  for (std::size_t i = 0; i < n; ++i) {
    touched.clear();
    heap.clear();
    auto touch = [&](std::uint32_t t) {
      if (seen[t]) return;
      seen[t] = 1;
      touched.push_back(t);
      if (t < i) {
        heap.push_back(t);
        std::push_heap(heap.begin(), heap.end(), greater);
      }
    };
    for (auto&& v : lacuna::boundary(c, k, w.columns[i])) {
      const auto [face, m] = residue_of(v, p);
      const std::uint32_t q = row_pos[face];
      if (q == none) continue;
      touch(q);
      acc[q] = (acc[q] + m) % p;
    }
    while (!heap.empty()) {
      std::pop_heap(heap.begin(), heap.end(), greater);
      const std::uint32_t t = heap.back();
      heap.pop_back();
      if (acc[t] == 0) continue;
      const std::uint64_t f = acc[t] * pivot_inverse[t] % p;
      for (std::size_t e = start[t]; e < start[t + 1]; ++e) {
        const auto [u, val] = reduced[e];
        touch(u);
        acc[u] = (acc[u] + p - f * val % p) % p;
      }
    }
    const bool ok = acc[i] != 0;
    if (ok) {
      reduced.push_back({static_cast<std::uint32_t>(i), acc[i]});
      for (std::uint32_t u : touched)
        if (u > i && acc[u] != 0) reduced.push_back({u, acc[u]});
      start.push_back(reduced.size());
      pivot_inverse[i] = inverse(acc[i]);
    }
    for (std::uint32_t u : touched) acc[u] = 0, seen[u] = 0;
    if (!ok) {
      why = "pivot " + std::to_string(i) + " (" + std::to_string(k - 1) + "-cell " + std::to_string(w.rows[i]) + ", " +
            std::to_string(k) + "-cell " + std::to_string(w.columns[i]) + ") is zero modulo " + std::to_string(p) +
            " after elimination by the pivots before it";
      return false;
    }
  }
  return true;
}

/// The exact Schur complement of a minor of ∂_d over the integers (I = lacuna::integer):
/// the minor has the rows pivot_rows ∪ rows ((d−1)-cells) and the columns pivot_columns ∪
/// columns (d-cells). The pivots (pivot_rows[j], pivot_columns[j]) are eliminated in this
/// order by column operations (left-looking: each column is reduced by the earlier pivot
/// columns in increasing pivot order, a min-heap of the pivot indices it meets), and each
/// must be ±1 when its turn comes — a pivot that is not is refused, naming it, so every
/// multiplier is an integer and the operations are unimodular. Then the minor is
/// [[L, 0], [X, S]] with L lower triangular with ±1 on its diagonal, and
/// det(minor on pivots ∪ block) = ±det S[block]: `schur[j][i]` receives S at (rows[i],
/// columns[j]). Arithmetic: lacuna::integer, 64 bits inline and big integers past that, so an
/// overflow is never silent. Also refuses cells out of range or named twice.
/// Cost: that of the elimination (the engine's unit-pivot elimination on this map).
template <class I, cell_complex C>
bool exact_schur(const C& c, int d, const std::vector<std::size_t>& pivot_rows, const std::vector<std::size_t>& pivot_columns,
                 const std::vector<std::size_t>& rows, const std::vector<std::size_t>& columns,
                 std::vector<std::vector<I>>& schur, std::string& why) {
  const std::size_t u = pivot_rows.size(), m = rows.size();
  const std::size_t nrow = lacuna::cell_count(c, d - 1), ncol = lacuna::cell_count(c, d);
  if (pivot_columns.size() != u) {
    why = std::to_string(u) + " pivot rows for " + std::to_string(pivot_columns.size()) + " pivot columns";
    return false;
  }
  constexpr std::uint32_t none = ~std::uint32_t{0};
  std::vector<std::uint32_t> pos(nrow, none);  // (d-1)-cell -> position: pivots 0..u-1, then rows
  for (std::size_t i = 0; i < u + m; ++i) {
    const std::size_t r = i < u ? pivot_rows[i] : rows[i - u];
    if (r >= nrow || pos[r] != none) {
      why = (r >= nrow ? "row " + std::to_string(r) + " is out of range" : std::to_string(d - 1) + "-cell " + std::to_string(r) + " is named twice as a row");
      return false;
    }
    pos[r] = static_cast<std::uint32_t>(i);
  }
  {
    std::vector<char> used(ncol, 0);
    for (std::size_t j = 0; j < u + columns.size(); ++j) {
      const std::size_t x = j < u ? pivot_columns[j] : columns[j - u];
      if (x >= ncol || used[x]) {
        why = (x >= ncol ? "column " + std::to_string(x) + " is out of range" : std::to_string(d) + "-cell " + std::to_string(x) + " is named twice as a column");
        return false;
      }
      used[x] = 1;
    }
  }
  // The reduced pivot columns one after the other, pivot entry first: pivot t's entries are
  // [start[t], start[t+1]) of `reduced` (one array, not a vector per pivot: on a volume of
  // 10^8 cells the per-vector overhead was the largest part of this step's memory).
  std::vector<std::pair<std::uint32_t, I>> reduced;
  std::vector<std::size_t> start{0};
  start.reserve(u + 1);
  std::vector<I> acc(u + m, I(0));
  std::vector<char> seen(u + m, 0);
  std::vector<std::uint32_t> touched, heap;
  auto greater = [](std::uint32_t a, std::uint32_t b) { return a > b; };
  schur.assign(columns.size(), std::vector<I>(m, I(0)));
  for (std::size_t j = 0; j < u + columns.size(); ++j) {
    const std::size_t limit = j < u ? j : u;  // the pivots that reduce this column
    touched.clear();
    heap.clear();
    auto touch = [&](std::uint32_t t) {
      if (seen[t]) return;
      seen[t] = 1;
      touched.push_back(t);
      if (t < limit) {
        heap.push_back(t);
        std::push_heap(heap.begin(), heap.end(), greater);
      }
    };
    for (auto&& v : lacuna::boundary(c, d, j < u ? pivot_columns[j] : columns[j - u])) {
      auto [face, e] = term_of<I>(v);
      const std::uint32_t q = pos[face];
      if (q == none) continue;
      touch(q);
      acc[q] += e;
    }
    while (!heap.empty()) {
      std::pop_heap(heap.begin(), heap.end(), greater);
      const std::uint32_t t = heap.back();
      heap.pop_back();
      if (acc[t] == I(0)) continue;
      const I f = acc[t] * reduced[start[t]].second;  // the pivot is ±1: its own inverse
      for (std::size_t e = start[t]; e < start[t + 1]; ++e) {
        const std::uint32_t q = reduced[e].first;
        touch(q);
        acc[q] -= f * reduced[e].second;
      }
    }
    bool ok = true;
    if (j < u) {
      ok = acc[j] == I(1) || acc[j] == I(-1);
      if (ok) {  // column j is pivot j: appended in order
        reduced.push_back({static_cast<std::uint32_t>(j), acc[j]});
        for (std::uint32_t q : touched)
          if (q > j && !(acc[q] == I(0))) reduced.push_back({q, acc[q]});
        start.push_back(reduced.size());
      } else {
        why = "pivot " + std::to_string(j) + " (" + std::to_string(d - 1) + "-cell " + std::to_string(pivot_rows[j]) + ", " +
              std::to_string(d) + "-cell " + std::to_string(pivot_columns[j]) + ") is " + text(acc[j]) +
              " after elimination by the pivots before it, not ±1";
      }
    } else {
      for (std::uint32_t q : touched)
        if (q >= u) schur[j - u][q - u] = acc[q];
    }
    for (std::uint32_t q : touched) acc[q] = I(0), seen[q] = 0;
    if (!ok) return false;
  }
  return true;
}

/// The determinant of a square matrix a (a[j][i]: row i, column j) over the integers, exactly:
/// fraction-free Gaussian elimination (Bareiss 1968, "Sylvester's identity and multistep
/// integer-preserving Gaussian elimination"): every division is exact, and every entry is a
/// minor of a, so the sizes stay bounded by Hadamard's bound. The empty matrix has
/// determinant 1. Cost: n³ operations on integers of at most n times the size of the entries.
template <class I>
I bareiss_determinant(std::vector<std::vector<I>> a) {
  const std::size_t n = a.size();
  I prev(1);
  bool negate = false;
  for (std::size_t k = 0; k < n; ++k) {
    if (a[k][k] == I(0)) {
      std::size_t j = k + 1;
      while (j < n && a[j][k] == I(0)) ++j;
      if (j == n) return I(0);
      std::swap(a[k], a[j]);  // swap two columns
      negate = !negate;
    }
    for (std::size_t j = k + 1; j < n; ++j)
      for (std::size_t i = k + 1; i < n; ++i) a[j][i] = (a[j][i] * a[k][k] - a[j][k] * a[k][i]) / prev;
    prev = a[k][k];
  }
  if (n == 0) return I(1);
  return negate ? -a[n - 1][n - 1] : a[n - 1][n - 1];
}

/// The absolute value of an integer.
template <class I>
I magnitude(const I& x) {
  return x < I(0) ? -x : x;
}

}  // namespace detail::cert

namespace detail::cert {

/// How the failures of a check on a derived complex (view_of) are named in the terms of the
/// result it certifies: the group of view degree j, a view cell, the boundary map ∂'_j, and
/// the degrees reported for a group and for a map.
struct naming {
  std::function<std::string(int)> group = [](int k) { return "H_" + std::to_string(k); };
  std::function<std::string(int, std::size_t)> cell = [](int k, std::size_t i) {
    return std::to_string(k) + "-cell " + std::to_string(i);
  };
  std::function<std::string(int)> map = [](int k) { return "∂_" + std::to_string(k); };
  std::function<int(int)> degree = [](int k) { return k; };
  std::function<int(int)> map_degree = [](int k) { return k; };
  /// The words for a cycle and its boundary, and for a cocycle and its coboundary, of the view.
  std::string cycle = "a cycle", boundary = "boundary", cocycle = "a cocycle", coboundary = "coboundary";
};

/// The check of a certificate of absolute homology on c, failures named by nm.
template <euclidean_domain R, cell_complex C>
certificate_report check_absolute(const C& c, const homology_certificate<R>& cert, const naming& nm) {
  certificate_report rep;
  bool map_failure = false;  // the next failure is about a boundary map, not a group
  auto fail = [&](int k, std::ptrdiff_t g, std::string what) {
    if (rep.ok) {
      rep.first_failure = std::move(what);
      rep.dimension = k < 0 ? -1 : (map_failure ? nm.map_degree(k) : nm.degree(k));
      rep.generator = g;
    }
    rep.ok = false;
  };
  const int top = lacuna::top_dimension(c);
  if (static_cast<int>(cert.groups.size()) != top + 1 || static_cast<int>(cert.ranks.size()) != top + 1) {
    fail(-1, -1, "the certificate has " + std::to_string(cert.groups.size()) + " groups and " +
                     std::to_string(cert.ranks.size()) + " rank witnesses; the complex has dimension " +
                     std::to_string(top));
    return rep;
  }
  // (0) The complex is a chain complex over R (∂∂ = 0), so that H_k is defined and the rank
  // count of (d) holds: one pass over the faces of the faces of every cell.
  for (int k = 2; k <= top && rep.ok; ++k) {
    std::unordered_map<std::size_t, R> dd;
    for (std::size_t s = 0; s < lacuna::cell_count(c, k); ++s) {
      dd.clear();
      for (auto&& v : lacuna::boundary(c, k, s)) {
        const auto [face, e] = detail::cert::term_of<R>(v);
        for (auto&& u : lacuna::boundary(c, k - 1, face)) {
          const auto [ff, e2] = detail::cert::term_of<R>(u);
          auto [it, fresh] = dd.try_emplace(ff, zero<R>());
          it->second += e * e2;
        }
      }
      for (const auto& [ff, x] : dd)
        if (!(x == zero<R>())) {
          fail(k, -1, "the complex is not a chain complex: the boundary of the boundary of " + nm.cell(k, s) + " is not zero");
          break;
        }
      if (!rep.ok) break;
    }
    ++rep.checks;
  }
  for (int k = 0; k <= top && rep.ok; ++k) {
    const auto& g = cert.groups[static_cast<std::size_t>(k)];
    const std::string H = nm.group(k);
    const std::size_t r = g.rank, m = g.torsion.size(), N = r + m;
    const std::size_t nk = lacuna::cell_count(c, k);
    const std::size_t nk1 = k < top ? lacuna::cell_count(c, k + 1) : 0;
    if (g.dimension != k) fail(k, -1, H + ": the group is labelled dimension " + std::to_string(g.dimension));
    if (g.generators.size() != N || g.cocycles.size() != N || g.bounding_chains.size() != m) {
      fail(k, -1, H + ": " + std::to_string(g.generators.size()) + " generators, " + std::to_string(g.cocycles.size()) +
                      " cocycles and " + std::to_string(g.bounding_chains.size()) + " bounding chains for rank " +
                      std::to_string(r) + " and " + std::to_string(m) + " torsion factors");
      break;
    }
    // The torsion factors: non-units, each dividing the next (a field has none).
    for (std::size_t i = 0; i < m; ++i) {
      const std::string Ti = H + " torsion factor " + std::to_string(i) + " (order " + detail::cert::text(g.torsion[i]) + ")";
      if (g.torsion[i] == zero<R>() || detail::cert::unit(g.torsion[i]))
        fail(k, static_cast<std::ptrdiff_t>(r + i), Ti + ": an order must be neither zero nor a unit");
      else if (i + 1 < m && !(div_rem(g.torsion[i + 1], g.torsion[i]).remainder == zero<R>()))
        fail(k, static_cast<std::ptrdiff_t>(r + i), Ti + ": does not divide the next factor " + detail::cert::text(g.torsion[i + 1]));
    }
    if (!rep.ok) break;
    auto label = [&](std::size_t j) {
      return j < r ? H + " free generator " + std::to_string(j)
                   : H + " torsion factor " + std::to_string(j - r) + " (order " + detail::cert::text(g.torsion[j - r]) + ")";
    };
    auto in_range = [&](const chain<R>& ch, int dim, std::size_t count, std::size_t j, const char* what) {
      if (ch.dimension != dim) {
        fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": its " + what + " has dimension " + std::to_string(ch.dimension));
        return false;
      }
      for (std::size_t t = 0; t < ch.terms.size(); ++t) {
        if (ch.terms[t].cell >= count) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": its " + what + " names cell " + std::to_string(ch.terms[t].cell) +
                                                      ", out of range");
          return false;
        }
        if (t > 0 && ch.terms[t].cell <= ch.terms[t - 1].cell) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the terms of its " + what + " are not sorted and distinct");
          return false;
        }
      }
      return true;
    };
    // (a) cycles, (b) bounding chains.
    for (std::size_t j = 0; j < N && rep.ok; ++j) {
      const auto& z = g.generators[j];
      if (!in_range(z, k, nk, j, "generator")) break;
      if (z.is_zero()) {
        fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator is the zero chain");
        break;
      }
      for (const auto& [cell, v] : detail::cert::boundary_of(c, z))
        if (!(v == zero<R>())) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator is not " + nm.cycle + " (its " + nm.boundary + " is " +
                                                      detail::cert::text(v) + " on " + nm.cell(k - 1, cell) + ")");
          break;
        }
      ++rep.checks;
      if (j < r || !rep.ok) continue;
      const auto& w = g.bounding_chains[j - r];
      if (!in_range(w, k + 1, nk1, j, "bounding chain")) break;
      auto dw = detail::cert::boundary_of(c, w);
      const R& d = g.torsion[j - r];
      for (const auto& t : z.terms) {
        auto [it, fresh] = dw.try_emplace(t.cell, zero<R>());
        it->second -= d * t.coefficient;
      }
      for (const auto& [cell, v] : dw)
        if (!(v == zero<R>())) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the boundary of its bounding chain is not " +
                                                      detail::cert::text(d) + " times the generator (they differ on " +
                                                      nm.cell(k, cell) + ")");
          break;
        }
      ++rep.checks;
    }
    if (!rep.ok) break;
    // (c) cocycles: rows of Φ by cell, then δΦ over the (k+1)-cells, then the pairing Φᵀ Z.
    // Φ by rows (cells), in compressed form: the cochain values on cell x are
    // phi_values[phi_start[x] .. phi_start[x + 1]).
    std::vector<std::size_t> phi_start(nk + 1, 0);
    std::vector<std::pair<std::uint32_t, R>> phi_values;
    for (std::size_t j = 0; j < N && rep.ok; ++j) {
      if (!in_range(g.cocycles[j], k, nk, j, "cocycle")) break;
      for (const auto& t : g.cocycles[j].terms) ++phi_start[t.cell + 1];
    }
    if (!rep.ok) break;
    for (std::size_t x = 0; x < nk; ++x) phi_start[x + 1] += phi_start[x];
    phi_values.resize(phi_start[nk], {0, zero<R>()});
    {
      std::vector<std::size_t> fill(phi_start.begin(), phi_start.end() - 1);
      for (std::size_t j = 0; j < N; ++j)
        for (const auto& t : g.cocycles[j].terms) phi_values[fill[t.cell]++] = {static_cast<std::uint32_t>(j), t.coefficient};
    }
    auto modulus = [&](std::size_t j) { return j < r ? zero<R>() : g.torsion[j - r]; };
    if (k < top && !phi_values.empty()) {
      std::unordered_map<std::uint32_t, R> acc;
      for (std::size_t s = 0; s < nk1 && rep.ok; ++s) {
        acc.clear();
        for (auto&& v : lacuna::boundary(c, k + 1, s)) {
          const auto [face, e] = detail::cert::term_of<R>(v);
          if (phi_start[face] == phi_start[face + 1]) continue;
          for (std::size_t q = phi_start[face]; q < phi_start[face + 1]; ++q) {
            const auto& [j, val] = phi_values[q];
            auto [a, fresh] = acc.try_emplace(j, zero<R>());
            a->second += e * val;
          }
        }
        for (const auto& [j, v] : acc)
          if (!detail::cert::congruent(v, zero<R>(), modulus(j))) {
            fail(k, j, label(j) + ": its dual witness is not " + nm.cocycle +
                           (j < r ? std::string() : " modulo " + detail::cert::text(modulus(j))) + " (the " + nm.coboundary + " is " +
                           detail::cert::text(v) + " on " + nm.cell(k + 1, s) + ")");
            break;
          }
      }
      rep.checks += N;
    }
    if (!rep.ok) break;
    for (std::size_t l = 0; l < N && rep.ok; ++l) {  // column l of the pairing: φ_j(z_l) for all j
      std::unordered_map<std::uint32_t, R> col;
      for (const auto& t : g.generators[l].terms) {
        for (std::size_t q = phi_start[t.cell]; q < phi_start[t.cell + 1]; ++q) {
          const auto& [j, val] = phi_values[q];
          auto [a, fresh] = col.try_emplace(j, zero<R>());
          a->second += val * t.coefficient;
        }
      }
      auto diag = col.find(static_cast<std::uint32_t>(l));
      const R dv = diag == col.end() ? zero<R>() : diag->second;
      if (!detail::cert::congruent(dv, one<R>(), modulus(l))) {
        fail(k, static_cast<std::ptrdiff_t>(l),
             label(l) + ": its cocycle takes the value " + detail::cert::text(dv) + " on it, not 1" +
                 (l < r ? std::string() : " modulo " + detail::cert::text(modulus(l))) +
                 (l < r ? " (the generator is not shown to be free and independent)"
                        : " (the generator is not shown to have exactly this order)"));
        break;
      }
      for (const auto& [j, v] : col)
        if (j != l && !detail::cert::congruent(v, zero<R>(), modulus(j))) {
          fail(k, static_cast<std::ptrdiff_t>(j),
               label(j) + ": its cocycle takes the value " + detail::cert::text(v) + " on generator " + std::to_string(l) +
                   ", not 0" + (j < r ? std::string() : " modulo " + detail::cert::text(modulus(j))));
          break;
        }
      ++rep.checks;
    }
  }
  if (!rep.ok) return rep;
  // (d) rank witnesses, then the free ranks (dimensions) they bound.
  std::vector<std::size_t> rho(static_cast<std::size_t>(top) + 2, 0);
  map_failure = true;
  for (int k = 1; k <= top && rep.ok; ++k) {
    const auto& w = cert.ranks[static_cast<std::size_t>(k)];
    const std::string D = "the rank witness of " + nm.map(k);
    if (w.rows.size() != w.columns.size()) {
      fail(k, -1, D + ": " + std::to_string(w.rows.size()) + " rows for " + std::to_string(w.columns.size()) + " columns");
      break;
    }
    if (!w.rows.empty()) {
      if (!detail::cert::small_prime(w.prime)) {
        fail(k, -1, D + ": " + std::to_string(w.prime) + " is not a prime below 2^32");
        break;
      }
      if constexpr (characteristic_v<R> != 0)
        if (w.prime != characteristic_v<R>) {
          fail(k, -1, D + ": works modulo " + std::to_string(w.prime) + ", not the characteristic " +
                          std::to_string(characteristic_v<R>));
          break;
        }
    }
    auto distinct = [](std::vector<std::size_t> v, std::size_t bound) {
      std::sort(v.begin(), v.end());
      return std::adjacent_find(v.begin(), v.end()) == v.end() && (v.empty() || v.back() < bound);
    };
    if (!distinct(w.rows, lacuna::cell_count(c, k - 1)) || !distinct(w.columns, lacuna::cell_count(c, k))) {
      fail(k, -1, D + ": rows or columns repeated or out of range");
      break;
    }
    std::string why;
    if (!detail::cert::minor_nonsingular(c, k, w, why)) {
      fail(k, -1, D + ": " + why);
      break;
    }
    rho[static_cast<std::size_t>(k)] = w.rows.size();
    ++rep.checks;
  }
  map_failure = false;
  for (int k = 0; k <= top && rep.ok; ++k) {
    const std::size_t nk = lacuna::cell_count(c, k);
    const std::size_t a = rho[static_cast<std::size_t>(k)], b = rho[static_cast<std::size_t>(k) + 1];
    const std::size_t r = cert.groups[static_cast<std::size_t>(k)].rank;
    if (a + b > nk || nk - a - b != r) {
      fail(k, -1, nm.group(k) + ": the rank witnesses bound the free rank by " +
                      (a + b > nk ? std::string("(inconsistent: more pivots than cells)") : std::to_string(nk - a - b)) +
                      ", the certificate claims " + std::to_string(r));
      break;
    }
    ++rep.checks;
  }
  // (e) Over the integers: no torsion is left out. By (d) and the free ranks, ρ_{k+1} (the
  // number of pivots of the rank witness of ∂_{k+1}) is rank ∂_{k+1} exactly: ρ_j ≤ rank ∂_j
  // for every j, and r_k ≤ rank H_k = n_k − rank ∂_k − rank ∂_{k+1} (H_k contains Z^r) while
  // r_k = n_k − ρ_k − ρ_{k+1}. The torsion of H_k = coker ∂_{k+1} / free part has order
  // Δ = d_1⋯d_ρ(∂_{k+1}), the gcd of all ρ×ρ minors of ∂_{k+1} (the determinantal divisors of
  // the Smith form). Each minor given is ρ×ρ, so Δ divides its determinant and their gcd g;
  // the claimed summands are a direct summand of the torsion, so P = ∏ d_i divides Δ. Then
  // g = P forces Δ = P: the finite K is trivial.
  if constexpr (!field<R>) {
    bool needed = false;
    for (int k = 0; k < top; ++k) needed = needed || rho[static_cast<std::size_t>(k) + 1] > 0;
    if (rep.ok && needed && cert.torsion.empty()) {
      fail(-1, -1, "the certificate has no torsion witnesses, so it proves each H_k only up to a finite summand that "
                   "may hold torsion left out: that summand is not proved to be zero");
      rep.torsion_unproved = true;
      return rep;
    }
    if (rep.ok && needed && static_cast<int>(cert.torsion.size()) != top + 1) {
      fail(-1, -1, "the certificate has " + std::to_string(cert.torsion.size()) + " torsion witnesses for " +
                       std::to_string(top + 1) + " groups");
      return rep;
    }
    for (int k = 0; k < top && rep.ok; ++k) {
      const std::size_t rank = rho[static_cast<std::size_t>(k) + 1];
      const auto& g = cert.groups[static_cast<std::size_t>(k)];
      const std::string H = nm.group(k) + ": ";
      R P = one<R>();
      for (const auto& d : g.torsion) P = P * d;
      if constexpr (!std::same_as<R, integer>) {
        if (rank > 0) fail(k, -1, H + "the torsion witnesses are checked over the integers only");
        continue;
      } else {
        P = detail::cert::magnitude(P);
        if (rank == 0) {  // ∂_{k+1} = 0: no torsion (the checks above already refuse a claimed factor)
          if (!(P == one<R>())) fail(k, -1, H + nm.map(k + 1) + " is zero, so " + nm.group(k) + " has no torsion");
          continue;
        }
        const auto& w = cert.torsion[static_cast<std::size_t>(k)];
        const std::string D = H + "the torsion witness (minors of " + nm.map(k + 1) + ")";
        const std::size_t u = w.pivot_rows.size();
        if (w.minors.empty() || u > rank) {
          fail(k, -1, D + (w.minors.empty() ? ": no minor is given" : ": more pivots than the rank " + std::to_string(rank)));
          break;
        }
        // The union of the blocks' rows and columns, for one elimination shared by all minors.
        std::vector<std::size_t> rows, columns;
        std::unordered_map<std::size_t, std::size_t> row_at, column_at;
        bool sizes = true;
        for (const auto& b : w.minors) {
          sizes = sizes && b.rows.size() == rank - u && b.columns.size() == rank - u;
          for (std::size_t x : b.rows)
            if (row_at.try_emplace(x, rows.size()).second) rows.push_back(x);
          for (std::size_t x : b.columns)
            if (column_at.try_emplace(x, columns.size()).second) columns.push_back(x);
        }
        if (!sizes) {
          fail(k, -1, D + ": a minor is not of size ρ = " + std::to_string(rank) + " = rank " + nm.map(k + 1) +
                          " (" + std::to_string(u) + " pivots and a block of " + std::to_string(rank - u) + ")");
          break;
        }
        std::vector<std::vector<integer>> S;
        std::string why;
        if (!detail::cert::exact_schur<integer>(c, k + 1, w.pivot_rows, w.pivot_columns, rows, columns, S, why)) {
          fail(k, -1, D + ": " + why);
          break;
        }
        integer gcd(0);
        for (const auto& b : w.minors) {
          std::vector<std::vector<integer>> block(b.columns.size(), std::vector<integer>(b.rows.size()));
          for (std::size_t j = 0; j < b.columns.size(); ++j)
            for (std::size_t i = 0; i < b.rows.size(); ++i) block[j][i] = S[column_at[b.columns[j]]][row_at[b.rows[i]]];
          std::vector<std::size_t> br = b.rows, bc = b.columns;  // a block repeating a row or column is singular
          std::sort(br.begin(), br.end()), std::sort(bc.begin(), bc.end());
          if (std::adjacent_find(br.begin(), br.end()) != br.end() || std::adjacent_find(bc.begin(), bc.end()) != bc.end())
            continue;
          gcd = lacuna::gcd(gcd, detail::cert::bareiss_determinant(std::move(block)));
        }
        gcd = detail::cert::magnitude(gcd);
        if (!(gcd == P)) {
          fail(k, -1, D + ": the gcd of the determinants of the " + std::to_string(w.minors.size()) + " minors is " +
                          detail::cert::text(gcd) + ", not the product " + detail::cert::text(P) +
                          " of the claimed torsion factors" +
                          (gcd == integer(0) ? " (every minor given is singular)"
                                             : ", so a torsion summand may be left out (the torsion has order dividing " +
                                                   detail::cert::text(gcd) + " and divisible by " + detail::cert::text(P) + ")"));
          break;
        }
        ++rep.checks;
      }
    }
  }
  return rep;
}

}  // namespace detail::cert

namespace detail::cert {

/// A chain complex held as lists of boundaries: the derived complexes (augmented, quotient,
/// dual) that reduced, relative and cohomology certificates are checked on. Inc is
/// lacuna::incidence, or exact_incidence when the original's incidence numbers may pass 64 bits.
template <class Inc>
struct derived_complex {
  int top = -1;
  /// start[k][i] .. start[k][i + 1]: the boundary of k-cell i in terms[k].
  std::vector<std::vector<std::size_t>> start;
  std::vector<std::vector<Inc>> terms;
  int top_dimension() const noexcept { return top; }
  std::size_t cell_count(int k) const noexcept {
    return k < 0 || k > top ? 0 : start[static_cast<std::size_t>(k)].size() - 1;
  }
  std::span<const Inc> boundary(int k, std::size_t i) const {
    if (k <= 0 || k > top) return {};
    const auto& s = start[static_cast<std::size_t>(k)];
    return std::span<const Inc>(terms[static_cast<std::size_t>(k)]).subspan(s[i], s[i + 1] - s[i]);
  }
};

template <cell_complex C>
using original_incidence =
    std::remove_cvref_t<std::ranges::range_value_t<decltype(lacuna::boundary(std::declval<const C&>(), 1, std::size_t{0}))>>;
template <cell_complex C>
using derived_incidence = std::conditional_t<small_incidence_like<original_incidence<C>>, incidence, exact_incidence>;

template <class Inc, class V>
Inc derived_term(std::size_t face, const V& v) {
  if constexpr (std::same_as<Inc, incidence>)
    return {face, as_incidence(v).coefficient};
  else
    return {face, coefficient_as_integer(v)};
}

/// The derived complex of a kind of result and the correspondence of its cells with X's: view
/// degree j is the degree degree(j) of the result (reduced: j − 1, cohomology: top − j, else
/// j), its cells are X's cells of that dimension (reduced degree −1: the augmentation cell;
/// relative: the cells not in A, in increasing order).
template <cell_complex C>
struct view {
  derived_complex<derived_incidence<C>> cx;
  certificate_kind kind = certificate_kind::absolute;
  int top = -1;  ///< X's top dimension
  static constexpr std::size_t npos = ~std::size_t{0};
  std::vector<std::vector<std::size_t>> to_view, to_original;  ///< relative only
  /// The degree of the result (and the index of the certificate's ranks and torsion) of view degree j.
  int degree(int j) const {
    return kind == certificate_kind::reduced ? j - 1 : kind == certificate_kind::cohomology ? top - j : j;
  }
  /// The view degree of degree k of the result (the inverse of degree).
  int view_degree(int k) const { return kind == certificate_kind::reduced ? k + 1 : kind == certificate_kind::cohomology ? top - k : k; }
  /// X's index of view cell i of view degree j (npos: out of range or in A).
  std::size_t original(int j, std::size_t i) const {
    if (kind != certificate_kind::relative) return i;
    const auto& m = to_original[static_cast<std::size_t>(j)];
    return i < m.size() ? m[i] : npos;
  }
  /// The view index of X's cell i of view degree j (npos: out of range or in A).
  std::size_t inside(int j, std::size_t i) const {
    if (kind != certificate_kind::relative) return i < cx.cell_count(j) ? i : npos;
    const auto& m = to_view[static_cast<std::size_t>(j)];
    return i < m.size() ? m[i] : npos;
  }
  /// How the checker names groups, cells and maps, in the terms of the result.
  naming names() const {
    naming nm;
    const certificate_kind kd = kind;
    const int t = top;
    const view* self = this;
    nm.degree = [self](int j) { return self->degree(j); };
    nm.map_degree = nm.degree;
    switch (kd) {
      case certificate_kind::reduced:
        nm.cycle = "a reduced cycle";
        nm.group = [](int j) { return "H̃_" + std::to_string(j - 1); };
        nm.cell = [](int j, std::size_t i) { return j == 0 ? std::string("the augmentation cell") : std::to_string(j - 1) + "-cell " + std::to_string(i); };
        nm.map = [](int j) { return j == 1 ? std::string("ε (the augmentation)") : "∂_" + std::to_string(j - 1); };
        break;
      case certificate_kind::relative:
        nm.cycle = "a relative cycle (its boundary lies in A)";
        nm.boundary = "boundary off A";
        nm.group = [](int j) { return "H_" + std::to_string(j) + "(X, A)"; };
        nm.cell = [self](int j, std::size_t i) { return std::to_string(j) + "-cell " + std::to_string(self->original(j, i)); };
        nm.map = [](int j) { return "∂_" + std::to_string(j) + " of C(X)/C(A)"; };
        break;
      case certificate_kind::cohomology:
        nm.cycle = "a cocycle", nm.boundary = "coboundary", nm.cocycle = "a cycle (modulo its order, for torsion)",
        nm.coboundary = "boundary";
        nm.group = [t](int j) { return "H^" + std::to_string(t - j); };
        nm.cell = [t](int j, std::size_t i) { return std::to_string(t - j) + "-cell " + std::to_string(i); };
        nm.map = [t](int j) { return "δ_" + std::to_string(t - j); };
        break;
      default: break;
    }
    return nm;
  }
};

/// Builds the derived complex of `kind` (not absolute). Relative: `marks` (marks[k][i] for
/// X's i-th k-cell) must have X's shape and be closed under faces (every face with a non-zero
/// incidence number of a marked cell is marked) — checked here, as the quotient C(X)/C(A) is a
/// chain complex only then. Returns false with the reason otherwise.
template <cell_complex C>
bool build_view(const C& c, certificate_kind kind, const std::vector<std::vector<bool>>* marks, view<C>& v, std::string& why) {
  using Inc = derived_incidence<C>;
  v.kind = kind;
  v.top = lacuna::top_dimension(c);
  const int top = v.top;
  auto& x = v.cx;
  auto n = [&](int k) { return lacuna::cell_count(c, k); };
  auto nonzero = [](const auto& t) { return !(coefficient_as_integer(t) == integer(0)); };
  if (kind == certificate_kind::reduced) {
    if (top < 0) {
      why = "reduced homology of the empty complex is not certified";
      return false;
    }
    x.top = top + 1;
    x.start.assign(static_cast<std::size_t>(top) + 2, {});
    x.terms.assign(static_cast<std::size_t>(top) + 2, {});
    x.start[0] = {0, 1};
    for (int k = 0; k <= top; ++k) {
      auto& s = x.start[static_cast<std::size_t>(k) + 1];
      auto& tm = x.terms[static_cast<std::size_t>(k) + 1];
      s.push_back(0);
      for (std::size_t i = 0; i < n(k); ++i) {
        if (k == 0)
          tm.push_back(derived_term<Inc>(0, incidence{0, 1}));
        else
          for (auto&& t : lacuna::boundary(c, k, i)) tm.push_back(derived_term<Inc>(incidence_face(t), t));
        s.push_back(tm.size());
      }
    }
    return true;
  }
  x.top = top;
  x.start.assign(static_cast<std::size_t>(top + 1), {});
  x.terms.assign(static_cast<std::size_t>(top + 1), {});
  if (kind == certificate_kind::relative) {
    const auto& a = *marks;
    if (static_cast<int>(a.size()) != top + 1) {
      why = "the subcomplex's marks have " + std::to_string(a.size()) + " dimensions, the complex " + std::to_string(top + 1);
      return false;
    }
    v.to_view.assign(static_cast<std::size_t>(top + 1), {});
    v.to_original.assign(static_cast<std::size_t>(top + 1), {});
    for (int k = 0; k <= top; ++k) {
      const auto& ak = a[static_cast<std::size_t>(k)];
      if (ak.size() != n(k)) {
        why = "the subcomplex's marks name " + std::to_string(ak.size()) + " " + std::to_string(k) + "-cells, the complex has " +
              std::to_string(n(k));
        return false;
      }
      auto& tv = v.to_view[static_cast<std::size_t>(k)];
      auto& to = v.to_original[static_cast<std::size_t>(k)];
      tv.assign(n(k), view<C>::npos);
      for (std::size_t i = 0; i < n(k); ++i)
        if (!ak[i]) tv[i] = to.size(), to.push_back(i);
    }
    for (int k = 0; k <= top; ++k) {
      auto& s = x.start[static_cast<std::size_t>(k)];
      auto& tm = x.terms[static_cast<std::size_t>(k)];
      s.push_back(0);
      for (std::size_t i = 0; i < n(k); ++i) {
        const bool in_a = a[static_cast<std::size_t>(k)][i];
        if (k > 0)
          for (auto&& t : lacuna::boundary(c, k, i)) {
            const std::size_t f = incidence_face(t);
            const bool face_in_a = f < n(k - 1) && a[static_cast<std::size_t>(k) - 1][f];
            if (in_a && !face_in_a && nonzero(t)) {
              why = "the subcomplex is not closed under faces: " + std::to_string(k) + "-cell " + std::to_string(i) +
                    " is in it, its face " + std::to_string(k - 1) + "-cell " + std::to_string(f) + " is not";
              return false;
            }
            if (!in_a && !face_in_a) tm.push_back(derived_term<Inc>(f < n(k - 1) ? v.to_view[static_cast<std::size_t>(k) - 1][f] : f, t));
          }
        if (!in_a) s.push_back(tm.size());
      }
    }
    return true;
  }
  // cohomology: view degree j holds X's (top − j)-cells; the boundary of one is its coboundary.
  for (int j = 0; j <= top; ++j) {
    const int k = top - j;
    auto& s = x.start[static_cast<std::size_t>(j)];
    auto& tm = x.terms[static_cast<std::size_t>(j)];
    s.assign(n(k) + 1, 0);
    if (j == 0) continue;
    for (std::size_t q = 0; q < n(k + 1); ++q)
      for (auto&& t : lacuna::boundary(c, k + 1, q))
        if (incidence_face(t) < n(k)) ++s[incidence_face(t) + 1];
    for (std::size_t i = 0; i < n(k); ++i) s[i + 1] += s[i];
    tm.assign(s[n(k)], derived_term<Inc>(0, incidence{0, 0}));
    std::vector<std::size_t> fill(s.begin(), s.end() - 1);
    for (std::size_t q = 0; q < n(k + 1); ++q)
      for (auto&& t : lacuna::boundary(c, k + 1, q))
        if (incidence_face(t) < n(k)) tm[fill[incidence_face(t)]++] = derived_term<Inc>(q, t);
  }
  return true;
}

/// A chain of the result's degree `k` (X's cells) as a chain of view degree j; relative:
/// terms on cells of A dropped (they are zero in the quotient). False with the reason when a
/// term is out of range or the dimension is not k.
template <cell_complex C, class R>
bool chain_into(const view<C>& v, const chain<R>& ch, int k, int j, chain<R>& out, std::string& why) {
  out = {j, {}};
  if (ch.dimension != k) {
    why = "has dimension " + std::to_string(ch.dimension) + ", not " + std::to_string(k);
    return false;
  }
  for (const auto& t : ch.terms) {
    const std::size_t i = v.inside(j, t.cell);
    if (i == view<C>::npos) {
      if (v.kind == certificate_kind::relative && j >= 0 && j <= v.top &&
          t.cell < v.to_view[static_cast<std::size_t>(j)].size())
        continue;  // a cell of A
      why = "names " + std::to_string(k) + "-cell " + std::to_string(t.cell) + ", out of range";
      return false;
    }
    out.terms.push_back({i, t.coefficient});
  }
  return true;
}

/// Cells of X (view degree j) as view cells; false if one is out of range or in A.
template <cell_complex C>
bool cells_into(const view<C>& v, const std::vector<std::size_t>& in, int j, std::vector<std::size_t>& out, std::string& why) {
  out.clear();
  for (std::size_t i : in) {
    const std::size_t x = v.inside(j, i);
    if (x == view<C>::npos) {
      why = std::to_string(v.degree(j)) + "-cell " + std::to_string(i) +
            (v.kind == certificate_kind::relative ? " is out of range or in the subcomplex" : " is out of range");
      return false;
    }
    out.push_back(x);
  }
  return true;
}

/// The certificate of a reduced, relative or cohomology result (layout of
/// homology_certificate) as a certificate of absolute homology of the view. False with the
/// reason (and the degree) on a layout that does not fit.
template <cell_complex C, class R>
bool certificate_into(const view<C>& v, const homology_certificate<R>& in, homology_certificate<R>& out, std::string& why, int& at) {
  const int top = v.top, T = v.cx.top;
  at = -1;
  if (static_cast<int>(in.groups.size()) != top + 1 || static_cast<int>(in.ranks.size()) != top + 1 ||
      (!in.torsion.empty() && static_cast<int>(in.torsion.size()) != top + 1)) {
    why = "the certificate has " + std::to_string(in.groups.size()) + " groups, " + std::to_string(in.ranks.size()) +
          " rank witnesses and " + std::to_string(in.torsion.size()) + " torsion witnesses; the complex has dimension " +
          std::to_string(top);
    return false;
  }
  const naming nm = v.names();
  out = {};
  out.groups.resize(static_cast<std::size_t>(T + 1));
  out.ranks.resize(static_cast<std::size_t>(T + 1));
  for (int j = 0; j <= T; ++j) {
    auto& g = out.groups[static_cast<std::size_t>(j)];
    g.dimension = j;
    const int k = v.degree(j);
    if (k < 0 || k > top) continue;  // H̃_{−1}: zero, proved by the witnesses of ε
    const auto& s = in.groups[static_cast<std::size_t>(k)];
    at = k;
    if (s.dimension != k) {
      why = nm.group(j) + ": the group is labelled dimension " + std::to_string(s.dimension);
      return false;
    }
    g.rank = s.rank;
    g.torsion = s.torsion;
    auto all = [&](const std::vector<chain<R>>& from, std::vector<chain<R>>& to, int kk, int jj, const char* what) {
      to.resize(from.size());
      for (std::size_t i = 0; i < from.size(); ++i)
        if (!chain_into(v, from[i], kk, jj, to[i], why)) {
          why = nm.group(j) + ": " + what + " " + std::to_string(i) + " " + why;
          return false;
        }
      return true;
    };
    if (!all(s.generators, g.generators, k, j, "generator") || !all(s.cocycles, g.cocycles, k, j, "dual witness (cocycles)") ||
        !all(s.bounding_chains, g.bounding_chains, v.degree(j + 1), j + 1, "bounding chain"))
      return false;
  }
  for (int j = 1; j <= T; ++j) {
    const int k = v.degree(j);
    at = k;
    const auto& s = in.ranks[static_cast<std::size_t>(k)];
    auto& w = out.ranks[static_cast<std::size_t>(j)];
    w.prime = s.prime;
    if (!cells_into(v, s.rows, j - 1, w.rows, why) || !cells_into(v, s.columns, j, w.columns, why)) {
      why = "the rank witness of " + nm.map(j) + ": " + why;
      return false;
    }
  }
  if (in.torsion.empty()) return true;
  out.torsion.resize(static_cast<std::size_t>(T + 1));
  for (int j = 0; j <= T; ++j) {
    const int k = v.degree(j);
    auto& w = out.torsion[static_cast<std::size_t>(j)];
    if (k < 0) {  // H̃_{−1}: the 1×1 minor of ε that its rank witness names (ε = ±1 there)
      w.pivot_rows = out.ranks[1].rows;
      w.pivot_columns = out.ranks[1].columns;
      w.minors.assign(1, {});
      continue;
    }
    if (j == T) continue;  // the top view degree: ∂'_{T+1} = 0
    at = k;
    const auto& s = in.torsion[static_cast<std::size_t>(k)];
    auto bad = [&] {
      why = nm.group(j) + ": the torsion witness (minors of " + nm.map(j + 1) + "): " + why;
      return false;
    };
    if (!cells_into(v, s.pivot_rows, j, w.pivot_rows, why) || !cells_into(v, s.pivot_columns, j + 1, w.pivot_columns, why)) return bad();
    w.minors.resize(s.minors.size());
    for (std::size_t i = 0; i < s.minors.size(); ++i)
      if (!cells_into(v, s.minors[i].rows, j, w.minors[i].rows, why) ||
          !cells_into(v, s.minors[i].columns, j + 1, w.minors[i].columns, why))
        return bad();
  }
  return true;
}

/// The inverse of certificate_into: a certificate of the view's absolute homology in the
/// layout of its kind, with X's cells.
template <cell_complex C, class R>
homology_certificate<R> certificate_from(const view<C>& v, const homology_certificate<R>& in) {
  const int top = v.top;
  homology_certificate<R> out;
  out.kind = v.kind;
  auto cells = [&](const std::vector<std::size_t>& from, int j) {
    std::vector<std::size_t> to;
    for (std::size_t i : from) to.push_back(v.original(j, i));
    return to;
  };
  auto back = [&](const chain<R>& ch) {
    chain<R> out_chain{v.degree(ch.dimension), {}};
    for (const auto& t : ch.terms) out_chain.terms.push_back({v.original(ch.dimension, t.cell), t.coefficient});
    return out_chain;
  };
  for (int k = 0; k <= top; ++k) {
    const auto& g = in.groups[static_cast<std::size_t>(v.view_degree(k))];
    certified_group<R> cg;
    cg.dimension = k;
    cg.rank = g.rank;
    cg.torsion = g.torsion;
    for (const auto& z : g.generators) cg.generators.push_back(back(z));
    for (const auto& z : g.cocycles) cg.cocycles.push_back(back(z));
    for (const auto& z : g.bounding_chains) cg.bounding_chains.push_back(back(z));
    out.groups.push_back(std::move(cg));
  }
  out.ranks.resize(static_cast<std::size_t>(top + 1));
  for (int j = 1; j <= v.cx.top; ++j) {
    const auto& w = in.ranks[static_cast<std::size_t>(j)];
    auto& o = out.ranks[static_cast<std::size_t>(v.degree(j))];
    o.prime = w.prime;
    o.rows = cells(w.rows, j - 1);
    o.columns = cells(w.columns, j);
  }
  if (!in.torsion.empty()) {
    out.torsion.resize(static_cast<std::size_t>(top + 1));
    for (int j = 0; j < v.cx.top; ++j) {
      const int k = v.degree(j);
      if (k < 0) continue;
      const auto& w = in.torsion[static_cast<std::size_t>(j)];
      auto& o = out.torsion[static_cast<std::size_t>(k)];
      o.pivot_rows = cells(w.pivot_rows, j);
      o.pivot_columns = cells(w.pivot_columns, j + 1);
      for (const auto& b : w.minors) o.minors.push_back({cells(b.rows, j), cells(b.columns, j + 1)});
    }
  }
  return out;
}

/// check_certificate of any kind: absolute on c itself, the others on their derived complex.
template <euclidean_domain R, cell_complex C>
certificate_report check_kind(const C& c, const homology_certificate<R>& cert, const std::vector<std::vector<bool>>* marks) {
  if (cert.kind == certificate_kind::absolute) return check_absolute(c, cert, naming{});
  certificate_report rep;
  auto refuse = [&](int k, std::string what) {
    rep.ok = false;
    rep.dimension = k;
    rep.first_failure = std::move(what);
    return rep;
  };
  if (cert.kind == certificate_kind::relative && !marks)
    return refuse(-1, "a certificate of relative homology is checked against the subcomplex A, and none is given");
  view<C> v;
  std::string why;
  if (!build_view(c, cert.kind, marks, v, why)) return refuse(-1, why);
  homology_certificate<R> inside;
  int at = -1;
  if (!certificate_into(v, cert, inside, why, at)) return refuse(at, why);
  const naming nm = v.names();
  return check_absolute(v.cx, inside, nm);
}

}  // namespace detail::cert

/// Checks a certificate against the complex c it claims to describe (see the top of this
/// header and docs/certificates.md for what a passing check proves). R models
/// euclidean_domain (lacuna::integer, or a field); C models cell_complex. Never throws on a
/// wrong certificate: the report names the first failure, its degree and generator.
/// Reduced and cohomology certificates (cert.kind) are checked on the augmented and the dual
/// complex; a relative one needs the subcomplex (the overload below) and fails without it.
/// Complexity: a pass over the faces of faces of every cell (∂∂ = 0), linear in the size of
/// the cells the witnesses meet, one pass over the (k+1)-cells per degree, and the
/// eliminations mod p of the rank witnesses (plus, for the other kinds, one copy of the
/// complex: the augmented, quotient or transposed boundaries).
template <euclidean_domain R, cell_complex C>
certificate_report check_certificate(const C& c, const homology_certificate<R>& cert) {
  return detail::cert::check_kind(c, cert, nullptr);
}

/// Checks a certificate of the relative homology H_k(X, A) (cert.kind ==
/// certificate_kind::relative), A the subcomplex of the cells marked in `subcomplex`
/// (subcomplex[k][i] for the i-th k-cell, as relative_homology takes it). The check first
/// verifies that the marks have c's shape and are closed under faces, then checks the
/// witnesses on the quotient C(X)/C(A). A certificate of another kind is checked as by the
/// overload above, with the marks ignored.
template <euclidean_domain R, cell_complex C>
certificate_report check_certificate(const C& c, const homology_certificate<R>& cert,
                                     const std::vector<std::vector<bool>>& subcomplex) {
  return detail::cert::check_kind(c, cert, &subcomplex);
}

}  // namespace lacuna

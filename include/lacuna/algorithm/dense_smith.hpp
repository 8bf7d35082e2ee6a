// lacuna/algorithm/dense_smith.hpp — Smith normal form of a dense matrix over a Euclidean
// domain, by elimination, optionally keeping the change of basis.
//
// The small-matrix reference, and the treatment of the non-unit cores left by sparse
// elimination. Pivoting: the entry of least Euclidean size in the remaining submatrix, then
// Euclidean row and column reduction against it, which keeps entries small in practice
// (the least-magnitude pivot rule of Havas, Holt & Rees, "Recognizing badly presented
// Z-modules", 1993). Exactness does not depend on it: lacuna::integer widens on overflow.
// Divisibility d_1 | d_2 | ... is enforced as in the classical proof (Kannan & Bachem 1979,
// §2): when an entry of the remaining submatrix is not a multiple of the pivot, its row is
// added to the pivot row and the reduction goes on.
#pragma once

#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <algorithm>
#include <cstddef>
#include <optional>
#include <vector>

namespace lacuna {

/// What dense_smith_form computes: U * A * V == D, D diagonal with the invariant factors
/// d_1 | d_2 | ... | d_r (normalized, non-zero) first, zeros after. U, V are invertible;
/// U_inv, V_inv are their inverses. The transforms are empty unless asked for.
template <euclidean_domain R>
struct smith_decomposition {
  /// The number r of non-zero invariant factors.
  std::size_t rank = 0;
  std::vector<R> diagonal;  ///< d_1..d_rank
  ///@{
  /// The transforms and their inverses (empty unless has_transforms).
  dense_matrix<R> U, U_inv, V, V_inv;
  ///@}
  /// True when U, U_inv, V and V_inv were computed.
  bool has_transforms = false;
};

/// Options of dense_smith_form.
struct dense_smith_options {
  bool transforms = false;  ///< keep U, U^-1, V, V^-1
  /// Stop request and progress (phase "Smith form of the core", units: pivots); may be null.
  const run_control* control = nullptr;
};

/// The Smith normal form of A. R models euclidean_domain. O(m n min(m,n)) ring operations
/// (more when divisibility repairs are needed).
template <euclidean_domain R>
smith_decomposition<R> dense_smith_form(dense_matrix<R> A, dense_smith_options options = {}) {
  const std::size_t m = A.rows(), n = A.cols();
  const bool tr = options.transforms;
  smith_decomposition<R> out;
  if (tr) {
    out.U = out.U_inv = dense_matrix<R>::identity(m);
    out.V = out.V_inv = dense_matrix<R>::identity(n);
    out.has_transforms = true;
  }
  const R z = zero<R>();
  // Elementary operations, mirrored on the transforms (U A V stays equal to the working A).
  auto row_swap = [&](std::size_t a, std::size_t b) {
    A.swap_rows(a, b);
    if (tr) out.U.swap_rows(a, b), out.U_inv.swap_cols(a, b);
  };
  auto col_swap = [&](std::size_t a, std::size_t b) {
    A.swap_cols(a, b);
    if (tr) out.V.swap_cols(a, b), out.V_inv.swap_rows(a, b);
  };
  auto row_add = [&](std::size_t dst, const R& s, std::size_t src) {  // row dst += s row src
    A.add_row(dst, s, src);
    if (tr) out.U.add_row(dst, s, src), out.U_inv.add_col(src, -s, dst);
  };
  auto col_add = [&](std::size_t dst, const R& s, std::size_t src) {  // col dst += s col src
    A.add_col(dst, s, src);
    if (tr) out.V.add_col(dst, s, src), out.V_inv.add_row(src, -s, dst);
  };

  detail::progress_ticker ticker(options.control, "Smith form of the core", std::min(m, n));
  std::size_t t = 0;
  for (; t < m && t < n; ++t) {
    ticker();
    // The pivot: least Euclidean size in the remaining submatrix.
    std::optional<std::pair<std::size_t, std::size_t>> best;
    for (std::size_t i = t; i < m; ++i)
      for (std::size_t j = t; j < n; ++j)
        if (!(A(i, j) == z) && (!best || euclidean_size(A(i, j)) < euclidean_size(A(best->first, best->second))))
          best = {i, j};
    if (!best) break;
    row_swap(t, best->first);
    col_swap(t, best->second);
    for (;;) {
      bool clean = true;
      for (std::size_t i = t + 1; i < m; ++i) {
        if (A(i, t) == z) continue;
        auto qr = div_rem(A(i, t), A(t, t));
        row_add(i, -qr.quotient, t);
        if (!(qr.remainder == z)) clean = false;
      }
      for (std::size_t j = t + 1; j < n; ++j) {
        if (A(t, j) == z) continue;
        auto qr = div_rem(A(t, j), A(t, t));
        col_add(j, -qr.quotient, t);
        if (!(qr.remainder == z)) clean = false;
      }
      if (!clean) {
        // A remainder is now smaller than the pivot: bring the smallest into place.
        std::size_t bi = t, bj = t;
        for (std::size_t i = t + 1; i < m; ++i)
          if (!(A(i, t) == z) && euclidean_size(A(i, t)) < euclidean_size(A(bi, bj))) bi = i, bj = t;
        for (std::size_t j = t + 1; j < n; ++j)
          if (!(A(t, j) == z) && euclidean_size(A(t, j)) < euclidean_size(A(bi, bj))) bi = t, bj = j;
        row_swap(t, bi);
        col_swap(t, bj);
        continue;
      }
      // Row t and column t are clear. Divisibility: every remaining entry must be a multiple.
      std::optional<std::size_t> bad_row;
      for (std::size_t i = t + 1; i < m && !bad_row; ++i)
        for (std::size_t j = t + 1; j < n; ++j)
          if (!(A(i, j) == z) && !(div_rem(A(i, j), A(t, t)).remainder == z)) {
            bad_row = i;
            break;
          }
      if (!bad_row) break;
      row_add(t, one<R>(), *bad_row);
    }
    // Normalize the pivot to its canonical associate.
    const R d = normalize(A(t, t));
    if (!(d == A(t, t))) {
      const R u = div_rem(A(t, t), d).quotient;  // A(t,t) == u * d, u a unit
      const R u_inv = div_rem(one<R>(), u).quotient;
      A.scale_row(t, u_inv);
      if (tr) out.U.scale_row(t, u_inv), out.U_inv.scale_col(t, u);
    }
    out.diagonal.push_back(A(t, t));
  }
  out.rank = out.diagonal.size();
  ticker.finish();
  return out;
}

}  // namespace lacuna

// lacuna/chain/chain.hpp — chains: finite formal sums of cells of one dimension.
#pragma once

#include <lacuna/chain/combine_terms.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstddef>
#include <vector>

namespace lacuna {

/// One term of a chain: a cell (by its index in its dimension) and a coefficient.
template <class R>
struct chain_term {
  /// The index of the cell in its dimension.
  std::size_t cell;
  /// Its coefficient (non-zero in a normalized chain).
  R coefficient;
  /// Same cell and coefficient.
  friend bool operator==(const chain_term&, const chain_term&) = default;
};

/// A chain of k-cells with coefficients in R: terms sorted by cell, no zero coefficient.
/// R models commutative_ring.
template <commutative_ring R>
struct chain {
  /// The dimension k of the cells.
  int dimension = 0;
  /// The terms, sorted by cell.
  std::vector<chain_term<R>> terms;

  /// Puts the terms in canonical form: sorted by cell, equal cells added, zeros dropped.
  void normalize_terms() {
    combine_terms(terms, &chain_term<R>::cell, &chain_term<R>::coefficient);
  }
  /// True for the zero chain (no terms).
  bool is_zero() const { return terms.empty(); }
  /// The coefficient of a cell (zero when absent). O(log n).
  R coefficient_of(std::size_t cell) const {
    auto it = std::lower_bound(terms.begin(), terms.end(), cell,
                               [](const auto& t, std::size_t c) { return t.cell < c; });
    return it != terms.end() && it->cell == cell ? it->coefficient : zero<R>();
  }
  /// Same dimension and terms (both normalized: equal chains).
  friend bool operator==(const chain&, const chain&) = default;
};

/// a + s * b for chains of one dimension.
template <commutative_ring R>
chain<R> add_scaled(const chain<R>& a, const R& s, const chain<R>& b) {
  chain<R> out{a.dimension, {}};
  out.terms.reserve(a.terms.size() + b.terms.size());
  std::size_t i = 0, j = 0;
  while (i < a.terms.size() || j < b.terms.size()) {
    if (j == b.terms.size() || (i < a.terms.size() && a.terms[i].cell < b.terms[j].cell)) {
      out.terms.push_back(a.terms[i++]);
    } else if (i == a.terms.size() || b.terms[j].cell < a.terms[i].cell) {
      R c = s * b.terms[j].coefficient;
      if (!(c == zero<R>())) out.terms.push_back({b.terms[j].cell, c});
      ++j;
    } else {
      R c = a.terms[i].coefficient + s * b.terms[j].coefficient;
      if (!(c == zero<R>())) out.terms.push_back({a.terms[i].cell, c});
      ++i, ++j;
    }
  }
  return out;
}

/// s * a.
template <commutative_ring R>
chain<R> scaled(const R& s, const chain<R>& a) {
  chain<R> out{a.dimension, {}};
  if (s == zero<R>()) return out;
  for (const auto& t : a.terms) {
    R c = s * t.coefficient;
    if (!(c == zero<R>())) out.terms.push_back({t.cell, c});
  }
  return out;
}

}  // namespace lacuna

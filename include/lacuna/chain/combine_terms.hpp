// lacuna/chain/combine_terms.hpp — the one routine that puts a list of (index, coefficient)
// terms in canonical form: sorted by index, terms of equal index added, zero sums dropped.
// Chains, chain maps and sparse matrices call it instead of a loop of their own.
#pragma once

#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <functional>
#include <vector>

namespace lacuna {

/// Sorts `terms` by index, adds the coefficients of equal indices and drops the terms whose
/// sum is zero. `index` and `coefficient` name a term's parts: member pointers (as
/// `&chain_term<R>::cell`) or callables. Coefficients are added with `add` (+ by default;
/// pass a checked addition for plain integers, so that an overflow is never silent); a sum is
/// zero when it equals zero<V>() for a ring V, else V{}. Cost O(n log n).
template <class T, class Index, class Coefficient, class Add = std::plus<>>
void combine_terms(std::vector<T>& terms, Index index, Coefficient coefficient, Add add = {}) {
  std::stable_sort(terms.begin(), terms.end(),
                   [&](const T& a, const T& b) { return std::invoke(index, a) < std::invoke(index, b); });
  std::size_t out = 0;
  for (std::size_t i = 0; i < terms.size();) {
    std::size_t j = i + 1;
    auto sum = std::invoke(coefficient, terms[i]);
    using V = decltype(sum);
    while (j < terms.size() && std::invoke(index, terms[j]) == std::invoke(index, terms[i]))
      sum = add(sum, std::invoke(coefficient, terms[j++]));
    bool zero_sum;
    if constexpr (commutative_ring<V>)
      zero_sum = sum == zero<V>();
    else
      zero_sum = sum == V{};
    if (!zero_sum) {
      if (out != i) terms[out] = std::move(terms[i]);
      std::invoke(coefficient, terms[out]) = std::move(sum);
      ++out;
    }
    i = j;
  }
  terms.resize(out);
}

}  // namespace lacuna

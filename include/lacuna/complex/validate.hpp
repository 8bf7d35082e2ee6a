// lacuna/complex/validate.hpp — checks that a cell complex is one.
//
// lacuna::validate(c) checks, for any lacuna::cell_complex (built-in or adapted):
//   * the top dimension is >= -1;
//   * a 0-cell has an empty boundary (terms with coefficient 0 are tolerated);
//   * every face index of a k-cell is below cell_count(k - 1);
//   * ∂∂ = 0 for every cell, computed exactly: in 128-bit arithmetic while the incidence
//     numbers fit in int64 and the sums in 128 bits (a product of two int64 values always
//     fits), otherwise again in lacuna::integer (incidence numbers of any size).
// It throws lacuna::invalid_complex naming the first offending cell (lowest dimension, then
// lowest index) by dimension, index and lacuna::cell_name. Cost: O(sum over cells of
// |∂c| * |∂ of a face|) time and O(largest such sum) memory.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

namespace detail {
__extension__ typedef __int128 int128_t;

inline std::string int128_to_string(int128_t v) {
  if (v == 0) return "0";
  const bool neg = v < 0;
  std::string s;
  while (v != 0) {
    const int d = static_cast<int>(v % 10);
    s += static_cast<char>('0' + (d < 0 ? -d : d));
    v /= 10;
  }
  if (neg) s += '-';
  std::reverse(s.begin(), s.end());
  return s;
}

template <class C>
std::string describe_cell(const C& c, int k, std::size_t i) {
  return std::to_string(k) + "-cell " + std::to_string(i) + " ('" + lacuna::cell_name(c, k, i) + "')";
}
}  // namespace detail

/// Throws lacuna::invalid_complex naming the first cell of c that breaks a rule of a cell
/// complex (see the top of this header); returns normally if c is a valid complex.
template <cell_complex C>
void validate(const C& c) {
  const int top = lacuna::top_dimension(c);
  if (top < -1) throw invalid_complex("top dimension " + std::to_string(top) + " is below -1");
  std::vector<std::pair<std::size_t, detail::int128_t>> acc;
  for (int k = 0; k <= top; ++k) {
    const std::size_t n = lacuna::cell_count(c, k);
    const std::size_t faces = k > 0 ? lacuna::cell_count(c, k - 1) : 0;
    const std::size_t faces2 = k > 1 ? lacuna::cell_count(c, k - 2) : 0;
    for (std::size_t i = 0; i < n; ++i) {
      acc.clear();
      bool exact = false;  // a coefficient beyond int64 or a sum beyond 128 bits: redo exactly
      for (const auto& term : lacuna::boundary(c, k, i)) {
        const exact_incidence t = as_exact_incidence(term);
        if (t.coefficient.sign() == 0) continue;
        if (k == 0)
          throw invalid_complex(detail::describe_cell(c, k, i) + " has a non-zero boundary", k, i);
        if (t.face >= faces)
          throw invalid_complex(detail::describe_cell(c, k, i) + " has face " + std::to_string(t.face) +
                                    ", but there are only " + std::to_string(faces) + " " +
                                    std::to_string(k - 1) + "-cells",
                                k, i);
        if (k == 1) continue;
        for (const auto& term2 : lacuna::boundary(c, k - 1, t.face)) {
          const exact_incidence u = as_exact_incidence(term2);
          if (u.coefficient.sign() == 0) continue;
          if (u.face >= faces2)
            throw invalid_complex(detail::describe_cell(c, k - 1, t.face) + " has face " +
                                      std::to_string(u.face) + ", but there are only " +
                                      std::to_string(faces2) + " " + std::to_string(k - 2) + "-cells",
                                  k - 1, t.face);
          if (t.coefficient.is_small() && u.coefficient.is_small())
            acc.emplace_back(u.face, static_cast<detail::int128_t>(t.coefficient.small_value()) *
                                         u.coefficient.small_value());
          else
            exact = true;
        }
      }
      const auto not_zero = [&](std::size_t f, const std::string& value) {
        return invalid_complex("the boundary of the boundary of " + detail::describe_cell(c, k, i) +
                                   " is not zero: coefficient " + value + " on " + detail::describe_cell(c, k - 2, f),
                               k, i);
      };
      std::sort(acc.begin(), acc.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
      for (std::size_t s = 0; s < acc.size() && !exact;) {
        detail::int128_t sum = 0;
        const std::size_t f = acc[s].first;
        for (; s < acc.size() && acc[s].first == f && !exact; ++s) exact = __builtin_add_overflow(sum, acc[s].second, &sum);
        if (!exact && sum != 0) throw not_zero(f, detail::int128_to_string(sum));
      }
      if (exact) {  // the same sum, in lacuna::integer (the faces were checked above)
        std::vector<std::pair<std::size_t, integer>> big;
        for (const auto& term : lacuna::boundary(c, k, i)) {
          const exact_incidence t = as_exact_incidence(term);
          if (t.coefficient.sign() == 0) continue;
          for (const auto& term2 : lacuna::boundary(c, k - 1, t.face)) {
            exact_incidence u = as_exact_incidence(term2);
            if (u.coefficient.sign() != 0) big.emplace_back(u.face, t.coefficient * u.coefficient);
          }
        }
        std::stable_sort(big.begin(), big.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
        for (std::size_t s = 0; s < big.size();) {
          integer sum;
          const std::size_t f = big[s].first;
          for (; s < big.size() && big[s].first == f; ++s) sum += big[s].second;
          if (sum.sign() != 0) throw not_zero(f, sum.to_string());
        }
      }
    }
  }
}

}  // namespace lacuna

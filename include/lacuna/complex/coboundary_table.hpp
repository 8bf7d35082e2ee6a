// lacuna/complex/coboundary_table.hpp — coboundaries of any cell complex, built on demand.
//
// coboundary_table<C> transposes the boundaries of a lacuna::cell_complex once (CSR per
// dimension: for each k-cell, the (k+1)-cells having it as a face, with the same incidence
// numbers, cofaces increasing). It keeps a pointer to the complex and forwards the rest of
// the interface, so a coboundary_table<C> itself models lacuna::complex_with_coboundary:
//     lacuna::coboundary_table t(c);        // c must outlive t
//     for (auto [coface, coef] : t.coboundary(1, e)) ...
// Time O(N + T), memory 8 bytes per cell plus 16 per incidence (N cells, T incidences).
// Equal faces listed twice in one boundary are added up; zero coefficients are dropped.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace lacuna {

/// The coboundaries of a cell complex C (which must outlive the table).
template <cell_complex C>
class coboundary_table {
 public:
  /// Builds the table for all dimensions. Throws lacuna::invalid_complex naming the cell if
  /// a face index is out of range, or if equal faces listed twice add up beyond int64.
  explicit coboundary_table(const C& c) : c_(&c) {
    const int top = lacuna::top_dimension(c);
    dims_.resize(top > 0 ? static_cast<std::size_t>(top) : 0);
    for (int k = 0; k < top; ++k) {
      auto& d = dims_[static_cast<std::size_t>(k)];
      const std::size_t n = lacuna::cell_count(c, k);
      const std::size_t m = lacuna::cell_count(c, k + 1);
      d.offsets.assign(n + 1, 0);
      for (std::size_t j = 0; j < m; ++j)
        for (const auto& term : lacuna::boundary(c, k + 1, j)) {
          const incidence t = as_incidence(term);
          if (t.coefficient == 0) continue;
          if (t.face >= n)
            throw invalid_complex("coboundary_table: " + std::to_string(k + 1) + "-cell " + std::to_string(j) +
                                      " ('" + lacuna::cell_name(c, k + 1, j) + "') has face " +
                                      std::to_string(t.face) + " out of range",
                                  k + 1, j);
          ++d.offsets[t.face + 1];
        }
      for (std::size_t i = 0; i < n; ++i) d.offsets[i + 1] += d.offsets[i];
      d.terms.resize(d.offsets[n]);
      std::vector<std::size_t> fill(d.offsets.begin(), d.offsets.end() - 1);
      for (std::size_t j = 0; j < m; ++j)
        for (const auto& term : lacuna::boundary(c, k + 1, j)) {
          const incidence t = as_incidence(term);
          if (t.coefficient == 0) continue;
          // Cofaces arrive in increasing order; a face repeated within one boundary adds up.
          const std::size_t start = d.offsets[t.face];
          std::size_t& pos = fill[t.face];
          if (pos > start && d.terms[pos - 1].face == j) {
            std::int64_t s;
            if (checked_add(d.terms[pos - 1].coefficient, t.coefficient, s))
              throw invalid_complex("coboundary_table: integer overflow in the boundary of " + std::to_string(k + 1) +
                                        "-cell " + std::to_string(j),
                                    k + 1, j);
            d.terms[pos - 1].coefficient = s;
          } else {
            d.terms[pos++] = incidence{j, t.coefficient};
          }
        }
      // Compact away the slots freed by repeated faces and by sums that cancelled to zero.
      std::size_t o = 0;
      std::vector<std::size_t> offsets(n + 1, 0);
      for (std::size_t i = 0; i < n; ++i) {
        for (std::size_t s = d.offsets[i]; s < fill[i]; ++s)
          if (d.terms[s].coefficient != 0) d.terms[o++] = d.terms[s];
        offsets[i + 1] = o;
      }
      d.terms.resize(o);
      d.terms.shrink_to_fit();
      d.offsets = std::move(offsets);
    }
  }

  /// The (k+1)-cells having the i-th k-cell as a face, with their incidence numbers.
  std::span<const incidence> coboundary(int k, std::size_t i) const {
    if (k < 0 || static_cast<std::size_t>(k) >= dims_.size()) return {};
    const auto& d = dims_[static_cast<std::size_t>(k)];
    return {d.terms.data() + d.offsets[i], d.offsets[i + 1] - d.offsets[i]};
  }

  // ---- forwarded to the complex --------------------------------------------------------
  ///@{
  /// The cell_complex interface, forwarded to the complex.
  int top_dimension() const { return lacuna::top_dimension(*c_); }
  std::size_t cell_count(int k) const { return lacuna::cell_count(*c_, k); }
  decltype(auto) boundary(int k, std::size_t i) const { return lacuna::boundary(*c_, k, i); }
  std::string cell_name(int k, std::size_t i) const { return lacuna::cell_name(*c_, k, i); }
  ///@}
  /// The complex the table was built for.
  const C& complex() const noexcept { return *c_; }

 private:
  struct dimension {
    std::vector<std::size_t> offsets;
    std::vector<incidence> terms;
  };
  const C* c_;
  std::vector<dimension> dims_;
};

}  // namespace lacuna

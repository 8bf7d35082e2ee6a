// lacuna/complex/construct/product.hpp — the cellular product X × Y of any two complexes.
//
// The n-cells are the pairs a × b with dim a + dim b = n, ordered by dim a, then the index of
// a, then the index of b; named "NAME(a)×NAME(b)". The boundary is the product rule
//     ∂(a × b) = ∂a × b + (-1)^{dim a} a × ∂b
// (Hatcher 2002, §3.B, the cellular boundary of a product). Coefficients multiply with an
// overflow check.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>

#include <vector>

namespace lacuna {

/// The cellular product X × Y as a cell_list; χ(X × Y) = χ(X) χ(Y). Throws
/// lacuna::invalid_complex if a product of coefficients overflows int64.
template <cell_complex X, cell_complex Y>
cell_list product(const X& x, const Y& y) {
  const int px = lacuna::top_dimension(x), qy = lacuna::top_dimension(y);
  cell_list out;
  if (px < 0 || qy < 0) return out;
  const auto nx = [&](int p) { return lacuna::cell_count(x, p); };
  const auto ny = [&](int q) { return lacuna::cell_count(y, q); };
  // offset[n][p]: index of the first n-cell a × b with dim a = p
  const int top = px + qy;
  std::vector<std::vector<std::size_t>> offset(static_cast<std::size_t>(top) + 1);
  for (int n = 0; n <= top; ++n) {
    std::size_t o = 0;
    for (int p = 0; p <= n; ++p) {
      offset[static_cast<std::size_t>(n)].push_back(o);
      o += nx(p) * ny(n - p);
    }
  }
  const auto index = [&](int n, int p, std::size_t a, std::size_t b) {
    return offset[static_cast<std::size_t>(n)][static_cast<std::size_t>(p)] + a * ny(n - p) + b;
  };
  std::vector<incidence> terms;
  for (int n = 0; n <= top; ++n)
    for (int p = 0; p <= n; ++p) {
      const int q = n - p;
      if (p > px || q > qy) continue;
      for (std::size_t a = 0; a < nx(p); ++a) {
        const auto name_a = lacuna::cell_name(x, p, a);
        for (std::size_t b = 0; b < ny(q); ++b) {
          terms.clear();
          if (p > 0)
            for (const auto& t : lacuna::boundary(x, p, a)) {
              const incidence f = as_incidence(t);
              terms.push_back({index(n - 1, p - 1, f.face, b), f.coefficient});
            }
          if (q > 0)
            for (const auto& t : lacuna::boundary(y, q, b)) {
              const incidence f = as_incidence(t);
              const std::int64_t c = (p % 2 == 0) ? f.coefficient : detail::checked_mul(f.coefficient, -1, "product");
              terms.push_back({index(n - 1, p, a, f.face), c});
            }
          out.add_cell(n, detail::concat(name_a, "×", lacuna::cell_name(y, q, b)), terms);
        }
      }
    }
  return out;
}

}  // namespace lacuna

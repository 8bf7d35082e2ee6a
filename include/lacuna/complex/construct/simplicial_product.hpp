// lacuna/complex/construct/simplicial_product.hpp — X × Y as a simplicial complex.
//
// The staircase triangulation: the vertices are the pairs (u, v), labelled "(U,V)" from the
// labels U, V, numbered u * |V(Y)| + v; the simplices are the chains
// (u0, v0) < (u1, v1) < ... in the product of the vertex orders (u and v non-decreasing,
// the pair strictly increasing) with {u_i} a simplex of X and {v_i} a simplex of Y. A product
// of a p-simplex and a q-simplex has C(p+q, p) top simplices, one per lattice path
// (Eilenberg & Zilber, 1950; Hatcher 2002, §3.B).
#pragma once

#include <lacuna/complex/simplicial_complex.hpp>

#include <cstdint>
#include <string>
#include <vector>

namespace lacuna {

/// The product X × Y triangulated as a simplicial_complex<std::string>;
/// χ(X × Y) = χ(X) χ(Y). Cost: C(p+q, p) facets per pair of facets of dimensions p and q.
template <class L1, class L2>
simplicial_complex<std::string> simplicial_product(const simplicial_complex<L1>& x,
                                                   const simplicial_complex<L2>& y) {
  using out_t = typename detail::text_labelled_complex<L1, L2>::type;
  typename out_t::builder b;
  const std::size_t ny = y.vertex_count();
  for (std::size_t u = 0; u < x.vertex_count(); ++u)
    for (std::size_t v = 0; v < ny; ++v)
      b.vertex(detail::concat("(", detail::label_to_string(x.label(static_cast<std::uint32_t>(u))), ",",
                              detail::label_to_string(y.label(static_cast<std::uint32_t>(v))), ")"));
  const auto fx = x.facets();
  const auto fy = y.facets();
  std::vector<std::uint32_t> ids;
  std::vector<char> steps;  // 0: step in X, 1: step in Y
  for (const auto& f : fx)
    for (const auto& g : fy) {
      const auto us = x.vertices(f.first, f.second);
      const auto vs = y.vertices(g.first, g.second);
      const std::size_t p = us.size() - 1, q = vs.size() - 1;
      steps.assign(p, 0);
      steps.insert(steps.end(), q, 1);
      do {  // every lattice path from (0, 0) to (p, q)
        ids.clear();
        std::size_t a = 0, c = 0;
        ids.push_back(static_cast<std::uint32_t>(us[a] * ny + vs[c]));
        for (char s : steps) {
          if (s == 0)
            ++a;
          else
            ++c;
          ids.push_back(static_cast<std::uint32_t>(us[a] * ny + vs[c]));
        }
        b.add_facet_ids(ids);
      } while (std::next_permutation(steps.begin(), steps.end()));
    }
  return std::move(b).finalize();
}

}  // namespace lacuna

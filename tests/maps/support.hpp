// Shared complexes of the maps tests: triangulated circles, cross-polytope spheres, the
// Möbius band, and fundamental classes of the circles.
#pragma once

#include <lacuna/chain/chain.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstdint>
#include <vector>

namespace maps_test {

using lacuna::integer;
using lacuna::simplicial_complex;

/// The circle with m vertices 0..m-1 and edges {i, i+1 mod m}.
inline simplicial_complex<int> circle(int m) {
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < m; ++i) facets.push_back({i, (i + 1) % m});
  return simplicial_complex<int>::from_facets(facets);
}

/// The fundamental class of circle(m), oriented 0 -> 1 -> ... -> m-1 -> 0.
inline lacuna::chain<integer> circle_class(const simplicial_complex<int>& c, int m) {
  lacuna::chain<integer> z{1, {}};
  for (int i = 0; i < m; ++i) {
    const int j = (i + 1) % m;
    const auto e = *c.find_labels(std::vector<int>{i, j});
    // The stored edge runs from its lower vertex id to its higher one.
    const bool forward = *c.vertex(i) < *c.vertex(j);
    z.terms.push_back({e, integer(forward ? 1 : -1)});
  }
  z.normalize_terms();
  return z;
}

/// The boundary of the (n+1)-dimensional cross-polytope, a triangulated S^n: vertex 2i is
/// +e_i, 2i+1 is -e_i; a facet takes one of each pair.
inline simplicial_complex<int> cross_polytope_sphere(int n) {
  std::vector<std::vector<int>> facets;
  for (int mask = 0; mask < (1 << (n + 1)); ++mask) {
    std::vector<int> f;
    for (int i = 0; i <= n; ++i) f.push_back(2 * i + ((mask >> i) & 1));
    facets.push_back(f);
  }
  return simplicial_complex<int>::from_facets(facets);
}

/// The five-vertex Möbius band: triangles {i, i+1, i+2} mod 5.
inline simplicial_complex<int> moebius_band() {
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < 5; ++i) facets.push_back({i, (i + 1) % 5, (i + 2) % 5});
  return simplicial_complex<int>::from_facets(facets);
}

/// Its boundary: the 5-cycle 0 - 2 - 4 - 1 - 3 - 0 (the edges lying in one triangle).
inline simplicial_complex<int> moebius_boundary() {
  return simplicial_complex<int>{{0, 2}, {2, 4}, {4, 1}, {1, 3}, {3, 0}};
}

}  // namespace maps_test

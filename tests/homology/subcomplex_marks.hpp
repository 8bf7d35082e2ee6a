// Subcomplexes for the tests of relative homology: the marks of a subcomplex spanned by some
// facets, and pairs (X, A) with known relative groups (a disk and its rim, a ball and its
// boundary sphere, the Möbius band and its boundary circle), and a boundary of the differential
// of each kind of result (for mutations that replace a generator by a boundary).
#pragma once

#include "homology/support.hpp"

#include <lacuna/homology/certificate.hpp>

#include <algorithm>
#include <vector>

namespace subcomplex_marks {

using marks_t = std::vector<std::vector<bool>>;
using lacuna_test::facets;

/// The marks of the subcomplex of X spanned by the facets `a` (every simplex of X all of whose
/// vertices lie in one facet of a).
inline marks_t marks_of(const lacuna::simplicial_complex<int>& x, const std::vector<std::vector<int>>& a) {
  marks_t m(static_cast<std::size_t>(x.top_dimension() + 1));
  for (int k = 0; k <= x.top_dimension(); ++k) {
    auto& mk = m[static_cast<std::size_t>(k)];
    mk.assign(x.cell_count(k), false);
    for (std::size_t i = 0; i < mk.size(); ++i)
      for (const auto& f : a) {
        bool inside = true;
        for (auto v : x.vertices(k, i)) inside = inside && std::find(f.begin(), f.end(), x.label(v)) != f.end();
        if (inside) mk[i] = true;
      }
  }
  return m;
}

/// A triangulated disk: the cone over an n-gon (apex 0, rim 1..n), and its rim.
inline lacuna::simplicial_complex<int> cone_disk(int n) {
  std::vector<std::vector<int>> fs;
  for (int i = 1; i <= n; ++i) fs.push_back({0, i, i % n + 1});
  return facets(fs);
}
inline std::vector<std::vector<int>> cone_rim(int n) {
  std::vector<std::vector<int>> fs;
  for (int i = 1; i <= n; ++i) fs.push_back({i, i % n + 1});
  return fs;
}

/// The 3-ball as the cone over the boundary of the tetrahedron (apex 9), and that boundary.
inline lacuna::simplicial_complex<int> cone_ball() {
  return facets({{9, 1, 2, 3}, {9, 1, 2, 4}, {9, 1, 3, 4}, {9, 2, 3, 4}});
}

/// The boundary circle of the five-vertex Möbius band (triangles {i, i+1, i+2} mod 5): the
/// edges {i, i+2}, each in one triangle only.
inline std::vector<std::vector<int>> moebius_rim() {
  std::vector<std::vector<int>> fs;
  for (int i = 0; i < 5; ++i) fs.push_back({i, (i + 2) % 5});
  return fs;
}

/// A boundary of the kind's differential in degree f, from a cell of degree f + 1 (homology
/// kinds: its boundary, the cells of A dropped for a pair) or f − 1 (cohomology: its coboundary).
template <class C>
inline lacuna::chain<lacuna::integer> kind_boundary(const C& c, lacuna::certificate_kind kind, const marks_t* a, int f) {
  lacuna::chain<lacuna::integer> b{f, {}};
  if (kind == lacuna::certificate_kind::cohomology) {
    if (f == 0) return b;
    for (std::size_t s = 0; s < lacuna::cell_count(c, f); ++s)
      for (auto&& v : lacuna::boundary(c, f, s))
        if (lacuna::incidence_face(v) == 0) b.terms.push_back({s, lacuna::coefficient_as_integer(v)});
  } else {
    if (f + 1 > lacuna::top_dimension(c)) return b;
    std::size_t cell = 0;
    if (a)
      while (cell < lacuna::cell_count(c, f + 1) && (*a)[static_cast<std::size_t>(f) + 1][cell]) ++cell;
    if (cell >= lacuna::cell_count(c, f + 1)) return b;
    for (auto&& v : lacuna::boundary(c, f + 1, cell))
      if (!a || !(*a)[static_cast<std::size_t>(f)][lacuna::incidence_face(v)])
        b.terms.push_back({lacuna::incidence_face(v), lacuna::coefficient_as_integer(v)});
  }
  b.normalize_terms();
  return b;
}

}  // namespace subcomplex_marks

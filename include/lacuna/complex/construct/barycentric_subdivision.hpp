// lacuna/complex/construct/barycentric_subdivision.hpp — sd X of a simplicial complex.
//
// The vertices of sd X are the simplices of X (in order of dimension, then index), labelled
// "{A,B,C}" from the labels of their vertices; the simplices are the chains
// σ0 ⊂ σ1 ⊂ ... ⊂ σk of simplices of X (Hatcher 2002, §2.1, barycentric subdivision).
// A facet of dimension p of X gives (p+1)! facets of sd X.
#pragma once

#include <lacuna/complex/simplicial_complex.hpp>

#include <algorithm>
#include <cstdint>
#include <numeric>
#include <span>
#include <string>
#include <vector>

namespace lacuna {

/// The barycentric subdivision of X as a simplicial_complex<std::string>; χ(sd X) = χ(X).
template <class L>
simplicial_complex<std::string> barycentric_subdivision(const simplicial_complex<L>& x) {
  using out_t = simplicial_complex<std::string>;
  out_t::builder b;
  std::vector<std::size_t> first;  // first[k]: sd-vertex id of the first k-simplex
  std::size_t g = 0;
  for (int k = 0; k <= x.top_dimension(); ++k) {
    first.push_back(g);
    for (std::size_t i = 0; i < x.cell_count(k); ++i, ++g) {
      std::string s = "{";
      for (auto v : x.vertices(k, i)) {
        if (s.size() > 1) s += ',';
        s += detail::label_to_string(x.label(v));
      }
      s += '}';
      b.vertex(s);
    }
  }
  std::vector<std::uint32_t> perm, prefix, ids;
  for (const auto& [p, i] : x.facets()) {
    const auto vs = x.vertices(p, i);
    perm.assign(vs.begin(), vs.end());  // increasing, so next_permutation visits all orders
    do {
      ids.clear();
      prefix.clear();
      for (std::size_t j = 0; j < perm.size(); ++j) {
        prefix.insert(std::upper_bound(prefix.begin(), prefix.end(), perm[j]), perm[j]);
        const auto idx = x.find(std::span<const std::uint32_t>(prefix));
        ids.push_back(static_cast<std::uint32_t>(first[j] + *idx));
      }
      b.add_facet_ids(ids);
    } while (std::next_permutation(perm.begin(), perm.end()));
  }
  return std::move(b).finalize();
}

}  // namespace lacuna

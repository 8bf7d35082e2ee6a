// lacuna/complex/construct/barycentric_subdivision.hpp — sd X of a simplicial complex.
//
// The vertices of sd X are the simplices of X (in order of dimension, then index), labelled
// "{A,B,C}" from the labels of their vertices; the simplices are the chains
// σ0 ⊂ σ1 ⊂ ... ⊂ σk of simplices of X (Hatcher 2002, §2.1, barycentric subdivision).
// A facet of dimension p of X gives (p+1)! facets of sd X.
//
// The second overload takes any *regular* cell complex (every closed cell a ball attached
// homeomorphically: polyhedral meshes, cubical complexes, Delta-complexes without
// identifications, products of these) and returns the order complex of its face poset, which
// is its barycentric subdivision (Lundell & Weingram, The Topology of CW Complexes, 1969,
// from memory). The face relation is read from the non-zero boundary coefficients. Vertex k, i
// is labelled "{NAME}" with whitespace runs of the name turned into ',' (so a simplicial
// complex gives the same result through either overload); if two labels collide, every vertex
// is labelled "{e<k>_<i>}". Regularity is a precondition, checked by what it implies and can be
// seen cheaply (detail::require_regular, in O(sum over cells of |∂c| |∂ of a face|)): every
// incidence is ±1, an edge has two distinct vertices, and between a cell and a face of its
// face there are exactly two cells (the diamond property of the face poset of a regular
// complex; Björner 1984, from memory). A complex failing it — the one-vertex torus, whose
// edges have boundary v − v — raises lacuna::invalid_complex naming the cell; one that passes
// it and is still not regular is not caught (a ball's boundary that is not a sphere).
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <unordered_set>

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
  using out_t = typename detail::text_labelled_complex<L>::type;
  typename out_t::builder b;
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
  using id = typename simplicial_complex<L>::vertex_id;  // the same type in sd X
  std::vector<id> perm, prefix, ids;
  for (const auto& [p, i] : x.facets()) {
    const auto vs = x.vertices(p, i);
    perm.assign(vs.begin(), vs.end());  // increasing, so next_permutation visits all orders
    do {
      ids.clear();
      prefix.clear();
      for (std::size_t j = 0; j < perm.size(); ++j) {
        prefix.insert(std::upper_bound(prefix.begin(), prefix.end(), perm[j]), perm[j]);
        const auto idx = x.find(std::span<const id>(prefix));
        ids.push_back(static_cast<id>(first[j] + *idx));
      }
      b.add_facet_ids(ids);
    } while (std::next_permutation(perm.begin(), perm.end()));
  }
  return std::move(b).finalize();
}

namespace detail {

/// Throws lacuna::invalid_complex naming the first cell (by dimension, then index) where the
/// face relation of c cannot be that of a regular cell complex (see the top of this header).
template <cell_complex C>
void require_regular(const C& c) {
  const int top = lacuna::top_dimension(c);
  std::vector<std::pair<std::size_t, std::int64_t>> faces;
  std::vector<std::size_t> below;
  for (int k = 1; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      const auto fail = [&](const std::string& why) {
        throw invalid_complex("barycentric_subdivision: the complex is not regular: the " + std::to_string(k) +
                                  "-cell " + std::to_string(i) + " ('" + lacuna::cell_name(c, k, i) + "') " + why,
                              k, i);
      };
      faces.clear();
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient != 0) faces.emplace_back(f.face, f.coefficient);
      }
      std::sort(faces.begin(), faces.end());
      std::size_t o = 0;  // repeated faces add up
      for (std::size_t s = 0; s < faces.size();) {
        std::int64_t sum = 0;
        const std::size_t f = faces[s].first;
        for (; s < faces.size() && faces[s].first == f; ++s) sum += faces[s].second;
        if (sum != 0) faces[o++] = {f, sum};
      }
      faces.resize(o);
      if (faces.empty()) fail("has no faces (its boundary is zero)");
      for (const auto& [f, a] : faces)
        if (a != 1 && a != -1)
          fail("meets the face '" + lacuna::cell_name(c, k - 1, f) + "' with incidence " + std::to_string(a) +
               " (a regular complex has incidences 0 and ±1)");
      if (k == 1) {
        if (faces.size() != 2) fail("has " + std::to_string(faces.size()) + " end vertex instead of two");
        continue;
      }
      below.clear();  // the faces of the faces, once per path: each must be met exactly twice
      for (const auto& [f, a] : faces)
        for (const auto& t : lacuna::boundary(c, k - 1, f))
          if (as_incidence(t).coefficient != 0) below.push_back(incidence_face(t));
      std::sort(below.begin(), below.end());
      for (std::size_t s = 0; s < below.size();) {
        std::size_t e = s;
        while (e < below.size() && below[e] == below[s]) ++e;
        if (e - s != 2)
          fail("and its face of a face '" + lacuna::cell_name(c, k - 2, below[s]) + "' have " + std::to_string(e - s) +
               " cells between them instead of two");
        s = e;
      }
    }
}

}  // namespace detail

/// The barycentric subdivision of a regular cell complex (the order complex of its face
/// poset) as a simplicial_complex<std::string>; χ(sd X) = χ(X). One facet per maximal chain
/// τ_top > face > ... > vertex. Throws lacuna::invalid_complex naming a cell when c is seen
/// not to be regular (see the top of this header).
template <cell_complex C>
simplicial_complex<std::string> barycentric_subdivision(const C& c) {
  detail::require_regular(c);
  using out_t = typename detail::text_labelled_complex<C>::type;
  const int top = lacuna::top_dimension(c);
  std::vector<std::size_t> first;
  std::vector<std::string> labels;
  std::unordered_set<typename out_t::label_type> seen;
  bool unique = true;
  for (int k = 0; k <= top; ++k) {
    first.push_back(labels.size());
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      const std::string name = lacuna::cell_name(c, k, i);
      std::string l = "{";
      bool space = false;
      for (char ch : name) {
        const bool ws = ch == ' ' || ch == '\t' || ch == '\n' || ch == '\r';
        if (ws) {
          space = true;
          continue;
        }
        if (space && l.size() > 1) l += ',';
        space = false;
        l += ch;
      }
      l += '}';
      unique = unique && seen.insert(l).second;
      labels.push_back(std::move(l));
    }
  }
  typename out_t::builder b;
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i)
      b.vertex(unique ? labels[first[static_cast<std::size_t>(k)] + i]
                      : detail::concat("{e", std::to_string(k), "_", std::to_string(i), "}"));
  // covered[k][i]: the cell is a face of some (k+1)-cell, so no maximal chain starts there
  std::vector<std::vector<char>> covered(static_cast<std::size_t>(top >= 0 ? top + 1 : 0));
  for (int k = 0; k <= top; ++k) covered[static_cast<std::size_t>(k)].assign(lacuna::cell_count(c, k), 0);
  for (int k = 1; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i)
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient != 0) covered[static_cast<std::size_t>(k - 1)].at(f.face) = 1;
      }
  std::vector<std::uint32_t> chain;
  // depth-first over descending chains; each path to a cell without faces is a facet
  const auto descend = [&](auto&& self, int k, std::size_t i) -> void {
    chain.push_back(static_cast<std::uint32_t>(first[static_cast<std::size_t>(k)] + i));
    bool any = false;
    if (k > 0)
      for (const auto& t : lacuna::boundary(c, k, i)) {
        const incidence f = as_incidence(t);
        if (f.coefficient == 0) continue;
        any = true;
        self(self, k - 1, f.face);
      }
    if (!any) b.add_facet_ids(chain);
    chain.pop_back();
  };
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i)
      if (!covered[static_cast<std::size_t>(k)][i]) descend(descend, k, i);
  return std::move(b).finalize();
}

}  // namespace lacuna

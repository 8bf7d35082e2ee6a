// lacuna/homology/exact_sequence.hpp — the long exact sequence of a pair (X, A), and a check
// of exactness for any sequence of finitely generated groups given in coordinates.
//
//   0 -> H_N(A) -i-> H_N(X) -j-> H_N(X,A) -∂-> H_{N-1}(A) -> ... -> H_0(X,A) -> 0
//
// i_* is induced by the inclusion, j_* by the identity of X (a cycle read modulo A), ∂_*
// sends a relative cycle z to the class in H_{n-1}(A) of ∂z, which lies in A (Hatcher 2002,
// §2.1, the long exact sequence of a pair). All groups are computed by the engine, with
// generators, and the maps are matrices in those bases (lacuna/homology/induced_map.hpp).
//
// Exactness at G, for F -f-> G -g-> H, each group written Z^r + Z/t_1 + ... in coordinates
// (r free ones, then residues), so that G = Z^{r+s} / L_G with L_G spanned by t_i e_{r+i}:
//   * over a field: g f = 0 and rank f + rank g = dim G;
//   * over a Euclidean domain, by lattices in Z^{r+s}: g is well defined (g(L_G) in L_H),
//     im f in ker g (g f(x) in L_H), and ker g in im f + L_G, where ker g is read off the
//     Smith form of [g | T_H] (T_H the diagonal of H's factors) and membership in a lattice
//     from the Smith form of its generators (U N V = D: m is in it iff (U m)_i is a multiple
//     of d_i for i < rank and zero beyond).
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/induced_map.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// One group of a sequence: R^rank + R/t_1 + ..., with a name for reports.
template <euclidean_domain R>
struct sequence_group {
  /// The group's name in reports, e.g. "H_1(A)".
  std::string name;
  /// The number of free generators.
  std::size_t rank = 0;
  /// The torsion factors.
  std::vector<R> torsion;
  /// The number of coordinates of an element: rank + torsion.size().
  std::size_t coordinates() const { return rank + torsion.size(); }
};

/// G_0 -> G_1 -> ... -> G_m; maps[i] : groups[i] -> groups[i+1], a matrix whose columns are
/// the images of the generators of groups[i] in the coordinates of groups[i+1].
template <euclidean_domain R>
struct exact_sequence {
  /// G_0, ..., G_m.
  std::vector<sequence_group<R>> groups;
  /// maps[i] : G_i -> G_{i+1}.
  std::vector<dense_matrix<R>> maps;
  /// The name of each map, for reports.
  std::vector<std::string> map_names;
};

/// The verdict at one interior group of a sequence.
struct exactness_place {
  std::size_t position = 0;  ///< index of the group in the sequence
  std::string group;         ///< its name
  /// True if the kernel of the outgoing map equals the image of the incoming one.
  bool exact = true;
  std::string message;       ///< empty when exact; else what fails (kernel or image, which map)
};

/// The verdict on a whole sequence: one place per interior group.
struct exactness_report {
  /// True if the sequence is exact at every place.
  bool exact = true;
  /// One verdict per interior group.
  std::vector<exactness_place> places;
  /// The first place that fails, or nullptr.
  const exactness_place* first_failure() const {
    for (const auto& p : places)
      if (!p.exact) return &p;
    return nullptr;
  }
};

namespace detail {
template <class R>
dense_matrix<R> multiply(const dense_matrix<R>& a, const dense_matrix<R>& b) {
  dense_matrix<R> c(a.rows(), b.cols());
  for (std::size_t i = 0; i < a.rows(); ++i)
    for (std::size_t k = 0; k < a.cols(); ++k)
      if (!(a(i, k) == zero<R>()))
        for (std::size_t j = 0; j < b.cols(); ++j) c(i, j) += a(i, k) * b(k, j);
  return c;
}

/// The lattice spanned by the columns of N, ready for membership tests.
template <class R>
struct lattice {
  smith_decomposition<R> s;
  std::size_t dim = 0;
  explicit lattice(const dense_matrix<R>& N) : s(dense_smith_form(N, {.transforms = true})), dim(N.rows()) {}
  bool contains(const std::vector<R>& m) const {
    for (std::size_t i = 0; i < dim; ++i) {
      R u = zero<R>();
      for (std::size_t j = 0; j < dim; ++j) u += s.U(i, j) * m[j];
      if (i < s.rank) {
        if (!(div_rem(u, s.diagonal[i]).remainder == zero<R>())) return false;
      } else if (!(u == zero<R>())) {
        return false;
      }
    }
    return true;
  }
};

/// Generators of L_G as the columns of a matrix: t_i e_{r+i}.
template <class R>
dense_matrix<R> relations(const sequence_group<R>& g) {
  dense_matrix<R> T(g.coordinates(), g.torsion.size());
  for (std::size_t i = 0; i < g.torsion.size(); ++i) T(g.rank + i, i) = g.torsion[i];
  return T;
}

template <class R>
std::vector<R> column(const dense_matrix<R>& m, std::size_t j) {
  std::vector<R> c(m.rows(), zero<R>());
  for (std::size_t i = 0; i < m.rows(); ++i) c[i] = m(i, j);
  return c;
}

template <class R>
dense_matrix<R> hcat(const dense_matrix<R>& a, const dense_matrix<R>& b) {
  dense_matrix<R> c(a.rows(), a.cols() + b.cols());
  for (std::size_t i = 0; i < a.rows(); ++i) {
    for (std::size_t j = 0; j < a.cols(); ++j) c(i, j) = a(i, j);
    for (std::size_t j = 0; j < b.cols(); ++j) c(i, a.cols() + j) = b(i, j);
  }
  return c;
}

/// Exactness at G for F -f-> G -g-> H; empty string when exact.
template <class R>
std::string exactness_at(const sequence_group<R>& F, const sequence_group<R>& G, const sequence_group<R>& H,
                         const dense_matrix<R>& f, const dense_matrix<R>& g, const std::string& fname,
                         const std::string& gname) {
  const std::size_t nF = F.coordinates(), nG = G.coordinates(), nH = H.coordinates();
  if (f.rows() != nG || f.cols() != nF) return "the map " + fname + " has the wrong shape";
  if (g.rows() != nH || g.cols() != nG) return "the map " + gname + " has the wrong shape";
  const dense_matrix<R> gf = multiply(g, f);
  if constexpr (field<R>) {
    (void)F;
    for (std::size_t i = 0; i < gf.rows(); ++i)
      for (std::size_t j = 0; j < gf.cols(); ++j)
        if (!(gf(i, j) == zero<R>())) return "the image of " + fname + " is not in the kernel of " + gname;
    const std::size_t rf = dense_smith_form(f).rank, rg = dense_smith_form(g).rank;
    if (rf + rg != nG)
      return "the kernel of " + gname + " (dimension " + std::to_string(nG - rg) + ") is larger than the image of " +
             fname + " (dimension " + std::to_string(rf) + ")";
    return {};
  } else {
    const lattice<R> LH(relations(H));
    // g well defined on G: the relations of G go into those of H.
    const dense_matrix<R> gT = multiply(g, relations(G));
    for (std::size_t j = 0; j < gT.cols(); ++j)
      if (!LH.contains(column(gT, j))) return "the map " + gname + " is not well defined on the torsion of " + G.name;
    for (std::size_t j = 0; j < gf.cols(); ++j)
      if (!LH.contains(column(gf, j))) return "the image of " + fname + " is not in the kernel of " + gname;
    // ker g: (x, y) with g x + T_H y = 0; the x parts.
    const auto s = dense_smith_form(hcat(g, relations(H)), {.transforms = true});
    const lattice<R> image(hcat(f, relations(G)));
    for (std::size_t j = s.rank; j < s.V.cols(); ++j) {
      std::vector<R> x(nG, zero<R>());
      for (std::size_t i = 0; i < nG; ++i) x[i] = s.V(i, j);
      if (!image.contains(x)) return "the kernel of " + gname + " is larger than the image of " + fname;
    }
    return {};
  }
}
}  // namespace detail

/// Checks exactness at every interior group of the sequence and reports each place.
template <euclidean_domain R>
exactness_report check_exactness(const exact_sequence<R>& seq) {
  if (seq.maps.size() + 1 != seq.groups.size())
    throw std::invalid_argument("lacuna: a sequence of m groups needs m - 1 maps");
  exactness_report r;
  for (std::size_t p = 1; p + 1 < seq.groups.size(); ++p) {
    exactness_place place{p, seq.groups[p].name, true, {}};
    place.message = detail::exactness_at(seq.groups[p - 1], seq.groups[p], seq.groups[p + 1], seq.maps[p - 1],
                                         seq.maps[p], seq.map_names[p - 1], seq.map_names[p]);
    place.exact = place.message.empty();
    if (!place.exact) place.message = "not exact at " + place.group + ": " + place.message;
    r.exact = r.exact && place.exact;
    r.places.push_back(std::move(place));
  }
  return r;
}

/// The long exact sequence of the pair (X, A): the three homology results (with generators)
/// and, for each n, i_*[n] : H_n(A) -> H_n(X), j_*[n] : H_n(X) -> H_n(X, A),
/// connecting[n] : H_n(X, A) -> H_{n-1}(A) (connecting[0] maps to the zero group).
template <euclidean_domain R>
struct pair_sequence {
  included_subcomplex A;  ///< the subcomplex as a cell_list, its inclusion, its selection
  ///@{
  /// The homology of A, of X and of the pair (X, A), with generators.
  homology_result<R> hA, hX, hXA;
  ///@}
  ///@{
  /// The maps i_*, j_* and the connecting homomorphisms, by degree n.
  std::vector<induced_homomorphism<R>> i_star, j_star, connecting;
  ///@}
  /// The top degree N.
  int top = -1;

  /// As one sequence 0 -> H_N(A) -> H_N(X) -> H_N(X,A) -> ... -> H_0(X,A) -> 0.
  exact_sequence<R> sequence() const {
    exact_sequence<R> s;
    auto group = [](const homology_result<R>& h, int n, std::string name) {
      sequence_group<R> g{std::move(name), 0, {}};
      if (n >= 0 && n <= h.top_dimension()) g.rank = h[n].rank, g.torsion = h[n].torsion;
      return g;
    };
    s.groups.push_back({"0", 0, {}});
    for (int n = top; n >= 0; --n) {
      const std::string k = std::to_string(n);
      s.groups.push_back(group(hA, n, "H_" + k + "(A)"));
      s.groups.push_back(group(hX, n, "H_" + k + "(X)"));
      s.groups.push_back(group(hXA, n, "H_" + k + "(X,A)"));
    }
    s.groups.push_back({"0", 0, {}});
    s.maps.push_back(dense_matrix<R>(s.groups[1].coordinates(), 0));
    s.map_names.push_back("0 -> H_" + std::to_string(top) + "(A)");
    for (int n = top; n >= 0; --n) {
      const std::string k = std::to_string(n);
      s.maps.push_back(i_star[static_cast<std::size_t>(n)].matrix);
      s.map_names.push_back("i_* on H_" + k);
      s.maps.push_back(j_star[static_cast<std::size_t>(n)].matrix);
      s.map_names.push_back("j_* on H_" + k);
      s.maps.push_back(connecting[static_cast<std::size_t>(n)].matrix);
      s.map_names.push_back(n > 0 ? "∂_* on H_" + k + "(X,A)" : "H_0(X,A) -> 0");
    }
    return s;
  }
  /// Checks exactness at every place of sequence().
  exactness_report check() const { return check_exactness(sequence()); }
};

/// The long exact sequence of the pair (X, A), A the subcomplex of the cells marked in
/// in_subcomplex[k][i] (closed under faces: else lacuna::invalid_complex naming the cell).
template <euclidean_domain R, cell_complex C>
pair_sequence<R> long_exact_sequence(const C& X, const std::vector<std::vector<bool>>& in_subcomplex,
                                     const R& ring_one = one<R>()) {
  pair_sequence<R> p;
  p.A = make_included_subcomplex(X, in_subcomplex);
  p.top = lacuna::top_dimension(X);
  std::vector<std::vector<bool>> marks(static_cast<std::size_t>(p.top + 1));
  for (int k = 0; k <= p.top; ++k) {
    marks[static_cast<std::size_t>(k)].assign(lacuna::cell_count(X, k), false);
    for (std::size_t i = 0; i < lacuna::cell_count(X, k); ++i) marks[static_cast<std::size_t>(k)][i] = p.A.selection.contains(k, i);
  }
  const homology_options opt{.generators = true};
  p.hA = homology<R>(p.A.complex, opt, sparse_elimination{}, ring_one);
  p.hX = homology<R>(X, opt, sparse_elimination{}, ring_one);
  p.hXA = relative_homology<R>(X, marks, opt, sparse_elimination{}, ring_one);
  for (int n = 0; n <= p.top; ++n) {
    p.i_star.push_back(induced_map(p.A.inclusion, p.hA, p.hX, n));
    p.j_star.push_back(induced_map(identity_map{}, p.hX, p.hXA, n));
    p.connecting.push_back(detail::homomorphism_from_generators(p.hXA, n, p.hA, n - 1, [&](const chain<R>& z) {
      chain<R> b{n - 1, {}};
      for (const auto& t : z.terms)
        for (auto&& v : lacuna::boundary(X, n, t.cell)) {
          const exact_incidence e = as_exact_incidence(v);
          b.terms.push_back({e.face, coefficient_in<R>(e.coefficient, ring_one) * t.coefficient});
        }
      b.normalize_terms();
      chain<R> in_a{n - 1, {}};
      for (const auto& t : b.terms) {
        if (!p.A.selection.contains(n - 1, t.cell))
          throw std::logic_error("lacuna: a relative generator's boundary leaves the subcomplex");
        in_a.terms.push_back({p.A.selection.new_index[static_cast<std::size_t>(n - 1)][t.cell], t.coefficient});
      }
      in_a.normalize_terms();
      return in_a;
    }));
  }
  return p;
}

}  // namespace lacuna

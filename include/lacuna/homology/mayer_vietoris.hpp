// lacuna/homology/mayer_vietoris.hpp — the Mayer–Vietoris sequence of X = A ∪ B, A and B
// subcomplexes of X given by marks, with its maps as matrices in the computed bases.
//
//   ... -> H_n(A∩B) -φ-> H_n(A) ⊕ H_n(B) -ψ-> H_n(X) -∂-> H_{n-1}(A∩B) -> ... -> H_0(X) -> 0
//
// Sign convention (Hatcher 2002, §2.2, the Mayer–Vietoris sequence): φ(x) = (x, −x),
// ψ(a, b) = a + b, and ∂[z] = [∂a] for a cycle z of X written z = a + b with a a chain of A
// (here: the terms of z on cells of A) and b one of B; ∂a = −∂b lies in A∩B. The sequence comes
// from the short exact sequence 0 -> C(A∩B) -> C(A) ⊕ C(B) -> C(X) -> 0 of chain complexes,
// exact because A and B are subcomplexes with A ∪ B = X; it is the unreduced sequence.
//
// Coordinates of H_n(A) ⊕ H_n(B) (sequence_group's layout, free coordinates first): the free
// generators of H_n(A), then those of H_n(B), then the torsion generators of H_n(A), then those
// of H_n(B).
#pragma once

#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/concepts.hpp>

#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// The Mayer–Vietoris sequence of X = A ∪ B: the four homology results (with generators) and,
/// for each n, phi[n] : H_n(A∩B) -> H_n(A) ⊕ H_n(B), psi[n] : H_n(A) ⊕ H_n(B) -> H_n(X),
/// connecting[n] : H_n(X) -> H_{n-1}(A∩B) (connecting[0] maps to the zero group).
template <euclidean_domain R>
struct mayer_vietoris_sequence {
  ///@{
  /// The subcomplexes A, B and C = A ∩ B, each with its inclusion into X.
  included_subcomplex A, B, C;  ///< C = A ∩ B
  ///@}
  ///@{
  /// The homology of A, B, C = A ∩ B and X, with generators.
  homology_result<R> hA, hB, hC, hX;
  ///@}
  ///@{
  /// The maps phi, psi and the connecting homomorphisms, by degree n.
  std::vector<dense_matrix<R>> phi, psi, connecting;
  ///@}
  /// The top degree.
  int top = -1;

  /// The group H_n(A) ⊕ H_n(B) in the coordinates described above.
  sequence_group<R> sum_group(int n) const {
    sequence_group<R> g{"H_" + std::to_string(n) + "(A)+H_" + std::to_string(n) + "(B)", 0, {}};
    for (const auto* h : {&hA, &hB})
      if (n <= h->top_dimension()) {
        g.rank += (*h)[n].rank;
        g.torsion.insert(g.torsion.end(), (*h)[n].torsion.begin(), (*h)[n].torsion.end());
      }
    return g;
  }

  /// As one sequence 0 -> H_N(A∩B) -> H_N(A)⊕H_N(B) -> H_N(X) -> ... -> H_0(X) -> 0.
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
      s.groups.push_back(group(hC, n, "H_" + k + "(A∩B)"));
      s.groups.push_back(sum_group(n));
      s.groups.push_back(group(hX, n, "H_" + k + "(X)"));
    }
    s.groups.push_back({"0", 0, {}});
    s.maps.push_back(dense_matrix<R>(s.groups[1].coordinates(), 0));
    s.map_names.push_back("0 -> H_" + std::to_string(top) + "(A∩B)");
    for (int n = top; n >= 0; --n) {
      const std::string k = std::to_string(n);
      const auto un = static_cast<std::size_t>(n);
      s.maps.push_back(phi[un]);
      s.map_names.push_back("φ on H_" + k);
      s.maps.push_back(psi[un]);
      s.map_names.push_back("ψ on H_" + k);
      s.maps.push_back(connecting[un]);
      s.map_names.push_back(n > 0 ? "∂ on H_" + k + "(X)" : "H_0(X) -> 0");
    }
    return s;
  }
  /// Checks exactness at every place of sequence().
  exactness_report check() const { return check_exactness(sequence()); }
};

namespace detail {
/// A chain of X (indices of X) as one of the subcomplex s (its indices); every cell must be in s.
template <class R>
chain<R> restrict_to(const included_subcomplex& s, const chain<R>& z) {
  chain<R> out{z.dimension, {}};
  for (const auto& t : z.terms) {
    if (!s.selection.contains(z.dimension, t.cell))
      throw std::logic_error("lacuna: Mayer–Vietoris: a chain leaves the subcomplex it should lie in");
    out.terms.push_back({s.selection.new_index[static_cast<std::size_t>(z.dimension)][t.cell], t.coefficient});
  }
  out.normalize_terms();
  return out;
}
}  // namespace detail

/// The Mayer–Vietoris sequence of X = A ∪ B, A and B the subcomplexes of the cells marked in
/// in_a[k][i], in_b[k][i] (each closed under faces, else lacuna::invalid_complex naming the
/// cell). Throws std::invalid_argument naming a cell of X in neither A nor B.
template <euclidean_domain R, cell_complex Cx>
mayer_vietoris_sequence<R> mayer_vietoris(const Cx& X, const std::vector<std::vector<bool>>& in_a,
                                          const std::vector<std::vector<bool>>& in_b, const R& ring_one = one<R>()) {
  auto marked = [](const std::vector<std::vector<bool>>& m, int k, std::size_t i) {
    return static_cast<std::size_t>(k) < m.size() && i < m[static_cast<std::size_t>(k)].size() &&
           m[static_cast<std::size_t>(k)][i];
  };
  mayer_vietoris_sequence<R> mv;
  mv.top = lacuna::top_dimension(X);
  for (int k = 0; k <= mv.top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(X, k); ++i)
      if (!marked(in_a, k, i) && !marked(in_b, k, i))
        throw std::invalid_argument("lacuna: Mayer–Vietoris: the cell '" + lacuna::cell_name(X, k, i) +
                                    "' is in neither A nor B, so X is not A ∪ B");
  mv.A = make_included_subcomplex(X, in_a);
  mv.B = make_included_subcomplex(X, in_b);
  mv.C = make_included_subcomplex(X, [&](int k, std::size_t i) { return marked(in_a, k, i) && marked(in_b, k, i); });
  const homology_options opt{.generators = true};
  mv.hA = homology<R>(mv.A.complex, opt, sparse_elimination{}, ring_one);
  mv.hB = homology<R>(mv.B.complex, opt, sparse_elimination{}, ring_one);
  mv.hC = homology<R>(mv.C.complex, opt, sparse_elimination{}, ring_one);
  mv.hX = homology<R>(X, opt, sparse_elimination{}, ring_one);
  auto coords = [](const homology_result<R>& h, int n) { return detail::coordinate_count(h, n); };
  auto free_of = [](const homology_result<R>& h, int n) { return detail::has_group(h, n) ? h[n].rank : std::size_t{0}; };
  for (int n = 0; n <= mv.top; ++n) {
    const std::size_t rA = free_of(mv.hA, n), rB = free_of(mv.hB, n);
    const std::size_t nA = coords(mv.hA, n), nB = coords(mv.hB, n);
    const std::size_t tA = nA - rA;
    // The position in the sum of coordinate i of H_n(A) and of H_n(B).
    auto posA = [&](std::size_t i) { return i < rA ? i : rA + rB + (i - rA); };
    auto posB = [&](std::size_t i) { return i < rB ? rA + i : rA + rB + tA + (i - rB); };
    // φ: x -> (x, -x).
    const std::size_t nC = coords(mv.hC, n);
    dense_matrix<R> phi(nA + nB, nC);
    for (std::size_t j = 0; j < nC; ++j) {
      const chain<R> x = apply_map(mv.C.inclusion, mv.hC[n].generators[j], ring_one);
      if (nA) {
        const auto a = mv.hA.coordinates(detail::restrict_to(mv.A, x));
        for (std::size_t i = 0; i < nA; ++i) phi(posA(i), j) = a[i];
      }
      if (nB) {
        const auto b = mv.hB.coordinates(detail::restrict_to(mv.B, x));
        for (std::size_t i = 0; i < nB; ++i) phi(posB(i), j) = -b[i];
      }
    }
    mv.phi.push_back(std::move(phi));
    // ψ: (a, b) -> a + b.
    const std::size_t nX = coords(mv.hX, n);
    dense_matrix<R> psi(nX, nA + nB);
    if (nX) {
      for (std::size_t j = 0; j < nA; ++j) {
        const auto y = mv.hX.coordinates(apply_map(mv.A.inclusion, mv.hA[n].generators[j], ring_one));
        for (std::size_t i = 0; i < nX; ++i) psi(i, posA(j)) = y[i];
      }
      for (std::size_t j = 0; j < nB; ++j) {
        const auto y = mv.hX.coordinates(apply_map(mv.B.inclusion, mv.hB[n].generators[j], ring_one));
        for (std::size_t i = 0; i < nX; ++i) psi(i, posB(j)) = y[i];
      }
    }
    mv.psi.push_back(std::move(psi));
    // ∂: [z] -> [∂a], a the part of z on cells of A.
    mv.connecting.push_back(detail::homomorphism_from_generators(mv.hX, n, mv.hC, n - 1, [&](const chain<R>& z) {
      chain<R> b{n - 1, {}};
      for (const auto& t : z.terms) {
        if (!mv.A.selection.contains(n, t.cell)) continue;
        for (auto&& v : lacuna::boundary(X, n, t.cell)) {
          const exact_incidence e = as_exact_incidence(v);
          b.terms.push_back({e.face, coefficient_in<R>(e.coefficient, ring_one) * t.coefficient});
        }
      }
      b.normalize_terms();
      return detail::restrict_to(mv.C, b);
    }).matrix);
  }
  return mv;
}

}  // namespace lacuna

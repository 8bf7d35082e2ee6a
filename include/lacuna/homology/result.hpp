// lacuna/homology/result.hpp — what lacuna::homology returns: one group per degree, with
// generators on request, and the change of basis behind coordinates() and is_boundary().
//
// The basis kept for coordinates(): the elimination log of the route (a chain map from the
// complex to its reduced core, algorithm/elimination_maps.hpp) and, per level, the transforms
// of the core's Smith forms (homology/routes.hpp says how they are made): a cycle is pushed
// through the log onto the core, multiplied by V^-1, and its coordinates read off through U_M
// (detail::level_coordinates).
#pragma once

#include <lacuna/algorithm/elimination_maps.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/indexed_cells.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/options.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <cstdint>
#include <functional>
#include <memory>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <vector>

namespace lacuna {

/// One homology group H_k = R^rank + R/t_1 + ... + R/t_m (t_1 | t_2 | ..., non-units).
template <euclidean_domain R>
struct homology_group {
  /// The degree k.
  int dimension = 0;
  /// The number of free generators (the Betti number, over a field the dimension).
  std::size_t rank = 0;
  /// The torsion factors t_1 | t_2 | ..., non-units (empty over a field).
  std::vector<R> torsion;
  /// With generators: rank free generators first (order 0), then one per torsion factor.
  std::vector<chain<R>> generators;
  std::vector<R> orders;  ///< beside generators: 0 for free ones, the factor for torsion ones
  /// With homology_options::witnesses: one (k+1)-chain per torsion generator, in the order of
  /// the torsion generators, whose boundary is the generator times its order.
  std::vector<chain<R>> bounding_chains;
};

namespace detail {

// What coordinates() needs at one level L of the core. With D_L the boundary out of level L
// and U D_L V = diag its Smith form, the cycles are the columns of V past D_L's rank, and the
// quotient matrix M (rows boundary_rank.. of V^-1 D_{L+1}: the next boundary in that cycle
// basis) has its own Smith form U_M M V_M; a class's coordinates are U_M V^-1 applied to a
// cycle, read modulo the invariant factors of M.
template <class R>
struct level_coordinates {
  indexed_cells core;                       // surviving cells with incidences (local indices)
  indexed_cells isolated;                   // surviving cells without any incidence
  std::size_t boundary_rank = 0;            // rank of D_L
  dense_matrix<R> boundary_v_inverse;       // V^-1 of D_L's Smith form
  dense_matrix<R> quotient_u;               // U_M of M's Smith form
  std::vector<R> quotient_factors;          // invariant factors of M
};

template <class R>
struct homology_basis {
  elimination_log<R> log;
  std::vector<level_coordinates<R>> levels;
  std::vector<std::vector<std::int64_t>> from_original;  // per level, empty: identity
  std::vector<std::size_t> level_sizes;
};

template <class R, class W>
R to_ring(const W& w) {
  if constexpr (std::same_as<R, W>)
    return w;
  else if constexpr (std::same_as<W, checked_int64>)
    return R(w.v);
  else
    static_assert(std::same_as<R, W>, "no conversion of working coefficients");
}

template <class R>
R canonical_residue(const R& w, const R& e) {
  R r = div_rem(w, e).remainder;
  if constexpr (std::totally_ordered<R>) {
    if (r < zero<R>()) r += normalize(e);
  }
  return r;
}

template <class R>
bool ring_is_unit(const R& x) {
  if constexpr (field<R>)
    return !(x == zero<R>());
  else
    return lacuna::is_unit(x);
}

}  // namespace detail

/// The homology (or cohomology) of a complex over R, one group per dimension 0..top.
template <euclidean_domain R>
class homology_result {
 public:
  /// groups[k] is the group of degree k, k = 0..top_dimension().
  std::vector<homology_group<R>> groups;
  /// True for cohomology.
  bool cohomology = false;
  /// True for reduced homology (reduced cohomology is not offered).
  bool reduced = false;
  /// True for the homology of a pair (relative_homology).
  bool relative = false;

  /// The group of degree k; throws std::out_of_range outside 0..top_dimension().
  const homology_group<R>& operator[](int k) const { return groups.at(static_cast<std::size_t>(k)); }
  /// The highest degree, groups.size() - 1.
  int top_dimension() const { return static_cast<int>(groups.size()) - 1; }
  /// The ranks of the groups, by degree.
  std::vector<std::size_t> betti_numbers() const {
    std::vector<std::size_t> b;
    for (const auto& g : groups) b.push_back(g.rank);
    return b;
  }
  /// True when coordinates() can be called (keep_basis or generators was set).
  bool has_basis() const { return basis_ != nullptr; }

  /// The class of a k-cycle of the original complex in the basis of generators: first the
  /// rank free coordinates, then one residue per torsion factor (canonical: in 0..t-1 over
  /// the integers). Precondition: the chain is a cycle (a cocycle, for cohomology); the
  /// overload taking the complex checks it. Without the complex, a non-cycle is caught only
  /// when its image on the reduced complex is not a cycle (std::invalid_argument).
  /// Cost: one pass over the elimination log, and dense products on the core.
  std::vector<R> coordinates(const chain<R>& cycle) const {
    if (!basis_) throw std::logic_error("lacuna: homology computed without keep_basis or generators");
    if (project_) return coordinates_on_levels(project_(cycle));
    return coordinates_on_levels(cycle);
  }
  /// True when the cycle is a boundary: all its coordinates vanish (precondition as above).
  bool is_boundary(const chain<R>& cycle) const {
    for (const auto& x : coordinates(cycle))
      if (!(x == zero<R>())) return false;
    return true;
  }

  /// coordinates(cycle), after checking on `complex` (the one this result was computed from)
  /// that the chain is a cycle (for cohomology: a cocycle; for a pair: a relative cycle).
  /// Throws std::invalid_argument otherwise. Extra cost: one pass over the boundaries.
  template <cell_complex C>
  std::vector<R> coordinates(const C& complex, const chain<R>& cycle) const {
    check_cycle(complex, cycle);
    return coordinates(cycle);
  }
  /// is_boundary(cycle), after checking on `complex` that the chain is a cycle, as coordinates(complex, cycle) does.
  template <cell_complex C>
  bool is_boundary(const C& complex, const chain<R>& cycle) const {
    check_cycle(complex, cycle);
    return is_boundary(cycle);
  }

  std::shared_ptr<detail::homology_basis<R>> basis_;  ///< internal
  int level_offset_ = 0;                               ///< internal: level = dim - offset (or top - dim)
  /// internal: the top dimension that levels are numbered from.
  int top_ = -1;
  /// internal: with a Morse pre-reduction, the chain map from the original complex to the
  /// complex the basis belongs to.
  std::function<chain<R>(const chain<R>&)> project_;

 private:
  std::vector<R> coordinates_on_levels(const chain<R>& cycle) const {
    const int L = level_of(cycle.dimension);
    if (L < 0 || L >= static_cast<int>(basis_->levels.size()))
      throw std::invalid_argument("lacuna: no cells of dimension " + std::to_string(cycle.dimension));
    level_chain<R> lc;
    for (const auto& t : cycle.terms) {
      std::int64_t li = static_cast<std::int64_t>(t.cell);
      if (!basis_->from_original[static_cast<std::size_t>(L)].empty()) {
        if (t.cell >= basis_->from_original[static_cast<std::size_t>(L)].size()) continue;
        li = basis_->from_original[static_cast<std::size_t>(L)][t.cell];
        if (li < 0) continue;  // a cell of the subcomplex: zero in the quotient
      }
      if (static_cast<std::size_t>(li) >= basis_->level_sizes[static_cast<std::size_t>(L)])
        throw std::invalid_argument("lacuna: a chain names a cell that does not exist");
      lc.push_back({static_cast<std::uint32_t>(li), t.coefficient});
    }
    const level_chain<R> red = push_chain(basis_->log, L, lc);
    const auto& b = basis_->levels[static_cast<std::size_t>(L)];
    std::vector<R> zc(b.core.size(), zero<R>());
    std::vector<R> out;
    std::vector<R> iso(b.isolated.size(), zero<R>());
    for (const auto& e : red) {
      if (b.core.position[e.index] >= 0)
        zc[static_cast<std::size_t>(b.core.position[e.index])] += e.value;
      else if (b.isolated.position[e.index] >= 0)
        iso[static_cast<std::size_t>(b.isolated.position[e.index])] += e.value;
      else
        throw std::logic_error("lacuna: a pushed chain meets an eliminated cell");
    }
    const std::size_t n = b.core.size();
    std::vector<R> y(n, zero<R>());
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = 0; j < n; ++j)
        if (!(zc[j] == zero<R>())) y[i] += b.boundary_v_inverse(i, j) * zc[j];
    for (std::size_t i = 0; i < b.boundary_rank; ++i)
      if (!(y[i] == zero<R>())) throw std::invalid_argument("lacuna: the chain is not a cycle");
    const std::size_t kdim = n - b.boundary_rank;
    std::vector<R> w(kdim, zero<R>());
    for (std::size_t i = 0; i < kdim; ++i)
      for (std::size_t j = 0; j < kdim; ++j)
        if (!(y[b.boundary_rank + j] == zero<R>())) w[i] += b.quotient_u(i, j) * y[b.boundary_rank + j];
    out = iso;
    for (std::size_t i = b.quotient_factors.size(); i < kdim; ++i) out.push_back(w[i]);
    for (std::size_t i = 0; i < b.quotient_factors.size(); ++i)
      if (!detail::ring_is_unit(b.quotient_factors[i])) out.push_back(detail::canonical_residue(w[i], b.quotient_factors[i]));
    return out;
  }
  int level_of(int dim) const { return cohomology ? top_ - dim : dim - level_offset_; }
  bool excluded(int dim, std::size_t cell) const {
    const int L = level_of(dim);
    if (!basis_ || L < 0 || L >= static_cast<int>(basis_->from_original.size())) return false;
    const auto& f = basis_->from_original[static_cast<std::size_t>(L)];
    return !f.empty() && cell < f.size() && f[cell] < 0;
  }
  template <cell_complex C>
  void check_cycle(const C& c, const chain<R>& z) const {
    const int k = z.dimension;
    const int top = lacuna::top_dimension(c);
    if (k < 0 || k > top) throw std::invalid_argument("lacuna: no cells of dimension " + std::to_string(k));
    const R ring_one = ring_one_;
    std::unordered_map<std::size_t, R> acc;
    if (!cohomology) {
      if (k == 0 && !reduced) return;  // every 0-chain is a cycle
      for (const auto& t : z.terms) {
        if (t.cell >= lacuna::cell_count(c, k)) throw std::invalid_argument("lacuna: a chain names a cell that does not exist");
        if (excluded(k, t.cell)) continue;
        if (k == 0) {
          acc[0] += t.coefficient;  // the augmentation
          continue;
        }
        for (auto&& v : lacuna::boundary(c, k, t.cell)) {
          const incidence inc = as_incidence(v);
          if (excluded(k - 1, inc.face)) continue;
          acc[inc.face] += from_integer<R>(inc.coefficient) * ring_one * t.coefficient;
        }
      }
    } else {
      if (k == top) return;  // every top cochain is a cocycle
      std::unordered_map<std::size_t, R> phi;
      for (const auto& t : z.terms) {
        if (t.cell >= lacuna::cell_count(c, k)) throw std::invalid_argument("lacuna: a chain names a cell that does not exist");
        phi[t.cell] += t.coefficient;
      }
      for (std::size_t s = 0; s < lacuna::cell_count(c, k + 1); ++s)
        for (auto&& v : lacuna::boundary(c, k + 1, s)) {
          const incidence inc = as_incidence(v);
          auto it = phi.find(inc.face);
          if (it != phi.end()) acc[s] += from_integer<R>(inc.coefficient) * ring_one * it->second;
        }
    }
    for (const auto& [cell, v] : acc)
      if (!(v == zero<R>()))
        throw std::invalid_argument(cohomology ? "lacuna: the cochain is not a cocycle" : "lacuna: the chain is not a cycle");
  }

 public:
  R ring_one_ = one<R>();  ///< internal: the one of R the result was computed with
};

}  // namespace lacuna

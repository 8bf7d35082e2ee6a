// lacuna/persistence/reduction.hpp — the persistence reductions over a field, as policy
// values, the concept they model, and the step that turns reduced matrices into diagrams.
//
// Variants (passed to lacuna::persistence; each a tiny type with a member template reduce):
//   standard_persistence{}    the column reduction of Edelsbrunner, Letscher & Zomorodian
//                             (2002), for any field as in Zomorodian & Carlsson (2005): every
//                             boundary matrix in filtration order is reduced left to right
//                             until the lowest non-zeros of its columns are distinct; a pivot
//                             (row sigma, column tau) pairs the class born with sigma with
//                             its death at tau;
//   twist_persistence{}       the same with clearing (Chen & Kerber 2011, "twist"): matrices
//                             from the top dimension down, and a column whose cell is already
//                             the lowest row of a pivot above is zero without work;
//   cohomology_persistence{}  the coboundary matrices in reverse filtration order, reduced
//                             from dimension 0 up with clearing (de Silva, Morozov &
//                             Vejdemo-Johansson 2011); the same pairs (their Proposition 2.4).
//                             With representatives, the cycles come from a twist reduction run
//                             beside it (cohomology gives cocycles, not cycles);
//   cubical_morse_persistence{} (lacuna/persistence/cubical_reduction.hpp) for cubical
//                             filtrations: pairs cells before the algebra.
// The default, automatic_persistence{} (lacuna/persistence/persistence.hpp), is
// cubical_morse_persistence for cubical filtrations and twist_persistence otherwise.
// All of them reduce with lacuna::reduce_columns / reduce_chain_complex
// (lacuna/algorithm/field_reduction.hpp): bit-packed columns over Z/2, raw 64-bit residues
// over mod_p<P> and mod_p_dynamic, the field's own operators otherwise (lacuna::rational).
//
// A variant of one's own is any type P with
//     template <filtration F, field R>
//     persistence_result<filtration_value_t<F>, R, filtration_order_t<F>>
//     reduce(const F&, const persistence_options&, const R& unit) const;
// (the concept persistence_reduction checks it); the building blocks filter_boundaries
// (lacuna/persistence/filtered_boundary.hpp) and persistence_from_pivots below let it change
// one step and keep the rest.
#pragma once

#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/filtered_boundary.hpp>
#include <lacuna/persistence/filtration.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <concepts>
#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace lacuna {

/// Options of lacuna::persistence and of every reduction variant.
struct persistence_options {
  /// Diagrams of dimensions 0..max_dimension (the cells of dimension max_dimension + 1 are
  /// read too, to kill classes). -1, or more than the top dimension: every dimension.
  int max_dimension = -1;
  /// One representative cycle per pair (persistence_result::representatives).
  bool representatives = false;
  /// Threads where a variant splits its work (the cubical one: 2); results do not depend on it.
  unsigned threads = 1;
  /// A stop request and a progress callback (lacuna/chain/run_control.hpp): a stopped
  /// computation throws lacuna::computation_stopped and returns nothing. Phases reported:
  /// "ordering the cells", "reducing the boundary matrices" (units: cells and columns), and
  /// for the cubical variant "pairing cubical cells", "Morse boundaries".
  run_control control{};
};

/// P is a persistence reduction variant for filtrations F over the field R: p.reduce(f,
/// options, ring_one) computes the persistence of f (ring_one: the one of R, for mod_p_dynamic).
template <class P, class F, class R>
concept persistence_reduction = filtration<F> && field<R> &&
    requires(const P& p, const F& f, const persistence_options& o, const R& ring_one) {
      { p.reduce(f, o, ring_one) } -> std::same_as<persistence_result<filtration_value_t<F>, R, filtration_order_t<F>>>;
    };

/// The dimensions a computation reads: diagrams 0..D, cells 0..T (T = D + 1 where the
/// filtration has such cells). D = -1 for the empty filtration.
struct persistence_range {
  /// The top dimension D of the diagrams.
  int diagram_top = -1;
  /// The top dimension T of the cells read.
  int cell_top = -1;
};

/// The range for a filtration of top dimension `top` and the option max_dimension.
inline persistence_range persistence_range_of(int top, int max_dimension) {
  persistence_range r;
  r.diagram_top = (max_dimension < 0 || max_dimension > top) ? top : max_dimension;
  r.cell_top = r.diagram_top < top ? r.diagram_top + 1 : top;
  return r;
}

namespace detail {

template <class R>
chain<R> chain_of_positions(int k, const sparse_vector<R>& v, const std::vector<std::uint32_t>& order) {
  chain<R> c{k, {}};
  c.terms.reserve(v.size());
  for (const auto& e : v) c.terms.push_back({order[e.index], e.value});
  std::sort(c.terms.begin(), c.terms.end(), [](const auto& a, const auto& b) { return a.cell < b.cell; });
  return c;
}

}  // namespace detail

/// Diagrams from reduced boundary matrices. `reduced[k - 1]` is the reduction of
/// fb.matrices[k] for k = 1..fb.top_dimension() (fewer: the dimensions above are not paired),
/// with pivots (lowest row, column) in positions. A pivot of matrix k + 1 is a finite pair of
/// dimension k; a k-cell that is neither a pivot row of matrix k + 1 nor a pivot column of
/// matrix k is essential. With `representatives`, each reduction must hold its image (the
/// reduced pivot columns: finite classes) and its kernel (one cycle per non-pivot column:
/// essential classes), as reduce_columns gives them with {.kernel = true, .image = true}.
/// Diagrams of dimensions 0..diagram_top. The pairs come out sorted (diagram.hpp).
template <class V, field R, class Order>
persistence_result<V, R, Order> persistence_from_pivots(const filtered_boundary<V, R>& fb,
                                                        const std::vector<field_reduction_result<R>>& reduced,
                                                        int diagram_top, const Order& order, bool representatives,
                                                        const R& ring_one = one<R>()) {
  persistence_result<V, R, Order> out;
  out.order = order;
  if (diagram_top > fb.top_dimension()) diagram_top = fb.top_dimension();
  const auto nd = static_cast<std::size_t>(diagram_top + 1);
  out.diagrams.resize(nd);
  if (representatives) out.representatives.resize(nd);
  for (std::size_t k = 0; k < nd; ++k) {
    auto& d = out.diagrams[k];
    d.dimension = static_cast<int>(k);
    d.order = order;
    const std::size_t n = fb.order[k].size();
    std::vector<char> paired(n, 0);
    // finite pairs: pivots of matrix k + 1
    if (k < reduced.size()) {
      const auto& red = reduced[k];
      for (std::size_t t = 0; t < red.pivots.size(); ++t) {
        const auto [row, col] = red.pivots[t];
        paired[row] = 1;
        const std::uint32_t birth = fb.order[k][row], death = fb.order[k + 1][col];
        d.pairs.push_back({fb.values[k][birth], fb.values[k + 1][death], birth, death});
        if (representatives) out.representatives[k].push_back(detail::chain_of_positions(static_cast<int>(k), red.image.at(t), fb.order[k]));
      }
    }
    // essential classes: neither killed (above) nor killing (below)
    std::vector<char> kills(n, 0);
    if (k >= 1 && k - 1 < reduced.size())
      for (const auto& pv : reduced[k - 1].pivots) kills[pv.column] = 1;
    std::size_t kernel_index = 0;  // the kernel vectors of matrix k follow its non-pivot columns
    for (std::uint32_t p = 0; p < n; ++p) {
      if (kills[p]) continue;
      const std::size_t this_kernel = kernel_index++;
      if (paired[p]) continue;
      const std::uint32_t cell = fb.order[k][p];
      d.pairs.push_back({fb.values[k][cell], std::nullopt, cell, no_cell});
      if (representatives) {
        if (k == 0)
          out.representatives[k].push_back(chain<R>{0, {{cell, ring_one}}});
        else
          out.representatives[k].push_back(
              detail::chain_of_positions(static_cast<int>(k), reduced[k - 1].kernel.at(this_kernel), fb.order[k]));
      }
    }
  }
  detail::sort_pairs(out);
  return out;
}

namespace detail {

/// The matrices 1..T of a filtered boundary, moved out (reduce_chain_complex takes a vector).
template <class V, class R>
std::vector<sparse_matrix<R>> take_matrices(filtered_boundary<V, R>& fb) {
  std::vector<sparse_matrix<R>> m;
  for (std::size_t k = 1; k < fb.matrices.size(); ++k) m.push_back(std::move(fb.matrices[k]));
  fb.matrices.resize(std::min<std::size_t>(fb.matrices.size(), 1));
  return m;
}

inline field_reduction_options reduction_options_for(const persistence_options& o) {
  return {.kernel = o.representatives, .image = o.representatives, .control = &o.control,
          .phase = "reducing the boundary matrices"};
}

template <class R>
void check_unit(const R& ring_one) {
  if (ring_one == zero<R>()) throw std::invalid_argument("lacuna::persistence: the unit of the field is zero");
}

/// Twist (clearing) on a prepared filtered boundary; shared by the variants that fall back
/// to it.
template <filtration F, field R>
persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> twist_on(
    const F& f, filtered_boundary<filtration_value_t<F>, R> fb, int diagram_top, const persistence_options& o,
    const R& ring_one) {
  auto matrices = take_matrices(fb);
  auto reduced = reduce_chain_complex(matrices, reduction_options_for(o));
  return persistence_from_pivots(fb, reduced, diagram_top, lacuna::value_order(f), o.representatives, ring_one);
}

}  // namespace detail

/// The column reduction of every boundary matrix on its own (Edelsbrunner, Letscher &
/// Zomorodian 2002; Zomorodian & Carlsson 2005): the reference variant.
struct standard_persistence {
  /// The persistence of f over the field of `ring_one`, with options o (the persistence_reduction interface).
  template <filtration F, field R>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& ring_one) const {
    detail::check_unit(ring_one);
    const auto range = persistence_range_of(lacuna::top_dimension(f), o.max_dimension);
    auto fb = filter_boundaries<R>(f, range.cell_top, ring_one, &o.control);
    std::vector<field_reduction_result<R>> reduced;
    for (std::size_t k = 1; k < fb.matrices.size(); ++k) {
      reduced.push_back(reduce_columns(fb.matrices[k], detail::reduction_options_for(o)));
      fb.matrices[k] = sparse_matrix<R>();
    }
    return persistence_from_pivots(fb, reduced, range.diagram_top, lacuna::value_order(f), o.representatives, ring_one);
  }
};

/// The column reduction with clearing, top dimension first (Chen & Kerber 2011).
struct twist_persistence {
  /// The persistence of f over the field of `ring_one`, with options o (the persistence_reduction interface).
  template <filtration F, field R>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& ring_one) const {
    detail::check_unit(ring_one);
    const auto range = persistence_range_of(lacuna::top_dimension(f), o.max_dimension);
    return detail::twist_on(f, filter_boundaries<R>(f, range.cell_top, ring_one, &o.control), range.diagram_top, o, ring_one);
  }
};

/// The coboundary reduction with clearing, dimension 0 first (de Silva, Morozov &
/// Vejdemo-Johansson 2011). Representatives, when asked for, come from a twist reduction.
struct cohomology_persistence {
  /// The persistence of f over the field of `ring_one`, with options o (the persistence_reduction interface).
  template <filtration F, field R>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& ring_one) const {
    detail::check_unit(ring_one);
    const auto range = persistence_range_of(lacuna::top_dimension(f), o.max_dimension);
    auto fb = filter_boundaries<R>(f, range.cell_top, ring_one, &o.control);
    if (o.representatives) return detail::twist_on(f, std::move(fb), range.diagram_top, o, ring_one);
    // Coboundary matrix of dimension k: the anti-transpose of boundary matrix k + 1 —
    // columns the k-cells from the last to enter to the first, rows the (k+1)-cells likewise.
    const int T = fb.top_dimension();
    std::vector<sparse_matrix<R>> co;  // co[i] is the coboundary of dimension T - 1 - i
    for (int k = T - 1; k >= 0; --k) {
      const auto& m = fb.matrices[static_cast<std::size_t>(k + 1)];
      const std::size_t nk = m.rows, nk1 = m.cols;
      sparse_matrix<R> a(nk1, nk);
      for (std::size_t col = 0; col < nk1; ++col)
        for (const auto& e : m.columns[col])
          a.columns[nk - 1 - e.index].push_back({static_cast<std::uint32_t>(nk1 - 1 - col), e.value});
      for (auto& c : a.columns) std::reverse(c.begin(), c.end());  // rows increasing
      fb.matrices[static_cast<std::size_t>(k + 1)] = sparse_matrix<R>();
      co.push_back(std::move(a));
    }
    field_reduction_options ro{.control = &o.control, .phase = "reducing the coboundary matrices"};
    auto red = reduce_chain_complex(co, ro);
    // Back to homology coordinates: pivot (row a, column b) of coboundary k pairs the k-cell
    // at position n_k - 1 - b with the (k+1)-cell at position n_{k+1} - 1 - a.
    std::vector<field_reduction_result<R>> reduced(static_cast<std::size_t>(std::max(T, 0)));
    for (int k = 0; k < T; ++k) {
      const auto& r = red[static_cast<std::size_t>(T - 1 - k)];
      auto& h = reduced[static_cast<std::size_t>(k)];
      for (const auto& pv : r.pivots)
        h.pivots.push_back({static_cast<std::uint32_t>(r.cols - 1 - pv.column), static_cast<std::uint32_t>(r.rows - 1 - pv.row)});
      h.rank = h.pivots.size();
    }
    return persistence_from_pivots(fb, reduced, range.diagram_top, lacuna::value_order(f), false, ring_one);
  }
};

}  // namespace lacuna

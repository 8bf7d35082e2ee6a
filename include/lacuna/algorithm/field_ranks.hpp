// lacuna/algorithm/field_ranks.hpp — the ranks of the boundary maps of a chain complex over a
// field, by column reduction with clearing, and the Betti numbers they give.
//
// The method: every boundary matrix ∂_L of the complex (level L to level L-1, restricted to
// the cells still alive after a pre-reduction) is reduced by the column reduction of
// lacuna/algorithm/field_reduction.hpp (bit-packed over Z/2, raw 64-bit residues over Z/p).
// Clearing (Chen & Kerber 2011) skips every column known to reduce to zero: a reduced
// column with its low at j is a cycle e_j + (earlier rows), so column j of the next matrix
// is a combination of earlier columns. Two directions, both exact:
//   reduction_direction::coboundary  the default: the transposes ∂_L^T (coboundary matrices)
//       from level 1 up, a column of ∂_{L+1}^T cleared by the pivots of ∂_L^T — the
//       cohomology reduction with clearing of de Silva, Morozov & Vejdemo-Johansson (2011),
//       used without a filtration. On complexes whose cells have many cofaces and few faces
//       (matching and chessboard complexes, where the top dimension holds most cells) most
//       columns of the large matrices are cleared, and the columns that are reduced stay
//       short; measured in docs/performance.md ("Homology over fields through the column
//       reductions") against the other direction.
//   reduction_direction::boundary    the boundary matrices from the top level down, a column
//       of ∂_L cleared by the pivots of ∂_{L+1} (the persistence reduction's order).
// How each number is proved: a reduced matrix has distinct lows, so its non-zero columns
// are independent and rank ∂_L is their count (row and column rank agree, so the rank of
// ∂_L^T is that of ∂_L); the cleared columns are combinations of the others, as above. Over
// a field, dim H_L = n_L − rank ∂_L − rank ∂_{L+1} (rank–nullity), n_L the alive cells.
// Nothing is sampled or probabilistic.
#pragma once

#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/indexed_cells.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/z2.hpp>

#include <algorithm>
#include <concepts>
#include <cstdint>
#include <vector>

namespace lacuna {

/// Which matrices boundary_ranks reduces (see the header comment).
enum class reduction_direction {
  /// The default: coboundary when the top level holds more cells than the bottom one (the
  /// empty cell of an augmented complex not counted), boundary otherwise. Measured
  /// (docs/performance.md): matching and chessboard complexes, whose top dimension holds
  /// most cells, run 1.3-20x faster by coboundaries; a coin-flip volume, with about twice as
  /// many vertices as cubes, 9-13x slower by coboundaries than by boundaries.
  automatic,
  coboundary,  ///< ∂_L^T from level 1 up, clearing by the level below
  boundary,    ///< ∂_L from the top level down, clearing by the level above
};

/// Options of boundary_ranks and field_betti_numbers.
struct field_ranks_options {
  /// Reduce coboundaries or boundaries (automatic: chosen from the shape of the complex).
  reduction_direction direction = reduction_direction::automatic;
  /// Number the cells of every level backwards (the low of a column is then its entry of
  /// smallest original index). The ranks do not change; the fill-in does, either way:
  /// measured 1.3-3x faster on chessboard complexes and M(K_12), 4x slower on M(K_13)
  /// (docs/performance.md), so the default keeps the complex's own order.
  bool reversed = false;
  /// A stop request and a progress callback (phase "reducing columns over a field", units:
  /// columns of one matrix); may be null. A stopped reduction throws computation_stopped.
  const run_control* control = nullptr;
};

/// F has a fast column reduction (bit_packed_z2 or word_mod_p): the fields the homology
/// route of field_betti_numbers is taken for. Other fields (the rationals, whose entries
/// would grow in a column reduction) keep the elimination and Smith-form route.
template <class F>
inline constexpr bool has_fast_column_reduction = std::same_as<F, z2> || detail::is_word_field<F>;

namespace detail::field_ranks {

/// Alive cells of a level, and the position of each local index among them (-1: eliminated).
template <class F>
indexed_cells alive_at(const elimination_workspace<F>& rc, int L, bool reversed) {
  indexed_cells a(rc.size(L));
  for (std::uint32_t i = 0; i < rc.size(L); ++i)
    if (rc.alive(L, i)) a.add(i);
  if (reversed) a.reverse();
  return a;
}

/// ∂_L on the alive cells (rows: level L-1, columns: level L), or its transpose. Columns come
/// out sorted: boundaries are sorted by face and positions keep the order of local indices.
template <class F>
sparse_matrix<F> boundary_matrix(const elimination_workspace<F>& rc, int L, const indexed_cells& lower,
                                 const indexed_cells& upper, bool transpose) {
  const std::size_t nr = lower.cells.size(), nc = upper.cells.size();
  if (!transpose) {
    sparse_matrix<F> m(nr, nc);
    for (std::size_t j = 0; j < nc; ++j) {
      auto& col = m.columns[j];
      for (const auto& e : rc.boundary(L, upper.cells[j])) {
        if (e.value == zero<F>()) continue;
        col.push_back({static_cast<std::uint32_t>(lower.position[e.index]), e.value});
      }
      std::sort(col.begin(), col.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
    }
    return m;
  }
  sparse_matrix<F> m(nc, nr);
  std::vector<std::size_t> count(nr, 0);
  for (std::size_t j = 0; j < nc; ++j)
    for (const auto& e : rc.boundary(L, upper.cells[j]))
      if (!(e.value == zero<F>())) ++count[static_cast<std::size_t>(lower.position[e.index])];
  for (std::size_t i = 0; i < nr; ++i) m.columns[i].reserve(count[i]);
  // Walking the upper cells in order appends rows in increasing order: columns come out sorted.
  for (std::size_t j = 0; j < nc; ++j)
    for (const auto& e : rc.boundary(L, upper.cells[j]))
      if (!(e.value == zero<F>()))
        m.columns[static_cast<std::size_t>(lower.position[e.index])].push_back({static_cast<std::uint32_t>(j), e.value});
  return m;
}

}  // namespace detail::field_ranks

/// The rank of every boundary map of rc over F (F models field), restricted to the alive
/// cells: ranks[L] = rank ∂_L for L = 1..levels()-1, ranks[0] = 0. Algorithm is a
/// field-reduction policy (lacuna/algorithm/field_reduction.hpp) that applies to F.
/// Precondition: rc is a chain complex over F (∂∂ = 0; clearing relies on it).
/// Memory: one boundary matrix (two, with its transpose built) and the pivots of the one
/// before at a time. Cost: that of reduce_columns on the columns that are not cleared.
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
std::vector<std::size_t> boundary_ranks(const elimination_workspace<F>& rc, field_ranks_options options = {},
                                        const Algorithm& algorithm = {}) {
  const int nl = rc.levels();
  std::vector<std::size_t> ranks(static_cast<std::size_t>(nl > 0 ? nl : 0), 0);
  if (nl < 2) return ranks;
  field_reduction_options fo{.control = options.control, .phase = "reducing columns over a field"};
  field_reduction_result<F> previous;
  bool have_previous = false;
  std::vector<indexed_cells> alive(static_cast<std::size_t>(nl));
  for (int L = 0; L < nl; ++L) alive[static_cast<std::size_t>(L)] = detail::field_ranks::alive_at(rc, L, options.reversed);
  bool by_coboundary = options.direction == reduction_direction::coboundary;
  if (options.direction == reduction_direction::automatic) {
    const int bottom = rc.dimension_of_level(0) == -1 ? 1 : 0;  // the empty cell of reduced homology
    by_coboundary = alive[static_cast<std::size_t>(nl - 1)].cells.size() > alive[static_cast<std::size_t>(bottom)].cells.size();
  }
  for (int t = 0; t < nl - 1; ++t) {
    const int L = by_coboundary ? t + 1 : nl - 1 - t;
    const auto A = detail::field_ranks::boundary_matrix(rc, L, alive[static_cast<std::size_t>(L - 1)],
                                                        alive[static_cast<std::size_t>(L)], by_coboundary);
    field_reduction_result<F> r =
        have_previous ? reduce_columns_after(A, previous, fo, algorithm) : reduce_columns(A, fo, algorithm);
    ranks[static_cast<std::size_t>(L)] = r.rank;
    previous = std::move(r);
    have_previous = true;
  }
  return ranks;
}

/// The Betti numbers over F of the chain complex rc, one per level: first an optional
/// pre-reduction (`pre`: eliminate_unit_pivots with these options, which changes rc; null:
/// none), then boundary_ranks, then dim H_L = n_L − rank ∂_L − rank ∂_{L+1} over the alive
/// cells. F models field; the pre-reduction keeps the homology (Kaczynski, Mrozek &
/// Ślusarek 1998), so the numbers are those of the complex rc was built from.
template <field F, class Algorithm = automatic_reduction>
  requires field_reduction_algorithm_for<Algorithm, F>
std::vector<std::size_t> field_betti_numbers(elimination_workspace<F>& rc, const elimination_options* pre,
                                             field_ranks_options options = {}, const Algorithm& algorithm = {}) {
  if (pre) {
    elimination_options e = *pre;
    e.record = false;
    e.control = options.control;
    eliminate_unit_pivots<F>(rc, e, nullptr);
  }
  const auto ranks = boundary_ranks(rc, options, algorithm);
  const int nl = rc.levels();
  std::vector<std::size_t> betti(static_cast<std::size_t>(nl > 0 ? nl : 0), 0);
  for (int L = 0; L < nl; ++L) {
    std::size_t n = 0;
    for (std::uint32_t i = 0; i < rc.size(L); ++i) if (rc.alive(L, i)) ++n;
    betti[static_cast<std::size_t>(L)] = n - ranks[static_cast<std::size_t>(L)] -
                                         (L + 1 < nl ? ranks[static_cast<std::size_t>(L + 1)] : 0);
  }
  return betti;
}

}  // namespace lacuna

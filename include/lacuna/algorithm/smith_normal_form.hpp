// lacuna/algorithm/smith_normal_form.hpp — invariant factors of a sparse matrix over a
// Euclidean domain, by one of two variants chosen as a policy value:
//   dense_elimination{}   the small-matrix reference (lacuna/algorithm/dense_smith.hpp);
//   sparse_elimination{}  unit pivots first, fill-reducing (zero-fill singletons, then the
//                         least Markowitz count), through eliminate_unit_pivots; then the
//                         non-unit core (over the integers first by
//                         modular_smith_invariants when its proofs go through,
//                         modular_smith.hpp), else by dense_smith_form, whose least-size pivoting
//                         and Euclidean reduction keep entries small (Havas, Holt & Rees
//                         1993) and whose integers widen instead of overflowing. This is
//                         the scheme of Dumas, Heckenbach, Saunders & Welker (2003) for
//                         boundary matrices: almost every pivot is a unit, the core is tiny.
// Both give identical invariants (tests/homology and tests/reference check it against FLINT).
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/algorithm/stages.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <vector>

namespace lacuna {

/// The reduction that runs before the algebra, a policy value of sparse_elimination. All of
/// them give the same groups (all_variants() of tests/homology/support.hpp, used by textbook.cpp and random_variants.long.cpp); they differ in speed, memory
/// and the shape of the generators (benchmarks/scale.cpp, BM_volume_variants, compares them).
enum class pre_reduction {
  /// The default: coreductions and collapses as `elimination` says (Mrozek & Batko 2009).
  coreductions_and_collapses,
  /// None: unit pivots chosen by Markowitz count only (no coreductions, collapses, set-aside).
  none,
  /// Collapses of free faces only (a face with a single coface and a unit incidence).
  collapses,
  /// Coreductions only (a cell with a single face and a unit incidence), with set-aside.
  coreductions,
  /// A discrete Morse matching first (Forman 1998): the algebra runs on the Morse complex,
  /// whose boundary comes from gradient paths (Sköldberg 2006), and generators are mapped
  /// back through its chain maps. Cubical complexes of images and volumes (dimension <= 4)
  /// use the implicit lower-star matching of lacuna/algorithm/cubical_morse.hpp, every other
  /// complex the coreduction matching of lacuna/algorithm/morse_reduction.hpp. Cohomology
  /// with generators and relative homology run without it (same groups); a Morse incidence
  /// beyond 64 bits also falls back to the run without it.
  morse,
};

/// The variant that eliminates unit pivots sparsely, then finishes a dense core (default).
/// Its elimination options apply to homology; for a single matrix, set-aside does not
/// apply (a matrix has no cells to set aside) and is switched off. `reduction` other than
/// the default overrides the three switches coreductions, collapses and set_aside.
struct sparse_elimination {
  /// The options of the sparse unit elimination.
  elimination_options elimination{};
  /// Which pre-reductions run before the elimination (see pre_reduction).
  pre_reduction reduction = pre_reduction::coreductions_and_collapses;
  /// Homology over Z/2 and Z/p without generators or keep_basis: ranks by column reduction
  /// with clearing (lacuna/algorithm/field_ranks.hpp) instead of unit pivots and a Smith
  /// form of the core (`elimination` and `reduction` then do not apply, except
  /// pre_reduction::morse, whose Morse complex is reduced). false: the route of the integers.
  bool field_column_reduction = true;
  /// lacuna::homology over the integers, asked for ranks and torsion only (no generators,
  /// no basis) of a complex that is not an image or volume, with `reduction` left at its
  /// default, takes the coboundary route instead (coboundary_reduction,
  /// lacuna/algorithm/integral_reduction.hpp; the rule and its measurements are in
  /// docs/homology.md). false: always this variant.
  bool allow_coboundary_route = true;
  /// lacuna::homology and lacuna::cohomology of an image or volume (cubical_complex<D>,
  /// D <= 3) asked for groups only (no generators, no basis) take the duality route: two
  /// voxel labellings and the Euler characteristic (lacuna/algorithm/cubical_duality.hpp),
  /// exact because such complexes have no torsion. false: never.
  bool cubical_duality = true;

  /// The elimination options with `reduction` applied.
  elimination_options effective_elimination() const {
    elimination_options e = elimination;
    switch (reduction) {
      case pre_reduction::none:
        e.coreductions = e.collapses = e.set_aside = false;
        break;
      case pre_reduction::collapses:
        e.coreductions = e.set_aside = false;
        e.collapses = true;
        break;
      case pre_reduction::coreductions:
        e.collapses = false;
        e.coreductions = e.set_aside = true;
        break;
      default:
        break;
    }
    return e;
  }

  /// The stages this variant runs (algorithm/stages.hpp), its fields applied: lacuna::homology
  /// with sparse_elimination{...} is lacuna::homology with stages(), one code path. To replace
  /// a stage, keep the others from here, e.g.
  ///   auto s = sparse_elimination{}.stages();
  ///   staged_elimination<my_pre, decltype(s.eliminate), decltype(s.core), decltype(s.route)>{
  ///       .eliminate = s.eliminate, .core = s.core, .route = s.route}
  default_route stages() const { return stages_of(effective_elimination()); }

  /// The stages for elimination options `e` (with this variant's route choice): with
  /// set-aside, the zero-fill pivots and set-aside first (zero_fill_reduction), then, when
  /// `e` asks for Markowitz pivots after them (markowitz and second_pass), the elimination of
  /// what is left; without set-aside, no pre-reduction and a single elimination with the
  /// pivot kinds of `e`. Either way the pivots are those eliminate_unit_pivots(e) takes.
  default_route stages_of(const elimination_options& e) const {
    default_route s;
    if (e.set_aside) {
      s.pre = {.coreductions = e.coreductions, .collapses = e.collapses};
      if (e.markowitz && e.second_pass)
        s.eliminate = {.coreductions = e.coreductions, .collapses = e.collapses, .markowitz = true};
      else
        s.eliminate = {.coreductions = false, .collapses = false, .markowitz = false};
    } else {
      s.pre = {.coreductions = false, .collapses = false};
      s.eliminate = {.coreductions = e.coreductions, .collapses = e.collapses, .markowitz = e.markowitz};
    }
    const bool default_reduction = reduction == pre_reduction::coreductions_and_collapses;
    s.route = {.cubical_duality = cubical_duality && (default_reduction || reduction == pre_reduction::morse),
               .coboundary = allow_coboundary_route && default_reduction,
               .morse = reduction == pre_reduction::morse,
               .field_column_reduction = field_column_reduction};
    return s;
  }
};
/// The reference variant: dense Smith forms of whole matrices. For small inputs only.
struct dense_elimination {
  /// Its stages (algorithm/stages.hpp): no reduction, the Smith form of each whole boundary
  /// matrix, no route choice.
  staged_elimination<no_reduction, no_reduction, smith_core> stages() const { return {}; }
};

template <class P>
concept smith_algorithm = std::same_as<P, sparse_elimination> || std::same_as<P, dense_elimination>;

namespace detail {
template <euclidean_domain R, class W, class Convert>
smith_invariants<R> sparse_smith(const sparse_matrix<R>& A, const sparse_elimination& alg, Convert convert,
                                 const run_control* control) {
  auto rc = elimination_workspace<W>::from_matrix(A, convert);
  auto opt = alg.effective_elimination();
  opt.set_aside = false;  // a matrix has no cells to set aside
  const auto stages = alg.stages_of(opt);
  elimination_log<W>* const no_log = nullptr;
  stages.pre.reduce(rc, no_log, control);
  stages.eliminate.reduce(rc, no_log, control);
  // Every pivot eliminated one column (and one row) with a unit incidence: that many unit
  // invariant factors.
  std::size_t pivots = 0;
  for (std::uint32_t j = 0; j < A.cols; ++j)
    if (!rc.alive(1, j)) ++pivots;
  // The core: surviving rows and columns that still meet a non-zero entry.
  std::vector<std::int64_t> rpos(A.rows, -1), cpos(A.cols, -1);
  std::size_t nr = 0, nc = 0;
  for (std::uint32_t j = 0; j < A.cols; ++j)
    if (rc.alive(1, j) && !rc.boundary(1, j).empty()) cpos[j] = static_cast<std::int64_t>(nc++);
  for (std::uint32_t i = 0; i < A.rows; ++i)
    if (rc.alive(0, i) && !rc.cofaces(0, i).empty()) rpos[i] = static_cast<std::int64_t>(nr++);
  dense_matrix<R> core(nr, nc);
  for (std::uint32_t j = 0; j < A.cols; ++j)
    if (cpos[j] >= 0)
      for (const auto& e : rc.boundary(1, j)) {
        if constexpr (std::same_as<W, checked_int64>)
          core(static_cast<std::size_t>(rpos[e.index]), static_cast<std::size_t>(cpos[j])) = R(e.value.v);
        else
          core(static_cast<std::size_t>(rpos[e.index]), static_cast<std::size_t>(cpos[j])) = e.value;
      }
  // The core stage (smith_core: modular over the integers when its proofs go through, else
  // the dense Smith form).
  auto s = stages.core.invariants(std::move(core), control);
  smith_invariants<R> out;
  out.factors.assign(pivots, one<R>());
  out.factors.insert(out.factors.end(), s.factors.begin(), s.factors.end());
  out.rank = out.factors.size();
  return out;
}
}  // namespace detail

/// The invariant factors of A (R models euclidean_domain) by the chosen variant.
/// Integers: the sparse variant works on 64-bit coefficients and repeats the work with
/// lacuna::integer when a coefficient would overflow, so the result is always exact.
/// `control` (may be null): a stop request (throws computation_stopped) and progress.
template <euclidean_domain R, smith_algorithm Algorithm = sparse_elimination>
smith_invariants<R> smith_normal_form(const sparse_matrix<R>& A, const Algorithm& algorithm = {},
                                      const run_control* control = nullptr) {
  if constexpr (std::same_as<Algorithm, dense_elimination>) {
    const auto d = dense_smith_form(A.to_dense(), {.control = control});
    return {d.rank, d.diagonal};
  } else {
    if constexpr (std::same_as<R, integer>) {
      try {
        return detail::sparse_smith<R, checked_int64>(A, algorithm, [](const integer& x) {
          if (!x.is_small()) throw coefficient_overflow();
          return checked_int64(x.small_value());
        }, control);
      } catch (const coefficient_overflow&) {
        // widen and repeat
      }
    }
    return detail::sparse_smith<R, R>(A, algorithm, [](const R& x) { return x; }, control);
  }
}

}  // namespace lacuna

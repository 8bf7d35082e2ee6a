// lacuna/algorithm/stages.hpp — the open stages of the elimination route of lacuna::homology:
// the concepts a stage models, the built-in stages, and the policy value that chains them.
//
// A homology computation is a composition of four stages, each open:
//   0. the route choice (route_selector): duality for volumes, the coboundary route, a Morse
//      complex first, column reductions over a field, or the elimination below;
//   1. a pre-reduction (reduction_stage): zero-fill pivots, e.g. coreductions and collapses;
//   2. an elimination (reduction_stage) with its pivot rule (pivot_rule,
//      algorithm/unit_elimination.hpp): what is left after the pre-reduction;
//   3. the core's invariant factors (core_stage): per boundary matrix of the core, by Smith
//      forms (smith_core, dense_smith_core) or, over a field, by column reduction
//      (field_reduction_core).
// The elimination route (homology/routes.hpp) builds the chain complex of a cell complex as
// an elimination_workspace over working coefficients W, runs stages 1 and 2 on it and
// finishes the small core that is left with stage 3.
// staged_elimination<Pre, Eliminate, Core, Route> is the policy value that names the four.
// sparse_elimination{} is the same composition with the built-in stages (default_route;
// sparse_elimination::stages() gives its stages as values, its fields applied), and runs
// through the same code: a user's own type that models a concept takes the place of one of
// them.
//
// Contract of a reduction stage (not checkable by the compiler, so stated here): it changes
// the complex only by eliminating pivot pairs (a, b) whose incidence is a unit, each the
// reduction of Kaczynski, Mrozek & Slusarek (1998) that keeps the chain-homotopy type, with
// the coface lists of the surviving cells exact when it returns, and, when `log` is not null,
// records every pivot in it (elimination_maps.hpp lifts generators through the log; the
// pivot's boundary too unless log->pivots_wanted is false). The public eliminate_unit_pivots
// (unit_elimination.hpp) does all of that; a stage that only looks (a pre-reduction that
// counts, say) models the concept too. A stage that is generic in W also runs on the 64-bit
// fast path of the integers (checked_int64, widened to lacuna::integer when a coefficient
// would overflow); one written for W = R only runs at R.
//
// A core stage gets the dense matrix of one boundary map of the core (rows: the core cells of
// the lower level) over the ring R of the answer and returns its rank and invariant factors.
// It finishes groups only: with generators or a kept basis the route needs the Smith forms'
// transforms, and dense_smith_form with transforms runs instead (docs/homology.md).
//
// A route selector is asked, before anything is built, which route a computation takes
// (homology_route); the route it names is exact on its own (homology/routes.hpp says how).
// A route that does not apply to the request (duality with generators, the coboundary route
// for cohomology, field ranks over a ring that is not a field with a fast column reduction,
// a Morse complex that declines) is replaced by the algebra: the selector is asked again
// with route_request::algebra_only set, and then field_ranks or elimination is taken.
#pragma once

#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/field_ranks.hpp>
#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstdint>

#include <concepts>
#include <type_traits>
#include <utility>

namespace lacuna {

/// The open stage "reduction of the chain complex" at working coefficients W: a type with
/// `reduce(elimination_workspace<W>&, elimination_log<W>* log, const run_control* control)`
/// (log and control may be null). Contract at the top of this header.
template <class S, class W>
concept reduction_stage =
    std::copy_constructible<S> &&
    requires(const S& s, elimination_workspace<W>& rc, elimination_log<W>* log, const run_control* control) {
      s.reduce(rc, log, control);
    };

/// The open stage "invariant factors of the core" over R: a type with
/// `invariants(dense_matrix<R> core, const run_control* control)` returning the rank and the
/// invariant factors (units included, smith_invariants<R>) of the matrix.
template <class S, class R>
concept core_stage = std::copy_constructible<S> && requires(const S& s, dense_matrix<R> m, const run_control* control) {
  { s.invariants(std::move(m), control) } -> std::convertible_to<smith_invariants<R>>;
};

/// A reduction stage that leaves the complex as it is.
struct no_reduction {
  /// Does nothing.
  template <class W>
  void reduce(elimination_workspace<W>&, elimination_log<W>*, const run_control*) const {}
};

/// The built-in pre-reduction: zero-fill pivots only — coreductions (Mrozek & Batko 2009) and
/// collapses — and, when none is left, a cell without active faces set aside as critical,
/// which starts the coreductions of the next piece (algorithm/unit_elimination.hpp). With
/// both switches off it does nothing (the pre-reduction of sparse_elimination without
/// set-aside, pre_reduction::none).
struct zero_fill_reduction {
  bool coreductions = true;  ///< pivots from a cell with a single active face
  bool collapses = true;     ///< pivots from a face with a single coface
  /// Runs eliminate_unit_pivots without Markowitz pivots.
  template <class W>
  void reduce(elimination_workspace<W>& rc, elimination_log<W>* log, const run_control* control) const {
    if (!coreductions && !collapses) return;
    eliminate_unit_pivots(rc,
                          {.coreductions = coreductions, .collapses = collapses, .set_aside = true,
                           .markowitz = false, .record = log != nullptr,
                           .record_pivots = log == nullptr || log->pivots_wanted, .second_pass = false,
                           .control = control},
                          log);
  }
};

/// The built-in elimination: unit pivots by increasing cost under `rule` (the Markowitz count
/// by default), zero-fill pivots first whenever one appears; cells an earlier stage set aside
/// are searched again. The switches name the kinds of pivot taken (all three off: nothing
/// is done, the elimination of sparse_elimination whose options stop after the set-aside).
template <pivot_rule Rule = markowitz_rule>
struct unit_pivot_elimination {
  Rule rule{};               ///< the order of the pivots
  bool coreductions = true;  ///< zero-fill pivots from a cell with a single active face
  bool collapses = true;     ///< zero-fill pivots from a face with a single coface
  bool markowitz = true;     ///< unit pivots by increasing cost under `rule`
  /// Runs eliminate_unit_pivots with `rule`.
  template <class W>
  void reduce(elimination_workspace<W>& rc, elimination_log<W>* log, const run_control* control) const {
    if (!coreductions && !collapses && !markowitz) return;
    eliminate_unit_pivots(rc,
                          {.coreductions = coreductions, .collapses = collapses, .set_aside = false,
                           .markowitz = markowitz, .record = log != nullptr,
                           .record_pivots = log == nullptr || log->pivots_wanted, .second_pass = false,
                           .revive_critical = true, .control = control},
                          log, rule);
  }
};

/// The built-in core stage: over the integers the modular Smith form where it pays and its
/// proofs go through (algorithm/modular_smith.hpp), otherwise, and over other rings,
/// dense_smith_form.
struct smith_core {
  /// The rank and invariant factors of `core`.
  template <class R>
  smith_invariants<R> invariants(dense_matrix<R> core, const run_control* control) const {
    if constexpr (std::same_as<R, integer>)
      if (prefer_modular_smith(core))
        if (auto s = modular_smith_invariants(core, control)) return std::move(*s);
    auto d = dense_smith_form(std::move(core), {.control = control});
    return {d.rank, std::move(d.diagonal)};
  }
};

/// The dense Smith form only (dense_smith_form; Kannan & Bachem 1979).
struct dense_smith_core {
  /// The rank and invariant factors of `core`.
  template <class R>
  smith_invariants<R> invariants(dense_matrix<R> core, const run_control* control) const {
    auto d = dense_smith_form(std::move(core), {.control = control});
    return {d.rank, std::move(d.diagonal)};
  }
};

/// The core stage over a field: the rank of the core by column reduction
/// (reduce_columns, algorithm/field_reduction.hpp); over a field every non-zero invariant
/// factor is a unit, so the rank is the whole answer (returned as that many ones). Models
/// core_stage at the fields reduce_columns takes (z2, mod_p<P>, mod_p_dynamic, rational...).
struct field_reduction_core {
  /// The rank of `core`, as `rank` unit invariant factors.
  template <field R>
    requires field_reduction_algorithm_for<automatic_reduction, R>
  smith_invariants<R> invariants(dense_matrix<R> core, const run_control* control) const {
    sparse_matrix<R> a(core.rows(), core.cols());
    for (std::size_t j = 0; j < core.cols(); ++j)
      for (std::size_t i = 0; i < core.rows(); ++i)  // rows in order: the column is sorted
        if (!(core(i, j) == zero<R>())) a.columns[j].push_back({static_cast<std::uint32_t>(i), core(i, j)});
    const std::size_t r = reduce_columns(a, {.control = control}).rank;
    return {r, std::vector<R>(r, one<R>())};
  }
};

// ---- the route choice ------------------------------------------------------------------

/// The routes of lacuna::homology (homology/routes.hpp says how each is exact).
enum class homology_route {
  /// Stages 1–3 on the chain complex (with generators and bases: always possible).
  elimination,
  /// Betti numbers by column reduction with clearing over the whole chain complex
  /// (algorithm/field_ranks.hpp): fields with a fast column reduction, groups only.
  field_ranks,
  /// Images and volumes (cubical_complex<D>, D <= 3), groups only: two voxel labellings and
  /// the Euler characteristic (algorithm/cubical_duality.hpp).
  duality,
  /// Ranks and torsion by reduction of the coboundaries (coboundary_reduction{},
  /// algorithm/integral_reduction.hpp); homology and relative homology, groups only.
  coboundary,
  /// A discrete Morse complex first (pre_reduction::morse), the algebra on it.
  morse,
};

/// What a route selector is told about the computation.
struct route_request {
  bool generators = false;   ///< generators asked for
  bool keep_basis = false;   ///< a coordinate basis kept
  bool reduced = false;      ///< reduced homology
  bool cohomology = false;   ///< cohomology rather than homology
  bool relative = false;     ///< homology of a pair
  /// Only field_ranks or elimination may be taken: the complex is already a Morse complex, or
  /// the route chosen first did not apply.
  bool algebra_only = false;
};

/// The open stage "route choice" for the ring R and the complex type C: a type with
/// `select<R>(const C&, const route_request&)` returning a homology_route.
template <class S, class R, class C>
concept route_selector = std::copy_constructible<S> && requires(const S& s, const C& c, const route_request& q) {
  { s.template select<R>(c, q) } -> std::same_as<homology_route>;
};

namespace detail {
template <class C>
inline constexpr std::size_t duality_dimension = 0;
template <std::size_t D>
inline constexpr std::size_t duality_dimension<cubical_complex<D>> = D <= 3 ? D : 0;
}  // namespace detail

/// The route selector that always takes the elimination (staged_elimination's default).
struct elimination_only_route {
  /// homology_route::elimination.
  template <class R, class C>
  homology_route select(const C&, const route_request&) const {
    return homology_route::elimination;
  }
};

/// The built-in route choice of sparse_elimination{} (the rules and their measurements:
/// docs/homology.md and docs/performance.md):
///   * images and volumes of dimension <= 3, groups only: the duality route (such complexes
///     have no torsion, so the ranks are the groups over any R);
///   * other complexes over the integers and Q, homology groups only: the coboundary route
///     (on simplicial complexes and cell lists as fast or faster; matching complex of K_11:
///     minutes -> under a second), not on images and volumes, where the implicit Morse
///     matching stays ahead;
///   * with `morse`: the Morse complex first (not for relative homology);
///   * fields with a fast column reduction (Z/2, Z/p), groups only: field ranks;
///   * else the elimination.
struct automatic_route {
  bool cubical_duality = true;         ///< take the duality route when it applies
  bool coboundary = true;              ///< take the coboundary route when it applies
  bool morse = false;                  ///< a Morse complex first
  bool field_column_reduction = true;  ///< field ranks when they apply
  /// The route for this request.
  template <class R, class C>
  homology_route select(const C& c, const route_request& q) const {
    const bool groups_only = !q.generators && !q.keep_basis;
    if (!q.algebra_only) {
      if constexpr (detail::duality_dimension<C> != 0)
        if (cubical_duality && groups_only && !q.relative && !(q.reduced && c.top_dimension() < 0))
          return homology_route::duality;
      if constexpr ((std::same_as<R, integer> || std::same_as<R, rational>) && !has_implicit_morse_complex<C>)
        if (coboundary && groups_only && !q.cohomology) return homology_route::coboundary;
      if (morse && !q.relative) return homology_route::morse;
    }
    if constexpr (has_fast_column_reduction<R>)
      if (field_column_reduction && groups_only) return homology_route::field_ranks;
    return homology_route::elimination;
  }
};

/// The policy value of a homology computation with its four stages named: `route` chooses
/// the route, and on the elimination route `pre`, then `eliminate` reduce the chain complex,
/// and `core` finishes what is left. Pass it to lacuna::homology, relative_homology or
/// cohomology as the algorithm. staged_elimination<>{} has the elimination stages of
/// sparse_elimination{} without its route choice (elimination_only_route: no duality route
/// for volumes, no coboundary route, no field ranks, no Morse complex), so it gives the same
/// groups by the same reductions; default_route is sparse_elimination{} itself.
template <class Pre = zero_fill_reduction, class Eliminate = unit_pivot_elimination<>, class Core = smith_core,
          class Route = elimination_only_route>
struct staged_elimination {
  Pre pre{};              ///< the pre-reduction (reduction_stage)
  Eliminate eliminate{};  ///< the elimination (reduction_stage)
  Core core{};            ///< the finishing of the core (core_stage)
  Route route{};          ///< the route choice (route_selector)
};

/// The composition that sparse_elimination{} runs (sparse_elimination::stages()).
using default_route = staged_elimination<zero_fill_reduction, unit_pivot_elimination<>, smith_core, automatic_route>;

namespace detail {
template <class P>
inline constexpr bool is_staged_elimination = false;
template <class Pre, class Eliminate, class Core, class Route>
inline constexpr bool is_staged_elimination<staged_elimination<Pre, Eliminate, Core, Route>> = true;
}  // namespace detail

/// A staged_elimination of any stages (whether the stages fit a ring is checked where the
/// ring is known, with a message naming the stage).
template <class P>
concept staged_algorithm = detail::is_staged_elimination<P>;

}  // namespace lacuna

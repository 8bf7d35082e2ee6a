// lacuna/algorithm/stages.hpp — the open stages of the elimination route of lacuna::homology:
// the concepts a stage models, the built-in stages, and the policy value that chains them.
//
// The elimination route (homology/homology.hpp) builds the chain complex of a cell complex as
// a elimination_workspace over working coefficients W, reduces it, and finishes the small core
// that is left with Smith forms. Three stages, each open:
//   1. a pre-reduction (reduction_stage): zero-fill pivots, e.g. coreductions and collapses;
//   2. an elimination (reduction_stage) with its pivot rule (pivot_rule,
//      algorithm/unit_elimination.hpp): what is left after the pre-reduction;
//   3. the core's invariant factors (core_stage): per boundary matrix of the core.
// staged_elimination<Pre, Eliminate, Core> is the policy value that names the three; the
// built-in stages below are the pieces that sparse_elimination{} runs, and a user's own type
// that models a concept takes the place of one of them.
//
// Contract of a reduction stage (not checkable by the compiler, so stated here): it changes
// the complex only by eliminating pivot pairs (a, b) whose incidence is a unit, each the
// reduction of Kaczynski, Mrozek & Slusarek (1998) that keeps the chain-homotopy type, with
// the coface lists of the surviving cells exact when it returns, and, when `log` is not null,
// records every pivot in it (elimination_maps.hpp lifts generators through the log). The
// public eliminate_unit_pivots (unit_elimination.hpp) does all of that; a stage that only
// looks (a pre-reduction that counts, say) models the concept too. A stage that is generic in
// W also runs on the 64-bit fast path of the integers (checked_int64, widened to
// lacuna::integer when a coefficient would overflow); one written for W = R only runs at R.
//
// A core stage gets the dense matrix of one boundary map of the core (rows: the core cells of
// the lower level) over the ring R of the answer and returns its rank and invariant factors.
// It finishes groups only: with generators or a kept basis the route needs the Smith forms'
// transforms, and dense_smith_form with transforms runs instead (docs/homology.md).
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

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
/// which starts the coreductions of the next piece (algorithm/unit_elimination.hpp).
struct zero_fill_reduction {
  bool coreductions = true;  ///< pivots from a cell with a single active face
  bool collapses = true;     ///< pivots from a face with a single coface
  /// Runs eliminate_unit_pivots without Markowitz pivots.
  template <class W>
  void reduce(elimination_workspace<W>& rc, elimination_log<W>* log, const run_control* control) const {
    eliminate_unit_pivots(rc,
                          {.coreductions = coreductions, .collapses = collapses, .set_aside = true,
                           .markowitz = false, .record = log != nullptr, .second_pass = false, .control = control},
                          log);
  }
};

/// The built-in elimination: unit pivots by increasing cost under `rule` (the Markowitz count
/// by default), zero-fill pivots first whenever one appears; cells an earlier stage set aside
/// are searched again.
template <pivot_rule Rule = markowitz_rule>
struct unit_pivot_elimination {
  Rule rule{};  ///< the order of the pivots
  /// Runs eliminate_unit_pivots with `rule`.
  template <class W>
  void reduce(elimination_workspace<W>& rc, elimination_log<W>* log, const run_control* control) const {
    eliminate_unit_pivots(rc,
                          {.coreductions = true, .collapses = true, .set_aside = false, .markowitz = true,
                           .record = log != nullptr, .second_pass = false, .revive_critical = true, .control = control},
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

/// The policy value of the elimination route with its three stages named: `pre`, then
/// `eliminate` reduce the chain complex, and `core` finishes what is left. Pass it to
/// lacuna::homology, relative_homology or cohomology as the algorithm. The defaults are the
/// stages of sparse_elimination{} (without its shortcuts: no duality route for volumes, no
/// coboundary route, no field column reduction, no Morse complex), so staged_elimination<>{}
/// gives the same groups by the same reductions.
template <class Pre = zero_fill_reduction, class Eliminate = unit_pivot_elimination<>, class Core = smith_core>
struct staged_elimination {
  Pre pre{};              ///< the pre-reduction (reduction_stage)
  Eliminate eliminate{};  ///< the elimination (reduction_stage)
  Core core{};            ///< the finishing of the core (core_stage)
};

namespace detail {
template <class P>
inline constexpr bool is_staged_elimination = false;
template <class Pre, class Eliminate, class Core>
inline constexpr bool is_staged_elimination<staged_elimination<Pre, Eliminate, Core>> = true;
}  // namespace detail

/// A staged_elimination of any stages (whether the stages fit a ring is checked where the
/// ring is known, with a message naming the stage).
template <class P>
concept staged_algorithm = detail::is_staged_elimination<P>;

}  // namespace lacuna

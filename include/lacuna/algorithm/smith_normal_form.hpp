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
};
/// The reference variant: dense Smith forms of whole matrices. For small inputs only.
struct dense_elimination {};

template <class P>
concept smith_algorithm = std::same_as<P, sparse_elimination> || std::same_as<P, dense_elimination>;

namespace detail {
template <euclidean_domain R, class W, class Convert>
smith_invariants<R> sparse_smith(const sparse_matrix<R>& A, const sparse_elimination& alg, Convert convert,
                                 const run_control* control) {
  auto rc = elimination_workspace<W>::from_matrix(A, convert);
  auto opt = alg.effective_elimination();
  opt.set_aside = false;
  opt.record = false;
  opt.control = control;
  const auto stats = eliminate_unit_pivots(rc, opt);
  const std::size_t pivots = stats.coreductions + stats.collapses + stats.markowitz;
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
  smith_invariants<R> out;
  if constexpr (std::same_as<R, integer>) {  // modular, when its proofs go through
    if (prefer_modular_smith(core))
      if (auto s = modular_smith_invariants(core, control)) {
        out.factors.assign(pivots, one<R>());
        out.factors.insert(out.factors.end(), s->factors.begin(), s->factors.end());
        out.rank = out.factors.size();
        return out;
      }
  }
  const auto d = dense_smith_form(std::move(core), {.control = control});
  out.factors.assign(pivots, one<R>());
  out.factors.insert(out.factors.end(), d.diagonal.begin(), d.diagonal.end());
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

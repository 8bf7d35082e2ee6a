// lacuna/homology/homology.hpp — homology groups, with torsion and generators, of any cell
// complex over any Euclidean domain; cohomology through the dual complex.
//
// The front: the three public functions and the algorithms they take. The options are in
// homology/options.hpp, the result type in homology/result.hpp, the routes (which one runs
// when, and how each is exact) in homology/routes.hpp, and the open stages of the elimination
// route in algorithm/stages.hpp.
#pragma once

#include <lacuna/algorithm/integral_reduction.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/algorithm/stages.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/options.hpp>
#include <lacuna/homology/result.hpp>
#include <lacuna/homology/routes.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <concepts>
#include <stdexcept>
#include <vector>

namespace lacuna {

// ---- variants (policy values, from lacuna/algorithm/smith_normal_form.hpp and stages.hpp) ----
//   sparse_elimination{}  the default: the route choice (automatic_route: duality for
//                         volumes, the coboundary route over Z and Q, field ranks over Z/p),
//                         else unit pivots eliminated on the whole chain complex, then Smith
//                         forms of the small core. It runs as its stages() — default_route,
//                         a staged_elimination — through the same code as the user's own.
//   dense_elimination{}   the reference for small complexes: dense Smith forms of the whole
//                         boundary matrices (its stages(): no reduction, smith_core).
//   coboundary_reduction{} ranks and torsion by unit-pivot reduction of the coboundaries
//                         with clearing (lacuna/algorithm/integral_reduction.hpp); what it
//                         cannot give (generators, a basis, cohomology) runs sparse_elimination{}.
//   staged_elimination<Pre, Eliminate, Core, Route>{} the computation with its stages named,
//                         the user's own among them (lacuna/algorithm/stages.hpp).
template <class P>
concept homology_algorithm = smith_algorithm<P> || std::same_as<P, coboundary_reduction> || staged_algorithm<P>;

/// The homology of c over R (R models euclidean_domain; fields give dimensions, the
/// integers give ranks and torsion). Algorithm: sparse_elimination{} (default) or
/// dense_elimination{} (the small-matrix reference). See homology_options. `ring_one` is the one
/// of R, for rings whose elements carry a run-time modulus (mod_p_dynamic(1, p)).
/// Precondition, checked when the chain complex is built (as are cohomology's and
/// relative_homology's; chain/boundary_squared.hpp, about a tenth of the build's cost): ∂∂ = 0
/// in R, else lacuna::invalid_complex naming the first cell where it fails (with
/// pre_reduction::morse on a complex other than an image or volume, the Morse complex is the
/// one checked: lacuna::validate checks the complex itself). memory_limit_exceeded when a
/// dense core passes options.control.memory_limit (homology/memory_estimate.hpp).
template <euclidean_domain R, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
homology_result<R> homology(const C& c, homology_options options = {}, const Algorithm& algorithm = {},
                            const R& ring_one = one<R>()) {
  if constexpr (std::same_as<Algorithm, coboundary_reduction>) {
    return detail::homology_by_coboundaries<R>(c, options, algorithm, nullptr, ring_one);
  } else if constexpr (smith_algorithm<Algorithm>) {
    return detail::staged_homology<R>(c, options, algorithm.stages(), false, nullptr, ring_one);
  } else {
    return detail::staged_homology<R>(c, options, algorithm, false, nullptr, ring_one);
  }
}

/// The homology of the pair (c, A) over R, A the subcomplex of the cells marked in
/// `in_subcomplex` (in_subcomplex[k][i] for the i-th k-cell; the caller checks closure):
/// the homology of the quotient chain complex C(c)/C(A).
template <euclidean_domain R, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
homology_result<R> relative_homology(const C& c, const std::vector<std::vector<bool>>& in_subcomplex,
                                     homology_options options = {}, const Algorithm& algorithm = {},
                                     const R& ring_one = one<R>()) {
  if (options.reduced) throw std::invalid_argument("lacuna: relative homology is not augmented");
  auto marked = [](homology_result<R> r) {
    r.relative = true;
    return r;
  };
  if constexpr (std::same_as<Algorithm, coboundary_reduction>) {
    return marked(detail::homology_by_coboundaries<R>(c, options, algorithm, &in_subcomplex, ring_one));
  } else if constexpr (smith_algorithm<Algorithm>) {
    return marked(detail::staged_homology<R>(c, options, algorithm.stages(), false, &in_subcomplex, ring_one));
  } else {
    return marked(detail::staged_homology<R>(c, options, algorithm, false, &in_subcomplex, ring_one));
  }
}

/// The cohomology H^k of c over R, with cocycle generators on request (cochains named by
/// the cells they take the value 1 on, with coefficients).
template <euclidean_domain R, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
homology_result<R> cohomology(const C& c, homology_options options = {}, const Algorithm& algorithm = {},
                              const R& ring_one = one<R>()) {
  if constexpr (std::same_as<Algorithm, coboundary_reduction>) {  // not on this route: the default one
    return detail::staged_homology<R>(c, options, sparse_elimination{}.stages(), true, nullptr, ring_one);
  } else if constexpr (smith_algorithm<Algorithm>) {
    return detail::staged_homology<R>(c, options, algorithm.stages(), true, nullptr, ring_one);
  } else {
    return detail::staged_homology<R>(c, options, algorithm, true, nullptr, ring_one);
  }
}

}  // namespace lacuna

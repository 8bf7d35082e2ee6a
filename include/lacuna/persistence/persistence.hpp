// lacuna/persistence/persistence.hpp — persistent homology of a filtration over a field:
// the one call, and the default variant.
//
//   lacuna::cubical_filtration<2, std::uint16_t> f({512, 512}, samples);
//   auto r = lacuna::persistence(f);                         // Z/2, every dimension
//   auto q = lacuna::persistence<lacuna::mod_p<3>>(f, {.max_dimension = 1});
//   auto s = lacuna::persistence<lacuna::rational>(rips, {.representatives = true}, lacuna::twist_persistence{});
//   r[1].pairs, r.betti_number(1, t), r.persistent_betti_number(1, s, t),
//   lacuna::without_zero_persistence(r)
//
// The variant is a policy value (lacuna/persistence/reduction.hpp); automatic_persistence{},
// the default, takes cubical_morse_persistence for cubical filtrations (pairs cubical cells
// before the algebra) and twist_persistence for every other filtration.
#pragma once

#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/cubical_reduction.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/filtration.hpp>
#include <lacuna/persistence/reduction.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/z2.hpp>

namespace lacuna {

/// The default variant: cubical_morse_persistence for cubical filtrations, twist_persistence
/// for every other filtration.
struct automatic_persistence {
  /// The persistence of f over the field of `ring_one`, with options o (the persistence_reduction interface).
  template <filtration F, field R>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& ring_one) const {
    if constexpr (persistence_reduction<cubical_morse_persistence, F, R>)
      return cubical_morse_persistence{}.reduce(f, o, ring_one);
    else
      return twist_persistence{}.reduce(f, o, ring_one);
  }
};

/// The persistent homology of the filtration f over the field R (default Z/2): diagrams of
/// dimensions 0..options.max_dimension, the cells creating and destroying every class, and
/// representatives on request (persistence_result). `algorithm` is the variant
/// (automatic_persistence{}, standard_persistence{}, twist_persistence{},
/// cohomology_persistence{}, cubical_morse_persistence{}, or one's own model of
/// persistence_reduction); `ring_one` is the one of R, for rings whose elements carry a run-time
/// modulus (mod_p_dynamic(1, p)).
/// Throws filtration_error naming a cell that enters before one of its faces,
/// computation_stopped on a stop request (options.control).
template <field R = z2, filtration F, class Algorithm = automatic_persistence>
  requires persistence_reduction<Algorithm, F, R>
persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> persistence(const F& f,
                                                                                const persistence_options& options = {},
                                                                                const Algorithm& algorithm = {},
                                                                                const R& ring_one = one<R>()) {
  return algorithm.reduce(f, options, ring_one);
}

}  // namespace lacuna

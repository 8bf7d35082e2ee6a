// lacuna/complex/construct/augmentation.hpp — the check the cone and the suspension need.
//
// A cone or suspension has ∂∂ = 0 only if every 1-cell's boundary has coefficient sum 0
// (ε∂ = 0 for the augmentation ε). CW and Delta complexes always satisfy it; a bare chain
// complex such as "1 q : 2*p" does not.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

#include <cstdint>
#include <string>

namespace lacuna::detail {

template <cell_complex C>
void require_augmented(const C& c, const char* construction) {
  for (std::size_t i = 0; i < lacuna::cell_count(c, 1); ++i) {
    __extension__ __int128 sum = 0;
    for (const auto& t : lacuna::boundary(c, 1, i)) sum += as_incidence(t).coefficient;
    if (sum != 0)
      throw invalid_complex(std::string(construction) + ": the boundary of 1-cell " + std::to_string(i) + " ('" +
                                lacuna::cell_name(c, 1, i) +
                                "') has coefficient sum other than 0, so the result would have ∂∂ ≠ 0",
                            1, i);
  }
}

}  // namespace lacuna::detail

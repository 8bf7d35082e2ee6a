// lacuna/chain/checked_coefficient.hpp — 64-bit integer coefficients that refuse to overflow.
//
// The fast path of integral elimination: arithmetic on int64 whose every operation checks
// for overflow and throws lacuna::coefficient_overflow instead of wrapping. The homology
// engine catches it and repeats the work with lacuna::integer (64-bit with big-integer
// widening), so a result is never wrong because a number grew.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/concepts.hpp>

#include <cstdint>
#include <stdexcept>

namespace lacuna {

/// Thrown by checked_int64 arithmetic whose result does not fit in 64 bits.
struct coefficient_overflow : std::overflow_error {
  coefficient_overflow() : std::overflow_error("lacuna: a coefficient exceeded 64 bits") {}
};

/// An int64 that throws coefficient_overflow rather than overflow. Models commutative_ring.
struct checked_int64 {
  /// The value.
  std::int64_t v = 0;
  constexpr checked_int64() = default;
  /// The value x; implicit, as the image of an integer.
  constexpr checked_int64(std::int64_t x) : v(x) {}  // NOLINT: the image of an integer
  ///@{
  /// Sum, difference, negation and product; throw coefficient_overflow beyond 64 bits.
  friend checked_int64 operator+(checked_int64 a, checked_int64 b) {
    std::int64_t r;
    if (checked_add(a.v, b.v, r)) throw coefficient_overflow();
    return r;
  }
  friend checked_int64 operator-(checked_int64 a, checked_int64 b) {
    std::int64_t r;
    if (checked_sub(a.v, b.v, r)) throw coefficient_overflow();
    return r;
  }
  friend checked_int64 operator-(checked_int64 a) {
    std::int64_t r;
    if (checked_neg(a.v, r)) throw coefficient_overflow();
    return r;
  }
  friend checked_int64 operator*(checked_int64 a, checked_int64 b) {
    std::int64_t r;
    if (checked_mul(a.v, b.v, r)) throw coefficient_overflow();
    return r;
  }
  ///@}
  ///@{
  /// Compound assignment: *this = *this op b (overflow throws).
  checked_int64& operator+=(checked_int64 b) { return *this = *this + b; }
  checked_int64& operator-=(checked_int64 b) { return *this = *this - b; }
  checked_int64& operator*=(checked_int64 b) { return *this = *this * b; }
  /// Equal values.
  ///@}
  friend constexpr bool operator==(checked_int64, checked_int64) = default;
};

/// checked_int64 as an exact ring (a commutative ring only: no division).
template <>
struct ring_traits<checked_int64> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes: exact, and the image of an integer.
  static constexpr bool is_exact = true;
  static constexpr checked_int64 from_integer(std::int64_t n) { return n; }
  ///@}
};

}  // namespace lacuna

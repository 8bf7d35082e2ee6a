// lacuna_examples/gaussian_integer.hpp — the Gaussian integers Z[i] as a user-defined
// Euclidean domain, written the way a user of lacuna would write one: in their own namespace,
// with free functions found by argument-dependent lookup and one opt-in trait.
//
// Components are lacuna::integer, so values never overflow. The Euclidean size is the norm
// N(a + bi) = a^2 + b^2; division rounds the exact quotient (a * conj(b)) / N(b) to the
// nearest Gaussian integer, which leaves a remainder of norm at most N(b) / 2 < N(b).
// normalize picks the associate in the first quadrant: re > 0 and im >= 0 (or zero).
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstdint>
#include <ostream>
#include <stdexcept>
#include <type_traits>
#include <utility>

namespace lacuna_examples {

/// a + b i with exact integer parts.
struct gaussian_integer {
  lacuna::integer re;
  lacuna::integer im;

  friend bool operator==(const gaussian_integer&, const gaussian_integer&) = default;

  friend gaussian_integer operator+(const gaussian_integer& x, const gaussian_integer& y) {
    return {x.re + y.re, x.im + y.im};
  }
  friend gaussian_integer operator-(const gaussian_integer& x, const gaussian_integer& y) {
    return {x.re - y.re, x.im - y.im};
  }
  friend gaussian_integer operator-(const gaussian_integer& x) { return {-x.re, -x.im}; }
  friend gaussian_integer operator*(const gaussian_integer& x, const gaussian_integer& y) {
    return {x.re * y.re - x.im * y.im, x.re * y.im + x.im * y.re};
  }
  gaussian_integer& operator+=(const gaussian_integer& y) { return *this = *this + y; }
  gaussian_integer& operator-=(const gaussian_integer& y) { return *this = *this - y; }
  gaussian_integer& operator*=(const gaussian_integer& y) { return *this = *this * y; }

  friend std::ostream& operator<<(std::ostream& os, const gaussian_integer& x) {
    os << x.re;
    if (x.im.sign() < 0) return os << " - " << -x.im << "i";
    return os << " + " << x.im << "i";
  }
};

/// The norm a^2 + b^2.
inline lacuna::integer norm(const gaussian_integer& x) { return x.re * x.re + x.im * x.im; }

namespace detail {
/// The integer nearest to x / n for n > 0 (halves round up): floor((2x + n) / (2n)).
inline lacuna::integer round_div(const lacuna::integer& x, const lacuna::integer& n) {
  const lacuna::integer num = x + x + n;
  const lacuna::integer den = n + n;
  lacuna::integer q = num / den;                    // truncates toward zero
  if (num % den != 0 && num.sign() < 0) q -= 1;     // make it the floor
  return q;
}
}  // namespace detail

// ---- the customization points, found by ADL --------------------------------------------

/// n as n + 0i.
inline gaussian_integer from_integer(std::type_identity<gaussian_integer>, std::int64_t n) {
  return {lacuna::integer(n), lacuna::integer(0)};
}

/// Rounding division: q nearest to x / y, r = x - q y with N(r) <= N(y) / 2.
inline lacuna::div_rem_result<gaussian_integer> div_rem(const gaussian_integer& x, const gaussian_integer& y) {
  const lacuna::integer n = norm(y);
  if (n == 0) throw std::domain_error("gaussian_integer: division by zero");
  // x * conj(y) = (x.re y.re + x.im y.im) + (x.im y.re - x.re y.im) i
  const gaussian_integer q{detail::round_div(x.re * y.re + x.im * y.im, n),
                           detail::round_div(x.im * y.re - x.re * y.im, n)};
  return {q, x - q * y};
}

inline lacuna::integer euclidean_size(const gaussian_integer& x) { return norm(x); }

/// The associate with re > 0 and im >= 0 (zero for zero): rotate by i until it lands there.
inline gaussian_integer normalize(const gaussian_integer& x) {
  if (x.re == 0 && x.im == 0) return x;
  gaussian_integer y = x;
  while (!(y.re.sign() > 0 && y.im.sign() >= 0)) y = {-y.im, y.re};  // y *= i
  return y;
}

}  // namespace lacuna_examples

/// The one property syntax cannot show: arithmetic is exact.
template <>
inline constexpr bool lacuna::enable_exact_ring<lacuna_examples::gaussian_integer> = true;

// lacuna/ring/euclid.hpp — the generic Euclidean algorithms: is_unit, unit_part, gcd,
// extended_gcd, for any lacuna::euclidean_domain.
//
// Each is a customization-point object resolving, like those in concepts.hpp, to
//   1. ring_traits<R>::NAME(...)   2. NAME(...) found by ADL   3. the generic default here,
// so a ring may supply a faster version (lacuna::integer does, for the 64-bit path).
#pragma once

#include <lacuna/ring/concepts.hpp>

#include <utility>

namespace lacuna {

/// The result of lacuna::extended_gcd(a, b): s * a + t * b == g, and g == lacuna::gcd(a, b)
/// (normalized).
template <class R>
struct extended_gcd_result {
  /// A greatest common divisor, normalized.
  R g;
  ///@{
  /// Bezout coefficients: g == s * a + t * b.
  R s;
  R t;
  ///@}
};

namespace cpo_detail {

void gcd() = delete;
void extended_gcd() = delete;

template <class R>
concept traits_is_unit = requires(const R& a) { { ring_traits<R>::is_unit(a) } -> std::convertible_to<bool>; };
template <class R>
concept adl_is_unit = requires(const R& a) { { is_unit(a) } -> std::convertible_to<bool>; };

struct is_unit_fn {
  /// True iff a has a multiplicative inverse in R.
  template <euclidean_domain R>
  constexpr bool operator()(const R& a) const {
    if constexpr (traits_is_unit<R>)
      return ring_traits<R>::is_unit(a);
    else if constexpr (adl_is_unit<R>)
      return is_unit(a);
    else  // Default: a divides one.
      return a != lacuna::zero<R>() && lacuna::div_rem(lacuna::one<R>(), a).remainder == lacuna::zero<R>();
  }
};

template <class R>
concept traits_unit_part = requires(const R& a) { { ring_traits<R>::unit_part(a) } -> std::convertible_to<R>; };
template <class R>
concept adl_unit_part = requires(const R& a) { { unit_part(a) } -> std::convertible_to<R>; };

struct unit_part_fn {
  /// The unit u with a == u * normalize(a); one for a == 0.
  template <euclidean_domain R>
  constexpr R operator()(const R& a) const {
    if constexpr (traits_unit_part<R>)
      return ring_traits<R>::unit_part(a);
    else if constexpr (adl_unit_part<R>)
      return unit_part(a);
    else {  // Default: the exact quotient a / normalize(a).
      if (a == lacuna::zero<R>()) return lacuna::one<R>();
      return lacuna::div_rem(a, lacuna::normalize(a)).quotient;
    }
  }
};

template <class R>
concept traits_gcd = requires(const R& a) { { ring_traits<R>::gcd(a, a) } -> std::convertible_to<R>; };
template <class R>
concept adl_gcd = requires(const R& a) { { gcd(a, a) } -> std::convertible_to<R>; };

struct gcd_fn {
  /// The normalized greatest common divisor; gcd(0, 0) == 0. An override must return the
  /// normalized associate too.
  template <euclidean_domain R>
  constexpr R operator()(const R& a, const R& b) const {
    if constexpr (traits_gcd<R>)
      return ring_traits<R>::gcd(a, b);
    else if constexpr (adl_gcd<R>)
      return gcd(a, b);
    else {  // Default: Euclid's algorithm, O(number of division steps).
      const R z = lacuna::zero<R>();
      R x = a;
      R y = b;
      while (!(y == z)) {
        R r = lacuna::div_rem(x, y).remainder;
        x = std::move(y);
        y = std::move(r);
      }
      return lacuna::normalize(x);
    }
  }
};

template <class R>
concept traits_extended_gcd = requires(const R& a) {
  { ring_traits<R>::extended_gcd(a, a) } -> std::convertible_to<extended_gcd_result<R>>;
};
template <class R>
concept adl_extended_gcd = requires(const R& a) {
  { extended_gcd(a, a) } -> std::convertible_to<extended_gcd_result<R>>;
};

struct extended_gcd_fn {
  /// {g, s, t} with s * a + t * b == g == gcd(a, b), g normalized.
  template <euclidean_domain R>
  constexpr extended_gcd_result<R> operator()(const R& a, const R& b) const {
    if constexpr (traits_extended_gcd<R>)
      return ring_traits<R>::extended_gcd(a, b);
    else if constexpr (adl_extended_gcd<R>)
      return extended_gcd(a, b);
    else {
      // Invariants: r0 == s0 * a + t0 * b and r1 == s1 * a + t1 * b.
      const R z = lacuna::zero<R>();
      R r0 = a, r1 = b;
      R s0 = lacuna::one<R>(), s1 = z;
      R t0 = z, t1 = lacuna::one<R>();
      while (!(r1 == z)) {
        auto [q, r] = lacuna::div_rem(r0, r1);
        R s2 = s0 - q * s1;
        R t2 = t0 - q * t1;
        r0 = std::move(r1);
        r1 = std::move(r);
        s0 = std::move(s1);
        s1 = std::move(s2);
        t0 = std::move(t1);
        t1 = std::move(t2);
      }
      if (r0 == z) return {z, s0, t0};
      // Scale by the inverse of the unit part so that g is the normalized associate.
      R g = lacuna::normalize(r0);
      if (!(g == r0)) {
        const R u = lacuna::div_rem(r0, g).quotient;             // r0 == u * g
        const R u_inv = lacuna::div_rem(lacuna::one<R>(), u).quotient;
        s0 *= u_inv;
        t0 *= u_inv;
      }
      return {std::move(g), std::move(s0), std::move(t0)};
    }
  }
};

}  // namespace cpo_detail

inline namespace cpo {
/// lacuna::is_unit(a): a is invertible. Default: a != 0 and div_rem(one, a).remainder == 0.
inline constexpr cpo_detail::is_unit_fn is_unit{};
/// lacuna::unit_part(a): the unit u with a == u * normalize(a) (one for zero).
inline constexpr cpo_detail::unit_part_fn unit_part{};
/// lacuna::gcd(a, b): the normalized gcd. Default: Euclid's algorithm.
inline constexpr cpo_detail::gcd_fn gcd{};
/// lacuna::extended_gcd(a, b): {g, s, t}, s * a + t * b == g == gcd(a, b).
inline constexpr cpo_detail::extended_gcd_fn extended_gcd{};
}  // namespace cpo

}  // namespace lacuna

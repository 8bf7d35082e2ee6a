// lacuna/ring/concepts.hpp — the coefficient-ring concepts and their customization points.
//
// A coefficient ring is a type R with value semantics whose operators + - * == model a
// commutative ring with one. The concepts refine one another:
//
//     commutative_ring  ->  euclidean_domain  ->  field
//
// Operations that operators cannot express go through the customization points below
// (lacuna::from_integer, lacuna::div_rem, ...). Each one resolves, in this order, to
//   1. a static member of a specialization of lacuna::ring_traits<R>   (full control),
//   2. a free function found by argument-dependent lookup in R's namespace (the easy way),
//   3. a generic default built on the compulsory operations, where one exists.
// docs/rings.md has the two tables: what is compulsory, and what is optional with a default.
//
// Properties that syntax cannot check are opt-in: a type is a ring for lacuna only if
// lacuna::enable_exact_ring<R> is true, so that double or float never pass by accident.
#pragma once

#include <concepts>
#include <cstdint>
#include <type_traits>
#include <utility>

namespace lacuna {

/// Full-control customization point: specialize for a type you cannot (or do not want to)
/// give free functions. Every member is optional; see docs/rings.md for the list:
///   static constexpr bool is_exact;            opt in as an exact ring
///   static R from_integer(std::int64_t);
///   static R zero(); static R one();
///   static div_rem_result<R> div_rem(const R&, const R&);
///   static auto euclidean_size(const R&);      any totally ordered unsigned-like value
///   static bool is_unit(const R&);
///   static R normalize(const R&);              the canonical associate
///   static R unit_part(const R&);              u with a == u * normalize(a)
///   static R inverse(const R&);                fields only, a != 0
///   static constexpr std::uint64_t characteristic;
template <class R>
struct ring_traits {};

/// Quotient and remainder of a Euclidean division a = quotient * b + remainder.
template <class R>
struct div_rem_result {
  /// The quotient.
  R quotient;
  /// The remainder.
  R remainder;
};

namespace detail {
template <class R>
concept traits_say_exact = requires {
  { ring_traits<R>::is_exact } -> std::convertible_to<bool>;
} && ring_traits<R>::is_exact;
}  // namespace detail

/// Opt-in: true for exact rings. Specialize to true for your own type (or set
/// ring_traits<R>::is_exact). Floating-point types are never exact.
template <class R>
inline constexpr bool enable_exact_ring = detail::traits_say_exact<R>;

// ---------------------------------------------------------------------------------------
// Customization-point objects. Each is a function object in namespace lacuna, so that
// lacuna::div_rem(a, b) is never hijacked by an unconstrained overload, and passes
// through ring_traits, then ADL, then the default.
// ---------------------------------------------------------------------------------------
namespace cpo_detail {

// Poison pills: block unqualified lookup from finding the CPO objects themselves.
void from_integer() = delete;
void div_rem() = delete;
void euclidean_size() = delete;
void is_unit() = delete;
void normalize() = delete;
void unit_part() = delete;
void inverse() = delete;

template <class R>
struct from_integer_fn {
  constexpr R operator()(std::int64_t n) const
    requires requires { { ring_traits<R>::from_integer(n) } -> std::convertible_to<R>; }
  {
    return ring_traits<R>::from_integer(n);
  }
  constexpr R operator()(std::int64_t n) const
    requires(!requires { ring_traits<R>::from_integer(n); } &&
             requires { { from_integer(std::type_identity<R>{}, n) } -> std::convertible_to<R>; })
  {
    return from_integer(std::type_identity<R>{}, n);
  }
  constexpr R operator()(std::int64_t n) const
    requires(!requires { ring_traits<R>::from_integer(n); } &&
             !requires { from_integer(std::type_identity<R>{}, n); } && std::constructible_from<R, std::int64_t>)
  {
    return R(n);
  }
};

struct div_rem_fn {
  template <class R>
    requires requires(const R& a) { { ring_traits<R>::div_rem(a, a) } -> std::convertible_to<div_rem_result<R>>; }
  constexpr div_rem_result<R> operator()(const R& a, const R& b) const {
    return ring_traits<R>::div_rem(a, b);
  }
  template <class R>
    requires(!requires(const R& a) { ring_traits<R>::div_rem(a, a); } &&
             requires(const R& a) { { div_rem(a, a) } -> std::convertible_to<div_rem_result<R>>; })
  constexpr div_rem_result<R> operator()(const R& a, const R& b) const {
    return div_rem(a, b);
  }
  /// Default: the operators / and %.
  template <class R>
    requires(!requires(const R& a) { ring_traits<R>::div_rem(a, a); } &&
             !requires(const R& a) { div_rem(a, a); } &&
             requires(const R& a, const R& b) {
               { a / b } -> std::convertible_to<R>;
               { a % b } -> std::convertible_to<R>;
             })
  constexpr div_rem_result<R> operator()(const R& a, const R& b) const {
    return {R(a / b), R(a % b)};
  }
};

struct euclidean_size_fn {
  template <class R>
    requires requires(const R& a) { ring_traits<R>::euclidean_size(a); }
  constexpr auto operator()(const R& a) const {
    return ring_traits<R>::euclidean_size(a);
  }
  template <class R>
    requires(!requires(const R& a) { ring_traits<R>::euclidean_size(a); } &&
             requires(const R& a) { euclidean_size(a); })
  constexpr auto operator()(const R& a) const {
    return euclidean_size(a);
  }
};

struct normalize_fn {
  template <class R>
    requires requires(const R& a) { { ring_traits<R>::normalize(a) } -> std::convertible_to<R>; }
  constexpr R operator()(const R& a) const {
    return ring_traits<R>::normalize(a);
  }
  template <class R>
    requires(!requires(const R& a) { ring_traits<R>::normalize(a); } &&
             requires(const R& a) { { normalize(a) } -> std::convertible_to<R>; })
  constexpr R operator()(const R& a) const {
    return normalize(a);
  }
};

struct inverse_fn {
  template <class R>
    requires requires(const R& a) { { ring_traits<R>::inverse(a) } -> std::convertible_to<R>; }
  constexpr R operator()(const R& a) const {
    return ring_traits<R>::inverse(a);
  }
  template <class R>
    requires(!requires(const R& a) { ring_traits<R>::inverse(a); } &&
             requires(const R& a) { { inverse(a) } -> std::convertible_to<R>; })
  constexpr R operator()(const R& a) const {
    return inverse(a);
  }
};

}  // namespace cpo_detail

inline namespace cpo {
/// lacuna::from_integer<R>(n): the image of the machine integer n in R.
template <class R>
inline constexpr cpo_detail::from_integer_fn<R> from_integer{};
/// lacuna::div_rem(a, b): Euclidean division, b != 0.
inline constexpr cpo_detail::div_rem_fn div_rem{};
/// lacuna::euclidean_size(a): the Euclidean function; size(r) < size(b) for a remainder r != 0.
inline constexpr cpo_detail::euclidean_size_fn euclidean_size{};
/// lacuna::normalize(a): the canonical associate of a (e.g. |a| in Z, 1 for a unit in a field).
inline constexpr cpo_detail::normalize_fn normalize{};
/// lacuna::inverse(a): multiplicative inverse in a field, a != 0.
inline constexpr cpo_detail::inverse_fn inverse{};
}  // namespace cpo

///@{
/// lacuna::zero<R>(), lacuna::one<R>().
template <class R>
constexpr R zero() {
  if constexpr (requires { { ring_traits<R>::zero() } -> std::convertible_to<R>; })
    return ring_traits<R>::zero();
  else
    return from_integer<R>(0);
}
template <class R>
constexpr R one() {
  if constexpr (requires { { ring_traits<R>::one() } -> std::convertible_to<R>; })
    return ring_traits<R>::one();
  else
    return from_integer<R>(1);
}
///@}

// ---------------------------------------------------------------------------------------
// The concepts
// ---------------------------------------------------------------------------------------

/// A commutative ring with one, with exact arithmetic: R is copyable and comparable, has
/// + - (binary and unary) * and their compound forms, and maps machine integers into R.
/// Opt in with enable_exact_ring<R> (or ring_traits<R>::is_exact).
template <class R>
concept commutative_ring =
    std::regular<R> && enable_exact_ring<R> &&
    requires(const R& a, const R& b, R& m, std::int64_t n) {
      { a + b } -> std::convertible_to<R>;
      { a - b } -> std::convertible_to<R>;
      { -a } -> std::convertible_to<R>;
      { a * b } -> std::convertible_to<R>;
      { m += b } -> std::same_as<R&>;
      { m -= b } -> std::same_as<R&>;
      { m *= b } -> std::same_as<R&>;
      { lacuna::from_integer<R>(n) } -> std::same_as<R>;
    };

/// A Euclidean domain: a commutative ring with division with remainder (lacuna::div_rem)
/// for a Euclidean size (lacuna::euclidean_size) and a canonical associate
/// (lacuna::normalize). is_unit, unit_part, gcd and extended gcd come from
/// lacuna/ring/euclid.hpp on top of these.
template <class R>
concept euclidean_domain = commutative_ring<R> && requires(const R& a, const R& b) {
  { lacuna::div_rem(a, b) } -> std::same_as<div_rem_result<R>>;
  { lacuna::euclidean_size(a) } -> std::totally_ordered;
  { lacuna::normalize(a) } -> std::same_as<R>;
};

/// A field: a Euclidean domain in which every non-zero element has an inverse
/// (lacuna::inverse).
template <class R>
concept field = euclidean_domain<R> && requires(const R& a) {
  { lacuna::inverse(a) } -> std::same_as<R>;
};

/// The characteristic of R where it declares one (ring_traits<R>::characteristic), else 0.
template <class R>
inline constexpr std::uint64_t characteristic_v = [] {
  if constexpr (requires { ring_traits<R>::characteristic; })
    return static_cast<std::uint64_t>(ring_traits<R>::characteristic);
  else
    return std::uint64_t{0};
}();

}  // namespace lacuna

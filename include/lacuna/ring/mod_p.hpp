// lacuna/ring/mod_p.hpp — the prime fields Z/p: lacuna::mod_p<P> with the modulus fixed at
// compile time, and lacuna::mod_p_dynamic with the modulus chosen at run time.
//
// Elements are stored reduced, in [0, p). Moduli go up to 2^62 so that a sum of two residues
// never wraps; products go through a 128-bit intermediate (a 64-bit one when p < 2^32).
// Inverses use the extended Euclidean algorithm on machine words.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/primality.hpp>

#include <compare>
#include <cstdint>
#include <functional>
#include <ostream>
#include <stdexcept>
#include <string>

namespace lacuna {

/// The largest modulus mod_p and mod_p_dynamic accept (exclusive): 2^62.
inline constexpr std::uint64_t mod_p_modulus_limit = std::uint64_t{1} << 62U;

namespace detail {

constexpr std::uint64_t reduce_signed(std::int64_t n, std::uint64_t p) noexcept {
  if (n >= 0) return static_cast<std::uint64_t>(n) % p;
  // -n may overflow for INT64_MIN: go through the unsigned magnitude.
  const std::uint64_t r = (std::uint64_t{0} - static_cast<std::uint64_t>(n)) % p;
  return r == 0 ? 0 : p - r;
}
constexpr std::uint64_t add_mod(std::uint64_t a, std::uint64_t b, std::uint64_t p) noexcept {
  const std::uint64_t s = a + b;  // < 2^63, no wrap
  return s >= p ? s - p : s;
}
constexpr std::uint64_t sub_mod(std::uint64_t a, std::uint64_t b, std::uint64_t p) noexcept {
  return a >= b ? a - b : a + p - b;
}
constexpr std::uint64_t mul_mod(std::uint64_t a, std::uint64_t b, std::uint64_t p) noexcept {
  if (p <= (std::uint64_t{1} << 32U)) return a * b % p;  // a, b < 2^32: no overflow
  return mul_mod_u64(a, b, p);
}
/// a^-1 mod p for 0 < a < p, p prime: extended Euclid on (p, a), tracking the coefficient
/// of a only; coefficients stay below p in absolute value, so int64 suffices for p < 2^62.
constexpr std::uint64_t inv_mod(std::uint64_t a, std::uint64_t p) noexcept {
  std::int64_t t0 = 0, t1 = 1;
  std::uint64_t r0 = p, r1 = a;
  while (r1 != 0) {
    const std::uint64_t q = r0 / r1;
    const std::uint64_t r2 = r0 - q * r1;
    const std::int64_t t2 = t0 - static_cast<std::int64_t>(q) * t1;
    r0 = r1;
    r1 = r2;
    t0 = t1;
    t1 = t2;
  }
  return t0 < 0 ? static_cast<std::uint64_t>(t0 + static_cast<std::int64_t>(p)) : static_cast<std::uint64_t>(t0);
}

[[noreturn]] inline void throw_inverse_of_zero(const char* who) {
  throw std::domain_error(std::string(who) + ": zero has no inverse");
}

}  // namespace detail

/// Z/P for a prime P < 2^62 fixed at compile time (models field). Constructing from an
/// integer reduces it (so -1 is P - 1).
template <std::uint64_t P>
class mod_p {
  static_assert(P >= 2 && P < mod_p_modulus_limit, "lacuna::mod_p<P>: P must satisfy 2 <= P < 2^62");
  static_assert(is_prime(P), "lacuna::mod_p<P>: the modulus P must be prime");

 public:
  /// Zero.
  constexpr mod_p() noexcept = default;
  /// The residue of n; implicit, as the ring map Z -> Z/P.
  constexpr mod_p(std::int64_t n) noexcept : v_(detail::reduce_signed(n, P)) {}  // NOLINT
  /// The element with residue r, r < P (unchecked).
  static constexpr mod_p from_residue(std::uint64_t r) noexcept {
    mod_p x;
    x.v_ = r;
    return x;
  }

  /// The modulus P.
  static constexpr std::uint64_t modulus() noexcept { return P; }
  /// The residue in [0, P).
  [[nodiscard]] constexpr std::uint64_t value() const noexcept { return v_; }

  ///@{
  /// Sum, difference, product and negation mod P.
  friend constexpr mod_p operator+(mod_p a, mod_p b) noexcept { return from_residue(detail::add_mod(a.v_, b.v_, P)); }
  friend constexpr mod_p operator-(mod_p a, mod_p b) noexcept { return from_residue(detail::sub_mod(a.v_, b.v_, P)); }
  friend constexpr mod_p operator*(mod_p a, mod_p b) noexcept { return from_residue(detail::mul_mod(a.v_, b.v_, P)); }
  friend constexpr mod_p operator-(mod_p a) noexcept { return from_residue(a.v_ == 0 ? 0 : P - a.v_); }
  ///@}
  /// Field division a * b^-1; throws std::domain_error if b == 0.
  friend constexpr mod_p operator/(mod_p a, mod_p b) { return a * b.inverse(); }
  ///@{
  /// Compound assignment: *this = *this op b (/ throws std::domain_error if b == 0).
  constexpr mod_p& operator+=(mod_p b) noexcept { return *this = *this + b; }
  constexpr mod_p& operator-=(mod_p b) noexcept { return *this = *this - b; }
  constexpr mod_p& operator*=(mod_p b) noexcept { return *this = *this * b; }
  constexpr mod_p& operator/=(mod_p b) { return *this = *this / b; }
  /// Equal residues.
  ///@}
  friend constexpr bool operator==(mod_p, mod_p) noexcept = default;

  /// a^-1; throws std::domain_error for zero.
  [[nodiscard]] constexpr mod_p inverse() const {
    if (v_ == 0) detail::throw_inverse_of_zero("lacuna::mod_p");
    return from_residue(detail::inv_mod(v_, P));
  }
  /// a^e by repeated squaring.
  [[nodiscard]] constexpr mod_p pow(std::uint64_t e) const noexcept {
    mod_p r = from_residue(1 % P), b = *this;
    for (; e != 0; e >>= 1U) {
      if (e & 1U) r *= b;
      b *= b;
    }
    return r;
  }

  /// Writes the residue.
  friend std::ostream& operator<<(std::ostream& os, mod_p a) { return os << a.v_; }

 private:
  std::uint64_t v_ = 0;
};

/// A field's Euclidean structure: every non-zero element divides exactly, size 0 or 1,
/// and normalize sends non-zero elements to one.
template <std::uint64_t P>
struct ring_traits<mod_p<P>> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes, for Z/P.
  using R = mod_p<P>;
  static constexpr bool is_exact = true;
  static constexpr std::uint64_t characteristic = P;
  static constexpr R from_integer(std::int64_t n) noexcept { return R(n); }
  static constexpr div_rem_result<R> div_rem(R a, R b) { return {a / b, R()}; }
  static constexpr unsigned euclidean_size(R a) noexcept { return a.value() != 0; }
  static constexpr R normalize(R a) noexcept { return R(a.value() != 0); }
  static constexpr R unit_part(R a) noexcept { return a.value() != 0 ? a : R(1); }
  static constexpr bool is_unit(R a) noexcept { return a.value() != 0; }
  static constexpr R inverse(R a) { return a.inverse(); }
  ///@}
};

// ---------------------------------------------------------------------------------------

/// A prime modulus p < 2^62, checked once at construction; mod_p_dynamic elements built from
/// it skip the check.
class prime_modulus {
 public:
  /// Throws std::invalid_argument unless p is a prime below 2^62.
  explicit constexpr prime_modulus(std::uint64_t p) : p_(p) {
    if (p >= mod_p_modulus_limit)
      throw std::invalid_argument("lacuna::mod_p_dynamic: modulus " + std::to_string(p) + " is not below 2^62");
    if (!is_prime(p))
      throw std::invalid_argument("lacuna::mod_p_dynamic: modulus " + std::to_string(p) + " is not prime");
  }
  /// The prime p.
  [[nodiscard]] constexpr std::uint64_t value() const noexcept { return p_; }

 private:
  std::uint64_t p_;
};

/// Z/p with p chosen at run time (models field). Each element carries its modulus.
///
/// The integers without a modulus: lacuna::zero, lacuna::one and lacuna::from_integer (and
/// construction from a bare integer) cannot know p, so they make an *unbound* element, which
/// holds the integer itself. An unbound element adopts the modulus of the other operand in
/// any operation with a bound one; so generic code may start from zero<R>() and add bound
/// elements. Two unbound operands give an unbound result, computed exactly in 64 bits
/// (std::overflow_error if it does not fit: bind first). Mixing two different moduli throws
/// std::invalid_argument. Equality binds the same way, so 3 (mod 7) == unbound 10; it is an
/// equivalence on the elements of one modulus and on the unbound ones.
class mod_p_dynamic {
 public:
  /// Unbound zero.
  constexpr mod_p_dynamic() noexcept = default;
  /// The unbound integer n; implicit, as the ring map Z -> Z/p for any p.
  constexpr mod_p_dynamic(std::int64_t n) noexcept : v_(static_cast<std::uint64_t>(n)) {}  // NOLINT
  /// n mod p.
  constexpr mod_p_dynamic(std::int64_t n, prime_modulus p) noexcept : v_(detail::reduce_signed(n, p.value())), p_(p.value()) {}
  /// n mod p; throws std::invalid_argument unless p is a prime below 2^62.
  mod_p_dynamic(std::int64_t n, std::uint64_t p) : mod_p_dynamic(n, prime_modulus(p)) {}

  /// True iff the element carries a modulus.
  [[nodiscard]] constexpr bool is_bound() const noexcept { return p_ != 0; }
  /// The modulus, or 0 for an unbound element.
  [[nodiscard]] constexpr std::uint64_t modulus() const noexcept { return p_; }
  /// The residue in [0, p) of a bound element.
  [[nodiscard]] constexpr std::uint64_t value() const noexcept { return v_; }
  /// The integer of an unbound element.
  [[nodiscard]] constexpr std::int64_t unbound_value() const noexcept { return static_cast<std::int64_t>(v_); }

  ///@{
  /// Sum, difference, product and negation: mod p when an operand is bound (throws std::invalid_argument for two different moduli), exact integer arithmetic between unbound elements (overflow throws).
  friend mod_p_dynamic operator+(const mod_p_dynamic& a, const mod_p_dynamic& b) {
    const std::uint64_t p = common(a, b);
    if (p == 0) return exact(a, b, [](std::int64_t x, std::int64_t y, std::int64_t& r) { return checked_add(x, y, r); });
    return raw(detail::add_mod(a.residue(p), b.residue(p), p), p);
  }
  friend mod_p_dynamic operator-(const mod_p_dynamic& a, const mod_p_dynamic& b) {
    const std::uint64_t p = common(a, b);
    if (p == 0) return exact(a, b, [](std::int64_t x, std::int64_t y, std::int64_t& r) { return checked_sub(x, y, r); });
    return raw(detail::sub_mod(a.residue(p), b.residue(p), p), p);
  }
  friend mod_p_dynamic operator*(const mod_p_dynamic& a, const mod_p_dynamic& b) {
    const std::uint64_t p = common(a, b);
    if (p == 0) return exact(a, b, [](std::int64_t x, std::int64_t y, std::int64_t& r) { return checked_mul(x, y, r); });
    return raw(detail::mul_mod(a.residue(p), b.residue(p), p), p);
  }
  friend mod_p_dynamic operator-(const mod_p_dynamic& a) { return mod_p_dynamic() - a; }
  ///@}
  /// Field division a * b^-1; throws std::domain_error if b == 0.
  friend mod_p_dynamic operator/(const mod_p_dynamic& a, const mod_p_dynamic& b) {
    const std::uint64_t p = common(a, b);
    if (p == 0) return a * b.inverse();
    return a * raw(b.residue(p), p).inverse();
  }
  ///@{
  /// Compound assignment: *this = *this op b.
  mod_p_dynamic& operator+=(const mod_p_dynamic& b) { return *this = *this + b; }
  mod_p_dynamic& operator-=(const mod_p_dynamic& b) { return *this = *this - b; }
  mod_p_dynamic& operator*=(const mod_p_dynamic& b) { return *this = *this * b; }
  mod_p_dynamic& operator/=(const mod_p_dynamic& b) { return *this = *this / b; }
  ///@}

  /// Equal after binding the unbound operand; false for two different moduli.
  friend constexpr bool operator==(const mod_p_dynamic& a, const mod_p_dynamic& b) noexcept {
    if (a.p_ == b.p_) return a.v_ == b.v_;
    if (a.p_ != 0 && b.p_ != 0) return false;
    const std::uint64_t p = a.p_ | b.p_;
    return a.residue(p) == b.residue(p);
  }

  /// a^-1: for a bound element, the inverse mod p (std::domain_error for zero); for an
  /// unbound one, only 1 and -1 are invertible without a modulus (std::domain_error else).
  [[nodiscard]] mod_p_dynamic inverse() const {
    if (p_ == 0) {
      if (v_ == 1 || unbound_value() == -1) return *this;
      throw std::domain_error("lacuna::mod_p_dynamic: the inverse of the unbound integer " +
                              std::to_string(unbound_value()) + " needs a modulus");
    }
    if (v_ == 0) detail::throw_inverse_of_zero("lacuna::mod_p_dynamic");
    return raw(detail::inv_mod(v_, p_), p_);
  }

  /// "r mod p", or the integer for an unbound element.
  friend std::ostream& operator<<(std::ostream& os, const mod_p_dynamic& a) {
    if (a.p_ == 0) return os << a.unbound_value();
    return os << a.v_ << " mod " << a.p_;
  }

 private:
  std::uint64_t v_ = 0;  // residue if bound, the int64 bit pattern if unbound
  std::uint64_t p_ = 0;  // 0: unbound

  static constexpr mod_p_dynamic raw(std::uint64_t v, std::uint64_t p) noexcept {
    mod_p_dynamic x;
    x.v_ = v;
    x.p_ = p;
    return x;
  }
  [[nodiscard]] constexpr std::uint64_t residue(std::uint64_t p) const noexcept {
    return p_ != 0 ? v_ : detail::reduce_signed(unbound_value(), p);
  }
  static std::uint64_t common(const mod_p_dynamic& a, const mod_p_dynamic& b) {
    if (a.p_ != 0 && b.p_ != 0 && a.p_ != b.p_)
      throw std::invalid_argument("lacuna::mod_p_dynamic: operands have different moduli (" + std::to_string(a.p_) +
                                  " and " + std::to_string(b.p_) + ")");
    return a.p_ | b.p_;
  }
  template <class Op>
  static mod_p_dynamic exact(const mod_p_dynamic& a, const mod_p_dynamic& b, Op op) {
    std::int64_t r = 0;
    if (op(a.unbound_value(), b.unbound_value(), r))
      throw std::overflow_error("lacuna::mod_p_dynamic: arithmetic on unbound integers overflows 64 bits; bind a modulus first");
    return mod_p_dynamic(r);
  }
  friend struct ring_traits<mod_p_dynamic>;
};

/// mod_p_dynamic as a field: every non-zero element is a unit, size 0 or 1.
template <>
struct ring_traits<mod_p_dynamic> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes, for Z/p with p chosen at run time.
  using R = mod_p_dynamic;
  static constexpr bool is_exact = true;
  static constexpr R from_integer(std::int64_t n) noexcept { return R(n); }
  /// {a / b, 0}: every non-zero b divides exactly. The zero remainder carries the modulus.
  static div_rem_result<R> div_rem(const R& a, const R& b) {
    R q = a / b;
    return {q, R::raw(0, q.p_)};
  }
  static unsigned euclidean_size(const R& a) noexcept { return !(a == R()); }
  static R normalize(const R& a) noexcept {
    if (a == R()) return a;
    return a.p_ == 0 ? R(1) : R::raw(1, a.p_);
  }
  static R unit_part(const R& a) noexcept {
    if (a == R()) return a.p_ == 0 ? R(1) : R::raw(1, a.p_);
    return a;
  }
  static R inverse(const R& a) { return a.inverse(); }
  ///@}
};

}  // namespace lacuna

/// Hash of the residue and modulus (unbound elements hash their integer with modulus 0, so
/// hashing agrees with equality only among elements of one modulus).
template <>
struct std::hash<lacuna::mod_p_dynamic> {
  /// Hash of the residue and the modulus.
  std::size_t operator()(const lacuna::mod_p_dynamic& a) const noexcept {
    return std::hash<std::uint64_t>{}((a.value() * 0x9E3779B97F4A7C15ULL) ^ a.modulus());
  }
};
/// Hash of the residue.
template <std::uint64_t P>
struct std::hash<lacuna::mod_p<P>> {
  /// Hash of the residue.
  std::size_t operator()(lacuna::mod_p<P> a) const noexcept { return std::hash<std::uint64_t>{}(a.value()); }
};

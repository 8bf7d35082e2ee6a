// lacuna/ring/integer.hpp — lacuna::integer, the exact integer with a 64-bit fast path.
//
// A value is held inline as a std::int64_t while it fits, and as a heap-allocated
// boost::multiprecision::cpp_int only when it does not. The representation is canonical:
// a value that fits in 64 bits is always small, so equality, ordering and hashing branch on
// the flag without converting. sizeof(integer) == 16: the inline value and a pointer that is
// null on the small path (the flag). The small path never allocates.
//
// Division is truncating, as for C++'s built-in integers: a / b rounds toward zero and
// a % b has the sign of a, with a == (a / b) * b + a % b and |a % b| < |b|. That is a
// Euclidean division for the size |a|. Division by zero throws std::domain_error.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <lacuna/ring/detail/cpp_int.hpp>

#include <compare>
#include <concepts>
#include <cstdint>
#include <functional>
#include <limits>
#include <numeric>
#include <ostream>
#include <stdexcept>
#include <string>
#include <utility>

namespace lacuna {

/// An exact integer (models euclidean_domain): 64 bits inline, big on overflow.
class integer {
 public:
  /// The Boost.Multiprecision integer that holds values beyond 64 bits.
  using big_type = boost::multiprecision::cpp_int;

  /// Zero.
  constexpr integer() noexcept = default;

  /// The value n; implicit, so that `x + 1` and `integer x = 5;` read naturally.
  template <std::integral T>
    requires(!std::same_as<T, bool>)
  constexpr integer(T n) noexcept(std::is_signed_v<T> || sizeof(T) < sizeof(std::int64_t)) {  // NOLINT
    if constexpr (std::is_signed_v<T> || sizeof(T) < sizeof(std::int64_t)) {
      small_ = static_cast<std::int64_t>(n);
    } else if (n <= static_cast<T>(std::numeric_limits<std::int64_t>::max())) {
      small_ = static_cast<std::int64_t>(n);
    } else {
      big_ = new big_type(n);
    }
  }

  /// The value of a big integer; small if it fits.
  explicit integer(const big_type& n) { assign_big(n); }
  /// The value of a big integer; small if it fits.
  explicit integer(big_type&& n) { assign_big(std::move(n)); }

  ///@{
  /// Copy and move: value semantics.
  integer(const integer& o) : small_(o.small_), big_(o.big_ ? new big_type(*o.big_) : nullptr) {}
  constexpr integer(integer&& o) noexcept : small_(o.small_), big_(std::exchange(o.big_, nullptr)) {}
  integer& operator=(const integer& o) {
    if (this == &o) return *this;
    if (o.big_ == nullptr) {
      release();
      small_ = o.small_;
    } else if (big_ != nullptr) {
      *big_ = *o.big_;
    } else {
      big_ = new big_type(*o.big_);
    }
    return *this;
  }
  integer& operator=(integer&& o) noexcept {
    std::swap(small_, o.small_);
    std::swap(big_, o.big_);
    return *this;
  }
  ///@}
  ~integer() { delete big_; }

  /// True iff the value fits in a std::int64_t (and is stored inline).
  [[nodiscard]] constexpr bool is_small() const noexcept { return big_ == nullptr; }
  /// The value; precondition is_small().
  [[nodiscard]] constexpr std::int64_t small_value() const noexcept { return small_; }
  /// The value as a big integer (copies).
  [[nodiscard]] big_type to_big() const { return big_ ? *big_ : big_type(small_); }
  /// -1, 0 or 1.
  [[nodiscard]] int sign() const noexcept {
    if (big_ == nullptr) return (small_ > 0) - (small_ < 0);
    return big_->sign();
  }
  /// Decimal digits, with a leading '-' for negative values.
  [[nodiscard]] std::string to_string() const { return big_ ? big_->str() : std::to_string(small_); }

  // ---- arithmetic: the small path inline, the rest out of line ------------------------
  ///@{
  /// Exact sum, difference and product: 64-bit arithmetic, big integers on overflow.
  friend integer operator+(const integer& a, const integer& b) {
    std::int64_t r;
    if (a.both_small(b) && !checked_add(a.small_, b.small_, r)) [[likely]]
      return integer(r);
    return from_big_value(a.to_big() + b.to_big());
  }
  friend integer operator-(const integer& a, const integer& b) {
    std::int64_t r;
    if (a.both_small(b) && !checked_sub(a.small_, b.small_, r)) [[likely]]
      return integer(r);
    return from_big_value(a.to_big() - b.to_big());
  }
  friend integer operator*(const integer& a, const integer& b) {
    std::int64_t r;
    if (a.both_small(b) && !checked_mul(a.small_, b.small_, r)) [[likely]]
      return integer(r);
    return from_big_value(a.to_big() * b.to_big());
  }
  ///@}
  /// Truncating quotient (rounds toward zero). Throws std::domain_error if b == 0.
  friend integer operator/(const integer& a, const integer& b) {
    if (b.is_zero()) throw_division_by_zero();
    // INT64_MIN / -1 is the one small quotient that overflows.
    if (a.both_small(b) && !(b.small_ == -1 && a.small_ == min64)) [[likely]]
      return integer(a.small_ / b.small_);
    return from_big_value(big_type(a.to_big() / b.to_big()));
  }
  /// Truncating remainder (sign of a, |a % b| < |b|). Throws std::domain_error if b == 0.
  friend integer operator%(const integer& a, const integer& b) {
    if (b.is_zero()) throw_division_by_zero();
    if (a.both_small(b)) [[likely]]
      return integer(b.small_ == -1 ? 0 : a.small_ % b.small_);  // INT64_MIN % -1 is UB in C++.
    return from_big_value(big_type(a.to_big() % b.to_big()));
  }
  ///@{
  /// Exact negation (big for -INT64_MIN), and unary plus.
  friend integer operator-(const integer& a) {
    std::int64_t r;
    if (a.is_small() && !checked_neg(a.small_, r)) [[likely]]
      return integer(r);
    return from_big_value(big_type(-a.to_big()));
  }
  friend integer operator+(const integer& a) { return a; }
  ///@}

  ///@{
  /// Compound assignment: *this = *this op b (/ and % throw std::domain_error if b == 0).
  integer& operator+=(const integer& b) { return *this = *this + b; }
  integer& operator-=(const integer& b) { return *this = *this - b; }
  integer& operator*=(const integer& b) { return *this = *this * b; }
  integer& operator/=(const integer& b) { return *this = *this / b; }
  integer& operator%=(const integer& b) { return *this = *this % b; }
  ///@}

  // ---- comparison: canonical form means a big value lies outside the 64-bit range ------
  ///@{
  /// Comparison of the values.
  friend bool operator==(const integer& a, const integer& b) noexcept {
    if (a.both_small(b)) return a.small_ == b.small_;
    if (a.is_small() != b.is_small()) return false;
    return *a.big_ == *b.big_;
  }
  friend std::strong_ordering operator<=>(const integer& a, const integer& b) noexcept {
    if (a.both_small(b)) return a.small_ <=> b.small_;
    if (a.is_small()) return 0 <=> b.big_->sign();   // |b| beyond 64 bits: b's sign decides
    if (b.is_small()) return a.big_->sign() <=> 0;
    return a.big_->compare(*b.big_) <=> 0;
  }
  ///@}

  /// Writes the decimal digits.
  friend std::ostream& operator<<(std::ostream& os, const integer& a) {
    if (a.big_) return os << *a.big_;
    return os << a.small_;
  }

  /// |a|.
  friend integer abs(const integer& a) { return a.sign() < 0 ? -a : a; }

 private:
  static constexpr std::int64_t min64 = std::numeric_limits<std::int64_t>::min();

  std::int64_t small_ = 0;
  big_type* big_ = nullptr;  // non-null iff the value does not fit in 64 bits

  [[nodiscard]] constexpr bool both_small(const integer& b) const noexcept { return (big_ == nullptr) & (b.big_ == nullptr); }
  [[nodiscard]] constexpr bool is_zero() const noexcept { return big_ == nullptr && small_ == 0; }
  void release() noexcept {
    delete big_;
    big_ = nullptr;
  }
  template <class B>
  void assign_big(B&& n) {
    if (n >= min64 && n <= std::numeric_limits<std::int64_t>::max()) {
      release();
      small_ = static_cast<std::int64_t>(n);
    } else if (big_) {
      *big_ = std::forward<B>(n);
    } else {
      big_ = new big_type(std::forward<B>(n));
    }
  }
  [[gnu::noinline]] static integer from_big_value(big_type&& n) {
    integer r;
    r.assign_big(std::move(n));
    return r;
  }
  [[noreturn, gnu::cold]] static void throw_division_by_zero() {
    throw std::domain_error("lacuna::integer: division by zero");
  }

  friend struct ring_traits<integer>;
};

/// lacuna::integer as a Euclidean domain: size |a|, normalize |a|, unit part the sign, and
/// 64-bit fast paths for gcd and is_unit.
template <>
struct ring_traits<integer> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes, for the integers.
  static constexpr bool is_exact = true;
  static constexpr std::uint64_t characteristic = 0;
  static integer from_integer(std::int64_t n) noexcept { return integer(n); }
  static div_rem_result<integer> div_rem(const integer& a, const integer& b) {
    if (b.is_zero()) integer::throw_division_by_zero();
    if (a.both_small(b) && !(b.small_ == -1)) [[likely]]
      return {integer(a.small_ / b.small_), integer(a.small_ % b.small_)};
    if (a.both_small(b)) return {-a, integer()};
    integer::big_type q, r;
    boost::multiprecision::divide_qr(a.to_big(), b.to_big(), q, r);
    return {integer(std::move(q)), integer(std::move(r))};
  }
  static integer euclidean_size(const integer& a) { return abs(a); }
  static integer normalize(const integer& a) { return abs(a); }
  static integer unit_part(const integer& a) noexcept { return integer(a.sign() < 0 ? -1 : 1); }
  static bool is_unit(const integer& a) noexcept { return a.is_small() && (a.small_ == 1 || a.small_ == -1); }
  static integer gcd(const integer& a, const integer& b) {
    if (a.both_small(b)) {
      // On magnitudes: |INT64_MIN| == 2^63 fits in uint64, and gcd(2^63, 0) becomes big.
      auto mag = [](std::int64_t v) { return v < 0 ? std::uint64_t{0} - static_cast<std::uint64_t>(v) : static_cast<std::uint64_t>(v); };
      return integer(std::gcd(mag(a.small_), mag(b.small_)));
    }
    return integer(integer::big_type(boost::multiprecision::gcd(a.to_big(), b.to_big())));
  }
  ///@}
};

static_assert(sizeof(integer) <= 16);

}  // namespace lacuna

/// Hash of the value (the same for the small and the big form of one value: the form is canonical).
template <>
struct std::hash<lacuna::integer> {
  /// Hash of the value.
  std::size_t operator()(const lacuna::integer& a) const {
    if (a.is_small()) return std::hash<std::int64_t>{}(a.small_value());
    return std::hash<boost::multiprecision::cpp_int>{}(a.to_big());
  }
};

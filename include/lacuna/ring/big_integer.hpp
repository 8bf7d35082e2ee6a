// lacuna/ring/big_integer.hpp — lacuna::big_integer, an always-heap exact integer: a thin
// wrapper on boost::multiprecision::cpp_int.
//
// Why a wrapper and not ring_traits<cpp_int>: cpp_int's operators return expression
// templates, so generic code writing `auto c = a * b + d;` would hold references to
// temporaries; the wrapper's operators return big_integer. It also keeps lacuna's
// customization points away from ADL into boost::multiprecision, and gives cpp_int values
// one place to opt in as an exact ring. Use lacuna::integer for speed; big_integer is the
// plain reference ring (and the right choice when nearly every value is large).
//
// Division truncates toward zero, as for lacuna::integer and C++'s built-in integers.
#pragma once

#include <lacuna/ring/concepts.hpp>

#include <lacuna/ring/detail/cpp_int.hpp>

#include <compare>
#include <cstdint>
#include <functional>
#include <ostream>
#include <stdexcept>
#include <string>
#include <utility>

namespace lacuna {

/// An exact integer on cpp_int (models euclidean_domain).
class big_integer {
 public:
  /// The Boost.Multiprecision integer that holds the value.
  using big_type = boost::multiprecision::cpp_int;

  /// Zero.
  big_integer() = default;
  /// The value n; implicit.
  big_integer(std::int64_t n) : v_(n) {}  // NOLINT
  /// The value v.
  explicit big_integer(big_type v) : v_(std::move(v)) {}
  /// Parses decimal digits (with an optional '-'); throws std::runtime_error on bad input.
  explicit big_integer(const std::string& digits) : v_(digits) {}

  /// The value as a Boost.Multiprecision integer.
  [[nodiscard]] const big_type& value() const noexcept { return v_; }
  /// Decimal digits, with a leading '-' for negative values.
  [[nodiscard]] std::string to_string() const { return v_.str(); }
  /// -1, 0 or 1.
  [[nodiscard]] int sign() const noexcept { return v_.sign(); }

  ///@{
  /// Exact sum, difference and product (never overflow).
  friend big_integer operator+(const big_integer& a, const big_integer& b) { return big_integer(big_type(a.v_ + b.v_)); }
  friend big_integer operator-(const big_integer& a, const big_integer& b) { return big_integer(big_type(a.v_ - b.v_)); }
  friend big_integer operator*(const big_integer& a, const big_integer& b) { return big_integer(big_type(a.v_ * b.v_)); }
  ///@}
  /// Truncating quotient; throws std::domain_error if b == 0.
  friend big_integer operator/(const big_integer& a, const big_integer& b) {
    check_divisor(b);
    return big_integer(big_type(a.v_ / b.v_));
  }
  /// Truncating remainder (sign of a); throws std::domain_error if b == 0.
  friend big_integer operator%(const big_integer& a, const big_integer& b) {
    check_divisor(b);
    return big_integer(big_type(a.v_ % b.v_));
  }
  /// Exact negation.
  friend big_integer operator-(const big_integer& a) { return big_integer(big_type(-a.v_)); }
  ///@{
  /// Compound assignment: *this = *this op b (/ and % throw std::domain_error if b == 0).
  big_integer& operator+=(const big_integer& b) { v_ += b.v_; return *this; }
  big_integer& operator-=(const big_integer& b) { v_ -= b.v_; return *this; }
  big_integer& operator*=(const big_integer& b) { v_ *= b.v_; return *this; }
  big_integer& operator/=(const big_integer& b) { return *this = *this / b; }
  big_integer& operator%=(const big_integer& b) { return *this = *this % b; }
  ///@}

  ///@{
  /// Comparison of the values.
  friend bool operator==(const big_integer& a, const big_integer& b) noexcept { return a.v_ == b.v_; }
  friend std::strong_ordering operator<=>(const big_integer& a, const big_integer& b) noexcept {
    return a.v_.compare(b.v_) <=> 0;
  }
  /// Writes the decimal digits.
  ///@}
  friend std::ostream& operator<<(std::ostream& os, const big_integer& a) { return os << a.v_; }
  /// |a|.
  friend big_integer abs(const big_integer& a) { return big_integer(big_type(boost::multiprecision::abs(a.v_))); }

  /// Throws std::domain_error if b == 0.
  static void check_divisor(const big_integer& b) {
    if (b.v_.is_zero()) throw std::domain_error("lacuna::big_integer: division by zero");
  }

 private:
  big_type v_;
};

/// big_integer as a Euclidean domain: size |a|, normalize |a|, unit part the sign.
template <>
struct ring_traits<big_integer> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes, for the integers.
  static constexpr bool is_exact = true;
  static constexpr std::uint64_t characteristic = 0;
  static big_integer from_integer(std::int64_t n) { return big_integer(n); }
  static div_rem_result<big_integer> div_rem(const big_integer& a, const big_integer& b) {
    big_integer::check_divisor(b);
    big_integer::big_type q, r;
    boost::multiprecision::divide_qr(a.value(), b.value(), q, r);
    return {big_integer(std::move(q)), big_integer(std::move(r))};
  }
  static big_integer euclidean_size(const big_integer& a) { return abs(a); }
  static big_integer normalize(const big_integer& a) { return abs(a); }
  static big_integer unit_part(const big_integer& a) { return big_integer(a.sign() < 0 ? -1 : 1); }
  static bool is_unit(const big_integer& a) { return a.value() == 1 || a.value() == -1; }
  static big_integer gcd(const big_integer& a, const big_integer& b) {
    return big_integer(big_integer::big_type(boost::multiprecision::gcd(a.value(), b.value())));
  }
  ///@}
};

}  // namespace lacuna

/// Hash of the value.
template <>
struct std::hash<lacuna::big_integer> {
  /// Hash of the value.
  std::size_t operator()(const lacuna::big_integer& a) const { return std::hash<boost::multiprecision::cpp_int>{}(a.value()); }
};

// lacuna/ring/rational.hpp — lacuna::rational, the field Q on
// boost::multiprecision::cpp_rational (always in lowest terms, denominator > 0).
//
// A wrapper rather than ring_traits<cpp_rational> for the reasons given in big_integer.hpp
// (expression templates, ADL).
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

/// An exact rational number (models field).
class rational {
 public:
  /// The Boost.Multiprecision rational that holds the value.
  using big_type = boost::multiprecision::cpp_rational;
  /// The Boost.Multiprecision integer of numerators and denominators.
  using integer_type = boost::multiprecision::cpp_int;

  /// Zero.
  rational() = default;
  /// The integer n; implicit.
  rational(std::int64_t n) : v_(n) {}  // NOLINT
  /// num / den in lowest terms; throws std::domain_error if den == 0.
  rational(const integer_type& num, const integer_type& den) {
    if (den.is_zero()) throw std::domain_error("lacuna::rational: zero denominator");
    // Boost 1.74's cpp_rational(num, den) throws "bad rational" for den < 0: make it positive.
    v_ = den.sign() < 0 ? big_type(integer_type(-num), integer_type(-den)) : big_type(num, den);
  }
  /// The value v.
  explicit rational(big_type v) : v_(std::move(v)) {}

  /// The value as a Boost.Multiprecision rational.
  [[nodiscard]] const big_type& value() const noexcept { return v_; }
  /// The numerator in lowest terms.
  [[nodiscard]] integer_type numerator() const { return boost::multiprecision::numerator(v_); }
  /// Always positive.
  [[nodiscard]] integer_type denominator() const { return boost::multiprecision::denominator(v_); }
  /// "n" or "n/d".
  [[nodiscard]] std::string to_string() const { return v_.str(); }
  /// True for zero.
  [[nodiscard]] bool is_zero() const noexcept { return v_.is_zero(); }

  ///@{
  /// Exact sum, difference and product.
  friend rational operator+(const rational& a, const rational& b) { return rational(big_type(a.v_ + b.v_)); }
  friend rational operator-(const rational& a, const rational& b) { return rational(big_type(a.v_ - b.v_)); }
  friend rational operator*(const rational& a, const rational& b) { return rational(big_type(a.v_ * b.v_)); }
  ///@}
  /// Throws std::domain_error if b == 0.
  friend rational operator/(const rational& a, const rational& b) {
    if (b.is_zero()) throw std::domain_error("lacuna::rational: division by zero");
    return rational(big_type(a.v_ / b.v_));
  }
  /// Exact negation.
  friend rational operator-(const rational& a) { return rational(big_type(-a.v_)); }
  ///@{
  /// Compound assignment: *this = *this op b (/ throws std::domain_error if b == 0).
  rational& operator+=(const rational& b) { v_ += b.v_; return *this; }
  rational& operator-=(const rational& b) { v_ -= b.v_; return *this; }
  rational& operator*=(const rational& b) { v_ *= b.v_; return *this; }
  rational& operator/=(const rational& b) { return *this = *this / b; }
  ///@}

  ///@{
  /// Comparison of the values.
  friend bool operator==(const rational& a, const rational& b) noexcept { return a.v_ == b.v_; }
  friend std::strong_ordering operator<=>(const rational& a, const rational& b) noexcept {
    return a.v_.compare(b.v_) <=> 0;
  }
  /// Writes "n" or "n/d".
  ///@}
  friend std::ostream& operator<<(std::ostream& os, const rational& a) { return os << a.v_; }

  /// 1 / a; throws std::domain_error for zero.
  [[nodiscard]] rational inverse() const { return rational(1) / *this; }

 private:
  big_type v_;
};

/// rational as a field: every non-zero element is a unit, size 0 or 1.
template <>
struct ring_traits<rational> {
  ///@{
  /// The customization points that ring_traits (ring/concepts.hpp) describes, for a field of characteristic 0.
  static constexpr bool is_exact = true;
  static constexpr std::uint64_t characteristic = 0;
  static rational from_integer(std::int64_t n) { return rational(n); }
  static div_rem_result<rational> div_rem(const rational& a, const rational& b) { return {a / b, rational()}; }
  static unsigned euclidean_size(const rational& a) noexcept { return !a.is_zero(); }
  static rational normalize(const rational& a) { return rational(a.is_zero() ? 0 : 1); }
  static rational unit_part(const rational& a) { return a.is_zero() ? rational(1) : a; }
  static bool is_unit(const rational& a) noexcept { return !a.is_zero(); }
  static rational inverse(const rational& a) { return a.inverse(); }
  ///@}
};

}  // namespace lacuna

/// Hash of the value.
template <>
struct std::hash<lacuna::rational> {
  /// Hash of the value.
  std::size_t operator()(const lacuna::rational& a) const {
    return std::hash<boost::multiprecision::cpp_rational>{}(a.value());
  }
};

// lacuna/ring/z2.hpp — lacuna::z2, the field with two elements, backed by a bool.
//
// Addition is exclusive or and multiplication is and; -a == a. Kept separate from
// mod_p<2> (which is also valid) so that bit-packed reductions can specialise on it.
#pragma once

#include <lacuna/ring/concepts.hpp>

#include <cstdint>
#include <functional>
#include <ostream>
#include <stdexcept>

namespace lacuna {

/// Z/2 (models field).
class z2 {
 public:
  /// Zero.
  constexpr z2() noexcept = default;
  /// n mod 2; implicit, as the ring map Z -> Z/2.
  constexpr z2(std::int64_t n) noexcept : v_((n & 1) != 0) {}  // NOLINT
  /// The element whose residue is b.
  static constexpr z2 from_bool(bool b) noexcept {
    z2 x;
    x.v_ = b;
    return x;
  }
  /// The residue, as a bool.
  [[nodiscard]] constexpr bool value() const noexcept { return v_; }
  /// True for 1.
  constexpr explicit operator bool() const noexcept { return v_; }

  ///@{
  /// Field operations: + and - are exclusive or, * is and.
  friend constexpr z2 operator+(z2 a, z2 b) noexcept { return from_bool(a.v_ != b.v_); }
  friend constexpr z2 operator-(z2 a, z2 b) noexcept { return from_bool(a.v_ != b.v_); }
  friend constexpr z2 operator*(z2 a, z2 b) noexcept { return from_bool(a.v_ && b.v_); }
  friend constexpr z2 operator-(z2 a) noexcept { return a; }
  ///@}
  /// a / 1 == a; throws std::domain_error for b == 0.
  friend constexpr z2 operator/(z2 a, z2 b) { return a * b.inverse(); }
  ///@{
  /// Compound assignment: *this = *this op b.
  constexpr z2& operator+=(z2 b) noexcept { return *this = *this + b; }
  constexpr z2& operator-=(z2 b) noexcept { return *this = *this - b; }
  constexpr z2& operator*=(z2 b) noexcept { return *this = *this * b; }
  constexpr z2& operator/=(z2 b) { return *this = *this / b; }
  ///@}
  /// Equal residues.
  friend constexpr bool operator==(z2, z2) noexcept = default;

  /// 1^-1 == 1; throws std::domain_error for zero.
  [[nodiscard]] constexpr z2 inverse() const {
    if (!v_) throw std::domain_error("lacuna::z2: zero has no inverse");
    return *this;
  }

  /// Writes 0 or 1.
  friend std::ostream& operator<<(std::ostream& os, z2 a) { return os << (a.v_ ? '1' : '0'); }

 private:
  bool v_ = false;
};

/// The ring structure of z2 for the customization points (ring/concepts.hpp).
template <>
struct ring_traits<z2> {
  ///@{
  /// As ring_traits in ring/concepts.hpp describes: exact, characteristic 2, every nonzero element a unit.
  static constexpr bool is_exact = true;
  static constexpr std::uint64_t characteristic = 2;
  static constexpr z2 from_integer(std::int64_t n) noexcept { return z2(n); }
  static constexpr z2 zero() noexcept { return z2(); }
  static constexpr z2 one() noexcept { return z2::from_bool(true); }
  static constexpr div_rem_result<z2> div_rem(z2 a, z2 b) { return {a / b, z2()}; }
  static constexpr unsigned euclidean_size(z2 a) noexcept { return a.value(); }
  static constexpr z2 normalize(z2 a) noexcept { return a; }
  static constexpr z2 unit_part(z2) noexcept { return z2::from_bool(true); }
  static constexpr bool is_unit(z2 a) noexcept { return a.value(); }
  static constexpr z2 inverse(z2 a) { return a.inverse(); }
  ///@}
};

}  // namespace lacuna

/// Hash of z2: its residue.
template <>
struct std::hash<lacuna::z2> {
  /// The residue, 0 or 1.
  std::size_t operator()(lacuna::z2 a) const noexcept { return a.value(); }
};

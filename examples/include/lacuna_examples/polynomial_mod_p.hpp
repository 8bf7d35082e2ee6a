// lacuna_examples/polynomial_mod_p.hpp — polynomials over Z/p as a user-defined Euclidean
// domain (the ring (Z/p)[x]), written with lacuna's public customization points only.
//
// The Euclidean size is the number of coefficients (degree + 1, and 0 for the zero
// polynomial); division is schoolbook long division, exact because the leading coefficient
// of a non-zero divisor is invertible in Z/p; normalize makes a polynomial monic.
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <initializer_list>
#include <ostream>
#include <stdexcept>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna_examples {

/// c[0] + c[1] x + ... + c[d] x^d over Z/P, stored without leading zeros.
template <std::uint64_t P>
class polynomial_mod_p {
 public:
  using coefficient = lacuna::mod_p<P>;

  polynomial_mod_p() = default;
  /// From coefficients, constant term first: {1, 0, 2} is 1 + 2x^2.
  polynomial_mod_p(std::initializer_list<std::int64_t> c) {
    for (std::int64_t v : c) c_.emplace_back(v);
    trim();
  }
  explicit polynomial_mod_p(std::vector<coefficient> c) : c_(std::move(c)) { trim(); }

  /// Degree; -1 for the zero polynomial.
  [[nodiscard]] std::ptrdiff_t degree() const { return static_cast<std::ptrdiff_t>(c_.size()) - 1; }
  [[nodiscard]] const std::vector<coefficient>& coefficients() const { return c_; }
  [[nodiscard]] coefficient leading() const { return c_.empty() ? coefficient() : c_.back(); }
  [[nodiscard]] coefficient operator()(coefficient x) const {  // Horner
    coefficient r;
    for (auto it = c_.rbegin(); it != c_.rend(); ++it) r = r * x + *it;
    return r;
  }

  friend bool operator==(const polynomial_mod_p&, const polynomial_mod_p&) = default;

  friend polynomial_mod_p operator+(const polynomial_mod_p& a, const polynomial_mod_p& b) {
    std::vector<coefficient> r(std::max(a.c_.size(), b.c_.size()));
    for (std::size_t i = 0; i < a.c_.size(); ++i) r[i] += a.c_[i];
    for (std::size_t i = 0; i < b.c_.size(); ++i) r[i] += b.c_[i];
    return polynomial_mod_p(std::move(r));
  }
  friend polynomial_mod_p operator-(const polynomial_mod_p& a) {
    std::vector<coefficient> r(a.c_);
    for (auto& v : r) v = -v;
    return polynomial_mod_p(std::move(r));
  }
  friend polynomial_mod_p operator-(const polynomial_mod_p& a, const polynomial_mod_p& b) { return a + -b; }
  friend polynomial_mod_p operator*(const polynomial_mod_p& a, const polynomial_mod_p& b) {
    if (a.c_.empty() || b.c_.empty()) return {};
    std::vector<coefficient> r(a.c_.size() + b.c_.size() - 1);
    for (std::size_t i = 0; i < a.c_.size(); ++i)
      for (std::size_t j = 0; j < b.c_.size(); ++j) r[i + j] += a.c_[i] * b.c_[j];
    return polynomial_mod_p(std::move(r));
  }
  polynomial_mod_p& operator+=(const polynomial_mod_p& b) { return *this = *this + b; }
  polynomial_mod_p& operator-=(const polynomial_mod_p& b) { return *this = *this - b; }
  polynomial_mod_p& operator*=(const polynomial_mod_p& b) { return *this = *this * b; }

  friend std::ostream& operator<<(std::ostream& os, const polynomial_mod_p& a) {
    if (a.c_.empty()) return os << "0";
    bool first = true;
    for (std::size_t i = a.c_.size(); i-- > 0;) {
      if (a.c_[i] == coefficient()) continue;
      if (!first) os << " + ";
      first = false;
      if (a.c_[i] != coefficient(1) || i == 0) os << a.c_[i];
      if (i >= 1) os << "x";
      if (i >= 2) os << "^" << i;
    }
    return os;
  }

 private:
  std::vector<coefficient> c_;
  void trim() {
    while (!c_.empty() && c_.back() == coefficient()) c_.pop_back();
  }
};

// ---- the customization points, found by ADL --------------------------------------------

template <std::uint64_t P>
polynomial_mod_p<P> from_integer(std::type_identity<polynomial_mod_p<P>>, std::int64_t n) {
  return polynomial_mod_p<P>(std::vector<lacuna::mod_p<P>>{lacuna::mod_p<P>(n)});
}

/// Long division: a = q b + r with deg r < deg b. Throws std::domain_error if b == 0.
template <std::uint64_t P>
lacuna::div_rem_result<polynomial_mod_p<P>> div_rem(const polynomial_mod_p<P>& a, const polynomial_mod_p<P>& b) {
  using c = lacuna::mod_p<P>;
  if (b.degree() < 0) throw std::domain_error("polynomial_mod_p: division by zero");
  std::vector<c> r = a.coefficients();
  const auto& d = b.coefficients();
  const std::size_t db = d.size() - 1;
  const c lead_inv = d.back().inverse();
  std::vector<c> q(r.size() > db ? r.size() - db : 0);
  for (std::size_t k = q.size(); k-- > 0;) {
    const c f = r[k + db] * lead_inv;
    q[k] = f;
    for (std::size_t j = 0; j <= db; ++j) r[k + j] -= f * d[j];
  }
  return {polynomial_mod_p<P>(std::move(q)), polynomial_mod_p<P>(std::move(r))};
}

/// degree + 1 (0 for zero).
template <std::uint64_t P>
std::size_t euclidean_size(const polynomial_mod_p<P>& a) {
  return a.coefficients().size();
}

/// The monic associate (zero stays zero).
template <std::uint64_t P>
polynomial_mod_p<P> normalize(const polynomial_mod_p<P>& a) {
  if (a.degree() < 0) return a;
  const lacuna::mod_p<P> inv = a.leading().inverse();
  std::vector<lacuna::mod_p<P>> c = a.coefficients();
  for (auto& v : c) v *= inv;
  return polynomial_mod_p<P>(std::move(c));
}

}  // namespace lacuna_examples

template <std::uint64_t P>
inline constexpr bool lacuna::enable_exact_ring<lacuna_examples::polynomial_mod_p<P>> = true;

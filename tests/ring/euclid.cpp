// The generic Euclidean algorithms: against Boost's gcd on lacuna::integer; on an archetype
// that models euclidean_domain and nothing more (so gcd asks only for the concept); and on a
// third-party number type adapted through a lacuna::ring_traits specialization alone.
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include "ring_conformance.hpp"

#include <lacuna/ring/detail/cpp_int.hpp>  // cpp_int, the reference
#include <doctest/doctest.h>

#include <cstdint>
#include <random>

namespace ring_euclid_test {

using boost::multiprecision::cpp_int;

// ---- the archetype ----------------------------------------------------------------------
// Exactly what euclidean_domain asks for: regular, + - * (and unary -, compound forms),
// from_integer, div_rem, euclidean_size, normalize, opt-in exactness. No / or %, no
// ordering, no printing, no conversion from integers, no is_unit/unit_part/gcd of its own.
namespace archetype {
class euclidean_archetype {
 public:
  euclidean_archetype() = default;
  friend bool operator==(const euclidean_archetype&, const euclidean_archetype&) = default;
  friend euclidean_archetype operator+(const euclidean_archetype& a, const euclidean_archetype& b) { return make(a.v_ + b.v_); }
  friend euclidean_archetype operator-(const euclidean_archetype& a, const euclidean_archetype& b) { return make(a.v_ - b.v_); }
  friend euclidean_archetype operator-(const euclidean_archetype& a) { return make(-a.v_); }
  friend euclidean_archetype operator*(const euclidean_archetype& a, const euclidean_archetype& b) { return make(a.v_ * b.v_); }
  euclidean_archetype& operator+=(const euclidean_archetype& b) { v_ += b.v_; return *this; }
  euclidean_archetype& operator-=(const euclidean_archetype& b) { v_ -= b.v_; return *this; }
  euclidean_archetype& operator*=(const euclidean_archetype& b) { v_ *= b.v_; return *this; }

  // The hooks for the traits and the test, not an arithmetic interface.
  static euclidean_archetype make(std::int64_t v) {
    euclidean_archetype a;
    a.v_ = v;
    return a;
  }
  [[nodiscard]] std::int64_t peek() const { return v_; }
  static inline int div_rem_calls = 0;

 private:
  std::int64_t v_ = 0;  // small values only: the archetype tests semantics, not overflow
};
}  // namespace archetype

}  // namespace ring_euclid_test
template <>
struct lacuna::ring_traits<ring_euclid_test::archetype::euclidean_archetype> {
  using A = ring_euclid_test::archetype::euclidean_archetype;
  static constexpr bool is_exact = true;
  static A from_integer(std::int64_t n) { return A::make(n); }
  static div_rem_result<A> div_rem(const A& a, const A& b) {
    ++A::div_rem_calls;
    return {A::make(a.peek() / b.peek()), A::make(a.peek() % b.peek())};
  }
  static std::int64_t euclidean_size(const A& a) { return a.peek() < 0 ? -a.peek() : a.peek(); }
  static A normalize(const A& a) { return A::make(a.peek() < 0 ? -a.peek() : a.peek()); }
};
namespace ring_euclid_test {

static_assert(lacuna::euclidean_domain<archetype::euclidean_archetype>);
static_assert(!lacuna::field<archetype::euclidean_archetype>);
static_assert(!std::totally_ordered<archetype::euclidean_archetype>);
static_assert(!std::constructible_from<archetype::euclidean_archetype, std::int64_t>);

TEST_CASE("generic gcd, extended_gcd, is_unit and unit_part ask only for euclidean_domain") {
  using A = archetype::euclidean_archetype;
  A::div_rem_calls = 0;
  CHECK(lacuna::gcd(A::make(84), A::make(-36)) == A::make(12));  // from memory: gcd(84, 36) = 12
  CHECK(A::div_rem_calls > 0);                                   // the default, built on div_rem
  const auto e = lacuna::extended_gcd(A::make(-84), A::make(36));
  CHECK(e.g == A::make(12));
  CHECK(e.s * A::make(-84) + e.t * A::make(36) == A::make(12));
  CHECK(lacuna::is_unit(A::make(-1)));
  CHECK_FALSE(lacuna::is_unit(A::make(2)));
  CHECK(lacuna::unit_part(A::make(-5)) == A::make(-1));
  ring_test::check_euclidean_domain<A>(
      [](std::mt19937_64& rng) { return A::make(static_cast<std::int64_t>(rng() % 20001) - 10000); }, 300);
}

// ---- a number type the user cannot edit -------------------------------------------------
// Imagine this came from a library: operators only, nothing that knows lacuna. Its division
// (in the traits below) uses the non-negative remainder 0 <= r < |b|, unlike C++.
namespace third_party {
struct fixnum {
  long long value = 0;
  friend bool operator==(fixnum, fixnum) = default;
  friend fixnum operator+(fixnum a, fixnum b) { return {a.value + b.value}; }
  friend fixnum operator-(fixnum a, fixnum b) { return {a.value - b.value}; }
  friend fixnum operator-(fixnum a) { return {-a.value}; }
  friend fixnum operator*(fixnum a, fixnum b) { return {a.value * b.value}; }
  fixnum& operator+=(fixnum b) { value += b.value; return *this; }
  fixnum& operator-=(fixnum b) { value -= b.value; return *this; }
  fixnum& operator*=(fixnum b) { value *= b.value; return *this; }
};
}  // namespace third_party

// The adaptation, entirely outside third_party.
}  // namespace ring_euclid_test
template <>
struct lacuna::ring_traits<ring_euclid_test::third_party::fixnum> {
  using F = ring_euclid_test::third_party::fixnum;
  static constexpr bool is_exact = true;  // the user vouches for the range of their values
  static F from_integer(std::int64_t n) { return {n}; }
  static div_rem_result<F> div_rem(F a, F b) {
    long long q = a.value / b.value, r = a.value % b.value;
    if (r < 0) {  // Euclidean convention: 0 <= r < |b|
      r += b.value < 0 ? -b.value : b.value;
      q += b.value < 0 ? 1 : -1;
    }
    return {{q}, {r}};
  }
  static unsigned long long euclidean_size(F a) { return a.value < 0 ? -static_cast<unsigned long long>(a.value) : a.value; }
  static F normalize(F a) { return {a.value < 0 ? -a.value : a.value}; }
};
namespace ring_euclid_test {

static_assert(lacuna::euclidean_domain<third_party::fixnum>);

TEST_CASE("a third-party type adapted by ring_traits alone works with the generic gcd") {
  using F = third_party::fixnum;
  std::mt19937_64 rng(2718);
  for (int i = 0; i < 2000; ++i) {
    const F a{static_cast<long long>(rng() % 2000001) - 1000000};
    const F b{static_cast<long long>(rng() % 2000001) - 1000000};
    INFO("a = ", a.value, ", b = ", b.value);
    const F g = lacuna::gcd(a, b);
    CHECK(cpp_int(g.value) == boost::multiprecision::gcd(cpp_int(a.value), cpp_int(b.value)));  // reference: Boost
    const auto e = lacuna::extended_gcd(a, b);
    CHECK(e.g == g);
    CHECK(e.s * a + e.t * b == g);
    if (b.value != 0) {
      const auto [q, r] = lacuna::div_rem(a, b);
      CHECK(r.value >= 0);
      CHECK(q * b + r == a);
    }
  }
  ring_test::check_euclidean_domain<F>(
      [](std::mt19937_64& g) { return F{static_cast<long long>(g() % 20001) - 10000}; }, 200);
}

// ---- lacuna::integer's fast paths agree with the defaults and with Boost -----------------
TEST_CASE("gcd and extended_gcd over lacuna::integer with values beyond 64 bits (reference: Boost gcd)") {
  using lacuna::integer;
  std::mt19937_64 rng(31415);
  for (int i = 0; i < 500; ++i) {
    const cpp_int common = cpp_int(rng()) * (rng() % 1000 + 1);
    const cpp_int x = common * static_cast<std::int64_t>(rng() % 1000000) * (i % 2 ? 1 : -1);
    const cpp_int y = common * cpp_int(rng());
    const integer a(x), b(y);
    INFO("x = ", x.str(), ", y = ", y.str());
    const integer g = lacuna::gcd(a, b);
    CHECK(g.to_big() == boost::multiprecision::gcd(x, y));
    const auto e = lacuna::extended_gcd(a, b);
    CHECK(e.g == g);
    CHECK(e.s * a + e.t * b == g);
  }
  // small operands: the 64-bit path
  CHECK(lacuna::gcd(integer(-48), integer(180)) == integer(12));
  CHECK(lacuna::gcd(integer(0), integer(-7)) == integer(7));
}

}  // namespace ring_euclid_test

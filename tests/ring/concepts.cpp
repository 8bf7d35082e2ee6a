// Which types model which ring concept — acceptances and rejections side by side.
#include <lacuna/ring/ring.hpp>

#include <doctest/doctest.h>

#include <cstdint>
#include <string>

namespace ring_concepts_test {

using namespace lacuna;

// The provided rings.
static_assert(euclidean_domain<integer> && !field<integer>);
static_assert(euclidean_domain<big_integer> && !field<big_integer>);
static_assert(field<mod_p<2>> && field<mod_p<3>> && field<mod_p<65521>>);
static_assert(field<mod_p<(std::uint64_t{1} << 61U) - 1>>);
static_assert(field<mod_p<(std::uint64_t{1} << 62U) - 57>>);
static_assert(field<mod_p_dynamic>);
static_assert(field<z2>);
static_assert(field<rational>);

// Built-in arithmetic types are NOT rings for lacuna. Floating point is inexact; machine
// integers overflow silently (INT64_MAX + 1 is undefined behaviour, and unsigned types wrap),
// so a homology computed "over std::int64_t" could be wrong without a sign. Use
// lacuna::integer, which widens on overflow. enable_exact_ring stays false for all of them.
static_assert(!commutative_ring<double>);
static_assert(!commutative_ring<float>);
static_assert(!commutative_ring<std::int64_t>);
static_assert(!commutative_ring<long>);
static_assert(!commutative_ring<int>);
static_assert(!commutative_ring<std::uint64_t>);
static_assert(!commutative_ring<bool>);
static_assert(!commutative_ring<boost::multiprecision::cpp_int>);  // use lacuna::big_integer
static_assert(!commutative_ring<std::string>);

// Characteristics.
static_assert(characteristic_v<integer> == 0);
static_assert(characteristic_v<rational> == 0);
static_assert(characteristic_v<z2> == 2);
static_assert(characteristic_v<mod_p<65521>> == 65521);
static_assert(characteristic_v<mod_p_dynamic> == 0);  // not known at compile time: read modulus()

// Layout: integer is at most 16 bytes (inline int64 + pointer), z2 one byte.
static_assert(sizeof(integer) <= 16);
static_assert(sizeof(z2) == 1);
static_assert(sizeof(mod_p<7>) == 8);
static_assert(sizeof(mod_p_dynamic) == 16);

// A type with all the operators is a ring only once it opts in: the opt-in is the one
// difference between these two.
namespace probe {
template <bool Tag>
struct ring_like {
  long v = 0;
  ring_like() = default;
  explicit ring_like(std::int64_t n) : v(static_cast<long>(n)) {}
  friend bool operator==(ring_like, ring_like) = default;
  friend ring_like operator+(ring_like a, ring_like b) { return ring_like(a.v + b.v); }
  friend ring_like operator-(ring_like a, ring_like b) { return ring_like(a.v - b.v); }
  friend ring_like operator-(ring_like a) { return ring_like(-a.v); }
  friend ring_like operator*(ring_like a, ring_like b) { return ring_like(a.v * b.v); }
  ring_like& operator+=(ring_like b) { v += b.v; return *this; }
  ring_like& operator-=(ring_like b) { v -= b.v; return *this; }
  ring_like& operator*=(ring_like b) { v *= b.v; return *this; }
};
}  // namespace probe
}  // namespace ring_concepts_test
template <>
inline constexpr bool lacuna::enable_exact_ring<ring_concepts_test::probe::ring_like<true>> = true;
namespace ring_concepts_test {
static_assert(!commutative_ring<probe::ring_like<false>>);
static_assert(commutative_ring<probe::ring_like<true>>);
static_assert(!euclidean_domain<probe::ring_like<true>>);  // no division with remainder

TEST_CASE("zero and one of every provided ring") {
  CHECK(zero<integer>() == integer(0));
  CHECK(one<integer>() == integer(1));
  CHECK(one<mod_p<3>>().value() == 1);
  CHECK(zero<z2>().value() == false);
  CHECK(one<z2>().value() == true);
  CHECK(one<rational>() == rational(1));
  CHECK(zero<mod_p_dynamic>().is_bound() == false);
}

}  // namespace ring_concepts_test

// tests/ring/ring_conformance.hpp — one conformance suite for every model of the ring
// concepts (in the manner of Boost.Multiprecision's test_arithmetic.hpp): randomized
// property tests of the axioms with a fixed seed, so that a failure is reproducible.
//
// Each check takes a generator `R gen(std::mt19937_64&)` of random elements. The reference
// for every check is the definition of the structure (the ring axioms; a = q b + r with
// size(r) < size(b) or r = 0; Bézout's identity; a a^-1 = 1).
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <doctest/doctest.h>

#include <cstdint>
#include <random>
#include <sstream>
#include <string>

namespace ring_test {

inline constexpr std::uint64_t default_seed = 20240611;

template <class R>
std::string show(const R& a) {
  if constexpr (requires(std::ostream& os) { os << a; }) {
    std::ostringstream os;
    os << a;
    return os.str();
  } else {
    return "<unprintable>";
  }
}

/// The commutative-ring axioms, the compound operators and from_integer as a ring map.
template <lacuna::commutative_ring R, class Gen>
void check_commutative_ring(Gen gen, int rounds = 300, std::uint64_t seed = default_seed) {
  std::mt19937_64 rng(seed);
  const R z = lacuna::zero<R>();
  const R o = lacuna::one<R>();
  CHECK_FALSE(z == o);  // a ring with one != 0 (every ring lacuna provides is non-trivial)
  std::uniform_int_distribution<std::int64_t> small(-1000, 1000);
  for (int i = 0; i < rounds; ++i) {
    const R a = gen(rng), b = gen(rng), c = gen(rng);
    INFO("a = ", show(a), ", b = ", show(b), ", c = ", show(c));
    CHECK((a + b) + c == a + (b + c));
    CHECK((a * b) * c == a * (b * c));
    CHECK(a + b == b + a);
    CHECK(a * b == b * a);
    CHECK(a * (b + c) == a * b + a * c);
    CHECK((a + b) * c == a * c + b * c);
    CHECK(a + z == a);
    CHECK(a * o == a);
    CHECK(a * z == z);
    CHECK(a + (-a) == z);
    CHECK(a - b == a + (-b));
    CHECK(-(-a) == a);
    R m = a;
    m += b;
    CHECK(m == a + b);
    m = a;
    m -= b;
    CHECK(m == a - b);
    m = a;
    m *= b;
    CHECK(m == a * b);
    R copy = a;  // value semantics: the copy is independent
    copy += o;
    CHECK_FALSE(copy == a);

    const std::int64_t x = small(rng), y = small(rng);
    INFO("x = ", x, ", y = ", y);
    CHECK(lacuna::from_integer<R>(x + y) == lacuna::from_integer<R>(x) + lacuna::from_integer<R>(y));
    CHECK(lacuna::from_integer<R>(x * y) == lacuna::from_integer<R>(x) * lacuna::from_integer<R>(y));
    CHECK(lacuna::from_integer<R>(-x) == -lacuna::from_integer<R>(x));
  }
  CHECK(lacuna::from_integer<R>(0) == z);
  CHECK(lacuna::from_integer<R>(1) == o);
}

/// Division with remainder, the unit normal form, gcd and the Bézout identity.
template <lacuna::euclidean_domain R, class Gen>
void check_euclidean_domain(Gen gen, int rounds = 300, std::uint64_t seed = default_seed) {
  check_commutative_ring<R>(gen, rounds, seed);
  std::mt19937_64 rng(seed + 1);
  const R z = lacuna::zero<R>();
  const R o = lacuna::one<R>();
  CHECK(lacuna::is_unit(o));
  CHECK_FALSE(lacuna::is_unit(z));
  CHECK(lacuna::normalize(z) == z);
  CHECK(lacuna::gcd(z, z) == z);
  for (int i = 0; i < rounds; ++i) {
    const R a = gen(rng), b = gen(rng);
    INFO("a = ", show(a), ", b = ", show(b));
    if (!(b == z)) {
      const auto [q, r] = lacuna::div_rem(a, b);
      INFO("q = ", show(q), ", r = ", show(r));
      CHECK(a == q * b + r);
      CHECK((r == z || lacuna::euclidean_size(r) < lacuna::euclidean_size(b)));
      // exact division of a multiple
      const auto [q2, r2] = lacuna::div_rem(a * b, b);
      CHECK(r2 == z);
      CHECK(q2 == a);
    }
    // unit normal form: a == unit_part(a) * normalize(a), idempotent, unit part a unit
    const R u = lacuna::unit_part(a);
    const R n = lacuna::normalize(a);
    CHECK(lacuna::is_unit(u));
    CHECK(u * n == a);
    CHECK(lacuna::normalize(n) == n);
    CHECK(lacuna::normalize(a * u) == n);
    // gcd divides both, is normalized, and every common divisor built in divides it
    const R g = lacuna::gcd(a, b);
    INFO("g = ", show(g));
    CHECK(lacuna::normalize(g) == g);
    if (!(g == z)) {
      CHECK(lacuna::div_rem(a, g).remainder == z);
      CHECK(lacuna::div_rem(b, g).remainder == z);
      const R c = gen(rng);
      if (!(c == z)) {
        const R gc = lacuna::gcd(a * c, b * c);  // gcd(ac, bc) = gcd(a, b) c up to a unit
        CHECK(gc == lacuna::normalize(g * c));
      }
    } else {
      CHECK(a == z);
      CHECK(b == z);
    }
    CHECK(lacuna::gcd(a, b) == lacuna::gcd(b, a));
    CHECK(lacuna::gcd(a, z) == n);
    const auto e = lacuna::extended_gcd(a, b);
    INFO("s = ", show(e.s), ", t = ", show(e.t));
    CHECK(e.g == g);
    CHECK(e.s * a + e.t * b == e.g);
  }
}

/// Inverses: a a^-1 == 1 for a != 0, and every non-zero element is a unit.
template <lacuna::field R, class Gen>
void check_field(Gen gen, int rounds = 300, std::uint64_t seed = default_seed) {
  check_euclidean_domain<R>(gen, rounds, seed);
  std::mt19937_64 rng(seed + 2);
  const R z = lacuna::zero<R>();
  const R o = lacuna::one<R>();
  for (int i = 0; i < rounds; ++i) {
    const R a = gen(rng);
    INFO("a = ", show(a));
    if (a == z) continue;
    const R inv = lacuna::inverse(a);
    CHECK(a * inv == o);
    CHECK(lacuna::inverse(inv) == a);
    CHECK(lacuna::is_unit(a));
    CHECK(lacuna::normalize(a) == o);
  }
}

}  // namespace ring_test

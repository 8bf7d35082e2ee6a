// lacuna::is_prime cross-checked with FLINT's n_is_prime (an independent implementation:
// FLINT 2.9, <flint/ulong_extras.h>) on ranges near 2^32, 2^61, 2^62 and 2^64 and on random
// 64-bit numbers; and the two large moduli the ring tests use.
#include <lacuna/ring/primality.hpp>

#include <flint/ulong_extras.h>

#include <doctest/doctest.h>

#include <cstdint>
#include <random>

namespace reference_ring_primality_test {

namespace {
bool flint_prime(std::uint64_t n) { return n_is_prime(static_cast<ulong>(n)) != 0; }
}  // namespace

TEST_CASE("the moduli used by the Z/p tests are prime according to FLINT") {
  CHECK(flint_prime((std::uint64_t{1} << 61U) - 1));
  CHECK(flint_prime((std::uint64_t{1} << 62U) - 57));
  CHECK(flint_prime(65521));
  // and 2^62 - 57 is the largest prime below 2^62 according to FLINT too
  for (std::uint64_t n = (std::uint64_t{1} << 62U) - 56; n < (std::uint64_t{1} << 62U); ++n) CHECK_FALSE(flint_prime(n));
}

TEST_CASE("is_prime agrees with FLINT near powers of two and at random") {
  for (unsigned k : {32U, 40U, 61U, 62U, 63U}) {
    const std::uint64_t c = std::uint64_t{1} << k;
    for (std::uint64_t n = c - 3000; n < c + 3000; ++n) {
      INFO("n = ", n);
      CHECK(lacuna::is_prime(n) == flint_prime(n));
    }
  }
  for (std::uint64_t n = ~std::uint64_t{0} - 3000; n != 0; ++n) CHECK(lacuna::is_prime(n) == flint_prime(n));
  std::mt19937_64 rng(99);
  for (int i = 0; i < 100000; ++i) {
    const std::uint64_t n = rng() | 1U;
    INFO("n = ", n);
    CHECK(lacuna::is_prime(n) == flint_prime(n));
  }
  // products of two primes (hard composites) near 2^32 each
  const std::uint64_t ps[] = {4294967291ULL, 4294967279ULL, 4294967231ULL, 4294967197ULL, 2147483647ULL};
  for (std::uint64_t p : ps)
    for (std::uint64_t q : ps) CHECK(lacuna::is_prime(p * q) == flint_prime(p * q));
}

}  // namespace reference_ring_primality_test

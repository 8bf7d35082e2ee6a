// lacuna::is_prime: known primes and composites (from memory, as noted), strong
// pseudoprimes that defeat Miller–Rabin with fewer bases, and trial division as the
// reference for every n below 10^5. A cross-check against FLINT's n_is_prime is in
// tests/reference/ring_primality.cpp.
#include <lacuna/ring/primality.hpp>

#include <doctest/doctest.h>

#include <cstdint>

namespace ring_primality_test {

namespace {
bool trial_division(std::uint64_t n) {
  if (n < 2) return false;
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % d == 0) return false;
  return true;
}
}  // namespace

// Usable at compile time: mod_p<P> relies on it.
static_assert(lacuna::is_prime(2) && lacuna::is_prime(3) && lacuna::is_prime(65521));
static_assert(!lacuna::is_prime(0) && !lacuna::is_prime(1) && !lacuna::is_prime(65535));

TEST_CASE("is_prime agrees with trial division below 100000") {
  int count = 0;
  for (std::uint64_t n = 0; n < 100000; ++n) {
    CHECK(lacuna::is_prime(n) == trial_division(n));
    count += lacuna::is_prime(n);
  }
  CHECK(count == 9592);  // pi(10^5) = 9592, from memory
}

TEST_CASE("large primes, from memory") {
  CHECK(lacuna::is_prime((std::uint64_t{1} << 61U) - 1));   // Mersenne prime M61
  CHECK(lacuna::is_prime((std::uint64_t{1} << 31U) - 1));   // Mersenne prime M31
  CHECK(lacuna::is_prime((std::uint64_t{1} << 62U) - 57));  // largest prime below 2^62
  CHECK(lacuna::is_prime(18446744073709551557ULL));          // 2^64 - 59, largest prime below 2^64
  CHECK(lacuna::is_prime(1000000007));
  CHECK(lacuna::is_prime(4294967291ULL));                    // largest prime below 2^32
  // and the numbers between 2^62 - 57 and 2^62 are composite (so it is the largest)
  for (std::uint64_t n = (std::uint64_t{1} << 62U) - 56; n < (std::uint64_t{1} << 62U); ++n) CHECK_FALSE(lacuna::is_prime(n));
}

TEST_CASE("composites that fool weaker tests") {
  CHECK_FALSE(lacuna::is_prime(561));                   // Carmichael number 3 * 11 * 17
  CHECK_FALSE(lacuna::is_prime(2047));                  // strong pseudoprime to base 2 (23 * 89)
  CHECK_FALSE(lacuna::is_prime(3215031751ULL));         // spsp to bases 2, 3, 5, 7 (151 * 751 * 28351)
  CHECK_FALSE(lacuna::is_prime(3825123056546413051ULL));  // spsp to bases 2..23 (149491 * 747451 * 34233211)
  CHECK(3825123056546413051ULL == 149491ULL * 747451ULL * 34233211ULL);  // the factorization, checked
  CHECK(3215031751ULL == 151ULL * 751ULL * 28351ULL);
  CHECK_FALSE(lacuna::is_prime((std::uint64_t{1} << 32U) + 1));  // Fermat F5 = 641 * 6700417
  CHECK_FALSE(lacuna::is_prime(18446744073709551615ULL));         // 2^64 - 1
  CHECK_FALSE(lacuna::is_prime(4294967291ULL * 4294967279ULL));   // product of two primes near 2^32
  CHECK_FALSE(lacuna::is_prime(41 * 41));
  CHECK_FALSE(lacuna::is_prime(37 * 37));
}

}  // namespace ring_primality_test

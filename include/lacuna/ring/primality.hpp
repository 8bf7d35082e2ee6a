// lacuna/ring/primality.hpp — deterministic primality of 64-bit numbers, usable in constant
// expressions (mod_p<P> checks P at compile time with it).
//
// Method: Miller–Rabin (Miller 1976, Rabin 1980) with the first twelve primes 2, 3, ..., 37
// as bases, which is deterministic for every n < 3.317e24 > 2^64 (Sorenson & Webster 2015;
// Jiang & Deng 2014 for the bound of the first twelve primes).
#pragma once

#include <cstdint>

namespace lacuna {
namespace detail {

__extension__ using uint128_t = unsigned __int128;

/// a * b mod m for a, b < m, through a 128-bit product.
constexpr std::uint64_t mul_mod_u64(std::uint64_t a, std::uint64_t b, std::uint64_t m) noexcept {
  return static_cast<std::uint64_t>(static_cast<uint128_t>(a) * b % m);
}

/// a^e mod m for a < m, m >= 1.
constexpr std::uint64_t pow_mod_u64(std::uint64_t a, std::uint64_t e, std::uint64_t m) noexcept {
  std::uint64_t r = 1 % m;
  while (e != 0) {
    if (e & 1U) r = mul_mod_u64(r, a, m);
    a = mul_mod_u64(a, a, m);
    e >>= 1U;
  }
  return r;
}

/// One strong-probable-prime round: n odd > 2, n - 1 = d * 2^s with d odd.
constexpr bool strong_probable_prime(std::uint64_t n, std::uint64_t base, std::uint64_t d, int s) noexcept {
  std::uint64_t x = pow_mod_u64(base % n, d, n);
  if (x == 1 || x == n - 1) return true;
  for (int i = 1; i < s; ++i) {
    x = mul_mod_u64(x, x, n);
    if (x == n - 1) return true;
    if (x == 1) return false;
  }
  return false;
}

}  // namespace detail

/// True iff n is prime. Deterministic for all 64-bit n; constexpr. Cost: at most twelve
/// modular exponentiations (about 12 * 64 * 2 128-bit multiplications).
constexpr bool is_prime(std::uint64_t n) noexcept {
  constexpr std::uint64_t bases[] = {2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37};
  if (n < 2) return false;
  for (std::uint64_t p : bases) {
    if (n == p) return true;
    if (n % p == 0) return false;
  }
  // n is odd, has no factor <= 37, so n > 37 * 37 or n is prime.
  if (n < 41 * 41) return true;
  std::uint64_t d = n - 1;
  int s = 0;
  while ((d & 1U) == 0) {
    d >>= 1U;
    ++s;
  }
  for (std::uint64_t p : bases)
    if (!detail::strong_probable_prime(n, p, d, s)) return false;
  return true;
}

}  // namespace lacuna

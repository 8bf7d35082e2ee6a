// lacuna/ring/checked.hpp — overflow-checked std::int64_t arithmetic: the one family of
// overflow checks of the library (everything else calls these, never the builtins).
//
// The homology engine runs on machine integers and widens to big integers when a step
// overflows; these helpers say when. Each computes the exact result into `out` when it fits
// and returns true when it does NOT fit (the GCC/Clang __builtin_*_overflow convention), in
// which case `out` holds the wrapped value and must not be used.
#pragma once

#include <cstdint>

namespace lacuna {

/// a + b into out; true on overflow. Constant time, no branches beyond the flag.
[[nodiscard]] constexpr bool checked_add(std::int64_t a, std::int64_t b, std::int64_t& out) noexcept {
  return __builtin_add_overflow(a, b, &out);
}

/// a - b into out; true on overflow.
[[nodiscard]] constexpr bool checked_sub(std::int64_t a, std::int64_t b, std::int64_t& out) noexcept {
  return __builtin_sub_overflow(a, b, &out);
}

/// a * b into out; true on overflow.
[[nodiscard]] constexpr bool checked_mul(std::int64_t a, std::int64_t b, std::int64_t& out) noexcept {
  return __builtin_mul_overflow(a, b, &out);
}

/// a + b into out for unsigned counts (sizes, sums of sizes); true on overflow.
[[nodiscard]] constexpr bool checked_add(std::uint64_t a, std::uint64_t b, std::uint64_t& out) noexcept {
  return __builtin_add_overflow(a, b, &out);
}

/// -a into out; true on overflow (only for a == INT64_MIN).
[[nodiscard]] constexpr bool checked_neg(std::int64_t a, std::int64_t& out) noexcept {
  return __builtin_sub_overflow(std::int64_t{0}, a, &out);
}

/// a * b + c into out (the kernel of a row operation); true if the product or the sum
/// overflows.
[[nodiscard]] constexpr bool checked_mul_add(std::int64_t a, std::int64_t b, std::int64_t c,
                                             std::int64_t& out) noexcept {
  std::int64_t p = 0;
  return __builtin_mul_overflow(a, b, &p) || __builtin_add_overflow(p, c, &out);
}

}  // namespace lacuna

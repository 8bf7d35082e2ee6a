// examples/cli/options.hpp — the one parser of every numeric option of the lacuna tool
// (--threshold, --max-cells, --max-facet-vertices, --max-memory, and every later one: the
// persistence subcommand uses it too).
//
// A number is decimal and nothing else: an optional sign where the option allows one, then
// digits. Leading zeros are decimal ("010" is 10, "08" is 8; no octal, no hexadecimal, no
// exponent, no spaces). An empty value is an error, and so is a value outside the option's
// range: an overflow is refused with a message saying the limit, never wrapped or clamped.
// Errors are lacuna_cli::option_error, whose what() is the one line the tool prints
// ("lacuna: --max-cells 08x: expected a decimal integer").
#pragma once

#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>
#include <string_view>

namespace lacuna_cli {

/// A bad option value: exit status 2 and what() on one line.
struct option_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

/// What parse_decimal found.
enum class number_status { ok, empty, malformed, too_large };

/// The magnitude and sign of a decimal integer, the whole of `text`: an optional sign
/// (when `signs` is true; '+' or '-'), then one or more digits '0'..'9'. too_large when the
/// magnitude is 2^64 or more (any number of leading zeros is fine).
struct decimal_number {
  number_status status = number_status::empty;
  bool negative = false;
  std::uint64_t magnitude = 0;
};

inline decimal_number parse_decimal(std::string_view text, bool signs) {
  decimal_number r;
  if (text.empty()) return r;
  if (signs && (text.front() == '+' || text.front() == '-')) {
    r.negative = text.front() == '-';
    text.remove_prefix(1);
  }
  r.status = number_status::malformed;
  if (text.empty()) return r;
  std::uint64_t v = 0;
  bool over = false;
  for (char c : text) {
    if (c < '0' || c > '9') return r;
    const auto d = static_cast<std::uint64_t>(c - '0');
    if (v > (std::numeric_limits<std::uint64_t>::max() - d) / 10) over = true;
    if (!over) v = v * 10 + d;
  }
  r.status = over ? number_status::too_large : number_status::ok;
  r.magnitude = over ? 0 : v;
  return r;
}

/// The value of option `option` (its name, for the message) as a decimal integer in
/// [min, max]; throws option_error otherwise. Signs are accepted when min < 0.
template <class T>
T parse_number(std::string_view text, std::string_view option, T min = std::numeric_limits<T>::min(),
               T max = std::numeric_limits<T>::max()) {
  static_assert(std::numeric_limits<T>::is_integer && sizeof(T) <= 8);
  const std::string head = "lacuna: " + std::string(option) + " '" + std::string(text) + "': ";
  const bool signs = min < 0;
  const std::string what = signs ? "a decimal integer" : "a non-negative decimal integer";
  const decimal_number d = parse_decimal(text, signs);
  if (d.status == number_status::empty) throw option_error("lacuna: " + std::string(option) + ": the value is empty; expected " + what);
  if (d.status == number_status::malformed) {
    if (!signs && !text.empty() && text.front() == '-') throw option_error(head + "must not be negative");
    throw option_error(head + "expected " + what + " (digits only, read in base 10)");
  }
  const auto range = [&] {
    return " (" + std::to_string(min) + " .. " + std::to_string(max) + ")";
  };
  if (d.status == number_status::too_large) throw option_error(head + "out of range" + range());
  if (d.negative) {
    // -magnitude >= min, computed without overflow: min is at least INT64_MIN
    const std::uint64_t lim = static_cast<std::uint64_t>(-(static_cast<std::int64_t>(min) + 1)) + 1;
    if (d.magnitude > lim) throw option_error(head + "out of range" + range());
    const std::int64_t v = d.magnitude == lim ? static_cast<std::int64_t>(min) : -static_cast<std::int64_t>(d.magnitude);
    if (v > static_cast<std::int64_t>(max)) throw option_error(head + "out of range" + range());
    return static_cast<T>(v);
  }
  if (d.magnitude > static_cast<std::uint64_t>(max)) throw option_error(head + "out of range" + range());
  if (min > 0 && d.magnitude < static_cast<std::uint64_t>(min)) throw option_error(head + "out of range" + range());
  return static_cast<T>(d.magnitude);
}

/// A size in bytes: a decimal integer (parse_number) followed by an optional unit K, M, G or T
/// (powers of 1024; "6G" is 6 * 2^30 bytes); without a unit, bytes. Refused: an empty value,
/// a unit alone, other units, and sizes of 2^64 bytes or more.
inline std::uint64_t parse_size(std::string_view text, std::string_view option) {
  std::string_view digits = text;
  unsigned shift = 0;
  if (!digits.empty()) {
    switch (digits.back()) {
      case 'K': case 'k': shift = 10; break;
      case 'M': case 'm': shift = 20; break;
      case 'G': case 'g': shift = 30; break;
      case 'T': case 't': shift = 40; break;
      default: break;
    }
    if (shift) digits.remove_suffix(1);
  }
  if (shift && digits.empty())
    throw option_error("lacuna: " + std::string(option) + " '" + std::string(text) + "': expected a number before the unit");
  const auto n = parse_number<std::uint64_t>(digits, option);
  if (shift && n > (std::numeric_limits<std::uint64_t>::max() >> shift))
    throw option_error("lacuna: " + std::string(option) + " '" + std::string(text) + "': out of range (below 2^64 bytes)");
  return n << shift;
}

}  // namespace lacuna_cli

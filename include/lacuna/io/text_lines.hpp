// lacuna/io/text_lines.hpp — what the line-oriented text readers of persistence input share
// (point clouds, distance matrices, value files): their line rules on top of the one line
// reader (io/line_reader.hpp), the field splitter and the decimal numbers of the format.
//
// The rules every one of these readers applies (docs/persistence-io.md):
//   * lines end in LF or CRLF; a carriage return anywhere else (a bare CR, as old Mac files
//     have) is an error naming its line;
//   * a UTF-8 byte-order mark (EF BB BF) at the very start of the file is skipped (spreadsheet
//     programs write one before CSV); anywhere else those bytes are ordinary text;
//   * a control character (bytes 0x00-0x1F other than tab, and 0x7F) is an error naming its
//     line and column: the file is not text. So a NUL byte never reaches a message, and every
//     message quotes the input with control bytes and invalid UTF-8 escaped as \xHH;
//   * a line longer than the limit is an error at that line, found before more than the limit
//     is buffered, so neither a huge line nor an endless stream takes unbounded memory;
//   * '#' starts a comment that runs to the end of the line.
//
// A number is a decimal: an optional sign, digits, optionally '.' and digits, optionally 'e'
// or 'E', an optional sign and digits (`-1.5e-3`, `+2`, `007`, `1E6`). Digits are required on
// both sides of the point, so `.5` and `1.` are refused, as are hexadecimal forms, `inf`,
// `nan` and digit group separators. The value is the double nearest to the decimal
// (std::from_chars: exact, and the same in every locale); a decimal too large for a double is
// an error, one too small reads as 0, and `-0` reads as 0.
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/line_reader.hpp>

#include <charconv>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <istream>
#include <string>
#include <string_view>
#include <system_error>
#include <vector>

namespace lacuna::io {

namespace text_detail {

/// Quotes input text for a message (the quoting of every reader: io/line_reader.hpp).
inline std::string quote(std::string_view s, std::size_t max_bytes = 40) { return quote_text(s, max_bytes); }

/// The one line reader of the library (io/line_reader.hpp: LF or CRLF, a bare CR refused, a
/// leading byte-order mark skipped, the line length bounded before it is buffered), with the
/// two rules these formats add: the comment is removed, and a control character is an error.
class line_reader {
 public:
  line_reader(std::istream& in, std::string file, std::size_t max_line_bytes)
      : lines_(in, std::move(file), line_reader_options{.max_line_bytes = max_line_bytes}) {}

  /// The next line (its comment removed), or false at the end of the input.
  bool next(std::string_view& line) {
    std::string_view raw;
    if (!lines_.next(raw)) return false;
    for (std::size_t i = 0; i < raw.size(); ++i) {
      const auto c = static_cast<unsigned char>(raw[i]);
      if ((c < 0x20 && c != '\t') || c == 0x7F) {
        constexpr char digits[] = "0123456789abcdef";
        fail(std::string("a control character (byte 0x") + digits[c >> 4] + digits[c & 15] + ") in column " +
             std::to_string(i + 1) + ": the file is not text");
      }
    }
    line = strip_comment(raw);
    return true;
  }

  /// The 1-based number of the line last returned (0 before the first).
  std::size_t line_number() const noexcept { return lines_.line_number(); }
  const std::string& file() const noexcept { return lines_.file_name(); }

  /// Throws parse_error at the line last returned.
  [[noreturn]] void fail(const std::string& message) const { lines_.fail(message); }
  [[noreturn]] void fail_at(std::size_t line, const std::string& message) const { lines_.fail_at(line, message); }

 private:
  io::line_reader lines_;
};

inline bool is_blank(char c) { return c == ' ' || c == '\t'; }

/// Splits a line into whitespace-separated tokens.
inline void split_blank(std::string_view line, std::vector<std::string_view>& out) {
  out.clear();
  std::size_t i = 0;
  while (i < line.size()) {
    while (i < line.size() && is_blank(line[i])) ++i;
    const std::size_t start = i;
    while (i < line.size() && !is_blank(line[i])) ++i;
    if (i > start) out.push_back(line.substr(start, i - start));
  }
}

/// Splits a line of numbers into fields: fields are separated by blanks, by one comma, or by
/// both (`1, 2`, `1 ,2`, `1 2`). Returns the 1-based number of the first empty field (two
/// commas in a row, a comma at the start or end of the line), or 0 when there is none. A
/// line of blanks has no field.
inline std::size_t split_fields(std::string_view line, std::vector<std::string_view>& out) {
  out.clear();
  std::size_t i = 0;
  while (i < line.size() && is_blank(line[i])) ++i;
  if (i == line.size()) return 0;
  std::size_t empty = 0;
  for (;;) {
    const std::size_t start = i;
    while (i < line.size() && !is_blank(line[i]) && line[i] != ',') ++i;
    out.push_back(line.substr(start, i - start));
    if (i == start && empty == 0) empty = out.size();
    while (i < line.size() && is_blank(line[i])) ++i;
    if (i == line.size()) break;
    if (line[i] == ',') {
      ++i;
      while (i < line.size() && is_blank(line[i])) ++i;
      if (i == line.size()) {  // a comma at the end: an empty last field
        out.push_back(line.substr(i, 0));
        if (empty == 0) empty = out.size();
        break;
      }
    }
  }
  return empty;
}

enum class decimal_status { ok, malformed, too_large };

/// Reads `s`, the whole of it, as a decimal of the format (see the top of this header).
inline decimal_status parse_decimal(std::string_view s, double& out) {
  std::size_t i = 0;
  const auto digits = [&] {
    const std::size_t start = i;
    while (i < s.size() && s[i] >= '0' && s[i] <= '9') ++i;
    return i - start;
  };
  if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
  const std::size_t number_start = i;
  const std::size_t int_digits = digits();
  if (int_digits == 0) return decimal_status::malformed;
  if (i < s.size() && s[i] == '.') {
    ++i;
    if (digits() == 0) return decimal_status::malformed;
  }
  const std::size_t mantissa_end = i;
  if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
    ++i;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    if (digits() == 0) return decimal_status::malformed;
  }
  if (i != s.size()) return decimal_status::malformed;
  const bool negative = s[0] == '-';
  double v = 0;
  const auto [p, ec] = std::from_chars(s.data() + number_start, s.data() + s.size(), v, std::chars_format::general);
  if (ec == std::errc::result_out_of_range) {
    // Too large or too small for a double. Which: the sign of the decimal exponent of the
    // first non-zero digit (there is one: zero is never out of range).
    std::int64_t exponent = 0;
    if (mantissa_end < s.size()) {
      std::size_t e = mantissa_end + 1;
      const bool negative_exponent = s[e] == '-';
      if (s[e] == '+' || s[e] == '-') ++e;
      for (; e < s.size() && exponent < 1000000000000000; ++e) exponent = exponent * 10 + (s[e] - '0');
      if (negative_exponent) exponent = -exponent;
    }
    std::int64_t lead = 0;
    for (std::size_t k = number_start; k < mantissa_end; ++k) {
      if (s[k] == '.' || s[k] == '0') continue;
      const auto position = static_cast<std::int64_t>(k - number_start);  // counts the point too
      const auto point = static_cast<std::int64_t>(int_digits);
      lead = position < point ? point - 1 - position : point - position;
      break;
    }
    if (exponent + lead > 0) return decimal_status::too_large;
    v = 0;  // nearer to zero than to the least subnormal double
  } else if (ec != std::errc{} || p != s.data() + s.size()) {
    return decimal_status::malformed;
  }
  out = negative && v != 0 ? -v : v;  // -0 reads as 0
  return decimal_status::ok;
}

/// The message for a field that is not a number of the format.
inline std::string not_a_number(std::string_view field, std::string_view what) {
  std::string m = std::string(what) + " " + quote(field) + " is not a number";
  std::string lower;
  for (char c : field.substr(0, 12)) lower += (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c;
  const auto body = std::string_view(lower).substr(!lower.empty() && (lower[0] == '+' || lower[0] == '-'));
  if (body == "inf" || body == "infinity" || body == "nan")
    return m + " (every number must be finite)";
  if (!field.empty() && (field.find('.') == 0 || field.back() == '.' || field.find(".e") != std::string_view::npos ||
                         field.find(".E") != std::string_view::npos || field.find("-.") != std::string_view::npos ||
                         field.find("+.") != std::string_view::npos))
    return m + " (write a digit on both sides of the decimal point, as in 0.5 or 1.0)";
  return m + " (a decimal such as 2, -0.75 or 1.5e-3)";
}

/// Reads a decimal field or throws at the reader's line.
inline double read_decimal(const line_reader& reader, std::string_view field, std::string_view what) {
  double v = 0;
  switch (parse_decimal(field, v)) {
    case decimal_status::ok:
      return v;
    case decimal_status::too_large:
      reader.fail(std::string(what) + " " + quote(field) + " is too large for a double (at most about 1.8e308)");
    case decimal_status::malformed:
      break;
  }
  reader.fail(not_a_number(field, what));
}

/// The shortest decimal that reads back as v (for messages).
inline std::string shortest(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

/// "1st", "2nd", "3rd", "4th", ... for field numbers in messages.
inline std::string ordinal(std::size_t n) {
  const std::size_t t = n % 100;
  const char* suffix = (t >= 11 && t <= 13) ? "th" : n % 10 == 1 ? "st" : n % 10 == 2 ? "nd" : n % 10 == 3 ? "rd" : "th";
  return std::to_string(n) + suffix;
}

}  // namespace text_detail
}  // namespace lacuna::io

// lacuna/io/svg_text.hpp — the text of SVG documents: numbers for attributes and escaped
// character data. Shared by the SVG writers of lacuna/io (persistence_svg.hpp, cycle_svg.hpp).
#pragma once

#include <charconv>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <string>
#include <string_view>

namespace lacuna::io::svg_detail {

/// A number for an SVG attribute: fixed, two decimals, locale-free.
inline std::string num(double v) {
  if (!std::isfinite(v)) v = 0;  // never reached for values inside the view box
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed, 2);
  std::string s(buf, r.ptr);
  if (s == "-0.00") s = "0.00";
  return s;
}

/// Text for XML character data and attributes: escaped, control characters dropped, invalid
/// UTF-8 replaced by U+FFFD, at most `max_chars` characters (then an ellipsis).
inline std::string xml_text(std::string_view s, std::size_t max_chars = std::numeric_limits<std::size_t>::max()) {
  std::string out;
  std::size_t chars = 0, i = 0;
  while (i < s.size()) {
    if (chars == max_chars) {
      out += "\xE2\x80\xA6";  // …
      break;
    }
    const auto c = static_cast<unsigned char>(s[i]);
    if (c < 0x80) {
      ++i;
      if (c == '\t' || c == '\n' || c == '\r') {
        out += ' ';
      } else if (c < 0x20 || c == 0x7F) {
        continue;
      } else if (c == '&') {
        out += "&amp;";
      } else if (c == '<') {
        out += "&lt;";
      } else if (c == '>') {
        out += "&gt;";
      } else if (c == '"') {
        out += "&quot;";
      } else if (c == '\'') {
        out += "&apos;";
      } else {
        out += static_cast<char>(c);
      }
      ++chars;
      continue;
    }
    std::size_t n = 0;
    std::uint32_t cp = 0;
    if ((c & 0xE0) == 0xC0) {
      n = 1;
      cp = c & 0x1Fu;
    } else if ((c & 0xF0) == 0xE0) {
      n = 2;
      cp = c & 0x0Fu;
    } else if ((c & 0xF8) == 0xF0) {
      n = 3;
      cp = c & 0x07u;
    }
    bool ok = n > 0 && i + n < s.size();
    for (std::size_t t = 1; ok && t <= n; ++t) {
      const auto d = static_cast<unsigned char>(s[i + t]);
      ok = (d & 0xC0) == 0x80;
      cp = (cp << 6) | (d & 0x3Fu);
    }
    // also refuse what XML 1.0 does not allow: surrogates, U+FFFE, U+FFFF, C1 controls
    ok = ok && !((n == 1 && cp < 0x80) || (n == 2 && cp < 0x800) || (n == 3 && cp < 0x10000) || cp > 0x10FFFF ||
                 (cp >= 0xD800 && cp <= 0xDFFF) || cp == 0xFFFE || cp == 0xFFFF || (cp >= 0x80 && cp <= 0x9F));
    if (ok) {
      out.append(s.substr(i, n + 1));
      i += n + 1;
    } else {
      out += "\xEF\xBF\xBD";  // U+FFFD
      ++i;
    }
    ++chars;
  }
  return out;
}

}  // namespace lacuna::io::svg_detail

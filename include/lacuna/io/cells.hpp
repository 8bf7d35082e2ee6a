// lacuna/io/cells.hpp — the cell list format (.cells) of docs/formats.md.
//
//   read_cells(stream, file_name [, options])  -> cell_list
//   read_cells(path [, options])               -> cell_list
//   write_cells(stream, complex)                  any lacuna::cell_complex
//
// Lines "0 NAME" and "DIM NAME : CHAIN"; CHAIN is "0" or terms [+|-][COEFFICIENT*]NAME with
// optional whitespace between tokens. Errors are lacuna::parse_error, "FILE:LINE: message",
// for every rule of the format, and for limits of lacuna's own, checked before anything is
// allocated: options.max_cells, options.max_dimension and options.max_coefficient_digits.
// Coefficients are integers of any size, as the format says: those that fit in int64 are read
// on the fast path, the others as lacuna::integer (cell_list then keeps that dimension
// exactly); repeated names add up exactly, and ∂∂ = 0 is checked exactly. write_cells writes
// every coefficient back exactly, so a cell list survives the round trip.
// The writer names cells by lacuna::cell_name; a name that is not a valid NAME is rewritten
// (each run of other characters becomes '_', a leading digit gets a '_' in front) with the
// original in a comment; if the rewritten names collide, every cell is named e<k>_<i>.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <istream>
#include <limits>
#include <ostream>
#include <string>
#include <string_view>
#include <unordered_map>
#include <unordered_set>
#include <vector>

namespace lacuna::io {

/// Limits a reader applies before it allocates.
struct cells_read_options {
  /// The most cells the file may declare.
  std::size_t max_cells = std::size_t{1} << 31;
  /// The highest dimension a cell may have.
  int max_dimension = 1024;
  /// The most decimal digits a coefficient may have (leading zeros included). Reading n digits
  /// costs O(n^2) time, so this bounds the work a single term can ask for; 100000 digits (a
  /// number of about 332000 bits) take well under a second.
  std::size_t max_coefficient_digits = 100000;
  /// The longest line, in bytes (io/line_reader.hpp): bounds the memory an endless stream
  /// that never ends a line can take.
  std::size_t max_line_bytes = std::size_t{1} << 24;
};

namespace cells_detail {

inline bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\v' || c == '\f'; }
inline bool is_digit(char c) { return c >= '0' && c <= '9'; }
inline bool is_letter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
inline bool name_start(char c) { return is_letter(c) || c == '_'; }
inline bool name_char(char c) { return name_start(c) || is_digit(c) || c == '.' || c == '\''; }

/// True if s is a NAME of the cell list format.
inline bool valid_name(std::string_view s) {
  if (s.empty() || !name_start(s[0])) return false;
  for (char c : s)
    if (!name_char(c)) return false;
  return true;
}

/// A readable rendering of the next token, for messages.
inline std::string near(std::string_view rest) {
  std::size_t n = 0;
  while (n < rest.size() && !is_space(rest[n]) && n < 20) ++n;
  if (n == 0) return "the end of the line";
  return quote_text(rest.substr(0, n));
}

struct cursor {
  std::string_view s;
  std::size_t i = 0;
  void skip() {
    while (i < s.size() && is_space(s[i])) ++i;
  }
  bool done() const { return i >= s.size(); }
  char peek() const { return s[i]; }
  std::string_view rest() const { return s.substr(i); }
  std::string_view take_name() {
    const std::size_t start = i;
    if (i < s.size() && name_start(s[i]))
      while (i < s.size() && name_char(s[i])) ++i;
    return s.substr(start, i - start);
  }
  std::string_view take_digits() {
    const std::size_t start = i;
    while (i < s.size() && is_digit(s[i])) ++i;
    return s.substr(start, i - start);
  }
};

struct declared {
  int dimension;
  std::size_t index;
  std::size_t line;
};

/// The magnitude of a decimal string if it is at most `limit`.
inline bool parse_magnitude(std::string_view digits, std::uint64_t limit, std::uint64_t& out) {
  std::uint64_t v = 0;
  for (char c : digits) {
    const auto d = static_cast<std::uint64_t>(c - '0');
    if (d > limit || v > (limit - d) / 10) return false;
    v = v * 10 + d;
  }
  out = v;
  return true;
}

/// The value of a decimal string of any length (digits only, at least one), by chunks of 18
/// digits: exact, and free of the prefix rules (0x, leading 0) of string constructors.
/// `Integer` is lacuna::integer; a template so that its big-integer arithmetic is instantiated
/// only where cell lists are read.
template <class Integer>
Integer parse_integer(std::string_view digits) {
  std::uint64_t m = 0;
  if (digits.size() <= 18 && parse_magnitude(digits, std::numeric_limits<std::uint64_t>::max(), m))
    return Integer(m);
  typename Integer::big_type v = 0;
  const std::size_t head = digits.size() % 18 == 0 ? 18 : digits.size() % 18;
  std::size_t pos = 0;
  for (std::size_t len = head; pos < digits.size(); pos += len, len = 18) {
    std::uint64_t chunk = 0, scale = 1;
    for (std::size_t j = 0; j < len; ++j) {
      chunk = chunk * 10 + static_cast<std::uint64_t>(digits[pos + j] - '0');
      scale *= 10;
    }
    v = v * scale + chunk;
  }
  return Integer(std::move(v));
}

/// The body of read_cells; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
cell_list read_cells_from(Stream& in, const std::string& file_name, const cells_read_options& options) {
  using namespace cells_detail;
  cell_list out;
  std::unordered_map<std::string, declared> names;
  std::size_t line_number = 0, total = 0;
  std::vector<exact_incidence> terms;
  std::unordered_map<std::size_t, integer> dd;
  const auto fail = [&](const std::string& message) { throw parse_error(file_name, line_number, message); };
  // the shared line reader: LF or CRLF, a leading byte-order mark skipped, a bare CR and an
  // over-long line refused (io/line_reader.hpp)
  line_reader lines(in, file_name, {.max_line_bytes = options.max_line_bytes});
  for (std::string_view line; lines.next(line);) {
    line_number = lines.line_number();
    line = strip_comment(line);
    cursor cur{line};
    cur.skip();
    if (cur.done()) continue;
    // DIM
    const auto dim_text = cur.take_digits();
    if (dim_text.empty())
      fail("expected the dimension of a cell (a decimal integer >= 0) at the start of the line, found " +
           near(cur.rest()));
    std::uint64_t dim64 = 0;
    if (!parse_magnitude(dim_text, static_cast<std::uint64_t>(options.max_dimension), dim64))
      fail("dimension " + std::string(dim_text) + " is above the limit of " + std::to_string(options.max_dimension));
    const int dim = static_cast<int>(dim64);
    if (!cur.done() && !is_space(cur.peek()))
      fail("expected a space after the dimension " + std::string(dim_text) + ", found " + near(cur.rest()));
    cur.skip();
    // NAME
    const std::string name(cur.take_name());
    if (name.empty())
      fail("expected a cell name (a letter or '_', then letters, digits, '_', '.' or ''') after the dimension, found " +
           near(cur.rest()));
    if (!cur.done() && !is_space(cur.peek()) && cur.peek() != ':')
      fail("unexpected " + near(cur.rest()) + " in the cell name '" + name + "'");
    if (const auto it = names.find(name); it != names.end())
      fail("the cell '" + name + "' is already declared on line " + std::to_string(it->second.line));
    if (total >= options.max_cells)
      fail("more than " + std::to_string(options.max_cells) + " cells (the limit of the reader)");
    cur.skip();
    terms.clear();
    if (dim == 0) {
      if (!cur.done()) {
        if (cur.peek() == ':') fail("the 0-cell '" + name + "' cannot have a boundary: write '0 " + name + "'");
        fail("unexpected " + near(cur.rest()) + " after the 0-cell '" + name + "'");
      }
    } else {
      if (cur.done() || cur.peek() != ':')
        fail("expected ':' and the boundary of the " + std::to_string(dim) + "-cell '" + name + "', found " +
             near(cur.rest()));
      ++cur.i;
      cur.skip();
      if (cur.done()) fail("the boundary of '" + name + "' is missing (write 0 for the zero chain)");
      // CHAIN: "0" alone, or terms
      bool zero_chain = false;
      {
        cursor probe = cur;
        const auto d = probe.take_digits();
        probe.skip();
        zero_chain = d == "0" && probe.done();
      }
      bool first = true;
      while (!zero_chain) {
        cur.skip();
        if (cur.done()) break;
        bool negative = false;
        if (cur.peek() == '+' || cur.peek() == '-') {
          negative = cur.peek() == '-';
          ++cur.i;
          cur.skip();
        } else if (!first) {
          fail("expected '+' or '-' before the next term of the boundary of '" + name + "', found " + near(cur.rest()));
        }
        first = false;
        integer coefficient(negative ? -1 : 1);
        if (!cur.done() && is_digit(cur.peek())) {
          const auto digits = cur.take_digits();
          if (digits.size() > options.max_coefficient_digits)
            fail("a coefficient of " + std::to_string(digits.size()) + " digits in the boundary of '" + name +
                 "' is above the limit of " + std::to_string(options.max_coefficient_digits) +
                 " digits (the limit of the reader)");
          integer m = parse_integer<integer>(digits);
          if (m.sign() == 0) fail("a coefficient must be positive, found 0 in the boundary of '" + name + "'");
          coefficient = negative ? -m : std::move(m);
          cur.skip();
          if (cur.done() || cur.peek() != '*')
            fail("expected '*' after the coefficient " +
                 (digits.size() <= 40 ? std::string(digits) : std::string(digits.substr(0, 20)) + "...") +
                 ", found " + near(cur.rest()));
          ++cur.i;
          cur.skip();
        }
        const std::string face(cur.take_name());
        if (face.empty()) fail("expected a cell name in the boundary of '" + name + "', found " + near(cur.rest()));
        if (!cur.done() && !is_space(cur.peek()) && cur.peek() != '+' && cur.peek() != '-')
          fail("unexpected " + near(cur.rest()) + " after the cell name '" + face + "'");
        const auto it = names.find(face);
        if (it == names.end())
          fail("unknown cell '" + face + "' in the boundary of '" + name + "' (a cell must be declared before it is used)");
        if (it->second.dimension != dim - 1)
          fail("the cell '" + face + "' has dimension " + std::to_string(it->second.dimension) +
               ", but the boundary of a " + std::to_string(dim) + "-cell is made of " + std::to_string(dim - 1) +
               "-cells");
        terms.push_back({it->second.index, std::move(coefficient)});
      }
      if (zero_chain) terms.clear();
    }
    // the cell keeps the faces as written (cell_list::faces_as_written: a face whose
    // coefficients add up to zero is still a face), its boundary the exact sums; then ∂∂ = 0
    // is checked exactly (lacuna::integer: 64-bit arithmetic inline while the numbers fit)
    const std::size_t index = out.add_cell(dim, name, std::move(terms));
    terms.clear();
    if (dim >= 2) {
      dd.clear();
      for (const auto& t : out.boundary(dim, index))
        for (const auto& u : out.boundary(dim - 1, t.face)) dd[u.face] += t.coefficient * u.coefficient;
      std::size_t worst = std::numeric_limits<std::size_t>::max();
      for (const auto& [f, v] : dd)
        if (v.sign() != 0 && f < worst) worst = f;
      if (worst != std::numeric_limits<std::size_t>::max())
        fail("the boundary of the boundary of '" + name + "' is not zero (it has '" + out.cell_name(dim - 2, worst) +
             "' in it)");
    }
    names.emplace(name, declared{dim, index, line_number});
    ++total;
  }
  return out;
}

}  // namespace cells_detail

/// Reads a cell list from `in`; `file_name` is used in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
template <input_stream Stream>
cell_list read_cells(Stream& in, const std::string& file_name, const cells_read_options& options = {}) {
  return cells_detail::read_cells_from<std::istream>(in, file_name, options);
}

/// Reads the cell list in the file at `path`.
template <path_argument Path>
cell_list read_cells(const Path& file, const cells_read_options& options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return read_cells(in, path.string(), options);
}

/// Writes any cell complex as a cell list (see the top of this header for the names).
/// Throws lacuna::invalid_complex naming the cell if a face index is out of range.
template <cell_complex C>
void write_cells(std::ostream& out, const C& c) {
  const int top = lacuna::top_dimension(c);
  std::vector<std::vector<std::string>> names(top >= 0 ? static_cast<std::size_t>(top) + 1 : 0);
  std::vector<std::vector<std::string>> originals(names.size());
  std::unordered_set<std::string> seen;
  bool unique = true;
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      std::string n = lacuna::cell_name(c, k, i), fixed;
      if (!cells_detail::valid_name(n)) {
        bool bad_run = false;
        for (char ch : n) {
          if (cells_detail::name_char(ch)) {
            fixed += ch;
            bad_run = false;
          } else if (!bad_run) {
            fixed += '_';
            bad_run = true;
          }
        }
        if (fixed.empty() || !cells_detail::name_start(fixed[0])) fixed.insert(0, "_");
      } else {
        fixed = n;
      }
      unique = unique && seen.insert(fixed).second;
      originals[static_cast<std::size_t>(k)].push_back(fixed == n ? std::string() : n);
      names[static_cast<std::size_t>(k)].push_back(std::move(fixed));
    }
  if (!unique)
    for (int k = 0; k <= top; ++k)
      for (std::size_t i = 0; i < names[static_cast<std::size_t>(k)].size(); ++i) {
        auto& o = originals[static_cast<std::size_t>(k)][i];
        if (o.empty()) o = names[static_cast<std::size_t>(k)][i];
        names[static_cast<std::size_t>(k)][i] = lacuna::detail::concat("e", std::to_string(k), "_", std::to_string(i));
      }
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      out << k << ' ' << names[static_cast<std::size_t>(k)][i];
      if (k > 0) {
        out << " :";
        bool any = false;
        for (const auto& term : lacuna::boundary(c, k, i)) {
          const std::size_t face = incidence_face(term);
          bool negative = false;
          std::uint64_t m = 0;      // the magnitude as unsigned, so that -2^63 is written too
          std::string big_digits;  // the magnitude of a coefficient beyond int64
          if constexpr (small_incidence_like<std::remove_cvref_t<decltype(term)>>) {
            const std::int64_t v = as_incidence(term).coefficient;
            if (v == 0) continue;
            negative = v < 0;
            m = negative ? 0 - static_cast<std::uint64_t>(v) : static_cast<std::uint64_t>(v);
          } else {
            const integer v = coefficient_as_integer(term);
            if (v.sign() == 0) continue;
            negative = v.sign() < 0;
            if (v.is_small())
              m = negative ? 0 - static_cast<std::uint64_t>(v.small_value()) : static_cast<std::uint64_t>(v.small_value());
            else
              big_digits = abs(v).to_string();
          }
          if (face >= lacuna::cell_count(c, k - 1))
            throw invalid_complex("write_cells: " + std::to_string(k) + "-cell " + std::to_string(i) + " ('" +
                                      lacuna::cell_name(c, k, i) + "') has face " + std::to_string(face) +
                                      " out of range",
                                  k, i);
          out << ' ' << (negative ? "-" : (any ? "+" : ""));
          if (negative || any) out << ' ';
          if (!big_digits.empty())
            out << big_digits << '*';
          else if (m != 1)
            out << m << '*';
          out << names[static_cast<std::size_t>(k - 1)][face];
          any = true;
        }
        if (!any) out << " 0";
      }
      const auto& o = originals[static_cast<std::size_t>(k)][i];
      if (!o.empty()) {
        std::string clean = o;
        for (auto& ch : clean)
          if (ch == '\n' || ch == '\r') ch = ' ';
        out << "  # " << clean;
      }
      out << '\n';
    }
}

}  // namespace lacuna::io

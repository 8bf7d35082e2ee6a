// lacuna/io/cells.hpp — the cell list format (.cells) of shared/FORMATS.md.
//
//   read_cells(stream, file_name [, options])  -> cell_list
//   read_cells(path [, options])               -> cell_list
//   write_cells(stream, complex)                  any lacuna::cell_complex
//
// Lines "0 NAME" and "DIM NAME : CHAIN"; CHAIN is "0" or terms [+|-][COEFFICIENT*]NAME with
// optional whitespace between tokens. Errors are lacuna::parse_error, "FILE:LINE: message",
// for every rule of the format, and for two limits of lacuna's own:
//   * a coefficient must fit the int64 incidence numbers of lacuna::cell_complex: the
//     format allows any size, and a term whose signed value lies outside
//     [-2^63, 2^63 - 1] is refused, as is a sum of coefficients of one face beyond int64;
//   * options.max_cells and options.max_dimension, checked before anything is allocated.
// The writer names cells by lacuna::cell_name; a name that is not a valid NAME is rewritten
// (each run of other characters becomes '_', a leading digit gets a '_' in front) with the
// original in a comment; if the rewritten names collide, every cell is named e<k>_<i>.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>

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
};

namespace cells_detail {

__extension__ typedef __int128 int128_t;

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
  return detail::concat("'", rest.substr(0, n), "'");
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

}  // namespace cells_detail

/// Reads a cell list from `in`; `file_name` is used in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
inline cell_list read_cells(std::istream& in, const std::string& file_name, const cells_read_options& options = {}) {
  using namespace cells_detail;
  cell_list out;
  std::unordered_map<std::string, declared> names;
  std::string raw;
  std::size_t line_number = 0, total = 0;
  std::vector<incidence> terms;
  std::vector<std::string> face_names;  // parallel to terms, for messages
  const auto fail = [&](const std::string& message) { throw parse_error(file_name, line_number, message); };
  while (std::getline(in, raw)) {
    ++line_number;
    std::string_view line(raw);
    if (const auto hash = line.find('#'); hash != std::string_view::npos) line = line.substr(0, hash);
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
    face_names.clear();
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
        std::int64_t coefficient = negative ? -1 : 1;
        if (!cur.done() && is_digit(cur.peek())) {
          const auto digits = cur.take_digits();
          std::uint64_t m = 0;
          const std::uint64_t limit = negative ? std::uint64_t{1} << 63 : (std::uint64_t{1} << 63) - 1;
          if (!parse_magnitude(digits, limit, m))
            fail("the coefficient " + std::string(negative ? "-" : "") + std::string(digits) +
                 " does not fit in a signed 64-bit integer");
          if (m == 0) fail("a coefficient must be positive, found 0 in the boundary of '" + name + "'");
          coefficient = negative ? static_cast<std::int64_t>(0 - m) : static_cast<std::int64_t>(m);
          cur.skip();
          if (cur.done() || cur.peek() != '*')
            fail("expected '*' after the coefficient " + std::string(digits) + ", found " + near(cur.rest()));
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
        terms.push_back({it->second.index, coefficient});
        face_names.push_back(face);
      }
      if (zero_chain) terms.clear();
    }
    // add up repeated faces (overflow-checked), then check ∂∂ = 0 in 128-bit arithmetic
    try {
      detail::normalize_chain(terms, "the coefficients in the boundary of '" + name + "' add up beyond 64 bits");
    } catch (const invalid_complex&) {
      fail("the coefficients in the boundary of '" + name + "' add up beyond a signed 64-bit integer");
    }
    if (dim >= 2) {
      std::unordered_map<std::size_t, int128_t> dd;
      for (const auto& t : terms)
        for (const auto& u : out.boundary(dim - 1, t.face))
          dd[u.face] += static_cast<int128_t>(t.coefficient) * u.coefficient;
      std::size_t worst = std::numeric_limits<std::size_t>::max();
      for (const auto& [f, v] : dd)
        if (v != 0 && f < worst) worst = f;
      if (worst != std::numeric_limits<std::size_t>::max())
        fail("the boundary of the boundary of '" + name + "' is not zero (it has '" + out.cell_name(dim - 2, worst) +
             "' in it)");
    }
    const std::size_t index = out.add_cell(dim, name, terms);
    names.emplace(name, declared{dim, index, line_number});
    ++total;
  }
  if (in.bad()) throw parse_error(file_name, line_number, "read error");
  return out;
}

/// Reads the cell list in the file at `path`.
inline cell_list read_cells(const std::filesystem::path& path, const cells_read_options& options = {}) {
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
        names[static_cast<std::size_t>(k)][i] = detail::concat("e", std::to_string(k), "_", std::to_string(i));
      }
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      out << k << ' ' << names[static_cast<std::size_t>(k)][i];
      if (k > 0) {
        out << " :";
        bool any = false;
        for (const auto& term : lacuna::boundary(c, k, i)) {
          const incidence t = as_incidence(term);
          if (t.coefficient == 0) continue;
          if (t.face >= lacuna::cell_count(c, k - 1))
            throw invalid_complex("write_cells: " + std::to_string(k) + "-cell " + std::to_string(i) + " ('" +
                                      lacuna::cell_name(c, k, i) + "') has face " + std::to_string(t.face) +
                                      " out of range",
                                  k, i);
          const bool negative = t.coefficient < 0;
          // the magnitude as unsigned, so that -2^63 is written too
          const std::uint64_t m = negative ? 0 - static_cast<std::uint64_t>(t.coefficient)
                                           : static_cast<std::uint64_t>(t.coefficient);
          out << ' ' << (negative ? "-" : (any ? "+" : ""));
          if (negative || any) out << ' ';
          if (m != 1) out << m << '*';
          out << names[static_cast<std::size_t>(k - 1)][t.face];
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

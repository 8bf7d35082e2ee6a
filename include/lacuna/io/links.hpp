// lacuna/io/links.hpp — sparse distances (.links) for Vietoris–Rips persistence: only the pairs
// of points the file lists have a distance; every other pair has none (its edge never enters).
//
//   read_links(stream, file_name [, options])  -> link_list
//   read_links(path [, options])               -> link_list
//
// The layout (docs/formats.md, "Sparse distances"):
//
//   # a comment
//   points 5
//   1 2 0.5
//   2, 3, 0.75
//
// The first line that is not blank or a comment is `points N`: the number of points, a
// decimal integer >= 0 (the points are 1..N; a point no line names is alone, a class of its
// own). Every further line lists one pair: two point numbers and their distance, three fields
// separated by blanks, a comma, or both. A distance is a decimal as for point clouds
// (text_lines.hpp), finite and not negative (`-0` reads as 0). The two points differ, and
// each unordered pair is listed once (`1 2 ...` and `2 1 ...` are the same pair).
//
// Errors are lacuna::parse_error "FILE:LINE: message": a first line other than `points N`, a
// count or point number that is not a decimal integer or is out of range, a line without
// exactly three fields, an empty field, a pair of one point, a distance that is not a number,
// not finite or negative, a pair listed twice (naming the line of its first listing), and the
// limits of links_read_options.
//
// Memory: 24 bytes per pair listed (and as much again while repeated pairs are looked for).
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/io/text_lines.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <istream>
#include <string>
#include <string_view>
#include <vector>

namespace lacuna::io {

/// One pair of a sparse distance list: 0-based points (a < b) and their distance.
struct listed_pair {
  ///@{
  /// The two points, a < b.
  std::uint32_t a = 0, b = 0;
  ///@}
  /// Their distance.
  double distance = 0;
};

/// A sparse distance list as read: the number of points and the pairs, in the order of the file.
struct link_list {
  /// The number of points.
  std::size_t points = 0;
  /// The pairs, in the order of the file.
  std::vector<listed_pair> pairs;
  /// The line of the file of each pair (for messages of later checks).
  std::vector<std::size_t> lines;
};

/// Limits of read_links, checked before the memory they guard is taken.
struct links_read_options {
  /// The most points (at most 2^32 - 2, the most lacuna's Vietoris–Rips numbering takes).
  std::size_t max_points = std::size_t{1} << 26;
  /// The most pairs.
  std::size_t max_pairs = std::size_t{1} << 27;
  /// The longest line, in bytes (without its line end).
  std::size_t max_line_bytes = std::size_t{1} << 16;
};

namespace links_detail {

/// A decimal integer of at most 19 digits (no sign), or false.
inline bool parse_count(std::string_view s, std::uint64_t& out) {
  if (s.empty() || s.size() > 19) return false;
  std::uint64_t v = 0;
  for (const char c : s) {
    if (c < '0' || c > '9') return false;
    v = v * 10 + static_cast<std::uint64_t>(c - '0');
  }
  out = v;
  return true;
}

/// The body of read_links; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
link_list read_links_from(Stream& in, const std::string& file_name, const links_read_options& options) {
  using text_detail::quote;
  text_detail::line_reader reader(in, file_name, options.max_line_bytes);
  link_list out;
  std::vector<std::string_view> fields;
  bool counted = false;
  std::string_view line;
  while (reader.next(line)) {
    const std::size_t empty = text_detail::split_fields(line, fields);
    if (fields.empty()) continue;
    if (!counted) {
      std::uint64_t n = 0;
      if (fields.size() != 2 || fields[0] != "points" || !links_detail::parse_count(fields[1], n))
        reader.fail("expected `points N` (the number of points, a decimal integer >= 0) as the first line, found " +
                    quote(line));
      const std::size_t cap = std::min<std::size_t>(options.max_points, (std::size_t{1} << 32) - 2);
      if (n > cap)
        reader.fail(std::to_string(n) + " points, more than the limit of " + std::to_string(cap) +
                    " (the limit of the reader)");
      out.points = static_cast<std::size_t>(n);
      counted = true;
      continue;
    }
    if (empty != 0)
      reader.fail("the " + text_detail::ordinal(empty) +
                  " field is empty (two commas in a row, or a comma at the start or end of the line)");
    if (fields.size() != 3)
      reader.fail("a pair line holds two point numbers and a distance, three fields; this one holds " +
                  std::to_string(fields.size()));
    std::uint64_t p[2] = {0, 0};
    for (int i = 0; i < 2; ++i) {
      if (!links_detail::parse_count(fields[static_cast<std::size_t>(i)], p[i]) || p[i] == 0 || p[i] > out.points)
        reader.fail("the " + std::string(i == 0 ? "first" : "second") + " point " + quote(fields[static_cast<std::size_t>(i)]) +
                    " is not a point number (an integer from 1 to " + std::to_string(out.points) + ", the count of `points`)");
    }
    if (p[0] == p[1]) reader.fail("a pair of point " + std::to_string(p[0]) + " with itself");
    const double d = text_detail::read_decimal(reader, fields[2], "the distance");
    if (d < 0) reader.fail("the distance " + text_detail::shortest(d) + " is negative: a distance is at least 0");
    if (out.pairs.size() >= options.max_pairs)
      reader.fail("more than " + std::to_string(options.max_pairs) + " pairs (the limit of the reader)");
    out.pairs.push_back({static_cast<std::uint32_t>(std::min(p[0], p[1]) - 1), static_cast<std::uint32_t>(std::max(p[0], p[1]) - 1),
                         d == 0 ? 0.0 : d});
    out.lines.push_back(reader.line_number());
  }
  if (!counted) reader.fail_at(reader.line_number(), "no `points N` line: the file lists nothing");
  // a pair listed twice: sort a copy of the positions by pair, then by line
  std::vector<std::size_t> order(out.pairs.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](std::size_t x, std::size_t y) {
    const auto& u = out.pairs[x];
    const auto& v = out.pairs[y];
    return u.a != v.a ? u.a < v.a : u.b != v.b ? u.b < v.b : x < y;
  });
  const auto same = [&](std::size_t x, std::size_t y) {
    return out.pairs[x].a == out.pairs[y].a && out.pairs[x].b == out.pairs[y].b;
  };
  std::size_t worst = out.pairs.size();  // the earliest second listing of any pair
  std::size_t first_of_worst = 0;
  for (std::size_t i = 1; i < order.size(); ++i) {
    const bool second_listing = same(order[i - 1], order[i]) && (i == 1 || !same(order[i - 2], order[i - 1]));
    if (second_listing && order[i] < worst) {
      worst = order[i];
      first_of_worst = order[i - 1];
    }
  }
  if (worst < out.pairs.size()) {
    const auto& w = out.pairs[worst];
    reader.fail_at(out.lines[worst], "the pair of points " + std::to_string(w.a + 1) + " and " + std::to_string(w.b + 1) +
                                         " is listed again (first at line " + std::to_string(out.lines[first_of_worst]) +
                                         "): each pair is listed once");
  }
  return out;
}

}  // namespace links_detail

/// Reads a sparse distance list from `in`; `file_name` names it in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
template <input_stream Stream>
link_list read_links(Stream& in, const std::string& file_name, const links_read_options& options = {}) {
  return links_detail::read_links_from<std::istream>(in, file_name, options);
}

/// Reads the sparse distance list in the file at `path`. Throws lacuna::parse_error ("FILE:
/// cannot open the file", or FILE:LINE: message).
template <path_argument Path>
link_list read_links(const Path& file, const links_read_options& options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return read_links(in, path.string(), options);
}

}  // namespace lacuna::io

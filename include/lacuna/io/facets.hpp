// lacuna/io/facets.hpp — the facet list format (.facets) of docs/formats.md.
//
//   read_facets(stream, file_name [, options])  -> simplicial_complex<std::string>
//   read_facets(path [, options])               -> simplicial_complex<std::string>
//   write_facets(stream, complex)                  any simplicial_complex<Label>
//
// One simplex per line, labels separated by whitespace; '#' starts a comment; LF or CRLF;
// blank lines ignored; the complex is the closure; vertices numbered in order of first
// appearance. Errors are lacuna::parse_error, "FILE:LINE: message":
//   * a label repeated within one line;
//   * bytes that are not UTF-8;
//   * the rules of every text format (io/line_reader.hpp): a bare CR, a line longer than
//     options.max_line_bytes (a leading UTF-8 byte-order mark is skipped);
//   * a line of more than options.max_facet_vertices labels;
//   * facets whose closures, counted line by line before duplicates merge (2^n - 1 faces for
//     n labels), add up to more than options.max_cells (reported at the line that crosses
//     it). This sum bounds the reader's work and memory, so a short hostile file (one line
//     of 28 one-letter labels implies 2^28 simplices) is refused before anything is built.
// The writer writes the maximal simplices in lexicographic order of vertex ids, adding a
// line with a single vertex where that is needed to keep the numbering, so that reading the
// output back gives the same complex (same numbering, same orientation).
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/io/read_limits.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <functional>
#include <istream>
#include <limits>
#include <ostream>
#include <string>
#include <string_view>
#include <unordered_set>
#include <vector>

namespace lacuna::io {

/// Limits a reader applies before it allocates.
struct facets_read_options {
  /// The most simplices the facets may imply, summed line by line before duplicates merge
  /// (so also a bound on the complex). 2^28 simplices take about 3 GB once built.
  std::size_t max_cells = std::size_t{1} << 28;
  /// The most labels one line may hold: a simplex of n vertices brings 2^n - 1 faces.
  std::size_t max_facet_vertices = 20;
  /// The longest line, in bytes (io/line_reader.hpp): bounds the memory an endless stream
  /// that never ends a line can take.
  std::size_t max_line_bytes = std::size_t{1} << 24;
};

namespace facets_detail {

inline bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f'; }

/// True if s is well-formed UTF-8 (no overlong forms, no surrogates, at most U+10FFFF).
inline bool valid_utf8(std::string_view s) { return io::valid_utf8(s); }

/// True if the text can be written as a facet-list label.
inline bool writable_label(std::string_view s) {
  if (s.empty()) return false;
  for (char c : s)
    if (is_space(c) || c == '#') return false;
  return true;
}

/// The body of read_facets; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
simplicial_complex<std::string> read_facets_from(Stream& in, const std::string& file_name,
                                                 const facets_read_options& options) {
  using builder = simplicial_complex<std::string>::builder;
  builder b;
  b.max_cells(options.max_cells);
  // A line of a new vertex takes at least 2 bytes, typical files 30 to 60 bytes per vertex:
  // room for one vertex per 32 bytes (at most 2^24 up front) spares most rehashing. The read
  // buffer and the label cache below are sized by the file too, so a small file costs little.
  const auto left = detail::remaining_bytes(in);
  if (left) b.reserve_vertices(static_cast<std::size_t>(std::min<std::uint64_t>(*left / 32, std::uint64_t{1} << 24)));
  std::vector<std::string_view> labels;
  std::vector<simplicial_complex<std::string>::vertex_id> ids;
  std::size_t line_number = 0;
  std::uint64_t implied = 0;  // the closures' sizes so far, duplicates counted
  // Neighbouring lines share most of their vertices: a small direct-mapped cache of recent
  // labels (slot by hash, checked against the label's text) spares most lookups in the big
  // hash table, whose entries are scattered in memory.
  std::size_t cache_slots = 64;  // a power of two, about one slot per 8 bytes, at most 2^16
  while (cache_slots < (std::size_t{1} << 16) && (!left || cache_slots * 8 < *left)) cache_slots <<= 1;
  constexpr auto no_vertex = std::numeric_limits<simplicial_complex<std::string>::vertex_id>::max();
  std::vector<simplicial_complex<std::string>::vertex_id> recent(cache_slots, no_vertex);
  const auto vertex_of = [&](std::string_view l) {
    auto& slot = recent[std::hash<std::string_view>{}(l) & (cache_slots - 1)];
    if (slot != no_vertex && b.label(slot) == l) return slot;
    return slot = b.vertex_of_text(l);
  };
  auto process = [&](std::string_view line) {
    ++line_number;  // the same as the line reader's count
    if (const auto hash = line.find('#'); hash != std::string_view::npos) line = line.substr(0, hash);
    labels.clear();
    bool high = false;  // a byte >= 0x80: the labels need the UTF-8 check
    for (std::size_t i = 0; i < line.size();) {
      while (i < line.size() && facets_detail::is_space(line[i])) ++i;
      const std::size_t start = i;
      while (i < line.size() && !facets_detail::is_space(line[i])) high |= static_cast<unsigned char>(line[i++]) >= 0x80;
      if (i > start) labels.push_back(line.substr(start, i - start));
    }
    if (labels.empty()) return;
    if (high)
      for (const auto l : labels)
        if (!facets_detail::valid_utf8(l)) throw parse_error(file_name, line_number, "a label is not valid UTF-8");
    // 2^n - 1 faces for n labels: refuse before the builder allocates them
    const std::size_t n = labels.size();
    if (n > options.max_facet_vertices)
      throw parse_error(file_name, line_number,
                        "a simplex with " + std::to_string(n) + " vertices (2^" + std::to_string(n) +
                            " - 1 faces) is more than the limit of " + std::to_string(options.max_facet_vertices) +
                            " vertices per line");
    const std::uint64_t faces = n >= 63 ? ~std::uint64_t{0} : (std::uint64_t{1} << n) - 1;
    if (faces > options.max_cells || implied > options.max_cells - faces)
      throw parse_error(file_name, line_number,
                        "the facets up to this line imply up to " +
                            (faces > ~std::uint64_t{0} - implied ? std::string("2^64") : std::to_string(implied + faces)) +
                            " simplices, more than the limit of " + std::to_string(options.max_cells) + " cells");
    implied += faces;
    for (std::size_t i = 0; i < n; ++i)
      for (std::size_t j = i + 1; j < n; ++j)
        if (labels[i] == labels[j])
          throw parse_error(file_name, line_number,
                            "the label " + quote_text(labels[i]) + " is repeated within one simplex");
    ids.clear();
    try {
      for (const auto l : labels) ids.push_back(vertex_of(l));
      b.add_facet_ids(ids);
    } catch (const invalid_complex& e) {
      throw parse_error(file_name, line_number, e.what());
    }
  };
  // The shared line reader (LF or CRLF, a leading byte-order mark skipped, a bare CR and an
  // over-long line refused) in blocks sized by the file: up to 1 MiB.
  line_reader lines(in, file_name,
                    {.max_line_bytes = options.max_line_bytes,
                     .block_bytes = left ? static_cast<std::size_t>(std::clamp<std::uint64_t>(*left + 1, 4096, std::uint64_t{1} << 20))
                                         : std::size_t{1} << 20});
  for (std::string_view line; lines.next(line);) process(line);
  try {
    return std::move(b).finalize();
  } catch (const invalid_complex& e) {
    throw parse_error(file_name, 0, e.what());
  }
}

}  // namespace facets_detail

/// Reads a facet list from `in`; `file_name` is used in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
/// The stream is read in blocks of up to 1 MiB and each line is split in place: labels are looked
/// up as views, and a string is made only for a vertex seen for the first time.
template <input_stream Stream>
simplicial_complex<std::string> read_facets(Stream& in, const std::string& file_name,
                                            const facets_read_options& options = {}) {
  return facets_detail::read_facets_from<std::istream>(in, file_name, options);
}

/// Reads the facet list in the file at `path`. Throws lacuna::parse_error ("FILE: cannot
/// open the file", or FILE:LINE: message).
template <path_argument Path>
simplicial_complex<std::string> read_facets(const Path& file, const facets_read_options& options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return read_facets(in, path.string(), options);
}

/// Writes c as a facet list that reads back as the same complex. Throws
/// lacuna::invalid_complex naming the vertex if a label's text is empty, holds whitespace
/// or '#', or equals the text of another label.
template <class Label>
void write_facets(std::ostream& out, const simplicial_complex<Label>& c) {
  std::vector<std::string> text;
  std::unordered_set<std::string> seen;
  for (std::uint32_t v = 0; v < c.vertex_count(); ++v) {
    text.push_back(lacuna::detail::label_to_string(c.label(v)));
    if (!facets_detail::writable_label(text.back()))
      throw invalid_complex("write_facets: the label of vertex " + std::to_string(v) + " ('" + text.back() +
                                "') is empty or holds whitespace or '#'",
                            0, v);
    if (!seen.insert(text.back()).second)
      throw invalid_complex("write_facets: two vertices have the label '" + text.back() + "'", 0, v);
  }
  auto facets = c.facets();
  const auto lex = [&](const std::pair<int, std::size_t>& a, const std::pair<int, std::size_t>& b) {
    const auto x = c.vertices(a.first, a.second), y = c.vertices(b.first, b.second);
    return std::lexicographical_compare(x.begin(), x.end(), y.begin(), y.end());
  };
  std::sort(facets.begin(), facets.end(), lex);
  out << "# " << c.vertex_count() << " vertices, " << facets.size() << " facets\n";
  std::uint32_t next = 0;  // the first vertex not yet written
  for (const auto& [k, i] : facets) {
    const auto vs = c.vertices(k, i);
    if (k == 0 && vs[0] < next) continue;  // already written on a line of its own
    // the vertices that appear here for the first time must be next, next + 1, ... in order
    std::uint32_t top_new = 0;
    bool any_new = false;
    for (auto v : vs)
      if (v >= next) {
        top_new = any_new ? std::max(top_new, v) : v;
        any_new = true;
      }
    if (any_new) {
      std::uint32_t expect = next;
      bool in_order = true;
      for (auto v : vs)
        if (v >= next) in_order = in_order && (v == expect++);
      if (!in_order)
        for (; next < top_new; ++next) out << text[next] << '\n';
      next = std::max(next, top_new + 1);
    }
    for (std::size_t j = 0; j < vs.size(); ++j) out << (j ? " " : "") << text[vs[j]];
    out << '\n';
  }
}

}  // namespace lacuna::io

// lacuna/io/values.hpp — value files (`--values`): the value at which each listed cell of a
// complex enters a filtration.
//
//   read_values(stream, file_name [, options])  -> value_list     one record per line
//   read_values(path [, options])               -> value_list
//   resolve_values(list, complex, complex_file) -> std::vector<cell_value>
//   line_of_cell(stream, kind, name)            -> the line of FILE where a cell is written
//
// Every line that is not blank or a comment names one cell and ends with its value, separated
// by blanks (spaces, tabs): `NAME VALUE` for a cell list (value_names::cell), the labels of a
// simplex in any order then its value for a facet list (value_names::simplex: `a b c 0.25`).
// The value is a decimal as for point clouds (text_lines.hpp). The line rules of text_lines.hpp
// apply (LF or CRLF, a byte-order mark at the start skipped, no control characters).
//
// read_values checks what can be checked without the complex (a line with no value, a value
// that is not a number, the number of names); resolve_values then finds each record's cell and
// reports, at the record's line of the value file, a name that is not a cell of the complex, a
// label repeated within a line, and a cell listed twice. Whether a cell enters before one of
// its faces, and which cells get no value at all, is for the filtration built from these
// values; line_of_cell finds the line of FILE to name in such an error.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/io/text_lines.hpp>

#include <algorithm>
#include <concepts>
#include <cstddef>
#include <filesystem>
#include <fstream>
#include <istream>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna::io {

/// How a line of a value file names its cell.
enum class value_names {
  cell,    ///< `NAME VALUE`: one cell name (for cell lists)
  simplex  ///< `LABEL ... LABEL VALUE`: the labels of a simplex in any order (for facet lists)
};

/// Limits of read_values, checked before the memory they guard is taken.
struct values_read_options {
  /// How a line names its cell.
  value_names names = value_names::cell;
  /// The most lines with a value.
  std::size_t max_records = std::size_t{1} << 26;
  /// The most labels on one line (value_names::simplex).
  std::size_t max_labels = 64;
  /// The most bytes of names in all.
  std::size_t max_name_bytes = std::size_t{1} << 30;
  /// The longest line, in bytes (without its line end).
  std::size_t max_line_bytes = std::size_t{1} << 20;
};

/// The records of a value file: per line with a value, the names on it, the value and the
/// line number. Names are kept in one block of text.
class value_list {
 public:
  value_list() = default;
  /// An empty list of the value file named `file`.
  explicit value_list(std::string file) : file_(std::move(file)) {}

  /// The value file's name, as given to the reader (used in the resolver's messages).
  const std::string& file() const noexcept { return file_; }
  /// The number of records.
  std::size_t size() const noexcept { return records_.size(); }
  /// True when there is no record.
  bool empty() const noexcept { return records_.empty(); }
  /// The 1-based line of record r in the value file.
  std::size_t line(std::size_t r) const { return records_.at(r).line; }
  /// The value of record r.
  double value(std::size_t r) const { return records_.at(r).value; }
  /// The number of names on record r's line (1 for a cell name, the labels of a simplex).
  std::size_t name_count(std::size_t r) const { return records_.at(r).name_count; }
  /// The k-th name of record r, as written.
  std::string_view name(std::size_t r, std::size_t k) const {
    const auto& rec = records_.at(r);
    const std::size_t n = rec.first_name + k;
    const std::size_t begin = n == 0 ? 0 : ends_.at(n - 1);
    return std::string_view(text_).substr(begin, ends_.at(n) - begin);
  }
  /// The names of record r joined by single spaces, as written.
  std::string joined_names(std::size_t r) const {
    std::string s;
    for (std::size_t k = 0; k < name_count(r); ++k) {
      if (k) s += ' ';
      s += name(r, k);
    }
    return s;
  }
  /// Bytes of names held.
  std::size_t name_bytes() const noexcept { return text_.size(); }

  /// Appends a record (the reader's, and a caller's own way to build a list).
  void add(std::size_t line, std::span<const std::string_view> names, double value) {
    records_.push_back({line, value, ends_.size(), names.size()});
    for (const auto n : names) {
      text_.append(n);
      ends_.push_back(text_.size());
    }
  }

 private:
  struct record {
    std::size_t line;
    double value;
    std::size_t first_name;
    std::size_t name_count;
  };
  std::string file_;
  std::vector<record> records_;
  std::string text_;
  std::vector<std::size_t> ends_;  // name n is text_[ends_[n - 1], ends_[n])
};

namespace values_detail {

/// The body of read_values; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
value_list read_values_from(Stream& in, const std::string& file_name, const values_read_options& options) {
  text_detail::line_reader reader(in, file_name, options.max_line_bytes);
  value_list out(file_name);
  std::vector<std::string_view> tokens;
  std::string_view line;
  const bool simplex = options.names == value_names::simplex;
  while (reader.next(line)) {
    text_detail::split_blank(line, tokens);
    if (tokens.empty()) continue;
    double ignored = 0;
    if (tokens.size() == 1) {
      if (text_detail::parse_decimal(tokens[0], ignored) != text_detail::decimal_status::malformed)
        reader.fail(std::string("a value with no ") + (simplex ? "simplex" : "cell") +
                    " before it: write the " + (simplex ? "labels of the simplex" : "name of the cell") +
                    ", then its value");
      reader.fail("no value after " + text_detail::quote(tokens[0]) + ": write the " +
                  (simplex ? "labels of the simplex" : "name of the cell") + ", then its value");
    }
    const std::size_t names = tokens.size() - 1;
    if (!simplex && names != 1)
      reader.fail(std::to_string(tokens.size()) + " fields, but a line of values for a cell list is a cell name and its value");
    if (names > options.max_labels)
      reader.fail("a simplex of " + std::to_string(names) + " labels, more than the limit of " +
                  std::to_string(options.max_labels) + " (the limit of the reader)");
    const double v = text_detail::read_decimal(reader, tokens.back(), "the value");
    if (out.size() >= options.max_records)
      reader.fail("more than " + std::to_string(options.max_records) + " lines of values (the limit of the reader)");
    std::size_t bytes = 0;
    for (std::size_t k = 0; k < names; ++k) bytes += tokens[k].size();
    if (out.name_bytes() + bytes > options.max_name_bytes)
      reader.fail("more than " + std::to_string(options.max_name_bytes) + " bytes of names in all (the limit of the reader)");
    out.add(reader.line_number(), std::span<const std::string_view>(tokens.data(), names), v);
  }
  return out;
}

}  // namespace values_detail

/// Reads a value file from `in`; `file_name` names it in error messages (and in value_list).
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
template <input_stream Stream>
value_list read_values(Stream& in, const std::string& file_name, const values_read_options& options = {}) {
  return values_detail::read_values_from<std::istream>(in, file_name, options);
}

/// Reads the value file at `path`. Throws lacuna::parse_error ("FILE: cannot open the file",
/// or FILE:LINE: message).
template <path_argument Path>
value_list read_values(const Path& file, const values_read_options& options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return read_values(in, path.string(), options);
}

/// A record of a value file resolved to its cell.
struct cell_value {
  /// The dimension of the cell.
  int dimension;
  /// Its index in its dimension.
  std::size_t index;
  /// The value.
  double value;
  /// The line of the value file.
  std::size_t line;
};

namespace values_detail {

/// Per cell, the line that listed it (0: none yet); throws at the second listing.
class listed_cells {
 public:
  template <class Complex>
  explicit listed_cells(const Complex& c) {
    for (int k = 0; k <= c.top_dimension(); ++k) lines_.emplace_back(c.cell_count(k), 0);
  }
  void mark(const value_list& list, std::size_t r, int k, std::size_t i, const std::string& name) {
    auto& l = lines_[static_cast<std::size_t>(k)][i];
    if (l != 0)
      throw parse_error(list.file(), list.line(r),
                        "the cell " + text_detail::quote(name, 200) + " is listed twice (first on line " +
                            std::to_string(l) + ")");
    l = list.line(r);
  }

 private:
  std::vector<std::vector<std::size_t>> lines_;
};

}  // namespace values_detail

/// Finds the simplex of each record (labels in any order) in `c`. Throws lacuna::parse_error at
/// the record's line of the value file for a label repeated within a line, labels that are not
/// a simplex of `c` (named `complex_file` in the message), and a simplex listed twice.
/// `Label` is std::string (a complex read from a facet list), deduced; a template so that only
/// the translation units that call it compile it.
template <class Label>
  requires std::same_as<Label, std::string>
std::vector<cell_value> resolve_values(const value_list& list, const simplicial_complex<Label>& c,
                                       std::string_view complex_file) {
  std::vector<cell_value> out;
  out.reserve(list.size());
  values_detail::listed_cells listed(c);
  std::vector<typename simplicial_complex<Label>::vertex_id> ids;
  std::string label;
  for (std::size_t r = 0; r < list.size(); ++r) {
    const auto fail = [&](const std::string& message) { throw parse_error(list.file(), list.line(r), message); };
    ids.clear();
    for (std::size_t k = 0; k < list.name_count(r); ++k) {
      for (std::size_t j = 0; j < k; ++j)
        if (list.name(r, j) == list.name(r, k))
          fail("the label " + text_detail::quote(list.name(r, k)) + " is repeated within one simplex");
      label.assign(list.name(r, k));
      const auto v = c.vertex(label);
      if (!v)
        fail(text_detail::quote(list.joined_names(r), 200) + " is not a simplex of " + std::string(complex_file) + ": " +
             text_detail::quote(label) + " is not a vertex of it");
      ids.push_back(*v);
    }
    const auto i = c.find(ids);
    if (!i) fail(text_detail::quote(list.joined_names(r), 200) + " is not a simplex of " + std::string(complex_file));
    const int k = static_cast<int>(ids.size()) - 1;
    listed.mark(list, r, k, *i, c.cell_name(k, *i));
    out.push_back({k, *i, list.value(r), list.line(r)});
  }
  return out;
}

/// Finds the cell of each record by its name in `c`. Throws lacuna::parse_error at the
/// record's line of the value file for a line with more than one name, a name that is not a
/// cell of `c` (named `complex_file` in the message), and a cell listed twice.
/// `CellList` is lacuna::cell_list, deduced (a template for the reason the overload above is one).
template <class CellList>
  requires std::same_as<CellList, cell_list>
std::vector<cell_value> resolve_values(const value_list& list, const CellList& c, std::string_view complex_file) {
  std::unordered_map<std::string_view, std::pair<int, std::size_t>> by_name;
  for (int k = 0; k <= c.top_dimension(); ++k)
    for (std::size_t i = 0; i < c.cell_count(k); ++i) by_name.emplace(c.cell_name(k, i), std::pair{k, i});
  std::vector<cell_value> out;
  out.reserve(list.size());
  values_detail::listed_cells listed(c);
  for (std::size_t r = 0; r < list.size(); ++r) {
    if (list.name_count(r) != 1)
      throw parse_error(list.file(), list.line(r),
                        std::to_string(list.name_count(r) + 1) +
                            " fields, but a line of values for a cell list is a cell name and its value");
    const auto name = list.name(r, 0);
    const auto it = by_name.find(name);
    if (it == by_name.end())
      throw parse_error(list.file(), list.line(r),
                        text_detail::quote(name) + " is not a cell of " + std::string(complex_file));
    const auto [k, i] = it->second;
    listed.mark(list, r, k, i, std::string(name));
    out.push_back({k, i, list.value(r), list.line(r)});
  }
  return out;
}

/// The 1-based line of a complex file where a cell is written, or 0 if it is not found: for
/// value_names::cell (a cell list) the line that declares the cell `name`; for
/// value_names::simplex (a facet list) the first line that holds the label `name` (a vertex).
/// Reads `in` from where it stands; meant for a file its reader has accepted, to name the line
/// of a cell in an error found later (a cell with no value and no face to take one from).
inline std::size_t line_of_cell(std::istream& in, value_names kind, std::string_view name) {
  const auto space = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\v' || c == '\f'; };
  std::string raw;
  for (std::size_t line = 1; std::getline(in, raw); ++line) {
    std::string_view s(raw);
    if (const auto hash = s.find('#'); hash != std::string_view::npos) s = s.substr(0, hash);
    std::size_t i = 0;
    if (kind == value_names::cell) {
      while (i < s.size() && space(s[i])) ++i;
      while (i < s.size() && s[i] >= '0' && s[i] <= '9') ++i;
      while (i < s.size() && space(s[i])) ++i;
      std::size_t j = i;
      while (j < s.size() && !space(s[j]) && s[j] != ':') ++j;
      if (j > i && s.substr(i, j - i) == name) return line;
      continue;
    }
    while (i < s.size()) {
      while (i < s.size() && space(s[i])) ++i;
      std::size_t j = i;
      while (j < s.size() && !space(s[j])) ++j;
      if (j > i && s.substr(i, j - i) == name) return line;
      i = j;
    }
  }
  return 0;
}

}  // namespace lacuna::io

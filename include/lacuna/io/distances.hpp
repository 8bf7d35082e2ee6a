// lacuna/io/distances.hpp — distance matrices (.distances) for Vietoris–Rips persistence.
//
//   read_distances(stream, file_name [, options])  -> distance_matrix
//   read_distances(path [, options])               -> distance_matrix
//
// Two forms, told apart by the first row (the first line that holds a number):
//   * the full matrix: n rows of n numbers, a zero diagonal, symmetric (entry (i, j) equal to
//     entry (j, i) as read, that is as doubles: `0.5` and `0.50` are equal, 0.5 and 0.5000001
//     are not), when the first row holds n >= 2 numbers;
//   * the lower triangle: row i holds i numbers, the last of them the zero diagonal, when the
//     first row holds one number (which must be 0). The file then ends wherever it ends.
// Numbers and separators as for point clouds (text_lines.hpp, points.hpp): decimals separated by
// blanks, a comma, or both; '#' comments and blank lines are skipped. Every number is finite and
// not negative (`-0` reads as 0). A file with no row has no points.
//
// Errors are lacuna::parse_error "FILE:LINE: message", naming the row and column (1-based rows
// and columns of the matrix, as well as the line of the file): a field that is not a number, an
// empty field, a negative number, a diagonal entry other than 0, a row of the wrong length, an
// entry that differs from its mirror image (at the line of the later of the two), a full matrix
// with too few or too many rows, and the limits of distances_read_options.
//
// Memory: the result keeps the n (n - 1) / 2 entries below the diagonal. The full form also
// keeps the entries above it while it reads (to compare the two halves) and copies them at the
// end, so it peaks at twice that.
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/io/text_lines.hpp>

#include <cstddef>
#include <filesystem>
#include <fstream>
#include <istream>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace lacuna::io {

/// A symmetric matrix of distances with a zero diagonal, kept as its lower triangle.
struct distance_matrix {
  /// The number of points (rows).
  std::size_t points = 0;
  /// Entry (i, j) for i > j at i (i - 1) / 2 + j: row 1, then row 2, ... of the lower triangle.
  std::vector<double> lower;

  /// The number of points.
  std::size_t size() const noexcept { return points; }
  /// The distance between points i and j (0 when i == j). Precondition: i, j < size().
  double operator()(std::size_t i, std::size_t j) const noexcept {
    if (i == j) return 0;
    if (i < j) std::swap(i, j);
    return lower[i * (i - 1) / 2 + j];
  }
};

/// Limits of read_distances, checked before the memory they guard is taken.
struct distances_read_options {
  /// The most points (rows).
  std::size_t max_points = std::size_t{1} << 16;
  /// The most entries below the diagonal, n (n - 1) / 2 (2^27 doubles take 1 GiB; the full
  /// form needs twice that while it reads).
  std::size_t max_numbers = std::size_t{1} << 27;
  /// The longest line, in bytes (without its line end).
  std::size_t max_line_bytes = std::size_t{1} << 22;
};

namespace distances_detail {

/// The body of read_distances; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
distance_matrix read_distances_from(Stream& in, const std::string& file_name, const distances_read_options& options) {
  using text_detail::shortest;
  text_detail::line_reader reader(in, file_name, options.max_line_bytes);
  distance_matrix out;
  std::vector<std::string_view> fields;
  std::vector<double> upper;             // full form: entries (r, j), j > r, row by row
  std::vector<std::size_t> row_lines;    // the line of each row read so far
  std::size_t n = 0;                     // full form: the number of points; 0: triangle form
  const auto entry = [](std::size_t r, std::size_t c) {
    return "row " + std::to_string(r + 1) + ", column " + std::to_string(c + 1);
  };
  const auto check_count = [&](std::size_t points) {
    if (points > options.max_points)
      reader.fail("a matrix of " + std::to_string(points) + " points, more than the limit of " +
                  std::to_string(options.max_points) + " (the limit of the reader)");
    // n (n - 1) / 2 without overflow: points <= max_points fits, and so does the product's half
    const std::size_t below = points % 2 == 0 ? points / 2 * (points - 1) : (points - 1) / 2 * points;
    if (points > 0 && below > options.max_numbers)
      reader.fail("a matrix of " + std::to_string(points) + " points has " + std::to_string(below) +
                  " entries below the diagonal, more than the limit of " + std::to_string(options.max_numbers) +
                  " (the limit of the reader)");
  };
  std::string_view line;
  while (reader.next(line)) {
    const std::size_t empty = text_detail::split_fields(line, fields);
    if (fields.empty()) continue;
    const std::size_t r = row_lines.size();  // this row, 0-based
    if (r == 0 && fields.size() >= 2) {
      n = fields.size();
      check_count(n);
    }
    if (n == 0) {
      if (fields.size() != r + 1)
        reader.fail("row " + std::to_string(r + 1) + " holds " + std::to_string(fields.size()) + " number" +
                    (fields.size() == 1 ? "" : "s") +
                    ", but this is a lower triangle (its first row holds one number), where row i holds i numbers");
      check_count(r + 1);
    } else {
      if (r >= n)
        reader.fail("a row beyond the " + std::to_string(n) + " rows of this " + std::to_string(n) + " x " +
                    std::to_string(n) + " matrix (its first row holds " + std::to_string(n) + " numbers)");
      if (fields.size() != n)
        reader.fail("row " + std::to_string(r + 1) + " holds " + std::to_string(fields.size()) + " number" +
                    (fields.size() == 1 ? "" : "s") + ", but the first row holds " + std::to_string(n) +
                    ": every row of a full matrix holds as many");
    }
    if (empty != 0)
      reader.fail("the " + text_detail::ordinal(empty) +
                  " field is empty (two commas in a row, or a comma at the start or end of the line)");
    row_lines.push_back(reader.line_number());
    for (std::size_t c = 0; c < fields.size(); ++c) {
      const double v = text_detail::read_decimal(reader, fields[c], entry(r, c));
      if (v < 0) reader.fail(entry(r, c) + " is negative (" + shortest(v) + "): a distance is at least 0");
      if (c == r) {
        if (v != 0) reader.fail(entry(r, c) + " is " + shortest(v) + ", but the diagonal must be 0");
      } else if (c < r) {
        if (n == 0) {
          out.lower.push_back(v);
        } else {
          const double mirror = upper[c * n - c * (c + 1) / 2 + (r - c - 1)];
          if (mirror != v)
            reader.fail(entry(r, c) + " is " + shortest(v) + ", but " + entry(c, r) + " (line " +
                        std::to_string(row_lines[c]) + ") is " + shortest(mirror) + ": the matrix must be symmetric");
        }
      } else {
        upper.push_back(v);
      }
    }
  }
  if (n != 0 && row_lines.size() != n)
    reader.fail_at(reader.line_number(), "the matrix ends after " + std::to_string(row_lines.size()) + " of its " +
                                             std::to_string(n) + " rows (its first row holds " + std::to_string(n) +
                                             " numbers)");
  out.points = row_lines.size();
  if (n != 0) {
    out.lower.reserve(upper.size());
    for (std::size_t i = 1; i < n; ++i)
      for (std::size_t j = 0; j < i; ++j) out.lower.push_back(upper[j * n - j * (j + 1) / 2 + (i - j - 1)]);
  }
  return out;
}

}  // namespace distances_detail

/// Reads a distance matrix from `in`; `file_name` names it in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
template <input_stream Stream>
distance_matrix read_distances(Stream& in, const std::string& file_name, const distances_read_options& options = {}) {
  return distances_detail::read_distances_from<std::istream>(in, file_name, options);
}

/// Reads the distance matrix in the file at `path`. Throws lacuna::parse_error ("FILE: cannot
/// open the file", or FILE:LINE: message).
template <path_argument Path>
distance_matrix read_distances(const Path& file, const distances_read_options& options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return read_distances(in, path.string(), options);
}

}  // namespace lacuna::io

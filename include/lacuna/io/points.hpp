// lacuna/io/points.hpp — point clouds (.points and .csv) for Vietoris–Rips persistence.
//
//   read_points(stream, file_name [, options])  -> point_cloud
//   read_points(path [, options])               -> point_cloud   (.csv in any case: header allowed)
//
// One point a line, its coordinates as decimals (text_lines.hpp: `-1.5e-3`, no `.5`, no `inf`)
// separated by blanks, a comma, or both. '#' comments and blank lines are skipped. With
// options.header (the path overload sets it for .csv files) the first line that holds a field
// and has a field that is not a number is a header and is skipped; an empty field alone does
// not make a header. Every point has the same number of coordinates, at least one. A file
// with no point is an empty cloud (dimension 0).
//
// Errors are lacuna::parse_error "FILE:LINE: message": a field that is not a number (named by
// its position and its text), an empty field, a number too large for a double, a point with
// another number of coordinates than the first, and the rules and limits of text_lines.hpp and
// points_read_options (each checked before memory for the offending point is taken).
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/reader_arguments.hpp>
#include <lacuna/io/text_lines.hpp>

#include <algorithm>
#include <cctype>
#include <cstddef>
#include <filesystem>
#include <fstream>
#include <istream>
#include <span>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace lacuna::io {

/// Points with the same number of coordinates each, stored one after the other.
struct point_cloud {
  /// Coordinates per point; 0 when there is no point.
  std::size_t dimension = 0;
  /// Point i is coordinates[i * dimension, (i + 1) * dimension).
  std::vector<double> coordinates;
  /// The line of the file each point was read from.
  std::vector<std::size_t> lines;

  /// The number of points.
  std::size_t size() const noexcept { return lines.size(); }
  /// True when there is no point.
  bool empty() const noexcept { return lines.empty(); }
  /// The coordinates of point i. Precondition: i < size().
  std::span<const double> point(std::size_t i) const noexcept {
    return std::span<const double>(coordinates).subspan(i * dimension, dimension);
  }
};

/// Limits of read_points; all are checked before the memory they guard is taken, so neither an
/// endless stream nor a huge line takes more than they allow.
struct points_read_options {
  /// Skip a first line that has a field that is not a number (CSV column names).
  bool header = false;
  /// The most points a file may hold.
  std::size_t max_points = std::size_t{1} << 24;
  /// The most coordinates one point may have.
  std::size_t max_dimension = std::size_t{1} << 16;
  /// The most coordinates of all points together (2^27 doubles take 1 GiB).
  std::size_t max_numbers = std::size_t{1} << 27;
  /// The longest line, in bytes (without its line end).
  std::size_t max_line_bytes = std::size_t{1} << 22;
};

namespace points_detail {

/// The body of read_points; `Stream` is std::istream (the public overloads pass every stream as
/// one), a template so that only the translation units that read the format compile it.
template <class Stream>
point_cloud read_points_from(Stream& in, const std::string& file_name, const points_read_options& options) {
  text_detail::line_reader reader(in, file_name, options.max_line_bytes);
  point_cloud out;
  std::vector<std::string_view> fields;
  std::string_view line;
  std::size_t first_line = 0;  // the line of the first point
  bool first_fields = true;    // no line with a field seen yet
  while (reader.next(line)) {
    const std::size_t empty = text_detail::split_fields(line, fields);
    if (fields.empty()) continue;
    if (std::exchange(first_fields, false) && options.header) {
      double ignored = 0;
      const bool header = std::any_of(fields.begin(), fields.end(), [&](std::string_view f) {
        return !f.empty() && text_detail::parse_decimal(f, ignored) == text_detail::decimal_status::malformed;
      });
      if (header) continue;
    }
    if (empty != 0)
      reader.fail("the " + text_detail::ordinal(empty) +
                  " field is empty (two commas in a row, or a comma at the start or end of the line)");
    if (out.empty()) {
      if (fields.size() > options.max_dimension)
        reader.fail("a point with " + std::to_string(fields.size()) + " coordinates, more than the limit of " +
                    std::to_string(options.max_dimension));
      out.dimension = fields.size();
      first_line = reader.line_number();
    } else if (fields.size() != out.dimension) {
      reader.fail("a point with " + std::to_string(fields.size()) + " coordinate" + (fields.size() == 1 ? "" : "s") +
                  ", but the first point (line " + std::to_string(first_line) + ") has " +
                  std::to_string(out.dimension) + ": every point needs the same number");
    }
    if (out.size() >= options.max_points)
      reader.fail("more than " + std::to_string(options.max_points) + " points (the limit of the reader)");
    if (out.coordinates.size() + fields.size() > options.max_numbers)
      reader.fail("more than " + std::to_string(options.max_numbers) + " coordinates in all (the limit of the reader)");
    for (std::size_t k = 0; k < fields.size(); ++k)
      out.coordinates.push_back(
          text_detail::read_decimal(reader, fields[k], "the " + text_detail::ordinal(k + 1) + " coordinate"));
    out.lines.push_back(reader.line_number());
  }
  return out;
}

}  // namespace points_detail

/// Reads a point cloud from `in`; `file_name` names it in error messages only.
/// Throws lacuna::parse_error ("FILE:LINE: message") on bad input.
template <input_stream Stream>
point_cloud read_points(Stream& in, const std::string& file_name, const points_read_options& options = {}) {
  return points_detail::read_points_from<std::istream>(in, file_name, options);
}

/// Reads the point cloud in the file at `path`; a `.csv` file (the extension in any letter
/// case) may begin with a header line. Throws lacuna::parse_error ("FILE: cannot open the
/// file", or FILE:LINE: message).
template <path_argument Path>
point_cloud read_points(const Path& file, points_read_options options = {}) {
  const std::filesystem::path& path = file;
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  std::string ext = path.extension().string();
  for (auto& c : ext) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (ext == ".csv") options.header = true;
  return read_points(in, path.string(), options);
}

}  // namespace lacuna::io

// lacuna/complex/errors.hpp — the exception types for bad complexes and bad input files.
//
//   lacuna::invalid_complex   a complex (built, adapted or constructed) breaks a rule: a face
//                             out of range, a boundary of a boundary that is not zero, a
//                             coefficient that overflows int64, a subcomplex not closed, ...
//                             It carries the place: dimension and index of the first offending
//                             cell (or -1/npos when the fault is not one cell's).
//   lacuna::parse_error       a reader met bad input; what() is "FILE:LINE: message", the form
//                             docs/formats.md fixes for every error of the command-line tool.
//                             LINE is 1-based; 0 means "no line known" and what() is then
//                             "FILE: message".
// Both derive from std::runtime_error, so a caller may catch either, or both at once.
#pragma once

#include <cstddef>
#include <limits>
#include <stdexcept>
#include <string>
#include <utility>

namespace lacuna {

/// A complex that breaks a rule of lacuna::cell_complex (or of the operation applied to it).
/// `dimension()` and `index()` name the first offending cell; they are -1 and npos when the
/// fault does not belong to one cell (a bad argument, a mismatch between two complexes).
class invalid_complex : public std::runtime_error {
 public:
  /// The index() of a fault that belongs to no cell.
  static constexpr std::size_t npos = std::numeric_limits<std::size_t>::max();

  /// A fault that belongs to no cell.
  explicit invalid_complex(const std::string& message)
      : std::runtime_error(message) {}
  /// A fault of cell `index` of dimension `dimension`.
  invalid_complex(const std::string& message, int dimension, std::size_t index)
      : std::runtime_error(message), dimension_(dimension), index_(index) {}

  /// The dimension of the offending cell, -1 if none.
  int dimension() const noexcept { return dimension_; }
  /// The index of the offending cell within its dimension, npos if none.
  std::size_t index() const noexcept { return index_; }

 private:
  int dimension_ = -1;
  std::size_t index_ = npos;
};

/// Bad input met by a reader. what() is "FILE:LINE: message" ("FILE: message" for line 0).
class parse_error : public std::runtime_error {
 public:
  /// A fault at `line` of `file` (0: no line).
  parse_error(std::string file, std::size_t line, std::string message)
      : std::runtime_error(format(file, line, message)),
        file_(std::move(file)),
        line_(line),
        message_(std::move(message)) {}

  /// The file name as given to the reader (for a stream: the name the caller chose).
  const std::string& file() const noexcept { return file_; }
  /// The 1-based line number; 0 when no line is known (a file that cannot be opened).
  std::size_t line() const noexcept { return line_; }
  /// The message alone, without "FILE:LINE: ".
  const std::string& message() const noexcept { return message_; }

 private:
  // what() is a C string: a NUL byte that reached a message would cut it short, so it is
  // written as \x00 (the readers quote input with io::quote_text, which escapes it already)
  static std::string format(const std::string& file, std::size_t line, const std::string& message) {
    std::string s = line == 0 ? file + ": " + message : file + ":" + std::to_string(line) + ": " + message;
    for (std::size_t p; (p = s.find('\0')) != std::string::npos;) s.replace(p, 1, "\\x00");
    return s;
  }

  std::string file_;
  std::size_t line_;
  std::string message_;
};

}  // namespace lacuna

// lacuna/io/read_limits.hpp — the limits every reader enforces before it allocates, and the
// small helpers the readers share (opening a file, measuring what is left of a stream).
//
// A header's counts are promises, not facts: a reader checks them against these limits and,
// when the stream can tell its size, against the bytes that remain, before it reserves memory.
// Where the size is unknown (a pipe, a gzip stream) the reader grows its storage only as data
// arrives, so a lying header costs no more memory than the data actually present.
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/line_reader.hpp>

#include <algorithm>
#include <charconv>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <istream>
#include <optional>
#include <string>
#include <string_view>
#include <system_error>
#include <utility>
#include <vector>

namespace lacuna::io {

/// Limits on what a file may announce. Designated initializers: `read_limits{.max_cells = 1e6}`.
struct read_limits {
  /// Images and volumes: the positions of the doubled grid, prod (2 n_a + 1) (about the cells of
  /// a full image). Meshes: vertices + faces + face corners.
  std::uint64_t max_cells = std::uint64_t{1} << 32;
  /// Bytes of sample data (after decompression) a header may announce.
  std::uint64_t max_bytes = std::uint64_t{1} << 34;
};

/// Options of the image and volume readers.
struct image_options {
  /// Foreground: samples >= threshold when set; otherwise samples other than zero. (In PBM a
  /// black pixel has the value 1.)
  std::optional<std::int64_t> threshold{};
  /// The limits the reader enforces.
  read_limits limits{};
};

namespace detail {

/// Bytes left between the read position and the end of the stream, if it can be told
/// (seekable streams). Leaves the read position where it was.
inline std::optional<std::uint64_t> remaining_bytes(std::istream& in) {
  if (!in.good()) return std::nullopt;
  const auto here = in.tellg();
  if (here == std::istream::pos_type(-1)) return std::nullopt;
  in.seekg(0, std::ios::end);
  const auto end = in.tellg();
  in.clear();
  in.seekg(here);
  if (end == std::istream::pos_type(-1) || end < here) return std::nullopt;
  return static_cast<std::uint64_t>(end - here);
}

/// Opens a file for binary reading or throws parse_error(file, 0, ...).
inline std::ifstream open_input(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw parse_error(path.string(), 0, "cannot open the file");
  return in;
}

/// A non-negative decimal integer, the whole of `s`; nullopt when malformed or too large.
inline std::optional<std::uint64_t> parse_unsigned(std::string_view s) {
  if (s.empty() || s.front() == '+' || s.front() == '-') return std::nullopt;
  std::uint64_t v = 0;
  const auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || p != s.data() + s.size()) return std::nullopt;
  return v;
}

/// A decimal integer with optional sign, the whole of `s`.
inline std::optional<std::int64_t> parse_signed(std::string_view s) {
  if (!s.empty() && s.front() == '+') s.remove_prefix(1);
  if (s.empty()) return std::nullopt;
  std::int64_t v = 0;
  const auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || p != s.data() + s.size()) return std::nullopt;
  return v;
}

/// A floating-point number, the whole of `s`.
inline std::optional<double> parse_real(std::string_view s) {
  if (!s.empty() && s.front() == '+') s.remove_prefix(1);
  if (s.empty()) return std::nullopt;
  double v = 0;
  const auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc{} || p != s.data() + s.size()) return std::nullopt;
  return v;
}

/// Splits off the next run of non-blank characters (blank: space, tab, CR, FF, VT).
inline std::string_view next_token(std::string_view& s) {
  auto blank = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v'; };
  std::size_t i = 0;
  while (i < s.size() && blank(s[i])) ++i;
  std::size_t j = i;
  while (j < s.size() && !blank(s[j])) ++j;
  const std::string_view t = s.substr(i, j - i);
  s.remove_prefix(j);
  return t;
}

/// Quotes a token for an error message, shortened when long; control bytes (NUL included)
/// and bytes that are not UTF-8 are shown as \xHH (io/line_reader.hpp, quote_text).
inline std::string quote_token(std::string_view t) { return quote_text(t, 40); }

/// Reads a stream byte by byte through its buffer, counting bytes and lines.
class byte_source {
 public:
  /// `offset` and `line`: where the stream stands in the input (after a header read by a
  /// line_reader, say).
  explicit byte_source(std::istream& in, std::uint64_t offset = 0, std::size_t line = 1)
      : in_(in), sb_(in.rdbuf()), offset_(offset), line_(line) {}
  /// The next byte, or -1 at the end.
  int peek() { return sb_ ? sb_->sgetc() : -1; }
  int get() {
    if (!sb_) return -1;
    const int c = sb_->sbumpc();
    if (c == std::char_traits<char>::eof()) return -1;
    ++offset_;
    if (c == '\n') ++line_;
    return c;
  }
  /// Reads up to n bytes; returns how many were read (fewer only at the end).
  std::size_t read(char* out, std::size_t n) {
    if (!sb_) return 0;
    std::size_t got = 0;
    while (got < n) {
      const auto r = sb_->sgetn(out + got, static_cast<std::streamsize>(n - got));
      if (r <= 0) break;
      got += static_cast<std::size_t>(r);
    }
    offset_ += got;
    return got;
  }
  /// Says that the stream now stands `offset` bytes into the input, at line `line` (after a
  /// header read through a line_reader on the same stream).
  void set_position(std::uint64_t offset, std::size_t line) noexcept {
    offset_ = offset;
    line_ = line;
  }
  /// Bytes consumed so far (from where the reader started).
  std::uint64_t offset() const noexcept { return offset_; }
  /// The 1-based line of the next byte.
  std::size_t line() const noexcept { return line_; }
  std::istream& stream() noexcept { return in_; }

 private:
  std::istream& in_;
  std::streambuf* sb_;
  std::uint64_t offset_ = 0;
  std::size_t line_ = 1;
};

/// Appends bits to a voxel bitmap, growing it only as bits arrive.
class bit_sink {
 public:
  explicit bit_sink(std::size_t expected_bits, bool size_known) {
    const std::size_t words = (expected_bits + 63) / 64;
    words_.reserve(size_known ? words : std::min<std::size_t>(words, std::size_t{1} << 14));
  }
  void push(bool b) {
    if ((count_ & 63) == 0) words_.push_back(0);
    if (b) words_.back() |= std::uint64_t{1} << (count_ & 63);
    ++count_;
  }
  std::size_t size() const noexcept { return count_; }
  std::vector<std::uint64_t> take() { return std::move(words_); }

 private:
  std::vector<std::uint64_t> words_;
  std::size_t count_ = 0;
};

}  // namespace detail
}  // namespace lacuna::io

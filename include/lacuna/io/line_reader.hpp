// lacuna/io/line_reader.hpp — the one line reader of every text format (.facets, .cells, OFF,
// OBJ, plain Netpbm, NRRD headers, and the subcomplex files of the command-line tool), and the
// quoting of input text in messages.
//
//   line_reader lines(stream, file_name [, line_reader_options]);
//   for (std::string_view line; lines.next(line);) { ... lines.line_number() ... lines.fail("...") }
//
// The rules, the same for every reader that uses it (docs/cli.md, *Text files*):
//   * lines end in LF or CRLF; the line handed out has neither. A carriage return anywhere
//     else (a bare CR, as old Mac files end their lines) is an error naming its line: such a
//     file would otherwise read as one long line;
//   * a UTF-8 byte-order mark (EF BB BF) at the very start of the input is skipped (editors on
//     some systems write one); anywhere else those bytes are ordinary text;
//   * a line longer than options.max_line_bytes is an error naming its line, found before more
//     than that is buffered: an endless stream that never ends a line (/dev/zero, a pipe) costs
//     at most that much memory and ends in a clear message;
//   * a read error is reported at the line being read.
// Bytes other than CR are handed on as they are (a NUL too: a reader decides what it accepts);
// quote_text() shows them safely in messages. Comments are the reader's business
// (strip_comment() cuts a line at '#').
//
// Two ways of reading: read ahead (the default; the stream is read in blocks and consumed to
// its end; fast: the facet list reader reads 10^7 simplices through it), or exact
// (read_ahead = false: never a byte past the LF of the last line handed out, so that binary
// data after a text header stays in the stream; bytes_consumed() says where it begins).
//
// Errors are lacuna::parse_error, "FILE:LINE: message".
#pragma once

#include <lacuna/complex/errors.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <istream>
#include <streambuf>
#include <string>
#include <string_view>
#include <utility>

namespace lacuna::io {

/// How a line_reader reads. Designated initializers: `line_reader_options{.max_line_bytes = 65536}`.
struct line_reader_options {
  /// The longest line accepted, in bytes, without its LF or CRLF.
  std::size_t max_line_bytes = std::size_t{1} << 24;
  /// Read the stream in blocks (true) or never past the end of the line handed out (false).
  bool read_ahead = true;
  /// The block size when reading ahead.
  std::size_t block_bytes = std::size_t{1} << 16;
};

/// The length of the well-formed UTF-8 sequence that starts at s[i] (1 for ASCII), or 0 when
/// the bytes there are not one (a stray continuation byte, an overlong form, a surrogate, a
/// code point above U+10FFFF, a truncated sequence).
inline std::size_t utf8_sequence_length(std::string_view s, std::size_t i) {
  const auto c = static_cast<unsigned char>(s[i]);
  if (c < 0x80) return 1;
  std::size_t n;
  std::uint32_t cp;
  if ((c & 0xE0) == 0xC0) {
    n = 1;
    cp = c & 0x1Fu;
  } else if ((c & 0xF0) == 0xE0) {
    n = 2;
    cp = c & 0x0Fu;
  } else if ((c & 0xF8) == 0xF0) {
    n = 3;
    cp = c & 0x07u;
  } else {
    return 0;
  }
  if (i + n >= s.size()) return 0;
  for (std::size_t t = 1; t <= n; ++t) {
    const auto d = static_cast<unsigned char>(s[i + t]);
    if ((d & 0xC0) != 0x80) return 0;
    cp = (cp << 6) | (d & 0x3Fu);
  }
  if ((n == 1 && cp < 0x80) || (n == 2 && cp < 0x800) || (n == 3 && cp < 0x10000) || cp > 0x10FFFF ||
      (cp >= 0xD800 && cp <= 0xDFFF))
    return 0;
  return n + 1;
}

/// True if s is well-formed UTF-8.
inline bool valid_utf8(std::string_view s) {
  for (std::size_t i = 0; i < s.size();) {
    const std::size_t n = utf8_sequence_length(s, i);
    if (n == 0) return false;
    i += n;
  }
  return true;
}

/// Input text quoted for a message: '...', at most `max_bytes` bytes of it (then "..."),
/// control bytes (NUL included) and bytes that are not well-formed UTF-8 written as `\xHH`. So
/// a message is one line of valid UTF-8 and is never cut short by a NUL.
inline std::string quote_text(std::string_view s, std::size_t max_bytes = 40) {
  std::string out = "'";
  std::size_t i = 0;
  while (i < s.size() && i < max_bytes) {
    const auto c = static_cast<unsigned char>(s[i]);
    const std::size_t n = (c < 0x20 || c == 0x7F) ? 0 : utf8_sequence_length(s, i);
    if (n == 0) {
      constexpr char digits[] = "0123456789abcdef";
      out += "\\x";
      out += digits[c >> 4];
      out += digits[c & 15];
      ++i;
    } else {
      out.append(s.substr(i, n));
      i += n;
    }
  }
  if (i < s.size()) out += "...";
  out += '\'';
  return out;
}

/// The line up to its first `mark` (the comment removed).
inline std::string_view strip_comment(std::string_view line, char mark = '#') {
  const auto p = line.find(mark);
  return p == std::string_view::npos ? line : line.substr(0, p);
}

/// Reads a text stream line by line under the rules at the top of this header.
class line_reader {
 public:
  /// Reads `in`; `file_name` names it in messages.
  line_reader(std::istream& in, std::string file_name, line_reader_options options = {})
      : in_(in), sb_(in.rdbuf()), file_(std::move(file_name)), opt_(options) {
    if (opt_.read_ahead) buffer_.resize(std::max<std::size_t>(opt_.block_bytes, 16));
  }

  /// The next line, without its LF or CRLF; false at the end of the input. The view is valid
  /// until the next call.
  bool next(std::string_view& line) {
    return opt_.read_ahead ? next_ahead(line) : next_exact(line);
  }

  /// The 1-based number of the line last handed out (0 before the first).
  std::size_t line_number() const noexcept { return line_number_; }
  /// The file name given at construction.
  const std::string& file_name() const noexcept { return file_; }
  /// True when the last line handed out ended in LF (false: the input ended without one).
  bool last_line_terminated() const noexcept { return terminated_; }
  /// Bytes taken from the stream so far (exact mode: up to the end of the last line).
  std::uint64_t bytes_consumed() const noexcept { return consumed_; }
  /// Bytes of the input before the next line not yet handed out (in either mode).
  std::uint64_t offset() const noexcept { return consumed_ - (end_ - pos_); }

  /// Throws parse_error at the line last handed out.
  [[noreturn]] void fail(const std::string& message) const { fail_at(line_number_, message); }
  /// Throws parse_error at line `line`.
  [[noreturn]] void fail_at(std::size_t line, const std::string& message) const {
    throw parse_error(file_, line, message);
  }

 private:
  std::string too_long_message() const {
    return "a line longer than " + std::to_string(opt_.max_line_bytes) +
           " bytes (the limit of the reader; lines end in LF or CRLF)";
  }
  [[noreturn]] void too_long() const { fail_at(line_number_ + 1, too_long_message()); }

  // the checks every line goes through, once it is complete
  bool finish(std::string_view raw, std::string_view& line) {
    ++line_number_;
    if (line_number_ == 1 && raw.size() >= 3 && raw.substr(0, 3) == "\xEF\xBB\xBF") raw.remove_prefix(3);
    if (terminated_ && !raw.empty() && raw.back() == '\r') raw.remove_suffix(1);  // CRLF; a CR at the very end is bare
    if (raw.size() > opt_.max_line_bytes) fail(too_long_message());
    if (std::memchr(raw.data(), '\r', raw.size()) != nullptr)
      fail("a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
    line = raw;
    return true;
  }

  bool refill() {
    if (!sb_) return false;
    std::size_t got = 0;
    try {
      while (got < buffer_.size()) {
        const auto r = sb_->sgetn(buffer_.data() + got, static_cast<std::streamsize>(buffer_.size() - got));
        if (r <= 0) break;
        got += static_cast<std::size_t>(r);
      }
    } catch (const std::ios_base::failure&) {
      fail_at(line_number_ + 1, "read error");
    }
    pos_ = 0;
    end_ = got;
    consumed_ += got;
    if (got == 0) in_.setstate(std::ios::eofbit);
    return got > 0;
  }

  bool next_ahead(std::string_view& line) {
    carry_.clear();
    bool partial = false;  // bytes of this line are in carry_
    for (;;) {
      if (pos_ < end_) {
        const char* start = buffer_.data() + pos_;
        const auto* nl = static_cast<const char*>(std::memchr(start, '\n', end_ - pos_));
        const std::size_t take = nl ? static_cast<std::size_t>(nl - start) : end_ - pos_;
        if (!partial && nl) {  // the whole line is in the buffer: no copy
          if (take > opt_.max_line_bytes + 1) too_long();  // + 1: the CR of a CRLF
          pos_ += take + 1;
          terminated_ = true;
          return finish(std::string_view(start, take), line);
        }
        if (carry_.size() + take > opt_.max_line_bytes + 1) too_long();
        carry_.append(start, take);
        partial = true;
        pos_ += take;
        if (nl) {
          ++pos_;
          terminated_ = true;
          return finish(carry_, line);
        }
      }
      if (!refill()) {
        if (!partial) return false;
        terminated_ = false;
        return finish(carry_, line);
      }
    }
  }

  bool next_exact(std::string_view& line) {
    carry_.clear();
    if (!sb_) return false;
    bool any = false;
    for (;;) {
      int c;
      try {
        c = sb_->sbumpc();
      } catch (const std::ios_base::failure&) {
        fail_at(line_number_ + 1, "read error");
      }
      if (c == std::char_traits<char>::eof()) {
        in_.setstate(std::ios::eofbit);
        if (any) terminated_ = false;
        return any ? finish(carry_, line) : false;
      }
      any = true;
      ++consumed_;
      if (c == '\n') {
        terminated_ = true;
        return finish(carry_, line);
      }
      if (carry_.size() >= opt_.max_line_bytes + 1) too_long();
      carry_.push_back(static_cast<char>(c));
    }
  }

  std::istream& in_;
  std::streambuf* sb_;
  std::string file_;
  line_reader_options opt_;
  std::string buffer_;
  std::size_t pos_ = 0, end_ = 0;
  std::string carry_;
  std::size_t line_number_ = 0;
  std::uint64_t consumed_ = 0;
  bool terminated_ = false;
};

}  // namespace lacuna::io

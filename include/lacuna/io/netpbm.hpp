// lacuna/io/netpbm.hpp — Netpbm bitmaps and greymaps (P1, P4, P2, P5) as 2D cubical complexes,
// and a PGM writer.
//
// Pixel (x, y) — column x, row y counted from the top — is voxel (x, y) of a
// lacuna::cubical_complex<2>: axis 0 runs along a row, axis 1 down the image. Foreground is a
// sample other than zero (in PBM, 1 = black), or with image_options::threshold T a sample >= T.
//
// Accepted: the magic P1, P2, P4 or P5; width, height (and maxval, 1..65535, for P2/P5)
// separated by whitespace, with '#' comments anywhere in the header (and, leniently, between
// samples of P1 and P2); in P4/P5 exactly one whitespace byte before the raster; P5 with
// maxval > 255 has 16-bit big-endian samples. P1 samples need not be separated. Only the first
// image of a file is read; whatever follows it is ignored.
// Errors (lacuna::parse_error): "FILE:LINE: message" for the header and plain rasters,
// "FILE: byte offset N: message" for binary rasters.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/io/reader_arguments.hpp>

#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <istream>
#include <limits>
#include <optional>
#include <ostream>
#include <span>
#include <string>
#include <utility>
#include <vector>

namespace lacuna::io {

namespace detail {

// A template on its stream (always std::istream: the public functions pass every stream as
// one) so that only the translation units that read the format compile it.
template <class Stream>
class netpbm_reader {
 public:
  netpbm_reader(Stream& in, const std::string& name, const image_options& opt)
      : src_(in), name_(name), opt_(opt) {}

  cubical_complex<2> read() {
    // a UTF-8 byte-order mark before the magic is skipped, as by every text reader
    // (io/line_reader.hpp); the magic's bytes are read one by one, so nothing is consumed twice
    int p = src_.get();
    if (p == 0xEF && src_.peek() == 0xBB) {
      src_.get();
      if (src_.get() != 0xBF) fail(1, "not a Netpbm image (the file must begin with P1, P2, P4 or P5)");
      p = src_.get();
    }
    const int k = src_.get();
    if (p != 'P' || k < '1' || k > '7') fail(1, "not a Netpbm image (the file must begin with P1, P2, P4 or P5)");
    if (k == '3' || k == '6') fail(1, "P" + std::string(1, static_cast<char>(k)) + " (colour) images are not supported; use P1, P2, P4 or P5");
    if (k == '7') fail(1, "P7 (PAM) images are not supported; use P1, P2, P4 or P5");
    kind_ = k - '0';
    // P1 and P2 are text from end to end: the rest goes through the shared line reader (LF or
    // CRLF, a bare CR refused, bounded lines), handed on byte by byte with '\n' between lines
    if (kind_ == 1 || kind_ == 2) {
      plain_size_ = remaining_bytes(src_.stream());
      plain_.emplace(src_.stream(), name_);
    }
    const std::uint64_t w = header_number("width"), h = header_number("height");
    const std::size_t size_line = last_token_line_;  // size errors are reported where the sizes are
    if (w == 0 || h == 0) fail(last_token_line_, "the image has no pixels (width " + std::to_string(w) + ", height " + std::to_string(h) + ")");
    std::uint64_t maxval = 1;
    if (kind_ == 2 || kind_ == 5) {
      maxval = header_number("maxval");
      if (maxval == 0 || maxval > 65535) fail(last_token_line_, "maxval " + std::to_string(maxval) + " is out of range 1..65535");
    }
    if (kind_ == 4 || kind_ == 5) {
      const int c = src_.get();  // the single whitespace byte before the raster
      if (c < 0) fail(src_.line(), "the file ends before the pixel data");
      if (!is_space(c)) fail(src_.line(), "expected one whitespace byte after the header");
    }
    maxval_ = maxval;

    // sizes, checked before anything is allocated
    const auto pixels = checked_mul(w, h);
    const auto gw = checked_mul(2 * w + 1, 2 * h + 1);
    if (!pixels || !gw || w > (std::uint64_t{1} << 62) || h > (std::uint64_t{1} << 62) ||
        *gw > opt_.limits.max_cells || *pixels > std::numeric_limits<std::size_t>::max() / 2)
      fail(size_line, "an image of " + std::to_string(w) + " x " + std::to_string(h) +
                            " pixels exceeds the limit of " + std::to_string(opt_.limits.max_cells) + " grid cells");
    const std::uint64_t bytes_per_sample = (kind_ == 5 && maxval > 255) ? 2 : 1;
    const std::uint64_t row_bytes = kind_ == 4 ? (w + 7) / 8 : w * bytes_per_sample;
    // the fewest bytes the raster can take: P1 one per pixel, P2 two per sample but the last
    const std::uint64_t min_bytes = kind_ == 1 ? *pixels : kind_ == 2 ? 2 * *pixels - 1 : row_bytes * h;
    if (min_bytes > opt_.limits.max_bytes)
      fail(size_line, "the pixel data (" + std::to_string(min_bytes) + " bytes) exceeds the limit of " +
                            std::to_string(opt_.limits.max_bytes) + " bytes");
    const auto left = plain_ ? plain_left() : remaining_bytes(src_.stream());
    if (left && *left < min_bytes) {
      if (kind_ == 4 || kind_ == 5)
        fail_at(src_.offset() + *left, "pixel data truncated: the header promises " + std::to_string(min_bytes) +
                                           " bytes, the file holds " + std::to_string(*left));
      fail(size_line, "the header promises " + std::to_string(*pixels) + " pixels, the file is too short to hold them (" +
                            std::to_string(*left) + " bytes left)");
    }

    w_ = static_cast<std::size_t>(w);
    h_ = static_cast<std::size_t>(h);
    bit_sink bits(samples_ ? 0 : static_cast<std::size_t>(*pixels), left.has_value());
    if (samples_ && left) samples_->reserve(static_cast<std::size_t>(*pixels));
    if (kind_ == 1 || kind_ == 2) read_plain(bits);
    else read_binary(bits, static_cast<std::size_t>(row_bytes), static_cast<unsigned>(bytes_per_sample));
    if (samples_) return cubical_complex<2>();
    return cubical_complex<2>({w_, h_}, bits.take());
  }

  /// Reads the samples instead (P1 and P4: 1 for black), row by row; returns {width, height}.
  std::array<std::size_t, 2> read_samples(std::vector<std::int32_t>& samples) {
    samples_ = &samples;
    read();
    return {w_, h_};
  }

 private:
  static bool is_space(int c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v'; }
  static std::optional<std::uint64_t> checked_mul(std::uint64_t a, std::uint64_t b) {
    if (a != 0 && b > std::numeric_limits<std::uint64_t>::max() / a) return std::nullopt;
    return a * b;
  }
  [[noreturn]] void fail(std::size_t line, const std::string& msg) const { throw parse_error(name_, line, msg); }
  [[noreturn]] void fail_at(std::uint64_t offset, const std::string& msg) const {
    throw parse_error(name_, 0, "byte offset " + std::to_string(offset) + ": " + msg);
  }
  void push(bit_sink& bits, std::uint64_t v) {
    if (samples_)
      samples_->push_back(static_cast<std::int32_t>(v));  // at most 65535
    else
      bits.push(foreground(v));
  }
  // the header and plain rasters: bytes from the line reader (P1, P2) or from the stream
  int peek() {
    if (!plain_) return src_.peek();
    if (at_ >= text_.size() + 1) {
      if (plain_ended_ || !plain_->next(text_)) {
        plain_ended_ = true;
        return -1;
      }
      at_ = 0;
    }
    return at_ < text_.size() ? static_cast<unsigned char>(text_[at_]) : '\n';
  }
  int get() {
    if (!plain_) {
      // a binary image's header is short: an endless one (spaces, a comment that never
      // ends) is refused instead of read for ever
      if (src_.offset() > (std::uint64_t{1} << 20))
        fail(src_.line(), "a header longer than 1 MiB (an endless stream?)");
      const int c = src_.get();
      // the text rules of every reader in a binary image's header too: CR only before LF
      if (c == '\r' && src_.peek() != '\n')
        fail(src_.line(), "a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
      return c;
    }
    const int c = peek();
    if (c >= 0) ++at_;
    return c;
  }
  // P1, P2: the bytes left after the next one peek() gives, if the stream can tell
  std::optional<std::uint64_t> plain_left() const {
    if (!plain_size_) return std::nullopt;
    const std::uint64_t in_line = at_ <= text_.size() ? text_.size() + 1 - at_ : 0;
    const std::uint64_t used = plain_->offset();
    return used > *plain_size_ ? 0 : *plain_size_ - used + in_line;
  }
  std::size_t line() const {
    if (!plain_) return src_.line();
    // at the end, the line after the last LF (as a byte count of LFs would say)
    if (plain_ended_) return plain_->line_number() + (plain_->last_line_terminated() ? 1 : 0);
    return std::max<std::size_t>(plain_->line_number(), 1);
  }
  bool foreground(std::uint64_t v) const {
    return opt_.threshold ? static_cast<std::int64_t>(v) >= *opt_.threshold : v != 0;
  }

  // skips whitespace and comments; returns the next byte (not consumed), -1 at the end
  int skip_blank() {
    for (;;) {
      const int c = peek();
      if (c == '#') {
        while (get() >= 0 && peek() != '\n' && peek() >= 0) {}
        continue;
      }
      if (c >= 0 && is_space(c)) {
        get();
        continue;
      }
      return c < 0 ? -1 : c;
    }
  }

  std::uint64_t header_number(const char* what) {
    const int first = skip_blank();
    if (first < 0) fail(line(), std::string("the file ends before the ") + what);
    const std::size_t ln = line();
    last_token_line_ = ln;
    std::string digits;
    while (peek() >= 0 && !is_space(peek()) && peek() != '#' && digits.size() < 32)
      digits.push_back(static_cast<char>(get()));
    const auto v = parse_unsigned(digits);
    if (!v) fail(ln, std::string("bad ") + what + " " + quote_token(digits));
    return *v;
  }

  void read_plain(bit_sink& bits) {
    const std::size_t total = w_ * h_;
    for (std::size_t i = 0; i < total; ++i) {
      const int c = skip_blank();
      if (c < 0)
        fail(line(), "the file ends after " + std::to_string(i) + " of " + std::to_string(total) + " pixels");
      if (kind_ == 1) {
        get();
        if (c != '0' && c != '1') fail(line(), "bad pixel " + quote_token(std::string(1, static_cast<char>(c))) + " (PBM pixels are 0 or 1)");
        push(bits, c == '1' ? 1 : 0);
      } else {
        const std::size_t ln = line();
        std::string digits;
        while (peek() >= 0 && !is_space(peek()) && peek() != '#' && digits.size() < 32)
          digits.push_back(static_cast<char>(get()));
        const auto v = parse_unsigned(digits);
        if (!v) fail(ln, "bad sample " + quote_token(digits));
        if (*v > maxval_) fail(ln, "sample " + std::to_string(*v) + " exceeds maxval " + std::to_string(maxval_));
        push(bits, *v);
      }
    }
  }

  // reads row by row in chunks of at most 64 KiB, so that a lying width costs no memory
  void read_binary(bit_sink& bits, std::size_t row_bytes, unsigned bps) {
    std::vector<unsigned char> buf(std::min<std::size_t>(row_bytes, std::size_t{1} << 16));
    for (std::size_t y = 0; y < h_; ++y) {
      std::size_t x = 0;  // next pixel of the row (P5) or next byte (P4)
      for (std::size_t done = 0; done < row_bytes;) {
        const std::size_t want = std::min(buf.size(), row_bytes - done);  // even for 16-bit rows
        const std::uint64_t start = src_.offset();
        const std::size_t got = src_.read(reinterpret_cast<char*>(buf.data()), want);
        if (got < want)
          fail_at(start + got, "pixel data truncated in row " + std::to_string(y) + " of " + std::to_string(h_));
        done += got;
        if (kind_ == 4) {
          for (std::size_t b = 0; b < got; ++b, ++x)
            for (unsigned k = 0; k < 8 && 8 * x + k < w_; ++k) push(bits, (buf[b] >> (7 - k)) & 1);
          continue;
        }
        for (std::size_t b = 0; b < got; b += bps, ++x) {
          const std::uint64_t v = bps == 1 ? buf[b] : (std::uint64_t{buf[b]} << 8) | buf[b + 1];
          if (v > maxval_) fail_at(start + b, "sample " + std::to_string(v) + " exceeds maxval " + std::to_string(maxval_));
          push(bits, v);
        }
      }
    }
  }

  byte_source src_;
  std::optional<line_reader> plain_;  // P1, P2: the text after the magic
  std::optional<std::uint64_t> plain_size_;  // its size, if the stream can tell
  std::string_view text_;             // its current line
  bool plain_ended_ = false;
  std::size_t at_ = 1;                // the next byte of text_; text_.size() stands for its '\n'
  const std::string& name_;
  const image_options& opt_;
  int kind_ = 0;
  std::uint64_t maxval_ = 1;
  std::size_t w_ = 0, h_ = 0;
  std::size_t last_token_line_ = 1;
  std::vector<std::int32_t>* samples_ = nullptr;  // set: read the samples, not the foreground
};

}  // namespace detail

/// Reads a PBM or PGM image (P1, P2, P4, P5) from a stream as a 2D cubical complex; `name`
/// names the input in error messages. Throws lacuna::parse_error.
template <input_stream Stream>
cubical_complex<2> read_netpbm(Stream& in, const std::string& name, const image_options& options = {}) {
  return detail::netpbm_reader<std::istream>(in, name, options).read();
}

/// Reads a PBM or PGM file.
template <path_argument Path>
cubical_complex<2> read_netpbm(const Path& file, const image_options& options = {}) {
  const std::filesystem::path& path = file;
  auto in = detail::open_input(path);
  return read_netpbm(in, path.string(), options);
}

/// The samples of a PBM or PGM image, row by row from the top, as integers (P1 and P4: 1 for
/// black), with the extents {width, height}: the input of a sublevel or superlevel
/// filtration. The same checks and limits as read_netpbm. Throws lacuna::parse_error.
template <input_stream Stream>
std::pair<std::array<std::size_t, 2>, std::vector<std::int32_t>> read_netpbm_samples(
    Stream& in, const std::string& name, const read_limits& limits = {}) {
  std::vector<std::int32_t> samples;
  const image_options options{.limits = limits};
  auto extents = detail::netpbm_reader<std::istream>(in, name, options).read_samples(samples);
  return {extents, std::move(samples)};
}

/// Reads the samples of a PBM or PGM file (see above).
template <path_argument Path>
std::pair<std::array<std::size_t, 2>, std::vector<std::int32_t>> read_netpbm_samples(
    const Path& file, const read_limits& limits = {}) {
  const std::filesystem::path& path = file;
  auto in = detail::open_input(path);
  return read_netpbm_samples(in, path.string(), limits);
}

/// Writes samples (row by row, top row first) as a binary PGM (P5); 16-bit big-endian samples
/// when maxval > 255. Precondition: samples.size() == width * height, every sample <= maxval.
inline void write_pgm(std::ostream& out, std::size_t width, std::size_t height,
                      std::span<const std::uint16_t> samples, std::uint16_t maxval) {
  out << "P5\n" << width << ' ' << height << '\n' << maxval << '\n';
  for (std::size_t i = 0; i < width * height; ++i) {
    if (maxval > 255) out.put(static_cast<char>(samples[i] >> 8));
    out.put(static_cast<char>(samples[i] & 0xff));
  }
}

/// Writes the foreground of a 2D cubical complex as a PGM: 255 for foreground, 0 otherwise.
/// Reading it back gives the same complex. `D` is deduced from the complex and must be 2 (a
/// template so that only the translation units that call it instantiate the complex).
template <std::size_t D>
  requires(D == 2)
void write_pgm(std::ostream& out, const cubical_complex<D>& c) {
  const auto n = c.extents();
  out << "P5\n" << n[0] << ' ' << n[1] << "\n255\n";
  for (std::size_t y = 0; y < n[1]; ++y)
    for (std::size_t x = 0; x < n[0]; ++x) out.put(c.is_foreground({x, y}) ? static_cast<char>(255) : '\0');
}

}  // namespace lacuna::io

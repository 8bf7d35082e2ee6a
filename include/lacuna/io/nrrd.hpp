// lacuna/io/nrrd.hpp — NRRD volumes as cubical complexes, and a raw NRRD writer.
//
// Accepted subset of NRRD (magic "NRRD0001" .. "NRRD0005"):
//   type       uint8 (uchar, unsigned char, uint8_t), int8 (signed char, int8_t),
//              uint16 (ushort, unsigned short [int], uint16_t), int16 (short [int],
//              signed short [int], int16_t)
//   dimension  1 .. D (D = 3 by default); missing trailing axes get size 1
//   sizes      one positive integer per axis; the first axis varies fastest and is axis 0
//   encoding   raw, or gzip/gz when built with zlib (LACUNA_HAVE_ZLIB=1)
//   endian     little or big; required for 16-bit samples
// "# " comments and "key:=value" pairs are skipped, as are all other fields. The header ends at
// the first empty line; the samples follow at once and must fill exactly what the sizes say.
// Refused with a clear message: detached data ("data file"), non-zero "byte skip"/"line skip",
// other encodings and types, and a field given twice.
// Errors (lacuna::parse_error): "FILE:LINE: message" in the header, "FILE: byte offset N:
// message" in the data (for gzip data: N counts compressed bytes from the file's start).
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/io/reader_arguments.hpp>

#if defined(LACUNA_HAVE_ZLIB) && LACUNA_HAVE_ZLIB
#if __has_include(<zlib.h>)
#include <zlib.h>
#define LACUNA_NRRD_GZIP 1
#else
#error "LACUNA_HAVE_ZLIB is set but <zlib.h> cannot be found"
#endif
#endif

#include <array>
#include <cctype>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <istream>
#include <limits>
#include <new>
#include <optional>
#include <ostream>
#include <span>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace lacuna::io {

/// What a NRRD header says, as far as lacuna reads it.
struct nrrd_header {
  /// The sample types lacuna reads.
  enum class sample_type { uint8, int8, uint16, int16 };
  /// The data encodings lacuna reads.
  enum class data_encoding { raw, gzip };
  /// The number of axes.
  int dimension = 0;
  std::vector<std::uint64_t> sizes;  ///< per axis, fastest first
  /// The sample type.
  sample_type type = sample_type::uint8;
  /// The encoding of the data.
  data_encoding encoding = data_encoding::raw;
  /// True for big-endian samples.
  bool big_endian = false;
  std::uint64_t data_offset = 0;  ///< bytes from the reader's start to the first data byte
  std::size_t header_lines = 0;   ///< lines of the header, the empty line included

  /// 1 or 2.
  unsigned bytes_per_sample() const noexcept {
    return (type == sample_type::uint16 || type == sample_type::int16) ? 2 : 1;
  }
};

namespace detail {

inline std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
  return s;
}

// A template on its stream (always std::istream: the public functions pass every stream as
// one) so that only the translation units that read the format compile it.
template <class Stream>
class nrrd_reader {
 public:
  nrrd_reader(Stream& in, const std::string& name, const read_limits& limits)
      : lines_(in, name, {.max_line_bytes = 65536, .read_ahead = false}), src_(in), name_(name), limits_(limits) {}

  nrrd_header read_header(int max_dimension) {
    nrrd_header h;
    std::string line;
    if (!next_line(line)) fail(1, "empty file: not a NRRD file");
    if (line.size() != 8 || line.compare(0, 7, "NRRD000") != 0 || line[7] < '1' || line[7] > '5')
      fail(1, "not a NRRD file (the first line must be NRRD0001 .. NRRD0005)");
    std::size_t sizes_line = 0;
    bool have_type = false, have_dim = false, have_sizes = false, have_enc = false, have_endian = false;
    for (;;) {
      if (!next_line(line))
        fail(line_, "the header does not end with an empty line (the file ends in the header)");
      const std::size_t ln = line_;
      std::string_view l = trim(line);
      if (line.empty()) break;
      if (l.empty() || l.front() == '#') continue;
      const auto colon = l.find(':');
      if (colon == std::string_view::npos) fail(ln, "expected 'field: value', found " + quote_token(l));
      if (colon + 1 < l.size() && l[colon + 1] == '=') continue;  // key:=value
      std::string field(trim(l.substr(0, colon)));
      for (char& c : field) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      const std::string_view value = trim(l.substr(colon + 1));
      auto once = [&](bool& seen) {
        if (seen) fail(ln, "field '" + field + "' given twice");
        seen = true;
      };
      if (field == "type") {
        once(have_type);
        h.type = parse_type(value, ln);
      } else if (field == "dimension") {
        once(have_dim);
        const auto d = parse_unsigned(value);
        if (!d || *d == 0 || *d > 16) fail(ln, "bad dimension " + quote_token(value));
        if (*d > static_cast<std::uint64_t>(max_dimension))
          fail(ln, "dimension " + std::to_string(*d) + " is not supported here (at most " + std::to_string(max_dimension) + ")");
        h.dimension = static_cast<int>(*d);
      } else if (field == "sizes") {
        once(have_sizes);
        sizes_line = ln;
        std::string_view rest = value;
        for (std::string_view t = next_token(rest); !t.empty(); t = next_token(rest)) {
          const auto v = parse_unsigned(t);
          if (!v) fail(ln, "bad size " + quote_token(t));
          if (*v == 0) fail(ln, "a size of 0");
          if (h.sizes.size() == 16) fail(ln, "too many sizes");
          h.sizes.push_back(*v);
        }
      } else if (field == "encoding") {
        once(have_enc);
        if (value == "raw") h.encoding = nrrd_header::data_encoding::raw;
        else if (value == "gzip" || value == "gz") h.encoding = nrrd_header::data_encoding::gzip;
        else fail(ln, "encoding " + quote_token(value) + " is not supported (raw and gzip are)");
      } else if (field == "endian") {
        once(have_endian);
        if (value == "little") h.big_endian = false;
        else if (value == "big") h.big_endian = true;
        else fail(ln, "bad endian " + quote_token(value) + " (little or big)");
      } else if (field == "data file" || field == "datafile") {
        fail(ln, "detached data ('data file') is not supported: the samples must follow the header");
      } else if (field == "byte skip" || field == "byteskip" || field == "line skip" || field == "lineskip") {
        if (value != "0") fail(ln, "'" + field + "' is not supported");
      }
      // every other field (spacings, space directions, kinds, content, ...) is irrelevant here
    }
    const std::size_t end = line_;
    if (!have_type) fail(end, "the header has no 'type' field");
    if (!have_dim) fail(end, "the header has no 'dimension' field");
    if (!have_sizes) fail(end, "the header has no 'sizes' field");
    if (!have_enc) fail(end, "the header has no 'encoding' field");
    if (h.sizes.size() != static_cast<std::size_t>(h.dimension))
      fail(sizes_line, std::to_string(h.sizes.size()) + " sizes for dimension " + std::to_string(h.dimension));
    if (h.bytes_per_sample() > 1 && !have_endian) fail(end, "the header has no 'endian' field (16-bit samples need one)");
    std::uint64_t voxels = 1, grid = 1;
    for (auto s : h.sizes) {
      if (s > (std::uint64_t{1} << 62) || !mul(voxels, s) || !mul(grid, 2 * s + 1))
        fail(sizes_line, "the sizes overflow");
    }
    if (grid > limits_.max_cells)
      fail(sizes_line, "a volume of " + std::to_string(voxels) + " voxels exceeds the limit of " +
                           std::to_string(limits_.max_cells) + " grid cells");
    std::uint64_t bytes = voxels;
    if (!mul(bytes, h.bytes_per_sample()) || bytes > limits_.max_bytes)
      fail(sizes_line, "the data (" + std::to_string(voxels) + " samples) exceeds the limit of " +
                           std::to_string(limits_.max_bytes) + " bytes");
    src_.set_position(lines_.bytes_consumed(), end + 1);
    h.data_offset = src_.offset();
    h.header_lines = end;
    return h;
  }

  template <std::size_t D>
  cubical_complex<D> read(const image_options& opt) {
    const nrrd_header h = read_header(static_cast<int>(D));
    std::array<std::size_t, D> extents;
    extents.fill(1);
    std::size_t voxels = 1;
    for (std::size_t a = 0; a < h.sizes.size(); ++a) {
      extents[a] = static_cast<std::size_t>(h.sizes[a]);
      voxels *= extents[a];
    }
    threshold_ = opt.threshold;
    header_ = &h;
    sizes_ = h.sizes;
    needed_ = static_cast<std::uint64_t>(voxels) * h.bytes_per_sample();
    if (h.encoding == nrrd_header::data_encoding::raw) {
      const auto left = remaining_bytes(src_.stream());
      if (left && *left < needed_)
        fail_at(h.data_offset + *left, "data truncated: the sizes need " + std::to_string(needed_) +
                                           " bytes, the file holds " + std::to_string(*left) + " after the header");
      bit_sink bits(samples_ ? 0 : voxels, left.has_value());
      if (samples_) samples_->reserve(voxels);
      read_raw(bits);
      if (samples_) return cubical_complex<D>();
      return cubical_complex<D>(extents, bits.take());
    }
    bit_sink bits(samples_ ? 0 : voxels, false);  // the decompressed size is unknown until it is decompressed
    read_gzip(bits);
    if (samples_) return cubical_complex<D>();
    return cubical_complex<D>(extents, bits.take());
  }

  /// Reads the samples instead (axis 0 fastest); returns the extents (1 beyond the file's axes).
  template <std::size_t D>
  std::array<std::size_t, D> read_samples(std::vector<std::int32_t>& samples) {
    samples_ = &samples;
    read<D>(image_options{.limits = limits_});
    std::array<std::size_t, D> extents;
    extents.fill(1);
    for (std::size_t a = 0; a < sizes_.size(); ++a) extents[a] = static_cast<std::size_t>(sizes_[a]);
    return extents;
  }

 private:
  static bool mul(std::uint64_t& a, std::uint64_t b) {
    if (a != 0 && b > std::numeric_limits<std::uint64_t>::max() / a) return false;
    a *= b;
    return true;
  }
  [[noreturn]] void fail(std::size_t line, const std::string& msg) const { throw parse_error(name_, line, msg); }
  [[noreturn]] void fail_at(std::uint64_t offset, const std::string& msg) const {
    throw parse_error(name_, 0, "byte offset " + std::to_string(offset) + ": " + msg);
  }

  // one header line (without its LF or CRLF) through the shared line reader, which never
  // reads past the line: the samples follow the header at once; false at the end of the file
  bool next_line(std::string& line) {
    std::string_view v;
    if (lines_.bytes_consumed() > (std::uint64_t{1} << 24))
      fail(line_ + 1, "a header longer than 16 MiB (an endless stream?)");
    if (!lines_.next(v)) return false;
    line.assign(v);
    line_ = lines_.line_number();
    return true;
  }

  nrrd_header::sample_type parse_type(std::string_view v, std::size_t ln) const {
    using t = nrrd_header::sample_type;
    if (v == "uchar" || v == "unsigned char" || v == "uint8" || v == "uint8_t") return t::uint8;
    if (v == "signed char" || v == "int8" || v == "int8_t") return t::int8;
    if (v == "ushort" || v == "unsigned short" || v == "unsigned short int" || v == "uint16" || v == "uint16_t")
      return t::uint16;
    if (v == "short" || v == "short int" || v == "signed short" || v == "signed short int" || v == "int16" ||
        v == "int16_t")
      return t::int16;
    fail(ln, "type " + quote_token(v) + " is not supported (8- and 16-bit integers are)");
  }

  // decodes samples from a run of data bytes; a 16-bit sample may straddle two runs
  void consume(const unsigned char* p, std::size_t n, bit_sink& bits) {
    const unsigned bps = header_->bytes_per_sample();
    for (std::size_t i = 0; i < n; ++i) {
      if (bps == 2 && !have_half_) {
        half_ = p[i];
        have_half_ = true;
        continue;
      }
      std::int64_t v;
      switch (header_->type) {
        case nrrd_header::sample_type::uint8: v = p[i]; break;
        case nrrd_header::sample_type::int8: v = static_cast<std::int8_t>(p[i]); break;
        default: {
          const unsigned hi = header_->big_endian ? half_ : p[i], lo = header_->big_endian ? p[i] : half_;
          const auto u = static_cast<std::uint16_t>((hi << 8) | lo);
          v = header_->type == nrrd_header::sample_type::uint16 ? std::int64_t{u} : std::int64_t{static_cast<std::int16_t>(u)};
          have_half_ = false;
        }
      }
      if (samples_)
        samples_->push_back(static_cast<std::int32_t>(v));
      else
        bits.push(threshold_ ? v >= *threshold_ : v != 0);
    }
  }

  void read_raw(bit_sink& bits) {
    std::vector<unsigned char> buf(std::size_t{1} << 16);
    std::uint64_t done = 0;
    while (done < needed_) {
      const std::size_t want = static_cast<std::size_t>(std::min<std::uint64_t>(buf.size(), needed_ - done));
      const std::size_t got = src_.read(reinterpret_cast<char*>(buf.data()), want);
      consume(buf.data(), got, bits);
      done += got;
      if (got < want)
        fail_at(src_.offset(), "data truncated: the sizes need " + std::to_string(needed_) + " bytes, the file holds " +
                                   std::to_string(done) + " after the header");
    }
    if (src_.peek() >= 0)
      fail_at(src_.offset(), "more data than the sizes describe (" + std::to_string(needed_) + " bytes)");
  }

  void read_gzip(bit_sink& bits) {
#ifdef LACUNA_NRRD_GZIP
    z_stream zs{};
    // zlib's own allocations failing are running out of memory, not bad data
    if (const int r = inflateInit2(&zs, 15 + 32); r != Z_OK) {
      if (r == Z_MEM_ERROR) throw std::bad_alloc();
      fail_at(header_->data_offset, "cannot start gzip decompression");
    }
    struct guard {
      z_stream* z;
      ~guard() { inflateEnd(z); }
    } g{&zs};
    std::vector<unsigned char> in(std::size_t{1} << 16), out(std::size_t{1} << 16);
    std::uint64_t produced = 0, compressed = 0;
    int ret = Z_OK;
    while (ret != Z_STREAM_END) {
      if (zs.avail_in == 0) {
        const std::size_t got = src_.read(reinterpret_cast<char*>(in.data()), in.size());
        if (got == 0)
          fail_at(src_.offset(), "gzip data truncated (" + std::to_string(produced) + " of " + std::to_string(needed_) +
                                     " bytes decompressed)");
        zs.next_in = in.data();
        zs.avail_in = static_cast<uInt>(got);
        compressed += got;
      }
      zs.next_out = out.data();
      zs.avail_out = static_cast<uInt>(out.size());
      ret = inflate(&zs, Z_NO_FLUSH);
      if (ret == Z_MEM_ERROR) throw std::bad_alloc();
      if (ret != Z_OK && ret != Z_STREAM_END && ret != Z_BUF_ERROR)
        fail_at(header_->data_offset + (compressed - zs.avail_in),
                std::string("gzip data corrupt (") + (zs.msg ? zs.msg : "zlib error " + std::to_string(ret)) + ")");
      const std::size_t have = out.size() - zs.avail_out;
      if (ret == Z_BUF_ERROR && have == 0 && zs.avail_in != 0)
        fail_at(header_->data_offset + (compressed - zs.avail_in), "gzip data corrupt (no progress)");
      if (produced + have > needed_)
        fail_at(header_->data_offset + (compressed - zs.avail_in),
                "the gzip data holds more than the " + std::to_string(needed_) + " bytes the sizes describe");
      consume(out.data(), have, bits);
      produced += have;
    }
    if (produced < needed_)
      fail_at(header_->data_offset + (compressed - zs.avail_in),
              "gzip data truncated: " + std::to_string(produced) + " of " + std::to_string(needed_) + " bytes");
#else
    (void)bits;
    fail_at(header_->data_offset, "gzip-encoded data needs zlib: build with LACUNA_HAVE_ZLIB=1 and link zlib");
#endif
  }

  line_reader lines_;  // the header (io/line_reader.hpp)
  byte_source src_;    // the samples
  const std::string& name_;
  const read_limits& limits_;
  std::size_t line_ = 0;
  const nrrd_header* header_ = nullptr;
  std::optional<std::int64_t> threshold_;
  std::uint64_t needed_ = 0;
  std::vector<std::int32_t>* samples_ = nullptr;  // set: read the samples, not the foreground
  std::vector<std::uint64_t> sizes_;
  unsigned half_ = 0;
  bool have_half_ = false;
};

}  // namespace detail

/// Reads a NRRD header (the stream is left at the first data byte). Throws parse_error.
template <input_stream Stream>
nrrd_header read_nrrd_header(Stream& in, const std::string& name, const read_limits& limits = {},
                             int max_dimension = 3) {
  return detail::nrrd_reader<std::istream>(in, name, limits).read_header(max_dimension);
}

/// Reads a NRRD volume of dimension at most D as a D-dimensional cubical complex (axes beyond
/// the file's dimension get size 1). `name` names the input in errors. Throws parse_error.
template <std::size_t D = 3>
cubical_complex<D> read_nrrd(std::istream& in, const std::string& name, const image_options& options = {}) {
  return detail::nrrd_reader<std::istream>(in, name, options.limits).template read<D>(options);
}

/// Reads a NRRD file.
template <std::size_t D = 3>
cubical_complex<D> read_nrrd(const std::filesystem::path& path, const image_options& options = {}) {
  auto in = detail::open_input(path);
  return read_nrrd<D>(in, path.string(), options);
}

/// The samples of a NRRD volume of dimension at most D, axis 0 fastest, as integers (8- and
/// 16-bit, signed or not), with the extents (1 beyond the file's axes): the input of a
/// sublevel or superlevel filtration. The same checks and limits as read_nrrd.
template <std::size_t D = 3>
std::pair<std::array<std::size_t, D>, std::vector<std::int32_t>> read_nrrd_samples(std::istream& in,
                                                                                  const std::string& name,
                                                                                  const read_limits& limits = {}) {
  std::vector<std::int32_t> samples;
  auto extents = detail::nrrd_reader<std::istream>(in, name, limits).template read_samples<D>(samples);
  return {extents, std::move(samples)};
}

/// Reads the samples of a NRRD file (see above).
template <std::size_t D = 3>
std::pair<std::array<std::size_t, D>, std::vector<std::int32_t>> read_nrrd_samples(const std::filesystem::path& path,
                                                                                  const read_limits& limits = {}) {
  auto in = detail::open_input(path);
  return read_nrrd_samples<D>(in, path.string(), limits);
}

/// Writes the foreground of a cubical complex as a raw uint8 NRRD (1 = foreground).
template <std::size_t D>
void write_nrrd(std::ostream& out, const cubical_complex<D>& c) {
  const auto n = c.extents();
  out << "NRRD0004\n# written by lacuna\ntype: uint8\ndimension: " << D << "\nsizes:";
  for (auto s : n) out << ' ' << s;
  out << "\nencoding: raw\n\n";
  std::array<std::size_t, D> v{};
  std::size_t total = 1;
  for (auto s : n) total *= s;
  for (std::size_t i = 0; i < total; ++i) {
    out.put(c.is_foreground(v) ? '\1' : '\0');
    for (std::size_t a = 0; a < D; ++a) {
      if (++v[a] < n[a]) break;
      v[a] = 0;
    }
  }
}

/// Writes 16-bit samples (axis 0 fastest) as a raw uint16 NRRD in the given byte order.
/// Precondition: samples.size() is the product of sizes.
inline void write_nrrd(std::ostream& out, std::span<const std::size_t> sizes, std::span<const std::uint16_t> samples,
                       bool big_endian = false) {
  out << "NRRD0004\ntype: uint16\ndimension: " << sizes.size() << "\nsizes:";
  for (auto s : sizes) out << ' ' << s;
  out << "\nencoding: raw\nendian: " << (big_endian ? "big" : "little") << "\n\n";
  for (auto s : samples) {
    const char hi = static_cast<char>(s >> 8), lo = static_cast<char>(s & 0xff);
    out.put(big_endian ? hi : lo);
    out.put(big_endian ? lo : hi);
  }
}

}  // namespace lacuna::io

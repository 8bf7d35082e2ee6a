// lacuna/distributed/volume_blocks.hpp — a volume cut into slabs, and which rank holds which,
// and the reading of one slab of a NRRD file.
//
// Decomposition: slabs of whole voxel layers along the last axis (axis 2, the slowest in the
// file, so that a slab is one contiguous run of bytes in a raw file). With L layers, P ranks
// and b blocks per rank there are B = min(L, P·b) blocks; block j holds the layers
// [j·L/B, (j+1)·L/B) and belongs to rank floor(j·P/B). Ranks may hold no block (more ranks
// than layers); a block may hold no foreground voxel.
//
// Reading (each rank reads only what its blocks need): every rank parses the header itself
// (io/nrrd.hpp, read_nrrd_header, with the same limits and messages). Raw data: the rank seeks
// to data offset + first layer · (bytes per layer) and reads its layers; the file's length is
// checked against the header first, so a truncated or overlong file gives the same error as
// the one-process reader on every rank. Gzip data cannot be entered in the middle: each rank
// inflates the whole stream (checking it to its end, as the one-process reader does) and keeps
// only the bytes of its layers — memory per rank stays that of its slab, the time is that of
// one full decompression per rank.
// The foreground rule is that of the one-process reader (io/read_limits.hpp image_options): a
// sample >= threshold when a threshold is given, else a sample other than zero.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/read_limits.hpp>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <new>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna::distributed {

/// A block: the voxel layers [begin, end) along the last axis, held by rank `owner`.
struct volume_block {
  std::size_t begin = 0;  ///< first voxel layer
  std::size_t end = 0;    ///< one past the last layer
  int owner = 0;          ///< the rank that reads and reduces it
};

/// The extents (x, y, z) of the NRRD volume at `path`, read from its header with `limits`; a
/// 2-D file has z = 1. Throws what io::read_nrrd_header throws (with the same messages).
inline std::array<std::size_t, 3> nrrd_volume_extents(const std::filesystem::path& path, const io::read_limits& limits) {
  auto in = io::detail::open_input(path);
  const auto h = io::read_nrrd_header(in, path.string(), limits, 3);
  std::array<std::size_t, 3> e{1, 1, 1};
  for (std::size_t a = 0; a < h.sizes.size(); ++a) e[a] = static_cast<std::size_t>(h.sizes[a]);
  return e;
}

/// The blocks of a volume of `layers` voxel layers over `ranks` ranks, `blocks_per_rank` >= 1
/// per rank at most (see the file comment). Throws std::invalid_argument for ranks < 1 or
/// blocks_per_rank < 1. Blocks are in order of their layers.
inline std::vector<volume_block> plan_slabs(std::size_t layers, int ranks, std::size_t blocks_per_rank = 1) {
  if (ranks < 1) throw std::invalid_argument("lacuna: plan_slabs needs at least one rank");
  if (blocks_per_rank < 1) throw std::invalid_argument("lacuna: plan_slabs needs at least one block per rank");
  const std::size_t wanted = static_cast<std::size_t>(ranks) * blocks_per_rank;
  const std::size_t count = std::min(layers, wanted);
  std::vector<volume_block> blocks;
  for (std::size_t j = 0; j < count; ++j)
    blocks.push_back({j * layers / count, (j + 1) * layers / count, static_cast<int>(j * static_cast<std::size_t>(ranks) / count)});
  return blocks;
}

/// The voxels of one slab of a NRRD volume (dimension at most 3; missing axes have size 1).
struct volume_slab {
  std::array<std::size_t, 3> volume_extents{};  ///< the whole volume's voxel extents
  std::size_t begin = 0;                        ///< the first layer held
  std::size_t end = 0;                          ///< one past the last layer held
  cubical_complex<3> complex;                   ///< the slab's voxels as a complex, layer `begin` at z = 0
};

namespace detail {

inline std::int64_t sample_value(const io::nrrd_header& h, const unsigned char* p) {
  std::int64_t v;
  switch (h.type) {
    case io::nrrd_header::sample_type::uint8: v = p[0]; break;
    case io::nrrd_header::sample_type::int8: v = static_cast<std::int8_t>(p[0]); break;
    default: {
      const unsigned hi = h.big_endian ? p[0] : p[1], lo = h.big_endian ? p[1] : p[0];
      const auto u = static_cast<std::uint16_t>((hi << 8) | lo);
      v = h.type == io::nrrd_header::sample_type::uint16 ? std::int64_t{u} : std::int64_t{static_cast<std::int16_t>(u)};
    }
  }
  return v;
}

}  // namespace detail

namespace detail {

/// Reads the layers [begin, end) of the NRRD file `path` (see the file comment), calling
/// start(extents) once the header is read, then sample(v, value) for the v-th sample of the layers (axis 0 fastest); returns the volume's
/// extents. Throws lacuna::parse_error with the one-process reader's wording for a bad header,
/// a truncated or overlong raw file and corrupt gzip data; std::invalid_argument unless
/// begin <= end <= layers.
template <class Start, class Sample>
std::array<std::size_t, 3> read_nrrd_layers(const std::filesystem::path& path, std::size_t begin, std::size_t end,
                                            const io::read_limits& limits, Start&& start, Sample&& sample) {
  const std::string name = path.string();
  auto in = io::detail::open_input(path);
  const io::nrrd_header h = io::read_nrrd_header(in, name, limits, 3);
  std::array<std::size_t, 3> extents{1, 1, 1};
  for (std::size_t a = 0; a < h.sizes.size(); ++a) extents[a] = static_cast<std::size_t>(h.sizes[a]);
  const auto [nx, ny, nz] = extents;
  if (begin > end || end > nz) throw std::invalid_argument("lacuna: reading a slab: layers out of range");
  start(extents);
  const std::uint64_t bps = h.bytes_per_sample();
  const std::uint64_t layer_bytes = static_cast<std::uint64_t>(nx) * ny * bps;  // checked by the header reader
  const std::uint64_t needed = layer_bytes * nz;
  const std::size_t layers = end - begin;
  auto set_bits = [&](const unsigned char* p, std::uint64_t first_byte, std::size_t n) {
    // n bytes of the slab's data starting at slab byte `first_byte` (a multiple of bps)
    for (std::size_t i = 0; i + bps <= n; i += bps) sample(static_cast<std::size_t>((first_byte + i) / bps), sample_value(h, p + i));
  };
  if (h.encoding == io::nrrd_header::data_encoding::raw) {
    std::error_code ec;
    const std::uint64_t size = std::filesystem::file_size(path, ec);
    if (!ec) {
      const std::uint64_t left = size - std::min<std::uint64_t>(size, h.data_offset);
      if (left < needed)
        throw parse_error(name, 0, "byte offset " + std::to_string(h.data_offset + left) + ": data truncated: the sizes need " +
                                       std::to_string(needed) + " bytes, the file holds " + std::to_string(left) +
                                       " after the header");
      if (left > needed)
        throw parse_error(name, 0, "byte offset " + std::to_string(h.data_offset + needed) +
                                       ": more data than the sizes describe (" + std::to_string(needed) + " bytes)");
    }
    in.clear();
    in.seekg(static_cast<std::streamoff>(h.data_offset + begin * layer_bytes));
    std::vector<unsigned char> buf(std::size_t{1} << 20);
    const std::uint64_t total = layers * layer_bytes;
    for (std::uint64_t done = 0; done < total;) {
      const std::size_t want = static_cast<std::size_t>(std::min<std::uint64_t>(buf.size(), total - done));
      in.read(reinterpret_cast<char*>(buf.data()), static_cast<std::streamsize>(want));
      if (static_cast<std::size_t>(in.gcount()) != want)
        throw parse_error(name, 0, "byte offset " + std::to_string(h.data_offset + begin * layer_bytes + done) +
                                       ": data truncated (reading layers " + std::to_string(begin) + ".." +
                                       std::to_string(end) + ")");
      set_bits(buf.data(), done, want);
      done += want;
    }
  } else {
#ifdef LACUNA_NRRD_GZIP
    z_stream zs{};
    if (const int r = inflateInit2(&zs, 15 + 32); r != Z_OK) {
      if (r == Z_MEM_ERROR) throw std::bad_alloc();
      throw parse_error(name, 0, "byte offset " + std::to_string(h.data_offset) + ": cannot start gzip decompression");
    }
    struct guard {
      z_stream* z;
      ~guard() { inflateEnd(z); }
    } g{&zs};
    std::vector<unsigned char> inbuf(std::size_t{1} << 16), out(std::size_t{1} << 16);
    const std::uint64_t first = begin * layer_bytes, last = end * layer_bytes;
    std::uint64_t produced = 0, compressed = 0;
    std::size_t kept = 0;  // bytes of a split sample at the start of `out`
    auto where = [&] { return "byte offset " + std::to_string(h.data_offset + (compressed - zs.avail_in)) + ": "; };
    int ret = Z_OK;
    while (ret != Z_STREAM_END) {
      if (zs.avail_in == 0) {
        in.read(reinterpret_cast<char*>(inbuf.data()), static_cast<std::streamsize>(inbuf.size()));
        const auto got = static_cast<std::size_t>(in.gcount());
        if (got == 0)
          throw parse_error(name, 0, where() + "gzip data truncated (" + std::to_string(produced) + " of " +
                                         std::to_string(needed) + " bytes decompressed)");
        zs.next_in = inbuf.data();
        zs.avail_in = static_cast<uInt>(got);
        compressed += got;
      }
      zs.next_out = out.data() + kept;
      zs.avail_out = static_cast<uInt>(out.size() - kept);
      ret = inflate(&zs, Z_NO_FLUSH);
      if (ret == Z_MEM_ERROR) throw std::bad_alloc();
      if (ret != Z_OK && ret != Z_STREAM_END && ret != Z_BUF_ERROR)
        throw parse_error(name, 0, where() + "gzip data corrupt (" + (zs.msg ? std::string(zs.msg) : "zlib error " + std::to_string(ret)) + ")");
      const std::size_t have = out.size() - kept - zs.avail_out;
      if (ret == Z_BUF_ERROR && have == 0 && zs.avail_in != 0) throw parse_error(name, 0, where() + "gzip data corrupt (no progress)");
      if (produced + kept + have > needed)
        throw parse_error(name, 0, where() + "the gzip data holds more than the " + std::to_string(needed) + " bytes the sizes describe");
      // whole samples only: a 16-bit sample may straddle two outputs, its first byte waits
      const std::size_t total = kept + have, usable = total - total % bps;
      const std::uint64_t lo = std::max(produced, first), hi = std::min<std::uint64_t>(produced + usable, last);
      if (lo < hi) set_bits(out.data() + (lo - produced), lo - first, static_cast<std::size_t>(hi - lo));
      produced += usable;
      kept = total - usable;
      if (kept > 0) out[0] = out[usable];
    }
    produced += kept;
    if (produced < needed)
      throw parse_error(name, 0, where() + "gzip data truncated: " + std::to_string(produced) + " of " + std::to_string(needed) + " bytes");
#else
    throw parse_error(name, 0, "byte offset " + std::to_string(h.data_offset) +
                                   ": gzip-encoded data needs zlib: build with LACUNA_HAVE_ZLIB=1 and link zlib");
#endif
  }
  return extents;
}

}  // namespace detail

/// Reads the layers [begin, end) of the NRRD file `path` as a binary slab under the foreground
/// rule of `options` (see the file comment; errors as the one-process reader's).
inline volume_slab read_nrrd_slab(const std::filesystem::path& path, std::size_t begin, std::size_t end,
                                  const io::image_options& options = {}) {
  std::vector<std::uint64_t> bits;
  volume_slab s;
  s.volume_extents = detail::read_nrrd_layers(
      path, begin, end, options.limits,
      [&](const std::array<std::size_t, 3>& e) { bits.assign((e[0] * e[1] * (end - begin) + 63) / 64, 0); },
      [&](std::size_t v, std::int64_t value) {
        if (options.threshold ? value >= *options.threshold : value != 0) bits[v >> 6] |= std::uint64_t{1} << (v & 63);
      });
  s.begin = begin;
  s.end = end;
  if (end > begin) s.complex = cubical_complex<3>({s.volume_extents[0], s.volume_extents[1], end - begin}, std::move(bits));
  return s;
}

/// Reads the samples of the layers [begin, end) of the NRRD file `path` (axis 0 fastest), as
/// io::read_nrrd_samples reads the whole volume; returns the volume's extents and the samples.
inline std::pair<std::array<std::size_t, 3>, std::vector<std::int32_t>> read_nrrd_slab_samples(
    const std::filesystem::path& path, std::size_t begin, std::size_t end, const io::read_limits& limits = {}) {
  std::vector<std::int32_t> samples;
  const auto extents = detail::read_nrrd_layers(
      path, begin, end, limits, [&](const std::array<std::size_t, 3>& e) { samples.assign(e[0] * e[1] * (end - begin), 0); },
      [&](std::size_t v, std::int64_t value) { samples[v] = static_cast<std::int32_t>(value); });
  return {extents, std::move(samples)};
}



}  // namespace lacuna::distributed

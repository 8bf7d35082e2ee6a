// lacuna/io/off.hpp — Object File Format (OFF) meshes as lacuna::polygon_mesh.
//
// Accepted (text OFF):
//   * an optional header keyword: OFF, or OFF with any of the prefixes ST, C, N, 4, n
//     (COFF, NOFF, STOFF, 4OFF, nOFF, ...); nOFF is followed by the vertex dimension. The counts
//     may follow the keyword on its line.
//   * the counts: vertices, faces and (optionally) edges; the edge count is ignored.
//   * one vertex per line: its coordinates (3, or 4 for 4OFF, or the nOFF dimension); anything
//     after them (normals, colours, texture coordinates) is ignored.
//   * one face per line: "n i_1 ... i_n" with 0-based vertex numbers; anything after them (a
//     colour) is ignored. Each face becomes one 2-cell, not triangulated.
//   * '#' starts a comment to the end of the line; blank lines are skipped.
// Errors (lacuna::parse_error, "FILE:LINE: message"): a header word other than these, BINARY
// OFF, bad or missing counts, counts beyond read_limits or beyond what the file can hold, a bad
// number, a vertex index out of range, a degenerate face (see polygon_mesh.hpp), a file that
// ends early, and data after the last face.
#pragma once

#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/polygon_mesh.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/io/reader_arguments.hpp>

#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <istream>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace lacuna::io {

namespace detail {

// A template on its stream (always std::istream: the public functions pass every stream as
// one) so that only the translation units that read the format compile it.
template <class Stream>
class off_reader {
 public:
  off_reader(Stream& in, const std::string& name, const read_limits& limits)
      : size_(remaining_bytes(in)), lines_(in, name), name_(name), limits_(limits) {}

  polygon_mesh read() {
    // ---- header keyword and counts ----
    std::vector<std::string_view> counts;
    if (!next_significant()) fail(line_ == 0 ? 1 : line_, "empty file: expected the OFF header and counts");
    std::string_view first = peek_token();
    std::size_t dim = 3;
    const bool keyword = !parse_unsigned(first).has_value();  // the keyword is optional
    if (keyword) {
      next_token(rest_);
      parse_keyword(first, dim);
    }
    for (std::string_view t = next_token(rest_); !t.empty(); t = next_token(rest_)) {
      if (t == "BINARY") fail(line_, "binary OFF is not supported");
      counts.push_back(t);
    }
    if (need_dim_) {
      if (counts.empty()) {
        if (!next_significant()) fail(line_, "the file ends before the vertex dimension of nOFF");
        counts.push_back(next_token(rest_));
        for (std::string_view t = next_token(rest_); !t.empty(); t = next_token(rest_)) counts.push_back(t);
      }
      const auto d = parse_unsigned(counts.front());
      if (!d || *d == 0 || *d > 64) fail(line_, "bad vertex dimension " + quote_token(counts.front()));
      dim = static_cast<std::size_t>(*d) + (four_ ? 1 : 0);
      counts.erase(counts.begin());
    }
    if (counts.empty()) {
      if (!next_significant()) fail(line_, "the file ends before the counts line");
      for (std::string_view t = next_token(rest_); !t.empty(); t = next_token(rest_)) counts.push_back(t);
    }
    const std::size_t counts_line = line_;
    if (counts.size() < 2 || counts.size() > 3)
      fail(counts_line, "expected the counts 'vertices faces [edges]', found " + std::to_string(counts.size()) + " numbers");
    const auto nv = parse_unsigned(counts[0]), nf = parse_unsigned(counts[1]);
    if (!nv) fail(counts_line, "bad vertex count " + quote_token(counts[0]));
    if (!nf) fail(counts_line, "bad face count " + quote_token(counts[1]));
    if (counts.size() == 3 && !parse_unsigned(counts[2])) fail(counts_line, "bad edge count " + quote_token(counts[2]));
    if (*nv > limits_.max_cells || *nf > limits_.max_cells - *nv)
      fail(counts_line, "the header claims " + std::to_string(*nv) + " vertices and " + std::to_string(*nf) +
                            " faces, more than the limit of " + std::to_string(limits_.max_cells) + " cells");
    // every vertex and face takes a line of at least 2 bytes (the last may lack its newline); a
    // looser bound than a valid line needs, so that a short file still gets the precise error
    const std::optional<std::uint64_t> left =
        size_ ? std::optional<std::uint64_t>(*size_ - std::min(*size_, lines_.offset())) : std::nullopt;
    if (left && *nv + *nf > (*left + 1) / 2)
      fail(counts_line, "the header claims " + std::to_string(*nv) + " vertices and " + std::to_string(*nf) +
                            " faces, but the file holds only " + std::to_string(*left) + " more bytes");
    const std::size_t nvert = static_cast<std::size_t>(*nv), nface = static_cast<std::size_t>(*nf);

    // ---- vertices ----
    std::vector<std::array<double, 3>> positions;
    positions.reserve(left ? nvert : std::min<std::size_t>(nvert, 1 << 16));
    for (std::size_t i = 0; i < nvert; ++i) {
      if (!next_significant())
        fail(line_, "the file ends after " + std::to_string(i) + " of " + std::to_string(nvert) + " vertices");
      std::array<double, 3> p{0, 0, 0};
      for (std::size_t c = 0; c < dim; ++c) {
        const std::string_view t = next_token(rest_);
        if (t.empty()) fail(line_, "vertex " + std::to_string(i) + " has " + std::to_string(c) + " coordinates, " + std::to_string(dim) + " expected");
        const auto x = parse_real(t);
        if (!x) fail(line_, "bad coordinate " + quote_token(t) + " of vertex " + std::to_string(i));
        if (c < 3) p[c] = *x;
      }
      positions.push_back(p);
    }

    // ---- faces ----
    std::vector<std::size_t> fv, fo{0};
    fo.reserve(left ? nface + 1 : std::min<std::size_t>(nface + 1, 1 << 16));
    std::vector<std::pair<std::size_t, std::size_t>> scratch;
    std::uint64_t cells = *nv + *nf;
    for (std::size_t f = 0; f < nface; ++f) {
      if (!next_significant())
        fail(line_, "the file ends after " + std::to_string(f) + " of " + std::to_string(nface) + " faces");
      const std::string_view t = next_token(rest_);
      const auto n = parse_unsigned(t);
      if (!n) fail(line_, "bad vertex count " + quote_token(t) + " of face f" + std::to_string(f));
      if (*n > limits_.max_cells - cells) fail(line_, "face f" + std::to_string(f) + " has more vertices than the cell limit allows");
      cells += *n;
      const std::size_t begin = fv.size();
      for (std::uint64_t j = 0; j < *n; ++j) {
        const std::string_view x = next_token(rest_);
        if (x.empty())
          fail(line_, "face f" + std::to_string(f) + " lists " + std::to_string(j) + " of its " + std::to_string(*n) + " vertices");
        const auto v = parse_unsigned(x);
        if (!v) fail(line_, "bad vertex index " + quote_token(x) + " in face f" + std::to_string(f));
        if (*v >= nvert)
          fail(line_, "face f" + std::to_string(f) + ": vertex " + std::to_string(*v) + " out of range (the mesh has " +
                          std::to_string(nvert) + " vertices)");
        fv.push_back(static_cast<std::size_t>(*v));
      }
      if (auto fault = lacuna::detail::polygon_fault(std::span<const std::size_t>(fv).subspan(begin), nvert, scratch))
        fail(line_, "face f" + std::to_string(f) + ": " + *fault);
      fo.push_back(fv.size());
    }
    if (next_significant()) fail(line_, "unexpected data after the last face " + quote_token(peek_token()));
    polygon_mesh m(nvert, std::move(fv), std::move(fo));
    m.set_positions(std::move(positions));
    return m;
  }

 private:
  [[noreturn]] void fail(std::size_t line, const std::string& msg) const { throw parse_error(name_, line, msg); }

  // moves to the next line with a token (comments stripped); false at the end of the file
  bool next_significant() {
    for (std::string_view l; lines_.next(l);) {
      line_ = lines_.line_number();
      l = strip_comment(l);
      std::string_view probe = l;
      if (!next_token(probe).empty()) {
        rest_ = l;
        return true;
      }
    }
    return false;
  }
  std::string_view peek_token() const {
    std::string_view r = rest_;
    return next_token(r);
  }

  void parse_keyword(std::string_view w, std::size_t& dim) {
    if (w.size() < 3 || w.substr(w.size() - 3) != "OFF")
      fail(line_, "not an OFF file: expected the header OFF (or COFF, NOFF, ...), found " + quote_token(w));
    std::string_view p = w.substr(0, w.size() - 3);
    auto take = [&p](std::string_view x) {
      if (p.substr(0, x.size()) != x) return false;
      p.remove_prefix(x.size());
      return true;
    };
    take("ST");
    take("C");
    take("N");
    four_ = take("4");
    need_dim_ = take("n");
    if (!p.empty()) fail(line_, "not an OFF file: unknown header keyword " + quote_token(w));
    if (four_) dim = 4;
  }

  std::optional<std::uint64_t> size_;  // of the input, when the stream can tell
  line_reader lines_;                   // the shared line reader (io/line_reader.hpp)
  const std::string& name_;
  const read_limits& limits_;
  std::string_view rest_;
  std::size_t line_ = 0;
  bool four_ = false, need_dim_ = false;
};

}  // namespace detail

/// Reads an OFF mesh from a stream; `name` names the input in errors. Throws parse_error.
template <input_stream Stream>
polygon_mesh read_off(Stream& in, const std::string& name, const read_limits& limits = {}) {
  return detail::off_reader<std::istream>(in, name, limits).read();
}

/// Reads an OFF file.
template <path_argument Path>
polygon_mesh read_off(const Path& file, const read_limits& limits = {}) {
  const std::filesystem::path& path = file;
  auto in = detail::open_input(path);
  return read_off(in, path.string(), limits);
}

}  // namespace lacuna::io

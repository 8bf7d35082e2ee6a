// lacuna/io/obj.hpp — Wavefront OBJ meshes as lacuna::polygon_mesh.
//
// Accepted: `v x y z [w]` vertex lines (anything after the coordinates, such as colours, is
// ignored); `f` lines whose corners are `v`, `v/vt`, `v/vt/vn` or `v//vn`, with 1-based
// indices or negative ones counting back from the last vertex defined so far (-1 is that
// vertex); every face becomes one 2-cell, not triangulated. A vertex must be defined before a
// face uses it. Comments ('#'), blank lines, line continuations (a '\' at the end of a line)
// and all other statements (vt, vn, vp, g, o, s, usemtl, mtllib, l, p, ...) are skipped.
// Errors (lacuna::parse_error, "FILE:LINE: message"): a bad number, a vertex with fewer than
// 3 coordinates, index 0, an index out of range, a degenerate face (see polygon_mesh.hpp), and
// more cells than read_limits::max_cells.
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
#include <limits>
#include <string>
#include <string_view>
#include <vector>

namespace lacuna::io {

namespace detail {

// A template on its stream (always std::istream: the public functions pass every stream as
// one) so that only the translation units that read the format compile it.
template <class Stream>
class obj_reader {
 public:
  obj_reader(Stream& in, const std::string& name, const read_limits& limits)
      : lines_(in, name), name_(name), limits_(limits) {}

  polygon_mesh read() {
    std::vector<std::array<double, 3>> positions;
    std::vector<std::size_t> fv, fo{0};
    std::vector<std::pair<std::size_t, std::size_t>> scratch;
    std::string statement;
    std::uint64_t cells = 0;
    while (next_statement(statement)) {
      std::string_view rest = statement;
      if (const auto hash = rest.find('#'); hash != std::string_view::npos) rest = rest.substr(0, hash);
      const std::string_view key = next_token(rest);
      if (key == "v") {
        std::array<double, 3> p{};
        for (std::size_t c = 0; c < 3; ++c) {
          const std::string_view t = next_token(rest);
          if (t.empty()) fail("vertex " + std::to_string(positions.size() + 1) + " has " + std::to_string(c) + " coordinates, 3 expected");
          const auto x = parse_real(t);
          if (!x) fail("bad coordinate " + quote_token(t));
          p[c] = *x;
        }
        if (++cells > limits_.max_cells) fail("more than the limit of " + std::to_string(limits_.max_cells) + " cells");
        positions.push_back(p);
      } else if (key == "f") {
        const std::size_t face = fo.size() - 1, begin = fv.size();
        for (std::string_view t = next_token(rest); !t.empty(); t = next_token(rest)) {
          const std::string_view idx = t.substr(0, t.find('/'));
          const auto i = parse_signed(idx);
          if (!i) fail("bad vertex index " + quote_token(t) + " in face f" + std::to_string(face));
          const auto n = static_cast<std::int64_t>(positions.size());
          if (*i == 0) fail("vertex index 0 in face f" + std::to_string(face) + " (OBJ indices start at 1)");
          if (*i > n)
            fail("face f" + std::to_string(face) + ": vertex " + std::to_string(*i) + " is not defined (" +
                 std::to_string(n) + " vertices so far)");
          if (*i < -n)
            fail("face f" + std::to_string(face) + ": relative index " + std::to_string(*i) + " reaches before the first vertex (" +
                 std::to_string(n) + " vertices so far)");
          if (++cells > limits_.max_cells) fail("more than the limit of " + std::to_string(limits_.max_cells) + " cells");
          fv.push_back(static_cast<std::size_t>(*i > 0 ? *i - 1 : n + *i));
        }
        if (auto fault = lacuna::detail::polygon_fault(std::span<const std::size_t>(fv).subspan(begin), positions.size(), scratch))
          fail("face f" + std::to_string(face) + ": " + *fault);
        if (++cells > limits_.max_cells) fail("more than the limit of " + std::to_string(limits_.max_cells) + " cells");
        fo.push_back(fv.size());
      }
      // every other statement is irrelevant to the cell structure
    }
    const std::size_t nv = positions.size();
    polygon_mesh m(nv, std::move(fv), std::move(fo));
    m.set_positions(std::move(positions));
    return m;
  }

 private:
  [[noreturn]] void fail(const std::string& msg) const { throw parse_error(name_, start_line_, msg); }

  // one logical line, joining lines that end in '\'; remembers the line it starts on
  bool next_statement(std::string& out) {
    out.clear();
    std::string_view part;
    bool any = false;
    for (;;) {
      if (!lines_.next(part)) return any;
      line_ = lines_.line_number();
      if (!any) start_line_ = line_;
      any = true;
      if (!part.empty() && part.back() == '\\') {
        part.remove_suffix(1);
        out += part;
        out += ' ';
        if (out.size() > (std::size_t{1} << 24)) fail("statement longer than 16 MiB");
        continue;
      }
      out += part;
      return true;
    }
  }

  line_reader lines_;  // the shared line reader (io/line_reader.hpp)
  const std::string& name_;
  const read_limits& limits_;
  std::size_t line_ = 0, start_line_ = 0;
};

}  // namespace detail

/// Reads an OBJ mesh from a stream; `name` names the input in errors. Throws parse_error.
/// Messages name faces as the mesh does (f0 is the first face of the file).
template <input_stream Stream>
polygon_mesh read_obj(Stream& in, const std::string& name, const read_limits& limits = {}) {
  return detail::obj_reader<std::istream>(in, name, limits).read();
}

/// Reads an OBJ file.
template <path_argument Path>
polygon_mesh read_obj(const Path& file, const read_limits& limits = {}) {
  const std::filesystem::path& path = file;
  auto in = detail::open_input(path);
  return read_obj(in, path.string(), limits);
}

}  // namespace lacuna::io

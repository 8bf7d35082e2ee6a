// lacuna/io/cycle_svg.hpp — a picture of 1-cycles on a 2D binary image, as SVG (a standalone
// SVG 1.1 document; any browser or SVG viewer shows it).
//
//   cycle_picture_svg(image, cycles [, options])  -> std::string
//   closed_walks(image, cycle, arithmetic)         -> the closed walks drawn for one cycle
//
// The foreground pixels of the image are drawn as grey unit squares (one rectangle per run of
// a row); each cycle is drawn on them along the edges of the cubical complex, as one or more
// closed polylines, in a colour of its own (Okabe & Ito's colour-blind-safe palette; after six
// cycles the colours repeat with a dash pattern, so the first 24 cycles look different), and
// a legend names each one ("H_1 generator 1", ...). Cycles may share edges: each is drawn
// wider than those drawn after it, so that every one stays visible.
//
// How a cycle becomes closed polylines. A 1-chain z whose boundary is zero is a balanced
// directed multigraph on the image's vertices: the edge e with coefficient c is |c| arcs from
// its lower to its upper end (c > 0) or back (c < 0), the orientation of cubical_complex
// (boundary of an edge = upper end - lower end). In a balanced multigraph a walk that starts
// at a vertex v and always leaves by an unused arc can get stuck only at v (every other vertex
// it reaches has been entered once more than left, so an unused arc leaves it); repeating this
// until no arc is left splits z into closed walks (Euler 1736; the splitting step of
// Hierholzer's algorithm, 1873). Over Z/2 (cycle_arithmetic::mod_2) the edges with odd
// coefficient are used once each, in either direction, and the same argument holds with
// "even degree" for "balanced". So every polyline drawn is closed by construction, and a chain
// whose boundary is not zero is refused (std::invalid_argument) instead of being drawn open.
//
// Coordinates: everything is drawn inside one group whose transform scales the image's corner
// coordinates (pixel (x, y) is the square [x, x+1] x [y, y+1], y downwards as in the file), so
// the points of a polyline are integers, the grid vertices the cycle passes through; only its
// corners are written (straight runs are merged). Elements carry classes for scripts and
// tests: `foreground` (the pixels), `generator` with data-generator="k" (a group of the closed
// polylines `cycle` of cycle k, k from 1), `legend-entry` with data-generator.
#pragma once

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/io/svg_text.hpp>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna::io {

/// One term of a 1-chain of a 2D image's cubical complex: the edge (its dense index among the
/// 1-cells, as in cubical_complex<2>::position(1, edge)) and its coefficient.
struct cycle_edge {
  std::size_t edge = 0;          ///< dense index of the edge among the image's 1-cells
  std::int64_t coefficient = 0;  ///< its coefficient in the chain
};

/// How the coefficients of a drawn chain are read: as integers (its boundary is zero over Z,
/// so also for a cycle over Q scaled to integer coefficients) or modulo 2.
enum class cycle_arithmetic { integers, mod_2 };

/// Options: `cycle_picture_options{.title = "...", .arithmetic = cycle_arithmetic::mod_2}`.
struct cycle_picture_options {
  /// The title at the top (plain text); none when empty.
  std::string title{};
  /// How the coefficients are read (over the integers, or modulo 2).
  cycle_arithmetic arithmetic = cycle_arithmetic::integers;
  /// The legend's text for cycle k is label + " " + k.
  std::string label = "H_1 generator";
  /// The side of a pixel in SVG units; 0: chosen so that the image's longer side is about
  /// 640 units (at least 1 and at most 40 a pixel).
  double pixel_size = 0;
};

/// A vertex of the image's grid, in corner coordinates: (x, y), 0 <= x <= width.
using grid_vertex = std::array<std::size_t, 2>;

/// The closed walks into which `cycle` splits (see the head of this file), each as its list of
/// vertices, the first repeated at the end. Throws std::invalid_argument for an index that is
/// not an edge of `image` and for a chain whose boundary is not zero (in the arithmetic
/// given), std::length_error when the coefficients add up to more than 2^26 edge traversals.
/// O(number of traversals * log). `D` is deduced from the image and must be 2; the function is
/// a template so that only the translation units that call it compile it (DEVELOPERS.md,
/// *Compile cost of the headers*).
template <std::size_t D>
  requires(D == 2)
std::vector<std::vector<grid_vertex>> closed_walks(const cubical_complex<D>& image,
                                                   const std::vector<cycle_edge>& cycle,
                                                   cycle_arithmetic arithmetic) {
  // the chain with equal edges merged: edge -> coefficient (mod 2: its parity)
  std::map<std::size_t, std::int64_t> merged;
  for (const auto& t : cycle) {
    if (t.edge >= image.cell_count(1))
      throw std::invalid_argument("cycle picture: " + std::to_string(t.edge) + " is not an edge of the image");
    auto& c = merged[t.edge];
    if (arithmetic == cycle_arithmetic::mod_2) {
      c ^= t.coefficient & 1;
    } else if ((t.coefficient > 0 && c > std::numeric_limits<std::int64_t>::max() - t.coefficient) ||
               (t.coefficient < 0 && c < std::numeric_limits<std::int64_t>::min() - t.coefficient)) {
      throw std::length_error("cycle picture: a coefficient does not fit in 64 bits");
    } else {
      c += t.coefficient;
    }
  }
  // arcs leaving each vertex: (edge's other end, arc number); uses[arc] = traversals left
  struct arc {
    grid_vertex from, to;
    std::uint64_t left;
    bool both_ways;  // mod 2: either direction
  };
  std::vector<arc> arcs;
  std::map<grid_vertex, std::vector<std::size_t>> leaving;
  std::uint64_t total = 0;
  constexpr std::uint64_t max_traversals = std::uint64_t{1} << 26;
  for (const auto& [e, c] : merged) {
    if (c == 0) continue;
    const auto p = image.position(1, e);
    // the lower and the upper end of the edge along its free (odd) axis
    grid_vertex lo{p[0] / 2, p[1] / 2}, hi = lo;
    hi[(p[0] & 1) ? 0 : 1] += 1;
    const std::uint64_t m = c > 0 ? static_cast<std::uint64_t>(c) : static_cast<std::uint64_t>(-(c + 1)) + 1;
    total += m;
    if (total > max_traversals)
      throw std::length_error("cycle picture: the coefficients add up to more than 2^26 edge traversals");
    const bool both = arithmetic == cycle_arithmetic::mod_2;
    const grid_vertex from = c > 0 ? lo : hi, to = c > 0 ? hi : lo;
    leaving[from].push_back(arcs.size());
    if (both) leaving[to].push_back(arcs.size());
    arcs.push_back({from, to, m, both});
  }
  std::vector<std::vector<grid_vertex>> walks;
  std::map<grid_vertex, std::size_t> next_unused;  // per vertex: arcs before this one are used up
  auto take = [&](const grid_vertex& v) -> std::optional<grid_vertex> {
    auto it = leaving.find(v);
    if (it == leaving.end()) return std::nullopt;
    auto& k = next_unused[v];
    for (; k < it->second.size(); ++k) {
      arc& a = arcs[it->second[k]];
      if (a.left == 0) continue;
      --a.left;
      return a.from == v ? a.to : a.from;  // mod 2 arcs go either way
    }
    return std::nullopt;
  };
  for (std::size_t first = 0; first < arcs.size(); ++first) {
    while (arcs[first].left > 0) {
      const grid_vertex start = arcs[first].from;
      std::vector<grid_vertex> walk{start};
      grid_vertex v = start;
      do {
        const auto w = take(v);
        if (!w)
          throw std::invalid_argument("cycle picture: the chain is not a cycle (its boundary is not zero at the vertex (" +
                                      std::to_string(v[0]) + ", " + std::to_string(v[1]) + "))");
        v = *w;
        walk.push_back(v);
      } while (v != start);
      walks.push_back(std::move(walk));
    }
  }
  return walks;
}

namespace svg_detail {

/// The colour and dash pattern of cycle k (from 0): the pattern's lengths in units of the line's
/// width (empty: solid), written scaled by `unit`.
inline std::pair<const char*, std::string> cycle_style(std::size_t k, double unit) {
  static constexpr const char* colours[] = {"#D55E00", "#0072B2", "#009E73", "#CC79A7", "#E69F00", "#56B4E9"};
  // plain arrays, not a static vector of vectors: its initializer was compiled in every
  // translation unit (DEVELOPERS.md, *Compile cost of the headers*)
  static constexpr double dashes[4][4] = {{}, {4, 2}, {1, 1.6}, {5, 1.6, 1, 1.6}};
  static constexpr std::size_t dash_lengths[4] = {0, 2, 2, 4};
  const std::size_t pattern = (k / 6) % 4;
  std::string d;
  for (std::size_t j = 0; j < dash_lengths[pattern]; ++j) d += (d.empty() ? "" : " ") + num(dashes[pattern][j] * unit);
  return {colours[k % 6], d};
}

}  // namespace svg_detail

/// The picture of `cycles` (1-chains with zero boundary) on `image` (see the head of this
/// file). Throws as closed_walks does, for any of the cycles. The document is about 40 bytes
/// per run of foreground pixels in a row plus 8 per corner of a drawn cycle. `D` is deduced
/// from the image and must be 2 (a template for the reason closed_walks is one).
template <std::size_t D>
  requires(D == 2)
std::string cycle_picture_svg(const cubical_complex<D>& image, const std::vector<std::vector<cycle_edge>>& cycles,
                              const cycle_picture_options& options = {}) {
  using svg_detail::num;
  std::vector<std::vector<std::vector<grid_vertex>>> drawn;
  for (const auto& z : cycles) drawn.push_back(closed_walks(image, z, options.arithmetic));
  const auto n = image.extents();
  const double longer = static_cast<double>(std::max<std::size_t>({n[0], n[1], 1}));
  const double s = options.pixel_size > 0 ? options.pixel_size : std::clamp(640.0 / longer, 1.0, 40.0);
  const double margin = 12, title_h = options.title.empty() ? 0.0 : 28.0, row = 20;
  const double img_w = static_cast<double>(n[0]) * s, img_h = static_cast<double>(n[1]) * s;
  const double legend_x = margin + img_w + 20;
  const std::size_t entries = std::max<std::size_t>(cycles.size(), 1);
  const double width = legend_x + 200, top = margin + title_h;
  const double height = top + std::max(img_h, row * static_cast<double>(entries)) + margin;
  std::string out;
  out += "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  out += "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"" + num(width) + "\" height=\"" +
         num(height) + "\" viewBox=\"0 0 " + num(width) + " " + num(height) +
         "\" font-family=\"sans-serif\" font-size=\"13\">\n";
  out += "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n";
  if (!options.title.empty())
    out += "<text x=\"" + num(margin) + "\" y=\"" + num(margin + 16) + "\" font-size=\"15\">" +
           svg_detail::xml_text(options.title, 90) + "</text>\n";
  // the image, in pixel units: pixel (x, y) is [x, x+1] x [y, y+1]
  out += "<g transform=\"translate(" + num(margin) + " " + num(top) + ") scale(" + num(s) + ")\">\n";
  out += "<rect class=\"frame\" width=\"" + std::to_string(n[0]) + "\" height=\"" + std::to_string(n[1]) +
         "\" fill=\"white\" stroke=\"#999999\" stroke-width=\"" + num(1.0 / s) + "\"/>\n";
  out += "<path class=\"foreground\" fill=\"#C8C8C8\" d=\"";
  for (std::size_t y = 0; y < n[1]; ++y)
    for (std::size_t x = 0; x < n[0];) {
      if (!image.is_foreground({x, y})) {
        ++x;
        continue;
      }
      std::size_t e = x;
      while (e < n[0] && image.is_foreground({e, y})) ++e;
      out += "M" + std::to_string(x) + " " + std::to_string(y) + "h" + std::to_string(e - x) + "v1h-" +
             std::to_string(e - x) + "z";
      x = e;
    }
  out += "\"/>\n";
  // In pixel units. Cycles may share edges: each is drawn wider than the ones drawn over it
  // (from 2.5 times the thinnest for the first down to once for the last), so none hides another.
  const double thinnest = std::max(0.12, 1.5 / s);
  for (std::size_t k = 0; k < drawn.size(); ++k) {
    const double stroke =
        thinnest * (1 + 1.5 * static_cast<double>(drawn.size() - 1 - k) / static_cast<double>(std::max<std::size_t>(drawn.size() - 1, 1)));
    const auto [colour, dash] = svg_detail::cycle_style(k, stroke);
    out += "<g class=\"generator\" data-generator=\"" + std::to_string(k + 1) + "\" fill=\"none\" stroke=\"" + colour +
           "\" stroke-width=\"" + num(stroke) + "\" stroke-linejoin=\"round\" stroke-linecap=\"round\"" +
           (dash.empty() ? std::string() : " stroke-dasharray=\"" + dash + "\"") + ">\n";
    for (const auto& walk : drawn[k]) {
      out += "<polyline class=\"cycle\" points=\"";
      for (std::size_t i = 0; i < walk.size(); ++i) {
        // corners only: a vertex in line with its neighbours is left out (never the ends)
        if (i > 0 && i + 1 < walk.size()) {
          const auto& a = walk[i - 1];
          const auto& b = walk[i + 1];
          if ((a[0] == b[0] && a[0] == walk[i][0]) || (a[1] == b[1] && a[1] == walk[i][1])) {
            const bool between = (a[0] == b[0]) ? ((a[1] < walk[i][1]) == (walk[i][1] < b[1]))
                                                : ((a[0] < walk[i][0]) == (walk[i][0] < b[0]));
            if (between) continue;
          }
        }
        out += (i ? " " : "") + std::to_string(walk[i][0]) + "," + std::to_string(walk[i][1]);
      }
      out += "\"/>\n";
    }
    out += "</g>\n";
  }
  out += "</g>\n";
  // the legend
  if (cycles.empty())
    out += "<text class=\"legend-empty\" x=\"" + num(legend_x) + "\" y=\"" + num(top + 14) + "\">no cycles to draw</text>\n";
  for (std::size_t k = 0; k < cycles.size(); ++k) {
    const auto [colour, dash] = svg_detail::cycle_style(k, 3.0);
    const double y = top + row * static_cast<double>(k) + 10;
    out += "<g class=\"legend-entry\" data-generator=\"" + std::to_string(k + 1) + "\">";
    out += "<line x1=\"" + num(legend_x) + "\" y1=\"" + num(y) + "\" x2=\"" + num(legend_x + 28) + "\" y2=\"" + num(y) +
           "\" stroke=\"" + colour + "\" stroke-width=\"3\"" +
           (dash.empty() ? std::string() : " stroke-dasharray=\"" + dash + "\"") + "/>";
    out += "<text x=\"" + num(legend_x + 36) + "\" y=\"" + num(y + 4.5) + "\">" +
           svg_detail::xml_text(options.label + " " + std::to_string(k + 1), 40) + "</text></g>\n";
  }
  out += "</svg>\n";
  return out;
}

}  // namespace lacuna::io

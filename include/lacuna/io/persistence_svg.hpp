// lacuna/io/persistence_svg.hpp — pictures of persistence: a persistence diagram and a barcode
// as SVG (standalone SVG 1.1 documents; any browser or SVG viewer shows them).
//
//   persistence_diagram_svg(diagrams [, options])  -> std::string
//   barcode_svg(diagrams [, options])              -> std::string
//
// `diagrams[k]` holds the classes of dimension options.first_dimension + k, each a (birth,
// death) pair with no death (std::nullopt, or an infinite value) for a class that never dies.
//
// The diagram plots death against birth on equal scales, with the diagonal; classes that never
// die sit on a line of their own above the plot, labelled "never dies". Each dimension has its
// own mark shape and colour and a legend entry with its number of classes. The barcode draws one
// bar per class from birth to death, grouped by dimension (a label per group, in the order
// given), on one axis; a bar that never ends runs off the right edge into an arrow head.
// With options.superlevel the values decrease along both axes (the filtration runs from the
// largest value down), so a diagram's points still lie above its diagonal and bars still run
// from left to right.
//
// Any finite values work: negative, all equal, huge (the scale is computed in halves, so the
// range of -1e308 .. 1e308 does not overflow), or none at all; every coordinate written is a
// finite number inside the view box, and the left margin widens to fit the tick labels. The
// title is escaped for XML (control characters dropped, bytes that are not UTF-8 replaced by
// U+FFFD) and shortened to fit the width. Throws std::invalid_argument for a NaN or an infinite
// birth. Elements carry classes for scripts and tests: `mark` (diagram), `bar` (barcode),
// `essential` on classes that never die, and data-dimension on both.
#pragma once

#include <lacuna/io/svg_text.hpp>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace lacuna::io {

/// One class of a diagram: its birth, and its death or nothing if it never dies.
using diagram_interval = std::pair<double, std::optional<double>>;

/// Options of the pictures: `persistence_picture_options{.title = "...", .superlevel = true}`.
struct persistence_picture_options {
  /// The title at the top (plain text).
  std::string title{};
  /// Values decrease along the filtration (a superlevel filtration): the axes run downwards.
  bool superlevel = false;
  /// The dimension of diagrams[0].
  int first_dimension = 0;
};

namespace svg_detail {

/// A tick label: the shortest decimal with enough significant digits to tell neighbouring
/// ticks apart.
inline std::string tick_label(double v, int digits) {
  if (v == 0) return "0";
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, digits);
  std::string s(buf, r.ptr);
  // 1e+06 -> 1e6, 1e-05 -> 1e-5
  if (const auto e = s.find('e'); e != std::string::npos) {
    std::string mant = s.substr(0, e), ex = s.substr(e + 1);
    const bool negative = !ex.empty() && ex[0] == '-';
    if (!ex.empty() && (ex[0] == '+' || ex[0] == '-')) ex.erase(0, 1);
    while (ex.size() > 1 && ex[0] == '0') ex.erase(0, 1);
    s = mant + "e" + (negative ? "-" : "") + ex;
  }
  return s;
}

/// Estimated width in pixels of text in a sans-serif font of the given size.
inline double text_width(std::string_view s, double size) {
  std::size_t chars = 0;
  for (char c : s)
    if ((static_cast<unsigned char>(c) & 0xC0) != 0x80) ++chars;
  return static_cast<double>(chars) * size * 0.62;
}

/// The map from values to [0, 1] along an axis (reversed for superlevel filtrations), and the
/// ticks. Everything is computed on halves of the values, so that hi - lo cannot overflow.
class axis_scale {
 public:
  axis_scale(double lo, double hi, bool decreasing) : decreasing_(decreasing) {
    if (lo > hi) std::swap(lo, hi);
    if (lo == hi) {
      const double pad = lo == 0 ? 1 : std::abs(lo) / 10;
      lo = std::max(lo - pad, -std::numeric_limits<double>::max());
      hi = std::min(hi + pad, std::numeric_limits<double>::max());
    }
    lo2_ = lo / 2;
    hi2_ = hi / 2;
    const double pad2 = (hi2_ - lo2_) / 20;
    lo2_ -= pad2;
    hi2_ += pad2;
    if (!(hi2_ > lo2_)) hi2_ = lo2_ + std::max(std::abs(lo2_) * 1e-12, 1e-300);  // lost to rounding
    ticks_ = make_ticks();
  }
  /// Where v lies, from 0 (the start of the axis) to 1 (its end), clamped.
  double fraction(double v) const {
    double f = (v / 2 - lo2_) / (hi2_ - lo2_);
    if (!std::isfinite(f)) f = 0;
    f = std::clamp(f, 0.0, 1.0);
    return decreasing_ ? 1 - f : f;
  }
  struct tick {
    double value;
    std::string label;
  };
  const std::vector<tick>& ticks() const noexcept { return ticks_; }
  /// Keeps every k-th tick.
  void thin(std::size_t k) {
    std::vector<tick> kept;
    for (std::size_t i = 0; i < ticks_.size(); i += k) kept.push_back(ticks_[i]);
    ticks_ = std::move(kept);
  }

 private:
  std::vector<tick> make_ticks() const {
    // a step of 1, 2 or 5 times a power of ten, for about 6 ticks
    const double span_log = std::log10(hi2_ - lo2_) + std::log10(2.0);
    const double raw_log = span_log - std::log10(6.0);
    double e = std::floor(raw_log);
    const double m = std::pow(10.0, raw_log - e);
    double mult = m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10;
    if (mult == 10) {
      mult = 1;
      e += 1;
    }
    // step = mult * 10^e, and tick values k * step: k * mult * 10^e, computed so that neither
    // 10^e nor k * 10^e overflows
    const double p10 = std::pow(10.0, e);
    const double step = mult * p10;
    std::vector<tick> out;
    if (!(step > 0) || !std::isfinite(step)) return out;
    const double first = std::ceil((lo2_ / step) * 2);
    const double last = std::floor((hi2_ / step) * 2);
    if (!std::isfinite(first) || !std::isfinite(last) || last - first > 40) return out;
    // significant digits that tell neighbours apart
    const double biggest = std::max(std::abs(first), std::abs(last)) * step;
    int digits = static_cast<int>(std::ceil(std::log10(std::max(biggest, step) / step))) + 2;
    digits = std::clamp(digits, 1, 17);
    for (double k = first; k <= last; k += 1) {
      double v = k * step;
      if (std::abs(v) < step * 1e-9) v = 0;
      if (!std::isfinite(v)) continue;
      out.push_back({v, tick_label(v, digits)});
    }
    // the labels must differ: shorter forms can coincide for far-off magnitudes
    for (std::size_t i = 1; i < out.size(); ++i)
      if (out[i].label == out[i - 1].label) {
        for (auto& t : out) t.label = tick_label(t.value, 17);
        break;
      }
    return out;
  }

  bool decreasing_;
  double lo2_, hi2_;
  std::vector<tick> ticks_;
};

inline void check(const std::vector<std::vector<diagram_interval>>& diagrams) {
  for (const auto& d : diagrams)
    for (const auto& [b, e] : d)
      if (!std::isfinite(b) || (e && std::isnan(*e)))
        throw std::invalid_argument("persistence picture: a NaN or an infinite birth");
}

inline bool never_dies(const diagram_interval& x) { return !x.second || !std::isfinite(*x.second); }

/// The least and largest finite value of all classes (births and deaths), if any.
inline std::optional<std::pair<double, double>> value_range(const std::vector<std::vector<diagram_interval>>& diagrams) {
  std::optional<std::pair<double, double>> r;
  const auto add = [&](double v) {
    if (!r)
      r = std::pair{v, v};
    else
      r = std::pair{std::min(r->first, v), std::max(r->second, v)};
  };
  for (const auto& d : diagrams)
    for (const auto& x : d) {
      add(x.first);
      if (!never_dies(x)) add(*x.second);
    }
  return r;
}

/// Colour and shape of a dimension's marks (Okabe & Ito's colour-blind-safe palette).
inline const char* colour(int k) {
  static constexpr const char* c[] = {"#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9"};
  return c[static_cast<std::size_t>(((k % 6) + 6) % 6)];
}

/// A mark of a dimension's shape centred at (x, y), radius r, with the given attributes.
inline std::string mark(int k, double x, double y, double r, const std::string& attributes) {
  using std::string;
  switch (((k % 6) + 6) % 6) {
    case 0:
      return "<circle " + attributes + " cx=\"" + num(x) + "\" cy=\"" + num(y) + "\" r=\"" + num(r) + "\"/>";
    case 1:  // triangle up
      return "<path " + attributes + " d=\"M" + num(x) + " " + num(y - 1.2 * r) + "L" + num(x + 1.1 * r) + " " +
             num(y + 0.8 * r) + "L" + num(x - 1.1 * r) + " " + num(y + 0.8 * r) + "Z\"/>";
    case 2:  // square
      return "<rect " + attributes + " x=\"" + num(x - 0.85 * r) + "\" y=\"" + num(y - 0.85 * r) + "\" width=\"" +
             num(1.7 * r) + "\" height=\"" + num(1.7 * r) + "\"/>";
    case 3:  // diamond
      return "<path " + attributes + " d=\"M" + num(x) + " " + num(y - 1.2 * r) + "L" + num(x + 1.2 * r) + " " +
             num(y) + "L" + num(x) + " " + num(y + 1.2 * r) + "L" + num(x - 1.2 * r) + " " + num(y) + "Z\"/>";
    case 4:  // triangle down
      return "<path " + attributes + " d=\"M" + num(x) + " " + num(y + 1.2 * r) + "L" + num(x + 1.1 * r) + " " +
             num(y - 0.8 * r) + "L" + num(x - 1.1 * r) + " " + num(y - 0.8 * r) + "Z\"/>";
    default:  // cross
      return "<path " + attributes + " d=\"M" + num(x - r) + " " + num(y - 0.35 * r) + "H" + num(x - 0.35 * r) + "V" +
             num(y - r) + "H" + num(x + 0.35 * r) + "V" + num(y - 0.35 * r) + "H" + num(x + r) + "V" +
             num(y + 0.35 * r) + "H" + num(x + 0.35 * r) + "V" + num(y + r) + "H" + num(x - 0.35 * r) + "V" +
             num(y + 0.35 * r) + "H" + num(x - r) + "Z\"/>";
  }
}

/// "H" with the dimension as a subscript, then `rest` (SVG text content).
inline std::string dimension_label(int k, const std::string& rest) {
  return "H<tspan dy=\"3\" font-size=\"75%\">" + std::to_string(k) + "</tspan><tspan dy=\"-3\">" + rest + "</tspan>";  // rest may begin with a no-break space
}

inline std::string header(double width, double height, const std::string& title) {
  return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"" +
         num(width) + "\" height=\"" + num(height) + "\" viewBox=\"0 0 " + num(width) + " " + num(height) +
         "\" font-family=\"DejaVu Sans, Helvetica, Arial, sans-serif\">\n<title>" + title + "</title>\n" +
         "<rect class=\"background\" x=\"0\" y=\"0\" width=\"" + num(width) + "\" height=\"" + num(height) +
         "\" fill=\"#ffffff\"/>\n";
}

/// The title line, shortened to fit `width`.
inline std::string title_text(const std::string& title, double width, double size) {
  const auto max_chars = static_cast<std::size_t>(std::max(8.0, (width - 20) / (size * 0.62)));
  return xml_text(title, max_chars);
}

}  // namespace svg_detail

/// A persistence diagram as an SVG document (see the top of this header).
inline std::string persistence_diagram_svg(const std::vector<std::vector<diagram_interval>>& diagrams,
                                           const persistence_picture_options& options = {}) {
  using namespace svg_detail;
  check(diagrams);
  const auto range = value_range(diagrams);
  axis_scale scale(range ? range->first : 0, range ? range->second : 1, options.superlevel);
  const double tick_size = 11, plot = 420, top = 96, essential_y = 66;
  // the left margin fits the widest tick label and "never dies"
  double widest = text_width("never dies", tick_size);
  for (const auto& t : scale.ticks()) widest = std::max(widest, text_width(t.label, tick_size));
  const double left = std::max(100.0, widest + 44);
  // the right margin fits half the last tick label, centred on the plot's edge at worst
  const double right = std::max(30.0, widest / 2 + 6), bottom = 64;
  // x tick labels must not overlap: keep every k-th
  std::size_t keep = 1;
  while (keep < scale.ticks().size()) {
    double need = 0;
    for (const auto& t : scale.ticks()) need = std::max(need, text_width(t.label, tick_size) + 8);
    if (need * static_cast<double>(scale.ticks().size()) / static_cast<double>(keep) <= plot * 0.95) break;
    ++keep;
  }
  const double width = left + plot + right, height = top + plot + bottom;
  const std::string title = title_text(options.title, width, 15);
  std::string s = header(width, height, title);
  const auto px = [&](double v) { return left + plot * scale.fraction(v); };
  const auto py = [&](double v) { return top + plot - plot * scale.fraction(v); };
  s += "<text class=\"title\" x=\"" + num(width / 2) + "\" y=\"28\" font-size=\"15\" text-anchor=\"middle\">" + title +
       "</text>\n";
  // the plot area, the region below the diagonal shaded, grid lines and ticks
  s += "<rect class=\"plot\" x=\"" + num(left) + "\" y=\"" + num(top) + "\" width=\"" + num(plot) + "\" height=\"" +
       num(plot) + "\" fill=\"#ffffff\" stroke=\"#444444\" stroke-width=\"1\"/>\n";
  s += "<path class=\"below-diagonal\" d=\"M" + num(left) + " " + num(top + plot) + "L" + num(left + plot) + " " +
       num(top) + "L" + num(left + plot) + " " + num(top + plot) + "Z\" fill=\"#f0f0f0\"/>\n";
  s += "<g class=\"ticks\" stroke=\"#dddddd\" stroke-width=\"1\">\n";
  for (const auto& t : scale.ticks()) {
    s += "<line x1=\"" + num(px(t.value)) + "\" y1=\"" + num(top) + "\" x2=\"" + num(px(t.value)) + "\" y2=\"" +
         num(top + plot) + "\"/>";
    s += "<line x1=\"" + num(left) + "\" y1=\"" + num(py(t.value)) + "\" x2=\"" + num(left + plot) + "\" y2=\"" +
         num(py(t.value)) + "\"/>\n";
  }
  s += "</g>\n<g class=\"tick-marks\" stroke=\"#444444\" stroke-width=\"1\">\n";
  for (const auto& t : scale.ticks()) {
    s += "<line x1=\"" + num(px(t.value)) + "\" y1=\"" + num(top + plot) + "\" x2=\"" + num(px(t.value)) + "\" y2=\"" +
         num(top + plot + 5) + "\"/>";
    s += "<line x1=\"" + num(left - 5) + "\" y1=\"" + num(py(t.value)) + "\" x2=\"" + num(left) + "\" y2=\"" +
         num(py(t.value)) + "\"/>\n";
  }
  s += "</g>\n<g class=\"tick-labels\" font-size=\"" + num(tick_size) + "\" fill=\"#222222\">\n";
  for (std::size_t i = 0; i < scale.ticks().size(); ++i) {
    const auto& t = scale.ticks()[i];
    if (i % keep == 0)
      s += "<text x=\"" + num(px(t.value)) + "\" y=\"" + num(top + plot + 18) + "\" text-anchor=\"middle\">" +
           xml_text(t.label) + "</text>";
    s += "<text x=\"" + num(left - 8) + "\" y=\"" + num(py(t.value) + 4) + "\" text-anchor=\"end\">" +
         xml_text(t.label) + "</text>\n";
  }
  s += "</g>\n";
  const std::string direction = options.superlevel ? " (decreasing)" : "";
  s += "<text class=\"axis-title\" x=\"" + num(left + plot / 2) + "\" y=\"" + num(top + plot + 44) +
       "\" font-size=\"13\" text-anchor=\"middle\">birth" + direction + "</text>\n";
  s += "<text class=\"axis-title\" x=\"16\" y=\"" + num(top + plot / 2) + "\" font-size=\"13\" text-anchor=\"middle\" " +
       "transform=\"rotate(-90 16 " + num(top + plot / 2) + ")\">death" + direction + "</text>\n";
  // the diagonal, and the line of classes that never die
  s += "<line class=\"diagonal\" x1=\"" + num(left) + "\" y1=\"" + num(top + plot) + "\" x2=\"" + num(left + plot) +
       "\" y2=\"" + num(top) + "\" stroke=\"#888888\" stroke-width=\"1\"/>\n";
  s += "<line class=\"never-dies\" x1=\"" + num(left) + "\" y1=\"" + num(essential_y) + "\" x2=\"" + num(left + plot) +
       "\" y2=\"" + num(essential_y) + "\" stroke=\"#888888\" stroke-width=\"1\" stroke-dasharray=\"4 3\"/>\n";
  s += "<text class=\"never-dies-label\" x=\"" + num(left - 8) + "\" y=\"" + num(essential_y + 4) + "\" font-size=\"" +
       num(tick_size) + "\" text-anchor=\"end\" fill=\"#222222\">never dies</text>\n";
  // the marks, one group per dimension
  const double r = 4.2;
  for (std::size_t k = 0; k < diagrams.size(); ++k) {
    const int dim = options.first_dimension + static_cast<int>(k);
    s += "<g class=\"dimension\" data-dimension=\"" + std::to_string(dim) + "\" fill=\"" + colour(dim) +
         "\" fill-opacity=\"0.6\" stroke=\"" + colour(dim) + "\" stroke-width=\"1\">\n";
    for (const auto& x : diagrams[k]) {
      const bool ess = never_dies(x);
      const double cy = ess ? essential_y : py(*x.second);
      s += mark(dim, px(x.first), cy, r,
                std::string("class=\"mark") + (ess ? " essential" : "") + "\" data-dimension=\"" + std::to_string(dim) +
                    "\"") +
           "\n";
    }
    s += "</g>\n";
  }
  // the legend, in the empty corner below the diagonal
  const double row = 18;
  const double legend_h = row * static_cast<double>(diagrams.size()) + 8;
  double legend_w = 0;
  for (std::size_t k = 0; k < diagrams.size(); ++k)
    legend_w = std::max(legend_w, text_width("H0 (" + std::to_string(diagrams[k].size()) + ")", 12) + 34);
  const double lx = left + plot - legend_w - 10, ly = top + plot - legend_h - 10;
  if (!diagrams.empty()) {
    s += "<g class=\"legend\" font-size=\"12\" fill=\"#222222\">\n<rect x=\"" + num(lx) + "\" y=\"" + num(ly) +
         "\" width=\"" + num(legend_w) + "\" height=\"" + num(legend_h) +
         "\" fill=\"#ffffff\" fill-opacity=\"0.85\" stroke=\"#bbbbbb\"/>\n";
    for (std::size_t k = 0; k < diagrams.size(); ++k) {
      const int dim = options.first_dimension + static_cast<int>(k);
      const double y = ly + 4 + row * (static_cast<double>(k) + 0.5);
      s += mark(dim, lx + 14, y, r,
                std::string("class=\"legend-mark\" fill=\"") + colour(dim) + "\" fill-opacity=\"0.6\" stroke=\"" +
                    colour(dim) + "\"");
      s += "<text x=\"" + num(lx + 26) + "\" y=\"" + num(y + 4) + "\">" +
           dimension_label(dim, "\xC2\xA0(" + std::to_string(diagrams[k].size()) + ")") + "</text>\n";
    }
    s += "</g>\n";
  }
  s += "</svg>\n";
  return s;
}

/// A barcode as an SVG document (see the top of this header).
inline std::string barcode_svg(const std::vector<std::vector<diagram_interval>>& diagrams,
                               const persistence_picture_options& options = {}) {
  using namespace svg_detail;
  check(diagrams);
  const auto range = value_range(diagrams);
  axis_scale scale(range ? range->first : 0, range ? range->second : 1, options.superlevel);
  const double tick_size = 11, plot_w = 520, top = 56, gap = 16, arrow = 12;
  std::size_t total = 0;
  for (const auto& d : diagrams) total += std::max<std::size_t>(d.size(), 1);  // an empty group keeps one row
  // the bars' pitch: 8 px while the bars fit in 800 px, less beyond (bars then overlap)
  const double bars_h = std::clamp(8.0 * static_cast<double>(total), 16.0, 800.0);
  const double pitch = bars_h / static_cast<double>(std::max<std::size_t>(total, 1));
  const double thickness = std::max(pitch * 0.7, 0.6);
  double widest = 0;
  for (const auto& t : scale.ticks()) widest = std::max(widest, text_width(t.label, tick_size));
  const double left = std::max(72.0, widest / 2 + 6), right = std::max(40.0, widest / 2 + 6);
  const double groups_h = bars_h + gap * static_cast<double>(diagrams.empty() ? 0 : diagrams.size() - 1);
  const double axis_y = top + groups_h + 10;
  const double width = left + plot_w + right, height = axis_y + 58;
  std::size_t keep = 1;
  while (keep < scale.ticks().size()) {
    double need = 0;
    for (const auto& t : scale.ticks()) need = std::max(need, text_width(t.label, tick_size) + 8);
    if (need * static_cast<double>(scale.ticks().size()) / static_cast<double>(keep) <= plot_w * 0.95) break;
    ++keep;
  }
  const std::string title = title_text(options.title, width, 15);
  std::string s = header(width, height, title);
  const auto px = [&](double v) { return left + plot_w * scale.fraction(v); };
  s += "<text class=\"title\" x=\"" + num(width / 2) + "\" y=\"28\" font-size=\"15\" text-anchor=\"middle\">" + title +
       "</text>\n";
  // grid lines through the bars, the axis, ticks and labels
  s += "<g class=\"ticks\" stroke=\"#e4e4e4\" stroke-width=\"1\">\n";
  for (const auto& t : scale.ticks())
    s += "<line x1=\"" + num(px(t.value)) + "\" y1=\"" + num(top - 6) + "\" x2=\"" + num(px(t.value)) + "\" y2=\"" +
         num(axis_y) + "\"/>\n";
  s += "</g>\n<line class=\"axis\" x1=\"" + num(left) + "\" y1=\"" + num(axis_y) + "\" x2=\"" + num(left + plot_w) +
       "\" y2=\"" + num(axis_y) + "\" stroke=\"#444444\" stroke-width=\"1\"/>\n";
  s += "<g class=\"tick-marks\" stroke=\"#444444\" stroke-width=\"1\">\n";
  for (const auto& t : scale.ticks())
    s += "<line x1=\"" + num(px(t.value)) + "\" y1=\"" + num(axis_y) + "\" x2=\"" + num(px(t.value)) + "\" y2=\"" +
         num(axis_y + 5) + "\"/>\n";
  s += "</g>\n<g class=\"tick-labels\" font-size=\"" + num(tick_size) + "\" fill=\"#222222\" text-anchor=\"middle\">\n";
  for (std::size_t i = 0; i < scale.ticks().size(); i += keep)
    s += "<text x=\"" + num(px(scale.ticks()[i].value)) + "\" y=\"" + num(axis_y + 18) + "\">" +
         xml_text(scale.ticks()[i].label) + "</text>\n";
  s += "</g>\n<text class=\"axis-title\" x=\"" + num(left + plot_w / 2) + "\" y=\"" + num(axis_y + 42) +
       "\" font-size=\"13\" text-anchor=\"middle\">filtration value" +
       (options.superlevel ? std::string(" (decreasing)") : std::string()) + "</text>\n";
  bool any_essential = false;
  // the bars, one group per dimension
  double y = top;
  for (std::size_t k = 0; k < diagrams.size(); ++k) {
    const int dim = options.first_dimension + static_cast<int>(k);
    const auto& d = diagrams[k];
    const double group_h = pitch * static_cast<double>(std::max<std::size_t>(d.size(), 1));
    s += "<text class=\"group-label\" x=\"14\" y=\"" + num(y + group_h / 2 + 5) + "\" font-size=\"13\" fill=\"#222222\">" +
         dimension_label(dim, "") + "</text>\n";
    if (d.empty())
      s += "<text class=\"group-empty\" x=\"" + num(left + 4) + "\" y=\"" + num(y + group_h / 2 + 4) +
           "\" font-size=\"11\" fill=\"#777777\">no classes</text>\n";
    s += "<g class=\"dimension\" data-dimension=\"" + std::to_string(dim) + "\" fill=\"" + colour(dim) + "\">\n";
    for (std::size_t i = 0; i < d.size(); ++i) {
      const auto& x = d[i];
      const double cy = y + pitch * (static_cast<double>(i) + 0.5);
      const double y0 = cy - thickness / 2, y1 = cy + thickness / 2;
      const std::string attributes = std::string("class=\"bar") + (never_dies(x) ? " essential" : "") +
                                     "\" data-dimension=\"" + std::to_string(dim) + "\"";
      if (never_dies(x)) {
        any_essential = true;
        // from the birth to the right edge of the axis, then an arrow head beyond it
        const double x0 = px(x.first), xe = left + plot_w, head = std::max(thickness * 1.6, 3.0);
        s += "<path " + attributes + " d=\"M" + num(x0) + " " + num(y0) + "H" + num(xe) + "V" + num(cy - head) + "L" +
             num(xe + arrow) + " " + num(cy) + "L" + num(xe) + " " + num(cy + head) + "V" + num(y1) + "H" + num(x0) +
             "Z\"/>\n";
      } else {
        double x0 = px(x.first), x1 = px(*x.second);
        if (x0 > x1) std::swap(x0, x1);
        if (x1 - x0 < 1) x1 = x0 + 1;  // a bar of no length still shows
        s += "<rect " + attributes + " x=\"" + num(x0) + "\" y=\"" + num(y0) + "\" width=\"" + num(x1 - x0) +
             "\" height=\"" + num(thickness) + "\"/>\n";
      }
    }
    s += "</g>\n";
    y += group_h + gap;
  }
  if (any_essential)
    s += "<text class=\"never-dies-label\" x=\"" + num(left + plot_w + right - 4) + "\" y=\"" + num(axis_y + 42) +
         "\" font-size=\"11\" text-anchor=\"end\" fill=\"#555555\">arrow: never dies</text>\n";
  s += "</svg>\n";
  return s;
}

}  // namespace lacuna::io

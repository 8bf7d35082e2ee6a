// Tests of lacuna/io/persistence_svg.hpp. Each picture is parsed back with expat (Debian's
// libexpat1-dev, an XML parser written apart from lacuna), which checks that it is well-formed
// XML; then the test counts the marks and bars (one per class given, and one `essential` per
// class that never dies), checks every coordinate is a finite number inside the view box,
// every diagram mark lies on or above the diagonal (death after birth in the order of the
// filtration), and the title comes back as given (escaped, not cut). Inputs: ordinary, superlevel,
// negative, all equal, huge (+-1e308), tiny, none at all, and a hostile title.
#include <doctest/doctest.h>

#include <lacuna/io/persistence_svg.hpp>

#include <expat.h>

#include <cmath>
#include <cstddef>
#include <cstdlib>
#include <limits>
#include <map>
#include <optional>
#include <random>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace persistence_svg_test {

using lacuna::io::diagram_interval;
using diagrams = std::vector<std::vector<diagram_interval>>;

struct element {
  std::string name;
  std::map<std::string, std::string> attributes;
  std::string text;  // character data directly inside
  bool has_class(const std::string& c) const {
    const auto it = attributes.find("class");
    if (it == attributes.end()) return false;
    std::istringstream words(it->second);
    for (std::string w; words >> w;)
      if (w == c) return true;
    return false;
  }
};

struct document {
  bool well_formed = false;
  std::string error;
  std::vector<element> elements;
};

/// Parses an SVG document with expat, keeping every element, its attributes and its text.
inline document parse_svg(const std::string& svg) {
  document doc;
  std::vector<std::size_t> open;
  struct state {
    document* doc;
    std::vector<std::size_t>* open;
  } st{&doc, &open};
  XML_Parser p = XML_ParserCreate("UTF-8");
  XML_SetUserData(p, &st);
  XML_SetElementHandler(
      p,
      [](void* data, const XML_Char* name, const XML_Char** attrs) {
        auto* s = static_cast<state*>(data);
        element e;
        e.name = name;
        for (std::size_t i = 0; attrs[i]; i += 2) e.attributes[attrs[i]] = attrs[i + 1];
        s->open->push_back(s->doc->elements.size());
        s->doc->elements.push_back(std::move(e));
      },
      [](void* data, const XML_Char*) { static_cast<state*>(data)->open->pop_back(); });
  XML_SetCharacterDataHandler(p, [](void* data, const XML_Char* text, int len) {
    auto* s = static_cast<state*>(data);
    if (!s->open->empty()) s->doc->elements[s->open->back()].text.append(text, static_cast<std::size_t>(len));
  });
  doc.well_formed = XML_Parse(p, svg.data(), static_cast<int>(svg.size()), 1) == XML_STATUS_OK;
  if (!doc.well_formed) doc.error = XML_ErrorString(XML_GetErrorCode(p));
  XML_ParserFree(p);
  return doc;
}

inline double number(const std::string& s) {
  char* end = nullptr;
  const double v = std::strtod(s.c_str(), &end);
  REQUIRE(end == s.c_str() + s.size());
  return v;
}

/// Every number of a path's d attribute with its axis: 'x' or 'y' (M, L: pairs; H: x; V: y).
inline std::vector<std::pair<char, double>> path_numbers(const std::string& d) {
  std::vector<std::pair<char, double>> out;
  char command = 0;
  int parity = 0;
  std::size_t i = 0;
  while (i < d.size()) {
    const char c = d[i];
    if (c == 'M' || c == 'L' || c == 'H' || c == 'V' || c == 'Z') {
      command = c;
      parity = 0;
      ++i;
      continue;
    }
    if (c == ' ' || c == ',') {
      ++i;
      continue;
    }
    REQUIRE((command == 'M' || command == 'L' || command == 'H' || command == 'V'));
    char* end = nullptr;
    const double v = std::strtod(d.c_str() + i, &end);
    REQUIRE(end != d.c_str() + i);
    i = static_cast<std::size_t>(end - d.c_str());
    const char axis = command == 'H' ? 'x' : command == 'V' ? 'y' : (parity++ % 2 == 0 ? 'x' : 'y');
    out.emplace_back(axis, v);
  }
  return out;
}

struct box {
  double width, height;
};

/// Checks the document's shape: an svg root with a view box, every coordinate finite and inside
/// it, no "nan" or "inf" anywhere. Returns the view box.
inline box check_coordinates(const std::string& svg, const document& doc) {
  REQUIRE(doc.well_formed);
  REQUIRE(!doc.elements.empty());
  CHECK(svg.find("nan") == std::string::npos);
  CHECK(svg.find("inf") == std::string::npos);
  const auto& root = doc.elements.front();
  REQUIRE(root.name == "svg");
  CHECK(root.attributes.at("xmlns") == "http://www.w3.org/2000/svg");
  std::istringstream vb(root.attributes.at("viewBox"));
  double x0 = -1, y0 = -1, w = 0, h = 0;
  vb >> x0 >> y0 >> w >> h;
  CHECK(x0 == 0);
  CHECK(y0 == 0);
  CHECK(w > 0);
  CHECK(h > 0);
  const auto inside = [&](char axis, double v) {
    CHECK(std::isfinite(v));
    CHECK(v >= 0);
    CHECK(v <= (axis == 'x' ? w : h));
  };
  for (const auto& e : doc.elements) {
    for (const auto& [name, value] : e.attributes) {
      if (name == "x" || name == "cx" || name == "x1" || name == "x2") inside('x', number(value));
      if (name == "y" || name == "cy" || name == "y1" || name == "y2") inside('y', number(value));
      if (name == "width") inside('x', number(value));
      if (name == "height") inside('y', number(value));
      if (name == "r") CHECK(number(value) > 0);
      if (name == "d" && e.name == "path")
        for (const auto& [axis, v] : path_numbers(value)) inside(axis, v);
    }
    if (e.name == "rect" && e.attributes.count("width")) {  // the far corner too
      inside('x', number(e.attributes.at("x")) + number(e.attributes.at("width")));
      inside('y', number(e.attributes.at("y")) + number(e.attributes.at("height")));
    }
    if (e.name == "circle") {
      inside('x', number(e.attributes.at("cx")) + number(e.attributes.at("r")));
      inside('y', number(e.attributes.at("cy")) + number(e.attributes.at("r")));
      inside('x', number(e.attributes.at("cx")) - number(e.attributes.at("r")));
      inside('y', number(e.attributes.at("cy")) - number(e.attributes.at("r")));
    }
  }
  return {w, h};
}

inline std::size_t count_class(const document& doc, const std::string& c, std::optional<int> dimension = {}) {
  std::size_t n = 0;
  for (const auto& e : doc.elements)
    if (e.has_class(c) && (!dimension || e.attributes.at("data-dimension") == std::to_string(*dimension))) ++n;
  return n;
}

inline std::size_t classes(const diagrams& d) {
  std::size_t n = 0;
  for (const auto& x : d) n += x.size();
  return n;
}
inline std::size_t never_dying(const diagrams& d) {
  std::size_t n = 0;
  for (const auto& x : d)
    for (const auto& [b, e] : x) n += !e || !std::isfinite(*e);
  return n;
}

/// The centre of a mark (circle, rect, or path: the middle of its numbers' range).
inline std::pair<double, double> centre(const element& e) {
  if (e.name == "circle") return {number(e.attributes.at("cx")), number(e.attributes.at("cy"))};
  if (e.name == "rect")
    return {number(e.attributes.at("x")) + number(e.attributes.at("width")) / 2,
            number(e.attributes.at("y")) + number(e.attributes.at("height")) / 2};
  double lo[2] = {1e300, 1e300}, hi[2] = {-1e300, -1e300};
  for (const auto& [axis, v] : path_numbers(e.attributes.at("d"))) {
    const int k = axis == 'x' ? 0 : 1;
    lo[k] = std::min(lo[k], v);
    hi[k] = std::max(hi[k], v);
  }
  return {(lo[0] + hi[0]) / 2, (lo[1] + hi[1]) / 2};
}

/// All checks of a persistence diagram picture.
inline void check_diagram(const diagrams& d, const lacuna::io::persistence_picture_options& o = {}) {
  const std::string svg = lacuna::io::persistence_diagram_svg(d, o);
  const auto doc = parse_svg(svg);
  INFO(doc.error);
  check_coordinates(svg, doc);
  CHECK(count_class(doc, "mark") == classes(d));
  CHECK(count_class(doc, "essential") == never_dying(d));
  for (std::size_t k = 0; k < d.size(); ++k)
    CHECK(count_class(doc, "mark", o.first_dimension + static_cast<int>(k)) == d[k].size());
  CHECK(count_class(doc, "legend-mark") == d.size());
  // every finite mark on or above the diagonal (its centre, to within rounding to 0.01 px)
  const element* diagonal = nullptr;
  for (const auto& e : doc.elements)
    if (e.has_class("diagonal")) diagonal = &e;
  REQUIRE(diagonal);
  const double ax = number(diagonal->attributes.at("x1")), ay = number(diagonal->attributes.at("y1"));
  const double bx = number(diagonal->attributes.at("x2")), by = number(diagonal->attributes.at("y2"));
  // marks come in the order of the classes, dimension by dimension
  std::vector<const element*> marks;
  for (const auto& e : doc.elements)
    if (e.has_class("mark")) marks.push_back(&e);
  std::size_t m = 0;
  for (const auto& dim : d)
    for (const auto& [b, death] : dim) {
      REQUIRE(m < marks.size());
      const auto& e = *marks[m++];
      if (!death || !std::isfinite(*death)) {
        CHECK(e.has_class("essential"));
        continue;
      }
      const auto [x, y] = centre(e);
      // (b - a) x (p - a) <= 0: p lies on the upper-left side of the line from a (bottom left)
      // to b, to within rounding to 0.01 px, when death comes after birth in the filtration
      const double cross = (bx - ax) * (y - ay) - (by - ay) * (x - ax);
      const bool in_order = o.superlevel ? *death <= b : *death >= b;
      if (in_order)
        CHECK(cross <= 0.05 * std::abs(bx - ax));
      else
        CHECK(cross >= -0.05 * std::abs(bx - ax));
    }
  // the title, as given (up to control characters, which are dropped)
  for (const auto& e : doc.elements)
    if (e.name == "title") CHECK(e.text.size() <= o.title.size() + 3);
}

/// All checks of a barcode picture.
inline void check_barcode(const diagrams& d, const lacuna::io::persistence_picture_options& o = {}) {
  const std::string svg = lacuna::io::barcode_svg(d, o);
  const auto doc = parse_svg(svg);
  INFO(doc.error);
  const auto vb = check_coordinates(svg, doc);
  CHECK(count_class(doc, "bar") == classes(d));
  CHECK(count_class(doc, "essential") == never_dying(d));
  for (std::size_t k = 0; k < d.size(); ++k)
    CHECK(count_class(doc, "bar", o.first_dimension + static_cast<int>(k)) == d[k].size());
  CHECK(count_class(doc, "group-label") == d.size());
  // essential bars end in an arrow beyond the axis; the others end on it or before
  const element* axis = nullptr;
  for (const auto& e : doc.elements)
    if (e.has_class("axis")) axis = &e;
  REQUIRE(axis);
  const double axis_end = number(axis->attributes.at("x2"));
  for (const auto& e : doc.elements) {
    if (!e.has_class("bar")) continue;
    double right = 0;
    if (e.name == "rect")
      right = number(e.attributes.at("x")) + number(e.attributes.at("width"));
    else
      for (const auto& [a, v] : path_numbers(e.attributes.at("d")))
        if (a == 'x') right = std::max(right, v);
    if (e.has_class("essential"))
      CHECK(right > axis_end);
    else
      CHECK(right <= axis_end + 1.01);  // a bar of no length is drawn 1 px long
    CHECK(right <= vb.width);
  }
}

inline const double infinity = std::numeric_limits<double>::infinity();

}  // namespace persistence_svg_test

TEST_CASE("pictures: an ordinary diagram and barcode") {
  using namespace persistence_svg_test;
  // two dimensions, a class that never dies in each, repeated pairs
  const diagrams d = {{{0, 0.5}, {0, 1.25}, {0, 1.25}, {0, std::nullopt}},
                      {{1, 1.4142135623730951}, {0.75, 2}, {1.5, std::nullopt}}};
  check_diagram(d, {.title = "a test"});
  check_barcode(d, {.title = "a test"});
  // the order of the filtration: a later death is higher up
  const auto doc = parse_svg(lacuna::io::persistence_diagram_svg({{{0, 1}, {0, 2}}}));
  std::vector<double> ys;
  for (const auto& e : doc.elements)
    if (e.has_class("mark")) ys.push_back(centre(e).second);
  REQUIRE(ys.size() == 2);
  CHECK(ys[1] < ys[0]);
  // an infinite death is the same as no death
  const diagrams inf_death = {{{0, infinity}}};
  check_diagram(inf_death);
  check_barcode(inf_death);
}

TEST_CASE("pictures: superlevel filtrations run downwards") {
  using namespace persistence_svg_test;
  const diagrams d = {{{255, 10}, {200, 120}, {180, 179}, {255, std::nullopt}}, {{150, 20}, {100, 90}}};
  check_diagram(d, {.title = "superlevel", .superlevel = true});
  check_barcode(d, {.title = "superlevel", .superlevel = true});
  // the larger birth is further left
  const auto doc = parse_svg(lacuna::io::persistence_diagram_svg({{{200, 0}, {100, 0}}}, {.superlevel = true}));
  std::vector<double> xs;
  for (const auto& e : doc.elements)
    if (e.has_class("mark")) xs.push_back(centre(e).first);
  REQUIRE(xs.size() == 2);
  CHECK(xs[0] < xs[1]);
  // a class that never dies in a superlevel filtration may be given a death of -infinity
  check_barcode({{{3, -infinity}}}, {.superlevel = true});
}

TEST_CASE("pictures: awkward values stay inside the picture") {
  using namespace persistence_svg_test;
  const std::vector<diagrams> inputs = {
      {},                                                     // no dimension at all
      {{}, {}, {}},                                           // dimensions without classes
      {{{3, 3}, {3, 3}, {3, std::nullopt}}},                  // all equal, zero persistence
      {{{0, 0}}},                                             // all zero
      {{{-5, -2}, {-7.5, -7}}, {{-3, std::nullopt}}},         // negative
      {{{-1e308, 1e308}, {-1e308, std::nullopt}, {0, 1}}},    // the range overflows when subtracted
      {{{1.7976931348623157e308, 1.7976931348623157e308}}},   // the largest double, alone
      {{{1e-300, 2e-300}, {0, 4.9406564584124654e-324}}},     // tiny
      {{{1e15, 1e15 + 0.5}, {1e15 + 0.25, 1e15 + 1}}},        // far from zero, close together
      {{{0, 1}}, {}, {}, {}, {}, {}, {}, {{2, 3}}},           // eight dimensions: every shape
  };
  for (std::size_t i = 0; i < inputs.size(); ++i) {
    CAPTURE(i);
    check_diagram(inputs[i]);
    check_barcode(inputs[i]);
    check_diagram(inputs[i], {.superlevel = true, .first_dimension = 2});
    check_barcode(inputs[i], {.superlevel = true, .first_dimension = 2});
  }
}

TEST_CASE("pictures: many classes") {
  using namespace persistence_svg_test;
  std::mt19937_64 rng(77);  // fixed seed
  std::uniform_real_distribution<double> u(-100, 100);
  diagrams d(3);
  for (auto& x : d)
    for (int i = 0; i < 700; ++i) {
      const double b = u(rng), e = u(rng);
      x.emplace_back(std::min(b, e), i % 50 == 0 ? std::optional<double>() : std::max(b, e));
    }
  check_diagram(d);
  check_barcode(d);
}

TEST_CASE("pictures: titles are escaped, cleaned and shortened") {
  using namespace persistence_svg_test;
  const std::string hostile = std::string("<b>&amp; \"q\" 'a' \x01\x1F") + '\0' + "\xFF\xC3\x28 \xCE\xB1 ]]> end";
  for (const bool barcode : {false, true}) {
    const auto svg = barcode ? lacuna::io::barcode_svg({{{0, 1}}}, {.title = hostile})
                             : lacuna::io::persistence_diagram_svg({{{0, 1}}}, {.title = hostile});
    const auto doc = parse_svg(svg);
    INFO(doc.error);
    REQUIRE(doc.well_formed);
    // expat gives the text back unescaped: the markup characters as given, control characters
    // and the NUL dropped, the three bytes that are not UTF-8 replaced by U+FFFD, alpha kept
    const std::string expected = "<b>&amp; \"q\" 'a' \xEF\xBF\xBD\xEF\xBF\xBD( \xCE\xB1 ]]> end";
    bool found = false;
    for (const auto& e : doc.elements)
      if (e.has_class("title")) {
        CHECK(e.text == expected);
        found = true;
      }
    CHECK(found);
  }
  // a long title is shortened with an ellipsis
  const auto doc = parse_svg(lacuna::io::persistence_diagram_svg({}, {.title = std::string(500, 'x')}));
  for (const auto& e : doc.elements)
    if (e.has_class("title")) {
      CHECK(e.text.size() < 100);
      CHECK(e.text.substr(e.text.size() - 3) == "\xE2\x80\xA6");
    }
}

TEST_CASE("pictures: bad values are refused") {
  using namespace persistence_svg_test;
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK_THROWS_AS(lacuna::io::persistence_diagram_svg({{{nan, 1}}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::io::barcode_svg({{{0, nan}}}), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::io::barcode_svg({{{infinity, std::nullopt}}}), std::invalid_argument);
}

// lacuna homology --picture OUT.svg: the generators of H_1 drawn on a 2D image. The SVG is
// parsed back with expat (Debian's libexpat1-dev, an XML parser written apart from lacuna),
// and checked against what the test computes on its own from the pixels:
//   * beta_1 by Alexander duality (Hatcher, Algebraic Topology, 2002, Theorem 3.44; from
//     memory): the foreground is a union of closed squares (pixels meeting at a corner are
//     connected, 8-connectivity), so its complement in the plane has 4-connected background
//     components, and beta_1 of the foreground is the number of bounded ones. Exactly that
//     many generators must be drawn, each with its legend entry;
//   * every polyline is closed and runs along edges of the foreground (an edge belongs to the
//     complex when a pixel on either side of it is foreground);
//   * every generator encircles a hole: the centre of some pixel of a bounded background
//     component lies inside one of its polylines (even-odd rule). A generator of H_1 cannot
//     encircle none, for then it would bound in the plane minus no hole, i.e. be zero.
// Also: the printed result is the same with and without --picture; inputs other than 2D images
// and the combinations not offered are refused with status 2 and one line, leaving no file.
#include "run.hpp"

#include <expat.h>

#include <cstdint>
#include <map>
#include <sstream>
#include <string>
#include <vector>

namespace cli_picture_test {

using namespace cli_test;

namespace {

/// An element of the parsed SVG: its name, attributes, text, and the `generator` group it is in.
struct element {
  std::string name;
  std::map<std::string, std::string> attributes;
  std::string text;
  int generator = 0;  // data-generator of the enclosing class="generator" group; 0: none
};

struct svg_document {
  bool well_formed = false;
  std::string error;
  std::vector<element> elements;
};

svg_document parse_svg(const std::string& svg) {
  struct state {
    svg_document doc;
    std::vector<std::size_t> open;  // indices of the open elements
  } st;
  XML_Parser p = XML_ParserCreate("UTF-8");
  XML_SetUserData(p, &st);
  XML_SetElementHandler(
      p,
      [](void* data, const XML_Char* name, const XML_Char** attrs) {
        auto& s = *static_cast<state*>(data);
        element e{name, {}, {}, 0};
        for (std::size_t i = 0; attrs[i]; i += 2) e.attributes[attrs[i]] = attrs[i + 1];
        for (auto it = s.open.rbegin(); it != s.open.rend(); ++it) {
          const auto& a = s.doc.elements[*it].attributes;
          if (a.count("class") && a.at("class") == "generator") {
            e.generator = std::stoi(a.at("data-generator"));
            break;
          }
        }
        s.open.push_back(s.doc.elements.size());
        s.doc.elements.push_back(std::move(e));
      },
      [](void* data, const XML_Char*) { static_cast<state*>(data)->open.pop_back(); });
  XML_SetCharacterDataHandler(p, [](void* data, const XML_Char* text, int len) {
    auto& s = *static_cast<state*>(data);
    if (!s.open.empty()) s.doc.elements[s.open.back()].text.append(text, static_cast<std::size_t>(len));
  });
  st.doc.well_formed = XML_Parse(p, svg.data(), static_cast<int>(svg.size()), 1) == XML_STATUS_OK;
  if (!st.doc.well_formed) st.doc.error = XML_ErrorString(XML_GetErrorCode(p));
  XML_ParserFree(p);
  return std::move(st.doc);
}

/// A binary image, row by row: pixels[y][x] is foreground.
using image = std::vector<std::vector<bool>>;

std::string pbm(const image& im) {
  std::string s = "P1\n" + std::to_string(im[0].size()) + " " + std::to_string(im.size()) + "\n";
  for (const auto& row : im) {
    for (bool b : row) s += b ? "1 " : "0 ";
    s += "\n";
  }
  return s;
}

/// The bounded 4-connected background components: label[y][x] = component number (from 1)
/// for their pixels, 0 elsewhere; and their count.
std::pair<std::vector<std::vector<int>>, int> holes_of(const image& im) {
  const int h = static_cast<int>(im.size()), w = static_cast<int>(im[0].size());
  // a frame of background around the image: its component is the unbounded one
  std::vector<std::vector<int>> comp(static_cast<std::size_t>(h + 2), std::vector<int>(static_cast<std::size_t>(w + 2), -1));
  auto bg = [&](int x, int y) {  // frame coordinates
    return x == 0 || y == 0 || x == w + 1 || y == h + 1 || !im[static_cast<std::size_t>(y - 1)][static_cast<std::size_t>(x - 1)];
  };
  int count = 0;
  for (int y0 = 0; y0 < h + 2; ++y0)
    for (int x0 = 0; x0 < w + 2; ++x0) {
      if (!bg(x0, y0) || comp[static_cast<std::size_t>(y0)][static_cast<std::size_t>(x0)] != -1) continue;
      const int id = (x0 == 0 && y0 == 0) ? 0 : ++count;  // (0, 0) is on the frame: found first
      std::vector<std::pair<int, int>> stack{{x0, y0}};
      comp[static_cast<std::size_t>(y0)][static_cast<std::size_t>(x0)] = id;
      while (!stack.empty()) {
        const auto [x, y] = stack.back();
        stack.pop_back();
        const int d[4][2] = {{1, 0}, {-1, 0}, {0, 1}, {0, -1}};
        for (const auto& dd : d) {
          const int u = x + dd[0], v = y + dd[1];
          if (u < 0 || v < 0 || u > w + 1 || v > h + 1 || !bg(u, v)) continue;
          auto& c = comp[static_cast<std::size_t>(v)][static_cast<std::size_t>(u)];
          if (c != -1) continue;
          c = id;
          stack.push_back({u, v});
        }
      }
    }
  std::vector<std::vector<int>> label(static_cast<std::size_t>(h), std::vector<int>(static_cast<std::size_t>(w), 0));
  for (int y = 0; y < h; ++y)
    for (int x = 0; x < w; ++x) {
      const int c = comp[static_cast<std::size_t>(y + 1)][static_cast<std::size_t>(x + 1)];
      label[static_cast<std::size_t>(y)][static_cast<std::size_t>(x)] = c > 0 ? c : 0;
    }
  return {label, count};
}

using point = std::pair<long, long>;

std::vector<point> points_of(const std::string& text) {
  std::vector<point> out;
  std::istringstream in(text);
  for (std::string pair; in >> pair;) {
    const auto comma = pair.find(',');
    REQUIRE(comma != std::string::npos);
    out.push_back({std::stol(pair.substr(0, comma)), std::stol(pair.substr(comma + 1))});
  }
  return out;
}

bool foreground(const image& im, long x, long y) {
  return x >= 0 && y >= 0 && y < static_cast<long>(im.size()) && x < static_cast<long>(im[0].size()) &&
         im[static_cast<std::size_t>(y)][static_cast<std::size_t>(x)];
}

/// The unit edge from (x, y) one step along (dx, dy) is an edge of the cubical complex: a pixel
/// on either side of it is foreground.
bool is_edge(const image& im, long x, long y, long dx, long dy) {
  const long ex = std::min(x, x + dx), ey = std::min(y, y + dy);
  if (dy == 0) return foreground(im, ex, ey - 1) || foreground(im, ex, ey);  // horizontal
  return foreground(im, ex - 1, ey) || foreground(im, ex, ey);               // vertical
}

/// Even-odd rule: (px, py) (not on the polygon: a pixel centre) is inside the closed polyline.
bool inside(const std::vector<point>& poly, double px, double py) {
  bool in = false;
  for (std::size_t i = 0; i + 1 < poly.size(); ++i) {
    const double x1 = static_cast<double>(poly[i].first), y1 = static_cast<double>(poly[i].second);
    const double x2 = static_cast<double>(poly[i + 1].first), y2 = static_cast<double>(poly[i + 1].second);
    if ((y1 > py) != (y2 > py) && px < x1 + (py - y1) * (x2 - x1) / (y2 - y1)) in = !in;
  }
  return in;
}

/// Runs --picture on `im` with `extra` options and checks the picture against the pixels;
/// returns beta_1 as the test computed it.
int check_picture(const image& im, const std::vector<std::string>& extra = {}) {
  temp_dir dir;
  const std::string file = dir.write("image.pbm", pbm(im));
  const std::string out = (dir.path() / "cycles.svg").string();
  std::vector<std::string> args{"homology", "--quiet"};
  args.insert(args.end(), extra.begin(), extra.end());
  std::vector<std::string> plain = args;
  plain.push_back(file);
  args.insert(args.end(), {"--picture", out, file});
  const auto r = run(args);
  INFO(r.err);
  REQUIRE(r.status == 0);
  // the rest of the output is that of the run without --picture
  CHECK(r.out == run(plain).out);
  CHECK(!std::filesystem::exists(out + ".part"));
  const auto doc = parse_svg(slurp(out));
  INFO(doc.error);
  REQUIRE(doc.well_formed);
  const auto [label, beta1] = holes_of(im);
  CAPTURE(beta1);
  std::map<int, std::vector<std::vector<point>>> cycles;  // generator -> its polylines
  std::map<int, std::string> legend;  // generator -> its legend text
  int entries = 0;
  for (const auto& e : doc.elements) {
    if (e.name == "polyline" && e.attributes.count("class") && e.attributes.at("class") == "cycle") {
      REQUIRE(e.generator > 0);
      cycles[e.generator].push_back(points_of(e.attributes.at("points")));
    }
    if (e.name == "g" && e.attributes.count("class") && e.attributes.at("class") == "legend-entry")
      ++entries;
    if (e.name == "text" && e.text.rfind("H_1 generator ", 0) == 0) legend[std::stoi(e.text.substr(14))] = e.text;
  }
  CHECK(static_cast<int>(cycles.size()) == beta1);
  CHECK(static_cast<int>(legend.size()) == beta1);
  CHECK(entries == beta1);
  for (int k = 1; k <= beta1; ++k) {
    CAPTURE(k);
    CHECK(cycles.count(k) == 1);
    CHECK(legend[k] == "H_1 generator " + std::to_string(k));
    bool encircles = false;
    for (const auto& poly : cycles[k]) {
      REQUIRE(poly.size() >= 5);  // a closed walk on the grid has at least 4 edges
      CHECK(poly.front() == poly.back());
      for (std::size_t i = 0; i + 1 < poly.size(); ++i) {
        const long dx = poly[i + 1].first - poly[i].first, dy = poly[i + 1].second - poly[i].second;
        REQUIRE(((dx == 0) != (dy == 0)));  // along one axis, not a point
        const long n = std::max(std::labs(dx), std::labs(dy)), sx = dx / n, sy = dy / n;
        for (long t = 0; t < n; ++t)
          CHECK(is_edge(im, poly[i].first + t * sx, poly[i].second + t * sy, sx, sy));
      }
      for (std::size_t y = 0; y < im.size() && !encircles; ++y)
        for (std::size_t x = 0; x < im[0].size() && !encircles; ++x)
          if (label[y][x] > 0 && inside(poly, static_cast<double>(x) + 0.5, static_cast<double>(y) + 0.5)) encircles = true;
    }
    CHECK(encircles);
  }
  return beta1;
}

image from_rows(const std::vector<std::string>& rows) {
  image im;
  for (const auto& r : rows) {
    im.emplace_back();
    for (char c : r) im.back().push_back(c == '#');
  }
  return im;
}

}  // namespace

TEST_CASE("--picture: two rings, a ring closed only at corners, and no hole at all") {
  CHECK(check_picture(from_rows({"..........", ".####.###.", ".#..#.#.#.", ".####.###.", ".........."})) == 2);
  // the background pixel in the middle touches the foreground on all four sides; the pixels
  // around it meet only at corners, which closed squares share (a loop through 4 corners)
  CHECK(check_picture(from_rows({".#.", "#.#", ".#."})) == 1);
  check_picture(from_rows({"###", "###"}));
  check_picture(from_rows({"...", "..."}));  // no foreground: the empty complex
}

TEST_CASE("--picture: random images, with generators and JSON, over Z, Q and Z/2") {
  std::uint64_t state = 16;
  int holes = 0;
  for (int round = 0; round < 8; ++round) {
    const std::size_t w = 6 + static_cast<std::size_t>(round) * 3, h = 5 + static_cast<std::size_t>(round) * 2;
    image im(h, std::vector<bool>(w));
    for (auto& row : im)
      for (std::size_t x = 0; x < w; ++x) {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        row[x] = (state >> 33) % 100 < 62;
      }
    CAPTURE(round);
    const char* coefficients[] = {"Z", "Q", "Z/2"};
    holes += check_picture(im, {"--coefficients", coefficients[round % 3]});
    if (round % 2 == 0) check_picture(im, {"--generators", "--json"});
  }
  CHECK(holes >= 8);  // the images do have holes, so the checks above are not vacuous
}

TEST_CASE("--picture: more generators than colours (dashes) stay distinct entries") {
  // 3 x 3 rings side by side: 9 generators, more than the six colours
  std::vector<std::string> rows(10, std::string(13, '.'));
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int y = 0; y < 3; ++y)
        for (int x = 0; x < 3; ++x)
          if (x != 1 || y != 1) rows[static_cast<std::size_t>(1 + 3 * i + y)][static_cast<std::size_t>(1 + 4 * j + x)] = '#';
  CHECK(check_picture(from_rows(rows)) == 9);
}

TEST_CASE("--picture refuses what it cannot draw, with status 2, one line and no file") {
  temp_dir dir;
  const std::string img = dir.write("ring.pbm", "P1\n3 3\n1 1 1\n1 0 1\n1 1 1\n");
  const std::string facets = dir.write("circle.facets", "a b\nb c\nc a\n");
  const std::string out = (dir.path() / "x.svg").string();
  auto refused = [&](const std::vector<std::string>& args, const std::string& words) {
    const auto line = expect_error(run(args));
    CAPTURE(line);
    CHECK(line.find(words) != std::string::npos);
    CHECK(!std::filesystem::exists(out));
    CHECK(!std::filesystem::exists(out + ".part"));
  };
  refused({"homology", "--picture", out, facets}, "2D images");
  refused({"homology", "--picture", out, "--coefficients", "Z/3", img}, "not over Z/3");
  refused({"homology", "--picture", out, "--certificate", (dir.path() / "c.json").string(), img}, "--certificate");
  refused({"homology", "--picture", out, "--relative", facets, facets}, "2D images");
  refused({"homology", "--picture", (dir.path() / "no" / "such" / "dir.svg").string(), img}, "cannot be written");
  refused({"homology", "--picture", out, (dir.path() / "missing.pbm").string()}, "no such file");
}

}  // namespace cli_picture_test

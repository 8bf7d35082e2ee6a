// Runs examples/sensor_coverage.cpp (docs/demo-coverage.md) and checks its verdicts against the
// discs themselves, sampled in the plane, independently of the homology the program computes:
//   * the full field is declared covered, and indeed every sample point of the floor lies in
//     some sensor's disc (what the criterion of de Silva & Ghrist, 2007, promises under its
//     hypotheses, which the program states);
//   * the field with sensors removed is not certified and has 2 holes (two regions emptied
//     of sensors, each wider than twice the covering radius), and each hole drawn is a cycle
//     (every end of its segments is met an even number of times) that surrounds a sample point
//     outside every disc (even-odd rule: a point inside a mod-2 cycle of segments is crossed by
//     a ray from it an odd number of times).
// Both maps are parsed with expat (Debian's libexpat1-dev), which checks they are well-formed.
#include <doctest/doctest.h>

#include "run_program.hpp"

#include <expat.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

namespace examples_sensor_coverage_test {

namespace {

struct svg_element {
  std::string name;
  std::map<std::string, std::string> attributes;
};

/// The elements of an SVG file, or nothing (and a failed check) when it is not well-formed XML.
std::vector<svg_element> parse(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  std::stringstream ss;
  ss << f.rdbuf();
  const std::string svg = ss.str();
  std::vector<svg_element> out;
  XML_Parser p = XML_ParserCreate("UTF-8");
  XML_SetUserData(p, &out);
  XML_SetElementHandler(
      p,
      [](void* data, const XML_Char* name, const XML_Char** attrs) {
        svg_element e{name, {}};
        for (std::size_t i = 0; attrs[i]; i += 2) e.attributes[attrs[i]] = attrs[i + 1];
        static_cast<std::vector<svg_element>*>(data)->push_back(std::move(e));
      },
      [](void*, const XML_Char*) {});
  const bool ok = XML_Parse(p, svg.data(), static_cast<int>(svg.size()), 1) == XML_STATUS_OK;
  INFO(path << ": " << XML_ErrorString(XML_GetErrorCode(p)));
  CHECK(ok);
  XML_ParserFree(p);
  return out;
}

struct disc {
  double x, y, r;
};
struct segment {
  double x1, y1, x2, y2;
};

/// The segments of a path written as "Mx yLx y" repeated.
std::vector<segment> segments_of(const std::string& d) {
  std::vector<segment> out;
  std::string t = d;
  for (auto& c : t)
    if (c == 'M' || c == 'L') c = ' ';
  std::istringstream in(t);
  for (segment s; in >> s.x1 >> s.y1 >> s.x2 >> s.y2;) out.push_back(s);
  return out;
}

struct field_map {
  std::vector<disc> discs;
  std::vector<std::vector<segment>> holes;
  double x0 = 1e300, y0 = 1e300, x1 = -1e300, y1 = -1e300;  // the sensors' bounding box: the floor
};

field_map read_map(const std::string& path) {
  field_map m;
  for (const auto& e : parse(path)) {
    const auto cls = e.attributes.count("class") ? e.attributes.at("class") : std::string();
    if (e.name == "circle" && cls == "disc")
      m.discs.push_back({std::stod(e.attributes.at("cx")), std::stod(e.attributes.at("cy")), std::stod(e.attributes.at("r"))});
    if (e.name == "path" && cls == "hole") m.holes.push_back(segments_of(e.attributes.at("d")));
  }
  for (const auto& d : m.discs) {
    m.x0 = std::min(m.x0, d.x), m.y0 = std::min(m.y0, d.y), m.x1 = std::max(m.x1, d.x), m.y1 = std::max(m.y1, d.y);
  }
  return m;
}

bool covered(const field_map& m, double x, double y) {
  for (const auto& d : m.discs)
    if ((x - d.x) * (x - d.x) + (y - d.y) * (y - d.y) <= d.r * d.r) return true;
  return false;
}

/// The sample points of the floor outside every disc (a grid of step `step`).
std::vector<std::pair<double, double>> uncovered(const field_map& m, double step) {
  std::vector<std::pair<double, double>> out;
  for (double y = m.y0 + step / 2; y < m.y1; y += step)
    for (double x = m.x0 + step / 2; x < m.x1; x += step)
      if (!covered(m, x, y)) out.push_back({x, y});
  return out;
}

bool surrounds(const std::vector<segment>& cycle, double px, double py) {
  bool in = false;
  for (const auto& s : cycle)
    if ((s.y1 > py) != (s.y2 > py) && px < s.x1 + (py - s.y1) * (s.x2 - s.x1) / (s.y2 - s.y1)) in = !in;
  return in;
}

}  // namespace

TEST_CASE("examples/sensor_coverage: verdicts checked against the discs, sampled in the plane") {
  // a folder of this process's own, so that two runs at once do not share the maps
  const auto dir = std::filesystem::temp_directory_path() / ("lacuna-sensor-coverage-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const auto run = examples_support::run_program("sensor_coverage " + dir.string(), false);
  const std::string& text = run.text;
  INFO(text);
  REQUIRE(run.status == 0);
  const auto full_at = text.find("full field:"), gaps_at = text.find("field with sensors removed:");
  REQUIRE(full_at != std::string::npos);
  REQUIRE(gaps_at != std::string::npos);
  const std::string full = text.substr(full_at, gaps_at - full_at), gaps = text.substr(gaps_at);
  CHECK(full.find("verdict: covered") != std::string::npos);
  CHECK(full.find("holes: 0\n") != std::string::npos);
  CHECK(gaps.find("verdict: coverage not certified") != std::string::npos);
  CHECK(gaps.find("holes: 2\n") != std::string::npos);
  CHECK(text.find("r_b / sqrt(3)") != std::string::npos);  // the hypotheses are stated

  const auto full_map = read_map((dir / "coverage_full.svg").string());
  REQUIRE(full_map.discs.size() > 100);
  CHECK(full_map.holes.empty());
  CHECK(uncovered(full_map, 2.0).empty());  // 2 SVG units: 1/30 of the broadcast radius

  const auto gaps_map = read_map((dir / "coverage_gaps.svg").string());
  const auto open_points = uncovered(gaps_map, 2.0);
  CHECK(!open_points.empty());
  REQUIRE(gaps_map.holes.size() == 2);
  for (std::size_t h = 0; h < gaps_map.holes.size(); ++h) {
    CAPTURE(h);
    const auto& cycle = gaps_map.holes[h];
    std::map<std::pair<double, double>, int> ends;
    for (const auto& s : cycle) ++ends[{s.x1, s.y1}], ++ends[{s.x2, s.y2}];
    for (const auto& [p, n] : ends) CHECK(n % 2 == 0);
    bool around_open = false;
    for (const auto& [x, y] : open_points) around_open = around_open || surrounds(cycle, x, y);
    CHECK(around_open);
  }
  std::filesystem::remove_all(dir);
}

}  // namespace examples_sensor_coverage_test

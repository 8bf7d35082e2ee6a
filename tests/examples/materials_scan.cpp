// Runs examples/materials_scan.cpp (the README's first command) at small sizes into a temporary
// directory and checks what it prints and writes against truths computed here, apart from the
// library, from the volume it wrote (materials_scan.nrrd, read back by hand):
//   * H_0 = the number of 26-connected components of the solid voxels (closed unit cubes that
//     share a corner are connected);
//   * H_2 = the number of 6-connected components of the pore voxels that do not touch the
//     scan's faces (Alexander duality, Hatcher 2002, Theorem 3.44; for digital pictures with the
//     26/6 connectivity pair, Toriwaki & Yonekura 2002 — both from memory);
//   * chi = vertices - edges + squares - cubes of the union of the closed solid voxels, counted
//     here by marking the doubled grid, equals the printed b_0 - b_1 + b_2 and the printed
//     local-configuration Euler number (Euler-Poincare formula);
//   * every reported sealed-void box contains a sealed void found by the flood fill, and every
//     sealed void lies in some box;
//   * the slice picture is well-formed XML (parsed with expat) and marks exactly H_2 voids.
#include <doctest/doctest.h>

#include "run_program.hpp"

#include <expat.h>

#include <array>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <map>
#include <regex>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include <sys/wait.h>
#include <unistd.h>

namespace examples_materials_scan_test {

namespace {

examples_support::run_result run_scan(const std::string& arguments) {
  return examples_support::run_program("materials_scan " + arguments, true);
}

long long number_after(const std::string& text, const std::string& pattern) {
  std::smatch m;
  REQUIRE_MESSAGE(std::regex_search(text, m, std::regex(pattern)), "no match for " << pattern);
  return std::stoll(m[1].str());
}

/// A raw uint8 NRRD of three axes, read by hand (the writer's own header: type, dimension,
/// sizes, encoding raw, then an empty line).
struct scan_volume {
  std::size_t n = 0;
  std::vector<std::uint8_t> solid;
  bool at(long x, long y, long z) const {
    const long m = static_cast<long>(n);
    if (x < 0 || y < 0 || z < 0 || x >= m || y >= m || z >= m) return false;
    return solid[static_cast<std::size_t>(x + m * (y + m * z))] != 0;
  }
};

scan_volume read_volume(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  REQUIRE(in);
  std::string line;
  std::array<std::size_t, 3> sizes{};
  bool raw = false, uint8 = false;
  while (std::getline(in, line) && !line.empty()) {
    if (line.rfind("sizes:", 0) == 0) {
      std::istringstream s(line.substr(6));
      s >> sizes[0] >> sizes[1] >> sizes[2];
    }
    if (line == "encoding: raw") raw = true;
    if (line == "type: uint8" || line == "type: unsigned char" || line == "type: uchar") uint8 = true;
  }
  REQUIRE(raw);
  REQUIRE(uint8);
  REQUIRE(sizes[0] == sizes[1]);
  REQUIRE(sizes[1] == sizes[2]);
  scan_volume v{sizes[0], {}};
  v.solid.assign(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  REQUIRE(v.solid.size() == v.n * v.n * v.n);
  return v;
}

struct flood_counts {
  std::size_t solid_components = 0;
  std::vector<std::vector<std::array<long, 3>>> sealed;  // voxels of each sealed pore component
};

/// Solid components by 26-neighbours, pore components by 6-neighbours; a pore component is
/// sealed when none of its voxels lies on a face of the scan.
flood_counts flood(const scan_volume& v) {
  const long n = static_cast<long>(v.n);
  std::vector<std::uint8_t> seen(v.solid.size(), 0);
  flood_counts c;
  std::vector<std::array<long, 3>> stack, members;
  for (long z0 = 0; z0 < n; ++z0)
    for (long y0 = 0; y0 < n; ++y0)
      for (long x0 = 0; x0 < n; ++x0) {
        const auto i0 = static_cast<std::size_t>(x0 + n * (y0 + n * z0));
        if (seen[i0]) continue;
        const bool solid = v.solid[i0] != 0;
        seen[i0] = 1;
        stack = {{x0, y0, z0}};
        members.clear();
        bool touches_face = false;
        while (!stack.empty()) {
          const auto p = stack.back();
          stack.pop_back();
          members.push_back(p);
          for (long a : p)
            if (a == 0 || a == n - 1) touches_face = true;
          for (long dz = -1; dz <= 1; ++dz)
            for (long dy = -1; dy <= 1; ++dy)
              for (long dx = -1; dx <= 1; ++dx) {
                const int moved = (dx != 0) + (dy != 0) + (dz != 0);
                if (moved == 0 || (!solid && moved != 1)) continue;
                const long x = p[0] + dx, y = p[1] + dy, z = p[2] + dz;
                if (x < 0 || y < 0 || z < 0 || x >= n || y >= n || z >= n) continue;
                const auto i = static_cast<std::size_t>(x + n * (y + n * z));
                if (seen[i] || (v.solid[i] != 0) != solid) continue;
                seen[i] = 1;
                stack.push_back({x, y, z});
              }
        }
        if (solid)
          ++c.solid_components;
        else if (!touches_face)
          c.sealed.push_back(members);
      }
  return c;
}

/// chi of the union of the closed solid voxels: mark every cell of every solid voxel's closed
/// cube in the doubled grid (cell dimension = number of odd coordinates), then add up signs.
long long euler_characteristic(const scan_volume& v) {
  const std::size_t g = 2 * v.n + 1;
  std::vector<std::uint8_t> cell(g * g * g, 0);
  for (std::size_t z = 0; z < v.n; ++z)
    for (std::size_t y = 0; y < v.n; ++y)
      for (std::size_t x = 0; x < v.n; ++x)
        if (v.solid[x + v.n * (y + v.n * z)])
          for (std::size_t c = 2 * z; c <= 2 * z + 2; ++c)
            for (std::size_t b = 2 * y; b <= 2 * y + 2; ++b)
              for (std::size_t a = 2 * x; a <= 2 * x + 2; ++a) cell[a + g * (b + g * c)] = 1;
  long long chi = 0;
  for (std::size_t c = 0; c < g; ++c)
    for (std::size_t b = 0; b < g; ++b)
      for (std::size_t a = 0; a < g; ++a)
        if (cell[a + g * (b + g * c)]) chi += ((a % 2) + (b % 2) + (c % 2)) % 2 == 0 ? 1 : -1;
  return chi;
}

struct reported_box {
  std::array<long, 3> lo{}, hi{};
  bool holds(const std::vector<std::array<long, 3>>& voxels) const {
    for (const auto& p : voxels)
      for (std::size_t a = 0; a < 3; ++a)
        if (p[a] < lo[a] || p[a] > hi[a]) return false;
    return true;
  }
};

std::vector<reported_box> reported_boxes(const std::string& text) {
  std::vector<reported_box> boxes;
  const std::regex line(R"(\n  V(\d+): x (\d+)\.\.(\d+), y (\d+)\.\.(\d+), z (\d+)\.\.(\d+))");
  for (auto it = std::sregex_iterator(text.begin(), text.end(), line); it != std::sregex_iterator(); ++it) {
    const auto& m = *it;
    CHECK(std::stoul(m[1].str()) == boxes.size() + 1);
    reported_box b;
    for (std::size_t a = 0; a < 3; ++a) {
      b.lo[a] = std::stol(m[2 + 2 * a].str());
      b.hi[a] = std::stol(m[3 + 2 * a].str());
    }
    boxes.push_back(b);
  }
  return boxes;
}

/// Well-formedness by expat, and the sealed-void marks: <g class="void ..." data-void="i">.
struct svg_marks {
  bool well_formed = false;
  std::string error;
  std::size_t projection_marks = 0;
  std::set<std::string> ids;
};

svg_marks read_svg(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  REQUIRE(in);
  const std::string svg((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  svg_marks marks;
  XML_Parser p = XML_ParserCreate("UTF-8");
  XML_SetUserData(p, &marks);
  XML_SetStartElementHandler(p, [](void* data, const XML_Char* name, const XML_Char** attrs) {
    auto& m = *static_cast<svg_marks*>(data);
    if (std::string(name) != "g") return;
    std::string cls, id;
    for (int i = 0; attrs[i] != nullptr; i += 2) {
      if (std::string(attrs[i]) == "class") cls = attrs[i + 1];
      if (std::string(attrs[i]) == "data-void") id = attrs[i + 1];
    }
    if (cls.rfind("void", 0) != 0) return;
    m.ids.insert(id);
    if (cls == "void projection") ++m.projection_marks;
  });
  marks.well_formed = XML_Parse(p, svg.data(), static_cast<int>(svg.size()), 1) == XML_STATUS_OK;
  if (!marks.well_formed) marks.error = XML_ErrorString(XML_GetErrorCode(p));
  XML_ParserFree(p);
  return marks;
}

void check_size(std::size_t n) {
  CAPTURE(n);
  const auto dir = std::filesystem::temp_directory_path() /
                   ("lacuna_materials_scan_" + std::to_string(n) + "_" + std::to_string(::getpid()));
  std::filesystem::remove_all(dir);
  const auto r = run_scan("--size " + std::to_string(n) + " --output " + dir.string());
  INFO(r.text);
  REQUIRE(r.status == 0);
  CHECK(r.text.find("all checks passed") != std::string::npos);
  CHECK(r.text.find("FAIL") == std::string::npos);

  const long long b0 = number_after(r.text, R"(H_0 = Z\^(\d+))");
  const long long b1 = number_after(r.text, R"(H_1 = Z\^(\d+))");
  const long long b2 = number_after(r.text, R"(H_2 = Z\^(\d+))");
  const long long chi_printed = number_after(r.text, R"(b_0 - b_1 \+ b_2 = (-?\d+))");
  const long long chi_local = number_after(r.text, R"(Toriwaki & Yonekura 2002\) = (-?\d+))");

  const auto volume = read_volume(dir / "materials_scan.nrrd");
  CHECK(volume.n == n);
  const auto truth = flood(volume);
  const long long chi = euler_characteristic(volume);
  CHECK(b0 == static_cast<long long>(truth.solid_components));  // 26-connected pieces
  CHECK(b2 == static_cast<long long>(truth.sealed.size()));     // Alexander duality
  CHECK(chi_printed == chi);                                    // Euler-Poincare
  CHECK(chi_local == chi);
  CHECK(b1 == b0 + b2 - chi);
  CHECK(b2 > 0);  // the sizes tested are chosen so that there is something to locate

  const auto boxes = reported_boxes(r.text);
  CHECK(static_cast<long long>(boxes.size()) == b2);
  for (const auto& box : boxes) {
    bool holds_one = false;
    for (const auto& v : truth.sealed) holds_one = holds_one || box.holds(v);
    CHECK_MESSAGE(holds_one, "a box holds no sealed void: " << box.lo[0] << ".." << box.hi[0] << ", " << box.lo[1]
                                                             << ".." << box.hi[1] << ", " << box.lo[2] << ".." << box.hi[2]);
  }
  for (const auto& v : truth.sealed) {
    bool in_some = false;
    for (const auto& box : boxes) in_some = in_some || box.holds(v);
    CHECK_MESSAGE(in_some, "a sealed void in no box, at " << v[0][0] << " " << v[0][1] << " " << v[0][2]);
  }

  const auto marks = read_svg(dir / "materials_scan.svg");
  CHECK_MESSAGE(marks.well_formed, marks.error);
  CHECK(static_cast<long long>(marks.projection_marks) == b2);
  CHECK(static_cast<long long>(marks.ids.size()) == b2);
  for (long long i = 1; i <= b2; ++i) CHECK(marks.ids.count(std::to_string(i)) == 1);
  const auto pores = read_svg(dir / "materials_scan_pores.svg");
  CHECK_MESSAGE(pores.well_formed, pores.error);
  std::filesystem::remove_all(dir);
}

}  // namespace

TEST_CASE("examples/materials_scan counts pieces, tunnels and sealed voids as flood fills and cell counts do") {
  check_size(40);
  check_size(32);
}

TEST_CASE("examples/materials_scan refuses a bad size with exit status 2") {
  for (const char* bad : {"--size 3", "--size 999", "--size x", "--size -40", "--size", "--colour red"}) {
    CAPTURE(bad);
    const auto r = run_scan(bad);
    CHECK(r.status == 2);
  }
}

}  // namespace examples_materials_scan_test

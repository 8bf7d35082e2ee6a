// Runs examples/mesh_check on its own part and on meshes of known surfaces written here, and
// checks what it prints against the classification of surfaces (Hatcher 2002, from memory:
// a connected orientable surface of genus g with b >= 1 boundary circles has H_1 = Z^(2g+b−1)
// and H_2 = 0; closed, H_1 = Z^(2g), H_2 = Z; a closed non-orientable one with k cross-caps
// H_1 = Z^(k−1) + Z/2) and against χ = V − E + F counted here from the faces this file writes.
#include <doctest/doctest.h>

#include "run_program.hpp"

#include <sys/wait.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <string>
#include <vector>

namespace examples_mesh_check_test {

namespace {

examples_support::run_result run(const std::string& args) { return examples_support::run_program("mesh_check " + args, true); }

std::string temp(const std::string& name) { return (std::filesystem::temp_directory_path() / ("lacuna_mesh_check_" + name)).string(); }

using faces_t = std::vector<std::vector<std::size_t>>;

// Writes the faces as OFF (all vertices at the origin: the positions play no part) and
// returns χ = V − E + F counted here.
long long write_off(const std::string& path, std::size_t vertices, const faces_t& faces) {
  std::ofstream out(path);
  out << "OFF\n" << vertices << ' ' << faces.size() << " 0\n";
  for (std::size_t v = 0; v < vertices; ++v) out << "0 0 0\n";
  std::set<std::pair<std::size_t, std::size_t>> edges;
  for (const auto& f : faces) {
    out << f.size();
    for (std::size_t i = 0; i < f.size(); ++i) {
      out << ' ' << f[i];
      const std::size_t a = f[i], b = f[(i + 1) % f.size()];
      edges.insert({std::min(a, b), std::max(a, b)});
    }
    out << '\n';
  }
  return static_cast<long long>(vertices) - static_cast<long long>(edges.size()) + static_cast<long long>(faces.size());
}

// An n × m grid of quads with its sides glued: the torus, or with `twist` the second gluing
// reversed (the Klein bottle). Needs n, m >= 3 so that the quotient is a regular cell complex.
faces_t glued_grid(std::size_t n, std::size_t m, bool twist) {
  auto v = [&](std::size_t i, std::size_t j) {
    if (j == m) j = 0, i = twist ? (n - i) % n : i;
    return (i % n) * m + j;
  };
  faces_t f;
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < m; ++j) f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1), v(i, j + 1)});
  return f;
}

std::string line_with(const std::string& text, const std::string& start) {
  const auto at = text.find(start);
  return at == std::string::npos ? "" : text.substr(at, text.find('\n', at) - at);
}

}  // namespace

TEST_CASE("mesh_check's bracket: genus 2 and 3 boundary circles both ways") {
  const std::string path = temp("bracket.off");
  const auto r = run("--make " + path);
  INFO(r.text);
  CHECK(r.status == 0);
  // classification: g = 2, b = 3 gives H_1 = Z^6, H_2 = 0, χ = 2 − 2g − b = −5
  CHECK(r.text.find("homology over Z: H_0 = Z, H_1 = Z^6, H_2 = 0; rim: H_0 = Z^3, H_1 = Z^3; H_2(M, rim) = Z\n") != std::string::npos);
  CHECK(line_with(r.text, "from homology:") == "from homology: orientable, 3 boundary circles, chi = -5, genus 2");
  CHECK(line_with(r.text, "from the mesh:") == "from the mesh: orientable, 3 boundary loops traced, chi = V - E + F = -5, genus 2");
  CHECK(r.text.find("\nagree\n") != std::string::npos);
  // the file is an OFF mesh of quads whose V − E + F the test counts itself
  std::ifstream in(path);
  std::string head;
  std::size_t V = 0, F = 0, E0 = 0;
  REQUIRE(std::getline(in, head));
  CHECK(head == "OFF");
  std::getline(in, head);  // the comment
  in >> V >> F >> E0;
  for (std::size_t i = 0; i < V; ++i) {
    double x, y, z;
    in >> x >> y >> z;
  }
  std::set<std::pair<std::size_t, std::size_t>> edges;
  for (std::size_t i = 0; i < F; ++i) {
    std::size_t k = 0;
    in >> k;
    CHECK(k == 4u);
    std::vector<std::size_t> f(k);
    for (auto& x : f) in >> x;
    for (std::size_t j = 0; j < k; ++j) edges.insert({std::min(f[j], f[(j + 1) % k]), std::max(f[j], f[(j + 1) % k])});
  }
  CHECK(static_cast<long long>(V) - static_cast<long long>(edges.size()) + static_cast<long long>(F) == -5);
  std::filesystem::remove(path);
}

TEST_CASE("mesh_check on known surfaces written by the test") {
  struct known {
    std::string name;
    std::size_t vertices;
    faces_t faces;
    std::string h1, h2, homology_line, mesh_line;
  };
  const std::size_t n = 4, m = 5;
  faces_t torus = glued_grid(n, m, false), holed = torus, klein = glued_grid(n, m, true);
  holed.erase(holed.begin() + 7);  // a torus with one hole: g = 1, b = 1, H_1 = Z^2 (2g + b − 1)
  faces_t strip;                    // a Möbius strip of 5 quads: k = 1, b = 1, H_1 = Z (k + b − 1)
  for (std::size_t i = 0; i < 4; ++i) strip.push_back({i, i + 1, i + 6, i + 5});  // rows 0..4 and 5..9
  strip.push_back({4, 5, 0, 9});  // the last quad glues column 4 to column 0 upside down
  std::vector<known> cases{
      {"torus", n * m, torus, "Z^2", "Z", "orientable, 0 boundary circles", "genus 1"},
      {"holed", n * m, holed, "Z^2", "0", "orientable, 1 boundary circles", "genus 1"},
      {"klein", n * m, klein, "Z + Z/2", "0", "not orientable, 0 boundary circles", "cross-caps 2"},
      {"moebius", 10, strip, "Z", "0", "not orientable, 1 boundary circles", "cross-caps 1"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.name);
    const std::string path = temp(c.name + ".off");
    const long long chi = write_off(path, c.vertices, c.faces);
    const auto r = run(path);
    INFO(r.text);
    CHECK(r.status == 0);
    CHECK(line_with(r.text, "homology over Z:").find("H_1 = " + c.h1 + ", H_2 = " + c.h2 + ";") != std::string::npos);
    CHECK(line_with(r.text, "from homology:") == "from homology: " + c.homology_line + ", chi = " + std::to_string(chi) + ", " + c.mesh_line);
    CHECK(line_with(r.text, "from the mesh:").find("chi = V - E + F = " + std::to_string(chi) + ", " + c.mesh_line) != std::string::npos);
    std::filesystem::remove(path);
  }
}

TEST_CASE("mesh_check refuses what is not a surface, and bad files") {
  const std::string path = temp("bad.off");
  // three triangles on one edge {0, 1}
  write_off(path, 5, {{0, 1, 2}, {0, 1, 3}, {0, 1, 4}});
  auto r = run(path);
  CHECK(r.status == 2);
  CHECK(r.text.find("not a surface: edge v0 v1 has 3 faces") != std::string::npos);
  // two triangles meeting at vertex 0 only (a bow tie)
  write_off(path, 5, {{0, 1, 2}, {0, 3, 4}});
  r = run(path);
  CHECK(r.status == 2);
  CHECK(r.text.find("not a surface") != std::string::npos);
  // two separate triangles
  write_off(path, 6, {{0, 1, 2}, {3, 4, 5}});
  r = run(path);
  CHECK(r.status == 2);
  CHECK(r.text.find("2 components (homology: 2)") != std::string::npos);
  // a file that is not OFF, and one that does not exist
  std::ofstream(path) << "OFF\n3 1 0\n0 0 0\n1 0 0\n";
  r = run(path);
  CHECK(r.status == 2);
  CHECK(r.text.rfind("mesh_check: ", 0) == 0);
  std::filesystem::remove(path);
  CHECK(run(path).status == 2);
}

}  // namespace examples_mesh_check_test

// Coverage holes in a sensor network, decided from the sensors' communication graph alone, by
// the homological criterion of de Silva & Ghrist ("Coverage in sensor networks via persistent
// homology", Algebraic & Geometric Topology 7, 2007; first in "Coordinate-free coverage in
// sensor networks with controlled boundaries via homology", Int. J. Robotics Research, 2006).
//
// The scenario: a 10 x 6 warehouse floor D, a fence of sensors along its walls (every 0.7),
// and sensors on a jittered grid inside. Each sensor talks to the sensors within the broadcast
// radius r_b = 1 and senses the disc of radius r_c around it. R is the Vietoris–Rips complex of
// the sensors at r_b, F its full subcomplex on the fence sensors.
//
// The criterion (hypotheses, from memory of the papers): D is a compact connected domain in
// the plane; the fence sensors lie on its boundary, each within r_b of the next, so that F
// follows the boundary cycle; r_c >= r_b / sqrt(3). Then, if some class of H_2(R, F) has a
// non-zero boundary in H_1(F), the discs of radius r_c cover D. Why: each point of a Rips
// triangle (sides <= r_b) lies within r_b / sqrt(3) of a corner (an acute triangle's
// circumradius, at most r_b / sqrt(3) by Jung's theorem in the plane; half the longest side
// for the others), and a relative 2-cycle whose boundary is the fence sweeps out all of D. The criterion is sufficient, not necessary: when it fails
// we report the holes of R, whose H_1 generators are drawn over the map.
//
// How each number is proved: the boundary map H_2(R, F) -> H_1(F) and H_1(R) come from exact
// elimination over Z/2 (lacuna/homology/exact_sequence.hpp), no sampling and no tolerance; the
// Rips edges are decided by comparing squared distances of the generated coordinates.
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/io/svg_text.hpp>
#include <lacuna/ring/z2.hpp>

#include <array>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <string>
#include <vector>

namespace {

constexpr double width = 10, height = 6, r_b = 1.0, fence_step = 0.7;
const double r_c = r_b / std::sqrt(3.0);

struct sensor {
  double x, y;
  bool fence;
};

/// The fence along the walls, then a grid (spacing 0.6) jittered by at most 0.05 in x and y by
/// a fixed linear congruential generator, without the sensors inside the `gaps` (x, y, radius).
std::vector<sensor> place_sensors(const std::vector<std::array<double, 3>>& gaps) {
  std::vector<sensor> s;
  const double corners[5][2] = {{0, 0}, {width, 0}, {width, height}, {0, height}, {0, 0}};
  for (int side = 0; side < 4; ++side) {
    const double dx = corners[side + 1][0] - corners[side][0], dy = corners[side + 1][1] - corners[side][1];
    const int steps = static_cast<int>(std::ceil(std::hypot(dx, dy) / fence_step));
    for (int i = 0; i < steps; ++i)
      s.push_back({corners[side][0] + dx * i / steps, corners[side][1] + dy * i / steps, true});
  }
  std::uint64_t state = 2007;
  auto jitter = [&state] {
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return (static_cast<double>(state >> 11) / 9007199254740992.0 - 0.5) * 0.1;
  };
  for (double y = 0.3; y < height - 0.1; y += 0.6)
    for (double x = 0.3; x < width - 0.1; x += 0.6) {
      const sensor p{x + jitter(), y + jitter(), false};
      bool removed = false;
      for (const auto& g : gaps) removed |= std::hypot(p.x - g[0], p.y - g[1]) < g[2];
      if (!removed) s.push_back(p);
    }
  return s;
}

/// Decides the criterion for one field, prints the verdict, and draws the map to `svg_file`.
void survey(const std::string& name, const std::vector<sensor>& s, const std::string& svg_file) {
  std::vector<int> ids(s.size());
  std::vector<std::pair<int, int>> edges;
  for (std::size_t i = 0; i < s.size(); ++i) {
    ids[i] = static_cast<int>(i);
    for (std::size_t j = i + 1; j < s.size(); ++j)
      if (std::pow(s[i].x - s[j].x, 2) + std::pow(s[i].y - s[j].y, 2) <= r_b * r_b)
        edges.push_back({static_cast<int>(i), static_cast<int>(j)});
  }
  // dimension 3: H_2 needs the tetrahedra that bound 2-cycles
  const auto R = lacuna::clique_complex(ids, edges, 3);
  std::vector<std::vector<bool>> in_F(static_cast<std::size_t>(R.top_dimension() + 1));
  for (int k = 0; k <= R.top_dimension(); ++k)
    for (std::size_t i = 0; i < R.cell_count(k); ++i) {
      bool all = true;
      for (auto v : R.vertices(k, i)) all = all && s[static_cast<std::size_t>(R.label(v))].fence;
      in_F[static_cast<std::size_t>(k)].push_back(all);
    }
  const auto seq = lacuna::long_exact_sequence<lacuna::z2>(R, in_F);
  const auto& boundary_map = seq.connecting[2].matrix;  // H_2(R, F) -> H_1(F)
  bool certified = false;
  for (std::size_t i = 0; i < boundary_map.rows(); ++i)
    for (std::size_t j = 0; j < boundary_map.cols(); ++j) certified |= boundary_map(i, j) != lacuna::zero<lacuna::z2>();
  const auto& holes = seq.hX[1].generators;
  std::cout << name << ": " << s.size() << " sensors, " << edges.size() << " Rips edges; H_1(R) has rank "
            << seq.hX[1].rank << "\n  verdict: "
            << (certified ? "covered (a class of H_2(R, F) has non-zero boundary in H_1(F))"
                          : "coverage not certified (no class of H_2(R, F) reaches the fence)")
            << "\n  holes: " << holes.size() << "\n";

  // The map: 60 units per metre, y upwards as on a floor plan.
  using lacuna::io::svg_detail::num;
  const double m = 60, pad = 40;
  auto X = [&](double x) { return num(pad + m * x); };
  auto Y = [&](double y) { return num(pad + m * (height - y)); };
  std::ofstream out(svg_file);
  out << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\""
      << num(2 * pad + m * width + 110) << "\" height=\"" << num(2 * pad + m * height)
      << "\" font-family=\"sans-serif\" font-size=\"13\">\n<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n"
      << "<text x=\"" << num(pad) << "\" y=\"24\">" << name << ": r_b = 1, r_c = r_b/sqrt(3)</text>\n"
      << "<rect x=\"" << X(0) << "\" y=\"" << Y(height) << "\" width=\"" << num(m * width) << "\" height=\""
      << num(m * height) << "\" fill=\"none\" stroke=\"#444444\"/>\n<g fill=\"#56B4E9\" fill-opacity=\"0.18\">\n";
  for (const auto& p : s)
    out << "<circle class=\"disc\" cx=\"" << X(p.x) << "\" cy=\"" << Y(p.y) << "\" r=\"" << num(m * r_c) << "\"/>\n";
  out << "</g>\n<g class=\"rips\" stroke=\"#999999\" stroke-width=\"0.6\">\n";
  for (const auto& [i, j] : edges)
    out << "<line x1=\"" << X(s[i].x) << "\" y1=\"" << Y(s[i].y) << "\" x2=\"" << X(s[j].x) << "\" y2=\"" << Y(s[j].y)
        << "\"/>\n";
  out << "</g>\n";
  for (const auto& p : s)
    out << "<circle class=\"sensor\" cx=\"" << X(p.x) << "\" cy=\"" << Y(p.y) << "\" r=\"2.5\" fill=\""
        << (p.fence ? "#000000" : "#0072B2") << "\"/>\n";
  const char* colours[] = {"#D55E00", "#009E73", "#CC79A7", "#E69F00"};
  for (std::size_t h = 0; h < holes.size(); ++h) {
    const char* c = colours[h % 4];
    // earlier holes wider, so that a cycle drawn over another one's edges leaves it visible
    out << "<path class=\"hole\" data-hole=\"" << h + 1 << "\" fill=\"none\" stroke=\"" << c
        << "\" stroke-linecap=\"round\" stroke-width=\"" << 3 + 3 * (holes.size() - 1 - h) << "\" d=\"";
    for (const auto& t : holes[h].terms) {  // the edges of the cycle, one segment each
      const auto v = R.vertices(1, t.cell);
      const auto& a = s[static_cast<std::size_t>(R.label(v[0]))];
      const auto& b = s[static_cast<std::size_t>(R.label(v[1]))];
      out << "M" << X(a.x) << " " << Y(a.y) << "L" << X(b.x) << " " << Y(b.y);
    }
    const double ly = pad + 20 * static_cast<double>(h) + 10;
    out << "\"/>\n<line x1=\"" << num(2 * pad + m * width) << "\" y1=\"" << num(ly) << "\" x2=\""
        << num(2 * pad + m * width + 28) << "\" y2=\"" << num(ly) << "\" stroke=\"" << c << "\" stroke-width=\"3\"/>"
        << "<text x=\"" << num(2 * pad + m * width + 36) << "\" y=\"" << num(ly + 4.5) << "\">hole " << h + 1
        << "</text>\n";
  }
  out << "</svg>\n";
  out.close();
  if (!out) {  // never print a map that was not written
    std::cerr << "sensor_coverage: cannot write " << svg_file << "\n";
    std::exit(2);
  }
  std::cout << "  map: " << svg_file << "\n";
}

}  // namespace

int main(int argc, char** argv) {
  // argv[1]: the folder for the two maps (default: the current one)
  const std::string dir = argc > 1 ? std::string(argv[1]) + "/" : std::string();
  std::error_code folder_error;
  if (argc > 1) std::filesystem::create_directories(argv[1], folder_error);
  if (folder_error) {
    std::cerr << "sensor_coverage: cannot create the folder " << argv[1] << ": " << folder_error.message() << "\n";
    return 2;
  }
  std::cout << "criterion: de Silva & Ghrist (2007); hypotheses: fence sensors on the walls, each within r_b of "
               "the next; r_c = "
            << r_c << " >= r_b / sqrt(3) with r_b = " << r_b << "\n";
  survey("full field", place_sensors({}), dir + "coverage_full.svg");
  survey("field with sensors removed", place_sensors({{3.0, 3.2, 1.2}, {7.4, 2.2, 0.9}}), dir + "coverage_gaps.svg");
}

// mesh_check: the genus and the boundary circles of a polygon mesh, found from homology and
// from the mesh's own counts, and compared (docs/demo-mesh.md).
//   mesh_check                 writes bracket.off — a made-up plate with two slots through it
//                              (genus 2) and three open sockets (3 boundary circles) — and checks it
//   mesh_check --make FILE     the same, written to FILE
//   mesh_check FILE.off        checks a mesh of one's own
// From homology (exact, over Z: docs/homology.md) of the mesh read back by io::read_off: the
// Betti numbers; the rim (edges of one face) as a 1-complex, rank H_0 = boundary circles;
// orientability from H_2(M, rim) = Z (Lefschetz duality; 0 when not orientable: Hatcher 2002,
// §3.3) or H_2 = Z when closed. The classification of surfaces (Hatcher 2002, from memory):
// orientable, genus g, b >= 1 circles: β1 = 2g + b − 1, β2 = 0; closed: β1 = 2g, β2 = 1;
// k cross-caps: β1 = k + b − 1 (b >= 1), or H_1 = Z^(k−1) + Z/2 (closed).
// From the face lists alone: χ = V − E + F, the rim traced into loops, an orientation spread
// across shared edges, and g = (2 − χ − b)/2 (k = 2 − χ − b).
// Exit status: 0 agree, 1 disagree, 2 a bad file, not a surface (an edge of three or more
// faces, a vertex whose faces form more than one fan), or a mesh of several pieces.
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/off.hpp>

#include <array>
#include <cstdio>
#include <fstream>
#include <map>
#include <numeric>
#include <set>
#include <string>

namespace {

// The part: the surface of a 12 × 4 × 1 plate of unit cubes with two 1 × 2 slots, three
// squares of its skin left open. Outward quads, 10 mm to a unit.
void write_bracket(const std::string& path) {
  auto solid = [](int x, int y, int z) { return x >= 0 && x < 12 && y >= 0 && y < 4 && z == 0 && !((x == 2 || x == 9) && (y == 1 || y == 2)); };
  auto open = [](int x, int y, int z, int d) { return d == 2 && ((z == 1 && ((x == 5 && y == 1) || (x == 7 && y == 2))) || (z == 0 && x == 4 && y == 2)); };
  std::map<std::array<int, 3>, std::size_t> id;
  std::vector<std::array<std::size_t, 4>> quads;
  for (int x = 0; x < 12; ++x)
    for (int y = 0; y < 4; ++y)
      for (int d = 0; d < 3; ++d)
        for (int s : {-1, 1}) {
          std::array<int, 3> p{x, y, 0}, q = p;
          q[d] += s;
          if (!solid(x, y, 0) || solid(q[0], q[1], q[2])) continue;
          if (s > 0) p[d] += 1;  // the face's corner
          if (open(p[0], p[1], p[2], d)) continue;
          const int u = (d + 1) % 3, v = (d + 2) % 3;
          std::array<std::size_t, 4> quad{};
          for (int c = 0; c < 4; ++c) {
            auto r = p;
            r[u] += c == 1 || c == 2, r[v] += c >= 2;
            quad[static_cast<std::size_t>(s > 0 ? c : 3 - c)] = id.emplace(r, id.size()).first->second;  // counter-clockwise seen from outside
          }
          quads.push_back(quad);
        }
  std::vector<std::array<int, 3>> at(id.size());
  for (const auto& [r, i] : id) at[i] = r;
  std::ofstream out(path);
  out << "OFF\n# a bracket plate: two slots (genus 2), three open sockets (boundary circles)\n" << at.size() << ' ' << quads.size() << " 0\n";
  for (const auto& r : at) out << 10 * r[0] << ' ' << 10 * r[1] << ' ' << 10 * r[2] << '\n';
  for (const auto& f : quads) out << "4 " << f[0] << ' ' << f[1] << ' ' << f[2] << ' ' << f[3] << '\n';
  if (!out) throw std::runtime_error("cannot write " + path);
}

std::size_t root(std::vector<std::size_t>& up, std::size_t i) { return up[i] == i ? i : up[i] = root(up, up[i]); }

std::string group(const lacuna::homology_result<lacuna::integer>& h, int k) {
  if (k >= static_cast<int>(h.groups.size())) return "0";
  const auto& g = h[k];
  std::string t = g.rank == 0 ? "" : g.rank == 1 ? "Z" : "Z^" + std::to_string(g.rank);
  for (const auto& x : g.torsion) t += (t.empty() ? "Z/" : " + Z/") + x.to_string();
  return t.empty() ? "0" : t;
}

int check(const std::string& path) {
  const lacuna::polygon_mesh mesh = lacuna::io::read_off(std::filesystem::path(path));
  const std::size_t V = mesh.vertex_count(), F = mesh.face_count();
  // ---- from the face lists: edges with (face, corner, direction), fans, rim loops, orientation
  std::map<std::pair<std::size_t, std::size_t>, std::vector<std::array<std::size_t, 3>>> edges;
  std::vector<std::size_t> first{0}, corner_vertex;  // corner c of face f: first[f] + c
  for (std::size_t f = 0; f < F; ++f) {
    const auto fv = mesh.face_vertices(f);
    for (std::size_t c = 0; c < fv.size(); ++c) {
      const std::size_t a = fv[c], b = fv[(c + 1) % fv.size()];
      edges[{std::min(a, b), std::max(a, b)}].push_back({f, c, a < b});
      corner_vertex.push_back(a);
    }
    first.push_back(first.back() + fv.size());
  }
  std::vector<std::size_t> corners(corner_vertex.size()), comps(V), face_up(F);
  std::iota(corners.begin(), corners.end(), 0), std::iota(comps.begin(), comps.end(), 0), std::iota(face_up.begin(), face_up.end(), 0);
  std::vector<int> parity(F, 0);  // orientation of a face relative to its root, by union-find with parity
  bool orientable = true;
  std::map<std::size_t, std::vector<std::size_t>> rim;  // vertex -> rim edges at it
  std::vector<std::vector<int>> rim_edges;
  for (const auto& [e, fs] : edges) {
    comps[root(comps, e.first)] = root(comps, e.second);
    if (fs.size() > 2) return std::printf("not a surface: edge v%zu v%zu has %zu faces\n", e.first, e.second, fs.size()), 2;
    if (fs.size() == 1) {
      rim[e.first].push_back(rim_edges.size()), rim[e.second].push_back(rim_edges.size());
      rim_edges.push_back({static_cast<int>(e.first), static_cast<int>(e.second)});
      continue;
    }
    const auto [f, cf, df] = fs[0];
    const auto [g, cg, dg] = fs[1];
    auto at = [&](std::size_t h, std::size_t c, std::size_t v) { return corner_vertex[first[h] + c] == v ? first[h] + c : first[h] + (c + 1) % (first[h + 1] - first[h]); };
    for (std::size_t v : {e.first, e.second}) corners[root(corners, at(f, cf, v))] = root(corners, at(g, cg, v));
    // coherent: the two faces run the edge in opposite directions once oriented
    auto find = [&](std::size_t h) { int p = 0; while (face_up[h] != h) p ^= parity[h], h = face_up[h]; return std::pair{h, p}; };
    const auto [rf, pf] = find(f);
    const auto [rg, pg] = find(g);
    const int need = (df == dg) ^ pf ^ pg;  // 1: g must be flipped relative to f
    if (rf != rg) face_up[rg] = rf, parity[rg] = need;
    else if (need) orientable = false;
  }
  std::set<std::pair<std::size_t, std::size_t>> fans;
  std::set<std::size_t> parts;
  for (std::size_t c = 0; c < corners.size(); ++c) fans.insert({corner_vertex[c], root(corners, c)});
  for (std::size_t v = 0; v < V; ++v) parts.insert(root(comps, v));
  if (fans.size() != std::set<std::size_t>(corner_vertex.begin(), corner_vertex.end()).size())
    return std::printf("not a surface: the faces at some vertex form more than one fan\n"), 2;
  for (const auto& [v, at] : rim)
    if (at.size() != 2) return std::printf("not a surface: vertex v%zu has %zu rim edges\n", v, at.size()), 2;
  std::size_t loops = 0;  // walk each loop of rim edges once
  std::vector<bool> seen(rim_edges.size(), false);
  for (std::size_t s = 0; s < rim_edges.size(); ++s) {
    if (seen[s]) continue;
    ++loops;
    for (std::size_t e = s, v = static_cast<std::size_t>(rim_edges[s][1]); !seen[e];) {
      seen[e] = true;
      e = rim[v][0] == e ? rim[v][1] : rim[v][0];
      v = static_cast<std::size_t>(rim_edges[e][0]) == v ? static_cast<std::size_t>(rim_edges[e][1]) : static_cast<std::size_t>(rim_edges[e][0]);
    }
  }
  const long long chi = static_cast<long long>(V) - static_cast<long long>(edges.size()) + static_cast<long long>(F);
  std::printf("%s: %zu vertices, %zu edges, %zu faces (read back through the OFF reader)\n", path.c_str(), V, edges.size(), F);
  // ---- from homology
  const auto h = lacuna::homology<lacuna::integer>(mesh);
  const auto hr = lacuna::homology<lacuna::integer>(lacuna::simplicial_complex<int>::from_facets(rim_edges));
  const std::size_t b = rim_edges.empty() ? 0 : hr[0].rank;
  std::vector<std::vector<bool>> in_rim{std::vector<bool>(V), std::vector<bool>(mesh.edge_count()), std::vector<bool>(F)};
  for (const auto& r : rim_edges) {
    const auto a = static_cast<std::size_t>(r[0]), c = static_cast<std::size_t>(r[1]);
    in_rim[0][a] = in_rim[0][c] = true, in_rim[1][*mesh.find_edge(a, c)] = true;
  }
  const auto hrel = lacuna::relative_homology<lacuna::integer>(mesh, in_rim);
  auto rank = [](const auto& x, int k) { return k < static_cast<int>(x.groups.size()) ? x[k].rank : 0; };
  const bool orientable_h = b == 0 ? rank(h, 2) == 1 : rank(hrel, 2) == 1;
  const long long chi_h = static_cast<long long>(rank(h, 0)) - static_cast<long long>(rank(h, 1)) + static_cast<long long>(rank(h, 2));
  std::printf("homology over Z: H_0 = %s, H_1 = %s, H_2 = %s; rim: H_0 = %s, H_1 = %s; H_2(M, rim) = %s\n", group(h, 0).c_str(), group(h, 1).c_str(),
              group(h, 2).c_str(), group(hr, 0).c_str(), group(hr, 1).c_str(), group(hrel, 2).c_str());
  if (parts.size() != 1 || rank(h, 0) != 1)
    return std::printf("%zu components (homology: %zu): genus not computed\n", parts.size(), rank(h, 0)), parts.size() == rank(h, 0) ? 2 : 1;
  // genus (orientable) or cross-caps (not): from β1 by the classification, from χ by counting
  const long long beta1 = static_cast<long long>(rank(h, 1)), bb = static_cast<long long>(b);
  const long long k_h = orientable_h ? (beta1 - bb + (b ? 1 : 0)) / 2 : beta1 - bb + 1;
  const long long k_m = orientable ? (2 - chi - static_cast<long long>(loops)) / 2 : 2 - chi - static_cast<long long>(loops);
  auto kind = [](bool o) { return o ? "orientable" : "not orientable"; };
  auto what = [](bool o) { return o ? "genus" : "cross-caps"; };
  std::printf("from homology: %s, %zu boundary circles, chi = %lld, %s %lld\n", kind(orientable_h), b, chi_h, what(orientable_h), k_h);
  std::printf("from the mesh: %s, %zu boundary loops traced, chi = V - E + F = %lld, %s %lld\n", kind(orientable), loops, chi, what(orientable), k_m);
  std::vector<std::string> torsion;  // none, but Z/2 in H_1 of a closed non-orientable surface
  if (rank(h, 0) > 0 && h.groups.size() > 1)
    for (const auto& x : h[1].torsion) torsion.push_back(x.to_string());
  const bool agree = orientable == orientable_h && b == loops && chi == chi_h && k_h == k_m && (hr.groups.size() < 2 || rank(hr, 1) == b) &&
                     torsion == (orientable_h || b ? std::vector<std::string>{} : std::vector<std::string>{"2"});
  std::printf("%s\n", agree ? "agree" : "DISAGREE");
  return agree ? 0 : 1;
}

}  // namespace

int main(int argc, char** argv) {
  try {
    const std::string arg = argc > 1 ? argv[1] : "--make";
    if (arg == "--make") write_bracket(argc > 2 ? argv[2] : "bracket.off");
    return check(arg == "--make" ? (argc > 2 ? argv[2] : "bracket.off") : arg);
  } catch (const std::exception& e) {
    std::fprintf(stderr, "mesh_check: %s\n", e.what());
    return 2;
  }
}

// --generators: every chain names existing cells and is a cycle, checked here independently of
// the tool (the input files are parsed by the test itself); free summands first with order 0,
// then one per torsion factor with "order" equal to it; for small complexes, the class of each
// generator has exactly that order and the generators span the group.
#include "json_checks.hpp"

#include <boost/multiprecision/cpp_int.hpp>

#include <fstream>
#include <map>
#include <regex>
#include <set>
#include <sstream>
#include <string>

namespace cli_generators_test {

using namespace cli_test;
using big = boost::multiprecision::cpp_int;

namespace {

/// A complex as the test understands it: per dimension, cell name -> boundary terms.
using terms = std::vector<std::pair<big, std::string>>;
using model = std::map<int, std::map<std::string, terms>>;

std::vector<std::string> lines_without_comments(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string l; std::getline(in, l);) {
    if (auto h = l.find('#'); h != std::string::npos) l.erase(h);
    if (l.find_first_not_of(" \t\r") != std::string::npos) out.push_back(l);
  }
  return out;
}

/// The .cells files of tests/data/cli (the grammar of docs/formats.md, terms [+|-][N*]NAME or 0).
model parse_cells(const std::string& path) {
  model m;
  for (const auto& l : lines_without_comments(slurp(path))) {
    std::istringstream in(l);
    int dim = -1;
    std::string name;
    in >> dim >> name;
    REQUIRE(dim >= 0);
    terms t;
    std::string rest, s;
    std::getline(in, rest);
    for (char ch : rest)
      if (ch != ' ' && ch != '\t' && ch != '\r') s += ch;
    if (dim > 0) {
      REQUIRE(s.size() > 1);
      REQUIRE(s[0] == ':');
      static const std::regex term(R"(([+-]?)(?:(\d+)\*)?([A-Za-z_][A-Za-z0-9_.']*))");
      s.erase(0, 1);
      if (s != "0")
        for (std::sregex_iterator it(s.begin(), s.end(), term), end; it != end; ++it) {
          big c = (*it)[2].matched ? big((*it)[2].str()) : big(1);
          if ((*it)[1] == "-") c = -c;
          t.emplace_back(c, (*it)[3].str());
        }
    }
    m[dim][name] = t;
  }
  return m;
}

/// A .facets file: the closure, simplices named by their labels in vertex order.
model parse_facets(const std::string& path) {
  model m;
  std::map<std::string, int> number;
  for (const auto& l : lines_without_comments(slurp(path))) {
    std::istringstream in(l);
    std::vector<std::string> labels;
    for (std::string w; in >> w;) {
      number.emplace(w, static_cast<int>(number.size()));
      labels.push_back(w);
    }
    std::sort(labels.begin(), labels.end(), [&](const auto& a, const auto& b) { return number[a] < number[b]; });
    const std::size_t n = labels.size();
    for (std::uint32_t mask = 1; mask < (1u << n); ++mask) {
      std::vector<std::string> face;
      for (std::size_t i = 0; i < n; ++i)
        if (mask >> i & 1) face.push_back(labels[i]);
      auto join = [](const std::vector<std::string>& v) {
        std::string s;
        for (const auto& x : v) s += (s.empty() ? "" : " ") + x;
        return s;
      };
      terms t;
      if (face.size() > 1)
        for (std::size_t i = 0; i < face.size(); ++i) {
          auto f = face;
          f.erase(f.begin() + static_cast<std::ptrdiff_t>(i));
          t.emplace_back(i % 2 ? -1 : 1, join(f));  // the i-th face, sign (-1)^i
        }
      m[static_cast<int>(face.size()) - 1][join(face)] = t;
    }
  }
  return m;
}

/// A 2D image or 3D volume as docs/images-and-meshes.md names its cubes: one interval per
/// axis, "[t,t+1]" or "[t]", joined by "x"; the boundary is sum over the free axes j (in
/// increasing order, counted among the free ones) of (-1)^j (upper face - lower face).
model cubical_model(const std::vector<std::vector<int>>& voxels) {
  model m;
  const std::size_t d = voxels.front().size();
  auto name = [&](const std::vector<int>& lo, const std::vector<bool>& free) {
    std::string s;
    for (std::size_t a = 0; a < d; ++a)
      s += (a ? "x[" : "[") + std::to_string(lo[a]) + (free[a] ? "," + std::to_string(lo[a] + 1) : "") + "]";
    return s;
  };
  for (const auto& v : voxels)
    for (std::uint32_t code = 0; code < (1u << (2 * d)); ++code) {
      // per axis: 0 free, 1 lower corner, 2 upper corner (code 3 skipped)
      std::vector<int> lo(d);
      std::vector<bool> free(d);
      bool ok = true;
      int dim = 0;
      for (std::size_t a = 0; a < d; ++a) {
        const auto c = (code >> (2 * a)) & 3u;
        ok = ok && c != 3;
        free[a] = c == 0;
        lo[a] = v[a] + (c == 2 ? 1 : 0);
        dim += c == 0;
      }
      if (!ok) continue;
      terms t;
      int j = 0;
      for (std::size_t a = 0; a < d; ++a) {
        if (!free[a]) continue;
        auto f = free;
        f[a] = false;
        auto up = lo;
        up[a] += 1;
        const int sign = j % 2 ? -1 : 1;
        t.emplace_back(sign, name(up, f));
        t.emplace_back(-sign, name(lo, f));
        ++j;
      }
      m[dim][name(lo, free)] = t;
    }
  return m;
}

/// An OFF mesh as docs/images-and-meshes.md names it: vertices v<i>, edges "v<i> v<j>" (i < j,
/// boundary v<j> - v<i>), faces f<k> in file order with boundary sum of +-edges around them.
model off_model(const std::string& path) {
  model m;
  const auto lines = lines_without_comments(slurp(path));
  std::istringstream head(lines.at(1));
  std::size_t nv = 0, nf = 0;
  head >> nv >> nf;
  for (std::size_t i = 0; i < nv; ++i) m[0]["v" + std::to_string(i)] = {};
  for (std::size_t f = 0; f < nf; ++f) {
    std::istringstream in(lines.at(2 + nv + f));
    std::size_t n = 0;
    in >> n;
    std::vector<std::size_t> vs(n);
    for (auto& x : vs) in >> x;
    terms t;
    for (std::size_t j = 0; j < n; ++j) {
      const auto a = vs[j], b = vs[(j + 1) % n];
      const auto lo = std::min(a, b), hi = std::max(a, b);
      // (std::string("v") rather than "v" + ...: GCC 12 warns falsely on the latter, -Wrestrict)
      const std::string vlo = std::string("v").append(std::to_string(lo));
      const std::string vhi = std::string("v").append(std::to_string(hi));
      const std::string e = vlo + " " + vhi;
      m[1][e] = {{1, vhi}, {-1, vlo}};
      t.emplace_back(a < b ? 1 : -1, e);
    }
    m[2]["f" + std::to_string(f)] = t;
  }
  return m;
}

struct generator {
  big order;
  terms chain;
};

/// Parses --json --generators output; integers of 19 digits or more become strings first, so
/// that nlohmann does not round them to floating point.
std::vector<std::vector<generator>> generators_of(const result& r) {
  parse_result(r, true);
  static const std::regex long_int(R"((-?\d{19,}))");
  const auto j = ordered_json::parse(std::regex_replace(r.out, long_int, "\"$1\""));
  auto as_big = [](const ordered_json& x) {
    if (x.is_string()) return big(x.get<std::string>());
    if (x.is_number_unsigned()) return big(x.get<std::uint64_t>());
    return big(x.get<std::int64_t>());
  };
  std::vector<std::vector<generator>> out;
  for (const auto& e : j["homology"]) {
    std::vector<generator> gs;
    for (const auto& g : e["generators"]) {
      generator x{as_big(g["order"]), {}};
      for (const auto& t : g["chain"]) {
        REQUIRE(t.size() == 2);
        REQUIRE(t[1].is_string());
        x.chain.emplace_back(as_big(t[0]), t[1].get<std::string>());
      }
      gs.push_back(x);
    }
    // free summands first (order 0), then one per torsion factor, in the order of torsion
    const auto rank = e["rank"].get<std::size_t>();
    REQUIRE(gs.size() == rank + e["torsion"].size());
    for (std::size_t i = 0; i < gs.size(); ++i) {
      if (i < rank) CHECK(gs[i].order == 0);
      else CHECK(gs[i].order == as_big(e["torsion"][i - rank]));
    }
    out.push_back(gs);
  }
  return out;
}

big mod(const big& x, const big& m) {
  if (m == 0) return x;
  big r = x % m;
  return r < 0 ? r + m : r;
}

/// Every cell named exists in dimension k, no cell twice, no zero coefficient, and the
/// boundary is zero (over Z when modulus is 0, otherwise mod the modulus).
void check_cycle(const model& m, int k, const terms& chain, const big& modulus) {
  std::map<std::string, big> boundary;
  std::set<std::string> seen;
  for (const auto& [c, name] : chain) {
    CAPTURE(name);
    REQUIRE(m.count(k) == 1);
    const auto it = m.at(k).find(name);
    REQUIRE(it != m.at(k).end());
    CHECK(seen.insert(name).second);
    CHECK(mod(c, modulus) != 0);
    if (modulus != 0) CHECK((c > 0 && c < modulus));  // over Z/p: 1 .. p-1
    for (const auto& [d, face] : it->second) boundary[face] += c * d;
  }
  for (const auto& [face, c] : boundary) {
    CAPTURE(face);
    CHECK(mod(c, modulus) == 0);
  }
}

void check_all_cycles(const model& m, const std::vector<std::vector<generator>>& gens, const big& modulus) {
  for (std::size_t k = 0; k < gens.size(); ++k)
    for (const auto& g : gens[k]) {
      CAPTURE(k);
      check_cycle(m, static_cast<int>(k), g.chain, modulus);
    }
}

big coefficient_of(const terms& chain, const std::string& name) {
  big c = 0;
  for (const auto& [x, n] : chain)
    if (n == name) c += x;
  return c;
}

/// For a complex whose 2-cells each have boundary n_e * e on distinct loops e (all 1-cells
/// loops at one vertex): the order of the class of a 1-chain, lcm of n_e / gcd(n_e, c_e).
big diagonal_order(const model& m, const terms& chain) {
  big order = 1;
  for (const auto& [edge, unused] : m.at(1)) {
    const big c = coefficient_of(chain, edge);
    big n = 0;
    for (const auto& [r, bd] : m.at(2))
      if (bd.size() == 1 && bd[0].second == edge) n = bd[0].first;
    if (c == 0) continue;
    if (n == 0) return 0;  // infinite order
    const big o = n / boost::multiprecision::gcd(n, c);
    order = order / boost::multiprecision::gcd(order, o) * o;
  }
  return order;
}

}  // namespace

TEST_CASE("--generators on .cells files: cycles, orders exactly the torsion factors") {
  for (const char* name : {"projective_plane.cells", "torsion_mix.cells", "big_prime.cells", "big_product.cells"}) {
    CAPTURE(name);
    const auto f = data(name).string();
    const auto m = parse_cells(f);
    const auto gens = generators_of(run({"homology", "--json", "--generators", f}));
    check_all_cycles(m, gens, 0);
    REQUIRE(gens.size() == 3);
    // a one-vertex complex: H_0 = Z, generated by the vertex with coefficient +-1
    REQUIRE(gens[0].size() == 1);
    CHECK(abs(gens[0][0].chain.at(0).first) == 1);
    // each torsion generator's class has exactly the order it claims: d*g is a boundary, no
    // smaller multiple is (computed from the diagonal relations 2q, 6a 4b 2c, ...)
    for (const auto& g : gens[1]) CHECK(diagonal_order(m, g.chain) == g.order);
  }
}

TEST_CASE("--generators: the torsion generators of Z/6 + Z/4 + Z/2 span it") {
  const auto f = data("torsion_mix.cells").string();
  const auto gens = generators_of(run({"homology", "--json", "--generators", f}));
  REQUIRE(gens[1].size() == 3);
  // the 2*2*12 = 48 combinations are distinct classes of a group of order 6*4*2 = 48, so the
  // generators give an isomorphism Z/2 + Z/2 + Z/12 -> H_1 (by hand)
  std::set<std::array<big, 3>> classes;
  for (int x = 0; x < 2; ++x)
    for (int y = 0; y < 2; ++y)
      for (int z = 0; z < 12; ++z) {
        std::array<big, 3> c;
        const std::array<std::string, 3> edge{"a", "b", "c"};
        const std::array<int, 3> n{6, 4, 2};
        for (int e = 0; e < 3; ++e)
          c[e] = mod(x * coefficient_of(gens[1][0].chain, edge[e]) + y * coefficient_of(gens[1][1].chain, edge[e]) +
                         z * coefficient_of(gens[1][2].chain, edge[e]),
                     n[e]);
        classes.insert(c);
      }
  CHECK(classes.size() == 48);
}

TEST_CASE("--generators on the torus and the Klein bottle: bases, by hand") {
  auto f = data("torus.cells").string();
  auto m = parse_cells(f);
  auto gens = generators_of(run({"homology", "--json", "--generators", f}));
  check_all_cycles(m, gens, 0);
  REQUIRE(gens.size() == 3);
  // H_1 = Z^3 / (a + b - c): two generators form a basis iff with (1, 1, -1) they make a
  // matrix of determinant +-1 (by hand)
  REQUIRE(gens[1].size() == 2);
  auto row = [&](const terms& t) {
    return std::array<big, 3>{coefficient_of(t, "a"), coefficient_of(t, "b"), coefficient_of(t, "c")};
  };
  const auto g = row(gens[1][0].chain), h = row(gens[1][1].chain);
  const std::array<big, 3> r{1, 1, -1};
  const big det = g[0] * (h[1] * r[2] - h[2] * r[1]) - g[1] * (h[0] * r[2] - h[2] * r[0]) + g[2] * (h[0] * r[1] - h[1] * r[0]);
  CHECK(abs(det) == 1);
  // no 3-cells: H_2 = Z_2 = Z (U - L) since dU = dL (the file), so the generator is +-(U - L)
  REQUIRE(gens[2].size() == 1);
  CHECK(abs(coefficient_of(gens[2][0].chain, "U")) == 1);
  CHECK(coefficient_of(gens[2][0].chain, "U") == -coefficient_of(gens[2][0].chain, "L"));

  f = data("klein_bottle.cells").string();
  m = parse_cells(f);
  gens = generators_of(run({"homology", "--json", "--generators", f}));
  check_all_cycles(m, gens, 0);
  // H_1 = Z^2 / (2a) = Z + Z/2: the free generator has b-coefficient +-1, the order-2 one is
  // an odd multiple of a (by hand)
  REQUIRE(gens[1].size() == 2);
  CHECK(abs(coefficient_of(gens[1][0].chain, "b")) == 1);
  CHECK(gens[1][1].order == 2);
  CHECK(coefficient_of(gens[1][1].chain, "b") == 0);
  CHECK(mod(coefficient_of(gens[1][1].chain, "a"), 2) == 1);
}

TEST_CASE("--generators over fields: cycles mod p, over Q scaled to integers") {
  // over Z/2, RP^2 has one generator in each dimension: p, q, r (2q = 0 mod 2; by hand)
  auto f = data("projective_plane.cells").string();
  auto m = parse_cells(f);
  auto gens = generators_of(run({"homology", "--json", "--generators", "--coefficients", "Z/2", f}));
  check_all_cycles(m, gens, 2);
  REQUIRE(gens.size() == 3);
  for (const auto& g : gens) {
    REQUIRE(g.size() == 1);
    CHECK(g[0].order == 0);
  }
  CHECK(gens[2][0].chain == terms{{1, "r"}});
  for (const char* co : {"Z/3", "Z/65521", "Q"}) {
    CAPTURE(co);
    for (const char* name : {"torus.cells", "klein_bottle.cells", "torsion_mix.cells"}) {
      CAPTURE(name);
      f = data(name).string();
      m = parse_cells(f);
      gens = generators_of(run({"homology", "--json", "--generators", "--coefficients", co, f}));
      const std::string c = co;
      check_all_cycles(m, gens, c == "Q" ? big(0) : big(c.substr(2)));
    }
  }
}

TEST_CASE("--generators on .facets files: labels in vertex order, cycles") {
  for (const char* name : {"hollow_triangle.facets", "rp2_6.facets"}) {
    CAPTURE(name);
    const auto f = data(name).string();
    const auto m = parse_facets(f);
    for (const char* co : {"Z", "Z/2", "Q"}) {
      CAPTURE(co);
      const auto gens = generators_of(run({"homology", "--json", "--generators", "--coefficients", co, f}));
      check_all_cycles(m, gens, std::string(co) == "Z/2" ? 2 : 0);
    }
  }
  // the hollow triangle: Z_1 = Z (x y - x z + y z) (by hand), so the generator is that, up to sign
  const auto gens = generators_of(run({"homology", "--json", "--generators", data("hollow_triangle.facets").string()}));
  REQUIRE(gens.at(1).size() == 1);
  const auto& g = gens[1][0].chain;
  CHECK(g.size() == 3);
  CHECK(abs(coefficient_of(g, "x y")) == 1);
  CHECK(coefficient_of(g, "x z") == -coefficient_of(g, "x y"));
  CHECK(coefficient_of(g, "y z") == coefficient_of(g, "x y"));
}

TEST_CASE("--generators on an image, a volume and a mesh: names as documented, cycles") {
  temp_dir dir;
  // the 3x3 ring of pixels (row y = 1 has the hole)
  std::vector<std::vector<int>> ring;
  for (int y = 0; y < 3; ++y)
    for (int x = 0; x < 3; ++x)
      if (x != 1 || y != 1) ring.push_back({x, y});
  auto gens = generators_of(run({"homology", "--json", "--generators",
                                 dir.write("ring.pbm", "P1\n3 3\n1 1 1\n1 0 1\n1 1 1\n")}));
  check_all_cycles(cubical_model(ring), gens, 0);
  REQUIRE(gens.size() == 3);
  CHECK(gens[1].size() == 1);
  // the hollow 3x3x3 block: H_2 = Z, a cycle of squares
  std::vector<std::vector<int>> hollow;
  std::string bytes;
  for (int z = 0; z < 3; ++z)
    for (int y = 0; y < 3; ++y)
      for (int x = 0; x < 3; ++x) {
        const bool centre = x == 1 && y == 1 && z == 1;
        bytes.push_back(centre ? '\0' : '\x01');
        if (!centre) hollow.push_back({x, y, z});
      }
  gens = generators_of(run({"homology", "--json", "--generators",
                            dir.write("hollow.nrrd", "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 3 3 3\nencoding: raw\n\n" + bytes)}));
  check_all_cycles(cubical_model(hollow), gens, 0);
  REQUIRE(gens.size() == 4);
  CHECK(gens[2].size() == 1);
  // the cube surface: H_2 = Z, every face with coefficient +-1 (a closed orientable surface:
  // the fundamental class; Hatcher, Algebraic Topology, 2002, Theorem 3.26, from memory)
  const auto off = data("cube.off").string();
  gens = generators_of(run({"homology", "--json", "--generators", off}));
  check_all_cycles(off_model(off), gens, 0);
  REQUIRE(gens.at(2).size() == 1);
  CHECK(gens[2][0].chain.size() == 6);
  for (const auto& [c, n] : gens[2][0].chain) CHECK(abs(c) == 1);
}

TEST_CASE("--generators in human-readable output") {
  const auto r = run({"homology", "--generators", data("projective_plane.cells").string()});
  CHECK(r.status == 0);
  // the generators of RP^2 from one cell in each dimension are +-p and an odd multiple of q
  // (by hand: no other cells); H_2 = 0 has none
  CHECK(std::regex_search(r.out, std::regex(R"(\nH_0 = Z\n  generator \(free\): -?\[p\]\n)")));
  CHECK(std::regex_search(r.out, std::regex(R"(\nH_1 = Z/2\n  generator \(order 2\): -?(\d*[13579]\*)?\[q\]\n)")));
  CHECK(std::regex_search(r.out, std::regex(R"(\nH_2 = 0\n$)")));
}

}  // namespace cli_generators_test

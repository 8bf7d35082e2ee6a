// Tests of lacuna::cubical_complex: cell counts against hand counts and against Euler numbers
// computed independently from the voxel array (Gray 1971 in 2D; the octant form of
// Toriwaki & Yonekura 2002 in 3D), d∘d = 0 in dimensions 1..4, boundary/coboundary agreement,
// index <-> position round trips, and the memory per grid position.
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/validate.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <cstdint>
#include <map>
#include <random>
#include <vector>

namespace cubical_cubical_complex_test {

using lacuna::cubical_complex;

static_assert(lacuna::cell_complex<cubical_complex<1>>);
static_assert(lacuna::complex_with_coboundary<cubical_complex<3>>);
static_assert(lacuna::complex_with_coboundary<cubical_complex<4>>);

namespace {

template <std::size_t D>
std::vector<std::size_t> counts(const cubical_complex<D>& c) {
  std::vector<std::size_t> v;
  for (int k = 0; k <= static_cast<int>(D); ++k) v.push_back(c.cell_count(k));
  return v;
}

// A random voxel array with foreground probability p (fixed seed).
template <std::size_t D>
std::vector<std::uint8_t> random_voxels(const std::array<std::size_t, D>& n, double p, unsigned seed) {
  std::size_t total = 1;
  for (auto x : n) total *= x;
  std::mt19937 rng(seed);
  std::bernoulli_distribution coin(p);
  std::vector<std::uint8_t> v(total);
  for (auto& x : v) x = coin(rng) ? 1 : 0;
  return v;
}

// Gray (1971): the Euler number of a 2D binary image with 8-connected foreground is
// (n(Q1) - n(Q3) - 2 n(QD)) / 4 over all 2x2 windows of the zero-padded image, Q1 one pixel set,
// Q3 three set, QD the two diagonal pairs. This equals chi of the union of closed squares.
long gray_euler_2d(const std::vector<std::uint8_t>& img, std::size_t w, std::size_t h) {
  auto at = [&](long x, long y) -> int {
    if (x < 0 || y < 0 || x >= static_cast<long>(w) || y >= static_cast<long>(h)) return 0;
    return img[static_cast<std::size_t>(y) * w + static_cast<std::size_t>(x)] != 0;
  };
  long q1 = 0, q3 = 0, qd = 0;
  for (long y = -1; y < static_cast<long>(h); ++y)
    for (long x = -1; x < static_cast<long>(w); ++x) {
      const int a = at(x, y), b = at(x + 1, y), c = at(x, y + 1), d = at(x + 1, y + 1);
      const int s = a + b + c + d;
      if (s == 1) ++q1;
      if (s == 3) ++q3;
      if (s == 2 && a == d) ++qd;  // a,d both set or b,c both set
    }
  return (q1 - q3 - 2 * qd) / 4;
}

// Octant form of the local Euler number (Toriwaki & Yonekura 2002): chi of a union of closed
// unit cubes is the sum over lattice points p of the 2x2x2 window of voxels around p, weighted
// 8*[some voxel] - 4*#edges at p + 2*#faces at p - #cubes at p, divided by 8 (each edge has 2
// ends, each square 4 corners, each cube 8). The weights of all 256 windows come from a table.
long octant_euler_3d(const std::vector<std::uint8_t>& vox, const std::array<std::size_t, 3>& n) {
  static const std::array<int, 256> table = [] {
    std::array<int, 256> t{};
    for (int m = 0; m < 256; ++m) {
      auto bit = [m](int i, int j, int k) { return (m >> (i + 2 * j + 4 * k)) & 1; };
      int any = m != 0, edges = 0, faces = 0, cubes = __builtin_popcount(static_cast<unsigned>(m));
      // edges at p along each axis and side: present if one of the 4 voxels on that side is set
      for (int side = 0; side < 2; ++side) {
        int ex = 0, ey = 0, ez = 0;
        for (int u = 0; u < 2; ++u)
          for (int v = 0; v < 2; ++v) {
            ex |= bit(side, u, v);
            ey |= bit(u, side, v);
            ez |= bit(u, v, side);
          }
        edges += ex + ey + ez;
      }
      // faces at p: a quarter plane on each of the 3 planes, 4 quadrants each, present if one
      // of the 2 voxels beside it is set
      for (int u = 0; u < 2; ++u)
        for (int v = 0; v < 2; ++v) {
          faces += bit(0, u, v) | bit(1, u, v);  // face normal to x
          faces += bit(u, 0, v) | bit(u, 1, v);  // normal to y
          faces += bit(u, v, 0) | bit(u, v, 1);  // normal to z
        }
      t[static_cast<std::size_t>(m)] = 8 * any - 4 * edges + 2 * faces - cubes;
    }
    return t;
  }();
  auto at = [&](long x, long y, long z) -> int {
    if (x < 0 || y < 0 || z < 0 || x >= static_cast<long>(n[0]) || y >= static_cast<long>(n[1]) ||
        z >= static_cast<long>(n[2]))
      return 0;
    return vox[(static_cast<std::size_t>(z) * n[1] + static_cast<std::size_t>(y)) * n[0] + static_cast<std::size_t>(x)] != 0;
  };
  long sum = 0;
  for (long z = 0; z <= static_cast<long>(n[2]); ++z)
    for (long y = 0; y <= static_cast<long>(n[1]); ++y)
      for (long x = 0; x <= static_cast<long>(n[0]); ++x) {
        int m = 0;
        for (int k = 0; k < 2; ++k)
          for (int j = 0; j < 2; ++j)
            for (int i = 0; i < 2; ++i) m |= at(x - 1 + i, y - 1 + j, z - 1 + k) << (i + 2 * j + 4 * k);
        sum += table[static_cast<std::size_t>(m)];
      }
  CHECK(sum % 8 == 0);
  return sum / 8;
}

// Cell counts straight from the voxel array: a lattice cell (a position of the doubled grid) is
// present when one of the voxels around it is set. Brute force over the grid, independent of
// the class bitmaps and their closure.
template <std::size_t D>
std::vector<std::size_t> brute_counts(const std::vector<std::uint8_t>& vox, const std::array<std::size_t, D>& n) {
  std::vector<std::size_t> out(D + 1, 0);
  std::array<std::size_t, D> p{};
  std::size_t grid = 1;
  for (auto x : n) grid *= 2 * x + 1;
  for (std::size_t g = 0; g < grid; ++g) {
    // voxels adjacent: odd coordinate 2v+1 -> v; even 2t -> t-1 and t
    bool present = false;
    int dim = 0;
    for (auto x : p) dim += static_cast<int>(x & 1);
    for (unsigned choice = 0; choice < (1u << D) && !present; ++choice) {
      std::size_t lin = 0, stride = 1;
      bool ok = true;
      for (std::size_t a = 0; a < D; ++a) {
        long v = (p[a] & 1) ? static_cast<long>(p[a] / 2) : static_cast<long>(p[a] / 2) - 1 + ((choice >> a) & 1);
        if (v < 0 || v >= static_cast<long>(n[a])) { ok = false; break; }
        lin += static_cast<std::size_t>(v) * stride;
        stride *= n[a];
      }
      if (ok && vox[lin]) present = true;
    }
    if (present) ++out[static_cast<std::size_t>(dim)];
    for (std::size_t a = 0; a < D; ++a) {
      if (++p[a] <= 2 * n[a]) break;
      p[a] = 0;
    }
  }
  return out;
}

template <std::size_t D>
void check_dd_zero(const cubical_complex<D>& c) {
  CHECK_NOTHROW(lacuna::validate(c));  // the library's own checker: faces in range, dd = 0
  for (int k = 2; k <= c.top_dimension(); ++k) {
    std::map<std::size_t, std::int64_t> acc;
    for (std::size_t i = 0; i < c.cell_count(k); ++i) {
      acc.clear();
      for (const auto& x : lacuna::boundary(c, k, i))
        for (const auto& y : lacuna::boundary(c, k - 1, x.face)) acc[y.face] += x.coefficient * y.coefficient;
      for (auto [f, v] : acc) REQUIRE(v == 0);  // d(d(cell)) = 0
    }
  }
}

template <std::size_t D>
void check_cobound_and_roundtrip(const cubical_complex<D>& c) {
  for (int k = 0; k <= c.top_dimension(); ++k) {
    std::size_t boundary_terms = 0, coboundary_terms = 0;
    std::size_t expect = 0;
    c.for_each_cell(k, [&](std::size_t i, const auto& p) {
      REQUIRE(i == expect++);
      REQUIRE(c.position(k, i) == p);
      REQUIRE(c.index_of(p) == i);
      REQUIRE(cubical_complex<D>::dimension_of(p) == k);
      const auto via_index = c.boundary(k, i), via_position = c.boundary_at(p);
      REQUIRE(std::equal(via_index.begin(), via_index.end(), via_position.begin(), via_position.end()));
    });
    REQUIRE(expect == c.cell_count(k));
    for (std::size_t i = 0; i < c.cell_count(k); ++i) {
      const auto b = c.boundary(k, i);
      REQUIRE(b.size() == 2 * static_cast<std::size_t>(k));  // a k-cube has 2k facets
      boundary_terms += b.size();
      for (const auto& x : b) {
        bool found = false;
        for (const auto& y : c.coboundary(k - 1, x.face))
          if (y.face == i) {
            REQUIRE(y.coefficient == x.coefficient);
            found = true;
          }
        REQUIRE(found);
      }
    }
    if (k >= 1) {
      for (std::size_t f = 0; f < c.cell_count(k - 1); ++f) coboundary_terms += c.coboundary(k - 1, f).size();
      CHECK(boundary_terms == coboundary_terms);
    }
  }
}

}  // namespace

TEST_CASE("a single voxel: 8 vertices, 12 edges, 6 squares, 1 cube") {
  const auto c = cubical_complex<3>::from_bytes({1, 1, 1}, std::vector<std::uint8_t>{1});
  CHECK(c.top_dimension() == 3);
  CHECK(counts(c) == std::vector<std::size_t>{8, 12, 6, 1});  // the cube's faces, by hand
  CHECK(lacuna::euler_characteristic(c) == 1);                 // a ball
  CHECK(c.grid_position_count() == 27);
}

TEST_CASE("a single pixel and a single 1D interval; hypercube in 4D") {
  const auto p = cubical_complex<2>::from_bytes({1, 1}, std::vector<std::uint8_t>{1});
  CHECK(counts(p) == std::vector<std::size_t>{4, 4, 1});
  const auto i = cubical_complex<1>::from_bytes({3}, std::vector<std::uint8_t>{1, 0, 1});
  CHECK(counts(i) == std::vector<std::size_t>{4, 2});  // two separate intervals
  CHECK(lacuna::euler_characteristic(i) == 2);
  const auto h = cubical_complex<4>::from_bytes({1, 1, 1, 1}, std::vector<std::uint8_t>{1});
  // the tesseract: 16 vertices, 32 edges, 24 squares, 8 cubes, 1 (from memory)
  CHECK(counts(h) == std::vector<std::size_t>{16, 32, 24, 8, 1});
}

TEST_CASE("the empty image is the empty complex") {
  const auto c = cubical_complex<2>::from_bytes({5, 4}, std::vector<std::uint8_t>(20, 0));
  CHECK(c.top_dimension() == -1);
  CHECK(counts(c) == std::vector<std::size_t>{0, 0, 0});
  CHECK(lacuna::total_cell_count(c) == 0);
  const cubical_complex<3> d;
  CHECK(d.top_dimension() == -1);
  CHECK(d.cell_count(0) == 0);
  CHECK(d.cell_count(7) == 0);
  CHECK_THROWS_AS(d.position(0, 0), std::out_of_range);
}

TEST_CASE("3x3x3 with the centre removed: a hollow cube, chi = 2") {
  std::vector<std::uint8_t> v(27, 1);
  v[13] = 0;
  const auto c = cubical_complex<3>::from_bytes({3, 3, 3}, v);
  // full 3x3x3 block: 4^3 vertices, 3*3*4*4 edges, 3*3*3*4 squares, 27 cubes; removing the centre
  // removes only its open cube (by hand)
  CHECK(counts(c) == std::vector<std::size_t>{64, 144, 108, 26});
  CHECK(lacuna::euler_characteristic(c) == 2);  // components - tunnels + cavities = 1 - 0 + 1
  CHECK(octant_euler_3d(v, {3, 3, 3}) == 2);
  CHECK_FALSE(c.is_foreground({1, 1, 1}));
  CHECK(c.is_foreground({0, 1, 1}));
  // the centre cube's faces remain
  CHECK(c.contains({3, 3, 2}));
  CHECK_FALSE(c.contains({3, 3, 3}));
}

TEST_CASE("a solid torus of voxels, chi = 0; corner contact connects") {
  // a 4x4 ring (centre 2x2 removed), two layers thick
  const auto c = cubical_complex<3>::from_predicate({4, 4, 2}, [](const std::array<std::size_t, 3>& v) {
    return !(v[0] >= 1 && v[0] <= 2 && v[1] >= 1 && v[1] <= 2);
  });
  CHECK(lacuna::euler_characteristic(c) == 0);  // 1 component - 1 tunnel + 0 cavities
  // two voxels sharing only a corner: 15 vertices, 24 edges, 12 squares, 2 cubes (by hand)
  std::vector<std::uint8_t> two(8, 0);
  two[0] = 1;
  two[7] = 1;
  const auto d = cubical_complex<3>::from_bytes({2, 2, 2}, two);
  CHECK(counts(d) == std::vector<std::size_t>{15, 24, 12, 2});
  CHECK(lacuna::euler_characteristic(d) == 1);  // one component: connected through the corner
}

TEST_CASE("a 2D ring of pixels with a diagonal gap: closed squares connect at corners") {
  // 3x3 ring: chi = 1 - 1 = 0 (Gray's formula agrees)
  std::vector<std::uint8_t> ring{1, 1, 1, 1, 0, 1, 1, 1, 1};
  const auto c = cubical_complex<2>::from_bytes({3, 3}, ring);
  CHECK(counts(c) == std::vector<std::size_t>{16, 24, 8});  // 4x4 vertices, 24 edges, by hand
  CHECK(lacuna::euler_characteristic(c) == 0);
  CHECK(gray_euler_2d(ring, 3, 3) == 0);
  // a diagonal staircase closes a loop only through corner contacts
  std::vector<std::uint8_t> diamond{0, 1, 0, 1, 0, 1, 0, 1, 0};
  const auto d = cubical_complex<2>::from_bytes({3, 3}, diamond);
  CHECK(lacuna::euler_characteristic(d) == 0);  // one component, one hole (8-connected)
  CHECK(gray_euler_2d(diamond, 3, 3) == 0);
}

TEST_CASE("orientation and names of a unit square") {
  const auto c = cubical_complex<2>::from_bytes({1, 1}, std::vector<std::uint8_t>{1});
  std::map<std::string, std::int64_t> b;
  for (const auto& x : c.boundary(2, 0)) b[c.cell_name(1, x.face)] = x.coefficient;
  // d[0,1]x[0,1] = (upper - lower along axis 0) - (upper - lower along axis 1): counterclockwise
  CHECK(b == std::map<std::string, std::int64_t>{{"[1]x[0,1]", 1}, {"[0]x[0,1]", -1}, {"[0,1]x[1]", -1}, {"[0,1]x[0]", 1}});
  CHECK(c.cell_name(2, 0) == "[0,1]x[0,1]");
  const auto e = *c.find({1, 0});
  std::map<std::string, std::int64_t> eb;
  for (const auto& x : c.boundary(1, e)) eb[c.cell_name(0, x.face)] = x.coefficient;
  CHECK(eb == std::map<std::string, std::int64_t>{{"[1]x[0]", 1}, {"[0]x[0]", -1}});
  CHECK(cubical_complex<3>::position_name({5, 10, 1}) == "[2,3]x[5]x[0,1]");
  CHECK_FALSE(c.find({3, 0}).has_value());
}

TEST_CASE("random 2D images: chi equals Gray's Euler number") {
  for (unsigned seed = 1; seed <= 30; ++seed) {
    const std::size_t w = 5 + seed % 13, h = 3 + (seed * 7) % 17;
    const auto img = random_voxels<2>({w, h}, 0.2 + 0.02 * seed, seed);
    const auto c = cubical_complex<2>::from_bytes({w, h}, img);
    CHECK(lacuna::euler_characteristic(c) == gray_euler_2d(img, w, h));
    CHECK(counts(c) == brute_counts<2>(img, {w, h}));
  }
}

TEST_CASE("random 3D volumes: chi equals the octant Euler number, counts equal brute force") {
  for (unsigned seed = 1; seed <= 20; ++seed) {
    const std::array<std::size_t, 3> n{3 + seed % 7, 2 + seed % 5, 4 + seed % 3};
    const auto v = random_voxels<3>(n, 0.15 + 0.035 * seed, 100 + seed);
    const auto c = cubical_complex<3>::from_bytes(n, v);
    CHECK(lacuna::euler_characteristic(c) == octant_euler_3d(v, n));
    CHECK(counts(c) == brute_counts<3>(v, n));
  }
  // a larger one that crosses many words and select samples
  const std::array<std::size_t, 3> n{37, 29, 23};
  const auto v = random_voxels<3>(n, 0.4, 7);
  const auto c = cubical_complex<3>::from_bytes(n, v);
  CHECK(lacuna::euler_characteristic(c) == octant_euler_3d(v, n));
  CHECK(counts(c) == brute_counts<3>(v, n));
  check_cobound_and_roundtrip(c);
}

TEST_CASE("d o d = 0, boundary/coboundary agreement and round trips in dimensions 1..4") {
  for (unsigned seed = 1; seed <= 4; ++seed) {
    const auto v1 = random_voxels<1>({40}, 0.5, seed);
    const auto c1 = cubical_complex<1>::from_bytes({40}, v1);
    CHECK(counts(c1) == brute_counts<1>(v1, {40}));
    check_cobound_and_roundtrip(c1);

    const auto v2 = random_voxels<2>({9, 11}, 0.5, seed);
    const auto c2 = cubical_complex<2>::from_bytes({9, 11}, v2);
    check_dd_zero(c2);
    check_cobound_and_roundtrip(c2);

    const auto v3 = random_voxels<3>({6, 5, 7}, 0.45, seed);
    const auto c3 = cubical_complex<3>::from_bytes({6, 5, 7}, v3);
    check_dd_zero(c3);
    check_cobound_and_roundtrip(c3);

    const auto v4 = random_voxels<4>({4, 3, 5, 3}, 0.4, seed);
    const auto c4 = cubical_complex<4>::from_bytes({4, 3, 5, 3}, v4);
    CHECK(counts(c4) == brute_counts<4>(v4, {4, 3, 5, 3}));
    check_dd_zero(c4);
    check_cobound_and_roundtrip(c4);
  }
}

TEST_CASE("voxel bitmap constructor, from_predicate and bad arguments") {
  std::vector<std::uint64_t> bits{0b1011};
  const cubical_complex<2> c({2, 2}, bits);  // voxels (0,0), (1,0), (1,1)
  CHECK(c.is_foreground({0, 0}));
  CHECK_FALSE(c.is_foreground({0, 1}));
  CHECK(c.cell_count(2) == 3);
  const auto d = cubical_complex<2>::from_predicate({2, 2}, [](const std::array<std::size_t, 2>& v) {
    return !(v[0] == 0 && v[1] == 1);
  });
  CHECK(counts(c) == counts(d));
  CHECK_THROWS_AS(cubical_complex<2>({100, 100}, std::vector<std::uint64_t>(3)), std::invalid_argument);
  const std::size_t huge = std::size_t{1} << 40;
  CHECK_THROWS_AS(cubical_complex<2>({huge, huge}, {}), std::length_error);
  CHECK_THROWS_AS(cubical_complex<3>::from_bytes({4, 4, 4}, std::vector<std::uint8_t>(10)), std::invalid_argument);
}

TEST_CASE("memory: bytes per grid position") {
  const std::array<std::size_t, 3> n{96, 96, 96};
  const auto v = random_voxels<3>(n, 0.3, 11);
  const auto c = cubical_complex<3>::from_bytes(n, v);
  const double per_position = static_cast<double>(c.memory_bytes()) / static_cast<double>(c.grid_position_count());
  MESSAGE("cubical_complex<3> 96^3: " << c.memory_bytes() << " bytes for " << c.grid_position_count()
                                      << " grid positions = " << per_position << " bytes per position");
  CHECK(per_position < 0.2);  // the layout: 1 bit + a 64-bit count per 512 bits + samples
  CHECK(lacuna::euler_characteristic(c) == octant_euler_3d(v, n));
}

}  // namespace cubical_cubical_complex_test

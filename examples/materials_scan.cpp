// A demo in a made-up setting: the CT scan of a sintered porous part, counted with lacuna.
//
// The program makes its own volume (nothing is read): powder grains — balls of varying radius
// from a fixed-seed std::mt19937 — poured into a block and sintered, densest in the core,
// with a few gas bubbles trapped there and a few loose grains lying beside the part. It then
//   1. counts the solid's pieces, tunnels and sealed voids: H_0, H_1, H_2 over the integers,
//      with generators (lacuna::homology on the cubical complex of the volume);
//   2. checks the Euler characteristic b_0 - b_1 + b_2 against the Euler number of the volume
//      counted independently here from 2x2x2 voxel neighbourhoods (Toriwaki & Yonekura 2002),
//      and the Betti numbers against the library's second, independent route (voxel labellings
//      and Alexander duality, algorithm/cubical_duality.hpp);
//   3. says where each sealed void is: the box of the pore voxels its H_2 generator winds
//      around, the winding numbers computed from the generator's squares;
//   4. looks at pore sizes: persistence of the superlevel sets of the Euclidean distance to the
//      solid (Felzenszwalb & Huttenlocher 2012 for the exact distance transform);
//   5. writes the volume as NRRD (for `lacuna homology`), a picture of slices with the sealed
//      voids marked, and the persistence diagram of the pore sizes, as SVG.
// It exits 1 (printing FAIL) when a check fails, 2 on bad arguments.
//
//   materials_scan [--size N] [--output DIR]     N voxels per side (default 128, 16..256)
#include <lacuna/algorithm/cubical_duality.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/persistence_svg.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <array>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <limits>
#include <optional>
#include <random>
#include <sstream>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace {

int failures = 0;
void expect(bool ok, const std::string& what) {
  if (!ok) {
    std::cout << "FAIL: " << what << "\n";
    ++failures;
  }
}

// ---- the volume ------------------------------------------------------------------------

/// A cube of n^3 voxels, voxel (x, y, z) at x + n (y + n z): axis 0 fastest, as the library
/// and NRRD number them.
struct volume {
  std::size_t n = 0;
  std::vector<std::uint8_t> solid;
  std::size_t at(std::size_t x, std::size_t y, std::size_t z) const { return x + n * (y + n * z); }
};

/// Uniform numbers from the raw 32-bit outputs of std::mt19937, whose sequence the standard
/// fixes (the 10000th output of the default seed is 4123659995). std::uniform_real_distribution
/// is not used: its algorithm is left to the implementation, so its values differ between
/// standard libraries.
struct uniform_source {
  std::mt19937 engine;
  explicit uniform_source(std::uint32_t seed) : engine(seed) {}
  /// In [0, 1), a multiple of 2^-32.
  double unit() { return static_cast<double>(engine()) / 4294967296.0; }
  double between(double lo, double hi) { return lo + (hi - lo) * unit(); }
};

struct ball {
  double x, y, z, r;
};

// ---- the exact Euclidean distance transform (Felzenszwalb & Huttenlocher 2012) -----------

constexpr std::int64_t far_away = std::numeric_limits<std::int64_t>::max();

/// One line of the squared distance transform: out[x] = min over q of (x - q)^2 + f[q]
/// (far_away terms skipped), by the lower envelope of parabolas of Felzenszwalb & Huttenlocher,
/// "Distance transforms of sampled functions", Theory of Computing 8 (2012). The breakpoints
/// between parabolas are rationals compared by cross-multiplication, so every value is exact
/// (numerators stay below 4 n^2 + 3 n^2, far inside 64 bits for n <= 256).
void distance_line(const std::vector<std::int64_t>& f, std::vector<std::int64_t>& out, std::vector<std::int64_t>& hull) {
  const auto len = static_cast<std::int64_t>(f.size());
  hull.clear();
  // the breakpoint between the parabolas of p < q: ((f[q] + q^2) - (f[p] + p^2)) / (2 (q - p))
  const auto num = [&](std::int64_t p, std::int64_t q) { return (f[q] + q * q) - (f[p] + p * p); };
  const auto den = [](std::int64_t p, std::int64_t q) { return 2 * (q - p); };
  for (std::int64_t q = 0; q < len; ++q) {
    if (f[q] == far_away) continue;
    // drop the last parabola while the new one overtakes it no later than it overtook its predecessor
    while (hull.size() >= 2) {
      const std::int64_t a = hull[hull.size() - 2], b = hull.back();
      if (num(b, q) * den(a, b) <= num(a, b) * den(b, q))
        hull.pop_back();
      else
        break;
    }
    hull.push_back(q);
  }
  if (hull.empty()) {
    std::fill(out.begin(), out.end(), far_away);
    return;
  }
  std::size_t k = 0;
  for (std::int64_t x = 0; x < len; ++x) {
    while (k + 1 < hull.size() && num(hull[k], hull[k + 1]) < x * den(hull[k], hull[k + 1])) ++k;
    const std::int64_t d = x - hull[k];
    out[static_cast<std::size_t>(x)] = d * d + f[static_cast<std::size_t>(hull[k])];
  }
}

/// The squared Euclidean distance from every voxel centre of an n^3 scan to the nearest centre
/// of a voxel marked in `target` (0 on those), separably along the three axes; far_away
/// everywhere when none is marked.
std::vector<std::int64_t> squared_distance_to(std::size_t n, const std::vector<std::uint8_t>& target) {
  std::vector<std::int64_t> d(n * n * n);
  for (std::size_t i = 0; i < d.size(); ++i) d[i] = target[i] ? 0 : far_away;
  std::vector<std::int64_t> f(n), out(n), hull;
  const std::array<std::size_t, 3> stride{1, n, n * n};
  for (std::size_t axis = 0; axis < 3; ++axis) {
    const std::size_t s = stride[axis], s1 = stride[(axis + 1) % 3], s2 = stride[(axis + 2) % 3];
    for (std::size_t b = 0; b < n; ++b)
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t base = a * s1 + b * s2;
        for (std::size_t t = 0; t < n; ++t) f[t] = d[base + t * s];
        distance_line(f, out, hull);
        for (std::size_t t = 0; t < n; ++t) d[base + t * s] = out[t];
      }
  }
  return d;
}

/// Sets (value) every voxel whose centre lies in the ball.
void paint(volume& v, const ball& b, std::uint8_t value) {
  const auto lo = [&](double c) { return static_cast<std::size_t>(std::max(0.0, std::ceil(c - b.r - 0.5))); };
  const auto hi = [&](double c) {
    return static_cast<std::size_t>(std::clamp(std::floor(c + b.r - 0.5), -1.0, static_cast<double>(v.n) - 1) + 1);
  };
  for (std::size_t z = lo(b.z); z < hi(b.z); ++z)
    for (std::size_t y = lo(b.y); y < hi(b.y); ++y)
      for (std::size_t x = lo(b.x); x < hi(b.x); ++x) {
        const double dx = x + 0.5 - b.x, dy = y + 0.5 - b.y, dz = z + 0.5 - b.z;
        if (dx * dx + dy * dy + dz * dz <= b.r * b.r) v.solid[v.at(x, y, z)] = value;
      }
}

/// The parameters of the made-up scan; lengths are for a 128^3 scan and scale with its size.
struct scan_recipe {
  std::uint32_t seed = 20260611u;
  double margin = 16;             ///< air between the block of powder and the scan's faces
  double packing = 0.62;          ///< grain volume put in, per unit of block volume
  double grain_min = 2.5, grain_max = 5.5;  ///< grain radii
  double neck = 1.5;              ///< sintering: gaps narrower than about twice this close
  double core_growth = 0.3;       ///< grains grow by up to this fraction towards the core (denser there)
  int bubbles = 6;                ///< gas bubbles trapped in the core
  double bubble_min = 2.5, bubble_max = 4.5;
  int loose = 4;                  ///< loose grains lying in the air beside the block
};

/// The scan: powder grains (balls of random centre and radius) poured into a block; sintering
/// grows necks between them, modelled as a morphological closing by a ball (dilate, then
/// erode: gaps narrower than the ball close and pore throats narrow, so some pores are sealed
/// off); gas bubbles trapped in the core; loose grains in the air beside the block.
volume make_scan(std::size_t n, const scan_recipe& r = {}) {
  volume v{n, std::vector<std::uint8_t>(n * n * n, 0)};
  const double s = static_cast<double>(n) / 128.0, size = std::max(s, 0.4);  // grains stay at least a few voxels wide
  uniform_source rng(r.seed);
  const double lo = r.margin * s, hi = n - r.margin * s, mid = n / 2.0;
  const double grain_volume = 4.0 / 3.0 * 3.14159265358979 * std::pow((r.grain_min + r.grain_max) / 2 * size, 3);
  const auto grains = static_cast<std::size_t>(r.packing * std::pow(hi - lo, 3) / grain_volume);
  for (std::size_t i = 0; i < grains; ++i) {
    ball b{rng.between(lo, hi), rng.between(lo, hi), rng.between(lo, hi), rng.between(r.grain_min, r.grain_max) * size};
    // depth 0 at the block's centre, 1 on its faces (max norm); the inner 60 % grow
    const double depth = std::max({std::abs(b.x - mid), std::abs(b.y - mid), std::abs(b.z - mid)}) / ((hi - lo) / 2);
    b.r *= 1.0 + r.core_growth * std::max(0.0, 1.0 - depth / 0.6);
    paint(v, b, 1);
  }
  // sintering: closing by a ball of radius `neck`, through two exact distance transforms
  const auto neck2 = static_cast<std::int64_t>(std::floor(std::pow(std::max(r.neck * s, 1.5), 2)));  // at least the 2-voxel gaps
  const auto to_solid = squared_distance_to(n, v.solid);
  std::vector<std::uint8_t> outside(n * n * n);
  for (std::size_t i = 0; i < outside.size(); ++i) outside[i] = to_solid[i] > neck2;
  const auto to_outside = squared_distance_to(n, outside);
  for (std::size_t i = 0; i < outside.size(); ++i) v.solid[i] = to_outside[i] > neck2;
  for (int i = 0; i < r.bubbles; ++i) {
    const double c = 16 * s;
    paint(v, {rng.between(mid - c, mid + c), rng.between(mid - c, mid + c), rng.between(mid - c, mid + c),
              rng.between(r.bubble_min, r.bubble_max) * size}, 0);
  }
  for (int i = 0; i < r.loose; ++i) {
    const double radius = std::min(rng.between(2.0, 3.5) * size, r.margin * s / 3);
    const double t = rng.between(lo, hi), u = rng.between(lo, hi);
    const double side = (i % 2 == 0) ? r.margin * s / 2 : n - r.margin * s / 2;
    paint(v, i % 4 < 2 ? ball{side, t, u, radius} : ball{t, side, u, radius}, 1);
  }
  return v;
}

// ---- the Euler number from 2x2x2 neighbourhoods (Toriwaki & Yonekura 2002) ---------------

/// The Euler number of the union of the closed solid voxels, counted without the library.
/// Every grid vertex (i, j, k), 0 <= i, j, k <= n, is the lower corner of one vertex, three
/// edges (+x, +y, +z), three squares and one cube of the grid, and each of these is in the
/// union exactly when a voxel of the 2x2x2 block around the vertex that contains it is solid:
/// the vertex needs any of the 8, the +x edge any of the 4 with x index i, the xy square any
/// of the 2 with x index i and y index j, the cube the voxel (i, j, k) itself. So
/// chi = V - E + F - C is a sum over the blocks of a value that depends on the block's 8 bits
/// only: the local-configuration Euler number of Toriwaki & Yonekura (2002), "Euler number and
/// connectivity indexes of a three dimensional digital picture", Forma 17, for the 26/6
/// connectivity pair (solid voxels that share a corner are joined). Voxels outside the scan
/// are background.
long long euler_number_from_neighbourhoods(const volume& v) {
  // bit (a + 2b + 4c) of a block: the voxel (i - 1 + a, j - 1 + b, k - 1 + c)
  std::array<int, 256> table{};
  for (unsigned m = 0; m < 256; ++m) {
    const auto any = [&](auto keep) {
      for (unsigned bit = 0; bit < 8; ++bit)
        if ((m >> bit & 1u) && keep(bit & 1u, bit >> 1 & 1u, bit >> 2 & 1u)) return 1;
      return 0;
    };
    const int vertices = any([](unsigned, unsigned, unsigned) { return true; });
    const int edges = any([](unsigned a, unsigned, unsigned) { return a == 1; }) +
                      any([](unsigned, unsigned b, unsigned) { return b == 1; }) +
                      any([](unsigned, unsigned, unsigned c) { return c == 1; });
    const int squares = any([](unsigned a, unsigned b, unsigned) { return a == 1 && b == 1; }) +
                        any([](unsigned a, unsigned, unsigned c) { return a == 1 && c == 1; }) +
                        any([](unsigned, unsigned b, unsigned c) { return b == 1 && c == 1; });
    const int cubes = any([](unsigned a, unsigned b, unsigned c) { return a == 1 && b == 1 && c == 1; });
    table[m] = vertices - edges + squares - cubes;
  }
  const auto n = static_cast<long long>(v.n);
  const auto voxel = [&](long long x, long long y, long long z) -> unsigned {
    if (x < 0 || y < 0 || z < 0 || x >= n || y >= n || z >= n) return 0;
    return v.solid[v.at(static_cast<std::size_t>(x), static_cast<std::size_t>(y), static_cast<std::size_t>(z))] ? 1u : 0u;
  };
  long long chi = 0;
  for (long long k = 0; k <= n; ++k)
    for (long long j = 0; j <= n; ++j)
      for (long long i = 0; i <= n; ++i) {
        unsigned m = 0;
        for (unsigned bit = 0; bit < 8; ++bit)
          m |= voxel(i - 1 + (bit & 1), j - 1 + (bit >> 1 & 1), k - 1 + (bit >> 2 & 1)) << bit;
        chi += table[m];
      }
  return chi;
}

// ---- where a sealed void is ---------------------------------------------------------------

/// A box of voxels, inclusive bounds per axis.
struct voxel_box {
  std::array<std::size_t, 3> lo{}, hi{};
};

/// What a sealed void's H_2 generator encloses.
struct enclosure {
  voxel_box box;             ///< of the pore voxels the cycle winds around
  std::size_t pore_voxels = 0;
  std::vector<std::pair<std::size_t, std::int64_t>> winding;  ///< (pore voxel, winding number), by voxel
  std::size_t squares = 0;   ///< of the cycle
  bool closes = true;        ///< the winding numbers vanish again beyond the scan (a check)
};

/// The pore voxels a 2-cycle z of the solid winds around. In the grid of all voxels of the
/// scan (a cube, whose H_2 and H_3 vanish) z is the boundary of exactly one 3-chain W, W(v)
/// the winding number of z around the centre of voxel v. By the orientation of cubical_complex
/// (+ on the upper face along the first free axis), the square in the plane x = t between
/// voxels t-1 and t carries W(t-1) - W(t) in dW, so W is a running sum along x from W = 0
/// before the scan. z - d(W on the solid) is homologous to z in the solid and is the boundary
/// of W on the pore voxels alone: those voxels are where the generator's class sits, and their
/// box is what is reported (no flood fill: only the generator's squares are read).
enclosure enclosed_by(const lacuna::cubical_complex<3>& c, const std::vector<std::uint8_t>& solid,
                      const lacuna::chain<lacuna::integer>& z) {
  const std::size_t n = c.extents()[0];
  // coefficient of the square in plane x = t at (y, z), for the squares of z with x bound
  std::vector<std::int64_t> jump((n + 1) * n * n, 0);
  enclosure e;
  e.squares = z.terms.size();
  for (const auto& t : z.terms) {
    const auto p = c.position(2, t.cell);
    if (p[0] % 2 != 0) continue;  // x is free: the square lies along x, it is crossed by no x line
    if (!t.coefficient.is_small()) throw std::overflow_error("a generator's coefficient passes 64 bits");
    jump[p[0] / 2 + (n + 1) * (p[1] / 2 + n * (p[2] / 2))] = t.coefficient.small_value();
  }
  std::array<std::size_t, 3> lo, hi{};
  lo.fill(std::numeric_limits<std::size_t>::max());
  for (std::size_t zz = 0; zz < n; ++zz)
    for (std::size_t y = 0; y < n; ++y) {
      std::int64_t w = 0;
      const auto step = [&](std::size_t x) {
        if (__builtin_sub_overflow(w, jump[x + (n + 1) * (y + n * zz)], &w))
          throw std::overflow_error("a winding number passes 64 bits");
      };
      for (std::size_t x = 0; x < n; ++x) {
        step(x);
        if (w != 0 && solid[x + n * (y + n * zz)] == 0) {
          ++e.pore_voxels;
          e.winding.emplace_back(x + n * (y + n * zz), w);
          const std::array<std::size_t, 3> v{x, y, zz};
          for (std::size_t a = 0; a < 3; ++a) lo[a] = std::min(lo[a], v[a]), hi[a] = std::max(hi[a], v[a]);
        }
      }
      step(n);
      if (w != 0) e.closes = false;
    }
  if (e.pore_voxels > 0) e.box = {lo, hi};
  std::sort(e.winding.begin(), e.winding.end());
  return e;
}

/// If the pore voxels of `inner` all lie among those of `outer`, with the windings of outer
/// there c times those of inner for one integer c, returns c: then outer - c * inner winds
/// around fewer voxels.
std::optional<std::int64_t> nested_multiple(const enclosure& inner, const enclosure& outer) {
  if (inner.winding.empty() || inner.winding.size() >= outer.winding.size()) return std::nullopt;
  std::optional<std::int64_t> c;
  auto it = outer.winding.begin();
  for (const auto& [voxel, w] : inner.winding) {
    it = std::lower_bound(it, outer.winding.end(), std::pair{voxel, std::numeric_limits<std::int64_t>::min()});
    if (it == outer.winding.end() || it->first != voxel || it->second % w != 0) return std::nullopt;
    if (c && *c != it->second / w) return std::nullopt;
    c = it->second / w;
  }
  return c;
}

/// A basis of H_2 whose cycles wind around as few pore voxels as this finds: while the region
/// of one generator z_i sits inside that of another z_j with proportional windings (factor c),
/// z_j becomes z_j - c z_i. Each step is a unimodular change of basis (the classes still form
/// a basis of H_2), computed on the chains themselves; the total number of enclosed voxels
/// drops at each step, so it ends. The engine may return a cycle around two voids when one
/// around each is as good; this separates such nested ones.
std::vector<enclosure> separated_voids(const lacuna::cubical_complex<3>& c, const std::vector<std::uint8_t>& solid,
                                       std::vector<lacuna::chain<lacuna::integer>> generators) {
  std::vector<enclosure> found;
  for (const auto& z : generators) found.push_back(enclosed_by(c, solid, z));
  for (bool changed = true; changed;) {
    changed = false;
    for (std::size_t i = 0; i < found.size(); ++i)
      for (std::size_t j = 0; j < found.size(); ++j)
        if (i != j)
          if (const auto m = nested_multiple(found[i], found[j])) {
            generators[j] = lacuna::add_scaled(generators[j], lacuna::integer(-*m), generators[i]);
            found[j] = enclosed_by(c, solid, generators[j]);
            changed = true;
          }
  }
  return found;
}

// ---- pictures ------------------------------------------------------------------------------

std::string fixed(double v, int digits = 2) {
  std::ostringstream o;
  o.imbue(std::locale::classic());
  o.setf(std::ios::fixed);
  o.precision(digits);
  o << v;
  return o.str();
}

/// Runs of voxels of one row with keep(x) true, as an SVG path in voxel units: "M x y h w v1 h-w z".
template <class Keep>
std::string row_runs(std::size_t n, std::size_t row, Keep keep) {
  std::string d;
  for (std::size_t x = 0; x < n;) {
    if (!keep(x)) {
      ++x;
      continue;
    }
    std::size_t e = x;
    while (e < n && keep(e)) ++e;
    d += "M" + std::to_string(x) + " " + std::to_string(row) + "h" + std::to_string(e - x) + "v1h-" +
         std::to_string(e - x) + "z";
    x = e;
  }
  return d;
}

/// Slices z = const of the volume (x to the right, y down) and a projection along z, as one SVG
/// document. Sealed voids (their boxes from the H_2 generators) are outlined, with labels, on
/// every slice that cuts their box, and all of them on the projection.
std::string slices_svg(const volume& v, const std::vector<std::size_t>& zs, const std::vector<voxel_box>& voids) {
  const std::size_t n = v.n;
  const double scale = 360.0 / static_cast<double>(n), panel = 360, gap = 24, left = 20, top = 56;
  const std::size_t panels = zs.size() + 1;
  const double width = left * 2 + panels * panel + (panels - 1) * gap, height = top + panel + 96;
  const char* solid_colour = "#4d4d4d";
  const char* pore_colour = "#f3e9c6";
  const char* void_colour = "#d7263d";
  std::string s = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"" +
                  fixed(width) + "\" height=\"" + fixed(height) + "\" viewBox=\"0 0 " + fixed(width) + " " + fixed(height) +
                  "\" font-family=\"DejaVu Sans, Helvetica, Arial, sans-serif\">\n"
                  "<title>Sintered part: slices and sealed voids</title>\n"
                  "<rect class=\"background\" x=\"0\" y=\"0\" width=\"" + fixed(width) + "\" height=\"" + fixed(height) +
                  "\" fill=\"#ffffff\"/>\n"
                  "<text x=\"" + fixed(left) + "\" y=\"26\" font-size=\"16\">Sintered part, " + std::to_string(n) + "\u00b3 voxels: slices z = const and a projection along z, sealed voids outlined</text>\n";
  const auto void_mark = [&](std::size_t id, const voxel_box& b, bool projection) {
    const double x = b.lo[0], y = b.lo[1], w = b.hi[0] - b.lo[0] + 1.0, h = b.hi[1] - b.lo[1] + 1.0;
    std::string m = "<g class=\"void" + std::string(projection ? " projection" : "") + "\" data-void=\"" +
                    std::to_string(id) + "\">";
    m += "<rect x=\"" + fixed(x - 0.5) + "\" y=\"" + fixed(y - 0.5) + "\" width=\"" + fixed(w + 1) + "\" height=\"" +
         fixed(h + 1) + "\" fill=\"none\" stroke=\"" + void_colour + "\" stroke-width=\"" + fixed(1.6 / scale) + "\"/>";
    m += "<text x=\"" + fixed(x + w + 1.5) + "\" y=\"" + fixed(y + 0.5) + "\" font-size=\"" + fixed(13 / scale) +
         "\" font-weight=\"bold\" fill=\"" + void_colour + "\" dominant-baseline=\"middle\">V" + std::to_string(id) +
         "</text></g>\n";
    return m;
  };
  for (std::size_t p = 0; p < panels; ++p) {
    const double ox = left + p * (panel + gap);
    const bool projection = p == zs.size();
    s += "<g class=\"" + std::string(projection ? "projection" : "slice") + "\"" +
         (projection ? std::string() : " data-z=\"" + std::to_string(zs[p]) + "\"") + " transform=\"translate(" +
         fixed(ox) + " " + fixed(top) + ") scale(" + fixed(scale, 4) + ")\">\n";
    s += "<rect x=\"0\" y=\"0\" width=\"" + std::to_string(n) + "\" height=\"" + std::to_string(n) + "\" fill=\"" +
         pore_colour + "\"/>\n";
    if (!projection) {
      std::string d;
      for (std::size_t y = 0; y < n; ++y) d += row_runs(n, y, [&](std::size_t x) { return v.solid[v.at(x, y, zs[p])] != 0; });
      s += "<path fill=\"" + std::string(solid_colour) + "\" d=\"" + d + "\"/>\n";
      for (std::size_t i = 0; i < voids.size(); ++i)
        if (voids[i].lo[2] <= zs[p] && zs[p] <= voids[i].hi[2]) s += void_mark(i + 1, voids[i], false);
    } else {
      // the fraction of solid along each line z = 0..n-1, in four grey levels
      std::vector<double> fraction(n * n, 0);
      for (std::size_t z = 0; z < n; ++z)
        for (std::size_t y = 0; y < n; ++y)
          for (std::size_t x = 0; x < n; ++x) fraction[x + n * y] += v.solid[v.at(x, y, z)] ? 1.0 / n : 0;
      static constexpr const char* greys[] = {"#d9d3bf", "#a8a294", "#77736a", "#4d4d4d"};
      for (int level = 0; level < 4; ++level) {
        std::string d;
        for (std::size_t y = 0; y < n; ++y)
          d += row_runs(n, y, [&](std::size_t x) {
            const double f = fraction[x + n * y];
            return f > 0 && std::min(3, static_cast<int>(f * 4 / 0.8)) == level;
          });
        if (!d.empty()) s += "<path fill=\"" + std::string(greys[level]) + "\" d=\"" + d + "\"/>\n";
      }
      for (std::size_t i = 0; i < voids.size(); ++i) s += void_mark(i + 1, voids[i], true);
    }
    s += "</g>\n";
    const std::string caption = projection ? "projection along z (darker: more solid)" : "slice z = " + std::to_string(zs[p]);
    s += "<text x=\"" + fixed(ox) + "\" y=\"" + fixed(top - 8) + "\" font-size=\"13\">" + caption + "</text>\n";
  }
  // legend
  const double ly = top + panel + 30;
  s += "<g class=\"legend\" font-size=\"13\">\n";
  s += "<rect x=\"" + fixed(left) + "\" y=\"" + fixed(ly - 11) + "\" width=\"14\" height=\"14\" fill=\"" + solid_colour + "\"/>";
  s += "<text x=\"" + fixed(left + 20) + "\" y=\"" + fixed(ly) + "\">solid</text>\n";
  s += "<rect x=\"" + fixed(left + 90) + "\" y=\"" + fixed(ly - 11) + "\" width=\"14\" height=\"14\" fill=\"" + pore_colour +
       "\" stroke=\"#999999\"/>";
  s += "<text x=\"" + fixed(left + 110) + "\" y=\"" + fixed(ly) + "\">pore or air</text>\n";
  s += "<rect x=\"" + fixed(left + 220) + "\" y=\"" + fixed(ly - 11) + "\" width=\"14\" height=\"14\" fill=\"none\" stroke=\"" +
       void_colour + "\" stroke-width=\"2\"/>";
  s += "<text x=\"" + fixed(left + 240) + "\" y=\"" + fixed(ly) + "\">sealed void Vi: the box of the voxels its H\u2082 generator encloses (" +
       std::to_string(voids.size()) + " in all)</text>\n";
  s += "<text x=\"" + fixed(left) + "\" y=\"" + fixed(ly + 24) +
       "\" fill=\"#555555\">x to the right, y down, in voxels; a void is outlined on each slice that cuts its box</text>\n";
  s += "</g>\n</svg>\n";
  return s;
}

void write_file(const std::filesystem::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  if (!out) throw std::runtime_error("cannot write " + path.string());
}

double seconds_since(std::chrono::steady_clock::time_point t) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t).count();
}

int run(std::size_t n, const std::filesystem::path& dir) {
  const auto start = std::chrono::steady_clock::now();
  std::filesystem::create_directories(dir);
  const volume scan = make_scan(n);
  std::size_t solid_voxels = 0;
  for (auto b : scan.solid) solid_voxels += b;
  std::cout << "Sintered part, CT-like scan of " << n << "^3 voxels (made up by this program, seed 20260611):\n"
            << "  solid " << fixed(100.0 * solid_voxels / scan.solid.size(), 1) << " % of the scan; solid voxels "
            << "touching at a corner belong together (closed unit cubes)\n";
  if (solid_voxels == 0) throw std::runtime_error("the scan has no solid voxel");

  const auto c = lacuna::cubical_complex<3>::from_bytes({n, n, n}, scan.solid);

  // 1. Homology over Z with generators. The Morse complex of the volume (cubical_morse.hpp:
  // Robins, Wood & Sheppard 2011) carries the algebra; generators are lifted back to the
  // volume's own squares. The groups are exact (integer Smith forms, overflow-checked).
  const auto h = lacuna::homology<lacuna::integer>(c, {.generators = true, .keep_basis = false, .threads = 2},
                                                   lacuna::sparse_elimination{.reduction = lacuna::pre_reduction::morse});
  const auto b = h.betti_numbers();
  std::cout << "\nHomology of the solid over the integers:\n"
            << "  H_0 = Z^" << b[0] << "   pieces (the part and the loose grains)\n"
            << "  H_1 = Z^" << b[1] << "   tunnels (independent loops through the solid around pore channels)\n"
            << "  H_2 = Z^" << b[2] << "   sealed voids (pores closed off from the outside)\n";
  for (const auto& g : h.groups) expect(g.torsion.empty(), "torsion in H_" + std::to_string(g.dimension) + " of a volume");

  // 2. Checks. (a) The Euler characteristic b_0 - b_1 + b_2 against the local-configuration
  // Euler number, counted above without the library. (b) The Betti numbers against the
  // library's duality route: voxel labellings (b_0, and b_2 by Alexander duality, Hatcher 2002,
  // Theorem 3.44), with b_1 from the complex's cell counts — no boundary matrix at all.
  const long long chi_h = static_cast<long long>(b[0]) - static_cast<long long>(b[1]) + static_cast<long long>(b[2]);
  const long long chi_local = euler_number_from_neighbourhoods(scan);
  std::cout << "\nChecks:\n"
            << "  Euler characteristic b_0 - b_1 + b_2 = " << chi_h << "\n"
            << "  Euler number from 2x2x2 voxel neighbourhoods (Toriwaki & Yonekura 2002) = " << chi_local << "\n"
            << "  agree: " << (chi_h == chi_local ? "yes" : "NO") << "\n";
  expect(chi_h == chi_local, "Euler characteristic differs from the local Euler number");
  const auto dual = lacuna::cubical_betti_numbers(c);
  const bool same = dual.size() == b.size() && std::equal(dual.begin(), dual.end(), b.begin());
  std::cout << "  Betti numbers by voxel labelling and Alexander duality: " << dual[0] << " " << dual[1] << " " << dual[2]
            << ", agree: " << (same ? "yes" : "NO") << "\n";
  expect(same, "Betti numbers differ between the algebra and the duality route");

  // 3. Where the sealed voids are: each H_2 generator is a 2-cycle of squares of the solid;
  // the pore voxels it winds around are found from its squares alone (enclosed_by), after
  // nested generators are separated by a change of basis (separated_voids).
  auto found = separated_voids(c, scan.solid, h[2].generators);
  for (const auto& e : found) {
    expect(e.closes, "an H_2 generator is not closed along some line of the scan");
    expect(e.pore_voxels > 0, "an H_2 generator winds around no pore voxel");
  }
  std::sort(found.begin(), found.end(), [](const enclosure& x, const enclosure& y) { return x.box.lo < y.box.lo; });
  std::vector<voxel_box> voids;
  std::cout << "\nSealed voids: the pore voxels each H_2 generator winds around (voxel coordinates x, y, z, inclusive):\n";
  for (std::size_t i = 0; i < found.size(); ++i) {
    const auto& v = found[i].box;
    voids.push_back(v);
    std::cout << "  V" << i + 1 << ": x " << v.lo[0] << ".." << v.hi[0] << ", y " << v.lo[1] << ".." << v.hi[1] << ", z "
              << v.lo[2] << ".." << v.hi[2] << "   " << found[i].pore_voxels << " voxels, generator of "
              << found[i].squares << " squares\n";
  }
  if (voids.empty()) std::cout << "  (none)\n";

  // 4. Pore sizes. d = the squared Euclidean distance from a voxel centre to the nearest solid
  // voxel centre (exact integers, squared_distance_to). Superlevel sets {d >= t} of the pore
  // space: where a ball of radius about sqrt(t) fits between the grains. A pore is born at its
  // widest point and dies when it joins a wider pore through a throat (the widest ball that
  // passes); a sealed void dies only at 0, when the solid enters. Only the block of powder is
  // filtered (the air around it left out), so the widest pore of the block never dies.
  // Persistence over Z/2 of the cubical superlevel filtration (its H_0 is the same over every
  // field); the values stay exact integers and are turned into radii only for printing.
  const auto d2 = squared_distance_to(n, scan.solid);
  const auto m = static_cast<std::size_t>(std::ceil(scan_recipe{}.margin * static_cast<double>(n) / 128.0));
  const std::size_t e = n - 2 * m;
  std::vector<std::int64_t> block(e * e * e);
  for (std::size_t z = 0; z < e; ++z)
    for (std::size_t y = 0; y < e; ++y)
      for (std::size_t x = 0; x < e; ++x) block[x + e * (y + e * z)] = d2[scan.at(x + m, y + m, z + m)];
  const lacuna::cubical_filtration<3, std::int64_t> f({e, e, e}, std::move(block), lacuna::level_sets::superlevel);
  const auto pr = lacuna::without_zero_persistence(lacuna::persistence(f, {.max_dimension = 2, .threads = 2}));
  const auto radius = [](std::int64_t t) { return std::sqrt(static_cast<double>(t)); };
  auto pores = pr[0].pairs;
  std::sort(pores.begin(), pores.end(), [](const auto& x, const auto& y) {
    const auto len = [](const auto& p) { return p.essential() ? std::numeric_limits<std::int64_t>::max() : p.birth - *p.death; };
    return len(x) != len(y) ? len(x) > len(y) : x.birth_cell < y.birth_cell;
  });
  std::cout << "\nPore sizes: persistence of the superlevel sets of the distance to the solid, inside the block\n"
            << "of powder (voxels " << m << ".." << n - m - 1 << " on each axis; radii in voxels, d^2 exact).\n"
            << "  A pore is born at the radius of the widest ball that fits in it and dies at the radius of the\n"
            << "  throat through which it joins a wider pore (0: a sealed void, joined only when the solid enters).\n"
            << "  " << pr[0].pairs.size() << " pores, " << pr[1].pairs.size() << " loops and " << pr[2].pairs.size()
            << " cavities of the pore space; the longest pore bars:\n";
  for (std::size_t i = 0; i < std::min<std::size_t>(8, pores.size()); ++i) {
    const auto& p = pores[i];
    std::cout << "    born at radius " << fixed(radius(p.birth)) << " (d^2 = " << p.birth << "), "
              << (p.essential() ? std::string("never dies (the widest pore of the block)")
                                : "dies at radius " + fixed(radius(*p.death)) + " (d^2 = " + std::to_string(*p.death) + ")")
              << "\n";
  }
  std::vector<std::vector<lacuna::io::diagram_interval>> diagram(3);
  for (int k = 0; k <= 2; ++k)
    for (const auto& p : pr[k].pairs)
      diagram[static_cast<std::size_t>(k)].push_back(
          {radius(p.birth), p.essential() ? std::nullopt : std::optional<double>(radius(*p.death))});

  // 5. Files.
  const auto nrrd_path = dir / "materials_scan.nrrd";
  {
    std::ofstream out(nrrd_path, std::ios::binary);
    lacuna::io::write_nrrd(out, c);
    if (!out) throw std::runtime_error("cannot write " + nrrd_path.string());
  }
  // slices through the first sealed voids, the others evenly spaced
  std::vector<std::size_t> zs;
  for (const auto& v : voids)
    if (zs.size() < 2 && std::none_of(zs.begin(), zs.end(), [&](std::size_t z) { return v.lo[2] <= z && z <= v.hi[2]; }))
      zs.push_back((v.lo[2] + v.hi[2]) / 2);
  for (std::size_t k = 1; k < 10 && zs.size() < 4; ++k) {  // evenly spaced, not too close to those
    const std::size_t z = n * (k % 2 == 1 ? (k + 1) / 2 : 5 - k / 2) / 5;
    if (std::none_of(zs.begin(), zs.end(), [&](std::size_t w) { return (w > z ? w - z : z - w) < n / 8; })) zs.push_back(z);
  }
  for (std::size_t k = 1; zs.size() < 4; ++k) zs.push_back(n * k / 5);
  std::sort(zs.begin(), zs.end());
  const auto slices_path = dir / "materials_scan.svg";
  write_file(slices_path, slices_svg(scan, zs, voids));
  const auto diagram_path = dir / "materials_scan_pores.svg";
  write_file(diagram_path,
             lacuna::io::persistence_diagram_svg(
                 diagram, {.title = "Pore sizes: distance to the solid, superlevel sets", .superlevel = true}));
  std::cout << "\nFiles in " << dir.string() << ":\n"
            << "  materials_scan.nrrd       the volume (uint8, 1 = solid); recount it with\n"
            << "                            build/bin/lacuna homology " << nrrd_path.string() << "\n"
            << "  materials_scan.svg        slices and a projection with the sealed voids outlined\n"
            << "  materials_scan_pores.svg  the persistence diagram of the pore sizes\n";
  std::cout << "\nTime: " << fixed(seconds_since(start), 1) << " s\n";
  if (failures == 0) std::cout << "all checks passed\n";
  return failures == 0 ? 0 : 1;
}

}  // namespace

int main(int argc, char** argv) {
  std::size_t n = 128;
  std::filesystem::path dir = "materials_scan_output";
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    if ((a == "--size" || a == "--output") && i + 1 < argc) {
      const std::string value = argv[++i];
      if (a == "--output") {
        dir = value;
        continue;
      }
      std::size_t used = 0;
      unsigned long v = 0;
      try {
        v = std::stoul(value, &used);
      } catch (const std::exception&) {
        used = 0;
      }
      if (used != value.size() || value.empty() || value[0] == '-' || v < 16 || v > 256) {
        std::cerr << "materials_scan: --size wants a whole number from 16 to 256, not '" << value << "'\n";
        return 2;
      }
      n = v;
    } else {
      std::cerr << "usage: materials_scan [--size N] [--output DIR]   (N from 16 to 256, default 128; DIR default "
                   "materials_scan_output)\n";
      return 2;
    }
  }
  try {
    return run(n, dir);
  } catch (const std::exception& e) {
    std::cerr << "materials_scan: " << e.what() << "\n";
    return 2;
  }
}

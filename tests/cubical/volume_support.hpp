// volume_support.hpp — synthetic binary volumes and images for the cubical tests and the
// benchmarks, and Betti numbers of them computed without lacuna's homology.
//
// Standard library only (no doctest, no lacuna), so that benchmarks can include it as
// "../tests/cubical/volume_support.hpp".
//
//   grid<D>, volume = grid<3>, image = grid<2>
//                       a binary grid of D dimensions (in 2D its voxels are pixels)
//   porous<D>           white noise blurred by a Gaussian, thresholded at its median: about
//                       half foreground, with tunnels and cavities whose size grows with sigma
//                       (a standard model of porous media); porous_volume(n, ...) is n^3
//   coin_flip<D>        each voxel foreground with probability p; coin_flip_volume(n, ...) is n^3
//   duality_betti       b0, b1, b2 and chi of the union of closed voxels (D = 2 or 3), from
//                       connected components and cell counts (Alexander duality)
//   write_nrrd          a raw uint8 NRRD file of a volume
//
// Layout: axis 0 fastest, one byte per voxel, 1 = foreground, 0 = background. As in
// lacuna::cubical_complex, every foreground voxel stands for a CLOSED unit cube (square) with
// all its faces, so voxels that share only a corner are connected.
#pragma once

#include <algorithm>
#include <array>
#include <bit>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <fstream>
#include <limits>
#include <random>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna_volumes {

/// A binary grid: extents[0] x ... x extents[D-1] voxels (pixels in 2D), axis 0 fastest.
template <std::size_t D>
struct grid {
  std::array<std::size_t, D> extents{};
  std::vector<std::uint8_t> voxels;  ///< 1 = foreground, 0 = background
};

using volume = grid<3>;  ///< a binary volume
using image = grid<2>;   ///< a binary image

/// Betti numbers and Euler characteristic of the union of closed voxels (b2 = 0 for images).
struct duality_numbers {
  std::size_t b0 = 0, b1 = 0, b2 = 0;
  std::int64_t euler = 0;
};

namespace detail {

template <std::size_t D>
std::size_t element_count(const std::array<std::size_t, D>& n) {
  std::size_t total = 1;
  for (auto x : n) {
    if (x != 0 && total > std::numeric_limits<std::size_t>::max() / x)
      throw std::length_error("lacuna_volumes: the extents overflow std::size_t");
    total *= x;
  }
  return total;
}

template <std::size_t D>
std::array<std::size_t, D> strides_of(const std::array<std::size_t, D>& n) {
  std::array<std::size_t, D> s{};
  std::size_t acc = 1;
  for (std::size_t a = 0; a < D; ++a) {
    s[a] = acc;
    acc *= n[a];
  }
  return s;
}

/// Advances a coordinate counter (axis 0 fastest) within extents n.
template <std::size_t D>
void advance(std::array<std::size_t, D>& p, const std::array<std::size_t, D>& n) {
  for (std::size_t a = 0; a < D; ++a) {
    if (++p[a] < n[a]) return;
    p[a] = 0;
  }
}

/// The normalized Gaussian of standard deviation sigma, truncated at radius ceil(4 sigma);
/// index r is the centre. sigma <= 0 gives the identity {1}.
inline std::vector<float> gaussian_kernel(double sigma) {
  if (!(sigma > 0)) return {1.0f};
  const auto radius = static_cast<std::size_t>(std::ceil(4.0 * sigma));
  std::vector<double> w(2 * radius + 1);
  double sum = 0;
  for (std::size_t i = 0; i < w.size(); ++i) {
    const double x = static_cast<double>(i) - static_cast<double>(radius);
    w[i] = std::exp(-x * x / (2 * sigma * sigma));
    sum += w[i];
  }
  std::vector<float> k(w.size());
  for (std::size_t i = 0; i < w.size(); ++i) k[i] = static_cast<float>(w[i] / sum);
  return k;
}

/// Mirror boundary (reflect about the edge: -1 -> 0, -2 -> 1, n -> n-1), for any offset, also
/// one larger than n (the reflection repeats with period 2n).
inline std::size_t mirror(std::ptrdiff_t i, std::size_t n) {
  const auto period = static_cast<std::ptrdiff_t>(2 * n);
  std::ptrdiff_t m = i % period;
  if (m < 0) m += period;
  const auto u = static_cast<std::size_t>(m);
  return u < n ? u : 2 * n - 1 - u;
}

/// Convolves `f` (extents n, axis 0 fastest) with kernel k along `axis`, in place.
/// Axis 0: one padded line buffer per line. Other axes: the lines along `axis` are taken in
/// bundles of up to 256 neighbouring lines along axis 0 (a buffer of (n_axis + 2r) x width
/// floats), so that the inner loop runs over contiguous memory.
template <std::size_t D>
void blur_axis(std::vector<float>& f, const std::array<std::size_t, D>& n, std::size_t axis,
               const std::vector<float>& k) {
  const std::size_t len = n[axis];
  if (len == 0 || k.size() == 1) return;
  const std::size_t r = k.size() / 2, taps = k.size();
  const std::size_t stride = strides_of(n)[axis];   // distance between neighbours along axis
  const std::size_t outer = f.size() / (stride * len);  // independent blocks of len * stride
  if (axis == 0) {
    std::vector<float> buf(len + 2 * r), acc(len);
    for (std::size_t line = 0; line < outer; ++line) {
      float* p = f.data() + line * len;
      for (std::size_t i = 0; i < buf.size(); ++i)
        buf[i] = p[mirror(static_cast<std::ptrdiff_t>(i) - static_cast<std::ptrdiff_t>(r), len)];
      std::fill(acc.begin(), acc.end(), 0.0f);
      for (std::size_t t = 0; t < taps; ++t) {  // tap-major: the inner loop vectorizes
        const float kt = k[t];
        const float* src = buf.data() + t;
        for (std::size_t i = 0; i < len; ++i) acc[i] += kt * src[i];
      }
      std::copy(acc.begin(), acc.end(), p);
    }
    return;
  }
  const std::size_t width = std::min<std::size_t>(stride, 256);
  std::vector<float> buf((len + 2 * r) * width);
  std::vector<float> acc(width);
  for (std::size_t o = 0; o < outer; ++o) {
    float* block = f.data() + o * len * stride;
    for (std::size_t c = 0; c < stride; c += width) {
      const std::size_t w = std::min(width, stride - c);
      for (std::size_t i = 0; i < len + 2 * r; ++i) {
        const float* src =
            block + mirror(static_cast<std::ptrdiff_t>(i) - static_cast<std::ptrdiff_t>(r), len) * stride + c;
        std::copy(src, src + w, buf.data() + i * width);
      }
      for (std::size_t i = 0; i < len; ++i) {
        std::fill(acc.begin(), acc.begin() + static_cast<std::ptrdiff_t>(w), 0.0f);
        for (std::size_t t = 0; t < taps; ++t) {
          const float kt = k[t];
          const float* row = buf.data() + (i + t) * width;
          for (std::size_t x = 0; x < w; ++x) acc[x] += kt * row[x];
        }
        std::copy(acc.begin(), acc.begin() + static_cast<std::ptrdiff_t>(w), block + i * stride + c);
      }
    }
  }
}

/// The lower median of f (the element of rank (N-1)/2 in increasing order), exactly, without a
/// copy of f: a histogram of 65536 bins between min and max finds the bin holding that rank
/// (the bin index is a monotone function of the value, so bins are ordered), then nth_element
/// on the few values of that bin. Precondition: f is not empty and holds no NaN.
inline float lower_median(const std::vector<float>& f) {
  const auto [lo_it, hi_it] = std::minmax_element(f.begin(), f.end());
  const double lo = *lo_it, hi = *hi_it;
  if (lo == hi) return static_cast<float>(lo);
  constexpr std::size_t bins = 65536;
  const double scale = static_cast<double>(bins) / (hi - lo);
  auto bin_of = [&](float v) {
    const auto b = static_cast<std::size_t>((static_cast<double>(v) - lo) * scale);
    return std::min(b, bins - 1);
  };
  std::vector<std::size_t> hist(bins, 0);
  for (float v : f) ++hist[bin_of(v)];
  std::size_t rank = (f.size() - 1) / 2, b = 0;
  while (rank >= hist[b]) rank -= hist[b++];
  std::vector<float> in_bin;
  in_bin.reserve(hist[b]);
  for (float v : f)
    if (bin_of(v) == b) in_bin.push_back(v);
  std::nth_element(in_bin.begin(), in_bin.begin() + static_cast<std::ptrdiff_t>(rank), in_bin.end());
  return in_bin[rank];
}

/// White noise (mt19937_64, standard normal) blurred by a Gaussian of standard deviation sigma
/// along every axis, mirrored at the borders; 1 where the value exceeds its (lower) median.
template <std::size_t D>
std::vector<std::uint8_t> porous_field(const std::array<std::size_t, D>& n, double sigma, std::uint64_t seed) {
  const std::size_t total = element_count(n);
  if (total == 0) return {};
  std::vector<float> f(total);
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  for (auto& x : f) x = static_cast<float>(normal(rng));
  const auto k = gaussian_kernel(sigma);
  for (std::size_t a = 0; a < D; ++a) blur_axis(f, n, a, k);
  const float median = lower_median(f);
  std::vector<std::uint8_t> out(total);
  for (std::size_t i = 0; i < total; ++i) out[i] = f[i] > median ? 1 : 0;
  return out;
}

template <std::size_t D>
std::vector<std::uint8_t> coin_flips(const std::array<std::size_t, D>& n, double p, std::uint64_t seed) {
  std::vector<std::uint8_t> out(element_count(n));
  std::mt19937_64 rng(seed);
  std::bernoulli_distribution coin(p);
  for (auto& x : out) x = coin(rng) ? 1 : 0;
  return out;
}

/// Union-find over element indices (path halving, union by rank): 5 bytes per element.
class disjoint_sets {
 public:
  explicit disjoint_sets(std::size_t n) : parent_(n), rank_(n, 0) {
    if (n > std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("lacuna_volumes: more than 2^32 - 1 elements for the union-find");
    for (std::size_t i = 0; i < n; ++i) parent_[i] = static_cast<std::uint32_t>(i);
  }
  std::size_t find(std::size_t i) {
    while (parent_[i] != i) {
      parent_[i] = parent_[parent_[i]];
      i = parent_[i];
    }
    return i;
  }
  void unite(std::size_t a, std::size_t b) {
    a = find(a);
    b = find(b);
    if (a == b) return;
    if (rank_[a] < rank_[b]) std::swap(a, b);
    parent_[b] = static_cast<std::uint32_t>(a);
    if (rank_[a] == rank_[b]) ++rank_[a];  // ranks stay below 33 (2^rank <= elements)
  }

 private:
  std::vector<std::uint32_t> parent_;
  std::vector<std::uint8_t> rank_;
};

/// Connected components of the elements with member[i] != 0 in a grid of extents n, two members
/// adjacent when their coordinates differ by at most 1 on every axis and on at most
/// `max_changed` axes (D: all 3^D - 1 neighbours, 26 in 3D and 8 in 2D; 1: the 2D neighbours
/// across a face, 6 in 3D and 4 in 2D).
template <std::size_t D>
std::size_t count_components(const std::array<std::size_t, D>& n, const std::vector<std::uint8_t>& member,
                             std::size_t max_changed) {
  const std::size_t total = member.size();
  if (total == 0) return 0;
  const auto stride = strides_of(n);
  // the half of the neighbourhood that comes earlier in index order: the offset's last nonzero
  // coordinate (highest axis) is -1
  std::vector<std::array<int, D>> offsets;
  std::array<int, D> o{};
  std::size_t codes = 1;
  for (std::size_t a = 0; a < D; ++a) codes *= 3;
  for (std::size_t code = 0; code < codes; ++code) {
    std::size_t c = code, changed = 0;
    for (std::size_t a = 0; a < D; ++a, c /= 3) {
      o[a] = static_cast<int>(c % 3) - 1;
      changed += o[a] != 0;
    }
    if (changed == 0 || changed > max_changed) continue;
    std::size_t last = D;
    for (std::size_t a = D; a-- > 0;)
      if (o[a] != 0) {
        last = a;
        break;
      }
    if (o[last] == -1) offsets.push_back(o);
  }
  disjoint_sets sets(total);
  std::array<std::size_t, D> p{};
  for (std::size_t i = 0; i < total; ++i, advance(p, n)) {
    if (!member[i]) continue;
    for (const auto& off : offsets) {
      std::size_t j = i;
      bool inside = true;
      for (std::size_t a = 0; a < D && inside; ++a) {
        if (off[a] == -1) {
          if (p[a] == 0) inside = false;
          else j -= stride[a];
        } else if (off[a] == 1) {
          if (p[a] + 1 == n[a]) inside = false;
          else j += stride[a];
        }
      }
      if (inside && member[j]) sets.unite(i, j);
    }
  }
  std::size_t roots = 0;
  for (std::size_t i = 0; i < total; ++i)
    if (member[i] && sets.find(i) == i) ++roots;
  return roots;
}

/// The background of the voxels, with a frame of one background voxel all around the box.
template <std::size_t D>
std::vector<std::uint8_t> padded_background(const std::array<std::size_t, D>& n, const std::vector<std::uint8_t>& fg,
                                            std::array<std::size_t, D>& padded) {
  for (std::size_t a = 0; a < D; ++a) padded[a] = n[a] + 2;
  std::vector<std::uint8_t> bg(element_count(padded), 1);
  const auto ps = strides_of(padded);
  std::array<std::size_t, D> p{};
  for (std::size_t i = 0; i < fg.size(); ++i, advance(p, n)) {
    std::size_t j = 0;
    for (std::size_t a = 0; a < D; ++a) j += (p[a] + 1) * ps[a];
    bg[j] = fg[i] ? 0 : 1;
  }
  return bg;
}

/// chi of the union of closed voxels, by counting its cells. A cell of the lattice is given by
/// the set S of axes it spans (its dimension is |S|) and a lattice position p: along an axis in
/// S it spans [p_a, p_a + 1] (0 <= p_a < n_a), along the others it sits at p_a (0 <= p_a <= n_a).
/// It belongs to the union when one of the voxels containing it is foreground: v_a = p_a on the
/// axes in S, v_a in {p_a - 1, p_a} on the others. chi = sum over cells of (-1)^dimension.
template <std::size_t D>
std::int64_t counted_euler(const std::array<std::size_t, D>& n, const std::vector<std::uint8_t>& fg) {
  if (fg.empty()) return 0;
  const auto stride = strides_of(n);
  std::int64_t chi = 0;
  for (unsigned spans = 0; spans < (1u << D); ++spans) {
    std::array<std::size_t, D> m{};
    for (std::size_t a = 0; a < D; ++a) m[a] = (spans >> a & 1u) ? n[a] : n[a] + 1;
    const std::size_t positions = element_count(m);
    std::int64_t count = 0;
    std::array<std::size_t, D> p{};
    for (std::size_t t = 0; t < positions; ++t, advance(p, m)) {
      bool present = false;
      // choice bit a (axes outside S only): 0 = voxel p_a - 1, 1 = voxel p_a
      for (unsigned choice = 0; choice < (1u << D) && !present; ++choice) {
        if (choice & spans) continue;
        std::size_t idx = 0;
        bool inside = true;
        for (std::size_t a = 0; a < D && inside; ++a) {
          std::size_t v = p[a];
          if (!(spans >> a & 1u) && !(choice >> a & 1u)) {
            if (v == 0) inside = false;
            else --v;
          }
          if (v >= n[a]) inside = false;
          idx += v * stride[a];
        }
        present = inside && fg[idx] != 0;
      }
      count += present;
    }
    chi += (std::popcount(spans) % 2 == 0) ? count : -count;
  }
  return chi;
}

}  // namespace detail

/// A porous grid of the given extents: independent standard normal values (std::mt19937_64
/// seeded with `seed`, std::normal_distribution), blurred by a separable Gaussian of standard
/// deviation sigma voxels (truncated at radius ceil(4 sigma), normalized, mirrored at the
/// borders), foreground where the blurred value exceeds its median (the lower median, so half
/// the voxels, rounded down, are foreground when the values are distinct). Memory: 4 bytes per
/// voxel while it works (about 70 MB for 256^3). The values depend on the standard library's
/// normal_distribution, so the same seed may give other grids with another library.
template <std::size_t D>
grid<D> porous(const std::array<std::size_t, D>& extents, double sigma, std::uint64_t seed) {
  return {extents, detail::porous_field<D>(extents, sigma, seed)};
}

/// A grid of the given extents, each voxel foreground with probability p (std::mt19937_64, `seed`).
template <std::size_t D>
grid<D> coin_flip(const std::array<std::size_t, D>& extents, double p, std::uint64_t seed) {
  return {extents, detail::coin_flips<D>(extents, p, seed)};
}

/// An n x n x n porous volume (see porous).
inline volume porous_volume(std::size_t n, double sigma, std::uint64_t seed) { return porous<3>({n, n, n}, sigma, seed); }

/// An n x n x n coin-flip volume (see coin_flip).
inline volume coin_flip_volume(std::size_t n, double p, std::uint64_t seed) { return coin_flip<3>({n, n, n}, p, seed); }

/// The Betti numbers and chi of X, the union of the closed foreground voxels of a volume
/// (D = 3) or pixels of an image (D = 2), without any homology computation.
///
/// - b0: X is a union of closed cubes (squares), and two of them meet exactly when their
///   voxels are neighbours (they share a face, an edge or a corner), so the components of X
///   are the 26-connected (8-connected in 2D) components of the foreground.
/// - b_{D-1}: the components of R^D - X are the 6-connected (4-connected in 2D) components of
///   the background voxels together with a one-voxel frame around the box (which stands for
///   the unbounded component): a point outside X lies in the closure of background voxels
///   only, and two background voxels sharing a face are joined through its open interior,
///   which is not in X (neither of its two voxels is foreground); background voxels sharing
///   only an edge or a corner are joined outside X exactly when the voxels around that edge
///   (corner) are all background, hence through a chain of face neighbours. Alexander duality
///   (Hatcher 2002, Theorem 3.44): for a compact, locally contractible, proper subset K of
///   S^D, H~_0(S^D - K) = H~^{D-1}(K). X is a finite cubical complex in R^D = S^D - {point},
///   and S^D - X has as many components as R^D - X (the point at infinity joins the
///   unbounded one), so rank H^{D-1}(X) = (components of R^D - X) - 1. H_{D-2}(X) is
///   torsion-free (Hatcher 2002, Corollary 3.46: for compact, locally contractible X in R^n,
///   H_i(X) = 0 for i >= n and is torsion-free for i = n-1, n-2), so by universal
///   coefficients rank H^{D-1} = rank H_{D-1} = b_{D-1}: b2 in 3D, b1 in 2D.
/// - chi: counted from the cells of X (vertices - edges + squares - cubes), see counted_euler.
/// - 3D: H_3(X) = 0 (Corollary 3.46 again), so chi = b0 - b1 + b2 and b1 = b0 + b2 - chi. The
///   ranks are the same over every field, the homology being torsion-free.
/// - 2D: b2 = 0 (Corollary 3.46). Here chi is not needed to get b1, so b0 - b1 == chi is an
///   independent check.
/// The empty grid gives all zeros. Throws std::logic_error when b0 + b2 - chi < 0 (3D) or
/// b0 - b1 != chi (2D), a bug in one of the counts.
template <std::size_t D>
  requires(D == 2 || D == 3)
duality_numbers duality_betti(const grid<D>& g) {
  if (g.voxels.size() != detail::element_count(g.extents))
    throw std::invalid_argument("lacuna_volumes: the voxel array does not match the extents");
  duality_numbers d;
  d.b0 = detail::count_components<D>(g.extents, g.voxels, D);
  std::array<std::size_t, D> padded{};
  const auto bg = detail::padded_background<D>(g.extents, g.voxels, padded);
  const std::size_t top = detail::count_components<D>(padded, bg, 1) - 1;  // b_{D-1}
  d.euler = detail::counted_euler<D>(g.extents, g.voxels);
  if constexpr (D == 3) {
    d.b2 = top;
    const std::int64_t b1 = static_cast<std::int64_t>(d.b0) + static_cast<std::int64_t>(d.b2) - d.euler;
    if (b1 < 0)
      throw std::logic_error("lacuna_volumes: b0 + b2 - chi = " + std::to_string(b1) + " is negative");
    d.b1 = static_cast<std::size_t>(b1);
  } else {
    d.b1 = top;
    if (static_cast<std::int64_t>(d.b0) - static_cast<std::int64_t>(d.b1) != d.euler)
      throw std::logic_error("lacuna_volumes: b0 - b1 = " +
                             std::to_string(static_cast<std::int64_t>(d.b0) - static_cast<std::int64_t>(d.b1)) +
                             " differs from the counted chi = " + std::to_string(d.euler));
  }
  return d;
}

/// Writes v as a raw uint8 NRRD (NRRD0004, sizes axis 0 first, 1 = foreground), a file that
/// lacuna::io::read_nrrd reads back as the same cubical complex. Throws std::runtime_error when
/// the file cannot be written.
inline void write_nrrd(const std::string& path, const volume& v) {
  if (v.voxels.size() != detail::element_count(v.extents))
    throw std::invalid_argument("lacuna_volumes: the voxel array does not match the extents");
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (!out) throw std::runtime_error("lacuna_volumes: cannot open " + path + " for writing");
  out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: " << v.extents[0] << ' ' << v.extents[1] << ' '
      << v.extents[2] << "\nencoding: raw\n\n";
  out.write(reinterpret_cast<const char*>(v.voxels.data()), static_cast<std::streamsize>(v.voxels.size()));
  out.close();
  if (!out) throw std::runtime_error("lacuna_volumes: writing " + path + " failed");
}

}  // namespace lacuna_volumes

// lacuna/algorithm/cubical_duality.hpp — the Betti numbers of an image or volume (D <= 3)
// from two labellings and the Euler characteristic, with no boundary matrix at all.
//
// The complex K of a binary image is the union of the closed cubes of its foreground voxels
// (complex/cubical_complex.hpp), a compact, locally contractible subset of R^D. Then:
//   * b_0(K) is the number of components of the foreground under the neighbourhood of closed
//     cubes: two voxels touch when they share a point (3^D - 1 neighbours each).
//   * b_(D-1)(K) is the number of bounded components of R^D - K (Alexander duality:
//     H_(D-1)(K) = H̃^(D-1)(K) ≅ H̃_0(S^D - K), Hatcher 2002, Theorem 3.44 and Corollary 3.45,
//     from memory). R^D - K is the union of the open background voxels and of the lower cells
//     none of whose voxels is foreground; such a cell only joins background voxels that are
//     already joined through shared faces, so the components of R^D - K are those of the
//     background under face adjacency (2D neighbours), the region outside the box being one
//     more, which every background voxel on the border of the box meets.
//   * b_1 for D = 3 from Euler–Poincaré: χ(K) = b_0 - b_1 + b_2, χ counted from the cells.
//     For D = 2, b_1 = b_0 - χ is computed both ways and must agree (a logic_error if not).
//   * No torsion: for a compact, locally contractible X ⊂ R^n, H_i(X; Z) is 0 for i >= n and
//     torsion-free for i = n - 1 and n - 2 (Hatcher 2002, Corollary 3.46, from memory), and
//     H_0 is free. So these are the ranks over Z and the dimensions over every field, and the
//     cohomology has the same ranks (universal coefficients).
// Every number is exact: two union-find labellings and a count. Cost: O(voxels · α), 4 bytes
// per voxel (8 past 2^32 voxels), two passes over the voxels. This is the labelling and
// Euler-number route of image analysis (connected components and the Euler number of a
// binary image; Toriwaki & Yonekura 2002 for the local counts), used here because it is
// exact for D <= 3.
#pragma once

#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/cubical_complex.hpp>

#include <array>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <numeric>
#include <stdexcept>
#include <vector>

namespace lacuna {

namespace detail {

template <class Index>
struct voxel_forest {
  std::vector<Index> parent;
  explicit voxel_forest(std::size_t n) : parent(n) { std::iota(parent.begin(), parent.end(), Index{0}); }
  Index find(Index x) {
    while (parent[x] != x) {
      parent[x] = parent[parent[x]];  // path halving
      x = parent[x];
    }
    return x;
  }
  // the smaller root becomes the parent: the outside node (index 0) stays a root
  bool unite(Index a, Index b) {
    a = find(a), b = find(b);
    if (a == b) return false;
    if (a < b)
      parent[b] = a;
    else
      parent[a] = b;
    return true;
  }
};

/// The labelling of the voxels of a box (a whole image or one block of it): the union-find
/// forest (node 0: the outside of the box; voxel v, axis 0 fastest, is node v + 1) and the
/// numbers of its foreground components (closed-cube adjacency, 3^D - 1 neighbours) and of its
/// background components (face adjacency, 2D neighbours) that do not meet the outside.
template <class Index>
struct voxel_labelling {
  voxel_forest<Index> forest;               ///< every voxel's component: forest.find(v + 1)
  std::size_t foreground_components = 0;    ///< b_0 of the block's complex
  std::size_t bounded_background = 0;       ///< background components not joined to node 0
};

/// Labels the voxels of a box of extents n (foreground(v) for voxel v, axis 0 fastest). A
/// background voxel on the side `s` (0 low, 1 high) of axis a meets the outside when
/// open[a][s]: all sides for a whole image; a block cut out of a larger box passes false for
/// the sides it shares with a neighbouring block, whose voxels it does not see (the labels of
/// its first and last layers then let the blocks be joined: distributed/volume_duality.hpp).
template <std::size_t D, class Index, class Foreground>
voxel_labelling<Index> label_voxels(const std::array<std::size_t, D>& n, Foreground&& foreground,
                                    const std::array<std::array<bool, 2>, D>& open, const run_control* control) {
  std::size_t count = 1;
  std::array<std::size_t, D> stride{};
  for (std::size_t a = 0; a < D; ++a) stride[a] = count, count *= n[a];
  if (control) control->require_memory(static_cast<std::uint64_t>(count + 1) * sizeof(Index), "the voxel labels");
  voxel_labelling<Index> out{voxel_forest<Index>(count + 1)};  // node 0: the outside of the box; voxel v is node v + 1
  auto& f = out.forest;
  std::size_t fg_roots = 0;
  detail::progress_ticker tick(control, "labelling voxels", count);
  std::array<std::size_t, D> v{};
  // The 3^D - 1 neighbours split into halves; each voxel looks at the half that comes first.
  std::vector<std::array<int, D>> earlier;
  {
    std::array<int, D> d{};
    const std::size_t total = [] {
      std::size_t t = 1;
      for (std::size_t a = 0; a < D; ++a) t *= 3;
      return t;
    }();
    for (std::size_t code = 0; code < total; ++code) {
      std::size_t x = code;
      for (std::size_t a = 0; a < D; ++a) d[a] = static_cast<int>(x % 3) - 1, x /= 3;
      // lexicographically before 0 when the last non-zero offset (highest axis first) is -1
      int last = 0;
      for (std::size_t a = D; a-- > 0;)
        if (d[a] != 0) {
          last = d[a];
          break;
        }
      if (last == -1) earlier.push_back(d);
    }
  }
  for (std::size_t i = 0; i < count; ++i) {
    const bool fg = foreground(i);
    const Index node = static_cast<Index>(i + 1);
    std::size_t merges = 0;
    if (fg) {
      for (const auto& d : earlier) {
        bool inside = true;
        std::size_t j = i;
        for (std::size_t a = 0; a < D && inside; ++a) {
          if (d[a] == -1) {
            if (v[a] == 0) inside = false;
            else j -= stride[a];
          } else if (d[a] == 1) {
            if (v[a] + 1 >= n[a]) inside = false;
            else j += stride[a];
          }
        }
        if (inside && foreground(j) && f.unite(node, static_cast<Index>(j + 1))) ++merges;
      }
      fg_roots += 1;
      fg_roots -= merges;
    } else {
      bool border = false;
      for (std::size_t a = 0; a < D; ++a) {
        if ((v[a] == 0 && open[a][0]) || (v[a] + 1 == n[a] && open[a][1])) border = true;
        if (v[a] > 0 && !foreground(i - stride[a])) f.unite(node, static_cast<Index>(i - stride[a] + 1));
      }
      if (border) f.unite(node, Index{0});
    }
    for (std::size_t a = 0; a < D; ++a) {  // next voxel coordinates, axis 0 fastest
      if (++v[a] < n[a]) break;
      v[a] = 0;
    }
    tick();
  }
  tick.finish();
  // Every background component that met the outside has node 0 as its root (unite keeps the
  // smaller root); the bounded ones are the background roots other than 0.
  std::size_t bounded = 0;
  for (std::size_t i = 0; i < count; ++i)
    if (!foreground(i) && f.parent[i + 1] == static_cast<Index>(i + 1)) ++bounded;
  out.foreground_components = fg_roots;
  out.bounded_background = bounded;
  return out;
}

/// The Euler characteristic of the complex of the foreground voxels (foreground(v), axis 0
/// fastest) of a box of extents n, counted from the 2^D voxels around each grid vertex (the
/// local configurations of Gray 1971 and Toriwaki & Yonekura 2002): every cell of the doubled
/// grid has one lowest vertex, and whether it is in the complex depends only on the voxels
/// around that vertex, so χ = Σ over the (n + 1)^D vertices of a table entry. Exact: an
/// integer sum, at most 2^D cells per vertex. Cost: O(2^D · vertices), no memory.
template <std::size_t D, class Foreground>
long long euler_by_configurations(const std::array<std::size_t, D>& n, Foreground&& foreground) {
  // table[c]: the signed count of the cells with this lowest vertex that are present when the
  // voxels around it are those of the bits of c (bit o: the voxel at offset o_a - 1 on axis a)
  constexpr unsigned around = 1u << D;  // voxels around a vertex
  std::array<long long, (1u << around)> table{};
  for (unsigned c = 0; c < (1u << around); ++c)
    for (unsigned d = 0; d < (1u << D); ++d) {  // the cell going up along the axes of d
      bool present = false;  // some foreground voxel has it as a face: offset 0 on the axes of d
      for (unsigned o = 0; o < around && !present; ++o)
        if ((o & d) == d && ((c >> o) & 1u)) present = true;
      if (present) table[c] += std::popcount(d) % 2 == 0 ? 1 : -1;
    }
  std::array<std::size_t, D> stride{};
  std::size_t count = 1;
  for (std::size_t a = 0; a < D; ++a) stride[a] = count, count *= n[a];
  if (count == 0) return 0;
  long long chi = 0;
  std::array<std::size_t, D> x{};
  for (;;) {
    unsigned c = 0;
    for (unsigned o = 0; o < around; ++o) {
      bool inside = true;
      std::size_t v = 0;
      for (std::size_t a = 0; a < D && inside; ++a) {
        const std::size_t y = x[a] + ((o >> a) & 1u);  // the voxel's coordinate + 1
        if (y == 0 || y > n[a]) inside = false;
        else v += (y - 1) * stride[a];
      }
      if (inside && foreground(v)) c |= 1u << o;
    }
    chi += table[c];
    std::size_t a = 0;
    for (; a < D; ++a) {  // the next vertex, axis 0 fastest
      if (++x[a] <= n[a]) break;
      x[a] = 0;
    }
    if (a == D) break;
  }
  return chi;
}

template <std::size_t D, class Index>
std::array<std::size_t, 2> cubical_components(const cubical_complex<D>& c, const run_control* control) {
  // The voxels' own bits: the parity class with every axis odd holds them in voxel order.
  const auto& top = c.class_of_mask((1u << D) - 1);
  const auto bits = c.bitmap();
  auto foreground = [&](std::size_t v) {
    const std::size_t b = top.bit_begin + v;
    return ((bits[b >> 6] >> (b & 63)) & 1u) != 0;
  };
  std::array<std::array<bool, 2>, D> open{};
  for (auto& s : open) s = {true, true};
  const auto l = label_voxels<D, Index>(c.extents(), foreground, open, control);
  return {l.foreground_components, l.bounded_background};
}

}  // namespace detail

/// The Betti numbers b_0..b_D of the cubical complex of an image or volume (D <= 3), with no
/// boundary matrix: the ranks over Z (there is no torsion) and the dimensions over every
/// field. Empty image: no numbers (an empty vector). Stop requests and progress ("labelling
/// voxels") through `control`; its memory_limit bounds the labels (4 or 8 bytes per voxel).
template <std::size_t D>
  requires(D >= 1 && D <= 3)
std::vector<std::size_t> cubical_betti_numbers(const cubical_complex<D>& c, const run_control* control = nullptr) {
  if (c.top_dimension() < 0) return {};
  std::size_t count = 1;
  for (auto e : c.extents()) count *= e;
  const auto [b0, bounded] = count < 0xffffffffu ? detail::cubical_components<D, std::uint32_t>(c, control)
                                                 : detail::cubical_components<D, std::uint64_t>(c, control);
  long long chi = 0;
  for (int k = 0; k <= static_cast<int>(D); ++k)
    chi += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(c.cell_count(k));
  std::vector<std::size_t> b(D + 1, 0);
  b[0] = b0;
  if constexpr (D == 1) {
    if (static_cast<long long>(b0) != chi) throw std::logic_error("lacuna::cubical_betti_numbers: b_0 differs from χ");
  } else if constexpr (D == 2) {
    b[1] = bounded;
    if (static_cast<long long>(b0) - static_cast<long long>(bounded) != chi)
      throw std::logic_error("lacuna::cubical_betti_numbers: Euler-Poincaré fails (b_0 - b_1 != χ)");
  } else {
    b[2] = bounded;
    const long long b1 = static_cast<long long>(b0) + static_cast<long long>(bounded) - chi;
    if (b1 < 0) throw std::logic_error("lacuna::cubical_betti_numbers: Euler-Poincaré gives b_1 < 0");
    b[1] = static_cast<std::size_t>(b1);
  }
  return b;
}

}  // namespace lacuna

// lacuna/distributed/volume_duality.hpp — the Betti numbers of a NRRD volume (or image) on many
// MPI ranks by labelling and the Euler characteristic, the distributed form of
// algorithm/cubical_duality.hpp; no boundary matrix and no residual complex.
//
//   auto r = lacuna::distributed::volume_duality(MPI_COMM_WORLD, "scan.nrrd", {.threshold = 100});
//   if (r.has_result) use(r.betti);   // on the root rank
//
// The numbers are those cubical_duality.hpp proves for the union K of the closed foreground
// voxels of the whole volume (Alexander duality, Hatcher 2002, Theorem 3.44 and Corollary
// 3.45, from memory; Euler–Poincaré): b_0 = the foreground components under closed-cube
// adjacency (26 neighbours), b_2 = the background components under face adjacency (6
// neighbours) that do not meet the outside of the box, b_1 = b_0 + b_2 − χ(K), b_3 = 0. K is a
// compact, locally contractible subset of R^3, so H_*(K; Z) is free (Hatcher 2002, Corollary
// 3.46, from memory): these are the ranks over Z and the dimensions over every field, with no
// torsion. A 2-D image is a volume of one layer: every background voxel then meets the
// outside (b_2 = 0) and b_1 = b_0 − χ, the numbers of the image's complex.
//
// How the ranks share the work:
//   1. Slabs (distributed/volume_blocks.hpp, one per rank, rank order = layer order; ranks past
//      the number of layers hold none). Each rank reads only the voxels of its slab, one bit per
//      voxel, and labels them (label_voxels of cubical_duality.hpp, the labelling the
//      one-process route runs) with the outside reached through the box's own sides only: the
//      x and y sides, and the low / high z side only where the slab's first / last layer is
//      the volume's. Memory per rank: 1/8 byte (the bit) + 4 bytes (the label; 8 past 2^32
//      voxels in the slab) per voxel of its slab, plus 2 × 4 bytes per voxel of one layer.
//   2. χ(K) by inclusion–exclusion over the slabs: χ(K) = Σ_b χ(K_b) − Σ_cuts χ(K_b ∩ K_b+1),
//      K_b the complex of slab b. K_b ∩ K_b+1 lies in the plane of the cut: the faces of the
//      foreground squares of the last layer of b (a 2-D complex X) that are also faces of
//      those of the first layer of b + 1 (Y), so χ(X ∩ Y) = χ(X) + χ(Y) − χ(X ∪ Y), and X ∪ Y
//      is the 2-D complex of the union of the two layers' foreground. A rank counts
//      χ(K_b) − χ(X) − χ(Y) for the planes it is cut at (euler_by_configurations, local 2^D
//      configurations: Gray 1971; Toriwaki & Yonekura 2002); the χ of the union is counted
//      where the two neighbours are joined (step 3), which sees both layers. So a cell of a
//      cut plane is counted once, by the join of the two slabs it lies between.
//   3. A slab's summary: its counts (foreground components, bounded background components,
//      its part of χ) and the labels of its first and last layers, each voxel's component
//      renumbered densely (a bit for foreground; 0 for background joined to the outside).
//      Summaries are joined in a reduction tree (pairwise, ⌈log2 P⌉ rounds: in round s, rank r
//      with r mod 2s = 0 receives the summary of rank r + s, the slabs just above its own, and
//      joins them), so each rank sends at most its two layers of labels once and no rank holds
//      more than two summaries. The join of a lower summary A and an upper one B unites, in
//      one union-find over their labels, the foreground voxels of A's last layer with those of
//      B's first layer that share a point with them (the 9 voxels above each: the closed-cube
//      adjacency across the cut, which needs the neighbour's layer, carried by its labels) and
//      the background voxels that share a face (the voxel just above). Each union of two
//      different components lowers the foreground count, or the bounded background count, by
//      one (the outside keeps the smallest node, so a bounded component joined to it stops
//      being bounded: one union, one fewer). Components that reach neither outer layer are
//      final and are only counted. The joined summary keeps A's first and B's last layer.
//   4. Rank 0 ends with the summary of the whole volume: its counts are b_0, b_2 and χ(K).
//      They are broadcast, and b_1 = b_0 + b_2 − χ (a negative b_1 is a logic_error: it would
//      mean a counting fault, never a property of the input).
// Every number is exact: union-find labellings and integer counts (int64; a count past 2^63
// cannot occur below 2^63 voxels).
//
// Errors: each phase runs under collective_phase (distributed/collective_error.hpp): bad input
// (the header, a truncated file, corrupt gzip data), memory exhaustion or a layer too wide for
// the labels (2^30 voxels per layer) on any rank ends the call on every rank with the same
// lacuna::distributed::distributed_error naming the rank, the phase and the message.
#pragma once

#include <lacuna/algorithm/cubical_duality.hpp>
#include <lacuna/distributed/collective_error.hpp>
#include <lacuna/distributed/gather_words.hpp>
#include <lacuna/distributed/volume_blocks.hpp>
#include <lacuna/homology/result.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/ring/concepts.hpp>

#include <mpi.h>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna::distributed {

/// Options of volume_duality (designated initializers welcome).
struct duality_options {
  /// Foreground: samples >= threshold when set, else samples other than zero.
  std::optional<std::int64_t> threshold{};
  /// The limits every rank's header reader enforces (io/read_limits.hpp).
  io::read_limits limits{};
  /// The rank that holds the answer.
  int root = 0;
};

/// The answer of volume_duality on one rank, with its own figures.
struct volume_duality_result {
  bool has_result = false;                ///< true on the root
  bool empty = true;                      ///< no foreground voxel (the empty complex: no numbers); on every rank
  std::array<std::size_t, 4> betti{};     ///< b_0..b_3 of the volume's complex (on the root)
  long long euler_characteristic = 0;     ///< χ of the volume's complex (on the root)
  /// The cells of the volume's complex in dimensions 0..3 (on every rank; zeros when empty),
  /// counted as χ is (see the file comment) and checked against it: Σ (-1)^k cells[k] = χ.
  std::array<std::uint64_t, 4> cells{};
  std::size_t layers = 0;                 ///< voxel layers this rank read (0: it held no slab)
  std::uint64_t voxels_read = 0;          ///< voxels this rank read
  std::uint64_t label_bytes = 0;          ///< bytes of this rank's voxel bits and labels
  communication_counts communication;     ///< payload bytes this rank sent and received
};

namespace detail {

inline constexpr std::uint32_t foreground_label = 0x80000000u;  // the bit of a foreground label

/// A run of consecutive slabs, summarized (see the file comment, step 3).
struct slab_summary {
  bool present = false;          // false: no layer (a rank past the number of layers)
  std::int64_t foreground = 0;   // foreground components
  std::int64_t bounded = 0;      // background components not joined to the outside
  std::int64_t chi = 0;          // χ of its complex, less the 2-D χ of each layer it is cut at
  std::array<std::int64_t, 4> cells{};  // its complex's cells by dimension, less those of each cut layer's plane
  std::vector<std::uint32_t> first, last;  // labels of the first and last layer (nx · ny each)
};

/// The dense labels of `layer` (a range of voxels of a labelling): background joined to the
/// outside is 0, every other component a number from 1 (its own for each component), with
/// foreground_label set for a foreground voxel. `ids` carries the numbering over both layers.
template <class Index, class Foreground>
std::vector<std::uint32_t> layer_labels(lacuna::detail::voxel_labelling<Index>& l, Foreground& foreground, std::size_t from,
                                        std::size_t width, std::unordered_map<Index, std::uint32_t>& ids) {
  std::vector<std::uint32_t> out(width);
  for (std::size_t i = 0; i < width; ++i) {
    const Index root = l.forest.find(static_cast<Index>(from + i + 1));
    if (root == 0) continue;  // background reaching the outside
    const auto [it, fresh] = ids.try_emplace(root, static_cast<std::uint32_t>(ids.size() + 1));
    out[i] = it->second | (foreground(from + i) ? foreground_label : 0u);
  }
  return out;
}

/// The 2-D χ of the union of the foreground of the labelled layers a and b (either may be empty).
inline long long layer_union_euler(std::size_t nx, std::size_t ny, const std::vector<std::uint32_t>* a,
                                   const std::vector<std::uint32_t>* b) {
  return lacuna::detail::euler_by_configurations<2>({nx, ny}, [&](std::size_t v) {
    return (a && ((*a)[v] & foreground_label)) || (b && ((*b)[v] & foreground_label));
  });
}

/// The cells of the 2-D closed-square complex of the nx × ny footprint `in` (squares whose
/// predicate holds, with their edges and vertices): {vertices, edges, squares}. An edge or a
/// vertex is present when one of the (at most 2 or 4) squares around it is.
template <class In>
std::array<std::int64_t, 3> footprint_cells(std::size_t nx, std::size_t ny, In&& in) {
  std::array<std::int64_t, 3> c{};
  auto at = [&](std::size_t x, std::size_t y) { return x < nx && y < ny && in(y * nx + x); };  // x, y wrap below 0
  for (std::size_t y = 0; y <= ny; ++y)
    for (std::size_t x = 0; x <= nx; ++x) {
      const bool here = at(x, y), left = at(x - 1, y), down = at(x, y - 1), both = at(x - 1, y - 1);
      c[0] += (here || left || down || both) ? 1 : 0;  // vertex (x, y)
      c[1] += (here || down) ? 1 : 0;                   // edge from (x, y) along x
      c[1] += (here || left) ? 1 : 0;                   // edge from (x, y) along y
      c[2] += here ? 1 : 0;
    }
  return c;
}

/// The cells of the 2-D complex of the union of the foreground of the labelled layers a and b
/// (either may be empty): the cells of the plane between them in the volume's complex.
inline std::array<std::int64_t, 3> layer_union_cells(std::size_t nx, std::size_t ny, const std::vector<std::uint32_t>* a,
                                                     const std::vector<std::uint32_t>* b) {
  return footprint_cells(nx, ny, [&](std::size_t v) {
    return (a && ((*a)[v] & foreground_label)) || (b && ((*b)[v] & foreground_label));
  });
}

/// The cells by dimension of the 3-D complex of an nx × ny × layers block: the layers' middles
/// (a square of the footprint is a voxel, an edge a vertical square, a vertex a vertical edge)
/// and the planes 0..layers between them (the footprint of the layers on either side).
template <class Foreground>
std::array<std::int64_t, 4> block_cells(std::size_t nx, std::size_t ny, std::size_t layers, Foreground& foreground) {
  std::array<std::int64_t, 4> c{};
  const std::size_t width = nx * ny;
  for (std::size_t z = 0; z <= layers; ++z) {
    const auto plane = footprint_cells(nx, ny, [&](std::size_t v) {
      return (z > 0 && foreground((z - 1) * width + v)) || (z < layers && foreground(z * width + v));
    });
    for (int k = 0; k < 3; ++k) c[k] += plane[k];
    if (z == layers) break;
    const auto middle = footprint_cells(nx, ny, [&](std::size_t v) { return foreground(z * width + v); });
    for (int k = 0; k < 3; ++k) c[k + 1] += middle[k];
  }
  return c;
}

/// Labels one slab of `layers` layers of an nx × ny volume whose voxel bits are `bits`, the
/// slab's first layer being the volume's when `bottom`, its last the volume's when `top`.
template <class Index>
slab_summary summarize_slab(const std::vector<std::uint64_t>& bits, std::size_t nx, std::size_t ny, std::size_t layers,
                            bool bottom, bool top) {
  auto foreground = [&](std::size_t v) { return ((bits[v >> 6] >> (v & 63)) & 1u) != 0; };
  const std::array<std::size_t, 3> n{nx, ny, layers};
  auto l = lacuna::detail::label_voxels<3, Index>(n, foreground, {{{true, true}, {true, true}, {bottom, top}}}, nullptr);
  slab_summary s;
  s.present = true;
  s.foreground = static_cast<std::int64_t>(l.foreground_components);
  s.bounded = static_cast<std::int64_t>(l.bounded_background);
  const std::size_t width = nx * ny;
  std::unordered_map<Index, std::uint32_t> ids;
  s.first = layer_labels(l, foreground, 0, width, ids);
  s.last = layer_labels(l, foreground, (layers - 1) * width, width, ids);
  l = lacuna::detail::voxel_labelling<Index>{lacuna::detail::voxel_forest<Index>(0)};  // the labels go before the χ count
  s.chi = lacuna::detail::euler_by_configurations<3>(n, foreground);
  if (!bottom) s.chi -= layer_union_euler(nx, ny, &s.first, nullptr);
  if (!top) s.chi -= layer_union_euler(nx, ny, &s.last, nullptr);
  s.cells = block_cells(nx, ny, layers, foreground);
  if (!bottom) {
    const auto plane = layer_union_cells(nx, ny, &s.first, nullptr);
    for (int k = 0; k < 3; ++k) s.cells[k] -= plane[k];
  }
  if (!top) {
    const auto plane = layer_union_cells(nx, ny, &s.last, nullptr);
    for (int k = 0; k < 3; ++k) s.cells[k] -= plane[k];
  }
  return s;
}

/// Joins the summary `a` with `b`, the slabs just above it (see the file comment, step 3).
inline slab_summary join_summaries(slab_summary a, slab_summary b, std::size_t nx, std::size_t ny) {
  if (!b.present) return a;
  if (!a.present) return b;
  const std::size_t width = nx * ny;
  std::uint32_t most_a = 0, most_b = 0;
  for (const auto* layer : {&a.first, &a.last})
    for (auto x : *layer) most_a = std::max(most_a, x & ~foreground_label);
  for (const auto* layer : {&b.first, &b.last})
    for (auto x : *layer) most_b = std::max(most_b, x & ~foreground_label);
  // nodes: 0 the outside, a's component k is k, b's component k is most_a + k
  lacuna::detail::voxel_forest<std::uint64_t> f(std::size_t{most_a} + most_b + 1);
  auto node_a = [&](std::uint32_t x) { return std::uint64_t{x & ~foreground_label}; };
  auto node_b = [&](std::uint32_t x) {
    const std::uint32_t k = x & ~foreground_label;
    return k == 0 ? std::uint64_t{0} : std::uint64_t{most_a} + k;
  };
  slab_summary j;
  j.present = true;
  j.foreground = a.foreground + b.foreground;
  j.bounded = a.bounded + b.bounded;
  j.chi = a.chi + b.chi + layer_union_euler(nx, ny, &a.last, &b.first);
  const auto plane = layer_union_cells(nx, ny, &a.last, &b.first);
  for (int k = 0; k < 4; ++k) j.cells[k] = a.cells[k] + b.cells[k] + (k < 3 ? plane[k] : 0);
  for (std::size_t y = 0; y < ny; ++y)
    for (std::size_t x = 0; x < nx; ++x) {
      const std::uint32_t below = a.last[y * nx + x];
      if (below & foreground_label) {
        for (std::size_t yy = y > 0 ? y - 1 : 0; yy <= y + 1 && yy < ny; ++yy)
          for (std::size_t xx = x > 0 ? x - 1 : 0; xx <= x + 1 && xx < nx; ++xx) {
            const std::uint32_t above = b.first[yy * nx + xx];
            if ((above & foreground_label) && f.unite(node_a(below), node_b(above))) --j.foreground;
          }
      } else {
        const std::uint32_t above = b.first[y * nx + x];
        if (!(above & foreground_label) && f.unite(node_a(below), node_b(above))) --j.bounded;
      }
    }
  // the outer layers, renumbered densely through the union-find
  std::unordered_map<std::uint64_t, std::uint32_t> ids;
  auto relabel = [&](const std::vector<std::uint32_t>& layer, auto node) {
    std::vector<std::uint32_t> out(width);
    for (std::size_t i = 0; i < width; ++i) {
      const std::uint64_t root = f.find(node(layer[i]));
      if (root == 0) continue;
      const auto [it, fresh] = ids.try_emplace(root, static_cast<std::uint32_t>(ids.size() + 1));
      out[i] = it->second | (layer[i] & foreground_label);
    }
    return out;
  };
  j.first = relabel(a.first, node_a);
  j.last = relabel(b.last, node_b);
  return j;
}

}  // namespace detail

/// The Betti numbers of the cubical complex of the NRRD volume (or 2-D image) at `path` over
/// the ranks of `comm` (collective: every rank calls it with the same arguments), by the
/// method of the file comment; the answer on options.root, each rank's own figures everywhere.
/// They are the ranks over Z and the dimensions over every field (no torsion). Throws
/// std::invalid_argument (on every rank, before any work) for a root outside the communicator,
/// distributed_error on every rank when any rank fails. Cost per rank: two passes over its
/// slab's voxels plus one of the χ count, about 4.1 bytes per voxel of its slab; per join, two
/// layers' labels sent (4 bytes per voxel of a layer each).
inline volume_duality_result volume_duality(MPI_Comm comm, const std::filesystem::path& path,
                                            const duality_options& options = {}) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  if (options.root < 0 || options.root >= size)
    throw std::invalid_argument("lacuna: volume_duality: the root is not a rank of the communicator");
  volume_duality_result r;

  const std::array<std::size_t, 3> extents = collective_phase(comm, "reading the volume header", [&] {
    const auto e = nrrd_volume_extents(path, options.limits);
    if (e[0] * e[1] >= (std::size_t{1} << 30))
      throw std::length_error("a layer of " + std::to_string(e[0] * e[1]) +
                              " voxels is too wide for the labels of the distributed duality route (2^30 at most)");
    return e;
  });
  const auto [nx, ny, nz] = extents;
  const std::size_t width = nx * ny;

  // Phase 1: read and label this rank's slab (no communication).
  detail::slab_summary mine = collective_phase(comm, "reading and labelling its slab", [&] {
    std::size_t begin = 0, end = 0;
    bool any = false;
    for (const auto& b : plan_slabs(nz, size))
      if (b.owner == rank) begin = any ? begin : b.begin, end = b.end, any = true;
    detail::slab_summary s;
    if (!any || begin == end) return s;
    const std::size_t layers = end - begin, voxels = width * layers;
    std::vector<std::uint64_t> bits;
    detail::read_nrrd_layers(path, begin, end, options.limits,
                     [&](const std::array<std::size_t, 3>&) { bits.assign((voxels + 63) / 64, 0); },
                     [&](std::size_t v, std::int64_t value) {
                       if (options.threshold ? value >= *options.threshold : value != 0)
                         bits[v >> 6] |= std::uint64_t{1} << (v & 63);
                     });
    r.layers = layers;
    r.voxels_read = voxels;
    const bool small = voxels < 0xffffffffu;
    r.label_bytes = bits.size() * sizeof(std::uint64_t) + (voxels + 1) * (small ? 4 : 8);
    return small ? detail::summarize_slab<std::uint32_t>(bits, nx, ny, layers, begin == 0, end == nz)
                 : detail::summarize_slab<std::uint64_t>(bits, nx, ny, layers, begin == 0, end == nz);
  });

  // Phase 2: the reduction tree (rank order is layer order).
  auto& counts = r.communication;
  for (int step = 1; step < size; step *= 2) {
    const bool receiver = rank % (2 * step) == 0 && rank + step < size;
    const bool sender = rank % (2 * step) == step;
    std::array<std::int64_t, 8> head{};
    if (sender) {
      head = {mine.present ? 1 : 0, mine.foreground, mine.bounded, mine.chi, mine.cells[0], mine.cells[1], mine.cells[2], mine.cells[3]};
      check_mpi(MPI_Send(head.data(), 8, MPI_INT64_T, rank - step, 0, comm), "MPI_Send (slab summary)");
      counts.bytes_sent += sizeof head;
    } else if (receiver) {
      check_mpi(MPI_Recv(head.data(), 8, MPI_INT64_T, rank + step, 0, comm, MPI_STATUS_IGNORE), "MPI_Recv (slab summary)");
      counts.bytes_received += sizeof head;
    }
    detail::slab_summary theirs;
    collective_phase(comm, "making room for the labels of the slabs above", [&] {
      if (!receiver || head[0] == 0) return;
      theirs.present = true;
      theirs.foreground = head[1], theirs.bounded = head[2], theirs.chi = head[3];
      theirs.cells = {head[4], head[5], head[6], head[7]};
      theirs.first.resize(width);
      theirs.last.resize(width);
    });
    // the labels only once the receiver has made room for them (a failure there is seen by all)
    if (sender && mine.present) {
      check_mpi(MPI_Send(mine.first.data(), static_cast<int>(width), MPI_UINT32_T, rank - step, 1, comm), "MPI_Send (labels)");
      check_mpi(MPI_Send(mine.last.data(), static_cast<int>(width), MPI_UINT32_T, rank - step, 2, comm), "MPI_Send (labels)");
      counts.bytes_sent += 2 * width * sizeof(std::uint32_t);
    }
    if (theirs.present) {
      check_mpi(MPI_Recv(theirs.first.data(), static_cast<int>(width), MPI_UINT32_T, rank + step, 1, comm, MPI_STATUS_IGNORE),
                "MPI_Recv (labels)");
      check_mpi(MPI_Recv(theirs.last.data(), static_cast<int>(width), MPI_UINT32_T, rank + step, 2, comm, MPI_STATUS_IGNORE),
                "MPI_Recv (labels)");
      counts.bytes_received += 2 * width * sizeof(std::uint32_t);
    }
    collective_phase(comm, "joining the labels of neighbouring slabs", [&] {
      if (sender) mine = detail::slab_summary{};
      if (receiver) mine = detail::join_summaries(std::move(mine), std::move(theirs), nx, ny);
    });
  }

  // Phase 3: rank 0 holds the whole volume's counts; the root gets them.
  std::array<std::int64_t, 8> total{mine.present ? 1 : 0, mine.foreground, mine.bounded, mine.chi,
                                    mine.cells[0], mine.cells[1], mine.cells[2], mine.cells[3]};
  check_mpi(MPI_Bcast(total.data(), 8, MPI_INT64_T, 0, comm), "MPI_Bcast (the counts)");
  if (rank != 0) counts.bytes_received += sizeof total;
  else counts.bytes_sent += sizeof total * static_cast<std::size_t>(size - 1);
  r.empty = total[1] == 0;  // no foreground component: no foreground voxel (known on every rank)
  for (std::size_t k = 0; k < 4; ++k) r.cells[k] = static_cast<std::uint64_t>(total[4 + k]);
  collective_phase(comm, "reading off the Betti numbers", [&] {
    if (rank != options.root) return;
    r.has_result = true;
    if (r.empty) return;
    const std::int64_t b1 = total[1] + total[2] - total[3];
    if (b1 < 0) throw std::logic_error("lacuna::distributed::volume_duality: Euler-Poincaré gives b_1 < 0");
    // two independent counts of χ: local configurations, and the cells themselves
    if (total[4] - total[5] + total[6] - total[7] != total[3])
      throw std::logic_error("lacuna::distributed::volume_duality: the cell counts disagree with the Euler characteristic");
    r.betti = {static_cast<std::size_t>(total[1]), static_cast<std::size_t>(b1), static_cast<std::size_t>(total[2]), 0};
    r.euler_characteristic = total[3];
  });
  return r;
}

namespace detail {

/// The groups of the root's answer `d` over R, as the one-process duality route reports them
/// (homology/routes.hpp duality_homology): free of ranks b_0..b_3 (no torsion, see the file
/// comment), degrees 0..3 as a volume's cubical complex has them (none for the empty volume),
/// b_0 less one for reduced homology. Precondition: d.has_result, and not (reduced and d.empty).
template <euclidean_domain R>
homology_result<R> duality_result(const volume_duality_result& d, bool reduced, const R& ring_one) {
  homology_result<R> res;
  res.reduced = reduced;
  res.level_offset_ = reduced ? -1 : 0;
  res.top_ = d.empty ? -1 : 3;
  res.ring_one_ = ring_one;
  for (int k = 0; k <= res.top_; ++k) {
    homology_group<R> g;
    g.dimension = k;
    g.rank = d.betti[static_cast<std::size_t>(k)] - (reduced && k == 0 ? 1 : 0);
    res.groups.push_back(std::move(g));
  }
  return res;
}

}  // namespace detail

}  // namespace lacuna::distributed

// lacuna/distributed/volume_homology.hpp — the homology of a NRRD volume on many MPI ranks,
// equal to that of the one-process engine on the whole volume (io/nrrd.hpp read_nrrd, then
// homology/homology.hpp), on any number of ranks.
//
//   auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, "scan.nrrd",
//                                                                  {.threshold = 100});
//   if (r.has_result) print(r.result);   // on the root rank
//
// The method (reductions of chain complexes by blocks, glued along their interfaces: Lewis &
// Zomorodian, "Multicore homology via Mayer–Vietoris", 2014; discrete Morse theory: Forman
// 1998; coreductions: Mrozek & Batko 2009):
//   1. The volume is cut into slabs (distributed/volume_blocks.hpp); each rank reads only its
//      slabs. The closed voxels of a slab form a subcomplex K_b of the whole complex K. Its
//      interface cells are those lying in a plane it shares with a neighbouring slab.
//   2. Each rank reduces each of its slabs by an acyclic matching of its non-interface cells
//      (coreductions, algorithm/morse_reduction.hpp, run on K_b with the interface cells cut
//      out: they have no boundary there and are nobody's face, so they stay critical). A
//      non-interface cell of K_b has all its cofaces of K in K_b, so the union of these
//      matchings over the slabs is an acyclic matching on K, and every gradient path stops at
//      an interface cell or stays in its slab: the Morse complex of K under that matching is
//      the union of the slabs' Morse complexes, glued along the interface cells (which appear,
//      with the same boundary, in both neighbours). For an interior critical cell σ, the
//      Morse boundary is the restriction to critical cells of ∂g(σ), g the lift (Sköldberg
//      2006): its interior part is the Morse boundary of the reduced slab, its interface part
//      is read off ∂ of the lifted chain. For an interface cell it is its cubical boundary.
//   3. The residual complexes (critical cells named by their position in the whole volume's
//      doubled grid, boundaries with int64 coefficients, overflow checked) are merged in a
//      reduction tree (distributed/slab_reduction_tree.hpp, the driver shared with
//      volume_persistence): neighbours glued pairwise over ceil(log2 P) rounds, each union
//      reduced again by unit pairs of cells no longer on an interface; the root runs the
//      one-process engine (homology/homology.hpp) on the residual of the whole volume, a
//      lacuna::cell_list whose cells are named as the one-process complex names them.
// Why the answer is the one-process answer: the glued complex is the Morse complex of K under
// an acyclic matching, chain homotopy equivalent to C(K) (Forman 1998; Sköldberg 2006), each
// merge of the tree replaces it by a chain-homotopy-equivalent one (Kaczynski, Mrozek &
// Ślusarek 1998; see slab_reduction_tree.hpp), and
// the engine is exact over any Euclidean domain R; the groups are padded to degree 3 as the
// one-process cubical complex reports them (top dimension 3 whenever a voxel is foreground).
//
// Errors: every phase runs under collective_phase (distributed/collective_error.hpp): bad
// input, integer overflow or memory exhaustion on any rank ends the call on every rank with
// the same lacuna::distributed::distributed_error naming the rank, the phase and the message.
//
// Generators (options.homology.generators, over the integers): the root's generators of the
// glued complex are broadcast, every rank lifts the cells interior to its slabs by their Morse
// lift, and the root adds the pieces up (detail::lift_generators): cycles of the whole
// volume's complex in the classes of the root's generators, cells named by grid position.
// A generator request takes the one-step gather (slab_reduction_tree.hpp with the tree off):
// the lift of a cell the root names is its slab's Morse lift, which a cell paired at a merge
// would not have (that would need each merge's own lift, composed down the tree).
// Not yet offered: generators over other rings (std::invalid_argument on every rank).
#pragma once

#include <lacuna/algorithm/morse_reduction.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/distributed/collective_error.hpp>
#include <lacuna/distributed/gather_words.hpp>
#include <lacuna/distributed/slab_reduction_tree.hpp>
#include <lacuna/distributed/volume_blocks.hpp>
#include <lacuna/distributed/volume_duality.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/integer.hpp>

#include <mpi.h>

#include <algorithm>
#include <array>
#include <concepts>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <limits>
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna::distributed {

/// Options of volume_homology (designated initializers welcome).
struct volume_options {
  /// Foreground: samples >= threshold when set, else samples other than zero (as `lacuna
  /// homology --threshold`).
  std::optional<std::int64_t> threshold{};
  /// The limits every rank's header reader enforces (io/read_limits.hpp).
  io::read_limits limits{};
  /// Slabs per rank (at most; fewer when the volume has fewer voxel layers).
  std::size_t blocks_per_rank = 1;
  /// The rank that glues the residuals and finishes; it alone holds the result.
  int root = 0;
  /// Options of the engine run on the glued residual complex (generators: over the integers).
  homology_options homology{};
  /// Merge the residuals in a reduction tree (distributed/slab_reduction_tree.hpp); false, or
  /// a generator request, gathers every slab's residual on the root in one step.
  bool reduction_tree = true;
  /// Groups only (no generators, no basis, no witnesses): take the duality route of
  /// distributed/volume_duality.hpp (labellings and χ, no residual complex), as
  /// sparse_elimination::cubical_duality does for the one-process engine. false: never.
  bool cubical_duality = true;
};

/// A chain of the whole volume's cubical complex, its cells named by their position in the
/// doubled grid of the whole volume (cubical_complex<3>::position_type, index_of gives the
/// one-process index).
template <class R>
struct grid_chain {
  int dimension = 0;                                              ///< k
  std::vector<std::pair<std::array<std::size_t, 3>, R>> terms;  ///< (position, coefficient), by position
};

/// The answer of volume_homology on one rank.
template <class R>
struct volume_homology_result {
  bool has_result = false;           ///< true on the root
  homology_result<R> result;         ///< the homology of the volume (on the root); its chains index the glued complex
  /// With options.homology.generators (over the integers): generators[k][j] is the cycle of the
  /// volume's complex lifting result.groups[k].generators[j] (on the root).
  std::vector<std::vector<grid_chain<R>>> generators;
  /// The cells of the whole volume's cubical complex in dimensions 0..3 (empty when no voxel is
  /// foreground: the empty complex), on every rank — the counts of the one-process complex.
  /// Each rank counts the cells its slabs own (detail::count_owned_cells: a cell on a plane two
  /// slabs share is owned by the slab below when it is a cell of it, else by the slab above, so
  /// it is counted once), and the counts are summed exactly (uint64).
  std::vector<std::uint64_t> cells;
  volume_run_statistics statistics;  ///< this rank's figures
};

namespace detail {

/// The slab complex with its interface cells cut out: same cells and indices, an interface
/// cell has an empty boundary and is no cell's face. Models lacuna::cell_complex.
class interface_cut {
 public:
  interface_cut(const cubical_complex<3>& c, bool low, bool high) : c_(c), low_(low), high_(high), top_(2 * c.extents()[2]) {}
  int top_dimension() const noexcept { return c_.top_dimension(); }
  std::size_t cell_count(int k) const noexcept { return c_.cell_count(k); }
  bool is_interface(const cubical_complex<3>::position_type& p) const noexcept {
    return (low_ && p[2] == 0) || (high_ && p[2] == top_);
  }
  cubical_complex<3>::boundary_range boundary(int k, std::size_t i) const {
    cubical_complex<3>::boundary_range out;
    const auto p = c_.position(k, i);
    if (is_interface(p)) return out;
    for (const auto& t : c_.boundary_at(p))
      if (!is_interface(c_.position(k - 1, t.face))) out.push_back(t);
    return out;
  }

 private:
  const cubical_complex<3>& c_;
  bool low_, high_;
  std::size_t top_;
};

/// A reduced slab kept for lifting generators: its Morse complex, and its critical cells by
/// grid id.
struct kept_slab {
  volume_slab slab;
  morse_complex morse;
  std::array<std::unordered_map<std::uint64_t, std::size_t>, 4> critical;
};

/// Appends the residual complex of one slab to `out` as records of slab_reduction_tree.hpp
/// (value 0); keeps the Morse complex in `keep` when given. Returns the critical cells.
inline std::uint64_t reduce_slab(const volume_slab& s, std::size_t layers, const grid_numbering& g,
                                 std::vector<std::int64_t>& out, kept_slab* keep = nullptr) {
  const cubical_complex<3>& c = s.complex;
  if (c.top_dimension() < 0) return 0;
  const interface_cut cut(c, s.begin > 0, s.end < layers);
  morse_complex m = morse_reduce(cut);
  const std::size_t shift = 2 * s.begin;
  std::uint64_t cells = 0;
  std::map<std::uint64_t, integer> acc;
  for (int k = 0; k <= m.top_dimension(); ++k) {
    for (std::size_t i = 0; i < m.cell_count(k); ++i) {
      const std::size_t orig = m.original_cell(k, i);
      const auto p = c.position(k, orig);
      acc.clear();
      if (cut.is_interface(p)) {
        for (const auto& t : c.boundary_at(p)) acc[g.id(c.position(k - 1, t.face), shift)] += integer(t.coefficient);
      } else {
        for (const auto& t : m.boundary(k, i))
          acc[g.id(c.position(k - 1, m.original_cell(k - 1, t.face)), shift)] += integer(t.coefficient);
        if (k > 0) {
          // the interface part of ∂g(σ): g(σ) = σ + the k-cells of the gradient paths from σ
          const chain<integer> lifted = m.lift(chain<integer>{k, {{i, integer(1)}}});
          for (const auto& u : lifted.terms)
            for (const auto& t : c.boundary(k, u.cell)) {
              const auto q = c.position(k - 1, t.face);
              if (cut.is_interface(q)) acc[g.id(q, shift)] += u.coefficient * integer(t.coefficient);
            }
        }
      }
      out.push_back(k);
      out.push_back(static_cast<std::int64_t>(g.id(p, shift)));
      out.push_back(0);  // the value word of the record (slab_reduction_tree.hpp): plain homology has none
      const std::size_t count_at = out.size();
      out.push_back(0);
      std::int64_t terms = 0;
      for (const auto& [face, coef] : acc) {
        if (coef == integer(0)) continue;
        if (!coef.is_small())
          throw std::overflow_error("lacuna: a Morse boundary coefficient of cell " + cubical_complex<3>::position_name(g.position(g.id(p, shift))) +
                                    " does not fit in 64 bits");
        out.push_back(static_cast<std::int64_t>(face));
        out.push_back(coef.small_value());
        ++terms;
      }
      out[count_at] = terms;
      ++cells;
      if (keep) keep->critical[static_cast<std::size_t>(k)][g.id(p, shift)] = i;
    }
  }
  if (keep) keep->morse = std::move(m);
  return cells;
}

/// Adds to `counts` the cells the slab `s` owns in the whole volume's complex: all its cells,
/// except (for a slab above another) those of its lowest plane that are also cells of the slab
/// below — faces of a foreground voxel of layer s.begin - 1, which this reads (one layer, with
/// the same foreground rule `image`), and which the slab below counts among its own.
inline void count_owned_cells(const volume_slab& s, const std::filesystem::path& path, const io::image_options& image,
                              std::array<std::uint64_t, 4>& counts) {
  const cubical_complex<3>& c = s.complex;
  const std::size_t row = 2 * s.volume_extents[0] + 1;
  std::vector<bool> below;  // (x, y) of the cells of the slab below on the shared plane
  if (s.begin > 0 && c.top_dimension() >= 0) {
    const volume_slab layer = read_nrrd_slab(path, s.begin - 1, s.begin, image);
    below.assign(row * (2 * s.volume_extents[1] + 1), false);
    for (int k = 0; k <= layer.complex.top_dimension() && k < 3; ++k)
      for (std::size_t i = 0; i < layer.complex.cell_count(k); ++i) {
        const auto p = layer.complex.position(k, i);
        if (p[2] == 2) below[p[0] + row * p[1]] = true;
      }
  }
  for (int k = 0; k <= c.top_dimension() && k <= 3; ++k)
    for (std::size_t i = 0; i < c.cell_count(k); ++i) {
      if (!below.empty()) {
        const auto p = c.position(k, i);
        if (p[2] == 0 && below[p[0] + row * p[1]]) continue;
      }
      ++counts[static_cast<std::size_t>(k)];
    }
}

/// Lifts the root's generators (chains of the glued complex) to cycles of the whole volume's
/// complex: a glued cell on a plane two slabs share is a cell of the volume as it is; any
/// other is a critical cell of exactly one slab, whose rank lifts it by that slab's Morse lift
/// g (g(σ) = σ + the cells of the gradient paths from σ; a chain map, so a cycle goes to a
/// cycle of the same class: Sköldberg 2006). Collective over comm.
template <class R>
void lift_generators(MPI_Comm comm, int root, volume_homology_result<R>& r, const std::vector<kept_slab>& kept,
                     const grid_numbering& g, const std::vector<volume_block>& blocks,
                     const std::vector<std::vector<std::uint64_t>>& ids) {
  int rank = 0;
  MPI_Comm_rank(comm, &rank);
  auto small = [](const integer& x) {
    if (!x.is_small()) throw std::overflow_error("lacuna: a generator coefficient does not fit in 64 bits");
    return x.small_value();
  };
  // the root packs them: per generator, degree, term count, then (grid id, coefficient) pairs
  std::vector<std::int64_t> words = collective_phase(comm, "packing the generators", [&] {
    std::vector<std::int64_t> w;
    if (rank != root) return w;
    for (const auto& grp : r.result.groups)
      for (const auto& z : grp.generators) {
        w.push_back(z.dimension);
        w.push_back(static_cast<std::int64_t>(z.terms.size()));
        for (const auto& t : z.terms) {
          w.push_back(static_cast<std::int64_t>(ids.at(static_cast<std::size_t>(z.dimension)).at(t.cell)));
          w.push_back(small(t.coefficient));
        }
      }
    if (w.size() > static_cast<std::size_t>(std::numeric_limits<int>::max()))
      throw std::length_error("the generators exceed 2^31 - 1 words");
    return w;
  });
  long long n = static_cast<long long>(words.size());
  check_mpi(MPI_Bcast(&n, 1, MPI_LONG_LONG, root, comm), "MPI_Bcast (generator size)");
  words.resize(static_cast<std::size_t>(n));
  check_mpi(MPI_Bcast(words.data(), static_cast<int>(n), MPI_INT64_T, root, comm), "MPI_Bcast (generators)");
  r.statistics.bytes_received += rank == root ? 0 : static_cast<std::uint64_t>(n) * sizeof(std::int64_t);
  r.statistics.bytes_sent += rank == root ? static_cast<std::uint64_t>(n) * sizeof(std::int64_t) : 0;
  // every rank lifts the cells interior to its slabs: (generator, grid id, coefficient)
  const std::vector<std::int64_t> lifted = collective_phase(comm, "lifting the generators", [&] {
    std::vector<std::int64_t> out;
    std::int64_t gen = 0;
    for (std::size_t at = 0; at < words.size(); ++gen) {
      const int k = static_cast<int>(words[at]);
      const auto terms = static_cast<std::size_t>(words[at + 1]);
      at += 2;
      for (std::size_t t = 0; t < terms; ++t, at += 2) {
        const auto id = static_cast<std::uint64_t>(words[at]);
        const std::size_t z = g.position(id)[2];
        for (const auto& ks : kept) {
          const bool low_ok = ks.slab.begin == 0 || z > 2 * ks.slab.begin;
          const bool high_ok = ks.slab.end == ks.slab.volume_extents[2] ? z <= 2 * ks.slab.end : z < 2 * ks.slab.end;
          if (!low_ok || !high_ok) continue;
          const auto f = ks.critical[static_cast<std::size_t>(k)].find(id);
          if (f == ks.critical[static_cast<std::size_t>(k)].end())
            throw std::runtime_error("lacuna: a generator names a cell its slab did not keep");
          const chain<integer> up = ks.morse.lift(chain<integer>{k, {{f->second, integer(words[at + 1])}}});
          for (const auto& u : up.terms) {
            out.push_back(gen);
            out.push_back(static_cast<std::int64_t>(g.id(ks.slab.complex.position(k, u.cell), 2 * ks.slab.begin)));
            out.push_back(small(u.coefficient));
          }
          break;
        }
      }
    }
    return out;
  });
  communication_counts sent;
  const std::vector<std::int64_t> all = gather_words(comm, root, lifted, sent);
  r.statistics.bytes_sent += sent.bytes_sent;
  r.statistics.bytes_received += sent.bytes_received;
  collective_phase(comm, "assembling the generators", [&] {
    if (rank != root) return;
    std::vector<std::map<std::uint64_t, integer>> sums;
    std::vector<int> degree;
    auto shared_plane = [&](std::size_t z) {
      if (z % 2 != 0) return false;
      for (const auto& b : blocks)
        if (b.begin > 0 && 2 * b.begin == z) return true;
      return false;
    };
    for (std::size_t at = 0; at < words.size();) {
      degree.push_back(static_cast<int>(words[at]));
      sums.emplace_back();
      const auto terms = static_cast<std::size_t>(words[at + 1]);
      at += 2;
      for (std::size_t t = 0; t < terms; ++t, at += 2) {
        const auto id = static_cast<std::uint64_t>(words[at]);
        if (shared_plane(g.position(id)[2])) sums.back()[id] += integer(words[at + 1]);
      }
    }
    for (std::size_t at = 0; at + 3 <= all.size(); at += 3)
      sums.at(static_cast<std::size_t>(all[at]))[static_cast<std::uint64_t>(all[at + 1])] += integer(all[at + 2]);
    r.generators.assign(r.result.groups.size(), {});
    std::size_t gen = 0;
    for (std::size_t k = 0; k < r.result.groups.size(); ++k)
      for (std::size_t j = 0; j < r.result.groups[k].generators.size(); ++j, ++gen) {
        grid_chain<R> c;
        c.dimension = degree.at(gen);
        for (const auto& [id, x] : sums.at(gen))
          if (!(x == integer(0))) c.terms.emplace_back(g.position(id), x);
        r.generators[k].push_back(std::move(c));
      }
  });
}
}  // namespace detail

/// The homology over R (a lacuna::euclidean_domain; `ring_one` its one, for rings with a
/// run-time modulus) of the cubical complex of the NRRD volume `path` (dimension <= 3), under
/// the foreground rule of options.threshold — the groups `lacuna homology FILE.nrrd` reports.
/// Collective over `comm`: every rank calls it with the same arguments. The result is held by
/// options.root; every rank gets its own statistics. Throws distributed_error on every rank
/// when any rank fails (see the file comment); std::invalid_argument (on every rank, before
/// any work) for generators or a root outside the communicator.
/// Cost per rank: its slabs' voxels read and reduced (O(cells) matching, plus the gradient
/// paths of its critical cells); the root also holds and finishes the glued residual.
template <euclidean_domain R>
volume_homology_result<R> volume_homology(MPI_Comm comm, const std::filesystem::path& path, const volume_options& options = {},
                                          const R& ring_one = one<R>()) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  if (options.root < 0 || options.root >= size) throw std::invalid_argument("lacuna: volume_homology: the root is not a rank of the communicator");
  if (options.homology.generators && !std::same_as<R, integer>)
    throw std::invalid_argument("lacuna: volume_homology offers generators over the integers only");
  const bool want_generators = options.homology.generators;
  std::vector<detail::kept_slab> kept;
  volume_homology_result<R> r;
  auto& st = r.statistics;
  // The duality route, when it applies (a reduced group of the empty volume goes on below).
  if (options.cubical_duality && !want_generators && !options.homology.keep_basis.value_or(false) && !options.homology.witnesses) {
    const auto d = volume_duality(comm, path, {.threshold = options.threshold, .limits = options.limits, .root = options.root});
    st.blocks = d.layers > 0 ? 1 : 0;
    st.voxels_read = d.voxels_read;
    st.bytes_sent = d.communication.bytes_sent;
    st.bytes_received = d.communication.bytes_received;
    if (!(options.homology.reduced && d.empty)) {
      if (d.has_result) r.result = detail::duality_result<R>(d, options.homology.reduced, ring_one);
      if (!d.empty) r.cells.assign(d.cells.begin(), d.cells.end());
      r.has_result = d.has_result;
      return r;
    }
    st = {};
  }
  const io::image_options image{.threshold = options.threshold, .limits = options.limits};

  // Phase 1: the header (every rank reads it; the same error everywhere if it is bad).
  const std::array<std::size_t, 3> extents = collective_phase(
      comm, "reading the volume header", [&] { return nrrd_volume_extents(path, options.limits); });
  const auto blocks = plan_slabs(extents[2], size, options.blocks_per_rank);
  const detail::grid_numbering g{2 * extents[0] + 1, 2 * extents[1] + 1};

  std::array<std::uint64_t, 4> owned_cells{};
  // Phase 2: read and reduce this rank's slabs; merge the residuals in a reduction tree (one
  // step for generators: their lifts need the slabs' own Morse complexes); finish on the root.
  std::vector<std::vector<std::uint64_t>> glued_ids;
  auto reduce = [&](const volume_block& b, std::vector<std::int64_t>& out) -> std::uint64_t {
    volume_slab s = read_nrrd_slab(path, b.begin, b.end, image);
    detail::count_owned_cells(s, path, image, owned_cells);
    ++st.blocks;
    st.voxels_read += static_cast<std::uint64_t>(extents[0]) * extents[1] * (b.end - b.begin);
    for (int k = 0; k <= s.complex.top_dimension(); ++k) st.cells_in_blocks += s.complex.cell_count(k);
    if (!want_generators) return detail::reduce_slab(s, extents[2], g, out);
    kept.emplace_back();
    const std::uint64_t cells = detail::reduce_slab(s, extents[2], g, out, &kept.back());
    kept.back().slab = std::move(s);
    return cells;
  };
  auto finish = [&](std::vector<std::int64_t>&& all) {
    const cell_list glued = detail::glue_residuals(all, g);
    if (want_generators) glued_ids = detail::glued_ids(all);
    std::vector<std::int64_t>().swap(all);
    for (int k = 0; k <= glued.top_dimension(); ++k) st.glued_cells += glued.cell_count(k);
    r.result = homology<R>(glued, options.homology, sparse_elimination{}, ring_one);
    // the one-process cubical complex has top dimension 3 whenever it has a cell
    if (glued.top_dimension() >= 0)
      while (r.result.groups.size() < 4) {
        homology_group<R> empty;
        empty.dimension = static_cast<int>(r.result.groups.size());
        r.result.groups.push_back(std::move(empty));
      }
    r.has_result = true;
  };
  detail::reduce_slabs_in_tree(comm, blocks, extents[2], g, {.root = options.root, .tree = options.reduction_tree && !want_generators},
                               st, reduce, finish);
  // The cell counts of the whole complex: the sum of what the slabs own.
  std::array<std::uint64_t, 4> all_cells{};
  check_mpi(MPI_Allreduce(owned_cells.data(), all_cells.data(), 4, MPI_UINT64_T, MPI_SUM, comm), "MPI_Allreduce (cell counts)");
  if (all_cells[0] > 0) r.cells.assign(all_cells.begin(), all_cells.end());
  if constexpr (std::same_as<R, integer>)
    if (want_generators) detail::lift_generators(comm, options.root, r, kept, g, blocks, glued_ids);
  return r;
}

}  // namespace lacuna::distributed

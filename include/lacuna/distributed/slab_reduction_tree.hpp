// lacuna/distributed/slab_reduction_tree.hpp — the one driver of the slab reductions
// (volume_homology.hpp, volume_persistence.hpp): every rank reduces its slabs, the residual
// complexes are merged pairwise in a reduction tree, and the root finishes.
//
//   reduce_slabs_in_tree(comm, blocks, layers, g, {.root = 0, .tree = true}, statistics,
//                        reduce_slab,   // (const volume_block&, std::vector<int64_t>& out) -> cells
//                        finish);       // (std::vector<int64_t>&& residual), on the root
//
// The residual of a set of slabs is a chain complex over the integers written as records:
//   dimension k, grid id (the cell's position in the whole volume's doubled grid, one number:
//   grid_numbering), value (the filtration value; 0 for plain homology), term count n, then n
//   pairs (face grid id, coefficient, int64).
// Its *interface cells* are the cells on a plane that a slab of the set shares with a slab
// outside it; they carry their cubical boundary (their faces lie on the same plane), were
// never paired, and appear with the same boundary in the residual of the neighbour.
//
// The tree (Lewis & Zomorodian, "Multicore homology via Mayer–Vietoris", 2014: blocks
// reduced apart and glued along their interfaces; Bauer, Kerber & Reininghaus, "Distributed
// computation of persistent homology", 2014: chunks reduced apart, then what is left of them
// merged and reduced again; Lipsky, Skraba & Vejdemo-Johansson, "A spectral sequence for
// parallelized persistence", 2011: the merge of blocks along their intersections):
//   0. every rank glues the residuals of its own slabs and reduces the union again (below);
//   1. round s = 0, 1, ..., ceil(log2 P) - 1: the rank at tree position v (v = rank - root
//      mod P) with v mod 2^(s+1) == 0 receives the residual of position v + 2^s, if any,
//      glues the two (a cell both hold — an interface cell of both — is kept once) and
//      reduces the union again, keeping critical the cells on the union's own interfaces.
//      Ranks hold contiguous runs of slabs in rank order (plan_slabs), so with root 0 every
//      merge joins neighbours; the interfaces are computed from the layer intervals of the
//      union, so a root elsewhere (one merge across the wrap-around) is exact too.
//   2. the root, whose union is the whole volume (no interface left), hands the residual to
//      `finish` (the engine).
// The re-reduction (reduce_residual) is the reduction of chain complexes of Kaczynski, Mrozek
// & Ślusarek (1998) on the merged residual, one unit pair (σ, τ) at a time: τ a face of σ
// with ⟨∂σ, τ⟩ = ε = ±1, neither an interface cell of the union, and — for persistence —
// σ and τ of equal value (the matching rule of Mischaikow & Nanda 2013). Then σ and τ go,
// every other coface ρ of τ gets ∂ρ − ⟨∂ρ, τ⟩ ε ∂σ, and σ is dropped from the boundaries of
// its cofaces. Why it is exact:
//   - each step replaces a complex by a chain-homotopy-equivalent one over Z, hence over
//     every ring (KMS 1998); with equal values the maps and the homotopy are filtered (∂σ has
//     values <= value(σ) = value(τ) <= value(ρ)), so the persistence diagrams are kept except
//     for pairs of persistence zero, which neither side reports (Mischaikow & Nanda 2013);
//   - interface cells are never paired, and no step changes their boundaries (their faces
//     are interface cells too, so they are nobody's ρ): the neighbour still sees them as
//     they are, and gluing later is gluing the same cells (the argument of the slab phase,
//     volume_homology.hpp, applied to the union);
//   - coefficients are int64 with every operation checked (ring/checked.hpp); a step that
//     would overflow is not done (the pair stays for the engine, which widens to big
//     integers), so no number is ever wrong because it grew.
// Order of steps (it changes the size, not the answer): zero-fill pairs first (σ with a single
// face: coreductions, Mrozek & Batko 2009; τ with a single coface: collapses), then pairs of
// least Markowitz count (Markowitz 1957), each followed by the zero-fill pairs it opened.
//
// With `tree` off, the residuals of all slabs are gathered on the root in one step
// (gather_words.hpp) and handed to `finish` unreduced (the generators of volume_homology need
// the slab reductions' own cells: see there).
//
// What each rank holds: its slabs (one at a time) while reducing them, its residual, and while
// merging its residual and one child's; the root at the end holds the reduced residual of the
// whole volume instead of every slab's interface planes at once.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/distributed/collective_error.hpp>
#include <lacuna/distributed/gather_words.hpp>
#include <lacuna/distributed/volume_blocks.hpp>
#include <lacuna/ring/checked.hpp>

#include <mpi.h>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <map>
#include <set>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <unordered_set>
#include <utility>
#include <vector>

namespace lacuna::distributed {

/// What one rank did, for the scale study and for reports.
struct volume_run_statistics {
  std::size_t blocks = 0;                 ///< slabs this rank reduced
  std::uint64_t voxels_read = 0;          ///< voxels of those slabs
  std::uint64_t cells_in_blocks = 0;      ///< cells of those slabs' complexes
  std::uint64_t residual_cells = 0;       ///< critical cells of its slabs' reductions (interface cells included)
  std::uint64_t bytes_sent = 0;           ///< bytes this rank sent over MPI (payload, counted here)
  std::uint64_t bytes_received = 0;       ///< bytes this rank received over MPI (payload)
  std::uint64_t glued_cells = 0;          ///< root: cells of the glued complex; 0 elsewhere
  std::uint64_t merges = 0;               ///< residuals this rank glued and reduced again (its own slabs' union included)
  std::uint64_t peak_residual_words = 0;  ///< the most residual words (int64) this rank held at once
};

/// How reduce_slabs_in_tree merges (designated initializers welcome).
struct slab_tree_options {
  int root = 0;       ///< the rank that finishes
  bool tree = true;   ///< false: gather every slab's residual on the root in one step, unreduced
};

namespace detail {

/// The position in the whole volume's doubled grid, as one number (axis 0 fastest).
struct grid_numbering {
  std::uint64_t gx = 1, gy = 1;
  std::uint64_t id(const cubical_complex<3>::position_type& p, std::size_t z_shift) const {
    return p[0] + gx * (p[1] + gy * (p[2] + z_shift));
  }
  cubical_complex<3>::position_type position(std::uint64_t id) const {
    return {static_cast<std::size_t>(id % gx), static_cast<std::size_t>((id / gx) % gy), static_cast<std::size_t>(id / gx / gy)};
  }
};

/// Walks the records of a residual, checking their shape: f(at) for the offset of each record.
/// Cells are of dimension 0 .. max_dimension (3 for volumes).
template <class F>
void for_each_record(const std::vector<std::int64_t>& all, F&& f, std::int64_t max_dimension = 3) {
  for (std::size_t at = 0; at < all.size();) {
    if (at + 4 > all.size()) throw std::runtime_error("lacuna: a residual record is cut short");
    const auto k = all[at];
    const auto terms = all[at + 3];
    if (k < 0 || k > max_dimension || terms < 0 || static_cast<std::uint64_t>(terms) > (all.size() - at - 4) / 2)
      throw std::runtime_error("lacuna: a residual record is malformed");
    f(at);
    at += 4 + 2 * static_cast<std::size_t>(terms);
  }
}

/// The grid ids of the cells of glue_residuals(all, g), by dimension, in the order of their
/// indices there (increasing ids).
inline std::vector<std::vector<std::uint64_t>> glued_ids(const std::vector<std::int64_t>& all) {
  std::vector<std::vector<std::uint64_t>> ids(4);
  for_each_record(all, [&](std::size_t at) { ids[static_cast<std::size_t>(all[at])].push_back(static_cast<std::uint64_t>(all[at + 1])); });
  for (auto& v : ids) {
    std::sort(v.begin(), v.end());
    v.erase(std::unique(v.begin(), v.end()), v.end());
  }
  while (!ids.empty() && ids.back().empty()) ids.pop_back();
  return ids;
}

/// The glued complex of a residual (a cell held twice is kept once), its k-cells numbered by
/// increasing grid id and named by their grid position.
inline cell_list glue_residuals(const std::vector<std::int64_t>& all, const grid_numbering& g) {
  std::array<std::map<std::uint64_t, std::size_t>, 4> by_id;  // grid id -> record offset
  for_each_record(all, [&](std::size_t at) { by_id[static_cast<std::size_t>(all[at])].emplace(static_cast<std::uint64_t>(all[at + 1]), at); });
  cell_list out;
  std::array<std::unordered_map<std::uint64_t, std::size_t>, 4> index;
  for (int k = 0; k <= 3; ++k) {
    for (const auto& [id, at] : by_id[static_cast<std::size_t>(k)]) {
      std::vector<incidence> terms;
      const auto n = static_cast<std::size_t>(all[at + 3]);
      for (std::size_t t = 0; t < n; ++t) {
        const auto face = static_cast<std::uint64_t>(all[at + 4 + 2 * t]);
        if (k == 0) throw std::runtime_error("lacuna: a residual vertex has a boundary");
        const auto f = index[static_cast<std::size_t>(k - 1)].find(face);
        if (f == index[static_cast<std::size_t>(k - 1)].end())
          throw std::runtime_error("lacuna: a residual cell names a face that no rank sent");
        terms.push_back({f->second, all[at + 5 + 2 * t]});
      }
      index[static_cast<std::size_t>(k)][id] = out.add_cell(k, cubical_complex<3>::position_name(g.position(id)), std::move(terms));
    }
  }
  return out;
}

/// Sorted, coalesced intervals of voxel layers [begin, end): the layers a tree node covers.
using layer_intervals = std::vector<std::pair<std::size_t, std::size_t>>;

inline layer_intervals coalesce(layer_intervals v) {
  std::sort(v.begin(), v.end());
  layer_intervals out;
  for (const auto& iv : v) {
    if (iv.first == iv.second) continue;
    if (!out.empty() && out.back().second >= iv.first) out.back().second = std::max(out.back().second, iv.second);
    else out.push_back(iv);
  }
  return out;
}

/// The layers of the slabs of the ranks at tree positions [v, v + span) (positions are ranks
/// counted from the root).
inline layer_intervals node_layers(const std::vector<volume_block>& blocks, int root, int size, int v, int span) {
  layer_intervals iv;
  for (const auto& b : blocks) {
    const int pos = ((b.owner - root) % size + size) % size;
    if (pos >= v && pos < v + span) iv.emplace_back(b.begin, b.end);
  }
  return coalesce(std::move(iv));
}

/// Whether the doubled-grid plane z is an interface of a node covering `iv` in a volume of
/// `layers` layers: an end of one of its intervals that is not an end of the volume.
inline bool interface_plane(const layer_intervals& iv, std::size_t layers, std::size_t z) {
  if (z % 2 != 0) return false;
  const std::size_t layer = z / 2;
  if (layer == 0 || layer >= layers) return false;
  for (const auto& [b, e] : iv)
    if (layer == b || layer == e) return true;
  return false;
}

/// The re-reduction of a merged residual (see the file comment).
class residual_reducer {
 public:
  using term_t = std::pair<std::uint64_t, std::int64_t>;  // (face grid id, coefficient)

  /// Reads the records of `all` (a cell held twice is kept once; cells of dimension at most
  /// max_dimension); interface(id) tells the cells that must stay. Throws std::runtime_error
  /// for malformed records or a face no record names.
  template <class Interface>
  residual_reducer(const std::vector<std::int64_t>& all, Interface&& interface, std::int64_t max_dimension = 3) {
    for_each_record(all, [&](std::size_t at) {
      const auto id = static_cast<std::uint64_t>(all[at + 1]);
      if (cells_.count(id)) return;
      cell c;
      c.k = static_cast<int>(all[at]);
      c.value = all[at + 2];
      c.interface = interface(id);
      const auto n = static_cast<std::size_t>(all[at + 3]);
      for (std::size_t t = 0; t < n; ++t) c.boundary.emplace_back(static_cast<std::uint64_t>(all[at + 4 + 2 * t]), all[at + 5 + 2 * t]);
      std::sort(c.boundary.begin(), c.boundary.end());
      cells_.emplace(id, std::move(c));
    }, max_dimension);
    for (const auto& [id, c] : cells_)
      for (const auto& [face, coef] : c.boundary) {
        const auto f = cells_.find(face);
        if (f == cells_.end() || f->second.k != c.k - 1) throw std::runtime_error("lacuna: a residual cell names a face that no rank sent");
        cofaces_[face].insert(id);
      }
  }

  /// Eliminates unit pairs of non-interface cells of equal value (see the file comment).
  void reduce() {
    std::vector<std::uint64_t> order;
    for (const auto& [id, c] : cells_)
      if (!c.interface) order.push_back(id);
    std::sort(order.begin(), order.end());  // a deterministic order
    work_.assign(order.rbegin(), order.rend());
    drain();
    for (bool progress = true; progress;) {
      progress = false;
      for (std::uint64_t id : order) {
        if (!try_pivot(id, false)) continue;
        progress = true;
        drain();
      }
    }
  }

  /// Appends the surviving cells as records, by dimension, then grid id; returns their count.
  std::uint64_t write(std::vector<std::int64_t>& out) const {
    std::vector<std::pair<int, std::uint64_t>> live;
    for (const auto& [id, c] : cells_)
      if (c.alive) live.emplace_back(c.k, id);
    std::sort(live.begin(), live.end());
    for (const auto& [k, id] : live) {
      const cell& c = cells_.at(id);
      out.push_back(k);
      out.push_back(static_cast<std::int64_t>(id));
      out.push_back(c.value);
      out.push_back(static_cast<std::int64_t>(c.boundary.size()));
      for (const auto& [face, coef] : c.boundary) {
        out.push_back(static_cast<std::int64_t>(face));
        out.push_back(coef);
      }
    }
    return live.size();
  }

 private:
  struct cell {
    int k = 0;
    std::int64_t value = 0;
    bool interface = false;
    bool alive = true;
    std::vector<term_t> boundary;  // by face id
  };

  static std::int64_t coefficient_of(const std::vector<term_t>& b, std::uint64_t face) {
    const auto it = std::lower_bound(b.begin(), b.end(), face, [](const term_t& t, std::uint64_t f) { return t.first < f; });
    return it != b.end() && it->first == face ? it->second : 0;
  }

  // the cofaces of `id`: kept exact (a cell is there iff it is alive and `id` is in its
  // boundary), so the Markowitz count costs nothing and a vertex that gathers many edges is
  // never rescanned
  std::vector<std::uint64_t> cofaces_of(std::uint64_t id) const {
    const auto it = cofaces_.find(id);
    if (it == cofaces_.end()) return {};
    std::vector<std::uint64_t> v(it->second.begin(), it->second.end());
    std::sort(v.begin(), v.end());
    return v;
  }
  std::size_t coface_count(std::uint64_t id) const {
    const auto it = cofaces_.find(id);
    return it == cofaces_.end() ? 0 : it->second.size();
  }

  // takes the best unit pivot below σ = id (zero fill-in only, when `zero_fill`); true if done
  bool try_pivot(std::uint64_t id, bool zero_fill) {
    cell& s = cells_.at(id);
    if (!s.alive || s.interface || s.k == 0) return false;
    std::uint64_t best = 0, best_cost = std::numeric_limits<std::uint64_t>::max();
    std::int64_t best_eps = 0;
    for (const auto& [face, coef] : s.boundary) {
      if (coef != 1 && coef != -1) continue;
      const cell& t = cells_.at(face);
      if (!t.alive || t.interface || t.value != s.value || refused_.count({id, face})) continue;
      const std::uint64_t cost = (coface_count(face) - 1) * (s.boundary.size() - 1);
      if (cost < best_cost) best = face, best_cost = cost, best_eps = coef;
    }
    if (best_eps == 0 || (zero_fill && best_cost != 0)) return false;
    if (!eliminate(id, best, best_eps)) {
      refused_.insert({id, best});
      return false;
    }
    return true;
  }

  void drain() {
    while (!work_.empty()) {
      const std::uint64_t id = work_.back();
      work_.pop_back();
      try_pivot(id, true);
    }
  }

  // σ, τ = ⟨∂σ, τ⟩ ε (ε = ±1); false (nothing changed) if an update would overflow int64
  bool eliminate(std::uint64_t sigma, std::uint64_t tau, std::int64_t eps) {
    cell& s = cells_.at(sigma);
    std::vector<std::pair<std::uint64_t, std::vector<term_t>>> updates;
    for (std::uint64_t rho : cofaces_of(tau)) {
      if (rho == sigma) continue;
      const cell& r = cells_.at(rho);
      std::int64_t m = 0;  // ∂ρ ← ∂ρ − m ∂σ, m = ⟨∂ρ, τ⟩ ε (ε^-1 = ε)
      if (checked_mul(coefficient_of(r.boundary, tau), eps, m)) return false;
      std::vector<term_t> nb;
      auto a = r.boundary.cbegin(), b = s.boundary.cbegin();
      while (a != r.boundary.cend() || b != s.boundary.cend()) {
        std::uint64_t face;
        std::int64_t x = 0, y = 0;
        if (b == s.boundary.cend() || (a != r.boundary.cend() && a->first < b->first)) face = a->first, x = (a++)->second;
        else if (a == r.boundary.cend() || b->first < a->first) face = b->first, y = (b++)->second;
        else face = a->first, x = (a++)->second, y = (b++)->second;
        std::int64_t my = 0, v = 0;
        if (checked_mul(m, y, my) || checked_sub(x, my, v)) return false;
        if (v != 0) nb.emplace_back(face, v);
      }
      updates.emplace_back(rho, std::move(nb));
    }
    for (auto& [rho, nb] : updates) {
      cell& r = cells_.at(rho);
      for (const auto& [face, coef] : nb)
        if (coefficient_of(r.boundary, face) == 0) cofaces_[face].insert(rho);
      for (const auto& [face, coef] : r.boundary)
        if (coefficient_of(nb, face) == 0) cofaces_[face].erase(rho);
      r.boundary = std::move(nb);
      work_.push_back(rho);
    }
    for (std::uint64_t up : cofaces_of(sigma)) {
      cell& u = cells_.at(up);
      u.boundary.erase(std::remove_if(u.boundary.begin(), u.boundary.end(), [&](const term_t& t) { return t.first == sigma; }), u.boundary.end());
      work_.push_back(up);
    }
    s.alive = false;
    cell& t = cells_.at(tau);
    t.alive = false;
    for (const auto& [face, coef] : t.boundary) cofaces_[face].erase(tau);
    for (const auto& [face, coef] : s.boundary) {
      if (face == tau) continue;
      auto& up = cofaces_[face];
      up.erase(sigma);
      if (up.size() == 1) work_.push_back(*up.begin());  // a collapse may have opened
    }
    cofaces_.erase(sigma);
    cofaces_.erase(tau);
    return true;
  }

  std::unordered_map<std::uint64_t, cell> cells_;
  std::unordered_map<std::uint64_t, std::unordered_set<std::uint64_t>> cofaces_;
  std::set<std::pair<std::uint64_t, std::uint64_t>> refused_;  // pairs whose step would overflow
  std::vector<std::uint64_t> work_;
};

/// The residual `all` glued and reduced again, keeping the interfaces of a node covering `iv`.
inline std::vector<std::int64_t> merge_residual(const std::vector<std::int64_t>& all, const layer_intervals& iv, std::size_t layers,
                                                const grid_numbering& g) {
  residual_reducer red(all, [&](std::uint64_t id) { return interface_plane(iv, layers, g.position(id)[2]); });
  red.reduce();
  std::vector<std::int64_t> out;
  red.write(out);
  return out;
}

/// Reads this rank's slabs (reduce_slab appends each one's residual and returns its critical
/// cells), merges the residuals in a reduction tree (or gathers them in one step), and calls
/// finish(residual) on the root with the residual of the whole volume (see the file comment).
/// Collective over comm; every phase runs under collective_phase, so a failure anywhere ends
/// every rank with the same distributed_error.
template <class ReduceSlab, class Finish>
void reduce_slabs_in_tree(MPI_Comm comm, const std::vector<volume_block>& blocks, std::size_t layers, const grid_numbering& g,
                          slab_tree_options options, volume_run_statistics& st, ReduceSlab&& reduce_slab, Finish&& finish) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  const int v = ((rank - options.root) % size + size) % size;  // position in the tree
  auto note_words = [&](std::uint64_t w) { st.peak_residual_words = std::max(st.peak_residual_words, w); };

  std::vector<std::int64_t> mine = collective_phase(comm, "reading and reducing its blocks", [&] {
    std::vector<std::int64_t> out;
    for (const auto& b : blocks)
      if (b.owner == rank) st.residual_cells += reduce_slab(b, out);
    note_words(out.size());
    return out;
  });

  if (!options.tree) {
    communication_counts sent;
    std::vector<std::int64_t> all = gather_words(comm, options.root, mine, sent);
    st.bytes_sent += sent.bytes_sent;
    st.bytes_received += sent.bytes_received;
    std::vector<std::int64_t>().swap(mine);
    note_words(all.size());
    collective_phase(comm, "gluing the residual complexes and finishing", [&] {
      if (rank == options.root) finish(std::move(all));
    });
    return;
  }

  collective_phase(comm, "merging the residuals of its blocks", [&] {
    if (mine.empty()) return;
    mine = merge_residual(mine, node_layers(blocks, options.root, size, v, 1), layers, g);
    ++st.merges;
  });
  for (int step = 1; step < size; step *= 2) {
    const bool sender = v % (2 * step) == step;
    const bool receiver = v % (2 * step) == 0 && v + step < size;
    const int partner = sender ? (rank - step + size) % size : (rank + step) % size;
    std::uint64_t count = mine.size();
    collective_phase(comm, "sending its residual up the reduction tree", [&] {
      if (sender && count > static_cast<std::uint64_t>(std::numeric_limits<int>::max()))
        throw std::length_error("its residual exceeds 2^31 - 1 words (use more ranks or more blocks per rank)");
    });
    if (sender) check_mpi(MPI_Send(&count, 1, MPI_UINT64_T, partner, 0, comm), "MPI_Send (residual size)");
    if (receiver) check_mpi(MPI_Recv(&count, 1, MPI_UINT64_T, partner, 0, comm, MPI_STATUS_IGNORE), "MPI_Recv (residual size)");
    std::vector<std::int64_t> child;
    collective_phase(comm, "receiving a residual in the reduction tree", [&] {
      if (!receiver) return;
      if (count > static_cast<std::uint64_t>(std::numeric_limits<int>::max()))
        throw std::length_error("a residual exceeds 2^31 - 1 words");
      child.resize(static_cast<std::size_t>(count));
      note_words(mine.size() + count);
    });
    if (sender) {
      check_mpi(MPI_Send(mine.data(), static_cast<int>(count), MPI_INT64_T, partner, 1, comm), "MPI_Send (residual)");
      st.bytes_sent += sizeof count + count * sizeof(std::int64_t);
      std::vector<std::int64_t>().swap(mine);
    }
    if (receiver) {
      check_mpi(MPI_Recv(child.data(), static_cast<int>(count), MPI_INT64_T, partner, 1, comm, MPI_STATUS_IGNORE), "MPI_Recv (residual)");
      st.bytes_received += sizeof count + count * sizeof(std::int64_t);
    }
    collective_phase(comm, "merging residuals in the reduction tree", [&] {
      if (!receiver) return;
      if (child.empty()) return;
      mine.insert(mine.end(), child.begin(), child.end());
      std::vector<std::int64_t>().swap(child);
      mine = merge_residual(mine, node_layers(blocks, options.root, size, v, std::min(2 * step, size - v)), layers, g);
      ++st.merges;
    });
  }
  collective_phase(comm, "gluing the residual complexes and finishing", [&] {
    if (rank == options.root) finish(std::move(mine));
  });
}

}  // namespace detail
}  // namespace lacuna::distributed

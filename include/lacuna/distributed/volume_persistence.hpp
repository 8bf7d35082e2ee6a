// lacuna/distributed/volume_persistence.hpp — sublevel (or superlevel) persistence of a NRRD
// volume on many MPI ranks, with the diagrams of the one-process run (io/nrrd.hpp
// read_nrrd_samples, cubical_filtration, persistence/persistence.hpp; pairs of persistence
// zero dropped, as `lacuna persistence FILE.nrrd` reports them), on any number of ranks.
//
// The method (chunks of a filtered complex reduced apart and merged: Bauer, Kerber &
// Reininghaus, "Distributed computation of persistent homology", 2014; matchings that respect
// a filtration: Mischaikow & Nanda, "Morse theory for filtrations and efficient computation of
// persistent homology", 2013):
//   1. Slabs as for volume_homology (distributed/volume_blocks.hpp). Every cell of the grid is
//      present; a cell's value is the first sample of the voxels containing it. A rank reads
//      its layers and one layer on each side, so the cells of the planes it shares with its
//      neighbours get their true values; those cells are its interface cells.
//   2. Each slab is reduced by coreductions (Mrozek & Batko 2009) on its associated graded
//      complex: a cell's faces there are its non-interface faces of the same value (∂∂ = 0
//      there too: a face of a face has a value between). So every pair has one value and
//      [υ:τ] = ±1, interface cells stay critical, and the matching is acyclic on the whole
//      complex: along a gradient path the value never rises, and at one value the coreduction
//      numbering falls (for a pair (τ, υ) the other faces of υ died before τ). The key
//      (value rank, number) therefore falls along every path; the Morse boundaries of the
//      critical cells are the flows of their boundaries along it (algorithm/gradient_flow.hpp,
//      over the integers, exact), stopping at critical and interface cells.
//   3. The residuals (critical cells with value, Morse boundary, and position in the whole
//      grid) are merged in the reduction tree of volume_homology
//      (distributed/slab_reduction_tree.hpp), whose re-reduction pairs only cells of equal
//      value; the root runs the engine (persistence/persistence.hpp) on the residual of the
//      whole volume filtered by value (values_filtration; cells of one value by dimension).
// Why the diagrams are those of one process: the glued complex is the Morse complex of the
// whole filtered complex under a matching whose pairs have equal values, and such a Morse
// complex, filtered by value, has the same persistence (Mischaikow & Nanda 2013, Theorem 4.3,
// from memory); the merges of the tree eliminate pairs of equal value, filtered chain homotopy
// equivalences; only pairs of persistence zero differ, and neither side reports them.
// The cells named in the result are those of the glued complex (result.cells names them as
// the one-process filtration does); with ties of values they may differ from one process's.
//
// Errors: as volume_homology — a failure on any rank ends every rank with one
// distributed_error. Not offered yet: representatives.
// Memory per rank: its slab's samples (and one layer each side), 10 bytes per cell of the slab
// for the matching, and its residual.
#pragma once

#include <lacuna/algorithm/gradient_flow.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/distributed/collective_error.hpp>
#include <lacuna/distributed/slab_reduction_tree.hpp>
#include <lacuna/distributed/volume_blocks.hpp>
#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/values_filtration.hpp>
#include <lacuna/ring/integer.hpp>

#include <mpi.h>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <map>
#include <memory>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <vector>

namespace lacuna::distributed {

/// Options of volume_persistence (designated initializers welcome).
struct volume_persistence_options {
  /// Sublevel (from the least sample up; `lacuna persistence`'s default) or superlevel.
  level_sets direction = level_sets::sublevel;
  /// Diagrams of dimensions 0..max_dimension (-1: all, 0..3).
  int max_dimension = -1;
  /// The limits every rank's header reader enforces.
  io::read_limits limits{};
  /// Slabs per rank (at most).
  std::size_t blocks_per_rank = 1;
  /// The rank that glues and finishes; it alone holds the result.
  int root = 0;
  /// Merge the residuals in a reduction tree (distributed/slab_reduction_tree.hpp); false
  /// gathers every slab's residual on the root in one step.
  bool reduction_tree = true;
};

/// The answer of volume_persistence on one rank.
template <class R>
struct volume_persistence_result {
  bool has_result = false;  ///< true on the root
  /// The diagrams (pairs of persistence zero dropped); cells are those of `cells`.
  persistence_result<std::int32_t, R, sample_order<std::int32_t>> result;
  /// The glued complex the cells of `result` index (names: positions in the whole grid).
  std::shared_ptr<const cell_list> cells;
  volume_run_statistics statistics;  ///< this rank's figures
};

namespace detail {

/// The filtered coreduction matching of one slab and its residual (see the file comment).
class filtered_slab_reducer {
 public:
  using filtration_t = cubical_filtration<3, std::int32_t>;
  enum kind_t : std::uint8_t { outside, live, critical, paired_down, up_plus, up_minus };

  // f: the slab with one layer each side where there is one; [lo, hi]: the slab's grid z range
  // in f; the interface planes are lo (when low) and hi (when high).
  filtered_slab_reducer(const filtration_t& f, std::size_t lo, std::size_t hi, bool low, bool high)
      : f_(f), lo_(lo), hi_(hi), low_(low), high_(high) {
    for (int k = 0; k <= 3; ++k) {
      const std::size_t n = f.cell_count(k);
      auto& d = dims_[static_cast<std::size_t>(k)];
      d.kind.assign(n, outside);
      d.mate.assign(n, 0);
      d.order.assign(n, 0);
      d.count.assign(n, 0);
      d.rank.assign(n, 0);
    }
    match();
  }

  // the residual: per critical cell of the slab, k, grid id, value, term count, terms
  std::uint64_t residual(const grid_numbering& g, std::size_t z_shift, std::vector<std::int64_t>& out) const {
    std::uint64_t cells = 0;
    std::map<std::uint64_t, integer> acc;
    for (int k = 0; k <= 3; ++k) {
      const auto& d = dims_[static_cast<std::size_t>(k)];
      for (std::size_t i = 0; i < d.kind.size(); ++i) {
        if (d.kind[i] != critical) continue;
        const auto p = f_.position(k, i);
        acc.clear();
        if (is_interface(p) || k == 0) {
          for (const auto& t : f_.boundary_at(p)) acc[g.id(f_.position(k - 1, t.face), z_shift)] += integer(t.coefficient);
        } else {
          gradient_flow<integer>(
              gradient_view{this, k - 1}, integer(1),
              [&](auto&& add) {
                for (const auto& t : f_.boundary_at(p)) add(static_cast<std::uint32_t>(t.face), integer(t.coefficient));
              },
              [&](std::uint32_t x, const integer& c) {
                if (dims_[static_cast<std::size_t>(k - 1)].kind[x] == critical) acc[g.id(f_.position(k - 1, x), z_shift)] += c;
              },
              [](std::uint32_t, const integer&) {});
        }
        out.push_back(k);
        out.push_back(static_cast<std::int64_t>(g.id(p, z_shift)));
        out.push_back(f_.value_at(p));
        const std::size_t count_at = out.size();
        out.push_back(0);
        std::int64_t terms = 0;
        for (const auto& [face, coef] : acc) {
          if (coef == integer(0)) continue;
          if (!coef.is_small())
            throw std::overflow_error("lacuna: a Morse boundary coefficient of cell " + filtration_t::position_name(p) +
                                      " (in its slab) does not fit in 64 bits");
          out.push_back(static_cast<std::int64_t>(face));
          out.push_back(coef.small_value());
          ++terms;
        }
        out[count_at] = terms;
        ++cells;
      }
    }
    return cells;
  }

 private:
  struct dim_data {
    std::vector<std::uint8_t> kind;
    std::vector<std::uint32_t> mate;   // partner (paired cells)
    std::vector<std::uint32_t> order;  // death number within the dimension, from 1; 0 for interface cells
    std::vector<std::uint8_t> count;   // live faces in the graded complex
    std::vector<std::uint32_t> rank;   // rank of the value in the filtration's order
  };

  // The gradient on the k-cells for gradient_flow: key (value rank, death number).
  struct gradient_view {
    using cell_type = std::uint32_t;
    const filtered_slab_reducer* r;
    int k;
    std::uint64_t priority(cell_type x) const {
      const auto& d = r->dims_[static_cast<std::size_t>(k)];
      return (std::uint64_t{d.rank[x]} << 32) | d.order[x];
    }
    int paired_up(cell_type x, cell_type& up) const {
      const auto& d = r->dims_[static_cast<std::size_t>(k)];
      if (d.kind[x] != up_plus && d.kind[x] != up_minus) return 0;
      up = d.mate[x];
      return d.kind[x] == up_plus ? 1 : -1;
    }
    template <class F>
    void for_each_face(cell_type u, F&& fn) const {
      for (const auto& t : r->f_.boundary(k + 1, u)) fn(static_cast<cell_type>(t.face), t.coefficient);
    }
  };

  bool in_slab(const filtration_t::position_type& p) const { return p[2] >= lo_ && p[2] <= hi_; }
  bool is_interface(const filtration_t::position_type& p) const { return (low_ && p[2] == lo_) || (high_ && p[2] == hi_); }
  std::uint32_t value_rank(std::int32_t v) const {
    // samples are 8- or 16-bit: v + 2^31 fits; the superlevel order runs the other way
    const auto up = static_cast<std::uint32_t>(static_cast<std::int64_t>(v) + (std::int64_t{1} << 31));
    return f_.direction() == level_sets::sublevel ? up : ~up;
  }
  bool graded(int k_face, std::size_t face, std::int32_t value) const {
    const auto& d = dims_[static_cast<std::size_t>(k_face)];
    return d.kind[face] == live && f_.cell_value(k_face, face) == value;
  }

  void kill(int k, std::size_t i, std::uint32_t& counter) {
    auto& d = dims_[static_cast<std::size_t>(k)];
    d.order[i] = ++counter;
    const std::int32_t v = f_.cell_value(k, i);
    if (k < 3)
      for (const auto& t : f_.coboundary(k, i)) {
        auto& up = dims_[static_cast<std::size_t>(k + 1)];
        if (up.kind[t.face] == live && f_.cell_value(k + 1, t.face) == v) {
          if (--up.count[t.face] == 1) queue_.push_back({k + 1, t.face});
        }
      }
  }

  void match() {
    std::array<std::uint32_t, 4> counters{};
    // cells of the slab: interface cells critical at once (number 0), the others live
    for (int k = 0; k <= 3; ++k) {
      auto& d = dims_[static_cast<std::size_t>(k)];
      for (std::size_t i = 0; i < d.kind.size(); ++i) {
        const auto p = f_.position(k, i);
        if (!in_slab(p)) continue;
        d.rank[i] = value_rank(f_.value_at(p));
        d.kind[i] = is_interface(p) ? critical : live;
      }
    }
    for (int k = 1; k <= 3; ++k) {
      auto& d = dims_[static_cast<std::size_t>(k)];
      for (std::size_t i = 0; i < d.kind.size(); ++i) {
        if (d.kind[i] != live) continue;
        const std::int32_t v = f_.cell_value(k, i);
        for (const auto& t : f_.boundary(k, i))
          if (graded(k - 1, t.face, v)) ++d.count[i];
        if (d.count[i] == 1) queue_.push_back({k, i});
      }
    }
    std::array<std::size_t, 4> scan{};
    for (;;) {
      while (!queue_.empty()) {
        const auto [k, u] = queue_.back();
        queue_.pop_back();
        auto& du = dims_[static_cast<std::size_t>(k)];
        if (du.kind[u] != live || du.count[u] != 1) continue;
        const std::int32_t v = f_.cell_value(k, u);
        for (const auto& t : f_.boundary(k, u)) {
          if (!graded(k - 1, t.face, v)) continue;
          auto& dt = dims_[static_cast<std::size_t>(k - 1)];
          dt.kind[t.face] = t.coefficient == 1 ? up_plus : up_minus;  // cubical incidences are ±1
          dt.mate[t.face] = static_cast<std::uint32_t>(u);
          du.kind[u] = paired_down;
          du.mate[u] = static_cast<std::uint32_t>(t.face);
          kill(k - 1, t.face, counters[static_cast<std::size_t>(k - 1)]);
          kill(k, u, counters[static_cast<std::size_t>(k)]);
          break;
        }
      }
      // no coreduction left: the live cell of lowest dimension (its faces all dead) is critical
      int k = 0;
      for (; k <= 3; ++k) {
        auto& d = dims_[static_cast<std::size_t>(k)];
        auto& s = scan[static_cast<std::size_t>(k)];
        while (s < d.kind.size() && d.kind[s] != live) ++s;
        if (s < d.kind.size()) break;
      }
      if (k > 3) break;
      const std::size_t i = scan[static_cast<std::size_t>(k)];
      dims_[static_cast<std::size_t>(k)].kind[i] = critical;
      kill(k, i, counters[static_cast<std::size_t>(k)]);
    }
    // interface cells: critical with number 0, below every slab cell of their value
  }

  const filtration_t& f_;
  std::size_t lo_, hi_;
  bool low_, high_;
  std::array<dim_data, 4> dims_;
  std::vector<std::pair<int, std::size_t>> queue_;
};

}  // namespace detail

/// The persistence diagrams over the field R (default Z/2; `ring_one` its one) of the sublevel
/// (or superlevel) filtration of the NRRD volume `path` (dimension <= 3) on the full cubical
/// grid, pairs of persistence zero dropped — the diagrams `lacuna persistence FILE.nrrd`
/// reports. Collective over `comm`; the result is held by options.root. Throws
/// distributed_error on every rank when any rank fails; std::invalid_argument (on every rank)
/// for a root outside the communicator.
template <field R = z2>
volume_persistence_result<R> volume_persistence(MPI_Comm comm, const std::filesystem::path& path,
                                                const volume_persistence_options& options = {}, const R& ring_one = one<R>()) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  if (options.root < 0 || options.root >= size) throw std::invalid_argument("lacuna: volume_persistence: the root is not a rank of the communicator");
  volume_persistence_result<R> r;
  auto& st = r.statistics;
  const std::array<std::size_t, 3> extents = collective_phase(
      comm, "reading the volume header", [&] { return nrrd_volume_extents(path, options.limits); });
  const auto blocks = plan_slabs(extents[2], size, options.blocks_per_rank);
  const detail::grid_numbering g{2 * extents[0] + 1, 2 * extents[1] + 1};

  auto reduce = [&](const volume_block& b, std::vector<std::int64_t>& out) -> std::uint64_t {
    const std::size_t g0 = b.begin > 0 ? b.begin - 1 : 0, g1 = std::min(extents[2], b.end + 1);
    auto [e, samples] = read_nrrd_slab_samples(path, g0, g1, options.limits);
    ++st.blocks;
    st.voxels_read += samples.size();
    const detail::filtered_slab_reducer::filtration_t f({e[0], e[1], g1 - g0}, std::move(samples), options.direction);
    for (int k = 0; k <= 3; ++k) st.cells_in_blocks += f.cell_count(k);
    const detail::filtered_slab_reducer red(f, 2 * (b.begin - g0), 2 * (b.end - g0), b.begin > 0, b.end < extents[2]);
    return red.residual(g, 2 * g0, out);
  };
  auto finish = [&](std::vector<std::int64_t>&& all) {
    std::unordered_map<std::uint64_t, std::int32_t> value_of;
    detail::for_each_record(all, [&](std::size_t at) { value_of[static_cast<std::uint64_t>(all[at + 1])] = static_cast<std::int32_t>(all[at + 2]); });
    auto cells = std::make_shared<cell_list>(detail::glue_residuals(all, g));
    std::vector<std::vector<std::int32_t>> values(static_cast<std::size_t>(cells->top_dimension() + 1));
    for (int k = 0; k <= cells->top_dimension(); ++k) st.glued_cells += cells->cell_count(k);
    // the values, by grid id: glue_residuals numbers the cells of a dimension by increasing id
    const std::vector<std::vector<std::uint64_t>> ids = detail::glued_ids(all);
    std::vector<std::int64_t>().swap(all);
    for (int k = 0; k <= cells->top_dimension(); ++k)
      if (static_cast<std::size_t>(k) < ids.size())
        for (std::uint64_t id : ids[static_cast<std::size_t>(k)]) values[static_cast<std::size_t>(k)].push_back(value_of.at(id));
    const sample_order<std::int32_t> order{.descending = options.direction == level_sets::superlevel};
    const values_filtration<cell_list, std::int32_t, sample_order<std::int32_t>> filt(*cells, std::move(values), order);
    const int top = options.max_dimension < 0 || options.max_dimension > 3 ? 3 : options.max_dimension;
    auto res = persistence<R>(filt, persistence_options{.max_dimension = top}, automatic_persistence{}, ring_one);
    r.result = without_zero_persistence(std::move(res));
    r.result.order = order;
    // the one-process filtration has diagrams 0..top whenever the volume has a voxel
    while (static_cast<int>(r.result.diagrams.size()) < top + 1) {
      persistence_diagram<std::int32_t, sample_order<std::int32_t>> d;
      d.dimension = static_cast<int>(r.result.diagrams.size());
      d.order = order;
      r.result.diagrams.push_back(std::move(d));
    }
    r.cells = std::move(cells);
    r.has_result = true;
  };
  detail::reduce_slabs_in_tree(comm, blocks, extents[2], g, {.root = options.root, .tree = options.reduction_tree}, st, reduce, finish);
  return r;
}

}  // namespace lacuna::distributed

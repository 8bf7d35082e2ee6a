// lacuna/algorithm/morse_reduction.hpp — discrete Morse reduction of any cell complex, with
// the chain maps between the original complex and its Morse complex.
//
//   lacuna::morse_complex m = lacuna::morse_reduce(c);   // c: any lacuna::cell_complex
//   lacuna::homology<lacuna::integer>(m);                // m is a cell complex itself
//   m.lift(z);  m.project(x);                            // chains back and forth
//
// The method, in three steps:
//   1. A matching by coreductions (Mrozek & Batko, "Coreduction homology algorithm", 2009;
//      matchings built this way: Harker, Mischaikow, Mrozek & Nanda, "Discrete Morse theoretic
//      algorithms for computing homology of complexes and maps", 2014). A live cell υ with
//      exactly one live face τ, [υ:τ] = ±1, is paired with it and both die; when no such
//      cell is left, the live cell of lowest dimension (all its faces are dead) is made
//      critical and dies, which starts the coreductions of the next piece. Every cell gets
//      the number of its death within its dimension. For a pair (τ, υ) the other faces of υ
//      died before τ, and the faces of a critical cell died before it: the matching is
//      acyclic (a discrete gradient in the sense of Forman, "Morse theory for cell
//      complexes", 1998), and a gradient path τ -> V(τ) -> τ' strictly lowers the number.
//      Collapses (a face with a single live coface) are not used: they pair τ with υ while
//      other faces of υ are still alive, which breaks that numbering.
//   2. The boundary of the Morse complex from gradient paths (algebraic Morse theory:
//      Sköldberg, "Morse theory from an algebraic viewpoint", 2006; Jöllenbeck & Welker,
//      "Minimal resolutions via algebraic discrete Morse theory", 2009). For a critical
//      k-cell σ, start from ∂σ and repeatedly take the (k-1)-cell ρ of largest number still
//      pending, with coefficient c: a critical ρ enters ∂σ with c; a ρ paired with a lower
//      cell is dropped; a ρ paired with a k-cell υ is replaced by -c [υ:ρ'] / [υ:ρ] on every
//      other face ρ' of υ. Every contribution to ρ comes from a cell of larger number, so
//      it has arrived when ρ is taken. Coefficients are int64 with every operation checked:
//      lacuna::coefficient_overflow when one does not fit (a caller may then fall back to
//      the unreduced engine).
//   3. The chain maps, over any Euclidean domain R (the flow of algorithm/gradient_flow.hpp,
//      shared with cubical_morse.hpp): lift (g, Morse -> original) runs the same traversal and also collects the k-cells -c / [υ:ρ] υ of the gradient paths, so
//      g(σ) = σ + (those cells); project (f, original -> Morse) takes the k-cells of a chain
//      by decreasing number: critical ones stay, those paired with a lower cell drop out,
//      one paired with a (k+1)-cell υ is replaced by -c [υ:ρ'] / [υ:x] on the other faces
//      ρ' of υ. f and g are chain maps, f∘g = id, and g∘f is chain homotopic to id
//      (Sköldberg 2006, the main theorem; from memory), so they induce inverse isomorphisms on homology.
//
// The morse_complex keeps a copy of the original boundaries (CSR, 32-bit face indices,
// int64 coefficients; duplicate faces added up, zeros dropped) and the matching, so lift and
// project need no reference to the original complex.
#pragma once

#include <lacuna/algorithm/gradient_flow.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <span>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// Options of morse_reduce (designated initializers welcome).
struct morse_options {
  /// Stop request and progress, may be null. Phases: "Morse matching" (units: reading and
  /// matching steps, two per cell) and "Morse boundaries" (units: critical cells).
  const run_control* control = nullptr;
};

namespace detail {
struct morse_builder;
}

/// The Morse complex of a cell complex under an acyclic matching built by coreductions (see
/// the top of this header), with the chain maps to and from the original. Models
/// lacuna::cell_complex: its k-cells are the critical k-cells, numbered in the order they
/// were made critical. Built by lacuna::morse_reduce.
class morse_complex {
 public:
  morse_complex() = default;

  /// The top dimension of the original complex (-1 if empty).
  int top_dimension() const { return top_; }
  /// The number of critical k-cells (0 for k outside 0..top).
  std::size_t cell_count(int k) const { return has(k) ? dim(k).critical.size() : 0; }
  /// The Morse boundary of the i-th critical k-cell: faces are critical (k-1)-cell indices,
  /// increasing, coefficients non-zero.
  std::span<const incidence> boundary(int k, std::size_t i) const {
    const auto& d = checked_dim(k);
    if (i >= d.critical.size()) throw std::out_of_range("lacuna: no critical cell " + std::to_string(i));
    return std::span<const incidence>(d.morse_terms).subspan(d.morse_offsets[i], d.morse_offsets[i + 1] - d.morse_offsets[i]);
  }
  /// The index, in the original complex, of the i-th critical k-cell.
  std::size_t original_cell(int k, std::size_t i) const {
    const auto& d = checked_dim(k);
    if (i >= d.critical.size()) throw std::out_of_range("lacuna: no critical cell " + std::to_string(i));
    return d.critical[i];
  }
  /// The number of k-cells of the original complex.
  std::size_t original_count(int k) const { return has(k) ? dim(k).kind.size() : 0; }

  /// g: a chain of the Morse complex to a chain of the original, g(σ) = σ plus the cells of
  /// the gradient paths from σ. A chain map with project(lift(z)) == z. R models
  /// euclidean_domain; `ring_one` is the one of R (rings with a run-time modulus). The stop
  /// request of `control` (may be null) is looked at every few thousand steps. Throws
  /// std::invalid_argument for a cell or dimension that does not exist.
  /// Cost: O(m log m) ring operations, m the number of cells on the gradient paths met.
  template <euclidean_domain R>
  chain<R> lift(const chain<R>& on_morse, const R& ring_one = one<R>(), const run_control* control = nullptr) const {
    if (control) control->check();
    const int k = on_morse.dimension;
    chain<R> out{k, {}};
    if (on_morse.terms.empty()) return out;
    const auto& d = checked_dim(k);
    const R zero_r = zero<R>() * ring_one;
    for (const auto& t : on_morse.terms) {
      if (t.cell >= d.critical.size()) throw std::invalid_argument("lacuna: a chain names a critical cell that does not exist");
      if (!(t.coefficient == zero_r)) out.terms.push_back({d.critical[t.cell], t.coefficient});
    }
    if (k > 0)  // g(σ) = σ + the cofaces the flow goes through
      gradient_flow<R>(
          gradient(k - 1), ring_one,
          [&](auto&& add) {
            for (const auto& t : on_morse.terms) {
              if (t.coefficient == zero_r) continue;
              const std::uint32_t s = d.critical[t.cell];
              for (std::size_t p = d.offsets[s]; p < d.offsets[s + 1]; ++p)
                add(d.faces[p], from_integer<R>(d.coefficients[p]) * ring_one * t.coefficient);
            }
          },
          [](std::uint32_t, const R&) {}, [&](std::uint32_t u, const R& w) { out.terms.push_back({u, w}); }, control);
    out.normalize_terms();
    return out;
  }

  /// f: a chain of the original complex to a chain of the Morse complex. A chain map with
  /// f∘g = id; R, unit, control and errors as for lift.
  template <euclidean_domain R>
  chain<R> project(const chain<R>& on_original, const R& ring_one = one<R>(), const run_control* control = nullptr) const {
    if (control) control->check();
    const int k = on_original.dimension;
    chain<R> out{k, {}};
    if (on_original.terms.empty()) return out;
    const auto& d = checked_dim(k);
    for (const auto& t : on_original.terms)
      if (t.cell >= d.kind.size()) throw std::invalid_argument("lacuna: a chain names a cell that does not exist");
    gradient_flow<R>(
        gradient(k), ring_one,
        [&](auto&& add) {
          for (const auto& t : on_original.terms) add(static_cast<std::uint32_t>(t.cell), t.coefficient);
        },
        [&](std::uint32_t x, const R& c) {
          if (d.kind[x] == critical) out.terms.push_back({d.mate[x], c});  // paired down: 0 in the Morse complex
        },
        [](std::uint32_t, const R&) {}, control);
    out.normalize_terms();
    return out;
  }

 private:
  friend struct detail::morse_builder;

  // What a cell became: critical (mate = its index among the critical cells), paired with a
  // face (mate = that (k-1)-cell), or paired with a coface υ (mate = that (k+1)-cell) with
  // [υ:cell] = +1 or -1.
  enum cell_kind : std::uint8_t { critical, paired_down, up_plus, up_minus };

  struct dimension_data {
    // The original k-cells: boundaries in CSR form.
    std::vector<std::size_t> offsets{0};
    std::vector<std::uint32_t> faces;
    std::vector<std::int64_t> coefficients;
    // The matching.
    std::vector<std::uint8_t> kind;
    std::vector<std::uint32_t> mate;
    std::vector<std::uint32_t> order;     // death number within the dimension
    std::vector<std::uint32_t> critical;  // critical index -> original index
    // The Morse boundaries of the critical k-cells.
    std::vector<std::size_t> morse_offsets{0};
    std::vector<incidence> morse_terms;
  };

  // The gradient on the k-cells (algorithm/gradient_flow.hpp): priority the death number
  // (every gradient path lowers it), partners and faces from the stored matching.
  struct gradient_view {
    using cell_type = std::uint32_t;
    const dimension_data* lo;
    const dimension_data* hi;  // the (k+1)-cells; null at the top dimension
    std::uint64_t priority(cell_type x) const { return lo->order[x]; }
    int paired_up(cell_type x, cell_type& up) const {
      if (lo->kind[x] != up_plus && lo->kind[x] != up_minus) return 0;
      up = lo->mate[x];
      return lo->kind[x] == up_plus ? 1 : -1;
    }
    template <class F>
    void for_each_face(cell_type u, F&& f) const {
      for (std::size_t p = hi->offsets[u]; p < hi->offsets[u + 1]; ++p) f(hi->faces[p], hi->coefficients[p]);
    }
  };
  gradient_view gradient(int k) const { return {&dim(k), has(k + 1) ? &dim(k + 1) : nullptr}; }

  bool has(int k) const { return k >= 0 && k <= top_; }
  const dimension_data& dim(int k) const { return dims_[static_cast<std::size_t>(k)]; }
  const dimension_data& checked_dim(int k) const {
    if (!has(k)) throw std::invalid_argument("lacuna: the complex has no dimension " + std::to_string(k));
    return dim(k);
  }

  int top_ = -1;
  std::vector<dimension_data> dims_;
};

namespace detail {

struct morse_builder {
  using data = morse_complex::dimension_data;

  template <class V>
  static std::int64_t read_coefficient(const V& v) {
    if constexpr (small_incidence_like<V>) {
      return as_incidence(v).coefficient;
    } else {
      const integer x = coefficient_as_integer(v);
      if (!x.is_small()) throw coefficient_overflow();
      return x.small_value();
    }
  }

  // Copies the boundaries of c: faces checked, equal faces added up (checked), zeros dropped.
  template <cell_complex C>
  static void read(morse_complex& m, const C& c, progress_ticker& tick) {
    const int top = lacuna::top_dimension(c);
    if (top < -1) throw invalid_complex("top dimension " + std::to_string(top) + " is below -1");
    m.top_ = top;
    m.dims_.assign(static_cast<std::size_t>(top + 1), data{});
    std::vector<std::pair<std::uint32_t, std::int64_t>> row;
    for (int k = 0; k <= top; ++k) {
      auto& d = m.dims_[static_cast<std::size_t>(k)];
      const std::size_t n = lacuna::cell_count(c, k);
      const std::size_t nf = k > 0 ? lacuna::cell_count(c, k - 1) : 0;
      if (n > std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: morse_reduce takes at most 2^32 - 1 cells per dimension");
      d.offsets.reserve(n + 1);
      for (std::size_t i = 0; i < n; ++i) {
        tick();
        row.clear();
        for (auto&& term : lacuna::boundary(c, k, i)) {
          const std::int64_t a = read_coefficient(term);
          if (a == 0) continue;
          const std::size_t f = incidence_face(term);
          if (k == 0) throw invalid_complex("0-cell " + std::to_string(i) + " has a non-zero boundary", k, i);
          if (f >= nf)
            throw invalid_complex(std::to_string(k) + "-cell " + std::to_string(i) + " has face " + std::to_string(f) +
                                      ", but there are only " + std::to_string(nf) + " " + std::to_string(k - 1) + "-cells",
                                  k, i);
          row.emplace_back(static_cast<std::uint32_t>(f), a);
        }
        std::sort(row.begin(), row.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
        for (std::size_t s = 0; s < row.size();) {
          std::int64_t sum = 0;
          const std::uint32_t f = row[s].first;
          for (; s < row.size() && row[s].first == f; ++s)
            if (lacuna::checked_add(sum, row[s].second, sum)) throw coefficient_overflow();
          if (sum != 0) d.faces.push_back(f), d.coefficients.push_back(sum);
        }
        d.offsets.push_back(d.faces.size());
      }
      d.kind.assign(n, morse_complex::critical);
      d.mate.assign(n, 0);
      d.order.assign(n, 0);
    }
  }

  // Step 1: the matching by coreductions, with death numbers.
  static void match(morse_complex& m, progress_ticker& tick) {
    const int top = m.top_;
    const auto nd = static_cast<std::size_t>(top + 1);
    auto& dims = m.dims_;
    // Cofaces (CSR), live flags and live-face counts.
    std::vector<std::vector<std::size_t>> cof_off(nd);
    std::vector<std::vector<std::uint32_t>> cof(nd);
    for (int k = 0; k < top; ++k) {
      const auto& up = dims[static_cast<std::size_t>(k + 1)];
      auto& off = cof_off[static_cast<std::size_t>(k)];
      auto& list = cof[static_cast<std::size_t>(k)];
      off.assign(dims[static_cast<std::size_t>(k)].kind.size() + 1, 0);
      for (std::uint32_t f : up.faces) ++off[f + 1];
      for (std::size_t i = 1; i < off.size(); ++i) off[i] += off[i - 1];
      list.resize(up.faces.size());
      std::vector<std::size_t> fill(off.begin(), off.end() - 1);
      for (std::size_t x = 0; x + 1 < up.offsets.size(); ++x)
        for (std::size_t p = up.offsets[x]; p < up.offsets[x + 1]; ++p) list[fill[up.faces[p]]++] = static_cast<std::uint32_t>(x);
    }
    std::vector<std::vector<std::uint8_t>> alive(nd);
    std::vector<std::vector<std::uint32_t>> live_faces(nd);
    std::vector<std::uint32_t> next_order(nd, 0);
    std::vector<std::size_t> scan(nd, 0);
    std::vector<std::uint64_t> queue;  // (k << 32) | i, first in, first out
    std::size_t head = 0;
    for (std::size_t k = 0; k < nd; ++k) {
      const auto& d = dims[k];
      const std::size_t n = d.kind.size();
      alive[k].assign(n, 1);
      live_faces[k].resize(n);
      for (std::size_t i = 0; i < n; ++i) {
        live_faces[k][i] = static_cast<std::uint32_t>(d.offsets[i + 1] - d.offsets[i]);
        if (live_faces[k][i] == 1) queue.push_back((std::uint64_t{k} << 32U) | i);
      }
    }
    const auto kill = [&](std::size_t k, std::uint32_t i) {
      tick();
      alive[k][i] = 0;
      dims[k].order[i] = next_order[k]++;
      if (k + 1 < nd) {
        const auto& off = cof_off[k];
        for (std::size_t p = off[i]; p < off[i + 1]; ++p) {
          const std::uint32_t x = cof[k][p];
          if (--live_faces[k + 1][x] == 1 && alive[k + 1][x]) queue.push_back((std::uint64_t{k + 1} << 32U) | x);
        }
      }
    };
    for (;;) {
      // Breadth first: the gradient paths, hence lifted chains, stay short.
      while (head < queue.size()) {
        const std::uint64_t q = queue[head++];
        const auto k = static_cast<std::size_t>(q >> 32U);
        const auto u = static_cast<std::uint32_t>(q & 0xffffffffU);
        if (!alive[k][u] || live_faces[k][u] != 1) continue;
        auto& d = dims[k];
        std::size_t p = d.offsets[u];
        while (!alive[k - 1][d.faces[p]]) ++p;
        const std::int64_t a = d.coefficients[p];
        if (a != 1 && a != -1) continue;  // not a unit: u waits, and is made critical later
        const std::uint32_t t = d.faces[p];
        auto& lo = dims[k - 1];
        lo.kind[t] = a == 1 ? morse_complex::up_plus : morse_complex::up_minus;
        lo.mate[t] = u;
        d.kind[u] = morse_complex::paired_down;
        d.mate[u] = t;
        kill(k - 1, t);  // the other faces of u are dead: t's number is above theirs
        kill(k, u);
      }
      queue.clear();
      head = 0;
      std::size_t k = 0;
      for (; k < nd; ++k) {
        while (scan[k] < alive[k].size() && !alive[k][scan[k]]) ++scan[k];
        if (scan[k] < alive[k].size()) break;
      }
      if (k == nd) break;
      // The live cell of lowest dimension: its faces are all dead.
      const auto s = static_cast<std::uint32_t>(scan[k]);
      auto& d = dims[k];
      d.kind[s] = morse_complex::critical;
      d.mate[s] = static_cast<std::uint32_t>(d.critical.size());
      d.critical.push_back(s);
      kill(k, s);
    }
  }

  // Step 2: the Morse boundaries, from gradient paths, in checked int64.
  static void boundaries(morse_complex& m, const run_control* control) {
    std::uint64_t total = 0;
    for (int k = 1; k <= m.top_; ++k) total += m.dims_[static_cast<std::size_t>(k)].critical.size();
    progress_ticker tick(control, "Morse boundaries", total);
    std::vector<std::int64_t> acc;
    std::vector<std::uint8_t> pending;
    std::vector<std::uint64_t> heap;
    std::vector<incidence> terms;
    std::uint64_t steps = 0;
    for (int k = 1; k <= m.top_; ++k) {
      auto& d = m.dims_[static_cast<std::size_t>(k)];
      const auto& lo = m.dims_[static_cast<std::size_t>(k - 1)];
      acc.assign(lo.kind.size(), 0);
      pending.assign(lo.kind.size(), 0);
      d.morse_offsets.reserve(d.critical.size() + 1);
      const auto add = [&](std::uint32_t f, std::int64_t v) {
        if (!pending[f]) {
          pending[f] = 1;
          acc[f] = v;
          heap.push_back((std::uint64_t{lo.order[f]} << 32U) | f);
          std::push_heap(heap.begin(), heap.end());
        } else if (lacuna::checked_add(acc[f], v, acc[f])) {
          throw coefficient_overflow();
        }
      };
      for (const std::uint32_t s : d.critical) {
        tick();
        terms.clear();
        for (std::size_t p = d.offsets[s]; p < d.offsets[s + 1]; ++p) add(d.faces[p], d.coefficients[p]);
        while (!heap.empty()) {
          if (control && (++steps & 4095U) == 0) control->check();
          std::pop_heap(heap.begin(), heap.end());
          const auto rho = static_cast<std::uint32_t>(heap.back() & 0xffffffffU);
          heap.pop_back();
          pending[rho] = 0;
          const std::int64_t c = acc[rho];
          if (c == 0) continue;
          const auto kind = lo.kind[rho];
          if (kind == morse_complex::critical) {
            terms.push_back({lo.mate[rho], c});
          } else if (kind != morse_complex::paired_down) {
            const std::uint32_t u = lo.mate[rho];
            std::int64_t w = c;  // -c / [u:rho]
            if (kind == morse_complex::up_plus && lacuna::checked_neg(c, w)) throw coefficient_overflow();
            for (std::size_t p = d.offsets[u]; p < d.offsets[u + 1]; ++p) {
              const std::uint32_t f = d.faces[p];
              if (f == rho) continue;
              if (lo.order[f] >= lo.order[rho]) throw std::logic_error("lacuna: morse_reduce: the matching is not acyclic");
              std::int64_t v;
              if (lacuna::checked_mul(w, d.coefficients[p], v)) throw coefficient_overflow();
              add(f, v);
            }
          }
        }
        std::sort(terms.begin(), terms.end(), [](const incidence& x, const incidence& y) { return x.face < y.face; });
        d.morse_terms.insert(d.morse_terms.end(), terms.begin(), terms.end());
        d.morse_offsets.push_back(d.morse_terms.size());
      }
    }
    if (m.top_ >= 0) m.dims_[0].morse_offsets.assign(m.dims_[0].critical.size() + 1, 0);
    tick.finish();
  }
};

}  // namespace detail

/// The discrete Morse reduction of c (C models lacuna::cell_complex): an acyclic matching
/// by coreductions, the Morse complex of its critical cells, and the chain maps back (see
/// the top of this header). The Morse complex has the homology of c over every ring.
/// Throws lacuna::coefficient_overflow when an incidence number of c or of the Morse
/// boundary does not fit in int64, lacuna::invalid_complex for a face out of range or a
/// 0-cell with a boundary, std::length_error beyond 2^32 - 1 cells in one dimension, and
/// lacuna::computation_stopped on a stop request.
/// Cost: O(N log N) to copy the boundaries (N cells and incidences; rows are sorted), O(N)
/// for the matching, plus, per critical cell, O(m log m) for the m cells its gradient paths
/// meet (at most N each). Memory kept: about 12 bytes per incidence and 17 per cell; the
/// matching needs about 4 more per incidence and 13 per cell while it runs.
template <cell_complex C>
morse_complex morse_reduce(const C& c, const morse_options& options = {}) {
  morse_complex m;
  {
    detail::progress_ticker tick(options.control, "Morse matching", 2 * static_cast<std::uint64_t>(total_cell_count(c)));
    detail::morse_builder::read(m, c, tick);
    detail::morse_builder::match(m, tick);
    tick.finish();
  }
  detail::morse_builder::boundaries(m, options.control);
  return m;
}

}  // namespace lacuna

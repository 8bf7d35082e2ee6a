// lacuna/algorithm/cubical_morse.hpp — the Morse complex of a cubical complex of a binary
// image or volume, from a discrete gradient that is never stored: it is read off the voxels.
//
// Gradient (Forman 1998), built lower star by lower star (Robins, Wood & Sheppard 2011): every
// cell has a highest vertex v (the vertex with the largest coordinates, in the linear order of
// the grid), and the cells whose highest vertex is v — its lower star — are the cubes spanning
// v − e .. v for the axis sets e ⊆ {0..D−1}. Which of them belong to the complex depends only on
// the 2^D voxels around v, so the matching inside a lower star is a table lookup: for each of the
// 2^(2^D) voxel configurations, a table (built once, at first use) pairs the cells of the lower
// star by elementary expansions — a cell with a single unassigned face is paired with it, else
// the lowest cell whose faces are all assigned is critical — and numbers them in the order they
// were assigned. A cell's key is (v, that number). Along a gradient path the key strictly falls
// (a face outside the lower star has a lower v; inside it was assigned earlier), so the matching
// is acyclic and a path can be followed by always taking the largest pending key.
//
// The Morse complex has the critical cells and the boundary of algebraic Morse theory
// (Sköldberg 2006; Jöllenbeck & Welker 2009): the sum over gradient paths from the faces of a
// critical cell to critical cells, each step weighted by −[υ:ρ']/[υ:ρ]. All incidences here are
// ±1, so the weights stay integers; they are summed with overflow checks (coefficient_overflow).
// The chain maps both ways are computed on request from the same gradient:
//   lift    g: Morse → original, g(σ) = σ + the cells of the gradient paths from σ;
//   project f: original → Morse, a chain flowed to the critical cells;
// f∘g = id, and g∘f is chain homotopic to the identity, so a generator of the Morse complex's
// homology lifts to a generator of the original's (tests/cubical/cubical_morse.cpp checks both).
//
// Memory: one byte per vertex (its voxel configuration; the padded voxel bitmap it is read from
// is freed once it is filled), one 32-bit root per vertex while dimension 1 is done (where
// each vertex flows to), and the critical cells with their boundaries — no per-cell objects. Work: one pass over the vertices, then one path search per critical cell of
// dimension >= 2. With threads = 2 both passes split in two halves; the result is identical.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/algorithm/gradient_flow.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/side_by_side.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <array>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <span>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <vector>

namespace lacuna {

namespace detail {

/// The matching inside one lower star, for every voxel configuration (see the file comment).
/// Cell e (bit a set: the cell spans v−1..v along axis a); configuration bit s: the voxel
/// v − s is foreground.
template <std::size_t D>
struct lower_star_table {
  static constexpr unsigned cells = 1u << D;
  enum kind_t : std::uint8_t { absent = 0, critical = 1, with_coface = 2, with_face = 3 };
  struct entry {
    std::array<std::uint8_t, cells> kind{};
    std::array<std::uint8_t, cells> axis{};     // the axis added (with_coface) or removed (with_face)
    std::array<std::uint8_t, cells> rank{};     // the order of assignment
    std::array<std::uint8_t, cells> at_rank{};  // rank -> cell
    std::uint8_t size = 0;  // cells of the lower star present (ranks 0..size-1)
  };
  std::vector<entry> entries;

  lower_star_table() : entries(std::size_t{1} << cells) {
    for (std::size_t config = 0; config < entries.size(); ++config) entries[config] = make(config);
  }

  static const lower_star_table& get() {
    static const lower_star_table table;
    return table;
  }

 private:
  static entry make(std::size_t config) {
    entry t;
    std::uint32_t present = 0;
    for (unsigned e = 0; e < cells; ++e)
      for (unsigned s = 0; s < cells; ++s)
        if ((s & e) == e && ((config >> s) & 1u)) present |= 1u << e;
    // cells in order of dimension, then of their bits
    std::array<std::uint8_t, cells> order{};
    for (unsigned e = 0; e < cells; ++e) order[e] = static_cast<std::uint8_t>(e);
    std::stable_sort(order.begin(), order.end(),
                     [](unsigned x, unsigned y) { return std::popcount(x) < std::popcount(y); });
    std::uint32_t assigned = 0;
    unsigned next_rank = 0;
    auto faces_assigned_except = [&](unsigned e, int skip_axis) {
      for (unsigned a = 0; a < D; ++a)
        if ((e >> a) & 1u) {
          if (static_cast<int>(a) == skip_axis) continue;
          if (!((assigned >> (e & ~(1u << a))) & 1u)) return false;
        }
      return true;
    };
    auto assign = [&](unsigned e, std::uint8_t kind, unsigned axis) {
      t.kind[e] = kind;
      t.axis[e] = static_cast<std::uint8_t>(axis);
      t.rank[e] = static_cast<std::uint8_t>(next_rank);
      t.at_rank[next_rank++] = static_cast<std::uint8_t>(e);
      assigned |= 1u << e;
    };
    const unsigned total = static_cast<unsigned>(std::popcount(present));
    t.size = static_cast<std::uint8_t>(total);
    while (next_rank < total) {
      bool paired = false;
      for (unsigned tau : order) {
        if (!((present >> tau) & 1u) || ((assigned >> tau) & 1u) || !faces_assigned_except(tau, -1)) continue;
        for (unsigned a = 0; a < D && !paired; ++a) {
          if ((tau >> a) & 1u) continue;
          const unsigned up = tau | (1u << a);
          if (!((present >> up) & 1u) || ((assigned >> up) & 1u) || !faces_assigned_except(up, static_cast<int>(a)))
            continue;
          assign(tau, with_coface, a);
          assign(up, with_face, a);
          paired = true;
        }
        if (paired) break;
      }
      if (paired) continue;
      for (unsigned e : order)
        if (((present >> e) & 1u) && !((assigned >> e) & 1u) && faces_assigned_except(e, -1)) {
          assign(e, critical, 0);
          break;
        }
    }
    return t;
  }
};

/// Pending coefficients of one path search: open addressing (linear probing) on 64-bit keys,
/// cleared in time proportional to what was used, so one map serves every search.
template <class V>
class pending_map {
 public:
  pending_map() { rehash(64); }
  /// The value of key k, inserted as V{} when absent; `fresh` tells which.
  V& at(std::uint64_t k, bool& fresh) {
    if (2 * (used_.size() + 1) > slots_.size()) rehash(2 * slots_.size());
    std::size_t i = slot(k);
    fresh = slots_[i].key == empty;
    if (fresh) {
      slots_[i].key = k;
      slots_[i].value = V{};
      used_.push_back(i);
    }
    return slots_[i].value;
  }
  /// Takes key k's value out (k must be present); its slot stays claimed until clear().
  V take(std::uint64_t k) {
    auto& s = slots_[slot(k)];
    V v = s.value;
    s.value = V{};
    return v;
  }
  void clear() {
    for (std::size_t i : used_) slots_[i].key = empty;
    used_.clear();
  }

 private:
  static constexpr std::uint64_t empty = ~std::uint64_t{0};
  struct item {
    std::uint64_t key = empty;
    V value{};
  };
  std::vector<item> slots_;
  std::vector<std::size_t> used_;
  std::size_t slot(std::uint64_t k) const noexcept {
    const std::size_t mask = slots_.size() - 1;
    std::size_t i = static_cast<std::size_t>((k * 0x9E3779B97F4A7C15ull) >> 20) & mask;
    while (slots_[i].key != empty && slots_[i].key != k) i = (i + 1) & mask;
    return i;
  }
  void rehash(std::size_t n) {
    std::vector<item> old = std::move(slots_);
    slots_.assign(n, item{});
    used_.clear();
    for (const auto& x : old)
      if (x.key != empty) {
        const std::size_t i = slot(x.key);
        slots_[i] = x;
        used_.push_back(i);
      }
  }
};

}  // namespace detail

/// Options of cubical_morse_reduce.
struct cubical_morse_options {
  unsigned threads = 1;                  ///< 2: the vertex pass and the path searches in two halves
  const run_control* control = nullptr;  ///< phase "Morse complex of the volume" (units: vertices, then cells)
};

/// The Morse complex of a cubical_complex<D> (1 <= D <= 4) under the lower-star gradient.
/// Models lacuna::cell_complex: cells are the critical cells, in the order of their keys.
template <std::size_t D>
class cubical_morse_complex {
  static_assert(D >= 1 && D <= 4, "cubical_morse_complex: dimensions 1 to 4 (the table has 2^(2^D) entries)");
  using table_t = detail::lower_star_table<D>;
  static constexpr unsigned cells = table_t::cells;

 public:
  /// The position of a cell in the cubical complex (doubled coordinates).
  using position_type = typename cubical_complex<D>::position_type;

  /// The highest dimension of a critical cell.
  int top_dimension() const noexcept { return top_; }
  /// The number of critical k-cells (0 outside 0..top_dimension()).
  std::size_t cell_count(int k) const noexcept {
    return (k < 0 || k > top_) ? 0 : keys_[static_cast<std::size_t>(k)].size();
  }
  /// The Morse boundary of the i-th critical k-cell: critical (k−1)-cells, sorted, no zeros.
  std::span<const incidence> boundary(int k, std::size_t i) const {
    if (k <= 0) return {};
    const auto& s = start_[static_cast<std::size_t>(k)];
    return {entries_[static_cast<std::size_t>(k)].data() + s[i], s[i + 1] - s[i]};
  }
  /// The grid position (as in cubical_complex) of the i-th critical k-cell.
  position_type position(int k, std::size_t i) const { return position_of_key(keys_.at(static_cast<std::size_t>(k)).at(i)); }
  /// The original cell's name.
  std::string cell_name(int k, std::size_t i) const { return cubical_complex<D>::position_name(position(k, i)); }
  /// The number of k-cells of the original complex.
  std::size_t original_count(int k) const noexcept {
    return (k < 0 || k > top_) ? 0 : original_counts_[static_cast<std::size_t>(k)];
  }

  /// g: a chain of the Morse complex -> the chain of the original complex it stands for
  /// (original cell indices). `original` must be the complex this was computed from.
  template <euclidean_domain R>
  chain<R> lift(const cubical_complex<D>& original, const chain<R>& z, const R& ring_one = one<R>()) const {
    const int k = z.dimension;
    chain<R> out{k, {}};
    std::unordered_map<std::uint64_t, R> result;
    flow<R>(
        ring_one,
        [&](auto&& add) {
          for (const auto& t : z.terms) {
            const std::uint64_t key = keys_.at(static_cast<std::size_t>(k)).at(t.cell);
            result[key] += t.coefficient;
            if (k >= 1) for_each_face(key, [&](std::uint64_t f, std::int64_t w) { add(f, from_integer<R>(w) * ring_one * t.coefficient); });
          }
        },
        [](std::uint64_t, const R&) {},  // g(σ) = σ + the cofaces the flow goes through
        [&](std::uint64_t up, const R& cu) { result[up] += cu; });
    for (const auto& [key, c] : result)
      if (!(c == zero<R>())) out.terms.push_back({original.index_of(position_of_key(key)), c});
    out.normalize_terms();
    return out;
  }

  /// f: a chain of the original complex (original cell indices) -> a chain of the Morse complex.
  template <euclidean_domain R>
  chain<R> project(const cubical_complex<D>& original, const chain<R>& x, const R& ring_one = one<R>()) const {
    const int k = x.dimension;
    chain<R> out{k, {}};
    if (k < 0 || k > top_) return out;
    const auto& crit = keys_[static_cast<std::size_t>(k)];
    flow<R>(
        ring_one,
        [&](auto&& add) {
          for (const auto& t : x.terms) add(key_of_position(original.position(k, t.cell)), t.coefficient);
        },
        [&](std::uint64_t cell, const R& c) {
          if (kind_of(cell) != table_t::critical) return;  // paired with a face: 0 in the Morse complex
          const auto at = std::lower_bound(crit.begin(), crit.end(), cell);
          out.terms.push_back({static_cast<std::size_t>(at - crit.begin()), c});
        },
        [](std::uint64_t, const R&) {});
    out.normalize_terms();
    return out;
  }

  /// Builds the Morse complex of c. Throws coefficient_overflow if a Morse incidence passes 64
  /// bits, computation_stopped on a stop request.
  static cubical_morse_complex reduce(const cubical_complex<D>& c, const cubical_morse_options& opt = {}) {
    cubical_morse_complex m;
    m.setup(c);
    m.find_critical(opt);
    m.find_boundaries(opt);
    return m;
  }

 private:
  // ---- the padded voxel grid: vertex v (0 <= v_a <= n_a) has V = sum v_a S_a, S the strides
  // of the (n_a + 2)-extent grid; voxel u sits at padded index sum (u_a + 1) S_a. -------------
  std::array<std::size_t, D> n_{};
  std::array<std::uint64_t, D> S_{};
  std::array<std::uint64_t, cells> voxel_delta_{};  // padded index of voxel v − s is V + delta[s]
  using config_t = std::conditional_t<(D <= 3), std::uint8_t, std::uint16_t>;
  std::vector<std::uint64_t> bits_;    // padded voxels; freed once configs_ is filled
  std::vector<config_t> configs_;      // per vertex V: which of the 2^D voxels around it are foreground
  const table_t* table_ = nullptr;
  int top_ = -1;
  std::array<std::size_t, D + 1> original_counts_{};
  std::vector<std::vector<std::uint64_t>> keys_;      // critical keys per dimension, ascending
  std::vector<std::vector<std::size_t>> start_;       // CSR of the Morse boundary
  std::vector<std::vector<incidence>> entries_;

  bool voxel_bit(std::uint64_t i) const noexcept { return (bits_[i >> 6] >> (i & 63)) & 1u; }
  unsigned voxel_config(std::uint64_t V) const noexcept {
    unsigned c = 0;
    for (unsigned s = 0; s < cells; ++s) c |= static_cast<unsigned>(voxel_bit(V + voxel_delta_[s])) << s;
    return c;
  }
  unsigned config(std::uint64_t V) const noexcept { return configs_[V]; }
  const typename table_t::entry& entry_of(std::uint64_t V) const noexcept { return table_->entries[config(V)]; }
  std::uint64_t key(std::uint64_t V, unsigned e) const noexcept { return (V << D) | entry_of(V).rank[e]; }
  unsigned cell_of(std::uint64_t key) const noexcept { return entry_of(key >> D).at_rank[key & (cells - 1)]; }
  std::uint8_t kind_of(std::uint64_t k) const noexcept {
    const auto& t = entry_of(k >> D);
    return t.kind[t.at_rank[k & (cells - 1)]];
  }
  /// If the cell is paired with a coface, that coface's key.
  bool paired_up(std::uint64_t k, std::uint64_t& up) const noexcept {
    const std::uint64_t V = k >> D;
    const auto& t = entry_of(V);
    const unsigned e = t.at_rank[k & (cells - 1)];
    if (t.kind[e] != table_t::with_coface) return false;
    const unsigned u = e | (1u << t.axis[e]);
    up = (V << D) | t.rank[u];
    return true;
  }
  /// f(face key, incidence) for the faces of a cell, in the cubical orientation of
  /// cubical_complex: per free axis (ascending) the lower face with −sign, the upper with +sign.
  template <class F>
  void for_each_face(std::uint64_t k, F&& f) const {
    const std::uint64_t V = k >> D;
    const unsigned e = cell_of(k);
    std::int64_t sign = 1;
    for (unsigned a = 0; a < D; ++a) {
      if (!((e >> a) & 1u)) continue;
      const unsigned g = e & ~(1u << a);
      f(key(V - S_[a], g), -sign);
      f(key(V, g), sign);
      sign = -sign;
    }
  }
  /// The implicit gradient as algorithm/gradient_flow.hpp follows it: cells are keys, whose
  /// order strictly falls along a gradient path; partners and faces are read off the voxels.
  struct gradient_view {
    using cell_type = std::uint64_t;
    static constexpr bool priority_is_cell = true;
    const cubical_morse_complex* m;
    std::uint64_t priority(cell_type k) const { return k; }
    int paired_up(cell_type k, cell_type& up) const {
      if (!m->paired_up(k, up)) return 0;
      return static_cast<int>(m->incidence_of(up, k));  // ±1
    }
    template <class F>
    void for_each_face(cell_type k, F&& f) const {
      m->for_each_face(k, std::forward<F>(f));
    }
  };
  /// lift and project: the shared gradient flow on this complex's gradient.
  template <class R, class Seed, class Reached, class Through>
  void flow(const R& ring_one, Seed&& seed, Reached&& reached, Through&& through) const {
    gradient_flow<R>(gradient_view{this}, ring_one, std::forward<Seed>(seed), std::forward<Reached>(reached),
                     std::forward<Through>(through));
  }
  std::int64_t incidence_of(std::uint64_t up, std::uint64_t face) const {
    std::int64_t w = 0;
    for_each_face(up, [&](std::uint64_t f, std::int64_t x) {
      if (f == face) w = x;
    });
    return w;
  }
  position_type position_of_key(std::uint64_t k) const {
    std::uint64_t V = k >> D;
    const unsigned e = cell_of(k);
    position_type p{};
    for (std::size_t a = 0; a < D; ++a) {
      const std::uint64_t v = V % (n_[a] + 2);
      V /= (n_[a] + 2);
      p[a] = static_cast<std::size_t>(2 * v - ((e >> a) & 1u));
    }
    return p;
  }
  std::uint64_t key_of_position(const position_type& p) const {
    std::uint64_t V = 0;
    unsigned e = 0;
    for (std::size_t a = 0; a < D; ++a) {
      V += static_cast<std::uint64_t>((p[a] + 1) / 2) * S_[a];
      e |= static_cast<unsigned>(p[a] & 1) << a;
    }
    return key(V, e);
  }

  void setup(const cubical_complex<D>& c) {
    table_ = &table_t::get();
    n_ = c.extents();
    std::uint64_t stride = 1;
    for (std::size_t a = 0; a < D; ++a) {
      S_[a] = stride;
      if (n_[a] + 2 > std::numeric_limits<std::uint64_t>::max() / stride)
        throw std::length_error("cubical_morse_complex: the grid is too large");
      stride *= n_[a] + 2;
    }
    if (stride > (std::numeric_limits<std::uint64_t>::max() >> (D + 1)) || stride > (std::uint64_t{1} << 40))
      throw std::length_error("cubical_morse_complex: the grid is too large for 64-bit keys");
    std::uint64_t off = 0;
    for (std::size_t a = 0; a < D; ++a) off += S_[a];
    for (unsigned s = 0; s < cells; ++s) {
      std::uint64_t d = off;
      for (std::size_t a = 0; a < D; ++a)
        if ((s >> a) & 1u) d -= S_[a];
      voxel_delta_[s] = d;
    }
    bits_.assign((stride + 63) / 64, 0);
    top_ = c.top_dimension();
    for (int k = 0; k <= static_cast<int>(D); ++k) original_counts_[static_cast<std::size_t>(k)] = c.cell_count(k);
    // voxels: the class of cells whose axes are all free is the voxel grid, axis 0 fastest
    const auto& vc = c.class_of_mask(cells - 1);
    const auto words = c.bitmap();
    std::array<std::size_t, D> u{};
    for (std::size_t i = 0; i < vc.size; ++i) {
      const std::size_t b = vc.bit_begin + i;
      if ((words[b >> 6] >> (b & 63)) & 1u) {
        std::uint64_t P = 0;
        for (std::size_t a = 0; a < D; ++a) P += (u[a] + 1) * S_[a];
        bits_[P >> 6] |= std::uint64_t{1} << (P & 63);
      }
      for (std::size_t a = 0; a < D; ++a) {
        if (++u[a] < n_[a]) break;
        u[a] = 0;
      }
    }
  }

  // f(V) for the vertices v with v_{D-1} in [lo, hi) (every other v_a in 0..n_a), in increasing V.
  template <class F>
  void for_each_vertex(std::size_t lo, std::size_t hi, F&& f) const {
    if constexpr (D == 1) {
      for (std::size_t x = lo; x < hi; ++x) f(static_cast<std::uint64_t>(x));
    } else {
      std::array<std::size_t, D> v{};
      for (std::size_t z = lo; z < hi; ++z) {
        v.fill(0);
        v[D - 1] = z;
        for (;;) {
          std::uint64_t V = 0;
          for (std::size_t a = 1; a < D; ++a) V += v[a] * S_[a];
          for (std::size_t x = 0; x <= n_[0]; ++x) f(V + x);  // a row along axis 0
          std::size_t a = 1;
          for (; a + 1 < D; ++a) {
            if (++v[a] <= n_[a]) break;
            v[a] = 0;
          }
          if (a + 1 >= D) break;
        }
      }
    }
  }

  void find_critical(const cubical_morse_options& opt) {
    keys_.assign(D + 1, {});
    if (top_ < 0) {
      keys_.clear();
      start_.clear();
      entries_.clear();
      return;
    }
    configs_.assign(bits_.size() * 64, 0);
    const std::size_t last = n_[D - 1] + 1;  // vertex rows along the last axis
    auto scan = [&](std::size_t lo, std::size_t hi, std::vector<std::vector<std::uint64_t>>& out, bool report) {
      out.assign(D + 1, {});
      std::size_t rows = 0;
      for_each_vertex(lo, hi, [&](std::uint64_t V) {
        const unsigned cf = voxel_config(V);
        configs_[V] = static_cast<config_t>(cf);
        if (cf == 0) return;
        const auto& t = table_->entries[cf];
        for (unsigned r = 0; r < t.size; ++r) {
          const unsigned e = t.at_rank[r];
          if (t.kind[e] == table_t::critical) out[static_cast<std::size_t>(std::popcount(e))].push_back((V << D) | r);
        }
        if (opt.control && (++rows & 0xffff) == 0) {
          if (report)
            opt.control->report("Morse complex of the volume", 0, 1);
          else
            opt.control->check();
        }
      });
    };
    if (opt.threads >= 2 && last >= 2) {
      std::vector<std::vector<std::uint64_t>> upper;
      detail::side_by_side([&] { scan(last / 2, last, upper, false); }, [&] { scan(0, last / 2, keys_, true); });
      for (std::size_t k = 0; k <= D; ++k) keys_[k].insert(keys_[k].end(), upper[k].begin(), upper[k].end());
    } else {
      scan(0, last, keys_, true);
    }
    std::vector<std::uint64_t>().swap(bits_);
  }

  void find_boundaries(const cubical_morse_options& opt) {
    start_.assign(D + 1, {});
    entries_.assign(D + 1, {});
    start_[0].assign(keys_[0].size() + 1, 0);
    if (top_ < 1) {
      for (int k = 1; k <= top_; ++k) start_[static_cast<std::size_t>(k)].assign(keys_[static_cast<std::size_t>(k)].size() + 1, 0);
      return;
    }
    // Where each vertex flows: its critical vertex (vertex-edge paths carry weight +1).
    std::vector<std::uint32_t> root(configs_.size(), std::numeric_limits<std::uint32_t>::max());
    if (keys_[0].size() >= std::numeric_limits<std::uint32_t>::max())
      throw std::length_error("cubical_morse_complex: too many critical vertices");
    {
      std::uint32_t next = 0;
      std::size_t rows = 0;
      for_each_vertex(0, n_[D - 1] + 1, [&](std::uint64_t V) {
        const unsigned cf = config(V);
        if (cf == 0) return;
        const auto& t = table_->entries[cf];
        if (t.kind[0] == table_t::critical)
          root[V] = next++;
        else
          root[V] = root[V - S_[t.axis[0]]];
        if (opt.control && (++rows & 0xfffff) == 0) opt.control->check();
      });
    }
    // dimension 1: the two ends' roots
    {
      auto& s = start_[1];
      auto& en = entries_[1];
      s.assign(keys_[1].size() + 1, 0);
      for (std::size_t i = 0; i < keys_[1].size(); ++i) {
        std::int64_t lo_c = 0, hi_c = 0;
        std::uint32_t lo_r = 0, hi_r = 0;
        int n = 0;
        for_each_face(keys_[1][i], [&](std::uint64_t f, std::int64_t w) {
          const std::uint32_t r = root[f >> D];
          if (n++ == 0) {
            lo_r = r;
            lo_c = w;
          } else {
            hi_r = r;
            hi_c = w;
          }
        });
        if (lo_r != hi_r) {
          if (lo_r > hi_r) {
            std::swap(lo_r, hi_r);
            std::swap(lo_c, hi_c);
          }
          en.push_back({lo_r, lo_c});
          en.push_back({hi_r, hi_c});
        }
        s[i + 1] = en.size();
      }
    }
    std::vector<std::uint32_t>().swap(root);
    // dimensions >= 2: path searches
    for (int k = 2; k <= top_; ++k) {
      const auto& crit = keys_[static_cast<std::size_t>(k)];
      const std::size_t n = crit.size();
      // Cells of higher keys have longer paths (paths run down the keys), so the two halves
      // of the work take every other cell; the results are put back in order.
      auto run = [&](std::size_t first, std::size_t step, std::vector<std::size_t>& s, std::vector<incidence>& en) {
        s.assign(1, 0);
        search_state st;
        for (std::size_t i = first; i < n; i += step) {
          morse_boundary(crit[i], k, st, en);
          s.push_back(en.size());
          if (opt.control && ((i / step) & 1023) == 0) opt.control->check();
        }
      };
      auto& s = start_[static_cast<std::size_t>(k)];
      auto& en = entries_[static_cast<std::size_t>(k)];
      if (opt.threads >= 2 && n >= 64) {
        std::vector<std::size_t> s0, s1;
        std::vector<incidence> e0, e1;
        detail::side_by_side([&] { run(1, 2, s1, e1); }, [&] { run(0, 2, s0, e0); });
        s.assign(1, 0);
        en.reserve(e0.size() + e1.size());
        for (std::size_t i = 0; i < n; ++i) {
          const auto& ss = (i % 2 == 0) ? s0 : s1;
          const auto& ee = (i % 2 == 0) ? e0 : e1;
          const std::size_t j = i / 2;
          en.insert(en.end(), ee.begin() + static_cast<std::ptrdiff_t>(ss[j]), ee.begin() + static_cast<std::ptrdiff_t>(ss[j + 1]));
          s.push_back(en.size());
        }
      } else {
        run(0, 1, s, en);
      }
    }
  }

  struct search_state {
    std::vector<std::uint64_t> heap;
    detail::pending_map<std::int64_t> pending;
    std::vector<incidence> found;
  };

  static std::int64_t add_checked(std::int64_t a, std::int64_t b) {
    std::int64_t r;
    if (checked_add(a, b, r)) throw coefficient_overflow();
    return r;
  }

  // The Morse boundary of the critical k-cell `sigma`, appended to en (sorted by face).
  void morse_boundary(std::uint64_t sigma, int k, search_state& st, std::vector<incidence>& en) const {
    auto& heap = st.heap;
    auto& pending = st.pending;
    heap.clear();
    pending.clear();
    st.found.clear();
    auto add = [&](std::uint64_t f, std::int64_t w) {
      bool fresh;
      std::int64_t& p = pending.at(f, fresh);
      p = add_checked(p, w);
      if (fresh) {
        heap.push_back(f);
        std::push_heap(heap.begin(), heap.end());
      }
    };
    for_each_face(sigma, add);
    const auto& lower = keys_[static_cast<std::size_t>(k - 1)];
    while (!heap.empty()) {
      std::pop_heap(heap.begin(), heap.end());
      const std::uint64_t rho = heap.back();
      heap.pop_back();
      const std::int64_t c = pending.take(rho);
      if (c == 0) continue;
      const std::uint64_t V = rho >> D;
      const auto& t = entry_of(V);
      const unsigned e = t.at_rank[rho & (cells - 1)];
      if (t.kind[e] == table_t::critical) {
        const auto at = std::lower_bound(lower.begin(), lower.end(), rho);
        st.found.push_back({static_cast<std::size_t>(at - lower.begin()), c});
        continue;
      }
      if (t.kind[e] != table_t::with_coface) continue;
      const std::uint64_t up = (V << D) | t.rank[e | (1u << t.axis[e])];
      const std::int64_t w_rho = incidence_of(up, rho);
      for_each_face(up, [&](std::uint64_t f, std::int64_t w) {
        if (f == rho) return;
        std::int64_t x;
        if (checked_mul(c, w * w_rho, x) || x == std::numeric_limits<std::int64_t>::min())
          throw coefficient_overflow();
        add(f, -x);
      });
    }
    std::sort(st.found.begin(), st.found.end(), [](const incidence& a, const incidence& b) { return a.face < b.face; });
    for (std::size_t i = 0; i < st.found.size();) {
      std::int64_t sum = 0;
      std::size_t j = i;
      for (; j < st.found.size() && st.found[j].face == st.found[i].face; ++j) sum = add_checked(sum, st.found[j].coefficient);
      if (sum != 0) en.push_back({st.found[i].face, sum});
      i = j;
    }
  }
};

/// True for the complexes cubical_morse_reduce serves: cubical_complex<D>, 1 <= D <= 4.
template <class C>
inline constexpr bool has_implicit_morse_complex = false;
/// True for cubical_complex<D> with D <= 4.
template <std::size_t D>
inline constexpr bool has_implicit_morse_complex<cubical_complex<D>> = (D <= 4);

/// The Morse complex of the cubical complex of a binary image or volume (see the file comment).
template <std::size_t D>
cubical_morse_complex<D> cubical_morse_reduce(const cubical_complex<D>& c, const cubical_morse_options& opt = {}) {
  return cubical_morse_complex<D>::reduce(c, opt);
}

}  // namespace lacuna

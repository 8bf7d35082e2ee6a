// lacuna/persistence/cubical_reduction.hpp — persistence of cubical filtrations with the cells
// paired before the algebra: apparent pairs, the Morse complex they leave, then twist.
//
// 1. Apparent pairs (the name from Bauer's Ripser, 2021; the idea of pairing along the
//    filtration before the algebra from Robins, Wood & Sheppard 2011). In the total order of
//    the filtration — (value, dimension, index) — a face f and a cell c form an apparent pair
//    when f is the youngest (last to enter) face of c and c the oldest coface of f. Such pairs
//    are persistence pairs that any reduction finds, and together they form an acyclic
//    matching (a discrete gradient, Forman 1998) along which every path runs down the order.
//    On a cubical filtration each pair has persistence zero: the oldest coface of f lies in
//    the voxel f takes its value from, so it has f's value. Finding them is local: one pass
//    over the grid, reading the values of five consecutive hyperplanes of the doubled grid
//    (computed from the samples by separable minima); one bit per cell marks the paired ones.
// 2. The Morse complex (algebraic Morse theory: Sköldberg 2006; Jöllenbeck & Welker 2009) has
//    the unpaired (critical) cells, in the order they had, and the boundary summed over the
//    gradient paths — found by a search from the faces of a critical cell, taking pending
//    cells latest first (the order falls along a path), with coefficients in the field. Its
//    filtration by value has the persistence of the original one (Mischaikow & Nanda 2013:
//    the gradient pairs cells of equal value), and its persistence pairs are read in the
//    original cells.
// 3. The Morse complex is reduced with clearing (Chen & Kerber 2011), top dimension first,
//    and a column whose cell the dimension above has paired is never built: its Morse
//    boundary is not searched for.
// Representatives are found on the Morse complex and lifted along the gradient
// (g(sigma) = sigma + the cells the paths from its faces run through), a chain map that keeps
// the filtration, so a lifted cycle is born and dies where its Morse cycle does.
//
// What it omits: the apparent pairs themselves, all of persistence zero. The other pairs,
// their values and their cells, are those of the matrix reductions; compare diagrams of
// different variants after without_zero_persistence.
// Memory: the samples, one bit per cell of the doubled grid, five hyperplanes of values per
// thread, and the critical cells with their Morse boundaries.
#pragma once

#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/side_by_side.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/filtration.hpp>
#include <lacuna/persistence/reduction.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <array>
#include <atomic>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <optional>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// True for lacuna::cubical_filtration<D, T>.
template <class F>
inline constexpr bool is_cubical_filtration = false;
template <std::size_t D, class T>
inline constexpr bool is_cubical_filtration<cubical_filtration<D, T>> = true;

namespace detail::cubical_pers {

/// The doubled grid of a cubical filtration: positions, linear numbers (axis 0 fastest),
/// the filtration order of cells of one dimension, and the apparent pairs computed on the fly.
template <std::size_t D, class T>
class grid {
 public:
  using filtration_type = cubical_filtration<D, T>;
  using position = std::array<std::size_t, D>;

  explicit grid(const filtration_type& f) : f_(f), order_(f.value_order()) {
    std::uint64_t s = 1;
    for (std::size_t a = 0; a < D; ++a) {
      ext_[a] = 2 * f.extents()[a] + 1;
      stride_[a] = s;
      s *= ext_[a];
    }
    total_ = f.top_dimension() < 0 ? 0 : s;
  }

  const filtration_type& filtration() const noexcept { return f_; }
  const sample_order<T>& order() const noexcept { return order_; }
  std::uint64_t total() const noexcept { return total_; }
  const std::array<std::uint64_t, D>& extents() const noexcept { return ext_; }
  const std::array<std::uint64_t, D>& strides() const noexcept { return stride_; }

  std::uint64_t linear(const position& p) const noexcept {
    std::uint64_t l = 0;
    for (std::size_t a = 0; a < D; ++a) l += p[a] * stride_[a];
    return l;
  }
  position at(std::uint64_t l) const noexcept {
    position p;
    for (std::size_t a = 0; a < D; ++a) {
      p[a] = static_cast<std::size_t>(l % ext_[a]);
      l /= ext_[a];
    }
    return p;
  }
  static int dimension_of(const position& p) noexcept { return filtration_type::dimension_of(p); }

  /// a enters before b: cells of one dimension with values va, vb.
  bool before(const T& va, const position& a, const T& vb, const position& b) const {
    if (order_(va, vb)) return true;
    if (order_(vb, va)) return false;
    return f_.index_of(a) < f_.index_of(b);
  }

  /// f(face position, incidence) for the faces of p (cubical orientation: per free axis,
  /// ascending, the lower face with -sign and the upper with +sign, sign alternating).
  template <class Fn>
  static void for_each_face(const position& p, Fn&& fn) {
    int sign = 1;
    for (std::size_t a = 0; a < D; ++a) {
      if ((p[a] & 1) == 0) continue;
      position q = p;
      q[a] = p[a] - 1;
      fn(q, -sign);
      q[a] = p[a] + 1;
      fn(q, sign);
      sign = -sign;
    }
  }
  /// fn(coface position) for the cofaces of p inside the grid.
  template <class Fn>
  void for_each_coface(const position& p, Fn&& fn) const {
    for (std::size_t a = 0; a < D; ++a) {
      if (p[a] & 1) continue;
      position q = p;
      if (p[a] > 0) {
        q[a] = p[a] - 1;
        fn(q);
      }
      if (p[a] + 1 < ext_[a]) {
        q[a] = p[a] + 1;
        fn(q);
      }
    }
  }
  /// The youngest face of p (dimension >= 1), with values read by value(q).
  template <class Value>
  position youngest_face(const position& p, Value&& value) const {
    position best{};
    T best_v{};
    bool have = false;
    for_each_face(p, [&](const position& q, int) {
      const T v = value(q);
      if (!have || before(best_v, best, v, q)) {
        best = q;
        best_v = v;
        have = true;
      }
    });
    return best;
  }
  /// The oldest coface of p (dimension < D); p itself if it has none.
  template <class Value>
  position oldest_coface(const position& p, Value&& value) const {
    position best = p;
    T best_v{};
    bool have = false;
    for_each_coface(p, [&](const position& q) {
      const T v = value(q);
      if (!have || before(v, q, best_v, best)) {
        best = q;
        best_v = v;
        have = true;
      }
    });
    return best;
  }
  /// If p is paired up (p is the youngest face of its oldest coface), that coface.
  std::optional<position> paired_up(const position& p) const {
    auto value = [&](const position& q) { return f_.value_at(q); };
    if (dimension_of(p) >= static_cast<int>(D)) return std::nullopt;
    const position g = oldest_coface(p, value);
    if (g == p) return std::nullopt;
    if (youngest_face(g, value) == p) return g;
    return std::nullopt;
  }

 private:
  const filtration_type& f_;
  sample_order<T> order_;
  std::array<std::uint64_t, D> ext_{};
  std::array<std::uint64_t, D> stride_{};
  std::uint64_t total_ = 0;
};

/// The values of the cells of a few consecutive hyperplanes of the doubled grid (the last
/// coordinate fixed), computed from the samples by separable minima (maxima for superlevel).
template <std::size_t D, class T>
class value_window {
 public:
  static constexpr std::size_t slots = 5;
  using position = std::array<std::size_t, D>;

  explicit value_window(const grid<D, T>& g) : g_(g) {
    std::size_t s = 1;
    for (std::size_t a = 0; a + 1 < D; ++a) {
      hstride_[a] = s;
      s *= static_cast<std::size_t>(g.extents()[a]);
    }
    hsize_ = s;
    for (auto& p : planes_) p.assign(hsize_, T{});
    held_.fill(-1);
  }

  /// The value of the cell at p; its hyperplane must be within two of the last one asked for
  /// by prepare().
  const T& value(const position& p) const noexcept {
    std::size_t o = 0;
    for (std::size_t a = 0; a + 1 < D; ++a) o += p[a] * hstride_[a];
    return planes_[p[D - 1] % slots][o];
  }
  /// Makes the doubled hyperplanes z - 2 .. z + 2 (those in the grid) available.
  void prepare(std::size_t z) {
    const std::size_t last = static_cast<std::size_t>(g_.extents()[D - 1]) - 1;
    for (std::size_t w = z >= 2 ? z - 2 : 0; w <= std::min(z + 2, last); ++w) {
      auto& slot = planes_[w % slots];
      if (held_[w % slots] == static_cast<std::int64_t>(w)) continue;
      if (w & 1) {
        slot = voxel_plane((w - 1) / 2);
      } else {
        const std::size_t x = w / 2, n = g_.filtration().extents()[D - 1];
        if (x == 0) {
          slot = voxel_plane(0);
        } else if (x == n) {
          slot = voxel_plane(n - 1);
        } else {
          const auto& lo = voxel_plane(x - 1);
          const auto& hi = voxel_plane(x);
          const auto& ord = g_.order();
          for (std::size_t i = 0; i < hsize_; ++i) slot[i] = ord(hi[i], lo[i]) ? hi[i] : lo[i];
        }
      }
      held_[w % slots] = static_cast<std::int64_t>(w);
    }
  }
  std::size_t hyperplane_size() const noexcept { return hsize_; }

 private:
  /// The doubled values of voxel hyperplane z (cached: the last three asked for).
  const std::vector<T>& voxel_plane(std::size_t z) {
    for (std::size_t c = 0; c < 3; ++c)
      if (cache_z_[c] == static_cast<std::int64_t>(z)) return cache_[c];
    const std::size_t c = next_++ % 3;
    cache_z_[c] = static_cast<std::int64_t>(z);
    auto& out = cache_[c];
    const auto& f = g_.filtration();
    const auto& n = f.extents();
    const auto& ord = g_.order();
    // the voxels of hyperplane z, then doubled along axes 0..D-2 one after the other
    std::size_t count = 1;
    for (std::size_t a = 0; a + 1 < D; ++a) count *= n[a];
    const std::size_t base = z * f.voxel_strides()[D - 1];
    cur_.assign(f.samples().begin() + static_cast<std::ptrdiff_t>(base),
                f.samples().begin() + static_cast<std::ptrdiff_t>(base + count));
    std::size_t inner = 1;  // product of the doubled extents of the axes done
    for (std::size_t a = 0; a + 1 < D; ++a) {
      const std::size_t na = n[a], ea = 2 * na + 1;
      const std::size_t outer = count / (inner * na);
      nxt_.resize(outer * ea * inner);
      for (std::size_t o = 0; o < outer; ++o)
        for (std::size_t x = 0; x < ea; ++x) {
          T* dst = &nxt_[(o * ea + x) * inner];
          if (x & 1) {
            const T* src = &cur_[(o * na + (x - 1) / 2) * inner];
            std::copy(src, src + inner, dst);
          } else if (x == 0) {
            const T* src = &cur_[(o * na) * inner];
            std::copy(src, src + inner, dst);
          } else if (x == ea - 1) {
            const T* src = &cur_[(o * na + na - 1) * inner];
            std::copy(src, src + inner, dst);
          } else {
            const T* lo = &cur_[(o * na + x / 2 - 1) * inner];
            const T* hi = &cur_[(o * na + x / 2) * inner];
            for (std::size_t i = 0; i < inner; ++i) dst[i] = ord(hi[i], lo[i]) ? hi[i] : lo[i];
          }
        }
      count = outer * ea * inner;
      inner *= ea;
      std::swap(cur_, nxt_);
    }
    out = cur_;
    return out;
  }

  const grid<D, T>& g_;
  std::array<std::size_t, D> hstride_{};
  std::size_t hsize_ = 1;
  std::array<std::vector<T>, slots> planes_;
  std::array<std::int64_t, slots> held_{};
  std::array<std::vector<T>, 3> cache_;
  std::array<std::int64_t, 3> cache_z_{{-1, -1, -1}};
  std::size_t next_ = 0;
  std::vector<T> cur_, nxt_;
};

/// One bit per cell of the doubled grid: set for the cells in an apparent pair. Words that
/// two threads may both write are written atomically.
class pair_bits {
 public:
  explicit pair_bits(std::uint64_t cells) : words_((cells + 63) / 64 + 1, 0) {}
  void set_shared_words(std::uint64_t first, std::uint64_t last) {
    shared_first_ = first;
    shared_last_ = last;
  }
  void set(std::uint64_t bit) {
    const std::uint64_t w = bit >> 6, m = std::uint64_t{1} << (bit & 63);
    if (w >= shared_first_ && w <= shared_last_)
      std::atomic_ref<std::uint64_t>(words_[w]).fetch_or(m, std::memory_order_relaxed);
    else
      words_[w] |= m;
  }
  bool test(std::uint64_t bit) const noexcept { return (words_[bit >> 6] >> (bit & 63)) & 1; }
  const std::vector<std::uint64_t>& words() const noexcept { return words_; }

 private:
  std::vector<std::uint64_t> words_;
  std::uint64_t shared_first_ = 1, shared_last_ = 0;
};

/// Marks the apparent pairs (f, c) with c in doubled hyperplanes [z0, z1) and dimension at
/// most `top`.
template <std::size_t D, class T>
void mark_apparent_pairs(const grid<D, T>& g, pair_bits& bits, std::size_t z0, std::size_t z1, int top,
                         const run_control* control, bool report) {
  using position = std::array<std::size_t, D>;
  value_window<D, T> window(g);
  auto value = [&](const position& q) -> const T& { return window.value(q); };
  const std::size_t hsize = window.hyperplane_size();
  const auto& ext = g.extents();
  for (std::size_t z = z0; z < z1; ++z) {
    window.prepare(z);
    position p{};
    p[D - 1] = z;
    for (std::size_t h = 0; h < hsize; ++h) {
      if (h != 0) {  // odometer over axes 0..D-2
        for (std::size_t a = 0; a + 1 < D; ++a) {
          if (++p[a] < ext[a]) break;
          p[a] = 0;
        }
      }
      const int k = grid<D, T>::dimension_of(p);
      if (k == 0 || k > top) continue;
      const position f = g.youngest_face(p, value);
      if (g.oldest_coface(f, value) == p) {
        bits.set(g.linear(p));
        bits.set(g.linear(f));
      }
    }
    if (control && (z & 7) == 0) {
      if (report)
        control->report("pairing cubical cells", z - z0, z1 - z0);
      else
        control->check();
    }
  }
}

/// The Morse complex and its reduction over the field R.
template <std::size_t D, class T, class R>
class morse_persistence {
 public:
  using position = std::array<std::size_t, D>;
  using result_type = persistence_result<T, R, sample_order<T>>;

  morse_persistence(const cubical_filtration<D, T>& f, const persistence_options& o, const R& unit)
      : g_(f), o_(o), unit_(unit), bits_(g_.total()) {}

  result_type run() {
    const auto range = persistence_range_of(g_.filtration().top_dimension(), o_.max_dimension);
    result_type out;
    out.order = g_.order();
    if (range.diagram_top < 0) return out;
    top_ = range.cell_top;
    find_critical();
    reduce(range.diagram_top, out);
    return out;
  }

 private:
  struct heap_item {
    T value;
    std::size_t index;
    std::uint64_t cell;
  };

  grid<D, T> g_;
  const persistence_options& o_;
  R unit_;
  pair_bits bits_;
  int top_ = -1;
  std::vector<std::vector<std::uint64_t>> by_cell_;      // critical cells per dimension, by linear number
  std::vector<std::vector<std::uint32_t>> rank_of_;      // their places in the order, parallel to by_cell_
  std::vector<std::vector<std::uint64_t>> in_order_;     // critical cells per dimension in filtration order

  void find_critical() {
    const std::size_t Z = static_cast<std::size_t>(g_.extents()[D - 1]);
    const run_control* control = &o_.control;
    if (o_.threads >= 2 && Z >= 8) {
      const std::size_t s = Z / 2;
      const std::uint64_t plane = g_.strides()[D - 1];
      bits_.set_shared_words(((s - 1) * plane) / 64, ((s + 1) * plane - 1) / 64);
      side_by_side([&] { mark_apparent_pairs(g_, bits_, s, Z, top_ + 1, control, false); },
                   [&] { mark_apparent_pairs(g_, bits_, 0, s, top_ + 1, control, true); });
    } else {
      mark_apparent_pairs(g_, bits_, 0, Z, top_ + 1, control, true);
    }
    // the unpaired cells of dimension <= top_
    by_cell_.assign(static_cast<std::size_t>(top_ + 1), {});
    const auto& words = bits_.words();
    const std::uint64_t total = g_.total();
    for (std::size_t w = 0; w * 64 < total; ++w) {
      std::uint64_t free = ~words[w];
      if ((w + 1) * 64 > total) free &= (std::uint64_t{1} << (total - w * 64)) - 1;
      while (free != 0) {
        const std::uint64_t l = w * 64 + static_cast<std::uint64_t>(std::countr_zero(free));
        free &= free - 1;
        const int k = grid<D, T>::dimension_of(g_.at(l));
        if (k <= top_) by_cell_[static_cast<std::size_t>(k)].push_back(l);
      }
    }
    const auto& f = g_.filtration();
    in_order_.assign(by_cell_.size(), {});
    rank_of_.assign(by_cell_.size(), {});
    for (std::size_t k = 0; k < by_cell_.size(); ++k) {
      const auto& cells = by_cell_[k];
      if (cells.size() >= std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: more than 2^32 - 1 critical cells of dimension " + std::to_string(k));
      std::vector<std::pair<T, std::size_t>> keys;  // (value, index) per critical cell
      keys.reserve(cells.size());
      for (auto l : cells) {
        const position p = g_.at(l);
        keys.emplace_back(f.value_at(p), f.index_of(p));
      }
      std::vector<std::uint32_t> perm(cells.size());
      for (std::uint32_t j = 0; j < perm.size(); ++j) perm[j] = j;
      const auto& ord = g_.order();
      std::sort(perm.begin(), perm.end(), [&](std::uint32_t a, std::uint32_t b) {
        if (ord(keys[a].first, keys[b].first)) return true;
        if (ord(keys[b].first, keys[a].first)) return false;
        return keys[a].second < keys[b].second;
      });
      auto& ordered = in_order_[k];
      auto& rank = rank_of_[k];
      ordered.resize(cells.size());
      rank.resize(cells.size());
      for (std::uint32_t r = 0; r < perm.size(); ++r) {
        ordered[r] = cells[perm[r]];
        rank[perm[r]] = r;
      }
    }
  }

  bool is_critical(std::uint64_t l) const noexcept { return !bits_.test(l); }

  /// The place in the filtration order of the critical k-cell with linear number l.
  std::uint32_t morse_index(int k, std::uint64_t l) const {
    const auto& cells = by_cell_[static_cast<std::size_t>(k)];
    const auto it = std::lower_bound(cells.begin(), cells.end(), l);
    return rank_of_[static_cast<std::size_t>(k)][static_cast<std::size_t>(it - cells.begin())];
  }

  struct search_state {
    std::vector<heap_item> heap;
    pending_map<R> pending;
    std::vector<sparse_entry<R>> found;
  };

  bool later(const heap_item& a, const heap_item& b) const {
    // heap order: the top is the latest cell
    const auto& ord = g_.order();
    if (ord(a.value, b.value)) return true;
    if (ord(b.value, a.value)) return false;
    return a.index < b.index;
  }

  /// The gradient flow from a chain of (k-1)-cells seeded by seed(add): every pending cell,
  /// latest first; a critical cell with coefficient c goes to reached(cell, c); a cell paired
  /// with a coface tau passes -c/[tau:cell] to through(tau, ...) and on to tau's other faces.
  template <class Seed, class Reached, class Through>
  void flow(search_state& st, Seed&& seed, Reached&& reached, Through&& through) const {
    const auto& f = g_.filtration();
    auto& heap = st.heap;
    auto& pending = st.pending;
    heap.clear();
    pending.clear();
    auto cmp = [this](const heap_item& a, const heap_item& b) { return later(a, b); };
    auto add = [&](const position& q, const R& c) {
      const std::uint64_t l = g_.linear(q);
      bool fresh = false;
      R& slot = pending.at(l, fresh);
      slot += c;
      if (fresh) {
        heap.push_back({f.value_at(q), f.index_of(q), l});
        std::push_heap(heap.begin(), heap.end(), cmp);
      }
    };
    seed(add);
    while (!heap.empty()) {
      std::pop_heap(heap.begin(), heap.end(), cmp);
      const std::uint64_t l = heap.back().cell;
      heap.pop_back();
      const R c = pending.take(l);
      if (c == zero<R>()) continue;
      if (is_critical(l)) {
        reached(l, c);
        continue;
      }
      const position rho = g_.at(l);
      const auto up = g_.paired_up(rho);
      if (!up) continue;  // paired with a face: the path ends
      int w = 0;
      grid<D, T>::for_each_face(*up, [&](const position& q, int s) {
        if (q == rho) w = s;
      });
      const R cu = -(c * (from_integer<R>(w) * unit_));  // w = +-1 is its own inverse
      through(*up, cu);
      grid<D, T>::for_each_face(*up, [&](const position& q, int s) {
        if (q != rho) add(q, cu * (from_integer<R>(s) * unit_));
      });
    }
  }

  /// The Morse boundary of the critical k-cell at linear number l, as a sorted column.
  std::vector<sparse_entry<R>> morse_boundary(int k, std::uint64_t l, search_state& st) const {
    st.found.clear();
    flow(
        st,
        [&](auto&& add) {
          grid<D, T>::for_each_face(g_.at(l), [&](const position& q, int s) { add(q, from_integer<R>(s) * unit_); });
        },
        [&](std::uint64_t cell, const R& c) { st.found.push_back({morse_index(k - 1, cell), c}); },
        [](const position&, const R&) {});
    auto& col = st.found;
    std::sort(col.begin(), col.end(), [](const auto& a, const auto& b) { return a.index < b.index; });
    std::vector<sparse_entry<R>> out;
    for (std::size_t i = 0; i < col.size();) {
      R sum = col[i].value;
      std::size_t j = i + 1;
      for (; j < col.size() && col[j].index == col[i].index; ++j) sum += col[j].value;
      if (!(sum == zero<R>())) out.push_back({col[i].index, sum});
      i = j;
    }
    return out;
  }

  /// g(z): a chain of critical k-cells (Morse places) -> the chain of the original cells it
  /// stands for (original indices).
  chain<R> lift(int k, const sparse_vector<R>& z, search_state& st) const {
    const auto& f = g_.filtration();
    std::unordered_map<std::uint64_t, R> result;
    flow(
        st,
        [&](auto&& add) {
          for (const auto& t : z) {
            const std::uint64_t l = in_order_[static_cast<std::size_t>(k)][t.index];
            result[l] += t.value;
            if (k >= 1)
              grid<D, T>::for_each_face(g_.at(l), [&](const position& q, int s) { add(q, t.value * (from_integer<R>(s) * unit_)); });
          }
        },
        [](std::uint64_t, const R&) {}, [&](const position& up, const R& cu) { result[g_.linear(up)] += cu; });
    chain<R> out{k, {}};
    for (const auto& [l, c] : result)
      if (!(c == zero<R>())) out.terms.push_back({f.index_of(g_.at(l)), c});
    out.normalize_terms();
    return out;
  }

  void reduce(int diagram_top, result_type& out) {
    const int T_ = top_;
    const bool reps = o_.representatives;
    std::vector<field_reduction_result<R>> red(static_cast<std::size_t>(T_ + 1));
    field_reduction_options ro{.kernel = reps, .image = reps, .control = &o_.control,
                               .phase = "reducing the boundary matrices"};
    search_state st;
    std::uint64_t columns = 0;
    for (int k = 1; k <= T_; ++k) columns += in_order_[static_cast<std::size_t>(k)].size();
    progress_ticker tick(&o_.control, "Morse boundaries", columns);
    for (int k = T_; k >= 1; --k) {
      const auto uk = static_cast<std::size_t>(k);
      const auto& cells = in_order_[uk];
      sparse_matrix<R> A(in_order_[uk - 1].size(), cells.size());
      std::vector<char> cleared(cells.size(), 0);
      if (k < T_)
        for (const auto& pv : red[uk + 1].pivots) cleared[pv.row] = 1;
      for (std::size_t j = 0; j < cells.size(); ++j) {
        tick();
        if (!cleared[j]) A.columns[j] = morse_boundary(k, cells[j], st);
      }
      red[uk] = k == T_ ? reduce_columns(A, ro) : reduce_columns_after(A, red[uk + 1], ro);
    }
    tick.finish();
    // the pairs, in the original cells
    const auto& f = g_.filtration();
    out.diagrams.resize(static_cast<std::size_t>(diagram_top + 1));
    if (reps) out.representatives.resize(out.diagrams.size());
    auto cell_of = [&](int k, std::uint32_t r) { return g_.at(in_order_[static_cast<std::size_t>(k)][r]); };
    for (int k = 0; k <= diagram_top; ++k) {
      const auto uk = static_cast<std::size_t>(k);
      auto& d = out.diagrams[uk];
      d.dimension = k;
      d.order = g_.order();
      const std::size_t n = in_order_[uk].size();
      std::vector<char> paired(n, 0), kills(n, 0);
      if (k + 1 <= T_) {
        const auto& r = red[uk + 1];
        for (std::size_t t = 0; t < r.pivots.size(); ++t) {
          const auto [row, col] = r.pivots[t];
          paired[row] = 1;
          const position b = cell_of(k, row), e = cell_of(k + 1, col);
          d.pairs.push_back({f.value_at(b), f.value_at(e), f.index_of(b), f.index_of(e)});
          if (reps) out.representatives[uk].push_back(lift(k, r.image.at(t), st));
        }
      }
      if (k >= 1)
        for (const auto& pv : red[uk].pivots) kills[pv.column] = 1;
      std::size_t kernel_index = 0;
      for (std::uint32_t p = 0; p < n; ++p) {
        if (kills[p]) continue;
        const std::size_t this_kernel = kernel_index++;
        if (paired[p]) continue;
        const position b = cell_of(k, p);
        d.pairs.push_back({f.value_at(b), std::nullopt, f.index_of(b), no_cell});
        if (reps) {
          if (k == 0)
            out.representatives[uk].push_back(chain<R>{0, {{f.index_of(b), unit_}}});
          else
            out.representatives[uk].push_back(lift(k, red[uk].kernel.at(this_kernel), st));
        }
      }
    }
    sort_pairs(out);
  }
};

}  // namespace detail::cubical_pers

/// The variant for cubical filtrations: apparent pairs, then the Morse complex they leave,
/// reduced with clearing (see the file comment). Pairs of persistence zero taken as
/// apparent pairs are not reported.
struct cubical_morse_persistence {
  template <filtration F, field R>
    requires is_cubical_filtration<F>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& unit) const {
    detail::check_unit(unit);
    return detail::cubical_pers::morse_persistence<F::dimension, typename F::value_type, R>(f, o, unit).run();
  }
};

}  // namespace lacuna

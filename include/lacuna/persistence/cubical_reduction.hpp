// lacuna/persistence/cubical_reduction.hpp — persistence of cubical filtrations with the cells
// paired before the algebra: a discrete gradient of lower stars, the Morse complex it leaves,
// then twist.
//
// 1. The gradient (Forman 1998), built lower star by lower star (Robins, Wood & Sheppard 2011),
//    here with the voxels as the top cells: voxels come in the order of their samples, ties by
//    their number, and a cell belongs to the first voxel containing it — so every cell of a
//    voxel's lower star has that voxel's value, the value of the filtration. Inside the star
//    the cells are paired by elementary expansions (star_matcher): a cell whose faces are all
//    in is paired with a coface of the star whose other faces are all in; a cell that cannot
//    be is critical. Which cells of a voxel's cube are in its star depends only on which of
//    the 3^D - 1 voxels around it precede it; the matchings are cached by that (a full table
//    up to dimension 2). Each cell gets a code of 4 bits (8 above dimension 3): critical, or
//    the direction of its partner. The pass over the voxels reads the samples only.
// 2. The Morse complex (algebraic Morse theory: Sköldberg 2006; Jöllenbeck & Welker 2009) has
//    the critical cells, ordered as the filtration orders cells — (value, dimension, index) —
//    and the boundary summed over the gradient paths, with coefficients in the field: in the
//    top dimension the paths from a cell form a tree (a face has two cofaces), in dimension 1
//    a path is a walk from vertex to vertex, elsewhere the paths form an acyclic graph walked
//    in a topological order (Kahn 1962). The gradient pairs cells of equal value, so the Morse
//    complex filtered by value has the persistence of the original one (Mischaikow & Nanda,
//    "Morse theory for filtrations", 2013).
// 3. The Morse complex is reduced with clearing (Chen & Kerber 2011), top dimension first; a
//    column whose cell the dimension above has already paired is never built (its Morse
//    boundary is not searched for).
// Representatives are found on the Morse complex and lifted along the gradient
// (g(sigma) = sigma + the cells the paths from its faces run through), a chain map that keeps
// the filtration by value: a lifted cycle has no cell entering after its birth value, is not
// a boundary of the cells entering before its death value, and is one at it.
//
// What it reports: the pairs of positive persistence (and the essential classes), with the
// values the matrix variants give (the tests compare them). Pairs of persistence zero are not
// reported, and the cells named are cells of the right values — critical cells of the
// gradient, which may differ from those of the total order when values tie.
// Memory: the samples, half a byte per cell of the doubled grid (a byte above dimension 3),
// a cache of matchings (2 MB per thread in dimension 3), and the critical cells with their
// Morse boundaries. Work: one pass over the voxels, then one search per Morse column; with
// threads = 2 both split in two (the results do not depend on it).
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
#include <bitset>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// True for lacuna::cubical_filtration<D, T>.
template <class F>
inline constexpr bool is_cubical_filtration = false;
/// True: a cubical_filtration.
template <std::size_t D, class T>
inline constexpr bool is_cubical_filtration<cubical_filtration<D, T>> = true;

namespace detail::cubical_pers {

/// A cell of the doubled grid: its coordinates and its linear number (axis 0 fastest).
template <std::size_t D>
struct cell {
  std::array<std::uint32_t, D> q;
  std::uint64_t l;
};

/// The doubled grid of a cubical filtration: strides, the rank of each parity class in the
/// numbering of cells, and the values of cells read from the samples.
template <std::size_t D, class T>
class layout {
 public:
  using filtration_type = cubical_filtration<D, T>;

  explicit layout(const filtration_type& f) : f_(f), order_(f.value_order()) {
    std::uint64_t s = 1;
    for (std::size_t a = 0; a < D; ++a) {
      if (2 * f.extents()[a] + 1 >= std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: a cubical grid extent beyond 2^31");
      ext_[a] = static_cast<std::uint32_t>(2 * f.extents()[a] + 1);
      stride_[a] = s;
      s *= ext_[a];
      vstride_[a] = f.voxel_strides()[a];
    }
    total_ = f.top_dimension() < 0 ? 0 : s;
    // the classes in the numbering of cells: by dimension, then by mask
    std::array<unsigned, (1u << D)> masks{};
    for (unsigned m = 0; m < (1u << D); ++m) masks[m] = m;
    std::stable_sort(masks.begin(), masks.end(), [](unsigned x, unsigned y) { return std::popcount(x) < std::popcount(y); });
    for (unsigned r = 0; r < masks.size(); ++r) rank_[masks[r]] = static_cast<std::uint16_t>(r);
  }

  const filtration_type& filtration() const noexcept { return f_; }
  const sample_order<T>& order() const noexcept { return order_; }
  std::uint64_t total() const noexcept { return total_; }
  std::uint32_t extent(std::size_t a) const noexcept { return ext_[a]; }
  std::uint64_t stride(std::size_t a) const noexcept { return stride_[a]; }
  /// The place of the parity class `mask` in the numbering (classes of one dimension in order).
  std::uint16_t rank(unsigned mask) const noexcept { return rank_[mask]; }

  static unsigned mask_of(const std::array<std::uint32_t, D>& q) noexcept {
    unsigned m = 0;
    for (std::size_t a = 0; a < D; ++a) m |= (q[a] & 1u) << a;
    return m;
  }
  cell<D> at(std::uint64_t l) const noexcept {
    cell<D> c{{}, l};
    for (std::size_t a = 0; a < D; ++a) {
      c.q[a] = static_cast<std::uint32_t>(l % ext_[a]);
      l /= ext_[a];
    }
    return c;
  }
  typename filtration_type::position_type position(const cell<D>& c) const noexcept {
    typename filtration_type::position_type p{};
    for (std::size_t a = 0; a < D; ++a) p[a] = c.q[a];
    return p;
  }
  /// The index of the cell in the filtration (within its dimension).
  std::size_t index_of(const cell<D>& c) const noexcept { return f_.index_of(position(c)); }

  /// The value of a cell: the first sample (in the order) of the voxels containing it.
  T value(const std::array<std::uint32_t, D>& q) const noexcept {
    const T* s = f_.samples().data();
    std::uint64_t base = 0;
    std::array<std::uint64_t, D> step{};
    unsigned even = 0;
    for (std::size_t a = 0; a < D; ++a) {
      if (q[a] & 1u) {
        base += ((q[a] - 1) / 2) * vstride_[a];
      } else {
        const std::uint32_t x = q[a] / 2;
        if (x == 0) {
          base += 0;
        } else if (x == (ext_[a] - 1) / 2) {
          base += (x - 1) * vstride_[a];
        } else {
          base += (x - 1) * vstride_[a];
          step[even++] = vstride_[a];
        }
      }
    }
    T best = s[base];
    for (unsigned m = 1; m < (1u << even); ++m) {
      std::uint64_t v = base;
      for (unsigned b = 0; b < even; ++b)
        if ((m >> b) & 1u) v += step[b];
      if (order_(s[v], best)) best = s[v];
    }
    return best;
  }

  /// a enters after b (cells of one dimension): by value, then class, then place in the grid.
  bool later(const T& va, unsigned ra, std::uint64_t la, const T& vb, unsigned rb, std::uint64_t lb) const noexcept {
    if (order_(vb, va)) return true;
    if (order_(va, vb)) return false;
    if (ra != rb) return ra > rb;
    return la > lb;
  }

  /// The incidence of the face of a cell (mask m) along its free axis a: the upper face or the
  /// lower one (cubical orientation: the j-th free axis gives (-1)^j to its upper face).
  static int incidence(unsigned m, std::size_t a, bool upper) noexcept {
    const int sign = (std::popcount(m & ((1u << a) - 1u)) & 1) ? -1 : 1;
    return upper ? sign : -sign;
  }

 private:
  const filtration_type& f_;
  sample_order<T> order_;
  std::array<std::uint32_t, D> ext_{};
  std::array<std::uint64_t, D> stride_{};
  std::array<std::uint64_t, D> vstride_{};
  std::array<std::uint16_t, (1u << D)> rank_{};
  std::uint64_t total_ = 0;
};

/// Per cell: 0 for a critical cell, else 1 + 2 (2a + above) + up — the partner is the
/// neighbour along axis a (above: at +1), a coface when `up`. Four bits per cell up to
/// dimension 3, a byte above. Cells that two threads may both write are written atomically.
template <std::size_t D>
class pairing_codes {
 public:
  static constexpr bool nibbles = D <= 3;

  explicit pairing_codes(std::uint64_t cells) : bytes_(nibbles ? cells / 2 + 1 : cells + 1, 0) {}
  /// Cells l with first <= l < last may be written by two threads.
  void set_shared(std::uint64_t first, std::uint64_t last) noexcept {
    shared_first_ = first;
    shared_last_ = last;
  }
  std::uint8_t get(std::uint64_t l) const noexcept {
    if constexpr (nibbles)
      return static_cast<std::uint8_t>((static_cast<unsigned>(bytes_[l >> 1]) >> ((l & 1) * 4)) & 15u);
    else
      return bytes_[l];
  }
  void set(std::uint64_t l, std::uint8_t code) noexcept {
    if constexpr (nibbles) {
      const auto v = static_cast<std::uint8_t>(code << ((l & 1) * 4));
      if (l + 1 >= shared_first_ && l <= shared_last_)  // its byte may hold a cell of the other thread
        std::atomic_ref<std::uint8_t>(bytes_[l >> 1]).fetch_or(v, std::memory_order_relaxed);
      else
        bytes_[l >> 1] |= v;
    } else {
      bytes_[l] = code;  // one byte per cell: distinct cells never share memory
    }
  }
  static std::uint8_t code(std::size_t axis, bool above, bool up) noexcept {
    return static_cast<std::uint8_t>(1 + 2 * (2 * axis + (above ? 1 : 0)) + (up ? 1 : 0));
  }
  const std::vector<std::uint8_t>& bytes() const noexcept { return bytes_; }

 private:
  std::vector<std::uint8_t> bytes_;
  std::uint64_t shared_first_ = 1, shared_last_ = 0;
};

/// The cells of a closed D-cube, numbered by base-3 digits per axis (axis 0 least
/// significant): 0 the lower face along that axis, 1 free, 2 the upper face. The same numbers
/// name the voxels around a voxel (0: one below, 1: the same, 2: one above).
template <std::size_t D>
struct cube_cells {
  static constexpr std::size_t count = [] {
    std::size_t n = 1;
    for (std::size_t a = 0; a < D; ++a) n *= 3;
    return n;
  }();
  static constexpr std::size_t center = (count - 1) / 2;
  static constexpr std::size_t power(std::size_t a) {
    std::size_t p = 1;
    for (std::size_t b = 0; b < a; ++b) p *= 3;
    return p;
  }
  static constexpr unsigned digit(std::size_t c, std::size_t a) { return static_cast<unsigned>((c / power(a)) % 3); }
  static constexpr int dimension(std::size_t c) {
    int k = 0;
    for (std::size_t a = 0; a < D; ++a) k += digit(c, a) == 1;
    return k;
  }
};

/// Tables of the cells of a closed D-cube: faces, cofaces, the cells with one bound axis
/// freed, and the cells by dimension (built once).
template <std::size_t D>
struct cube_tables {
  using cc = cube_cells<D>;
  using set = std::bitset<cc::count>;
  std::array<set, cc::count> faces{};
  std::array<std::vector<std::uint16_t>, cc::count> cofaces{};  // with the axis and side below
  std::array<std::vector<std::uint8_t>, cc::count> coface_axis{};
  std::array<std::vector<std::uint16_t>, cc::count> freed{};    // one bound axis made free
  std::array<std::uint16_t, cc::count> by_dimension{};
  std::array<std::uint8_t, cc::count> digits_bound{};            // number of bound axes

  static const cube_tables& get() {
    static const cube_tables t;
    return t;
  }

 private:
  cube_tables() {
    for (std::size_t c = 0; c < cc::count; ++c) {
      by_dimension[c] = static_cast<std::uint16_t>(c);
      digits_bound[c] = static_cast<std::uint8_t>(D - static_cast<std::size_t>(cc::dimension(c)));
      for (std::size_t a = 0; a < D; ++a) {
        const unsigned d = cc::digit(c, a);
        if (d == 1) {
          faces[c].set(c - cc::power(a));
          faces[c].set(c + cc::power(a));
        } else {
          const std::size_t up = d == 0 ? c + cc::power(a) : c - cc::power(a);
          cofaces[c].push_back(static_cast<std::uint16_t>(up));
          coface_axis[c].push_back(static_cast<std::uint8_t>(a));
          freed[c].push_back(static_cast<std::uint16_t>(up));
        }
      }
    }
    std::stable_sort(by_dimension.begin(), by_dimension.end(),
                     [](std::size_t x, std::size_t y) { return cc::dimension(x) < cc::dimension(y); });
  }
};

/// The discrete gradient inside the lower star of a voxel (Robins, Wood & Sheppard 2011,
/// here with voxels as the top cells): the cells of its cube that no preceding voxel contains
/// are its lower star; they are paired by elementary expansions — a cell all of whose faces
/// are in (entered earlier, or assigned) is paired with a coface of the star whose other faces
/// are all in, else the lowest such cell is critical. The result lists the cells of the star
/// that are paired, with their codes (pairing_codes); the others of the star are critical.
template <std::size_t D>
class star_matcher {
  using cc = cube_cells<D>;
  using tables = cube_tables<D>;

 public:
  struct result {
    std::array<std::uint8_t, cc::count> cell{};  // the paired cells of the star
    std::array<std::uint8_t, cc::count> code{};  // and their codes
    std::uint8_t size = 0;
  };

  /// `blocked`: the cells of the cube outside the star (a preceding voxel contains them).
  static void match(const typename tables::set& blocked, result& out) {
    const tables& t = tables::get();
    out.size = 0;
    typename tables::set assigned = blocked;  // cells outside the star entered before it
    std::size_t left = cc::count - blocked.count();
    while (left > 0) {
      bool paired = false;
      for (std::uint16_t tau : t.by_dimension) {
        if (assigned[tau] || (t.faces[tau] & ~assigned).any()) continue;
        for (std::size_t j = 0; j < t.cofaces[tau].size(); ++j) {
          const std::uint16_t up = t.cofaces[tau][j];
          if (assigned[up]) continue;
          auto missing = t.faces[up] & ~assigned;
          missing.reset(tau);
          if (missing.any()) continue;
          // tau is the face of up along axis a: up lies above it when tau's digit is 0
          const std::size_t a = t.coface_axis[tau][j];
          const bool below = cc::digit(tau, a) == 0;
          out.cell[out.size] = static_cast<std::uint8_t>(tau);
          out.code[out.size++] = pairing_codes<D>::code(a, below, true);
          out.cell[out.size] = static_cast<std::uint8_t>(up);
          out.code[out.size++] = pairing_codes<D>::code(a, !below, false);
          assigned.set(tau);
          assigned.set(up);
          left -= 2;
          paired = true;
          break;
        }
        if (paired) break;
      }
      if (paired) continue;
      for (std::uint16_t c : t.by_dimension)
        if (!assigned[c] && !(t.faces[c] & ~assigned).any()) {
          assigned.set(c);  // critical
          --left;
          break;
        }
    }
  }
};

/// The lower-star matchings already met, keyed by the cells outside the star (one bit per
/// cell of the cube): a full table up to dimension 2, a cache of 2^16 entries in dimension
/// 3; dimensions above 3 are not cached (each voxel is matched on its own).
template <std::size_t D>
class star_cache {
  using cc = cube_cells<D>;

 public:
  using result = typename star_matcher<D>::result;
  static constexpr bool cached = D <= 3;
  static constexpr bool full_table = D <= 2;

  star_cache() {
    if constexpr (cached && !full_table) {
      keys_.assign(std::size_t{1} << bits, ~std::uint32_t{0});
      values_.resize(std::size_t{1} << bits);
    }
  }

  /// The matching for the blocked cells `key` (bit c: cube cell c is outside the star).
  const result& get(std::uint32_t key) {
    if constexpr (full_table) {
      return table()[key];
    } else {
      const std::size_t i = static_cast<std::size_t>((key * 0x9E3779B1u) >> (32 - bits));
      if (keys_[i] != key) {
        star_matcher<D>::match(typename cube_tables<D>::set(key), values_[i]);
        keys_[i] = key;
      }
      return values_[i];
    }
  }

 private:
  static constexpr unsigned bits = 16;
  // Not a lambda: a lambda is implicitly constexpr, and GCC then tries to build the table in
  // the compiler, in every translation unit that instantiates this class.
  static std::vector<result> build_table() {
    std::vector<result> v(std::size_t{1} << cc::count);
    for (std::uint32_t key = 0; key < v.size(); ++key)
      if (!((key >> cc::center) & 1u)) star_matcher<D>::match(typename cube_tables<D>::set(key), v[key]);
    return v;
  }
  static const std::vector<result>& table() {
    static const std::vector<result> t = build_table();
    return t;
  }
  std::vector<std::uint32_t> keys_;
  std::vector<result> values_;
};

/// Matches the lower stars of the voxels whose last coordinate is in [z0, z1) and writes the
/// codes of their paired cells. A voxel precedes another when its sample comes first in the
/// order, or the samples are equal and its number is smaller.
template <std::size_t D, class T, bool Descending>
void match_lower_stars_in(const layout<D, T>& g, pairing_codes<D>& codes, std::size_t z0, std::size_t z1,
                          const run_control* control, bool report) {
  using cc = cube_cells<D>;
  using tables = cube_tables<D>;
  const tables& t = tables::get();
  const auto& f = g.filtration();
  const auto& n = f.extents();
  const T* s = f.samples().data();
  auto first = [](const T& a, const T& b) { return Descending ? b < a : a < b; };
  star_cache<D> cache;
  std::array<std::int64_t, cc::count> voxel_offset{}, cell_offset{};
  for (std::size_t c = 0; c < cc::count; ++c)
    for (std::size_t a = 0; a < D; ++a) {
      const auto d = static_cast<std::int64_t>(cc::digit(c, a)) - 1;
      voxel_offset[c] += d * static_cast<std::int64_t>(f.voxel_strides()[a]);
      cell_offset[c] += d * static_cast<std::int64_t>(g.stride(a));
    }
  // the cells other than the center by number of bound axes; a neighbour precedes by index
  // when its last differing coordinate is lower
  std::vector<std::uint16_t> around;
  for (std::uint16_t c : t.by_dimension)
    if (c != cc::center) around.push_back(c);
  std::reverse(around.begin(), around.end());  // fewest bound axes (highest dimension) first
  std::array<bool, cc::count> lower_index{};
  for (std::size_t c = 0; c < cc::count; ++c)
    for (std::size_t a = D; a-- > 0;)
      if (cc::digit(c, a) != 1) {
        lower_index[c] = cc::digit(c, a) == 0;
        break;
      }
  // contains[c]: the cells of the cube that the voxel around numbered c contains (they agree
  // with c on its bound axes) — up to dimension 3, as a bit mask
  std::array<std::uint32_t, cc::count> contains{};
  if constexpr (D <= 3)
    for (std::size_t c = 0; c < cc::count; ++c)
      for (std::size_t x = 0; x < cc::count; ++x) {
        bool in = true;
        for (std::size_t a = 0; a < D; ++a)
          if (cc::digit(c, a) != 1 && cc::digit(x, a) != cc::digit(c, a)) in = false;
        if (in && c != cc::center) contains[c] |= std::uint32_t{1} << x;
      }
  std::size_t rows = 1;
  for (std::size_t a = 0; a + 1 < D; ++a) rows *= n[a];
  std::array<std::size_t, D> u{};
  typename star_matcher<D>::result own;
  for (std::size_t z = z0; z < z1; ++z) {
    u.fill(0);
    u[D - 1] = z;
    for (std::size_t step = 0; step < rows; ++step) {
      if (step != 0)
        for (std::size_t a = 0; a + 1 < D; ++a) {
          if (++u[a] < n[a]) break;
          u[a] = 0;
        }
      std::size_t v = 0;
      std::uint64_t center_cell = 0;
      bool inside = true;  // no neighbour outside the grid
      for (std::size_t a = 0; a < D; ++a) {
        v += u[a] * f.voxel_strides()[a];
        center_cell += (2 * u[a] + 1) * g.stride(a);
        inside = inside && u[a] > 0 && u[a] + 1 < n[a];
      }
      const T here = s[v];
      if constexpr (D <= 3) {
        // blocked cells: the union of the cells that the preceding voxels around contain
        std::uint32_t blocked = 0;
        if (inside) {
          for (std::size_t j = 0; j < around.size(); ++j) {
            const std::uint16_t c = around[j];
            const T there = s[static_cast<std::int64_t>(v) + voxel_offset[c]];
            const bool b = first(there, here) || (lower_index[c] && !first(here, there));
            blocked |= contains[c] & (std::uint32_t{0} - static_cast<std::uint32_t>(b));
          }
        } else {
          for (std::uint16_t c : around) {
            bool exists = true;
            for (std::size_t a = 0; a < D; ++a) {
              const unsigned d = cc::digit(c, a);
              if ((d == 0 && u[a] == 0) || (d == 2 && u[a] + 1 == n[a])) exists = false;
            }
            if (!exists) continue;
            const T there = s[static_cast<std::int64_t>(v) + voxel_offset[c]];
            if (first(there, here) || (lower_index[c] && !first(here, there))) blocked |= contains[c];
          }
        }
        const auto& m = cache.get(blocked);
        for (std::size_t j = 0; j < m.size; ++j)
          codes.set(static_cast<std::uint64_t>(static_cast<std::int64_t>(center_cell) + cell_offset[m.cell[j]]), m.code[j]);
        continue;
      }
      // blocked: the voxel of the cell precedes, or a cell with one bound axis freed is blocked
      typename tables::set blocked;
      for (std::uint16_t c : around) {
        bool b = false;
        for (std::uint16_t p : t.freed[c])
          if (blocked[p]) {
            b = true;
            break;
          }
        if (!b) {
          bool exists = true;
          if (!inside)
            for (std::size_t a = 0; a < D; ++a) {
              const unsigned d = cc::digit(c, a);
              if ((d == 0 && u[a] == 0) || (d == 2 && u[a] + 1 == n[a])) exists = false;
            }
          if (exists) {
            const T there = s[static_cast<std::int64_t>(v) + voxel_offset[c]];
            b = first(there, here) || (lower_index[c] && !first(here, there));
          }
        }
        if (b) blocked.set(c);
      }
      const typename star_matcher<D>::result* out;
      if constexpr (star_cache<D>::cached) {
        out = &cache.get(static_cast<std::uint32_t>(blocked.to_ulong()));
      } else {
        star_matcher<D>::match(blocked, own);
        out = &own;
      }
      for (std::size_t j = 0; j < out->size; ++j)
        codes.set(static_cast<std::uint64_t>(static_cast<std::int64_t>(center_cell) + cell_offset[out->cell[j]]), out->code[j]);
    }
    if (control && (z & 3) == 0) {
      if (report)
        control->report("pairing cubical cells", z - z0, z1 - z0);
      else
        control->check();
    }
  }
  if (control && report) control->report("pairing cubical cells", z1 - z0, z1 - z0);
}

template <std::size_t D, class T>
void match_lower_stars(const layout<D, T>& g, pairing_codes<D>& codes, std::size_t z0, std::size_t z1,
                       const run_control* control, bool report) {
  if (g.order().descending)
    match_lower_stars_in<D, T, true>(g, codes, z0, z1, control, report);
  else
    match_lower_stars_in<D, T, false>(g, codes, z0, z1, control, report);
}

/// The Morse complex and its reduction over the field R.
template <std::size_t D, class T, class R>
class morse_persistence {
 public:
  using result_type = persistence_result<T, R, sample_order<T>>;

  morse_persistence(const cubical_filtration<D, T>& f, const persistence_options& o, const R& ring_one)
      : g_(f), o_(o), ring_one_(ring_one), codes_(g_.total()) {}

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
  struct sort_key {
    T value;
    unsigned rank;
    cell<D> c;
  };
  struct node {
    R coefficient{};
    std::uint32_t waiting = 0;  // paths into the cell not yet walked
    cell<D> c{};
  };
  struct search_state {
    pending_map<node> nodes;
    std::vector<std::uint64_t> todo, all;
    std::vector<std::pair<std::uint64_t, R>> seeds;
    std::vector<sparse_entry<R>> found;
    std::vector<std::pair<cell<D>, R>> stack;
  };

  layout<D, T> g_;
  const persistence_options& o_;
  R ring_one_;
  pairing_codes<D> codes_;
  int top_ = -1;
  std::vector<std::vector<std::uint64_t>> by_cell_;  // critical cells per dimension, by linear number
  std::vector<std::vector<std::uint32_t>> rank_of_;  // their places in the filtration order
  std::vector<std::vector<std::uint64_t>> in_order_;  // critical cells per dimension in filtration order

  R integer_in_field(int n) const { return from_integer<R>(n) * ring_one_; }

  void find_critical() {
    const std::size_t Z = g_.filtration().extents()[D - 1];  // voxel hyperplanes
    const run_control* control = &o_.control;
    if (o_.threads >= 2 && Z >= 4) {
      // the two halves meet in hyperplane 2s of the doubled grid, whose cells either may own
      const std::size_t s = Z / 2;
      const std::uint64_t plane = g_.stride(D - 1);
      codes_.set_shared(2 * s * plane, (2 * s + 1) * plane);
      side_by_side([&] { match_lower_stars(g_, codes_, s, Z, control, false); },
                   [&] { match_lower_stars(g_, codes_, 0, s, control, true); });
    } else {
      match_lower_stars(g_, codes_, 0, Z, control, true);
    }
    by_cell_.assign(static_cast<std::size_t>(top_ + 1), {});
    const std::uint64_t total = g_.total();
    for (std::uint64_t l = 0; l < total; ++l) {
      if constexpr (pairing_codes<D>::nibbles) {  // skip two paired cells at once
        if ((l & 1) == 0 && l + 1 < total && (codes_.bytes()[l >> 1] & 0x0f) != 0 && (codes_.bytes()[l >> 1] & 0xf0) != 0) {
          ++l;
          continue;
        }
      }
      if (codes_.get(l) != 0) continue;
      const cell<D> c = g_.at(l);
      const int k = std::popcount(layout<D, T>::mask_of(c.q));
      if (k <= top_) by_cell_[static_cast<std::size_t>(k)].push_back(l);
    }
    in_order_.assign(by_cell_.size(), {});
    rank_of_.assign(by_cell_.size(), {});
    for (std::size_t k = 0; k < by_cell_.size(); ++k) {
      const auto& cells = by_cell_[k];
      if (cells.size() >= std::numeric_limits<std::uint32_t>::max())
        throw std::length_error("lacuna: more than 2^32 - 1 critical cells of dimension " + std::to_string(k));
      std::vector<sort_key> keys;
      keys.reserve(cells.size());
      for (auto l : cells) {
        const cell<D> c = g_.at(l);
        keys.push_back({g_.value(c.q), g_.rank(layout<D, T>::mask_of(c.q)), c});
      }
      std::vector<std::uint32_t> perm(cells.size());
      for (std::uint32_t j = 0; j < perm.size(); ++j) perm[j] = j;
      std::sort(perm.begin(), perm.end(), [&](std::uint32_t a, std::uint32_t b) {
        return g_.later(keys[b].value, keys[b].rank, keys[b].c.l, keys[a].value, keys[a].rank, keys[a].c.l);
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

  /// The place in the filtration order of the critical k-cell with linear number l.
  std::uint32_t morse_index(int k, std::uint64_t l) const {
    const auto& cells = by_cell_[static_cast<std::size_t>(k)];
    const auto it = std::lower_bound(cells.begin(), cells.end(), l);
    return rank_of_[static_cast<std::size_t>(k)][static_cast<std::size_t>(it - cells.begin())];
  }

  /// c moved by s (+-1) along axis a.
  cell<D> moved(const cell<D>& c, std::size_t a, int s) const noexcept {
    cell<D> n = c;
    if (s > 0) {
      ++n.q[a];
      n.l += g_.stride(a);
    } else {
      --n.q[a];
      n.l -= g_.stride(a);
    }
    return n;
  }
  /// fn(face, incidence) for the faces of c.
  template <class Fn>
  void for_each_face(const cell<D>& c, Fn&& fn) const {
    const unsigned m = layout<D, T>::mask_of(c.q);
    for (std::size_t a = 0; a < D; ++a) {
      if (!((m >> a) & 1u)) continue;
      fn(moved(c, a, -1), layout<D, T>::incidence(m, a, false));
      fn(moved(c, a, +1), layout<D, T>::incidence(m, a, true));
    }
  }

  /// The gradient flow from a chain of (k-1)-cells put in by seed(add): a critical cell that
  /// collects a coefficient c goes to reached(cell, c); a cell paired with a coface tau passes
  /// cu = -c/[tau:cell] to through(tau, cu) and cu [tau:f] to every other face f of tau; one
  /// paired with a face ends its path. The paths form an acyclic graph; it is found first, then
  /// walked in a topological order (Kahn 1962): a cell is passed on once every path into it
  /// has brought its share.
  template <class Seed, class Reached, class Through>
  void flow(search_state& st, Seed&& seed, Reached&& reached, Through&& through) const {
    auto& nodes = st.nodes;
    auto& todo = st.todo;
    auto& all = st.all;
    nodes.clear();
    todo.clear();
    all.clear();
    st.seeds.clear();
    auto meet = [&](const cell<D>& x) -> node& {
      bool fresh = false;
      node& nd = nodes.at(x.l, fresh);
      if (fresh) {
        nd.c = x;
        todo.push_back(x.l);
        all.push_back(x.l);
      }
      return nd;
    };
    seed([&](const cell<D>& x, const R& c) {
      meet(x);
      st.seeds.emplace_back(x.l, c);
    });
    // the graph: every cell reached, and how many paths enter it
    while (!todo.empty()) {
      const std::uint64_t l = todo.back();
      todo.pop_back();
      bool fresh = false;
      const cell<D> rho = nodes.at(l, fresh).c;
      const std::uint8_t code = codes_.get(l);
      if (code == 0 || ((code - 1) & 1) == 0) continue;
      const cell<D> tau = partner(rho, code);
      for_each_face(tau, [&](const cell<D>& face, int) {
        if (face.l != l) ++meet(face).waiting;
      });
    }
    for (const auto& [l, c] : st.seeds) {
      bool fresh = false;
      nodes.at(l, fresh).coefficient += c;
    }
    for (std::uint64_t l : all) {
      bool fresh = false;
      if (nodes.at(l, fresh).waiting == 0) todo.push_back(l);
    }
    while (!todo.empty()) {
      const std::uint64_t l = todo.back();
      todo.pop_back();
      bool fresh = false;
      const node nd = nodes.at(l, fresh);
      const std::uint8_t code = codes_.get(l);
      if (code == 0) {
        if (!(nd.coefficient == zero<R>())) reached(nd.c, nd.coefficient);
        continue;
      }
      if (((code - 1) & 1) == 0) continue;  // paired with a face: the path ends
      const cell<D> tau = partner(nd.c, code);
      const std::size_t a = static_cast<std::size_t>((code - 1) >> 2);
      const bool above = (((code - 1) >> 1) & 1) != 0;
      const unsigned tm = layout<D, T>::mask_of(tau.q);
      // the cell is tau's upper face when tau lies below it; +-1 is its own inverse
      const R cu = -(nd.coefficient * integer_in_field(layout<D, T>::incidence(tm, a, !above)));
      if (!(cu == zero<R>())) through(tau, cu);
      for_each_face(tau, [&](const cell<D>& face, int w) {
        if (face.l == l) return;
        bool f2 = false;
        node& m = nodes.at(face.l, f2);
        m.coefficient += cu * integer_in_field(w);
        if (--m.waiting == 0) todo.push_back(face.l);
      });
    }
  }

  /// The partner of a paired cell, from its code.
  cell<D> partner(const cell<D>& c, std::uint8_t code) const noexcept {
    const std::size_t a = static_cast<std::size_t>((code - 1) >> 2);
    return moved(c, a, (((code - 1) >> 1) & 1) ? 1 : -1);
  }

  /// Where a vertex flows: the critical vertex at the end of its walk (vertex, edge, vertex...).
  std::uint64_t walk_down(cell<D> u) const {
    for (;;) {
      const std::uint8_t code = codes_.get(u.l);
      if (code == 0) return u.l;
      const std::size_t a = static_cast<std::size_t>((code - 1) >> 2);
      const int s = ((code - 1) >> 1) & 1 ? 1 : -1;
      u = moved(moved(u, a, s), a, s);  // across the paired edge to its other end
    }
  }

  /// The Morse boundary of the critical k-cell at linear number l, as a sorted column.
  std::vector<sparse_entry<R>> morse_boundary(int k, std::uint64_t l, search_state& st) const {
    auto& found = st.found;
    found.clear();
    const cell<D> sigma = g_.at(l);
    if (k == 1) {
      // a walk from each end; the coefficient stays the same along it
      for_each_face(sigma, [&](const cell<D>& u, int w) { found.push_back({morse_index(0, walk_down(u)), integer_in_field(w)}); });
    } else if (k == static_cast<int>(D)) {
      // Top cells: a face has at most two cofaces, so the paths from sigma form a tree — every
      // top cell is entered through its one paired face, every paired face from its other
      // coface — and each cell is met once: no order to keep, a stack will do.
      auto& stack = st.stack;
      stack.clear();
      for_each_face(sigma, [&](const cell<D>& f, int w) { stack.push_back({f, integer_in_field(w)}); });
      while (!stack.empty()) {
        const cell<D> rho = stack.back().first;  // (no structured binding: lambdas below use it)
        const R c = stack.back().second;
        stack.pop_back();
        const std::uint8_t code = codes_.get(rho.l);
        if (code == 0) {
          found.push_back({morse_index(k - 1, rho.l), c});
          continue;
        }
        if (((code - 1) & 1) == 0) continue;  // paired with a face: the path ends
        const std::size_t a = static_cast<std::size_t>((code - 1) >> 2);
        const int s = ((code - 1) >> 1) & 1 ? 1 : -1;
        const cell<D> tau = moved(rho, a, s);
        const unsigned tm = layout<D, T>::mask_of(tau.q);
        const R cu = -(c * integer_in_field(layout<D, T>::incidence(tm, a, s < 0)));
        for_each_face(tau, [&](const cell<D>& face, int w) {
          if (face.l != rho.l) stack.push_back({face, cu * integer_in_field(w)});
        });
      }
    } else {
      flow(
          st, [&](auto&& add) { for_each_face(sigma, [&](const cell<D>& f, int w) { add(f, integer_in_field(w)); }); },
          [&](const cell<D>& x, const R& c) { found.push_back({morse_index(k - 1, x.l), c}); },
          [](const cell<D>&, const R&) {});
    }
    std::sort(found.begin(), found.end(), [](const auto& a, const auto& b) { return a.index < b.index; });
    std::vector<sparse_entry<R>> out;
    for (std::size_t i = 0; i < found.size();) {
      R sum = found[i].value;
      std::size_t j = i + 1;
      for (; j < found.size() && found[j].index == found[i].index; ++j) sum += found[j].value;
      if (!(sum == zero<R>())) out.push_back({found[i].index, sum});
      i = j;
    }
    return out;
  }

  /// g(z): a chain of critical k-cells (Morse places) -> the chain of original cells it stands
  /// for (original indices).
  chain<R> lift(int k, const sparse_vector<R>& z, search_state& st) const {
    std::unordered_map<std::uint64_t, R> result;
    flow(
        st,
        [&](auto&& add) {
          for (const auto& t : z) {
            const cell<D> c = g_.at(in_order_[static_cast<std::size_t>(k)][t.index]);
            result[c.l] += t.value;
            if (k >= 1) for_each_face(c, [&](const cell<D>& f, int w) { add(f, t.value * integer_in_field(w)); });
          }
        },
        [](const cell<D>&, const R&) {}, [&](const cell<D>& up, const R& cu) { result[up.l] += cu; });
    chain<R> out{k, {}};
    for (const auto& [l, c] : result)
      if (!(c == zero<R>())) out.terms.push_back({g_.index_of(g_.at(l)), c});
    out.normalize_terms();
    return out;
  }

  /// Fills the listed columns of A with Morse boundaries, on one or two threads.
  void fill_columns(int k, sparse_matrix<R>& A, const std::vector<std::uint32_t>& wanted, progress_ticker& tick) const {
    const auto& cells = in_order_[static_cast<std::size_t>(k)];
    auto run = [&](std::size_t first, std::size_t step, bool main) {
      search_state st;
      for (std::size_t i = first; i < wanted.size(); i += step) {
        const std::uint32_t j = wanted[i];
        A.columns[j] = morse_boundary(k, cells[j], st);
        if (main)
          tick(step);
        else if ((i & 1023) == 1)
          o_.control.check();
      }
    };
    if (o_.threads >= 2 && wanted.size() >= 64)
      side_by_side([&] { run(1, 2, false); }, [&] { run(0, 2, true); });
    else
      run(0, 1, true);
  }

  void reduce(int diagram_top, result_type& out) {
    const int top = top_;
    const bool reps = o_.representatives;
    std::vector<field_reduction_result<R>> red(static_cast<std::size_t>(top + 1));
    const field_reduction_options ro{.kernel = reps, .image = reps, .control = &o_.control,
                                     .phase = "reducing the boundary matrices"};
    std::uint64_t columns = 0;
    for (int k = 1; k <= top; ++k) columns += in_order_[static_cast<std::size_t>(k)].size();
    progress_ticker tick(&o_.control, "Morse boundaries", columns);
    for (int k = top; k >= 1; --k) {
      const auto uk = static_cast<std::size_t>(k);
      const auto& cells = in_order_[uk];
      sparse_matrix<R> A(in_order_[uk - 1].size(), cells.size());
      std::vector<char> cleared(cells.size(), 0);
      if (k < top)
        for (const auto& pv : red[uk + 1].pivots) cleared[pv.row] = 1;
      std::vector<std::uint32_t> wanted;
      for (std::uint32_t j = 0; j < cells.size(); ++j)
        if (!cleared[j]) wanted.push_back(j);
      tick(cells.size() - wanted.size());
      fill_columns(k, A, wanted, tick);
      red[uk] = k == top ? reduce_columns(A, ro) : reduce_columns_after(A, red[uk + 1], ro);
    }
    tick.finish();
    // the pairs, in the original cells
    search_state st;
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
      if (k + 1 <= top) {
        const auto& r = red[uk + 1];
        for (std::size_t t = 0; t < r.pivots.size(); ++t) {
          const auto [row, col] = r.pivots[t];
          paired[row] = 1;
          const cell<D> b = cell_of(k, row), e = cell_of(k + 1, col);
          const T birth = g_.value(b.q), death = g_.value(e.q);
          if (!g_.order()(birth, death)) continue;  // persistence zero: not reported
          d.pairs.push_back({birth, death, g_.index_of(b), g_.index_of(e)});
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
        const cell<D> b = cell_of(k, p);
        d.pairs.push_back({g_.value(b.q), std::nullopt, g_.index_of(b), no_cell});
        if (reps) {
          if (k == 0)
            out.representatives[uk].push_back(chain<R>{0, {{g_.index_of(b), ring_one_}}});
          else
            out.representatives[uk].push_back(lift(k, red[uk].kernel.at(this_kernel), st));
        }
      }
    }
    sort_pairs(out);
  }
};

}  // namespace detail::cubical_pers

/// The variant for cubical filtrations: a gradient of lower stars, then the Morse complex it
/// leaves, reduced with clearing (see the file comment). Reports the pairs of positive
/// persistence and the essential classes, with cells of their values.
struct cubical_morse_persistence {
  /// The persistence of f over the field of `ring_one`, with options o (the persistence_reduction interface).
  template <filtration F, field R>
    requires is_cubical_filtration<F>
  persistence_result<filtration_value_t<F>, R, filtration_order_t<F>> reduce(const F& f, const persistence_options& o,
                                                                            const R& ring_one) const {
    detail::check_unit(ring_one);
    return detail::cubical_pers::morse_persistence<F::dimension, typename F::value_type, R>(f, o, ring_one).run();
  }
};

}  // namespace lacuna

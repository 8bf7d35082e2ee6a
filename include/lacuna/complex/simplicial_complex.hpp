// lacuna/complex/simplicial_complex.hpp — abstract simplicial complexes, stored compactly.
//
// A simplicial_complex is the closure of a list of facets (ranges of vertex labels of any
// type). Vertices are numbered 0, 1, ... in order of first appearance; every simplex is
// oriented by increasing vertex number, and
//     boundary [v0 .. vk] = sum_j (-1)^j [v0 .. v^j .. vk].
//
// Storage: per dimension k >= 1 one flat array of std::uint32_t vertex ids, k+1 ids per
// simplex, the simplices in lexicographic order (no per-simplex object); the 0-simplices are
// the vertex ids 0..n-1 (4 bytes each, so that every dimension is a plain array). A face is found by binary search, so
// boundary(k, i) costs O(k^2 log n_{k-1}) and allocates nothing for k < 8.
// Memory: 4(k+1) bytes per k-simplex. Measured (tests/complex/simplicial_memory.long.cpp):
// a 3-dimensional complex of 1.02 * 10^7 simplices holds 117.5 MB of simplex arrays
// (11.5 bytes per simplex) and builds in 4 s with a peak resident size of 331 MiB.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/detail/concat.hpp>
#include <lacuna/complex/errors.hpp>

#include <algorithm>
#include <array>
#include <concepts>
#include <cstdint>
#include <cstring>
#include <functional>
#include <initializer_list>
#include <limits>
#include <map>
#include <numeric>
#include <optional>
#include <ostream>
#include <ranges>
#include <span>
#include <sstream>
#include <string>
#include <string_view>
#include <type_traits>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// A type usable as a vertex label: copyable, equality comparable, and hashable (std::hash)
/// or totally ordered, so that a label can be looked up.
template <class L>
concept simplex_label =
    std::copyable<L> && std::equality_comparable<L> &&
    (requires(const L& l) { { std::hash<L>{}(l) } -> std::convertible_to<std::size_t>; } ||
     std::totally_ordered<L>);

namespace detail {

/// The text of a label: strings as they are, a char as itself, integers in decimal, other
/// types through operator<<.
template <class L>
std::string label_to_string(const L& l) {
  if constexpr (std::is_convertible_v<const L&, std::string_view>) {
    return std::string(std::string_view(l));
  } else if constexpr (std::is_same_v<L, char>) {
    return std::string(1, l);
  } else if constexpr (std::integral<L>) {
    return std::to_string(l);
  } else {
    static_assert(requires(std::ostream& os) { os << l; },
                  "a vertex label must be a string, an integer, or printable with operator<<");
    std::ostringstream os;
    os << l;
    return os.str();
  }
}

/// Hashes std::string and std::string_view alike, so that a string-labelled complex can be
/// searched with a view (no temporary string per lookup). Deliberately not noexcept: then
/// libstdc++'s unordered_map keeps each node's hash code, so a lookup compares codes before
/// texts and a rehash does not hash every label again (with 10^6 labels the reader spent a
/// third of its time re-hashing keys while walking buckets).
struct string_label_hash {
  using is_transparent = void;
  std::size_t operator()(std::string_view s) const { return std::hash<std::string_view>{}(s); }
};

template <class L>
struct label_index {
  using type =
      std::conditional_t<requires(const L& l) { { std::hash<L>{}(l) } -> std::convertible_to<std::size_t>; },
                         std::unordered_map<L, std::uint32_t>, std::map<L, std::uint32_t>>;
};
template <>
struct label_index<std::string> {
  using type = std::unordered_map<std::string, std::uint32_t, string_label_hash, std::equal_to<>>;
};
template <class L>
using label_index_t = typename label_index<L>::type;

// Sorts the records of `width` ids in `flat` lexicographically and removes repeats.
template <std::size_t W, std::unsigned_integral Id>
void sort_unique_fixed(std::vector<Id>& flat) {
  using record = std::array<Id, W>;
  static_assert(sizeof(record) == W * sizeof(Id));
  std::vector<record> recs(flat.size() / W);
  if (!recs.empty()) std::memcpy(recs.data(), flat.data(), flat.size() * sizeof(Id));
  std::vector<Id>().swap(flat);
  if (recs.size() < (std::size_t{1} << 15)) {
    std::sort(recs.begin(), recs.end());
  } else {
    // Least-significant-digit radix sort (counting sort per column, last column first): a
    // few linear passes instead of ~log2(n) comparisons of whole records per record — the
    // closure of millions of facets spent most of its time in std::sort.
    Id max_id = 0;
    for (const auto& r : recs)
      for (auto v : r) max_id = std::max(max_id, v);
    const bool one_pass = max_id < (std::uint32_t{1} << 22);
    const std::size_t buckets = one_pass ? std::size_t{max_id} + 1 : std::size_t{1} << 16;
    std::vector<record> tmp(recs.size());
    std::vector<std::size_t> count(buckets + 1);
    auto pass = [&](std::size_t col, unsigned shift, std::uint32_t mask) {
      std::fill(count.begin(), count.end(), 0);
      for (const auto& r : recs) ++count[((r[col] >> shift) & mask) + 1];
      for (std::size_t b = 0; b < buckets; ++b) count[b + 1] += count[b];
      for (const auto& r : recs) tmp[count[(r[col] >> shift) & mask]++] = r;
      recs.swap(tmp);
    };
    for (std::size_t col = W; col-- > 0;) {
      if (one_pass) {
        pass(col, 0, 0xffffffffu);
      } else {
        pass(col, 0, 0xffffu);
        pass(col, 16, 0xffffu);
      }
    }
  }
  recs.erase(std::unique(recs.begin(), recs.end()), recs.end());
  flat.resize(recs.size() * W);
  if (!recs.empty()) std::memcpy(flat.data(), recs.data(), flat.size() * sizeof(Id));
}

// A template on the id type (std::uint32_t, vertex_id) so that the eight sorts are instantiated
// only where a complex is built, not in every translation unit that includes this header.
template <std::unsigned_integral Id>
  requires(sizeof(Id) <= 4)  // the radix passes below cover 32-bit ids
void sort_unique_records(std::vector<Id>& flat, std::size_t width) {
  switch (width) {
    case 1: sort_unique_fixed<1>(flat); return;
    case 2: sort_unique_fixed<2>(flat); return;
    case 3: sort_unique_fixed<3>(flat); return;
    case 4: sort_unique_fixed<4>(flat); return;
    case 5: sort_unique_fixed<5>(flat); return;
    case 6: sort_unique_fixed<6>(flat); return;
    case 7: sort_unique_fixed<7>(flat); return;
    case 8: sort_unique_fixed<8>(flat); return;
    default: break;
  }
  // Wide records: sort a permutation, then gather.
  const std::size_t n = flat.size() / width;
  std::vector<std::size_t> perm(n);
  std::iota(perm.begin(), perm.end(), std::size_t{0});
  const auto rec = [&](std::size_t i) { return flat.begin() + static_cast<std::ptrdiff_t>(i * width); };
  const auto less = [&](std::size_t a, std::size_t b) {
    return std::lexicographical_compare(rec(a), rec(a) + static_cast<std::ptrdiff_t>(width), rec(b),
                                        rec(b) + static_cast<std::ptrdiff_t>(width));
  };
  std::sort(perm.begin(), perm.end(), less);
  std::vector<Id> out;
  out.reserve(flat.size());
  for (std::size_t t = 0; t < n; ++t) {
    if (t > 0 && !less(perm[t - 1], perm[t])) continue;
    out.insert(out.end(), rec(perm[t]), rec(perm[t]) + static_cast<std::ptrdiff_t>(width));
  }
  flat = std::move(out);
}

}  // namespace detail

/// The boundary of one simplex: a contiguous range of lacuna::incidence held in an inline
/// buffer (no heap allocation for simplices of dimension < 8).
class simplex_boundary {
 public:
  /// Up to this many terms are held inline.
  static constexpr std::size_t inline_capacity = 8;

  simplex_boundary() = default;
  /// A boundary of n terms (on the heap beyond inline_capacity).
  explicit simplex_boundary(std::size_t n) : size_(n) {
    if (n > inline_capacity) heap_.resize(n);
  }
  ///@{
  /// The terms, contiguous.
  incidence* data() noexcept { return size_ > inline_capacity ? heap_.data() : inline_.data(); }
  const incidence* data() const noexcept { return size_ > inline_capacity ? heap_.data() : inline_.data(); }
  ///@}
  ///@{
  /// The range of terms.
  const incidence* begin() const noexcept { return data(); }
  const incidence* end() const noexcept { return data() + size_; }
  ///@}
  /// The number of terms.
  std::size_t size() const noexcept { return size_; }
  /// True for a vertex (no faces).
  bool empty() const noexcept { return size_ == 0; }
  /// Term j.
  const incidence& operator[](std::size_t j) const noexcept { return data()[j]; }

 private:
  std::array<incidence, inline_capacity> inline_{};
  std::vector<incidence> heap_;
  std::size_t size_ = 0;
};

/// An abstract simplicial complex with vertex labels of type Label (models
/// lacuna::cell_complex). Build it with simplicial_complex::builder, from_facets, or an
/// initializer list of facets.
template <simplex_label Label = std::string>
class simplicial_complex {
 public:
  /// The type of vertex labels.
  using label_type = Label;
  /// The number of a vertex: its index among the vertices.
  using vertex_id = std::uint32_t;

  class builder;

  /// The empty complex.
  simplicial_complex() = default;

  /// The closure of the given facets: `simplicial_complex<int> c{{0, 1, 2}, {2, 3}}`.
  simplicial_complex(std::initializer_list<std::initializer_list<Label>> facets) {
    builder b;
    for (const auto& f : facets) b.add_facet(f);
    *this = std::move(b).finalize();
  }

  /// The closure of a range of facets, each a range of labels convertible to Label.
  template <std::ranges::input_range R>
    requires std::ranges::input_range<std::ranges::range_reference_t<R>>
  static simplicial_complex from_facets(R&& facets) {
    builder b;
    for (auto&& f : facets) b.add_facet(f);
    return std::move(b).finalize();
  }

  // ---- the cell_complex interface ------------------------------------------------------
  /// The highest dimension of a simplex; -1 for the empty complex.
  int top_dimension() const noexcept {
    return static_cast<int>(simplices_.size()) - 1;
  }
  /// The number of k-simplices (0 outside 0..top).
  std::size_t cell_count(int k) const noexcept {
    if (k < 0 || k > top_dimension()) return 0;
    return simplices_[static_cast<std::size_t>(k)].size() / static_cast<std::size_t>(k + 1);
  }
  /// The boundary of the i-th k-simplex: sum_j (-1)^j (face without vertex j).
  /// Precondition: i < cell_count(k).
  simplex_boundary boundary(int k, std::size_t i) const {
    if (k <= 0) return simplex_boundary{};
    simplex_boundary out(static_cast<std::size_t>(k) + 1);
    incidence* d = out.data();
    for (int j = 0; j <= k; ++j)
      d[j] = incidence{face_index(k, i, j), (j % 2 == 0) ? std::int64_t{1} : std::int64_t{-1}};
    return out;
  }
  /// The labels of the simplex in vertex order, joined by single spaces (docs/formats.md).
  std::string cell_name(int k, std::size_t i) const {
    std::string s;
    for (vertex_id v : vertices(k, i)) {
      if (!s.empty()) s += ' ';
      s += detail::label_to_string(labels_[v]);
    }
    return s;
  }

  // ---- simplices and vertices ----------------------------------------------------------
  /// The number of vertices (= cell_count(0)).
  std::size_t vertex_count() const noexcept { return labels_.size(); }
  /// The label of vertex v.
  const Label& label(vertex_id v) const { return labels_.at(v); }
  /// All labels, indexed by vertex id.
  const std::vector<Label>& labels() const noexcept { return labels_; }
  /// The id of the vertex with this label, if there is one.
  std::optional<vertex_id> vertex(const Label& l) const {
    const auto it = index_.find(l);
    if (it == index_.end()) return std::nullopt;
    return it->second;
  }
  /// The vertex ids of the i-th k-simplex, increasing. Precondition: i < cell_count(k).
  std::span<const vertex_id> vertices(int k, std::size_t i) const {
    const auto w = static_cast<std::size_t>(k + 1);
    return {simplices_[static_cast<std::size_t>(k)].data() + i * w, w};
  }
  /// The index of the face of the i-th k-simplex that omits its j-th vertex (0 <= j <= k).
  std::size_t face_index(int k, std::size_t i, int j) const {
    const auto vs = vertices(k, i);
    if (k == 1) return vs[static_cast<std::size_t>(1 - j)];
    std::array<vertex_id, 32> small{};
    std::vector<vertex_id> big;
    vertex_id* key = small.data();
    if (k > 32) {
      big.resize(static_cast<std::size_t>(k));
      key = big.data();
    }
    for (int t = 0, o = 0; t <= k; ++t)
      if (t != j) key[o++] = vs[static_cast<std::size_t>(t)];
    const auto r = find_sorted(k - 1, std::span<const vertex_id>(key, static_cast<std::size_t>(k)));
    return *r;  // present: the complex is closed
  }
  /// The index of the simplex with these vertex ids (any order), if it is in the complex.
  std::optional<std::size_t> find(std::span<const vertex_id> ids) const {
    if (ids.empty()) return std::nullopt;
    std::vector<vertex_id> key(ids.begin(), ids.end());
    std::sort(key.begin(), key.end());
    if (std::adjacent_find(key.begin(), key.end()) != key.end()) return std::nullopt;
    return find_sorted(static_cast<int>(key.size()) - 1, key);
  }
  /// The same from a braced list of vertex ids.
  std::optional<std::size_t> find(std::initializer_list<vertex_id> ids) const {
    return find(std::span<const vertex_id>(ids.begin(), ids.size()));
  }
  /// The index of the simplex with these labels (any order), if it is in the complex.
  template <std::ranges::input_range R>
    requires std::convertible_to<std::ranges::range_reference_t<R>, const Label&>
  std::optional<std::size_t> find_labels(const R& labels) const {
    std::vector<vertex_id> ids;
    for (const auto& l : labels) {
      const auto v = vertex(l);
      if (!v) return std::nullopt;
      ids.push_back(*v);
    }
    return find(ids);
  }
  /// Bytes held by the simplex arrays (the vertex labels and their index come on top).
  std::size_t storage_bytes() const noexcept {
    std::size_t b = 0;
    for (const auto& a : simplices_) b += a.capacity() * sizeof(vertex_id);
    for (const auto& d : first_) b += d.capacity() * sizeof(std::uint64_t);
    return b;
  }
  /// The maximal simplices (facets) as (dimension, index) pairs, by dimension then index.
  std::vector<std::pair<int, std::size_t>> facets() const {
    std::vector<std::pair<int, std::size_t>> out;
    const int top = top_dimension();
    std::vector<char> covered;
    std::vector<char> covered_next;
    for (int k = top; k >= 0; --k) {
      covered.assign(cell_count(k), 0);
      if (k < top)
        for (std::size_t i = 0; i < cell_count(k + 1); ++i)
          for (int j = 0; j <= k + 1; ++j) covered[face_index(k + 1, i, j)] = 1;
      for (std::size_t i = 0; i < cell_count(k); ++i)
        if (!covered[i]) out.emplace_back(k, i);
    }
    std::sort(out.begin(), out.end());
    return out;
  }

  /// Same labels and the same simplices in the same order.
  friend bool operator==(const simplicial_complex& a, const simplicial_complex& b) {
    return a.labels_ == b.labels_ && a.simplices_ == b.simplices_;
  }

 private:
  std::optional<std::size_t> find_sorted(int k, std::span<const vertex_id> key) const {
    if (k < 0 || k > top_dimension()) return std::nullopt;
    if (k == 0) {
      if (key[0] < labels_.size()) return key[0];
      return std::nullopt;
    }
    const auto& a = simplices_[static_cast<std::size_t>(k)];
    const auto w = static_cast<std::size_t>(k + 1);
    std::size_t lo = 0, hi = a.size() / w;
    // The directory by first vertex narrows the search to the simplices that start with
    // key[0] (a handful on a surface, instead of log2 of millions of steps).
    const auto& dir = first_[static_cast<std::size_t>(k)];
    if (key[0] + 1 < dir.size()) {
      lo = dir[key[0]];
      hi = dir[key[0] + 1];
    } else if (!dir.empty()) {
      return std::nullopt;
    }
    while (lo < hi) {
      const std::size_t mid = lo + (hi - lo) / 2;
      const vertex_id* r = a.data() + mid * w;
      if (std::lexicographical_compare(r, r + w, key.begin(), key.end()))
        lo = mid + 1;
      else
        hi = mid;
    }
    if (lo < a.size() / w && std::equal(key.begin(), key.end(), a.data() + lo * w)) return lo;
    return std::nullopt;
  }

  std::vector<Label> labels_;
  detail::label_index_t<Label> index_;
  // [k]: the k-simplices, k+1 ids each, lexicographic; [0] is 0, 1, ..., n-1 (the vertices).
  std::vector<std::vector<vertex_id>> simplices_;
  // [k]: for k >= 1, first_[k][v] is the index of the first k-simplex whose first vertex is
  // at least v (n + 1 entries): the simplices starting with v are [first_[k][v], first_[k][v+1]).
  std::vector<std::vector<std::uint64_t>> first_;

  void build_directory() {
    first_.assign(simplices_.size(), {});
    const std::size_t n = labels_.size();
    for (std::size_t k = 1; k < simplices_.size(); ++k) {
      const auto& a = simplices_[k];
      const std::size_t w = k + 1, m = a.size() / w;
      auto& d = first_[k];
      d.assign(n + 1, m);
      for (std::size_t i = m; i-- > 0;) d[a[i * w]] = i;
      for (std::size_t v = n; v-- > 0;) d[v] = std::min(d[v], d[v + 1]);
    }
  }
};

/// Collects facets, then closes them (sort + unique per dimension, top down).
///     simplicial_complex<std::string>::builder b;
///     b.add_facet(std::vector<std::string>{"a", "b", "c"});
///     auto c = std::move(b).finalize();
/// Listing a face of a listed simplex changes nothing; a label repeated within one facet
/// throws lacuna::invalid_complex. Empty facets are ignored.
template <simplex_label Label>
class simplicial_complex<Label>::builder {
 public:
  /// The id of the vertex with this label, adding it (as an isolated vertex) if new.
  vertex_id vertex(const Label& l) { return find_or_add(l); }
  /// The id of the vertex labelled by the text `l` (string labels only), adding it if new;
  /// no string is made when the label is known.
  vertex_id vertex_of_text(std::string_view l)
    requires std::same_as<Label, std::string>
  {
    return find_or_add(l);
  }
  /// Adds the simplex with these labels (and so all its faces).
  template <std::ranges::input_range R>
    requires std::convertible_to<std::ranges::range_reference_t<R>, Label>
  builder& add_facet(const R& labels) {
    ids_.clear();
    for (const auto& l : labels) ids_.push_back(vertex(Label(l)));
    ++facet_number_;
    auto& sorted = sorted_;
    sorted = ids_;
    std::sort(sorted.begin(), sorted.end());
    const auto rep = std::adjacent_find(sorted.begin(), sorted.end());
    if (rep != sorted.end())
      throw invalid_complex("simplicial complex: label '" + detail::label_to_string(sc_.labels_[*rep]) +
                            "' repeated within facet number " + std::to_string(facet_number_));
    add_sorted(sorted);
    return *this;
  }
  /// The same from a braced list of labels.
  builder& add_facet(std::initializer_list<Label> labels) {
    return add_facet<std::initializer_list<Label>>(labels);
  }
  /// Adds the simplex with these vertex ids (each < the number of vertices so far, distinct).
  builder& add_facet_ids(std::span<const vertex_id> ids) {
    ++facet_number_;
    auto& sorted = sorted_;
    sorted.assign(ids.begin(), ids.end());
    std::sort(sorted.begin(), sorted.end());
    if (std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end())
      throw invalid_complex("simplicial complex: a vertex id repeated within facet number " +
                            std::to_string(facet_number_));
    if (!sorted.empty() && sorted.back() >= sc_.labels_.size())
      throw invalid_complex("simplicial complex: vertex id " + std::to_string(sorted.back()) +
                            " out of range in facet number " + std::to_string(facet_number_));
    add_sorted(sorted);
    return *this;
  }
  /// Refuse to build more than this many simplices in all (default: no limit).
  builder& max_cells(std::size_t n) {
    max_cells_ = n;
    return *this;
  }
  /// The number of vertices so far.
  std::size_t vertex_count() const noexcept { return sc_.labels_.size(); }
  /// Room for n vertices in all, so that adding them does not rehash the label index.
  builder& reserve_vertices(std::size_t n) {
    sc_.labels_.reserve(n);
    if constexpr (requires { sc_.index_.reserve(n); }) sc_.index_.reserve(n);
    return *this;
  }
  /// The label of vertex v (v < vertex_count()).
  const Label& label(vertex_id v) const { return sc_.labels_[v]; }

  /// The closure of everything added. Throws lacuna::invalid_complex if it would exceed
  /// max_cells. Complexity O(N log N) in the number N of simplices of the closure.
  simplicial_complex finalize() && {
    auto& s = sc_.simplices_;
    std::size_t total = sc_.labels_.size();
    if (total > max_cells_)
      throw invalid_complex("simplicial complex: more than " + std::to_string(max_cells_) + " simplices");
    if (s.empty() && total > 0) s.resize(1);
    for (std::size_t k = s.size() - 1; k >= 1 && k < s.size(); --k) {
      auto& flat = s[k];
      const std::size_t w = k + 1;
      detail::sort_unique_records(flat, w);
      flat.shrink_to_fit();
      total += flat.size() / w;
      if (total > max_cells_)
        throw invalid_complex("simplicial complex: more than " + std::to_string(max_cells_) + " simplices");
      if (k == 1) break;
      auto& down = s[k - 1];
      down.reserve(down.size() + flat.size());
      for (std::size_t off = 0; off < flat.size(); off += w)
        for (std::size_t j = 0; j < w; ++j)
          for (std::size_t t = 0; t < w; ++t)
            if (t != j) down.push_back(flat[off + t]);
    }
    if (!s.empty()) {
      s[0].resize(sc_.labels_.size());
      std::iota(s[0].begin(), s[0].end(), vertex_id{0});
    }
    sc_.build_directory();
    return std::move(sc_);
  }

 private:
  // l: a Label, or a view the index can be searched with (string labels).
  template <class Text>
  vertex_id find_or_add(const Text& l) {
    const auto it = sc_.index_.find(l);
    if (it != sc_.index_.end()) return it->second;
    if (sc_.labels_.size() >= std::numeric_limits<vertex_id>::max())
      throw invalid_complex("simplicial complex: more than 2^32 - 1 vertices");
    const auto id = static_cast<vertex_id>(sc_.labels_.size());
    sc_.labels_.emplace_back(l);
    sc_.index_.emplace(sc_.labels_.back(), id);
    return id;
  }
  void add_sorted(const std::vector<vertex_id>& sorted) {
    if (sorted.size() <= 1) return;  // vertices are registered by vertex()
    const std::size_t k = sorted.size() - 1;
    if (sc_.simplices_.size() < k + 1) sc_.simplices_.resize(k + 1);
    auto& flat = sc_.simplices_[k];
    flat.insert(flat.end(), sorted.begin(), sorted.end());
  }

  simplicial_complex sc_;
  std::vector<vertex_id> ids_, sorted_;
  std::size_t facet_number_ = 0;
  std::size_t max_cells_ = std::numeric_limits<std::size_t>::max();
};

namespace detail {

// simplicial_complex<std::string>, named through the input types of a construction: the
// constructions that label their vertices by text (join, barycentric subdivision, ...) build
// their result through this type, so that their bodies depend on the inputs and the builder of
// simplicial_complex<std::string> is instantiated only where a construction is called, not in
// every translation unit that includes them (DEVELOPERS.md, *Compile cost of the headers*).
template <class... Inputs>
struct text_labelled_complex {
  using type = simplicial_complex<std::string>;
};

}  // namespace detail

}  // namespace lacuna

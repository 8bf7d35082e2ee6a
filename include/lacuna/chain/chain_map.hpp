// lacuna/chain/chain_map.hpp — chain maps between cell complexes.
//
// A chain map f: C(X) -> C(Y) is given cell by cell: f.image(k, i) is the image of the i-th
// k-cell of X, a range of terms {cell, coefficient} naming k-cells of Y. Coefficients are
// machine integers (the maps that come from geometry: simplicial maps, inclusions) or
// elements of a ring R (maps written over a field, say). Anything with such a member models
// lacuna::chain_map; the built-ins are
//   * explicit_chain_map<T>     cell-to-chain data, stored; from names between cell lists
//                               (chain_map_from_names);
//   * simplicial_chain_map      from a vertex map between simplicial complexes: a simplex
//                               goes to the simplex spanned by the images of its vertices,
//                               with the sign of the permutation that sorts them, or to zero
//                               when two vertices meet (a degenerate image);
//   * inclusion_map             of a subcomplex (from a cell_selection, or by labels);
//   * identity_map, compose(g, f), sum(f, g), negated(f): lazy, computed on each image().
// check_chain_map(f, X, Y) verifies that f names cells of Y and that ∂f = f∂, and names the
// first cell (lowest dimension, then index) where it fails.
#pragma once

#include <lacuna/ring/checked.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/combine_terms.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/subcomplex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <concepts>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <map>
#include <optional>
#include <ranges>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna {

namespace chain_map_detail {
template <class V>
concept map_term = requires(const V& v) {
  { v.cell } -> std::convertible_to<std::size_t>;
  v.coefficient;
};
}  // namespace chain_map_detail

/// A chain map: f.image(k, i) is a range of terms {cell, coefficient}, the image of the i-th
/// k-cell as a chain of k-cells of the target. Coefficients: integral, or a ring element.
template <class F>
concept chain_map = requires(const F& f, int k, std::size_t i) {
  { f.image(k, i) } -> std::ranges::input_range;
} && chain_map_detail::map_term<std::ranges::range_value_t<decltype(std::declval<const F&>().image(0, std::size_t{}))>>;

/// The coefficient type of the terms of a chain map.
template <chain_map F>
using chain_map_coefficient_t = std::remove_cvref_t<
    decltype(std::declval<std::ranges::range_value_t<decltype(std::declval<const F&>().image(0, std::size_t{}))>>().coefficient)>;

/// The image in R of a coefficient of a chain map (integral: through from_integer, times unit).
template <class R, class T>
R map_coefficient_in(const T& c, const R& ring_one = one<R>()) {
  if constexpr (std::same_as<std::remove_cvref_t<T>, R>)
    return c;
  else if constexpr (std::integral<T>)
    return from_integer<R>(static_cast<std::int64_t>(c)) * ring_one;
  else if constexpr (std::same_as<std::remove_cvref_t<T>, integer>)
    return coefficient_in<R>(c, ring_one);
  else
    return static_cast<R>(c);
}

/// f applied to a chain over R (terms naming cells of the source; the result names cells of
/// the target, normalized).
template <commutative_ring R, chain_map F>
chain<R> apply_map(const F& f, const chain<R>& c, const R& ring_one = one<R>()) {
  chain<R> out{c.dimension, {}};
  for (const auto& t : c.terms)
    for (auto&& im : f.image(c.dimension, t.cell))
      out.terms.push_back({static_cast<std::size_t>(im.cell), map_coefficient_in<R>(im.coefficient, ring_one) * t.coefficient});
  out.normalize_terms();
  return out;
}

// ---- explicit data -----------------------------------------------------------------------

/// A chain map stored cell by cell: images_[k][i]. Cells without an image map to zero.
template <class T = std::int64_t>
class explicit_chain_map {
 public:
  /// The coefficient type T.
  using coefficient_type = T;
  explicit_chain_map() = default;
  /// All-zero map out of a complex with these cell counts.
  template <graded_cells C>
  explicit explicit_chain_map(const C& source) {
    for (int k = 0; k <= lacuna::top_dimension(source); ++k) images_.emplace_back(lacuna::cell_count(source, k));
  }
  /// Sets the image of the i-th k-cell (terms summed per cell, zeros dropped, sorted).
  void set(int k, std::size_t i, std::vector<chain_term<T>> terms) {
    if (k < 0) throw std::invalid_argument("lacuna: a chain map has no cells of negative dimension");
    if (static_cast<std::size_t>(k) >= images_.size()) images_.resize(static_cast<std::size_t>(k) + 1);
    auto& level = images_[static_cast<std::size_t>(k)];
    if (i >= level.size()) level.resize(i + 1);
    combine_terms(terms, &chain_term<T>::cell, &chain_term<T>::coefficient, [](const T& a, const T& b) {
      if constexpr (std::same_as<T, std::int64_t>) {  // 64-bit images: an overflow throws
        std::int64_t r = 0;
        if (checked_add(a, b, r)) throw std::overflow_error("lacuna: a chain map coefficient passes 64 bits");
        return r;
      } else {
        return a + b;
      }
    });
    level[i] = std::move(terms);
  }
  /// The image of the i-th k-cell (empty: zero).
  const std::vector<chain_term<T>>& image(int k, std::size_t i) const {
    static const std::vector<chain_term<T>> none;
    if (k < 0 || static_cast<std::size_t>(k) >= images_.size()) return none;
    const auto& level = images_[static_cast<std::size_t>(k)];
    return i < level.size() ? level[i] : none;
  }

 private:
  std::vector<std::vector<std::vector<chain_term<T>>>> images_;
};

/// The chain map from X to Y given by names: each entry names a cell of X and its image as
/// (name of a cell of Y, coefficient) pairs; unnamed cells map to zero. Throws
/// std::invalid_argument for an unknown name or an image cell of another dimension.
template <class T = std::int64_t>
explicit_chain_map<T> chain_map_from_names(
    const cell_list& X, const cell_list& Y,
    const std::vector<std::pair<std::string, std::vector<std::pair<std::string, T>>>>& images) {
  explicit_chain_map<T> f(X);
  for (const auto& [name, terms] : images) {
    const auto src = X.find(name);
    if (!src) throw std::invalid_argument("lacuna: the source has no cell named '" + name + "'");
    std::vector<chain_term<T>> out;
    for (const auto& [tname, c] : terms) {
      const auto dst = Y.find(tname);
      if (!dst) throw std::invalid_argument("lacuna: the target has no cell named '" + tname + "'");
      if (dst->first != src->first)
        throw std::invalid_argument("lacuna: the image of the " + std::to_string(src->first) + "-cell '" + name +
                                    "' names the " + std::to_string(dst->first) + "-cell '" + tname + "'");
      out.push_back({dst->second, c});
    }
    f.set(src->first, src->second, std::move(out));
  }
  return f;
}

// ---- simplicial maps ---------------------------------------------------------------------

/// The chain map of a vertex map between simplicial complexes, computed once for all
/// simplices: vertex_map[v] is the image (a vertex id of Y) of the vertex id v of X.
/// Throws std::invalid_argument if a vertex has no image or the image of a simplex is not a
/// simplex of Y (the map is then not simplicial), naming the simplex.
template <simplex_label L1, simplex_label L2>
explicit_chain_map<std::int64_t> simplicial_chain_map(const simplicial_complex<L1>& X, const simplicial_complex<L2>& Y,
                                                      const std::vector<std::uint32_t>& vertex_map) {
  if (vertex_map.size() != X.vertex_count())
    throw std::invalid_argument("lacuna: the vertex map has " + std::to_string(vertex_map.size()) + " images for " +
                                std::to_string(X.vertex_count()) + " vertices");
  for (std::size_t v = 0; v < vertex_map.size(); ++v)
    if (vertex_map[v] >= Y.vertex_count())
      throw std::invalid_argument("lacuna: vertex '" + X.cell_name(0, v) + "' maps to a vertex the target does not have");
  explicit_chain_map<std::int64_t> f(X);
  std::vector<std::uint32_t> img;
  for (int k = 0; k <= X.top_dimension(); ++k)
    for (std::size_t i = 0; i < X.cell_count(k); ++i) {
      img.clear();
      for (auto v : X.vertices(k, i)) img.push_back(vertex_map[v]);
      // Sign of the sorting permutation by counting inversions; a repeat: degenerate, zero.
      bool degenerate = false;
      std::size_t inversions = 0;
      for (std::size_t a = 0; a < img.size() && !degenerate; ++a)
        for (std::size_t b = a + 1; b < img.size(); ++b) {
          if (img[a] == img[b]) degenerate = true;
          if (img[a] > img[b]) ++inversions;
        }
      if (degenerate) continue;
      const auto j = Y.find(std::span<const std::uint32_t>(img.data(), img.size()));
      if (!j)
        throw std::invalid_argument("lacuna: not a simplicial map: the image of the simplex '" + X.cell_name(k, i) +
                                    "' is not a simplex of the target");
      f.set(k, i, {{*j, inversions % 2 == 0 ? std::int64_t{1} : std::int64_t{-1}}});
    }
  return f;
}

/// The same from a map of labels (a callable L1 -> L2, or anything with operator()).
template <simplex_label L1, simplex_label L2, class VertexMap>
  requires std::invocable<const VertexMap&, const L1&>
explicit_chain_map<std::int64_t> simplicial_chain_map(const simplicial_complex<L1>& X, const simplicial_complex<L2>& Y,
                                                      const VertexMap& label_map) {
  std::vector<std::uint32_t> ids;
  for (std::uint32_t v = 0; v < X.vertex_count(); ++v) {
    const auto w = Y.vertex(static_cast<L2>(label_map(X.label(v))));
    if (!w) throw std::invalid_argument("lacuna: vertex '" + X.cell_name(0, v) + "' maps to a label the target does not have");
    ids.push_back(*w);
  }
  return simplicial_chain_map(X, Y, ids);
}

// ---- inclusions --------------------------------------------------------------------------

/// The inclusion of the subcomplex chosen by a cell_selection (as built by subcomplex(): the
/// chosen cells renumbered in their order) into the complex it was chosen from.
inline explicit_chain_map<std::int64_t> inclusion_map(const cell_selection& s) {
  explicit_chain_map<std::int64_t> f;
  for (std::size_t k = 0; k < s.new_index.size(); ++k)
    for (std::size_t i = 0; i < s.new_index[k].size(); ++i)
      if (s.new_index[k][i] != cell_selection::npos) f.set(static_cast<int>(k), s.new_index[k][i], {{i, 1}});
  return f;
}

/// The inclusion of A into X, simplicial complexes, matching simplices by their labels.
/// Throws std::invalid_argument naming the first simplex of A that X does not have.
template <simplex_label L>
explicit_chain_map<std::int64_t> inclusion_map(const simplicial_complex<L>& A, const simplicial_complex<L>& X) {
  explicit_chain_map<std::int64_t> f(A);
  std::vector<L> labels;
  for (int k = 0; k <= A.top_dimension(); ++k)
    for (std::size_t i = 0; i < A.cell_count(k); ++i) {
      labels.clear();
      for (auto v : A.vertices(k, i)) labels.push_back(A.label(v));
      const auto j = X.find_labels(labels);
      if (!j) throw std::invalid_argument("lacuna: the simplex '" + A.cell_name(k, i) + "' is not in the complex");
      // Both complexes order vertices by id, which may differ: take the permutation sign.
      std::vector<std::uint32_t> ids;
      for (const auto& l : labels) ids.push_back(*X.vertex(l));
      std::size_t inv = 0;
      for (std::size_t a = 0; a < ids.size(); ++a)
        for (std::size_t b = a + 1; b < ids.size(); ++b) inv += ids[a] > ids[b] ? 1 : 0;
      f.set(k, i, {{*j, inv % 2 == 0 ? std::int64_t{1} : std::int64_t{-1}}});
    }
  return f;
}

/// A subcomplex of X as its own complex, with its inclusion into X and the selection.
struct included_subcomplex {
  /// The subcomplex, its cells renumbered.
  cell_list complex;
  /// Its inclusion into X (each cell to the cell it came from, coefficient 1).
  explicit_chain_map<std::int64_t> inclusion;
  /// Which cells of X were chosen, and their new indices.
  cell_selection selection;
};

/// The subcomplex of the cells (k, i) of X with pred(k, i), and its inclusion. Throws
/// lacuna::invalid_complex naming the first chosen cell whose face is not chosen.
template <cell_complex C, class Pred>
  requires std::predicate<Pred&, int, std::size_t>
included_subcomplex make_included_subcomplex(const C& X, Pred pred) {
  included_subcomplex out;
  out.selection = detail::select_closed(X, pred, "subcomplex");
  out.complex = subcomplex(X, [&](int k, std::size_t i) { return out.selection.contains(k, i); });
  out.inclusion = inclusion_map(out.selection);
  return out;
}

/// The same from marks in_subcomplex[k][i] (missing entries: not chosen).
template <cell_complex C>
included_subcomplex make_included_subcomplex(const C& X, const std::vector<std::vector<bool>>& in_subcomplex) {
  return make_included_subcomplex(X, [&](int k, std::size_t i) {
    return static_cast<std::size_t>(k) < in_subcomplex.size() && i < in_subcomplex[static_cast<std::size_t>(k)].size() &&
           in_subcomplex[static_cast<std::size_t>(k)][i];
  });
}

// ---- identity, composition, sums ---------------------------------------------------------

/// The identity chain map of any complex.
struct identity_map {
  /// The cell itself, coefficient 1.
  std::vector<chain_term<std::int64_t>> image(int, std::size_t i) const { return {{i, 1}}; }
};

namespace chain_map_detail {
template <class A, class B>
struct common_coefficient {
  static_assert(std::same_as<A, B>, "lacuna: chain maps with coefficients in different rings");
  using type = A;
};
template <std::integral A, std::integral B>
struct common_coefficient<A, B> {
  using type = std::int64_t;
};
template <std::integral A, class B>
  requires(!std::integral<B>)
struct common_coefficient<A, B> {
  using type = B;
};
template <class A, std::integral B>
  requires(!std::integral<A>)
struct common_coefficient<A, B> {
  using type = A;
};

template <class T, class U>
T convert(const U& u) {
  if constexpr (std::same_as<T, U>)
    return u;
  else if constexpr (std::integral<T> && std::integral<U>)
    return static_cast<T>(u);
  else
    return map_coefficient_in<T>(u);
}
template <class T>
T mul(const T& a, const T& b) {
  if constexpr (std::same_as<T, std::int64_t>) {
    std::int64_t r = 0;
    if (checked_mul(a, b, r)) throw std::overflow_error("lacuna: a chain map coefficient passes 64 bits");
    return r;
  } else {
    return a * b;
  }
}
template <class T>
T add(const T& a, const T& b) {
  if constexpr (std::same_as<T, std::int64_t>) {
    std::int64_t r = 0;
    if (checked_add(a, b, r)) throw std::overflow_error("lacuna: a chain map coefficient passes 64 bits");
    return r;
  } else {
    return a + b;
  }
}
template <class T>
std::vector<chain_term<T>> collect(std::map<std::size_t, T>& acc) {
  std::vector<chain_term<T>> out;
  for (auto& [c, v] : acc)
    if (!(v == T{}) && !(v == convert<T>(0))) out.push_back({c, v});
  return out;
}
}  // namespace chain_map_detail

/// g ∘ f (f first), evaluated on each image() call. Holds copies of f and g.
template <chain_map G, chain_map F>
class composed_map {
 public:
  /// The common coefficient type of g and f.
  using coefficient_type =
      typename chain_map_detail::common_coefficient<chain_map_coefficient_t<G>, chain_map_coefficient_t<F>>::type;
  /// g after f.
  composed_map(G g, F f) : g_(std::move(g)), f_(std::move(f)) {}
  /// g(f(cell i of dimension k)).
  std::vector<chain_term<coefficient_type>> image(int k, std::size_t i) const {
    using T = coefficient_type;
    std::map<std::size_t, T> acc;
    for (auto&& t : f_.image(k, i))
      for (auto&& u : g_.image(k, static_cast<std::size_t>(t.cell))) {
        auto& slot = acc.try_emplace(static_cast<std::size_t>(u.cell), chain_map_detail::convert<T>(0)).first->second;
        slot = chain_map_detail::add(slot, chain_map_detail::mul(chain_map_detail::convert<T>(u.coefficient),
                                                                 chain_map_detail::convert<T>(t.coefficient)));
      }
    return chain_map_detail::collect(acc);
  }

 private:
  G g_;
  F f_;
};

/// f + g (maps between the same complexes), evaluated on each image() call.
template <chain_map F, chain_map G>
class sum_map {
 public:
  /// The common coefficient type of f and g.
  using coefficient_type =
      typename chain_map_detail::common_coefficient<chain_map_coefficient_t<F>, chain_map_coefficient_t<G>>::type;
  /// f + g.
  sum_map(F f, G g) : f_(std::move(f)), g_(std::move(g)) {}
  /// f(cell) + g(cell), for cell i of dimension k.
  std::vector<chain_term<coefficient_type>> image(int k, std::size_t i) const {
    using T = coefficient_type;
    std::map<std::size_t, T> acc;
    auto put = [&](auto&& t) {
      auto& slot = acc.try_emplace(static_cast<std::size_t>(t.cell), chain_map_detail::convert<T>(0)).first->second;
      slot = chain_map_detail::add(slot, chain_map_detail::convert<T>(t.coefficient));
    };
    for (auto&& t : f_.image(k, i)) put(t);
    for (auto&& t : g_.image(k, i)) put(t);
    return chain_map_detail::collect(acc);
  }

 private:
  F f_;
  G g_;
};

/// -f.
template <chain_map F>
class negated_map {
 public:
  /// The coefficient type of f (std::int64_t for any integral type).
  using coefficient_type = std::conditional_t<std::integral<chain_map_coefficient_t<F>>, std::int64_t, chain_map_coefficient_t<F>>;
  /// -f.
  explicit negated_map(F f) : f_(std::move(f)) {}
  /// -f(cell), for cell i of dimension k.
  std::vector<chain_term<coefficient_type>> image(int k, std::size_t i) const {
    std::vector<chain_term<coefficient_type>> out;
    for (auto&& t : f_.image(k, i)) {
      const auto c = chain_map_detail::convert<coefficient_type>(t.coefficient);
      if constexpr (std::same_as<coefficient_type, std::int64_t>) {
        if (c == std::numeric_limits<std::int64_t>::min()) throw std::overflow_error("lacuna: a chain map coefficient passes 64 bits");
      }
      out.push_back({static_cast<std::size_t>(t.cell), -c});
    }
    return out;
  }

 private:
  F f_;
};

/// g ∘ f: first f, then g.
template <chain_map G, chain_map F>
composed_map<G, F> compose(G g, F f) {
  return {std::move(g), std::move(f)};
}
/// f + g.
template <chain_map F, chain_map G>
sum_map<F, G> sum(F f, G g) {
  return {std::move(f), std::move(g)};
}
/// -f.
template <chain_map F>
negated_map<F> negated(F f) {
  return negated_map<F>(std::move(f));
}

/// f materialized on the cells of X (so that later evaluations are look-ups).
template <chain_map F, graded_cells C>
explicit_chain_map<chain_map_coefficient_t<F>> materialize(const F& f, const C& X) {
  using T = chain_map_coefficient_t<F>;
  explicit_chain_map<T> out(X);
  for (int k = 0; k <= lacuna::top_dimension(X); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(X, k); ++i) {
      std::vector<chain_term<T>> terms;
      for (auto&& t : f.image(k, i)) terms.push_back({static_cast<std::size_t>(t.cell), t.coefficient});
      out.set(k, i, std::move(terms));
    }
  return out;
}

// ---- the check ∂f = f∂ -------------------------------------------------------------------

/// What check_chain_map found: ok, or the first cell where the map fails and why.
struct chain_map_report {
  /// True if the map commutes with the boundaries everywhere.
  bool ok = true;
  int dimension = -1;     ///< of the failing cell of the source
  std::size_t cell = 0;   ///< its index
  std::string message;    ///< names the cell and what is wrong
  /// ok.
  explicit operator bool() const { return ok; }
};

/// Verifies over R (default: the integers) that f maps the k-cells of X to chains of k-cells
/// of Y and that ∂f = f∂ on every cell; stops at the first failure (lowest dimension, then
/// index) and names it.
template <commutative_ring R = integer, chain_map F, cell_complex X_t, cell_complex Y_t>
chain_map_report check_chain_map(const F& f, const X_t& X, const Y_t& Y, const R& ring_one = one<R>()) {
  auto fail = [&](int k, std::size_t i, const std::string& why) {
    return chain_map_report{false, k, i,
                            "the " + std::to_string(k) + "-cell " + std::to_string(i) + " ('" + lacuna::cell_name(X, k, i) +
                                "'): " + why};
  };
  for (int k = 0; k <= lacuna::top_dimension(X); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(X, k); ++i) {
      chain<R> fi{k, {}};
      for (auto&& t : f.image(k, i)) {
        const auto c = static_cast<std::size_t>(t.cell);
        if (k > lacuna::top_dimension(Y) || c >= lacuna::cell_count(Y, k))
          return fail(k, i, "its image names the " + std::to_string(k) + "-cell " + std::to_string(c) +
                                ", which the target does not have");
        fi.terms.push_back({c, map_coefficient_in<R>(t.coefficient, ring_one)});
      }
      fi.normalize_terms();
      if (k == 0) continue;
      // ∂(f e) in Y.
      chain<R> lhs{k - 1, {}};
      for (const auto& t : fi.terms)
        for (auto&& v : lacuna::boundary(Y, k, t.cell)) {
          const exact_incidence e = as_exact_incidence(v);
          lhs.terms.push_back({e.face, coefficient_in<R>(e.coefficient, ring_one) * t.coefficient});
        }
      lhs.normalize_terms();
      // f(∂e).
      chain<R> de{k - 1, {}};
      for (auto&& v : lacuna::boundary(X, k, i)) {
        const exact_incidence e = as_exact_incidence(v);
        de.terms.push_back({e.face, coefficient_in<R>(e.coefficient, ring_one)});
      }
      de.normalize_terms();
      chain<R> rhs{k - 1, {}};
      for (const auto& t : de.terms)
        for (auto&& u : f.image(k - 1, t.cell))
          rhs.terms.push_back({static_cast<std::size_t>(u.cell), map_coefficient_in<R>(u.coefficient, ring_one) * t.coefficient});
      rhs.normalize_terms();
      if (!(lhs == rhs)) {
        // Name the first face where the two sides differ.
        const chain<R> diff = add_scaled(lhs, -one<R>(), rhs);
        const std::size_t face = diff.terms.front().cell;
        return fail(k, i, "the boundary of its image and the image of its boundary differ on the " +
                              std::to_string(k - 1) + "-cell " + std::to_string(face) + " ('" +
                              lacuna::cell_name(Y, k - 1, face) + "') of the target");
      }
    }
  return {};
}

}  // namespace lacuna

// lacuna/persistence/diagram.hpp — the results of a persistence computation: pairs per
// dimension, the cells that create and destroy them, representatives, and the rank
// invariant (Betti numbers at a value, persistent Betti numbers between two values).
//
// A class of dimension k is born when its creating k-cell enters and dies when its
// destroying (k+1)-cell enters; an essential class never dies. Values are those of the
// filtration, in its own type, compared by its own order (for a superlevel filtration a
// birth is then at least its death). Pairs of persistence zero (born and killed at the same
// value) are kept: without_zero_persistence drops them, as the command-line tool does.
// Within a dimension, pairs are sorted by birth, then by death (essential last), each in the
// order of the filtration, then by the creating and the destroying cell.
#pragma once

#include <lacuna/chain/chain.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <cstddef>
#include <functional>
#include <limits>
#include <numeric>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// No cell: the destroying cell of an essential class.
inline constexpr std::size_t no_cell = std::numeric_limits<std::size_t>::max();

/// One class of a persistence diagram of dimension k: born at `birth` when the k-cell
/// `birth_cell` enters, killed at `*death` when the (k+1)-cell `death_cell` enters, or
/// essential (`death` empty, `death_cell == no_cell`). Cells are indices within their
/// dimension, as in the filtration (lacuna::cell_name names them).
template <class V>
struct persistence_pair {
  /// The value at which the class is born.
  V birth{};
  /// The value at which it dies; empty for an essential class.
  std::optional<V> death{};
  /// The k-cell whose entry creates the class.
  std::size_t birth_cell = 0;
  /// The (k+1)-cell whose entry kills it, no_cell for an essential class.
  std::size_t death_cell = no_cell;

  /// True for a class that never dies.
  bool essential() const noexcept { return !death.has_value(); }
  /// Same values and cells.
  friend bool operator==(const persistence_pair&, const persistence_pair&) = default;
};

/// The pairs of one dimension, with the order of the values they were computed in.
/// V models filtration_value; Order is the filtration's strict weak order on V.
template <class V, class Order = std::less<V>>
struct persistence_diagram {
  /// The dimension k of the classes.
  int dimension = 0;
  /// The classes.
  std::vector<persistence_pair<V>> pairs;
  /// The order of the values.
  Order order{};

  /// The number of classes alive at t: born at t or before, and not dead at t
  /// (birth <= t < death in the order). This is the k-th Betti number of the subcomplex of
  /// the cells entering at t or before. O(pairs).
  std::size_t betti_at(const V& t) const {
    std::size_t n = 0;
    for (const auto& p : pairs)
      if (!order(t, p.birth) && (p.essential() || order(t, *p.death))) ++n;
    return n;
  }
  /// The persistent Betti number between s and t (s at or before t): the rank of the map
  /// H_k(K_s) -> H_k(K_t) induced by inclusion, i.e. the classes born at s or before and
  /// still alive at t. Throws std::invalid_argument if t comes before s. O(pairs).
  std::size_t persistent_betti(const V& s, const V& t) const {
    if (order(t, s)) throw std::invalid_argument("lacuna: persistent Betti number between s and t with t before s");
    std::size_t n = 0;
    for (const auto& p : pairs)
      if (!order(s, p.birth) && (p.essential() || order(t, *p.death))) ++n;
    return n;
  }
  /// The number of essential classes (the k-th Betti number of the whole filtration).
  std::size_t essential_count() const {
    return static_cast<std::size_t>(std::count_if(pairs.begin(), pairs.end(), [](const auto& p) { return p.essential(); }));
  }
  /// Same dimension and pairs (the order objects are not compared).
  friend bool operator==(const persistence_diagram& a, const persistence_diagram& b) {
    return a.dimension == b.dimension && a.pairs == b.pairs;
  }
};

/// The result of lacuna::persistence: diagrams of dimensions 0..max_dimension(), and, when
/// representatives were asked for, one cycle over the field R per pair
/// (representatives[k][j] belongs to diagrams[k].pairs[j]): a k-cycle of the cells entering
/// up to the creating cell, with the creating cell in it, that is not a boundary before the
/// destroying cell enters and is one once it has (never, for an essential class).
template <class V, class R, class Order = std::less<V>>
struct persistence_result {
  /// diagrams[k]: the diagram of dimension k.
  std::vector<persistence_diagram<V, Order>> diagrams;
  /// representatives[k][j] for diagrams[k].pairs[j]; empty unless asked for.
  std::vector<std::vector<chain<R>>> representatives;
  /// The order of the values.
  Order order{};

  /// The diagram of dimension k (std::out_of_range outside 0..max_dimension()).
  const persistence_diagram<V, Order>& operator[](int k) const { return diagrams.at(static_cast<std::size_t>(k)); }
  /// The highest dimension with a diagram; -1 when there is none (an empty filtration).
  int max_dimension() const noexcept { return static_cast<int>(diagrams.size()) - 1; }
  /// True when representatives were computed.
  bool has_representatives() const noexcept { return !representatives.empty(); }

  /// The k-th Betti number of the subcomplex at t (see persistence_diagram::betti_at);
  /// 0 for a dimension without a diagram.
  std::size_t betti_number(int k, const V& t) const {
    return k < 0 || k > max_dimension() ? 0 : diagrams[static_cast<std::size_t>(k)].betti_at(t);
  }
  /// All Betti numbers at t, dimensions 0..max_dimension().
  std::vector<std::size_t> betti_numbers(const V& t) const {
    std::vector<std::size_t> out;
    for (const auto& d : diagrams) out.push_back(d.betti_at(t));
    return out;
  }
  /// The persistent Betti number of dimension k between s and t (s at or before t).
  std::size_t persistent_betti_number(int k, const V& s, const V& t) const {
    return k < 0 || k > max_dimension() ? 0 : diagrams[static_cast<std::size_t>(k)].persistent_betti(s, t);
  }
};

namespace detail {

/// a before b in the order of persistence pairs (see the file comment).
template <class V, class Order>
bool pair_before(const persistence_pair<V>& a, const persistence_pair<V>& b, const Order& order) {
  if (order(a.birth, b.birth)) return true;
  if (order(b.birth, a.birth)) return false;
  if (a.essential() != b.essential()) return b.essential();
  if (!a.essential()) {
    if (order(*a.death, *b.death)) return true;
    if (order(*b.death, *a.death)) return false;
  }
  if (a.birth_cell != b.birth_cell) return a.birth_cell < b.birth_cell;
  return a.death_cell < b.death_cell;
}

/// Sorts the pairs of every diagram (see the file comment), and the representatives with them.
template <class V, class R, class Order>
void sort_pairs(persistence_result<V, R, Order>& r) {
  for (std::size_t k = 0; k < r.diagrams.size(); ++k) {
    auto& pairs = r.diagrams[k].pairs;
    if (k >= r.representatives.size() || r.representatives[k].empty()) {
      std::sort(pairs.begin(), pairs.end(), [&](const auto& a, const auto& b) { return pair_before(a, b, r.order); });
      continue;
    }
    std::vector<std::size_t> perm(pairs.size());
    std::iota(perm.begin(), perm.end(), std::size_t{0});
    std::sort(perm.begin(), perm.end(),
              [&](std::size_t a, std::size_t b) { return pair_before(pairs[a], pairs[b], r.order); });
    std::vector<persistence_pair<V>> sorted;
    sorted.reserve(pairs.size());
    for (std::size_t j : perm) sorted.push_back(std::move(pairs[j]));
    pairs = std::move(sorted);
    auto& reps = r.representatives[k];
    std::vector<chain<R>> sorted_reps;
    sorted_reps.reserve(reps.size());
    for (std::size_t j : perm) sorted_reps.push_back(std::move(reps[j]));
    reps = std::move(sorted_reps);
  }
}

template <class V, class R, class Order, class Keep>
persistence_result<V, R, Order> filter_pairs(persistence_result<V, R, Order> r, Keep keep) {
  for (std::size_t k = 0; k < r.diagrams.size(); ++k) {
    auto& pairs = r.diagrams[k].pairs;
    const bool reps = k < r.representatives.size() && r.representatives[k].size() == pairs.size();
    std::size_t out = 0;
    for (std::size_t j = 0; j < pairs.size(); ++j) {
      if (!keep(pairs[j])) continue;
      if (out != j) {
        pairs[out] = std::move(pairs[j]);
        if (reps) r.representatives[k][out] = std::move(r.representatives[k][j]);
      }
      ++out;
    }
    pairs.resize(out);
    if (reps) r.representatives[k].resize(out);
  }
  return r;
}

}  // namespace detail

/// True for a pair born and killed at the same value (neither comes before the other).
template <class V, class Order>
bool has_zero_persistence(const persistence_pair<V>& p, const Order& order) {
  return !p.essential() && !order(p.birth, *p.death) && !order(*p.death, p.birth);
}

/// The result without its pairs of persistence zero (and their representatives). The Betti
/// numbers at every value are unchanged.
template <class V, class R, class Order>
persistence_result<V, R, Order> without_zero_persistence(persistence_result<V, R, Order> r) {
  const Order order = r.order;
  return detail::filter_pairs(std::move(r), [&](const persistence_pair<V>& p) { return !has_zero_persistence(p, order); });
}

/// The result for the cells entering at `last` or before it (in the order of the
/// filtration): pairs born after `last` are dropped, and a class still alive at `last`
/// becomes essential (its destroying cell is forgotten; its representative stays valid).
/// This is exactly the persistence of the filtration cut at `last`.
template <class V, class R, class Order>
persistence_result<V, R, Order> up_to(persistence_result<V, R, Order> r, const V& last) {
  const Order order = r.order;
  r = detail::filter_pairs(std::move(r), [&](const persistence_pair<V>& p) { return !order(last, p.birth); });
  for (auto& d : r.diagrams)
    for (auto& p : d.pairs)
      if (!p.essential() && order(last, *p.death)) {
        p.death.reset();
        p.death_cell = no_cell;
      }
  detail::sort_pairs(r);
  return r;
}

}  // namespace lacuna

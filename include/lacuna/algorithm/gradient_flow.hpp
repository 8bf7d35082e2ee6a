// lacuna/algorithm/gradient_flow.hpp — the flow of a chain along the paths of a discrete
// gradient: the one routine behind the chain maps of both Morse complexes
// (algorithm/morse_reduction.hpp, any complex; algorithm/cubical_morse.hpp, images and
// volumes, whose gradient is never stored).
//
// The method (Forman 1998; as chain maps, Sköldberg 2006 and Jöllenbeck & Welker 2009): a
// chain is a set of pending coefficients on k-cells. The pending cells are taken by
// decreasing priority, which strictly falls along every gradient path x -> V(x) -> x', so
// every contribution to a cell has arrived when the cell is taken. A cell x taken with
// coefficient c != 0 is reached (reached(x, c)); if the gradient pairs it with a coface u
// (incidence [u:x] = ±1), c flows on: w = −c / [u:x] goes through u (through(u, w)) and
// w·[u:f] is added to every other face f of u. lift (g) and project (f) of a Morse complex
// differ only in what they keep of `reached` and `through`.
#pragma once

#include <lacuna/chain/run_control.hpp>
#include <lacuna/ring/concepts.hpp>

#include <algorithm>
#include <concepts>
#include <cstdint>
#include <stdexcept>
#include <type_traits>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna {

/// A discrete gradient that gradient_flow can follow, cells named by `typename G::cell_type`:
///   priority(x)              strictly falls along a gradient path (x, its partner u, a face of u);
///   paired_up(x, u)          the incidence [u:x] (+1 or −1) when x is paired with a coface u, else 0;
///   for_each_face(u, f)      f(face, incidence) for every face of u.
/// A gradient whose cells are unsigned integers equal to their own priority may say so with
/// `static constexpr bool priority_is_cell = true;` (the flow then keeps a smaller heap).
template <class G>
concept discrete_gradient = requires(const G& g, typename G::cell_type x, typename G::cell_type& up) {
  { g.priority(x) } -> std::convertible_to<std::uint64_t>;
  { g.paired_up(x, up) } -> std::convertible_to<int>;
  g.for_each_face(x, [](typename G::cell_type, std::int64_t) {});
};

/// Flows the chain that `seed(add)` puts in — add(cell, coefficient) — along the gradient g,
/// as described at the top of this header. R models commutative_ring; `ring_one` is its one
/// (rings with a run-time modulus). The stop request of `control` (may be null) is looked at
/// every 4096 steps. Throws std::logic_error when a face of a partner does not have a lower
/// priority than the cell it came from (the matching is not acyclic).
/// Cost: O(m log m) ring operations, m the cells of the paths met.
template <class R, discrete_gradient G, class Seed, class Reached, class Through>
void gradient_flow(const G& g, const R& ring_one, Seed&& seed, Reached&& reached, Through&& through,
                   const run_control* control = nullptr) {
  using cell = typename G::cell_type;
  // A cell that is its own priority (G::priority_is_cell) goes on the heap as it is; else
  // (priority, cell), ordered by priority first.
  constexpr bool bare = requires { requires G::priority_is_cell; };
  using heap_entry = std::conditional_t<bare, cell, std::pair<std::uint64_t, cell>>;
  const R zero_r = zero<R>() * ring_one;
  std::unordered_map<cell, R> pending;
  std::vector<heap_entry> heap;  // the largest priority on top
  auto add = [&](cell f, const R& v) {
    auto [p, fresh] = pending.try_emplace(f, v);
    if (fresh) {
      if constexpr (bare)
        heap.push_back(f);
      else
        heap.push_back({static_cast<std::uint64_t>(g.priority(f)), f});
      std::push_heap(heap.begin(), heap.end());
    } else {
      p->second += v;
    }
  };
  seed(add);
  std::uint64_t steps = 0;
  while (!heap.empty()) {
    if (control && (++steps & 4095U) == 0) control->check();
    std::pop_heap(heap.begin(), heap.end());
    std::uint64_t from;
    cell x;
    if constexpr (bare)
      x = heap.back(), from = static_cast<std::uint64_t>(g.priority(x));
    else
      from = heap.back().first, x = heap.back().second;
    heap.pop_back();
    auto node = pending.extract(x);
    const R c = std::move(node.mapped());
    if (c == zero_r) continue;
    reached(x, c);
    cell up{};
    const int sign = static_cast<int>(g.paired_up(x, up));
    if (sign == 0) continue;  // critical or paired with a face: the path ends here
    const R w = sign > 0 ? R(-c) : c;  // −c / [u:x], [u:x] = ±1
    through(up, w);
    g.for_each_face(up, [&](cell f, std::int64_t incidence) {
      if (f == x) return;
      if (static_cast<std::uint64_t>(g.priority(f)) >= from)
        throw std::logic_error("lacuna: gradient_flow: the matching is not acyclic");
      add(f, w * (from_integer<R>(incidence) * ring_one));
    });
  }
}

}  // namespace lacuna

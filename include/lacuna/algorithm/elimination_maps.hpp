// lacuna/algorithm/elimination_maps.hpp — the chain maps between a complex and the complex
// left by eliminate_unit_pivots, read off the elimination log.
//
// For one pivot (a, b), c = <da, b> (Kaczynski, Mrozek & Slusarek 1998):
//   lift  g: reduced -> original,   g(y) = y - c^-1 <dy, b> a      for y a cell beside a;
//   push  f: original -> reduced,   f(z) = z - <z, b> c^-1 da      for z a cell beside b,
//                                   f(a) = 0.
// Both are chain maps inducing inverse isomorphisms on homology; g sends cycles of the
// reduced complex to cycles of the original one, f sends cycles and boundaries to cycles
// and boundaries. The composite maps run the log backwards (g) or forwards (f).
#pragma once

#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/run_control.hpp>

#include <cstdint>
#include <limits>
#include <optional>
#include <unordered_map>
#include <vector>

namespace lacuna {

/// A chain at one level of a elimination_workspace: (local index, coefficient) pairs.
template <class R>
using level_chain = std::vector<sparse_entry<R>>;

namespace detail {

/// What one step of the log does in a backward sweep: the entries (x, w) to read, the cell
/// `skip` among them left out, and the cell `target` that receives −c⁻¹ Σ w·v(x).
template <class R>
struct sweep_action {
  const sparse_entry<R>* first;
  const sparse_entry<R>* last;
  std::uint32_t skip, target;
};

/// The backward sweep of lift_chains and pull_cochains: `vectors` (chains or cochains of one
/// level of level_size cells) are kept as one linked list of (vector, value) per cell; the
/// steps of the log run last first, and for each one `action(step)` returns (an optional
/// sweep_action), each vector's Σ w·v(x) over the entries is taken and −c⁻¹ times it added at
/// the target cell. Cost: proportional to the entries read times the vectors meeting them.
/// The results are sorted by index, without zeros; the stop request is checked every 4096
/// steps.
template <class R, class Action>
std::vector<level_chain<R>> sweep_log_backwards(const elimination_log<R>& log, std::size_t level_size,
                                                const std::vector<level_chain<R>>& vectors,
                                                const run_control* control, Action&& action) {
  constexpr std::uint32_t none = std::numeric_limits<std::uint32_t>::max();
  struct node {
    std::uint32_t vector;
    R value;
    std::uint32_t next;
  };
  std::vector<std::uint32_t> head(level_size, none);
  std::vector<node> nodes;
  for (std::uint32_t g = 0; g < vectors.size(); ++g)
    for (const auto& e : vectors[g]) {
      nodes.push_back({g, e.value, head[e.index]});
      head[e.index] = static_cast<std::uint32_t>(nodes.size() - 1);
    }
  std::vector<R> acc(vectors.size(), zero<R>());
  std::vector<std::uint32_t> touched;
  std::size_t seen = 0;
  for (auto s = log.steps.rbegin(); s != log.steps.rend(); ++s) {
    if (control && (++seen & 4095) == 0) control->check();
    const std::optional<sweep_action<R>> act = action(*s);
    if (!act) continue;
    touched.clear();
    for (const sparse_entry<R>* e = act->first; e != act->last; ++e) {
      if (e->index == act->skip) continue;
      for (std::uint32_t n = head[e->index]; n != none; n = nodes[n].next) {
        if (acc[nodes[n].vector] == zero<R>()) touched.push_back(nodes[n].vector);
        acc[nodes[n].vector] += nodes[n].value * e->value;
      }
    }
    for (std::uint32_t g : touched) {
      const R t = acc[g];
      acc[g] = zero<R>();
      if (t == zero<R>()) continue;
      nodes.push_back({g, -(s->c_inverse * t), head[act->target]});
      head[act->target] = static_cast<std::uint32_t>(nodes.size() - 1);
    }
  }
  std::vector<level_chain<R>> out(vectors.size());
  for (std::uint32_t i = 0; i < level_size; ++i)
    for (std::uint32_t n = head[i]; n != none; n = nodes[n].next) {
      auto& ch = out[nodes[n].vector];
      if (!ch.empty() && ch.back().index == i)
        ch.back().value += nodes[n].value;
      else
        ch.push_back({i, nodes[n].value});
    }
  for (auto& ch : out) std::erase_if(ch, [](const auto& e) { return e.value == zero<R>(); });
  return out;
}

}  // namespace detail

/// Lifts chains of the reduced complex at `level` (cells surviving the elimination) to
/// chains of the original complex, all at once: g applied to each. level_size is the number
/// of cells of that level in the original complex. Cost: proportional to the log of that
/// level times the number of chains meeting each step, not to the number of chains times
/// the log. Each result is sorted by index. A control's stop request is checked every 4096
/// steps (safe from any thread; its progress callback is not called).
template <class R>
std::vector<level_chain<R>> lift_chains(const elimination_log<R>& log, int level, std::size_t level_size,
                                        const std::vector<level_chain<R>>& chains,
                                        const run_control* control = nullptr) {
  // g(y) = y − c⁻¹ <dy, b> a for the pivots (a, b) of this level, last first: read the
  // cofaces y of b (log.affected holds (y, <dy, b>)), add at a
  constexpr std::uint32_t nothing = std::numeric_limits<std::uint32_t>::max();
  return detail::sweep_log_backwards(log, level_size, chains, control,
                                     [&](const elimination_step<R>& s) -> std::optional<detail::sweep_action<R>> {
                                       if (s.level != level) return std::nullopt;
                                       return detail::sweep_action<R>{log.affected.data() + s.affected_begin,
                                                                      log.affected.data() + s.affected_end, nothing, s.a};
                                     });
}

/// Pulls cochains of the reduced complex at `level` (values on surviving cells) back to
/// cochains of the original complex, all at once: φ ↦ φ∘f, the transpose of push_chain, so
/// (pull φ)(z) = φ(push z) for every chain z. Since f is a chain map, a cocycle pulls back to
/// a cocycle, and φ(f(g(y))) = φ(y) for a lifted chain g(y). For one pivot (a, b) of the
/// level above, f(b) = −c⁻¹(∂a − c·b), so the pulled value at b is −c⁻¹ Σ_{x≠b} <∂a, x> φ(x),
/// and f(a) = 0 for a pivot of this level (a's value stays zero): the log is run backwards
/// and only the steps whose b lives at `level` act. Needs the pivot columns in the log
/// (elimination_options::record_pivots). Cost and result as lift_chains (each cochain is a
/// level_chain of its non-zero values, sorted by index).
template <class R>
std::vector<level_chain<R>> pull_cochains(const elimination_log<R>& log, int level, std::size_t level_size,
                                          const std::vector<level_chain<R>>& cochains,
                                          const run_control* control = nullptr) {
  // read ∂a (log.pivot) without b, add at b
  return detail::sweep_log_backwards(log, level_size, cochains, control,
                                     [&](const elimination_step<R>& s) -> std::optional<detail::sweep_action<R>> {
                                       if (s.level != level + 1) return std::nullopt;
                                       return detail::sweep_action<R>{log.pivot.data() + s.pivot_begin,
                                                                      log.pivot.data() + s.pivot_end, s.b, s.b};
                                     });
}

/// Pushes a chain of the original complex at `level` to the reduced complex: f applied to
/// it. The result is supported on the surviving cells, sorted by index.
template <class R>
level_chain<R> push_chain(const elimination_log<R>& log, int level, const level_chain<R>& chain) {
  std::unordered_map<std::uint32_t, R> w;
  for (const auto& e : chain) w[e.index] += e.value;
  for (const auto& s : log.steps) {
    if (s.level == level + 1) {  // b lives at this level
      auto it = w.find(s.b);
      if (it == w.end() || it->second == zero<R>()) continue;
      const R t = it->second * s.c_inverse;
      for (std::size_t k = s.pivot_begin; k < s.pivot_end; ++k) w[log.pivot[k].index] -= t * log.pivot[k].value;
      w.erase(s.b);
    } else if (s.level == level) {  // a lives at this level
      w.erase(s.a);
    }
  }
  level_chain<R> out;
  for (const auto& [i, v] : w)
    if (!(v == zero<R>())) out.push_back({i, v});
  std::sort(out.begin(), out.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
  return out;
}

}  // namespace lacuna

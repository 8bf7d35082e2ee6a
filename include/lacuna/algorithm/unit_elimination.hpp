// lacuna/algorithm/unit_elimination.hpp — sparse elimination of unit pivots on a chain
// complex, keeping the maps back on request.
//
// A pivot is a pair (a, b): a a cell, b a face of a whose incidence c = <da, b> is a unit.
// Eliminating it replaces the complex by a smaller chain-homotopy-equivalent one (Kaczynski,
// Mrozek & Slusarek, "Homology computation by reduction of chain complexes", 1998):
//   for every other coface y of b:  dy <- dy - <dy,b> c^-1 da     (b drops out of dy)
//   for every coface x of a:        a drops out of dx
// and a, b disappear. The order of pivots decides the fill-in:
//   1. zero-fill pivots first: coreductions (a has exactly one active face; Mrozek & Batko,
//      "Coreduction homology algorithm", 2009) and collapses (b has a single coface);
//   2. when none is left, a cell with no active face is set aside as critical (it stays in
//      the reduced complex), which is what starts the coreductions of the next piece;
//   3. without set-aside, the unit pivot of least Markowitz count (|cofaces(b)|-1)(|da|-1)
//      (Markowitz, 1957; as used for sparse integer matrices by Dumas, Heckenbach, Saunders
//      & Welker, 2003).
// Critical cells are cells never used as pivots; their boundaries are updated like any
// other, so at the end the surviving cells with their boundaries are the reduced complex.
//
// The log (on request) records each pivot, the boundary of a at that moment, and the pairs
// (y, <dy, b>); it is what maps chains between the original and the reduced complex
// (lacuna/algorithm/elimination_maps.hpp).
#pragma once

#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <algorithm>
#include <concepts>
#include <cstdint>
#include <optional>
#include <tuple>
#include <vector>

namespace lacuna {

/// Options of eliminate_unit_pivots (designated initializers welcome).
struct elimination_options {
  bool coreductions = true;  ///< pivots found from a cell with a single active face
  bool collapses = true;     ///< pivots found from a face with a single coface
  bool set_aside = true;     ///< when stuck, set aside a cell with no active face as critical
  bool markowitz = true;     ///< then unit pivots of least Markowitz count
  bool record = false;       ///< keep the log (needed for generators and chain maps)
  bool record_pivots = true; ///< with the log: also each pivot's boundary (needed to push chains)
  bool second_pass = true;   ///< after set-aside, reduce the critical cells once more (Markowitz)
  /// Before starting, make the cells an earlier elimination set aside as critical active
  /// again (a later stage of a pipeline reducing what an earlier one left; the coface lists
  /// an elimination leaves behind are exact for every surviving cell, so this is sound).
  bool revive_critical = false;
  /// Stop request and progress (phase "eliminating unit pivots", units: cells); may be null.
  const run_control* control = nullptr;
};

/// One eliminated pivot: a at `level`, b at level-1, c = <da, b> a unit.
template <class R>
struct elimination_step {
  /// The level of a.
  int level;
  ///@{
  /// The eliminated cell a (at level) and its face b (at level-1), by their indices.
  std::uint32_t a, b;
  ///@}
  ///@{
  /// The unit c = <da, b> and its inverse.
  R c, c_inverse;
  ///@}
  ///@{
  /// This pivot's entries [affected_begin, affected_end) of elimination_log::affected.
  std::size_t affected_begin, affected_end;  ///< log.affected: (y, <dy, b>) for the other cofaces y of b
  ///@}
  ///@{
  /// This pivot's entries [pivot_begin, pivot_end) of elimination_log::pivot.
  std::size_t pivot_begin, pivot_end;        ///< log.pivot: da at the time, b included
  ///@}
};

/// The record of an elimination, in order.
template <class R>
struct elimination_log {
  /// The pivots, in the order they were eliminated.
  std::vector<elimination_step<R>> steps;
  /// The entries that elimination_step::affected_begin and affected_end delimit.
  std::vector<sparse_entry<R>> affected;
  /// The entries that elimination_step::pivot_begin and pivot_end delimit.
  std::vector<sparse_entry<R>> pivot;
  /// Set by the caller before an elimination: whether the steps also record each pivot's
  /// boundary (`pivot`; needed to push chains into the reduced complex, e.g. for coordinates).
  /// The reduction stages of algorithm/stages.hpp pass it on as
  /// elimination_options::record_pivots.
  bool pivots_wanted = true;
};

/// Counts of what an elimination did, per kind of pivot.
struct elimination_statistics {
  ///@{
  /// Pivots found by coreductions, by collapses, by Markowitz counts, and cells set aside.
  std::size_t coreductions = 0, collapses = 0, markowitz = 0, set_aside = 0;
  ///@}
};

/// A unit pivot the elimination may take next: cell a at `level` with its face b, and the
/// counts a pivot rule weighs (what eliminating it can fill in).
struct pivot_candidate {
  /// The level of a (b lies at level - 1).
  int level;
  ///@{
  /// The cell a and its face b, by their indices at their levels.
  std::uint32_t a, b;
  ///@}
  /// The active faces of a (b included).
  std::uint64_t faces_of_a;
  /// The cofaces of b (a included).
  std::uint64_t cofaces_of_b;
};

/// The open stage "pivot rule" of the elimination: a cost per candidate unit pivot; the
/// elimination takes candidates by increasing cost (ties by level, a, b) once the zero-fill
/// pivots are exhausted. Any type with `cost(const pivot_candidate&)` returning an unsigned
/// number models it; the rule only orders pivots, so every rule gives the same groups.
template <class P>
concept pivot_rule = requires(const P& p, const pivot_candidate& c) {
  { p.cost(c) } -> std::convertible_to<std::uint64_t>;
};

/// The default pivot rule: the Markowitz count (|cofaces(b)| − 1)(|faces(a)| − 1), an upper
/// bound of the fill-in of the pivot (Markowitz 1957; for sparse integer matrices Dumas,
/// Heckenbach, Saunders & Welker 2003).
struct markowitz_rule {
  /// The Markowitz count of the candidate.
  std::uint64_t cost(const pivot_candidate& c) const {
    return (c.cofaces_of_b - 1) * (c.faces_of_a > 0 ? c.faces_of_a - 1 : 0);
  }
};

namespace detail {

/// true when c is a unit of R; then inv is its inverse.
template <class R>
bool unit_inverse(const R& c, R& inv) {
  if constexpr (std::same_as<R, checked_int64>) {
    if (c.v == 1 || c.v == -1) {
      inv = c;
      return true;
    }
    return false;
  } else if constexpr (field<R>) {
    if (c == zero<R>()) return false;
    inv = lacuna::inverse(c);
    return true;
  } else if constexpr (euclidean_domain<R>) {
    if (c == zero<R>() || !lacuna::is_unit(c)) return false;
    inv = div_rem(one<R>(), c).quotient;
    return true;
  } else {
    if (c == one<R>() || c == -one<R>()) {
      inv = c;
      return true;
    }
    return false;
  }
}

template <class R, class Rule = markowitz_rule>
class unit_eliminator {
  using st = typename elimination_workspace<R>::state;

 public:
  unit_eliminator(elimination_workspace<R>& rc, const elimination_options& opt, elimination_log<R>* log,
                  const Rule& rule = {})
      : rc_(rc), opt_(opt), log_(log), rule_(rule), ticker_(opt.control, "eliminating unit pivots", total_cells(rc),
                                                              eliminated_cells(rc, opt.control)) {}

  elimination_statistics run() {
    const int nl = rc_.levels();
    // The log's arrays are reserved at once, so that they are not copied while they grow (at
    // the last doubling an array holds 3 times its size, and keeps up to twice it): a pivot
    // takes two cells, so a fresh log has at most half the cells as steps; the boundaries
    // recorded are those of the pivots' cells, as many entries as the boundaries hold in all
    // while the elimination fills nothing in (grown by a quarter when it does: record_pivot).
    if (log_ && log_->steps.empty()) {
      log_->steps.reserve(static_cast<std::size_t>(total_cells(rc_) / 2));
      if (opt_.record_pivots && log_->pivot.empty()) {
        std::size_t entries = 0;
        for (int L = 1; L < nl; ++L)
          for (std::uint32_t i = 0; i < rc_.size(L); ++i) entries += rc_.boundary(L, i).size();
        log_->pivot.reserve(entries);
      }
    }
    active_count_.resize(static_cast<std::size_t>(nl));
    empty_.resize(static_cast<std::size_t>(nl));
    for (int L = 0; L < nl; ++L) {
      active_count_[static_cast<std::size_t>(L)].resize(rc_.size(L));
      for (std::uint32_t i = 0; i < rc_.size(L); ++i) {
        if (!rc_.alive(L, i)) continue;
        recount(L, i);
        consider(L, i);
      }
    }
    loop(opt_.set_aside);
    if (opt_.set_aside && opt_.second_pass && opt_.markowitz) {
      // Give the critical cells back to the pivot search: what is left has no unit pivot.
      for (int L = 0; L < nl; ++L)
        for (std::uint32_t i = 0; i < rc_.size(L); ++i)
          if (rc_.cell_state(L, i) == st::critical) rc_.cell_state(L, i) = st::active;
      rebuild_cofaces();
      for (int L = 0; L < nl; ++L)
        for (std::uint32_t i = 0; i < rc_.size(L); ++i)
          if (rc_.alive(L, i)) recount(L, i), consider(L, i);
      loop(false);
    }
    rebuild_cofaces();
    ticker_.finish();
    return stats_;
  }

 private:
  // Coface lists are kept for active cells only while eliminating (a critical cell is never
  // a pivot, and a set-aside vertex would otherwise collect every edge of a coreduction
  // front). The reduced complex gets exact lists for all surviving cells here.
  void rebuild_cofaces() {
    for (int L = 0; L < rc_.levels(); ++L)
      for (std::uint32_t i = 0; i < rc_.size(L); ++i)
        if (rc_.alive(L, i)) rc_.clear_cofaces(L, i);
    for (int L = 1; L < rc_.levels(); ++L)
      for (std::uint32_t i = 0; i < rc_.size(L); ++i)
        if (rc_.alive(L, i))
          for (const auto& e : rc_.boundary(L, i)) rc_.add_coface(L - 1, e.index, i);
  }
  bool critical(int L, std::uint32_t i) const { return rc_.cell_state(L, i) == st::critical; }
  static std::uint64_t total_cells(const elimination_workspace<R>& rc) {
    std::uint64_t n = 0;
    for (int L = 0; L < rc.levels(); ++L) n += rc.size(L);
    return n;
  }
  // Cells an earlier elimination removed (its progress counted them), when progress is
  // reported: a later stage of a pipeline continues the count instead of starting at zero.
  static std::uint64_t eliminated_cells(const elimination_workspace<R>& rc, const run_control* control) {
    if (!control || !control->progress) return 0;
    std::uint64_t n = 0;
    for (int L = 0; L < rc.levels(); ++L)
      for (std::uint32_t i = 0; i < rc.size(L); ++i) n += rc.cell_state(L, i) == st::eliminated;
    return n;
  }

  void recount(int L, std::uint32_t i) {
    std::uint32_t n = 0;
    if (L > 0)
      for (const auto& e : rc_.boundary(L, i))
        if (rc_.cell_state(L - 1, e.index) == st::active) ++n;
    active_count_[static_cast<std::size_t>(L)][i] = n;
  }
  void consider(int L, std::uint32_t i) {
    if (rc_.cell_state(L, i) != st::active) return;
    const auto n = active_count_[static_cast<std::size_t>(L)][i];
    if (n == 1 && opt_.coreductions) push_candidate(L, i);
    if (n == 0 && opt_.set_aside) empty_[static_cast<std::size_t>(L)].push_back(i);
    if (opt_.collapses && L + 1 < rc_.levels() && rc_.cofaces(L, i).size() == 1) push_candidate(L, i);
  }

  void loop(bool set_aside) {
    for (;;) {
      drain();
      if (set_aside && set_aside_one()) continue;
      if (opt_.markowitz && markowitz_batch()) continue;
      break;
    }
  }

  // A coreduction with i as a, or a collapse with i as b, when one applies.
  void try_zero_fill(int L, std::uint32_t i) {
    if (rc_.cell_state(L, i) != st::active) return;
    if (opt_.coreductions && L > 0 && active_count_[static_cast<std::size_t>(L)][i] == 1) {
      for (const auto& e : rc_.boundary(L, i)) {
        if (rc_.cell_state(L - 1, e.index) != st::active) continue;
        R inv;
        if (unit_inverse(e.value, inv)) {
          eliminate(L, i, e.index, e.value, inv);
          ++stats_.coreductions;
          return;
        }
        break;
      }
    }
    if (opt_.collapses && L + 1 < rc_.levels() && rc_.cofaces(L, i).size() == 1) {
      const std::uint32_t a = rc_.cofaces(L, i)[0];
      if (rc_.cell_state(L + 1, a) != st::active) return;
      const R c = coefficient(L + 1, a, i);
      R inv;
      if (unit_inverse(c, inv)) {
        eliminate(L + 1, a, i, c, inv);
        ++stats_.collapses;
      }
    }
  }

  // Order of the zero-fill candidates. Below the top level, first in, first out: a
  // breadth-first reduction, whose gradient paths (and so the lifted generators of H_k,
  // k < top) stay short. At the top level, where every top generator is a whole
  // fundamental class anyway, last in, first out: the reduction walks through neighbouring
  // cells, which lie close together in memory (on a 1024x1024 torus the top level ran 3x
  // faster than breadth first).
  void push_candidate(int L, std::uint32_t i) {
    if (L + 1 == rc_.levels())
      stack_.push_back(i);
    else
      queue_.push_back({L, i});
  }
  void drain() {
    for (;;) {
      if (head_ < queue_.size()) {
        auto [L, i] = queue_[head_++];
        try_zero_fill(L, i);
      } else if (!stack_.empty()) {
        const std::uint32_t i = stack_.back();
        stack_.pop_back();
        try_zero_fill(rc_.levels() - 1, i);
      } else {
        break;
      }
    }
    queue_.clear();
    head_ = 0;
  }

  bool set_aside_one() {
    for (int L = 0; L < rc_.levels(); ++L) {
      auto& stack = empty_[static_cast<std::size_t>(L)];
      while (!stack.empty()) {
        const std::uint32_t s = stack.back();
        stack.pop_back();
        if (rc_.cell_state(L, s) != st::active || active_count_[static_cast<std::size_t>(L)][s] != 0) continue;
        rc_.cell_state(L, s) = st::critical;
        ++stats_.set_aside;
        if (L + 1 < rc_.levels())
          for (std::uint32_t x : rc_.cofaces(L, s)) {
            --active_count_[static_cast<std::size_t>(L + 1)][x];
            consider(L + 1, x);
          }
        rc_.release_cofaces(L, s);
        return true;
      }
    }
    return false;
  }

  bool markowitz_batch() {
    struct cand {
      std::uint64_t cost;
      int L;
      std::uint32_t a, b;
    };
    std::vector<cand> cands;
    if (opt_.control) opt_.control->check();
    for (int L = 1; L < rc_.levels(); ++L)
      for (std::uint32_t a = 0; a < rc_.size(L); ++a) {
        if (rc_.cell_state(L, a) != st::active) continue;
        for (const auto& e : rc_.boundary(L, a)) {
          if (rc_.cell_state(L - 1, e.index) != st::active) continue;
          R inv;
          if (!unit_inverse(e.value, inv)) continue;
          cands.push_back({cost(L, a, e.index), L, a, e.index});
        }
      }
    if (cands.empty()) return false;
    std::sort(cands.begin(), cands.end(), [](const cand& x, const cand& y) {
      return std::tie(x.cost, x.L, x.a, x.b) < std::tie(y.cost, y.L, y.a, y.b);
    });
    bool any = false;
    for (const auto& cd : cands) {
      if (rc_.cell_state(cd.L, cd.a) != st::active || rc_.cell_state(cd.L - 1, cd.b) != st::active) continue;
      const R c = coefficient(cd.L, cd.a, cd.b);
      R inv;
      if (!unit_inverse(c, inv)) continue;
      if (any && cost(cd.L, cd.a, cd.b) > cd.cost) continue;  // grew since the scan: rescan later
      eliminate(cd.L, cd.a, cd.b, c, inv);
      ++stats_.markowitz;
      any = true;
      // Zero-fill pivots made possible by this one go first.
      drain();
    }
    return any;
  }

  std::uint64_t cost(int L, std::uint32_t a, std::uint32_t b) const {
    return static_cast<std::uint64_t>(rule_.cost(
        pivot_candidate{L, a, b, active_count_[static_cast<std::size_t>(L)][a], rc_.cofaces(L - 1, b).size()}));
  }

  R coefficient(int L, std::uint32_t a, std::uint32_t b) const {
    const auto& col = rc_.boundary(L, a);
    auto it = std::lower_bound(col.begin(), col.end(), b, [](const auto& e, std::uint32_t x) { return e.index < x; });
    return it != col.end() && it->index == b ? it->value : zero<R>();
  }

  // Eliminates the pivot (a at level L, b at level L-1), c = <da, b>, inv = c^-1.
  void eliminate(int L, std::uint32_t a, std::uint32_t b, const R& c, const R& inv) {
    ticker_(2);
    // Copies: the boundary and coface storage may move while other cells change.
    const auto da_span = rc_.boundary(L, a);
    pivot_.assign(da_span.begin(), da_span.end());
    const auto yb = rc_.cofaces(L - 1, b);
    ys_.assign(yb.begin(), yb.end());
    rc_.release_cofaces(L - 1, b);
    if (log_) {
      log_->steps.push_back({L, a, b, c, inv, log_->affected.size(), 0, log_->pivot.size(), 0});
      if (opt_.record_pivots) {
        auto& pv = log_->pivot;
        if (pv.size() + pivot_.size() > pv.capacity())  // by a quarter, not double (see run)
          pv.reserve(std::max({pv.size() + pivot_.size(), pv.capacity() + pv.capacity() / 4, std::size_t{4096}}));
        pv.insert(pv.end(), pivot_.begin(), pivot_.end());
      }
      log_->steps.back().pivot_end = log_->pivot.size();
    }
    rc_.cell_state(L, a) = st::eliminated;  // a is no longer a candidate for anything
    rc_.cell_state(L - 1, b) = st::eliminated;
    // b leaves; its cofaces other than a absorb a multiple of da.
    const bool lone = pivot_.size() == 1;  // da = c b: the cofaces of b just lose b
    for (std::uint32_t y : ys_) {
      if (y == a) continue;
      if (lone) {
        const R w = rc_.take_face(L, y, b);
        if (log_) log_->affected.push_back({y, w});
        --active_count_[static_cast<std::size_t>(L)][y];  // b was active
      } else {
        const R w = coefficient(L, y, b);
        if (log_) log_->affected.push_back({y, w});
        merge_subtract(L, y, w * inv, b);
      }
      consider(L, y);
    }
    if (log_) log_->steps.back().affected_end = log_->affected.size();
    // a leaves the coface lists of its other faces.
    for (const auto& e : pivot_) {
      if (e.index == b || critical(L - 1, e.index)) continue;
      rc_.remove_coface(L - 1, e.index, a);
      if (rc_.cofaces(L - 1, e.index).size() == 1) consider(L - 1, e.index);
    }
    // b leaves the coface lists of its faces.
    if (L - 1 > 0)
      for (const auto& e : rc_.boundary(L - 1, b)) {
        if (critical(L - 2, e.index)) continue;
        rc_.remove_coface(L - 2, e.index, b);
        if (rc_.cofaces(L - 2, e.index).size() == 1) consider(L - 2, e.index);
      }
    // The cofaces of a lose a.
    if (L + 1 < rc_.levels()) {
      const auto xa = rc_.cofaces(L, a);
      xs_.assign(xa.begin(), xa.end());
      for (std::uint32_t x : xs_) {
        rc_.erase_face(L + 1, x, a);
        --active_count_[static_cast<std::size_t>(L + 1)][x];  // a was active when it was chosen
        consider(L + 1, x);
      }
    }
    rc_.release_boundary(L, a);
    rc_.release_boundary(L - 1, b);
    rc_.release_cofaces(L, a);
  }

  // dy <- dy - q * da (da in pivot_), with b dropping out; keeps coface lists of active
  // faces and active counts exact.
  void merge_subtract(int L, std::uint32_t y, const R& q, std::uint32_t b) {
    const auto dy = rc_.boundary(L, y);
    const auto& da = pivot_;
    scratch_.clear();
    scratch_.reserve(dy.size() + da.size());
    std::size_t i = 0, j = 0;
    auto& cnt = active_count_[static_cast<std::size_t>(L)][y];
    while (i < dy.size() || j < da.size()) {
      if (j == da.size() || (i < dy.size() && dy[i].index < da[j].index)) {
        scratch_.push_back(dy[i++]);
      } else if (i == dy.size() || da[j].index < dy[i].index) {
        // A new face of y (fill-in).
        const std::uint32_t z = da[j].index;
        R v = -(q * da[j].value);
        if (!(v == zero<R>())) {
          scratch_.push_back({z, v});
          if (rc_.cell_state(L - 1, z) == st::active) {
            rc_.add_coface(L - 1, z, y);
            ++cnt;
          }
        }
        ++j;
      } else {
        const std::uint32_t z = dy[i].index;
        R v = dy[i].value - q * da[j].value;
        const bool was_active = rc_.cell_state(L - 1, z) == st::active || z == b;
        if (!(v == zero<R>())) {
          scratch_.push_back({z, v});
        } else {
          if (z != b && !critical(L - 1, z)) rc_.remove_coface(L - 1, z, y);
          if (was_active) --cnt;
        }
        ++i, ++j;
      }
    }
    rc_.set_boundary(L, y, scratch_);
  }

  elimination_workspace<R>& rc_;
  elimination_options opt_;
  elimination_log<R>* log_;
  Rule rule_;
  elimination_statistics stats_;
  std::vector<std::vector<std::uint32_t>> active_count_;
  std::vector<std::vector<std::uint32_t>> empty_;
  std::vector<std::pair<int, std::uint32_t>> queue_;
  std::size_t head_ = 0;
  std::vector<std::uint32_t> stack_;
  std::vector<sparse_entry<R>> scratch_, pivot_;
  std::vector<std::uint32_t> ys_, xs_;
  progress_ticker ticker_;
};

}  // namespace detail

/// Eliminates unit pivots of rc in place (see the top of this header for the order).
/// R models commutative_ring; units are found with lacuna::is_unit where R is a Euclidean
/// domain, as non-zero elements in a field, and as +-1 otherwise. If log is given, the
/// steps are recorded in it (set options.record too, for clarity; either enables it).
/// Complexity: linear in the number of incidences for zero-fill pivots; each Markowitz pass
/// scans the remaining cells.
///
/// `rule` orders the unit pivots once no zero-fill pivot is left (pivot_rule; the default is
/// the Markowitz count). Cells set aside as critical by an earlier elimination are given back
/// to the pivot search when options.revive_critical is set.
template <class R, pivot_rule Rule = markowitz_rule>
elimination_statistics eliminate_unit_pivots(elimination_workspace<R>& rc, elimination_options options = {},
                                             elimination_log<R>* log = nullptr, const Rule& rule = {}) {
  if (options.revive_critical)
    for (int L = 0; L < rc.levels(); ++L)
      for (std::uint32_t i = 0; i < rc.size(L); ++i)
        if (rc.cell_state(L, i) == elimination_workspace<R>::state::critical)
          rc.cell_state(L, i) = elimination_workspace<R>::state::active;
  detail::unit_eliminator<R, Rule> e(rc, options, log, rule);
  return e.run();
}

}  // namespace lacuna

// lacuna/homology/routes.hpp — the routes behind lacuna::homology, relative_homology and
// cohomology (homology/homology.hpp is the front that chooses among them).
//
// Routes (docs/homology.md, "How the engine works"); each one is exact. Which one runs is
// the route choice of the algorithm (a route_selector, algorithm/stages.hpp; staged_homology
// at the end of this header asks it); the built-in automatic_route picks, for groups only (no
// generators, no basis):
//   * images and volumes of dimension <= 3, any ring: two voxel labellings and the Euler
//     characteristic (algorithm/cubical_duality.hpp; such complexes have no torsion);
//   * other complexes over the integers and Q: the coboundary route (coboundary_reduction,
//     algorithm/integral_reduction.hpp);
//   * over Z/2 and Z/p: column reductions with clearing (algorithm/field_ranks.hpp).
// Everything else (generators, coordinates, relative groups of volumes, other variants): the
// route below.
// The route below: the complex is indexed into an elimination_workspace over working
// coefficients W, reduced by the algorithm's reduction stages (pre, then eliminate; the
// built-in ones call eliminate_unit_pivots), and the small core that is left is finished by
// its core stage when only groups are asked for (smith_core: modular Smith forms where they
// pay, algorithm/modular_smith.hpp), else by dense Smith forms with transforms:
//   D_k = boundary out of level k, U D_k V = diag(d_1..d_r): ker D_k = V[:, r..];
//   M = (V^-1 D_{k+1})[r.., :], U' M V' = diag(e_1..e_s): H_k = Z^{n_k - r - s} + sum Z/e_i,
//   generators = V[:, r..] U'^-1, one per column (columns with a unit e_i are boundaries).
// Generators found on the core are lifted back to the original cells through the log.
//
// Over the integers, W is checked_int64 first; if a coefficient would pass 64 bits, the
// whole computation is repeated with lacuna::integer, so a result is never wrong because a
// number grew.
#pragma once

#include <lacuna/algorithm/cubical_duality.hpp>
#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/elimination_maps.hpp>
#include <lacuna/algorithm/field_ranks.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/integral_reduction.hpp>
#include <lacuna/algorithm/morse_reduction.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/algorithm/stages.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/chain/boundary_squared.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/chain/side_by_side.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/options.hpp>
#include <lacuna/homology/result.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/rational.hpp>

#include <algorithm>
#include <cstdint>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <type_traits>
#include <vector>

namespace lacuna {

namespace detail {

/// Per level: rank, torsion, generators (as level chains over R, before lifting).
template <class R>
struct level_result {
  std::size_t rank = 0;
  std::vector<R> torsion;
  std::vector<level_chain<R>> generators;
  std::vector<R> orders;
  std::vector<level_chain<R>> bounding;  // per torsion generator: a chain of level L+1
};

// Dense matrix of the boundary from level L to level L-1, restricted to the core cells. Its
// size, with the two transforms of its Smith form, is checked against control->memory_limit
// before anything is allocated.
template <class R, class W>
dense_matrix<R> core_matrix(const elimination_workspace<W>& rc, const std::vector<level_coordinates<R>>& lb, int L,
                            const run_control* control = nullptr) {
  const std::uint64_t rows = lb[static_cast<std::size_t>(L - 1)].core.size(),
                      cols = lb[static_cast<std::size_t>(L)].core.size();
  if (control && control->memory_limit) {
    const double bytes = (double(rows) * double(cols) + double(rows) * double(rows) + double(cols) * double(cols)) *
                         double(sizeof(R));  // in double: the product of two counts may pass 2^64
    control->require_memory(bytes >= 1.8e19 ? ~std::uint64_t{0} : static_cast<std::uint64_t>(bytes), "the dense core");
  }
  dense_matrix<R> D(lb[static_cast<std::size_t>(L - 1)].core.size(), lb[static_cast<std::size_t>(L)].core.size());
  for (std::size_t j = 0; j < lb[static_cast<std::size_t>(L)].core.size(); ++j)
    for (const auto& e : rc.boundary(L, lb[static_cast<std::size_t>(L)].core[j])) {
      const auto p = lb[static_cast<std::size_t>(L - 1)].core.position[e.index];
      D(static_cast<std::size_t>(p), j) = to_ring<R>(e.value);
    }
  return D;
}

template <class R, class W, class Core = smith_core>
std::vector<level_result<R>> core_level_homology(const elimination_workspace<W>& rc, bool want_generators, bool keep,
                                         std::vector<level_coordinates<R>>& lb, const run_control* control = nullptr,
                                         bool want_bounding = false, const Core& core_stage = {}) {
  const int nl = rc.levels();
  lb.assign(static_cast<std::size_t>(nl), {});
  for (int L = 0; L < nl; ++L) {
    auto& b = lb[static_cast<std::size_t>(L)];
    b.core = indexed_cells(rc.size(L));
    b.isolated = indexed_cells(rc.size(L));
    for (std::uint32_t i = 0; i < rc.size(L); ++i) {
      if (!rc.alive(L, i)) continue;
      const bool has = !rc.boundary(L, i).empty() || !rc.cofaces(L, i).empty();
      (has ? b.core : b.isolated).add(i);
    }
  }
  std::vector<level_result<R>> out(static_cast<std::size_t>(nl));
  if (!want_generators && !keep) {
    // Ranks and invariant factors of each core boundary matrix suffice: the core stage
    // (algorithm/stages.hpp; smith_core: modular Smith forms of integral cores where they
    // pay, else dense ones).
    std::vector<smith_decomposition<R>> snf(static_cast<std::size_t>(nl + 1));
    for (int L = 1; L < nl; ++L) {
      smith_invariants<R> s = core_stage.invariants(core_matrix<R>(rc, lb, L, control), control);
      snf[static_cast<std::size_t>(L)].rank = s.rank;
      snf[static_cast<std::size_t>(L)].diagonal = std::move(s.factors);
    }
    for (int L = 0; L < nl; ++L) {
      const std::size_t rL = L >= 1 ? snf[static_cast<std::size_t>(L)].rank : 0;
      const std::size_t rN = L + 1 < nl ? snf[static_cast<std::size_t>(L + 1)].rank : 0;
      out[static_cast<std::size_t>(L)].rank =
          lb[static_cast<std::size_t>(L)].isolated.size() + lb[static_cast<std::size_t>(L)].core.size() - rL - rN;
      if (L + 1 < nl)
        for (const auto& d : snf[static_cast<std::size_t>(L + 1)].diagonal)
          if (!ring_is_unit(d)) out[static_cast<std::size_t>(L)].torsion.push_back(d);
    }
    return out;
  }
  for (int L = 0; L < nl; ++L) {
    auto& b = lb[static_cast<std::size_t>(L)];
    const std::size_t n = b.core.size();
    smith_decomposition<R> s1;
    if (L >= 1) {
      s1 = dense_smith_form(core_matrix<R>(rc, lb, L, control), {.transforms = true, .control = control});
    } else {
      s1.rank = 0;
      s1.V = s1.V_inv = dense_matrix<R>::identity(n);
    }
    b.boundary_rank = s1.rank;
    const std::size_t kdim = n - b.boundary_rank;
    dense_matrix<R> M(kdim, L + 1 < nl ? lb[static_cast<std::size_t>(L + 1)].core.size() : 0);
    if (L + 1 < nl && M.cols() > 0 && kdim > 0) {
      const dense_matrix<R> P = s1.V_inv * core_matrix<R>(rc, lb, L + 1, control);
      for (std::size_t i = 0; i < kdim; ++i)
        for (std::size_t j = 0; j < M.cols(); ++j) M(i, j) = P(b.boundary_rank + i, j);
    }
    auto s2 = dense_smith_form(M, {.transforms = true, .control = control});
    b.quotient_factors = s2.diagonal;
    b.boundary_v_inverse = s1.V_inv;
    b.quotient_u = s2.U;
    auto& res = out[static_cast<std::size_t>(L)];
    // Free: isolated cells, then the core columns past the rank of M; torsion: non-unit e_i.
    res.rank = b.isolated.size() + (kdim - s2.rank);
    for (const auto& e : s2.diagonal)
      if (!ring_is_unit(e)) res.torsion.push_back(e);
    if (want_generators) {
      auto column = [&](std::size_t i) {  // generator i = sum_j V[:, r+j] U'^-1[j, i]
        level_chain<R> ch;
        for (std::size_t row = 0; row < n; ++row) {
          R v = zero<R>();
          for (std::size_t j = 0; j < kdim; ++j)
            if (!(s2.U_inv(j, i) == zero<R>())) v += s1.V(row, b.boundary_rank + j) * s2.U_inv(j, i);
          if (!(v == zero<R>())) ch.push_back({b.core[row], v});
        }
        std::sort(ch.begin(), ch.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
        return ch;
      };
      for (std::uint32_t c : b.isolated) res.generators.push_back({{c, one<R>()}}), res.orders.push_back(zero<R>());
      for (std::size_t i = s2.rank; i < kdim; ++i) res.generators.push_back(column(i)), res.orders.push_back(zero<R>());
      for (std::size_t i = 0; i < s2.rank; ++i)
        if (!ring_is_unit(s2.diagonal[i])) res.generators.push_back(column(i)), res.orders.push_back(s2.diagonal[i]);
      if (want_bounding) {
        // V^-1 D_{L+1} = [0; M] (D_L D_{L+1} = 0 kills the first r rows) and U' M V' = diag(e),
        // so D_{L+1} V'[:, i] = V[:, r..] U'^-1 e_i e_i = e_i · (generator i): column i of V'
        // bounds e_i times the generator, on the core; the lift is a chain map.
        for (std::size_t i = 0; i < s2.rank; ++i) {
          if (ring_is_unit(s2.diagonal[i])) continue;
          level_chain<R> w;
          for (std::size_t row = 0; row < s2.V.rows(); ++row)
            if (!(s2.V(row, i) == zero<R>())) w.push_back({lb[static_cast<std::size_t>(L) + 1].core[row], s2.V(row, i)});
          std::sort(w.begin(), w.end(), [](const auto& x, const auto& y) { return x.index < y.index; });
          res.bounding.push_back(std::move(w));
        }
      }
    }
  }
  return out;
}

template <class R, class W>
elimination_log<R> convert_log(elimination_log<W>&& log) {
  if constexpr (std::same_as<R, W>) {
    return std::move(log);
  } else {
    // Array by array, each given up once converted, so that the two logs are never held whole
    // at once (the largest array first).
    elimination_log<R> out;
    out.pivot.reserve(log.pivot.size());
    for (const auto& e : log.pivot) out.pivot.push_back({e.index, to_ring<R>(e.value)});
    std::vector<sparse_entry<W>>().swap(log.pivot);
    out.affected.reserve(log.affected.size());
    for (const auto& e : log.affected) out.affected.push_back({e.index, to_ring<R>(e.value)});
    std::vector<sparse_entry<W>>().swap(log.affected);
    out.steps.reserve(log.steps.size());
    for (const auto& s : log.steps)
      out.steps.push_back({s.level, s.a, s.b, to_ring<R>(s.c), to_ring<R>(s.c_inverse), s.affected_begin,
                           s.affected_end, s.pivot_begin, s.pivot_end});
    std::vector<elimination_step<W>>().swap(log.steps);
    return out;
  }
}

/// The ∂∂ = 0 precondition on the built complex (chain/boundary_squared.hpp): throws
/// invalid_complex naming the first cell whose boundary's boundary (coboundary's coboundary,
/// on a dual build) is not zero.
template <class W, cell_complex C>
void require_boundary_squared_zero(const elimination_workspace<W>& rc, const C& c) {
  if (const auto bad = first_nonzero_boundary_squared(rc)) {
    const int k = rc.dimension_of_level(bad->first);
    const std::size_t i = rc.original_index(bad->first, bad->second);
    throw invalid_complex(std::string(rc.is_dual() ? "lacuna: the coboundary of the coboundary of "
                                                   : "lacuna: the boundary of the boundary of ") +
                              std::to_string(k) + "-cell " + std::to_string(i) + " ('" + lacuna::cell_name(c, k, i) +
                              "') is not zero: not a chain complex (lacuna::validate names every fault)",
                          k, i);
  }
}

/// The chain complex of c at working coefficients W (integers mapped to R's `ring_one` when W is
/// R), with the ∂∂ = 0 precondition checked and the phase "building the chain complex"
/// reported to build.control (not null).
template <class R, class W, cell_complex C>
elimination_workspace<W> build_checked_complex(const C& c, const workspace_build_options& build, const R& ring_one) {
  build.control->report("building the chain complex", 0, 1);
  elimination_workspace<W> rc;
  if constexpr (std::same_as<R, W>)
    rc = elimination_workspace<W>::build(c, build, ring_one);
  else
    rc = elimination_workspace<W>::build(c, build);
  require_boundary_squared_zero(rc, c);  // precondition, checked
  build.control->report("building the chain complex", 1, 1);
  return rc;
}

/// The whole computation at one working coefficient type W, on the elimination route or,
/// with `field_ranks` (the route choice's homology_route::field_ranks), by column reductions
/// over the field when no log is needed.
template <class R, class W, cell_complex C, class Algorithm>
std::vector<level_result<R>> compute_levels(const C& c, const homology_options& opt, const Algorithm& alg,
                                            workspace_build_options build, std::shared_ptr<homology_basis<R>>* basis,
                                            const R& ring_one, bool field_ranks) {
  const run_control* control = &opt.control;
  build.control = control;
  elimination_workspace<W> rc = build_checked_complex<R, W>(c, build, ring_one);
  elimination_log<W> log;
  const bool keep = opt.keep_basis.value_or(false);
  const bool want_log = opt.generators || keep;
  log.pivots_wanted = keep;
  if constexpr (std::same_as<R, W> && has_fast_column_reduction<R>)
    if (field_ranks && !want_log) {  // over Z/2, Z/p: algorithm/field_ranks.hpp
      // No coreductions or collapses first: measured slower than reducing at once (docs/performance.md).
      const auto betti = field_betti_numbers(rc, nullptr, {.control = control});
      std::vector<level_result<R>> out(betti.size());
      for (std::size_t L = 0; L < betti.size(); ++L) out[L].rank = betti[L];
      return out;
    }
  // The reduction stages (algorithm/stages.hpp). The built-in ones report the phase
  // "eliminating unit pivots" themselves, each closing it; the caller sees one phase: its
  // reports never go back, and it closes once, after the last stage.
  {
    constexpr std::string_view phase = "eliminating unit pivots";
    std::uint64_t total = 0, shown = 0;
    for (int L = 0; L < rc.levels(); ++L) total += rc.size(L);
    run_control stages_control = *control;
    if (control->progress)
      stages_control.progress = [&](const progress_report& r) {
        if (r.phase != phase) return control->progress(r);
        if (r.total == 0 || r.done >= r.total) return;  // a stage closing: not yet the phase
        shown = std::max(shown, r.done);
        control->progress(progress_report{phase, shown, r.total});
      };
    alg.pre.reduce(rc, want_log ? &log : nullptr, &stages_control);
    alg.eliminate.reduce(rc, want_log ? &log : nullptr, &stages_control);
    control->report(phase, total, total);
  }
  std::vector<level_coordinates<R>> lb;
  std::vector<level_result<R>> levels;
  levels = core_level_homology<R>(rc, opt.generators, keep, lb, control, opt.generators && opt.witnesses, alg.core);
  // From here on only the log, the sizes and the index maps of rc are read: its boundaries
  // and coface lists are given up before the log is converted (the peak of the generators'
  // route is the workspace and the log together; docs/performance.md, "Certified homology").
  rc.release_incidences();
  auto rlog = convert_log<R>(std::move(log));
  if (opt.generators) {
    control->report("lifting generators", 0, 1);
    auto lift_level = [&](int L) {
      auto lifted = lift_chains(rlog, L, rc.size(L), levels[static_cast<std::size_t>(L)].generators, control);
      levels[static_cast<std::size_t>(L)].generators = std::move(lifted);
      for (auto& ch : levels[static_cast<std::size_t>(L)].generators)
        for (auto& e : ch) e.index = rc.original_index(L, e.index);
      auto& bounding = levels[static_cast<std::size_t>(L)].bounding;
      if (!bounding.empty()) {
        bounding = lift_chains(rlog, L + 1, rc.size(L + 1), bounding, control);
        for (auto& ch : bounding)
          for (auto& e : ch) e.index = rc.original_index(L + 1, e.index);
      }
    };
    const int top_level = rc.levels() - 1;
    if (opt.threads >= 2 && top_level >= 1) {
      // Levels are independent: the top one (usually the largest lift) beside the others.
      detail::side_by_side([&] { lift_level(top_level); },
                           [&] {
                             for (int L = 0; L < top_level; ++L) lift_level(L);
                           });
    } else {
      for (int L = 0; L < rc.levels(); ++L) lift_level(L);
    }
    control->report("lifting generators", 1, 1);
  }
  if (basis && keep) {
    auto hb = std::make_shared<homology_basis<R>>();
    hb->log = std::move(rlog);
    hb->levels = std::move(lb);
    for (int L = 0; L < rc.levels(); ++L) {
      hb->from_original.push_back(rc.local_indices(L));
      hb->level_sizes.push_back(rc.size(L));
    }
    *basis = std::move(hb);
  }
  return levels;
}

/// Whether the integers run at checked 64-bit working coefficients first: when the
/// reduction stages are generic in the working coefficients (the built-in ones are).
template <class Algorithm>
inline constexpr bool fast_integer_path = false;
template <class Pre, class Eliminate, class Core, class Route>
inline constexpr bool fast_integer_path<staged_elimination<Pre, Eliminate, Core, Route>> =
    reduction_stage<Pre, checked_int64> && reduction_stage<Eliminate, checked_int64>;

template <class R, cell_complex C, class Algorithm>
std::vector<level_result<R>> compute_levels_any(const C& c, const homology_options& opt, const Algorithm& alg,
                                                workspace_build_options build,
                                                std::shared_ptr<homology_basis<R>>* basis, const R& ring_one,
                                                bool field_ranks) {
  static_assert(reduction_stage<decltype(alg.pre), R>,
                "lacuna: the pre-reduction stage does not model reduction_stage at this ring (algorithm/stages.hpp)");
  static_assert(reduction_stage<decltype(alg.eliminate), R>,
                "lacuna: the elimination stage does not model reduction_stage at this ring (algorithm/stages.hpp)");
  static_assert(core_stage<decltype(alg.core), R>,
                "lacuna: the core stage does not model core_stage at this ring (algorithm/stages.hpp)");
  if constexpr (std::same_as<R, integer> && fast_integer_path<Algorithm>) {
    try {
      return compute_levels<R, checked_int64>(c, opt, alg, build, basis, ring_one, field_ranks);
    } catch (const coefficient_overflow&) {
      // Widen: repeat with coefficients that cannot overflow.
    }
  }
  return compute_levels<R, R>(c, opt, alg, build, basis, ring_one, field_ranks);
}

}  // namespace detail

namespace detail {
template <euclidean_domain R, cell_complex C, class Algorithm>
homology_result<R> assemble(const C& c, homology_options opt, const Algorithm& alg, bool is_cohomology,
                            const std::vector<std::vector<bool>>* excluded, const R& ring_one, bool field_ranks) {
  if (!opt.keep_basis.has_value()) opt.keep_basis = opt.generators;
  if (is_cohomology && opt.reduced) throw std::invalid_argument("lacuna: reduced cohomology is not offered; use reduced homology");
  if (is_cohomology && opt.witnesses) throw std::invalid_argument("lacuna: witnesses are offered for homology, not cohomology");
  workspace_build_options b{.augmented = opt.reduced, .dual = is_cohomology, .excluded = excluded, .threads = opt.threads};
  homology_result<R> res;
  res.cohomology = is_cohomology;
  res.reduced = opt.reduced;
  res.level_offset_ = opt.reduced ? -1 : 0;
  const int top = lacuna::top_dimension(c);
  res.top_ = top;
  res.ring_one_ = ring_one;
  auto levels = compute_levels_any<R>(c, opt, alg, b, &res.basis_, ring_one, field_ranks);
  for (int k = 0; k <= top; ++k) {
    const int L = is_cohomology ? top - k : k - res.level_offset_;
    auto& lr = levels[static_cast<std::size_t>(L)];
    homology_group<R> g;
    g.dimension = k;
    g.rank = lr.rank;
    g.torsion = std::move(lr.torsion);
    for (std::size_t i = 0; i < lr.generators.size(); ++i) {
      chain<R> ch{k, {}};
      for (const auto& e : lr.generators[i]) ch.terms.push_back({e.index, e.value});
      g.generators.push_back(std::move(ch));
      g.orders.push_back(lr.orders[i]);
    }
    for (const auto& w : lr.bounding) {
      chain<R> ch{k + 1, {}};
      for (const auto& e : w) ch.terms.push_back({e.index, e.value});
      g.bounding_chains.push_back(std::move(ch));
    }
    res.groups.push_back(std::move(g));
  }
  return res;
}
}  // namespace detail

namespace detail {

/// The algebra on a Morse complex m of c (pre_reduction::morse): generators are lifted to
/// c, and with a basis, coordinates() first projects a cycle of c to m. The route choice is
/// asked again on m, with algebra_only (field ranks or the elimination).
template <euclidean_domain R, class M, class Algorithm, class Lift, class Project>
homology_result<R> on_morse_complex(const M& m, const homology_options& opt, const Algorithm& alg, bool is_cohomology,
                                    const R& ring_one, Lift lift, Project project) {
  const route_request q{.generators = opt.generators, .keep_basis = opt.keep_basis.value_or(opt.generators),
                        .reduced = opt.reduced, .cohomology = is_cohomology, .relative = false, .algebra_only = true};
  const bool field_ranks = alg.route.template select<R>(m, q) == homology_route::field_ranks;
  homology_result<R> res = assemble<R>(m, opt, alg, is_cohomology, nullptr, ring_one, field_ranks);
  for (auto& g : res.groups)
    for (auto& z : g.generators) z = lift(z);
  if (res.basis_) res.project_ = std::move(project);
  return res;
}

/// The Morse route (pre_reduction::morse); nullopt when it does not apply (cohomology with
/// generators, witnesses, a Morse incidence beyond 64 bits): the caller then runs without it.
template <euclidean_domain R, cell_complex C, class Algorithm>
std::optional<homology_result<R>> morse_homology(const C& c, homology_options opt, const Algorithm& alg, bool is_cohomology,
                                                 const R& ring_one) {
  if (!opt.keep_basis.has_value()) opt.keep_basis = opt.generators;
  if (is_cohomology && (opt.generators || *opt.keep_basis)) return std::nullopt;
  if (opt.witnesses) return std::nullopt;  // bounding chains are lifted through the elimination log only
  try {
    if constexpr (has_implicit_morse_complex<C>) {
      constexpr std::size_t D = C::dimension;
      auto m = std::make_shared<const cubical_morse_complex<D>>(
          cubical_morse_reduce(c, {.threads = opt.threads, .control = &opt.control}));
      std::shared_ptr<const C> original;
      if (*opt.keep_basis) original = std::make_shared<const C>(c);  // coordinates() may outlive c
      return on_morse_complex<R>(
          *m, opt, alg, is_cohomology, ring_one, [&](const chain<R>& z) { return m->lift(c, z, ring_one); },
          [m, original, ring_one](const chain<R>& x) { return m->project(*original, x, ring_one); });
    } else {
      auto m = std::make_shared<const morse_complex>(morse_reduce(c, {.control = &opt.control}));
      const run_control* control = &opt.control;
      return on_morse_complex<R>(
          *m, opt, alg, is_cohomology, ring_one, [&](const chain<R>& z) { return m->lift(z, ring_one, control); },
          [m, ring_one](const chain<R>& x) { return m->project(x, ring_one); });
    }
  } catch (const coefficient_overflow&) {
    return std::nullopt;
  }
}

}  // namespace detail

namespace detail {

// ---- the coboundary route (coboundary_reduction; docs/homology.md) ------------------------

// ---- the duality route of images and volumes (algorithm/cubical_duality.hpp) ---------------

/// The groups of an image or volume by labelling (cubical_betti_numbers): ranks only, since
/// a compact subset of R^D, D <= 3, has torsion-free homology, so the groups over any R are
/// free of those ranks, and so are the cohomology groups (universal coefficients). nullopt
/// when the route does not apply (another complex, generators or a basis asked for, a
/// reduced group of the empty image).
template <euclidean_domain R, cell_complex C>
std::optional<homology_result<R>> duality_homology(const C& c, const homology_options& opt, bool cohomology,
                                                   const R& ring_one) {
  if constexpr (duality_dimension<C> == 0) {
    return std::nullopt;
  } else {
    if (opt.generators || opt.keep_basis.value_or(false)) return std::nullopt;
    if (opt.reduced && c.top_dimension() < 0) return std::nullopt;
    auto b = cubical_betti_numbers(c, &opt.control);
    if (opt.reduced) b[0] -= 1;
    homology_result<R> res;
    res.cohomology = cohomology;
    res.reduced = opt.reduced;
    res.level_offset_ = opt.reduced ? -1 : 0;
    res.top_ = c.top_dimension();
    res.ring_one_ = ring_one;
    for (int k = 0; k <= c.top_dimension(); ++k) {
      homology_group<R> g;
      g.dimension = k;
      g.rank = b[static_cast<std::size_t>(k)];
      res.groups.push_back(std::move(g));
    }
    return res;
  }
}

/// The groups from the coboundary route at working coefficients W: rank at level L is
/// size(L) − rank δ_{L−1} − rank δ_L (rank–nullity; rank δ = rank ∂ of its transpose), the
/// torsion at level L the non-unit invariant factors of δ_L = ∂_{L+1}^T, as in the Smith form
/// description at the top of this header.
template <class R, class W, cell_complex C>
homology_result<R> coboundary_groups(const C& c, const homology_options& opt, const coboundary_reduction& alg,
                                     const std::vector<std::vector<bool>>* excluded, const R& ring_one) {
  const run_control* control = &opt.control;
  const workspace_build_options build{.augmented = opt.reduced, .dual = false, .excluded = excluded,
                                      .threads = opt.threads, .control = control};
  const elimination_workspace<W> rc = build_checked_complex<R, W>(c, build, ring_one);
  const auto inv = reduce_coboundaries<R>(rc, alg, control);
  homology_result<R> res;
  res.reduced = opt.reduced;
  res.level_offset_ = opt.reduced ? -1 : 0;
  const int top = lacuna::top_dimension(c);
  res.top_ = top;
  res.ring_one_ = ring_one;
  for (int k = 0; k <= top; ++k) {
    const int L = k - res.level_offset_;
    homology_group<R> g;
    g.dimension = k;
    const std::size_t below = L >= 1 ? inv[static_cast<std::size_t>(L - 1)].rank : 0;
    g.rank = rc.size(L) - below - inv[static_cast<std::size_t>(L)].rank;
    g.torsion = inv[static_cast<std::size_t>(L)].torsion;
    res.groups.push_back(std::move(g));
  }
  return res;
}

/// homology / relative_homology with coboundary_reduction; generators or a basis fall back
/// to sparse_elimination{} (the route keeps no change of basis).
template <class R, cell_complex C>
homology_result<R> homology_by_coboundaries(const C& c, const homology_options& opt, const coboundary_reduction& alg,
                                            const std::vector<std::vector<bool>>* excluded, const R& ring_one) {
  if (opt.generators || opt.keep_basis.value_or(false))
    return assemble<R>(c, opt, sparse_elimination{.allow_coboundary_route = false}.stages(), false, excluded, ring_one,
                       false);
  if constexpr (std::same_as<R, rational>) {
    // H_k(C; Q) = H_k(C; Z) ⊗ Q (universal coefficients; Q is flat over Z): its dimension is
    // the free rank over Z, and torsion vanishes. The boundary coefficients are integers.
    // Only the ranks are needed: the remainders' torsion is not computed (ranks_only).
    coboundary_reduction ranks = alg;
    ranks.ranks_only = true;
    const auto z = homology_by_coboundaries<integer>(c, opt, ranks, excluded, one<integer>());
    homology_result<R> res;
    res.reduced = z.reduced;
    res.level_offset_ = z.level_offset_;
    res.top_ = z.top_;
    res.ring_one_ = ring_one;
    for (const auto& g : z.groups) {
      homology_group<R> q;
      q.dimension = g.dimension;
      q.rank = g.rank;
      res.groups.push_back(std::move(q));
    }
    return res;
  }
  if constexpr (std::same_as<R, integer>) {
    try {
      return coboundary_groups<R, checked_int64>(c, opt, alg, excluded, ring_one);
    } catch (const coefficient_overflow&) {
      // Widen: repeat with coefficients that cannot overflow.
    }
  }
  return coboundary_groups<R, R>(c, opt, alg, excluded, ring_one);
}

// ---- the route choice ----------------------------------------------------------------------

/// homology (excluded null, not cohomology), relative_homology (excluded: the subcomplex) or
/// cohomology of c with the stages of `alg` (a staged_elimination; sparse_elimination{} runs
/// as its stages()): the route selector names the route, and a route that does not apply to
/// the request is replaced by the algebra (the selector asked again with algebra_only).
template <euclidean_domain R, cell_complex C, class Algorithm>
homology_result<R> staged_homology(const C& c, const homology_options& opt, const Algorithm& alg, bool is_cohomology,
                                   const std::vector<std::vector<bool>>* excluded, const R& ring_one) {
  static_assert(route_selector<decltype(alg.route), R, C>,
                "lacuna: the route stage does not model route_selector at this ring and complex (algorithm/stages.hpp)");
  route_request q{.generators = opt.generators, .keep_basis = opt.keep_basis.value_or(opt.generators),
                  .reduced = opt.reduced, .cohomology = is_cohomology, .relative = excluded != nullptr,
                  .algebra_only = false};
  switch (alg.route.template select<R>(c, q)) {
    case homology_route::duality:
      if (!excluded)
        if (auto r = duality_homology<R>(c, opt, is_cohomology, ring_one)) return std::move(*r);
      break;
    case homology_route::coboundary:
      if (!is_cohomology && !q.generators && !q.keep_basis)
        return homology_by_coboundaries<R>(c, opt, coboundary_reduction{}, excluded, ring_one);
      break;
    case homology_route::morse:
      if (!excluded)
        if (auto r = morse_homology<R>(c, opt, alg, is_cohomology, ring_one)) return std::move(*r);
      break;
    case homology_route::field_ranks:
      if constexpr (has_fast_column_reduction<R>)
        if (!q.generators && !q.keep_basis) return assemble<R>(c, opt, alg, is_cohomology, excluded, ring_one, true);
      break;
    case homology_route::elimination:
      return assemble<R>(c, opt, alg, is_cohomology, excluded, ring_one, false);
  }
  q.algebra_only = true;
  return assemble<R>(c, opt, alg, is_cohomology, excluded, ring_one,
                     alg.route.template select<R>(c, q) == homology_route::field_ranks);
}

}  // namespace detail

}  // namespace lacuna

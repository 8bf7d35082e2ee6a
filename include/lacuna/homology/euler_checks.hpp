// lacuna/homology/euler_checks.hpp — Euler-characteristic identities, each one reported.
//
// euler_checks(X, options) tests
//   * χ(X) from cell counts = Σ (-1)^n dim H_n(X; Q), and the same over each Z/p asked
//     (Hatcher, Algebraic Topology, 2002, Theorem 2.44, which holds over any field);
//   * with a subcomplex A: χ(X) = χ(A) + χ(X, A), with χ(X, A) = Σ (-1)^n dim H_n(X, A; Q)
//     (additivity along the long exact sequence of the pair);
//   * with two subcomplexes A, B covering X: χ(A ∪ B) = χ(A) + χ(B) - χ(A ∩ B), every χ
//     computed from homology over Q (Mayer–Vietoris).
// Every side that is read from homology is computed by the engine, so the identities test
// it; the cell-count side is the independent reference.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/construct/subcomplex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace lacuna {

/// Options of euler_checks: primes p for the Z/p checks, a subcomplex A (marks [k][i]), and
/// a cover X = A ∪ B by two subcomplexes (marks of A and of B).
struct euler_check_options {
  /// The primes p of the checks over Z/p.
  std::vector<std::uint64_t> primes;
  /// The subcomplex A, marks [k][i], for the identities of the pair (X, A).
  std::optional<std::vector<std::vector<bool>>> subcomplex;
  /// The cover X = A ∪ B, marks of A and of B, for the Mayer-Vietoris identity.
  std::optional<std::pair<std::vector<std::vector<bool>>, std::vector<std::vector<bool>>>> cover;
};

/// One identity tested: its statement, both sides, and whether they agree.
struct euler_identity {
  /// The identity, in words.
  std::string statement;
  ///@{
  /// Its left and right sides.
  std::int64_t lhs = 0, rhs = 0;
  ///@}
  /// True if the two sides are equal.
  bool holds = true;
};

/// The outcome of euler_checks: every identity tested.
struct euler_report {
  /// True if every identity holds.
  bool ok = true;
  /// The identities, in the order tested.
  std::vector<euler_identity> identities;
};

namespace detail {
template <class R>
std::int64_t chi_of(const homology_result<R>& h) {
  std::int64_t chi = 0;
  for (const auto& g : h.groups) {
    const auto r = static_cast<std::int64_t>(g.rank + (field<R> ? 0 : g.torsion.size()));
    chi += g.dimension % 2 == 0 ? r : -r;
  }
  return chi;
}
inline bool mark(const std::vector<std::vector<bool>>& m, int k, std::size_t i) {
  return static_cast<std::size_t>(k) < m.size() && i < m[static_cast<std::size_t>(k)].size() && m[static_cast<std::size_t>(k)][i];
}
template <cell_complex C, class Pred>
std::int64_t chi_rational(const C& X, Pred pred) {
  const cell_list S = subcomplex(X, pred);
  return chi_of(homology<rational>(S));
}
}  // namespace detail

/// Tests the Euler-characteristic identities named in the header comment and reports each.
template <cell_complex C>
euler_report euler_checks(const C& X, const euler_check_options& options = {}) {
  euler_report r;
  auto add = [&](std::string s, std::int64_t l, std::int64_t rr) {
    r.identities.push_back({std::move(s), l, rr, l == rr});
    r.ok = r.ok && l == rr;
  };
  const std::int64_t cells = euler_characteristic(X);
  const std::int64_t chiQ = detail::chi_of(homology<rational>(X));
  add("χ(X) from cell counts = Σ(-1)^n dim H_n(X; Q)", cells, chiQ);
  for (auto p : options.primes) {
    const mod_p_dynamic ring_one(1, p);
    add("χ(X) from cell counts = Σ(-1)^n dim H_n(X; Z/" + std::to_string(p) + ")", cells,
        detail::chi_of(homology<mod_p_dynamic>(X, {}, sparse_elimination{}, ring_one)));
  }
  if (options.subcomplex) {
    const auto& m = *options.subcomplex;
    const std::int64_t chiA = detail::chi_rational(X, [&](int k, std::size_t i) { return detail::mark(m, k, i); });
    const std::int64_t chiXA = detail::chi_of(relative_homology<rational>(X, m));
    add("χ(X) = χ(A) + χ(X, A)", chiQ, chiA + chiXA);
  }
  if (options.cover) {
    // (Not a structured binding: clang 14 cannot capture one in a lambda.)
    const auto& a = options.cover->first;
    const auto& b = options.cover->second;
    const std::int64_t chiU = detail::chi_rational(X, [&](int k, std::size_t i) { return detail::mark(a, k, i) || detail::mark(b, k, i); });
    const std::int64_t chiA = detail::chi_rational(X, [&](int k, std::size_t i) { return detail::mark(a, k, i); });
    const std::int64_t chiB = detail::chi_rational(X, [&](int k, std::size_t i) { return detail::mark(b, k, i); });
    const std::int64_t chiI = detail::chi_rational(X, [&](int k, std::size_t i) { return detail::mark(a, k, i) && detail::mark(b, k, i); });
    add("χ(A ∪ B) = χ(A) + χ(B) - χ(A ∩ B)", chiU, chiA + chiB - chiI);
  }
  return r;
}

}  // namespace lacuna

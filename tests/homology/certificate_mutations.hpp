// Mutations of homology certificates, shared by the tests of this folder: each one changes a
// certificate the way a wrong answer would differ (a torsion factor, a generator, an order, a
// witness's coefficient, a torsion summand left out, a torsion witness's minors), and
// mutations_rejected checks that check_certificate refuses every one that applies, naming the
// group and the generator or factor where the fault is.
#pragma once

#include <doctest/doctest.h>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>

#include <functional>
#include <string>
#include <vector>

namespace certificate_mutations {

using lacuna::integer;

/// A mutation of a certificate, and where its checker must find the fault.
template <class R>
struct mutation {
  std::string name;
  std::function<bool(lacuna::homology_certificate<R>&)> apply;  // false: does not apply here
  int dimension;
  std::ptrdiff_t generator;  // -2: any
  std::string words;         // a phrase of the failure
};

/// The index of the first group with torsion, or -1.
template <class R>
inline int torsion_degree(const lacuna::homology_certificate<R>& c) {
  for (const auto& g : c.groups)
    if (!g.torsion.empty()) return g.dimension;
  return -1;
}
template <class R>
inline int free_degree(const lacuna::homology_certificate<R>& c) {
  for (const auto& g : c.groups)
    if (g.dimension > 0 && g.rank > 0) return g.dimension;
  return -1;
}

/// Runs every mutation that applies to c's certificate and checks it is rejected where
/// expected. Returns how many applied.
/// The same for a certificate `good` of any kind: `check` checks a certificate (with the
/// subcomplex, for a relative one), `a_boundary(f)` gives a boundary of degree f of the
/// kind's differential (empty: none).
template <class C, class Check, class Boundary>
inline int mutations_rejected_by(const C& c, const lacuna::homology_certificate<integer>& good, Check check,
                                 Boundary a_boundary) {
  (void)c;
  {
    const auto rep = check(good);
    INFO(rep.first_failure);
    REQUIRE(rep.ok);
  }
  const int t = torsion_degree(good), f = free_degree(good);
  using cert_t = lacuna::homology_certificate<integer>;
  std::vector<mutation<integer>> ms;
  if (t >= 0) {
    const std::size_t r = good.groups[t].rank;
    const std::ptrdiff_t last = static_cast<std::ptrdiff_t>(r + good.groups[t].torsion.size() - 1);
    // The report's case: the largest torsion factor doubled, generators left alone (and the
    // bounding chain doubled too, so that ∂w = d·z still holds): no cocycle mod 2d takes a
    // unit value on a class of order d.
    ms.push_back({"torsion factor doubled", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    g.torsion.back() = g.torsion.back() * 2;
                    g.bounding_chains.back() = lacuna::scaled(integer(2), g.bounding_chains.back());
                    return true;
                  }, t, last, ""});
    ms.push_back({"torsion factor doubled, witnesses left alone", [t](cert_t& x) {
                    x.groups[t].torsion.back() = x.groups[t].torsion.back() * 2;
                    return true;
                  }, t, last, "bounding chain"});
    ms.push_back({"torsion generator replaced by a boundary", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    // d·z = ∂w is a boundary; its bounding chain d·w keeps (b) true, so the
                    // cocycle's value d ≡ 0 must give it away
                    g.generators.back() = lacuna::scaled(g.torsion.back(), g.generators.back());
                    g.bounding_chains.back() = lacuna::scaled(g.torsion.back(), g.bounding_chains.back());
                    return true;
                  }, t, last, "not 1 modulo"});
    ms.push_back({"one coefficient of a torsion cocycle perturbed", [t](cert_t& x) {
                    auto& phi = x.groups[t].cocycles.back();
                    phi.terms.front().coefficient += 1;
                    if (phi.terms.front().coefficient == x.groups[t].torsion.back()) phi.terms.front().coefficient = 0;
                    phi.normalize_terms();
                    return true;
                  }, t, -2, ""});
    ms.push_back({"one coefficient of a bounding chain perturbed", [t](cert_t& x) {
                    x.groups[t].bounding_chains.back().terms.front().coefficient += 1;
                    x.groups[t].bounding_chains.back().normalize_terms();
                    return true;
                  }, t, last, "bounding chain"});
    if (good.groups[t].torsion.size() >= 2)
      ms.push_back({"two orders swapped", [t](cert_t& x) {
                      auto& g = x.groups[t];
                      std::swap(g.torsion[0], g.torsion[1]);
                      return true;
                    }, t, -2, ""});
    ms.push_back({"a torsion generator duplicated over another", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    if (g.generators.size() < 2) return false;
                    g.generators[g.generators.size() - 2] = g.generators.back();
                    return true;
                  }, t, -2, ""});
  }
  if (t >= 0) {
    // A whole torsion summand left out with its generator, cocycle and bounding chain (the
    // first factor, so the others still divide each other): everything the witnesses of (a)-(d)
    // check still holds; only the determinants of the torsion witness see it.
    ms.push_back({"a torsion summand dropped with its generator", [t](cert_t& x) {
                    auto& g = x.groups[t];
                    g.torsion.erase(g.torsion.begin());
                    g.generators.erase(g.generators.begin() + static_cast<std::ptrdiff_t>(g.rank));
                    g.cocycles.erase(g.cocycles.begin() + static_cast<std::ptrdiff_t>(g.rank));
                    g.bounding_chains.erase(g.bounding_chains.begin());
                    return true;
                  }, t, -1, "torsion witness"});
  }
  // The torsion witnesses themselves: the degree of the first one with a core block and unit
  // pivots, if any.
  int w = -1;
  for (std::size_t k = 0; k < good.torsion.size() && w < 0; ++k)
    if (!good.torsion[k].pivot_rows.empty() && !good.torsion[k].minors.empty() && !good.torsion[k].minors[0].rows.empty())
      w = static_cast<int>(k);
  int any = -1;
  for (std::size_t k = 0; k < good.torsion.size() && any < 0; ++k)
    if (!good.torsion[k].minors.empty()) any = static_cast<int>(k);
  if (any >= 0) {
    ms.push_back({"the torsion witnesses removed (a certificate of the older layout)", [](cert_t& x) {
                    x.torsion.clear();
                    return true;
                  }, -1, -1, "no torsion witnesses"});
    ms.push_back({"the minors of a torsion witness removed", [any](cert_t& x) {
                    x.torsion[static_cast<std::size_t>(any)].minors.clear();
                    return true;
                  }, any, -1, "no minor"});
    ms.push_back({"a pivot of a torsion witness dropped", [any](cert_t& x) {
                    auto& tw = x.torsion[static_cast<std::size_t>(any)];
                    if (tw.pivot_rows.empty()) return false;
                    tw.pivot_rows.pop_back(), tw.pivot_columns.pop_back();
                    return true;
                  }, any, -1, "not of size"});
  }
  if (w >= 0) {
    ms.push_back({"a row of a minor's block replaced by a pivot row", [w](cert_t& x) {
                    auto& tw = x.torsion[static_cast<std::size_t>(w)];
                    tw.minors[0].rows[0] = tw.pivot_rows[0];
                    return true;
                  }, w, -1, "named twice"});
  }
  if (f >= 0) {
    ms.push_back({"free generator dropped (rank one less)", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    g.rank -= 1;
                    g.generators.erase(g.generators.begin());
                    g.cocycles.erase(g.cocycles.begin());
                    return true;
                  }, f, -1, "free rank"});
    ms.push_back({"free generator duplicated", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    if (g.rank < 2) return false;
                    g.generators[1] = g.generators[0];
                    return true;
                  }, f, -2, ""});
    ms.push_back({"free generator doubled", [f](cert_t& x) {
                    auto& g = x.groups[f];
                    g.generators[0] = lacuna::scaled(integer(2), g.generators[0]);
                    return true;
                  }, f, 0, "not 1"});
    ms.push_back({"free generator replaced by a boundary", [f, &a_boundary](cert_t& x) {
                    auto& g = x.groups[f];
                    const lacuna::chain<integer> b = a_boundary(f);
                    if (b.is_zero()) return false;
                    g.generators[0] = b;
                    return true;
                  }, f, 0, ""});
    ms.push_back({"one coefficient of a free cocycle perturbed", [f](cert_t& x) {
                    auto& phi = x.groups[f].cocycles[0];
                    phi.terms.front().coefficient += 1;
                    phi.normalize_terms();
                    return true;
                  }, f, -2, ""});
    ms.push_back({"a rank witness loses a pivot", [f](cert_t& x) {
                    auto& w = x.ranks[static_cast<std::size_t>(f + 1 < static_cast<int>(x.ranks.size()) ? f + 1 : f)];
                    if (w.rows.empty()) return false;
                    w.rows.pop_back(), w.columns.pop_back();
                    return true;
                  }, -3, -1, ""});
  }
  int applied = 0;
  for (auto& m : ms) {
    auto bad = good;
    if (!m.apply(bad)) continue;
    ++applied;
    const auto rep = check(bad);
    INFO(m.name << ": " << rep.first_failure);
    CHECK(!rep.ok);
    if (m.dimension != -3) CHECK(rep.dimension == m.dimension);
    if (m.generator != -2) CHECK(rep.generator == m.generator);
    if (!m.words.empty()) CHECK(rep.first_failure.find(m.words) != std::string::npos);
    CHECK(rep.torsion_unproved == (m.words == "no torsion witnesses"));
  }
  return applied;
}

/// Runs every mutation that applies to c's certificate of absolute homology over Z and checks
/// it is rejected where expected. Returns how many applied.
template <class C>
inline int mutations_rejected(const C& c) {
  const auto good = lacuna::certified_homology<integer>(c).certificate;
  auto check = [&c](const lacuna::homology_certificate<integer>& x) { return lacuna::check_certificate(c, x); };
  auto a_boundary = [&c](int f) {
    lacuna::chain<integer> b{f, {}};
    if (lacuna::cell_count(c, f + 1) == 0) return b;
    for (auto&& v : lacuna::boundary(c, f + 1, 0))
      b.terms.push_back({lacuna::incidence_face(v), lacuna::coefficient_as_integer(v)});
    b.normalize_terms();
    return b;
  };
  return mutations_rejected_by(c, good, check, a_boundary);
}

}  // namespace certificate_mutations

// Mutations of homology results, for verify_generators (shared by verify.cpp and
// verify_volumes.long.cpp): each changes a result the way a wrong answer would differ — a
// torsion factor changed, a torsion summand or a free generator dropped, a generator
// duplicated, doubled or replaced by a boundary, two orders swapped, one coefficient of a
// generator perturbed — and result_mutations_rejected checks that verify_generators refuses
// every one that applies, naming the group and the generator or torsion factor.
#pragma once

#include <doctest/doctest.h>
#include <lacuna/homology/verify.hpp>

#include <functional>
#include <string>
#include <vector>

namespace verify_mutations {

using lacuna::integer;
using result_t = lacuna::homology_result<integer>;

struct result_mutation {
  std::string name;
  std::function<bool(result_t&)> apply;  // false: does not apply here
  int dimension;
  std::ptrdiff_t generator;  // -2: any
  std::string words;         // a phrase of the failure
};

/// Runs every mutation that applies to a result `good` of c (absolute, reduced, relative or
/// cohomology) and checks that verify_generators refuses it where expected, naming the group
/// and factor; returns how many applied. `verify` runs
/// verify_generators (with the subcomplex, for a pair), `a_boundary(f)` gives a boundary of
/// degree f of the result's differential (empty: none).
template <class C, class Verify, class Boundary>
int result_mutations_rejected_by(const C& c, const result_t& good, Verify verify, Boundary a_boundary) {
  (void)c;
  {
    const auto rep = verify(good);
    INFO(rep.first_failure);
    REQUIRE(rep.ok);
  }
  int t = -1, f = -1;
  for (const auto& g : good.groups) {
    if (t < 0 && !g.torsion.empty()) t = g.dimension;
    if (f < 0 && g.dimension > 0 && g.rank > 0) f = g.dimension;
  }
  std::vector<result_mutation> ms;
  if (t >= 0) {
    const std::size_t r = good[t].rank, m = good[t].torsion.size();
    const auto last = static_cast<std::ptrdiff_t>(r + m - 1);
    ms.push_back({"the largest torsion factor doubled, generators left alone", [t](result_t& x) {
                    auto& g = x.groups[t];
                    g.torsion.back() = g.torsion.back() * 2;
                    g.orders.back() = g.torsion.back();
                    return true;
                  }, t, last, "the certificate proves order"});
    ms.push_back({"a torsion summand dropped with its generator", [t, r](result_t& x) {
                    auto& g = x.groups[t];
                    g.torsion.erase(g.torsion.begin());
                    g.generators.erase(g.generators.begin() + static_cast<std::ptrdiff_t>(r));
                    g.orders.erase(g.orders.begin() + static_cast<std::ptrdiff_t>(r));
                    return true;
                  }, t, -2, "torsion factor"});
    ms.push_back({"a torsion generator replaced by a boundary (order times itself)", [t](result_t& x) {
                    auto& g = x.groups[t];
                    g.generators.back() = lacuna::scaled(g.torsion.back(), g.generators.back());
                    return true;
                  }, t, last, "boundary"});
    ms.push_back({"a torsion generator's order label changed", [t](result_t& x) {
                    x.groups[t].orders.back() = x.groups[t].orders.back() * 3;
                    return true;
                  }, t, last, "labelled"});
    if (m >= 2)
      ms.push_back({"two torsion orders swapped", [t](result_t& x) {
                      auto& g = x.groups[t];
                      if (g.torsion[0] == g.torsion[1]) return false;
                      std::swap(g.torsion[0], g.torsion[1]);
                      std::swap(g.orders[g.rank], g.orders[g.rank + 1]);
                      return true;
                    }, t, static_cast<std::ptrdiff_t>(r), "torsion factor 0"});
    if (m >= 2)
      ms.push_back({"a torsion generator duplicated over another", [t](result_t& x) {
                      auto& g = x.groups[t];
                      g.generators[g.generators.size() - 2] = g.generators.back();
                      return true;
                    }, t, -2, ""});
  }
  if (f >= 0) {
    ms.push_back({"a free generator dropped (rank one less)", [f](result_t& x) {
                    auto& g = x.groups[f];
                    g.rank -= 1;
                    g.generators.erase(g.generators.begin());
                    g.orders.erase(g.orders.begin());
                    return true;
                  }, f, -1, "claims rank"});
    ms.push_back({"a free generator dropped, rank left alone", [f](result_t& x) {
                    auto& g = x.groups[f];
                    g.generators.erase(g.generators.begin());
                    g.orders.erase(g.orders.begin());
                    return true;
                  }, f, -1, "generators"});
    ms.push_back({"a free generator duplicated over another", [f](result_t& x) {
                    auto& g = x.groups[f];
                    if (g.rank < 2) return false;
                    g.generators[1] = g.generators[0];
                    return true;
                  }, f, 1, "a unit times that of generator 0"});
    ms.push_back({"a free generator doubled", [f](result_t& x) {
                    x.groups[f].generators[0] = lacuna::scaled(integer(2), x.groups[f].generators[0]);
                    return true;
                  }, f, 0, "2 times a class"});
    ms.push_back({"a free generator replaced by a boundary", [f, &a_boundary](result_t& x) {
                    const lacuna::chain<integer> b = a_boundary(f);
                    if (b.is_zero()) return false;
                    x.groups[f].generators[0] = b;
                    return true;
                  }, f, 0, "boundary"});
    ms.push_back({"one coefficient of a free generator perturbed", [f](result_t& x) {
                    auto& z = x.groups[f].generators[0];
                    z.terms.front().coefficient += 1;
                    z.normalize_terms();
                    return true;
                  }, f, 0, ""});
  }
  int applied = 0;
  for (auto& mu : ms) {
    auto bad = good;
    if (!mu.apply(bad)) continue;
    ++applied;
    const auto rep = verify(bad);
    INFO(mu.name << ": " << rep.first_failure);
    CHECK(!rep.ok);
    CHECK(rep.dimension == mu.dimension);
    if (mu.generator != -2) CHECK(rep.generator == mu.generator);
    if (!mu.words.empty()) CHECK(rep.first_failure.find(mu.words) != std::string::npos);
  }
  return applied;
}

/// Runs every mutation that applies to the result of c over Z with generators (the default
/// route) and checks that verify_generators refuses it where expected. Returns how many applied.
template <class C>
int result_mutations_rejected(const C& c) {
  const auto good = lacuna::homology<integer>(c, {.generators = true});
  auto verify = [&c](const result_t& x) { return lacuna::verify_generators(c, x); };
  auto a_boundary = [&c](int f) {
    lacuna::chain<integer> b{f, {}};
    if (lacuna::cell_count(c, f + 1) == 0) return b;
    for (auto&& v : lacuna::boundary(c, f + 1, 0))
      b.terms.push_back({lacuna::incidence_face(v), lacuna::coefficient_as_integer(v)});
    b.normalize_terms();
    return b;
  };
  return result_mutations_rejected_by(c, good, verify, a_boundary);
}

}  // namespace verify_mutations

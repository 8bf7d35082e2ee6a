// lacuna/homology/verify.hpp — an independent check of the generators of a homology or
// cohomology result.
//
// What is checked, for every group H_k of a result computed with generators:
//   1. counts: rank free generators (order 0) then one per torsion factor, in order;
//   2. cycles: ∂z = 0 for a homology generator (and ε(z) = 0 in degree 0 of reduced
//      homology), δφ = 0 for a cohomology generator; both computed here from
//      lacuna::boundary of the complex itself, never from the engine's reduced complex;
//   3. through the result's own coordinates(): the coordinate matrix of the generators is
//      unit-diagonal (the identity up to units), a free generator is not a boundary, a
//      torsion generator z of order d is not a boundary and d·z is;
//   4. for complexes of at most `dense_cell_limit` cells, a second result is computed with
//      dense_elimination{} (no sparse elimination at all, a different code path): the groups
//      must be the same, and in that result's coordinates the generators must form a basis —
//      every torsion generator has exactly its order (the order of (c_i) in ⊕ R/t_i is the
//      lcm of t_i / gcd(c_i, t_i), and free coordinates must vanish), and the coordinate
//      vectors together with t_i e_i span R^N (Smith form of the stacked matrix: full rank,
//      unit invariant factors). A surjection Z^r ⊕ ⊕R/t_i → H sending the standard basis to
//      the generators is then an isomorphism (finitely generated modules are Hopfian).
//
// Steps 3 and 4 lean on the engine's own elimination data, and step 4 only for small
// complexes: for an answer that must be trusted, certified_homology and check_certificate
// (homology/certify.hpp, homology/certificate.hpp; docs/certificates.md) check witnesses
// against the complex itself at any size.
//
// Failures are reported, not thrown: the report holds the first failure in words. Errors of
// use (a result without generators) throw std::invalid_argument.
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>

#include <cstddef>
#include <cstdint>
#include <map>
#include <optional>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna {

/// The outcome of verify_generators: ok, or the first failure in words; `checks` counts the
/// individual facts that were verified (so a test can see that something was checked).
struct verification_report {
  /// True if every check passed.
  bool ok = true;
  /// What failed, in words; empty when ok.
  std::string first_failure;
  /// The number of facts verified.
  std::size_t checks = 0;
  /// ok.
  explicit operator bool() const noexcept { return ok; }
};

/// Options of verify_generators.
struct verify_options {
  /// Cross-check against a dense_elimination result when the complex has at most this many
  /// cells (0: never).
  std::size_t dense_cell_limit = 2000;
};

namespace detail {

template <class T>
std::string verify_text(const T& x) {
  if constexpr (requires { { x.to_string() } -> std::convertible_to<std::string>; }) {
    return x.to_string();
  } else if constexpr (requires(std::ostream& os) { os << x; }) {
    std::ostringstream os;
    os << x;
    return os.str();
  } else {
    return "?";
  }
}

template <class R>
bool verify_is_unit(const R& x) {
  if constexpr (field<R>)
    return !(x == zero<R>());
  else
    return !(x == zero<R>()) && lacuna::is_unit(x);
}

template <class R>
bool associates(const R& a, const R& b) {
  return normalize(a) == normalize(b);
}

/// ∂z (homology) or δφ (cohomology) from the complex's own boundaries, as a sparse map.
template <class R, cell_complex C>
std::map<std::size_t, R> verify_differential(const C& c, const chain<R>& z, bool is_cohomology) {
  std::map<std::size_t, R> out;
  const int k = z.dimension;
  if (!is_cohomology) {
    if (k == 0) return out;
    for (const auto& t : z.terms)
      for (auto&& v : lacuna::boundary(c, k, t.cell)) {
        const incidence f = as_incidence(v);
        auto [it, fresh] = out.try_emplace(f.face, zero<R>());
        it->second += from_integer<R>(f.coefficient) * t.coefficient;
      }
  } else {
    if (k + 1 > lacuna::top_dimension(c)) return out;
    const std::size_t n = lacuna::cell_count(c, k + 1);
    for (std::size_t s = 0; s < n; ++s) {
      R v = zero<R>();
      for (auto&& b : lacuna::boundary(c, k + 1, s)) {
        const incidence f = as_incidence(b);
        const R phi = z.coefficient_of(f.face);
        if (!(phi == zero<R>())) v += from_integer<R>(f.coefficient) * phi;
      }
      if (!(v == zero<R>())) out.emplace(s, v);
    }
  }
  for (auto it = out.begin(); it != out.end();) it = it->second == zero<R>() ? out.erase(it) : std::next(it);
  return out;
}

/// The order of the class with these coordinates: zero<R>() when a free coordinate is
/// non-zero (infinite order), else lcm_i t_i / gcd(c_i, t_i).
template <class R>
R verify_order(const std::vector<R>& coords, std::size_t rank, const std::vector<R>& torsion) {
  for (std::size_t i = 0; i < rank; ++i)
    if (!(coords[i] == zero<R>())) return zero<R>();
  R ord = one<R>();
  for (std::size_t i = 0; i < torsion.size(); ++i) {
    const R& t = torsion[i];
    const R g = lacuna::gcd(coords[rank + i], t);
    const R part = div_rem(t, g).quotient;
    const R h = lacuna::gcd(ord, part);
    ord = div_rem(ord, h).quotient * part;
  }
  return normalize(ord);
}

/// The generators form a basis in these coordinates (see the top of this header).
template <class R>
std::optional<std::string> verify_basis(const std::vector<std::vector<R>>& coords, const homology_group<R>& g) {
  const std::size_t r = g.rank, m = g.torsion.size(), N = r + m;
  for (std::size_t i = 0; i < coords.size(); ++i) {
    if (coords[i].size() != N)
      return "generator " + std::to_string(i) + " has " + std::to_string(coords[i].size()) +
             " coordinates, expected " + std::to_string(N);
    if (i >= r) {
      const R ord = verify_order(coords[i], r, g.torsion);
      if (!associates(ord, g.orders[i]))
        return "torsion generator " + std::to_string(i) + " has order " +
               (ord == zero<R>() ? std::string("infinite") : verify_text(ord)) + ", expected " +
               verify_text(g.orders[i]);
    }
  }
  dense_matrix<R> S(coords.size() + m, N);
  for (std::size_t i = 0; i < coords.size(); ++i)
    for (std::size_t j = 0; j < N; ++j) S(i, j) = coords[i][j];
  for (std::size_t j = 0; j < m; ++j) S(coords.size() + j, r + j) = g.torsion[j];
  const auto snf = dense_smith_form(std::move(S));
  if (snf.rank != N) return "the generators span a subgroup of lower rank";
  for (const auto& d : snf.diagonal)
    if (!verify_is_unit(d)) return "the generators span a subgroup of index " + verify_text(d);
  return std::nullopt;
}

}  // namespace detail

/// Checks the generators of `result` (homology or cohomology of `c` over R, computed with
/// homology_options{.generators = true}) as described at the top of this header. R models
/// euclidean_domain; C models cell_complex and must be the complex the result was computed
/// from. Throws std::invalid_argument if the result has no basis or too few generators were
/// kept to check anything. Cost: a pass over each generator's cells (cohomology: over all
/// (k+1)-cells per generator), one coordinates() call per generator and its multiple, and,
/// for small complexes, a dense homology computation.
template <euclidean_domain R, cell_complex C>
verification_report verify_generators(const C& c, const homology_result<R>& result, verify_options options = {}) {
  if (!result.has_basis()) throw std::invalid_argument("verify_generators: the result was computed without generators");
  verification_report rep;
  auto fail = [&](std::string what) {
    if (rep.ok) rep.first_failure = std::move(what);
    rep.ok = false;
  };
  const bool is_cohomology = result.cohomology;
  const char* H = is_cohomology ? "H^" : "H_";
  const int top = lacuna::top_dimension(c);
  if (result.top_dimension() != top) {
    fail("the result has groups up to " + std::to_string(result.top_dimension()) + ", the complex has dimension " +
         std::to_string(top));
    return rep;
  }

  std::optional<homology_result<R>> dense;
  if (options.dense_cell_limit > 0 && total_cell_count(c) <= options.dense_cell_limit) {
    const homology_options o{.generators = false, .reduced = result.reduced, .keep_basis = true};
    dense = is_cohomology ? cohomology<R>(c, o, dense_elimination{}) : homology<R>(c, o, dense_elimination{});
  }

  for (int k = 0; k <= top; ++k) {
    const auto& g = result[k];
    const std::string where = std::string(H) + std::to_string(k);
    const std::size_t r = g.rank, m = g.torsion.size();
    if (g.generators.size() != r + m || g.orders.size() != r + m) {
      fail(where + ": " + std::to_string(g.generators.size()) + " generators for rank " + std::to_string(r) + " and " +
           std::to_string(m) + " torsion factors");
      continue;
    }
    for (std::size_t i = 0; i < r + m; ++i) {
      const R expect = i < r ? zero<R>() : g.torsion[i - r];
      if (!(g.orders[i] == expect)) fail(where + ": generator " + std::to_string(i) + " has the wrong order label");
    }
    ++rep.checks;
    // Cycles (cocycles), from the complex itself.
    for (std::size_t i = 0; i < r + m; ++i) {
      const auto& z = g.generators[i];
      const std::string gi = where + " generator " + std::to_string(i);
      if (z.dimension != k) {
        fail(gi + " is a chain of dimension " + std::to_string(z.dimension));
        continue;
      }
      if (z.is_zero()) fail(gi + " is the zero chain");
      for (const auto& t : z.terms)
        if (t.cell >= lacuna::cell_count(c, k)) fail(gi + " names cell " + std::to_string(t.cell) + ", out of range");
      if (!rep.ok) continue;
      const auto d = detail::verify_differential(c, z, is_cohomology);
      if (!d.empty())
        fail(gi + (is_cohomology ? " is not a cocycle: δφ is non-zero on (k+1)-cell " : " is not a cycle: ∂z is non-zero on cell ") +
             std::to_string(d.begin()->first));
      if (!is_cohomology && result.reduced && k == 0) {
        R eps = zero<R>();
        for (const auto& t : z.terms) eps += t.coefficient;
        if (!(eps == zero<R>())) fail(gi + " is not a reduced cycle: its augmentation is " + detail::verify_text(eps));
      }
      ++rep.checks;
    }
    if (!rep.ok) continue;
    // The result's own coordinates: unit-diagonal; boundaries and multiples.
    std::vector<std::vector<R>> own;
    for (std::size_t i = 0; i < r + m; ++i) {
      const std::string gi = where + " generator " + std::to_string(i);
      std::vector<R> x;
      try {
        x = result.coordinates(g.generators[i]);
      } catch (const std::exception& e) {
        fail(gi + ": coordinates() threw: " + e.what());
        continue;
      }
      if (x.size() != r + m) {
        fail(gi + ": " + std::to_string(x.size()) + " coordinates");
        continue;
      }
      for (std::size_t j = 0; j < r + m; ++j) {
        if (j == i) {
          const bool unit = j < r ? detail::verify_is_unit(x[j])
                                  : detail::verify_is_unit(lacuna::gcd(x[j], g.torsion[j - r]));
          if (!unit) fail(gi + ": diagonal coordinate " + detail::verify_text(x[j]) + " is not a unit");
        } else if (!(x[j] == zero<R>())) {
          fail(gi + ": coordinate " + std::to_string(j) + " is " + detail::verify_text(x[j]) + ", expected 0");
        }
      }
      if (result.is_boundary(g.generators[i])) fail(gi + " is a boundary");
      if (i >= r) {
        const auto dz = scaled(g.orders[i], g.generators[i]);
        if (!result.is_boundary(dz)) fail(gi + ": order·z is not a boundary");
      }
      own.push_back(std::move(x));
      rep.checks += 3;
    }
    if (!rep.ok) continue;
    if (auto bad = detail::verify_basis(own, g)) fail(where + " (own coordinates): " + *bad);
    ++rep.checks;
    // The independent dense result.
    if (dense) {
      const auto& dg = (*dense)[k];
      bool same = dg.rank == r && dg.torsion.size() == m;
      for (std::size_t j = 0; same && j < m; ++j) same = detail::associates(dg.torsion[j], g.torsion[j]);
      if (!same) {
        fail(where + ": the dense reference finds rank " + std::to_string(dg.rank) + " and " +
             std::to_string(dg.torsion.size()) + " torsion factors, the result rank " + std::to_string(r) + " and " +
             std::to_string(m));
        continue;
      }
      std::vector<std::vector<R>> dc;
      for (std::size_t i = 0; i < r + m; ++i) {
        try {
          dc.push_back(dense->coordinates(g.generators[i]));
        } catch (const std::exception& e) {
          fail(where + " generator " + std::to_string(i) + ": dense coordinates() threw: " + e.what());
        }
      }
      if (!rep.ok) continue;
      if (auto bad = detail::verify_basis(dc, g)) fail(where + " (dense reference): " + *bad);
      rep.checks += 2;
    }
  }
  return rep;
}

}  // namespace lacuna

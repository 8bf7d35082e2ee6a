// lacuna/homology/verify.hpp — a check of the groups and generators of a homology or
// cohomology result, independent of the engine's elimination data where a certificate exists.
//
// Homology, reduced homology, the homology of a pair (the overload with the subcomplex's marks)
// and cohomology over a certifiable_ring (Z, Q, Z/p with p < 2^32 fixed at compile time) — the
// certified check (detail::verify_by_certificate; for the other kinds than homology, steps 3
// and 4 run on the derived complex that the certificate is checked on: augmented, quotient
// C(X)/C(A) or dual, homology/certificate.hpp, the result's generators read as its chains):
//   1. a certificate of the complex (certified_homology, homology/certify.hpp) is checked by
//      check_certificate (homology/certificate.hpp), which shares no code with the engine. A
//      passing check proves H_k ≅ R^r ⊕ ⊕ R/d_i for every k and that the certificate's
//      cochains φ_j induce an isomorphism Φ: H_k → R^r ⊕ ⊕ R/d_i (docs/certificates.md);
//   2. the result's rank and torsion factors are compared with the proved ones, factor by
//      factor (the report names the group and the factor);
//   3. the result's generators: count and order labels; cycles, from lacuna::boundary of the
//      complex; their classes Φ(z_l), by the sparse product of the cochains and the
//      generators. Refused at once: a zero class (a boundary), a free class of finite order
//      or that is not primitive (the gcd of its free coordinates divides det F below), a
//      torsion class whose order lcm d_j / gcd(c_j, d_j) is not its claimed order, and two
//      classes that are units times one basis element;
//   4. spanning: the matrix A of the classes is [[F, 0], [B, T]] (torsion classes have no
//      free coordinates), an automorphism of R^r ⊕ ⊕ R/d_i iff F and T are. When every class
//      is a unit times a distinct basis element (of its own order, for T) both are signed
//      permutations: accepted in linear time. Otherwise the Smith form of A stacked on the
//      relations d_i e_i must be unimodular (finitely generated modules are Hopfian, so a
//      surjection R^r ⊕ ⊕ R/d_i → H_k is an isomorphism): a dense (generators × generators)
//      test, run only up to verify_options::dense_generator_limit generators; beyond, the
//      group is reported as not proved — never accepted.
// Nothing of the verdict rests on the engine's coordinates: only on what check_certificate
// proved and on the complex's own boundaries.
//
// Rings that are not a certifiable_ring (no certificate yet) — the older check
// (detail::verify_by_coordinates), which is not a proof:
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
// Steps 3 and 4 lean on the engine's own elimination data, and step 4 only for small
// complexes: beyond it, this check accepted H_1 = Z ⊕ Z/4 for Z ⊕ Z/2 on a complex of 2170
// cells.
//
// Failures are reported, not thrown: the report holds the first failure in words (and, in the
// certified check, the group and generator). Errors of use (a result without generators)
// throw std::invalid_argument.
#pragma once

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
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
  /// The certified check (homology over a certifiable_ring): the degree k of the group found
  /// wrong, -1 if none or not known.
  int dimension = -1;
  /// The certified check: the generator concerned (torsion factor i is generator rank + i), -1
  /// if none.
  std::ptrdiff_t generator = -1;
  /// ok.
  explicit operator bool() const noexcept { return ok; }
};

/// Options of verify_generators.
struct verify_options {
  /// Cross-check against a dense_elimination result when the complex has at most this many
  /// cells (0: never).
  std::size_t dense_cell_limit = 2000;
  /// The certified check: a group whose generators are not a signed permutation of the
  /// certified basis is tested densely (a matrix of generators by generators) up to this many
  /// generators; beyond, it is reported as not proved.
  std::size_t dense_generator_limit = 2000;
  /// Threads, stop request, progress and memory limit of the certificate's computation.
  run_control control{};
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

namespace detail {

/// The older check, through the result's own coordinates() and, for small complexes, a dense
/// result (steps 1-4 at the top of this header): what verify_generators still runs for the
/// results that have no certificate yet (cohomology, reduced homology, rings that are not
/// certifiable_ring). It is not a proof: see the top of this header.
template <euclidean_domain R, cell_complex C>
verification_report verify_by_coordinates(const C& c, const homology_result<R>& result, verify_options options) {
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

}  // namespace detail

namespace detail {

/// Steps 2-4 of the certified check on a complex cx whose certificate `cert` check_certificate
/// has passed: the claimed groups (by degree of cx, generators as chains of cx) against the
/// proved ones; failures named by nm (the report's dimension in the result's degrees).
template <class R, cell_complex CX>
void compare_with_certificate(const CX& c, const homology_certificate<R>& cert, const std::vector<homology_group<R>>& claimed,
                              const cert::naming& nm, const verify_options& options, verification_report& rep) {
  auto fail = [&](int k, std::ptrdiff_t j, std::string what) {
    if (rep.ok) {
      rep.first_failure = std::move(what);
      rep.dimension = k < 0 ? -1 : nm.degree(k);
      rep.generator = j;
    }
    rep.ok = false;
  };
  const int top = lacuna::top_dimension(c);
  for (int k = 0; k <= top; ++k) {
    const auto& g = claimed[static_cast<std::size_t>(k)];
    const auto& cg = cert.groups[static_cast<std::size_t>(k)];
    const std::string H = nm.group(k);
    const std::size_t r = cg.rank, m = cg.torsion.size(), N = r + m;
    // 2. The claimed group against the proved one: the rank, then factor by factor.
    if (g.rank != r) {
      fail(k, -1, H + ": the result claims rank " + std::to_string(g.rank) + ", the certificate proves rank " +
                      std::to_string(r));
      continue;
    }
    for (std::size_t i = 0; i < std::max(m, g.torsion.size()) && rep.ok; ++i) {
      const std::string T = H + " torsion factor " + std::to_string(i);
      if (i >= m)
        fail(k, static_cast<std::ptrdiff_t>(r + i), T + ": the result claims order " + verify_text(g.torsion[i]) +
                                                        ", the certificate proves only " + std::to_string(m) + " torsion factors");
      else if (i >= g.torsion.size())
        fail(k, static_cast<std::ptrdiff_t>(r + i), T + ": the certificate proves a factor of order " + verify_text(cg.torsion[i]) +
                                                        ", the result leaves it out");
      else if (!associates(g.torsion[i], cg.torsion[i]))
        fail(k, static_cast<std::ptrdiff_t>(r + i), T + ": the result claims order " + verify_text(g.torsion[i]) +
                                                        ", the certificate proves order " + verify_text(cg.torsion[i]));
    }
    if (!rep.ok) continue;
    ++rep.checks;
    auto label = [&](std::size_t j) {
      return j < r ? H + " free generator " + std::to_string(j)
                   : H + " torsion factor " + std::to_string(j - r) + " (order " + verify_text(cg.torsion[j - r]) + ")";
    };
    if (g.generators.size() != N || g.orders.size() != N) {
      fail(k, -1, H + ": " + std::to_string(g.generators.size()) + " generators and " + std::to_string(g.orders.size()) +
                      " orders for rank " + std::to_string(r) + " and " + std::to_string(m) + " torsion factors");
      continue;
    }
    for (std::size_t j = 0; j < N && rep.ok; ++j)
      if (!associates(g.orders[j], j < r ? zero<R>() : cg.torsion[j - r]))
        fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator is labelled with order " + verify_text(g.orders[j]));
    if (!rep.ok) continue;
    // 3. The generators: cycles of the complex (its own boundaries), then their classes read in
    // the certified cochains — Φ(z_l), the sparse product Φᵀ Z over the cells where a cochain
    // and a generator meet (no matrix of generators by generators).
    const std::size_t nk = lacuna::cell_count(c, k);
    for (std::size_t j = 0; j < N && rep.ok; ++j) {
      const auto& z = g.generators[j];
      if (z.dimension != k) {
        fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator is a chain of dimension " + std::to_string(z.dimension));
        break;
      }
      for (const auto& t : z.terms)
        if (t.cell >= nk) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator names cell " + std::to_string(t.cell) + ", out of range");
          break;
        }
      if (!rep.ok) break;
      for (const auto& [cell, v] : cert::boundary_of(c, z))
        if (!(v == zero<R>())) {
          fail(k, static_cast<std::ptrdiff_t>(j), label(j) + ": the generator is not " + nm.cycle + " (its " + nm.boundary + " is " + verify_text(v) +
                                                      " on " + nm.cell(k - 1, cell) + ")");
          break;
        }
      ++rep.checks;
    }
    if (!rep.ok) continue;
    std::vector<std::size_t> start(nk + 1, 0);
    std::vector<std::pair<std::uint32_t, R>> values;
    for (const auto& phi : cg.cocycles)
      for (const auto& t : phi.terms) ++start[t.cell + 1];
    for (std::size_t x = 0; x < nk; ++x) start[x + 1] += start[x];
    values.resize(start[nk], {0, zero<R>()});
    {
      std::vector<std::size_t> fill(start.begin(), start.end() - 1);
      for (std::size_t j = 0; j < N; ++j)
        for (const auto& t : cg.cocycles[j].terms) values[fill[t.cell]++] = {static_cast<std::uint32_t>(j), t.coefficient};
    }
    auto modulus = [&](std::size_t j) { return j < r ? zero<R>() : cg.torsion[j - r]; };
    // coordinates[l]: the non-zero coordinates of Φ(z_l) (torsion ones as residues mod d_j).
    std::vector<std::vector<std::pair<std::uint32_t, R>>> coordinates(N);
    std::vector<std::int64_t> image(N, -1);  // monomial test: the coordinate each generator goes to
    std::vector<char> taken(N, 0);
    bool monomial = true;
    for (std::size_t l = 0; l < N && rep.ok; ++l) {
      std::map<std::uint32_t, R> col;
      for (const auto& t : g.generators[l].terms)
        for (std::size_t q = start[t.cell]; q < start[t.cell + 1]; ++q) {
          auto [it, fresh] = col.try_emplace(values[q].first, zero<R>());
          it->second += values[q].second * t.coefficient;
        }
      for (auto& [j, v] : col) {
        R x = j < r ? v : canonical_residue(v, modulus(j));
        if (!(x == zero<R>())) coordinates[l].push_back({j, std::move(x)});
      }
      // The class's order from its coordinates: infinite if a free one is non-zero, else the
      // lcm of d_j / gcd(c_j, d_j) (Φ is an isomorphism, so this is the order in H_k).
      bool free_part = false;
      R order = one<R>();
      for (const auto& [j, x] : coordinates[l]) {
        if (j < r) {
          free_part = true;
          continue;
        }
        const R part = div_rem(modulus(j), lacuna::gcd(x, modulus(j))).quotient;
        order = div_rem(order, lacuna::gcd(order, part)).quotient * part;
      }
      if (coordinates[l].empty()) {
        fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator is a boundary (its class is zero)");
        break;
      }
      if (l < r && !free_part) {
        fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator's class has finite order " + verify_text(normalize(order)) +
                                                    ", not infinite");
        break;
      }
      if (l >= r && free_part) {
        fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator's class has infinite order");
        break;
      }
      if (l >= r && !associates(order, modulus(l))) {
        fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator's class has order " + verify_text(normalize(order)));
        break;
      }
      // A free class is primitive: the gcd of its free coordinates divides the determinant of
      // F (below), so it must be a unit.
      if (l < r) {
        R gl = zero<R>();
        for (const auto& [j, x] : coordinates[l])
          if (j < r) gl = lacuna::gcd(gl, x);
        if (!verify_is_unit(gl)) {
          fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator's class is " + verify_text(normalize(gl)) +
                                                      " times a class, so the generators do not span " + H);
          break;
        }
      }
      // Monomial: a free generator has one non-zero free coordinate, a unit; a torsion one
      // one non-zero coordinate, a unit modulo its d_j = d_l; no coordinate taken twice.
      std::int64_t at = -1;
      for (const auto& [j, x] : coordinates[l]) {
        if ((l < r) != (j < r)) continue;  // a free generator's torsion part does not matter
        const bool unit = j < r ? verify_is_unit(x) : verify_is_unit(lacuna::gcd(x, modulus(j)));
        if (at >= 0 || !unit || (j >= r && !associates(modulus(j), modulus(l)))) {
          at = -2;
          break;
        }
        at = j;
      }
      if (at >= 0 && taken[static_cast<std::size_t>(at)]) {
        // Two classes that are each a unit times the same basis element (of the same order)
        // generate a cyclic group: they cannot both be basis elements.
        std::size_t other = 0;
        while (image[other] != at) ++other;
        fail(k, static_cast<std::ptrdiff_t>(l), label(l) + ": the generator's class is a unit times that of generator " +
                                                    std::to_string(other) + ", so the generators do not span " + H);
        break;
      }
      if (at < 0) monomial = false;
      else taken[static_cast<std::size_t>(at)] = 1, image[l] = at;
      ++rep.checks;
    }
    if (!rep.ok) continue;
    // 4. Spanning. The matrix A of the classes in the certified basis is block triangular,
    // [[F, 0], [B, T]] (the free rows of a torsion class vanish), so it is an automorphism of
    // R^r ⊕ ⊕ R/d_i when F is one of R^r and T one of ⊕ R/d_i. When every column is one unit
    // at a distinct place (of the same modulus, for T), both are: signed permutations.
    // Then generators ↦ A is an isomorphism R^r ⊕ ⊕ R/d_i → H_k (Φ is one), so they are a basis.
    if (monomial) {
      ++rep.checks;
      continue;
    }
    // Otherwise the Smith form of A stacked on the relations d_i e_i (the classes span iff it
    // is unimodular), dense: only up to dense_generator_limit generators.
    if (N > options.dense_generator_limit) {
      fail(k, -1, H + ": the classes of the " + std::to_string(N) + " generators are not a signed permutation of the "
                      "certified basis, and more than verify_options::dense_generator_limit = " +
                      std::to_string(options.dense_generator_limit) + " generators are too many for the dense test that "
                      "they span: not proved");
      continue;
    }
    std::vector<std::vector<R>> dense(N, std::vector<R>(N, zero<R>()));
    for (std::size_t l = 0; l < N; ++l)
      for (const auto& [j, x] : coordinates[l]) dense[l][j] = x;
    homology_group<R> group;
    group.rank = r;
    group.torsion = cg.torsion;
    group.orders = g.orders;
    if (auto bad = verify_basis(dense, group)) fail(k, -1, H + ": in the certified basis, " + *bad);
    ++rep.checks;
  }
}


/// The certified check of a homology result (the top of this header): a certificate of the
/// complex, produced by certified_homology and checked by check_certificate, then the result's
/// claims compared with what it proves and its generators read in its cocycles.
template <certifiable_ring R, cell_complex C>
verification_report verify_by_certificate(const C& c, const homology_result<R>& result, verify_options options,
                                          const std::vector<std::vector<bool>>* marks) {
  verification_report rep;
  auto fail = [&](int k, std::ptrdiff_t j, std::string what) {
    if (rep.ok) {
      rep.first_failure = std::move(what);
      rep.dimension = k;
      rep.generator = j;
    }
    rep.ok = false;
  };
  const int top = lacuna::top_dimension(c);
  if (result.top_dimension() != top) {
    fail(-1, -1, "the result has groups up to " + std::to_string(result.top_dimension()) +
                     ", the complex has dimension " + std::to_string(top));
    return rep;
  }
  // 1. A certificate of the complex's homology, checked by the checker alone: nothing below
  // rests on the engine's elimination data, only on what check_certificate proved.
  const certificate_kind kind = result.cohomology ? certificate_kind::cohomology
                                : result.reduced  ? certificate_kind::reduced
                                : result.relative ? certificate_kind::relative
                                                  : certificate_kind::absolute;
  certified_homology_result<R> cr;
  try {
    const homology_options o{.reduced = kind == certificate_kind::reduced, .control = options.control};
    cr = kind == certificate_kind::relative     ? certified_relative_homology<R>(c, *marks, o)
         : kind == certificate_kind::cohomology ? certified_cohomology<R>(c, o)
                                                : certified_homology<R>(c, o);
  } catch (const std::exception& e) {
    fail(-1, -1, std::string("no certificate of the complex's homology could be produced, so nothing is proved: ") + e.what());
    return rep;
  }
  const auto& cert = cr.certificate;
  {
    const auto crep = marks ? check_certificate(c, cert, *marks) : check_certificate(c, cert);
    rep.checks += crep.checks;
    if (!crep.ok) {
      fail(crep.dimension, crep.generator,
           "the certificate of the complex's homology does not check, so nothing is proved: " + crep.first_failure);
      return rep;
    }
  }
  // By the check, for every k: H_k ≅ R^r ⊕ ⊕ R/d_i (r, d_i those of the certificate), and the
  // certificate's cochains φ_j induce an isomorphism Φ: H_k → R^r ⊕ ⊕ R/d_i
  // (docs/certificates.md, "What a passing check proves": Φ∘ι = id with ι onto, K = 0).
  if (kind == certificate_kind::absolute) {
    compare_with_certificate(c, cert, result.groups, cert::naming{}, options, rep);
    return rep;
  }
  // The other kinds: the certificate and the result's generators on the derived complex
  // (augmented, quotient or dual) that check_certificate checked.
  cert::view<C> v;
  std::string why;
  homology_certificate<R> inside;
  int at = -1;
  if (!cert::build_view(c, kind, marks, v, why) || !cert::certificate_into(v, cert, inside, why, at)) {
    fail(at, -1, "the certificate cannot be read on the derived complex: " + why);
    return rep;
  }
  const cert::naming nm = v.names();
  std::vector<homology_group<R>> claimed(static_cast<std::size_t>(v.cx.top + 1));
  for (int j = 0; j <= v.cx.top && rep.ok; ++j) {
    const int k = v.degree(j);
    if (k < 0 || k > top) continue;  // H̃_{−1}: claimed zero
    auto& g = claimed[static_cast<std::size_t>(j)];
    g = result[k];
    for (std::size_t i = 0; i < g.generators.size(); ++i)
      if (!cert::chain_into(v, result[k].generators[i], k, j, g.generators[i], why)) {
        fail(k, static_cast<std::ptrdiff_t>(i), nm.group(j) + ": generator " + std::to_string(i) + " " + why);
        return rep;
      }
  }
  compare_with_certificate(v.cx, inside, claimed, nm, options, rep);
  return rep;
}

}  // namespace detail

/// Checks the generators of `result` (homology or cohomology of `c` over R, computed with
/// homology_options{.generators = true}) as described at the top of this header. R models
/// euclidean_domain; C models cell_complex and must be the complex the result was computed
/// from. Throws std::invalid_argument if the result has no generators.
/// Over a certifiable_ring (homology, reduced homology, cohomology): the certified check — the verdict rests
/// only on check_certificate and the complex's own boundaries; a wrong group, factor, order or
/// generator is refused at any size, and the report names the group (`dimension`) and the
/// generator or torsion factor (`generator`: torsion factor i is rank + i). Cost: that of
/// certified_homology and check_certificate (docs/certificates.md, "Cost"), plus a pass over
/// each generator's cells; a dense (generators × generators) test only for generators that are
/// not a signed permutation of the certified ones, and up to dense_generator_limit.
/// Other rings: the older check through the result's own coordinates (not a proof; the top of
/// this header). A relative result (relative_homology) is refused (std::invalid_argument):
/// it is checked by the overload below, with its subcomplex.
template <euclidean_domain R, cell_complex C>
verification_report verify_generators(const C& c, const homology_result<R>& result, verify_options options = {}) {
  if (!result.has_basis()) throw std::invalid_argument("verify_generators: the result was computed without generators");
  if (result.relative)
    throw std::invalid_argument("verify_generators: a relative result is checked against its subcomplex (the overload "
                                "that takes the marks)");
  if constexpr (certifiable_ring<R>) return detail::verify_by_certificate(c, result, options, nullptr);
  return detail::verify_by_coordinates(c, result, options);
}

/// Checks the generators of a relative result H_k(c, A) (relative_homology with generators),
/// A the subcomplex of the cells marked in `in_subcomplex`, as the overload above: over a
/// certifiable_ring through a certificate of the pair (certified_relative_homology,
/// check_certificate with the marks: the marks are checked to be a subcomplex), the
/// generators read as chains of C(c)/C(A) (their terms on A are zero there). Other rings:
/// std::invalid_argument (no check of relative results without a certificate).
template <euclidean_domain R, cell_complex C>
verification_report verify_generators(const C& c, const std::vector<std::vector<bool>>& in_subcomplex,
                                      const homology_result<R>& result, verify_options options = {}) {
  if (!result.has_basis()) throw std::invalid_argument("verify_generators: the result was computed without generators");
  if (!result.relative) throw std::invalid_argument("verify_generators: the result is not the homology of a pair");
  if constexpr (certifiable_ring<R>)
    return detail::verify_by_certificate(c, result, options, &in_subcomplex);
  else
    throw std::invalid_argument("verify_generators: relative results are checked over the integers, Q and Z/p only");
}

}  // namespace lacuna

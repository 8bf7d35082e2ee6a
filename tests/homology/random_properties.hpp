// The randomized property suite (issue 7 §3), shared by tests/homology/random_properties.cpp
// (short, the default run) and random_properties.long.cpp (label "long"): generators of
// random complexes — simplicial, cubical volumes, cell lists (quotients of random simplicial
// complexes by random subcomplexes, i.e. cells merged; suspensions; wedges; presentation
// complexes) — and checks of theorems on them. Every expectation comes from a theorem applied
// to values computed another way; each check names its theorem. What
// tests/homology/random_variants.long.cpp already covers (variants, UCT and χ on random
// simplicial and presentation complexes over Z, Z/2, Z/3, Q) is not repeated here.
#pragma once

#include "support.hpp"

#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/construct/quotient.hpp>
#include <lacuna/complex/construct/suspension.hpp>
#include <lacuna/complex/construct/wedge.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <cstdint>
#include <map>
#include <random>
#include <string>
#include <vector>

namespace random_test {

using lacuna::cell_list;
using lacuna::integer;
using lacuna_test::group;
using marks_t = std::vector<std::vector<bool>>;

inline constexpr std::uint64_t m61 = (std::uint64_t{1} << 61U) - 1;  // prime (ring_primality.cpp)

// ---- generators --------------------------------------------------------------------------

/// Random facets of dimension 1..max_dim on `vertices` vertices.
inline lacuna::simplicial_complex<int> random_simplicial(std::mt19937_64& rng, int vertices, int max_dim, int count) {
  std::vector<std::vector<int>> fs;
  std::uniform_int_distribution<int> dim(1, max_dim);
  for (int i = 0; i < count; ++i) {
    std::vector<int> vs(static_cast<std::size_t>(vertices));
    for (int v = 0; v < vertices; ++v) vs[static_cast<std::size_t>(v)] = v;
    std::shuffle(vs.begin(), vs.end(), rng);
    vs.resize(static_cast<std::size_t>(dim(rng) + 1));
    fs.push_back(vs);
  }
  return lacuna_test::facets(fs);
}

/// A random volume of voxels, each on with probability `density`.
template <std::size_t D>
lacuna::cubical_complex<D> random_volume(std::mt19937_64& rng, const std::array<std::size_t, D>& extents, double density) {
  std::bernoulli_distribution on(density);
  return lacuna::cubical_complex<D>::from_predicate(extents, [&](const auto&) { return on(rng); });
}

/// Marks of the closure of randomly chosen cells (each with probability p): a subcomplex.
template <class C>
marks_t random_subcomplex(std::mt19937_64& rng, const C& c, double p) {
  const int top = lacuna::top_dimension(c);
  marks_t m(static_cast<std::size_t>(top + 1));
  for (int k = 0; k <= top; ++k) m[static_cast<std::size_t>(k)].assign(lacuna::cell_count(c, k), false);
  std::bernoulli_distribution coin(p);
  for (int k = top; k >= 0; --k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      if (!m[static_cast<std::size_t>(k)][i] && !coin(rng)) continue;
      m[static_cast<std::size_t>(k)][i] = true;
      if (k > 0)
        for (auto&& t : lacuna::boundary(c, k, i)) m[static_cast<std::size_t>(k - 1)][lacuna::as_incidence(t).face] = true;
    }
  return m;
}

/// A presentation complex: one vertex, g loops, r 2-cells with random coefficients in
/// [-range, range], some 2-cells doubled and each pair joined by a 3-cell k(R - R') (∂∂ = 0
/// because the loops have zero boundary and the twins equal boundaries).
inline cell_list random_presentation(std::mt19937_64& rng, int g, int r, int range) {
  cell_list c;
  c.add_cell(0, "v");
  std::uniform_int_distribution<int> coef(-range, range), deg(2, 6);
  for (int i = 0; i < g; ++i) c.add_cell(1, "", {{0, 1}, {0, -1}});
  std::vector<std::vector<lacuna::incidence>> rel;
  for (int j = 0; j < r; ++j) {
    std::vector<lacuna::incidence> t;
    for (int i = 0; i < g; ++i)
      if (rng() % 3 != 0) t.push_back({static_cast<std::size_t>(i), coef(rng)});
    rel.push_back(t);
    c.add_cell(2, "", t);
  }
  for (int j = 0; j < r; ++j)
    if (rng() % 2 == 1) {
      const auto twin = c.add_cell(2, "", rel[static_cast<std::size_t>(j)]);
      const std::int64_t k = deg(rng);
      c.add_cell(3, "", {{static_cast<std::size_t>(j), k}, {twin, -k}});
    }
  return c;
}

/// A random cell list, by one of four constructions (chosen by `kind` % 4): X/A for random
/// simplicial X and subcomplex A (A's cells merged into one vertex), ΣX, X ∨ Y, or a
/// presentation complex.
inline cell_list random_cell_list(std::mt19937_64& rng, int kind, int size) {
  switch (kind % 4) {
    case 0: {
      const auto x = random_simplicial(rng, 6 + size % 3, 3, 4 + size);
      const auto a = random_subcomplex(rng, x, 0.15);
      return lacuna::quotient(x, [&](int k, std::size_t i) { return static_cast<bool>(a[static_cast<std::size_t>(k)][i]); });
    }
    case 1: return lacuna::suspension(random_presentation(rng, 1 + size % 3, size % 4, 6));
    case 2: return lacuna::wedge(random_presentation(rng, 1 + size % 2, 1 + size % 3, 5), random_simplicial(rng, 5, 2, 3 + size % 4));
    default: return random_presentation(rng, 1 + size % 5, size % 6, 12);
  }
}

// ---- helpers -----------------------------------------------------------------------------

/// Groups with trailing zero groups removed (complexes of different top dimension compare).
inline std::vector<group> trim(std::vector<group> g) {
  while (!g.empty() && g.back() == group{}) g.pop_back();
  return g;
}

template <class R>
std::vector<std::size_t> betti(const lacuna::homology_result<R>& h) {
  auto b = h.betti_numbers();
  while (!b.empty() && b.back() == 0) b.pop_back();
  return b;
}

/// A decimal string as lacuna::integer.
inline integer num(const std::string& t) { return integer(integer::big_type(t)); }

inline bool divides(std::uint64_t p, const std::string& t) { return num(t) % integer(static_cast<std::int64_t>(p)) == integer(0); }

/// X ∪ CA: the cells of X, an apex, and for each cell σ of A a cone cell cσ of one dimension
/// more with ∂(cv) = v - apex for a vertex and ∂(cσ) = σ - c(∂σ) above (so ∂∂ = 0 when
/// every edge's boundary has coefficient sum 0, as for all complexes here; validate checks).
template <class C>
cell_list with_cone_on(const C& x, const marks_t& a) {
  cell_list out;
  const int top = lacuna::top_dimension(x);
  for (int k = 0; k <= top; ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i) {
      std::vector<lacuna::incidence> t;
      for (auto&& v : lacuna::boundary(x, k, i)) t.push_back(lacuna::as_incidence(v));
      out.add_cell(k, "", t);
    }
  const std::size_t apex = out.add_cell(0, "apex");
  std::vector<std::vector<std::size_t>> cone(static_cast<std::size_t>(top + 1));
  for (int k = 0; k <= top; ++k) {
    auto& ck = cone[static_cast<std::size_t>(k)];
    ck.assign(lacuna::cell_count(x, k), 0);
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i) {
      if (!a[static_cast<std::size_t>(k)][i]) continue;
      std::vector<lacuna::incidence> t{{i, 1}};
      if (k == 0)
        t.push_back({apex, -1});
      else
        for (auto&& v : lacuna::boundary(x, k, i)) {
          const auto f = lacuna::as_incidence(v);
          t.push_back({cone[static_cast<std::size_t>(k - 1)][f.face], -f.coefficient});
        }
      ck[i] = out.add_cell(k + 1, "", t);
    }
  }
  return out;
}

// ---- checks ------------------------------------------------------------------------------

/// ∂∂ = 0 (the defining property of a chain complex), computed here in 128 bits from the
/// boundaries the complex reports, independently of lacuna::validate (which is run too).
template <class C>
void check_dd_zero(const C& c) {
  __extension__ using i128 = __int128;
  lacuna::validate(c);
  for (int k = 2; k <= lacuna::top_dimension(c); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      std::map<std::size_t, i128> sum;
      for (auto&& v : lacuna::boundary(c, k, i)) {
        const auto f = lacuna::as_incidence(v);
        for (auto&& w : lacuna::boundary(c, k - 1, f.face)) {
          const auto g = lacuna::as_incidence(w);
          sum[g.face] += static_cast<i128>(f.coefficient) * g.coefficient;
        }
      }
      for (const auto& [face, s] : sum) {
        INFO("k = ", k, ", cell ", i, ", face ", face);
        CHECK(s == 0);
      }
    }
}

/// χ = Σ (-1)^k n_k = Σ (-1)^k dim H_k(X; F) for every field F (Euler–Poincaré; Hatcher 2002,
/// Theorem 2.44), over Q, Z/2 (z2), Z/3, Z/(2^61 - 1), Z/65521 at run time, and the ranks
/// over Z.
template <class C>
void check_euler(const C& c) {
  std::int64_t chi = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    chi += (k % 2 ? -1 : 1) * static_cast<std::int64_t>(lacuna::cell_count(c, k));
  const auto alt = [](const std::vector<std::size_t>& b) {
    std::int64_t s = 0;
    for (std::size_t k = 0; k < b.size(); ++k) s += (k % 2 ? -1 : 1) * static_cast<std::int64_t>(b[k]);
    return s;
  };
  CHECK(alt(lacuna::homology<integer>(c).betti_numbers()) == chi);
  CHECK(alt(lacuna::homology<lacuna::rational>(c).betti_numbers()) == chi);
  CHECK(alt(lacuna::homology<lacuna::z2>(c).betti_numbers()) == chi);
  CHECK(alt(lacuna::homology<lacuna::mod_p<3>>(c).betti_numbers()) == chi);
  CHECK(alt(lacuna::homology<lacuna::mod_p<m61>>(c).betti_numbers()) == chi);
  CHECK(alt(lacuna::homology<lacuna::mod_p_dynamic>(c, {}, {}, lacuna::mod_p_dynamic(1, 65521)).betti_numbers()) == chi);
}

/// The universal coefficient theorem for homology (Hatcher 2002, Theorem 3A.3):
/// H_k(X; Z/p) = H_k(X) ⊗ Z/p ⊕ Tor(H_{k-1}(X), Z/p), so dim = rank H_k + #{torsion factors
/// of H_k divisible by p} + #{those of H_{k-1}}; over Q, dim = rank H_k. Predicted from the
/// integral groups, compared with the engine over each field.
template <class C>
void check_uct(const C& c, const std::vector<group>& hz) {
  const auto predict = [&](std::uint64_t p) {
    std::vector<std::size_t> b;
    for (std::size_t k = 0; k < hz.size(); ++k) {
      std::size_t d = hz[k].rank;
      for (const auto& t : hz[k].torsion) d += divides(p, t);
      if (k > 0)
        for (const auto& t : hz[k - 1].torsion) d += divides(p, t);
      b.push_back(d);
    }
    while (!b.empty() && b.back() == 0) b.pop_back();
    return b;
  };
  CHECK(betti(lacuna::homology<lacuna::z2>(c)) == predict(2));
  CHECK(betti(lacuna::homology<lacuna::mod_p<3>>(c)) == predict(3));
  CHECK(betti(lacuna::homology<lacuna::mod_p<5>>(c)) == predict(5));
  CHECK(betti(lacuna::homology<lacuna::mod_p<m61>>(c)) == predict(m61));
  std::vector<std::size_t> q;
  for (const auto& g : hz) q.push_back(g.rank);
  while (!q.empty() && q.back() == 0) q.pop_back();
  CHECK(betti(lacuna::homology<lacuna::rational>(c)) == q);
}

/// The Künneth prediction for H_n(X × Y; Z) (Hatcher 2002, Theorem 3B.6):
/// ⊕_{i+j=n} H_i(X) ⊗ H_j(Y) ⊕ ⊕_{i+j=n-1} Tor(H_i(X), H_j(Y)), with Z/s ⊗ Z/t =
/// Tor(Z/s, Z/t) = Z/gcd(s, t).
inline std::vector<group> kunneth(const std::vector<group>& x, const std::vector<group>& y) {
  std::vector<group> out;
  if (x.empty() || y.empty()) return out;
  for (std::size_t n = 0; n + 1 < x.size() + y.size(); ++n) {
    std::size_t rank = 0;
    std::vector<integer> cyc;
    for (std::size_t i = 0; i < x.size(); ++i) {
      if (n >= i && n - i < y.size()) {
        const auto &a = x[i], &b = y[n - i];
        rank += a.rank * b.rank;
        for (const auto& t : a.torsion)
          for (std::size_t r = 0; r < b.rank; ++r) cyc.push_back(num(t));
        for (const auto& t : b.torsion)
          for (std::size_t r = 0; r < a.rank; ++r) cyc.push_back(num(t));
        for (const auto& s : a.torsion)
          for (const auto& t : b.torsion) cyc.push_back(lacuna::gcd(num(s), num(t)));
      }
      if (n >= i + 1 && n - 1 - i < y.size())  // Tor terms
        for (const auto& s : x[i].torsion)
          for (const auto& t : y[n - 1 - i].torsion) cyc.push_back(lacuna::gcd(num(s), num(t)));
    }
    out.push_back({rank, lacuna_test::invariant_factors(cyc)});
  }
  return out;
}

/// Künneth on X × Y: over Z with the Tor terms, and over the field Z/3 (where Tor vanishes:
/// β_n(X × Y) = Σ_{i+j=n} β_i(X) β_j(Y)).
template <class X, class Y>
void check_kunneth(const X& x, const Y& y) {
  const auto p = lacuna::product(x, y);
  const auto want = trim(kunneth(lacuna_test::groups_of(lacuna::homology<integer>(x)), lacuna_test::groups_of(lacuna::homology<integer>(y))));
  INFO("predicted ", lacuna_test::show(want));
  CHECK(trim(lacuna_test::groups_of(lacuna::homology<integer>(p))) == want);
  CHECK(trim(lacuna_test::groups_of(lacuna::homology<integer>(p, {}, lacuna::dense_elimination{}))) == want);
  const auto bx = lacuna::homology<lacuna::mod_p<3>>(x).betti_numbers(), by = lacuna::homology<lacuna::mod_p<3>>(y).betti_numbers();
  std::vector<std::size_t> conv(bx.size() + by.size(), 0);
  for (std::size_t i = 0; i < bx.size(); ++i)
    for (std::size_t j = 0; j < by.size(); ++j) conv[i + j] += bx[i] * by[j];
  while (!conv.empty() && conv.back() == 0) conv.pop_back();
  CHECK(betti(lacuna::homology<lacuna::mod_p<3>>(p)) == conv);
}

/// rank_p(A) = the number of invariant factors of A over Z not divisible by p (reduce the
/// Smith form U A V = D mod p), against the field reductions (every variant, with and
/// without clearing) and against dim H_k(X; Z/p) = n_k - r_k - r_{k+1} from the engine.
template <std::uint64_t P, class C>
void check_field_vs_smith(const C& c) {
  using F = lacuna::mod_p<P>;
  const int top = lacuna::top_dimension(c);
  std::vector<lacuna::sparse_matrix<F>> mats;
  std::vector<std::size_t> r(static_cast<std::size_t>(top) + 2, 0);
  for (int k = 1; k <= top; ++k) {
    const auto s = lacuna::smith_normal_form(lacuna::boundary_matrix<integer>(c, k));
    std::size_t want = 0;
    for (const auto& f : s.factors) want += !(f % integer(static_cast<std::int64_t>(P)) == integer(0));
    const auto m = lacuna::boundary_matrix<F>(c, k);
    CAPTURE(k);
    CHECK(lacuna::reduce_columns(m).rank == want);
    CHECK(lacuna::reduce_columns(m, {}, lacuna::standard_reduction{}).rank == want);
    CHECK(lacuna::reduce_columns(m, {}, lacuna::word_mod_p{.dense_threshold = 1}).rank == want);
    CHECK(lacuna::reduce_columns(lacuna::boundary_matrix<lacuna::mod_p_dynamic>(c, k, lacuna::mod_p_dynamic(1, P))).rank == want);
    mats.push_back(m);
    r[static_cast<std::size_t>(k)] = want;
  }
  if (!mats.empty()) {
    const auto cleared = lacuna::reduce_chain_complex(mats);  // clearing (Chen & Kerber 2011)
    for (std::size_t k = 0; k < cleared.size(); ++k) CHECK(cleared[k].rank == r[k + 1]);
  }
  const auto h = lacuna::homology<F>(c);
  for (int k = 0; k <= top; ++k)
    CHECK(h[k].rank == lacuna::cell_count(c, k) - r[static_cast<std::size_t>(k)] - r[static_cast<std::size_t>(k) + 1]);
}

/// A pair (X, A): the long exact sequence is exact (Hatcher 2002, Theorem 2.16), over Z and
/// Z/2; H_n(X, A) = H̃_n(X ∪ CA) (CA is contractible, so H_n(X, A) ≅ H_n(X ∪ CA, CA) ≅
/// H̃_n(X ∪ CA): excision and the sequence of the pair, Hatcher 2002, Prop. 2.22 and
/// Example 2.23's argument) = H̃_n(X/A) (Prop. 2.22); χ(X) = χ(A) + χ(X, A) (additivity of χ
/// over the short exact sequence 0 → C(A) → C(X) → C(X, A) → 0).
template <class C>
void check_pair(const C& x, const marks_t& a) {
  const auto seq = lacuna::long_exact_sequence<integer>(x, a);
  const auto rep = seq.check();
  if (const auto* bad = rep.first_failure()) MESSAGE(bad->message);
  CHECK(rep.exact);
  CHECK(lacuna::long_exact_sequence<lacuna::mod_p<2>>(x, a).check().exact);
  const auto rel = trim(lacuna_test::groups_of(lacuna::relative_homology<integer>(x, a)));
  CHECK(trim(lacuna_test::groups_of(seq.hXA)) == rel);
  CHECK(trim(lacuna_test::groups_of(lacuna::relative_homology<integer>(x, a, {}, lacuna::dense_elimination{}))) == rel);
  const auto xca = with_cone_on(x, a);
  check_dd_zero(xca);
  INFO("H(X, A) = ", lacuna_test::show(rel));
  CHECK(trim(lacuna_test::groups_of(lacuna::homology<integer>(xca, {.reduced = true}))) == rel);
  const auto q = lacuna::quotient(x, [&](int k, std::size_t i) { return static_cast<bool>(a[static_cast<std::size_t>(k)][i]); });
  CHECK(trim(lacuna_test::groups_of(lacuna::homology<integer>(q, {.reduced = true}))) == rel);
  std::int64_t chi_x = 0, chi_a = 0;
  for (int k = 0; k <= lacuna::top_dimension(x); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(x, k); ++i) {
      chi_x += k % 2 ? -1 : 1;
      chi_a += a[static_cast<std::size_t>(k)][i] ? (k % 2 ? -1 : 1) : 0;
    }
  std::int64_t chi_rel = 0;
  for (std::size_t k = 0; k < rel.size(); ++k) chi_rel += (k % 2 ? -1 : 1) * static_cast<std::int64_t>(rel[k].rank);
  CHECK(chi_x == chi_a + chi_rel);
}

/// Homology is a topological invariant and |sd X| = |X| (Hatcher 2002, Theorem 2.27 with
/// §2.1): the groups of the barycentric subdivision equal those of X.
template <class C>
void check_subdivision(const C& c) {
  const auto sd = lacuna::barycentric_subdivision(c);
  CHECK(trim(lacuna_test::groups_of(lacuna::homology<integer>(sd))) == trim(lacuna_test::groups_of(lacuna::homology<integer>(c))));
}

// ---- suites (the .cpp files choose seeds and sizes) ---------------------------------------

/// Every check on one complex whose integral groups are computed by all_variants (sparse,
/// Markowitz only, dense; generators verified).
template <class C>
void check_all(std::mt19937_64& rng, const C& c, bool subdivide) {
  check_dd_zero(c);
  const auto hz = lacuna_test::all_variants<integer>(c);
  lacuna_test::all_variants<lacuna::mod_p<3>>(c);
  check_euler(c);
  check_uct(c, hz);
  check_field_vs_smith<2>(c);
  check_field_vs_smith<3>(c);
  check_field_vs_smith<m61>(c);
  if (subdivide) check_subdivision(c);
  check_pair(c, random_subcomplex(rng, c, 0.1));
}

/// Random 2D and 3D volumes: `trials` of each.
inline void suite_cubical(std::uint64_t seed, int trials, std::size_t side) {
  std::mt19937_64 rng(seed);
  for (int t = 0; t < trials; ++t) {
    CAPTURE(t);
    const double density = 0.35 + 0.1 * (t % 5);
    const auto v2 = random_volume<2>(rng, {side + 1, side}, density);
    check_all(rng, v2, t % 2 == 0);
    const auto v3 = random_volume<3>(rng, {side, side - 1, 3}, density);
    check_all(rng, v3, t % 4 == 1 && side <= 4);
  }
}

/// Random cell lists of the four kinds of random_cell_list.
inline void suite_cell_lists(std::uint64_t seed, int trials) {
  std::mt19937_64 rng(seed);
  for (int t = 0; t < trials; ++t) {
    CAPTURE(t);
    check_all(rng, random_cell_list(rng, t, 1 + t % 7), false);
  }
}

/// Random simplicial complexes: field reduction against Smith ranks, pairs (the cone and the
/// quotient), subdivision now and then.
inline void suite_simplicial(std::uint64_t seed, int trials, int vertices) {
  std::mt19937_64 rng(seed);
  for (int t = 0; t < trials; ++t) {
    CAPTURE(t);
    const auto x = random_simplicial(rng, vertices, 3, 4 + t % 9);
    check_dd_zero(x);
    check_field_vs_smith<2>(x);
    check_field_vs_smith<3>(x);
    check_pair(x, random_subcomplex(rng, x, 0.05 + 0.05 * (t % 4)));
    if (t % 3 == 0) check_subdivision(x);
  }
}

/// Künneth on random products: presentation × presentation (torsion ⊗ torsion and Tor),
/// presentation × simplicial, cubical × cell list.
inline void suite_kunneth(std::uint64_t seed, int trials) {
  std::mt19937_64 rng(seed);
  int tor = 0;
  for (int t = 0; t < trials; ++t) {
    CAPTURE(t);
    const auto a = random_presentation(rng, 1 + t % 3, 1 + t % 3, 6), b = random_presentation(rng, 1 + (t + 1) % 3, t % 3, 6);
    const auto ha = lacuna_test::groups_of(lacuna::homology<integer>(a)), hb = lacuna_test::groups_of(lacuna::homology<integer>(b));
    tor += !ha[1].torsion.empty() && !hb[1].torsion.empty();
    check_kunneth(a, b);
    check_kunneth(a, random_simplicial(rng, 5, 2, 2 + t % 4));
    check_kunneth(random_volume<2>(rng, {3, 3}, 0.6), random_cell_list(rng, t, 1 + t % 3));
  }
  if (trials >= 10) CHECK(tor >= 2);  // the Tor terms of the theorem are exercised
}

}  // namespace random_test

// Shared helpers of the homology tests: the complexes of the textbook tests, every variant of
// the engine run side by side, generators verified, groups compared with expected values.
#pragma once

#include <doctest/doctest.h>
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/integer.hpp>

#include <algorithm>
#include <cstdint>
#include <map>
#include <set>
#include <string>
#include <vector>

namespace lacuna_test {

using lacuna::integer;

/// A group as plain data: rank and invariant factors (as decimal strings, for big ones).
struct group {
  std::size_t rank = 0;
  std::vector<std::string> torsion;
  friend bool operator==(const group&, const group&) = default;
};

inline std::string show(const std::vector<group>& gs) {
  std::string s;
  for (std::size_t k = 0; k < gs.size(); ++k) {
    s += "H" + std::to_string(k) + "=Z^" + std::to_string(gs[k].rank);
    for (const auto& t : gs[k].torsion) s += "+Z/" + t;
    s += " ";
  }
  return s;
}

template <class R>
std::string text(const R& x) {
  return lacuna::detail::verify_text(x);
}

template <class R>
std::vector<group> groups_of(const std::vector<lacuna::homology_group<R>>& groups) {
  std::vector<group> out;
  for (const auto& g : groups) {
    group x{g.rank, {}};
    for (const auto& t : g.torsion) x.torsion.push_back(text(t));
    out.push_back(x);
  }
  return out;
}

template <class R>
std::vector<group> groups_of(const lacuna::homology_result<R>& h) {
  return groups_of(h.groups);
}

/// Markowitz only: no coreductions, no collapses, no set-aside.
inline lacuna::sparse_elimination markowitz_only() {
  return lacuna::sparse_elimination{
      .elimination = {.coreductions = false, .collapses = false, .set_aside = false, .markowitz = true}};
}

/// Computes homology (or cohomology) of c over R with every variant — sparse default, sparse
/// Markowitz only, each pre_reduction (none, collapses, coreductions, morse), dense (when the complex has at most dense_limit cells; the same limit for
/// verify_generators' dense cross-check) — with generators;
/// checks that the groups agree and that every result's generators pass verify_generators.
/// Returns the groups of the default variant.
template <class R, class C>
std::vector<group> all_variants(const C& c, bool co = false, bool reduced = false, std::size_t dense_limit = 1600) {
  const lacuna::homology_options o{.generators = true, .reduced = reduced};
  auto run = [&](const auto& alg) {
    return co ? lacuna::cohomology<R>(c, o, alg) : lacuna::homology<R>(c, o, alg);
  };
  const auto h0 = run(lacuna::sparse_elimination{});
  const auto g0 = groups_of(h0);
  {
    const auto rep = lacuna::verify_generators(c, h0, {.dense_cell_limit = dense_limit});
    INFO("sparse default: ", rep.first_failure);
    CHECK(rep.ok);
    CHECK(rep.checks > 0);
  }
  {
    const auto h1 = run(markowitz_only());
    INFO("default: ", show(g0), " markowitz only: ", show(groups_of(h1)));
    CHECK(groups_of(h1) == g0);
    const auto rep = lacuna::verify_generators(c, h1, {.dense_cell_limit = dense_limit});
    INFO("markowitz only: ", rep.first_failure);
    CHECK(rep.ok);
  }
  // Every pre_reduction (lacuna/algorithm/smith_normal_form.hpp): the same groups, and
  // generators — for morse lifted from the Morse complex — that pass verification.
  for (auto red : {lacuna::pre_reduction::none, lacuna::pre_reduction::collapses, lacuna::pre_reduction::coreductions,
                   lacuna::pre_reduction::morse}) {
    const auto h = run(lacuna::sparse_elimination{.reduction = red});
    INFO("default: ", show(g0), " pre_reduction ", static_cast<int>(red), ": ", show(groups_of(h)));
    CHECK(groups_of(h) == g0);
    const auto rep = lacuna::verify_generators(c, h, {.dense_cell_limit = dense_limit});
    INFO("pre_reduction ", static_cast<int>(red), ": ", rep.first_failure);
    CHECK(rep.ok);
    // without generators (for cohomology this is the only Morse route)
    const auto p = co ? lacuna::cohomology<R>(c, {.reduced = reduced}, lacuna::sparse_elimination{.reduction = red})
                      : lacuna::homology<R>(c, {.reduced = reduced}, lacuna::sparse_elimination{.reduction = red});
    CHECK(groups_of(p) == g0);
  }
  if (lacuna::total_cell_count(c) <= dense_limit) {
    const auto h2 = run(lacuna::dense_elimination{});
    INFO("default: ", show(g0), " dense: ", show(groups_of(h2)));
    CHECK(groups_of(h2) == g0);
    const auto rep = lacuna::verify_generators(c, h2, {.dense_cell_limit = dense_limit});
    INFO("dense: ", rep.first_failure);
    CHECK(rep.ok);
  }
  // Without generators the groups come from a different branch (no transforms kept).
  const auto plain = co ? lacuna::cohomology<R>(c, {.reduced = reduced}) : lacuna::homology<R>(c, {.reduced = reduced});
  CHECK(groups_of(plain) == g0);
  return g0;
}

/// The simplicial complex with these facets (vertex labels are ints).
inline lacuna::simplicial_complex<int> facets(const std::vector<std::vector<int>>& fs) {
  return lacuna::simplicial_complex<int>::from_facets(fs);
}

/// The boundary of the (n+1)-simplex: a simplicial n-sphere.
inline lacuna::simplicial_complex<int> simplex_boundary_sphere(int n) {
  std::vector<std::vector<int>> fs;
  for (int skip = 0; skip <= n + 1; ++skip) {
    std::vector<int> f;
    for (int v = 0; v <= n + 1; ++v)
      if (v != skip) f.push_back(v);
    fs.push_back(f);
  }
  return facets(fs);
}

/// Möbius's 7-vertex torus: triangles {i, i+1, i+3} and {i, i+2, i+3} mod 7 (from memory;
/// the vertex-minimal torus of Möbius 1861 / Császár 1949). Validated by the tests.
inline lacuna::simplicial_complex<int> seven_vertex_torus() {
  std::vector<std::vector<int>> fs;
  for (int i = 0; i < 7; ++i) {
    fs.push_back({i, (i + 1) % 7, (i + 3) % 7});
    fs.push_back({i, (i + 2) % 7, (i + 3) % 7});
  }
  return facets(fs);
}

/// The 6-vertex RP^2 (the hemi-icosahedron; facet list from memory, validated by the tests).
inline lacuna::simplicial_complex<int> six_vertex_rp2() {
  return facets({{1, 2, 3}, {1, 3, 4}, {1, 4, 5}, {1, 5, 6}, {1, 2, 6},
                 {2, 3, 5}, {2, 4, 5}, {2, 4, 6}, {3, 4, 6}, {3, 5, 6}});
}

/// The 5-vertex Möbius band: triangles {i, i+1, i+2} mod 5 (from memory).
inline lacuna::simplicial_complex<int> five_vertex_moebius() {
  std::vector<std::vector<int>> fs;
  for (int i = 0; i < 5; ++i) fs.push_back({i, (i + 1) % 5, (i + 2) % 5});
  return facets(fs);
}

/// The dunce hat, triangulated here: a disk (boundary ring b_0..b_{3m-1}, an inner ring
/// r_0..r_{3m-1}, a centre o) whose boundary is identified by the word a a a^-1 (Zeeman 1964,
/// "On the dunce hat"): side s in {0, 1} sends b_{sm+t} to A_t, side 2 sends b_{2m+t} to
/// A_{m-t}, with A_m = A_0 the corner. With m >= 3 no triangle has two identified vertices,
/// and edges are identified only along the word; the tests check χ = 1 and that every
/// A-edge lies in exactly three triangles.
inline lacuna::simplicial_complex<int> dunce_hat(int m = 4) {
  const int N = 3 * m;
  auto b = [&](int i) {
    i = ((i % N) + N) % N;
    const int s = i / m, t = i % m;
    return s < 2 ? t : (m - t) % m;  // A_t has label t
  };
  auto r = [&](int i) { return m + ((i % N) + N) % N; };
  const int o = m + N;
  std::vector<std::vector<int>> fs;
  for (int i = 0; i < N; ++i) {
    fs.push_back({b(i), b(i + 1), r(i)});
    fs.push_back({b(i + 1), r(i), r(i + 1)});
    fs.push_back({o, r(i), r(i + 1)});
  }
  return facets(fs);
}

/// The matching complex of K_n: vertices the edges of K_n, simplices the sets of pairwise
/// disjoint edges.
inline lacuna::simplicial_complex<int> matching_complex(int n) {
  std::vector<std::pair<int, int>> edges;
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n; ++j) edges.push_back({i, j});
  std::vector<std::vector<int>> fs;
  std::vector<int> cur;
  std::vector<bool> used(static_cast<std::size_t>(n), false);
  // Maximal matchings are the facets.
  auto rec = [&](auto&& self, std::size_t from) -> void {
    bool extended = false;
    for (std::size_t e = from; e < edges.size(); ++e) {
      auto [u, v] = edges[e];
      if (used[static_cast<std::size_t>(u)] || used[static_cast<std::size_t>(v)]) continue;
      used[static_cast<std::size_t>(u)] = used[static_cast<std::size_t>(v)] = true;
      cur.push_back(static_cast<int>(e));
      self(self, e + 1);
      cur.pop_back();
      used[static_cast<std::size_t>(u)] = used[static_cast<std::size_t>(v)] = false;
      extended = true;
    }
    if (!extended && !cur.empty()) fs.push_back(cur);
  };
  rec(rec, 0);
  return facets(fs);
}

/// How many triangles contain each edge of a 2-dimensional simplicial complex.
template <class L>
std::map<std::size_t, int> edge_degrees(const lacuna::simplicial_complex<L>& c) {
  std::map<std::size_t, int> deg;
  for (std::size_t e = 0; e < c.cell_count(1); ++e) deg[e] = 0;
  for (std::size_t t = 0; t < c.cell_count(2); ++t)
    for (const auto& f : c.boundary(2, t)) ++deg[f.face];
  return deg;
}

/// Invariant factors of a direct sum of cyclic groups Z/n_i (units dropped), by the Smith
/// form of diag(n_i) — how the Künneth and UCT predictions are put in canonical form.
inline std::vector<std::string> invariant_factors(const std::vector<integer>& cyclic) {
  lacuna::dense_matrix<integer> D(cyclic.size(), cyclic.size());
  for (std::size_t i = 0; i < cyclic.size(); ++i) D(i, i) = cyclic[i];
  const auto s = lacuna::dense_smith_form(D);
  std::vector<std::string> out;
  for (const auto& d : s.diagonal)
    if (!(d == integer(1))) out.push_back(d.to_string());
  return out;
}

/// Rows of coordinates whose first r x r block (the free part) must be unimodular: its Smith
/// form is the identity, so the rows' free parts are a basis of Z^r.
inline void check_free_block_unimodular(const std::vector<std::vector<integer>>& rows, std::size_t r) {
  if (r == 0) return;
  REQUIRE(rows.size() >= r);
  lacuna::dense_matrix<integer> F(r, r);
  for (std::size_t i = 0; i < r; ++i)
    for (std::size_t j = 0; j < r; ++j) F(i, j) = rows[i][j];
  const auto s = lacuna::dense_smith_form(F);
  CHECK(s.rank == r);
  for (const auto& d : s.diagonal) CHECK(d == integer(1));
}

/// A cell list with H_1 = Z ⊕ Z/2 ⊕ Z/4 ⊕ Z/12 and H_2 = 0: loops a..d at one vertex, 2-cells
/// attached along 2b, 4c and 12d (the cellular chain complex gives the groups at once).
inline lacuna::cell_list torsion_2_4_12() {
  lacuna::cell_list c;
  c.add_cell(0, "v");
  for (const char* e : {"a", "b", "c", "d"}) c.add_cell(1, e, {{0, 1}, {0, -1}});
  c.add_cell(2, "B", {{1, 2}});
  c.add_cell(2, "C", {{2, 4}});
  c.add_cell(2, "D", {{3, 12}});
  return c;
}

}  // namespace lacuna_test

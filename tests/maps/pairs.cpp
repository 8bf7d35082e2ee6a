// Relative homology and the long exact sequence of a pair. Expected values:
//   * H_n(D^n, S^{n-1}) = Z and 0 in other degrees; ∂_*: H_n(D^n, S^{n-1}) -> H_{n-1}(S^{n-1})
//     is an isomorphism, since D^n is contractible (Hatcher, Algebraic Topology, 2002, §2.1,
//     Example 2.23 and the long exact sequence of the pair);
//   * the long exact sequence of a pair is exact (Hatcher 2002, Theorem 2.16 and §2.1), so
//     check_exactness must accept every pair, and must reject a sequence whose map was
//     replaced by zero where exactness forces a non-zero map;
//   * for a CW pair (X, A), H_n(X, A) = H̃_n(X/A) (Hatcher 2002, Proposition 2.22), checked
//     against complex/construct/quotient.hpp.
#include "support.hpp"

#include <doctest/doctest.h>
#include <lacuna/complex/construct/quotient.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/ring/rational.hpp>

#include <algorithm>
#include <cstdint>
#include <random>
#include <set>
#include <vector>

namespace maps_pairs_test {

using namespace maps_test;

namespace {
/// Marks of the cells of X lying in the closure of the given vertex sets.
std::vector<std::vector<bool>> closure_marks(const simplicial_complex<int>& X, const std::vector<std::set<int>>& spans) {
  std::vector<std::vector<bool>> marks(static_cast<std::size_t>(X.top_dimension() + 1));
  for (int k = 0; k <= X.top_dimension(); ++k) {
    marks[static_cast<std::size_t>(k)].assign(X.cell_count(k), false);
    for (std::size_t i = 0; i < X.cell_count(k); ++i)
      for (const auto& s : spans) {
        bool inside = true;
        for (auto v : X.vertices(k, i)) inside = inside && s.count(X.label(v)) > 0;
        if (inside) marks[static_cast<std::size_t>(k)][i] = true;
      }
  }
  return marks;
}

/// The simplex on n+1 vertices (a triangulated D^n) and marks of its boundary S^{n-1}.
std::vector<std::set<int>> boundary_faces(int n) {
  std::vector<std::set<int>> out;
  for (int skip = 0; skip <= n; ++skip) {
    std::set<int> f;
    for (int v = 0; v <= n; ++v)
      if (v != skip) f.insert(v);
    out.push_back(f);
  }
  return out;
}

simplicial_complex<int> full_simplex(int n) {
  std::vector<int> f;
  for (int v = 0; v <= n; ++v) f.push_back(v);
  return simplicial_complex<int>::from_facets(std::vector<std::vector<int>>{f});
}

template <class R>
bool same_groups(const lacuna::homology_result<R>& a, const lacuna::homology_result<R>& b) {
  for (int n = 0; n <= std::max(a.top_dimension(), b.top_dimension()); ++n) {
    const std::size_t ra = n <= a.top_dimension() ? a[n].rank : 0, rb = n <= b.top_dimension() ? b[n].rank : 0;
    const std::vector<R> ta = n <= a.top_dimension() ? a[n].torsion : std::vector<R>{};
    const std::vector<R> tb = n <= b.top_dimension() ? b[n].torsion : std::vector<R>{};
    if (ra != rb || !(ta == tb)) return false;
  }
  return true;
}
}  // namespace

TEST_CASE("(D^n, S^{n-1}): H_n = Z, elsewhere 0, and ∂_* is an isomorphism, n = 1..4") {
  for (int n = 1; n <= 4; ++n) {
    CAPTURE(n);
    const auto D = full_simplex(n);
    const auto p = lacuna::long_exact_sequence<integer>(D, closure_marks(D, boundary_faces(n)));
    for (int k = 0; k <= n; ++k) {
      CHECK(p.hXA[k].rank == (k == n ? 1u : 0u));
      CHECK(p.hXA[k].torsion.empty());
    }
    // ∂_*: H_n(D, S) -> H_{n-1}(S) (reduced: for n = 1, S^0 has H_0 = Z^2 and ∂_* is injective
    // onto the kernel of the augmentation, so the check is on n >= 2).
    const auto& d = p.connecting[static_cast<std::size_t>(n)].matrix;
    if (n >= 2) {
      REQUIRE(d.rows() == 1);
      REQUIRE(d.cols() == 1);
      CHECK((d(0, 0) == integer(1) || d(0, 0) == integer(-1)));
    } else {
      REQUIRE(d.rows() == 2);
      CHECK(d(0, 0) + d(1, 0) == integer(0));  // lands in the reduced part
      CHECK(!(d(0, 0) == integer(0)));
    }
    CHECK(p.check().exact);
  }
}

TEST_CASE("(disk, boundary circle): a triangulated disk with an interior vertex") {
  // The cone on a hexagon: centre 6, rim 0..5.
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < 6; ++i) facets.push_back({i, (i + 1) % 6, 6});
  const auto D = simplicial_complex<int>::from_facets(facets);
  std::vector<std::set<int>> rim;
  for (int i = 0; i < 6; ++i) rim.push_back({i, (i + 1) % 6});
  const auto p = lacuna::long_exact_sequence<integer>(D, closure_marks(D, rim));
  CHECK(p.hXA[2].rank == 1);
  CHECK(p.hXA[1].rank == 0);
  CHECK(p.hXA[0].rank == 0);
  const auto& d = p.connecting[2].matrix;
  REQUIRE(d.rows() == 1);
  CHECK((d(0, 0) == integer(1) || d(0, 0) == integer(-1)));
  const auto r = p.check();
  CHECK(r.exact);
  CHECK(r.places.size() == 9);  // three groups per degree 0..2
}

TEST_CASE("(Möbius band, boundary): H_1(M, ∂M) = Z/2, exact over Z and over Q") {
  const auto M = moebius_band();
  const auto marks = closure_marks(M, {{0, 2}, {2, 4}, {4, 1}, {1, 3}, {3, 0}});
  const auto p = lacuna::long_exact_sequence<integer>(M, marks);
  // From the sequence 0 -> H_1(∂M) = Z -2-> H_1(M) = Z -> H_1(M, ∂M) -> H_0(∂M) -≅-> H_0(M):
  // H_1(M, ∂M) = Z/2 (the cokernel of multiplication by 2), H_2(M, ∂M) = 0.
  CHECK(p.hXA[1].rank == 0);
  CHECK(p.hXA[1].torsion == std::vector<integer>{integer(2)});
  CHECK(p.hXA[2].rank == 0);
  CHECK(p.check().exact);
  CHECK(lacuna::long_exact_sequence<lacuna::rational>(M, marks).check().exact);
}

TEST_CASE("exactness holds on random pairs, and broken sequences are caught") {
  for (unsigned seed : {1u, 2u, 3u, 4u, 5u, 6u, 7u, 8u, 9u, 10u, 11u, 12u}) {
    CAPTURE(seed);
    std::mt19937 rng(seed);
    std::uniform_int_distribution<int> vertex(0, 7), size(2, 4);
    std::vector<std::vector<int>> facets;
    for (int f = 0; f < 7; ++f) {
      std::set<int> s;
      const int want = size(rng);
      while (static_cast<int>(s.size()) < want) s.insert(vertex(rng));
      facets.emplace_back(s.begin(), s.end());
    }
    const auto X = simplicial_complex<int>::from_facets(facets);
    // A: the closure of a random half of X's edges and triangles.
    std::vector<std::set<int>> spans;
    std::bernoulli_distribution coin(0.4);
    for (int k = 1; k <= std::min(2, X.top_dimension()); ++k)
      for (std::size_t i = 0; i < X.cell_count(k); ++i)
        if (coin(rng)) {
          std::set<int> s;
          for (auto v : X.vertices(k, i)) s.insert(X.label(v));
          spans.push_back(s);
        }
    const auto marks = closure_marks(X, spans);
    const auto p = lacuna::long_exact_sequence<integer>(X, marks);
    const auto report = p.check();
    CHECK(report.exact);
    if (const auto* bad = report.first_failure()) MESSAGE(bad->message);
    CHECK(lacuna::long_exact_sequence<lacuna::rational>(X, marks).check().exact);
    // Proposition 2.22: H_n(X, A) = H̃_n(X/A).
    const auto Q = lacuna::quotient(X, [&](int k, std::size_t i) { return static_cast<bool>(marks[static_cast<std::size_t>(k)][i]); });
    CHECK(same_groups(p.hXA, lacuna::homology<integer>(Q, {.reduced = true})));
    // Break it: zero out the first non-zero map; exactness must fail somewhere next to it.
    auto seq = p.sequence();
    for (std::size_t m = 0; m < seq.maps.size(); ++m) {
      bool nonzero = false;
      for (std::size_t i = 0; i < seq.maps[m].rows(); ++i)
        for (std::size_t j = 0; j < seq.maps[m].cols(); ++j) nonzero = nonzero || !(seq.maps[m](i, j) == integer(0));
      if (!nonzero) continue;
      seq.maps[m] = lacuna::dense_matrix<integer>(seq.maps[m].rows(), seq.maps[m].cols());
      const auto broken = lacuna::check_exactness(seq);
      CHECK_FALSE(broken.exact);
      REQUIRE(broken.first_failure() != nullptr);
      CHECK((broken.first_failure()->position == m || broken.first_failure()->position == m + 1));
      break;
    }
  }
}

TEST_CASE("a map that is not well defined on torsion is caught") {
  // 0 -> Z/2 -(1)-> Z -> 0 is not a homomorphism: the relation 2 e goes to 2, not 0.
  lacuna::exact_sequence<integer> s;
  s.groups = {{"0", 0, {}}, {"Z/2", 0, {integer(2)}}, {"Z", 1, {}}, {"0", 0, {}}};
  s.maps = {lacuna::dense_matrix<integer>(1, 0), lacuna::dense_matrix<integer>(1, 1), lacuna::dense_matrix<integer>(0, 1)};
  s.maps[1](0, 0) = integer(1);
  s.map_names = {"a", "b", "c"};
  const auto r = lacuna::check_exactness(s);
  CHECK_FALSE(r.exact);
  REQUIRE(r.first_failure() != nullptr);
  CHECK(r.first_failure()->message.find("well defined") != std::string::npos);
  // 0 -> Z -(2)-> Z -> Z/2 -> 0 is exact (by hand); with 4 in place of 2 it is not.
  lacuna::exact_sequence<integer> t;
  t.groups = {{"0", 0, {}}, {"Z", 1, {}}, {"Z", 1, {}}, {"Z/2", 0, {integer(2)}}, {"0", 0, {}}};
  t.maps = {lacuna::dense_matrix<integer>(1, 0), lacuna::dense_matrix<integer>(1, 1), lacuna::dense_matrix<integer>(1, 1),
            lacuna::dense_matrix<integer>(0, 1)};
  t.maps[1](0, 0) = integer(2);
  t.maps[2](0, 0) = integer(1);
  t.map_names = {"a", "times 2", "reduction", "d"};
  CHECK(lacuna::check_exactness(t).exact);
  t.maps[1](0, 0) = integer(4);
  const auto u = lacuna::check_exactness(t);
  CHECK_FALSE(u.exact);
  REQUIRE(u.first_failure() != nullptr);
  CHECK(u.first_failure()->position == 2);
}

}  // namespace maps_pairs_test

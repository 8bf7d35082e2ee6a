// The Mayer–Vietoris sequence of X = A ∪ B (lacuna/homology/mayer_vietoris.hpp). Expected values:
//   * the sequence is exact for subcomplexes A, B with A ∪ B = X (Hatcher, Algebraic Topology,
//     2002, §2.2, the Mayer–Vietoris sequence, from the short exact sequence of chain complexes);
//   * S^1 as two arcs meeting in two points (Hatcher 2002, §2.2, Example 2.46 with n = 1: S^n
//     as two disks meeting in S^{n-1}): H_0(A∩B) = Z^2, H_n(A) ⊕ H_n(B) = Z^2 in degree 0,
//     ∂ : H_1(S^1) = Z -> H_0(A∩B) is injective with image ker φ (the difference of the points);
//   * the torus as two cylinders meeting in two circles (Hatcher 2002, §2.2, the torus
//     computed by Mayer–Vietoris, Example 2.47's method): H_1(A∩B) = Z^2, H_1(A) ⊕ H_1(B) = Z^2,
//     φ on H_1 has rank 1 (each circle is the core of each cylinder), so ∂ : H_2(T) = Z ->
//     H_1(A∩B) is injective onto ker φ, and H_1(T) = Z^2;
//   * a map broken on purpose (φ(x) = (x, x) with ψ(a, b) = a + b, or ∂ set to 0) is caught.
#include "support.hpp"

#include <doctest/doctest.h>
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/homology/mayer_vietoris.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <algorithm>
#include <set>
#include <stdexcept>
#include <vector>

namespace maps_mayer_vietoris_test {

using namespace maps_test;

namespace {

using marks = std::vector<std::vector<bool>>;

/// Marks of the cells of X spanned by some facet of `facets` (the closure of those facets).
marks closure_of(const simplicial_complex<int>& X, const std::vector<std::vector<int>>& facets) {
  marks m(static_cast<std::size_t>(X.top_dimension() + 1));
  for (int k = 0; k <= X.top_dimension(); ++k) {
    m[static_cast<std::size_t>(k)].assign(X.cell_count(k), false);
    for (std::size_t i = 0; i < X.cell_count(k); ++i)
      for (const auto& f : facets) {
        const std::set<int> s(f.begin(), f.end());
        bool inside = true;
        for (auto v : X.vertices(k, i)) inside = inside && s.count(X.label(v)) > 0;
        if (inside) m[static_cast<std::size_t>(k)][i] = true;
      }
  }
  return m;
}

template <class R>
std::size_t rank_of(const lacuna::dense_matrix<R>& m) {
  return lacuna::dense_smith_form(m).rank;
}

/// Triangles of the n x n grid torus in the columns i_from <= i < i_to: vertex (i, j) (mod n)
/// has label n*i + j, two triangles per square.
std::vector<std::vector<int>> torus_triangles(int n, int i_from, int i_to) {
  std::vector<std::vector<int>> t;
  auto v = [n](int i, int j) { return n * ((i + n) % n) + (j + n) % n; };
  for (int i = i_from; i < i_to; ++i)
    for (int j = 0; j < n; ++j) {
      t.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      t.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return t;
}

}  // namespace

TEST_CASE("S^1 as two arcs") {
  const auto X = circle(4);  // 0-1-2-3-0
  const marks A = closure_of(X, {{0, 1}, {1, 2}});
  const marks B = closure_of(X, {{2, 3}, {3, 0}});
  const auto mv = lacuna::mayer_vietoris<integer>(X, A, B);
  CHECK(mv.hC[0].rank == 2);  // A∩B = {0, 2}
  CHECK(mv.hC.top_dimension() == 0);
  CHECK(mv.sum_group(0).rank == 2);
  CHECK(mv.sum_group(1).rank == 0);
  CHECK(mv.hX[1].rank == 1);
  const auto r = mv.check();
  CHECK(r.exact);
  CHECK(r.first_failure() == nullptr);
  // ∂ : H_1(X) = Z -> H_0(A∩B) = Z^2 is injective and its image, ker φ, is Z(p - q): the column
  // is ±(1, -1) in the basis of the two points.
  REQUIRE(mv.connecting[1].rows() == 2);
  REQUIRE(mv.connecting[1].cols() == 1);
  CHECK(mv.connecting[1](0, 0) == -mv.connecting[1](1, 0));
  CHECK(lacuna::is_unit(mv.connecting[1](0, 0)));
  CHECK(rank_of(mv.phi[0]) == 1);
  CHECK(rank_of(mv.psi[0]) == 1);
  // φ(x) = (x, -x): the two halves of each column are opposite (H_0 of each arc is Z).
  for (std::size_t j = 0; j < 2; ++j) CHECK(mv.phi[0](0, j) == -mv.phi[0](1, j));
  // ψ(a, b) = a + b: both arcs' points go to the generator of H_0(X).
  CHECK(lacuna::is_unit(mv.psi[0](0, 0)));
  CHECK(mv.psi[0](0, 0) == mv.psi[0](0, 1));
}

TEST_CASE("the torus as two cylinders, over Z, Q and Z/2") {
  const int n = 4;
  const auto X = simplicial_complex<int>::from_facets(torus_triangles(n, 0, n));
  const marks A = closure_of(X, torus_triangles(n, 0, 2));
  const marks B = closure_of(X, torus_triangles(n, 2, n));
  auto check_torus = [&]<class R>(const R& unit) {
    const auto mv = lacuna::mayer_vietoris<R>(X, A, B, unit);
    CHECK(mv.hC[0].rank == 2);  // two circles, i = 0 and i = 2
    CHECK(mv.hC[1].rank == 2);
    CHECK(mv.sum_group(1).rank == 2);  // each cylinder has H_1 = Z
    CHECK(mv.sum_group(2).rank == 0);
    CHECK(mv.hX[1].rank == 2);
    CHECK(mv.hX[2].rank == 1);
    CHECK(mv.check().exact);
    CHECK(rank_of(mv.phi[1]) == 1);
    CHECK(rank_of(mv.connecting[2]) == 1);  // H_2(T) injects into H_1(A∩B)
    CHECK(rank_of(mv.connecting[1]) == 1);  // the loop across both cylinders
    CHECK(rank_of(mv.psi[1]) == 1);
  };
  check_torus(lacuna::one<integer>());
  check_torus(lacuna::one<lacuna::rational>());
  check_torus(lacuna::one<lacuna::z2>());
}

TEST_CASE("a broken Mayer–Vietoris map is caught") {
  const auto X = circle(4);
  const marks A = closure_of(X, {{0, 1}, {1, 2}});
  const marks B = closure_of(X, {{2, 3}, {3, 0}});
  const auto mv = lacuna::mayer_vietoris<integer>(X, A, B);
  // φ(x) = (x, x) with ψ(a, b) = a + b: ψφ = 2·inclusion ≠ 0.
  {
    auto s = mv.sequence();
    for (std::size_t p = 0; p < s.maps.size(); ++p)
      if (s.map_names[p] == "φ on H_0")
        for (std::size_t j = 0; j < s.maps[p].cols(); ++j) s.maps[p](1, j) = -s.maps[p](1, j);
    const auto r = lacuna::check_exactness(s);
    CHECK_FALSE(r.exact);
    REQUIRE(r.first_failure() != nullptr);
    CHECK(r.first_failure()->group == "H_0(A)+H_0(B)");
  }
  // ∂ replaced by 0: ker φ (= Z(p - q)) is no longer an image, and H_1(X) injects nowhere.
  {
    auto s = mv.sequence();
    for (std::size_t p = 0; p < s.maps.size(); ++p)
      if (s.map_names[p] == "∂ on H_1(X)") s.maps[p] = lacuna::dense_matrix<integer>(s.maps[p].rows(), s.maps[p].cols());
    const auto r = lacuna::check_exactness(s);
    CHECK_FALSE(r.exact);
    REQUIRE(r.first_failure() != nullptr);
    CHECK(r.first_failure()->group == "H_1(X)");
  }
  // A cell in neither A nor B.
  const marks A2 = closure_of(X, {{0, 1}});
  CHECK_THROWS_AS(lacuna::mayer_vietoris<integer>(X, A2, B), std::invalid_argument);
}

}  // namespace maps_mayer_vietoris_test

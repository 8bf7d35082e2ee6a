// Induced maps on homology, degrees, traces and Lefschetz numbers. Expected values:
//   * the map z -> z^k of the circle has degree k (Hatcher, Algebraic Topology, 2002, §1.1
//     and §2.2, "degree"); realised simplicially from a circle with 4|k| vertices onto one
//     with 4, i -> +-i mod 4;
//   * the antipodal map of S^n has degree (-1)^{n+1} (Hatcher 2002, §2.2, property (e) of
//     degree), so its Lefschetz number is 1 + (-1)^n (-1)^{n+1} = 0 (it has no fixed point);
//   * the Lefschetz number of the identity is χ(X) (Hatcher 2002, §2.C: the trace of the
//     identity on H_n(X; Q) is its dimension); a reflection of the circle acts by 1 on H_0
//     and by -1 on H_1, so its Lefschetz number is 1 - (-1) = 2 (from the trace formula);
//   * the boundary circle of the Möbius band goes twice around its core: the inclusion is
//     multiplication by +-2 on H_1 = Z (Hatcher 2002, §2.1, Example 2.7 area — from memory);
//   * χ(S^n) = 1 + (-1)^n, χ(RP^2) = 1 (Hatcher 2002, §2.2, Euler characteristic);
//   * a rotation of the circle is homotopic to the identity: degree 1 and Lefschetz number
//     χ(S^1) = 0 (Hatcher 2002, §2.2 and §2.C), here through a chain-map type written as a
//     third party would, with its own term type and no lacuna base.
#include "support.hpp"

#include <doctest/doctest.h>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/homology/induced_map.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstdint>
#include <cstdlib>
#include <string>
#include <vector>

namespace maps_induced_test {

using namespace maps_test;
using lacuna::rational;

TEST_CASE("the k-fold winding of the circle has degree k, k = -3..3") {
  const int n = 4;
  const auto target = circle(n);
  for (int k = -3; k <= 3; ++k) {
    CAPTURE(k);
    const int m = n * (k == 0 ? 1 : std::abs(k));
    const auto source = circle(m);
    const auto f = lacuna::simplicial_chain_map(source, target, [&](int i) {
      if (k == 0) return 0;
      return ((k > 0 ? i : -i) % n + n) % n;
    });
    REQUIRE(lacuna::check_chain_map(f, source, target).ok);
    CHECK(lacuna::degree(f, source, target, circle_class(source, m), circle_class(target, n)) == integer(k));
  }
}

namespace third_party {
struct step {  // a term of its own: a cell and an integer
  std::size_t cell;
  long coefficient;
};
/// Rotates the n-gon by `by` steps, cell by cell; with `broken`, the edges stay put while the
/// vertices move (not a chain map).
struct rotation {
  std::size_t n = 0, by = 0;
  bool broken = false;
  std::vector<step> image(int k, std::size_t i) const {
    if (k == 1 && broken) return {{i, 1}};
    return {{(i + by) % n, 1}};
  }
};
}  // namespace third_party

TEST_CASE("a chain map of the user's own type: rotations of the n-gon") {
  static_assert(lacuna::chain_map<third_party::rotation>);
  const std::size_t n = 5;
  lacuna::cell_list C;
  for (std::size_t i = 0; i < n; ++i) C.add_cell(0, "v" + std::to_string(i));
  for (std::size_t i = 0; i < n; ++i)
    C.add_cell(1, "e" + std::to_string(i), {{(i + 1) % n, 1}, {i, -1}});
  for (std::size_t by = 0; by < n; ++by) {
    CAPTURE(by);
    const third_party::rotation r{n, by};
    REQUIRE(lacuna::check_chain_map(r, C, C).ok);
    CHECK(lacuna::degree(r, C) == integer(1));
    CHECK(lacuna::lefschetz_number(r, C) == rational(0));
    const auto h = lacuna::induced_maps<integer>(r, C, C);
    REQUIRE(h.size() == 2);
    const auto f1 = h[1].free_part();
    REQUIRE(f1.rows() == 1);
    CHECK(f1(0, 0) == integer(1));
  }
  const auto r = lacuna::check_chain_map(third_party::rotation{n, 1, true}, C, C);
  CHECK_FALSE(r.ok);
  CHECK(r.dimension == 1);
  CHECK(r.cell == 0);
  CHECK(r.message.find("'e0'") != std::string::npos);
}

TEST_CASE("the antipodal map of S^n has degree (-1)^(n+1) and Lefschetz number 0") {
  for (int n = 1; n <= 3; ++n) {
    CAPTURE(n);
    const auto S = cross_polytope_sphere(n);
    const auto antipode = lacuna::simplicial_chain_map(S, S, [](int v) { return v ^ 1; });
    REQUIRE(lacuna::check_chain_map(antipode, S, S).ok);
    CHECK(lacuna::degree(antipode, S) == integer(n % 2 == 1 ? 1 : -1));
    CHECK(lacuna::lefschetz_number(antipode, S) == rational(0));
    CHECK(lacuna::lefschetz_number(lacuna::identity_map{}, S) == rational(n % 2 == 0 ? 2 : 0));
  }
}

TEST_CASE("Lefschetz numbers: the identity gives χ, a reflection of the circle gives 2") {
  const simplicial_complex<int> rp2{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}, {0, 5, 1},
                                    {1, 2, 4}, {2, 3, 5}, {3, 4, 1}, {4, 5, 2}, {5, 1, 3}};
  CHECK(lacuna::euler_characteristic(rp2) == 1);  // 6 - 15 + 10, by hand
  CHECK(lacuna::lefschetz_number(lacuna::identity_map{}, rp2) == rational(1));
  const auto C = circle(6);
  CHECK(lacuna::lefschetz_number(lacuna::identity_map{}, C) == rational(0));
  const auto reflection = lacuna::simplicial_chain_map(C, C, [](int i) { return (6 - i) % 6; });
  REQUIRE(lacuna::check_chain_map(reflection, C, C).ok);
  CHECK(lacuna::trace(reflection, C, 0) == rational(1));
  CHECK(lacuna::trace(reflection, C, 1) == rational(-1));
  CHECK(lacuna::lefschetz_number(reflection, C) == rational(2));
  CHECK(lacuna::degree(reflection, C) == integer(-1));
}

TEST_CASE("the boundary of the Möbius band: the inclusion is multiplication by 2 on H_1") {
  const auto M = moebius_band();
  const auto B = moebius_boundary();
  const auto inc = lacuna::inclusion_map(B, M);
  REQUIRE(lacuna::check_chain_map(inc, B, M).ok);
  const auto maps = lacuna::induced_maps<integer>(inc, B, M);
  REQUIRE(maps.size() == 2);
  CHECK(maps[0].matrix.rows() == 1);
  CHECK(maps[0].matrix(0, 0) == integer(1));  // both connected: a point goes to a point
  REQUIRE(maps[1].free_part().rows() == 1);
  REQUIRE(maps[1].free_part().cols() == 1);
  const integer e = maps[1].free_part()(0, 0);
  CHECK((e == integer(2) || e == integer(-2)));
  // Over Z/2 the same map is zero; over Z/3 it is an isomorphism (2 is a unit mod 3).
  const auto m2 = lacuna::induced_maps<lacuna::mod_p<2>>(inc, B, M);
  CHECK(m2[1].matrix(0, 0) == lacuna::mod_p<2>(0));
  const auto m3 = lacuna::induced_maps<lacuna::mod_p<3>>(inc, B, M);
  CHECK(!(m3[1].matrix(0, 0) == lacuna::mod_p<3>(0)));
}

TEST_CASE("torsion: the map of RP^2 onto itself is the identity on H_1 = Z/2") {
  const simplicial_complex<int> rp2{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}, {0, 5, 1},
                                    {1, 2, 4}, {2, 3, 5}, {3, 4, 1}, {4, 5, 2}, {5, 1, 3}};
  // H_1(RP^2) = Z/2 (Hatcher 2002, Example 2.42).
  const auto maps = lacuna::induced_maps<integer>(lacuna::identity_map{}, rp2, rp2);
  REQUIRE(maps[1].torsion_part().rows() == 1);
  CHECK(maps[1].target_torsion == std::vector<integer>{integer(2)});
  CHECK(maps[1].torsion_part()(0, 0) == integer(1));
  CHECK(maps[1].free_part().rows() == 0);
  // Twice the identity (id + id) kills the torsion class: 2 = 0 in Z/2.
  const auto twice = lacuna::induced_maps<integer>(lacuna::sum(lacuna::identity_map{}, lacuna::identity_map{}), rp2, rp2);
  CHECK(twice[1].torsion_part()(0, 0) == integer(0));
}

}  // namespace maps_induced_test

// Euler-characteristic checks. Expected values:
//   * χ(RP^2) = 1 (Hatcher, Algebraic Topology, 2002, §2.2), and the Euler–Poincaré formula
//     holds over Q and over Z/2, where H_*(RP^2; Z/2) = Z/2 in degrees 0, 1, 2 (Hatcher
//     2002, Theorem 2.44 over a field; Example 2.42);
//   * χ(X) = χ(A) + χ(X, A) and χ(A ∪ B) = χ(A) + χ(B) - χ(A ∩ B) (Hatcher 2002, §2.2,
//     from the exact sequences — from memory).
#include "support.hpp"

#include <doctest/doctest.h>
#include <lacuna/homology/euler_checks.hpp>

#include <set>
#include <vector>

namespace maps_euler_test {

using namespace maps_test;

namespace {
std::vector<std::vector<bool>> marks_in(const simplicial_complex<int>& X, const std::set<int>& vs) {
  std::vector<std::vector<bool>> m(static_cast<std::size_t>(X.top_dimension() + 1));
  for (int k = 0; k <= X.top_dimension(); ++k)
    for (std::size_t i = 0; i < X.cell_count(k); ++i) {
      bool in = true;
      for (auto v : X.vertices(k, i)) in = in && vs.count(X.label(v)) > 0;
      m[static_cast<std::size_t>(k)].push_back(in);
    }
  return m;
}
}  // namespace

TEST_CASE("every identity holds on RP^2 with a subcomplex and a cover") {
  const simplicial_complex<int> rp2{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}, {0, 5, 1},
                                    {1, 2, 4}, {2, 3, 5}, {3, 4, 1}, {4, 5, 2}, {5, 1, 3}};
  // A, B: the full subcomplexes on {0..4} and on {0, 1, 2, 3, 5}; the identity is about
  // their union as a subcomplex (not all of RP^2).
  lacuna::euler_check_options o;
  o.primes = {2, 3};
  o.subcomplex = marks_in(rp2, {0, 1, 2});
  o.cover = std::pair{marks_in(rp2, {0, 1, 2, 3, 4}), marks_in(rp2, {0, 1, 5, 2, 3})};
  const auto r = lacuna::euler_checks(rp2, o);
  CHECK(r.ok);
  REQUIRE(r.identities.size() == 5);
  CHECK(r.identities[0].lhs == 1);
  CHECK(r.identities[1].rhs == 1);  // over Z/2: 1 - 1 + 1
  for (const auto& id : r.identities) {
    CAPTURE(id.statement);
    CHECK(id.holds);
  }
}

TEST_CASE("the circle and one edge: the values on each side, by hand") {
  const auto C = circle(5);
  const auto r = lacuna::euler_checks(C, {.primes = {5}, .subcomplex = marks_in(C, {0, 1}), .cover = std::nullopt});
  CHECK(r.ok);
  CHECK(r.identities[0].lhs == 0);
  CHECK(r.identities[2].statement == "χ(X) = χ(A) + χ(X, A)");
  CHECK(r.identities[2].rhs == 0);  // χ(edge) = 1, χ(C, edge) = 0 - 1 = -1
}

}  // namespace maps_euler_test

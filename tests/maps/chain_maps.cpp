// Chain maps: simplicial maps, inclusions, names, composition, sums, and the check ∂f = f∂.
// Expected values:
//   * a simplicial map commutes with the boundary (Hatcher, Algebraic Topology, 2002, §2.1,
//     "simplicial maps induce chain maps" — from memory), so check_chain_map accepts it;
//   * the sign of a simplex under a permutation of its vertices is the sign of the
//     permutation (Hatcher 2002, §2.1, orientation of simplices);
//   * a map that sends an edge to an edge but its end points elsewhere is not a chain map
//     (by hand: ∂f(e) and f(∂e) differ), and the check names that edge.
#include <doctest/doctest.h>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <cstdint>
#include <vector>

namespace maps_chain_maps_test {

using lacuna::simplicial_complex;

TEST_CASE("a vertex map gives signs and zeros by hand") {
  // The triangle {0,1,2} onto itself by the transposition 0 <-> 1, and onto an edge.
  const simplicial_complex<int> T{{0, 1, 2}};
  const auto swap = lacuna::simplicial_chain_map(T, T, std::vector<std::uint32_t>{1, 0, 2});
  CHECK(lacuna::check_chain_map(swap, T, T).ok);
  // The 2-simplex [0,1,2] goes to [1,0,2] = -[0,1,2] (an odd permutation).
  REQUIRE(swap.image(2, 0).size() == 1);
  CHECK(swap.image(2, 0)[0].coefficient == -1);
  // The edge [0,1] goes to [1,0] = -[0,1]; the edge [0,2] goes to [1,2] with sign +1.
  const auto e01 = *T.find({0, 1});
  const auto e02 = *T.find({0, 2});
  const auto e12 = *T.find({1, 2});
  CHECK(swap.image(1, e01)[0].cell == e01);
  CHECK(swap.image(1, e01)[0].coefficient == -1);
  CHECK(swap.image(1, e02)[0].cell == e12);
  CHECK(swap.image(1, e02)[0].coefficient == 1);
  // Collapse onto the edge {0, 1}: vertex 2 -> 1. The 2-simplex is degenerate (zero), [1,2] too.
  const simplicial_complex<int> E{{0, 1}};
  const auto fold = lacuna::simplicial_chain_map(T, E, std::vector<std::uint32_t>{0, 1, 1});
  CHECK(lacuna::check_chain_map(fold, T, E).ok);
  CHECK(fold.image(2, 0).empty());
  CHECK(fold.image(1, e12).empty());
  CHECK(fold.image(1, e02).size() == 1);
}

TEST_CASE("a vertex map that is not simplicial is refused, naming the simplex") {
  const simplicial_complex<int> E{{0, 1}};
  const simplicial_complex<int> two_points{{0}, {1}};
  CHECK_THROWS_WITH_AS(lacuna::simplicial_chain_map(E, two_points, std::vector<std::uint32_t>{0, 1}),
                       doctest::Contains("'0 1'"), std::invalid_argument);
}

TEST_CASE("inclusion, identity, composition, sum, negation") {
  const simplicial_complex<int> T{{0, 1, 2}};
  const simplicial_complex<int> B{{0, 1}, {1, 2}, {0, 2}};
  const auto inc = lacuna::inclusion_map(B, T);
  CHECK(lacuna::check_chain_map(inc, B, T).ok);
  const auto swap = lacuna::simplicial_chain_map(T, T, std::vector<std::uint32_t>{1, 0, 2});
  // swap ∘ swap = identity on every cell (an involution).
  const auto twice = lacuna::compose(swap, swap);
  for (int k = 0; k <= 2; ++k)
    for (std::size_t i = 0; i < T.cell_count(k); ++i) {
      const auto im = twice.image(k, i);
      REQUIRE(im.size() == 1);
      CHECK(im[0].cell == i);
      CHECK(im[0].coefficient == 1);
    }
  // id + swap is a chain map (sums of chain maps are); id - id is zero.
  CHECK(lacuna::check_chain_map(lacuna::sum(lacuna::identity_map{}, swap), T, T).ok);
  const auto zero = lacuna::sum(lacuna::identity_map{}, lacuna::negated(lacuna::identity_map{}));
  CHECK(zero.image(1, 0).empty());
  CHECK(lacuna::check_chain_map(lacuna::compose(swap, inc), B, T).ok);
}

TEST_CASE("a broken map is caught at its first bad cell") {
  // Cell list: a segment a: p -> q. The map sends p -> p, q -> p and a -> a: ∂f(a) = q - p but
  // f(∂a) = f(q) - f(p) = 0.
  lacuna::cell_list S;
  S.add_cell(0, "p");
  S.add_cell(0, "q");
  S.add_cell(1, "a", {{1, 1}, {0, -1}});
  const auto f = lacuna::chain_map_from_names<std::int64_t>(S, S, {{"p", {{"p", 1}}}, {"q", {{"p", 1}}}, {"a", {{"a", 1}}}});
  const auto r = lacuna::check_chain_map(f, S, S);
  CHECK_FALSE(r.ok);
  CHECK(r.dimension == 1);
  CHECK(r.cell == 0);
  CHECK(r.message.find("'a'") != std::string::npos);
  // The fix, q -> q, passes.
  const auto g = lacuna::chain_map_from_names<std::int64_t>(S, S, {{"p", {{"p", 1}}}, {"q", {{"q", 1}}}, {"a", {{"a", 1}}}});
  CHECK(lacuna::check_chain_map(g, S, S).ok);
  // An image naming a cell the target lacks is caught too.
  lacuna::explicit_chain_map<std::int64_t> h(S);
  h.set(0, 0, {{7, 1}});
  CHECK_FALSE(lacuna::check_chain_map(h, S, S).ok);
}

}  // namespace maps_chain_maps_test

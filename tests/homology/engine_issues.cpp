// Two engine defects found while writing the homology tests, now fixed; these tests keep
// them fixed.
#include "support.hpp"

#include <lacuna/ring/mod_p.hpp>

namespace homology_engine_issues_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

// With sparse_elimination, the image of a non-cycle on the reduced complex can be a cycle
// (f(∂z) vanishes once the faces are eliminated), so coordinates(chain) alone cannot always
// tell; coordinates(complex, chain) checks ∂z = 0 on the complex itself, with every variant.
// On the Delta-complex RP^2 the edge a has ∂a = w - v ≠ 0.
TEST_CASE("coordinates(complex, chain) rejects a chain that is not a cycle, with every variant") {
  const auto rp2 = cell_list::projective_plane();
  const lacuna::chain<integer> a{1, {{0, integer(1)}}};  // ∂a = w - v ≠ 0 (Hatcher 2002, §2.1)
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}, lacuna::dense_elimination{}).coordinates(a),
                  std::invalid_argument);
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}).coordinates(rp2, a), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}, markowitz_only()).coordinates(rp2, a),
                  std::invalid_argument);
  // No single edge of the 7-vertex torus is a cycle (it is a simplicial complex), nor a cocycle.
  const auto t = seven_vertex_torus();
  const auto h = lacuna::homology<integer>(t, {.keep_basis = true});
  const auto co = lacuna::cohomology<integer>(t, {.keep_basis = true});
  for (std::size_t e = 0; e < t.cell_count(1); ++e) {
    const lacuna::chain<integer> edge{1, {{e, integer(1)}}};
    CHECK_THROWS_AS(h.coordinates(t, edge), std::invalid_argument);
    CHECK_THROWS_AS(co.coordinates(t, edge), std::invalid_argument);
  }
}

// homology<mod_p_dynamic> needs the modulus: the engine maps incidences as
// from_integer(n) * unit, and the caller passes a bound one (mod_p_dynamic(1, p)).
// Expected: H(RP^2; Z/2) = Z/2 in every degree, H(RP^2; Z/3) = Z/3 in degree 0 only
// (Hatcher 2002, §3.1; universal coefficients).
TEST_CASE("homology over mod_p_dynamic") {
  const auto rp2 = cell_list::projective_plane();
  const auto h2 = lacuna::homology<lacuna::mod_p_dynamic>(rp2, {}, lacuna::sparse_elimination{},
                                                          lacuna::mod_p_dynamic(1, 2));
  CHECK(groups_of(h2) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  const auto h3 = lacuna::homology<lacuna::mod_p_dynamic>(rp2, {.generators = true}, lacuna::dense_elimination{},
                                                          lacuna::mod_p_dynamic(1, 3));
  CHECK(groups_of(h3) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  // Without a bound one, the first inverse of an unbound -2 cannot be taken: an error, not a
  // wrong answer.
  CHECK_THROWS(lacuna::homology<lacuna::mod_p_dynamic>(rp2));
}

}  // namespace homology_engine_issues_test

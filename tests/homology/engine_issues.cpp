// Engine defects found while writing the homology tests, kept as failing tests marked
// skip() until homology.hpp is fixed (remove the skip then).
#include "support.hpp"

#include <lacuna/ring/mod_p.hpp>

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

// homology_result::coordinates() is documented to throw std::invalid_argument when the chain
// is not a cycle. With sparse_elimination it does not: the chain is pushed through the
// elimination log and only its image on the core is tested, and the image of a non-cycle can
// be a cycle there (f(∂z) vanishes once the faces are eliminated). Then is_boundary() gives
// answers about chains that have no class at all: on the Delta-complex RP^2 the edge a
// (∂a = w - v) is reported as a boundary. dense_elimination throws as documented.
TEST_CASE("coordinates() rejects a chain that is not a cycle, with every variant" * doctest::skip()) {
  const auto rp2 = cell_list::projective_plane();
  const lacuna::chain<integer> a{1, {{0, integer(1)}}};  // ∂a = w - v ≠ 0 (Hatcher 2002, §2.1)
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}, lacuna::dense_elimination{}).coordinates(a),
                  std::invalid_argument);
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}).coordinates(a), std::invalid_argument);
  CHECK_THROWS_AS(lacuna::homology<integer>(rp2, {.keep_basis = true}, markowitz_only()).coordinates(a),
                  std::invalid_argument);
  // No single edge of the 7-vertex torus is a cycle (it is a simplicial complex), nor a cocycle.
  const auto t = seven_vertex_torus();
  const auto h = lacuna::homology<integer>(t, {.keep_basis = true});
  const auto co = lacuna::cohomology<integer>(t, {.keep_basis = true});
  for (std::size_t e = 0; e < t.cell_count(1); ++e) {
    const lacuna::chain<integer> edge{1, {{e, integer(1)}}};
    CHECK_THROWS_AS(h.coordinates(edge), std::invalid_argument);
    CHECK_THROWS_AS(co.coordinates(edge), std::invalid_argument);
  }
}

// homology<mod_p_dynamic> cannot work: the engine maps incidences with from_integer, which
// makes unbound elements (no modulus), and there is no option to pass p; the first inverse
// throws "the inverse of the unbound integer -2 needs a modulus". Expected over Z/2:
// H(RP^2; Z/2) = Z/2 in every degree (Hatcher 2002, §3.1; universal coefficients).
TEST_CASE("homology over mod_p_dynamic" * doctest::skip()) {
  const auto h = lacuna::homology<lacuna::mod_p_dynamic>(cell_list::projective_plane());
  CHECK(groups_of(h) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
}

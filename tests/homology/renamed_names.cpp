// The deprecated former names of docs/homology.md ("Renamed") still name the same entities,
// so code written against them keeps compiling (with a warning) and keeps its meaning.
#include <lacuna/chain/reducible_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/ring/integer.hpp>

#include <concepts>

#include <doctest/doctest.h>

#if defined(__GNUC__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wdeprecated-declarations"
#endif
static_assert(std::same_as<lacuna::reducible_complex<lacuna::integer>, lacuna::elimination_workspace<lacuna::integer>>);

TEST_CASE("reducible_complex, the former name, builds the elimination workspace of a complex") {
  // The boundary of a triangle, a circle: three vertices, three edges. The workspace holds one
  // level per dimension with every cell alive (its definition, chain/elimination_workspace.hpp),
  // and the alternating sum of the level sizes is the Euler characteristic of the circle, 0
  // (Hatcher, Algebraic Topology, Thm. 2.44 and chi(S^1) = 0; from memory).
  const lacuna::simplicial_complex circle{{0, 1}, {1, 2}, {0, 2}};
  const auto w = lacuna::reducible_complex<lacuna::integer>::build(circle);
  REQUIRE(w.levels() == 2);
  CHECK(w.size(0) == 3);
  CHECK(w.size(1) == 3);
  CHECK(static_cast<long>(w.size(0)) - static_cast<long>(w.size(1)) == 0);
  for (std::uint32_t i = 0; i < 3; ++i) CHECK(w.alive(1, i));
}
#if defined(__GNUC__)
#pragma GCC diagnostic pop
#endif

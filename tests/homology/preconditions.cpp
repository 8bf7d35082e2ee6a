// The engine refuses what it cannot compute right (issue 14, item 11) and offers a memory
// estimate and limit (issue 14, "What to build"). A boundary of a boundary that is not zero
// is the definition of "not a chain complex" (Hatcher 2002, §2.1); the cell named is worked out
// by hand beside each case.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/memory_estimate.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <string>
#include <vector>

namespace homology_preconditions_test {

/// v, w; e : w - v; f : e. ∂∂f = w - v ≠ 0 (and δδv = -f ≠ 0 in the dual).
inline lacuna::cell_list not_a_complex() {
  lacuna::cell_list c;
  c.add_cell(0, "v");
  c.add_cell(0, "w");
  c.add_cell(1, "e", {{1, 1}, {0, -1}});
  c.add_cell(2, "f", {{0, 1}});
  return c;
}

/// The invalid_complex that fn throws, or none.
template <class Fn>
std::optional<lacuna::invalid_complex> thrown(Fn&& fn) {
  try {
    fn();
  } catch (const lacuna::invalid_complex& e) {
    return e;
  }
  return std::nullopt;
}

}  // namespace homology_preconditions_test

TEST_CASE("homology, cohomology and relative homology refuse a complex with ∂∂ ≠ 0, naming the cell") {
  using namespace homology_preconditions_test;
  using lacuna::integer;
  const auto c = not_a_complex();
  CHECK_THROWS_AS(lacuna::validate(c), lacuna::invalid_complex);  // the independent checker agrees
  for (const auto reduction : {lacuna::pre_reduction::coreductions_and_collapses, lacuna::pre_reduction::none}) {
    const lacuna::sparse_elimination alg{.reduction = reduction};
    auto e = thrown([&] { (void)lacuna::homology<integer>(c, {}, alg); });
    REQUIRE(e);
    CHECK(e->dimension() == 2);
    CHECK(e->index() == 0);
    CHECK(std::string(e->what()).find("'f'") != std::string::npos);
    e = thrown([&] { (void)lacuna::homology<lacuna::z2>(c, {}, alg); });  // 1 is not 0 mod 2 either
    REQUIRE(e);
    CHECK(e->dimension() == 2);
    e = thrown([&] { (void)lacuna::cohomology<integer>(c, {}, alg); });  // δδv = -f
    REQUIRE(e);
    CHECK(e->dimension() == 0);
    CHECK(std::string(e->what()).find("'v'") != std::string::npos);
    const std::vector<std::vector<bool>> none{{false, false}, {false}, {false}};
    e = thrown([&] { (void)lacuna::relative_homology<integer>(c, none, {}, alg); });
    REQUIRE(e);
    CHECK(e->dimension() == 2);
    CHECK(thrown([&] { (void)lacuna::homology<integer>(c, {.generators = true}, alg); }));
  }
  CHECK(thrown([&] { (void)lacuna::homology<integer>(c, {}, lacuna::dense_elimination{}); }));
  // a chain complex passes: the projective plane, H_1 = Z/2 (Hatcher 2002, Example 2.42)
  const auto rp2 = lacuna::cell_list::real_projective_space(2);
  const auto h = lacuna::homology<integer>(rp2);
  CHECK(h[1].torsion == std::vector<integer>{integer(2)});
}

TEST_CASE("memory: the estimate, require_homology_memory, and the limit on the dense core") {
  using namespace homology_preconditions_test;
  using lacuna::integer;
  // a 3 x 3 torus triangulation (Hatcher 2002, §2.1; 9 vertices, 27 edges, 18 triangles)
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      const int a = 3 * i + j, b = 3 * i + (j + 1) % 3, c = 3 * ((i + 1) % 3) + j, d = 3 * ((i + 1) % 3) + (j + 1) % 3;
      facets.push_back({a, b, d});
      facets.push_back({a, c, d});
    }
  const auto torus = lacuna::simplicial_complex<int>::from_facets(facets);
  const auto plain = lacuna::estimate_homology_memory<integer>(torus);
  const auto with = lacuna::estimate_homology_memory<integer>(torus, {.generators = true});
  CHECK(plain.bytes > 0);
  CHECK(with.bytes > plain.bytes);  // the elimination log
  CHECK(with.generators > 0);
  CHECK(lacuna::estimate_homology_memory<integer>(lacuna::simplicial_complex<int>{}).bytes == 0);
  CHECK_THROWS_AS(lacuna::require_homology_memory<integer>(torus, {}, {}, 1000), lacuna::memory_limit_exceeded);
  CHECK(lacuna::require_homology_memory<integer>(torus, {}, {}, std::uint64_t{1} << 30).bytes == plain.bytes);
  try {
    (void)lacuna::require_homology_memory<integer>(torus, {}, {}, 1000);
  } catch (const lacuna::memory_limit_exceeded& e) {
    CHECK(e.needed() == plain.bytes);
    CHECK(e.limit() == 1000);
  }
  // the dense core: without pre-reductions the torus's core is its whole boundary matrices
  // (27 x 18 at least), far more than 64 bytes; with no limit the answer is the torus's
  lacuna::homology_options o;
  o.control.memory_limit = 64;
  CHECK_THROWS_AS((void)lacuna::homology<integer>(torus, o, lacuna::dense_elimination{}), lacuna::memory_limit_exceeded);
  o.control.memory_limit = 0;
  CHECK(lacuna::homology<integer>(torus, o, lacuna::dense_elimination{}).betti_numbers() ==
        std::vector<std::size_t>{1, 2, 1});  // Hatcher 2002, Example 2.36 (from memory)
}

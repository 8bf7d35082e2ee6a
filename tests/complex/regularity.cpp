// barycentric_subdivision of a cell complex checks the regularity it needs (issue 14, item
// 11): the one-vertex torus (Hatcher 2002, §2.1) is not regular — its edges are loops — and its
// order complex was a 1-dimensional complex with the wrong homology. Regular complexes (a
// simplicial complex through the cell-complex overload, a cubical complex) pass.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <doctest/doctest.h>

#include <string>

namespace complex_regularity_test {

/// The message of the invalid_complex that barycentric_subdivision(c) throws ("" if none),
/// with the cell it names.
template <class C>
std::string refusal(const C& c, int& k, std::size_t& i) {
  try {
    (void)lacuna::barycentric_subdivision(c);
  } catch (const lacuna::invalid_complex& e) {
    k = e.dimension();
    i = e.index();
    return e.what();
  }
  return {};
}

}  // namespace complex_regularity_test

TEST_CASE("barycentric_subdivision refuses complexes that are not regular, naming the cell") {
  using namespace complex_regularity_test;
  int k = -1;
  std::size_t i = 0;
  // the one-vertex torus: the edge a has boundary v - v (no faces)
  std::string m = refusal(lacuna::cell_list::torus(), k, i);
  CHECK(m.find("'a'") != std::string::npos);
  CHECK(k == 1);
  CHECK(i == 0);
  // RP^2 with one cell per dimension: the 2-cell meets its edge with incidence 2
  lacuna::cell_list rp2;
  rp2.add_cell(0, "p");
  rp2.add_cell(0, "r");
  rp2.add_cell(1, "q", {{1, 1}, {0, -1}});
  rp2.add_cell(2, "d", {{0, 2}});
  m = refusal(rp2, k, i);
  CHECK(m.find("'d'") != std::string::npos);
  CHECK(m.find("incidence 2") != std::string::npos);
  // a disk whose boundary is one edge from p to r: the diamond p < q < d fails (one edge
  // between d and p, two are needed)
  lacuna::cell_list bad;
  bad.add_cell(0, "p");
  bad.add_cell(0, "r");
  bad.add_cell(1, "q", {{1, 1}, {0, -1}});
  bad.add_cell(2, "d", {{0, 1}});
  m = refusal(bad, k, i);
  CHECK(k == 2);
  CHECK(m.find("'d'") != std::string::npos);
  // a square as a regular CW complex (4 vertices, 4 edges, 1 face) passes: sd has
  // 9 vertices, 16 edges, 8 triangles (counted by hand), χ = 1
  lacuna::cell_list square;
  for (const char* v : {"a", "b", "c", "d"}) square.add_cell(0, v);
  square.add_cell(1, "ab", {{1, 1}, {0, -1}});
  square.add_cell(1, "bc", {{2, 1}, {1, -1}});
  square.add_cell(1, "cd", {{3, 1}, {2, -1}});
  square.add_cell(1, "da", {{0, 1}, {3, -1}});
  square.add_cell(2, "s", {{0, 1}, {1, 1}, {2, 1}, {3, 1}});
  CHECK(refusal(square, k, i).empty());
  const auto sd = lacuna::barycentric_subdivision(square);
  CHECK(sd.cell_count(0) == 9);
  CHECK(sd.cell_count(1) == 16);
  CHECK(sd.cell_count(2) == 8);
  // a cubical complex: two voxels sharing a face
  const lacuna::cubical_complex<2> two({2, 1}, std::vector<std::uint64_t>{0b11});
  CHECK(refusal(two, k, i).empty());
}

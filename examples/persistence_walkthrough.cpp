// The worked example of docs/persistence.md: persistence of a height map, of four points, and
// of a projective plane over two fields. The data is made up for the example. The program
// checks what the document says about it and exits 1 (printing FAIL) if a check fails;
// tests/examples runs it and compares its lines with the document's.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/persistence/values_filtration.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <charconv>
#include <cmath>
#include <iostream>
#include <string>
#include <type_traits>
#include <vector>

namespace {

int failures = 0;
void expect(bool ok, const char* what) {
  if (!ok) {
    std::cout << "FAIL: " << what << "\n";
    ++failures;
  }
}

/// A value as the command-line tool prints it: integers as they are, doubles in the shortest
/// form that reads back as the same double.
template <class V>
std::string text(const V& v) {
  if constexpr (std::is_floating_point_v<V>) {
    char buf[32];
    return std::string(buf, std::to_chars(buf, buf + sizeof buf, v).ptr);
  } else {
    return std::to_string(v);
  }
}

/// "H_k: [b, d) [b, inf) ..." for every dimension.
template <class Result>
void print(const Result& r) {
  for (const auto& d : r.diagrams) {
    std::cout << "  H_" << d.dimension << ":";
    for (const auto& p : d.pairs) std::cout << " [" << text(p.birth) << ", " << (p.essential() ? "inf" : text(*p.death)) << ")";
    std::cout << "\n";
  }
}

}  // namespace

int main() {
  // 1. A height map of 7 x 5 pixels: a basin of depth 1 ringed by low ground around a peak
  //    of 9, and a separate hollow of 4 on the right, walled off by 6. Pixels are closed
  //    squares, so pixels touching at a corner are connected: the ring of heights 1 and 2
  //    closes at 2 (through the corners), before its two pixels of 3 enter.
  const std::vector<int> heights = {
      6, 6, 6, 6, 6, 6, 6,  //
      6, 1, 2, 2, 3, 6, 6,  //
      6, 2, 9, 9, 2, 6, 4,  //
      6, 3, 2, 2, 2, 6, 6,  //
      6, 6, 6, 6, 6, 6, 6};
  const lacuna::cubical_filtration<2, int> map({7, 5}, heights);
  const auto r = lacuna::persistence(map, {.representatives = true});
  std::cout << "sublevel sets of the height map, Z/2:\n";
  print(r);
  std::cout << "Betti numbers at height 5: " << r.betti_number(0, 5) << " " << r.betti_number(1, 5) << "\n";
  std::cout << "classes of H_1 alive from 2 to 8: " << r.persistent_betti_number(1, 2, 8) << "\n";
  const auto& loop = r.representatives[1][0];
  std::cout << "the loop is born with edge " << map.cell_name(1, r[1].pairs[0].birth_cell) << ", killed by square "
            << map.cell_name(2, r[1].pairs[0].death_cell) << ", and drawn by " << loop.terms.size() << " edges\n";
  expect(r[0].pairs.size() == 2 && r[1].pairs.size() == 1, "two classes of H_0, one of H_1");
  expect(r[1].pairs[0].birth == 2 && r[1].pairs[0].death == 9, "the ring closes at 2, the peak fills it at 9");

  const lacuna::cubical_filtration<2, int> upside({7, 5}, heights, lacuna::level_sets::superlevel);
  std::cout << "superlevel sets of the same map:\n";
  print(lacuna::persistence(upside));

  // 2. Four corners of a 2 x 1 rectangle: the loop closes at 2 (the long sides) and is
  //    filled at sqrt 5 (the diagonals).
  const auto rect = lacuna::rips_filtration::from_points(std::vector<std::vector<double>>{{0, 0}, {2, 0}, {2, 1}, {0, 1}},
                                                         {.max_dimension = 2});
  std::cout << "Vietoris-Rips of a 2 x 1 rectangle:\n";
  const auto q = lacuna::without_zero_persistence(lacuna::persistence(rect, {.max_dimension = 1}));
  print(q);
  expect(q[1].pairs.size() == 1 && q[1].pairs[0].death == std::sqrt(5.0), "the loop dies at sqrt 5");

  // 3. The projective plane with one cell per dimension (e0, e1, e2 with boundary 2 e1),
  //    entering at 0, 1 and 2: over Z/2 the 2-cell makes a class of H_2; over Z/3 it kills
  //    the class of H_1 instead (H_1 = Z/2 is invisible mod 3).
  const auto rp2 = lacuna::cell_list::real_projective_space(2);
  const lacuna::values_filtration<lacuna::cell_list, int> g(rp2, {{0}, {1}, {2}});
  const auto two = lacuna::persistence<lacuna::z2>(g);
  const auto three = lacuna::persistence<lacuna::mod_p<3>>(g);
  std::cout << "projective plane over Z/2:\n";
  print(two);
  std::cout << "projective plane over Z/3:\n";
  print(three);
  expect(two[2].essential_count() == 1 && three[1].pairs[0].death == 2, "the 2-cell creates over Z/2, kills over Z/3");

  if (failures == 0) std::cout << "all checks passed\n";
  return failures == 0 ? 0 : 1;
}

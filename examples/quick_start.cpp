// The README's quick start, built and run by the tests.
#include <lacuna/lacuna.hpp>
#include <iostream>

int main() {
  const auto klein = lacuna::cell_list::klein_bottle();
  const auto h = lacuna::homology<lacuna::integer>(klein, {.generators = true});
  for (const auto& g : h.groups) {
    std::cout << "H_" << g.dimension << ": rank " << g.rank;
    for (const auto& t : g.torsion) std::cout << ", torsion Z/" << t;
    std::cout << ", " << g.generators.size() << " generators\n";
  }
  // H_0: rank 1; H_1: rank 1, torsion Z/2; H_2: rank 0  (Hatcher 2002, Example 2.37)
  const bool ok = h[0].rank == 1 && h[1].rank == 1 && h[1].torsion.size() == 1 && h[1].torsion[0] == 2 &&
                  h[2].rank == 0 && h[2].torsion.empty();
  return ok ? 0 : 1;
}

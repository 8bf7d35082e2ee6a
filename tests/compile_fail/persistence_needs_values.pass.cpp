// Twin of persistence_needs_values.fail.cpp: the complex with vertex values (its lower-star
// filtration) is accepted.
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/persistence.hpp>

#include <vector>

int main() {
  const lacuna::simplicial_complex<int> c{{0, 1, 2}};
  (void)lacuna::persistence(lacuna::lower_star_filtration(c, std::vector<int>{0, 1, 2}));
}

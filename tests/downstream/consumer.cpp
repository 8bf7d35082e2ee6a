// A downstream program: uses the installed (or added) lacuna through its umbrella header.
#include <lacuna/lacuna.hpp>

#include <iostream>
#include <vector>

int main() {
  // The Euler characteristic of a hollow triangle, from an adapted cell list of our own.
  struct hollow_triangle {
    int top_dimension() const { return 1; }
    std::size_t cell_count(int k) const { return k == 0 || k == 1 ? 3 : 0; }
    std::vector<lacuna::incidence> boundary(int k, std::size_t i) const {
      if (k == 0) return {};
      return {{(i + 1) % 3, 1}, {i, -1}};
    }
  };
  static_assert(lacuna::cell_complex<hollow_triangle>);
  const auto chi = lacuna::euler_characteristic(hollow_triangle{});
  std::cout << (chi == 0 ? "consumer ok" : "consumer FAILED") << " chi=" << chi << "\n";
  return chi == 0 ? 0 : 1;
}

// Twin of complex_product_needs_complex.fail.cpp: a product of two cell lists compiles.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/product.hpp>

int main() {
  const auto p = lacuna::product(lacuna::cell_list::circle(), lacuna::cell_list::torus());
  return static_cast<int>(p.cell_count(0)) - 1;
}

// expect: cell_complex
// The constructions ask for lacuna::cell_complex in their signatures: a product with a type
// that has no top_dimension fails at the call. Twin: complex_product_needs_complex.pass.cpp.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/product.hpp>

namespace user {
struct not_a_complex {};
}  // namespace user

int main() {
  const auto p = lacuna::product(lacuna::cell_list::circle(), user::not_a_complex{});
  return static_cast<int>(p.cell_count(0));
}

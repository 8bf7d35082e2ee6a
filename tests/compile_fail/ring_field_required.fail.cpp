// expect: satisfaction of .*field<F>
// A function that needs a field, called with lacuna::integer (a Euclidean domain only).
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

template <lacuna::field F>
F solve_linear(const F& a, const F& b) {  // a x = b
  return lacuna::inverse(a) * b;
}

int main() {
  (void)solve_linear(lacuna::integer(3), lacuna::integer(6));
}

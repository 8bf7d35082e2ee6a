// Twin of ring_field_required.fail.cpp: the same call over Z/7 compiles.
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

template <lacuna::field F>
F solve_linear(const F& a, const F& b) {  // a x = b
  return lacuna::inverse(a) * b;
}

int main() {
  (void)solve_linear(lacuna::mod_p<7>(3), lacuna::mod_p<7>(6));
}

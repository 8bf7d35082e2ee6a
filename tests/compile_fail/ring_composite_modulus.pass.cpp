// Twin of ring_composite_modulus.fail.cpp: Z/13 compiles.
#include <lacuna/ring/mod_p.hpp>

int main() {
  lacuna::mod_p<13> x(4);
  (void)x;
}

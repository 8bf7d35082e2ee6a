// expect: the modulus P must be prime
// Z/15 is not a field: mod_p<15> is rejected at compile time.
#include <lacuna/ring/mod_p.hpp>

int main() {
  lacuna::mod_p<15> x(4);
  (void)x;
}

// Twin of ring_inverse_in_integers.fail.cpp: in Z/2 the inverse exists.
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

int main() {
  (void)lacuna::inverse(lacuna::z2(1));
}

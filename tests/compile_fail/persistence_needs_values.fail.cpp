// expect: satisfaction of .*filtration<F>
// A complex without values is not a filtration: lacuna::persistence refuses it.
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/persistence.hpp>

int main() {
  const lacuna::simplicial_complex<int> c{{0, 1, 2}};
  (void)lacuna::persistence(c);
}

// expect: satisfaction of .*field<R>
// Persistence over the integers: barcodes need a field, so lacuna::persistence refuses Z.
#include <lacuna/persistence.hpp>
#include <lacuna/ring/integer.hpp>

int main() {
  const lacuna::cubical_filtration<1, int> f({3}, {2, 1, 2});
  (void)lacuna::persistence<lacuna::integer>(f);
}

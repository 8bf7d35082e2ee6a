// Twin of persistence_needs_field.fail.cpp: the same call over Z/3 compiles.
#include <lacuna/persistence.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

int main() {
  const lacuna::cubical_filtration<1, int> f({3}, {2, 1, 2});
  (void)lacuna::persistence<lacuna::mod_p<3>>(f);
}

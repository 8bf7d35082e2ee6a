// Twin of ring_builtin_int.fail.cpp: through lacuna::integer it compiles.
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstdint>

int main() {
  (void)lacuna::gcd(lacuna::integer(std::int64_t{12}), lacuna::integer(std::int64_t{18}));
}

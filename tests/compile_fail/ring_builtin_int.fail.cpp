// expect: satisfaction of .*euclidean_domain<R>
// Machine integers are not rings for lacuna (they overflow silently): gcd rejects them.
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstdint>

int main() {
  (void)lacuna::gcd(std::int64_t{12}, std::int64_t{18});
}

// expect: lacuna::cpo_detail::inverse_fn
// lacuna::inverse exists only where the ring supplies it: not for lacuna::integer.
#include <lacuna/ring/integer.hpp>

int main() {
  (void)lacuna::inverse(lacuna::integer(3));
}

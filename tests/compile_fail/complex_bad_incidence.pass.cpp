// Twin of complex_bad_incidence.fail.cpp: terms with .face and .coefficient compile.
#include <lacuna/complex/coboundary_table.hpp>

#include <cstddef>
#include <vector>

namespace user {
struct term {
  std::size_t face;
  int coefficient;
};
struct numbers {};
inline int top_dimension(const numbers&) { return 1; }
inline std::size_t cell_count(const numbers&, int) { return 1; }
inline std::vector<term> boundary(const numbers&, int, std::size_t) { return {}; }
}  // namespace user

int main() {
  const user::numbers n;
  const lacuna::coboundary_table<user::numbers> t(n);
  return static_cast<int>(t.coboundary(0, 0).size());
}

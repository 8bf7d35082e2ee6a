// expect: incidence_like
// A boundary whose terms are plain numbers (no face, no coefficient) is not a boundary of a
// lacuna::cell_complex; the diagnostic names incidence_like. Twin: complex_bad_incidence.pass.cpp.
#include <lacuna/complex/coboundary_table.hpp>

#include <cstddef>
#include <vector>

namespace user {
struct numbers {};
inline int top_dimension(const numbers&) { return 1; }
inline std::size_t cell_count(const numbers&, int) { return 1; }
inline std::vector<double> boundary(const numbers&, int, std::size_t) { return {}; }
}  // namespace user

int main() {
  const user::numbers n;
  const lacuna::coboundary_table<user::numbers> t(n);
  return static_cast<int>(t.coboundary(0, 0).size());
}

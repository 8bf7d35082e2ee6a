// expect: satisfaction of .*cell_complex<C>.*required expression .*boundary\(c, k, i\)
// A type with cells but no boundary is not a lacuna::cell_complex: validate must refuse it at
// the call, naming the concept and its boundary requirement. Twin: complex_missing_boundary.pass.cpp.
#include <lacuna/complex/validate.hpp>

#include <cstddef>
#include <utility>
#include <vector>

namespace user {
struct cells_only {};
inline int top_dimension(const cells_only&) { return 0; }
inline std::size_t cell_count(const cells_only&, int k) { return k == 0 ? 1 : 0; }
}  // namespace user

int main() { lacuna::validate(user::cells_only{}); }

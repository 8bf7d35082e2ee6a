// Twin of complex_missing_boundary.fail.cpp: the same type with a boundary compiles.
#include <lacuna/complex/validate.hpp>

#include <cstddef>
#include <utility>
#include <vector>

namespace user {
struct cells_only {};
inline int top_dimension(const cells_only&) { return 0; }
inline std::size_t cell_count(const cells_only&, int k) { return k == 0 ? 1 : 0; }
inline std::vector<std::pair<std::size_t, long>> boundary(const cells_only&, int, std::size_t) { return {}; }
}  // namespace user

int main() { lacuna::validate(user::cells_only{}); }

// lacuna/complex/detail/concat.hpp — string concatenation for messages and names (internal).
#pragma once

#include <string>
#include <string_view>

namespace lacuna::detail {

/// Concatenates the pieces. (Written with append because GCC 12 at -O3 gives a false
/// -Wrestrict on chains of std::string operator+ with a literal in front.)
template <class... T>
std::string concat(const T&... pieces) {
  std::string s;
  (s.append(std::string_view(pieces)), ...);
  return s;
}

}  // namespace lacuna::detail

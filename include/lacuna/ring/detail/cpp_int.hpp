// lacuna/ring/detail/cpp_int.hpp — includes Boost.Multiprecision's cpp_int for lacuna.
//
// GCC 12 at -O2/-O3 reports false -Warray-bounds, -Wrestrict, -Wstringop-overflow and -Wstringop-overread
// diagnostics inside cpp_int's inlined limb copies and its string conversion (GCC bugs
// 105329, 105651 and relatives), which -Werror would turn into build failures for every
// user of lacuna::integer. They are silenced here for the Boost code only.
#pragma once

#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Warray-bounds"
#pragma GCC diagnostic ignored "-Wrestrict"
#pragma GCC diagnostic ignored "-Wstringop-overflow"
#pragma GCC diagnostic ignored "-Wstringop-overread"
#endif
#include <boost/multiprecision/cpp_int.hpp>
#include <string>
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif

// The deprecated former names of docs/homology.md ("Renamed") still name the same entities,
// so code written against them keeps compiling (with a warning) and keeps its meaning.
#include <lacuna/chain/reducible_complex.hpp>
#include <lacuna/ring/integer.hpp>

#include <concepts>

#if defined(__GNUC__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wdeprecated-declarations"
#endif
static_assert(std::same_as<lacuna::reducible_complex<lacuna::integer>, lacuna::elimination_workspace<lacuna::integer>>);
#if defined(__GNUC__)
#pragma GCC diagnostic pop
#endif

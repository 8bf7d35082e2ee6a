// fuzz/fuzz_facets.cpp — libFuzzer target: the facet list reader lacuna::io::read_facets.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/facets.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto c = lacuna::io::read_facets(in, "fuzz.facets", {.max_cells = lacuna_fuzz::max_facet_cells});
    lacuna_fuzz::check_complex(c);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

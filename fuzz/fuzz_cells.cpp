// fuzz/fuzz_cells.cpp — libFuzzer target: the cell list reader lacuna::io::read_cells.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/cells.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto c = lacuna::io::read_cells(in, "fuzz.cells", {.max_cells = lacuna_fuzz::max_cells, .max_dimension = 64, .max_coefficient_digits = 2000});
    lacuna_fuzz::check_complex(c);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

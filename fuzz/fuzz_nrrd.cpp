// fuzz/fuzz_nrrd.cpp — libFuzzer target: the NRRD reader lacuna::io::read_nrrd (raw and gzip), as 3D and as 2D.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/nrrd.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto c = lacuna::io::read_nrrd<3>(in, "fuzz.nrrd", {.limits = lacuna_fuzz::limits()});
    lacuna_fuzz::check_complex(c);
    // a dimension-3 file is refused as 2D with a parse_error; a smaller one is read again
    auto again = lacuna_fuzz::stream_of(data, size);
    const auto d = lacuna::io::read_nrrd<2>(again, "fuzz.nrrd", {.threshold = 1, .limits = lacuna_fuzz::limits()});
    lacuna_fuzz::check_complex(d);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

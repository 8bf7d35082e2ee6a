// fuzz/fuzz_off.cpp — libFuzzer target: the OFF mesh reader lacuna::io::read_off.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/off.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto m = lacuna::io::read_off(in, "fuzz.off", lacuna_fuzz::limits());
    lacuna_fuzz::check_complex(m);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

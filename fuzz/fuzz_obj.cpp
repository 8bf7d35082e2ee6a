// fuzz/fuzz_obj.cpp — libFuzzer target: the OBJ mesh reader lacuna::io::read_obj.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/obj.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto m = lacuna::io::read_obj(in, "fuzz.obj", lacuna_fuzz::limits());
    lacuna_fuzz::check_complex(m);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

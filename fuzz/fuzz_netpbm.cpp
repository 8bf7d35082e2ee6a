// fuzz/fuzz_netpbm.cpp — libFuzzer target: the PBM/PGM reader lacuna::io::read_netpbm, without and with a threshold.
// Documented errors: lacuna::parse_error only; anything else escaping is a finding.
#include <lacuna/io/netpbm.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"


extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  try {
    const auto c = lacuna::io::read_netpbm(in, "fuzz.pgm", {.limits = lacuna_fuzz::limits()});
    lacuna_fuzz::check_complex(c);
    auto again = lacuna_fuzz::stream_of(data, size);  // a threshold must not change what is accepted
    const auto t = lacuna::io::read_netpbm(again, "fuzz.pgm", {.threshold = 128, .limits = lacuna_fuzz::limits()});
    if (t.extents() != c.extents()) lacuna_fuzz::finding("the threshold changed the extents");
    lacuna_fuzz::check_complex(t);
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

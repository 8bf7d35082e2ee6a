// fuzz/fuzz_distances.cpp — libFuzzer target: the distance matrix reader
// lacuna::io::read_distances. Documented errors: lacuna::parse_error only. A matrix that is read
// must have n (n - 1) / 2 entries below the diagonal, all finite and not negative, and read back
// the same when written out as a full matrix of shortest decimals.
#include <lacuna/io/distances.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"

#include <charconv>
#include <cmath>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  const lacuna::io::distances_read_options options{.max_points = 256, .max_numbers = 1 << 14, .max_line_bytes = 1 << 12};
  try {
    const auto m = lacuna::io::read_distances(in, "fuzz.distances", options);
    const std::size_t n = m.size();
    if (m.lower.size() != (n == 0 ? 0 : n * (n - 1) / 2)) lacuna_fuzz::finding("wrong number of entries");
    for (const double v : m.lower)
      if (!std::isfinite(v) || !(v >= 0)) lacuna_fuzz::finding("an entry that is not finite or negative");
    std::string text;
    for (std::size_t i = 0; i < n; ++i) {
      for (std::size_t j = 0; j < n; ++j) {
        char buf[32];
        const auto r = std::to_chars(buf, buf + sizeof buf, m(i, j));
        text.append(buf, r.ptr);
        text += j + 1 < n ? ", " : "\n";
      }
    }
    std::istringstream again(text);
    const auto back = lacuna::io::read_distances(again, "again.distances", {.max_line_bytes = 1 << 20});
    if (back.size() != n || back.lower != m.lower) lacuna_fuzz::finding("the matrix written out reads back differently");
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

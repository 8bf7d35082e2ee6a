// fuzz/fuzz_points.cpp — libFuzzer target: the point cloud reader lacuna::io::read_points, with
// and without CSV header skipping (the first byte chooses). Documented errors: lacuna::parse_error
// only. A cloud that is read must be consistent (every point as many coordinates, all finite) and
// read back the same when written out as shortest decimals.
#include <lacuna/io/points.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"

#include <charconv>
#include <cmath>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const bool header = data[0] & 1;
  auto in = lacuna_fuzz::stream_of(data + 1, size - 1);
  const lacuna::io::points_read_options options{
      .header = header, .max_points = 1 << 12, .max_dimension = 64, .max_numbers = 1 << 14, .max_line_bytes = 1 << 12};
  try {
    const auto c = lacuna::io::read_points(in, "fuzz.points", options);
    if (c.coordinates.size() != c.size() * c.dimension || (c.dimension == 0) != c.empty() || c.size() > options.max_points)
      lacuna_fuzz::finding("inconsistent point cloud");
    std::string text;
    for (std::size_t i = 0; i < c.size(); ++i) {
      for (const double v : c.point(i)) {
        if (!std::isfinite(v)) lacuna_fuzz::finding("a coordinate that is not finite");
        char buf[32];
        const auto r = std::to_chars(buf, buf + sizeof buf, v);
        text.append(buf, r.ptr);
        text += ' ';
      }
      text += '\n';
    }
    std::istringstream again(text);
    const auto d = lacuna::io::read_points(again, "again.points", {.max_line_bytes = 1 << 20});
    if (d.coordinates != c.coordinates) lacuna_fuzz::finding("the cloud written out reads back differently");
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

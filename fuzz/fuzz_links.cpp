// fuzz/fuzz_links.cpp — libFuzzer target: the sparse distance reader lacuna::io::read_links.
// Documented errors: lacuna::parse_error only. A list that is read must name points below its
// count, no pair twice and no point with itself, hold finite distances that are not negative,
// be accepted by lacuna::rips_metric::from_links, and read back the same when written out.
#include <lacuna/io/links.hpp>  // first: see fuzz_common.hpp
#include <lacuna/persistence/implicit_rips.hpp>
#include "fuzz_common.hpp"

#include <charconv>
#include <cmath>
#include <set>
#include <utility>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  auto in = lacuna_fuzz::stream_of(data, size);
  const lacuna::io::links_read_options options{.max_points = 1 << 12, .max_pairs = 1 << 12, .max_line_bytes = 1 << 12};
  try {
    const auto l = lacuna::io::read_links(in, "fuzz.links", options);
    std::set<std::pair<std::uint32_t, std::uint32_t>> seen;
    std::vector<lacuna::rips_metric::link> links;
    std::string text = "points " + std::to_string(l.points) + "\n";
    for (const auto& p : l.pairs) {
      if (!(p.a < p.b) || p.b >= l.points) lacuna_fuzz::finding("a pair out of order or beyond the count");
      if (!seen.insert({p.a, p.b}).second) lacuna_fuzz::finding("a pair read twice");
      if (!std::isfinite(p.distance) || !(p.distance >= 0) || std::signbit(p.distance))
        lacuna_fuzz::finding("a distance that is not finite, negative or -0");
      links.push_back({p.a, p.b, p.distance});
      char buf[32];
      const auto r = std::to_chars(buf, buf + sizeof buf, p.distance);
      text += std::to_string(p.b + 1) + " " + std::to_string(p.a + 1) + " " + std::string(buf, r.ptr) + "\n";
    }
    try {
      (void)lacuna::rips_metric::from_links(l.points, links);
    } catch (const std::invalid_argument&) {
      lacuna_fuzz::finding("a list read but refused by rips_metric::from_links");
    }
    std::istringstream again(text);
    const auto back = lacuna::io::read_links(again, "again.links");
    if (back.points != l.points || back.pairs.size() != l.pairs.size()) lacuna_fuzz::finding("the list reads back differently");
    for (std::size_t i = 0; i < l.pairs.size(); ++i)
      if (back.pairs[i].a != l.pairs[i].a || back.pairs[i].b != l.pairs[i].b || back.pairs[i].distance != l.pairs[i].distance)
        lacuna_fuzz::finding("a pair reads back differently");
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

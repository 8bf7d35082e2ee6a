// fuzz/fuzz_values.cpp — libFuzzer target: the value file reader lacuna::io::read_values and
// both resolvers, against small fixed complexes (a hollow triangle with a filled corner for
// value_names::simplex, the projective plane for value_names::cell; the first byte chooses).
// Documented errors: lacuna::parse_error only. A resolved list must name every cell at most once,
// with the records' values and lines.
#include <lacuna/io/values.hpp>  // first: see fuzz_common.hpp
#include "fuzz_common.hpp"

#include <cmath>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  static const lacuna::simplicial_complex<std::string> facets{{"x", "y", "w"}, {"y", "z"}, {"z", "x"}};
  static const lacuna::cell_list cells = lacuna::cell_list::projective_plane();
  const bool simplex = data[0] & 1;
  auto in = lacuna_fuzz::stream_of(data + 1, size - 1);
  const lacuna::io::values_read_options options{
      .names = simplex ? lacuna::io::value_names::simplex : lacuna::io::value_names::cell,
      .max_records = 1 << 12,
      .max_labels = 8,
      .max_name_bytes = 1 << 14,
      .max_line_bytes = 1 << 12};
  try {
    const auto list = lacuna::io::read_values(in, "fuzz.values", options);
    for (std::size_t r = 0; r < list.size(); ++r)
      if (!std::isfinite(list.value(r)) || list.name_count(r) == 0 || (!simplex && list.name_count(r) != 1))
        lacuna_fuzz::finding("a record without a name or with a value that is not finite");
    const auto resolved = simplex ? lacuna::io::resolve_values(list, facets, "fixed.facets")
                                  : lacuna::io::resolve_values(list, cells, "fixed.cells");
    if (resolved.size() != list.size()) lacuna_fuzz::finding("records lost when resolved");
    std::vector<std::pair<int, std::size_t>> seen;
    for (std::size_t r = 0; r < resolved.size(); ++r) {
      const auto& v = resolved[r];
      if (v.line != list.line(r) || v.value != list.value(r)) lacuna_fuzz::finding("a resolved record changed");
      for (const auto& s : seen)
        if (s == std::pair{v.dimension, v.index}) lacuna_fuzz::finding("a cell resolved twice");
      seen.emplace_back(v.dimension, v.index);
    }
  } catch (const lacuna::parse_error&) {
  }
  return 0;
}

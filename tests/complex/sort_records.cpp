// The closure of facets sorts and deduplicates fixed-width vertex records; for large inputs
// it uses a radix sort. Reference: std::sort + std::unique on the same records (the
// standard library as the outside truth), for small and large vertex ids and widths 2..5.
#include <doctest/doctest.h>
#include <lacuna/complex/simplicial_complex.hpp>

#include <algorithm>
#include <random>
#include <vector>

namespace complex_sort_records_test {

TEST_CASE("sort_unique_records agrees with std::sort and std::unique") {
  std::mt19937 gen(20261202);
  for (std::size_t w : {2u, 3u, 4u, 5u})
    for (std::uint32_t max_id : {7u, 1000u, 1u << 23, 4000000000u})
      for (std::size_t n : {10u, 70000u}) {
        std::vector<std::uint32_t> flat;
        for (std::size_t i = 0; i < n * w; ++i) flat.push_back(static_cast<std::uint32_t>(gen() % max_id));
        std::vector<std::vector<std::uint32_t>> recs;
        for (std::size_t i = 0; i < flat.size(); i += w)
          recs.emplace_back(flat.begin() + static_cast<std::ptrdiff_t>(i), flat.begin() + static_cast<std::ptrdiff_t>(i + w));
        std::sort(recs.begin(), recs.end());
        recs.erase(std::unique(recs.begin(), recs.end()), recs.end());
        std::vector<std::uint32_t> expected;
        for (const auto& r : recs) expected.insert(expected.end(), r.begin(), r.end());
        lacuna::detail::sort_unique_records(flat, w);
        CHECK(flat == expected);
      }
}

}  // namespace complex_sort_records_test

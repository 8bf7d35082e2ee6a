// The implicit Vietoris–Rips route against lacuna::persistence on the explicit
// rips_filtration on larger clouds than implicit_rips.cpp (the same source: a different
// algorithm on a different numbering of the simplices must give the same (birth, death)
// values), and against Adamaszek's n-gon barcodes (circle_rips_theorem.hpp) in dimensions up
// to 5 (the derivation and its source are in circle_rips.cpp).
#include "circle_rips_theorem.hpp"

#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <optional>
#include <random>
#include <utility>
#include <vector>

namespace persistence_implicit_rips_long_test {

using value_bar = std::pair<double, std::optional<double>>;
using bars = std::vector<std::vector<value_bar>>;

template <class Result>
bars values_of(const Result& r, int D) {
  bars out(static_cast<std::size_t>(D + 1));
  for (const auto& d : r.diagrams)
    if (d.dimension <= D)
      for (const auto& p : d.pairs) out[static_cast<std::size_t>(d.dimension)].emplace_back(p.birth, p.death);
  for (auto& v : out) std::sort(v.begin(), v.end());
  return out;
}

template <class R>
void compare(const std::vector<double>& c, std::size_t dim, int D) {
  const auto m = lacuna::rips_metric::from_points(c, dim);
  const double radius = m.enclosing_radius();
  const auto f = lacuna::rips_filtration::from_points(c, dim, {.max_dimension = D + 1, .threshold = radius});
  const auto full = lacuna::persistence<R>(f, {.max_dimension = D});
  CHECK(values_of(lacuna::implicit_rips_persistence<R>(m, {.max_dimension = D}), D) ==
        values_of(lacuna::without_zero_persistence(full), D));
  CHECK(values_of(lacuna::implicit_rips_persistence<R>(m, {.max_dimension = D, .zero_persistence = true}), D) ==
        values_of(full, D));
}

TEST_CASE("random clouds: 60 points up to H_2, 30 points up to H_3, uniform and on a grid, Z/2 and Z/3") {
  std::mt19937_64 rng(424242);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::uniform_int_distribution<int> g(0, 4);
  for (int round = 0; round < 4; ++round) {
    const bool grid = round % 2 == 1;
    const std::size_t dim = 2 + static_cast<std::size_t>(round / 2);
    CAPTURE(round);
    for (const auto& [n, D] : {std::pair<std::size_t, int>{60, 2}, std::pair<std::size_t, int>{30, 3}}) {
      CAPTURE(n);
      std::vector<double> c(n * dim);
      for (auto& x : c) x = grid ? g(rng) : u(rng);
      compare<lacuna::z2>(c, dim, D);
      compare<lacuna::mod_p<3>>(c, dim, D);
    }
  }
}

TEST_CASE("regular n-gons up to dimension 5, n = 4..24: Adamaszek's barcodes") {
  namespace theorem = persistence_circle_theorem;
  for (int n = 4; n <= 24; ++n) {
    CAPTURE(n);
    const auto e = theorem::expected_bars(n);
    const int D = std::min(e.top, 5);
    const auto m = lacuna::rips_metric::from_distances(static_cast<std::size_t>(n), theorem::polygon_distances(n));
    bars want(static_cast<std::size_t>(D + 1));
    for (int k = 0; k <= D && k < static_cast<int>(e.bars.size()); ++k) want[static_cast<std::size_t>(k)] = e.bars[static_cast<std::size_t>(k)];
    for (auto& v : want) std::sort(v.begin(), v.end());
    CHECK(values_of(lacuna::implicit_rips_persistence<lacuna::mod_p<3>>(m, {.max_dimension = D}), D) == want);
  }
}

}  // namespace persistence_implicit_rips_long_test

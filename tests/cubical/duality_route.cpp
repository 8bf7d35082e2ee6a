// The duality route of images and volumes (lacuna/algorithm/cubical_duality.hpp): the
// groups from two voxel labellings and χ, against the algebra (sparse elimination and the
// Morse complex, with the route switched off), against textbook shapes, and for the options
// it takes (cohomology, reduced groups, any ring) and leaves to the algebra (generators, a
// basis, relative groups). Sources: Hatcher 2002 — Corollary 3.46 (no torsion in subsets of
// R^n, n <= 3, below the top), Theorem 3.44 (Alexander duality), the universal coefficient
// theorem (cohomology of free groups), from memory.
#include "volume_support.hpp"

#include <lacuna/algorithm/cubical_duality.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <random>
#include <span>
#include <stop_token>
#include <string>
#include <vector>

namespace cubical_duality_route_test {

using lacuna::cubical_complex;

const lacuna::sparse_elimination algebra{.cubical_duality = false};
const lacuna::sparse_elimination morse_algebra{.reduction = lacuna::pre_reduction::morse, .cubical_duality = false};

template <std::size_t D>
cubical_complex<D> from_predicate(const std::array<std::size_t, D>& n, auto pred) {
  return cubical_complex<D>::from_predicate(n, pred);
}

template <std::size_t D>
std::vector<std::string> phases_of(const cubical_complex<D>& c, lacuna::homology_options o = {}) {
  std::vector<std::string> seen;
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (seen.empty() || seen.back() != r.phase) seen.emplace_back(r.phase);
  };
  (void)lacuna::homology<lacuna::integer>(c, o);
  return seen;
}

bool has(const std::vector<std::string>& v, const std::string& s) { return std::find(v.begin(), v.end(), s) != v.end(); }

TEST_CASE("textbook shapes: a hollow cube is a sphere, a ring of voxels a circle, a frame of a cube a wedge") {
  // 3 x 3 x 3 block without its centre: a thickened S^2 (homology of spheres, Hatcher 2002 §2.1)
  const auto shell = from_predicate<3>({3, 3, 3}, [](const auto& v) { return !(v[0] == 1 && v[1] == 1 && v[2] == 1); });
  CHECK(lacuna::cubical_betti_numbers(shell) == std::vector<std::size_t>{1, 0, 1, 0});
  // the 12 edges of a 4 x 4 x 4 cube's frame: a wedge of 5 circles (χ = 1 - 5; the 1-skeleton
  // of a cube has 8 vertices and 12 edges, so b_1 = 12 - 8 + 1 = 5)
  const auto frame = from_predicate<3>({4, 4, 4}, [](const auto& v) {
    int on_face = 0;
    for (auto x : v) on_face += (x == 0 || x == 3);
    return on_face >= 2;
  });
  CHECK(lacuna::cubical_betti_numbers(frame) == std::vector<std::size_t>{1, 5, 0, 0});
  CHECK(lacuna::homology<lacuna::integer>(frame, {}, algebra).betti_numbers() == std::vector<std::size_t>{1, 5, 0, 0});
  // a square ring of pixels: S^1; two pixels touching at a corner: connected
  const auto ring = from_predicate<2>({4, 4}, [](const auto& v) { return v[0] == 0 || v[0] == 3 || v[1] == 0 || v[1] == 3; });
  CHECK(lacuna::cubical_betti_numbers(ring) == std::vector<std::size_t>{1, 1, 0});
  const auto corner = from_predicate<2>({2, 2}, [](const auto& v) { return v[0] == v[1]; });
  CHECK(lacuna::cubical_betti_numbers(corner) == std::vector<std::size_t>{1, 0, 0});
  // one dimension: three runs of voxels
  const auto runs = from_predicate<1>({9}, [](const auto& v) { return v[0] % 3 != 2; });
  CHECK(lacuna::cubical_betti_numbers(runs) == std::vector<std::size_t>{3, 0});
  // the empty image has no groups
  const auto none = from_predicate<2>({3, 3}, [](const auto&) { return false; });
  CHECK(lacuna::cubical_betti_numbers(none).empty());
  CHECK(lacuna::homology<lacuna::integer>(none).groups.empty());
}

TEST_CASE("random images and volumes: the route equals the algebra over Z, Z/2, Z/3 and Q, cohomology included") {
  std::mt19937_64 rng(20261203);
  for (int t = 0; t < 24; ++t) {
    CAPTURE(t);
    const double p = 0.25 + 0.05 * (t % 10);
    std::bernoulli_distribution coin(p);
    const std::size_t s = 3 + static_cast<std::size_t>(t % 6);
    std::vector<std::uint8_t> v3(s * (s + 1) * (s + 2)), v2(4 * s * s);
    for (auto& x : v3) x = coin(rng) ? 1 : 0;
    for (auto& x : v2) x = coin(rng) ? 1 : 0;
    const auto c3 = cubical_complex<3>::from_bytes({s, s + 1, s + 2}, v3);
    const auto c2 = cubical_complex<2>::from_bytes({2 * s, 2 * s}, v2);
    auto same = [](const auto& c) {
      const auto hz = lacuna::homology<lacuna::integer>(c);
      const auto want = lacuna::homology<lacuna::integer>(c, {}, algebra);
      CHECK(hz.betti_numbers() == want.betti_numbers());
      for (const auto& g : want.groups) CHECK(g.torsion.empty());  // Hatcher 2002, Corollary 3.46
      CHECK(hz.betti_numbers() == lacuna::homology<lacuna::integer>(c, {}, morse_algebra).betti_numbers());
      CHECK(lacuna::homology<lacuna::z2>(c).betti_numbers() == lacuna::homology<lacuna::z2>(c, {}, algebra).betti_numbers());
      CHECK(lacuna::homology<lacuna::mod_p<3>>(c).betti_numbers() ==
            lacuna::homology<lacuna::mod_p<3>>(c, {}, algebra).betti_numbers());
      CHECK(lacuna::homology<lacuna::rational>(c).betti_numbers() == want.betti_numbers());
      const auto co = lacuna::cohomology<lacuna::integer>(c);
      const auto co_algebra = lacuna::cohomology<lacuna::integer>(c, {}, algebra);
      CHECK(co.betti_numbers() == co_algebra.betti_numbers());
      for (const auto& g : co_algebra.groups) CHECK(g.torsion.empty());
      if (c.top_dimension() >= 0)
        CHECK(lacuna::homology<lacuna::integer>(c, {.reduced = true}).betti_numbers() ==
              lacuna::homology<lacuna::integer>(c, {.reduced = true}, algebra).betti_numbers());
    };
    same(c3);
    same(c2);
  }
}

TEST_CASE("checkerboard volumes: every odd voxel a sealed void (Alexander duality), against the algebra") {
  for (std::size_t n : {4u, 5u, 8u}) {
    CAPTURE(n);
    const auto c = from_predicate<3>({n, n, n}, [](const auto& v) { return (v[0] + v[1] + v[2]) % 2 == 0; });
    const auto b = lacuna::cubical_betti_numbers(c);
    // interior odd voxels: all 6 face neighbours are foreground, so each is a void of its own;
    // odd voxels on the border meet the outside
    std::size_t interior_odd = 0;
    for (std::size_t x = 1; x + 1 < n; ++x)
      for (std::size_t y = 1; y + 1 < n; ++y)
        for (std::size_t z = 1; z + 1 < n; ++z) interior_odd += (x + y + z) % 2;
    CHECK(b[2] == interior_odd);
    CHECK(b == lacuna::homology<lacuna::integer>(c, {}, algebra).betti_numbers());
  }
}

TEST_CASE("which route: groups only take it; generators, a basis, relative groups and other variants do not") {
  const auto c = from_predicate<3>({5, 5, 5}, [](const auto& v) { return (v[0] * 7 + v[1] * 3 + v[2]) % 4 != 0; });
  CHECK(has(phases_of(c), "labelling voxels"));
  CHECK(!has(phases_of(c, {.generators = true}), "labelling voxels"));
  CHECK(!has(phases_of(c, {.keep_basis = true}), "labelling voxels"));
  // the groups with generators are those of the route
  const auto hg = lacuna::homology<lacuna::integer>(c, {.generators = true});
  CHECK(hg.betti_numbers() == lacuna::homology<lacuna::integer>(c).betti_numbers());
  CHECK(hg[1].generators.size() == hg[1].rank);
}

TEST_CASE("a stop request ends the labelling with computation_stopped; the memory limit bounds the labels") {
  const auto c = from_predicate<3>({40, 40, 40}, [](const auto& v) { return (v[0] + v[1] + v[2]) % 2 == 0; });
  std::stop_source stop;
  lacuna::homology_options o;
  o.control.stop = stop.get_token();
  stop.request_stop();
  CHECK_THROWS_AS(lacuna::homology<lacuna::integer>(c, o), lacuna::computation_stopped);
  lacuna::run_control small;
  small.memory_limit = 1000;  // 40^3 labels of 4 bytes do not fit
  CHECK_THROWS_AS(lacuna::cubical_betti_numbers(c, &small), lacuna::memory_limit_exceeded);
}

}  // namespace cubical_duality_route_test

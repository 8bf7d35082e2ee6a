// The Betti numbers of larger volumes through the implicit Morse
// complex (pre_reduction::morse, over Z/2 and Z, one and two threads) against Alexander
// duality — b0 and b2 by union-find of the foreground (26-connected) and of the padded
// background (6-connected), b1 = b0 + b2 − χ with χ counted from the voxels
// (tests/cubical/volume_support.hpp; Hatcher 2002, Corollary 3.46) — and generators of the
// 64^3 porous volume lifted to the volume's own cells and verified there.
#include "volume_support.hpp"

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <vector>

namespace cubical_alexander_duality_large_test {

namespace {

// The algebra on the Morse complex (the duality route, which the default now takes for groups
// only, would repeat this file's own count; tests/cubical/duality_route.cpp checks it).
const lacuna::sparse_elimination morse{.reduction = lacuna::pre_reduction::morse, .cubical_duality = false};

void check(const lacuna_volumes::volume& v) {
  const auto d = lacuna_volumes::duality_betti(v);
  const std::vector<std::size_t> want{d.b0, d.b1, d.b2, 0};
  const auto c = lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
  CHECK(lacuna::euler_characteristic(c) == d.euler);
  CHECK(lacuna::homology<lacuna::z2>(c, {}, morse).betti_numbers() == want);
  const auto hz = lacuna::homology<lacuna::integer>(c, {.threads = 2}, morse);
  CHECK(hz.betti_numbers() == want);
  for (const auto& g : hz.groups) CHECK(g.torsion.empty());  // subsets of R^3: no torsion
}

}  // namespace

TEST_CASE("porous and coin-flip volumes up to 128^3 against Alexander duality") {
  for (std::uint64_t seed : {1, 2}) {
    check(lacuna_volumes::porous_volume(96, 2.0, seed));
    check(lacuna_volumes::porous_volume(64, 1.0, seed));
    check(lacuna_volumes::coin_flip_volume(48, 0.5, seed));
    check(lacuna_volumes::coin_flip_volume(40, 0.3, seed));
  }
  check(lacuna_volumes::porous_volume(128, 2.0, 3));
}

TEST_CASE("generators of a 64^3 porous volume through the Morse complex pass verification") {
  const auto v = lacuna_volumes::porous_volume(64, 2.0, 4);
  const auto c = lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
  const auto h = lacuna::homology<lacuna::integer>(c, {.generators = true, .threads = 2}, morse);
  const auto d = lacuna_volumes::duality_betti(v);
  CHECK(h.betti_numbers() == std::vector<std::size_t>{d.b0, d.b1, d.b2, 0});
  // cycles by the volume's own boundaries; coordinates (through the projection to the Morse
  // complex) unit-diagonal; the volume is too large for the dense cross-check
  const auto report = lacuna::verify_generators(c, h, {.dense_cell_limit = 0});
  CHECK_MESSAGE(report.ok, report.first_failure);
  CHECK(report.checks > d.b1);
}

}  // namespace cubical_alexander_duality_large_test

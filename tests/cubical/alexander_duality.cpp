// Betti numbers of binary volumes and images, lacuna's homology against an independent count:
// components of the foreground and of the background, and chi from the cells, give b0, b1, b2
// through Alexander duality (volume_support.hpp, duality_betti). Inputs: porous volumes
// (blurred noise at its median), coin flips, and hand-made shapes whose homology is known;
// the same in 2D. Over Z the homology must be torsion-free (Hatcher 2002, Corollary 3.46: a
// compact, locally contractible subset of R^n has torsion-free H_{n-1} and H_{n-2}, and
// H_i = 0 for i >= n). Also: the generators of volume_support.hpp, and its NRRD writer read
// back by lacuna::io::read_nrrd.
#include "volume_support.hpp"

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <numeric>
#include <random>
#include <span>
#include <string>
#include <vector>

namespace cubical_alexander_duality_test {

using lacuna::cubical_complex;
using lacuna_volumes::duality_numbers;
using lacuna_volumes::grid;
using lacuna_volumes::image;
using lacuna_volumes::volume;

namespace {

template <std::size_t D>
cubical_complex<D> complex_of(const grid<D>& g) {
  return cubical_complex<D>::from_bytes(g.extents, std::span<const std::uint8_t>(g.voxels));
}

// b_3 of a volume and b_2 of an image are 0: H_i(X) = 0 for i >= n when X is a compact,
// locally contractible subset of R^n (Hatcher 2002, Corollary 3.46).
template <std::size_t D>
std::vector<std::size_t> expected_betti(const grid<D>&, const duality_numbers& d) {
  if constexpr (D == 3)
    return {d.b0, d.b1, d.b2, 0};
  else
    return {d.b0, d.b1, 0};
}

// The computations checked against duality_betti. Each maps a cubical complex to its Betti
// numbers b_0..b_top. To check another variant, add a lambda here and one line to
// check_all_computations.
const auto over_z2 = [](const auto& c) { return lacuna::homology<lacuna::z2>(c).betti_numbers(); };
const auto over_integers = [](const auto& c) {
  const auto h = lacuna::homology<lacuna::integer>(c);
  for (const auto& g : h.groups) {
    CAPTURE(g.dimension);
    CHECK_MESSAGE(g.torsion.empty(), "torsion in the homology of a subset of R^n (Hatcher 2002, Corollary 3.46)");
  }
  return h.betti_numbers();
};
// The defaults above take the duality route of lacuna/algorithm/cubical_duality.hpp (labels
// and χ, written apart from this file's count); the algebra itself, without it:
const lacuna::sparse_elimination algebra{.cubical_duality = false};
const auto algebra_over_z2 = [](const auto& c) { return lacuna::homology<lacuna::z2>(c, {}, algebra).betti_numbers(); };
const auto algebra_over_integers = [](const auto& c) {
  const auto h = lacuna::homology<lacuna::integer>(c, {}, algebra);
  for (const auto& g : h.groups) CHECK(g.torsion.empty());
  return h.betti_numbers();
};
// The same through the implicit Morse complex of the volume (lacuna/algorithm/cubical_morse.hpp).
const lacuna::sparse_elimination morse{.reduction = lacuna::pre_reduction::morse, .cubical_duality = false};
const auto morse_over_z2 = [](const auto& c) { return lacuna::homology<lacuna::z2>(c, {}, morse).betti_numbers(); };
const auto morse_over_integers = [](const auto& c) {
  const auto h = lacuna::homology<lacuna::integer>(c, {.threads = 2}, morse);
  for (const auto& g : h.groups) CHECK(g.torsion.empty());
  return h.betti_numbers();
};

// Compares compute(complex) with the Betti numbers from duality, and lacuna's chi with the
// counted one. The empty complex (no foreground) has no groups at all; it is compared as zeros.
template <class Shape, class Compute>
void check_against_duality(const Shape& shape, Compute compute, const duality_numbers& d) {
  const auto c = complex_of(shape);
  CHECK(lacuna::euler_characteristic(c) == d.euler);
  std::vector<std::size_t> got = compute(c);
  const std::vector<std::size_t> want = expected_betti(shape, d);
  if (c.top_dimension() < 0) {
    CHECK(got.empty());
    got.resize(want.size(), 0);
  }
  CHECK(got == want);
}

template <class Shape, class Compute>
void check_against_duality(const Shape& shape, Compute compute) {
  check_against_duality(shape, compute, lacuna_volumes::duality_betti(shape));
}

template <class Shape>
duality_numbers check_all_computations(const Shape& shape) {
  const duality_numbers d = lacuna_volumes::duality_betti(shape);
  check_against_duality(shape, over_z2, d);
  check_against_duality(shape, over_integers, d);
  check_against_duality(shape, algebra_over_z2, d);
  check_against_duality(shape, algebra_over_integers, d);
  check_against_duality(shape, morse_over_z2, d);
  check_against_duality(shape, morse_over_integers, d);
  return d;
}

// Hand-made shapes: a grid of the given extents with the listed voxels set, and a full box.
template <std::size_t D>
grid<D> make_grid(const std::array<std::size_t, D>& n, const std::vector<std::array<std::size_t, D>>& set) {
  grid<D> g{n, std::vector<std::uint8_t>(lacuna_volumes::detail::element_count(n), 0)};
  for (const auto& p : set) {
    std::size_t i = 0;
    for (std::size_t a = D; a-- > 0;) i = i * n[a] + p[a];  // axis 0 fastest
    g.voxels.at(i) = 1;
  }
  return g;
}
template <std::size_t D>
grid<D> full_box(const std::array<std::size_t, D>& n) {
  return {n, std::vector<std::uint8_t>(lacuna_volumes::detail::element_count(n), 1)};
}

// Checks duality_betti and every computation against a known answer (want.b2 = 0 for images).
template <std::size_t D>
void check_known(const grid<D>& g, duality_numbers want) {
  const duality_numbers d = lacuna_volumes::duality_betti(g);
  CHECK(d.b0 == want.b0);
  CHECK(d.b1 == want.b1);
  CHECK(d.b2 == want.b2);
  CHECK(d.euler == static_cast<std::int64_t>(want.b0) - static_cast<std::int64_t>(want.b1) +
                       static_cast<std::int64_t>(want.b2));
  check_all_computations(g);
}

std::size_t foreground(const std::vector<std::uint8_t>& v) { return static_cast<std::size_t>(std::count(v.begin(), v.end(), 1)); }

}  // namespace

TEST_CASE("hand-made volumes with known homology") {
  SUBCASE("solid 3x3x3 cube: 1, 0, 0 (convex, hence contractible; from memory)") {
    check_known(full_box<3>({3, 3, 3}), {1, 0, 0, 1});
  }
  SUBCASE("3x3x3 shell with the middle voxel empty: 1, 0, 1 (a thickened 2-sphere; from memory)") {
    volume v = full_box<3>({3, 3, 3});
    v.voxels[13] = 0;
    check_known(v, {1, 0, 1, 2});
  }
  SUBCASE("ring of 8 voxels around an empty centre in a 3x3x1 layer: 1, 1, 0 (a solid torus; from memory)") {
    volume v = full_box<3>({3, 3, 1});
    v.voxels[4] = 0;
    check_known(v, {1, 1, 0, 0});
  }
  SUBCASE("two voxels touching only at a corner: 1, 0, 0 (two cubes meeting in one point; from memory)") {
    check_known(make_grid<3>({2, 2, 2}, {{0, 0, 0}, {1, 1, 1}}), {1, 0, 0, 1});
  }
  SUBCASE("two voxels touching only along an edge, and two apart: 1, 0, 0 and 2, 0, 0 (from memory)") {
    check_known(make_grid<3>({2, 2, 1}, {{0, 0, 0}, {1, 1, 0}}), {1, 0, 0, 1});
    check_known(make_grid<3>({3, 1, 1}, {{0, 0, 0}, {2, 0, 0}}), {2, 0, 0, 2});
  }
  SUBCASE("the six face neighbours of an empty centre voxel: 1, 0, 1 (from memory: they meet along the edges of "
          "the centre cube and contain its boundary sphere, onto which they retract)") {
    check_known(make_grid<3>({3, 3, 3}, {{0, 1, 1}, {2, 1, 1}, {1, 0, 1}, {1, 2, 1}, {1, 1, 0}, {1, 1, 2}}),
                {1, 0, 1, 2});
  }
  SUBCASE("5x3x3 block with two separate empty voxels inside: 1, 0, 2 (a ball with two cavities; from memory)") {
    volume v = full_box<3>({5, 3, 3});
    v.voxels[1 + 5 * (1 + 3 * 1)] = 0;
    v.voxels[3 + 5 * (1 + 3 * 1)] = 0;
    check_known(v, {1, 0, 2, 3});
  }
  SUBCASE("3x3x3 block with its central column removed: 1, 1, 0 (a cube with a hole drilled through is a "
          "solid torus; from memory)") {
    volume v = full_box<3>({3, 3, 3});
    v.voxels[1 + 3 * (1 + 3 * 0)] = 0;
    v.voxels[1 + 3 * (1 + 3 * 1)] = 0;
    v.voxels[1 + 3 * (1 + 3 * 2)] = 0;
    check_known(v, {1, 1, 0, 0});
  }
  SUBCASE("no foreground: the empty set, all zeros") { check_known(volume{{4, 3, 2}, std::vector<std::uint8_t>(24, 0)}, {0, 0, 0, 0}); }
}

TEST_CASE("hand-made images with known homology") {
  SUBCASE("filled 4x3 rectangle: 1, 0 (convex; from memory)") { check_known(full_box<2>({4, 3}), {1, 0, 0, 1}); }
  SUBCASE("ring of 8 pixels around an empty centre: 1, 1 (an annulus; from memory)") {
    image im = full_box<2>({3, 3});
    im.voxels[4] = 0;
    check_known(im, {1, 1, 0, 0});
  }
  SUBCASE("two pixels touching only at a corner: 1, 0 (from memory)") {
    check_known(make_grid<2>({2, 2}, {{0, 0}, {1, 1}}), {1, 0, 0, 1});
  }
  SUBCASE("four pixels around an empty centre, touching only at corners: 1, 1 (closed squares close a loop "
          "around the centre; from memory)") {
    check_known(make_grid<2>({3, 3}, {{1, 0}, {0, 1}, {2, 1}, {1, 2}}), {1, 1, 0, 0});
  }
  SUBCASE("5x3 rectangle with two holes: 1, 2 (a disk with two holes; from memory)") {
    image im = full_box<2>({5, 3});
    im.voxels[1 + 5] = 0;
    im.voxels[3 + 5] = 0;
    check_known(im, {1, 2, 0, -1});
  }
  SUBCASE("no foreground: all zeros") { check_known(image{{3, 2}, std::vector<std::uint8_t>(6, 0)}, {0, 0, 0, 0}); }
}

TEST_CASE("porous volumes: lacuna's Betti numbers over Z/2 and Z equal those from Alexander duality") {
  std::size_t seen_b0 = 0, seen_b1 = 0, seen_b2 = 0;
  for (std::size_t n : {16u, 20u, 24u, 28u, 32u})
    for (double sigma : {1.0, 2.0})
      for (std::uint64_t seed : {1u, 2u, 3u}) {
        CAPTURE(n);
        CAPTURE(sigma);
        CAPTURE(seed);
        const volume v = lacuna_volumes::porous_volume(n, sigma, seed);
        const duality_numbers d = check_all_computations(v);
        seen_b0 = std::max(seen_b0, d.b0);
        seen_b1 = std::max(seen_b1, d.b1);
        seen_b2 = std::max(seen_b2, d.b2);
      }
  // the inputs are not all balls: several components, tunnels and cavities occur
  CHECK(seen_b0 > 1);
  CHECK(seen_b1 > 0);
  CHECK(seen_b2 > 0);
}

TEST_CASE("coin-flip volumes: lacuna's Betti numbers over Z/2 and Z equal those from Alexander duality") {
  std::size_t seen_b1 = 0, seen_b2 = 0;
  std::uint64_t seed = 100;
  for (std::size_t n : {8u, 12u, 16u})
    for (double p : {0.3, 0.5, 0.7}) {
      CAPTURE(n);
      CAPTURE(p);
      CAPTURE(seed);
      const duality_numbers d = check_all_computations(lacuna_volumes::coin_flip_volume(n, p, seed++));
      seen_b1 = std::max(seen_b1, d.b1);
      seen_b2 = std::max(seen_b2, d.b2);
    }
  CHECK(seen_b1 > 0);
  CHECK(seen_b2 > 0);
}

TEST_CASE("porous and coin-flip images: lacuna's Betti numbers over Z/2 and Z equal those from duality") {
  std::size_t seen_b0 = 0, seen_b1 = 0;
  for (std::size_t n : {32u, 64u, 96u})
    for (double sigma : {1.0, 2.0})
      for (std::uint64_t seed : {1u, 2u}) {
        CAPTURE(n);
        CAPTURE(sigma);
        CAPTURE(seed);
        const duality_numbers d = check_all_computations(lacuna_volumes::porous<2>({n, n + 7}, sigma, seed));
        seen_b0 = std::max(seen_b0, d.b0);
        seen_b1 = std::max(seen_b1, d.b1);
      }
  std::uint64_t seed = 200;
  for (std::size_t n : {16u, 32u, 64u})
    for (double p : {0.3, 0.5, 0.7}) {
      CAPTURE(n);
      CAPTURE(p);
      CAPTURE(seed);
      const duality_numbers d = check_all_computations(lacuna_volumes::coin_flip<2>({n, n / 2 + 3}, p, seed++));
      seen_b0 = std::max(seen_b0, d.b0);
      seen_b1 = std::max(seen_b1, d.b1);
    }
  CHECK(seen_b0 > 1);
  CHECK(seen_b1 > 0);
}

TEST_CASE("volume_support generators: reproducible, half foreground at the median, p for coin flips") {
  const volume a = lacuna_volumes::porous_volume(20, 1.5, 7), b = lacuna_volumes::porous_volume(20, 1.5, 7);
  const volume c = lacuna_volumes::porous_volume(20, 1.5, 8);
  CHECK(a.extents == std::array<std::size_t, 3>{20, 20, 20});
  CHECK(a.voxels == b.voxels);
  CHECK(a.voxels != c.voxels);
  // foreground = value > lower median: exactly floor(N/2) voxels when the values are distinct
  CHECK(foreground(a.voxels) == 20 * 20 * 20 / 2);
  const image im = lacuna_volumes::porous<2>({31, 17}, 2.0, 3);
  CHECK(im.extents == std::array<std::size_t, 2>{31, 17});
  CHECK(foreground(im.voxels) == 31 * 17 / 2);
  // blurring makes neighbours agree more often than the 1/2 of white noise
  std::size_t agree = 0, pairs = 0;
  for (std::size_t i = 0; i + 1 < a.voxels.size(); ++i)
    if ((i + 1) % 20 != 0) {
      ++pairs;
      agree += a.voxels[i] == a.voxels[i + 1];
    }
  CHECK(static_cast<double>(agree) / static_cast<double>(pairs) > 0.75);
  // coin flips: the fraction is p within 4 standard deviations (sqrt(p(1-p)/N) = 0.0025 here)
  const volume f = lacuna_volumes::coin_flip_volume(40, 0.3, 5);
  CHECK(std::abs(static_cast<double>(foreground(f.voxels)) / 64000.0 - 0.3) < 0.01);
  const image g = lacuna_volumes::coin_flip<2>({100, 50}, 0.7, 5);
  CHECK(std::abs(static_cast<double>(foreground(g.voxels)) / 5000.0 - 0.7) < 0.03);
  // the mirror boundary and the kernel
  CHECK(lacuna_volumes::detail::mirror(-1, 5) == 0);
  CHECK(lacuna_volumes::detail::mirror(-2, 5) == 1);
  CHECK(lacuna_volumes::detail::mirror(5, 5) == 4);
  CHECK(lacuna_volumes::detail::mirror(6, 5) == 3);
  CHECK(lacuna_volumes::detail::mirror(-7, 3) == 0);  // period 6: -7 = 5 (mod 6), and 5 reflects to 0
  const auto k = lacuna_volumes::detail::gaussian_kernel(2.0);
  CHECK(k.size() == 17);  // radius ceil(4 sigma) = 8
  CHECK(std::abs(std::accumulate(k.begin(), k.end(), 0.0) - 1.0) < 1e-6);
  // a constant stays constant under the normalized, mirrored blur, even with a radius longer
  // than the axis
  std::vector<float> ones(3 * 4 * 5, 1.0f);
  for (std::size_t axis = 0; axis < 3; ++axis)
    lacuna_volumes::detail::blur_axis<3>(ones, {3, 4, 5}, axis, k);
  CHECK(std::count_if(ones.begin(), ones.end(), [](float x) { return std::abs(x - 1.0f) > 1e-5f; }) == 0);
  // shift kernels read two places away along one axis, through the mirror: on values 1 2 3 4
  // along that axis, reading at i - 2 gives 2 1 1 2 and at i + 2 gives 3 4 4 3 (index -1 reads
  // 0, -2 reads 1, 4 reads 3, 5 reads 2; the definition of the mirror boundary above)
  const std::vector<float> back{1, 0, 0, 0, 0}, ahead{0, 0, 0, 0, 1};
  for (std::size_t axis = 0; axis < 3; ++axis) {
    CAPTURE(axis);
    std::array<std::size_t, 3> n{2, 3, 2};
    n[axis] = 4;
    const auto stride = lacuna_volumes::detail::strides_of(n);
    for (const auto* kernel : {&back, &ahead}) {
      std::vector<float> f(24);
      std::array<std::size_t, 3> p{};
      for (std::size_t i = 0; i < f.size(); ++i, lacuna_volumes::detail::advance(p, n))
        f[i] = static_cast<float>(p[axis] + 1) + 10.0f * static_cast<float>(i - p[axis] * stride[axis]);
      lacuna_volumes::detail::blur_axis<3>(f, n, axis, *kernel);
      const std::array<float, 4> want = kernel == &back ? std::array<float, 4>{2, 1, 1, 2} : std::array<float, 4>{3, 4, 4, 3};
      std::size_t wrong = 0;
      p = {};
      for (std::size_t i = 0; i < f.size(); ++i, lacuna_volumes::detail::advance(p, n))
        wrong += f[i] != want[p[axis]] + 10.0f * static_cast<float>(i - p[axis] * stride[axis]);
      CHECK(wrong == 0);
    }
  }
}

TEST_CASE("write_nrrd, read back by lacuna::io::read_nrrd, gives the same cubical complex") {
  const volume cube = lacuna_volumes::porous_volume(16, 1.0, 11);
  // a box with three different extents, so that a mix-up of the axes shows
  volume box{{13, 9, 7}, {}};
  for (std::size_t z = 0; z < 7; ++z)
    for (std::size_t y = 0; y < 9; ++y)
      for (std::size_t x = 0; x < 13; ++x) box.voxels.push_back(cube.voxels[x + 16 * (y + 16 * z)]);
  std::random_device rd;
  const auto path = std::filesystem::temp_directory_path() /
                    ("lacuna-alexander-duality-" + std::to_string(rd()) + "-" + std::to_string(rd()) + ".nrrd");
  for (const volume* v : {&cube, static_cast<const volume*>(&box)}) {
    lacuna_volumes::write_nrrd(path.string(), *v);
    const auto read = lacuna::io::read_nrrd<3>(path);
    std::filesystem::remove(path);
    const auto direct = complex_of(*v);
    CHECK(read.extents() == direct.extents());
    for (int k = 0; k <= 3; ++k) {
      CAPTURE(k);
      CHECK(read.cell_count(k) == direct.cell_count(k));
    }
    std::size_t mismatches = 0;
    std::array<std::size_t, 3> p{};
    for (std::size_t i = 0; i < v->voxels.size(); ++i) {
      mismatches += read.is_foreground(p) != (v->voxels[i] != 0);
      lacuna_volumes::detail::advance(p, v->extents);
    }
    CHECK(mismatches == 0);
  }
  CHECK_THROWS_AS(lacuna_volumes::write_nrrd((path.parent_path() / "no-such-directory" / "x.nrrd").string(), box),
                  std::runtime_error);
}

}  // namespace cubical_alexander_duality_test

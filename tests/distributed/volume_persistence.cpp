// Sublevel and superlevel persistence of volumes on 1-4 MPI ranks
// (lacuna/distributed/volume_persistence.hpp): the diagrams must equal those of the
// one-process run on the whole volume — io::read_nrrd_samples, cubical_filtration, the
// default persistence variant, pairs of persistence zero dropped, which is what
// `lacuna persistence FILE.nrrd` prints — on any number of ranks and slabs per rank.
// Outside truths checked beside it: the essential classes of the whole filtration are the
// Betti numbers of the full grid, a solid cube (Z, 0, 0, 0: it is contractible); the Betti
// numbers of a sublevel set at value t (diagram.betti_at(t)) equal the one-process homology of
// the binary volume {sample <= t}, itself checked by Alexander duality in volume_homology.cpp;
// and the Euler characteristic of every sublevel set equals the alternating sum of the
// classes alive at t (Euler–Poincaré).
#include <doctest/doctest.h>

#include <lacuna/distributed/volume_persistence.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/mod_p.hpp>

#include "cubical/volume_support.hpp"

#include <mpi.h>
#include <unistd.h>

#include <algorithm>
#include <array>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <optional>
#include <random>
#include <string>
#include <utility>
#include <vector>

namespace {

int rank_in_world() {
  int r = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &r);
  return r;
}

std::filesystem::path shared_volume_path(const std::string& stem) {
  long pid = rank_in_world() == 0 ? static_cast<long>(::getpid()) : 0;
  MPI_Bcast(&pid, 1, MPI_LONG, 0, MPI_COMM_WORLD);
  return std::filesystem::temp_directory_path() / ("lacuna_volume_persistence_" + std::to_string(pid) + "_" + stem + ".nrrd");
}

using value_pairs = std::vector<std::pair<std::int32_t, std::optional<std::int32_t>>>;

template <class Result>
std::vector<value_pairs> values_of(const Result& r) {
  std::vector<value_pairs> out;
  for (const auto& d : r.diagrams) {
    value_pairs v;
    for (const auto& p : d.pairs) v.emplace_back(p.birth, p.death);
    std::sort(v.begin(), v.end());
    out.push_back(std::move(v));
  }
  return out;
}

// 16-bit samples: smooth noise (blurred, as in the porous volumes) quantized to `levels`
// values, so that many cells tie.
std::vector<std::uint16_t> smooth_samples(const std::array<std::size_t, 3>& n, unsigned levels, std::uint64_t seed) {
  std::mt19937_64 gen(seed);
  std::vector<double> f(n[0] * n[1] * n[2]);
  for (auto& x : f) x = std::uniform_real_distribution<double>(0, 1)(gen);
  for (int pass = 0; pass < 2; ++pass)  // a box blur along each axis, twice
    for (std::size_t axis = 0; axis < 3; ++axis) {
      const std::size_t stride = axis == 0 ? 1 : axis == 1 ? n[0] : n[0] * n[1];
      std::vector<double> g(f.size());
      for (std::size_t i = 0; i < f.size(); ++i) {
        const std::size_t c = (i / stride) % n[axis];
        double s = f[i];
        int m = 1;
        if (c > 0) s += f[i - stride], ++m;
        if (c + 1 < n[axis]) s += f[i + stride], ++m;
        g[i] = s / m;
      }
      f = std::move(g);
    }
  const auto [lo, hi] = std::minmax_element(f.begin(), f.end());
  std::vector<std::uint16_t> out(f.size());
  for (std::size_t i = 0; i < f.size(); ++i)
    out[i] = static_cast<std::uint16_t>(std::min<double>(levels - 1, (f[i] - *lo) / (*hi - *lo + 1e-12) * levels));
  return out;
}

void check_against_one_process(const std::array<std::size_t, 3>& n, const std::vector<std::uint16_t>& samples,
                               const std::string& stem) {
  const auto path = shared_volume_path(stem);
  if (rank_in_world() == 0) {
    std::ofstream out(path, std::ios::binary);
    lacuna::io::write_nrrd(out, n, samples, false);
  }
  MPI_Barrier(MPI_COMM_WORLD);
  auto [extents, values] = lacuna::io::read_nrrd_samples<3>(path);
  for (auto direction : {lacuna::level_sets::sublevel, lacuna::level_sets::superlevel}) {
    CAPTURE(static_cast<int>(direction));
    const lacuna::cubical_filtration<3, std::int32_t> f(extents, values, direction);
    const auto one2 = lacuna::without_zero_persistence(lacuna::persistence(f));
    const auto one3 = lacuna::without_zero_persistence(lacuna::persistence<lacuna::mod_p<3>>(f));
    for (std::size_t per_rank : {1u, 2u, 3u}) {
      CAPTURE(per_rank);
      const auto r2 = lacuna::distributed::volume_persistence(MPI_COMM_WORLD, path, {.direction = direction, .blocks_per_rank = per_rank});
      const auto r3 = lacuna::distributed::volume_persistence<lacuna::mod_p<3>>(
          MPI_COMM_WORLD, path, {.direction = direction, .blocks_per_rank = per_rank});
      CHECK(r2.has_result == (rank_in_world() == 0));
      if (!r2.has_result) continue;
      try {  // checks on the root only: a failed REQUIRE must not end the test case on the root alone
      CHECK(values_of(r2.result) == values_of(one2));
      CHECK(values_of(r3.result) == values_of(one3));
      // the whole grid is a solid box: contractible (Z, 0, 0, 0)
      REQUIRE(r2.result.diagrams.size() == 4);
      CHECK(r2.result.diagrams[0].essential_count() == 1);
      for (int k = 1; k <= 3; ++k) CHECK(r2.result.diagrams[static_cast<std::size_t>(k)].essential_count() == 0);
      if (direction == lacuna::level_sets::sublevel && per_rank == 2) {
        // sublevel sets: Betti numbers at t from the diagrams = the homology of {sample <= t}
        for (std::int32_t t : {1, 3}) {
          lacuna_volumes::volume v{n, std::vector<std::uint8_t>(samples.size())};
          for (std::size_t i = 0; i < samples.size(); ++i) v.voxels[i] = samples[i] <= t ? 1 : 0;
          const auto truth = lacuna_volumes::duality_betti(v);  // Alexander duality, flood fills
          CHECK(r2.result.diagrams[0].betti_at(t) == truth.b0);
          CHECK(r2.result.diagrams[1].betti_at(t) == truth.b1);
          CHECK(r2.result.diagrams[2].betti_at(t) == truth.b2);
          CHECK(static_cast<std::int64_t>(r2.result.diagrams[0].betti_at(t)) -
                    static_cast<std::int64_t>(r2.result.diagrams[1].betti_at(t)) +
                    static_cast<std::int64_t>(r2.result.diagrams[2].betti_at(t)) ==
                truth.euler);
        }
      }
      } catch (...) {
      }
    }
  }
  MPI_Barrier(MPI_COMM_WORLD);
  if (rank_in_world() == 0) std::filesystem::remove(path);
}

}  // namespace

TEST_CASE("smooth noise volumes: the one-process diagrams over Z/2 and Z/3, sublevel and superlevel") {
  check_against_one_process({9, 8, 13}, smooth_samples({9, 8, 13}, 6, 1), "smooth1");
  check_against_one_process({7, 10, 11}, smooth_samples({7, 10, 11}, 4, 2), "smooth2");
}

TEST_CASE("a hollow shell of low values cut through its void, and more ranks than layers") {
  // low values on a cube shell, high inside and outside: in the sublevel filtration the
  // shell's void (b2) is born at the shell's value and dies when the inside enters
  const std::array<std::size_t, 3> n{7, 7, 9};
  std::vector<std::uint16_t> s(n[0] * n[1] * n[2]);
  for (std::size_t z = 0; z < n[2]; ++z)
    for (std::size_t y = 0; y < n[1]; ++y)
      for (std::size_t x = 0; x < n[0]; ++x) {
        const bool outer = x >= 1 && x <= 5 && y >= 1 && y <= 5 && z >= 1 && z <= 7;
        const bool inner = x >= 2 && x <= 4 && y >= 2 && y <= 4 && z >= 2 && z <= 6;
        s[x + n[0] * (y + n[1] * z)] = outer && !inner ? 1 : inner ? 9 : 5;
      }
  check_against_one_process(n, s, "shell");
  const std::array<std::size_t, 3> flat{6, 5, 2};  // 2 layers: 4 ranks leave ranks without a slab
  check_against_one_process(flat, smooth_samples(flat, 5, 3), "flat");
}

TEST_CASE("bad input ends the persistence run on every rank with one error") {
  const auto path = shared_volume_path("bad");
  if (rank_in_world() == 0) {
    std::ofstream out(path, std::ios::binary);
    out << "NRRD0004\ntype: uint16\ndimension: 3\nsizes: 2 2 4\nencoding: raw\n\n";  // no endian field
  }
  MPI_Barrier(MPI_COMM_WORLD);
  bool thrown = false;
  try {
    (void)lacuna::distributed::volume_persistence(MPI_COMM_WORLD, path);
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.failing_rank() == 0);
    CHECK(e.message().find("endian") != std::string::npos);
  }
  CHECK(thrown);
  MPI_Barrier(MPI_COMM_WORLD);
  if (rank_in_world() == 0) std::filesystem::remove(path);
}

// Homology of volumes on 1-4 MPI ranks (lacuna/distributed/volume_homology.hpp): the groups
// must equal those of the one-process engine on the whole volume (io/nrrd.hpp read_nrrd, then
// homology/homology.hpp), on any number of ranks, and outside truths. They run the explicit
// route (cubical_duality = false; the duality route, the default for groups only, is tested
// in volume_duality.cpp). The truths:
//   - Alexander duality and flood fills (tests/cubical/volume_support.hpp duality_betti: b0 from
//     the components of the voxels, b2 from the bounded components of the background, b1 from
//     the Euler characteristic; Hatcher, Algebraic Topology, Corollary 3.46 and Proposition 3.46's
//     setting, from memory: a compact subset of R^3 has no torsion and H_3 = 0);
//   - the Euler characteristic from local 2x2x2 voxel configurations (Toriwaki & Yonekura
//     2002: every cell counted once, at its highest vertex, from the 8 voxels around it);
//   - the textbook groups of the shapes built here: a solid torus (Z, Z, 0), a hollow cube
//     (Z, 0, Z), nested shells (b0 = shells + core, b2 = shells).
// The volumes are cut through their tunnels and voids, some blocks hold no foreground, and
// some runs have more ranks than voxel layers.
#include <doctest/doctest.h>

#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

#include "cubical/volume_support.hpp"
#include "distributed/volume_files.hpp"

#include <mpi.h>
#include <unistd.h>

#include <array>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <map>
#include <string>
#include <vector>

namespace {

int world_rank() {
  int r = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &r);
  return r;
}
int world_size() {
  int s = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &s);
  return s;
}

// A file name shared by all ranks (rank 0's process id), written by rank 0 only.
std::filesystem::path shared_path(const std::string& stem) {
  long pid = world_rank() == 0 ? static_cast<long>(::getpid()) : 0;
  MPI_Bcast(&pid, 1, MPI_LONG, 0, MPI_COMM_WORLD);
  return std::filesystem::temp_directory_path() / ("lacuna_volume_homology_" + std::to_string(pid) + "_" + stem + ".nrrd");
}

struct written_volume {
  std::filesystem::path path;
  ~written_volume() {
    MPI_Barrier(MPI_COMM_WORLD);
    if (world_rank() == 0) std::filesystem::remove(path);
  }
};

written_volume write_shared(const lacuna_volumes::volume& v, const std::string& stem) {
  written_volume w{shared_path(stem)};
  if (world_rank() == 0) lacuna_volumes::write_nrrd(w.path.string(), v);
  MPI_Barrier(MPI_COMM_WORLD);
  return w;
}

using distributed_volume_files::euler_of;
using distributed_volume_files::on_one_rank;
using distributed_volume_files::volume_of;

template <class R>
void check_same_groups(const lacuna::homology_result<R>& a, const lacuna::homology_result<R>& b) {
  REQUIRE(a.groups.size() == b.groups.size());
  for (std::size_t k = 0; k < a.groups.size(); ++k) {
    CHECK(a.groups[k].rank == b.groups[k].rank);
    CHECK(a.groups[k].torsion == b.groups[k].torsion);
  }
}

// Runs the distributed homology over Z and Z/2 with 1, 2 and 3 blocks per rank and checks it
// on the root against the one-process engine, duality and the local Euler characteristic.
void check_volume(const lacuna_volumes::volume& v, const std::string& stem, std::array<std::size_t, 3> expected_betti) {
  const auto file = write_shared(v, stem);
  const auto truth = lacuna_volumes::duality_betti(v);  // Alexander duality + flood fills
  CHECK(truth.b0 == expected_betti[0]);
  CHECK(truth.b1 == expected_betti[1]);
  CHECK(truth.b2 == expected_betti[2]);
  CHECK(euler_of(v) == truth.euler);
  const auto whole = lacuna::io::read_nrrd<3>(file.path);
  const auto one_z = lacuna::homology<lacuna::integer>(whole);
  const auto one_2 = lacuna::homology<lacuna::mod_p<2>>(whole);
  for (std::size_t per_rank : {1u, 2u, 3u}) {
    CAPTURE(per_rank);
    const auto rz = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path, {.blocks_per_rank = per_rank, .cubical_duality = false});
    const auto r2 = lacuna::distributed::volume_homology<lacuna::mod_p<2>>(MPI_COMM_WORLD, file.path, {.blocks_per_rank = per_rank, .cubical_duality = false});
    CHECK(rz.has_result == (world_rank() == 0));
    CHECK(r2.has_result == (world_rank() == 0));
    // the cell counts, on every rank: those of the one-process complex (each cell of a plane
    // two slabs share counted once), and their alternating sum is the Euler characteristic of
    // the local configurations (Toriwaki & Yonekura 2002)
    std::vector<std::uint64_t> one_cells;
    std::int64_t alternating = 0;
    for (int k = 0; k <= whole.top_dimension(); ++k) {
      one_cells.push_back(whole.cell_count(k));
      alternating += (k % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(whole.cell_count(k));
    }
    CHECK(rz.cells == one_cells);
    CHECK(r2.cells == one_cells);
    CHECK(alternating == truth.euler);
    if (!rz.has_result) continue;
    on_one_rank([&] {
    check_same_groups(rz.result, one_z);
    check_same_groups(r2.result, one_2);
    const auto b = rz.result.betti_numbers();
    REQUIRE(b.size() == 4);
    CHECK(b[0] == truth.b0);
    CHECK(b[1] == truth.b1);
    CHECK(b[2] == truth.b2);
    CHECK(b[3] == 0);
    CHECK(static_cast<std::int64_t>(b[0]) - static_cast<std::int64_t>(b[1]) + static_cast<std::int64_t>(b[2]) == truth.euler);
    });
  }
}

}  // namespace

TEST_CASE("a solid torus cut through its tunnel: (Z, Z, 0) on every number of ranks") {
  // a square ring in the y-z plane: every slab along z cuts it, and the middle slabs hold only
  // two separate bars of it
  const auto v = volume_of({3, 10, 12}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool in_square = y >= 1 && y <= 8 && z >= 1 && z <= 10;
    const bool in_hole = y >= 3 && y <= 6 && z >= 3 && z <= 8;
    return x == 1 && in_square && !in_hole;
  });
  check_volume(v, "torus", {1, 1, 0});
}

TEST_CASE("a hollow cube cut through its void: (Z, 0, Z)") {
  const auto v = volume_of({9, 8, 11}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool outer = x >= 1 && x <= 7 && y >= 1 && y <= 6 && z >= 1 && z <= 9;
    const bool inner = x >= 3 && x <= 5 && y >= 3 && y <= 4 && z >= 3 && z <= 7;
    return outer && !inner;
  });
  check_volume(v, "shell", {1, 0, 1});
}

TEST_CASE("nested shells with a core: b0 = 3, b2 = 2") {
  const auto v = volume_of({13, 13, 13}, [](std::size_t x, std::size_t y, std::size_t z) {
    const std::size_t d = std::max({x > 6 ? x - 6 : 6 - x, y > 6 ? y - 6 : 6 - y, z > 6 ? z - 6 : 6 - z});
    return d == 6 || d == 3 || d == 0;  // cube shells at Chebyshev distance 6 and 3, and the centre voxel
  });
  check_volume(v, "nested", {3, 0, 2});
}

TEST_CASE("blocks with no foreground: two solids far apart along the cut axis") {
  const auto v = volume_of({4, 4, 16}, [](std::size_t, std::size_t, std::size_t z) { return z <= 1 || z >= 14; });
  check_volume(v, "apart", {2, 0, 0});
}

TEST_CASE("more ranks than voxel layers: an annulus two layers thick") {
  const auto v = volume_of({8, 8, 2}, [](std::size_t x, std::size_t y, std::size_t) {
    const bool outer = x >= 1 && x <= 6 && y >= 1 && y <= 6;
    const bool hole = x >= 3 && x <= 4 && y >= 3 && y <= 4;
    return outer && !hole;
  });
  check_volume(v, "annulus", {1, 1, 0});
}

TEST_CASE("an empty volume has no groups, as in one process") {
  const auto v = volume_of({3, 3, 5}, [](std::size_t, std::size_t, std::size_t) { return false; });
  const auto file = write_shared(v, "empty");
  const auto one = lacuna::homology<lacuna::integer>(lacuna::io::read_nrrd<3>(file.path));
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path, {.cubical_duality = false});
  CHECK(r.cells.empty());  // the empty complex: no cell counts, as the one-process complex has none
  if (r.has_result) on_one_rank([&] { check_same_groups(r.result, one); });
}

TEST_CASE("porous volumes (blurred noise at its median): the one-process groups, duality, local Euler") {
  // the seeds and sizes are arbitrary; the truths are recomputed for each volume
  for (std::uint64_t seed : {3u, 11u}) {
    CAPTURE(seed);
    const auto v = lacuna_volumes::porous<3>({14, 12, 17}, 1.2, seed);
    const auto t = lacuna_volumes::duality_betti(v);
    check_volume(v, "porous" + std::to_string(seed), {t.b0, t.b1, t.b2});
  }
  const auto v = lacuna_volumes::coin_flip<3>({9, 10, 13}, 0.45, 5);
  const auto t = lacuna_volumes::duality_betti(v);
  check_volume(v, "coins", {t.b0, t.b1, t.b2});
}

TEST_CASE("a threshold on 16-bit samples selects the same foreground as one process") {
  // a big-endian uint16 volume: values rise along x; threshold 300 keeps a slab x >= 3 with a
  // tunnel along z through it (the samples there are low)
  const std::array<std::size_t, 3> n{7, 6, 9};
  std::vector<std::uint16_t> samples(n[0] * n[1] * n[2]);
  for (std::size_t z = 0; z < n[2]; ++z)
    for (std::size_t y = 0; y < n[1]; ++y)
      for (std::size_t x = 0; x < n[0]; ++x)
        samples[x + n[0] * (y + n[1] * z)] = (x == 4 && y == 2) ? 7 : static_cast<std::uint16_t>(100 * x);
  const auto path = shared_path("u16");
  if (world_rank() == 0) {
    std::ofstream out(path, std::ios::binary);
    lacuna::io::write_nrrd(out, n, samples, true);
  }
  MPI_Barrier(MPI_COMM_WORLD);
  const auto one = lacuna::homology<lacuna::integer>(lacuna::io::read_nrrd<3>(path, {.threshold = 300}));
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, path, {.threshold = 300, .cubical_duality = false});
  if (r.has_result)
    on_one_rank([&] {
      check_same_groups(r.result, one);
      CHECK(r.result.betti_numbers() == std::vector<std::size_t>{1, 1, 0, 0});  // a slab with one tunnel
    });
  MPI_Barrier(MPI_COMM_WORLD);
  if (world_rank() == 0) std::filesystem::remove(path);
}

TEST_CASE("bad input ends the run on every rank with one error naming the rank") {
  const auto v = volume_of({4, 4, 8}, [](std::size_t x, std::size_t, std::size_t) { return x == 1; });
  const auto path = shared_path("truncated");
  if (world_rank() == 0) {
    lacuna_volumes::write_nrrd(path.string(), v);
    std::filesystem::resize_file(path, std::filesystem::file_size(path) - 5);  // cut the last samples
  }
  MPI_Barrier(MPI_COMM_WORLD);
  // the same message as the one-process reader
  std::string one_message;
  try {
    (void)lacuna::io::read_nrrd<3>(path);
  } catch (const std::exception& e) {
    one_message = e.what();
  }
  CHECK(one_message.find("data truncated") != std::string::npos);
  bool thrown = false;
  try {
    (void)lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, path, {.cubical_duality = false});
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.failing_rank() == 0);  // every rank holding a block fails; the lowest is named
    CHECK(e.phase() == "reading and reducing its blocks");
    CHECK(e.message().find("data truncated") != std::string::npos);
    CHECK(std::string(e.what()).find("rank 0 of " + std::to_string(world_size())) != std::string::npos);
  }
  CHECK(thrown);
  // a header error: every rank, in the first phase
  if (world_rank() == 0) {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out << "NRRD0004\ntype: float\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\n";
  }
  MPI_Barrier(MPI_COMM_WORLD);
  thrown = false;
  try {
    (void)lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, path);
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.phase() == "reading the volume header");
    CHECK(e.message().find("not supported") != std::string::npos);
  }
  CHECK(thrown);
  MPI_Barrier(MPI_COMM_WORLD);
  if (world_rank() == 0) std::filesystem::remove(path);
}

TEST_CASE("a failure on one rank only is reported on every rank") {
  // collective_phase itself: the highest rank throws, every rank sees its message
  const int last = world_size() - 1;
  bool thrown = false;
  try {
    lacuna::distributed::collective_phase(MPI_COMM_WORLD, "a phase that fails on the last rank", [&] {
      if (world_rank() == last) throw std::overflow_error("an overflow on the last rank");
      return 1;
    });
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.failing_rank() == last);
    CHECK(e.message() == "an overflow on the last rank");
  }
  CHECK(thrown);
  // and a phase where nothing fails returns its value on every rank
  CHECK(lacuna::distributed::collective_phase(MPI_COMM_WORLD, "a phase", [] { return 7; }) == 7);
}

namespace {

// det of a small square integer matrix by Laplace expansion (ranks here are at most 3)
long long small_det(const std::vector<std::vector<long long>>& m) {
  const std::size_t n = m.size();
  if (n == 0) return 1;
  if (n == 1) return m[0][0];
  long long d = 0;
  for (std::size_t c = 0; c < n; ++c) {
    std::vector<std::vector<long long>> minor;
    for (std::size_t r = 1; r < n; ++r) {
      std::vector<long long> row;
      for (std::size_t j = 0; j < n; ++j)
        if (j != c) row.push_back(m[r][j]);
      minor.push_back(row);
    }
    d += (c % 2 == 0 ? 1 : -1) * m[0][c] * small_det(minor);
  }
  return d;
}

// The generators of the distributed run, as chains of the one-process complex: each must be a
// cycle (∂ computed on the one-process complex), not a boundary, and together, where the
// rank is small, a basis of the free part (coordinates in the one-process basis with
// determinant ±1).
void check_generators(const lacuna_volumes::volume& v, const std::string& stem, std::size_t per_rank) {
  const auto file = write_shared(v, stem);
  const auto whole = lacuna::io::read_nrrd<3>(file.path);
  const auto one = lacuna::homology<lacuna::integer>(whole, {.generators = true});
  lacuna::homology_options with{};
  with.generators = true;
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path,
                                                                       {.blocks_per_rank = per_rank, .homology = with});
  if (!r.has_result) return;
  on_one_rank([&] {
  REQUIRE(r.generators.size() == r.result.groups.size());
  for (std::size_t k = 0; k < r.generators.size(); ++k) {
    CAPTURE(k);
    REQUIRE(r.generators[k].size() == one.groups[k].rank);
    std::vector<std::vector<long long>> coords;
    for (const auto& g : r.generators[k]) {
      lacuna::chain<lacuna::integer> z{static_cast<int>(k), {}};
      for (const auto& [p, c] : g.terms) {
        REQUIRE(whole.contains(p));
        z.terms.push_back({whole.index_of(p), c});
      }
      z.normalize_terms();
      REQUIRE(!z.terms.empty());
      if (k > 0) {  // a cycle of the one-process complex
        std::map<std::size_t, lacuna::integer> boundary;
        for (const auto& t : z.terms)
          for (const auto& b : whole.boundary(static_cast<int>(k), t.cell)) boundary[b.face] += t.coefficient * lacuna::integer(b.coefficient);
        for (const auto& [face, c] : boundary) CHECK(c == lacuna::integer(0));
      }
      CHECK_FALSE(one.is_boundary(z));
      std::vector<long long> row;
      for (const auto& x : one.coordinates(z)) row.push_back(x.small_value());
      coords.push_back(row);
    }
    if (coords.size() <= 3) {
      const long long d = small_det(coords);
      CHECK((d == 1 || d == -1));
    }
  }
  });
}

}  // namespace

TEST_CASE("generators mapped back to the voxels: cycles of the one-process complex in a basis of its classes") {
  for (std::size_t per_rank : {1u, 2u}) {
    CAPTURE(per_rank);
    check_generators(volume_of({3, 10, 12},
                                 [](std::size_t x, std::size_t y, std::size_t z) {
                                   const bool sq = y >= 1 && y <= 8 && z >= 1 && z <= 10, hole = y >= 3 && y <= 6 && z >= 3 && z <= 8;
                                   return x == 1 && sq && !hole;
                                 }),
                     "gen_torus", per_rank);
    check_generators(volume_of({13, 13, 13},
                                 [](std::size_t x, std::size_t y, std::size_t z) {
                                   const std::size_t d = std::max({x > 6 ? x - 6 : 6 - x, y > 6 ? y - 6 : 6 - y, z > 6 ? z - 6 : 6 - z});
                                   return d == 6 || d == 3 || d == 0;
                                 }),
                     "gen_nested", per_rank);
    check_generators(lacuna_volumes::porous<3>({10, 9, 14}, 1.2, 4), "gen_porous", per_rank);
  }
}

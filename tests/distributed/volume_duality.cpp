// The Betti numbers of volumes and images on 1-4 MPI ranks by labelling and the Euler
// characteristic (lacuna/distributed/volume_duality.hpp, and volume_homology's default route
// that takes it). They must equal, on any number of ranks:
//   - the one-process engine on the whole volume (io/nrrd.hpp read_nrrd, then
//     homology/homology.hpp) over Z and Z/2, run with its explicit elimination route
//     (cubical_duality = false), so that it shares no code with the route under test;
//   - Alexander duality and flood fills (tests/cubical/volume_support.hpp duality_betti: b0 from
//     the components of the voxels, b2 from the bounded components of the background, b1 from
//     the Euler characteristic; Hatcher, Algebraic Topology, Corollary 3.46, from memory: a
//     compact subset of R^3 has no torsion and H_3 = 0);
//   - the Euler characteristic from local 2x2x2 configurations counted at the highest vertex
//     (Toriwaki & Yonekura 2002; volume_files.hpp), apart from the library's count at the lowest;
//   - the textbook groups of the shapes built here: a solid torus (Z, Z, 0), a hollow cube
//     (Z, 0, Z), a staircase of voxels meeting only at corners (one component, contractible).
// The volumes are cut through their tunnels, voids and staircases by every number of ranks;
// cavities span several slabs; a background region meets the border only through other slabs;
// some slabs hold no foreground; some runs have more ranks than voxel layers; 2-D images are
// volumes of one layer; gzip-encoded files go through the slab reader's gzip path.
#include <doctest/doctest.h>

#include <lacuna/distributed/volume_duality.hpp>
#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

#include "cubical/volume_support.hpp"
#include "distributed/volume_files.hpp"

#include <mpi.h>

#include <algorithm>
#include <array>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <optional>
#include <string>
#include <vector>

namespace distributed_volume_duality_test {

using namespace distributed_volume_files;

// Writes v as NRRD on rank 0: raw, or gzip-compressed (zlib's deflate with the gzip wrapper),
// with `dimension` 2 for a volume of one layer when `as_image`.
shared_volume write_volume(const lacuna_volumes::volume& v, const std::string& stem, bool gzip = false, bool as_image = false) {
  shared_volume w{shared_file(stem)};
  if (rank_of_world() == 0) {
    if (!gzip && !as_image) {
      lacuna_volumes::write_nrrd(w.path.string(), v);
    } else {
      std::ofstream out(w.path, std::ios::binary | std::ios::trunc);
      out << "NRRD0004\ntype: uint8\n";
      if (as_image)
        out << "dimension: 2\nsizes: " << v.extents[0] << ' ' << v.extents[1];
      else
        out << "dimension: 3\nsizes: " << v.extents[0] << ' ' << v.extents[1] << ' ' << v.extents[2];
      out << "\nencoding: " << (gzip ? "gzip" : "raw") << "\n\n";
      if (!gzip) {
        out.write(reinterpret_cast<const char*>(v.voxels.data()), static_cast<std::streamsize>(v.voxels.size()));
      } else {
#if defined(LACUNA_HAVE_ZLIB) && LACUNA_HAVE_ZLIB
        z_stream zs{};
        REQUIRE(deflateInit2(&zs, 6, Z_DEFLATED, 15 + 16, 8, Z_DEFAULT_STRATEGY) == Z_OK);
        std::vector<unsigned char> in(v.voxels.begin(), v.voxels.end()), packed(deflateBound(&zs, static_cast<uLong>(in.size())) + 64);
        zs.next_in = in.data();
        zs.avail_in = static_cast<uInt>(in.size());
        zs.next_out = packed.data();
        zs.avail_out = static_cast<uInt>(packed.size());
        REQUIRE(deflate(&zs, Z_FINISH) == Z_STREAM_END);
        out.write(reinterpret_cast<const char*>(packed.data()), static_cast<std::streamsize>(zs.total_out));
        deflateEnd(&zs);
#endif
      }
    }
  }
  MPI_Barrier(MPI_COMM_WORLD);
  return w;
}

template <class R>
void check_same_groups(const lacuna::homology_result<R>& a, const lacuna::homology_result<R>& b) {
  REQUIRE(a.groups.size() == b.groups.size());
  for (std::size_t k = 0; k < a.groups.size(); ++k) {
    CHECK(a.groups[k].rank == b.groups[k].rank);
    CHECK(a.groups[k].torsion == b.groups[k].torsion);
  }
}

// The one-process engine on the whole file, by elimination (not by labelling).
template <class R>
lacuna::homology_result<R> one_process(const std::filesystem::path& path, const lacuna::homology_options& o = {}) {
  lacuna::sparse_elimination by_elimination;
  by_elimination.cubical_duality = false;
  return lacuna::homology<R>(lacuna::io::read_nrrd<3>(path), o, by_elimination);
}

// Checks the volume (written to a file) on every number of ranks against the truths above, and
// the textbook numbers `expected` when given.
void check_volume(const lacuna_volumes::volume& v, const std::string& stem, std::optional<std::array<std::size_t, 3>> expected,
                  bool gzip = false) {
  const auto file = write_volume(v, stem, gzip);
  const auto truth = lacuna_volumes::duality_betti(v);  // Alexander duality + flood fills
  if (expected) {
    CHECK(truth.b0 == (*expected)[0]);
    CHECK(truth.b1 == (*expected)[1]);
    CHECK(truth.b2 == (*expected)[2]);
  }
  const std::int64_t chi = euler_of(v);
  CHECK(chi == truth.euler);
  const auto one_z = one_process<lacuna::integer>(file.path);
  const auto one_2 = one_process<lacuna::mod_p<2>>(file.path);

  const auto d = lacuna::distributed::volume_duality(MPI_COMM_WORLD, file.path);
  CHECK(d.has_result == (rank_of_world() == 0));
  // every layer is read by exactly one rank
  unsigned long long voxels = d.voxels_read, all = 0;
  MPI_Allreduce(&voxels, &all, 1, MPI_UNSIGNED_LONG_LONG, MPI_SUM, MPI_COMM_WORLD);
  CHECK(all == v.voxels.size());
  const auto rz = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path);
  const auto r2 = lacuna::distributed::volume_homology<lacuna::mod_p<2>>(MPI_COMM_WORLD, file.path);
  // the cell counts, on every rank: those of the one-process cubical complex of the file
  {
    const auto whole = lacuna::io::read_nrrd<3>(file.path);
    std::vector<std::uint64_t> one_cells;
    for (int k = 0; k <= whole.top_dimension(); ++k) one_cells.push_back(whole.cell_count(k));
    CHECK(rz.cells == one_cells);
    CHECK(r2.cells == one_cells);
    if (!one_cells.empty()) CHECK(std::vector<std::uint64_t>(d.cells.begin(), d.cells.end()) == one_cells);
  }
  if (!d.has_result) return;
  on_one_rank([&] {
    const bool empty = std::none_of(v.voxels.begin(), v.voxels.end(), [](auto x) { return x != 0; });
    CHECK(d.empty == empty);
    check_same_groups(rz.result, one_z);
    check_same_groups(r2.result, one_2);
    if (empty) return;
    CHECK(d.betti[0] == truth.b0);
    CHECK(d.betti[1] == truth.b1);
    CHECK(d.betti[2] == truth.b2);
    CHECK(d.betti[3] == 0);
    CHECK(d.euler_characteristic == chi);
    CHECK(rz.result.betti_numbers() == std::vector<std::size_t>{truth.b0, truth.b1, truth.b2, 0});
  });
}

TEST_CASE("duality route: a solid torus cut through its tunnel is (Z, Z, 0)") {
  // a square ring in the y-z plane: every slab along z cuts it, the middle ones into two bars
  const auto v = volume_of({3, 10, 12}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool in_square = y >= 1 && y <= 8 && z >= 1 && z <= 10;
    const bool in_hole = y >= 3 && y <= 6 && z >= 3 && z <= 8;
    return x == 1 && in_square && !in_hole;
  });
  check_volume(v, "torus", std::array<std::size_t, 3>{1, 1, 0});
}

TEST_CASE("duality route: a hollow cube whose void spans several slabs is (Z, 0, Z)") {
  const auto v = volume_of({9, 8, 11}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool outer = x >= 1 && x <= 7 && y >= 1 && y <= 6 && z >= 1 && z <= 9;
    const bool inner = x >= 3 && x <= 5 && y >= 3 && y <= 4 && z >= 2 && z <= 8;
    return outer && !inner;
  });
  check_volume(v, "shell", std::array<std::size_t, 3>{1, 0, 1});
}

TEST_CASE("duality route: nested shells with a core: b0 = 3, b2 = 2") {
  const auto v = volume_of({13, 13, 13}, [](std::size_t x, std::size_t y, std::size_t z) {
    const std::size_t d = std::max({x > 6 ? x - 6 : 6 - x, y > 6 ? y - 6 : 6 - y, z > 6 ? z - 6 : 6 - z});
    return d == 6 || d == 3 || d == 0;
  });
  check_volume(v, "nested", std::array<std::size_t, 3>{3, 0, 2});
}

TEST_CASE("duality route: a cavity that meets the border only through a chimney in other slabs") {
  // a solid block with a cavity in its lowest layers and a one-voxel chimney from the cavity
  // up to the top face: the cavity is outside (b2 = 0) through the slabs above it; with the
  // chimney stopped one layer short of the top it is a void again (b2 = 1)
  for (std::size_t top : {11u, 10u}) {
    CAPTURE(top);
    const auto v = volume_of({6, 6, 12}, [&](std::size_t x, std::size_t y, std::size_t z) {
      const bool cavity = x >= 2 && x <= 3 && y >= 2 && y <= 3 && z >= 1 && z <= 2;
      const bool chimney = x == 2 && y == 3 && z >= 1 && z <= top;
      return !(cavity || chimney);
    });
    check_volume(v, "chimney" + std::to_string(top), std::array<std::size_t, 3>{1, 0, top == 11 ? 0u : 1u});
  }
}

TEST_CASE("duality route: voxels meeting only at corners across the cuts are one component") {
  // a diagonal staircase: foreground voxels (i, i, i) share only corners, background voxels
  // around them share faces; closed cubes: one contractible component
  const auto v = volume_of({9, 9, 9}, [](std::size_t x, std::size_t y, std::size_t z) { return x == y && y == z; });
  check_volume(v, "staircase", std::array<std::size_t, 3>{1, 0, 0});
  // a loop of voxels joined at edges and corners, crossing every cut twice: one tunnel
  const auto ring = volume_of({7, 7, 10}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool up = (z >= 1 && z <= 8) && ((x == 1 && y == 1) || (x == 5 && y == 5));
    const bool across_low = z == 0 && x == y && x >= 2 && x <= 4;
    const bool across_high = z == 9 && x == y && x >= 2 && x <= 4;
    return up || across_low || across_high;
  });
  check_volume(ring, "corner_ring", std::array<std::size_t, 3>{1, 1, 0});
}

TEST_CASE("duality route: slabs with no foreground, and an empty volume") {
  const auto v = volume_of({4, 4, 16}, [](std::size_t, std::size_t, std::size_t z) { return z <= 1 || z >= 14; });
  check_volume(v, "apart", std::array<std::size_t, 3>{2, 0, 0});
  const auto empty = volume_of({3, 3, 5}, [](std::size_t, std::size_t, std::size_t) { return false; });
  check_volume(empty, "empty", std::nullopt);
  // reduced homology of the empty volume: the duality route gives way to the explicit one on
  // every rank alike (the emptiness is known everywhere), and the groups are one process's
  const auto file = write_volume(empty, "empty_reduced");
  const lacuna::homology_options reduced{.reduced = true};
  const auto one = one_process<lacuna::integer>(file.path, reduced);
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path, {.homology = reduced});
  if (r.has_result) on_one_rank([&] { check_same_groups(r.result, one); });
}

TEST_CASE("duality route: more ranks than voxel layers") {
  const auto v = volume_of({8, 8, 2}, [](std::size_t x, std::size_t y, std::size_t) {
    const bool outer = x >= 1 && x <= 6 && y >= 1 && y <= 6;
    const bool hole = x >= 3 && x <= 4 && y >= 3 && y <= 4;
    return outer && !hole;
  });
  check_volume(v, "annulus", std::array<std::size_t, 3>{1, 1, 0});
}

TEST_CASE("duality route: porous volumes and coin flips, the one-process groups") {
  // the seeds and sizes are arbitrary; the truths are recomputed for each volume
  for (std::uint64_t seed : {3u, 11u, 29u}) {
    CAPTURE(seed);
    check_volume(lacuna_volumes::porous<3>({14, 12, 17}, 1.2, seed), "porous" + std::to_string(seed), std::nullopt);
  }
  check_volume(lacuna_volumes::coin_flip<3>({9, 10, 13}, 0.45, 5), "coins", std::nullopt);
  check_volume(lacuna_volumes::coin_flip<3>({6, 7, 9}, 0.7, 8), "dense_coins", std::nullopt);
}

TEST_CASE("duality route: a 2-D image is a volume of one layer") {
  // two annuli and a disc in a 2-D NRRD file: b0 = 3, b1 = 2 (duality_betti of the image)
  lacuna_volumes::image img{{16, 9}, std::vector<std::uint8_t>(16 * 9, 0)};
  for (std::size_t y = 0; y < 9; ++y)
    for (std::size_t x = 0; x < 16; ++x) {
      const bool ring1 = x >= 1 && x <= 5 && y >= 1 && y <= 5 && !(x == 3 && y == 3);
      const bool ring2 = x >= 7 && x <= 11 && y >= 2 && y <= 7 && !(x >= 9 && x <= 9 && y >= 4 && y <= 5);
      const bool disc = x >= 13 && x <= 14 && y >= 6 && y <= 7;
      img.voxels[x + 16 * y] = ring1 || ring2 || disc ? 1 : 0;
    }
  const auto truth = lacuna_volumes::duality_betti(img);
  CHECK(truth.b0 == 3);
  CHECK(truth.b1 == 2);
  const lacuna_volumes::volume v{{16, 9, 1}, img.voxels};
  const auto file = write_volume(v, "image", false, true);
  const auto one = one_process<lacuna::integer>(file.path);
  const auto d = lacuna::distributed::volume_duality(MPI_COMM_WORLD, file.path);
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path);
  if (d.has_result)
    on_one_rank([&] {
      CHECK(d.betti == std::array<std::size_t, 4>{3, 2, 0, 0});
      CHECK(d.euler_characteristic == truth.euler);
      check_same_groups(r.result, one);
    });
}

#if defined(LACUNA_HAVE_ZLIB) && LACUNA_HAVE_ZLIB
TEST_CASE("gzip-encoded volumes: the slab reader's gzip path gives the raw file's slabs and groups") {
  const auto v = lacuna_volumes::porous<3>({11, 13, 15}, 1.3, 41);
  check_volume(v, "gzip_porous", std::nullopt, true);
  // the explicit route reads the same file by slabs too (read_nrrd_slab): the same groups
  const auto raw = write_volume(v, "raw_porous");
  const auto gz = write_volume(v, "gz_porous", true);
  const auto one = one_process<lacuna::integer>(raw.path);
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, gz.path, {.cubical_duality = false});
  if (r.has_result) on_one_rank([&] { check_same_groups(r.result, one); });
  // every slab of every layer range reads the same bits from both files
  for (std::size_t begin = 0; begin < 15; begin += 4) {
    const std::size_t end = std::min<std::size_t>(15, begin + 1 + static_cast<std::size_t>(rank_of_world()) * 3);
    const auto a = lacuna::distributed::read_nrrd_slab(raw.path, begin, end);
    const auto b = lacuna::distributed::read_nrrd_slab(gz.path, begin, end);
    CHECK(a.volume_extents == b.volume_extents);
    CHECK(std::ranges::equal(a.complex.bitmap(), b.complex.bitmap()));
    CHECK(a.complex.cell_count(3) == b.complex.cell_count(3));
  }
  // corrupt gzip data: one error on every rank, with the one-process reader's wording
  const auto bad = shared_file("bad_gzip");
  if (rank_of_world() == 0) {
    std::ofstream out(bad, std::ios::binary | std::ios::trunc);
    out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: 4 4 4\nencoding: gzip\n\nthis is not gzip data";
  }
  MPI_Barrier(MPI_COMM_WORLD);
  bool thrown = false;
  try {
    (void)lacuna::distributed::volume_duality(MPI_COMM_WORLD, bad);
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.phase() == "reading and labelling its slab");
    CHECK(e.message().find("gzip data corrupt") != std::string::npos);
  }
  CHECK(thrown);
  MPI_Barrier(MPI_COMM_WORLD);
  if (rank_of_world() == 0) std::filesystem::remove(bad);
}
#endif

TEST_CASE("duality route: reduced homology, the switch of volume_homology, and over Z/3") {
  const auto v = lacuna_volumes::porous<3>({10, 9, 12}, 1.2, 7);
  const auto file = write_volume(v, "reduced");
  const lacuna::homology_options reduced{.reduced = true};
  const auto one = one_process<lacuna::integer>(file.path, reduced);
  const auto one3 = one_process<lacuna::mod_p<3>>(file.path);
  const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path, {.homology = reduced});
  const auto r3 = lacuna::distributed::volume_homology<lacuna::mod_p<3>>(MPI_COMM_WORLD, file.path);
  // the explicit route, chosen by the switch, reports its residual cells; the duality route none
  const auto e = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, file.path, {.cubical_duality = false});
  unsigned long long residual = r.statistics.residual_cells + e.statistics.residual_cells, all = 0;
  MPI_Allreduce(&residual, &all, 1, MPI_UNSIGNED_LONG_LONG, MPI_SUM, MPI_COMM_WORLD);
  CHECK(r.statistics.residual_cells == 0);
  CHECK(all > 0);
  if (r.has_result)
    on_one_rank([&] {
      check_same_groups(r.result, one);
      check_same_groups(r3.result, one3);
      check_same_groups(e.result, one_process<lacuna::integer>(file.path));
    });
}

TEST_CASE("duality route: bad input ends the run on every rank with one error") {
  const auto v = volume_of({4, 4, 8}, [](std::size_t x, std::size_t, std::size_t) { return x == 1; });
  const auto path = shared_file("truncated");
  if (rank_of_world() == 0) {
    lacuna_volumes::write_nrrd(path.string(), v);
    std::filesystem::resize_file(path, std::filesystem::file_size(path) - 5);
  }
  MPI_Barrier(MPI_COMM_WORLD);
  bool thrown = false;
  try {
    (void)lacuna::distributed::volume_duality(MPI_COMM_WORLD, path);
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.failing_rank() == 0);
    CHECK(e.phase() == "reading and labelling its slab");
    CHECK(e.message().find("data truncated") != std::string::npos);
  }
  CHECK(thrown);
  thrown = false;
  try {
    (void)lacuna::distributed::volume_duality(MPI_COMM_WORLD, path.string() + ".missing");
  } catch (const lacuna::distributed::distributed_error& e) {
    thrown = true;
    CHECK(e.phase() == "reading the volume header");
  }
  CHECK(thrown);
  CHECK_THROWS_AS((void)lacuna::distributed::volume_duality(MPI_COMM_WORLD, path, {.root = size_of_world()}), std::invalid_argument);
  MPI_Barrier(MPI_COMM_WORLD);
  if (rank_of_world() == 0) std::filesystem::remove(path);
}

TEST_CASE("the Euler characteristic from configurations at the lowest vertex equals the cell counts") {
  // euler_by_configurations (algorithm/cubical_duality.hpp) against the cubical complex's own
  // cell counts and the count at the highest vertex (volume_files.hpp): two ways apart
  for (std::uint64_t seed : {2u, 5u}) {
    const auto v = lacuna_volumes::coin_flip<3>({5, 6, 7}, 0.5, seed);
    const auto path = shared_file("euler" + std::to_string(seed));
    if (rank_of_world() == 0) lacuna_volumes::write_nrrd(path.string(), v);
    MPI_Barrier(MPI_COMM_WORLD);
    const auto c = lacuna::io::read_nrrd<3>(path);
    long long cells = 0;
    for (int k = 0; k <= 3; ++k) cells += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(c.cell_count(k));
    const long long by_config = lacuna::detail::euler_by_configurations<3>(
        v.extents, [&](std::size_t i) { return v.voxels[i] != 0; });
    CHECK(by_config == cells);
    CHECK(by_config == euler_of(v));
    MPI_Barrier(MPI_COMM_WORLD);
    if (rank_of_world() == 0) std::filesystem::remove(path);
  }
}

}  // namespace distributed_volume_duality_test

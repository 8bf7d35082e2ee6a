// The reduction tree of lacuna/distributed/slab_reduction_tree.hpp: residuals merged pairwise
// over ceil(log2 P) rounds, each merge reduced again. The cases are shaped so the tree matters:
// several slabs per rank, a tunnel and a void spanning every slab (closed only by the last
// merge), ranks whose slabs hold no foreground in the middle of the tree, a root other than
// rank 0 (one merge across the wrap-around of the ranks). Every answer is checked against
//   - the one-process engine on the whole volume (io::read_nrrd + homology; cubical_filtration
//     + persistence, pairs of persistence zero dropped);
//   - Alexander duality with flood fills (tests/cubical/volume_support.hpp duality_betti;
//     Hatcher, Algebraic Topology, Corollary 3.46, from memory) and the textbook groups of the
//     shapes (a solid torus: Z, Z, 0; a hollow box: Z, 0, Z);
//   - the same call with the tree off (every slab's residual gathered on the root in one step).
// And the tree does what it is for: on the root, the complex handed to the engine is no
// larger than the one the one-step gather glues (every merge only removes cells).
#include <doctest/doctest.h>

#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/distributed/volume_persistence.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/integer.hpp>
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

int tree_rank() {
  int r = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &r);
  return r;
}
int tree_size() {
  int s = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &s);
  return s;
}

// A file name shared by all ranks (rank 0's process id), removed when it goes out of scope.
struct tree_file {
  std::filesystem::path path;
  explicit tree_file(const std::string& stem) {
    long pid = tree_rank() == 0 ? static_cast<long>(::getpid()) : 0;
    MPI_Bcast(&pid, 1, MPI_LONG, 0, MPI_COMM_WORLD);
    path = std::filesystem::temp_directory_path() / ("lacuna_reduction_tree_" + std::to_string(pid) + "_" + stem + ".nrrd");
  }
  ~tree_file() {
    MPI_Barrier(MPI_COMM_WORLD);
    if (tree_rank() == 0) std::filesystem::remove(path);
  }
};

lacuna_volumes::volume shape(std::array<std::size_t, 3> n, auto inside) {
  lacuna_volumes::volume v{n, std::vector<std::uint8_t>(n[0] * n[1] * n[2], 0)};
  for (std::size_t z = 0; z < n[2]; ++z)
    for (std::size_t y = 0; y < n[1]; ++y)
      for (std::size_t x = 0; x < n[0]; ++x) v.voxels[x + n[0] * (y + n[1] * z)] = inside(x, y, z) ? 1 : 0;
  return v;
}

// Checks made on the root only must not end the test case there alone (collective calls follow).
template <class F>
void on_root(F&& checks) {
  try {
    checks();
  } catch (...) {
  }
}

// The distributed homology with and without the tree, for every root and 1-4 slabs per rank,
// against the one-process engine, duality and the expected Betti numbers.
void check_tree_homology(const lacuna_volumes::volume& v, const std::string& stem, std::array<std::size_t, 3> expected) {
  const tree_file file(stem);
  if (tree_rank() == 0) lacuna_volumes::write_nrrd(file.path.string(), v);
  MPI_Barrier(MPI_COMM_WORLD);
  const auto truth = lacuna_volumes::duality_betti(v);  // Alexander duality + flood fills
  CHECK(truth.b0 == expected[0]);
  CHECK(truth.b1 == expected[1]);
  CHECK(truth.b2 == expected[2]);
  const auto whole = lacuna::io::read_nrrd<3>(file.path);
  const auto one = lacuna::homology<lacuna::integer>(whole);
  for (int root : {0, tree_size() - 1})
    for (std::size_t per_rank : {1u, 3u, 4u}) {
      CAPTURE(root);
      CAPTURE(per_rank);
      const auto tree = lacuna::distributed::volume_homology<lacuna::integer>(
          MPI_COMM_WORLD, file.path, {.blocks_per_rank = per_rank, .root = root, .reduction_tree = true, .cubical_duality = false});
      const auto flat = lacuna::distributed::volume_homology<lacuna::integer>(
          MPI_COMM_WORLD, file.path, {.blocks_per_rank = per_rank, .root = root, .reduction_tree = false, .cubical_duality = false});
      const auto tree3 = lacuna::distributed::volume_homology<lacuna::mod_p<3>>(
          MPI_COMM_WORLD, file.path, {.blocks_per_rank = per_rank, .root = root, .cubical_duality = false});
      CHECK(tree.has_result == (tree_rank() == root));
      CHECK(tree.statistics.merges <= 1 + 2 * static_cast<std::uint64_t>(tree_size()));
      if (!tree.has_result) continue;
      on_root([&] {
        REQUIRE(tree.result.groups.size() == one.groups.size());
        REQUIRE(flat.result.groups.size() == one.groups.size());
        REQUIRE(tree3.result.groups.size() == one.groups.size());
        for (std::size_t k = 0; k < one.groups.size(); ++k) {
          CHECK(tree.result.groups[k].rank == one.groups[k].rank);
          CHECK(tree.result.groups[k].torsion == one.groups[k].torsion);
          CHECK(flat.result.groups[k].rank == one.groups[k].rank);
          CHECK(tree3.result.groups[k].rank == one.groups[k].rank);  // no torsion in R^3: same ranks mod 3
        }
        const auto b = tree.result.betti_numbers();
        REQUIRE(b.size() == 4);
        CHECK(b[0] == truth.b0);
        CHECK(b[1] == truth.b1);
        CHECK(b[2] == truth.b2);
        // every merge only removes cells: the root's complex is no larger than the flat glue
        CHECK(tree.statistics.glued_cells <= flat.statistics.glued_cells);
        CHECK(tree.statistics.merges >= 1);
      });
    }
}

}  // namespace

TEST_CASE("a tunnel through every slab: a square ring standing along the cut axis, closed only by the last merge") {
  // the ring spans z = 1..22: with 4 ranks and 3 slabs each every slab holds two bars of it,
  // and its tunnel exists only in the union of all of them
  const auto v = shape({3, 8, 24}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool square = y >= 1 && y <= 6 && z >= 1 && z <= 22;
    const bool hole = y >= 3 && y <= 4 && z >= 3 && z <= 20;
    return x == 1 && square && !hole;
  });
  check_tree_homology(v, "ring", {1, 1, 0});
}

TEST_CASE("a void through every slab: a hollow box, its cavity spanning the cut axis") {
  const auto v = shape({6, 6, 20}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool outer = x >= 1 && x <= 4 && y >= 1 && y <= 4 && z >= 1 && z <= 18;
    const bool inner = x >= 2 && x <= 3 && y >= 2 && y <= 3 && z >= 2 && z <= 17;
    return outer && !inner;
  });
  check_tree_homology(v, "box", {1, 0, 1});
}

TEST_CASE("empty slabs in the middle of the tree: two rings at the two ends of the volume") {
  // foreground only in the first and the last 4 layers: the middle ranks send empty residuals
  const auto v = shape({6, 6, 24}, [](std::size_t x, std::size_t y, std::size_t z) {
    const bool annulus = x >= 1 && x <= 4 && y >= 1 && y <= 4 && !(x >= 2 && x <= 3 && y >= 2 && y <= 3);
    return annulus && (z <= 3 || z >= 20);
  });
  check_tree_homology(v, "ends", {2, 2, 0});
}

TEST_CASE("a porous volume: the tree, the one-step gather and one process agree") {
  const auto v = lacuna_volumes::porous<3>({14, 14, 28}, 1.5, 20261204);
  const auto truth = lacuna_volumes::duality_betti(v);
  check_tree_homology(v, "porous", {truth.b0, truth.b1, truth.b2});
}

TEST_CASE("persistence through the tree: the diagrams of one process and of the one-step gather") {
  const std::array<std::size_t, 3> n{7, 6, 22};
  std::mt19937_64 gen(20261204);
  std::vector<std::uint16_t> samples(n[0] * n[1] * n[2]);
  for (auto& s : samples) s = static_cast<std::uint16_t>(std::uniform_int_distribution<int>(0, 5)(gen));  // many ties
  const tree_file file("persistence");
  if (tree_rank() == 0) {
    std::ofstream out(file.path, std::ios::binary);
    lacuna::io::write_nrrd(out, n, samples, false);
  }
  MPI_Barrier(MPI_COMM_WORLD);
  auto [extents, values] = lacuna::io::read_nrrd_samples<3>(file.path);
  using pairs_t = std::vector<std::pair<std::int32_t, std::optional<std::int32_t>>>;
  auto pairs_of = [](const auto& r) {
    std::vector<pairs_t> out;
    for (const auto& d : r.diagrams) {
      pairs_t p;
      for (const auto& x : d.pairs) p.emplace_back(x.birth, x.death);
      std::sort(p.begin(), p.end());
      out.push_back(std::move(p));
    }
    return out;
  };
  for (auto direction : {lacuna::level_sets::sublevel, lacuna::level_sets::superlevel}) {
    const lacuna::cubical_filtration<3, std::int32_t> f(extents, values, direction);
    const auto one = lacuna::without_zero_persistence(lacuna::persistence(f));
    for (int root : {0, tree_size() - 1})
      for (std::size_t per_rank : {1u, 3u}) {
        CAPTURE(static_cast<int>(direction));
        CAPTURE(root);
        CAPTURE(per_rank);
        const auto tree = lacuna::distributed::volume_persistence(
            MPI_COMM_WORLD, file.path, {.direction = direction, .blocks_per_rank = per_rank, .root = root});
        const auto flat = lacuna::distributed::volume_persistence(
            MPI_COMM_WORLD, file.path, {.direction = direction, .blocks_per_rank = per_rank, .root = root, .reduction_tree = false});
        if (!tree.has_result) continue;
        on_root([&] {
          CHECK(pairs_of(tree.result) == pairs_of(one));
          CHECK(pairs_of(flat.result) == pairs_of(one));
          CHECK(tree.statistics.glued_cells <= flat.statistics.glued_cells);
          // the whole grid is a solid box: one essential class, in dimension 0
          REQUIRE(tree.result.diagrams.size() == 4);
          CHECK(tree.result.diagrams[0].essential_count() == 1);
        });
      }
  }
}

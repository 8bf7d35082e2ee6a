// volume_files.hpp — volumes written once and read by every rank, for the tests of the MPI part
// that read NRRD files (tests/distributed/), and an Euler characteristic counted apart from
// lacuna. Names live in distributed_volume_files, so that the files of the folder, compiled
// as one translation unit, can all include it.
#pragma once

#include "cubical/volume_support.hpp"

#include <mpi.h>
#include <unistd.h>

#include <array>
#include <bit>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <utility>
#include <vector>

namespace distributed_volume_files {

inline int rank_of_world() {
  int r = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &r);
  return r;
}
inline int size_of_world() {
  int s = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &s);
  return s;
}

/// A file name shared by all ranks (rank 0's process id and `stem`), in the temporary folder.
inline std::filesystem::path shared_file(const std::string& stem, const std::string& extension = ".nrrd") {
  long pid = rank_of_world() == 0 ? static_cast<long>(::getpid()) : 0;
  MPI_Bcast(&pid, 1, MPI_LONG, 0, MPI_COMM_WORLD);
  return std::filesystem::temp_directory_path() / ("lacuna_mpi_volume_" + std::to_string(pid) + "_" + stem + extension);
}

/// A shared file, removed by rank 0 when every rank is done with it.
struct shared_volume {
  std::filesystem::path path;
  bool owner = true;  // false once moved from
  explicit shared_volume(std::filesystem::path p) : path(std::move(p)) {}
  shared_volume(shared_volume&& o) noexcept : path(std::move(o.path)), owner(o.owner) { o.owner = false; }
  shared_volume& operator=(shared_volume&&) = delete;
  ~shared_volume() {
    if (!owner) return;
    MPI_Barrier(MPI_COMM_WORLD);
    if (rank_of_world() == 0) std::filesystem::remove(path);
  }
};

/// A binary volume of extents n, voxel (x, y, z) foreground when inside(x, y, z).
template <class Inside>
lacuna_volumes::volume volume_of(std::array<std::size_t, 3> n, Inside inside) {
  lacuna_volumes::volume v{n, std::vector<std::uint8_t>(n[0] * n[1] * n[2], 0)};
  for (std::size_t z = 0; z < n[2]; ++z)
    for (std::size_t y = 0; y < n[1]; ++y)
      for (std::size_t x = 0; x < n[0]; ++x) v.voxels[x + n[0] * (y + n[1] * z)] = inside(x, y, z) ? 1 : 0;
  return v;
}

/// The Euler characteristic of the union of the closed foreground voxels of v, from the 2x2x2
/// configuration around every vertex (Toriwaki & Yonekura 2002): the cell spanning v - e..v
/// (e a set of axes) is present iff a voxel v - s with s ⊇ e is foreground; it is counted
/// once, at its highest vertex, with sign (-1)^|e|.
inline std::int64_t euler_of(const lacuna_volumes::volume& v) {
  const auto n = v.extents;
  auto fg = [&](std::ptrdiff_t x, std::ptrdiff_t y, std::ptrdiff_t z) {
    if (x < 0 || y < 0 || z < 0 || x >= static_cast<std::ptrdiff_t>(n[0]) || y >= static_cast<std::ptrdiff_t>(n[1]) ||
        z >= static_cast<std::ptrdiff_t>(n[2]))
      return false;
    return v.voxels[static_cast<std::size_t>(x) + n[0] * (static_cast<std::size_t>(y) + n[1] * static_cast<std::size_t>(z))] != 0;
  };
  std::int64_t chi = 0;
  for (std::ptrdiff_t z = 0; z <= static_cast<std::ptrdiff_t>(n[2]); ++z)
    for (std::ptrdiff_t y = 0; y <= static_cast<std::ptrdiff_t>(n[1]); ++y)
      for (std::ptrdiff_t x = 0; x <= static_cast<std::ptrdiff_t>(n[0]); ++x) {
        unsigned config = 0;
        for (unsigned s = 0; s < 8; ++s)
          if (fg(x - (s & 1), y - ((s >> 1) & 1), z - ((s >> 2) & 1))) config |= 1u << s;
        for (unsigned e = 0; e < 8; ++e) {
          bool present = false;
          for (unsigned s = 0; s < 8; ++s)
            if ((s & e) == e && ((config >> s) & 1)) present = true;
          if (present) chi += (std::popcount(e) % 2 == 0) ? 1 : -1;
        }
      }
  return chi;
}

/// Runs checks made on one rank only: a failed REQUIRE must not end the test case on that rank
/// alone, or the ranks' collective calls would no longer match.
template <class F>
void on_one_rank(F&& checks) {
  try {
    checks();
  } catch (...) {
  }
}

}  // namespace distributed_volume_files

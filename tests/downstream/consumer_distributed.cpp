// A downstream MPI program: uses the installed MPI part of lacuna (find_package(lacuna
// COMPONENTS distributed), target lacuna::distributed). Rank 0 writes a small volume, every rank
// computes its homology by slabs, and rank 0 checks the answer.
//
// The volume: a 5×5×7 box of foreground voxels with a sealed 1×1×3 cavity and a tunnel
// through the box along x (the tunnel misses the cavity). The foreground is a solid torus with
// a ball removed, so its homology is that of S^1 ∨ S^2: b_0 = 1, b_1 = 1, b_2 = 1 (Hatcher 2002,
// the homology of a wedge, Corollary 2.25, from memory), no torsion (a subset of R^3).
#include <lacuna/distributed/volume_homology.hpp>

#include <mpi.h>

#include <cstdio>
#include <fstream>
#include <iostream>
#include <string>
#include <vector>

int main(int argc, char** argv) {
  MPI_Init(&argc, &argv);
  int rank = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  const std::string path = argc > 1 ? argv[1] : "consumer_volume.nrrd";
  constexpr int nx = 5, ny = 5, nz = 7;
  if (rank == 0) {
    std::vector<unsigned char> v(nx * ny * nz, 1);
    auto at = [&](int x, int y, int z) -> unsigned char& { return v[(z * ny + y) * nx + x]; };
    for (int z = 1; z <= 3; ++z) at(2, 2, z) = 0;  // the cavity
    for (int x = 0; x < nx; ++x) at(x, 2, 5) = 0;  // the tunnel
    std::ofstream out(path, std::ios::binary);
    out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: " << nx << " " << ny << " " << nz
        << "\nencoding: raw\n\n";
    out.write(reinterpret_cast<const char*>(v.data()), static_cast<std::streamsize>(v.size()));
  }
  MPI_Barrier(MPI_COMM_WORLD);
  int status = 0;
  try {
    const auto r = lacuna::distributed::volume_homology<lacuna::integer>(MPI_COMM_WORLD, path);
    if (r.has_result) {
      const auto b = r.result.betti_numbers();
      bool torsion = false;
      for (const auto& g : r.result.groups) torsion = torsion || !g.torsion.empty();
      const bool ok = b.size() >= 3 && b[0] == 1 && b[1] == 1 && b[2] == 1 && !torsion;
      std::cout << (ok ? "consumer ok" : "consumer FAILED") << " betti=";
      for (auto x : b) std::cout << x << ' ';
      std::cout << "\n";
      status = ok ? 0 : 1;
    }
  } catch (const std::exception& e) {
    std::cerr << "rank " << rank << ": " << e.what() << "\n";
    status = 1;
  }
  int worst = 0;
  MPI_Allreduce(&status, &worst, 1, MPI_INT, MPI_MAX, MPI_COMM_WORLD);
  if (rank == 0) std::remove(path.c_str());
  MPI_Finalize();
  return worst;
}

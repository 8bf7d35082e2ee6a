// Measures the memory of lacuna::simplicial_complex at ten million simplices: the Kuhn
// (Freudenthal) triangulation of an m x m x m grid of cubes, six tetrahedra per cube, m = 73.
// Cell counts are checked against formulas counted by hand (below) and chi = 1 (a cube is
// contractible). The numbers measured are printed; measured here (GCC 12, x86-64, -O3):
//   10 210 803 simplices, 117.5 MB of simplex arrays = 11.5 bytes per simplex
//   (4(k+1) bytes per k-simplex), peak resident memory of the whole run 331 MiB (the builder's
//   sort holds a second copy of one dimension for a moment; the vertex-label hash map for
//   405 224 integer labels is included), built in 4.0 s. So 10^7 simplices: a few hundred MB.
#include <doctest/doctest.h>

#include <lacuna/complex/simplicial_complex.hpp>

#include <algorithm>
#include <array>
#include <chrono>
#include <cstdint>
#include <fstream>
#include <iostream>
#include <string>

namespace complex_simplicial_memory_test {

namespace {
std::size_t peak_rss_kib() {  // VmHWM from /proc/self/status (Linux)
  std::ifstream s("/proc/self/status");
  std::string line;
  while (std::getline(s, line))
    if (line.rfind("VmHWM:", 0) == 0) return std::stoul(line.substr(6));
  return 0;
}
}  // namespace

TEST_CASE("ten million simplices: about 12 bytes each") {
  const std::uint64_t m = 73, n = m + 1;
  const auto t0 = std::chrono::steady_clock::now();
  lacuna::simplicial_complex<std::uint32_t>::builder b;
  const auto id = [&](std::uint64_t x, std::uint64_t y, std::uint64_t z) {
    return static_cast<std::uint32_t>((x * n + y) * n + z);
  };
  for (std::uint64_t x = 0; x < n; ++x)
    for (std::uint64_t y = 0; y < n; ++y)
      for (std::uint64_t z = 0; z < n; ++z) b.vertex(id(x, y, z));
  std::array<int, 3> axes{0, 1, 2};
  std::array<std::uint32_t, 4> tet{};
  for (std::uint64_t x = 0; x < m; ++x)
    for (std::uint64_t y = 0; y < m; ++y)
      for (std::uint64_t z = 0; z < m; ++z) {
        axes = {0, 1, 2};
        do {  // one tetrahedron per order in which the three axes are stepped
          std::array<std::uint64_t, 3> p{x, y, z};
          tet[0] = id(p[0], p[1], p[2]);
          for (int s = 0; s < 3; ++s) {
            ++p[static_cast<std::size_t>(axes[static_cast<std::size_t>(s)])];
            tet[static_cast<std::size_t>(s) + 1] = id(p[0], p[1], p[2]);
          }
          b.add_facet_ids(tet);
        } while (std::next_permutation(axes.begin(), axes.end()));
      }
  const auto c = std::move(b).finalize();
  const auto t1 = std::chrono::steady_clock::now();
  // By hand: vertices n^3; edges: axis edges 3 m n^2, square diagonals 3 m^2 n, cube
  // diagonals m^3; triangles: 2 per grid square (3 m^2 n squares) and 6 inside each cube;
  // tetrahedra 6 per cube.
  CHECK(c.cell_count(0) == n * n * n);
  CHECK(c.cell_count(1) == 3 * m * n * n + 3 * m * m * n + m * m * m);
  CHECK(c.cell_count(2) == 6 * m * m * n + 6 * m * m * m);
  CHECK(c.cell_count(3) == 6 * m * m * m);
  CHECK(lacuna::euler_characteristic(c) == 1);  // the cube is contractible
  const std::size_t total = lacuna::total_cell_count(c);
  CHECK(total > 10'000'000);
  const double per = static_cast<double>(c.storage_bytes()) / static_cast<double>(total);
  CHECK(per < 16.0);  // 4(k+1) bytes per k-simplex, at most 16 here
  // a boundary looked up by binary search, on the last tetrahedron
  const auto d = c.boundary(3, c.cell_count(3) - 1);
  CHECK(d.size() == 4);
  std::cout << "simplicial_memory: " << total << " simplices, " << c.storage_bytes() << " bytes of simplex arrays ("
            << per << " per simplex), peak RSS " << peak_rss_kib() / 1024 << " MiB, built in "
            << std::chrono::duration<double>(t1 - t0).count() << " s\n";
}

}  // namespace complex_simplicial_memory_test

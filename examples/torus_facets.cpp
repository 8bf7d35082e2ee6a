// Writes the k x k torus triangulation as a .facets file on standard output: a k x k grid of
// squares with opposite sides glued, each square cut along one diagonal (k^2 vertices,
// 3k^2 edges, 2k^2 triangles). Used by docs/performance.md for whole-process timings.
//   torus_facets K > torus_K.facets
#include <cstdlib>
#include <iostream>
#include <string>

int main(int argc, char** argv) {
  if (argc != 2) {
    std::cerr << "usage: torus_facets K   (K >= 3)\n";
    return 2;
  }
  const long k = std::strtol(argv[1], nullptr, 10);
  if (k < 3 || k > 100000) {
    std::cerr << "torus_facets: K must be between 3 and 100000\n";
    return 2;
  }
  auto v = [k](long i, long j) { return std::to_string(((i % k) * k) + (j % k)); };
  std::string out;
  for (long i = 0; i < k; ++i)
    for (long j = 0; j < k; ++j) {
      out += v(i, j) + ' ' + v(i + 1, j) + ' ' + v(i + 1, j + 1) + '\n';
      out += v(i, j) + ' ' + v(i, j + 1) + ' ' + v(i + 1, j + 1) + '\n';
      if (out.size() > (1u << 20)) std::cout << out, out.clear();
    }
  std::cout << out;
  return 0;
}

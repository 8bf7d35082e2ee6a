// Runs examples/half_edge_adapter (built from examples/half_edge_adapter.cpp) and checks its
// output: the cube surface V, E, F = 8, 12, 6 and chi = 2 (Euler's polyhedron formula); the
// 4 x 4 quad torus 16, 32, 16 and chi = 0 (Hatcher 2002, §2.2).
#include <doctest/doctest.h>

#include <array>
#include <cstdio>
#include <string>

namespace complex_half_edge_example_test {

TEST_CASE("the half-edge adapter example runs and prints the right counts") {
  const std::string cmd = std::string(LACUNA_BINARY_DIR) + "/half_edge_adapter";
  FILE* p = popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  std::string out;
  std::array<char, 256> buf{};
  while (std::fgets(buf.data(), static_cast<int>(buf.size()), p)) out += buf.data();
  const int status = pclose(p);
  CHECK(status == 0);
  CHECK(out ==
        "cube: 8 vertices, 12 edges, 6 faces, chi = 2 (expected 2)\n"
        "torus: 16 vertices, 32 edges, 16 faces, chi = 0 (expected 0)\n");
}

}  // namespace complex_half_edge_example_test

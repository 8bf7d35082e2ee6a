// Twin of io_cycle_picture_needs_2d.fail.cpp: a 2D cubical complex is drawn.
#include <lacuna/io/cycle_svg.hpp>

#include <vector>

int main() {
  const lacuna::cubical_complex<2> image;
  const std::vector<std::vector<lacuna::io::cycle_edge>> cycles;
  return static_cast<int>(lacuna::io::cycle_picture_svg(image, cycles).size());
}

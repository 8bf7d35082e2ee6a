// expect: D == 2
// A picture of 1-cycles is drawn on a 2D image: a 3D cubical complex is refused at the call,
// and the diagnostic names the requirement on its dimension. Twin:
// io_cycle_picture_needs_2d.pass.cpp.
#include <lacuna/io/cycle_svg.hpp>

#include <vector>

int main() {
  const lacuna::cubical_complex<3> volume;
  const std::vector<std::vector<lacuna::io::cycle_edge>> cycles;
  return static_cast<int>(lacuna::io::cycle_picture_svg(volume, cycles).size());
}

// Twin of io_reader_needs_stream.fail.cpp: an input string stream is read.
#include <lacuna/io/facets.hpp>

#include <sstream>

int main() {
  std::istringstream in("a b c\n");
  const auto c = lacuna::io::read_facets(in, "triangle.facets");
  return static_cast<int>(c.vertex_count());
}

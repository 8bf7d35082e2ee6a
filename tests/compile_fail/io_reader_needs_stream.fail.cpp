// expect: input_stream
// The readers read from an input stream: an output stream is refused at the call, and the
// diagnostic names the concept io::input_stream. Twin: io_reader_needs_stream.pass.cpp.
#include <lacuna/io/facets.hpp>

#include <sstream>

int main() {
  std::ostringstream out;
  const auto c = lacuna::io::read_facets(out, "written.facets");
  return static_cast<int>(c.vertex_count());
}

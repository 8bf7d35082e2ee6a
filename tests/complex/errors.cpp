// Tests of lacuna/complex/errors.hpp: the place an error names, and the "FILE:LINE: message"
// form that docs/formats.md (*Errors*) fixes.
#include <doctest/doctest.h>

#include <lacuna/complex/errors.hpp>

#include <string>

namespace complex_errors_test {

TEST_CASE("parse_error formats FILE:LINE: message (docs/formats.md, Errors)") {
  const lacuna::parse_error e("torus.cells", 12, "unknown cell 'q'");
  CHECK(std::string(e.what()) == "torus.cells:12: unknown cell 'q'");
  CHECK(e.file() == "torus.cells");
  CHECK(e.line() == 12);
  CHECK(e.message() == "unknown cell 'q'");
  const lacuna::parse_error no_line("missing.facets", 0, "cannot open the file");
  CHECK(std::string(no_line.what()) == "missing.facets: cannot open the file");
}

TEST_CASE("invalid_complex names a cell or none") {
  const lacuna::invalid_complex e("boundary of boundary is not zero", 2, 5);
  CHECK(e.dimension() == 2);
  CHECK(e.index() == 5);
  const lacuna::invalid_complex g("two complexes of different sizes");
  CHECK(g.dimension() == -1);
  CHECK(g.index() == lacuna::invalid_complex::npos);
  const std::runtime_error& base = e;  // both derive from std::runtime_error
  CHECK(std::string(base.what()) == "boundary of boundary is not zero");
}

}  // namespace complex_errors_test

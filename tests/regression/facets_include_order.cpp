// Regression: io/facets.hpp wrote detail::label_to_string meaning lacuna::detail; once
// io/read_limits.hpp (which opens lacuna::io::detail) was included first, the name resolved
// to lacuna::io::detail and write_facets did not compile. Found while building fuzz/.
#include <lacuna/io/read_limits.hpp>  // must come first: this order is the test
#include <lacuna/io/facets.hpp>

#include <doctest/doctest.h>

#include <sstream>

namespace regression_facets_include_order_test {

TEST_CASE("io/facets.hpp compiles after io/read_limits.hpp and round-trips") {
  std::istringstream in("a b c\n");
  const auto c = lacuna::io::read_facets(in, "t.facets");
  std::ostringstream out;
  lacuna::io::write_facets(out, c);
  std::istringstream back(out.str());
  CHECK(lacuna::io::read_facets(back, "u.facets").cell_count(2) == 1);
}

}  // namespace regression_facets_include_order_test

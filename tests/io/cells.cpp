// Tests of lacuna/io/cells.hpp against the rules of docs/formats.md ("Cell lists"): the
// examples of the format, the CHAIN syntax, every malformed input in tests/data/complex/cells_*
// with its FILE:LINE: message, the limits, and round trips.
#include <doctest/doctest.h>

#include "../complex/support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/io/cells.hpp>

#include <limits>
#include <sstream>
#include <string>
#include <vector>

namespace io_cells_test {

using test_support::counts;

namespace {
lacuna::cell_list parse(const std::string& text, lacuna::io::cells_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_cells(in, "test.cells", o);
}
std::string error_of(const std::string& text, lacuna::io::cells_read_options o = {}) {
  try {
    parse(text, o);
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}
template <class C>
bool same_boundaries(const C& a, const lacuna::cell_list& b) {
  if (counts(a) != counts(b)) return false;
  for (int k = 0; k <= lacuna::top_dimension(a); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(a, k); ++i) {
      std::vector<lacuna::incidence> x;
      for (const auto& t : lacuna::boundary(a, k, i)) x.push_back(lacuna::as_incidence(t));
      std::vector<lacuna::incidence> y(b.small_boundary(k, i).begin(), b.small_boundary(k, i).end());
      lacuna::detail::normalize_chain(x, "test");
      if (x != y) return false;
    }
  return true;
}
}  // namespace

TEST_CASE("the projective plane from one cell per dimension") {
  const auto c = parse("0 p\n1 q : p - p\n2 r : 2*q\n");
  CHECK(counts(c) == std::vector<std::size_t>{1, 1, 1});  // one cell in each dimension
  CHECK(c.boundary(1, 0).empty());                          // p - p = 0
  REQUIRE(c.boundary(2, 0).size() == 1);
  CHECK(c.boundary(2, 0)[0] == lacuna::incidence{0, 2});  // ∂r = 2q (Hatcher 2002, Example 2.42)
  CHECK(c.cell_name(2, 0) == "r");
}

TEST_CASE("CHAIN syntax: signs, coefficients, optional whitespace, repeats add up") {
  const auto c = parse(
      "# the examples of the format\r\n0 a\n0 b\n0 c\n0 v\n"
      "1 e : a + b - c\n1 f : 3*b - 3*a\n1 g:v - v\n1 h : -2*a+2*b\n1 i : 0\n1 j :b-a+a\n"
      "1 k : + a - 1 * a + 007*b - 7 * b\n"
      "2 s : 0\n\t2  t:  e - e  # cancels\n1 big : -9223372036854775808*a + 9223372036854775807*b\n");
  CHECK(counts(c) == std::vector<std::size_t>{4, 8, 2});
  const auto e = c.boundary(1, 0);
  REQUIRE(e.size() == 3);
  CHECK(e[2] == lacuna::incidence{2, -1});
  CHECK(c.boundary(1, 1)[0] == lacuna::incidence{0, -3});
  CHECK(c.boundary(1, 2).empty());
  CHECK(c.boundary(1, 3)[1] == lacuna::incidence{1, 2});
  CHECK(c.boundary(1, 4).empty());
  CHECK(c.boundary(1, 5).size() == 1);  // b - a + a = b
  CHECK(c.boundary(1, 6).empty());
  CHECK(c.boundary(2, 1).empty());
  CHECK(c.boundary(1, 7)[0] == lacuna::incidence{0, std::numeric_limits<std::int64_t>::min()});
  CHECK(c.find("g") == std::optional<std::pair<int, std::size_t>>{{1, 2}});
  CHECK(lacuna::top_dimension(parse("# nothing\n\n")) == -1);
  CHECK(counts(parse("0 x_1.y'")) == std::vector<std::size_t>{1});  // every NAME character, no final newline
  CHECK(counts(parse("0 p\n3 w : 0\n")) == std::vector<std::size_t>{1, 0, 0, 1});  // a 3-cell on nothing
}

TEST_CASE("malformed inputs: FILE:LINE: message") {
  struct expected {
    const char* file;
    std::size_t line;
    const char* message;
  };
  const expected cases[] = {
      {"cells_bad_dimension.cells", 1,
       "expected the dimension of a cell (a decimal integer >= 0) at the start of the line, found 'x'"},
      {"cells_negative_dimension.cells", 1,
       "expected the dimension of a cell (a decimal integer >= 0) at the start of the line, found '-1'"},
      {"cells_huge_dimension.cells", 1, "dimension 99999999999999999999999 is above the limit of 1024"},
      {"cells_bad_name.cells", 1,
       "expected a cell name (a letter or '_', then letters, digits, '_', '.' or ''') after the dimension, found '1p'"},
      {"cells_bad_name_char.cells", 1, "unexpected '-q' in the cell name 'p'"},
      {"cells_duplicate_name.cells", 3, "the cell 'p' is already declared on line 1"},
      {"cells_zero_cell_boundary.cells", 1, "the 0-cell 'p' cannot have a boundary: write '0 p'"},
      {"cells_missing_colon.cells", 2, "expected ':' and the boundary of the 1-cell 'q', found 'p'"},
      {"cells_missing_boundary.cells", 2, "the boundary of 'q' is missing (write 0 for the zero chain)"},
      {"cells_missing_sign.cells", 2, "expected '+' or '-' before the next term of the boundary of 'q', found 'p'"},
      {"cells_missing_star.cells", 3, "expected '*' after the coefficient 2, found 'q'"},
      {"cells_missing_face_name.cells", 2, "expected a cell name in the boundary of 'q', found the end of the line"},
      {"cells_zero_coefficient.cells", 2, "a coefficient must be positive, found 0 in the boundary of 'q'"},
      {"cells_unknown_name.cells", 2,
       "unknown cell 'r' in the boundary of 'q' (a cell must be declared before it is used)"},
      {"cells_forward_reference.cells", 1,
       "unknown cell 'p' in the boundary of 'q' (a cell must be declared before it is used)"},
      {"cells_wrong_dimension.cells", 3,
       "the cell 'p' has dimension 0, but the boundary of a 2-cell is made of 1-cells"},
      {"cells_boundary_not_cycle.cells", 4, "the boundary of the boundary of 'U' is not zero (it has 'v' in it)"},
      {"cells_crlf_error.cells", 4, "expected a cell name in the boundary of 'q', found '+'"},
  };
  for (const auto& e : cases) {
    CAPTURE(e.file);
    const std::string path = std::string(LACUNA_TEST_DATA_DIR) + "/complex/" + e.file;
    try {
      lacuna::io::read_cells(std::filesystem::path(path));
      FAIL("must throw");
    } catch (const lacuna::parse_error& x) {
      CHECK(x.file() == path);
      CHECK(x.line() == e.line);
      CHECK(x.message() == e.message);
      CHECK(std::string(x.what()) == path + ":" + std::to_string(e.line) + ": " + e.message);
    }
  }
  CHECK(error_of("0p\n") == "test.cells:1: expected a space after the dimension 0, found 'p'");
  CHECK(error_of("0 p q\n") == "test.cells:1: unexpected 'q' after the 0-cell 'p'");
  CHECK(error_of("0 p\n1 q : 2 * * p\n") == "test.cells:2: expected a cell name in the boundary of 'q', found '*'");
  const std::string missing = std::string(LACUNA_TEST_DATA_DIR) + "/complex/no_such_file.cells";
  CHECK_THROWS_WITH_AS(lacuna::io::read_cells(std::filesystem::path(missing)), (missing + ": cannot open the file").c_str(),
                       lacuna::parse_error);
}

TEST_CASE("coefficients of any size (docs/formats.md: \"a positive decimal integer of any size\")") {
  using lacuna::integer;
  const auto big = [](const char* digits) { return integer(integer::big_type(digits)); };
  // just beyond int64 on either side: -2^63 - 1 and 2^63
  const auto c = parse("0 p\n0 w\n1 q : -9223372036854775809*p\n1 r : 9223372036854775808*p - w\n");
  CHECK(c.has_big_coefficients(1));
  CHECK(!c.has_big_coefficients(0));
  REQUIRE(c.boundary(1, 0).size() == 1);
  CHECK(c.boundary(1, 0)[0] == lacuna::exact_incidence{0, big("-9223372036854775809")});
  CHECK(c.boundary(1, 1)[0] == lacuna::exact_incidence{0, big("9223372036854775808")});
  CHECK(c.boundary(1, 1)[1] == lacuna::incidence{1, -1});
  CHECK_THROWS_AS(c.small_boundary(1, 0), std::overflow_error);
  CHECK_THROWS_AS(lacuna::as_incidence(c.boundary(1, 0)[0]), std::overflow_error);  // never truncated
  // the two data files that lacuna refused while its incidence numbers were int64
  const std::string dir = std::string(LACUNA_TEST_DATA_DIR) + "/complex/";
  const auto cancel = lacuna::io::read_cells(std::filesystem::path(dir + "cells_big_coefficient.cells"));
  CHECK(cancel.boundary(1, 0).empty());  // 99999999999999999999*p - 99999999999999999999*p = 0
  const auto sum = lacuna::io::read_cells(std::filesystem::path(dir + "cells_sum_overflow.cells"));
  REQUIRE(sum.boundary(1, 0).size() == 2);  // (2^63 - 1)*p + p - w = 2^63*p - w, added up exactly
  CHECK(sum.boundary(1, 0)[0] == lacuna::exact_incidence{0, big("9223372036854775808")});
  CHECK(sum.boundary(1, 0)[1] == lacuna::incidence{1, -1});
  // repeated names add up exactly, down to int64 again: 2^70*q - (2^70 - 3)*q = 3*q
  const auto back = parse("0 p\n1 q : 0\n2 r : 1180591620717411303424*q - 1180591620717411303421*q\n");
  CHECK(!back.has_big_coefficients(2));
  CHECK(back.boundary(2, 0)[0] == lacuna::incidence{0, 3});
  // a coefficient of 100 digits, with leading zeros (decimal, not octal): 10^99 + 7
  const std::string hundred = "1" + std::string(98, '0') + "7";
  const auto h = parse("0 p\n1 q : 000" + hundred + "*p - 000" + hundred + "*p\n1 s : 0" + hundred + "*p\n");
  CHECK(h.boundary(1, 0).empty());
  CHECK(h.boundary(1, 1)[0].coefficient == big(hundred.c_str()));
  // ∂∂ ≠ 0 caused only by coefficients beyond int64 is still found: ∂r = 2^64*q with ∂q = p - w
  CHECK(error_of("0 p\n0 w\n1 q : p - w\n2 r : 18446744073709551616*q\n") ==
        "test.cells:4: the boundary of the boundary of 'r' is not zero (it has 'p' in it)");
  // ... and one whose products cancel exactly is accepted: ∂r = 2^64*q - 2^64*q' with ∂q = ∂q'
  CHECK(error_of("0 p\n0 w\n1 q : p - w\n1 q' : p - w\n2 r : 18446744073709551616*q - 18446744073709551616*q'\n") ==
        "no error");
  // 0 is still not a coefficient, however it is written
  CHECK(error_of("0 p\n1 q : 00000000000000000000000000*p\n") ==
        "test.cells:2: a coefficient must be positive, found 0 in the boundary of 'q'");
}

TEST_CASE("limits are checked before allocating") {
  CHECK(error_of("0 p\n1 q : 123456*p\n", {.max_coefficient_digits = 5}) ==
        "test.cells:2: a coefficient of 6 digits in the boundary of 'q' is above the limit of 5 digits (the limit of the reader)");
  CHECK(error_of("0 p\n1 q : 12345*p\n", {.max_coefficient_digits = 5}) == "no error");
  CHECK(error_of("0 a\n0 b\n0 c\n", {.max_cells = 2}) == "test.cells:3: more than 2 cells (the limit of the reader)");
  CHECK(error_of("0 a\n0 b\n", {.max_cells = 2}) == "no error");
  CHECK(error_of("5 x : 0\n", {.max_dimension = 4}) == "test.cells:1: dimension 5 is above the limit of 4");
}

TEST_CASE("round trips: the standard complexes, a product, simplicial complexes") {
  using lacuna::cell_list;
  for (const auto& c : {cell_list::circle(), cell_list::torus(), cell_list::klein_bottle(),
                        cell_list::projective_plane(), cell_list::real_projective_space(6),
                        cell_list::lens_space(7, 3), cell_list::sphere(4), cell_list::sphere(0)}) {
    std::ostringstream out;
    lacuna::io::write_cells(out, c);
    CHECK(parse(out.str()) == c);  // names and boundaries kept
  }
  std::ostringstream t;
  lacuna::io::write_cells(t, cell_list::torus());
  CHECK(t.str() == "0 v\n1 a : 0\n1 b : 0\n1 c : 0\n2 U : a + b - c\n2 L : a + b - c\n");
  // names that are not NAMEs: "a×b" becomes "a_b", the original kept in a comment
  const auto p = lacuna::product(cell_list::klein_bottle(), cell_list::projective_plane());
  std::ostringstream out;
  lacuna::io::write_cells(out, p);
  CHECK(out.str().find("2 U_v : a_v + b_v - c_v  # U×v\n") != std::string::npos);
  CHECK(same_boundaries(p, parse(out.str())));
  for (unsigned seed = 1; seed <= 10; ++seed) {
    const auto s = test_support::random_simplicial(seed, 8, 6, 4);  // names "0 1 2": rewritten
    std::ostringstream o;
    lacuna::io::write_cells(o, s);
    const auto back = parse(o.str());
    CHECK(same_boundaries(s, back));
    lacuna::validate(back);
  }
}

TEST_CASE("round trip of coefficients beyond int64") {
  // ∂∂t = (2^65 + 1)*2^70 - 128*(2^128 + 2^63) = 0, so t is a valid 3-cell
  const std::string text =
      "0 p\n0 w\n1 q : 0\n1 m : -9223372036854775808*p + 9223372036854775808*w\n2 r : 1180591620717411303424*q\n"
      "2 s : -340282366920938463463374607431768211456*q - 9223372036854775808*q\n"
      "3 t : 36893488147419103233*r + 128*s\n";
  const auto c = parse(text);
  std::ostringstream out;
  lacuna::io::write_cells(out, c);
  // written exactly, in the writer's spacing: -2^63 and 2^63, 2^70, -(2^128 + 2^63) added up
  CHECK(out.str() ==
        "0 p\n0 w\n1 q : 0\n1 m : - 9223372036854775808*p + 9223372036854775808*w\n"
        "2 r : 1180591620717411303424*q\n2 s : - 340282366920938463472597979468622987264*q\n"
        "3 t : 36893488147419103233*r + 128*s\n");
  CHECK(parse(out.str()) == c);
}

}  // namespace io_cells_test

// Tests of lacuna/io/values.hpp: value files for cell lists (NAME VALUE) and facet lists
// (labels in any order, then the value), resolved against the complexes of tests/data/cli
// (the projective plane from one cell per dimension, the hollow triangle of three edges),
// with every error at its line of the value file.
#include <doctest/doctest.h>

#include "endless_stream.hpp"

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/values.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace values_reader_test {

inline std::string values_data(const char* dir, const char* name) {
  return std::string(LACUNA_TEST_DATA_DIR) + "/" + dir + "/" + name;
}

inline lacuna::io::value_list parse_values(const std::string& text, lacuna::io::values_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_values(in, "test.values", o);
}

inline std::string values_error(const std::string& text, lacuna::io::values_read_options o = {}) {
  try {
    parse_values(text, o);
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}

inline const lacuna::simplicial_complex<std::string>& triangle() {
  static const auto c = lacuna::io::read_facets(std::filesystem::path(values_data("cli", "hollow_triangle.facets")));
  return c;
}
inline const lacuna::cell_list& plane() {
  static const auto c = lacuna::io::read_cells(std::filesystem::path(values_data("cli", "projective_plane.cells")));
  return c;
}

/// The error of resolving `text` (a value file) against the hollow triangle.
inline std::string simplex_error(const std::string& text) {
  try {
    lacuna::io::resolve_values(parse_values(text, {.names = lacuna::io::value_names::simplex}), triangle(), "tri.facets");
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}
inline std::string cell_error(const std::string& text) {
  try {
    lacuna::io::resolve_values(parse_values(text), plane(), "rp2.cells");
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}

}  // namespace values_reader_test

TEST_CASE("values: a cell list's values, resolved by name") {
  using namespace values_reader_test;
  const auto list = lacuna::io::read_values(std::filesystem::path(values_data("persistence", "projective_plane.values")));
  REQUIRE(list.size() == 3);
  CHECK(list.file() == values_data("persistence", "projective_plane.values"));
  CHECK(list.name(2, 0) == "r");
  CHECK(list.value(2) == 2.5);
  CHECK(list.line(0) == 2);
  const auto v = lacuna::io::resolve_values(list, plane(), "projective_plane.cells");
  REQUIRE(v.size() == 3);
  // the cells of that projective plane: p in dimension 0, q in 1, r in 2, one each
  CHECK((v[0].dimension == 0 && v[0].index == 0 && v[0].value == 0 && v[0].line == 2));
  CHECK((v[1].dimension == 1 && v[1].index == 0 && v[1].value == 1 && v[1].line == 3));
  CHECK((v[2].dimension == 2 && v[2].index == 0 && v[2].value == 2.5 && v[2].line == 4));
}

TEST_CASE("values: a facet list's values, labels in any order") {
  using namespace values_reader_test;
  const auto list = lacuna::io::read_values(std::filesystem::path(values_data("persistence", "triangle.values")),
                                            {.names = lacuna::io::value_names::simplex});
  REQUIRE(list.size() == 4);
  CHECK(list.name_count(3) == 2);
  CHECK(list.joined_names(3) == "z y");
  const auto v = lacuna::io::resolve_values(list, triangle(), "hollow_triangle.facets");
  REQUIRE(v.size() == 4);
  // "z y" is the edge named "y z" (vertices numbered x, y, z by first appearance)
  CHECK(v[3].dimension == 1);
  CHECK(triangle().cell_name(1, v[3].index) == "y z");
  CHECK(v[3].value == 2);
  CHECK(triangle().cell_name(0, v[2].index) == "z");
  // blanks and tabs separate; comments, blank lines, CRLF
  const auto w = parse_values("\r\n# c\r\n x\ty   0.5 # c\r\n", {.names = lacuna::io::value_names::simplex});
  CHECK(w.size() == 1);
  CHECK(w.line(0) == 3);
  CHECK(w.value(0) == 0.5);
  CHECK(parse_values("").empty());
}

TEST_CASE("values: errors of the file alone, at their line") {
  using namespace values_reader_test;
  try {
    lacuna::io::read_values(std::filesystem::path(values_data("persistence", "values_no_value.values")));
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.file() == values_data("persistence", "values_no_value.values"));
    CHECK(e.line() == 2);
    CHECK(e.message() == "no value after 'q': write the name of the cell, then its value");
  }
  CHECK(values_error("0.5\n") == "test.values:1: a value with no cell before it: write the name of the cell, then its value");
  CHECK(values_error("0.5\n", {.names = lacuna::io::value_names::simplex}) ==
        "test.values:1: a value with no simplex before it: write the labels of the simplex, then its value");
  CHECK(values_error("p 0\nq r 1\n") ==
        "test.values:2: 3 fields, but a line of values for a cell list is a cell name and its value");
  CHECK(values_error("p x\n") == "test.values:1: the value 'x' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  CHECK(values_error("0.5 p\n") == "test.values:1: the value 'p' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  CHECK(values_error("p .5\n") == "test.values:1: the value '.5' is not a number (write a digit on both sides of the "
                              "decimal point, as in 0.5 or 1.0)");
  CHECK(values_error("p -inf\n") == "test.values:1: the value '-inf' is not a number (every number must be finite)");
  CHECK(values_error("p 1\rq 2\n") ==
        "test.values:1: a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
  CHECK(values_error(std::string("p 1\nq\0 2\n", 9)) ==
        "test.values:2: a control character (byte 0x00) in column 2: the file is not text");
  CHECK(parse_values("\xEF\xBB\xBFp 1\n").name(0, 0) == "p");  // a byte-order mark at the start is skipped
  // negative values are values like any other
  CHECK(parse_values("p -2.5e1\n").value(0) == -25);
}

TEST_CASE("values: errors found against the complex, at their line of the value file") {
  using namespace values_reader_test;
  try {
    lacuna::io::resolve_values(lacuna::io::read_values(std::filesystem::path(values_data("persistence", "values_unknown.values"))),
                               plane(), "projective_plane.cells");
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.file() == values_data("persistence", "values_unknown.values"));
    CHECK(e.line() == 2);
    CHECK(e.message() == "'s' is not a cell of projective_plane.cells");
  }
  try {
    lacuna::io::resolve_values(lacuna::io::read_values(std::filesystem::path(values_data("persistence", "values_twice.values")),
                                                       {.names = lacuna::io::value_names::simplex}),
                               triangle(), "hollow_triangle.facets");
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.line() == 3);
    CHECK(e.message() == "the cell 'x y' is listed twice (first on line 2)");
  }
  try {
    lacuna::io::resolve_values(lacuna::io::read_values(std::filesystem::path(values_data("persistence", "values_not_simplex.values")),
                                                       {.names = lacuna::io::value_names::simplex}),
                               triangle(), "hollow_triangle.facets");
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.line() == 1);
    CHECK(e.message() == "'x y z' is not a simplex of hollow_triangle.facets");  // the triangle is hollow
  }
  CHECK(simplex_error("x 0\nx w 1\n") == "test.values:2: 'x w' is not a simplex of tri.facets: 'w' is not a vertex of it");
  CHECK(simplex_error("x x 1\n") == "test.values:1: the label 'x' is repeated within one simplex");
  CHECK(simplex_error("z 1\nx 2\nz 3\n") == "test.values:3: the cell 'z' is listed twice (first on line 1)");
  CHECK(cell_error("p 0\n\n# c\np 1\n") == "test.values:4: the cell 'p' is listed twice (first on line 1)");
  CHECK(cell_error("P 0\n") == "test.values:1: 'P' is not a cell of rp2.cells");  // names are case-sensitive
  // a list read for a facet list, resolved against a cell list
  try {
    lacuna::io::resolve_values(parse_values("p q 1\n", {.names = lacuna::io::value_names::simplex}), plane(), "rp2.cells");
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.message() == "3 fields, but a line of values for a cell list is a cell name and its value");
  }
  // names that are not UTF-8 are escaped in the message
  CHECK(cell_error("\xC3\x28 1\n") == "test.values:1: '\\xc3(' is not a cell of rp2.cells");
  CHECK(cell_error("\xCE\xB1 1\n") == "test.values:1: '\xCE\xB1' is not a cell of rp2.cells");
  CHECK(lacuna::io::resolve_values(parse_values(""), plane(), "rp2.cells").empty());
}

TEST_CASE("values: the line of a cell in its complex file") {
  using namespace values_reader_test;
  std::ifstream cells(values_data("cli", "projective_plane.cells"));
  CHECK(lacuna::io::line_of_cell(cells, lacuna::io::value_names::cell, "q") == 2);
  std::istringstream cells2("# c\n0 p\n\n1 q:p-p\n");
  CHECK(lacuna::io::line_of_cell(cells2, lacuna::io::value_names::cell, "q") == 4);
  std::ifstream facets(values_data("cli", "hollow_triangle.facets"));
  CHECK(lacuna::io::line_of_cell(facets, lacuna::io::value_names::simplex, "z") == 3);
  std::istringstream none("a b\n");
  CHECK(lacuna::io::line_of_cell(none, lacuna::io::value_names::simplex, "c") == 0);
}

TEST_CASE("values: limits") {
  using namespace values_reader_test;
  CHECK(values_error("a 1\nb 2\nc 3\n", {.max_records = 2}) ==
        "test.values:3: more than 2 lines of values (the limit of the reader)");
  CHECK(values_error("a b c 1\n", {.names = lacuna::io::value_names::simplex, .max_labels = 2}) ==
        "test.values:1: a simplex of 3 labels, more than the limit of 2 (the limit of the reader)");
  CHECK(values_error("abc 1\ndef 2\n", {.max_name_bytes = 5}) ==
        "test.values:2: more than 5 bytes of names in all (the limit of the reader)");
  io_endless_stream::endless_stream in("", "vertex 0.5\n");
  CHECK_THROWS_WITH_AS(lacuna::io::read_values(in, "endless", {.max_records = 5000}),
                       "endless:5001: more than 5000 lines of values (the limit of the reader)", lacuna::parse_error);
}

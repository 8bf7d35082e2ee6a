// Tests of lacuna/io/distances.hpp against the distance matrix format of
// docs/persistence-io.md: the full and the lower-triangle forms, and every error with its file,
// line, row and column. The test matrices are the distances of points on a line, |x_i - x_j|,
// worked out by hand beside each file.
#include <doctest/doctest.h>

#include "endless_stream.hpp"

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/distances.hpp>

#include <filesystem>
#include <sstream>
#include <string>
#include <vector>

namespace distances_reader_test {

inline lacuna::io::distance_matrix parse_distances(const std::string& text, lacuna::io::distances_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_distances(in, "test.distances", o);
}

inline std::string distances_error(const std::string& text, lacuna::io::distances_read_options o = {}) {
  try {
    parse_distances(text, o);
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}

inline std::string distances_data(const char* name) { return std::string(LACUNA_TEST_DATA_DIR) + "/persistence/" + name; }

}  // namespace distances_reader_test

TEST_CASE("distances: the full matrix and the lower triangle give the same matrix") {
  using namespace distances_reader_test;
  const auto t = lacuna::io::read_distances(std::filesystem::path(distances_data("triangle4.distances")));
  const auto f = lacuna::io::read_distances(std::filesystem::path(distances_data("full4.distances")));
  // points at 0, 1, 3, 6: the distances |x_i - x_j| (by hand)
  const double expected[4][4] = {{0, 1, 3, 6}, {1, 0, 2, 5}, {3, 2, 0, 3}, {6, 5, 3, 0}};
  REQUIRE(t.size() == 4);
  REQUIRE(f.size() == 4);
  for (std::size_t i = 0; i < 4; ++i)
    for (std::size_t j = 0; j < 4; ++j) {
      CHECK(t(i, j) == expected[i][j]);
      CHECK(f(i, j) == expected[i][j]);
    }
  CHECK(t.lower == f.lower);
  CHECK(t.lower == std::vector<double>{1, 3, 2, 6, 5, 3});  // row 1, then row 2, ... below the diagonal
}

TEST_CASE("distances: small and empty matrices, separators, symmetry as read") {
  using namespace distances_reader_test;
  CHECK(parse_distances("").size() == 0);
  CHECK(parse_distances("# no rows\n\n").size() == 0);
  CHECK(parse_distances("0\n").size() == 1);  // one point: both forms at once
  CHECK(parse_distances("0 2\n2 0\n")(0, 1) == 2);
  CHECK(parse_distances("0\n2 0\n")(1, 0) == 2);
  CHECK(parse_distances("0,2\r\n2 , 0\r\n")(0, 1) == 2);
  // equal as read: 0.5 and 0.50 are the same double, and 1e0 is 1
  CHECK(parse_distances("0 0.5 1\n0.50 0 1\n1e0 1 0\n")(2, 0) == 1);
  // -0 is 0, and a distance of 0 between two points is allowed
  CHECK(parse_distances("0 -0\n0 0\n")(0, 1) == 0);
  // the triangle form ends wherever the file ends
  CHECK(parse_distances("0\n1 0\n2 1 0\n3 2 1 0\n4 3 2 1 0\n").size() == 5);
}

TEST_CASE("distances: malformed files give FILE:LINE: message") {
  using namespace distances_reader_test;
  struct expected {
    const char* file;
    std::size_t line;
    const char* message;
  };
  const expected cases[] = {
      {"distances_asymmetric.distances", 3,
       "row 3, column 2 is 3.5, but row 2, column 3 (line 2) is 3: the matrix must be symmetric"},
      {"distances_diagonal.distances", 2, "row 2, column 2 is 0.5, but the diagonal must be 0"},
      {"distances_negative.distances", 1, "row 1, column 2 is negative (-1): a distance is at least 0"},
      {"distances_short_row.distances", 2,
       "row 2 holds 2 numbers, but the first row holds 3: every row of a full matrix holds as many"},
      {"distances_missing_rows.distances", 3, "the matrix ends after 2 of its 3 rows (its first row holds 3 numbers)"},
      {"distances_extra_row.distances", 3,
       "a row beyond the 2 rows of this 2 x 2 matrix (its first row holds 2 numbers)"},
      {"distances_triangle_row.distances", 3,
       "row 3 holds 2 numbers, but this is a lower triangle (its first row holds one number), where row i holds i "
       "numbers"},
  };
  for (const auto& e : cases) {
    CAPTURE(e.file);
    try {
      lacuna::io::read_distances(std::filesystem::path(distances_data(e.file)));
      FAIL("must throw");
    } catch (const lacuna::parse_error& x) {
      CHECK(x.file() == distances_data(e.file));
      CHECK(x.line() == e.line);
      CHECK(x.message() == e.message);
    }
  }
  CHECK(distances_error("0\n1 0\n2 1 0\n3 0 0 0 0\n") ==
        "test.distances:4: row 4 holds 5 numbers, but this is a lower triangle (its first row holds one number), where "
        "row i holds i numbers");
  CHECK(distances_error("0\n1 0\n2 3 1\n") == "test.distances:3: row 3, column 3 is 1, but the diagonal must be 0");
  CHECK(distances_error("1\n") == "test.distances:1: row 1, column 1 is 1, but the diagonal must be 0");
  CHECK(distances_error("0 x\nx 0\n") ==
        "test.distances:1: row 1, column 2 'x' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  CHECK(distances_error("0 1e999\n1 0\n") ==
        "test.distances:1: row 1, column 2 '1e999' is too large for a double (at most about 1.8e308)");
  CHECK(distances_error("0,,1\n") ==
        "test.distances:1: the 2nd field is empty (two commas in a row, or a comma at the start or end of the line)");
  CHECK(distances_error("0 1\r1 0\n") ==
        "test.distances:1: a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
  CHECK(distances_error("0 nan\nnan 0\n") ==
        "test.distances:1: row 1, column 2 'nan' is not a number (every number must be finite)");
}

TEST_CASE("distances: limits, checked before the memory they guard is taken") {
  using namespace distances_reader_test;
  CHECK(distances_error("0 1 1\n", {.max_points = 2}) ==
        "test.distances:1: a matrix of 3 points, more than the limit of 2 (the limit of the reader)");
  CHECK(distances_error("0\n1 0\n1 1 0\n", {.max_points = 2}) ==
        "test.distances:3: a matrix of 3 points, more than the limit of 2 (the limit of the reader)");
  CHECK(distances_error("0 1 1 1\n", {.max_numbers = 5}) ==
        "test.distances:1: a matrix of 4 points has 6 entries below the diagonal, more than the limit of 5 (the limit "
        "of the reader)");
  // an endless first row stops at the line limit
  {
    io_endless_stream::endless_stream in("", "0 ");
    CHECK_THROWS_WITH_AS(lacuna::io::read_distances(in, "endless", {.max_line_bytes = 100000}),
                         "endless:1: a line longer than 100000 bytes (the limit of the reader; lines end in LF or CRLF)", lacuna::parse_error);
    CHECK(in.served() < 100000 + (std::size_t{1} << 17));
  }
  // an endless lower triangle (row i: i - 1 ones, then the zero diagonal) stops at max_numbers:
  // 141 rows hold 141 * 140 / 2 = 9870 entries below the diagonal, 142 rows 10011
  {
    std::size_t row = 0;
    io_endless_stream::endless_stream in([&row](std::string& piece) {
      piece.clear();
      for (std::size_t j = 0; j < row; ++j) piece += "1 ";
      piece += "0\n";
      ++row;
    });
    CHECK_THROWS_WITH_AS(lacuna::io::read_distances(in, "endless", {.max_numbers = 10000}),
                         "endless:142: a matrix of 142 points has 10011 entries below the diagonal, more than the "
                         "limit of 10000 (the limit of the reader)",
                         lacuna::parse_error);
  }
}

// Tests of lacuna/io/points.hpp (and the line rules of io/text_lines.hpp) against the point
// cloud format of docs/persistence-io.md: separators, comments, CSV headers, decimals, and
// every error with its file and line. Expected values are the decimals written in the inputs,
// read as the nearest double (IEEE 754; the C++ literal of the same decimal is that double).
#include <doctest/doctest.h>

#include "endless_stream.hpp"

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/points.hpp>

#include <cmath>
#include <cstring>
#include <filesystem>
#include <sstream>
#include <string>
#include <vector>

namespace points_reader_test {

inline lacuna::io::point_cloud parse_points(const std::string& text, lacuna::io::points_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_points(in, "test.points", o);
}

/// The whole what() of the error, checked to be as long as the message (no NUL cuts it).
inline std::string points_error(const std::string& text, lacuna::io::points_read_options o = {}) {
  try {
    parse_points(text, o);
  } catch (const lacuna::parse_error& e) {
    CHECK(std::strlen(e.what()) == std::string(e.what()).size());
    CHECK(std::string(e.what()).find('\0') == std::string::npos);
    return e.what();
  }
  return "no error";
}

inline std::string points_data(const char* name) { return std::string(LACUNA_TEST_DATA_DIR) + "/persistence/" + name; }

inline std::vector<double> all(const lacuna::io::point_cloud& c) { return c.coordinates; }

}  // namespace points_reader_test

TEST_CASE("points: blanks, commas or both; comments, blank lines, the line of each point") {
  using namespace points_reader_test;
  const auto c = lacuna::io::read_points(std::filesystem::path(points_data("mixed_separators.points")));
  CHECK(c.size() == 4);
  CHECK(c.dimension == 2);
  // the decimals as written in the file
  CHECK(all(c) == std::vector<double>{-1.5e-3, 2, 3, 4e1, 5, 6, 7, 8});
  CHECK(c.lines == std::vector<std::size_t>{2, 3, 4, 5});
  CHECK(c.point(2)[1] == 6);
  const auto sq = lacuna::io::read_points(std::filesystem::path(points_data("square.points")));
  CHECK(sq.size() == 4);
  CHECK(all(sq) == std::vector<double>{0, 0, 1, 0, 1, 1, 0, 1});
}

TEST_CASE("points: decimals are exact and locale-free; one coordinate is enough; empty input") {
  using namespace points_reader_test;
  const auto c = parse_points("0.1\n-0\n1e-400\n007\n1.7976931348623157e308\n4.9406564584124654e-324\n");
  CHECK(c.dimension == 1);
  // 0.1 is the double nearest 1/10; -0 reads as +0; 1e-400 is nearer 0 than any subnormal;
  // the largest finite double and the least subnormal read back exactly (IEEE 754 binary64)
  CHECK(all(c) == std::vector<double>{0.1, 0.0, 0.0, 7, 1.7976931348623157e308, 4.9406564584124654e-324});
  CHECK(!std::signbit(c.coordinates[1]));
  CHECK(parse_points("").empty());
  CHECK(parse_points("# nothing\n\n \t\n").empty());
  CHECK(parse_points("").dimension == 0);
  CHECK(parse_points("1 2").size() == 1);  // no final line end
}

TEST_CASE("points: CSV header lines") {
  using namespace points_reader_test;
  // FORMATS: in a .csv file a first line holding a field that is not a number is skipped
  const auto h = lacuna::io::read_points(std::filesystem::path(points_data("square_header.csv")));  // CRLF too
  CHECK(all(h) == std::vector<double>{0, 0, 1, 0, 1, 1, 0, 1});
  CHECK(h.lines.front() == 2);
  // a header whose first field is empty (an index column) is still a header
  const auto idx = lacuna::io::read_points(std::filesystem::path(points_data("index_column.csv")));
  CHECK(idx.dimension == 3);
  CHECK(idx.point(3)[0] == 3);
  // a byte-order mark before the header is skipped
  CHECK(lacuna::io::read_points(std::filesystem::path(points_data("bom_header.csv"))).size() == 2);
  // only the first line with fields can be a header, comments before it are fine
  CHECK(parse_points("# a comment\n\nx y\n1 2\n", {.header = true}).size() == 1);
  CHECK(points_error("1 2\nx y\n", {.header = true}) ==
        "test.points:2: the 1st coordinate 'x' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  // a first line of numbers is data
  CHECK(parse_points("1,2\n3,4\n", {.header = true}).size() == 2);
  // an empty field alone does not make a header: the line is data, and the field an error
  CHECK(points_error("1,,2\n", {.header = true}) ==
        "test.points:1: the 2nd field is empty (two commas in a row, or a comma at the start or end of the line)");
  // in a .points file there is no header
  try {
    lacuna::io::read_points(std::filesystem::path(points_data("header_in_points.points")));
    FAIL("must throw");
  } catch (const lacuna::parse_error& e) {
    CHECK(e.file() == points_data("header_in_points.points"));
    CHECK(e.line() == 1);
    CHECK(e.message() == "the 1st coordinate 'x' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  }
}

TEST_CASE("points: malformed files give FILE:LINE: message") {
  using namespace points_reader_test;
  struct expected {
    const char* file;
    std::size_t line;
    const char* message;
  };
  const expected cases[] = {
      {"points_ragged.points", 4,
       "a point with 3 coordinates, but the first point (line 1) has 2: every point needs the same number"},
      {"points_not_a_number.points", 4,
       "the 2nd coordinate '.5' is not a number (write a digit on both sides of the decimal point, as in 0.5 or 1.0)"},
      {"points_empty_field.csv", 3,
       "the 2nd field is empty (two commas in a row, or a comma at the start or end of the line)"},
      {"points_infinite.points", 1, "the 2nd coordinate 'inf' is not a number (every number must be finite)"},
      {"points_huge.points", 2, "the 1st coordinate '1e400' is too large for a double (at most about 1.8e308)"},
      {"points_bare_cr.points", 1, "a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone"},
      {"points_nul.points", 2, "a control character (byte 0x00) in column 3: the file is not text"},
  };
  for (const auto& e : cases) {
    CAPTURE(e.file);
    try {
      lacuna::io::read_points(std::filesystem::path(points_data(e.file)));
      FAIL("must throw");
    } catch (const lacuna::parse_error& x) {
      CHECK(x.file() == points_data(e.file));
      CHECK(x.line() == e.line);
      CHECK(x.message() == e.message);
    }
  }
  try {
    lacuna::io::read_points(std::filesystem::path(points_data("no_such_file.points")));
    FAIL("must throw");
  } catch (const lacuna::parse_error& x) {
    CHECK(x.line() == 0);
    CHECK(x.message() == "cannot open the file");
  }
}

TEST_CASE("points: what a decimal is") {
  using namespace points_reader_test;
  for (const char* good : {"1", "-1", "+1", "1.5", "-1.5e-3", "1E6", "1e+06", "007", "0.0", "-0"}) {
    CAPTURE(good);
    CHECK(parse_points(good).size() == 1);
  }
  for (const char* bad : {".5", "1.", "-.5", "1.e5", "0x10", "1e", "1e+", "--1", "1.5.2", "1,5.0.", "nan", "NaN",
                          "-inf", "Infinity", "1_000", "１", "1f", "e5"}) {
    CAPTURE(bad);
    CHECK(points_error(bad).find("is not a number") != std::string::npos);
  }
  CHECK(points_error("1e400").find("too large for a double") != std::string::npos);
  CHECK(points_error("-1.8e308").find("too large for a double") != std::string::npos);
}

TEST_CASE("points: line ends, byte-order marks and control characters") {
  using namespace points_reader_test;
  CHECK(all(parse_points("1 2\r\n3 4\r\n")) == std::vector<double>{1, 2, 3, 4});
  CHECK(all(parse_points("1 2\r\n3 4")) == std::vector<double>{1, 2, 3, 4});
  // a CR not followed by LF is refused, also at the very end of the file
  CHECK(points_error("1 2\r3 4\n") == "test.points:1: a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
  CHECK(points_error("1 2\n3 4\r") == "test.points:2: a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
  CHECK(points_error("1 2\n3 4\r\r\n") ==
        "test.points:2: a carriage return (CR) that does not end the line: lines end in LF or CRLF, not in CR alone");
  // a byte-order mark is skipped at the start of the file only
  CHECK(all(parse_points("\xEF\xBB\xBF" "1 2\n")) == std::vector<double>{1, 2});
  CHECK(points_error("1 2\n\xEF\xBB\xBF" "3 4\n") ==
        "test.points:2: the 1st coordinate '\xEF\xBB\xBF" "3' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  // control characters: the message names the byte, never holds it
  CHECK(points_error(std::string("1 2\n3\0 4\n", 9)) == "test.points:2: a control character (byte 0x00) in column 2: the file is not text");
  CHECK(points_error("1\x01 2\n") == "test.points:1: a control character (byte 0x01) in column 2: the file is not text");
  CHECK(points_error("1 2 # \x7F\n") == "test.points:1: a control character (byte 0x7f) in column 7: the file is not text");
  // bytes that are not UTF-8 are escaped in messages
  CHECK(points_error("1 \xFF\xFE\n") ==
        "test.points:1: the 2nd coordinate '\\xff\\xfe' is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
}

TEST_CASE("points: limits, checked before the memory they guard is taken") {
  using namespace points_reader_test;
  CHECK(points_error("1\n2\n3\n", {.max_points = 2}) == "test.points:3: more than 2 points (the limit of the reader)");
  CHECK(points_error("1 2 3\n", {.max_dimension = 2}) ==
        "test.points:1: a point with 3 coordinates, more than the limit of 2");
  CHECK(points_error("1 2\n3 4\n5 6\n", {.max_numbers = 5}) ==
        "test.points:3: more than 5 coordinates in all (the limit of the reader)");
  CHECK(points_error("1 2\n3   4\n", {.max_line_bytes = 4}) ==
        "test.points:2: a line longer than 4 bytes (the limit of the reader; lines end in LF or CRLF)");
  CHECK(parse_points("1 2\r\n", {.max_line_bytes = 3}).size() == 1);  // the CR of a CRLF is not counted
  // an endless stream of points stops at max_points, having read little more than that
  {
    io_endless_stream::endless_stream in("", "1.5 2.5\n");
    CHECK_THROWS_WITH_AS(lacuna::io::read_points(in, "endless", {.max_points = 1000}),
                         "endless:1001: more than 1000 points (the limit of the reader)", lacuna::parse_error);
    CHECK(in.served() < 1000 * 8 + (std::size_t{1} << 17));
  }
  // an endless line stops at max_line_bytes
  {
    io_endless_stream::endless_stream in("1 2\n", "1 ");
    CHECK_THROWS_WITH_AS(lacuna::io::read_points(in, "endless", {.max_line_bytes = 100000}),
                         "endless:2: a line longer than 100000 bytes (the limit of the reader; lines end in LF or CRLF)", lacuna::parse_error);
    CHECK(in.served() < 100000 + (std::size_t{1} << 17));
  }
  // an endless run of CRs is one endless line: refused at the line limit
  {
    io_endless_stream::endless_stream in("", "\r");
    CHECK_THROWS_AS(lacuna::io::read_points(in, "endless"), lacuna::parse_error);
  }
}

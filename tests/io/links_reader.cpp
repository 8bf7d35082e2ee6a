// Tests of lacuna/io/links.hpp against the sparse distance format of docs/formats.md
// ("Sparse distances"): the layout, separators and comments, and every error with its file and
// line. The expected lists are written out by hand beside each input.
#include <doctest/doctest.h>

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/links.hpp>

#include <sstream>
#include <string>
#include <vector>

namespace links_reader_test {

inline lacuna::io::link_list parse_links(const std::string& text, lacuna::io::links_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_links(in, "test.links", o);
}

inline std::string links_error(const std::string& text, lacuna::io::links_read_options o = {}) {
  try {
    parse_links(text, o);
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}

}  // namespace links_reader_test

TEST_CASE("links: the count, the pairs as read (0-based, smaller point first), comments and separators") {
  using namespace links_reader_test;
  const auto l = parse_links("# a path and a lone point\n\npoints 4\n1 2 0.5\n3, 2, 1.25  # a comment\r\n2 ,4 ,-0\n");
  CHECK(l.points == 4);
  REQUIRE(l.pairs.size() == 3);
  CHECK(l.pairs[0].a == 0);
  CHECK(l.pairs[0].b == 1);
  CHECK(l.pairs[0].distance == 0.5);
  CHECK(l.pairs[1].a == 1);  // "3, 2": the smaller point first
  CHECK(l.pairs[1].b == 2);
  CHECK(l.pairs[1].distance == 1.25);
  CHECK(l.pairs[2].a == 1);
  CHECK(l.pairs[2].b == 3);
  CHECK(l.pairs[2].distance == 0.0);
  CHECK(!std::signbit(l.pairs[2].distance));  // -0 reads as 0
  CHECK(l.lines == std::vector<std::size_t>{4, 5, 6});
  // no pairs at all, and no points at all
  CHECK(parse_links("points 3\n").pairs.empty());
  CHECK(parse_links("points 0\n").points == 0);
}

TEST_CASE("links: every error names the file, the line and the problem") {
  using namespace links_reader_test;
  CHECK(links_error("") == "test.links: no `points N` line: the file lists nothing");
  CHECK(links_error("# only a comment\n") == "test.links:1: no `points N` line: the file lists nothing");
  CHECK(links_error("1 2 0.5\n") ==
        "test.links:1: expected `points N` (the number of points, a decimal integer >= 0) as the first line, found '1 2 0.5'");
  CHECK(links_error("points -3\n").find("test.links:1: expected `points N`") == 0);
  CHECK(links_error("points 3\n1 2\n") ==
        "test.links:2: a pair line holds two point numbers and a distance, three fields; this one holds 2");
  CHECK(links_error("points 3\n1 2 3 4\n").find("this one holds 4") != std::string::npos);
  CHECK(links_error("points 3\n1,,2 0.5\n").find("test.links:2: the 2nd field is empty") == 0);
  CHECK(links_error("points 3\n0 2 0.5\n") ==
        "test.links:2: the first point '0' is not a point number (an integer from 1 to 3, the count of `points`)");
  CHECK(links_error("points 3\n1 4 0.5\n") ==
        "test.links:2: the second point '4' is not a point number (an integer from 1 to 3, the count of `points`)");
  CHECK(links_error("points 3\n1 x 0.5\n").find("the second point 'x' is not a point number") != std::string::npos);
  CHECK(links_error("points 3\n2 2 0.5\n") == "test.links:2: a pair of point 2 with itself");
  CHECK(links_error("points 3\n1 2 -0.5\n") == "test.links:2: the distance -0.5 is negative: a distance is at least 0");
  CHECK(links_error("points 3\n1 2 inf\n").find("test.links:2: the distance 'inf' is not a number (every number must be finite)") == 0);
  CHECK(links_error("points 3\n1 2 1e400\n").find("is too large for a double") != std::string::npos);
  // a pair listed twice, in either order: at the line of the second listing, naming the first;
  // of two repeated pairs, the one repeated first in the file
  CHECK(links_error("points 4\n1 2 0.5\n3 4 1\n2 1 0.5\n4 3 1\n") ==
        "test.links:4: the pair of points 1 and 2 is listed again (first at line 2): each pair is listed once");
  CHECK(links_error("points 4\n3 4 1\n1 2 0.5\n1 2 0.5\n4 3 1\n1 2 7\n") ==
        "test.links:4: the pair of points 1 and 2 is listed again (first at line 3): each pair is listed once");
  // limits, before memory is taken
  CHECK(links_error("points 11\n", {.max_points = 10}) == "test.links:1: 11 points, more than the limit of 10 (the limit of the reader)");
  CHECK(links_error("points 9999999999999\n").find("more than the limit") != std::string::npos);
  CHECK(links_error("points 3\n1 2 1\n2 3 1\n", {.max_pairs = 1}) == "test.links:3: more than 1 pairs (the limit of the reader)");
  CHECK(links_error("points 3\n1 2 " + std::string(100, '1') + "\n", {.max_line_bytes = 50}).find("test.links:2:") == 0);
  // not text
  CHECK(links_error(std::string("points 3\n1 2 \x01") + "\n").find("a control character") != std::string::npos);
}

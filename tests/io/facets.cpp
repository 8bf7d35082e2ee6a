// Tests of lacuna/io/facets.hpp against the rules of docs/formats.md ("Facet lists"):
// comments, CRLF, blank lines, labels, numbering; every malformed input in
// tests/data/complex/facets_* gives its FILE:LINE: message; round trips are exact.
#include <doctest/doctest.h>

#include "../complex/support.hpp"

#include <lacuna/complex/errors.hpp>
#include <lacuna/io/facets.hpp>

#include <sstream>
#include <string>
#include <vector>

namespace io_facets_test {

using test_support::counts;

namespace {
lacuna::simplicial_complex<std::string> parse(const std::string& text, lacuna::io::facets_read_options o = {}) {
  std::istringstream in(text);
  return lacuna::io::read_facets(in, "test.facets", o);
}
std::string error_of(const std::string& text, lacuna::io::facets_read_options o = {}) {
  try {
    parse(text, o);
  } catch (const lacuna::parse_error& e) {
    return e.what();
  }
  return "no error";
}
}  // namespace

TEST_CASE("the hollow triangle") {
  const auto c = parse("# three edges, no 2-simplex\nx y\ny z\nz x\n");
  CHECK(counts(c) == std::vector<std::size_t>{3, 3});  // three edges, no 2-simplex
  CHECK(c.cell_name(1, 1) == "x z");                   // "z x" named in increasing vertex order
}

TEST_CASE("comments, CRLF, tabs, blank lines, any label characters") {
  const auto c = parse("\r\n  # only a comment\r\n\tα\tβ  γ # a triangle\r\n\r\n1 2.5 x/y\r\nα β\n");
  CHECK(counts(c) == std::vector<std::size_t>{6, 6, 2});  // two disjoint triangles, one face relisted
  CHECK(c.label(0) == "α");
  CHECK(c.label(4) == "2.5");
  CHECK(c.cell_name(2, 1) == "1 2.5 x/y");
  CHECK(lacuna::top_dimension(parse("")) == -1);                 // docs/formats.md: an empty file is the empty complex
  CHECK(lacuna::top_dimension(parse("# nothing\n\n#\n")) == -1);  // ... as is one of comments only
  CHECK(counts(parse("a b c")) == std::vector<std::size_t>{3, 3, 1});  // no final newline
}

TEST_CASE("numbering by first appearance, orientation by vertex number") {
  const auto c = parse("c b\na c\n");
  CHECK(c.label(0) == "c");
  CHECK(c.label(1) == "b");
  CHECK(c.label(2) == "a");
  CHECK(c.cell_name(1, 1) == "c a");  // [0 2]: c before a
}

TEST_CASE("malformed inputs: FILE:LINE: message") {
  struct expected {
    const char* file;
    std::size_t line;
    const char* message;
  };
  const expected cases[] = {
      {"facets_repeated_label.facets", 4, "the label 'y' is repeated within one simplex"},
      {"facets_repeated_label_crlf.facets", 2, "the label 'c' is repeated within one simplex"},
      {"facets_bad_utf8.facets", 2, "a label is not valid UTF-8"},
      {"facets_truncated_utf8.facets", 1, "a label is not valid UTF-8"},
      {"facets_too_large.facets", 2,
       "a simplex with 40 vertices (2^40 - 1 faces) is more than the limit of 20 vertices per line"},
  };
  for (const auto& e : cases) {
    CAPTURE(e.file);
    const std::string path = std::string(LACUNA_TEST_DATA_DIR) + "/complex/" + e.file;
    try {
      lacuna::io::read_facets(std::filesystem::path(path));
      FAIL("must throw");
    } catch (const lacuna::parse_error& x) {
      CHECK(x.file() == path);
      CHECK(x.line() == e.line);
      CHECK(x.message() == e.message);
      CHECK(std::string(x.what()) == path + ":" + std::to_string(e.line) + ": " + e.message);
    }
  }
  CHECK(error_of("a b\n\xe0\x80\x80 c\n") == "test.facets:2: a label is not valid UTF-8");  // overlong form
  CHECK(error_of("a \xed\xa0\x80\n") == "test.facets:1: a label is not valid UTF-8");       // a surrogate
  CHECK(error_of("a b c d e\n", {.max_cells = 16}) ==
        "test.facets:1: the facets up to this line imply up to 31 simplices, more than the limit of 16 cells");
  CHECK(error_of("a b c d\nd e f g\n", {.max_cells = 20}) ==
        "test.facets:2: the facets up to this line imply up to 30 simplices, more than the limit of 20 cells");
  CHECK(error_of("a b c d\n", {.max_cells = 15}) == "no error");  // exactly at the limit
  // the sum counts duplicates: it bounds the reader's work, not only the complex (15 simplices)
  CHECK(error_of("a b c d\nb c d a\n", {.max_cells = 20}) ==
        "test.facets:2: the facets up to this line imply up to 30 simplices, more than the limit of 20 cells");
  CHECK(error_of("a b c d\nb c d a\n", {.max_cells = 30}) == "no error");
}

TEST_CASE("a short hostile line is refused by the default limits before anything is built") {
  // 28 one-letter labels: 56 bytes that imply 2^28 - 1 simplices (about 3 GB once built)
  std::string line;
  for (int i = 0; i < 28; ++i) line += std::string(1, static_cast<char>('A' + i % 26)) + (i >= 26 ? "x " : " ");
  CHECK(error_of(line + "\n") == "test.facets:1: a simplex with 28 vertices (2^28 - 1 faces) is more than the limit of 20 "
                                 "vertices per line");
  // twenty vertices per line are accepted by default; more when the caller raises the limit
  std::string twenty, twenty_one;
  for (int i = 0; i < 21; ++i) (i < 20 ? twenty : twenty_one) += lacuna::detail::concat("v", std::to_string(i), " ");
  twenty_one = twenty + twenty_one;
  // (a small max_cells stops each line at the next check, so no 10^6-simplex closure is built:
  // the message shows that the line got past the per-line limit)
  CHECK(error_of(twenty + "\n", {.max_cells = 100}) ==
        "test.facets:1: the facets up to this line imply up to 1048575 simplices, more than the limit of 100 cells");
  CHECK(error_of(twenty_one + "\n") ==
        "test.facets:1: a simplex with 21 vertices (2^21 - 1 faces) is more than the limit of 20 vertices per line");
  CHECK(error_of(twenty_one + "\n", {.max_cells = 100, .max_facet_vertices = 21}) ==
        "test.facets:1: the facets up to this line imply up to 2097151 simplices, more than the limit of 100 cells");
  // and a line at the limit is read: 5 labels under max_facet_vertices = 5, the 4-simplex
  CHECK(error_of("a b c d e\n", {.max_facet_vertices = 5}) == "no error");
  CHECK(error_of("a b c d e f\n", {.max_facet_vertices = 5}) ==
        "test.facets:1: a simplex with 6 vertices (2^6 - 1 faces) is more than the limit of 5 vertices per line");
  // the default sum limit, 2^28: 257 lines of 20 fresh vertices imply 257 (2^20 - 1) > 2^28
  // simplices; the reader stops at line 257 having built nothing
  std::string many;
  for (int l = 0; l < 257; ++l) {
    for (int i = 0; i < 20; ++i) many += lacuna::detail::concat("w", std::to_string(l), "_", std::to_string(i), " ");
    many += "\n";
  }
  CHECK(error_of(many) == "test.facets:257: the facets up to this line imply up to 269483775 simplices, more than "
                          "the limit of 268435456 cells");
  const std::string missing = std::string(LACUNA_TEST_DATA_DIR) + "/complex/no_such_file.facets";
  CHECK_THROWS_WITH_AS(lacuna::io::read_facets(std::filesystem::path(missing)), (missing + ": cannot open the file").c_str(),
                       lacuna::parse_error);
}

TEST_CASE("round trip: write then read gives the same complex (random, fixed seeds)") {
  for (unsigned seed = 1; seed <= 30; ++seed) {
    const auto r = test_support::random_simplicial(seed, 12, 9, 5);
    // relabel with strings in a scrambled order, so that first appearance is not lexicographic
    lacuna::simplicial_complex<std::string>::builder b;
    for (std::uint32_t v = 0; v < r.vertex_count(); ++v) b.vertex(lacuna::detail::concat("v", std::to_string((v * 7 + seed) % 13), "_", std::to_string(v)));
    for (const auto& [k, i] : r.facets()) b.add_facet_ids(r.vertices(k, i));
    const auto c = std::move(b).finalize();
    std::ostringstream out;
    lacuna::io::write_facets(out, c);
    const auto back = parse(out.str());
    CHECK(back == c);
  }
  // a numbering that needs a lone-vertex line: vertex 1 is in no facet with vertex 0
  lacuna::simplicial_complex<int>::builder b;
  for (int v : {0, 1, 2}) b.vertex(v);
  b.add_facet({0, 2});
  const auto c = std::move(b).finalize();
  std::ostringstream out;
  lacuna::io::write_facets(out, c);
  CHECK(out.str() == "# 3 vertices, 2 facets\n0\n1\n0 2\n");
  const auto back = parse(out.str());
  CHECK(back.labels() == std::vector<std::string>{"0", "1", "2"});  // the numbering is kept
  CHECK(counts(back) == std::vector<std::size_t>{3, 1});
}

TEST_CASE("the writer refuses labels it cannot write") {
  const lacuna::simplicial_complex<std::string> c{{"a b", "c"}};
  std::ostringstream out;
  CHECK_THROWS_WITH_AS(lacuna::io::write_facets(out, c),
                       "write_facets: the label of vertex 0 ('a b') is empty or holds whitespace or '#'",
                       lacuna::invalid_complex);
}

}  // namespace io_facets_test

// lacuna::io::line_reader, the one line reader of the text formats (issue 14, items 2, 3, 6
// and 8), and what the readers built on it do with a byte-order mark, a bare CR, a NUL byte
// and an endless line. Expected values are the rules of io/line_reader.hpp, applied by hand.
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/line_reader.hpp>

#include <doctest/doctest.h>

#include <sstream>
#include <streambuf>
#include <string>
#include <vector>

namespace io_line_reader_test {

using lacuna::io::line_reader;
using lacuna::io::line_reader_options;

/// Every line of `text`, or the parse_error's line and message.
struct outcome {
  std::vector<std::string> lines;
  std::size_t error_line = 0;
  std::string error;
};

inline outcome read_all(const std::string& text, line_reader_options o = {}) {
  std::istringstream in(text);
  line_reader r(in, "t.txt", o);
  outcome out;
  try {
    for (std::string_view l; r.next(l);) {
      out.lines.emplace_back(l);
      CHECK(r.line_number() == out.lines.size());
    }
  } catch (const lacuna::parse_error& e) {
    out.error_line = e.line();
    out.error = e.message();
  }
  return out;
}

/// A stream of `byte` that never ends (as /dev/zero), counting what was read from it.
class endless : public std::streambuf {
 public:
  explicit endless(char byte) : block_(4096, byte) {}
  std::size_t served = 0;

 protected:
  int_type underflow() override {
    served += block_.size();
    setg(block_.data(), block_.data(), block_.data() + block_.size());
    return traits_type::to_int_type(block_[0]);
  }

 private:
  std::string block_;
};

}  // namespace io_line_reader_test

TEST_CASE("line_reader: LF and CRLF, a last line without LF, empty lines, both modes") {
  using namespace io_line_reader_test;
  for (const bool ahead : {true, false}) {
    CAPTURE(ahead);
    const line_reader_options o{.read_ahead = ahead, .block_bytes = 3};  // lines across blocks
    CHECK(read_all("a b\nc\r\n\nlast", o).lines == std::vector<std::string>{"a b", "c", "", "last"});
    CHECK(read_all("", o).lines.empty());
    CHECK(read_all("\n", o).lines == std::vector<std::string>{""});
    CHECK(read_all("x\r\n", o).lines == std::vector<std::string>{"x"});
  }
}

TEST_CASE("line_reader: a byte-order mark at the start is skipped, nowhere else") {
  using namespace io_line_reader_test;
  CHECK(read_all("\xEF\xBB\xBFx y\nz\n").lines == std::vector<std::string>{"x y", "z"});
  CHECK(read_all("\xEF\xBB\xBF# c\n").lines == std::vector<std::string>{"# c"});
  CHECK(read_all("a\n\xEF\xBB\xBF" "b\n").lines == std::vector<std::string>{"a", "\xEF\xBB\xBF" "b"});
  CHECK(read_all("\xEF\xBB\xBF").lines == std::vector<std::string>{""});
}

TEST_CASE("line_reader: a bare CR is an error naming its line") {
  using namespace io_line_reader_test;
  for (const bool ahead : {true, false}) {
    CAPTURE(ahead);
    const line_reader_options o{.read_ahead = ahead};
    auto r = read_all("a b\rb c\r", o);  // old Mac line ends: one line, refused
    CHECK(r.error_line == 1);
    CHECK(r.error.find("carriage return") != std::string::npos);
    r = read_all("ok\nx\ry\n", o);
    CHECK(r.lines == std::vector<std::string>{"ok"});
    CHECK(r.error_line == 2);
    CHECK(read_all("x\r\r\n", o).error_line == 1);  // CR CR LF: the first CR is bare
  }
}

TEST_CASE("line_reader: a line past the limit is refused before more is buffered") {
  using namespace io_line_reader_test;
  const line_reader_options o{.max_line_bytes = 8, .block_bytes = 4};
  CHECK(read_all("12345678\n", o).lines == std::vector<std::string>{"12345678"});
  CHECK(read_all("12345678\r\n", o).lines == std::vector<std::string>{"12345678"});  // the CR is not counted
  auto r = read_all("ok\n123456789\n", o);
  CHECK(r.error_line == 2);
  CHECK(r.error.find("longer than 8 bytes") != std::string::npos);
  // an endless stream: refused at line 1, having read about the limit and no more
  for (const bool ahead : {true, false}) {
    endless src('\0');
    std::istream in(&src);
    line_reader lr(in, "zero", {.max_line_bytes = 1 << 16, .read_ahead = ahead});
    std::string_view l;
    CHECK_THROWS_AS(lr.next(l), lacuna::parse_error);
    CHECK(src.served < (std::size_t{1} << 16) + 2 * (std::size_t{1} << 16));
  }
}

TEST_CASE("line_reader: exact mode leaves the bytes after the last line in the stream") {
  using namespace io_line_reader_test;
  std::istringstream in("NRRD0004\r\nsizes: 2\n\n\x01\x02");
  line_reader r(in, "v.nrrd", {.read_ahead = false});
  std::string_view l;
  REQUIRE(r.next(l));
  CHECK(l == "NRRD0004");
  REQUIRE(r.next(l));
  REQUIRE(r.next(l));
  CHECK(l.empty());
  CHECK(r.bytes_consumed() == 20);  // 10 + 9 + 1, counted by hand
  CHECK(in.get() == 1);
  CHECK(in.get() == 2);
}

TEST_CASE("quote_text: control bytes and broken UTF-8 as \\xHH, never a NUL") {
  using lacuna::io::quote_text;
  using namespace std::string_literals;
  CHECK(quote_text("a\0b"s) == "'a\\x00b'");
  CHECK(quote_text("\xC3\xA9t\xC3\xA9") == "'\xC3\xA9t\xC3\xA9'");  // "été" stays as it is
  CHECK(quote_text("\xE9t\xFF") == "'\\xe9t\\xff'");                 // Latin-1: escaped
  CHECK(quote_text(std::string(50, 'x')) == "'" + std::string(40, 'x') + "...'");
  // parse_error itself never carries a NUL in what()
  const lacuna::parse_error e("f", 3, "a\0b"s);
  CHECK(std::string(e.what()) == "f:3: a\\x00b");
}

TEST_CASE("readers: the byte-order mark, a bare CR and a NUL in .facets and .cells") {
  using namespace std::string_literals;
  {
    // the hollow triangle saved with a mark: 3 vertices (was 4, one of them "\xEF\xBB\xBFx")
    std::istringstream in("\xEF\xBB\xBFx y\ny z\nz x\n");
    const auto c = lacuna::io::read_facets(in, "t.facets");
    CHECK(c.cell_count(0) == 3);
    CHECK(c.cell_count(1) == 3);
  }
  {
    std::istringstream in("a b\rb c\r");  // was: one 3-simplex
    CHECK_THROWS_WITH_AS(lacuna::io::read_facets(in, "t.facets"), doctest::Contains("t.facets:1: "), lacuna::parse_error);
  }
  {
    std::istringstream in("0 p\n1 a\0b : p - p\n"s);
    try {
      (void)lacuna::io::read_cells(in, "t.cells");
      FAIL("no error");
    } catch (const lacuna::parse_error& e) {
      CHECK(std::string(e.what()).find("'\\x00b' in the cell name 'a'") != std::string::npos);
    }
  }
  {
    // faces as written: '1 q : p - p' has the face p although its boundary is 0
    std::istringstream in("0 p\n0 w\n1 q : p - p\n1 e : w - p\n");
    const auto c = lacuna::io::read_cells(in, "t.cells");
    CHECK(c.boundary(1, 0).empty());
    CHECK(c.faces_as_written(1, 0) == std::vector<std::size_t>{0});
    CHECK(c.faces_as_written(1, 1) == std::vector<std::size_t>{0, 1});
  }
}

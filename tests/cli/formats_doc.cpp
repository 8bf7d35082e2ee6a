// Every example of docs/formats.md, run through the tool: the page says what the tool reads and
// prints, and this test holds it to that. The page marks its examples with HTML comments (which
// Markdown viewers do not show) right before a fenced block:
//
//   <!-- example file: NAME -->  the block is the file NAME, each of its lines ended by '\n'
//                                (a binary example is written so that its bytes are text)
//   <!-- example run -->    the block is "$ lacuna ARGS" followed by exactly what the tool prints
//                           on stdout; the run must end with status 0 and nothing on stderr
//   <!-- example error -->  the block is "$ lacuna ARGS" followed by the one line the tool
//                           prints on stderr; the run must end with status 2, stdout empty
//
// Files are written to a temporary directory and the tool runs there, so the names printed are
// the names on the page. ARGS are split at spaces (the page uses no quoting).
#include "run.hpp"

#include <cstddef>
#include <fstream>
#include <map>
#include <set>
#include <sstream>
#include <string>
#include <vector>

namespace cli_formats_doc_test {

using namespace cli_test;

namespace {

std::filesystem::path source_dir() { return std::filesystem::path(LACUNA_EXAMPLES_DIR).parent_path(); }

std::string read_text(const std::filesystem::path& p) {
  std::ifstream f(p, std::ios::binary);
  REQUIRE(f.good());
  std::ostringstream s;
  s << f.rdbuf();
  return s.str();
}

struct block {
  std::string kind;  // "file", "run" or "error"
  std::string name;  // of a file
  std::size_t line;  // the line of docs/formats.md where the marker is
  std::vector<std::string> lines;
};

/// The marked blocks of `page`, in order. A marker must be followed (after blank lines) by a
/// fenced block; a marker of an unknown kind is a mistake in the page and fails the test.
std::vector<block> marked_blocks(const std::string& page) {
  std::vector<std::string> lines;
  {
    std::istringstream in(page);
    for (std::string l; std::getline(in, l);) lines.push_back(l);
  }
  const std::string open = "<!-- example ", close = " -->";
  std::vector<block> out;
  for (std::size_t i = 0; i < lines.size(); ++i) {
    const std::string& l = lines[i];
    if (l.rfind(open, 0) != 0) continue;
    INFO("docs/formats.md:" << i + 1 << ": " << l);
    REQUIRE(l.size() > open.size() + close.size());
    REQUIRE(l.compare(l.size() - close.size(), close.size(), close) == 0);
    block b{l.substr(open.size(), l.size() - open.size() - close.size()), {}, i + 1, {}};
    if (b.kind.rfind("file: ", 0) == 0) {
      b.name = b.kind.substr(6);
      b.kind = "file";
    }
    REQUIRE((b.kind == "file" || b.kind == "run" || b.kind == "error"));
    std::size_t j = i + 1;
    while (j < lines.size() && lines[j].empty()) ++j;
    REQUIRE(j < lines.size());
    REQUIRE(lines[j].rfind("```", 0) == 0);
    for (++j; j < lines.size() && lines[j] != "```"; ++j) b.lines.push_back(lines[j]);
    REQUIRE(j < lines.size());  // the block is closed
    out.push_back(std::move(b));
    i = j;
  }
  return out;
}

std::vector<std::string> words(const std::string& s) {
  std::vector<std::string> w;
  std::istringstream in(s);
  for (std::string x; in >> x;) w.push_back(x);
  return w;
}

std::string joined(const std::vector<std::string>& lines, std::size_t from) {
  std::string s;
  for (std::size_t k = from; k < lines.size(); ++k) s += lines[k] + "\n";
  return s;
}

/// Changes the working directory for its lifetime.
class working_directory {
 public:
  explicit working_directory(const std::filesystem::path& p) : old_(std::filesystem::current_path()) {
    std::filesystem::current_path(p);
  }
  ~working_directory() {
    std::error_code ec;
    std::filesystem::current_path(old_, ec);
  }
  working_directory(const working_directory&) = delete;
  working_directory& operator=(const working_directory&) = delete;

 private:
  std::filesystem::path old_;
};

}  // namespace

TEST_CASE("every example of docs/formats.md is read and printed as the page says") {
  const auto blocks = marked_blocks(read_text(source_dir() / "docs" / "formats.md"));
  temp_dir dir;
  working_directory here(dir.path());
  std::set<std::string> files;
  std::map<std::string, std::size_t> counts;
  for (const block& b : blocks) {
    INFO("docs/formats.md:" << b.line << " (example " << b.kind << ")");
    ++counts[b.kind];
    if (b.kind == "file") {
      const std::string& name = b.name;
      REQUIRE(!name.empty());
      REQUIRE(name.find('/') == std::string::npos);
      CHECK(files.insert(name).second);  // each name once, so no example is silently replaced
      dir.write(name, joined(b.lines, 0));
      continue;
    }
    REQUIRE(!b.lines.empty());
    const std::string& command = b.lines.front();
    REQUIRE(command.rfind("$ lacuna ", 0) == 0);
    const auto args = words(command.substr(9));
    INFO(command);
    const result r = run(args);
    if (b.kind == "run") {
      CHECK(r.status == 0);
      CHECK(r.err == "");
      CHECK(r.out == joined(b.lines, 1));
    } else {
      REQUIRE(b.lines.size() == 2);  // the contract: one line
      CHECK(r.status == 2);
      CHECK(r.out == "");
      CHECK(r.err == b.lines[1] + "\n");
    }
  }
  // the page's examples are really there: every input kind has a file, and runs outnumber them
  for (const char* name : {"sphere.facets", "klein.cells", "ring.pbm", "hill.pgm", "hollow.nrrd", "tube.off",
                           "tetra.obj", "room.csv", "square.distances", "disk.values"}) {
    INFO(name);
    CHECK(files.count(name) == 1);
  }
  CHECK(counts["run"] >= counts["file"]);
  CHECK(counts["error"] >= 3);
}

}  // namespace cli_formats_doc_test

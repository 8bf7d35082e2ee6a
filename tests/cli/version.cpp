// `lacuna --version`: one line, "lacuna X.Y.Z", the version in the project() call of the
// top-level CMakeLists.txt (read here from the file itself, not from the build's definition).
#include "run.hpp"

#include <fstream>
#include <regex>
#include <sstream>
#include <string>

namespace cli_version_test {

using namespace cli_test;

namespace {

std::string project_version() {
  std::ifstream f(std::filesystem::path(LACUNA_EXAMPLES_DIR).parent_path() / "CMakeLists.txt");
  REQUIRE(f.good());
  std::ostringstream s;
  s << f.rdbuf();
  const std::string text = s.str();
  std::smatch m;
  REQUIRE(std::regex_search(text, m, std::regex(R"(project\(lacuna\s+VERSION\s+([0-9]+\.[0-9]+\.[0-9]+))")));
  return m[1].str();
}

}  // namespace

TEST_CASE("lacuna --version prints the project version and exits with status 0") {
  const result r = run({"--version"});
  CHECK(r.status == 0);
  CHECK(r.err == "");
  CHECK(r.out == "lacuna " + project_version() + "\n");
}

TEST_CASE("--version is an option of the tool, not of a subcommand") {
  // before a subcommand it still prints the version and nothing else; after one it is not an
  // option of that subcommand, so the command line is refused (status 2, one line)
  const result before = run({"--version", "homology"});
  CHECK(before.status == 0);
  CHECK(before.out == "lacuna " + project_version() + "\n");
  const std::string line = expect_error(run({"homology", "--version"}));
  CHECK(line.rfind("lacuna: ", 0) == 0);
}

}  // namespace cli_version_test

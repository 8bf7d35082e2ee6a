// Runs examples/ring_demo (built with the examples) and requires its self-checks to pass:
// exit status 0 and the final line. Its expected values are stated in the demo's source.
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <string>

namespace ring_ring_demo_test {

TEST_CASE("examples/ring_demo passes its self-checks") {
  const std::string cmd = std::string(LACUNA_BINARY_DIR) + "/ring_demo";
  FILE* out = popen(cmd.c_str(), "r");
  REQUIRE(out != nullptr);
  std::string text;
  char buf[512];
  while (std::fgets(buf, sizeof buf, out) != nullptr) text += buf;
  const int status = pclose(out);
  INFO(text);
  CHECK(status == 0);
  CHECK(text.find("all self-checks passed") != std::string::npos);
  CHECK(text.find("1000000009 = 31400^2 + 3747^2") != std::string::npos);  // 985960000 + 14040009
}

}  // namespace ring_ring_demo_test

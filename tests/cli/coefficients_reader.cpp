// One reader of --coefficients for every subcommand (examples/cli/coefficients.hpp): `lacuna
// homology` and `lacuna persistence` read a modulus the same way — decimal, leading zeros
// dropped, however many (docs/cli.md) — and give the same verdict on each spelling; persistence
// alone refuses Z (docs/persistence-cli.md: barcodes exist over a field only). The primes and
// non-primes named here are elementary (4 = 2 * 2; 2^62 - 57 is the largest prime below 2^62,
// from memory, as tests/cli/coefficients.cpp uses it).
#include "json_checks.hpp"

#include <filesystem>
#include <string>
#include <vector>

namespace cli_coefficients_reader_test {

using namespace cli_test;

namespace {

std::string square_points() {
  return (std::filesystem::path(LACUNA_TEST_DATA_DIR) / "persistence" / "square.points").string();
}

}  // namespace

TEST_CASE("homology and persistence read a modulus alike: leading zeros dropped, the same errors") {
  const auto cells = data("projective_plane.cells").string();
  const auto points = square_points();
  // Z/0007 is Z/7: the same bytes as Z/7 in both subcommands
  for (const std::vector<std::string>& sub : {std::vector<std::string>{"homology", "--json"},
                                              std::vector<std::string>{"persistence", "--json"}}) {
    const std::string file = sub[0] == "homology" ? cells : points;
    auto args = sub;
    args.insert(args.end(), {"--coefficients", "Z/0000000000000000000000007", file});
    const auto padded = run(args);
    args = sub;
    args.insert(args.end(), {"--coefficients", "Z/7", file});
    const auto plain = run(args);
    CAPTURE(sub[0]);
    CHECK(padded.status == 0);
    CHECK(plain.status == 0);
    CHECK(padded.out == plain.out);
    CHECK(plain.out.find("\"coefficients\": \"Z/7\"") != std::string::npos);
  }
  // the same verdict, in the same words after the option, for each bad spelling
  const std::vector<std::pair<std::string, std::string>> bad = {
      {"Z/04", ": 4 is not a prime"},
      {"Z/1", ": 1 is not a prime"},
      {"Z/4611686018427387904", ": the prime must be below 2^62"},  // 2^62
      {"Z/18446744073709551616", ": the prime must be below 2^62"},  // 2^64: no wrap-around
  };
  for (const auto& [co, words] : bad) {
    CAPTURE(co);
    const auto h = expect_error(run({"homology", "--coefficients", co, cells}));
    const auto p = expect_error(run({"persistence", "--coefficients", co, points}));
    CHECK(h == "lacuna: --coefficients " + co + words);
    CHECK(p == h);
  }
  // the largest prime below 2^62 is a field for persistence too
  CHECK(run({"persistence", "--json", "--coefficients", "Z/4611686018427387847", points}).status == 0);
  // malformed: each subcommand says what it expects
  CHECK(expect_error(run({"homology", "--coefficients", "Z/x", cells})) ==
        "lacuna: --coefficients Z/x: expected Z, Q or Z/p for a prime p");
  CHECK(expect_error(run({"persistence", "--coefficients", "Z/x", points})) ==
        "lacuna: --coefficients Z/x: expected Z/p for a prime p, or Q");
  CHECK(expect_error(run({"persistence", "--coefficients", "Z", points})).find("persistence needs a field") !=
        std::string::npos);
}

}  // namespace cli_coefficients_reader_test

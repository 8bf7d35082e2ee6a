// Robustness of the .cells and .facets readers: every file under tests/data/complex/ (and two
// valid ones) mutated many times (fixed seed: bytes flipped, inserted, deleted, lines
// duplicated); each read must either succeed with a complex that passes lacuna::validate or
// throw lacuna::parse_error whose what() starts with "FILE:" — never anything else.
#include <doctest/doctest.h>

#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace io_cells_facets_mutations_test {

namespace {
std::string slurp(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}
std::string mutate(std::string s, std::mt19937& rng) {
  const char alphabet[] = "0123456789 \t\r\n#:+-*_.'abpqrvw\xff\xc3";
  std::uniform_int_distribution<int> kind(0, 4), ch(0, static_cast<int>(sizeof alphabet) - 2);
  const int edits = 1 + static_cast<int>(rng() % 4);
  for (int e = 0; e < edits; ++e) {
    const std::size_t pos = s.empty() ? 0 : rng() % (s.size() + 1);
    switch (kind(rng)) {
      case 0: if (pos < s.size()) s[pos] = alphabet[ch(rng)]; break;
      case 1: s.insert(pos, 1, alphabet[ch(rng)]); break;
      case 2: if (pos < s.size()) s.erase(pos, 1); break;
      case 3: s.insert(pos, "99999999999999999999"); break;
      default: {
        const auto nl = s.find('\n', pos);
        if (nl != std::string::npos) s.insert(nl + 1, s.substr(pos, nl + 1 - pos));
      }
    }
  }
  return s;
}
}  // namespace

TEST_CASE("mutated inputs give a valid complex or a parse_error with the file name") {
  std::vector<std::pair<std::string, std::string>> seeds;  // (extension, text)
  for (const auto& e : std::filesystem::directory_iterator(std::string(LACUNA_TEST_DATA_DIR) + "/complex"))
    seeds.emplace_back(e.path().extension().string(), slurp(e.path()));
  seeds.emplace_back(".cells", "0 v\n1 a : v - v\n1 b : v - v\n1 c : v - v\n2 U : a + b - c\n2 L : a - b + c\n");
  seeds.emplace_back(".facets", "1 2 3\n1 3 4\n1 4 5\n1 5 6\n1 2 6\n2 3 5\n2 4 5\n2 4 6\n3 4 6\n3 5 6\n");
  std::mt19937 rng(2024);
  std::size_t ok = 0, errors = 0;
  for (int round = 0; round < 400; ++round)
    for (const auto& [ext, text] : seeds) {
      std::istringstream in(mutate(text, rng));
      try {
        if (ext == ".cells")
          lacuna::validate(lacuna::io::read_cells(in, "m.cells", {.max_cells = 1000}));
        else
          lacuna::validate(lacuna::io::read_facets(in, "m.facets", {.max_cells = 100000}));
        ++ok;
      } catch (const lacuna::parse_error& e) {
        CHECK(std::string(e.what()).rfind("m.", 0) == 0);
        ++errors;
      }
    }
  CHECK(ok > 0);  // the mutations are not all fatal ...
  CHECK(errors > 0);  // ... nor all harmless
}

}  // namespace io_cells_facets_mutations_test

// Runs the gallery programs that docs/tutorials.md points to and checks their exit status and
// the lines a reader checks by hand, against sources outside the programs:
//   * examples/own_ring_homology.cpp: the projective plane, the Klein bottle and the lens space
//     L(3,1) over the user-written rings Z[i], F_2[t], F_3[t]. Expected groups from the
//     universal coefficient theorem (Hatcher 2002, Theorem 3A.3, from memory) applied to the
//     integral groups H_1(RP^2) = Z/2 (Hatcher 2002, Example 2.42, from memory), H_1(K) = Z + Z/2
//     (Example 2.37), H_1(L(3,1)) = Z/3, H_3 = Z (Example 2.43, from memory): Z/m ⊗ R = R/(m)
//     and Tor(Z/m, R) = R when m = 0 in R. 2 = -i(1 + i)^2 in Z[i] by expanding the product.
//   * examples/variants_side_by_side.cpp: every variant prints the same groups (docs/homology.md:
//     all variants give the same groups); the Z ranks are checked here against χ computed from
//     the number of k-matchings of K_n, n! / (k! 2^k (n - 2k)!) (Euler–Poincaré), the Z/3 ranks
//     against the universal coefficient theorem, and for n = 7 against H_1(M(K_7)) = Z/3 (Bouc
//     1992, from memory).
//   * examples/own_cell_type.cpp: a polygon glued by a word, a cell type of the user's own with
//     free functions found by argument-dependent lookup. The groups of the sphere aA (Z, 0, Z),
//     the torus abAB (Z, Z^2, Z), the projective plane aa (Z, Z/2, 0), the Klein bottle abaB
//     (Z, Z + Z/2, 0) and the surface of genus 2 (Z, Z^4, Z): Hatcher 2002, §2.2, Examples 2.36
//     and 2.37 (from memory). Vertex counts: the corners of a polygon glued this way are all
//     one vertex, except for the sphere aA, whose two corners stay apart.
//   * docs/tutorials.md: every ```cpp block appears verbatim in the example file named last
//     before it (a path in backquotes starting with examples/), so the page quotes only code
//     that CI compiles and these tests run.
#include <doctest/doctest.h>

#include "run_program.hpp"
#include <sys/wait.h>

#include <cstdint>
#include <cstdio>
#include <fstream>
#include <iterator>
#include <map>
#include <sstream>
#include <string>
#include <vector>

namespace examples_gallery_test {

namespace {

examples_support::run_result run(const std::string& program_and_arguments) {
  return examples_support::run_program(program_and_arguments, false);
}

bool has_line(const std::string& text, const std::string& line) { return text.find(line + "\n") != std::string::npos; }

/// The rows of the variants table: ring -> the groups column of each row ("1, 0, 42+(Z/3)^8, 70").
std::map<std::string, std::vector<std::string>> table_rows(const std::string& text) {
  std::map<std::string, std::vector<std::string>> rows;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) {
    const auto ms = line.find(" ms  ");
    if (ms == std::string::npos) continue;
    rows[line.substr(0, line.find(' '))].push_back(line.substr(ms + 5));
  }
  return rows;
}

/// Parses "1, 0, 42+(Z/3)^8, 70" into ranks and, per dimension, the number of factors Z/3.
void parse_groups(const std::string& s, std::vector<std::int64_t>& ranks, std::vector<std::int64_t>& threes) {
  std::istringstream in(s);
  for (std::string item; std::getline(in, item, ',');) {
    ranks.push_back(std::stoll(item));
    std::int64_t count = 0;
    if (const auto p = item.find("+(Z/3)"); p != std::string::npos) {
      count = 1;
      if (item.size() > p + 6 && item[p + 6] == '^') count = std::stoll(item.substr(p + 7));
    }
    threes.push_back(count);
  }
}

/// Number of k-matchings of K_n: n! / (k! 2^k (n - 2k)!).
std::int64_t matchings(int n, int k) {
  std::int64_t r = 1;
  for (int i = 0; i < 2 * k; ++i) r = r * (n - i);
  for (int i = 1; i <= k; ++i) r /= 2 * i;  // k! 2^k = 2·4·…·2k
  return r;
}

}  // namespace

TEST_CASE("examples/own_ring_homology: the user's rings Z[i], F_2[t], F_3[t] give the UCT's groups") {
  const auto r = run("own_ring_homology");
  INFO(r.text);
  CHECK(r.status == 0);
  for (const char* line : {
           // RP^2: Z/2 ⊗ Z[i] = Z[i]/(2); over F_2[t] 2 = 0 gives R in H_1 and Tor in H_2; over F_3[t] 2 is a unit
           "projective plane over Z: H_0 = Z H_1 = Z/(2) H_2 = 0",
           "  H_1 = Z[i]/(2 + 0i)   (UCT: Z[i]/(2 + 0i))",
           "projective plane over F_2[t]:\n  H_0 = F_2[t]   (UCT: F_2[t])\n  H_1 = F_2[t]   (UCT: F_2[t])\n"
           "  H_2 = F_2[t]   (UCT: F_2[t])",
           "projective plane over F_3[t]:\n  H_0 = F_3[t]   (UCT: F_3[t])\n  H_1 = 0   (UCT: 0)\n  H_2 = 0   (UCT: 0)",
           // Klein bottle: Z + Z/2
           "Klein bottle over Z[i]:\n  H_0 = Z[i]   (UCT: Z[i])\n  H_1 = Z[i] + Z[i]/(2 + 0i)   (UCT: Z[i] + Z[i]/(2 + 0i))",
           "  H_1 = F_2[t]^2   (UCT: F_2[t]^2)",
           // L(3,1): Z/3 seen over F_3[t] in H_1 and H_2, invisible over F_2[t]; 3 stays prime in Z[i]
           "  H_1 = Z[i]/(3 + 0i)   (UCT: Z[i]/(3 + 0i))",
           "lens space L(3,1) over F_3[t]:\n  H_0 = F_3[t]   (UCT: F_3[t])\n  H_1 = F_3[t]   (UCT: F_3[t])\n"
           "  H_2 = F_3[t]   (UCT: F_3[t])\n  H_3 = F_3[t]   (UCT: F_3[t])",
           "lens space L(3,1) over F_2[t]:\n  H_0 = F_2[t]   (UCT: F_2[t])\n  H_1 = 0   (UCT: 0)\n  H_2 = 0   (UCT: 0)",
           "2 = -i (1 + i)^2 in Z[i]: yes", "all self-checks passed"}) {
    CAPTURE(line);
    CHECK(has_line(r.text, line));
  }
  CHECK(r.text.find("FAILED") == std::string::npos);
}

TEST_CASE("examples/own_cell_type: a cell type of the user's own gives the textbook's surfaces") {
  const auto r = run("own_cell_type");
  INFO(r.text);
  CHECK(r.status == 0);
  for (const char* line : {
           "aA: 2 vertices, 1 edges, 1 face; H_0 | H_1 | H_2 = Z | 0 | Z (expected Z | 0 | Z)",
           "   H_1 generated by nothing",
           "abAB: 1 vertices, 2 edges, 1 face; H_0 | H_1 | H_2 = Z | Z^2 | Z (expected Z | Z^2 | Z)",
           "   H_1 generated by a, b",  // each side of the square closes to a loop
           "aa: 1 vertices, 1 edges, 1 face; H_0 | H_1 | H_2 = Z | Z/2 | 0 (expected Z | Z/2 | 0)",
           "   H_1 generated by a (order 2)",  // ∂F = 2a
           "abaB: 1 vertices, 2 edges, 1 face; H_0 | H_1 | H_2 = Z | Z + Z/2 | 0 (expected Z | Z + Z/2 | 0)",
           "abABcdCD: 1 vertices, 4 edges, 1 face; H_0 | H_1 | H_2 = Z | Z^4 | Z (expected Z | Z^4 | Z)",
           "all self-checks passed"}) {
    CAPTURE(line);
    CHECK(has_line(r.text, line));
  }
}

TEST_CASE("examples/variants_side_by_side: all variants agree, and agree with Euler and the UCT") {
  for (const int n : {7, 9}) {
    CAPTURE(n);
    const auto r = run("variants_side_by_side " + std::to_string(n));
    INFO(r.text);
    CHECK(r.status == 0);
    CHECK(has_line(r.text, "Euler-Poincare: yes; universal coefficients over Z/2 and Z/3: yes"));
    CHECK(has_line(r.text, "all self-checks passed"));
    auto rows = table_rows(r.text);
    // Z: default, coboundary_reduction, five pre-reductions, and dense Smith forms for n <= 8.
    REQUIRE(rows["Z"].size() == (n <= 8 ? 8u : 7u));
    REQUIRE(rows["Z/2"].size() == 2u);
    REQUIRE(rows["Z/3"].size() == 2u);
    for (const auto& [ring, groups] : rows)
      for (const auto& g : groups) CHECK(g == groups.front());
    std::vector<std::int64_t> ranks, threes, ranks3, unused;
    parse_groups(rows["Z"].front(), ranks, threes);
    parse_groups(rows["Z/3"].front(), ranks3, unused);
    // Euler–Poincaré: χ from the numbers of k-matchings (cells of dimension k - 1)
    std::int64_t chi = 0, chi_h = 0, cells = 0;
    for (int k = 1; 2 * k <= n; ++k) chi += (k % 2 == 1 ? 1 : -1) * matchings(n, k), cells += matchings(n, k);
    for (std::size_t d = 0; d < ranks.size(); ++d) chi_h += (d % 2 == 0 ? 1 : -1) * ranks[d];
    CHECK(chi_h == chi);
    CHECK(has_line(r.text, "matching complex M(K_" + std::to_string(n) + "): " + std::to_string(cells) +
                               " cells, chi = " + std::to_string(chi)));
    // UCT over Z/3 (Hatcher 2002, Corollary 3A.6): rank + Z/3 factors of H_d and of H_{d-1}
    REQUIRE(ranks3.size() == ranks.size());
    for (std::size_t d = 0; d < ranks.size(); ++d)
      CHECK(ranks3[d] == ranks[d] + threes[d] + (d > 0 ? threes[d - 1] : 0));
    if (n == 7) CHECK(rows["Z"].front() == "1, 0+(Z/3), 20");  // H_1(M(K_7)) = Z/3 (Bouc 1992)
  }
}

TEST_CASE("examples/variants_side_by_side refuses a size out of range with status 2") {
  const auto r = run("variants_side_by_side 40");
  CHECK(r.status == 2);
  CHECK(r.text.find("usage:") != std::string::npos);
}

TEST_CASE("docs/tutorials.md quotes its code blocks verbatim from the examples it names") {
  const std::string examples = LACUNA_EXAMPLES_DIR;
  const auto slurp = [](const std::string& path) {
    std::ifstream in(path);
    return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  };
  const std::string page = slurp(examples + "/../docs/tutorials.md");
  REQUIRE(!page.empty());
  std::istringstream in(page);
  std::string source, block;
  bool in_block = false;
  int blocks = 0;
  for (std::string line; std::getline(in, line);) {
    if (!in_block && line == "```cpp") {
      in_block = true, block.clear();
      continue;
    }
    if (in_block && line == "```") {
      in_block = false, ++blocks;
      CAPTURE(source);
      CAPTURE(block);
      REQUIRE(!source.empty());
      const std::string text = slurp(examples + "/" + source);
      REQUIRE(!text.empty());
      CHECK(text.find(block) != std::string::npos);
      continue;
    }
    if (in_block) {
      block += line + "\n";
      continue;
    }
    for (std::size_t p = 0; (p = line.find("`examples/", p)) != std::string::npos; ++p) {  // the last path named
      const auto end = line.find('`', p + 1);
      if (end != std::string::npos) source = line.substr(p + 10, end - p - 10);
    }
  }
  CHECK(!in_block);
  CHECK(blocks >= 10);  // the page has 13 blocks of code: a parser that finds none must fail
}

}  // namespace examples_gallery_test

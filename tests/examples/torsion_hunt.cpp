// Runs examples/torsion_hunt on small matching and chessboard complexes and checks what it
// prints against sources outside the engine:
//   * published groups (from memory): H̃_1(M(K_7)) = Z/3 (Bouc 1992); H̃_2(M(5 × 5)) = Z/3 and
//     H̃_2(M(K_10)) = Z/3, the bottom groups for n ≡ 1 mod 3 (Shareshian & Wachs 2007);
//   * the face counts in closed form — n! / (k! 2^k (n − 2k)!) matchings of k edges in K_n,
//     C(m, k) C(n, k) k! placements of k rooks — computed here, against the printed cells
//     and, through Euler–Poincaré, against the printed ranks;
//   * the connectivity bound (Björner, Lovász, Vrećica & Živaljević 1994, from memory);
//   * universal coefficients (Hatcher 2002, Theorem 3A.3): the dimensions printed over Q,
//     Z/2 and Z/3 predicted from the groups printed over Z;
// and that a tiny budget stops a computation cleanly and bad arguments give exit status 2.
#include <doctest/doctest.h>

#include "run_program.hpp"

#include <sys/wait.h>

#include <algorithm>
#include <cstdio>
#include <map>
#include <sstream>
#include <string>
#include <vector>

namespace examples_torsion_hunt_test {

namespace {

examples_support::run_result run(const std::string& args) { return examples_support::run_program("torsion_hunt " + args, true); }

struct group {
  long long rank = 0;
  std::map<long long, long long> torsion;  // factor -> how many
  bool operator==(const group&) const = default;
};

struct line {
  long long cells = 0;
  std::map<int, group> h;  // reduced homology, non-zero degrees
};

// "M(K_9)  2619 cells  H~_2 = Z^42 + (Z/3)^8  H~_3 = Z^70   0.003 s  [...]", keyed by name;
// over a field (field = "Q", "Z/3") every summand is a dimension: "Z/3", "(Z/3)^8", "Q^5".
std::map<std::string, line> parse(const std::string& text, const std::string& field) {
  std::map<std::string, line> out;
  std::istringstream in(text);
  for (std::string l; std::getline(in, l);) {
    std::istringstream w(l);
    std::string name, word;
    line x;
    if (!(w >> name >> x.cells >> word) || word != "cells") continue;
    if (l.find("stopped") != std::string::npos) continue;
    int k = -2;
    while (w >> word && word != "all" && word.find('.') == std::string::npos) {  // up to the seconds
      const auto hat = word.find(")^");
      group& g = x.h[k];
      if (word.rfind("H~_", 0) == 0) {
        k = std::stoi(word.substr(3));
        x.h[k];
      } else if (word == "=" || word == "+") {
      } else if (field != "Z" && (word == field || word.rfind(field + "^", 0) == 0 || word.rfind("(" + field + ")^", 0) == 0)) {
        g.rank += word == field ? 1 : std::stoll(word.substr(word.find('^') + 1));
      } else if (field == "Z" && (word == "Z" || word.rfind("Z^", 0) == 0)) {
        g.rank += word == "Z" ? 1 : std::stoll(word.substr(2));
      } else if (field == "Z" && word.rfind("Z/", 0) == 0) {
        g.torsion[std::stoll(word.substr(2))] += 1;
      } else if (field == "Z" && word.rfind("(Z/", 0) == 0 && hat != std::string::npos) {
        g.torsion[std::stoll(word.substr(3, hat - 3))] += std::stoll(word.substr(hat + 2));
      } else {
        FAIL("unparsed word " << word);
      }
    }
    x.h.erase(-2);
    out[name] = x;
  }
  return out;
}

long long binomial(long long n, long long k) {
  long long r = 1;
  for (long long i = 1; i <= k; ++i) r = r * (n - k + i) / i;
  return r;
}
long long factorial(long long n) { return n <= 1 ? 1 : n * factorial(n - 1); }

// f_{k−1}: matchings of k edges in K_n, or placements of k rooks on an m × n board
long long faces(bool matching, long long m, long long n, long long k) {
  if (matching) return 2 * k > n ? 0 : factorial(n) / (factorial(k) * (1LL << k) * factorial(n - 2 * k));
  return binomial(m, k) * binomial(n, k) * factorial(k);
}

void check_counts(const line& x, bool matching, long long m, long long n) {
  long long cells = 0, chi = -1, chi_h = 0;
  for (long long k = 1; faces(matching, m, n, k) > 0; ++k) cells += faces(matching, m, n, k), chi += (k % 2 ? 1 : -1) * faces(matching, m, n, k);
  for (const auto& [d, g] : x.h) chi_h += (d % 2 ? -1 : 1) * g.rank;
  CHECK(x.cells == cells);
  CHECK(chi_h == chi);  // Euler–Poincaré, reduced
  const long long nu = matching ? (n + 1) / 3 - 1 : std::min(m, (m + n + 1) / 3) - 1;
  for (const auto& [d, g] : x.h) CHECK((d >= nu || g == group{}));  // BLVZ 1994
}

}  // namespace

TEST_CASE("torsion_hunt over Z: Bouc's Z/3, Shareshian & Wachs's Z/3, closed-form counts, Euler, connectivity") {
  const auto rm = run("--ring Z --family matching --from 3 --to 10");
  INFO(rm.text);
  CHECK(rm.status == 0);
  const auto m = parse(rm.text, "Z");
  REQUIRE(m.size() == 8u);
  for (int n = 3; n <= 10; ++n) {
    CAPTURE(n);
    check_counts(m.at("M(K_" + std::to_string(n) + ")"), true, n, n);
  }
  CHECK(m.at("M(K_7)").h.at(1) == group{0, {{3, 1}}});   // Bouc 1992
  CHECK(m.at("M(K_10)").h.at(2) == group{0, {{3, 1}}});  // Shareshian & Wachs 2007
  const auto rc = run("--ring Z --family chessboard --from 2 --to 6");
  INFO(rc.text);
  CHECK(rc.status == 0);
  const auto c = parse(rc.text, "Z");
  REQUIRE(c.size() == 5u);
  for (int n = 2; n <= 6; ++n) {
    CAPTURE(n);
    check_counts(c.at("M(" + std::to_string(n) + "x" + std::to_string(n) + ")"), false, n, n);
  }
  CHECK(c.at("M(5x5)").h.at(2) == group{0, {{3, 1}}});  // Shareshian & Wachs 2007
  const auto rr = run("--ring Z --family chessboard --rows 3 --from 3 --to 6");  // 3 × n boards
  CHECK(rr.status == 0);
  const auto r = parse(rr.text, "Z");
  REQUIRE(r.size() == 4u);
  for (int n = 3; n <= 6; ++n) check_counts(r.at("M(3x" + std::to_string(n) + ")"), false, 3, n);
}

TEST_CASE("torsion_hunt over Q, Z/2 and Z/3 agrees with universal coefficients applied to its groups over Z") {
  for (const std::string family : {"matching --from 4 --to 9", "chessboard --from 3 --to 6", "chessboard --rows 4 --from 5 --to 7"}) {
    CAPTURE(family);
    const auto z = parse(run("--ring Z --family " + family).text, "Z");
    REQUIRE(!z.empty());
    for (const auto& [ring, p] : std::vector<std::pair<std::string, long long>>{{"Q", 0}, {"Z/2", 2}, {"Z/3", 3}}) {
      CAPTURE(ring);
      const auto rf = run("--ring " + ring + " --family " + family);
      CHECK(rf.status == 0);
      const auto f = parse(rf.text, ring);
      REQUIRE(f.size() == z.size());
      for (const auto& [name, x] : z) {
        CAPTURE(name);
        // dim H̃_k(X; F) = rank H̃_k + #{factors of H̃_k and of H̃_{k−1} divisible by char F}
        std::map<int, long long> predicted;
        for (const auto& [k, g] : x.h) {
          predicted[k] += g.rank;
          for (const auto& [t, count] : g.torsion)
            if (p != 0 && t % p == 0) predicted[k] += count, predicted[k + 1] += count;
        }
        std::map<int, long long> printed;
        for (const auto& [k, g] : f.at(name).h) printed[k] = g.rank;
        std::erase_if(predicted, [](const auto& e) { return e.second == 0; });
        CHECK(printed == predicted);
      }
    }
  }
}

TEST_CASE("torsion_hunt stops at its budget and rejects bad arguments") {
  const auto r = run("--ring Z --family matching --from 11 --to 12 --budget 0.001");
  INFO(r.text);
  CHECK(r.status == 0);
  CHECK(r.text.find("M(K_11)") != std::string::npos);
  CHECK(r.text.find("stopped at the budget of 0.001 s") != std::string::npos);
  CHECK(r.text.find("M(K_12)") == std::string::npos);  // nothing after a stop
  for (const char* bad : {"--ring Z/4", "--ring R", "--family trees", "--from x", "--from 5 --to 3", "--budget 0", "--to"}) {
    CAPTURE(bad);
    const auto b = run(bad);
    CHECK(b.status == 2);
    CHECK(b.text.rfind("torsion_hunt: ", 0) == 0);
  }
}

}  // namespace examples_torsion_hunt_test

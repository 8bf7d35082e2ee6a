// Certificates of reduced homology (`lacuna homology --reduced --certificate`), of the homology
// of a pair (`--relative SUB --certificate`) and of cohomology (`lacuna cohomology
// --certificate`), checked by the standalone certificate_check (with SUB for a pair): they
// check valid and state the textbook groups, the printed result is the one without
// --certificate, and edited files are refused naming the group (H~_k, H_k(X, A), H^k) and factor.
#include "run.hpp"

#include <fstream>
#include <regex>
#include <sstream>
#include <string>

namespace cli_certificate_kinds_test {

using namespace cli_test;

namespace {

result check(std::vector<std::string> args) { return run_program(checker().string(), args); }

// RP^2 as a CW complex (Hatcher 2002, Example 2.42, from memory: H_1 = Z/2).
constexpr const char* rp2 = "0 p\n1 q : p - p\n2 r : 2*q\n";
// S^0: two points.
constexpr const char* s0 = "0 a\n0 b\n";
// The five-vertex Möbius band (triangles {i, i+1, i+2} mod 5) and its boundary circle, the
// edges {i, i+2}.
constexpr const char* moebius = "0 1 2\n1 2 3\n2 3 4\n3 4 0\n4 0 1\n";
constexpr const char* rim = "0 2\n2 4\n4 1\n1 3\n3 0\n";
// A disk, the cone over a hexagon, and its rim.
constexpr const char* disk = "o 1 2\no 2 3\no 3 4\no 4 5\no 5 6\no 6 1\n";
constexpr const char* disk_rim = "1 2\n2 3\n3 4\n4 5\n5 6\n6 1\n";

/// Runs the tool with and without --certificate OUT: same output, status 0; returns OUT.
std::string certified(const temp_dir& d, std::vector<std::string> args, const std::string& name) {
  const auto out = (d.path() / name).string();
  const auto plain = run(args);
  REQUIRE(plain.status == 0);
  args.insert(args.begin() + 1, {"--certificate", out});
  const auto with = run(args);
  INFO(with.err);
  REQUIRE(with.status == 0);
  CHECK(with.out == plain.out);
  return out;
}

void valid(const result& r, const std::string& line) {
  INFO(r.out << r.err);
  CHECK(r.status == 0);
  CHECK(r.out.rfind("valid", 0) == 0);
  CHECK(r.out.find(line) != std::string::npos);
}

void refused(const result& r, const std::string& words) {
  INFO(r.out << r.err);
  CHECK(r.status == 1);
  CHECK(r.out.rfind("invalid: ", 0) == 0);
  CHECK(r.out.find(words) != std::string::npos);
}

}  // namespace

TEST_CASE("reduced homology: the certificate checks valid and states H~") {
  REQUIRE(std::filesystem::exists(checker()));
  temp_dir d;
  // Reduced homology: H~_0 has rank b_0 − 1, H~_k = H_k above (Hatcher 2002, §2.1, from memory).
  const auto f = d.write("rp2.cells", rp2);
  const auto c = certified(d, {"homology", "--quiet", "--reduced", f}, "rp2.json");
  CHECK(slurp(c).find("\"kind\": \"reduced\"") != std::string::npos);
  valid(check({f, c}), "H~_0: rank 0\n");
  valid(check({f, c}), "H~_1: rank 0, torsion 2\n");
  const auto p = d.write("s0.cells", s0);
  const auto cp = certified(d, {"homology", "--quiet", "--reduced", p}, "s0.json");
  valid(check({p, cp}), "H~_0: rank 1\n");
  // Over Z/2 too.
  const auto c2 = certified(d, {"homology", "--quiet", "--reduced", "--coefficients", "Z/2", f}, "rp2.z2.json");
  valid(check({f, c2}), "H~_2: rank 1\n");
  // H~_0 of S^0 claimed as rank 2 with a second generator: refused by the rank witnesses.
  std::string t = slurp(cp);
  t = std::regex_replace(t, std::regex("\"dimension\": 0, \"rank\": 1"), "\"dimension\": 0, \"rank\": 2");
  const auto at = t.find("{\"order\": 0");
  REQUIRE(at != std::string::npos);
  t.insert(at, "{\"order\": 0, \"chain\": [[1, \"a\"]], \"cocycle\": []},\n      ");
  refused(check({p, d.write("s0.bad.json", t)}), "H̃_0");
}

TEST_CASE("relative homology: the certificate is checked with SUB on the quotient") {
  temp_dir d;
  // The Möbius band M rel its boundary circle: 0, Z/2, 0 (the long exact sequence of the pair:
  // H_1(∂M) → H_1(M) is multiplication by 2, so H_1(M, ∂M) = Z/2 and H_2(M, ∂M) = 0).
  const auto m = d.write("m.facets", moebius);
  const auto a = d.write("rim.facets", rim);
  const auto c = certified(d, {"homology", "--quiet", "--relative", a, m}, "m.json");
  const std::string good = slurp(c);
  CHECK(good.find("\"kind\": \"relative\"") != std::string::npos);
  CHECK(good.find("\"subcomplex\"") != std::string::npos);
  valid(check({m, c, a}), "H_1(X, A): rank 0, torsion 2\n");
  valid(check({m, c, a}), "H_2(X, A): rank 0\n");
  // Without SUB: unreadable as a check (exit status 2), naming SUB.
  CHECK(expect_error(check({m, c})).find("SUB") != std::string::npos);
  // Against another subcomplex (one vertex): the witnesses name cells of A or fail.
  const auto point = d.write("point.facets", "0\n");
  CHECK(check({m, c, point}).status != 0);
  // Z/2 claimed as Z/4.
  refused(check({m, d.write("m4.json", std::regex_replace(std::regex_replace(good, std::regex("\"torsion\": \\[2\\]"),
                                                                             "\"torsion\": [4]"),
                                                          std::regex("\"order\": 2"), "\"order\": 4")),
                 a}),
          "H_1(X, A) torsion factor 0 (order 4)");
  // H_2(D^2, S^1) = Z (Hatcher 2002, Example 2.23, from memory).
  const auto x = d.write("disk.facets", disk);
  const auto s = d.write("disk_rim.facets", disk_rim);
  const auto cd = certified(d, {"homology", "--quiet", "--relative", s, x}, "disk.json");
  valid(check({x, cd, s}), "H_2(X, A): rank 1\n");
  valid(check({x, cd, s}), "H_1(X, A): rank 0\n");
  // The same with a .cells pair: RP^2 rel its 1-skeleton (p, q): H_2 = Z (one 2-cell, no relative
  // boundary: 2q lies in A), H_1 = H_0 = 0.
  const auto f = d.write("rp2.cells", rp2);
  const auto sub = d.write("sk.cells", "0 p\n1 q : p - p\n");
  const auto cc = certified(d, {"homology", "--quiet", "--relative", sub, f}, "rp2rel.json");
  valid(check({f, cc, sub}), "H_2(X, A): rank 1\n");
}

TEST_CASE("cohomology: the certificate checks valid and states H^k") {
  temp_dir d;
  // H^1(RP^2) = 0 and H^2(RP^2) = Z/2 (universal coefficients: Ext(H_1, Z) = Z/2; Hatcher 2002,
  // Theorem 3.2, from memory).
  const auto f = d.write("rp2.cells", rp2);
  const auto c = certified(d, {"cohomology", "--quiet", f}, "rp2.json");
  const std::string good = slurp(c);
  CHECK(good.find("\"kind\": \"cohomology\"") != std::string::npos);
  valid(check({f, c}), "H^1: rank 0\n");
  valid(check({f, c}), "H^2: rank 0, torsion 2\n");
  refused(check({f, d.write("rp2.4.json", std::regex_replace(std::regex_replace(good, std::regex("\"torsion\": \\[2\\]"),
                                                                                "\"torsion\": [4]"),
                                                             std::regex("\"order\": 2"), "\"order\": 4"))}),
          "H^2 torsion factor 0 (order 4)");
  // Read as a certificate of homology (the "kind" key removed), it does not check.
  const auto plain = d.write("rp2.homology.json", std::regex_replace(good, std::regex(",\n  \"kind\": \"cohomology\""), ""));
  CHECK(check({f, plain}).status != 0);
  // The sphere over Z/2: 1, 0, 1.
  const auto s = d.write("sphere.facets", "n e w\nn e s\nn w s\ne w s\n");
  const auto cs = certified(d, {"cohomology", "--quiet", "--coefficients", "Z/2", s}, "sphere.json");
  valid(check({s, cs}), "H^2: rank 1\n");
}

TEST_CASE("--certificate with combinations that stay unsupported is refused with a reason") {
  temp_dir d;
  const auto f = d.write("rp2.cells", rp2);
  const auto sub = d.write("sub.cells", "0 p\n");
  const auto out = (d.path() / "c.json").string();
  CHECK(expect_error(run({"homology", "--reduced", "--relative", sub, "--certificate", out, f})).find("--reduced") !=
        std::string::npos);
  CHECK(expect_error(run({"cohomology", "--coefficients", "Q", "--certificate", out, f})).find("Z and Z/2") !=
        std::string::npos);
  CHECK(expect_error(run({"cohomology", "--relative", sub, "--certificate", out, f})).find("--relative") !=
        std::string::npos);
}

}  // namespace cli_certificate_kinds_test

// `lacuna homology --certificate OUT.json` and the standalone checker certificate_check
// (examples/certificate_check.cpp): certificates of textbook spaces written by the tool check
// valid, and edited certificates — a torsion factor changed (the Z/2 → Z/4 of the report), a
// generator removed, a cocycle value changed, a torsion summand left out — are refused, naming
// the group and the factor; a certificate without torsion witnesses is called incomplete.
#include "run.hpp"

#include <fstream>
#include <regex>
#include <sstream>
#include <string>

namespace cli_certificate_test {

using namespace cli_test;

namespace {

result check(const std::string& file, const std::string& cert) { return run_program(checker().string(), {file, cert}); }

// Hatcher 2002, §2.1 (from memory): RP^2 has H_1 = Z/2; the Klein bottle Z + Z/2.
constexpr const char* rp2 = "0 p\n1 q : p - p\n2 r : 2*q\n";
constexpr const char* klein = "0 v\n1 a : v - v\n1 b : 0\n2 sq : a + b + a - b\n";
// The boundary of a tetrahedron: a 2-sphere.
constexpr const char* sphere = "n e w\nn e s\nn w s\ne w s\n";

}  // namespace

TEST_CASE("certificates written by the tool check valid, and the printed result is unchanged") {
  REQUIRE(std::filesystem::exists(checker()));
  temp_dir d;
  for (const auto& [name, text] : {std::pair{"rp2.cells", rp2}, std::pair{"klein.cells", klein},
                                   std::pair{"sphere.facets", sphere}}) {
    const auto file = d.write(name, text);
    const auto cert = (d.path() / (std::string(name) + ".json")).string();
    const auto plain = run({"homology", "--quiet", file});
    const auto with = run({"homology", "--quiet", "--certificate", cert, file});
    CHECK(with.status == 0);
    CHECK(with.out == plain.out);
    const auto c = check(file, cert);
    INFO(c.out << c.err);
    CHECK(c.status == 0);
    CHECK(c.out.rfind("valid", 0) == 0);
    // over Z/2 too
    const auto cert2 = (d.path() / (std::string(name) + ".z2.json")).string();
    CHECK(run({"homology", "--quiet", "--coefficients", "Z/2", "--certificate", cert2, file}).status == 0);
    CHECK(check(file, cert2).status == 0);
  }
}

TEST_CASE("edited certificates are refused, naming the group and factor") {
  temp_dir d;
  const auto file = d.write("klein.cells", klein);
  const auto cert = (d.path() / "klein.json").string();
  REQUIRE(run({"homology", "--quiet", "--certificate", cert, file}).status == 0);
  const std::string good = slurp(cert);
  auto refused = [&](const std::string& edited, const std::string& words) {
    const auto bad = d.write("bad.json", edited);
    REQUIRE(edited != good);
    const auto r = check(file, bad);
    INFO(r.out << r.err);
    CHECK(r.status == 1);
    CHECK(r.out.rfind("invalid: ", 0) == 0);
    CHECK(r.out.find(words) != std::string::npos);
  };
  // Z/2 claimed as Z/4 (both the torsion list and the generator's order).
  refused(std::regex_replace(std::regex_replace(good, std::regex("\"torsion\": \\[2\\]"), "\"torsion\": [4]"),
                             std::regex("\"order\": 2"), "\"order\": 4"),
          "H_1 torsion factor 0 (order 4)");
  // The free generator of H_1 removed (rank 0): the rank witnesses see it.
  {
    std::string t = std::regex_replace(good, std::regex("\"dimension\": 1, \"rank\": 1"), "\"dimension\": 1, \"rank\": 0");
    const auto a = t.find("{\"order\": 0", t.find("\"dimension\": 1"));
    const auto b = t.find("{\"order\": 2", a);
    REQUIRE(a != std::string::npos);
    REQUIRE(b != std::string::npos);
    t.erase(a, b - a);
    refused(t, "H_1: the rank witnesses bound the free rank by 1");
  }
  // A coefficient of the torsion generator's cocycle changed from 1 to 3 is still a unit mod 2:
  // fine; changed to 2 it is not.
  {
    const auto at = good.find("\"cocycle\": [[", good.find("{\"order\": 2"));
    REQUIRE(at != std::string::npos);
    std::string t = good;
    const auto num = at + std::string("\"cocycle\": [[").size();
    const auto end = t.find(',', num);
    t.replace(num, end - num, "2");
    refused(t, "H_1 torsion factor 0 (order 2)");
  }
  // Files that are not certificates: exit status 2, one line.
  const auto junk = d.write("junk.json", "{\"certificate\": \"lacuna homology certificate 1\", \"coefficients\": \"Z\", \"groups\": [");
  CHECK(expect_error(check(file, junk)).find("junk.json") != std::string::npos);
  const auto order = d.write("order.json", std::regex_replace(good, std::regex("\"order\": 2"), "\"order\": 4"));
  CHECK(expect_error(check(file, order)).find("order 4") != std::string::npos);
}

TEST_CASE("a certificate that leaves out a torsion summand is refused by the standalone checker") {
  temp_dir d;
  const auto file = d.write("rp2.cells", rp2);
  const auto cert = (d.path() / "rp2.json").string();
  REQUIRE(run({"homology", "--quiet", "--certificate", cert, file}).status == 0);
  const std::string good = slurp(cert);
  REQUIRE(good.find("\"torsion_witnesses\"") != std::string::npos);
  REQUIRE(check(file, cert).status == 0);
  // H_1 = Z/2 (Hatcher 2002, §2.1) claimed as 0: the factor and its generator removed.
  std::string t = good;
  const std::string group = "{\"dimension\": 1, \"rank\": 0, \"torsion\": [2], \"generators\": [";
  const auto a = t.find(group);
  REQUIRE(a != std::string::npos);
  const auto end = t.find("\n    ]}", a);
  REQUIRE(end != std::string::npos);
  t.replace(a, end + std::string("\n    ]}").size() - a, "{\"dimension\": 1, \"rank\": 0, \"torsion\": [], \"generators\": []}");
  const auto bad = d.write("dropped.json", t);
  const auto r = check(file, bad);
  INFO(r.out << r.err);
  CHECK(r.status == 1);
  CHECK(r.out.rfind("invalid: H_1: the torsion witness", 0) == 0);
  CHECK(r.out.find("minors is 2, not the product 1") != std::string::npos);
  // The same certificate without its torsion witnesses (the layout before them): every other
  // check passes, and the checker says the torsion is not proved complete (exit status 3).
  const auto key = good.find(",\n  \"torsion_witnesses\"");
  REQUIRE(key != std::string::npos);
  const auto old = d.write("old.json", good.substr(0, key) + "\n}\n");
  const auto o = check(file, old);
  INFO(o.out << o.err);
  CHECK(o.status == 3);
  CHECK(o.out.rfind("incomplete: ", 0) == 0);
  CHECK(o.out.find("no torsion witnesses") != std::string::npos);
  // A torsion witness naming a cell the input does not have: unreadable (exit status 2).
  const auto pos = good.find("\"minors\": [{\"rows\": [\"q\"]");
  REQUIRE(pos != std::string::npos);
  std::string u = good;
  u.replace(pos, std::string("\"minors\": [{\"rows\": [\"q\"]").size(), "\"minors\": [{\"rows\": [\"x\"]");
  CHECK(expect_error(check(file, d.write("unknown.json", u))).find("no 1-cell is named \"x\"") != std::string::npos);
}

TEST_CASE("--certificate is refused where no certificate is offered") {
  temp_dir d;
  const auto file = d.write("rp2.cells", rp2);
  const auto out = (d.path() / "c.json").string();
  CHECK(expect_error(run({"homology", "--coefficients", "Q", "--certificate", out, file})).find("Z and Z/2") !=
        std::string::npos);
  // --relative, --reduced and cohomology are certified too: tests/cli/certificate_kinds.cpp.
  CHECK(expect_error(run({"homology", "--certificate", (d.path() / "no" / "c.json").string(), file}))
            .find("cannot be written") != std::string::npos);
}

}  // namespace cli_certificate_test

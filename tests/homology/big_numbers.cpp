// Torsion beyond 64 bits from int64 incidences, and factors near the int64 limit; the
// expected orders come from elementary algebra done here in boost::multiprecision::cpp_int
// (never from the engine).
#include "support.hpp"

#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <boost/multiprecision/cpp_int.hpp>

namespace homology_big_numbers_test {

using namespace lacuna_test;
using boost::multiprecision::cpp_int;
using lacuna::cell_list;
using lacuna::integer;

namespace {
constexpr std::int64_t p1 = 1000000007, p2 = 998244353;  // both prime (from memory)

cpp_int pow2(unsigned e) { return cpp_int(1) << e; }

/// ⟨a, b | s·a = b, s·b = 0⟩ as a 2-complex: H_1 = Z/s^2 (b = s·a, so a has order s^2 and
/// generates; elementary), H_2 = 0.
cell_list square_chain(std::int64_t s) {
  cell_list c;
  c.add_cell(0, "v");
  c.add_cell(1, "a", {{0, 1}, {0, -1}});
  c.add_cell(1, "b", {{0, 1}, {0, -1}});
  c.add_cell(2, "R", {{0, s}, {1, -1}});
  c.add_cell(2, "S", {{1, s}});
  return c;
}
}  // namespace

TEST_CASE("Z/2^70 and Z/2^124 from coefficients 2^35 and 2^62") {
  for (unsigned e : {35u, 62u}) {
    CAPTURE(e);
    const auto c = square_chain(std::int64_t{1} << e);
    const auto g = all_variants<integer>(c);
    REQUIRE(g.size() == 3);
    CHECK(g[0] == group{1, {}});
    CHECK(g[1] == group{0, {pow2(2 * e).str()}});
    CHECK(g[2] == group{0, {}});
    // UCT: over Z/2 the factor shows in H_1 and H_2, over Z/3 and Q it does not.
    const auto rep = lacuna::check_universal_coefficients<2, 3>(c);
    CHECK(rep.ok());
    CHECK(all_variants<lacuna::mod_p<2>>(c) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
    CHECK(all_variants<lacuna::mod_p<3>>(c) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
    // Cohomology: H^2 = Ext(H_1, Z) = Z/2^(2e) (Hatcher 2002, Theorem 3.2).
    const auto co = all_variants<integer>(c, true);
    CHECK(co[2] == group{0, {pow2(2 * e).str()}});
  }
  // One dimension up: H_2 = Z/2^70 from 3-cells on two 2-spheres.
  cell_list c;
  c.add_cell(0, "v");
  c.add_cell(2, "S");
  c.add_cell(2, "T");
  c.add_cell(3, "X", {{0, std::int64_t{1} << 35}, {1, -1}});
  c.add_cell(3, "Y", {{1, std::int64_t{1} << 35}});
  CHECK(all_variants<integer>(c) == std::vector<group>{{1, {}}, {0, {}}, {0, {pow2(70).str()}}, {0, {}}});
  CHECK(lacuna::check_universal_coefficients<2, 5>(c).ok());
}

TEST_CASE("a factor 1000000007 · 998244353, and its pieces") {
  const std::int64_t n = p1 * p2;  // 998244359987710471 < 2^63
  REQUIRE(cpp_int(p1) * p2 == cpp_int(n));
  {
    cell_list c = cell_list::circle();
    c.add_cell(2, "D", {{0, n}});
    CHECK(all_variants<integer>(c) == std::vector<group>{{1, {}}, {0, {std::to_string(n)}}, {0, {}}});
    // The UCT through mod_p at both primes: dimension 1 in H_1 and H_2.
    CHECK(all_variants<lacuna::mod_p<p1>>(c) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
    CHECK(all_variants<lacuna::mod_p<p2>>(c) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
    CHECK(lacuna::check_universal_coefficients<p1, p2, 2>(c).ok());
  }
  {
    // Z/p1 + Z/p2 = Z/(p1 p2) in invariant factors (Chinese remainder theorem).
    cell_list c;
    c.add_cell(0, "v");
    c.add_cell(1, "a", {{0, 1}, {0, -1}});
    c.add_cell(1, "b", {{0, 1}, {0, -1}});
    c.add_cell(2, "A", {{0, p1}});
    c.add_cell(2, "B", {{1, p2}});
    CHECK(all_variants<integer>(c) == std::vector<group>{{1, {}}, {0, {std::to_string(n)}}, {0, {}}});
  }
  {
    // p1·a = 0 and p2·a = 0 with gcd 1: a = 0, and the relation module has rank 2 on one
    // generator, so H_2 = Z (the kernel of (p1 p2)).
    cell_list c = cell_list::circle();
    c.add_cell(2, "A", {{0, p1}});
    c.add_cell(2, "B", {{0, p2}});
    CHECK(all_variants<integer>(c) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  }
}

TEST_CASE("2x2 relation matrices near 2^62: d_1 = gcd of entries, d_1 d_2 = |det|") {
  // The Smith form of a 2x2 integer matrix (Newman, Integral Matrices, 1972, Ch. II; from
  // memory): d_1 = gcd of the entries, d_1 d_2 = |det|; the determinant needs ~125 bits.
  const std::int64_t top = (std::int64_t{1} << 62) - 1;
  const std::vector<std::array<std::int64_t, 4>> ms{
      {top, top - 2, top - 6, top - 12},
      {top - 56, 3 * p1, 5 * p2, top - 100},
      {6 * (top / 7), 6 * (top / 11), 6 * (top / 13), 6 * (top / 17)},
  };
  for (const auto& m : ms) {
    cell_list c;
    c.add_cell(0, "v");
    c.add_cell(1, "a", {{0, 1}, {0, -1}});
    c.add_cell(1, "b", {{0, 1}, {0, -1}});
    c.add_cell(2, "R", {{0, m[0]}, {1, m[1]}});
    c.add_cell(2, "S", {{0, m[2]}, {1, m[3]}});
    cpp_int det = cpp_int(m[0]) * m[3] - cpp_int(m[1]) * m[2];
    if (det < 0) det = -det;
    cpp_int d1 = gcd(gcd(cpp_int(m[0]), cpp_int(m[1])), gcd(cpp_int(m[2]), cpp_int(m[3])));
    REQUIRE(det != 0);
    std::vector<std::string> want;
    if (d1 != 1) want.push_back(d1.str());
    want.push_back(cpp_int(det / d1).str());
    CHECK(all_variants<integer>(c) == std::vector<group>{{1, {}}, {0, want}, {0, {}}});
  }
}

}  // namespace homology_big_numbers_test

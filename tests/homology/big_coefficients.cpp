// Incidence numbers beyond int64, end to end: a .cells file with the coefficient 2^70, read
// exactly, through the engine over Z (int64 fast path, then the widening to lacuna::integer),
// Q, Z/2, Z/3, Z/65521, cohomology, every elimination variant, boundary matrices and
// elimination_workspace over the rings directly. Expected values, each from:
//   * the Moore space M(Z/n, 1) = S^1 ∪_n e^2 has H_0 = Z, H_1 = Z/n, H_2 = 0 (cellular
//     homology: ∂_2 = n, ∂_1 = 0; Hatcher, Algebraic Topology, 2002, Example 2.40 for the
//     idea — from memory);
//   * over a field F_p: dim H_1 = dim H_2 = 1 if p | n, else 0 (universal coefficients,
//     Hatcher 2002, Theorem 3A.3 — from memory); over Q: a point in dimensions >= 1;
//   * H^2 = Ext(H_1, Z) = Z/n, H^1 = Hom(H_1, Z) = 0 (Hatcher 2002, Theorem 3.2);
//   * residues of 2^70 by hand: 2^70 = 4^35 = 1 (mod 3); 2^70 = (2^3)^23 * 2 = 2 (mod 7).
#include "support.hpp"

#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <boost/multiprecision/cpp_int.hpp>

#include <cstdint>
#include <limits>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

namespace homology_big_coefficients_test {

using namespace lacuna_test;
using boost::multiprecision::cpp_int;
using lacuna::cell_list;
using lacuna::integer;

namespace {
const std::string two70 = "1180591620717411303424";  // 2^70 (cpp_int(1) << 70, checked below)

cell_list read(const std::string& text) {
  std::istringstream in(text);
  return lacuna::io::read_cells(in, "moore.cells");
}

/// M(Z/n, 1) as a .cells file, n a decimal string.
cell_list moore(const std::string& n) { return read("0 p\n1 q : p - p\n2 r : " + n + "*q\n"); }

/// The groups by the sparse default, Markowitz only and the dense reference, with and
/// without generators; they must agree. (verify_generators reads incidences as int64, so
/// the generators are checked here by hand instead.)
template <class R, class C>
std::vector<group> variants(const C& c, bool co = false, const R& unit = lacuna::one<R>()) {
  const auto run = [&](const auto& alg, bool gens) {
    const lacuna::homology_options o{.generators = gens};
    return co ? lacuna::cohomology<R>(c, o, alg, unit) : lacuna::homology<R>(c, o, alg, unit);
  };
  const auto g0 = groups_of(run(lacuna::sparse_elimination{}, true));
  CHECK(groups_of(run(lacuna::sparse_elimination{}, false)) == g0);
  CHECK(groups_of(run(markowitz_only(), true)) == g0);
  CHECK(groups_of(run(lacuna::dense_elimination{}, true)) == g0);
  CHECK(groups_of(run(lacuna::dense_elimination{}, false)) == g0);
  return g0;
}
}  // namespace

TEST_CASE("M(Z/2^70, 1) from a .cells file: H_1 = Z/2^70 over Z, and the universal coefficients") {
  REQUIRE((cpp_int(1) << 70).str() == two70);
  const auto c = moore(two70);
  CHECK(c.has_big_coefficients(2));
  lacuna::validate(c);  // ∂∂r = 2^70 ∂q = 0
  CHECK(variants<integer>(c) == std::vector<group>{{1, {}}, {0, {two70}}, {0, {}}});
  CHECK(variants<lacuna::z2>(c) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  CHECK(variants<lacuna::mod_p<2>>(c) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  CHECK(variants<lacuna::mod_p<3>>(c) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(variants<lacuna::rational>(c) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});
  CHECK(variants<lacuna::mod_p_dynamic>(c, false, lacuna::mod_p_dynamic(1, 65521)) ==
        std::vector<group>{{1, {}}, {0, {}}, {0, {}}});  // 65521 is odd: it does not divide 2^70
  CHECK(lacuna::check_universal_coefficients<2, 3, 5>(c).ok());
  // cohomology: H^1 = 0, H^2 = Ext(Z/2^70, Z) = Z/2^70
  CHECK(variants<integer>(c, true) == std::vector<group>{{1, {}}, {0, {}}, {0, {two70}}});
  // the generator of H_1 is ±q, of order 2^70: 2^70 q = ∂r
  const auto h = lacuna::homology<integer>(c, {.generators = true});
  REQUIRE(h[1].generators.size() == 1);
  CHECK(h[1].orders[0] == integer(integer::big_type(two70)));
  REQUIRE(h[1].generators[0].terms.size() == 1);
  CHECK(h[1].generators[0].terms[0].cell == 0);
  CHECK(abs(h[1].generators[0].terms[0].coefficient) == integer(1));
  // over Z/2, H_2 is spanned by r: ∂r = 2^70 q = 0 mod 2
  const auto h2 = lacuna::homology<lacuna::z2>(c, {.generators = true});
  REQUIRE(h2[2].generators.size() == 1);
  REQUIRE(h2[2].generators[0].terms.size() == 1);
  CHECK(h2[2].generators[0].terms[0].cell == 0);
}

TEST_CASE("big coefficients that cancel, that meet small ones, and -2^63 - 1") {
  // 2^70*q - (2^70 - 6)*q = 6*q: H_1 = Z/6, read in one line and added up exactly
  CHECK(variants<integer>(read("0 p\n1 q : p - p\n2 r : " + two70 + "*q - 1180591620717411303418*q\n")) ==
        std::vector<group>{{1, {}}, {0, {"6"}}, {0, {}}});
  // two 2-cells 2^70*q and 3*q: H_1 = Z/gcd(2^70, 3) = 0, H_2 = ker [2^70 3] = Z
  const auto two = read("0 p\n1 q : p - p\n2 r : " + two70 + "*q\n2 s : 3*q\n");
  CHECK(variants<integer>(two) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  // over Z/2: ∂ = [0 1], so H_1 = 0, H_2 = Z/2 (r); over Z/3: ∂ = [1 0], so H_2 = Z/3 (s)
  CHECK(variants<lacuna::z2>(two) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  CHECK(variants<lacuna::mod_p<3>>(two) == std::vector<group>{{1, {}}, {0, {}}, {1, {}}});
  // the negative side: -(2^63 + 1) is just beyond int64, and 2^63 + 1 = 3 * 3074457345618258603
  const auto neg = moore("9223372036854775809");
  CHECK(variants<integer>(read("0 p\n1 q : p - p\n2 r : -9223372036854775809*q\n")) ==
        std::vector<group>{{1, {}}, {0, {"9223372036854775809"}}, {0, {}}});
  CHECK(variants<lacuna::mod_p<3>>(neg) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  REQUIRE(cpp_int("9223372036854775809") == cpp_int(3) * cpp_int("3074457345618258603"));
}

TEST_CASE("boundary_matrix and elimination_workspace map big incidences into R exactly") {
  const auto c = moore(two70);
  const auto z = lacuna::boundary_matrix<integer>(c, 2);
  REQUIRE(z.columns[0].size() == 1);
  CHECK(z.columns[0][0].value == integer(integer::big_type(two70)));
  CHECK(lacuna::boundary_matrix<lacuna::z2>(c, 2).nonzeros() == 0);  // 2^70 = 0 mod 2
  const auto m3 = lacuna::boundary_matrix<lacuna::mod_p<3>>(c, 2);
  REQUIRE(m3.columns[0].size() == 1);
  CHECK(m3.columns[0][0].value == lacuna::mod_p<3>(1));  // 2^70 = 1 mod 3
  const auto m7 = lacuna::boundary_matrix<lacuna::mod_p<7>>(c, 2);
  CHECK(m7.columns[0][0].value == lacuna::mod_p<7>(2));  // 2^70 = 2 mod 7
  CHECK(lacuna::boundary_matrix<lacuna::rational>(c, 2).columns[0][0].value ==
        lacuna::rational(cpp_int(two70), cpp_int(1)));
  // the fast path refuses to hold it: coefficient_overflow, which makes the engine widen
  CHECK_THROWS_AS(lacuna::boundary_matrix<lacuna::checked_int64>(c, 2), lacuna::coefficient_overflow);
  CHECK_THROWS_AS(lacuna::elimination_workspace<lacuna::checked_int64>::build(c), lacuna::coefficient_overflow);
  const auto rc = lacuna::elimination_workspace<integer>::build(c);
  REQUIRE(rc.boundary(2, 0).size() == 1);
  CHECK(rc.boundary(2, 0)[0].value == integer(integer::big_type(two70)));
  const auto r3 = lacuna::elimination_workspace<lacuna::mod_p<3>>::build(c);
  CHECK(r3.boundary(2, 0)[0].value == lacuna::mod_p<3>(1));
  // the dual (cohomology) layout carries the same value
  const auto dual = lacuna::elimination_workspace<integer>::build(c, {.dual = true});
  CHECK(dual.boundary(0, 0).empty());        // level 0 = dimension 2: r has no coboundary
  REQUIRE(dual.boundary(1, 0).size() == 1);  // level 1 = dimension 1: the coboundary of q is 2^70 r
  CHECK(dual.boundary(1, 0)[0].value == integer(integer::big_type(two70)));
}

namespace user {
/// A complex given by int64 terms whose repeated faces add up beyond int64.
struct repeated {};
inline int top_dimension(const repeated&) { return 2; }
inline std::size_t cell_count(const repeated&, int k) { return k >= 0 && k <= 2 ? 1 : 0; }
inline std::vector<lacuna::incidence> boundary(const repeated&, int k, std::size_t) {
  constexpr auto big = std::numeric_limits<std::int64_t>::max();
  if (k == 2) return {{0, big}, {0, big}};  // (2^63 - 1) + (2^63 - 1) = 2^64 - 2
  return {};
}
/// A complex with lacuna::integer coefficients of its own (pairs), adapted by ADL.
struct exact {};
inline int top_dimension(const exact&) { return 2; }
inline std::size_t cell_count(const exact&, int k) { return k >= 0 && k <= 2 ? 1 : 0; }
inline std::vector<std::pair<std::size_t, integer>> boundary(const exact&, int k, std::size_t) {
  if (k == 2) return {{0, integer(integer::big_type(1) << 100)}};  // 2^100
  return {};
}
}  // namespace user

TEST_CASE("other complexes: int64 sums beyond int64, and integer coefficients of their own") {
  static_assert(lacuna::cell_complex<user::repeated> && lacuna::cell_complex<user::exact>);
  // 2^64 - 2 = 18446744073709551614 (by hand: 2 * (2^63 - 1)); before, this was refused
  CHECK(variants<integer>(user::repeated{}) == std::vector<group>{{1, {}}, {0, {"18446744073709551614"}}, {0, {}}});
  CHECK(variants<lacuna::mod_p<3>>(user::repeated{}) == std::vector<group>{{1, {}}, {0, {}}, {0, {}}});  // 2^64 - 2 = 1 - 2 = 2 mod 3
  CHECK(lacuna::boundary_matrix<integer>(user::repeated{}, 2).columns[0][0].value ==
        integer(integer::big_type("18446744073709551614")));
  CHECK(variants<integer>(user::exact{}) ==
        std::vector<group>{{1, {}}, {0, {(cpp_int(1) << 100).str()}}, {0, {}}});
  CHECK(variants<lacuna::z2>(user::exact{}) == std::vector<group>{{1, {}}, {1, {}}, {1, {}}});
  lacuna::validate(user::exact{});
  // write_cells writes such a complex exactly, and it reads back the same
  std::ostringstream out;
  lacuna::io::write_cells(out, user::exact{});
  CHECK(out.str() == "0 e0_0\n1 e1_0 : 0\n2 e2_0 : " + (cpp_int(1) << 100).str() + "*e1_0\n");
  CHECK(variants<integer>(read(out.str())) == variants<integer>(user::exact{}));
}

}  // namespace homology_big_coefficients_test

// Tests of lacuna/complex/validate.hpp on complexes adapted through ADL free functions:
// a broken complex is caught, and the error names the cell by dimension, index and name.
#include <doctest/doctest.h>

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstdint>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace complex_validate_test {

namespace user {
/// A complex given as plain vectors, adapted by ADL free functions.
struct chains {
  std::vector<std::vector<std::vector<std::pair<std::size_t, long>>>> d;  // [k][i] -> terms
};
inline int top_dimension(const chains& c) { return static_cast<int>(c.d.size()) - 1; }
inline std::size_t cell_count(const chains& c, int k) {
  return k >= 0 && k < static_cast<int>(c.d.size()) ? c.d[static_cast<std::size_t>(k)].size() : 0;
}
inline const std::vector<std::pair<std::size_t, long>>& boundary(const chains& c, int k, std::size_t i) {
  return c.d[static_cast<std::size_t>(k)][i];
}
inline std::string cell_name(const chains&, int k, std::size_t i) {
  return std::string(1, static_cast<char>('a' + k)) + std::to_string(i);
}
}  // namespace user

static_assert(lacuna::cell_complex<user::chains>);

namespace {
// A triangle: vertices a0 a1 a2, edges b0 = a1 - a0, b1 = a2 - a1, b2 = a2 - a0, face c0.
user::chains triangle(std::vector<std::pair<std::size_t, long>> face) {
  return {{{{}, {}, {}}, {{{1, 1}, {0, -1}}, {{2, 1}, {1, -1}}, {{2, 1}, {0, -1}}}, {std::move(face)}}};
}
}  // namespace

TEST_CASE("a valid adapted complex passes") {
  lacuna::validate(triangle({{0, 1}, {1, 1}, {2, -1}}));  // ∂c0 = b0 + b1 - b2, ∂∂ = 0 by hand
  lacuna::validate(user::chains{});
}

TEST_CASE("∂∂ != 0 is caught and the cell is named") {
  try {
    lacuna::validate(triangle({{0, 1}, {1, 1}, {2, 1}}));  // ∂∂ = 2 a2 - 2 a0
    FAIL("must throw");
  } catch (const lacuna::invalid_complex& e) {
    CHECK(std::string(e.what()) ==
          "the boundary of the boundary of 2-cell 0 ('c0') is not zero: coefficient -2 on 0-cell 0 ('a0')");
    CHECK(e.dimension() == 2);
    CHECK(e.index() == 0);
  }
}

TEST_CASE("faces out of range and non-zero boundaries of 0-cells are caught") {
  CHECK_THROWS_WITH_AS(lacuna::validate(triangle({{0, 1}, {7, 1}})),
                       "2-cell 0 ('c0') has face 7, but there are only 3 1-cells", lacuna::invalid_complex);
  user::chains p{{{{{0, 1}}}}};
  CHECK_THROWS_WITH_AS(lacuna::validate(p), "0-cell 0 ('a0') has a non-zero boundary", lacuna::invalid_complex);
  user::chains e = triangle({{0, 1}, {1, 1}, {2, -1}});
  e.d[1][1] = {{9, 1}};  // caught at the edge, before the face that uses it
  CHECK_THROWS_WITH_AS(lacuna::validate(e), "1-cell 1 ('b1') has face 9, but there are only 3 0-cells",
                       lacuna::invalid_complex);
}

TEST_CASE("huge coefficients: ∂∂ computed without overflow") {
  constexpr long big = std::numeric_limits<long>::max();
  // ∂b0 = big*(a1 - a0), ∂c0 = big*b0 - big*b0': the products big*big would overflow int64
  user::chains c{{{{}, {}}, {{{1, big}, {0, -big}}, {{1, big}, {0, -big}}}, {{{0, big}, {1, -big}}}}};
  lacuna::validate(c);
  c.d[2][0] = {{0, big}, {1, big}};
  try {
    lacuna::validate(c);
    FAIL("must throw");
  } catch (const lacuna::invalid_complex& e) {
    // 2 * big * big = 2 * (2^63 - 1)^2 = 2^127 - 2^65 + 2 = 170141183460469231694793815568465002498 (by hand)
    CHECK(std::string(e.what()) ==
          "the boundary of the boundary of 2-cell 0 ('c0') is not zero: coefficient "
          "-170141183460469231694793815568465002498 on 0-cell 0 ('a0')");
  }
}

namespace user {
/// The same with lacuna::integer coefficients (a complex whose incidence numbers are exact).
struct exact_chains {
  std::vector<std::vector<std::vector<std::pair<std::size_t, lacuna::integer>>>> d;
};
inline int top_dimension(const exact_chains& c) { return static_cast<int>(c.d.size()) - 1; }
inline std::size_t cell_count(const exact_chains& c, int k) {
  return k >= 0 && k < static_cast<int>(c.d.size()) ? c.d[static_cast<std::size_t>(k)].size() : 0;
}
inline const std::vector<std::pair<std::size_t, lacuna::integer>>& boundary(const exact_chains& c, int k,
                                                                           std::size_t i) {
  return c.d[static_cast<std::size_t>(k)][i];
}
}  // namespace user

static_assert(lacuna::cell_complex<user::exact_chains>);

TEST_CASE("coefficients beyond int64: ∂∂ checked exactly") {
  using lacuna::integer;
  const integer two64 = integer(integer::big_type(1) << 64);  // 2^64
  // ∂b0 = a1 - a0, ∂c0 = 2^64*b0: ∂∂c0 = 2^64*a1 - 2^64*a0 ≠ 0, only because of a coefficient beyond int64
  user::exact_chains c{{{{}, {}}, {{{1, integer(1)}, {0, integer(-1)}}}, {{{0, two64}}}}};
  CHECK_THROWS_WITH_AS(lacuna::validate(c),
                       "the boundary of the boundary of 2-cell 0 ('e2_0') is not zero: coefficient "
                       "-18446744073709551616 on 0-cell 0 ('e0_0')",
                       lacuna::invalid_complex);
  // a second edge with the same boundary, and ∂c0 = 2^64*(b0 - b1): zero, exactly
  c.d[1].push_back({{1, integer(1)}, {0, integer(-1)}});
  c.d[2][0] = {{0, two64}, {1, -two64}};
  lacuna::validate(c);
  // big on both sides: ∂b = 2^64*(a1 - a0) and ∂c0 = 2^64*b0 - 2^64*b1 + b2 with ∂b2 = a1 - a0
  // gives 2^128 - 2^128 + 1 = 1 on a1; with b2 left out it is zero
  c.d[1] = {{{1, two64}, {0, -two64}}, {{1, two64}, {0, -two64}}, {{1, integer(1)}, {0, integer(-1)}}};
  c.d[2][0] = {{0, two64}, {1, -two64}};
  lacuna::validate(c);
  c.d[2][0].push_back({2, integer(1)});
  CHECK_THROWS_WITH_AS(lacuna::validate(c),
                       "the boundary of the boundary of 2-cell 0 ('e2_0') is not zero: coefficient -1 on 0-cell 0 ('e0_0')",
                       lacuna::invalid_complex);
  // the same through cell_list, whose 2-cells then store exact coefficients
  lacuna::cell_list l;
  l.add_cell(0, "p");
  l.add_cell(0, "w");
  l.add_cell(1, "q", {{0, 1}, {1, -1}});
  l.add_cell(2, "r", std::vector<lacuna::exact_incidence>{{0, two64}});
  CHECK_THROWS_WITH_AS(lacuna::validate(l),
                       "the boundary of the boundary of 2-cell 0 ('r') is not zero: coefficient 18446744073709551616 "
                       "on 0-cell 0 ('p')",
                       lacuna::invalid_complex);
}

TEST_CASE("sums of int64 products beyond 128 bits are added up exactly, not refused") {
  constexpr long big = std::numeric_limits<long>::max();
  // 4 * big * big ≈ 2^129 does not fit 128 bits: ∂c0 = big*(b0 + b1 + b2 + b3), ∂b_j = big*(a1 - a0)
  std::vector<std::pair<std::size_t, long>> edge{{1, big}, {0, -big}};
  user::chains c{{{{}, {}}, {edge, edge, edge, edge}, {{{0, big}, {1, big}, {2, big}, {3, big}}}}};
  // 4 * (2^63 - 1)^2 = 2^128 - 2^66 + 4 = 340282366920938463389587631136930004996 (by hand)
  CHECK_THROWS_WITH_AS(lacuna::validate(c),
                       "the boundary of the boundary of 2-cell 0 ('c0') is not zero: coefficient "
                       "-340282366920938463389587631136930004996 on 0-cell 0 ('a0')",
                       lacuna::invalid_complex);
  c.d[2][0] = {{0, big}, {1, big}, {2, -big}, {3, -big}};
  lacuna::validate(c);
}

}  // namespace complex_validate_test

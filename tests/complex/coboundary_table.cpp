// Tests of lacuna/complex/coboundary_table.hpp: the table is the transpose of the boundaries.
#include <doctest/doctest.h>

#include "support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/coboundary_table.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>

#include <map>
#include <tuple>

namespace complex_coboundary_table_test {

static_assert(lacuna::complex_with_coboundary<lacuna::coboundary_table<lacuna::cell_list>>);
static_assert(lacuna::complex_with_coboundary<lacuna::coboundary_table<lacuna::simplicial_complex<int>>>);

namespace {
template <class C>
void check_transpose(const C& c) {
  const lacuna::coboundary_table<C> t(c);
  std::map<std::tuple<int, std::size_t, std::size_t>, std::int64_t> from_boundary, from_table;
  for (int k = 1; k <= lacuna::top_dimension(c); ++k)
    for (std::size_t j = 0; j < lacuna::cell_count(c, k); ++j)
      for (const auto& e : lacuna::boundary(c, k, j)) {
        const auto f = lacuna::as_incidence(e);
        from_boundary[{k - 1, f.face, j}] += f.coefficient;
      }
  std::erase_if(from_boundary, [](const auto& kv) { return kv.second == 0; });
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      std::size_t last = 0;
      bool first = true;
      for (const auto& e : t.coboundary(k, i)) {
        CHECK((first || e.face > last));  // cofaces increase
        first = false;
        last = e.face;
        from_table[{k, i, e.face}] += e.coefficient;
      }
    }
  CHECK(from_boundary == from_table);
}
}  // namespace

TEST_CASE("coboundaries of the Delta-complex torus") {
  const auto t = lacuna::cell_list::torus();
  const lacuna::coboundary_table tab(t);
  // δa = U + L, δc = -U - L (Hatcher 2002, §2.1: ∂U = ∂L = a + b - c)
  REQUIRE(tab.coboundary(1, 0).size() == 2);
  CHECK(tab.coboundary(1, 0)[0] == lacuna::incidence{0, 1});
  CHECK(tab.coboundary(1, 0)[1] == lacuna::incidence{1, 1});
  CHECK(tab.coboundary(1, 2)[1] == lacuna::incidence{1, -1});
  CHECK(tab.coboundary(0, 0).empty());  // every edge is a loop: v - v = 0
  CHECK(tab.coboundary(2, 0).empty());
  CHECK(lacuna::cell_name(tab, 2, 1) == "L");
  check_transpose(t);
}

TEST_CASE("coboundaries are the transpose, on random complexes (fixed seeds)") {
  for (unsigned seed = 1; seed <= 8; ++seed) {
    const auto s = test_support::random_simplicial(seed, 9, 10, 5);
    check_transpose(s);
    check_transpose(lacuna::to_cell_list(s));
  }
}

namespace user {
struct repeated {};  // one 0-cell, one 1-cell whose boundary lists the vertex twice: 3p - 3p
inline int top_dimension(const repeated&) { return 1; }
inline std::size_t cell_count(const repeated&, int k) { return k == 0 || k == 1 ? 1 : 0; }
inline std::vector<lacuna::incidence> boundary(const repeated&, int k, std::size_t) {
  if (k == 1) return {{0, 3}, {0, -3}};
  return {};
}
}  // namespace user

TEST_CASE("repeated faces add up and cancelled terms vanish") {
  const user::repeated r;
  const lacuna::coboundary_table t(r);
  CHECK(t.coboundary(0, 0).empty());
}

}  // namespace complex_coboundary_table_test

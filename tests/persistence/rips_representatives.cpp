// The representative cocycles of the implicit Vietoris–Rips route
// (lacuna::implicit_rips_persistence_with_cocycles) judged without the engine. The theory is
// persistent cohomology (de Silva, Morozov & Vejdemo-Johansson 2011, "Dualities in persistent
// (co)homology"): a k-class of the barcode born at b and killed at d is represented by a
// k-cochain z that is a cocycle of K_t for b <= t < d and not a coboundary there, and the
// cocycles of the classes alive at t form a basis of H^k(K_t). Here the simplices of K_t are
// enumerated by brute force (every subset of the points, its value the largest distance of two
// of its points), and for every reported pair of random clouds it is checked that
//   - z is made of k-simplices within the threshold, each once, with non-zero coefficients;
//   - z has coefficient 1 on the birth simplex and (k >= 1) no simplex entering before it, in
//     the documented order (value, then combinatorial number decreasing);
//   - δz vanishes on every (k+1)-simplex entering before the death simplex, and not on the
//     death simplex (its value the death); for an essential class δz = 0 on every
//     (k+1)-simplex within the threshold;
//   - at every birth value t, and at the last value before every death, the cocycles of the
//     classes alive at t, restricted to K_t, are independent modulo the coboundaries of K_t,
//     and their number is dim H^k(K_t) = dim ker δ_k - rank δ_{k-1}, both ranks by a textbook
//     column elimination over the field written here.
// Independently of all that, for the regular n-gon (Adamaszek 2013: the Vietoris–Rips complex
// at the side length is the n-cycle, whose H_1 class is born there) the H_1 cocycle takes a unit
// value on the boundary cycle of the polygon; since <δf, c> = <f, ∂c> = 0 for a cycle c, a
// cochain with a non-zero value on a cycle is not a coboundary.
#include "circle_rips_theorem.hpp"

#include "random_clouds.hpp"

#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <limits>
#include <map>
#include <optional>
#include <random>
#include <set>
#include <utility>
#include <vector>

namespace persistence_rips_cocycles_test {

using simplex_t = std::vector<std::uint32_t>;  // points, increasing

struct simplex_info {
  simplex_t points;
  double value = 0;
  std::uint64_t number = 0;  // the combinatorial number, computed here from binomials
};

std::uint64_t binomial(std::uint64_t n, std::uint64_t k) {
  if (k > n) return 0;
  std::uint64_t r = 1;
  for (std::uint64_t i = 1; i <= k; ++i) r = r * (n - k + i) / i;
  return r;
}

/// Every k-simplex of the points of m whose value is at most `threshold`, by brute force.
std::vector<simplex_info> all_simplices(const lacuna::rips_metric& m, int k, double threshold) {
  std::vector<simplex_info> out;
  const auto n = static_cast<std::uint32_t>(m.size());
  simplex_t cur;
  auto rec = [&](auto&& self, std::uint32_t from) -> void {
    if (static_cast<int>(cur.size()) == k + 1) {
      simplex_info s{cur, 0.0, 0};
      for (std::size_t i = 0; i < cur.size(); ++i) {
        s.number += binomial(cur[i], i + 1);  // colexicographic rank (Knuth, TAOCP 4A, 7.2.1.3)
        for (std::size_t j = i + 1; j < cur.size(); ++j) s.value = std::max(s.value, m.distance(cur[i], cur[j]));
      }
      if (s.value <= threshold) out.push_back(std::move(s));
      return;
    }
    for (std::uint32_t v = from; v < n; ++v) {
      cur.push_back(v);
      self(self, v + 1);
      cur.pop_back();
    }
  };
  if (k >= 0) rec(rec, 0);
  return out;
}

/// a enters before b (same dimension), in the order implicit_rips.hpp documents.
bool before(const simplex_info& a, const simplex_info& b) {
  return a.value < b.value || (a.value == b.value && a.number > b.number);
}

template <class R>
using cochain_map = std::map<simplex_t, R>;

/// (δz)(tau) = sum_i (-1)^i z(tau without its i-th point).
template <class R>
R coboundary_at(const cochain_map<R>& z, const simplex_t& tau) {
  R sum = lacuna::zero<R>();
  for (std::size_t i = 0; i < tau.size(); ++i) {
    simplex_t face = tau;
    face.erase(face.begin() + static_cast<std::ptrdiff_t>(i));
    const auto f = z.find(face);
    if (f == z.end()) continue;
    sum = i % 2 == 0 ? sum + f->second : sum - f->second;
  }
  return sum;
}

/// Gaussian elimination by columns (each column reduced by the earlier ones with the same
/// lowest row): add() says whether a column is independent of those added before.
template <class R>
class column_rank {
 public:
  using column = std::map<std::size_t, R>;
  bool add(column c) {
    for (auto it = c.begin(); it != c.end();) it = it->second == lacuna::zero<R>() ? c.erase(it) : std::next(it);
    while (!c.empty()) {
      const auto low = std::prev(c.end());
      const auto found = by_low_.find(low->first);
      if (found == by_low_.end()) {
        by_low_.emplace(low->first, std::move(c));
        return true;
      }
      const column& other = found->second;
      const R factor = low->second * lacuna::inverse(std::prev(other.end())->second);
      for (const auto& [row, a] : other) {
        R& x = c[row];
        x = x - factor * a;
        if (x == lacuna::zero<R>()) c.erase(row);
      }
    }
    return false;
  }
  std::size_t rank() const { return by_low_.size(); }

 private:
  std::map<std::size_t, column> by_low_;
};

/// Checks every cocycle of r (dimensions 0..D) against the brute-force complex within
/// `threshold`; returns the number of pairs checked.
template <class R>
std::size_t check_cocycles(const lacuna::rips_metric& m, const lacuna::implicit_rips_cocycles<R>& r, int D,
                           double threshold) {
  const std::size_t n = m.size();
  REQUIRE(r.persistence.max_dimension() == D);
  REQUIRE(r.cocycles.size() == static_cast<std::size_t>(D + 1));
  std::size_t checked = 0;
  std::vector<std::vector<simplex_info>> simplices;  // dimensions 0..D+1
  for (int k = 0; k <= D + 1; ++k) simplices.push_back(all_simplices(m, k, threshold));
  for (int k = 0; k <= D; ++k) {
    CAPTURE(k);
    const auto uk = static_cast<std::size_t>(k);
    const auto& pairs = r.persistence[k].pairs;
    REQUIRE(r.cocycles[uk].size() == pairs.size());
    std::map<simplex_t, const simplex_info*> info_k, info_k1;
    for (const auto& s : simplices[uk]) info_k.emplace(s.points, &s);
    for (const auto& s : simplices[uk + 1]) info_k1.emplace(s.points, &s);
    std::vector<cochain_map<R>> maps;
    for (std::size_t j = 0; j < pairs.size(); ++j) {
      CAPTURE(j);
      const auto& p = pairs[j];
      const auto& z = r.cocycles[uk][j];
      CHECK(z.dimension == k);
      REQUIRE(z.vertices.size() == z.size() * (uk + 1));
      cochain_map<R> zm;
      for (std::size_t i = 0; i < z.size(); ++i) {
        const simplex_t s(z.simplex(i).begin(), z.simplex(i).end());
        REQUIRE(info_k.count(s) == 1);  // a k-simplex within the threshold (points increasing, < n)
        CHECK(!(z.coefficient(i) == lacuna::zero<R>()));
        CHECK(zm.emplace(s, z.coefficient(i)).second);  // each simplex once
      }
      // the birth simplex, coefficient 1, and nothing older (k >= 1)
      const auto b_points = lacuna::implicit_rips_vertices(n, k, p.birth_cell);
      const simplex_t b(b_points.begin(), b_points.end());
      REQUIRE(info_k.count(b) == 1);
      const simplex_info& birth = *info_k.at(b);
      CHECK(birth.value == p.birth);
      REQUIRE(zm.count(b) == 1);
      CHECK(zm.at(b) == lacuna::one<R>());
      if (k >= 1)
        for (const auto& [s, c] : zm) CHECK_FALSE(before(*info_k.at(s), birth));
      // the coboundary: zero before the death simplex, not zero on it
      std::optional<simplex_info> death;
      if (!p.essential()) {
        const auto d_points = lacuna::implicit_rips_vertices(n, k + 1, p.death_cell);
        const simplex_t d(d_points.begin(), d_points.end());
        REQUIRE(info_k1.count(d) == 1);
        death = *info_k1.at(d);
        CHECK(death->value == *p.death);
        CHECK(!(coboundary_at(zm, d) == lacuna::zero<R>()));
      }
      for (const auto& tau : simplices[uk + 1])
        if (!death || before(tau, *death)) CHECK(coboundary_at(zm, tau.points) == lacuna::zero<R>());
      maps.push_back(std::move(zm));
      ++checked;
    }
    // a basis of H^k(K_t) at every birth value and at the last value before every death
    std::set<double> values;
    for (const auto& s : simplices[1]) values.insert(s.value);
    values.insert(0.0);
    std::set<double> at;
    for (const auto& p : pairs) {
      at.insert(p.birth);
      if (!p.essential()) {
        const auto below = values.lower_bound(*p.death);
        if (below != values.begin()) at.insert(*std::prev(below));
      }
    }
    for (const double t : at) {
      CAPTURE(t);
      std::map<simplex_t, std::size_t> row_km1, row_k, row_k1;
      if (k >= 1)
        for (const auto& s : simplices[uk - 1])
          if (s.value <= t) row_km1.emplace(s.points, row_km1.size());
      for (const auto& s : simplices[uk])
        if (s.value <= t) row_k.emplace(s.points, row_k.size());
      for (const auto& s : simplices[uk + 1])
        if (s.value <= t) row_k1.emplace(s.points, row_k1.size());
      // the coboundary matrix from the simplices `from` to the simplices `to` of K_t: column f
      // has (-1)^i in the row of every s whose i-th point left out gives f
      auto coboundary_columns = [](const std::map<simplex_t, std::size_t>& from, const std::map<simplex_t, std::size_t>& to) {
        std::vector<typename column_rank<R>::column> columns(from.size());
        for (const auto& [s, row] : to)
          for (std::size_t i = 0; i < s.size(); ++i) {
            simplex_t face = s;
            face.erase(face.begin() + static_cast<std::ptrdiff_t>(i));
            columns[from.at(face)][row] = i % 2 == 0 ? lacuna::one<R>() : -lacuna::one<R>();
          }
        return columns;
      };
      column_rank<R> image;  // rank δ_{k-1}, then the cocycles
      if (k >= 1)
        for (auto& c : coboundary_columns(row_km1, row_k)) image.add(std::move(c));
      const std::size_t boundaries = image.rank();
      column_rank<R> next;  // rank δ_k
      for (auto& c : coboundary_columns(row_k, row_k1)) next.add(std::move(c));
      const std::size_t cohomology = row_k.size() - next.rank() - boundaries;
      std::size_t alive = 0;
      for (std::size_t j = 0; j < pairs.size(); ++j) {
        const auto& p = pairs[j];
        if (p.birth > t || (!p.essential() && *p.death <= t)) continue;
        ++alive;
        typename column_rank<R>::column c;
        for (const auto& [s, coefficient] : maps[j])
          if (const auto row = row_k.find(s); row != row_k.end()) c[row->second] = coefficient;
        CAPTURE(j);
        CHECK(image.add(std::move(c)));  // independent of the coboundaries and of the others
      }
      CHECK(alive == cohomology);
    }
  }
  return checked;
}

using persistence_test_support::random_cloud;

template <class R>
std::size_t check_cloud(const lacuna::rips_metric& m, int D, std::optional<double> threshold, bool zero_persistence) {
  const lacuna::implicit_rips_options o{.max_dimension = D, .threshold = threshold, .zero_persistence = zero_persistence};
  const auto r = lacuna::implicit_rips_persistence_with_cocycles<R>(m, o);
  // the same pairs as implicit_rips_persistence, in the same order
  CHECK(r.persistence.diagrams == lacuna::implicit_rips_persistence<R>(m, o).diagrams);
  return check_cocycles(m, r, D, threshold ? *threshold : m.enclosing_radius());
}

}  // namespace persistence_rips_cocycles_test

TEST_CASE("representative cocycles of random clouds: cocycles before the death, a basis of H^k(K_t); Z/2, Z/3") {
  using namespace persistence_rips_cocycles_test;
  std::mt19937_64 rng(20261203);
  std::size_t pairs = 0, essential = 0, higher = 0;
  for (int round = 0; round < 8; ++round) {
    const std::size_t dim = 2 + static_cast<std::size_t>(round % 2);
    const int D = round < 4 ? 1 : 2;
    const std::size_t n = D == 1 ? 25 : 14 + static_cast<std::size_t>(round % 3) * 3;
    const bool grid = round % 4 == 3;
    CAPTURE(round);
    CAPTURE(n);
    const auto c = random_cloud(rng, n, dim, grid);
    const auto m = lacuna::rips_metric::from_points(c, dim);
    pairs += check_cloud<lacuna::z2>(m, D, std::nullopt, false);
    pairs += check_cloud<lacuna::mod_p<3>>(m, D, std::nullopt, false);
    // below the enclosing radius: essential classes in dimension >= 1
    const double low = 0.6 * m.enclosing_radius();
    pairs += check_cloud<lacuna::mod_p<3>>(m, D, low, false);
    pairs += check_cloud<lacuna::z2>(m, D, low, false);
    const auto r = lacuna::implicit_rips_persistence<lacuna::z2>(m, {.max_dimension = D, .threshold = low});
    for (int k = 1; k <= D; ++k) {
      essential += r[k].essential_count();
      higher += r[k].pairs.size();
    }
    // pairs of persistence zero kept (apparent and emergent pairs, whose cocycle is the
    // simplex alone): checked in the order of the filtration, as the others
    if (grid) pairs += check_cloud<lacuna::mod_p<3>>(m, D, std::nullopt, true);
  }
  // not vacuous: pairs in dimensions >= 1, and essential ones among them
  CHECK(pairs > 200);
  CHECK(higher > 20);
  CHECK(essential > 2);
}

TEST_CASE("the H_1 cocycle of a regular n-gon takes a unit value on the polygon's cycle (Adamaszek 2013)") {
  using namespace persistence_rips_cocycles_test;
  namespace theorem = persistence_circle_theorem;
  auto check = [](const auto& unit, int n) {
    using R = std::remove_cvref_t<decltype(unit)>;
    CAPTURE(n);
    const auto matrix = theorem::polygon_distances(n);
    const auto m = lacuna::rips_metric::from_distances(static_cast<std::size_t>(n), matrix);
    const auto r = lacuna::implicit_rips_persistence_with_cocycles<R>(m, {.max_dimension = 1}, unit);
    // the theorem: one H_1 class, born at the side d_1 (where the complex is the n-cycle)
    REQUIRE(r.persistence[1].pairs.size() == 1);
    CHECK(r.persistence[1].pairs[0].birth == theorem::chords(n)[1]);
    const auto& z = r.cocycles[1][0];
    // the cycle [0 1] + [1 2] + ... + [n-2 n-1] - [0 n-1]
    R value = lacuna::zero<R>();
    for (std::size_t i = 0; i < z.size(); ++i) {
      const auto s = z.simplex(i);
      if (s[1] == s[0] + 1) value = value + z.coefficient(i);
      if (s[0] == 0 && s[1] == static_cast<std::uint32_t>(n - 1)) value = value - z.coefficient(i);
    }
    CHECK(!(value == lacuna::zero<R>()));
    check_cocycles(m, r, 1, m.enclosing_radius());
  };
  for (int n = 4; n <= 16; ++n) {
    check(lacuna::one<lacuna::z2>(), n);
    check(lacuna::one<lacuna::mod_p<3>>(), n);
    check(lacuna::one<lacuna::rational>(), n);
  }
}

TEST_CASE("cocycles of small clouds by hand: the unit square, two far points, no points") {
  using namespace persistence_rips_cocycles_test;
  // the square 0 (0,0), 1 (1,0), 2 (1,1), 3 (0,1): H_1 born at 1 by the last side in the
  // order (the side of the smallest number, {0, 1}), killed at sqrt 2; its cocycle is a
  // 1-cochain with coefficient 1 there that pairs to a unit with the cycle of the sides
  const std::vector<double> square{0, 0, 1, 0, 1, 1, 0, 1};
  const auto m = lacuna::rips_metric::from_points(square, 2);
  const auto r = lacuna::implicit_rips_persistence_with_cocycles<lacuna::mod_p<3>>(m, {.max_dimension = 1});
  REQUIRE(r.persistence[1].pairs.size() == 1);
  CHECK(lacuna::implicit_rips_vertices(4, 1, r.persistence[1].pairs[0].birth_cell) == std::vector<std::uint32_t>{0, 1});
  const auto& z = r.cocycles[1][0];
  std::map<simplex_t, lacuna::mod_p<3>> zm;
  for (std::size_t i = 0; i < z.size(); ++i) zm.emplace(simplex_t(z.simplex(i).begin(), z.simplex(i).end()), z.coefficient(i));
  auto at = [&](simplex_t s) { return zm.count(s) ? zm.at(s) : lacuna::zero<lacuna::mod_p<3>>(); };
  CHECK(!(at({0, 1}) + at({1, 2}) + at({2, 3}) - at({0, 3}) == lacuna::zero<lacuna::mod_p<3>>()));
  CHECK(z.simplex(0)[0] == 0);  // the birth simplex first
  CHECK(z.simplex(0)[1] == 1);
  // H_0: three deaths at 1 and one essential class, whose cocycle is the indicator of all
  REQUIRE(r.persistence[0].pairs.size() == 4);
  CHECK(r.cocycles[0][3].size() == 4);
  check_cocycles(m, r, 1, m.enclosing_radius());
  // two points 3 apart, threshold 1: two essential classes, each the indicator of its point
  const std::vector<double> two{0, 3};
  const auto t = lacuna::implicit_rips_persistence_with_cocycles(lacuna::rips_metric::from_points(two, 1),
                                                                {.max_dimension = 1, .threshold = 1.0});
  REQUIRE(t.persistence[0].pairs.size() == 2);
  for (std::size_t j = 0; j < 2; ++j) {
    REQUIRE(t.cocycles[0][j].size() == 1);
    CHECK(t.cocycles[0][j].simplex(0)[0] == t.persistence[0].pairs[j].birth_cell);
  }
  // no points: empty diagrams, empty cocycles, D + 1 of each
  const auto e = lacuna::implicit_rips_persistence_with_cocycles(lacuna::rips_metric{}, {.max_dimension = 2});
  CHECK(e.cocycles.size() == 3);
  CHECK(e.cocycles[0].empty());
  // the same refusals as implicit_rips_persistence
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence_with_cocycles(m, {.max_dimension = -1}), std::invalid_argument);
}

TEST_CASE("the memory limit bounds the stored cocycles") {
  using namespace persistence_rips_cocycles_test;
  std::mt19937_64 rng(5);
  const auto c = random_cloud(rng, 60, 2, false);
  const auto m = lacuna::rips_metric::from_points(c, 2);
  // H_0 alone stores no column, so the limit is not reached without cocycles; with them the
  // essential class alone holds 60 vertices
  lacuna::implicit_rips_options o{.max_dimension = 0};
  o.control.memory_limit = 64;
  CHECK_NOTHROW(lacuna::implicit_rips_persistence(m, o));
  CHECK_THROWS_AS(lacuna::implicit_rips_persistence_with_cocycles(m, o), lacuna::memory_limit_exceeded);
}

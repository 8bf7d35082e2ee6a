// Every variant gives the same pairs, on random filtrations of every built-in kind (fixed seeds).
// The judge is a reduction written here: the persistence algorithm of Edelsbrunner,
// Letscher & Zomorodian (2002) in its textbook form (Edelsbrunner & Harer, "Computational
// Topology", 2010, §VII.1), a dense boundary matrix over the field with rows and columns in the
// order (value, dimension, index) — one matrix for all dimensions, as the book has it — whose
// columns are reduced left to right; the pairs (low(j), j) are the persistence pairs, and the
// unpaired cells that do not kill are the essential classes. The library's matrix variants
// (standard, twist, cohomology) must give exactly these pairs, cells included; the cubical
// variant, which pairs cells of equal value before the algebra and reports the pairs of
// positive persistence only, must give the same values, with cells of those values. The same
// judge, written
// as a variant of a user's own (filter_boundaries, its own reduction, persistence_from_pivots),
// shows that a variant plugs in.
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <optional>
#include <random>
#include <tuple>
#include <vector>

namespace persistence_variants_test {

namespace support = persistence_test_support;

/// (dimension, birth cell, death cell or no_cell) for every pair.
using cell_pairs = std::vector<std::tuple<int, std::size_t, std::size_t>>;

template <class V, class R, class O>
cell_pairs cells_of(const lacuna::persistence_result<V, R, O>& r, bool positive_only) {
  cell_pairs out;
  for (const auto& d : (positive_only ? lacuna::without_zero_persistence(r) : r).diagrams)
    for (const auto& p : d.pairs) out.emplace_back(d.dimension, p.birth_cell, p.death_cell);
  std::sort(out.begin(), out.end());
  return out;
}

/// (dimension, birth value, death value or nullopt) for every pair of positive persistence —
/// what the cubical variant, whose gradient pairs cells of equal value before the algebra,
/// shares with the others — after checking that its cells have the values it reports.
template <class F, class V, class R, class O>
std::vector<std::tuple<int, V, std::optional<V>>> values_of(const F& f, const lacuna::persistence_result<V, R, O>& r) {
  std::vector<std::tuple<int, V, std::optional<V>>> out;
  for (const auto& d : lacuna::without_zero_persistence(r).diagrams)
    for (const auto& p : d.pairs) {
      CHECK(lacuna::cell_value(f, d.dimension, p.birth_cell) == p.birth);
      if (!p.essential()) CHECK(lacuna::cell_value(f, d.dimension + 1, p.death_cell) == *p.death);
      out.emplace_back(d.dimension, p.birth, p.death);
    }
  std::sort(out.begin(), out.end());
  return out;
}

/// The same from the textbook's cell pairs.
template <class F>
auto values_of_cells(const F& f, const cell_pairs& cells) {
  using V = lacuna::filtration_value_t<F>;
  std::vector<std::tuple<int, V, std::optional<V>>> out;
  for (const auto& [k, b, d] : cells)
    out.emplace_back(k, lacuna::cell_value(f, k, b),
                     d == lacuna::no_cell ? std::optional<V>{} : std::optional<V>{lacuna::cell_value(f, k + 1, d)});
  std::sort(out.begin(), out.end());
  return out;
}

/// The textbook algorithm over the field R on one dense matrix of all cells (see the file
/// comment); `unit` is the one of R.
template <class R, class F>
cell_pairs textbook_pairs(const F& f, bool positive_only, const R& unit = lacuna::one<R>()) {
  struct cell {
    int k;
    std::size_t i;
  };
  const auto order = lacuna::value_order(f);
  std::vector<cell> cells;
  for (int k = 0; k <= lacuna::top_dimension(f); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) cells.push_back({k, i});
  std::stable_sort(cells.begin(), cells.end(), [&](const cell& a, const cell& b) {
    const auto va = lacuna::cell_value(f, a.k, a.i), vb = lacuna::cell_value(f, b.k, b.i);
    if (order(va, vb)) return true;
    if (order(vb, va)) return false;
    return a.k < b.k;  // then by index: the stable sort keeps it
  });
  const std::size_t n = cells.size();
  std::vector<std::vector<std::size_t>> place(static_cast<std::size_t>(lacuna::top_dimension(f) + 1));
  for (int k = 0; k <= lacuna::top_dimension(f); ++k) place[static_cast<std::size_t>(k)].resize(lacuna::cell_count(f, k));
  for (std::size_t j = 0; j < n; ++j) place[static_cast<std::size_t>(cells[j].k)][cells[j].i] = j;
  const R zero = lacuna::zero<R>() * unit;
  std::vector<std::vector<R>> m(n, std::vector<R>(n, zero));  // m[column][row]
  for (std::size_t j = 0; j < n; ++j)
    if (cells[j].k >= 1)
      for (auto&& e : lacuna::boundary(f, cells[j].k, cells[j].i)) {
        const auto inc = lacuna::as_incidence(e);
        m[j][place[static_cast<std::size_t>(cells[j].k - 1)][inc.face]] += lacuna::from_integer<R>(inc.coefficient) * unit;
      }
  auto low = [&](std::size_t j) -> std::int64_t {
    for (std::size_t r = n; r-- > 0;)
      if (!(m[j][r] == zero)) return static_cast<std::int64_t>(r);
    return -1;
  };
  std::vector<std::int64_t> column_of_low(n, -1);
  std::vector<char> paired(n, 0);
  cell_pairs out;
  for (std::size_t j = 0; j < n; ++j) {
    for (std::int64_t l = low(j); l >= 0 && column_of_low[static_cast<std::size_t>(l)] >= 0; l = low(j)) {
      const auto& piv = m[static_cast<std::size_t>(column_of_low[static_cast<std::size_t>(l)])];
      const R c = m[j][static_cast<std::size_t>(l)] / piv[static_cast<std::size_t>(l)];
      for (std::size_t r = 0; r < n; ++r) m[j][r] -= c * piv[r];
    }
    const std::int64_t l = low(j);
    if (l < 0) continue;
    column_of_low[static_cast<std::size_t>(l)] = static_cast<std::int64_t>(j);
    paired[static_cast<std::size_t>(l)] = paired[j] = 1;
    const cell& b = cells[static_cast<std::size_t>(l)];
    const cell& d = cells[j];
    const bool zero_persistence = !order(lacuna::cell_value(f, b.k, b.i), lacuna::cell_value(f, d.k, d.i));
    if (!positive_only || !zero_persistence) out.emplace_back(b.k, b.i, d.i);
  }
  for (std::size_t j = 0; j < n; ++j)
    if (!paired[j]) out.emplace_back(cells[j].k, cells[j].i, lacuna::no_cell);
  std::sort(out.begin(), out.end());
  return out;
}

/// A variant of a user's own: the library's structure stage, a dense reduction of its own,
/// and the library's assembly of the pairs.
struct dense_user_variant {
  template <lacuna::filtration F, lacuna::field R>
  lacuna::persistence_result<lacuna::filtration_value_t<F>, R, lacuna::filtration_order_t<F>> reduce(
      const F& f, const lacuna::persistence_options& o, const R& unit) const {
    const auto range = lacuna::persistence_range_of(lacuna::top_dimension(f), o.max_dimension);
    auto fb = lacuna::filter_boundaries<R>(f, range.cell_top, unit, &o.control);
    std::vector<lacuna::field_reduction_result<R>> reduced;
    for (std::size_t k = 1; k < fb.matrices.size(); ++k) {
      const auto& a = fb.matrices[k];
      std::vector<std::vector<R>> cols(a.cols, std::vector<R>(a.rows, lacuna::zero<R>()));
      for (std::size_t j = 0; j < a.cols; ++j)
        for (const auto& e : a.columns[j]) cols[j][e.index] = e.value;
      lacuna::field_reduction_result<R> res;
      res.rows = a.rows;
      res.cols = a.cols;
      std::vector<std::int64_t> owner(a.rows, -1);
      for (std::size_t j = 0; j < a.cols; ++j) {
        for (;;) {
          std::int64_t l = -1;
          for (std::size_t r = a.rows; r-- > 0;)
            if (!(cols[j][r] == lacuna::zero<R>())) {
              l = static_cast<std::int64_t>(r);
              break;
            }
          if (l < 0) break;
          const std::int64_t o2 = owner[static_cast<std::size_t>(l)];
          if (o2 < 0) {
            owner[static_cast<std::size_t>(l)] = static_cast<std::int64_t>(j);
            res.pivots.push_back({static_cast<std::uint32_t>(l), static_cast<std::uint32_t>(j)});
            break;
          }
          const auto& piv = cols[static_cast<std::size_t>(o2)];
          const R c = cols[j][static_cast<std::size_t>(l)] / piv[static_cast<std::size_t>(l)];
          for (std::size_t r = 0; r < a.rows; ++r) cols[j][r] -= c * piv[r];
        }
      }
      res.rank = res.pivots.size();
      reduced.push_back(std::move(res));
    }
    return lacuna::persistence_from_pivots(fb, reduced, range.diagram_top, lacuna::value_order(f), false, unit);
  }
};
static_assert(lacuna::persistence_reduction<dense_user_variant, lacuna::rips_filtration, lacuna::z2>);
static_assert(lacuna::persistence_reduction<lacuna::cubical_morse_persistence, lacuna::cubical_filtration<2, int>, lacuna::z2>);
static_assert(!lacuna::persistence_reduction<lacuna::cubical_morse_persistence, lacuna::rips_filtration, lacuna::z2>);
static_assert(!lacuna::persistence_reduction<lacuna::twist_persistence, lacuna::rips_filtration, lacuna::integer>);

/// Every matrix variant against the textbook pairs over the field R (characteristic p).
template <class R, class F>
void check_matrix_variants(const F& f, const R& unit = lacuna::one<R>()) {
  const auto expected = textbook_pairs<R>(f, false, unit);
  CHECK(cells_of(lacuna::persistence<R>(f, {}, lacuna::standard_persistence{}, unit), false) == expected);
  CHECK(cells_of(lacuna::persistence<R>(f, {}, lacuna::twist_persistence{}, unit), false) == expected);
  CHECK(cells_of(lacuna::persistence<R>(f, {}, lacuna::cohomology_persistence{}, unit), false) == expected);
  CHECK(cells_of(lacuna::persistence<R>(f, {}, dense_user_variant{}, unit), false) == expected);
  // with representatives the pairs stay the same
  CHECK(cells_of(lacuna::persistence<R>(f, {.representatives = true}, lacuna::twist_persistence{}, unit), false) == expected);
}

TEST_CASE("lower-star filtrations of random simplicial complexes: Z/2, Z/3 and Q") {
  std::mt19937_64 rng(8080);
  for (int trial = 0; trial < 6; ++trial) {
    const auto c = support::random_complex(rng, 9, 12, 4);
    const auto f = lacuna::lower_star_filtration(c, support::random_values(rng, c.vertex_count(), 5));
    check_matrix_variants<lacuna::z2>(f);
    check_matrix_variants<lacuna::mod_p<3>>(f);
    CHECK(cells_of(lacuna::persistence<lacuna::rational>(f), false) == textbook_pairs<lacuna::rational>(f, false));
  }
}

TEST_CASE("values on cell lists with torsion: Z/2, Z/3, and Z/5 with a modulus chosen at run time") {
  std::mt19937_64 rng(8081);
  for (const auto& c : {lacuna::cell_list::klein_bottle(), lacuna::cell_list::real_projective_space(3),
                        lacuna::cell_list::lens_space(5, 2), lacuna::cell_list::torus()}) {
    for (int trial = 0; trial < 3; ++trial) {
      const lacuna::values_filtration<lacuna::cell_list, int> f(c, support::random_monotone_values(rng, c, 3));
      check_matrix_variants<lacuna::z2>(f);
      check_matrix_variants<lacuna::mod_p<3>>(f);
      check_matrix_variants<lacuna::mod_p_dynamic>(f, lacuna::mod_p_dynamic(1, 5));
    }
  }
}

TEST_CASE("cubical filtrations: the matrix variants, and the cubical variant's pairs of positive persistence") {
  std::mt19937_64 rng(8082);
  for (int trial = 0; trial < 4; ++trial) {
    const auto samples = support::random_values(rng, 6 * 5, 4 + trial);
    for (const auto dir : {lacuna::level_sets::sublevel, lacuna::level_sets::superlevel}) {
      const lacuna::cubical_filtration<2, int> f({6, 5}, samples, dir);
      check_matrix_variants<lacuna::z2>(f);
      const auto positive = values_of_cells(f, textbook_pairs<lacuna::z2>(f, true));
      CHECK(values_of(f, lacuna::persistence(f, {}, lacuna::cubical_morse_persistence{})) == positive);
      CHECK(values_of(f, lacuna::persistence(f, {.threads = 2}, lacuna::cubical_morse_persistence{})) == positive);
      const auto five = lacuna::mod_p_dynamic(1, 5);
      CHECK(values_of(f, lacuna::persistence<lacuna::mod_p_dynamic>(f, {}, lacuna::cubical_morse_persistence{}, five)) ==
            values_of_cells(f, textbook_pairs<lacuna::mod_p_dynamic>(f, true, five)));
      // the default for cubical filtrations is the cubical variant, which reports no pair of
      // persistence zero
      const auto r = lacuna::persistence(f);
      CHECK(values_of(f, r) == positive);
      CHECK(cells_of(r, false) == cells_of(r, true));
    }
  }
  for (int trial = 0; trial < 3; ++trial) {
    const lacuna::cubical_filtration<3, int> f({3, 4, 3}, support::random_values(rng, 36, 5));
    check_matrix_variants<lacuna::z2>(f);
    const auto positive = values_of_cells(f, textbook_pairs<lacuna::z2>(f, true));
    CHECK(values_of(f, lacuna::persistence(f, {.threads = 2})) == positive);
    // diagrams up to dimension 1 only: the same pairs of dimensions 0 and 1
    auto low = positive;
    low.erase(std::remove_if(low.begin(), low.end(), [](const auto& t) { return std::get<0>(t) > 1; }), low.end());
    CHECK(values_of(f, lacuna::persistence(f, {.max_dimension = 1})) == low);
  }
  // a 1-dimensional signal and a 4-dimensional image
  const lacuna::cubical_filtration<1, int> s({12}, support::random_values(rng, 12, 4));
  CHECK(values_of(s, lacuna::persistence(s)) == values_of_cells(s, textbook_pairs<lacuna::z2>(s, true)));
  const lacuna::cubical_filtration<4, int> h({2, 2, 2, 2}, support::random_values(rng, 16, 3));
  CHECK(values_of(h, lacuna::persistence(h)) == values_of_cells(h, textbook_pairs<lacuna::z2>(h, true)));
}

TEST_CASE("Vietoris–Rips of random points: Z/2") {
  std::mt19937_64 rng(8083);
  for (int trial = 0; trial < 4; ++trial) {
    const auto f = lacuna::rips_filtration::from_points(support::random_points(rng, 8, 2, 5), {.max_dimension = 3});
    check_matrix_variants<lacuna::z2>(f);
  }
}

TEST_CASE("max_dimension: the pairs of the dimensions asked for, the same as in the full computation") {
  std::mt19937_64 rng(8084);
  const auto f = lacuna::rips_filtration::from_points(support::random_points(rng, 9, 3, 4), {.max_dimension = 3});
  const auto full = textbook_pairs<lacuna::z2>(f, false);
  for (int d = 0; d <= 2; ++d) {
    auto expected = full;
    expected.erase(std::remove_if(expected.begin(), expected.end(), [&](const auto& t) { return std::get<0>(t) > d; }),
                   expected.end());
    for (const auto& r : {lacuna::persistence(f, {.max_dimension = d}, lacuna::twist_persistence{}),
                          lacuna::persistence(f, {.max_dimension = d}, lacuna::standard_persistence{}),
                          lacuna::persistence(f, {.max_dimension = d}, lacuna::cohomology_persistence{})}) {
      CHECK(r.max_dimension() == d);
      CHECK(cells_of(r, false) == expected);
    }
  }
}

TEST_CASE("a face entering after its coface is caught while reading the boundaries, with its name") {
  // a filtration of a user's own whose values break the rule
  struct bad_filtration {
    lacuna::simplicial_complex<int> c{{0, 1}};
    int top_dimension() const { return c.top_dimension(); }
    std::size_t cell_count(int k) const { return c.cell_count(k); }
    auto boundary(int k, std::size_t i) const { return c.boundary(k, i); }
    std::string cell_name(int k, std::size_t i) const { return c.cell_name(k, i); }
    int cell_value(int k, std::size_t i) const { return k == 0 ? static_cast<int>(i) + 5 : 1; }
  };
  static_assert(lacuna::filtration<bad_filtration>);
  const bad_filtration f;
  CHECK_THROWS_AS(lacuna::check_filtration(f), lacuna::filtration_error);
  try {
    (void)lacuna::persistence(f);
    FAIL("expected a filtration_error");
  } catch (const lacuna::filtration_error& e) {
    CHECK(e.dimension() == 1);
    CHECK(std::string(e.what()).find("'0 1'") != std::string::npos);
  }
}

}  // namespace persistence_variants_test

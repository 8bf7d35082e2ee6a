// Tests of lacuna::cubical_morse_complex, the Morse complex of a binary image or volume under
// the lower-star gradient (lacuna/algorithm/cubical_morse.hpp).
//
// Sources of truth, none of them the code under test:
//   - the homology of the original cubical complex computed by the engine without any Morse
//     reduction (the unit-pivot elimination of lacuna/homology/homology.hpp, itself checked
//     against FLINT and textbook values in tests/homology and tests/reference): a Morse complex
//     is chain homotopy equivalent to the original (Forman 1998, Theorem 8.2; Sköldberg 2006);
//   - d∘d = 0 on the Morse complex (lacuna::validate);
//   - f∘g = id for the two chain maps (Sköldberg 2006, Lemma 2 and its proof);
//   - lifted generators are cycles of the original, computed from its own boundaries, and
//     form a basis of its homology (coordinates in an independently computed result);
//   - the Euler characteristic is the same (it is a homotopy invariant; also Forman's weak
//     Morse inequalities: at least b_k critical k-cells).
#include "../homology/support.hpp"

#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <array>
#include <random>
#include <vector>

namespace cubical_cubical_morse_test {

namespace {

using lacuna::integer;

template <std::size_t D>
lacuna::cubical_complex<D> random_volume(std::mt19937_64& rng, const std::array<std::size_t, D>& extents, double density) {
  std::bernoulli_distribution on(density);
  return lacuna::cubical_complex<D>::from_predicate(extents, [&](const auto&) { return on(rng); });
}

template <std::size_t D>
bool same_morse(const lacuna::cubical_morse_complex<D>& a, const lacuna::cubical_morse_complex<D>& b) {
  if (a.top_dimension() != b.top_dimension()) return false;
  for (int k = 0; k <= a.top_dimension(); ++k) {
    if (a.cell_count(k) != b.cell_count(k)) return false;
    for (std::size_t i = 0; i < a.cell_count(k); ++i) {
      if (a.position(k, i) != b.position(k, i)) return false;
      const auto x = a.boundary(k, i), y = b.boundary(k, i);
      if (!std::equal(x.begin(), x.end(), y.begin(), y.end())) return false;
    }
  }
  return true;
}

// The boundary of a chain of the original complex.
template <std::size_t D>
lacuna::chain<integer> boundary_of(const lacuna::cubical_complex<D>& c, const lacuna::chain<integer>& z) {
  lacuna::chain<integer> out{z.dimension - 1, {}};
  if (z.dimension == 0) return out;
  for (const auto& t : z.terms)
    for (const auto& e : c.boundary(z.dimension, t.cell)) out.terms.push_back({e.face, integer(e.coefficient) * t.coefficient});
  out.normalize_terms();
  return out;
}

template <std::size_t D>
void check_volume(const lacuna::cubical_complex<D>& c, std::mt19937_64& rng) {
  const auto m = lacuna::cubical_morse_reduce(c);
  CAPTURE(c.cell_count(0));
  lacuna::validate(m);
  // same groups over Z and Z/2
  const auto hc = lacuna::homology<integer>(c, {.keep_basis = true});
  const auto hm = lacuna::homology<integer>(m, {.generators = true});
  CHECK(lacuna_test::groups_of(hm) == lacuna_test::groups_of(hc));
  CHECK(lacuna_test::groups_of(lacuna::homology<lacuna::z2>(m)) == lacuna_test::groups_of(lacuna::homology<lacuna::z2>(c)));
  CHECK(lacuna::euler_characteristic(m) == lacuna::euler_characteristic(c));
  for (int k = 0; k <= c.top_dimension(); ++k) {
    CHECK(m.cell_count(k) <= c.cell_count(k));
    CHECK(m.cell_count(k) >= hc[k].rank);
    CHECK(m.original_count(k) == c.cell_count(k));
  }
  // two threads: the same complex
  CHECK(same_morse(m, lacuna::cubical_morse_reduce(c, {.threads = 2})));
  // lifted generators: cycles of the original forming a basis (no torsion in a cubical set
  // of R^D, D <= 3; in 4D the free part is what is checked)
  for (int k = 0; k <= c.top_dimension(); ++k) {
    const auto& g = hm[k];
    std::vector<std::vector<integer>> coords;
    for (const auto& z : g.generators) {
      const auto lifted = m.lift(c, z);
      CHECK(lifted.dimension == k);
      CHECK(boundary_of(c, lifted).is_zero());
      coords.push_back(hc.coordinates(c, lifted));
      // f∘g = id
      CHECK(m.project(c, lifted).terms == z.terms);
    }
    if (g.rank == 0) continue;
    lacuna::dense_matrix<integer> M(g.rank, g.rank);
    for (std::size_t i = 0; i < g.rank; ++i)
      for (std::size_t j = 0; j < g.rank; ++j) M(i, j) = coords[i][j];
    const auto s = lacuna::dense_smith_form(M);
    CHECK(s.rank == g.rank);
    for (const auto& d : s.diagonal) CHECK(lacuna::normalize(d) == integer(1));
  }
  // f∘g = id on random chains of the Morse complex, and f maps boundaries to boundaries
  for (int k = 1; k <= m.top_dimension(); ++k) {
    if (m.cell_count(k) == 0) continue;
    std::uniform_int_distribution<std::size_t> pick(0, m.cell_count(k) - 1);
    lacuna::chain<integer> z{k, {}};
    for (int r = 0; r < 3; ++r) z.terms.push_back({pick(rng), integer(r + 1)});
    z.normalize_terms();
    const auto gz = m.lift(c, z);
    CHECK(m.project(c, gz).terms == z.terms);
    // f(∂x) = ∂^M f(x) for a single original cell x
    std::uniform_int_distribution<std::size_t> cell(0, c.cell_count(k) - 1);
    lacuna::chain<integer> x{k, {{cell(rng), integer(1)}}};
    const auto fx = m.project(c, x);
    lacuna::chain<integer> dfx{k - 1, {}};
    for (const auto& t : fx.terms)
      for (const auto& e : m.boundary(k, t.cell)) dfx.terms.push_back({e.face, integer(e.coefficient) * t.coefficient});
    dfx.normalize_terms();
    CHECK(m.project(c, boundary_of(c, x)).terms == dfx.terms);
  }
}

}  // namespace

TEST_CASE("cubical Morse complex: random images and volumes agree with the unreduced engine") {
  std::mt19937_64 rng(20261202);
  for (double p : {0.2, 0.5, 0.8}) {
    for (int t = 0; t < 4; ++t) {
      check_volume(random_volume<1>(rng, {{40}}, p), rng);
      check_volume(random_volume<2>(rng, {{13, 11}}, p), rng);
      check_volume(random_volume<3>(rng, {{7, 6, 5}}, p), rng);
    }
    check_volume(random_volume<4>(rng, {{3, 4, 3, 3}}, p), rng);
  }
}

TEST_CASE("cubical Morse complex: shapes with known homology") {
  using C3 = lacuna::cubical_complex<3>;
  // a solid 4x4x4 cube is contractible: one critical vertex and nothing else (the lower-star
  // matching of a full cube pairs everything but the first vertex)
  const auto cube = C3::from_predicate({4, 4, 4}, [](const auto&) { return true; });
  const auto m = lacuna::cubical_morse_reduce(cube);
  CHECK(m.cell_count(0) == 1);
  CHECK(m.cell_count(1) == 0);
  CHECK(m.cell_count(2) == 0);
  CHECK(m.cell_count(3) == 0);
  // a hollow 3x3x3 shell: H = (Z, 0, Z) (a 2-sphere)
  const auto shell = C3::from_predicate({3, 3, 3}, [](const auto& v) { return !(v[0] == 1 && v[1] == 1 && v[2] == 1); });
  const auto hs = lacuna::homology<integer>(lacuna::cubical_morse_reduce(shell));
  CHECK(hs.betti_numbers() == std::vector<std::size_t>{1, 0, 1, 0});
  // the empty volume
  const auto empty = C3::from_predicate({2, 2, 2}, [](const auto&) { return false; });
  CHECK(lacuna::cubical_morse_reduce(empty).top_dimension() == -1);
}

TEST_CASE("cubical Morse complex: a stop request ends the reduction") {
  std::stop_source source;
  source.request_stop();
  lacuna::run_control control;
  control.stop = source.get_token();
  const auto v = lacuna::cubical_complex<3>::from_predicate({80, 80, 80}, [](const auto& x) { return (x[0] + x[1] + x[2]) % 3 != 0; });
  CHECK_THROWS_AS(lacuna::cubical_morse_reduce(v, {.control = &control}), lacuna::computation_stopped);
}

TEST_CASE("pre_reduction::morse in the engine: same groups, generators that pass verification") {
  std::mt19937_64 rng(7);
  const lacuna::sparse_elimination morse{.reduction = lacuna::pre_reduction::morse};
  for (double p : {0.3, 0.5, 0.7}) {
    const auto v = random_volume<3>(rng, {{6, 5, 5}}, p);
    const auto plain = lacuna::homology<integer>(v);
    const auto h = lacuna::homology<integer>(v, {.generators = true}, morse);
    CHECK(lacuna_test::groups_of(h) == lacuna_test::groups_of(plain));
    // verify_generators: cycles by the complex's own boundaries, coordinates unit-diagonal
    // (through the projection to the Morse complex), and for <= 2000 cells a dense
    // cross-check in which the generators must form a basis
    const auto report = lacuna::verify_generators(v, h);
    CHECK_MESSAGE(report.ok, report.first_failure);
    CHECK(report.checks > 0);
    const auto v2 = random_volume<2>(rng, {{30, 20}}, p);
    const auto h2 = lacuna::homology<lacuna::z2>(v2, {.generators = true, .threads = 2}, morse);
    CHECK(lacuna_test::groups_of(h2) == lacuna_test::groups_of(lacuna::homology<lacuna::z2>(v2)));
    const auto r2 = lacuna::verify_generators(v2, h2, {.dense_cell_limit = 4000});
    CHECK_MESSAGE(r2.ok, r2.first_failure);
    // cohomology groups through the Morse complex
    CHECK(lacuna_test::groups_of(lacuna::cohomology<integer>(v, {}, morse)) ==
          lacuna_test::groups_of(lacuna::cohomology<integer>(v)));
  }
}

}  // namespace cubical_cubical_morse_test

// Larger randomized runs (label "long"): random simplicial complexes and random presentation
// complexes, homology and cohomology over Z, Z/2, Z/3 and Q; every variant agrees, every
// generator passes verify_generators, the universal coefficient theorem and χ hold.
#include "support.hpp"

#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <random>

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

namespace {
lacuna::simplicial_complex<int> random_simplicial(std::mt19937_64& rng, int vertices, int max_dim, int count) {
  std::vector<std::vector<int>> fs;
  std::uniform_int_distribution<int> dim(1, max_dim);
  for (int i = 0; i < count; ++i) {
    std::vector<int> vs(static_cast<std::size_t>(vertices));
    for (int v = 0; v < vertices; ++v) vs[static_cast<std::size_t>(v)] = v;
    std::shuffle(vs.begin(), vs.end(), rng);
    vs.resize(static_cast<std::size_t>(dim(rng) + 1));
    fs.push_back(vs);
  }
  return facets(fs);
}

cell_list random_presentation(std::mt19937_64& rng, int g, int r) {
  cell_list c;
  c.add_cell(0, "v");
  std::uniform_int_distribution<int> coef(-30, 30), deg(1, 12);
  for (int i = 0; i < g; ++i) c.add_cell(1, "", {{0, 1}, {0, -1}});
  std::vector<std::vector<lacuna::incidence>> rel;
  for (int j = 0; j < r; ++j) {
    std::vector<lacuna::incidence> t;
    for (int i = 0; i < g; ++i)
      if (rng() % 3 != 0) t.push_back({static_cast<std::size_t>(i), coef(rng)});
    rel.push_back(t);
    c.add_cell(2, "", t);
  }
  std::vector<std::pair<std::size_t, std::size_t>> twins;
  for (int j = 0; j < r; ++j)
    if (rng() % 2 == 1) twins.push_back({static_cast<std::size_t>(j), c.add_cell(2, "", rel[static_cast<std::size_t>(j)])});
  for (auto [a, b] : twins) {
    const std::int64_t k = deg(rng);
    c.add_cell(3, "", {{a, k}, {b, -k}});
  }
  return c;
}

template <class C>
void everything(const C& c) {
  const auto gz = all_variants<integer>(c);
  CHECK(all_variants<integer>(c, true).size() == gz.size());
  all_variants<integer>(c, false, true);
  all_variants<lacuna::mod_p<2>>(c);
  all_variants<lacuna::mod_p<3>>(c, true);
  all_variants<lacuna::rational>(c);
  const auto rep = lacuna::check_universal_coefficients<2, 3, 5, 7, 11>(c);
  const auto* bad = rep.first_failure();
  INFO((bad ? bad->statement + ": " + bad->predicted + " vs " + bad->computed : std::string()));
  CHECK(rep.ok());
}
}  // namespace

TEST_CASE("random simplicial complexes") {
  std::mt19937_64 rng(99);
  for (int trial = 0; trial < 60; ++trial) {
    CAPTURE(trial);
    const auto c = random_simplicial(rng, 9, 4, 6 + trial % 15);
    everything(c);
    if (trial % 10 == 0) {
      const auto sd = lacuna::barycentric_subdivision(c);
      CHECK(all_variants<integer>(sd, false, false, 0) == groups_of(lacuna::homology<integer>(c)));
    }
  }
}

TEST_CASE("random presentation complexes with torsion in two degrees") {
  std::mt19937_64 rng(7);
  for (int trial = 0; trial < 200; ++trial) {
    CAPTURE(trial);
    everything(random_presentation(rng, 1 + trial % 7, trial % 9));
  }
}

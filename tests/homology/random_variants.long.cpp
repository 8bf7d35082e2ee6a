// Larger randomized runs (label "long"): random simplicial complexes and random presentation
// complexes, homology and cohomology over Z, Z/2, Z/3 and Q; every variant agrees, every
// generator passes verify_generators, the universal coefficient theorem and χ hold.
#include "random_properties.hpp"
#include "support.hpp"

#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <random>

namespace homology_random_variants_test {

using namespace lacuna_test;
using lacuna::cell_list;
using lacuna::integer;

namespace {
// The random complexes of the property suite (random_properties.hpp).
using random_test::random_presentation;
using random_test::random_simplicial;

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
    everything(random_presentation(rng, 1 + trial % 7, trial % 9, 30));
  }
}

}  // namespace homology_random_variants_test

// pull_cochains (algorithm/elimination_maps.hpp) is the transpose of push_chain: for every
// chain z and every cochain φ of the reduced complex, (pull φ)(z) = φ(push z). Checked on
// random chains and cochains after an elimination of a product of textbook complexes, at
// every level; and φ(push g(y)) = φ(y) for lifted chains g(y) (push ∘ lift = identity on the
// reduced complex, Kaczynski, Mrozek & Slusarek 1998), which is what makes the certificates'
// cocycles pair to the identity with the generators.
#include "homology/support.hpp"

#include <lacuna/algorithm/elimination_maps.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/complex/construct/product.hpp>

#include <random>

namespace homology_pull_cochains_test {

using lacuna::integer;

integer pairing(const lacuna::level_chain<integer>& phi, const lacuna::level_chain<integer>& z) {
  integer s = 0;
  std::size_t i = 0, j = 0;
  while (i < phi.size() && j < z.size()) {
    if (phi[i].index < z[j].index) ++i;
    else if (z[j].index < phi[i].index) ++j;
    else s += phi[i++].value * z[j++].value;
  }
  return s;
}

TEST_CASE("pull_cochains is the transpose of push_chain") {
  const auto c = lacuna::product(lacuna_test::six_vertex_rp2(), lacuna::cell_list::klein_bottle());
  auto rc = lacuna::elimination_workspace<integer>::build(c);
  lacuna::elimination_log<integer> log;
  lacuna::eliminate_unit_pivots(rc, {.record = true, .record_pivots = true}, &log);
  std::mt19937_64 rng(11);
  std::uniform_int_distribution<int> coef(-3, 3);
  int compared = 0;
  for (int L = 0; L < rc.levels(); ++L) {
    std::vector<std::uint32_t> alive;
    for (std::uint32_t i = 0; i < rc.size(L); ++i)
      if (rc.alive(L, i)) alive.push_back(i);
    if (alive.empty()) continue;
    std::vector<lacuna::level_chain<integer>> phis;
    for (int t = 0; t < 4; ++t) {
      lacuna::level_chain<integer> phi;
      for (auto i : alive)
        if (int v = coef(rng)) phi.push_back({i, integer(v)});
      phis.push_back(phi);
    }
    const auto pulled = lacuna::pull_cochains(log, L, rc.size(L), phis);
    REQUIRE(pulled.size() == phis.size());
    for (int t = 0; t < 6; ++t) {
      lacuna::level_chain<integer> z;  // any chain, not only cycles
      for (std::uint32_t i = 0; i < rc.size(L); ++i)
        if (rng() % 3 == 0)
          if (int v = coef(rng)) z.push_back({i, integer(v)});
      const auto pz = lacuna::push_chain(log, L, z);
      for (std::size_t g = 0; g < phis.size(); ++g) {
        CHECK(pairing(pulled[g], z) == pairing(phis[g], pz));
        ++compared;
      }
    }
    // φ(push g(y)) = φ(y): the lifted chains of random chains y of the reduced complex.
    std::vector<lacuna::level_chain<integer>> ys(3);
    for (auto& y : ys)
      for (auto i : alive)
        if (int v = coef(rng)) y.push_back({i, integer(v)});
    const auto lifted = lacuna::lift_chains(log, L, rc.size(L), ys);
    for (std::size_t t = 0; t < ys.size(); ++t)
      for (std::size_t g = 0; g < phis.size(); ++g) CHECK(pairing(pulled[g], lifted[t]) == pairing(phis[g], ys[t]));
  }
  CHECK(compared > 50);
}

}  // namespace homology_pull_cochains_test

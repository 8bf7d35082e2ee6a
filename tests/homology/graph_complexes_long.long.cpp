// The coboundary route on the larger matching and chessboard complexes (label "long"; M(K_12)
// takes most of it: the route without lattice_smith_invariants about 15 s):
// against the old route where it finishes in seconds, and against theorems — Euler–Poincaré,
// universal coefficients over Z/2 and Z/3 (old field route), and the connectivity bounds of
// Björner, Lovász, Vrećica & Živaljević (1994), from memory.
#include "support.hpp"

#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

namespace homology_graph_complexes_long_test {

using lacuna::integer;
using lacuna_test::group;
using lacuna_test::groups_of;

const lacuna::sparse_elimination old_route{.allow_coboundary_route = false};

bool divisible(const std::string& t, long long p) { return integer(integer::big_type(t)) % integer(p) == integer(0); }

template <class C>
void check_all(const C& c, int nu, bool compare_old) {
  const auto h = groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{}));
  const auto hr = groups_of(lacuna::homology<integer>(c, {.reduced = true}, lacuna::coboundary_reduction{}));
  if (compare_old) CHECK(hr == groups_of(lacuna::homology<integer>(c, {.reduced = true}, old_route)));
  // Euler–Poincaré
  long long chi_cells = 0, chi_h = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k)
    chi_cells += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(lacuna::cell_count(c, k));
  for (std::size_t k = 0; k < h.size(); ++k) chi_h += (k % 2 == 0 ? 1 : -1) * static_cast<long long>(h[k].rank);
  CHECK(chi_h == chi_cells);
  // universal coefficients (Hatcher 2002, Theorem 3A.3)
  auto predict = [&](long long p) {
    std::vector<std::size_t> b;
    for (std::size_t k = 0; k < h.size(); ++k) {
      std::size_t d = h[k].rank;
      for (const auto& t : h[k].torsion) d += divisible(t, p);
      if (k > 0)
        for (const auto& t : h[k - 1].torsion) d += divisible(t, p);
      b.push_back(d);
    }
    return b;
  };
  CHECK(lacuna::homology<lacuna::z2>(c).betti_numbers() == predict(2));
  CHECK(lacuna::homology<lacuna::mod_p<3>>(c).betti_numbers() == predict(3));
  // (ν − 1)-connected: the reduced homology vanishes in degrees ≤ ν − 1 (Hurewicz)
  for (int i = 0; i <= nu - 1; ++i) CHECK(hr[static_cast<std::size_t>(i)] == group{});
  // and the first possibly non-zero degree ν is non-zero here
  CHECK(!(hr[static_cast<std::size_t>(nu)] == group{}));
}

TEST_CASE("matching complexes of K_9, K_10, K_11") {
  for (int n = 9; n <= 11; ++n) {
    CAPTURE(n);
    check_all(lacuna::matching_complex(n), (n + 1) / 3 - 1, n <= 10);
  }
}

TEST_CASE("matching complex of K_12: its 17 007 x 137 level-4 remainder goes through lattice_smith_invariants") {
  // against the old route (an independent elimination), Euler–Poincaré, universal
  // coefficients and connectivity as above; and the route without the lattice step
  const auto c = lacuna::matching_complex(12);
  check_all(c, (12 + 1) / 3 - 1, true);
  CHECK(groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{.lattice_smith = false})) ==
        groups_of(lacuna::homology<integer>(c, {}, lacuna::coboundary_reduction{})));
}

TEST_CASE("chessboard complexes 5 x 6, 6 x 6, 6 x 7, 7 x 7") {
  for (const auto& [m, n] : std::vector<std::pair<int, int>>{{5, 6}, {6, 6}, {6, 7}, {7, 7}}) {
    CAPTURE(m);
    CAPTURE(n);
    check_all(lacuna::chessboard_complex(m, n), std::min(m, (m + n + 1) / 3) - 1, m * n <= 36);
  }
}

}  // namespace homology_graph_complexes_long_test

// Tests of lacuna/complex/clique_complex.hpp against counts known in closed form and against
// a brute-force enumeration of vertex subsets on random graphs (fixed seeds).
#include <doctest/doctest.h>

#include "support.hpp"

#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/validate.hpp>

#include <random>
#include <set>
#include <string>
#include <utility>
#include <vector>

namespace complex_clique_complex_test {

using test_support::binomial;
using test_support::counts;

TEST_CASE("complete graphs: f_k = C(n, k+1) up to the bound") {
  for (int n = 1; n <= 8; ++n)
    for (int d = 0; d <= 4; ++d) {
      std::vector<std::pair<int, int>> e;
      for (int u = 0; u < n; ++u)
        for (int v = u + 1; v < n; ++v) e.emplace_back(u, v);
      std::vector<int> vs;
      for (int u = 0; u < n; ++u) vs.push_back(u);
      const auto c = lacuna::clique_complex(vs, e, d);
      CHECK(lacuna::top_dimension(c) == std::min(n - 1, d));
      for (int k = 0; k <= lacuna::top_dimension(c); ++k)  // every (k+1)-subset is a clique
        CHECK(lacuna::cell_count(c, k) == binomial(static_cast<std::uint64_t>(n), static_cast<std::uint64_t>(k + 1)));
      lacuna::validate(c);
    }
}

TEST_CASE("cycles and the octahedron graph") {
  const std::vector<std::pair<std::string, std::string>> c4{{"a", "b"}, {"b", "c"}, {"c", "d"}, {"d", "a"}};
  const auto square = lacuna::clique_complex(c4, 3);
  CHECK(counts(square) == std::vector<std::size_t>{4, 4});  // C4 has no triangles: a circle, chi = 0
  const std::vector<std::pair<std::string, std::string>> c3{{"a", "b"}, {"b", "c"}, {"c", "a"}};
  CHECK(counts(lacuna::clique_complex(c3, 3)) == std::vector<std::size_t>{3, 3, 1});  // filled triangle
  CHECK(counts(lacuna::clique_complex(c3, 1)) == std::vector<std::size_t>{3, 3});
  // K_{2,2,2} (all pairs except the 3 antipodal ones): its flag complex is the octahedron,
  // 6, 12, 8 and chi = 2 (Euler's formula for a convex polyhedron)
  std::vector<std::pair<int, int>> oct;
  for (int u = 0; u < 6; ++u)
    for (int v = u + 1; v < 6; ++v)
      if (v != u + 3) oct.emplace_back(u, v);
  const auto o = lacuna::clique_complex(oct, 5);
  CHECK(counts(o) == std::vector<std::size_t>{6, 12, 8});
  CHECK(lacuna::euler_characteristic(o) == 2);
  CHECK(test_support::closed_pseudomanifold(o));
  CHECK_THROWS_AS(lacuna::clique_complex(std::vector<std::pair<int, int>>{{1, 1}}, 2), lacuna::invalid_complex);
  CHECK_THROWS_AS(lacuna::clique_complex(oct, -1), std::invalid_argument);
}

TEST_CASE("random graphs agree with brute force over all vertex subsets") {
  for (unsigned seed = 1; seed <= 10; ++seed) {
    std::mt19937 rng(seed);
    const int n = 11;
    std::bernoulli_distribution coin(0.55);
    std::vector<std::vector<bool>> adj(n, std::vector<bool>(n, false));
    std::vector<std::pair<int, int>> e;
    for (int u = 0; u < n; ++u)
      for (int v = u + 1; v < n; ++v)
        if (coin(rng)) {
          adj[u][v] = adj[v][u] = true;
          e.emplace_back(v, u);  // either order
        }
    std::vector<int> vs;
    for (int u = 0; u < n; ++u) vs.push_back(u);
    const int d = 4;
    const auto c = lacuna::clique_complex(vs, e, d);
    std::vector<std::size_t> brute(static_cast<std::size_t>(d) + 1, 0);
    for (unsigned mask = 1; mask < (1u << n); ++mask) {
      std::vector<int> s;
      for (int u = 0; u < n; ++u)
        if (mask >> u & 1u) s.push_back(u);
      if (static_cast<int>(s.size()) > d + 1) continue;
      bool clique = true;
      for (std::size_t i = 0; i < s.size() && clique; ++i)
        for (std::size_t j = i + 1; j < s.size(); ++j)
          if (!adj[s[i]][s[j]]) clique = false;
      if (clique) ++brute[s.size() - 1];
    }
    while (!brute.empty() && brute.back() == 0) brute.pop_back();
    CHECK(counts(c) == brute);
    lacuna::validate(c);
  }
}

}  // namespace complex_clique_complex_test

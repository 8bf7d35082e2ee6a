// Helpers shared by the tests in tests/complex/ (included, not a library).
#pragma once

#include <lacuna/complex/coboundary_table.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/simplicial_complex.hpp>

#include <cstdint>
#include <algorithm>
#include <map>
#include <numeric>
#include <queue>
#include <string>
#include <vector>

namespace test_support {

/// The cell counts n_0 .. n_top.
template <class C>
std::vector<std::size_t> counts(const C& c) {
  std::vector<std::size_t> v;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) v.push_back(lacuna::cell_count(c, k));
  return v;
}

inline std::uint64_t binomial(std::uint64_t n, std::uint64_t k) {
  if (k > n) return 0;
  std::uint64_t r = 1;
  for (std::uint64_t i = 1; i <= k; ++i) r = r * (n - k + i) / i;
  return r;
}

/// The boundary of the n-simplex on vertices 0..n (a sphere S^{n-1}).
inline lacuna::simplicial_complex<int> simplex_boundary_sphere(int n) {
  lacuna::simplicial_complex<int>::builder b;
  for (int omit = 0; omit <= n; ++omit) {
    std::vector<int> f;
    for (int v = 0; v <= n; ++v)
      if (v != omit) f.push_back(v);
    b.add_facet(f);
  }
  return std::move(b).finalize();
}

/// The boundary of the n-dimensional cross-polytope (a sphere S^{n-1}): vertices +i and -i
/// (labels i and -i-1... encoded as 2i and 2i+1), facets choose one of each pair.
inline lacuna::simplicial_complex<int> cross_polytope_sphere(int n) {
  lacuna::simplicial_complex<int>::builder b;
  for (std::uint32_t mask = 0; mask < (1u << n); ++mask) {
    std::vector<int> f;
    for (int i = 0; i < n; ++i) f.push_back(2 * i + static_cast<int>((mask >> i) & 1u));
    b.add_facet(f);
  }
  return std::move(b).finalize();
}

/// A triangulated 3x3 grid with its sides identified: the torus (twist = false) or the
/// Klein bottle (twist = true: (3, j) ~ (0, -j)).
inline lacuna::simplicial_complex<int> grid_surface(bool twist) {
  const auto v = [&](int i, int j) {
    j = ((j % 3) + 3) % 3;
    if (i == 3) {
      i = 0;
      if (twist) j = (3 - j) % 3;
    }
    return 3 * i + j;
  };
  lacuna::simplicial_complex<int>::builder b;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      b.add_facet({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      b.add_facet({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return std::move(b).finalize();
}

/// True if every (d-1)-simplex of the pure d-dimensional complex lies in exactly two
/// d-simplices (a closed pseudo-manifold).
template <class C>
bool closed_pseudomanifold(const C& c) {
  const int d = lacuna::top_dimension(c);
  lacuna::coboundary_table<C> t(c);
  for (std::size_t i = 0; i < lacuna::cell_count(c, d - 1); ++i)
    if (t.coboundary(d - 1, i).size() != 2) return false;
  return true;
}

/// For a closed pseudo-manifold: true if the top cells can be given signs so that every
/// codimension-1 cell cancels (an orientation, Hatcher 2002 §3.3). Breadth-first search.
template <class C>
bool orientable(const C& c) {
  const int d = lacuna::top_dimension(c);
  lacuna::coboundary_table<C> t(c);
  const std::size_t n = lacuna::cell_count(c, d);
  std::vector<int> sign(n, 0);
  for (std::size_t s = 0; s < n; ++s) {
    if (sign[s] != 0) continue;
    sign[s] = 1;
    std::queue<std::size_t> q;
    q.push(s);
    while (!q.empty()) {
      const std::size_t x = q.front();
      q.pop();
      for (const auto& term : lacuna::boundary(c, d, x)) {
        const auto f = lacuna::as_incidence(term);
        for (const auto& co : t.coboundary(d - 1, f.face)) {
          if (co.face == x) continue;
          // sign[x]*f.coefficient + sign[y]*co.coefficient must be 0
          const int want = -sign[x] * static_cast<int>(f.coefficient) * static_cast<int>(co.coefficient);
          if (sign[co.face] == 0) {
            sign[co.face] = want;
            q.push(co.face);
          } else if (sign[co.face] != want) {
            return false;
          }
        }
      }
    }
  }
  return true;
}

}  // namespace test_support

#include <random>

namespace test_support {

/// A random simplicial complex: `facets` random facets of 1..max_size of n vertices
/// (labels 0..n-1), from a fixed seed.
inline lacuna::simplicial_complex<int> random_simplicial(unsigned seed, int n, int facets, int max_size) {
  std::mt19937 rng(seed);
  std::uniform_int_distribution<int> size(1, max_size), vertex(0, n - 1);
  lacuna::simplicial_complex<int>::builder b;
  for (int f = 0; f < facets; ++f) {
    std::vector<int> s;
    const int m = size(rng);
    while (static_cast<int>(s.size()) < m) {
      const int v = vertex(rng);
      if (std::find(s.begin(), s.end(), v) == s.end()) s.push_back(v);
    }
    b.add_facet(s);
  }
  return std::move(b).finalize();
}

}  // namespace test_support

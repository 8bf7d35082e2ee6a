// Helpers of the field-reduction tests (tests/algorithm/field_reduction*.cpp and
// tests/reference/field_rank*.cpp): random sparse matrices with a chosen rank bound, the
// complexes whose Betti numbers are known theorems, and independent checks of kernel and
// image bases by matrix products.
#pragma once

#include <doctest/doctest.h>
#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <cstdint>
#include <random>
#include <utility>
#include <vector>

namespace field_reduction_test {

/// 2^61 - 1, a Mersenne prime (the "prime near 2^61").
inline constexpr std::uint64_t mersenne61 = (std::uint64_t{1} << 61U) - 1;

/// An integer matrix as columns of (row, value), rows x cols.
struct int_matrix {
  std::size_t rows = 0, cols = 0;
  std::vector<std::vector<std::pair<std::uint32_t, std::int64_t>>> columns;
};

/// A random sparse integer matrix: each entry non-zero with probability `density`, values in
/// [-range, range]. With rank_bound > 0, the product of a rows x rank_bound and a
/// rank_bound x cols random sparse matrix, so the rank is at most rank_bound.
inline int_matrix random_int_matrix(std::size_t rows, std::size_t cols, double density, std::int64_t range,
                                    std::uint64_t seed, std::size_t rank_bound = 0) {
  std::mt19937_64 gen(seed);
  std::bernoulli_distribution nz(density);
  std::uniform_int_distribution<std::int64_t> val(-range, range);
  auto plain = [&](std::size_t r, std::size_t c) {
    std::vector<std::vector<std::int64_t>> d(r, std::vector<std::int64_t>(c, 0));
    for (auto& row : d)
      for (auto& x : row)
        if (nz(gen)) x = val(gen);
    return d;
  };
  std::vector<std::vector<std::int64_t>> d;
  if (rank_bound == 0) {
    d = plain(rows, cols);
  } else {
    const auto b = plain(rows, rank_bound), c = plain(rank_bound, cols);
    d.assign(rows, std::vector<std::int64_t>(cols, 0));
    for (std::size_t i = 0; i < rows; ++i)
      for (std::size_t t = 0; t < rank_bound; ++t)
        if (b[i][t] != 0)
          for (std::size_t j = 0; j < cols; ++j) d[i][j] += b[i][t] * c[t][j];
  }
  int_matrix m{rows, cols, std::vector<std::vector<std::pair<std::uint32_t, std::int64_t>>>(cols)};
  for (std::size_t j = 0; j < cols; ++j)
    for (std::size_t i = 0; i < rows; ++i)
      if (d[i][j] != 0) m.columns[j].push_back({static_cast<std::uint32_t>(i), d[i][j]});
  return m;
}

/// The image of an integer matrix in F (entries n -> from_integer(n) * unit).
template <class F>
lacuna::sparse_matrix<F> over(const int_matrix& a, const F& unit = lacuna::one<F>()) {
  lacuna::sparse_matrix<F> m(a.rows, a.cols);
  for (std::size_t j = 0; j < a.cols; ++j)
    for (const auto& [i, v] : a.columns[j]) m.add(i, j, lacuna::from_integer<F>(v) * unit);
  m.normalize();
  return m;
}

/// The k x k torus: a grid of squares, opposite sides glued, each cut along a diagonal
/// (the layout of examples/torus_facets.cpp).
inline lacuna::simplicial_complex<int> torus(int k) {
  std::vector<std::vector<int>> f;
  auto v = [k](int i, int j) { return (i % k) * k + (j % k); };
  for (int i = 0; i < k; ++i)
    for (int j = 0; j < k; ++j) {
      f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      f.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return lacuna::simplicial_complex<int>::from_facets(f);
}

/// The 7-vertex torus of Möbius and Császár: triangles {i, i+1, i+3} and {i, i+2, i+3} mod 7.
inline lacuna::simplicial_complex<int> seven_vertex_torus() {
  std::vector<std::vector<int>> f;
  for (int i = 0; i < 7; ++i) {
    f.push_back({i, (i + 1) % 7, (i + 3) % 7});
    f.push_back({i, (i + 2) % 7, (i + 3) % 7});
  }
  return lacuna::simplicial_complex<int>::from_facets(f);
}

/// The 6-vertex real projective plane (the quotient of the icosahedron by the antipodal map).
inline lacuna::simplicial_complex<int> projective_plane() {
  return {{1, 2, 3}, {1, 3, 4}, {1, 4, 5}, {1, 5, 6}, {1, 2, 6}, {2, 3, 5}, {2, 4, 5}, {2, 4, 6}, {3, 4, 6}, {3, 5, 6}};
}

/// The clique complex, up to dimension 3, of a G(n, q) random graph.
inline lacuna::simplicial_complex<int> random_clique_complex(int n, double q, std::uint64_t seed) {
  std::mt19937_64 gen(seed);
  std::bernoulli_distribution edge(q);
  std::vector<int> vs;
  std::vector<std::pair<int, int>> es;
  for (int a = 0; a < n; ++a) {
    vs.push_back(a);
    for (int b = a + 1; b < n; ++b)
      if (edge(gen)) es.push_back({a, b});
  }
  return lacuna::clique_complex(vs, es, 3);
}

/// A v over F, v a sparse vector of length A.cols.
template <class F>
std::vector<F> apply(const lacuna::sparse_matrix<F>& A, const lacuna::sparse_vector<F>& v) {
  std::vector<F> y(A.rows, lacuna::zero<F>());
  for (const auto& e : v)
    for (const auto& a : A.columns[e.index]) y[a.index] += a.value * e.value;
  return y;
}

/// The vectors as the columns of a rows x vs.size() matrix.
template <class F>
lacuna::sparse_matrix<F> as_matrix(std::size_t rows, const std::vector<lacuna::sparse_vector<F>>& vs) {
  lacuna::sparse_matrix<F> m(rows, vs.size());
  for (std::size_t j = 0; j < vs.size(); ++j)
    for (const auto& e : vs[j]) m.add(e.index, j, e.value);
  m.normalize();
  return m;
}

/// [A | B] (same number of rows).
template <class F>
lacuna::sparse_matrix<F> beside(const lacuna::sparse_matrix<F>& A, const lacuna::sparse_matrix<F>& B) {
  lacuna::sparse_matrix<F> m(A.rows, A.cols + B.cols);
  for (std::size_t j = 0; j < A.cols; ++j) m.columns[j] = A.columns[j];
  for (std::size_t j = 0; j < B.cols; ++j) m.columns[A.cols + j] = B.columns[j];
  return m;
}

/// Checks a full result (kernel and image asked for) against A by products and ranks:
/// rank–nullity; A v == 0 for every kernel vector; the kernel vectors independent (rank of
/// the matrix they form, by the reference reduction); the image basis independent and
/// inside the column space, with rank A == rank [A | image] == rank image, so it spans it;
/// pivot rows distinct.
template <class F>
void check_result(const lacuna::sparse_matrix<F>& A, const lacuna::field_reduction_result<F>& r) {
  using lacuna::standard_reduction;
  CHECK(r.rank == r.pivots.size());
  CHECK(r.kernel.size() + r.rank == A.cols);  // rank–nullity
  REQUIRE(r.image.size() == r.rank);
  for (const auto& v : r.kernel) {
    CHECK(!v.empty());
    for (const F& y : apply(A, v)) CHECK(y == lacuna::zero<F>());
  }
  CHECK(lacuna::field_rank(as_matrix(A.cols, r.kernel), standard_reduction{}) == r.kernel.size());
  const auto im = as_matrix(A.rows, r.image);
  CHECK(lacuna::field_rank(im, standard_reduction{}) == r.rank);
  CHECK(lacuna::field_rank(beside(A, im), standard_reduction{}) == r.rank);
  std::vector<bool> seen(A.rows, false);
  for (std::size_t t = 0; t < r.pivots.size(); ++t) {
    CHECK(!seen[r.pivots[t].row]);
    seen[r.pivots[t].row] = true;
    REQUIRE(!r.image[t].empty());
    CHECK(r.image[t].back().index == r.pivots[t].row);
    CHECK(r.image[t].back().value == lacuna::one<F>());
  }
}

/// Two results are the same reduction: pivots, kernel and image entry by entry.
template <class F>
void check_same(const lacuna::field_reduction_result<F>& a, const lacuna::field_reduction_result<F>& b) {
  CHECK(a.rank == b.rank);
  CHECK(a.pivots == b.pivots);
  auto same = [](const std::vector<lacuna::sparse_vector<F>>& x, const std::vector<lacuna::sparse_vector<F>>& y) {
    if (x.size() != y.size()) return false;
    for (std::size_t i = 0; i < x.size(); ++i) {
      if (x[i].size() != y[i].size()) return false;
      for (std::size_t t = 0; t < x[i].size(); ++t)
        if (x[i][t].index != y[i][t].index || !(x[i][t].value == y[i][t].value)) return false;
    }
    return true;
  };
  CHECK(same(a.kernel, b.kernel));
  CHECK(same(a.image, b.image));
}

}  // namespace field_reduction_test

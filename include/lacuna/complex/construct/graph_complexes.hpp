// lacuna/complex/construct/graph_complexes.hpp — two standard simplicial complexes of graphs,
// the classic test cases of torsion in homology (Bouc 1992; Shareshian & Wachs 2007):
//   matching_complex(n)        M(K_n): vertices the edges of the complete graph K_n,
//                              simplices the matchings (sets of pairwise disjoint edges);
//   chessboard_complex(m, n)   vertices the squares of an m × n board, simplices the
//                              placements of non-attacking rooks (no two in a row or column).
// Both are given by their facets, the maximal matchings / placements, and closed.
#pragma once

#include <lacuna/complex/simplicial_complex.hpp>

#include <stdexcept>
#include <vector>

namespace lacuna {

/// The facets of the matching complex of K_n: the matchings that leave at most one vertex
/// uncovered (exactly the maximal ones: two uncovered vertices would span a free edge). The
/// vertex {a, b} (a < b) of the complex is numbered a·n + b. Count: (n−1)!! for n even,
/// n·(n−2)!! for n odd.
inline std::vector<std::vector<int>> matching_complex_facets(int n) {
  if (n < 2 || n > 40) throw std::invalid_argument("lacuna: matching_complex needs 2 <= n <= 40");
  std::vector<std::vector<int>> facets;
  std::vector<bool> used(static_cast<std::size_t>(n), false);
  std::vector<int> current;
  auto go = [&](auto&& self, bool skipped) -> void {
    int v = 0;
    while (v < n && used[static_cast<std::size_t>(v)]) ++v;
    if (v == n) {
      facets.push_back(current);
      return;
    }
    used[static_cast<std::size_t>(v)] = true;
    for (int w = v + 1; w < n; ++w) {
      if (used[static_cast<std::size_t>(w)]) continue;
      used[static_cast<std::size_t>(w)] = true;
      current.push_back(v * n + w);
      self(self, skipped);
      current.pop_back();
      used[static_cast<std::size_t>(w)] = false;
    }
    if (!skipped && n % 2 == 1) self(self, true);  // v is the one uncovered vertex
    used[static_cast<std::size_t>(v)] = false;
  };
  go(go, false);
  return facets;
}

/// The matching complex M(K_n), 2 <= n <= 40 (the closure of matching_complex_facets(n)).
inline simplicial_complex<int> matching_complex(int n) {
  return simplicial_complex<int>::from_facets(matching_complex_facets(n));
}

/// The facets of the m × n chessboard complex: placements of min(m, n) non-attacking rooks.
/// The square (row r, column c) is the vertex r·n + c.
inline std::vector<std::vector<int>> chessboard_complex_facets(int m, int n) {
  if (m < 1 || n < 1 || m * n > 4096) throw std::invalid_argument("lacuna: chessboard_complex needs 1 <= m, n and m*n <= 4096");
  const bool by_rows = m <= n;  // place one rook in every line of the shorter side
  const int lines = by_rows ? m : n, other = by_rows ? n : m;
  std::vector<std::vector<int>> facets;
  std::vector<bool> used(static_cast<std::size_t>(other), false);
  std::vector<int> current;
  auto go = [&](auto&& self, int line) -> void {
    if (line == lines) {
      facets.push_back(current);
      return;
    }
    for (int c = 0; c < other; ++c) {
      if (used[static_cast<std::size_t>(c)]) continue;
      used[static_cast<std::size_t>(c)] = true;
      current.push_back(by_rows ? line * n + c : c * n + line);
      self(self, line + 1);
      current.pop_back();
      used[static_cast<std::size_t>(c)] = false;
    }
  };
  go(go, 0);
  return facets;
}

/// The chessboard complex of an m × n board (the closure of chessboard_complex_facets).
inline simplicial_complex<int> chessboard_complex(int m, int n) {
  return simplicial_complex<int>::from_facets(chessboard_complex_facets(m, n));
}

}  // namespace lacuna

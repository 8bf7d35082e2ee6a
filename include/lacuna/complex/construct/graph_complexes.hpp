// lacuna/complex/construct/graph_complexes.hpp — two standard simplicial complexes of graphs,
// the classic test cases of torsion in homology (Bouc 1992; Shareshian & Wachs 2007):
//   matching_complex(n)        M(K_n): vertices the edges of the complete graph K_n,
//                              simplices the matchings (sets of pairwise disjoint edges);
//   chessboard_complex(m, n)   vertices the squares of an m × n board, simplices the
//                              placements of non-attacking rooks (no two in a row or column).
// Both are given by their facets, the maximal matchings / placements, and closed.
#pragma once

#include <lacuna/complex/simplicial_complex.hpp>

#include <concepts>
#include <limits>
#include <stdexcept>
#include <vector>

namespace lacuna {

/// The facets of the matching complex of K_n: the matchings that leave at most one vertex
/// uncovered (exactly the maximal ones: two uncovered vertices would span a free edge). The
/// vertex {a, b} (a < b) of the complex is numbered a·n + b. Count: (n−1)!! for n even,
/// n·(n−2)!! for n odd. `Label`: the integer type of the vertex numbers, int by default; a
/// template so that only the translation units that call it compile it (DEVELOPERS.md,
/// *Compile cost of the headers*).
template <std::integral Label = int>
  requires(std::numeric_limits<Label>::max() >= 4095)
std::vector<std::vector<Label>> matching_complex_facets(int n) {
  if (n < 2 || n > 40) throw std::invalid_argument("lacuna: matching_complex needs 2 <= n <= 40");
  std::vector<std::vector<Label>> facets;
  std::vector<bool> used(static_cast<std::size_t>(n), false);
  std::vector<Label> current;
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
      current.push_back(static_cast<Label>(v * n + w));  // below 40·40
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
/// `Label`: the integer type of the vertex labels, int by default (wide enough for the labels
/// below 40·40). A template so that only the translation units that build it instantiate
/// simplicial_complex<Label> (DEVELOPERS.md, *Compile cost of the headers*).
template <std::integral Label = int>
  requires(std::numeric_limits<Label>::max() >= 4095)
simplicial_complex<Label> matching_complex(int n) {
  return simplicial_complex<Label>::from_facets(matching_complex_facets<Label>(n));
}

/// The facets of the m × n chessboard complex: placements of min(m, n) non-attacking rooks.
/// The square (row r, column c) is the vertex r·n + c. `Label`: as for matching_complex_facets.
template <std::integral Label = int>
  requires(std::numeric_limits<Label>::max() >= 4095)
std::vector<std::vector<Label>> chessboard_complex_facets(int m, int n) {
  if (m < 1 || n < 1 || m * n > 4096) throw std::invalid_argument("lacuna: chessboard_complex needs 1 <= m, n and m*n <= 4096");
  const bool by_rows = m <= n;  // place one rook in every line of the shorter side
  const int lines = by_rows ? m : n, other = by_rows ? n : m;
  std::vector<std::vector<Label>> facets;
  std::vector<bool> used(static_cast<std::size_t>(other), false);
  std::vector<Label> current;
  auto go = [&](auto&& self, int line) -> void {
    if (line == lines) {
      facets.push_back(current);
      return;
    }
    for (int c = 0; c < other; ++c) {
      if (used[static_cast<std::size_t>(c)]) continue;
      used[static_cast<std::size_t>(c)] = true;
      current.push_back(static_cast<Label>(by_rows ? line * n + c : c * n + line));  // below 4096
      self(self, line + 1);
      current.pop_back();
      used[static_cast<std::size_t>(c)] = false;
    }
  };
  go(go, 0);
  return facets;
}

/// The chessboard complex of an m × n board (the closure of chessboard_complex_facets).
/// `Label`: the integer type of the vertex labels, int by default (wide enough for the labels
/// below 4096); a template for the reason matching_complex is one.
template <std::integral Label = int>
  requires(std::numeric_limits<Label>::max() >= 4095)
simplicial_complex<Label> chessboard_complex(int m, int n) {
  return simplicial_complex<Label>::from_facets(chessboard_complex_facets<Label>(m, n));
}

}  // namespace lacuna

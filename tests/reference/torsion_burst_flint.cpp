// A random 2-complex whose H_1 has torsion beyond 2^64, against FLINT (issue: "random
// 2-complexes with torsion beyond 2^64 against FLINT").
//
// The complex: all edges on 80 vertices and a prefix of a random order of all triangles
// (Linial & Meshulam 2006), taken near 2.7 · C(80,3)/80 triangles, where the torsion of H_1
// bursts before the large 2-cycles are born (Kahle, Lutz, Newman & Parsons 2020, from memory).
// The order: Fisher–Yates written out here (so that it is the same with every standard library)
// with std::mt19937_64 seed 3; the prefix of 2 780 triangles has a torsion factor of 30 digits.
//
// The reference, independent of the engine: the test's own reduction of ∂_2, then FLINT.
//   1. Collapses (an edge in exactly one triangle goes with it): a homotopy equivalence, so the
//      torsion of H_1 is that of coker ∂_2 on the 2-core (edges in no triangle only add free
//      summands).
//   2. Elimination of unit pivots (an entry ±1, fewest fill first) over Boost's cpp_int: row and
//      column operations invertible over Z, so the Smith form of ∂_2 is that of the remainder
//      plus one 1 per pivot.
//   3. FLINT on the remainder: fmpz_mat_hnf of its transpose, fmpz_mat_hnf of the transpose of
//      the non-zero rows (row operations over Z keep the invariant factors), then fmpz_mat_snf of
//      the square full-rank block. (fmpz_mat_snf straight on the rectangular remainder, 103 × 51
//      here, ran past 8 GB: its route for a rectangular matrix lets the entries grow.)
#include "flint_support.hpp"

#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <array>
#include <map>
#include <random>
#include <set>

namespace reference_torsion_burst_flint_test {

using lacuna::integer;
using cpp_int = boost::multiprecision::cpp_int;

struct burst_complex {
  int n = 80;
  std::vector<std::array<int, 3>> triangles;
  std::vector<std::vector<int>> facets;  // every edge, then the triangles
};

burst_complex make_burst(std::uint64_t seed, std::size_t prefix) {
  burst_complex b;
  const int n = b.n;
  for (int a = 0; a < n; ++a)
    for (int c = a + 1; c < n; ++c)
      for (int d = c + 1; d < n; ++d) b.triangles.push_back({a, c, d});
  std::mt19937_64 rng(seed);
  for (std::size_t i = b.triangles.size() - 1; i > 0; --i) std::swap(b.triangles[i], b.triangles[rng() % (i + 1)]);
  b.triangles.resize(prefix);
  for (int a = 0; a < n; ++a)
    for (int c = a + 1; c < n; ++c) b.facets.push_back({a, c});
  for (const auto& t : b.triangles) b.facets.push_back({t[0], t[1], t[2]});
  return b;
}

/// The non-unit invariant factors of ∂_2, by steps 1–3 of the file comment.
std::vector<std::string> reference_torsion(const burst_complex& b) {
  using edge = std::pair<int, int>;
  const auto& tri = b.triangles;
  // 1. collapses
  std::map<edge, std::set<std::size_t>> cofaces;
  auto faces = [&](std::size_t i) {
    const auto& t = tri[i];
    return std::array<edge, 3>{edge{t[1], t[2]}, edge{t[0], t[2]}, edge{t[0], t[1]}};  // signs +, -, +
  };
  for (std::size_t i = 0; i < tri.size(); ++i)
    for (const auto& e : faces(i)) cofaces[e].insert(i);
  std::vector<bool> alive(tri.size(), true);
  for (bool changed = true; changed;) {
    changed = false;
    for (auto& [e, s] : cofaces)
      if (s.size() == 1) {
        const std::size_t i = *s.begin();
        alive[i] = false;
        for (const auto& f : faces(i)) cofaces[f].erase(i);
        changed = true;
      }
  }
  std::map<edge, int> row_of;
  for (const auto& [e, s] : cofaces)
    if (!s.empty()) row_of.emplace(e, static_cast<int>(row_of.size()));
  // 2. unit pivots, over cpp_int
  std::vector<std::map<int, cpp_int>> col;
  for (std::size_t i = 0; i < tri.size(); ++i) {
    if (!alive[i]) continue;
    std::map<int, cpp_int> c;
    const auto f = faces(i);
    c[row_of.at(f[0])] += 1;
    c[row_of.at(f[1])] -= 1;
    c[row_of.at(f[2])] += 1;
    col.push_back(std::move(c));
  }
  std::vector<std::set<int>> cols_of_row(row_of.size());
  for (std::size_t j = 0; j < col.size(); ++j)
    for (const auto& [r, v] : col[j]) cols_of_row[static_cast<std::size_t>(r)].insert(static_cast<int>(j));
  std::vector<bool> row_gone(row_of.size(), false), col_gone(col.size(), false);
  for (;;) {
    long best = -1;
    int br = -1, bc = -1;
    for (std::size_t j = 0; j < col.size(); ++j)
      if (!col_gone[j])
        for (const auto& [r, v] : col[j])
          if (abs(v) == 1) {
            const long cost = static_cast<long>(col[j].size() - 1) * static_cast<long>(cols_of_row[static_cast<std::size_t>(r)].size() - 1);
            if (best < 0 || cost < best) best = cost, br = r, bc = static_cast<int>(j);
          }
    if (best < 0) break;
    const cpp_int pivot = col[static_cast<std::size_t>(bc)][br];  // ±1: its own inverse
    const std::vector<int> others(cols_of_row[static_cast<std::size_t>(br)].begin(), cols_of_row[static_cast<std::size_t>(br)].end());
    for (const int k : others) {
      if (k == bc) continue;
      auto& ck = col[static_cast<std::size_t>(k)];
      const cpp_int f = ck[br] * pivot;
      for (const auto& [r, v] : col[static_cast<std::size_t>(bc)]) {
        cpp_int& x = ck[r];
        x -= f * v;
        if (x == 0) {
          ck.erase(r);
          cols_of_row[static_cast<std::size_t>(r)].erase(k);
        } else {
          cols_of_row[static_cast<std::size_t>(r)].insert(k);
        }
      }
    }
    for (const auto& [r, v] : col[static_cast<std::size_t>(bc)]) cols_of_row[static_cast<std::size_t>(r)].erase(bc);
    col[static_cast<std::size_t>(bc)].clear();
    col_gone[static_cast<std::size_t>(bc)] = true;
    row_gone[static_cast<std::size_t>(br)] = true;
  }
  std::map<int, slong> rows;
  for (std::size_t r = 0; r < row_of.size(); ++r)
    if (!row_gone[r] && !cols_of_row[r].empty()) rows.emplace(static_cast<int>(r), static_cast<slong>(rows.size()));
  std::vector<std::size_t> cols;
  for (std::size_t j = 0; j < col.size(); ++j)
    if (!col_gone[j] && !col[j].empty()) cols.push_back(j);
  const auto m = static_cast<slong>(rows.size()), c = static_cast<slong>(cols.size());
  if (m == 0 || c == 0) return {};
  // 3. FLINT: the transpose's HNF, its non-zero rows transposed and put in HNF, then the Smith form
  fmpz_mat_t T, H;
  fmpz_mat_init(T, c, m);
  for (slong j = 0; j < c; ++j)
    for (const auto& [r, v] : col[cols[static_cast<std::size_t>(j)]]) fmpz_set_str(fmpz_mat_entry(T, j, rows.at(r)), v.str().c_str(), 10);
  const slong rank = fmpz_mat_rank(T);
  fmpz_mat_init(H, c, m);
  fmpz_mat_hnf(H, T);
  fmpz_mat_t U, H2, S;
  fmpz_mat_init(U, m, rank);
  for (slong i = 0; i < rank; ++i)
    for (slong j = 0; j < m; ++j) fmpz_set(fmpz_mat_entry(U, j, i), fmpz_mat_entry(H, i, j));
  fmpz_mat_init(H2, m, rank);
  fmpz_mat_hnf(H2, U);
  fmpz_mat_t Q;
  fmpz_mat_init(Q, rank, rank);
  for (slong i = 0; i < rank; ++i)
    for (slong j = 0; j < rank; ++j) fmpz_set(fmpz_mat_entry(Q, i, j), fmpz_mat_entry(H2, i, j));
  fmpz_mat_init(S, rank, rank);
  fmpz_mat_snf(S, Q);
  std::vector<std::string> out;
  for (slong i = 0; i < rank; ++i) {
    const fmpz* x = fmpz_mat_entry(S, i, i);
    if (!fmpz_is_zero(x) && !fmpz_is_one(x)) out.push_back(flint_test::fmpz_text(x));
  }
  for (auto* M : {&T, &H, &U, &H2, &Q, &S}) fmpz_mat_clear(*M);
  return out;
}

TEST_CASE("a random 2-complex on 80 vertices with H_1 torsion beyond 2^64, against FLINT") {
  const auto b = make_burst(3, 2780);
  const auto cx = lacuna::simplicial_complex<int>::from_facets(b.facets);
  const auto h = lacuna::homology<integer>(cx);
  REQUIRE(h.groups.size() >= 3);
  std::vector<std::string> engine;
  for (const auto& t : h.groups[1].torsion) engine.push_back(t.to_string());
  const auto flint = reference_torsion(b);
  CHECK(engine == flint);
  // the case is the one it claims to be: a factor beyond 2^64
  REQUIRE(!flint.empty());
  CHECK(cpp_int(flint.back()) > (cpp_int(1) << 64));
  CHECK(h.groups[0].rank == 1);
  CHECK(h.groups[2].torsion.empty());  // H_2 of a 2-complex is free
  // universal coefficients (Hatcher 2002, Corollary 3A.6, from memory): over Z/p, dim H_1 =
  // b_1 + #{factors divisible by p}, dim H_2 = b_2 + the same number (the Tor term of H_1)
  auto divisible = [&](int p) {
    std::size_t n = 0;
    for (const auto& t : flint) n += cpp_int(t) % p == 0 ? 1 : 0;
    return n;
  };
  const auto h2 = lacuna::homology<lacuna::mod_p<2>>(cx);
  const auto h3 = lacuna::homology<lacuna::mod_p<3>>(cx);
  CHECK(h2.groups[1].rank == h.groups[1].rank + divisible(2));
  CHECK(h2.groups[2].rank == h.groups[2].rank + divisible(2));
  CHECK(h3.groups[1].rank == h.groups[1].rank + divisible(3));
  CHECK(h3.groups[2].rank == h.groups[2].rank + divisible(3));
}

}  // namespace reference_torsion_burst_flint_test

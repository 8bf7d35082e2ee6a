// Coefficients matter where there is torsion: filtered projective planes, projective spaces
// and a lens space over Z/2 and Z/3.
//
// At every value t, the universal coefficient theorem (Hatcher, "Algebraic Topology", 2002,
// Corollary 3A.6 / Theorem 3A.3) gives the dimension of H_k(K_t; Z/p) from the integral
// homology of the subcomplex K_t — computed by lacuna::homology over Z, without any filtration:
//     dim H_k(K_t; Z/p) = rank H_k(K_t) + #{torsion factors of H_k divisible by p}
//                                       + #{torsion factors of H_{k-1} divisible by p}.
// The 6-vertex projective plane (the hemi-icosahedron: 6 vertices, 15 edges, 10 triangles,
// each edge in two triangles; from memory, and checked here to have H = Z, Z/2, 0): its
// proper subcomplexes have no torsion, so over Z/2 and Z/3 the diagrams agree until the last
// triangle enters; then over Z/2 it creates the class of H_2 and the class of H_1 born with the
// last edge to complete Z/2 stays, while over Z/3 that triangle kills that class instead.
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <optional>
#include <random>
#include <utility>
#include <vector>

namespace persistence_projective_plane_test {

namespace support = persistence_test_support;

inline lacuna::simplicial_complex<int> hemi_icosahedron() {
  return lacuna::simplicial_complex<int>{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}, {0, 5, 1},
                                         {1, 2, 4}, {2, 3, 5}, {3, 4, 1}, {4, 5, 2}, {5, 1, 3}};
}

/// dim H_k(K; Z/p) by the universal coefficient theorem from the integral homology of K.
inline std::vector<std::size_t> uct_dimensions(const lacuna::cell_list& c, std::size_t dims, std::int64_t p) {
  const auto h = lacuna::homology<lacuna::integer>(c);
  std::vector<std::size_t> out(dims, 0);
  auto divisible = [&](int k) {
    std::size_t n = 0;
    if (k < 0 || k > h.top_dimension()) return n;
    for (const auto& t : h[k].torsion) n += (t % lacuna::integer(p)).sign() == 0;
    return n;
  };
  for (int k = 0; k < static_cast<int>(dims); ++k)
    if (k <= h.top_dimension()) out[static_cast<std::size_t>(k)] = h[k].rank + divisible(k) + divisible(k - 1);
  return out;
}

/// At every value of f: the diagrams over Z/2 and Z/3 give the dimensions of the theorem.
template <class F>
void check_uct(const F& f) {
  const auto r2 = lacuna::persistence<lacuna::z2>(f);
  const auto r3 = lacuna::persistence<lacuna::mod_p<3>>(f);
  const auto dims = static_cast<std::size_t>(lacuna::top_dimension(f) + 1);
  std::vector<int> values;
  for (int k = 0; k <= lacuna::top_dimension(f); ++k)
    for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) values.push_back(lacuna::cell_value(f, k, i));
  std::sort(values.begin(), values.end());
  values.erase(std::unique(values.begin(), values.end()), values.end());
  for (const int t : values) {
    CAPTURE(t);
    const auto sub = support::at_value(f, t);
    CHECK(r2.betti_numbers(t) == uct_dimensions(sub.complex, dims, 2));
    CHECK(r3.betti_numbers(t) == uct_dimensions(sub.complex, dims, 3));
  }
}

using pair_values = std::vector<std::pair<int, std::optional<int>>>;

template <class R>
pair_values values_of(const lacuna::persistence_result<int, R, std::less<int>>& r, int k) {
  pair_values v;
  for (const auto& p : r[k].pairs) v.emplace_back(p.birth, p.death);
  std::sort(v.begin(), v.end());
  return v;
}

TEST_CASE("the hemi-icosahedron is a projective plane (H = Z, Z/2, 0)") {
  const auto c = hemi_icosahedron();
  CHECK(c.cell_count(0) == 6);
  CHECK(c.cell_count(1) == 15);
  CHECK(c.cell_count(2) == 10);
  const auto h = lacuna::homology<lacuna::integer>(lacuna::subcomplex(c, [](int, std::size_t) { return true; }));
  CHECK(h.betti_numbers() == std::vector<std::size_t>{1, 0, 0});
  REQUIRE(h[1].torsion.size() == 1);
  CHECK(h[1].torsion[0] == lacuna::integer(2));
}

TEST_CASE("filtered 6-vertex projective planes: Z/2 and Z/3 differ only at the last triangle, as the torsion says") {
  const auto c = hemi_icosahedron();
  std::mt19937_64 rng(62);
  for (int trial = 0; trial < 8; ++trial) {
    const lacuna::values_filtration<lacuna::simplicial_complex<int>, int> f(c, support::random_monotone_values(rng, c, 4));
    check_uct(f);
    const auto r2 = lacuna::persistence<lacuna::z2>(f);
    const auto r3 = lacuna::persistence<lacuna::mod_p<3>>(f);
    int last = 0;
    for (std::size_t i = 0; i < c.cell_count(2); ++i) last = std::max(last, f.cell_value(2, i));
    CHECK(values_of(r2, 0) == values_of(r3, 0));
    // dimension 2: over Z/2 one essential class born with the last triangle; none over Z/3
    CHECK(values_of(r2, 2) == pair_values{{last, std::nullopt}});
    CHECK(values_of(r3, 2).empty());
    // dimension 1: the same pairs but one, essential over Z/2 and killed at `last` over Z/3
    auto a = values_of(r2, 1), b = values_of(r3, 1);
    pair_values only2, only3;
    std::set_difference(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(only2));
    std::set_difference(b.begin(), b.end(), a.begin(), a.end(), std::back_inserter(only3));
    REQUIRE(only2.size() == 1);
    REQUIRE(only3.size() == 1);
    CHECK(!only2[0].second.has_value());
    CHECK(only3[0].first == only2[0].first);
    CHECK(only3[0].second == last);
  }
}

TEST_CASE("projective spaces and a lens space cell by cell: the universal coefficients at every value") {
  std::mt19937_64 rng(63);
  for (const auto& c : {lacuna::cell_list::real_projective_space(4), lacuna::cell_list::lens_space(3, 1),
                        lacuna::cell_list::projective_plane(), lacuna::cell_list::klein_bottle()}) {
    for (int trial = 0; trial < 3; ++trial) {
      const lacuna::values_filtration<lacuna::cell_list, int> f(c, support::random_monotone_values(rng, c, 3));
      check_uct(f);
    }
  }
}

}  // namespace persistence_projective_plane_test

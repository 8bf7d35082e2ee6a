// variants_side_by_side — one complex through every algorithm variant (docs/homology.md,
// "Variants" and "Reductions before the algebra"): the matching complex M(K_n) (n = 9, or the
// first argument, 3 to 11) over Z by each pre-reduction, the coboundary route and (n <= 8)
// dense Smith forms; over Z/2 and Z/3 by the field column reduction and by elimination. Each
// row is the best of three runs timed with std::chrono: a demonstration, not a measurement
// (those are in benchmarks/ and docs/performance.md). Checks, exit status 1 if one fails:
// every variant gives the same groups over its ring; the alternating sum of the ranks is χ
// from the cell counts (Euler–Poincaré); the dimensions over Z/p are those the universal
// coefficient theorem predicts from H_*(X; Z) (Hatcher 2002, Theorem 3A.3, Corollary 3A.6).
#include <lacuna/lacuna.hpp>

#include <algorithm>
#include <chrono>
#include <concepts>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <utility>
#include <vector>

namespace {

int failures = 0;

template <class R>
std::string groups_text(const lacuna::homology_result<R>& h) {  // "1, 0, 42+(Z/3)^8, 70"
  std::string s;
  for (const auto& g : h.groups) {
    s += (s.empty() ? "" : ", ") + std::to_string(g.rank);
    if constexpr (std::same_as<R, lacuna::integer>)  // over a field there is no torsion
      for (std::size_t i = 0, j = 0; i < g.torsion.size(); i = j) {
        while (j < g.torsion.size() && g.torsion[j] == g.torsion[i]) ++j;
        s += "+(Z/" + g.torsion[i].to_string() + ")" + (j - i > 1 ? "^" + std::to_string(j - i) : "");
      }
  }
  return s;
}

/// Runs one variant, prints its row, and compares its groups with the first row of its ring.
template <class R, class C, class Alg>
lacuna::homology_result<R> row(const char* ring, const char* variant, const C& c, const Alg& alg, std::string& first) {
  lacuna::homology_result<R> h;
  double ms = 1e300;
  for (int run = 0; run < 3; ++run) {
    const auto start = std::chrono::steady_clock::now();
    h = lacuna::homology<R>(c, {}, alg);
    ms = std::min(ms, std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
  }
  const std::string text = groups_text(h);
  if (first.empty()) first = text;
  failures += text == first ? 0 : 1;
  std::printf("%-4s %-34s %9.2f ms  %s%s\n", ring, variant, ms, text.c_str(), text == first ? "" : "  DIFFERS");
  return h;
}

}  // namespace

int main(int argc, char** argv) {
  const int n = argc > 1 ? std::atoi(argv[1]) : 9;
  if (n < 3 || n > 11) return std::printf("usage: variants_side_by_side [n], 3 <= n <= 11\n"), 2;
  const auto c = lacuna::matching_complex(n);
  const std::int64_t chi = lacuna::euler_characteristic(c);  // from the cell counts
  std::printf("matching complex M(K_%d): %zu cells, chi = %lld\n", n, lacuna::total_cell_count(c), (long long)chi);
  std::printf("ring variant                            best of 3    ranks by dimension (+ torsion)\n");
  using lacuna::pre_reduction, lacuna::sparse_elimination, lacuna::integer;
  std::string z, z2, z3;
  const auto hz = row<integer>("Z", "default (coboundary route)", c, sparse_elimination{}, z);
  row<integer>("Z", "coboundary_reduction", c, lacuna::coboundary_reduction{}, z);
  for (const auto& [name, r] : {std::pair{"elimination, no pre-reduction", pre_reduction::none},
                                {"elimination after collapses", pre_reduction::collapses},
                                {"elimination after coreductions", pre_reduction::coreductions},
                                {"elimination after both", pre_reduction::coreductions_and_collapses},
                                {"elimination on the Morse complex", pre_reduction::morse}})
    row<integer>("Z", name, c, sparse_elimination{.reduction = r, .allow_coboundary_route = false}, z);
  if (n <= 8) row<integer>("Z", "dense Smith forms (cubic cost)", c, lacuna::dense_elimination{}, z);
  const auto h2 = row<lacuna::z2>("Z/2", "field column reduction", c, sparse_elimination{}, z2);
  row<lacuna::z2>("Z/2", "elimination", c, sparse_elimination{.field_column_reduction = false}, z2);
  const auto h3 = row<lacuna::mod_p<3>>("Z/3", "field column reduction", c, sparse_elimination{}, z3);
  row<lacuna::mod_p<3>>("Z/3", "elimination", c, sparse_elimination{.field_column_reduction = false}, z3);
  // dim H_k(X; Z/p) = rank H_k + #{t : p | t} over the torsion of H_k and of H_{k-1}.
  std::int64_t chi_h = 0;
  std::vector<std::size_t> p2, p3;
  for (std::size_t k = 0; k < hz.groups.size(); ++k) {
    chi_h += (k % 2 ? -1 : 1) * std::int64_t(hz.groups[k].rank);
    p2.push_back(hz.groups[k].rank), p3.push_back(hz.groups[k].rank);
    for (std::size_t j = (k == 0 ? 0 : k - 1); j <= k; ++j)
      for (const auto& t : hz.groups[j].torsion) p2.back() += t % integer(2) == 0, p3.back() += t % integer(3) == 0;
  }
  const bool euler = chi_h == chi, uct = h2.betti_numbers() == p2 && h3.betti_numbers() == p3;
  failures += (euler ? 0 : 1) + (uct ? 0 : 1);
  std::printf("Euler-Poincare: %s; universal coefficients over Z/2 and Z/3: %s\n%s\n", euler ? "yes" : "NO",
              uct ? "yes" : "NO", failures == 0 ? "all self-checks passed" : "some self-checks failed");
  return failures == 0 ? 0 : 1;
}

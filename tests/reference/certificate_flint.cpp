// The torsion witnesses of certificates over Z (homology/certify.hpp, checked by
// homology/certificate.hpp) against FLINT (fmpz_mat_snf and fmpz_mat_det), an independent
// implementation. For every group H_k of a certificate that checks: the product of the claimed
// torsion factors equals the product of the non-unit invariant factors of ∂_{k+1} by FLINT's
// Smith form (the structure theorem; Munkres 1984, Theorem 11.4, from memory), and the gcd of
// the determinants of the witness's minors — each minor built from the certificate's rows and
// columns and its determinant taken by FLINT, not by lacuna — equals that product too (the
// ρ-th determinantal divisor of ∂_{k+1} is the product of its invariant factors; Newman 1972,
// Integral Matrices, chapter II, from memory). Complexes: random presentation complexes (one
// vertex, loops, 2-cells with random boundaries), the matching complexes of K_6 and K_7
// (H_1(M(K_7)) = Z/3, Shareshian & Wachs 2007, from memory) and chessboard complexes.
#include "flint_support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>

#include <random>

namespace reference_certificate_flint_test {

using namespace flint_test;

/// Certifies c over Z, checks the certificate, and compares every torsion witness with FLINT.
/// Returns the number of groups with torsion.
template <class C>
int torsion_witnesses_agree_with_flint(const C& c) {
  const auto r = lacuna::certified_homology<integer>(c);
  const auto rep = lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  REQUIRE(rep.ok);
  int with_torsion = 0;
  const int top = lacuna::top_dimension(c);
  for (int k = 0; k < top; ++k) {
    const auto d = exact_boundary(c, k + 1);
    cpp_int flint_product = 1;
    std::size_t flint_rank = 0;
    for (const auto& s : flint_invariants(d)) {
      flint_product *= cpp_int(s);
      ++flint_rank;
    }
    if (flint_product < 0) flint_product = -flint_product;
    cpp_int claimed = 1;
    for (const auto& t : r.certificate.groups[static_cast<std::size_t>(k)].torsion) claimed *= to_cpp(t);
    if (claimed < 0) claimed = -claimed;
    CAPTURE(k);
    CHECK(claimed == flint_product);
    CHECK(r.certificate.ranks[static_cast<std::size_t>(k) + 1].rows.size() == flint_rank);
    if (flint_rank == 0) continue;
    const auto& w = r.certificate.torsion[static_cast<std::size_t>(k)];
    cpp_int g = 0;
    for (const auto& b : w.minors) {
      std::vector<std::size_t> rows = w.pivot_rows, cols = w.pivot_columns;
      rows.insert(rows.end(), b.rows.begin(), b.rows.end());
      cols.insert(cols.end(), b.columns.begin(), b.columns.end());
      REQUIRE(rows.size() == flint_rank);
      REQUIRE(cols.size() == flint_rank);
      g = boost::multiprecision::gcd(g, flint_minor_determinant(d, rows, cols));
    }
    if (g < 0) g = -g;
    CHECK(g == flint_product);
    with_torsion += claimed != 1;
  }
  return with_torsion;
}

TEST_CASE("torsion witnesses of random presentation complexes agree with FLINT") {
  std::mt19937_64 random(4711);
  int with_torsion = 0;
  for (int trial = 0; trial < 60; ++trial) {
    const std::size_t n = 2 + random() % 10, m = 1 + random() % 10;
    lacuna::cell_list c;
    c.add_cell(0, "v");
    for (std::size_t i = 0; i < n; ++i) c.add_cell(1, "e" + std::to_string(i), {{0, 1}, {0, -1}});
    for (std::size_t j = 0; j < m; ++j) {
      std::vector<lacuna::incidence> b;
      for (std::size_t i = 0; i < n; ++i) {
        std::int64_t v = static_cast<std::int64_t>(random() % 7) - 3;
        if (random() % 4 == 0) v *= static_cast<std::int64_t>(2 + random() % 5);
        if (random() % 3 == 0) v = 0;
        if (v != 0) b.push_back({i, v});
      }
      c.add_cell(2, "f" + std::to_string(j), b);
    }
    CAPTURE(trial);
    with_torsion += torsion_witnesses_agree_with_flint(c);
  }
  CHECK(with_torsion >= 20);  // the test must meet torsion to mean anything
}

TEST_CASE("torsion witnesses of matching and chessboard complexes agree with FLINT") {
  torsion_witnesses_agree_with_flint(lacuna::matching_complex(6));
  CHECK(torsion_witnesses_agree_with_flint(lacuna::matching_complex(7)) >= 1);  // H_1 = Z/3
  torsion_witnesses_agree_with_flint(lacuna::chessboard_complex(3, 4));
  torsion_witnesses_agree_with_flint(lacuna::chessboard_complex(4, 5));
}

}  // namespace reference_certificate_flint_test

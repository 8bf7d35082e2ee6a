// Certificates of relative homology and of cohomology (homology/certify.hpp, checked by
// homology/certificate.hpp) against FLINT's fmpz_mat_snf and fmpz_mat_det, an independent
// implementation. For the pair (X, A) the chain complex is the quotient C(X)/C(A): the boundary
// matrices with the rows and columns of A's cells removed (here: set to zero, which leaves the
// non-zero invariant factors and the minors on other cells unchanged); for cohomology, the
// coboundaries δ_k = ∂_{k+1}ᵀ. For every degree k of a certificate that checks: the free rank is
// n_k − rank(out of k) − rank(into k) and the torsion factors are the non-unit invariant factors
// of the map into degree k (the structure theorem; Munkres 1984, Theorem 11.4, from memory), and
// the gcd of the determinants of the torsion witness's minors — built from the certificate's
// rows and columns, determinants by FLINT — is their product (the ρ-th determinantal divisor;
// Newman 1972, Integral Matrices, chapter II, from memory).
#include "flint_support.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>

#include <random>

namespace reference_certificate_kinds_flint_test {

using namespace flint_test;
using marks_t = std::vector<std::vector<bool>>;

/// ∂_k of c with the rows and columns of the cells marked in a set to zero (the quotient's).
template <class C>
bmatrix quotient_boundary(const C& c, int k, const marks_t& a) {
  bmatrix m = exact_boundary(c, k);
  for (std::size_t i = 0; i < m.rows; ++i)
    for (std::size_t j = 0; j < m.cols; ++j)
      if (a[static_cast<std::size_t>(k) - 1][i] || a[static_cast<std::size_t>(k)][j]) m.a[i][j] = 0;
  return m;
}

/// Checks the certificate (relative when a is given, else cohomology) and compares each group
/// and each torsion witness with FLINT. Returns the number of groups with torsion.
template <class C>
int agrees_with_flint(const C& c, const marks_t* a) {
  const auto r = a ? lacuna::certified_relative_homology<integer>(c, *a) : lacuna::certified_cohomology<integer>(c);
  const auto rep = a ? lacuna::check_certificate(c, r.certificate, *a) : lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  REQUIRE(rep.ok);
  const int top = lacuna::top_dimension(c);
  // into[k]: the map into degree k (rows: k-cells); out[k]: the map out of degree k.
  std::vector<bmatrix> into(static_cast<std::size_t>(top) + 1), out(static_cast<std::size_t>(top) + 1);
  for (int k = 0; k <= top; ++k) {
    if (a) {
      into[static_cast<std::size_t>(k)] = k < top ? quotient_boundary(c, k + 1, *a) : bmatrix(lacuna::cell_count(c, k), 0);
      out[static_cast<std::size_t>(k)] = k > 0 ? quotient_boundary(c, k, *a) : bmatrix(0, lacuna::cell_count(c, 0));
    } else {
      into[static_cast<std::size_t>(k)] = k > 0 ? transpose(exact_boundary(c, k)) : bmatrix(lacuna::cell_count(c, 0), 0);
      out[static_cast<std::size_t>(k)] = k < top ? transpose(exact_boundary(c, k + 1)) : bmatrix(0, lacuna::cell_count(c, k));
    }
  }
  int with_torsion = 0;
  for (int k = 0; k <= top; ++k) {
    CAPTURE(k);
    std::size_t cells = lacuna::cell_count(c, k);
    if (a)
      for (bool x : (*a)[static_cast<std::size_t>(k)]) cells -= x ? 1 : 0;
    const auto up = flint_invariants(into[static_cast<std::size_t>(k)]);
    const auto down = flint_invariants(out[static_cast<std::size_t>(k)]);
    const auto& g = r.certificate.groups[static_cast<std::size_t>(k)];
    CHECK(g.rank == cells - up.size() - down.size());
    cpp_int flint_product = 1, claimed = 1;
    for (const auto& s : up) flint_product *= cpp_int(s);
    for (const auto& t : g.torsion) claimed *= to_cpp(t);
    if (flint_product < 0) flint_product = -flint_product;
    if (claimed < 0) claimed = -claimed;
    CHECK(claimed == flint_product);
    if (up.empty()) continue;
    const auto& w = r.certificate.torsion[static_cast<std::size_t>(k)];
    cpp_int gcd = 0;
    for (const auto& b : w.minors) {
      std::vector<std::size_t> rows = w.pivot_rows, cols = w.pivot_columns;
      rows.insert(rows.end(), b.rows.begin(), b.rows.end());
      cols.insert(cols.end(), b.columns.begin(), b.columns.end());
      REQUIRE(rows.size() == up.size());
      REQUIRE(cols.size() == up.size());
      gcd = boost::multiprecision::gcd(gcd, flint_minor_determinant(into[static_cast<std::size_t>(k)], rows, cols));
    }
    if (gcd < 0) gcd = -gcd;
    CHECK(gcd == flint_product);
    with_torsion += claimed != 1;
  }
  return with_torsion;
}

/// A random presentation complex: one vertex, n loops, m 2-cells with random boundaries.
lacuna::cell_list presentation(std::mt19937_64& random) {
  const std::size_t n = 2 + random() % 8, m = 1 + random() % 8;
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
  return c;
}

TEST_CASE("cohomology certificates agree with FLINT's Smith forms of the transposed boundaries") {
  std::mt19937_64 random(1515);
  int with_torsion = 0;
  for (int trial = 0; trial < 40; ++trial) {
    CAPTURE(trial);
    with_torsion += agrees_with_flint(presentation(random), nullptr);
  }
  CHECK(with_torsion >= 12);  // the test must meet torsion to mean anything
  CHECK(agrees_with_flint(lacuna::matching_complex(7), nullptr) >= 1);  // H^2 = Ext(Z/3, Z) = Z/3
  agrees_with_flint(lacuna::chessboard_complex(3, 4), nullptr);
  CHECK(agrees_with_flint(lacuna::cell_list::real_projective_space(5), nullptr) == 2);  // H^2, H^4 = Z/2
}

TEST_CASE("relative certificates agree with FLINT's Smith forms of the quotient boundaries") {
  // Random presentation complexes rel the vertex and a random set of loops (a subcomplex: a
  // loop's faces are the vertex).
  std::mt19937_64 random(2727);
  int with_torsion = 0;
  for (int trial = 0; trial < 40; ++trial) {
    CAPTURE(trial);
    const auto c = presentation(random);
    marks_t a{{true}, std::vector<bool>(c.cell_count(1)), std::vector<bool>(c.cell_count(2))};
    for (std::size_t i = 0; i < a[1].size(); ++i) a[1][i] = random() % 3 == 0;
    with_torsion += agrees_with_flint(c, &a);
  }
  CHECK(with_torsion >= 8);
  // The Klein bottle rel its 1-skeleton: H_2 = Z (one 2-cell with relative boundary 0).
  const auto k = lacuna::cell_list::klein_bottle();
  marks_t a(3);
  a[0].assign(k.cell_count(0), true), a[1].assign(k.cell_count(1), true), a[2].assign(k.cell_count(2), false);
  agrees_with_flint(k, &a);
}

}  // namespace reference_certificate_kinds_flint_test

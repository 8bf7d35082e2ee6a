// Certificates of relative homology and of cohomology of a porous volume of more than 10^6
// cells (the "long" label): they check valid, their groups are the ones duality gives from the
// independent counts of volume_support.hpp (connected components of voxels, the Euler
// characteristic from local configurations), and every mutation is rejected with the group
// named.
#include "cubical/volume_support.hpp"
#include "homology/certificate_mutations.hpp"
#include "homology/subcomplex_marks.hpp"

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>

#include <array>
#include <set>

namespace homology_certificate_kinds_volumes_test {

using namespace certificate_mutations;
using lacuna::certificate_kind;
using subcomplex_marks::marks_t;
using cube = lacuna::cubical_complex<3>;
using cell_at = std::array<std::size_t, 3>;  // a position in the doubled grid

/// A = the cells of X on the faces of its bounding box B = [0, n]^3 (a doubled coordinate 0 or
/// 2n on some axis): closed under faces, since a face of such a cell lies on the same plane.
marks_t box_faces(const cube& c, std::size_t n) {
  marks_t m(4);
  for (int k = 0; k <= 3; ++k) {
    auto& mk = m[static_cast<std::size_t>(k)];
    mk.assign(c.cell_count(k), false);
    for (std::size_t i = 0; i < mk.size(); ++i) {
      const auto p = c.position(k, i);
      for (std::size_t a = 0; a < 3; ++a)
        if (p[a] == 0 || p[a] == 2 * n) mk[i] = true;
    }
  }
  return m;
}

/// χ(A) counted from the voxels alone: A is the union of the closed unit squares of ∂B that
/// bound a voxel of X; V − E + F of their vertices, edges and squares (Euler's count).
std::int64_t euler_of_box_faces(const lacuna_volumes::volume& v) {
  const std::size_t n = v.extents[0];
  std::set<cell_at> squares, edges, vertices;
  for (std::size_t z = 0; z < n; ++z)
    for (std::size_t y = 0; y < n; ++y)
      for (std::size_t x = 0; x < n; ++x) {
        if (!v.voxels[x + n * (y + n * z)]) continue;
        const cell_at voxel{x, y, z};
        for (std::size_t a = 0; a < 3; ++a)
          for (const bool upper : {false, true}) {
            if (voxel[a] != (upper ? n - 1 : 0)) continue;
            cell_at s{2 * x + 1, 2 * y + 1, 2 * z + 1};
            s[a] = upper ? 2 * n : 0;
            squares.insert(s);
          }
      }
  for (const auto& s : squares)
    for (std::size_t b = 0; b < 3; ++b)
      if (s[b] % 2 == 1)
        for (const int d : {-1, 1}) {
          cell_at e = s;
          e[b] = static_cast<std::size_t>(static_cast<std::int64_t>(e[b]) + d);
          edges.insert(e);
        }
  for (const auto& e : edges)
    for (std::size_t b = 0; b < 3; ++b)
      if (e[b] % 2 == 1)
        for (const int d : {-1, 1}) {
          cell_at p = e;
          p[b] = static_cast<std::size_t>(static_cast<std::int64_t>(p[b]) + d);
          vertices.insert(p);
        }
  return static_cast<std::int64_t>(vertices.size()) - static_cast<std::int64_t>(edges.size()) +
         static_cast<std::int64_t>(squares.size());
}

/// The ranks of H_k(X, A), A = X ∩ ∂B, from counts of voxels:
/// - b_0: components of X (voxels meeting at a corner are joined) that do not meet ∂B. A
///   shell of voxels around the grid joins every component that does into one, so b_0 is the
///   number of components of the padded grid less one.
/// - b_3 = 0 when A ≠ ∂B (H_3(X) = 0 → H_3(X, A) → H_2(A) = 0: A a proper part of a 2-sphere).
/// - b_2 = c − 1, c the number of components of B° \ X (voxels of the complement joined across
///   a face): by excision H(X, A) = H(X ∪ ∂B, ∂B); in the sequence of that pair H_3(X, A) = 0 →
///   H_2(∂B) = Z → H_2(X ∪ ∂B) → H_2(X, A) → H_1(∂B) = 0, and Alexander duality in S^3 gives
///   H̃_2(X ∪ ∂B) the rank of the components of its complement, c + 1 (the outside of B), less
///   one (Hatcher 2002, Theorem 3.44 and §2.1, from memory).
/// - b_1 from the Euler characteristic: χ(X, A) = χ(X) − χ(A) = b_0 − b_1 + b_2 − b_3.
/// The groups are free: H_2(X ∪ ∂B) ≅ H̃^0 and H_1(X, A) ≅ H_1(X ∪ ∂B) ≅ H̃^1 of the
/// complement (Alexander duality again), both torsion-free, and Z → Z^c above sends the sphere
/// to the sum of the components' classes, a primitive vector.
std::array<std::int64_t, 4> relative_betti(const lacuna_volumes::volume& v, const lacuna_volumes::duality_numbers& d) {
  const std::size_t n = v.extents[0];
  const std::array<std::size_t, 3> padded{n + 2, n + 2, n + 2};
  std::vector<std::uint8_t> shell((n + 2) * (n + 2) * (n + 2), 1);
  std::vector<std::uint8_t> complement(v.voxels.size());
  bool misses_a_box_face = false;
  for (std::size_t z = 0; z < n; ++z)
    for (std::size_t y = 0; y < n; ++y)
      for (std::size_t x = 0; x < n; ++x) {
        const auto here = v.voxels[x + n * (y + n * z)];
        shell[(x + 1) + (n + 2) * ((y + 1) + (n + 2) * (z + 1))] = here ? 1 : 0;
        complement[x + n * (y + n * z)] = here ? 0 : 1;
        const bool on_face = x == 0 || y == 0 || z == 0 || x == n - 1 || y == n - 1 || z == n - 1;
        if (on_face && !here) misses_a_box_face = true;
      }
  REQUIRE(misses_a_box_face);  // A ≠ ∂B
  const auto b0 = static_cast<std::int64_t>(lacuna_volumes::detail::count_components<3>(padded, shell, 3)) - 1;
  const auto c = static_cast<std::int64_t>(lacuna_volumes::detail::count_components<3>(v.extents, complement, 1));
  REQUIRE(c >= 1);
  const std::int64_t b2 = c - 1, b3 = 0;
  const std::int64_t chi = d.euler - euler_of_box_faces(v);
  return {b0, b0 + b2 - b3 - chi, b2, b3};
}

template <class Cert>
void free_ranks(const Cert& cert, const std::array<std::int64_t, 4>& b) {
  REQUIRE(cert.groups.size() == 4);
  for (std::size_t k = 0; k < 4; ++k) {
    CHECK(static_cast<std::int64_t>(cert.groups[k].rank) == b[k]);
    CHECK(cert.groups[k].torsion.empty());
  }
}

TEST_CASE("certificates of a porous volume of 10^6 cells rel its box faces, and of its cohomology") {
  const auto v = lacuna_volumes::porous_volume(64, 2.0, 7);
  const auto c = cube::from_bytes(v.extents, v.voxels);
  REQUIRE(lacuna::total_cell_count(c) >= 1'000'000);  // 1.2 M cells
  const auto d = lacuna_volumes::duality_betti(v);

  SUBCASE("relative homology modulo the cells on the box faces") {
    const auto a = box_faces(c, 64);
    const auto r = lacuna::certified_relative_homology<integer>(c, a);
    const auto rep = lacuna::check_certificate(c, r.certificate, a);
    INFO(rep.first_failure);
    CHECK(rep.ok);
    const auto b = relative_betti(v, d);
    INFO("duality and Euler give H_k(X, A) ranks " << b[0] << " " << b[1] << " " << b[2] << " " << b[3]);
    free_ranks(r.certificate, b);
    auto check = [&](const lacuna::homology_certificate<integer>& x) { return lacuna::check_certificate(c, x, a); };
    auto bnd = [&](int f) { return subcomplex_marks::kind_boundary(c, certificate_kind::relative, &a, f); };
    CHECK(mutations_rejected_by(c, r.certificate, check, bnd) >= 5);
  }

  SUBCASE("cohomology: H^k free of rank b_k (universal coefficients; H_* of a subset of R^3 is free)") {
    const auto r = lacuna::certified_cohomology<integer>(c);
    const auto rep = lacuna::check_certificate(c, r.certificate);
    INFO(rep.first_failure);
    CHECK(rep.ok);
    free_ranks(r.certificate, {static_cast<std::int64_t>(d.b0), static_cast<std::int64_t>(d.b1),
                               static_cast<std::int64_t>(d.b2), 0});
    auto check = [&](const lacuna::homology_certificate<integer>& x) { return lacuna::check_certificate(c, x); };
    auto bnd = [&](int f) { return subcomplex_marks::kind_boundary(c, certificate_kind::cohomology, nullptr, f); };
    CHECK(mutations_rejected_by(c, r.certificate, check, bnd) >= 5);
  }
}

}  // namespace homology_certificate_kinds_volumes_test

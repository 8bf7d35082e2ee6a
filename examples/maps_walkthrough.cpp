// The walkthrough of docs/maps-and-sequences.md: the annulus and its two boundary circles.
// It prints the long exact sequence of the pair with every map in the computed bases, checks
// exactness and the Euler identities, and computes the Lefschetz number of a rotation. Exits
// non-zero if any self-check fails. Expected values: for the annulus X = S^1 x I, by
// Lefschetz duality H_n(X, ∂X) = H^{2-n}(X) = Z, Z, 0 for n = 2, 1, 0 (Hatcher, Algebraic
// Topology, 2002, Theorem 3.43); a rotation is homotopic to the identity, so its Lefschetz
// number is χ(X) = 0 (Hatcher 2002, §2.C).
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/euler_checks.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/homology/induced_map.hpp>
#include <lacuna/ring/integer.hpp>

#include <iostream>
#include <vector>

using lacuna::integer;

int main() {
  int failures = 0;
  auto expect = [&](bool ok, const char* what) {
    if (!ok) {
      std::cout << "SELF-CHECK FAILED: " << what << "\n";
      ++failures;
    }
  };

  // The annulus: outer circle 0 1 2, inner circle 3 4 5, six triangles between them.
  std::vector<std::vector<int>> facets;
  for (int i = 0; i < 3; ++i) {
    const int j = (i + 1) % 3;
    facets.push_back({i, j, 3 + i});
    facets.push_back({j, 3 + i, 3 + j});
  }
  const auto X = lacuna::simplicial_complex<int>::from_facets(facets);

  // A = both boundary circles: the edges {i, i+1} within each circle, and their vertices.
  std::vector<std::vector<bool>> in_A(3);
  for (int k = 0; k <= 2; ++k)
    for (std::size_t i = 0; i < X.cell_count(k); ++i) {
      const auto vs = X.vertices(k, i);
      bool in = k <= 1;
      if (k == 1) in = (X.label(vs[0]) < 3) == (X.label(vs[1]) < 3);  // both outer or both inner
      in_A[static_cast<std::size_t>(k)].push_back(in);
    }

  const auto pair = lacuna::long_exact_sequence<integer>(X, in_A);
  const auto seq = pair.sequence();
  std::cout << "The long exact sequence of (annulus, boundary):\n";
  for (std::size_t g = 0; g < seq.groups.size(); ++g) {
    const auto& G = seq.groups[g];
    std::cout << "  " << G.name << " = Z^" << G.rank;
    for (const auto& t : G.torsion) std::cout << " + Z/" << t.to_string();
    std::cout << "\n";
    if (g < seq.maps.size()) {
      const auto& m = seq.maps[g];
      std::cout << "    " << seq.map_names[g] << ": " << m.rows() << "x" << m.cols();
      for (std::size_t r = 0; r < m.rows() && m.cols() > 0; ++r) {
        std::cout << (r == 0 ? " [" : "; ");
        for (std::size_t c = 0; c < m.cols(); ++c) std::cout << (c ? " " : "") << m(r, c).to_string();
      }
      std::cout << (m.rows() && m.cols() ? "]\n" : "\n");
    }
  }
  const auto report = pair.check();
  std::cout << "exact: " << (report.exact ? "yes" : "no") << " (" << report.places.size() << " places)\n";
  expect(report.exact, "the sequence is exact");
  expect(pair.hXA[2].rank == 1 && pair.hXA[1].rank == 1 && pair.hXA[0].rank == 0, "H_*(X, ∂X) = Z, Z, 0");
  // ∂_*: H_2(X, ∂X) -> H_1(∂X) = Z^2 sends the fundamental class to the two circles with
  // opposite orientations, so the entries are +-1 each.
  const auto& d = pair.connecting[2].matrix;
  auto unit = [](const integer& x) { return x == integer(1) || x == integer(-1); };
  expect(d.rows() == 2 && d.cols() == 1 && unit(d(0, 0)) && unit(d(1, 0)),
         "∂_* sends [X, ∂X] to both boundary circles");

  // A rotation by one step of both circles: homotopic to the identity, Lefschetz number 0.
  const auto rotation = lacuna::simplicial_chain_map(X, X, [](int v) { return v < 3 ? (v + 1) % 3 : 3 + (v - 2) % 3; });
  expect(lacuna::check_chain_map(rotation, X, X).ok, "the rotation is a chain map");
  const auto L = lacuna::lefschetz_number(rotation, X);
  std::cout << "Lefschetz number of the rotation: " << L.to_string() << "\n";
  expect(L == lacuna::rational(0), "L(rotation) = χ(annulus) = 0");

  const auto euler = lacuna::euler_checks(X, {.primes = {2, 3}, .subcomplex = in_A, .cover = std::nullopt});
  for (const auto& id : euler.identities)
    std::cout << (id.holds ? "holds: " : "FAILS: ") << id.statement << " (" << id.lhs << " = " << id.rhs << ")\n";
  expect(euler.ok, "the Euler identities hold");

  std::cout << (failures == 0 ? "all self-checks passed\n" : "some self-checks FAILED\n");
  return failures == 0 ? 0 : 1;
}

// The walkthrough of docs/homology.md: homology with torsion and generators, cohomology,
// the variants, verification and the universal coefficient check, on the Klein bottle and
// RP^2. Exits non-zero if any of its self-checks fails (the expected values are textbook
// ones: Hatcher, Algebraic Topology, 2002, §2.1 and Theorem 3.2).
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>

#include <iostream>

int main() {
  int failures = 0;
  auto expect = [&](bool ok, const char* what) {
    if (!ok) {
      std::cout << "SELF-CHECK FAILED: " << what << "\n";
      ++failures;
    }
  };

  // 1. Integral homology with generators.
  const auto klein = lacuna::cell_list::klein_bottle();
  const auto h = lacuna::homology<lacuna::integer>(klein, {.generators = true});
  for (const auto& g : h.groups) {
    std::cout << "H_" << g.dimension << " = Z^" << g.rank;
    for (const auto& t : g.torsion) std::cout << " + Z/" << t.to_string();
    std::cout << "\n";
    for (std::size_t i = 0; i < g.generators.size(); ++i) {
      std::cout << "  generator (order " << g.orders[i].to_string() << "):";
      for (const auto& term : g.generators[i].terms)
        std::cout << " " << term.coefficient.to_string() << "*" << lacuna::cell_name(klein, g.dimension, term.cell);
      std::cout << "\n";
    }
  }
  expect(h[1].rank == 1 && h[1].torsion.size() == 1 && h[1].torsion[0] == lacuna::integer(2), "H_1(K) = Z + Z/2");
  expect(h[2].rank == 0 && h[2].torsion.empty(), "H_2(K) = 0");

  // 2. Coordinates of a cycle: the edge c of the Delta-complex is a loop.
  const lacuna::chain<lacuna::integer> c_loop{1, {{2, lacuna::integer(1)}}};
  const auto x = h.coordinates(c_loop);
  std::cout << "coordinates of the loop c:";
  for (const auto& v : x) std::cout << " " << v.to_string();
  std::cout << "\nc is a boundary: " << std::boolalpha << h.is_boundary(c_loop) << "\n";
  expect(!h.is_boundary(c_loop), "the loop c is not a boundary");

  // 3. The generators verified independently (cycles by the complex's own boundary, and a
  //    second computation with dense_elimination).
  const auto rep = lacuna::verify_generators(klein, h);
  std::cout << "verify_generators: " << (rep.ok ? "ok" : rep.first_failure) << " (" << rep.checks << " checks)\n";
  expect(rep.ok, "verify_generators on the Klein bottle");

  // 4. Cohomology: H^2(RP^2; Z) = Z/2, with a cocycle generator, verified too.
  const auto rp2 = lacuna::cell_list::projective_plane();
  const auto co = lacuna::cohomology<lacuna::integer>(rp2, {.generators = true});
  std::cout << "H^2(RP^2) torsion:";
  for (const auto& t : co[2].torsion) std::cout << " Z/" << t.to_string();
  std::cout << "\n";
  expect(co[2].torsion.size() == 1 && co[2].torsion[0] == lacuna::integer(2), "H^2(RP^2) = Z/2");
  expect(lacuna::verify_generators(rp2, co).ok, "verify_generators on the cohomology of RP^2");

  // 5. Variants agree: sparse default, Markowitz only, dense.
  const lacuna::sparse_elimination markowitz{
      .elimination = {.coreductions = false, .collapses = false, .set_aside = false}};
  const auto hm = lacuna::homology<lacuna::integer>(klein, {}, markowitz);
  const auto hd = lacuna::homology<lacuna::integer>(klein, {}, lacuna::dense_elimination{});
  for (int k = 0; k <= 2; ++k)
    expect(hm[k].rank == h[k].rank && hm[k].torsion == h[k].torsion && hd[k].rank == h[k].rank &&
               hd[k].torsion == h[k].torsion,
           "variants agree");

  // 6. The universal coefficient theorem, checked against direct computations.
  const auto uct = lacuna::check_universal_coefficients<2, 3>(klein);
  for (const auto& id : uct.identities)
    std::cout << (id.holds ? "  holds: " : "  FAILS: ") << id.statement << "  [" << id.predicted << " vs "
              << id.computed << "]\n";
  expect(uct.ok(), "universal coefficients on the Klein bottle");

  std::cout << (failures == 0 ? "all self-checks passed\n" : "self-checks failed\n");
  return failures == 0 ? 0 : 1;
}

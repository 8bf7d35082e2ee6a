#include <doctest/doctest.h>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>
#include <iostream>

namespace homology_smoke_test {

using namespace lacuna;

template <class R, class A>
void dump(const char* name, const cell_list& c, A alg, bool gens = true) {
  auto h = homology<R>(c, {.generators = gens}, alg);
  std::cout << name << ":";
  for (auto& g : h.groups) {
    std::cout << " H" << g.dimension << "=" << g.rank;
    for (auto& t : g.torsion) std::cout << "+Z/" << t;
    std::cout << "[" << g.generators.size() << " gens]";
  }
  std::cout << "\n";
}

TEST_CASE("smoke") {
  for (int pass = 0; pass < 2; ++pass) {
    auto run = [&](auto alg) {
      dump<integer>("torus", cell_list::torus(), alg);
      dump<integer>("klein", cell_list::klein_bottle(), alg);
      dump<integer>("rp2", cell_list::projective_plane(), alg);
      dump<integer>("rp5", cell_list::real_projective_space(5), alg);
      dump<integer>("L(5,2)", cell_list::lens_space(5, 2), alg);
      dump<integer>("S3", cell_list::sphere(3), alg);
      dump<z2>("rp5/Z2", cell_list::real_projective_space(5), alg);
    };
    if (pass == 0) run(sparse_elimination{}); else run(dense_elimination{});
  }
}

}  // namespace homology_smoke_test

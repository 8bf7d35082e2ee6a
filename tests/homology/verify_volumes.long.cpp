// verify_generators on volumes of about 10^6 and more cells (the "long" label): results of the
// default route pass, their Betti numbers agree with the independent count of
// volume_support.hpp (connected components and Alexander duality), and every mutation of
// verify_mutations.hpp is refused, naming the group and the generator or torsion factor.
#include "cubical/volume_support.hpp"
#include "homology/verify_mutations.hpp"

#include <lacuna/complex/cubical_complex.hpp>

namespace homology_verify_volumes_test {

using verify_mutations::result_mutations_rejected;

void verify_volume(const lacuna_volumes::volume& v, std::size_t min_cells) {
  const auto c = lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
  REQUIRE(lacuna::total_cell_count(c) >= min_cells);
  const auto h = lacuna::homology<lacuna::integer>(c, {.generators = true});
  const auto d = lacuna_volumes::duality_betti(v);
  CHECK(h[0].rank == d.b0);
  CHECK(h[1].rank == d.b1);
  CHECK(h[2].rank == d.b2);
  // Volumes have no torsion (subsets of R^3): the free mutations apply, six of them.
  CHECK(result_mutations_rejected(c) >= 6);
}

TEST_CASE("verify_generators on porous and coin-flip volumes of 10^6 cells and more") {
  verify_volume(lacuna_volumes::porous_volume(64, 2.0, 7), 1'000'000);     // 1.2 M cells, b1 270
  verify_volume(lacuna_volumes::coin_flip_volume(64, 0.5, 7), 1'000'000);  // 1.75 M cells, b1 about 19 000
}

}  // namespace homology_verify_volumes_test

// Certificates of volumes of about 10^6 and more cells (the "long" label): they check valid,
// their Betti numbers agree with the independent count of volume_support.hpp (connected
// components and Alexander duality), and every mutation is rejected with the group and
// generator named.
#include "cubical/volume_support.hpp"
#include "homology/certificate_mutations.hpp"

#include <lacuna/complex/cubical_complex.hpp>

namespace homology_certificate_volumes_test {

using namespace certificate_mutations;

void certify_volume(const lacuna_volumes::volume& v, std::size_t min_cells) {
  const auto c = lacuna::cubical_complex<3>::from_bytes(v.extents, v.voxels);
  REQUIRE(lacuna::total_cell_count(c) >= min_cells);
  const auto r = lacuna::certified_homology<integer>(c);
  const auto rep = lacuna::check_certificate(c, r.certificate);
  INFO(rep.first_failure);
  CHECK(rep.ok);
  const auto d = lacuna_volumes::duality_betti(v);
  CHECK(r.certificate.groups[0].rank == d.b0);
  CHECK(r.certificate.groups[1].rank == d.b1);
  CHECK(r.certificate.groups[2].rank == d.b2);
  CHECK(r.certificate.groups[3].rank == 0);
  CHECK(mutations_rejected(c) >= 5);
}

TEST_CASE("certificates of porous and coin-flip volumes of 10^6 cells and more") {
  certify_volume(lacuna_volumes::porous_volume(64, 2.0, 7), 1'000'000);       // 1.2 M cells
  certify_volume(lacuna_volumes::coin_flip_volume(64, 0.5, 7), 1'000'000);    // 1.75 M cells, b1 about 19 000
}

}  // namespace homology_certificate_volumes_test

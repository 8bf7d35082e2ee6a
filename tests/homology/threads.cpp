// Using two threads (indexing dimensions side by side, lifting generators of different
// dimensions side by side) must not change any result: groups, generators and their order
// are compared with the one-thread run, as the reference, on complexes of every built-in
// kind. Expected groups come from the textbook tests (tests/homology/textbook.cpp).
#include "support.hpp"

#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/ring/z2.hpp>

#include <random>

namespace homology_threads_test {

using namespace lacuna_test;

namespace {
template <class R, class C>
void same_with_threads(const C& c, bool reduced = false) {
  const auto one_thread = lacuna::homology<R>(c, {.generators = true, .reduced = reduced});
  const auto two_threads = lacuna::homology<R>(c, {.generators = true, .reduced = reduced, .threads = 2});
  REQUIRE(one_thread.groups.size() == two_threads.groups.size());
  for (std::size_t k = 0; k < one_thread.groups.size(); ++k) {
    CHECK(one_thread.groups[k].rank == two_threads.groups[k].rank);
    CHECK(one_thread.groups[k].torsion == two_threads.groups[k].torsion);
    CHECK(one_thread.groups[k].generators == two_threads.groups[k].generators);
    CHECK(one_thread.groups[k].orders == two_threads.groups[k].orders);
  }
}
}  // namespace

TEST_CASE("two threads give the same groups and generators") {
  same_with_threads<integer>(seven_vertex_torus());
  same_with_threads<integer>(six_vertex_rp2());
  same_with_threads<integer>(six_vertex_rp2(), true);
  same_with_threads<integer>(matching_complex(7));
  same_with_threads<lacuna::z2>(matching_complex(7));
  same_with_threads<integer>(lacuna::cell_list::real_projective_space(6));
  std::mt19937 gen(7);
  std::vector<std::uint8_t> voxels(12 * 11 * 10);
  for (auto& v : voxels) v = gen() % 2;
  const auto vol = lacuna::cubical_complex<3>::from_bytes({12, 11, 10}, voxels);
  same_with_threads<integer>(vol);
  // A 3-dimensional top with a torsion-free but non-trivial H_1 and H_2 (random volume).
  const auto h = lacuna::homology<integer>(vol, {.threads = 2});
  CHECK(h.groups.size() == 4);
}

}  // namespace homology_threads_test

// Stop requests and progress callbacks (lacuna/chain/run_control.hpp) in the homology engine:
// a stopped computation throws computation_stopped and returns nothing, progress comes in
// phase order with done <= total, and a run after a stopped one gives the right answer (no
// state is left behind). Expected groups: the torus has H_0 = Z, H_1 = Z^2, H_2 = Z (the
// classification of surfaces; any textbook, e.g. Hatcher, Algebraic Topology, Example 2.3,
// from memory), a solid box is contractible.
#include "support.hpp"

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdint>
#include <stop_token>
#include <string>
#include <thread>
#include <vector>

namespace homology_run_control_test {

using lacuna::integer;
using lacuna_test::group;

namespace {

/// The k x k torus triangulation: a k x k grid of squares, opposite sides glued, each square
/// cut along one diagonal.
lacuna::simplicial_complex<int> grid_torus(int k) {
  lacuna::simplicial_complex<int>::builder b;
  auto v = [k](int i, int j) { return ((i % k + k) % k) * k + ((j % k + k) % k); };
  for (int i = 0; i < k; ++i)
    for (int j = 0; j < k; ++j) {
      b.add_facet({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      b.add_facet({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return std::move(b).finalize();
}

const std::vector<group> torus_groups{{1, {}}, {2, {}}, {1, {}}};

// Boxes of voxels take the duality route by default (labels, no elimination); the stops
// below are made in the elimination, so it is asked for.
const lacuna::sparse_elimination elimination{.cubical_duality = false};

struct seen {
  std::string phase;
  std::uint64_t done, total;
};

}  // namespace

TEST_CASE("a stop requested before the call: nothing is computed, for every ring and variant") {
  const auto t = grid_torus(12);
  std::stop_source source;
  source.request_stop();
  lacuna::homology_options o;
  o.control.stop = source.get_token();
  CHECK_THROWS_AS(lacuna::homology<integer>(t, o), lacuna::computation_stopped);
  CHECK_THROWS_AS(lacuna::homology<lacuna::z2>(t, o), lacuna::computation_stopped);
  CHECK_THROWS_AS(lacuna::cohomology<integer>(t, o), lacuna::computation_stopped);
  CHECK_THROWS_AS(lacuna::homology<integer>(t, o, lacuna::dense_elimination{}), lacuna::computation_stopped);
  o.generators = true;
  CHECK_THROWS_AS(lacuna::homology<integer>(t, o), lacuna::computation_stopped);
  // the message says what happened
  try {
    lacuna::homology<integer>(t, o);
  } catch (const lacuna::computation_stopped& e) {
    CHECK(std::string(e.what()) == "lacuna: the computation was stopped on request");
  }
}

TEST_CASE("progress: phases in order, done never above total, each phase closed") {
  const auto t = grid_torus(60);  // 3600 vertices, 10800 edges, 7200 triangles
  std::vector<seen> log;
  lacuna::homology_options o;
  o.generators = true;
  o.control.progress = [&](const lacuna::progress_report& r) { log.push_back({std::string(r.phase), r.done, r.total}); };
  const auto h = lacuna::homology<integer>(t, o);
  CHECK(lacuna_test::groups_of(h) == torus_groups);
  REQUIRE(!log.empty());
  const std::vector<std::string> order{"building the chain complex", "eliminating unit pivots", "Smith form of the core",
                                       "lifting generators"};
  std::size_t rank = 0;  // position in `order` of the last phase seen
  std::uint64_t last_done = 0;
  std::string last_phase;
  std::size_t elimination_reports = 0;
  for (const auto& s : log) {
    CAPTURE(s.phase);
    CAPTURE(s.done);
    const auto it = std::find(order.begin(), order.end(), s.phase);
    REQUIRE(it != order.end());
    const auto r = static_cast<std::size_t>(it - order.begin());
    CHECK(r >= rank);  // never back to an earlier phase
    CHECK(s.done <= s.total);
    if (s.phase == last_phase && s.phase != "Smith form of the core") CHECK(s.done >= last_done);
    if (s.phase == "eliminating unit pivots") {
      ++elimination_reports;
      CHECK(s.total == 3600 + 10800 + 7200);
    }
    rank = r, last_phase = s.phase, last_done = s.done;
  }
  // the elimination reports a few hundred times at most, and closes with done == total
  CHECK(elimination_reports >= 3);
  CHECK(elimination_reports <= 300);
  const auto last_elim = std::find_if(log.rbegin(), log.rend(), [](const seen& s) { return s.phase == "eliminating unit pivots"; });
  REQUIRE(last_elim != log.rend());
  CHECK(last_elim->done == last_elim->total);
  CHECK(log.back().phase == "lifting generators");
  CHECK(log.back().done == log.back().total);
}

TEST_CASE("a stop from the progress callback in the middle of the elimination, then a clean run") {
  const auto box = lacuna::cubical_complex<3>::from_predicate({24, 24, 24}, [](const auto&) { return true; });
  std::stop_source source;
  std::uint64_t stopped_at = 0;
  lacuna::homology_options o;
  o.control.stop = source.get_token();
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "eliminating unit pivots" && r.done > 0 && r.done < r.total && !source.stop_requested()) {
      stopped_at = r.done;
      source.request_stop();
    }
  };
  for (bool generators : {false, true}) {
    CAPTURE(generators);
    o.generators = generators;
    source = std::stop_source{};
    o.control.stop = source.get_token();
    CHECK_THROWS_AS(lacuna::homology<integer>(box, o, elimination), lacuna::computation_stopped);
    CHECK(stopped_at > 0);
  }
  // nothing is left behind: the same complex, without a stop, is a point (b_0 = 1, nothing else)
  const auto h = lacuna::homology<integer>(box, {.generators = true});
  CHECK(h.betti_numbers() == std::vector<std::size_t>{1, 0, 0, 0});
  CHECK(h[0].generators.size() == 1);
}

TEST_CASE("a stop from another thread") {
  const auto box = lacuna::cubical_complex<3>::from_predicate({24, 24, 24}, [](const auto&) { return true; });
  std::stop_source source;
  std::atomic<bool> started{false};
  lacuna::homology_options o;
  o.control.stop = source.get_token();
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase != "eliminating unit pivots" || r.done == 0 || started.exchange(true)) return;
    // let the other thread ask, then go on: the next check must see it
    for (int i = 0; i < 10000 && !source.stop_requested(); ++i) std::this_thread::sleep_for(std::chrono::milliseconds(1));
  };
  std::jthread asker([&] {
    while (!started) std::this_thread::sleep_for(std::chrono::milliseconds(1));
    source.request_stop();
  });
  CHECK_THROWS_AS(lacuna::homology<integer>(box, o, elimination), lacuna::computation_stopped);
  CHECK(source.stop_requested());
}

TEST_CASE("a stop while the generators are lifted, on two threads") {
  const auto t = grid_torus(40);
  std::stop_source source;
  lacuna::homology_options o;
  o.generators = true;
  o.threads = 2;
  o.control.stop = source.get_token();
  o.control.progress = [&](const lacuna::progress_report& r) {
    if (r.phase == "lifting generators") source.request_stop();
  };
  CHECK_THROWS_AS(lacuna::homology<integer>(t, o), lacuna::computation_stopped);
  o.control = {};
  CHECK(lacuna_test::groups_of(lacuna::homology<integer>(t, o)) == torus_groups);
}

TEST_CASE("dense Smith forms take the control too") {
  // diag(1, 2, ..., 40) in a dense 40 x 40 matrix: invariant factors are gcd/lcm
  // combinations, and the run has 40 pivots
  lacuna::dense_matrix<integer> A(40, 40);
  for (std::size_t i = 0; i < 40; ++i) A(i, i) = integer(static_cast<std::int64_t>(i + 1));
  std::vector<seen> log;
  lacuna::run_control control;
  control.progress = [&](const lacuna::progress_report& r) { log.push_back({std::string(r.phase), r.done, r.total}); };
  const auto s = lacuna::dense_smith_form(A, {.control = &control});
  CHECK(s.rank == 40);
  REQUIRE(!log.empty());
  CHECK(log.front().done == 0);
  CHECK(log.back().done == 40);
  CHECK(log.back().total == 40);
  std::stop_source source;
  control.stop = source.get_token();
  control.progress = [&](const lacuna::progress_report& r) {
    if (r.done == 10) source.request_stop();
  };
  CHECK_THROWS_AS(lacuna::dense_smith_form(A, {.control = &control}), lacuna::computation_stopped);
}

TEST_CASE("sparse Smith forms take the control too (the coboundary route's large remainders use them)") {
  // 2·I_30 with a unit in the corner: 1 unit pivot, then a 29 x 29 core; invariant factors
  // 1 and 29 × 2 (diagonal, so they are read off: Smith form of a diagonal matrix whose
  // entries divide each other in order)
  lacuna::sparse_matrix<integer> A(30, 30);
  for (std::size_t i = 0; i < 30; ++i) A.add(i, i, integer(static_cast<std::int64_t>(i == 0 ? 1 : 2)));
  A.normalize();
  lacuna::run_control control;
  const auto s = lacuna::smith_normal_form(A, lacuna::sparse_elimination{}, &control);
  CHECK(s.rank == 30);
  CHECK(std::count(s.factors.begin(), s.factors.end(), integer(2)) == 29);
  std::stop_source source;
  control.stop = source.get_token();
  source.request_stop();
  CHECK_THROWS_AS((void)lacuna::smith_normal_form(A, lacuna::sparse_elimination{}, &control), lacuna::computation_stopped);
  CHECK_THROWS_AS((void)lacuna::smith_normal_form(A, lacuna::dense_elimination{}, &control), lacuna::computation_stopped);
}

}  // namespace homology_run_control_test

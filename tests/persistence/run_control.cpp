// Stop requests and progress reports of the persistence computations (the contract of
// lacuna/chain/run_control.hpp: a stopped computation throws computation_stopped and returns
// nothing; reports name a phase, never count past its total, and close it with done == total).
#include "support.hpp"

#include <lacuna/persistence/persistence.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>

#include <map>
#include <random>
#include <stop_token>
#include <string>
#include <vector>

namespace persistence_run_control_test {

namespace support = persistence_test_support;

struct recorder {
  std::vector<lacuna::progress_report> reports;
  std::map<std::string, std::pair<std::uint64_t, std::uint64_t>> last;  // phase -> (done, total)
  bool monotone = true;
  void operator()(const lacuna::progress_report& r) {
    const std::string phase(r.phase);
    auto it = last.find(phase);  // a phase may run again with another total (one per matrix)
    if (it != last.end() && r.total == it->second.second && r.done != 0 && r.done < it->second.first) monotone = false;
    if (r.done > r.total) monotone = false;
    last[phase] = {r.done, r.total};
    reports.push_back(r);
  }
};

inline lacuna::cubical_filtration<2, int> test_image() {
  std::mt19937_64 rng(4);
  return lacuna::cubical_filtration<2, int>({40, 30}, support::random_values(rng, 1200, 50));
}

inline lacuna::rips_filtration test_cloud() {
  std::mt19937_64 rng(5);
  return lacuna::rips_filtration::from_points(support::random_points(rng, 30, 3, 10), {.max_dimension = 3});
}

template <class F, class Algorithm>
void check_reports(const F& f, const Algorithm& algorithm, const std::vector<std::string>& phases) {
  recorder rec;
  lacuna::persistence_options o;
  o.control.progress = [&](const lacuna::progress_report& r) { rec(r); };
  const auto with = lacuna::persistence(f, o, algorithm);
  const auto without = lacuna::persistence(f, {}, algorithm);
  CHECK(with[0] == without[0]);
  CHECK(rec.monotone);
  for (const auto& ph : phases) {
    CAPTURE(ph);
    REQUIRE(rec.last.count(ph) == 1);
    CHECK(rec.last[ph].first == rec.last[ph].second);  // closed
  }
}

TEST_CASE("progress: every phase is reported, counts rise, and each phase closes") {
  check_reports(test_cloud(), lacuna::twist_persistence{}, {"ordering the cells", "reducing the boundary matrices"});
  check_reports(test_cloud(), lacuna::standard_persistence{}, {"ordering the cells", "reducing the boundary matrices"});
  check_reports(test_cloud(), lacuna::cohomology_persistence{}, {"ordering the cells", "reducing the coboundary matrices"});
  check_reports(test_image(), lacuna::cubical_morse_persistence{}, {"pairing cubical cells", "Morse boundaries",
                                                                   "reducing the boundary matrices"});
}

template <class F, class Algorithm>
void check_stops(const F& f, const Algorithm& algorithm) {
  // stopped before it starts
  std::stop_source before;
  before.request_stop();
  lacuna::persistence_options o;
  o.control.stop = before.get_token();
  CHECK_THROWS_AS((void)lacuna::persistence(f, o, algorithm), lacuna::computation_stopped);
  // stopped from the progress callback once the work is under way, for each phase
  recorder rec;
  lacuna::persistence_options seen;
  seen.control.progress = [&](const lacuna::progress_report& r) { rec(r); };
  (void)lacuna::persistence(f, seen, algorithm);
  for (const auto& [phase, counts] : rec.last) {
    CAPTURE(phase);
    std::stop_source source;
    lacuna::persistence_options later;
    later.control.stop = source.get_token();
    later.control.progress = [&, name = phase](const lacuna::progress_report& r) {
      if (r.phase == name) source.request_stop();
    };
    CHECK_THROWS_AS((void)lacuna::persistence(f, later, algorithm), lacuna::computation_stopped);
  }
  CHECK(rec.last.size() >= 2);
}

TEST_CASE("stop requests: before the start and in every phase, each variant throws computation_stopped") {
  check_stops(test_cloud(), lacuna::twist_persistence{});
  check_stops(test_cloud(), lacuna::standard_persistence{});
  check_stops(test_cloud(), lacuna::cohomology_persistence{});
  check_stops(test_image(), lacuna::cubical_morse_persistence{});
  const auto img = test_image();
  std::stop_source s;
  s.request_stop();
  lacuna::persistence_options o;
  o.threads = 2;
  o.control.stop = s.get_token();
  CHECK_THROWS_AS((void)lacuna::persistence(img, o), lacuna::computation_stopped);
}

TEST_CASE("a Vietoris–Rips construction stops on request") {
  std::stop_source s;
  s.request_stop();
  lacuna::run_control control{.stop = s.get_token()};
  std::mt19937_64 rng(6);
  CHECK_THROWS_AS((void)lacuna::rips_filtration::from_points(support::random_points(rng, 50, 2, 10),
                                                             {.max_dimension = 2, .control = &control}),
                  lacuna::computation_stopped);
}

}  // namespace persistence_run_control_test

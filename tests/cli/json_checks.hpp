// tests/cli/json_checks.hpp — parses the tool's --json output and checks the layout that
// docs/formats.md fixes, for every result: the keys and their order, one homology entry per
// dimension 0..top, the Euler characteristic against the cell counts and the ranks, torsion
// increasing and each factor dividing the next.
#pragma once

#include "run.hpp"

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include <cstdint>
#include <string>
#include <vector>

namespace cli_test {

using ordered_json = nlohmann::ordered_json;

/// What a homology entry says, in the form the tests compare.
struct group {
  std::uint64_t rank;
  std::vector<std::uint64_t> torsion;
  bool operator==(const group&) const = default;
};

inline std::string group_text(const group& g) {
  std::string s = "rank " + std::to_string(g.rank) + " torsion [";
  for (std::size_t i = 0; i < g.torsion.size(); ++i) s += (i ? "," : "") + std::to_string(g.torsion[i]);
  return s + "]";
}

/// Parses r.out (which must be the whole of stdout of a successful run) and checks the
/// docs/formats.md layout. `generators` says whether --generators was given.
inline ordered_json parse_result(const result& r, bool generators = false) {
  REQUIRE(r.status == 0);
  CHECK(r.err.empty());
  const ordered_json j = ordered_json::parse(r.out);  // throws (and fails the test) if not JSON
  REQUIRE(j.is_object());
  // docs/formats.md: the keys coefficients, cells, euler_characteristic, homology, in this order.
  std::vector<std::string> keys;
  for (auto it = j.begin(); it != j.end(); ++it) keys.push_back(it.key());
  // --relative SUB adds "relative_to" right after "coefficients" (docs/cli.md).
  if (keys.size() > 1 && keys[1] == "relative_to") {
    CHECK(j["relative_to"].is_string());
    keys.erase(keys.begin() + 1);
  }
  REQUIRE(keys == std::vector<std::string>{"coefficients", "cells", "euler_characteristic", "homology"});
  REQUIRE(j["coefficients"].is_string());
  REQUIRE(j["cells"].is_array());
  REQUIRE(j["euler_characteristic"].is_number_integer());
  REQUIRE(j["homology"].is_array());
  // one entry per dimension from 0 to the top dimension; [] and [] for the empty complex
  const auto& cells = j["cells"];
  const auto& h = j["homology"];
  REQUIRE(h.size() == cells.size());
  std::int64_t chi_cells = 0, chi_ranks = 0;
  for (std::size_t k = 0; k < h.size(); ++k) {
    REQUIRE(cells[k].is_number_unsigned());
    const auto& e = h[k];
    std::vector<std::string> ek;
    for (auto it = e.begin(); it != e.end(); ++it) ek.push_back(it.key());
    std::vector<std::string> expected{"dimension", "rank", "torsion"};
    if (generators) expected.push_back("generators");
    CHECK(ek == expected);
    CHECK(e["dimension"] == k);
    REQUIRE(e["rank"].is_number_unsigned());
    REQUIRE(e["torsion"].is_array());
    const auto sign = k % 2 == 0 ? 1 : -1;
    chi_cells += sign * cells[k].get<std::int64_t>();
    chi_ranks += sign * e["rank"].get<std::int64_t>();
    // torsion: JSON integers > 1, increasing, each dividing the next (those that fit 64 bits;
    // bigger ones are parsed as floating point and are checked on the raw text by the tests)
    const auto& t = e["torsion"];
    for (std::size_t i = 0; i < t.size(); ++i) {
      CHECK(t[i].is_number());
      if (!t[i].is_number_unsigned()) continue;
      CHECK(t[i].get<std::uint64_t>() > 1);
      if (i + 1 < t.size() && t[i + 1].is_number_unsigned())
        CHECK(t[i + 1].get<std::uint64_t>() % t[i].get<std::uint64_t>() == 0);
    }
    if (j["coefficients"] != "Z") CHECK(t.empty());  // over a field: no torsion
    if (generators) {
      REQUIRE(e["generators"].is_array());
      CHECK(e["generators"].size() == e["rank"].get<std::size_t>() + t.size());
    }
  }
  // the Euler characteristic: alternating sum of cell counts, and of ranks (over Z and over
  // any field; torsion does not count)
  CHECK(j["euler_characteristic"].get<std::int64_t>() == chi_cells);
  CHECK(chi_ranks == chi_cells);
  return j;
}

/// The groups of a parsed result whose torsion factors fit 64 bits.
inline std::vector<group> groups_of(const ordered_json& j) {
  std::vector<group> out;
  for (const auto& e : j["homology"]) {
    group g{e["rank"].get<std::uint64_t>(), {}};
    for (const auto& t : e["torsion"]) g.torsion.push_back(t.get<std::uint64_t>());
    out.push_back(g);
  }
  return out;
}

inline std::vector<std::uint64_t> cells_of(const ordered_json& j) { return j["cells"].get<std::vector<std::uint64_t>>(); }

}  // namespace cli_test

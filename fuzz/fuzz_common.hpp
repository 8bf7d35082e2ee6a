// fuzz/fuzz_common.hpp — what every libFuzzer target of lacuna shares: small limits, and the
// checks run on a complex a reader accepted (validate, then homology with an Euler
// characteristic cross-check when the complex is tiny).
//
// A finding is anything a target does not catch: an exception other than the reader's
// documented ones (std::terminate, reported by libFuzzer as a crash), a sanitizer report, a
// timeout, an allocation beyond -malloc_limit_mb, or a failed check below (abort).
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/read_limits.hpp>
#include <lacuna/ring/integer.hpp>

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <istream>
#include <sstream>
#include <string>

namespace lacuna_fuzz {

/// The limits every target passes to its reader.
inline constexpr std::uint64_t max_cells = std::uint64_t{1} << 16;
inline constexpr std::uint64_t max_bytes = std::uint64_t{1} << 20;
/// The .facets target's cell limit is lower: the closure of one facet of k labels has 2^k - 1
/// simplices, and validate's ∂∂ = 0 check costs about k^2 face look-ups per simplex. Under the
/// sanitizers one facet of 16 labels (65 535 cells, allowed by max_cells) took 13.7 s, past the
/// fuzzer's 10 s timeout (a finding of the CI run of 2 December); 13 labels take about 1.3 s.
inline constexpr std::uint64_t max_facet_cells = std::uint64_t{1} << 13;
/// Complexes up to this many cells also go through the homology engine.
inline constexpr std::size_t homology_cells = 2000;
/// ... and up to this many, with generators.
inline constexpr std::size_t generator_cells = 300;

inline lacuna::io::read_limits limits() { return {.max_cells = max_cells, .max_bytes = max_bytes}; }

[[noreturn]] inline void finding(const std::string& what) {
  std::fprintf(stderr, "lacuna fuzz finding: %s\n", what.c_str());
  std::fflush(stderr);
  std::abort();
}

/// The fuzzer's bytes as a seekable stream (as a file would be).
inline std::istringstream stream_of(const std::uint8_t* data, std::size_t size) {
  return std::istringstream(std::string(reinterpret_cast<const char*>(data), size), std::ios::in | std::ios::binary);
}

template <class C>
std::size_t total_cells(const C& c) {
  std::size_t n = 0;
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) n += lacuna::cell_count(c, k);
  return n;
}

/// The checks on a complex a reader returned: it must be valid, and (when tiny) its integral
/// homology must satisfy χ = Σ (-1)^k rank H_k; with generators, as many generators as
/// summands.
template <class C>
void check_complex(const C& c) {
  try {
    lacuna::validate(c);
  } catch (const lacuna::invalid_complex& e) {
    finding(std::string("the reader returned an invalid complex: ") + e.what());
  }
  const std::size_t n = total_cells(c);
  if (n > homology_cells) return;
  const bool gens = n <= generator_cells;
  const auto h = lacuna::homology<lacuna::integer>(c, lacuna::homology_options{.generators = gens});
  std::int64_t chi = 0;
  for (const auto& g : h.groups) {
    chi += (g.dimension % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(g.rank);
    if (gens && g.generators.size() != g.rank + g.torsion.size())
      finding("H_" + std::to_string(g.dimension) + ": " + std::to_string(g.generators.size()) +
              " generators for rank " + std::to_string(g.rank) + " and " + std::to_string(g.torsion.size()) +
              " torsion factors");
  }
  if (chi != lacuna::euler_characteristic(c))
    finding("Euler characteristic " + std::to_string(lacuna::euler_characteristic(c)) +
            " from the cells, but Σ (-1)^k rank H_k = " + std::to_string(chi));
}

}  // namespace lacuna_fuzz

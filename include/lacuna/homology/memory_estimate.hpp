// lacuna/homology/memory_estimate.hpp — what a homology computation will need in memory,
// estimated before it starts, and a budget to hold it to.
//
//   lacuna::homology_options o{.generators = true};
//   o.control.memory_limit = std::uint64_t{4} << 30;          // the dense core: checked in the run
//   lacuna::require_homology_memory<lacuna::integer>(c, o);    // the rest: checked here
//   auto h = lacuna::homology<lacuna::integer>(c, o);
//
// estimate_homology_memory() counts cells and boundary terms (without building anything) and
// applies the per-cell costs measured with bench_peak_memory (docs/performance.md, *Peak memory
// per cell*; docs/reliability.md, *Memory budget*): the indexed chain complex and its coface
// lists, the elimination log kept for generators, the dense matrices of dense_elimination, and
// for the implicit Morse complex of an image or volume its arrays per grid vertex. The complex
// itself, already in memory, is not counted. It is an estimate from above for these parts;
// what depends on the data and is known only during the run — the dense core left after the
// elimination, the length of lifted generators — is not in it: run_control::memory_limit
// bounds the first (checked before the core is allocated); a caller that must bound everything
// also limits the process (the command-line tool sets an address-space limit beside it).
#pragma once

#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/chain/run_control.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>

#include <algorithm>
#include <cstdint>
#include <string>
#include <type_traits>

namespace lacuna {

/// An estimate of the memory of one homology computation, in bytes, with its parts.
struct memory_estimate {
  std::uint64_t bytes = 0;       ///< the whole estimate (the sum of the parts below)
  std::uint64_t complex = 0;     ///< the indexed chain complex (or the Morse arrays of a volume)
  std::uint64_t generators = 0;  ///< the elimination log kept to lift generators
  std::uint64_t dense = 0;       ///< dense matrices (dense_elimination)
};

namespace detail {

inline std::uint64_t saturating(double x) { return x >= 1.8e19 ? ~std::uint64_t{0} : static_cast<std::uint64_t>(x); }

/// Boundary terms of the k-cells: counted for the built-in complexes, summed otherwise.
template <cell_complex C>
double boundary_terms(const C& c, int k) {
  const double n = static_cast<double>(lacuna::cell_count(c, k));
  if (k == 0) return 0;
  if constexpr (has_implicit_morse_complex<C>) {
    return n * 2 * k;  // a k-cube has 2k faces
  } else if constexpr (requires { c.vertices(k, std::size_t{0}); }) {
    return n * (k + 1);  // a k-simplex has k + 1 faces
  } else {
    double t = 0;
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) t += static_cast<double>(std::ranges::size(lacuna::boundary(c, k, i)));
    return t;
  }
}

}  // namespace detail

/// The estimate for homology<R>(c, options, algorithm) (and for cohomology and relative
/// homology, which build the same complex). Costs O(cells) time for a complex that is not
/// built in (its boundaries are counted), O(dimension) otherwise.
template <euclidean_domain R, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
memory_estimate estimate_homology_memory(const C& c, const homology_options& options = {},
                                         const Algorithm& algorithm = {}) {
  memory_estimate e;
  const int top = lacuna::top_dimension(c);
  if (top < 0) return e;
  // the working coefficient takes sizeof(R) (at least 8: the 64-bit fast path of the integers)
  const double w = static_cast<double>(std::max<std::size_t>(sizeof(R), 8));
  if constexpr (std::same_as<Algorithm, sparse_elimination> && detail::duality_dimension<C> != 0) {
    if (algorithm.cubical_duality && !options.generators && !options.keep_basis.value_or(false) &&
        (algorithm.reduction == pre_reduction::coreductions_and_collapses || algorithm.reduction == pre_reduction::morse)) {
      // the duality route (algorithm/cubical_duality.hpp): one 32-bit label per voxel, 64-bit
      // past 2^32 voxels
      double voxels = 1;
      for (auto n : c.extents()) voxels *= static_cast<double>(n);
      e.complex = detail::saturating((voxels + 1) * (voxels < 4294967295.0 ? 4.0 : 8.0));
      e.bytes = e.complex;
      return e;
    }
  }
  bool implicit_morse = false;
  if constexpr (std::same_as<Algorithm, sparse_elimination> && has_implicit_morse_complex<C>)
    implicit_morse = algorithm.reduction == pre_reduction::morse;
  if constexpr (has_implicit_morse_complex<C>) {
    if (implicit_morse) {
      // per grid vertex: one byte of configuration, a 32-bit root, and the voxel bitmap while
      // it is read; measured 6.25 bytes per vertex on an 800^3 block of ones (docs/reliability.md)
      double vertices = 1;
      for (auto n : c.extents()) vertices *= static_cast<double>(n) + 1;
      e.complex = lacuna::cell_count(c, top) == 0 ? 0 : detail::saturating(6.5 * vertices);
      e.bytes = e.complex;
      return e;
    }
  }
  double cells = 0, terms = 0;
  for (int k = 0; k <= top; ++k) {
    cells += static_cast<double>(lacuna::cell_count(c, k));
    terms += detail::boundary_terms(c, k);
  }
  // bench_peak_memory, the torus over Z (2 terms per cell): 105 bytes per cell, 267 with
  // generators: per cell 40 bytes (states, offsets, indices), per term a boundary entry both
  // ways (index, coefficient) and a coface index; generators keep the elimination log (about
  // 1.6 times the complex again)
  e.complex = detail::saturating(40 * cells + terms * (2 * (4 + w) + 8));
  if (options.generators || options.keep_basis.value_or(false)) e.generators = detail::saturating(1.6 * static_cast<double>(e.complex));
  if constexpr (std::same_as<Algorithm, dense_elimination>) {
    double dense = 0;
    for (int k = 1; k <= top; ++k) {
      const double r = static_cast<double>(lacuna::cell_count(c, k - 1)), s = static_cast<double>(lacuna::cell_count(c, k));
      dense += (r * s + r * r + s * s) * w;  // the matrix and both transforms
    }
    e.dense = detail::saturating(dense);
  }
  e.bytes = detail::saturating(static_cast<double>(e.complex) + static_cast<double>(e.generators) + static_cast<double>(e.dense));
  return e;
}

/// Throws memory_limit_exceeded when estimate_homology_memory passes `limit` bytes (0: no
/// limit; by default options.control.memory_limit). Returns the estimate otherwise.
template <euclidean_domain R, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
memory_estimate require_homology_memory(const C& c, const homology_options& options = {},
                                        const Algorithm& algorithm = {}, std::uint64_t limit = ~std::uint64_t{0}) {
  if (limit == ~std::uint64_t{0}) limit = options.control.memory_limit;
  const memory_estimate e = estimate_homology_memory<R>(c, options, algorithm);
  if (limit != 0 && e.bytes > limit) throw memory_limit_exceeded(e.bytes, limit, "the homology computation");
  return e;
}

}  // namespace lacuna

// lacuna/homology/induced_map.hpp — what a chain map does on homology, and the numbers
// derived from it: degrees, traces, Lefschetz numbers.
//
// H_n(f): H_n(X) -> H_n(Y) is given as a matrix in the generator bases the engine computed:
// column j holds the coordinates in Y's basis (free coordinates, then one residue per torsion
// factor, hY.coordinates) of f applied to the j-th generator of H_n(X) (free generators
// first, then torsion ones). The block free -> free is the integer matrix of the map on the
// free parts; the block torsion -> torsion is the homomorphism between the finite cyclic
// parts (entries read modulo the target's factor); free -> torsion may be non-zero; torsion
// -> free is always zero. Over a field there is no torsion and the matrix is the linear map.
#pragma once

#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace lacuna {

/// A homomorphism between two finitely generated groups, each written in the basis of its
/// generators (rank free ones, then one per torsion factor), as a matrix: rows are target
/// coordinates, columns source generators.
template <euclidean_domain R>
struct induced_homomorphism {
  /// The degree of the source group.
  int source_dimension = 0;
  /// The degree of the target group.
  int target_dimension = 0;
  ///@{
  /// The numbers of free generators of the source and of the target.
  std::size_t source_rank = 0, target_rank = 0;
  ///@}
  ///@{
  /// The torsion factors of the source and of the target.
  std::vector<R> source_torsion, target_torsion;
  ///@}
  dense_matrix<R> matrix;  ///< (target_rank + target_torsion.size()) x (source_rank + source_torsion.size())

  /// The map on the free parts: target_rank x source_rank.
  dense_matrix<R> free_part() const { return block(0, target_rank, 0, source_rank); }
  /// The map between the torsion parts (entries modulo the target factors).
  dense_matrix<R> torsion_part() const {
    return block(target_rank, matrix.rows(), source_rank, matrix.cols());
  }
  /// The map from the free part of the source to the torsion part of the target.
  dense_matrix<R> free_to_torsion() const { return block(target_rank, matrix.rows(), 0, source_rank); }

 private:
  dense_matrix<R> block(std::size_t r0, std::size_t r1, std::size_t c0, std::size_t c1) const {
    dense_matrix<R> out(r1 - r0, c1 - c0);
    for (std::size_t i = r0; i < r1; ++i)
      for (std::size_t j = c0; j < c1; ++j) out(i - r0, j - c0) = matrix(i, j);
    return out;
  }
};

namespace detail {
template <class R>
bool has_group(const homology_result<R>& h, int n) {
  return n >= 0 && n <= h.top_dimension();
}
template <class R>
std::size_t coordinate_count(const homology_result<R>& h, int n) {
  return has_group(h, n) ? h[n].rank + h[n].torsion.size() : 0;
}

/// The homomorphism H_n(src) -> H_m(dst) that sends generator j to the class of
/// image_of(generator j), a cycle of dimension m of dst's complex.
template <class R, class Fn>
induced_homomorphism<R> homomorphism_from_generators(const homology_result<R>& src, int n, const homology_result<R>& dst,
                                                     int m, Fn&& image_of) {
  induced_homomorphism<R> h;
  h.source_dimension = n;
  h.target_dimension = m;
  if (has_group(src, n)) h.source_rank = src[n].rank, h.source_torsion = src[n].torsion;
  if (has_group(dst, m)) h.target_rank = dst[m].rank, h.target_torsion = dst[m].torsion;
  const std::size_t cols = coordinate_count(src, n), rows = coordinate_count(dst, m);
  h.matrix = dense_matrix<R>(rows, cols);
  if (cols == 0 || rows == 0) return h;
  const auto& gens = src[n].generators;
  if (gens.size() != cols) throw std::logic_error("lacuna: induced maps need the source homology with generators");
  if (!dst.has_basis()) throw std::logic_error("lacuna: induced maps need the target homology with keep_basis");
  for (std::size_t j = 0; j < cols; ++j) {
    const chain<R> im = image_of(gens[j]);
    const auto x = dst.coordinates(im);
    for (std::size_t i = 0; i < rows; ++i) h.matrix(i, j) = x[i];
  }
  return h;
}
}  // namespace detail

/// H_n(f) in the bases of hX (computed with generators) and hY (computed with keep_basis or
/// generators) of f: X -> Y.
template <euclidean_domain R, chain_map F>
induced_homomorphism<R> induced_map(const F& f, const homology_result<R>& hX, const homology_result<R>& hY, int n) {
  const R ring_one = hY.ring_one_;
  return detail::homomorphism_from_generators(hX, n, hY, n, [&](const chain<R>& z) { return apply_map(f, z, ring_one); });
}

/// H_n(f) for every n in 0..top(X), computing the homology of X and Y over R.
template <euclidean_domain R, chain_map F, cell_complex X_t, cell_complex Y_t>
std::vector<induced_homomorphism<R>> induced_maps(const F& f, const X_t& X, const Y_t& Y, const R& ring_one = one<R>()) {
  const auto hX = homology<R>(X, {.generators = true}, sparse_elimination{}, ring_one);
  const auto hY = homology<R>(Y, {.keep_basis = true}, sparse_elimination{}, ring_one);
  std::vector<induced_homomorphism<R>> out;
  for (int n = 0; n <= lacuna::top_dimension(X); ++n) out.push_back(induced_map(f, hX, hY, n));
  return out;
}

/// The degree of f: X -> Y, closed oriented manifolds (or any complexes) of one dimension n
/// with H_n = Z, with the orientations given by the n-cycles zX, zY (fundamental classes).
/// Throws std::invalid_argument if H_n is not Z or a cycle does not generate it.
template <chain_map F, cell_complex X_t, cell_complex Y_t>
integer degree(const F& f, const X_t& X, const Y_t& Y, const chain<integer>& zX, const chain<integer>& zY) {
  const int n = lacuna::top_dimension(X);
  if (lacuna::top_dimension(Y) != n) throw std::invalid_argument("lacuna: degree: the complexes differ in dimension");
  const auto hX = homology<integer>(X, {.keep_basis = true});
  const auto hY = homology<integer>(Y, {.keep_basis = true});
  for (const auto* h : {&hX, &hY})
    if ((*h)[n].rank != 1 || !(*h)[n].torsion.empty())
      throw std::invalid_argument("lacuna: degree: H_" + std::to_string(n) + " is not Z");
  const auto cx = hX.coordinates(X, zX);
  const auto cy = hY.coordinates(Y, zY);
  if (!is_unit(cx[0]) || !is_unit(cy[0]))
    throw std::invalid_argument("lacuna: degree: an orientation cycle does not generate H_" + std::to_string(n));
  const auto a = hY.coordinates(Y, apply_map(f, zX));
  return a[0] * cy[0];  // f(zX) = deg zY = deg cy gY, and cy = 1/cy is +-1
}

/// The degree of a self-map f: X -> X (H_n(X) = Z, n = top): independent of orientation.
template <chain_map F, cell_complex X_t>
integer degree(const F& f, const X_t& X) {
  const int n = lacuna::top_dimension(X);
  const auto h = homology<integer>(X, {.generators = true});
  if (h[n].rank != 1 || !h[n].torsion.empty())
    throw std::invalid_argument("lacuna: degree: H_" + std::to_string(n) + " is not Z");
  return induced_map(f, h, h, n).matrix(0, 0);
}

/// The trace of H_n(f; Q) for a self-map f of X.
template <chain_map F, cell_complex X_t>
rational trace(const F& f, const X_t& X, int n) {
  const auto h = homology<rational>(X, {.generators = true});
  const auto m = induced_map(f, h, h, n).matrix;
  rational t = 0;
  for (std::size_t i = 0; i < m.rows(); ++i) t += m(i, i);
  return t;
}

/// The Lefschetz number of a self-map f of X: sum over n of (-1)^n trace H_n(f; Q). If it is
/// not zero, every map homotopic to f has a fixed point (Lefschetz fixed-point theorem,
/// Hatcher 2002, Theorem 2C.3), for X a finite simplicial complex or a retract of one.
template <chain_map F, cell_complex X_t>
rational lefschetz_number(const F& f, const X_t& X) {
  const auto h = homology<rational>(X, {.generators = true});
  rational L = 0;
  for (int n = 0; n <= lacuna::top_dimension(X); ++n) {
    const auto m = induced_map(f, h, h, n).matrix;
    rational t = 0;
    for (std::size_t i = 0; i < m.rows(); ++i) t += m(i, i);
    L += (n % 2 == 0) ? t : -t;
  }
  return L;
}

}  // namespace lacuna

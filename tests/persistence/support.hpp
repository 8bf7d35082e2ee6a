// support.hpp — shared helpers of the persistence tests: random filtrations of every built-in
// kind, the subcomplex of a filtration up to a value or up to a cell (as a cell_list, so that
// lacuna::homology judges it with one instantiation per field), and chain arithmetic written
// apart from the library's reductions.
#pragma once

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/construct/subcomplex.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/filtration.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/persistence/values_filtration.hpp>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <map>
#include <optional>
#include <random>
#include <set>
#include <string>
#include <utility>
#include <vector>

namespace persistence_test_support {

// ---- random filtrations ----------------------------------------------------------------

/// A random simplicial complex on n vertices: `facets` random facets of 1..max_size vertices.
inline lacuna::simplicial_complex<int> random_complex(std::mt19937_64& rng, int n, int facets, int max_size) {
  typename lacuna::simplicial_complex<int>::builder b;
  for (int v = 0; v < n; ++v) b.vertex(v);
  std::uniform_int_distribution<int> size(1, max_size), vertex(0, n - 1);
  for (int f = 0; f < facets; ++f) {
    std::set<int> s;
    const int want = size(rng);
    while (static_cast<int>(s.size()) < want) s.insert(vertex(rng));
    b.add_facet(std::vector<int>(s.begin(), s.end()));
  }
  return std::move(b).finalize();
}

/// n random small integers in [0, range) (ties are likely: the tie rules are exercised).
inline std::vector<int> random_values(std::mt19937_64& rng, std::size_t n, int range) {
  std::uniform_int_distribution<int> d(0, range - 1);
  std::vector<int> v(n);
  for (auto& x : v) x = d(rng);
  return v;
}

/// Random values for every cell of c that respect faces: each cell gets the latest of its
/// faces (as written) plus a random increment in 0..2, vertices 0..range-1.
template <class C>
std::vector<std::vector<int>> random_monotone_values(std::mt19937_64& rng, const C& c, int range) {
  std::vector<std::vector<int>> values(static_cast<std::size_t>(lacuna::top_dimension(c) + 1));
  std::uniform_int_distribution<int> bump(0, 2);
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) {
    const auto uk = static_cast<std::size_t>(k);
    if (k == 0) {
      values[0] = random_values(rng, lacuna::cell_count(c, 0), range);
      continue;
    }
    for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) {
      int v = 0;
      for (std::size_t f : lacuna::faces_as_written(c, k, i)) v = std::max(v, values[uk - 1][f]);
      values[uk].push_back(v + bump(rng));
    }
  }
  return values;
}

/// n random points of dimension d with coordinates on a coarse grid (many equal distances).
inline std::vector<std::vector<double>> random_points(std::mt19937_64& rng, std::size_t n, std::size_t d, int grid) {
  std::uniform_int_distribution<int> c(0, grid - 1);
  std::vector<std::vector<double>> pts(n, std::vector<double>(d));
  for (auto& p : pts)
    for (auto& x : p) x = 0.5 * c(rng);
  return pts;
}

// ---- subcomplexes ----------------------------------------------------------------------

/// The cells of f entering at t or before (value not after t in f's order), as a cell_list,
/// and per dimension the new index of each old cell (npos if not kept).
struct sub {
  lacuna::cell_list complex;
  std::vector<std::vector<std::size_t>> new_index;
};

template <class F, class Keep>
sub keep_cells(const F& f, Keep keep) {
  sub s;
  const int top = lacuna::top_dimension(f);
  s.new_index.resize(static_cast<std::size_t>(std::max(top + 1, 0)));
  for (int k = 0; k <= top; ++k) {
    auto& idx = s.new_index[static_cast<std::size_t>(k)];
    std::size_t next = 0;
    for (std::size_t i = 0; i < lacuna::cell_count(f, k); ++i) idx.push_back(keep(k, i) ? next++ : lacuna::cell_selection::npos);
  }
  s.complex = lacuna::subcomplex(f, [&](int k, std::size_t i) { return keep(k, i); });
  return s;
}

/// The subcomplex at value t.
template <class F, class V>
sub at_value(const F& f, const V& t) {
  const auto order = lacuna::value_order(f);
  return keep_cells(f, [&](int k, std::size_t i) { return !order(t, lacuna::cell_value(f, k, i)); });
}

/// The cells entering before the cell (k0, i0) in the total order (value, dimension, index),
/// and the cell itself when `inclusive`.
template <class F>
sub before_cell(const F& f, int k0, std::size_t i0, bool inclusive) {
  const auto order = lacuna::value_order(f);
  const auto v0 = lacuna::cell_value(f, k0, i0);
  return keep_cells(f, [&](int k, std::size_t i) {
    const auto v = lacuna::cell_value(f, k, i);
    if (order(v, v0)) return true;
    if (order(v0, v)) return false;
    if (k != k0) return k < k0;
    return inclusive ? i <= i0 : i < i0;
  });
}

/// Betti numbers 0..top of a cell_list over the field R (lacuna::homology, the engine judge),
/// padded with zeros up to `dims` entries.
template <class R>
std::vector<std::size_t> betti_numbers(const lacuna::cell_list& c, std::size_t dims, const R& unit = lacuna::one<R>()) {
  std::vector<std::size_t> b = lacuna::homology<R>(c, {}, {}, unit).betti_numbers();
  b.resize(std::max(b.size(), dims), 0);
  b.resize(dims);
  return b;
}

// ---- chains, written apart -------------------------------------------------------------

/// The boundary of a chain of f over R, from f's own boundaries.
template <class R, class F>
lacuna::chain<R> boundary_of(const F& f, const lacuna::chain<R>& z, const R& unit = lacuna::one<R>()) {
  std::map<std::size_t, R> acc;
  if (z.dimension >= 1)
    for (const auto& t : z.terms)
      for (auto&& e : lacuna::boundary(f, z.dimension, t.cell)) {
        const auto inc = lacuna::as_incidence(e);
        acc[inc.face] += lacuna::from_integer<R>(inc.coefficient) * unit * t.coefficient;
      }
  lacuna::chain<R> out{z.dimension - 1, {}};
  for (const auto& [cell, c] : acc)
    if (!(c == lacuna::zero<R>())) out.terms.push_back({cell, c});
  return out;
}

/// A chain of f renumbered into a subcomplex; nullopt if a cell of it is not kept.
template <class R>
std::optional<lacuna::chain<R>> renumber(const lacuna::chain<R>& z, const sub& s) {
  lacuna::chain<R> out{z.dimension, {}};
  for (const auto& t : z.terms) {
    const std::size_t n = s.new_index.at(static_cast<std::size_t>(z.dimension)).at(t.cell);
    if (n == lacuna::cell_selection::npos) return std::nullopt;
    out.terms.push_back({n, t.coefficient});
  }
  out.normalize_terms();
  return out;
}

/// The pairs of a result with positive persistence, as (birth, death or nullopt) per
/// dimension, sorted — what two variants must agree on.
template <class V, class R, class O>
std::vector<std::vector<std::pair<V, std::optional<V>>>> positive_pairs(const lacuna::persistence_result<V, R, O>& r) {
  std::vector<std::vector<std::pair<V, std::optional<V>>>> out;
  for (const auto& d : lacuna::without_zero_persistence(r).diagrams) {
    out.emplace_back();
    for (const auto& p : d.pairs) out.back().emplace_back(p.birth, p.death);
  }
  return out;
}

}  // namespace persistence_test_support

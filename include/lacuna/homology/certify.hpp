// lacuna/homology/certify.hpp — homology with a certificate (homology/certificate.hpp) that a
// checker written apart from the engine verifies; docs/certificates.md says what it proves.
//
// How each witness is obtained (the engine's elimination route, homology/homology.hpp):
//   * generators and their bounding chains: homology() with generators and
//     homology_options::witnesses — on the core left by the unit-pivot elimination,
//     D_{k+1} V'[:, i] = e_i·(generator i) (the second Smith form's column transform), and
//     both are lifted to the original cells by the same chain map;
//   * cocycles: coordinate j of the engine's coordinates() is a linear form on k-chains —
//     the push f of the elimination log (a chain map), then rows of U_M·V⁻¹ on the core. As a
//     cochain it is the row of U_M V⁻¹ pulled back through the log (pull_cochains, the
//     transpose of the push). It vanishes on boundaries, since coordinates of boundaries
//     vanish (modulo d for a torsion coordinate), and it is 1 on generator j and 0 on the
//     others (modulo d) because f∘g is the identity. These facts are what the checker
//     verifies; nothing of this derivation is trusted;
//   * rank witnesses, from the elimination log: the unit pivots (b, a) of each boundary map,
//     in the log's order, are the first Gaussian pivots of the minor of ∂_k on the pivots'
//     rows and the core rows (an elementary reduction takes a Schur complement in ∂_k and only
//     deletes rows or columns of ∂_{k-1} and ∂_{k+1}); the elimination is repeated here mod p
//     (as the checker repeats it) and pivots of the core are chosen as it goes. Over Z the
//     unit pivots are ±1, so only the core depends on p: 2^31 − 1 first, then the next primes
//     below it while the core's rank mod p falls short (p divides a torsion order). When the
//     log does not give the ranks (over Q, whose unit pivots are any non-zero rationals), the
//     boundary matrices of the whole complex are reduced mod p instead (reduce_chain_complex,
//     algorithm/field_reduction.hpp): pivots by increasing reduced column have non-singular
//     leading minors (the reduced pivot columns are the original ones times a unitriangular
//     matrix, and with distinct lows they are triangular). Over Z/p, p itself;
//   * torsion witnesses (over Z), for each H_k: the log's unit pivots of ∂_{k+1} in its order,
//     then blocks of the core matrix that those pivots leave, found by eliminations mod primes
//     in pseudo-random orders until the gcd of their exact determinants is the product of the
//     torsion factors (detail::certify::torsion_witness_of).
// Cost: that of homology() with generators and a kept basis, plus the pull of one cochain per
// generator through the log (as the lift of the generators), plus a product of the kept core
// transforms, plus the elimination of each boundary map mod p in the log's order (about what
// the engine's elimination cost; docs/performance.md, "Certified homology"), plus over Z one
// more elimination over Z per boundary map along the unit pivots, and the blocks' determinants.
#pragma once

#include <lacuna/algorithm/elimination_maps.hpp>
#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/rational.hpp>

#include <algorithm>
#include <concepts>
#include <cstdint>
#include <numeric>
#include <random>
#include <set>
#include <stdexcept>
#include <vector>

namespace lacuna {

/// The rings certified_homology works over: the integers, Q, and fields of a characteristic
/// below 2^32 fixed at compile time (z2, mod_p<P>).
template <class R>
concept certifiable_ring = euclidean_domain<R> && (std::same_as<R, integer> || std::same_as<R, rational> ||
                                                   (characteristic_v<R> != 0 && characteristic_v<R> < (std::uint64_t{1} << 32)));

/// A homology result with generators and the certificate of its groups.
template <class R>
struct certified_homology_result {
  /// The groups and generators.
  homology_result<R> result;
  /// The certificate of the groups, for check_certificate.
  homology_certificate<R> certificate;
};

namespace detail::certify {

/// Rank witnesses of every ∂_k of c modulo p, or an empty vector when the ranks mod p do not
/// account for the free ranks claimed in `rank` (p divides a torsion order).
template <cell_complex C>
std::vector<rank_witness> rank_witnesses(const C& c, std::uint64_t p, const std::vector<std::size_t>& rank,
                                         const run_control* control) {
  const int top = lacuna::top_dimension(c);
  const mod_p_dynamic u(1, p);
  std::vector<rank_witness> out(static_cast<std::size_t>(top) + 1);
  // The direction of field_ranks.hpp's automatic choice: by coboundaries (the transposes, from
  // dimension 1 up) when the top dimension holds more cells than the vertices — the fill-in of
  // a triangulated surface reduced by boundaries is several times larger — else by boundaries.
  const bool by_coboundary = top >= 1 && lacuna::cell_count(c, top) > lacuna::cell_count(c, 0);
  std::vector<sparse_matrix<mod_p_dynamic>> mats;
  if (!by_coboundary) {
    for (int k = 1; k <= top; ++k) mats.push_back(boundary_matrix<mod_p_dynamic>(c, k, u));
  } else {
    for (int k = top; k >= 1; --k) {  // ∂_k^T: rows the k-cells, columns the (k-1)-cells
      auto d = boundary_matrix<mod_p_dynamic>(c, k, u);
      sparse_matrix<mod_p_dynamic> t(d.cols, d.rows);
      for (std::size_t j = 0; j < d.cols; ++j)
        for (const auto& e : d.columns[j]) t.add(j, e.index, e.value);
      t.normalize();
      mats.push_back(std::move(t));
    }
  }
  const auto red = reduce_chain_complex(mats, {.control = control, .phase = "rank witnesses modulo a prime"});
  for (int k = 1; k <= top; ++k) {
    auto& w = out[static_cast<std::size_t>(k)];
    w.prime = p;
    // A pivot of ∂_k^T at (k-cell, (k-1)-cell) is one of ∂_k at ((k-1)-cell, k-cell).
    for (const auto& pv : red[static_cast<std::size_t>(by_coboundary ? top - k : k - 1)].pivots) {
      w.rows.push_back(by_coboundary ? pv.column : pv.row);
      w.columns.push_back(by_coboundary ? pv.row : pv.column);
    }
  }
  for (int k = 0; k <= top; ++k) {
    const std::size_t a = out[static_cast<std::size_t>(k)].rows.size();
    const std::size_t b = k < top ? out[static_cast<std::size_t>(k) + 1].rows.size() : 0;
    if (lacuna::cell_count(c, k) - a - b != rank[static_cast<std::size_t>(k)]) return {};
  }
  return out;
}

/// Rank witnesses of ∂_k read off the engine's elimination: the unit pivots (b, a) of the
/// log at this level, in their order, are Gaussian pivots of ∂_k (an elimination step takes a
/// Schur complement in ∂_k and only deletes rows or columns of the neighbouring boundary
/// maps), followed by pivots of the core that are left, chosen here by a left-looking
/// elimination mod p over the unit pivot rows and the core rows (the same elimination the
/// checker repeats). Returns false if a unit pivot vanishes mod p (it cannot: each is ±1 after
/// the eliminations before it), so the caller can fall back to the field reduction.
template <class R, cell_complex C>
bool log_rank_witness(const C& c, int k, const homology_basis<R>& basis, std::uint64_t p, rank_witness& w) {
  w = {};
  w.prime = p;
  const std::size_t L = static_cast<std::size_t>(k);
  for (const auto& st : basis.log.steps)
    if (st.level == k) w.rows.push_back(st.b), w.columns.push_back(st.a);
  const std::size_t units = w.rows.size();
  std::vector<std::size_t> universe = w.rows;  // rows of the minor: unit pivot rows, then core rows
  for (std::uint32_t r : basis.levels[L - 1].core) universe.push_back(r);
  // (k-1)-cell -> its position in the universe: one array over the level (4 bytes a cell; a
  // hash map took some 50 bytes a row, the peak of this step on large volumes)
  constexpr std::uint32_t none = ~std::uint32_t{0};
  std::vector<std::uint32_t> pos(lacuna::cell_count(c, k - 1), none);
  for (std::size_t i = 0; i < universe.size(); ++i) pos[universe[i]] = static_cast<std::uint32_t>(i);
  std::vector<std::int64_t> pivot_at(universe.size(), -1);  // position -> pivot index
  for (std::size_t i = 0; i < units; ++i) pivot_at[i] = static_cast<std::int64_t>(i);
  auto inverse = [p](std::uint64_t x) {
    std::uint64_t r = 1, b = x % p, e = p - 2;
    for (; e; e >>= 1, b = b * b % p)
      if (e & 1) r = r * b % p;
    return r;
  };
  // The reduced pivot columns, one after the other (by pivot t: entries [start[t], start[t+1])
  // of `reduced`, (position, value), the pivot's own entry first).
  std::vector<std::pair<std::uint32_t, std::uint64_t>> reduced;
  std::vector<std::size_t> start{0};
  std::vector<std::uint32_t> pivot_pos;  // by pivot: its position
  std::vector<std::uint64_t> acc(universe.size(), 0);
  std::vector<char> seen(universe.size(), 0);
  std::vector<std::uint32_t> touched;
  std::vector<std::int64_t> heap;  // pivot indices, smallest first
  auto greater = [](std::int64_t a, std::int64_t b) { return a > b; };
  std::vector<std::size_t> columns = w.columns;
  for (std::uint32_t col : basis.levels[L].core) columns.push_back(col);
  w.rows.clear(), w.columns.clear();
  for (std::size_t j = 0; j < columns.size(); ++j) {
    const std::int64_t limit = static_cast<std::int64_t>(pivot_pos.size());  // pivots before this column
    touched.clear(), heap.clear();
    auto touch = [&](std::uint32_t q) {
      if (seen[q]) return;
      seen[q] = 1;
      touched.push_back(q);
      if (pivot_at[q] >= 0 && pivot_at[q] < limit) {
        heap.push_back(pivot_at[q]);
        std::push_heap(heap.begin(), heap.end(), greater);
      }
    };
    for (auto&& v : lacuna::boundary(c, k, columns[j])) {
      const auto [face, m] = cert::residue_of(v, p);
      const std::uint32_t q = pos[face];
      if (q == none) continue;
      touch(q);
      acc[q] = (acc[q] + m) % p;
    }
    while (!heap.empty()) {
      std::pop_heap(heap.begin(), heap.end(), greater);
      const auto t = static_cast<std::size_t>(heap.back());
      heap.pop_back();
      const std::uint64_t x = acc[pivot_pos[t]];
      if (x == 0) continue;
      const std::uint64_t f = x * inverse(reduced[start[t]].second) % p;
      for (std::size_t e = start[t]; e < start[t + 1]; ++e) {
        const auto [q, val] = reduced[e];
        touch(q);
        acc[q] = (acc[q] + p - f * val % p) % p;
      }
    }
    std::int64_t chosen = -1;  // the position of this column's pivot
    if (j < units) {
      chosen = static_cast<std::int64_t>(j);
      if (acc[j] == 0) chosen = -2;
    } else {
      for (std::uint32_t q : touched)
        if (pivot_at[q] < 0 && acc[q] != 0 && (chosen < 0 || q < chosen)) chosen = q;
    }
    if (chosen >= 0) {
      const auto q = static_cast<std::uint32_t>(chosen);
      pivot_at[q] = static_cast<std::int64_t>(pivot_pos.size());
      reduced.push_back({q, acc[q]});
      for (std::uint32_t u : touched)
        if (u != q && acc[u] != 0 && (pivot_at[u] < 0 || pivot_at[u] > pivot_at[q])) reduced.push_back({u, acc[u]});
      start.push_back(reduced.size());
      pivot_pos.push_back(q);
      w.rows.push_back(universe[q]);
      w.columns.push_back(columns[j]);
    }
    for (std::uint32_t u : touched) acc[u] = 0, seen[u] = 0;
    if (chosen == -2) return false;
  }
  return true;
}

/// The torsion witness of H_k over the integers (homology/certificate.hpp, torsion_witness):
/// the log's unit pivots of ∂_{k+1}, in their order, then blocks of the core. The minor of
/// ∂_{k+1} on the pivots' rows and columns and a block of core rows and columns has
/// determinant ± that of the block in the core matrix D (the Schur complement that the unit
/// pivots leave; docs/certificates.md). D is recomputed here exactly by the checker's own
/// elimination (detail::cert::exact_schur), its rank is s = rank − (unit pivots), and blocks
/// are chosen until the gcd of their determinants (exact, Bareiss) is P, the product of the
/// claimed torsion factors — the gcd of all s×s minors of D, d_1⋯d_s(D). Each block comes from
/// a Gaussian elimination of D modulo a prime, with the rows and columns taken in a
/// pseudo-random order (a fixed seed, so the certificate is reproducible): a block non-singular
/// mod q has a determinant prime to q, so primes that do not divide P leave the gcd quickly.
/// Nothing here is trusted: the checker recomputes every determinant. Throws std::runtime_error
/// when no such blocks are found within a bounded number of tries (never a wrong certificate).
template <cell_complex C, class R>
torsion_witness torsion_witness_of(const C& c, int k, const homology_basis<R>& basis, std::size_t rank, const integer& P) {
  torsion_witness w;
  for (const auto& st : basis.log.steps)
    if (st.level == k + 1) w.pivot_rows.push_back(st.b), w.pivot_columns.push_back(st.a);
  const std::size_t u = w.pivot_rows.size();
  const auto& core_rows = basis.levels[static_cast<std::size_t>(k)].core;
  const auto& core_columns = basis.levels[static_cast<std::size_t>(k) + 1].core;
  const std::vector<std::size_t> rows(core_rows.begin(), core_rows.end()), columns(core_columns.begin(), core_columns.end());
  std::vector<std::vector<integer>> D;
  std::string why;
  const std::string H = "lacuna::certified_homology: the torsion witness of H_" + std::to_string(k);
  if (!cert::exact_schur<integer>(c, k + 1, w.pivot_rows, w.pivot_columns, rows, columns, D, why))
    throw std::logic_error(H + ": the elimination's pivots are not unit pivots of the boundary (" + why + ")");
  if (u > rank) throw std::logic_error(H + ": more unit pivots than the rank");
  const std::size_t s = rank - u, m = rows.size(), n = columns.size();
  if (s == 0) {
    w.minors.push_back({});
    if (!(P == integer(1))) throw std::logic_error(H + ": the core has rank 0 but torsion is claimed");
    return w;
  }
  using seed_type = std::mt19937_64::result_type;
  std::mt19937_64 random(seed_type{0x6c6163756e61} + static_cast<seed_type>(k));
  // small primes (they clear small primes from the gcd), then large ones
  std::vector<std::uint64_t> primes{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47};
  for (std::uint64_t q = (std::uint64_t{1} << 31) - 1; primes.size() < 24; --q)
    if (is_prime(q)) primes.push_back(q);
  std::vector<std::size_t> row_order(m), column_order(n);
  std::iota(row_order.begin(), row_order.end(), std::size_t{0});
  std::iota(column_order.begin(), column_order.end(), std::size_t{0});
  integer g(0);
  std::set<std::pair<std::vector<std::size_t>, std::vector<std::size_t>>> tried;
  constexpr int max_tries = 256;
  for (int t = 0; t < max_tries && !(g == P); ++t) {
    // A large prime first (a generic block), then the primes in turn.
    const std::uint64_t p = primes[(static_cast<std::size_t>(t) + primes.size() - 1) % primes.size()];
    if (t > 0) {
      std::shuffle(row_order.begin(), row_order.end(), random);
      std::shuffle(column_order.begin(), column_order.end(), random);
    }
    // Gaussian elimination of D mod p, columns and rows in the orders drawn.
    std::vector<std::vector<std::uint64_t>> a(n, std::vector<std::uint64_t>(m));
    for (std::size_t j = 0; j < n; ++j)
      for (std::size_t i = 0; i < m; ++i) {
        integer x = D[j][i] % integer(static_cast<std::int64_t>(p));
        if (x < integer(0)) x += integer(static_cast<std::int64_t>(p));
        a[j][i] = static_cast<std::uint64_t>(x.small_value());
      }
    std::vector<char> used(m, 0);
    std::vector<std::size_t> block_rows, block_columns;
    std::vector<std::pair<std::size_t, std::size_t>> pivots;  // (row, column) positions in D
    for (std::size_t jj = 0; jj < n && pivots.size() < s; ++jj) {
      const std::size_t j = column_order[jj];
      auto& col = a[j];
      for (const auto& [pr, pc] : pivots) {  // reduce by the earlier pivot columns
        if (col[pr] == 0) continue;
        const auto& pcol = a[pc];
        std::uint64_t inv = 1, b = pcol[pr], e = p - 2;
        for (; e; e >>= 1, b = b * b % p)
          if (e & 1) inv = inv * b % p;
        const std::uint64_t f = col[pr] * inv % p;
        for (std::size_t i = 0; i < m; ++i)
          if (pcol[i]) col[i] = (col[i] + p - f * pcol[i] % p) % p;
      }
      for (std::size_t ii = 0; ii < m; ++ii) {
        const std::size_t i = row_order[ii];
        if (!used[i] && col[i] != 0) {
          used[i] = 1;
          pivots.push_back({i, j});
          break;
        }
      }
    }
    if (pivots.size() != s) continue;  // p divides a determinantal divisor: no full block mod p
    for (const auto& [i, j] : pivots) block_rows.push_back(i), block_columns.push_back(j);
    std::sort(block_rows.begin(), block_rows.end());
    std::sort(block_columns.begin(), block_columns.end());
    if (!tried.insert({block_rows, block_columns}).second) continue;
    std::vector<std::vector<integer>> block(s, std::vector<integer>(s));
    for (std::size_t j = 0; j < s; ++j)
      for (std::size_t i = 0; i < s; ++i) block[j][i] = D[block_columns[j]][block_rows[i]];
    const integer det = cert::bareiss_determinant(std::move(block));
    const integer before = g;
    g = cert::magnitude(lacuna::gcd(g, det));
    if (g == before) continue;  // this block adds nothing to the gcd: not kept
    minor_block mb;
    for (std::size_t i : block_rows) mb.rows.push_back(rows[i]);
    for (std::size_t j : block_columns) mb.columns.push_back(columns[j]);
    w.minors.push_back(std::move(mb));
  }
  if (!(g == P))
    throw std::runtime_error(H + ": no minors of ∂_" + std::to_string(k + 1) + " found whose determinants have gcd " +
                             P.to_string() + " (the gcd reached is " + g.to_string() + ")");
  return w;
}

/// certified_homology of absolute homology (below): the engine's elimination route, each
/// witness obtained as the top of this header says.
template <certifiable_ring R, cell_complex C>
certified_homology_result<R> certified_absolute(const C& c, homology_options options) {
  options.generators = true;
  options.keep_basis = true;
  options.witnesses = true;
  certified_homology_result<R> out;
  out.result = homology<R>(c, options, sparse_elimination{});
  const auto& h = out.result;
  if (!h.basis_ || h.project_) throw std::logic_error("lacuna::certified_homology: the engine kept no elimination basis");
  const auto& basis = *h.basis_;
  const int top = lacuna::top_dimension(c);
  auto& cert = out.certificate;
  for (int k = 0; k <= top; ++k) {
    const auto& g = h[k];
    certified_group<R> cg;
    cg.dimension = k;
    cg.rank = g.rank;
    cg.torsion = g.torsion;
    cg.generators = g.generators;
    cg.bounding_chains = g.bounding_chains;
    const std::size_t L = static_cast<std::size_t>(k);  // absolute homology: level = dimension
    const auto& b = basis.levels[L];
    if (!basis.from_original[L].empty()) throw std::logic_error("lacuna::certified_homology: cells were excluded");
    // The coordinate forms on the level, in the order of the generators (coordinates_on_levels).
    const std::size_t n = b.core.size(), kdim = n - b.boundary_rank;
    std::vector<level_chain<R>> forms;
    for (std::uint32_t cell : b.isolated) forms.push_back({{cell, one<R>()}});
    auto row = [&](std::size_t i) {  // row i of U_M · V_inv[r.., :], on the core cells
      level_chain<R> f;
      std::vector<R> v(n, zero<R>());
      for (std::size_t t = 0; t < kdim; ++t) {
        const R& u = b.quotient_u(i, t);
        if (u == zero<R>()) continue;
        for (std::size_t j = 0; j < n; ++j)
          if (!(b.boundary_v_inverse(b.boundary_rank + t, j) == zero<R>())) v[j] += u * b.boundary_v_inverse(b.boundary_rank + t, j);
      }
      for (std::size_t j = 0; j < n; ++j)
        if (!(v[j] == zero<R>())) f.push_back({b.core[j], v[j]});
      return f;
    };
    std::vector<R> moduli(b.isolated.size(), zero<R>());
    for (std::size_t i = b.quotient_factors.size(); i < kdim; ++i) forms.push_back(row(i)), moduli.push_back(zero<R>());
    for (std::size_t i = 0; i < b.quotient_factors.size(); ++i)
      if (!detail::ring_is_unit(b.quotient_factors[i])) forms.push_back(row(i)), moduli.push_back(b.quotient_factors[i]);
    auto pulled = pull_cochains(basis.log, static_cast<int>(L), basis.level_sizes[L], forms, &options.control);
    for (std::size_t j = 0; j < pulled.size(); ++j) {
      chain<R> phi{k, {}};
      for (const auto& e : pulled[j]) {
        R v = moduli[j] == zero<R>() ? e.value : detail::canonical_residue(e.value, moduli[j]);
        if (!(v == zero<R>())) phi.terms.push_back({e.index, std::move(v)});
      }
      cg.cocycles.push_back(std::move(phi));
    }
    cert.groups.push_back(std::move(cg));
  }
  // Rank witnesses: from the elimination log first (no new reduction of the complex), else
  // from a field reduction of the whole complex.
  std::vector<std::size_t> ranks;
  for (const auto& g : h.groups) ranks.push_back(g.rank);
  auto from_log = [&](std::uint64_t p) {
    std::vector<rank_witness> witnessed(static_cast<std::size_t>(top) + 1);
    for (int k = 1; k <= top; ++k)
      if (!detail::certify::log_rank_witness(c, k, basis, p, witnessed[static_cast<std::size_t>(k)])) return false;
    for (int k = 0; k <= top; ++k) {
      const std::size_t a = witnessed[static_cast<std::size_t>(k)].rows.size();
      const std::size_t b = k < top ? witnessed[static_cast<std::size_t>(k) + 1].rows.size() : 0;
      if (lacuna::cell_count(c, k) - a - b != ranks[static_cast<std::size_t>(k)]) return false;
    }
    cert.ranks = std::move(witnessed);
    return true;
  };
  if constexpr (characteristic_v<R> != 0) {
    from_log(characteristic_v<R>);
  } else {
    std::uint64_t p = (std::uint64_t{1} << 31) - 1;
    for (int tries = 0; tries < 4 && top >= 1; ++tries, --p) {
      while (!is_prime(p)) --p;
      if (from_log(p)) break;
    }
  }
  if (!cert.ranks.empty() || top < 1) {
    if (top == 0) cert.ranks.assign(1, {});
  } else if constexpr (characteristic_v<R> != 0) {
    cert.ranks = detail::certify::rank_witnesses(c, characteristic_v<R>, ranks, &options.control);
  } else {
    std::uint64_t p = (std::uint64_t{1} << 31) - 1;
    for (int tries = 0; tries < 16 && cert.ranks.empty(); ++tries, --p) {
      while (!is_prime(p)) --p;
      cert.ranks = detail::certify::rank_witnesses(c, p, ranks, &options.control);
    }
  }
  if (cert.ranks.empty() && top >= 0)
    throw std::logic_error("lacuna::certified_homology: no prime tried gives ranks that account for the free ranks");
  if (top < 0) cert.ranks.clear();
  // Torsion witnesses (over the integers): minors of each ∂_{k+1} whose determinants have the
  // product of the torsion factors of H_k as gcd, so no torsion summand is left out.
  if constexpr (std::same_as<R, integer>) {
    if (top >= 0) {
      cert.torsion.assign(static_cast<std::size_t>(top) + 1, {});
      for (int k = 0; k < top; ++k) {
        integer P(1);
        for (const auto& d : h[k].torsion) P = P * d;
        const std::size_t rank = cert.ranks[static_cast<std::size_t>(k) + 1].rows.size();
        if (rank > 0)
          cert.torsion[static_cast<std::size_t>(k)] =
              detail::certify::torsion_witness_of(c, k, basis, rank, detail::cert::magnitude(P));
      }
    }
  }
  return out;
}

/// A certificate of a reduced, relative or cohomology result: certified_absolute on the
/// derived complex D (homology/certificate.hpp, detail::cert::build_view: the augmented complex,
/// the quotient C(X)/C(A), the dual complex whose boundaries are X's coboundaries), its
/// witnesses read back in X's cells and in the layout of the kind. The result of the kind is
/// built from the same run, without running the engine again: each of the three kinds *is*
/// the homology of D by definition (docs/certificates.md, "Reduced, relative and cohomology"),
/// so its groups are the certified groups, its generators the certificate's (D's generators
/// read back in X's cells), and coordinates() uses the elimination basis of D, whose levels are
/// the result's levels: view degree k + 1 for reduced degree k (level_offset_ = −1), top − k for
/// cohomology degree k (levels numbered from the top), and for a pair X's cells renumbered into
/// D's (from_original: the cells of A map to −1, zero in the quotient). Cost: certified_absolute
/// on a copy of the complex (the coboundaries transposed, for cohomology).
template <certifiable_ring R, cell_complex C>
certified_homology_result<R> certified_kind(const C& c, certificate_kind kind, const std::vector<std::vector<bool>>* marks,
                                            homology_options options) {
  cert::view<C> v;
  std::string why;
  if (!cert::build_view(c, kind, marks, v, why)) throw std::invalid_argument("lacuna::certified_homology: " + why);
  homology_options inner = options;
  inner.reduced = false;
  auto on_view = certified_absolute<R>(v.cx, inner);
  certified_homology_result<R> out;
  out.certificate = cert::certificate_from(v, on_view.certificate);
  auto& res = out.result;
  res.reduced = kind == certificate_kind::reduced;
  res.relative = kind == certificate_kind::relative;
  res.cohomology = kind == certificate_kind::cohomology;
  for (const auto& cg : out.certificate.groups) {
    homology_group<R> g;
    g.dimension = cg.dimension;
    g.rank = cg.rank;
    g.torsion = cg.torsion;
    g.generators = cg.generators;
    g.orders.assign(cg.rank, zero<R>());
    g.orders.insert(g.orders.end(), cg.torsion.begin(), cg.torsion.end());
    g.bounding_chains = cg.bounding_chains;  // witnesses are on, as for certified_homology
    res.groups.push_back(std::move(g));
  }
  const int top = lacuna::top_dimension(c);
  res.top_ = top;
  res.level_offset_ = res.reduced ? -1 : 0;
  res.ring_one_ = on_view.result.ring_one_;
  res.basis_ = std::move(on_view.result.basis_);
  if (!res.basis_ || on_view.result.project_)
    throw std::logic_error("lacuna::certified_homology: the engine kept no elimination basis of the derived complex");
  if (res.relative) {
    // D's level k holds X's k-cells outside A, renumbered: coordinates() reads a chain of X
    // through this map, as the engine's relative result does.
    auto& from = res.basis_->from_original;
    from.resize(static_cast<std::size_t>(top + 1));
    for (int k = 0; k <= top; ++k) {
      const std::size_t n = lacuna::cell_count(c, k);
      auto& f = from[static_cast<std::size_t>(k)];
      std::vector<std::int64_t> on_view_cells;  // D's own renumbering, if the engine made one
      on_view_cells.swap(f);
      f.assign(n, -1);
      for (std::size_t i = 0; i < n; ++i)
        if (const std::size_t j = v.inside(k, i); j != cert::view<C>::npos)
          f[i] = on_view_cells.empty() ? static_cast<std::int64_t>(j) : on_view_cells[j];
    }
  }
  return out;
}

}  // namespace detail::certify

/// The homology of c over R with generators, and a certificate of it: for every group, its
/// generators, a cocycle per generator (identity pairing), a bounding chain per torsion
/// generator, rank witnesses of the boundary maps and, over the integers, torsion witnesses
/// (homology/certificate.hpp). R models certifiable_ring; C models cell_complex. options: as
/// for homology(); generators, a kept basis and witnesses are switched on. options.reduced:
/// reduced homology, certified on the augmented complex (certificate_kind::reduced;
/// std::invalid_argument for the empty complex). Throws std::runtime_error if no torsion
/// witness is found within its bound of tries (never returns a certificate that does not
/// check). The result is what homology() with those options returns (the elimination route,
/// without a Morse pre-reduction); with options.reduced, it is built from the one run on the
/// augmented complex (the certified groups, the certificate's generators; see certified_kind). check_certificate(c, r.certificate) verifies the certificate.
template <certifiable_ring R, cell_complex C>
certified_homology_result<R> certified_homology(const C& c, homology_options options = {}) {
  if (options.reduced) return detail::certify::certified_kind<R>(c, certificate_kind::reduced, nullptr, options);
  return detail::certify::certified_absolute<R>(c, options);
}

/// The relative homology H_k(c, A) over R with generators and a certificate
/// (certificate_kind::relative), A the subcomplex of the cells marked in `in_subcomplex` (as
/// relative_homology takes it). The marks must have c's shape and be closed under faces
/// (std::invalid_argument otherwise). check_certificate(c, r.certificate, in_subcomplex)
/// verifies the certificate.
template <certifiable_ring R, cell_complex C>
certified_homology_result<R> certified_relative_homology(const C& c, const std::vector<std::vector<bool>>& in_subcomplex,
                                                         homology_options options = {}) {
  if (options.reduced) throw std::invalid_argument("lacuna::certified_relative_homology: relative homology is not augmented");
  return detail::certify::certified_kind<R>(c, certificate_kind::relative, &in_subcomplex, options);
}

/// The cohomology H^k(c) over R with cocycle generators and a certificate
/// (certificate_kind::cohomology): the witnesses of the cochain complex, ∂ and δ exchanged
/// (homology/certificate.hpp, homology_certificate). check_certificate(c, r.certificate)
/// verifies it.
template <certifiable_ring R, cell_complex C>
certified_homology_result<R> certified_cohomology(const C& c, homology_options options = {}) {
  if (options.reduced) throw std::invalid_argument("lacuna::certified_cohomology: reduced cohomology is not offered");
  return detail::certify::certified_kind<R>(c, certificate_kind::cohomology, nullptr, options);
}

}  // namespace lacuna

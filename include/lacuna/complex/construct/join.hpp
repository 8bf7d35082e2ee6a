// lacuna/complex/construct/join.hpp — the simplicial join X ∗ Y.
//
// Vertices: those of X (labels as text), then those of Y (labels as text, with "'" appended
// while they collide with a label already taken). Simplices: σ ⊔ τ for σ a simplex of X or
// empty and τ a simplex of Y or empty, not both empty. The cone on X is X ∗ (one point).
#pragma once

#include <lacuna/complex/simplicial_complex.hpp>

#include <string>
#include <unordered_set>
#include <vector>

namespace lacuna {

/// The join X ∗ Y as a simplicial_complex<std::string>;
/// χ(X ∗ Y) = χ(X) + χ(Y) - χ(X) χ(Y). Cost: one facet per pair of facets.
template <class L1, class L2>
simplicial_complex<std::string> join(const simplicial_complex<L1>& x, const simplicial_complex<L2>& y) {
  using out_t = typename detail::text_labelled_complex<L1, L2>::type;
  typename out_t::builder b;
  std::unordered_set<typename out_t::label_type> taken;
  for (const auto& l : x.labels()) {
    auto s = detail::label_to_string(l);
    taken.insert(s);
    b.vertex(s);
  }
  const auto nx = static_cast<std::uint32_t>(x.vertex_count());
  for (const auto& l : y.labels()) {
    auto s = detail::label_to_string(l);
    while (taken.count(s)) s += "'";
    taken.insert(s);
    b.vertex(s);
  }
  const auto fx = x.facets();
  const auto fy = y.facets();
  std::vector<std::uint32_t> ids;
  const auto add = [&](const std::pair<int, std::size_t>* a, const std::pair<int, std::size_t>* c) {
    ids.clear();
    if (a)
      for (auto v : x.vertices(a->first, a->second)) ids.push_back(v);
    if (c)
      for (auto v : y.vertices(c->first, c->second)) ids.push_back(nx + v);
    b.add_facet_ids(ids);
  };
  if (fx.empty())
    for (const auto& g : fy) add(nullptr, &g);
  else if (fy.empty())
    for (const auto& f : fx) add(&f, nullptr);
  else
    for (const auto& f : fx)
      for (const auto& g : fy) add(&f, &g);
  return std::move(b).finalize();
}

}  // namespace lacuna

// lacuna/homology/universal_coefficients.hpp — checks a complex's homology over Z/p, over Q
// and its integral cohomology against the predictions of the universal coefficient theorem
// from H_*(X; Z) (Hatcher, Algebraic Topology, 2002, Theorems 3A.3 and 3.2):
//
//   dim H_n(X; Z/p) = rank H_n + #{t in torsion H_n : p | t} + #{t in torsion H_{n-1} : p | t}
//   dim H_n(X; Q)   = rank H_n
//   H^n(X; Z)       = Z^{rank H_n} ⊕ torsion H_{n-1}
//
// and χ(X) (from the cell counts) against the alternating sums of ranks over Z, Q, every Z/p.
// Every identity tested is recorded in the report, with the values on both sides.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <cstdint>
#include <string>
#include <vector>

namespace lacuna {

/// One identity checked: what it says, both sides, and whether they agree.
struct identity_check {
  std::string statement;  ///< e.g. "dim H_1(X; Z/2) = rank H_1 + #2|tors H_1 + #2|tors H_0"
  /// The value the identity predicts.
  std::string predicted;
  /// The value computed.
  std::string computed;
  /// True if the two agree.
  bool holds = false;
};

/// All identities checked by check_universal_coefficients, in order.
struct coefficient_report {
  /// The identities, in order.
  std::vector<identity_check> identities;
  /// True when every identity holds.
  bool ok() const {
    for (const auto& i : identities)
      if (!i.holds) return false;
    return true;
  }
  /// The first identity that fails, or nullptr.
  const identity_check* first_failure() const {
    for (const auto& i : identities)
      if (!i.holds) return &i;
    return nullptr;
  }
};

namespace detail {

inline std::string torsion_text(const std::vector<integer>& t) {
  std::string s = "[";
  for (std::size_t i = 0; i < t.size(); ++i) {  // appended piece by piece: GCC 12 at -O3 gives a
    if (i) s += ',';                              // false -Wrestrict on "lit" + std::string
    s += t[i].to_string();
  }
  return s + "]";
}

inline std::size_t divisible_count(const std::vector<integer>& t, std::uint64_t p) {
  std::size_t n = 0;
  const integer ip(static_cast<std::int64_t>(p));
  for (const auto& x : t)
    if (div_rem(x, ip).remainder == zero<integer>()) ++n;
  return n;
}

template <class R, cell_complex C, class Algorithm>
void check_one_field(const C& c, const homology_result<integer>& hz, const std::string& name, std::uint64_t p,
                     const Algorithm& alg, coefficient_report& rep) {
  const auto h = homology<R>(c, {}, alg);
  std::int64_t chi = 0;
  for (int n = 0; n <= hz.top_dimension(); ++n) {
    std::size_t predicted = hz[n].rank;
    std::string why = "rank H_" + std::to_string(n);
    if (p != 0) {
      predicted += divisible_count(hz[n].torsion, p);
      if (n > 0) predicted += divisible_count(hz[n - 1].torsion, p);
      why += " + #" + std::to_string(p) + "|tors H_" + std::to_string(n);
      if (n > 0) why += " + #" + std::to_string(p) + "|tors H_" + std::to_string(n - 1);
    }
    const std::size_t got = h[n].rank;
    rep.identities.push_back({"dim H_" + std::to_string(n) + "(X; " + name + ") = " + why, std::to_string(predicted),
                              std::to_string(got), predicted == got && h[n].torsion.empty()});
    chi += (n % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(got);
  }
  const std::int64_t cells = euler_characteristic(c);
  rep.identities.push_back({"χ(X) from cells = Σ (-1)^n dim H_n(X; " + name + ")", std::to_string(cells),
                            std::to_string(chi), cells == chi});
}

}  // namespace detail

/// Computes H_*(X; Z) once, then H_*(X; Z/p) for every prime in Primes (each < 2^62), H_*(X; Q)
/// and H^*(X; Z) directly, and checks them against the universal coefficient theorem and χ.
/// C models cell_complex; Algorithm is sparse_elimination (default) or dense_elimination, used
/// for every computation. Cost: 3 + sizeof...(Primes) homology computations.
template <std::uint64_t... Primes, cell_complex C, homology_algorithm Algorithm = sparse_elimination>
coefficient_report check_universal_coefficients(const C& c, const Algorithm& algorithm = {}) {
  coefficient_report rep;
  const auto hz = homology<integer>(c, {}, algorithm);
  std::int64_t chi = 0;
  for (int n = 0; n <= hz.top_dimension(); ++n) chi += (n % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(hz[n].rank);
  rep.identities.push_back({"χ(X) from cells = Σ (-1)^n rank H_n(X; Z)", std::to_string(euler_characteristic(c)),
                            std::to_string(chi), euler_characteristic(c) == chi});
  detail::check_one_field<rational>(c, hz, "Q", 0, algorithm, rep);
  (detail::check_one_field<mod_p<Primes>>(c, hz, "Z/" + std::to_string(Primes), Primes, algorithm, rep), ...);
  const auto co = cohomology<integer>(c, {}, algorithm);
  for (int n = 0; n <= hz.top_dimension(); ++n) {
    const std::string N = std::to_string(n);
    rep.identities.push_back({"rank H^" + N + "(X; Z) = rank H_" + N, std::to_string(hz[n].rank),
                              std::to_string(co[n].rank), hz[n].rank == co[n].rank});
    const std::vector<integer> predicted = n > 0 ? hz[n - 1].torsion : std::vector<integer>{};
    rep.identities.push_back({"torsion H^" + N + "(X; Z) = " + (n > 0 ? "torsion H_" + std::to_string(n - 1) : "0"),
                              detail::torsion_text(predicted), detail::torsion_text(co[n].torsion),
                              predicted == co[n].torsion});
  }
  return rep;
}

}  // namespace lacuna

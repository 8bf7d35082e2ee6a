// own_ring_homology — homology over rings written by a user (examples/include/lacuna_examples):
// the Gaussian integers Z[i] and the polynomial rings F_2[t] and F_3[t] go through
// lacuna::homology like the built-in rings. The groups over R come from Smith normal forms
// over R (exact: R's own division with remainder, no floating point). The prediction beside
// them comes from H_*(X; Z) by the universal coefficient theorem (Hatcher 2002, Theorem 3A.3,
// from memory): H_n(X; R) = H_n(X) ⊗ R + Tor(H_{n-1}(X), R), where, R having no zero
// divisors, Z ⊗ R = R, Z/m ⊗ R = R/(m), and Tor(Z/m, R) = R if m = 0 in R, else 0.
// Exit status 1 if a computed group differs from its prediction.
#include <lacuna/lacuna.hpp>
#include <lacuna_examples/gaussian_integer.hpp>
#include <lacuna_examples/polynomial_mod_p.hpp>

#include <iostream>
#include <sstream>
#include <string>
#include <vector>

namespace {

int failures = 0;

template <class R>
std::string group_text(const std::string& r, std::size_t rank, const std::vector<R>& torsion) {
  std::ostringstream s;
  if (rank > 0) s << r << (rank > 1 ? "^" + std::to_string(rank) : "");
  for (const R& t : torsion) s << (s.tellp() > 0 ? " + " : "") << r << "/(" << t << ")";
  return s.tellp() > 0 ? s.str() : "0";
}

/// Computes H_*(X; R), predicts it from hz = H_*(X; Z), prints both and compares them.
template <class R, class X>
void over(const char* space, const char* ring, const X& x, const lacuna::homology_result<lacuna::integer>& hz) {
  const auto h = lacuna::homology<R>(x);
  const auto in_r = [](const lacuna::integer& m) { return lacuna::from_integer<R>(m.small_value()); };
  std::cout << space << " over " << ring << ":\n";
  for (std::size_t n = 0; n < h.groups.size(); ++n) {
    std::size_t rank = hz.groups[n].rank;  // Z ⊗ R = R
    std::vector<R> torsion;
    for (const auto& m : hz.groups[n].torsion) {  // Z/m ⊗ R = R/(m): R, 0 or torsion
      const R mr = in_r(m);
      if (mr == lacuna::zero<R>()) ++rank;
      else if (!lacuna::is_unit(mr)) torsion.push_back(lacuna::normalize(mr));
    }
    if (n > 0)
      for (const auto& m : hz.groups[n - 1].torsion) rank += in_r(m) == lacuna::zero<R>() ? 1U : 0U;  // Tor
    const std::string got = group_text(ring, h.groups[n].rank, h.groups[n].torsion),
                      want = group_text(ring, rank, torsion);
    std::cout << "  H_" << n << " = " << got << "   (UCT: " << want << ")\n";
    if (got != want) ++failures, std::cout << "  SELF-CHECK FAILED: H_" << n << "\n";
  }
}

template <class X>
void all_rings(const char* space, const X& x) {
  const auto hz = lacuna::homology<lacuna::integer>(x);
  std::cout << space << " over Z:";
  for (const auto& g : hz.groups) std::cout << " H_" << g.dimension << " = " << group_text("Z", g.rank, g.torsion);
  std::cout << "\n";
  over<lacuna_examples::gaussian_integer>(space, "Z[i]", x, hz);
  over<lacuna_examples::polynomial_mod_p<2>>(space, "F_2[t]", x, hz);
  over<lacuna_examples::polynomial_mod_p<3>>(space, "F_3[t]", x, hz);
}

}  // namespace

int main() {
  all_rings("projective plane", lacuna::cell_list::projective_plane());  // H_1 = Z/2 (Hatcher 2002, Ex. 2.42, from memory)
  all_rings("Klein bottle", lacuna::cell_list::klein_bottle());          // H_1 = Z + Z/2 (Hatcher 2002, Ex. 2.37)
  all_rings("lens space L(3,1)", lacuna::cell_list::lens_space(3, 1));   // H_1 = Z/3 (Hatcher 2002, Ex. 2.43, from memory)
  // Over Z[i] the torsion 2 is not prime: 2 = -i (1 + i)^2, so H_1(RP^2; Z[i]) = Z[i]/((1 + i)^2),
  // a cyclic module with N(2) = 4 elements; 3 stays prime in Z[i] (3 is 3 mod 4).
  using lacuna_examples::gaussian_integer;
  const gaussian_integer one_plus_i{lacuna::integer(1), lacuna::integer(1)}, minus_i{lacuna::integer(0), lacuna::integer(-1)};
  const bool split = minus_i * one_plus_i * one_plus_i == lacuna::from_integer<gaussian_integer>(2);
  std::cout << "2 = -i (1 + i)^2 in Z[i]: " << (split ? "yes" : "no") << "\n";
  if (!split) ++failures;
  std::cout << (failures == 0 ? "all self-checks passed\n" : "some self-checks failed\n");
  return failures == 0 ? 0 : 1;
}

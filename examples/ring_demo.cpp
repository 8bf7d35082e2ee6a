// ring_demo — three small computations with lacuna's rings, each checked before it is
// printed; the program exits with status 1 if a check fails.
//
//  1. A timetable puzzle over lacuna::integer: a station is served by four shuttle lines
//     with cycle lengths (in seconds) that are large and not pairwise coprime; each line was
//     last seen at a known offset. When do all four next depart together? That is a system of
//     linear congruences x = r_i (mod m_i), solved by pairwise combination with
//     lacuna::extended_gcd; the intermediate products exceed 64 bits.
//  2. Over the Gaussian integers (user-defined ring, examples/include): the prime
//     p = 1000000009 is 1 mod 4, so it is a sum of two squares; with t^2 = -1 (mod p) from
//     lacuna::mod_p_dynamic, gcd(p, t + i) = a + bi gives p = a^2 + b^2.
//  3. Over (Z/7)[x] (user-defined ring): the repeated factor of a polynomial is
//     gcd(f, f'), computed with the generic lacuna::gcd.
#include <lacuna/ring/ring.hpp>
#include <lacuna_examples/gaussian_integer.hpp>
#include <lacuna_examples/polynomial_mod_p.hpp>

#include <cstdint>
#include <cstdlib>
#include <iostream>
#include <optional>
#include <vector>

namespace {

int failures = 0;
void expect(bool ok, const char* what) {
  if (!ok) {
    ++failures;
    std::cout << "SELF-CHECK FAILED: " << what << "\n";
  }
}

using lacuna::integer;

/// Least non-negative residue.
integer mod(const integer& a, const integer& m) {
  integer r = a % m;
  return r.sign() < 0 ? r + m : r;
}

struct congruence {
  integer residue;
  integer modulus;
};

/// Combine x = a.r (mod a.m) and x = b.r (mod b.m) into one congruence modulo lcm(a.m, b.m);
/// nothing if they contradict each other (the residues differ modulo gcd(a.m, b.m)).
std::optional<congruence> combine(const congruence& a, const congruence& b) {
  const auto [g, s, t] = lacuna::extended_gcd(a.modulus, b.modulus);  // s a.m + t b.m = g
  const integer diff = b.residue - a.residue;
  if (diff % g != 0) return std::nullopt;
  const integer lcm = a.modulus / g * b.modulus;
  // x = a.r + a.m * s * (diff / g) satisfies both: mod b.m, a.m s = g - t b.m = g.
  const integer x = a.residue + a.modulus * mod(s * (diff / g), b.modulus / g);
  return congruence{mod(x, lcm), lcm};
}

void timetable() {
  std::cout << "1. timetable: four shuttle lines, cycle lengths and offsets in seconds\n";
  // Cycle lengths share factors (gcd 462 between lines 1 and 3, 78 between 3 and 4, 6 between
  // 1 and 4); their lcm is about 2^110.
  const std::vector<congruence> lines = {
      {integer(178'549'410), integer(2'147'483'646)},
      {integer(439'655'985), integer(4'294'967'291)},
      {integer(5'880'144), integer(6'000'000'006)},
      {integer(967'039'590), integer(1'000'000'014)},
  };
  congruence all = lines.front();
  for (std::size_t i = 1; i < lines.size(); ++i) {
    const auto c = combine(all, lines[i]);
    expect(c.has_value(), "the timetable is consistent");
    if (!c) return;
    all = *c;
  }
  std::cout << "   all four depart together at t = " << all.residue << " s, and every " << all.modulus << " s\n";
  expect(!all.modulus.is_small(), "the common period exceeds 64 bits");
  // Reference values, computed independently with Python's arbitrary-precision integers.
  expect(all.residue.to_string() == "31415926535897932384626", "t as computed by Python");
  expect(all.modulus.to_string() == "1535692999646687209130628211019634", "the lcm as computed by Python");
  for (const congruence& l : lines) expect(mod(all.residue, l.modulus) == l.residue, "t solves every congruence");
  expect(all.residue.sign() >= 0 && all.residue < all.modulus, "t is the least solution");
  // A contradictory pair: both cycles are even, offsets of different parity never meet.
  expect(!combine({integer(1), integer(10)}, {integer(2), integer(4)}).has_value(), "contradiction detected");
  std::cout << "   (lines with offsets 1 mod 10 and 2 mod 4 never meet: detected)\n";
}

void sum_of_two_squares() {
  using lacuna_examples::gaussian_integer;
  const std::int64_t p = 1'000'000'009;  // prime, 1 mod 4
  std::cout << "2. Gaussian integers: " << p << " as a sum of two squares\n";
  const lacuna::prime_modulus pm(static_cast<std::uint64_t>(p));
  // t = c^((p-1)/4) for a quadratic non-residue c has t^2 = c^((p-1)/2) = -1.
  auto power = [&](lacuna::mod_p_dynamic b, std::uint64_t e) {
    lacuna::mod_p_dynamic r(1, pm);
    for (; e != 0; e >>= 1U, b *= b)
      if (e & 1U) r *= b;
    return r;
  };
  lacuna::mod_p_dynamic t;
  for (std::int64_t c = 2;; ++c) {
    t = power(lacuna::mod_p_dynamic(c, pm), (static_cast<std::uint64_t>(p) - 1) / 4);
    if (t * t == lacuna::mod_p_dynamic(-1)) break;  // the unbound -1 adopts p
  }
  const gaussian_integer g = lacuna::gcd(gaussian_integer{integer(p), integer(0)},
                                         gaussian_integer{integer(static_cast<std::int64_t>(t.value())), integer(1)});
  std::cout << "   t = " << t.value() << " has t^2 = -1 (mod p); gcd(p, t + i) = " << g << "\n";
  std::cout << "   " << p << " = " << g.re << "^2 + " << g.im << "^2\n";
  expect(g.re * g.re + g.im * g.im == integer(p), "p = a^2 + b^2");
  expect(lacuna::normalize(g) == g, "the gcd is in the first quadrant");
}

void repeated_factor() {
  using poly = lacuna_examples::polynomial_mod_p<7>;
  std::cout << "3. (Z/7)[x]: the repeated factor of f\n";
  const poly x{0, 1};
  const poly f = (x + poly{2}) * (x + poly{2}) * (x * x + poly{1}) * (x + poly{3});  // (x+2)^2 (x^2+1)(x+3)
  std::vector<lacuna::mod_p<7>> d;
  for (std::size_t k = 1; k < f.coefficients().size(); ++k)
    d.push_back(f.coefficients()[k] * lacuna::mod_p<7>(static_cast<std::int64_t>(k)));
  const poly df(std::move(d));
  const poly g = lacuna::gcd(f, df);
  std::cout << "   f = " << f << "\n   f' = " << df << "\n   gcd(f, f') = " << g << "\n";
  expect(g == x + poly{2}, "gcd(f, f') = x + 2");
  expect(lacuna::div_rem(f, g * g).remainder == poly{}, "(x + 2)^2 divides f");
}

}  // namespace

int main() {
  timetable();
  sum_of_two_squares();
  repeated_factor();
  if (failures != 0) {
    std::cout << failures << " self-check(s) failed\n";
    return EXIT_FAILURE;
  }
  std::cout << "all self-checks passed\n";
  return EXIT_SUCCESS;
}

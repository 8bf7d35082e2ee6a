// The user-style example rings (examples/include/lacuna_examples/): Gaussian integers and
// polynomials over Z/p, through the conformance suite and values checked by hand.
#include "../../examples/include/lacuna_examples/gaussian_integer.hpp"
#include "../../examples/include/lacuna_examples/polynomial_mod_p.hpp"

#include "ring_conformance.hpp"

#include <doctest/doctest.h>

#include <random>

namespace ring_examples_test {

using lacuna_examples::gaussian_integer;
using poly7 = lacuna_examples::polynomial_mod_p<7>;
using poly2 = lacuna_examples::polynomial_mod_p<2>;

static_assert(lacuna::euclidean_domain<gaussian_integer> && !lacuna::field<gaussian_integer>);
static_assert(lacuna::euclidean_domain<poly7> && !lacuna::field<poly7>);

namespace {
gaussian_integer random_gaussian(std::mt19937_64& rng) {
  auto part = [&] { return lacuna::integer(static_cast<std::int64_t>(rng() % 2001) - 1000); };
  return {part(), part()};
}
template <class P>
P random_poly(std::mt19937_64& rng) {
  std::vector<typename P::coefficient> c(rng() % 6);
  for (auto& v : c) v = typename P::coefficient(static_cast<std::int64_t>(rng() % 1000));
  return P(std::move(c));
}
}  // namespace

TEST_CASE("Gaussian integers: values by hand") {
  const gaussian_integer i{0, 1};
  CHECK(i * i == gaussian_integer{-1, 0});
  // 5 = (2 + i)(2 - i), from memory; gcd(5, 2 + i) is the first-quadrant associate 2 + i
  CHECK(gaussian_integer{2, 1} * gaussian_integer{2, -1} == gaussian_integer{5, 0});
  CHECK(lacuna::gcd(gaussian_integer{5, 0}, gaussian_integer{1, -2}) == gaussian_integer{2, 1});  // 1 - 2i = -i(2 + i)
  CHECK(lacuna::normalize(gaussian_integer{-3, -4}) == gaussian_integer{3, 4});
  CHECK(lacuna::normalize(gaussian_integer{0, -2}) == gaussian_integer{2, 0});
  CHECK(lacuna::normalize(gaussian_integer{4, -3}) == gaussian_integer{3, 4});
  CHECK(lacuna::unit_part(gaussian_integer{0, -2}) == gaussian_integer{0, -1});
  CHECK(lacuna::is_unit(i));
  CHECK_FALSE(lacuna::is_unit(gaussian_integer{1, 1}));  // norm 2
  const auto [q, r] = lacuna::div_rem(gaussian_integer{7, 3}, gaussian_integer{2, 1});
  CHECK(q * gaussian_integer{2, 1} + r == gaussian_integer{7, 3});
  CHECK(lacuna::euclidean_size(r) * 2 <= lacuna::euclidean_size(gaussian_integer{2, 1}));  // rounding: N(r) <= N(b)/2
}

TEST_CASE("Gaussian integers: conformance suite") {
  ring_test::check_euclidean_domain<gaussian_integer>(random_gaussian, 300);
}

TEST_CASE("polynomials over Z/7: values by hand") {
  const poly7 x{0, 1};
  // x^6 - 1 = prod over a in (Z/7)^* of (x - a) (Fermat); gcd with x^2 - 3x + 2 = (x-1)(x-2) is itself
  const poly7 f = x * x * x * x * x * x - poly7{1};
  const poly7 g{2, -3, 1};
  CHECK(lacuna::gcd(f, g) == g);
  CHECK(lacuna::gcd(poly7{1, 0, 1}, poly7{2, 0, 1}) == poly7{1});  // x^2 + 1, x^2 + 2: coprime
  CHECK(lacuna::normalize(poly7{3, 6}) == poly7{4, 1});          // 6x + 3 = 6(x + 4)
  CHECK(lacuna::unit_part(poly7{3, 6}) == poly7{6});
  const auto [q, r] = lacuna::div_rem(f, poly7{-1, 1});
  CHECK(r == poly7{});
  CHECK(q == poly7{1, 1, 1, 1, 1, 1});
  CHECK(f(typename poly7::coefficient(3)) == typename poly7::coefficient(0));
}

TEST_CASE("polynomials over Z/7 and Z/2: conformance suite") {
  ring_test::check_euclidean_domain<poly7>(random_poly<poly7>, 300);
  ring_test::check_euclidean_domain<poly2>(random_poly<poly2>, 300);
}

}  // namespace ring_examples_test

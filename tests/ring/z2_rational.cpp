// lacuna::z2 and lacuna::rational: tables and values from memory, and the conformance suite.
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include "ring_conformance.hpp"

#include <doctest/doctest.h>

#include <random>
#include <stdexcept>

namespace ring_z2_rational_test {

using lacuna::rational;
using lacuna::z2;
using boost::multiprecision::cpp_int;

TEST_CASE("z2: the addition and multiplication tables of GF(2)") {
  const z2 o(0), l(1);
  CHECK(o + o == o);
  CHECK(o + l == l);
  CHECK(l + l == o);
  CHECK(l * l == l);
  CHECK(l * o == o);
  CHECK(-l == l);
  CHECK(z2(-3) == l);
  CHECK(z2(4) == o);
  CHECK(lacuna::inverse(l) == l);
  CHECK_THROWS_WITH(lacuna::inverse(o), "lacuna::z2: zero has no inverse");
}

TEST_CASE("z2: field conformance suite") {
  ring_test::check_field<z2>([](std::mt19937_64& rng) { return z2::from_bool(rng() & 1U); }, 200);
}

TEST_CASE("rational: lowest terms and values, from memory") {
  const rational half(cpp_int(2), cpp_int(4));
  CHECK(half.numerator() == 1);
  CHECK(half.denominator() == 2);
  CHECK(rational(cpp_int(3), cpp_int(-6)).to_string() == "-1/2");  // denominator made positive
  CHECK(half + rational(cpp_int(1), cpp_int(3)) == rational(cpp_int(5), cpp_int(6)));
  CHECK(half < rational(1));
  CHECK(lacuna::inverse(half) == rational(2));
  CHECK_THROWS_AS(rational(cpp_int(1), cpp_int(0)), std::domain_error);
  CHECK_THROWS_AS(rational(1) / rational(0), std::domain_error);
  // harmonic number H_10 = 7381/2520
  rational h;
  for (int k = 1; k <= 10; ++k) h += rational(cpp_int(1), cpp_int(k));
  CHECK(h.to_string() == "7381/2520");
}

TEST_CASE("rational: field conformance suite") {
  ring_test::check_field<rational>(
      [](std::mt19937_64& rng) {
        const cpp_int num = cpp_int(static_cast<std::int64_t>(rng())) * static_cast<std::int64_t>(rng() % 1000);
        const cpp_int den = cpp_int(rng() % 100000 + 1);
        return rational(num, den);
      },
      200);
}

}  // namespace ring_z2_rational_test

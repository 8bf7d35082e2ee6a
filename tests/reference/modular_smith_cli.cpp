// Issue 14 item 9: the small dense inputs that used to be slow give FLINT's answer through
// `lacuna homology` (which now finishes their full-rank cores with modular_smith_invariants).
// Each .cells file is generated here: one vertex v, k loops e_i : v - v (boundary 0) and
// 2-cells whose boundaries are the columns of a matrix A, so H_1 = coker A = Z^(k - rank A)
// plus the non-unit invariant factors of A, and H_2 = ker A (free); the invariant factors come
// from FLINT's fmpz_mat_snf. No timing is asserted here: the speed is measured in
// benchmarks/modular_smith.cpp.
#include "flint_support.hpp"

#include "../cli/run.hpp"

#include <lacuna/ring/primality.hpp>

#include <random>
#include <sstream>

namespace reference_modular_smith_cli_test {

using namespace flint_test;

namespace {

cpp_int random_digits(std::mt19937_64& rng, int digits) {
  cpp_int v = 1 + static_cast<int>(rng() % 9);
  for (int d = 1; d < digits; ++d) v = v * 10 + static_cast<int>(rng() % 10);
  return (rng() & 1U) ? cpp_int(-v) : v;
}

/// The .cells text of the complex described in the header comment.
std::string cells_text(const bmatrix& a) {
  std::ostringstream s;
  s << "0 v\n";
  for (std::size_t i = 0; i < a.rows; ++i) s << "1 e" << i << " : v - v\n";
  for (std::size_t j = 0; j < a.cols; ++j) {
    s << "2 r" << j << " :";
    bool first = true;
    for (std::size_t i = 0; i < a.rows; ++i) {
      const cpp_int& x = a.a[i][j];
      if (x == 0) continue;
      const bool neg = x < 0;
      if (first)
        s << (neg ? " -" : " ");
      else
        s << (neg ? " - " : " + ");
      s << (neg ? cpp_int(-x) : x) << "*e" << i;
      first = false;
    }
    if (first) s << " 0";
    s << "\n";
  }
  return s.str();
}

/// "rank torsion..." of H_1 from the tool's --json output.
std::string h1_of_tool(const std::string& file) {
  const auto r = cli_test::run({"homology", "--quiet", "--json", file});
  REQUIRE(r.status == 0);
  const auto at = r.out.find("\"dimension\": 1,");
  REQUIRE(at != std::string::npos);
  const auto rank_at = r.out.find("\"rank\": ", at) + 8;
  const auto rank = r.out.substr(rank_at, r.out.find(',', rank_at) - rank_at);
  const auto t0 = r.out.find('[', at) + 1;
  auto torsion = r.out.substr(t0, r.out.find(']', t0) - t0);
  std::erase(torsion, ' ');
  return rank + " " + torsion;
}

/// The same, predicted from FLINT's invariant factors of A.
std::string h1_of_flint(const bmatrix& a) {
  const auto inv = flint_invariants(a);
  std::string torsion;
  for (const auto& d : inv)
    if (d != "1") torsion += (torsion.empty() ? "" : ",") + d;
  return std::to_string(a.rows - inv.size()) + " " + torsion;
}

void check_item9(const bmatrix& a, const std::string& name) {
  cli_test::temp_dir dir;
  const auto file = dir.write(name, cells_text(a));
  const auto want = h1_of_flint(a);
  CHECK(want.size() > 10);  // a torsion group that is not trivial (a large cyclic factor)
  CHECK(h1_of_tool(file) == want);
}

/// For matrices where fmpz_mat_snf itself is slow (100 x 100 of 19-digit entries takes it
/// minutes and gigabytes): the tool's H_1 of a square A of full rank is checked by FLINT's
/// determinant (the product of the invariant factors is |det A|, fmpz_mat_det) and FLINT's
/// ranks mod p (n - rank_p A factors are divisible by p, nmod_mat_rank) for p < 200.
void check_item9_by_det(const bmatrix& a, const std::string& name) {
  cli_test::temp_dir dir;
  const auto file = dir.write(name, cells_text(a));
  const auto got = h1_of_tool(file);
  REQUIRE(got.rfind("0 ", 0) == 0);  // H_1 is finite: A has full rank
  std::vector<cpp_int> factors;
  std::stringstream list(got.substr(2));
  for (std::string t; std::getline(list, t, ',');) factors.emplace_back(t);
  cpp_int order = 1;
  for (const auto& f : factors) order *= f;
  fmpz_mat_t A;
  fmpz_t det;
  fmpz_mat_init(A, static_cast<slong>(a.rows), static_cast<slong>(a.cols));
  fmpz_init(det);
  for (std::size_t i = 0; i < a.rows; ++i)
    for (std::size_t j = 0; j < a.cols; ++j) fmpz_set_str(fmpz_mat_entry(A, i, j), a.a[i][j].str().c_str(), 10);
  fmpz_mat_det(det, A);
  fmpz_abs(det, det);
  CHECK(order.str() == fmpz_text(det));
  fmpz_clear(det);
  fmpz_mat_clear(A);
  for (std::uint64_t p = 2; p < 200; ++p) {
    if (!lacuna::is_prime(p)) continue;
    std::size_t divisible = 0;
    for (const auto& f : factors) divisible += (f % p == 0);
    CAPTURE(p);
    CHECK(divisible == a.rows - flint_rank_mod(a, p));
  }
}

}  // namespace

TEST_CASE("issue 14.9: a 150 x 150 matrix of entries -9..9 as a 2-complex: H_1 as FLINT says") {
  std::mt19937_64 rng(149);
  bmatrix a(150, 150);
  for (auto& row : a.a)
    for (auto& x : row) x = static_cast<int>(rng() % 19) - 9;
  check_item9(a, "small150.cells");
}

TEST_CASE("issue 14.9: a 100 x 100 matrix of 19-digit entries: H_1 as FLINT says") {
  std::mt19937_64 rng(1419);
  bmatrix a(100, 100);
  for (auto& row : a.a)
    for (auto& x : row) x = random_digits(rng, 19);
  check_item9_by_det(a, "digits19.cells");
}

TEST_CASE("issue 14.9: four 20 000-digit coefficients: H_1 as FLINT says") {
  std::mt19937_64 rng(1420);
  bmatrix a(4, 4);
  for (std::size_t j = 0; j < 4; ++j) {
    a.a[j][j] = random_digits(rng, 20000);
    a.a[(j + 1) % 4][j] = 2 + static_cast<int>(rng() % 8);
    a.a[(j + 2) % 4][j] = -(2 + static_cast<int>(rng() % 8));
  }
  check_item9(a, "huge4.cells");
}

TEST_CASE("issue 14.9: a rank-deficient dense core: H_1 as FLINT says") {
  // A = X Y with X 16 x 12, Y 12 x 16: rank 12 (proved modularly, or the dense fallback);
  // a factor 6 on the first column puts torsion in the cokernel.
  std::mt19937_64 rng(1421);
  bmatrix x(16, 12), y(12, 16), a(16, 16);
  for (auto& row : x.a)
    for (auto& v : row) v = static_cast<int>(rng() % 7) - 3;
  for (auto& row : y.a)
    for (auto& v : row) v = static_cast<int>(rng() % 7) - 3;
  for (std::size_t i = 0; i < 16; ++i)
    for (std::size_t k = 0; k < 12; ++k)
      for (std::size_t j = 0; j < 16; ++j) a.a[i][j] += x.a[i][k] * y.a[k][j] * (j == 0 ? 6 : 1);
  cli_test::temp_dir dir;
  const auto file = dir.write("deficient.cells", cells_text(a));
  CHECK(h1_of_tool(file) == h1_of_flint(a));
}

}  // namespace reference_modular_smith_cli_test

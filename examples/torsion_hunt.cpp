// torsion_hunt: reduced homology of matching complexes M(K_n) and chessboard complexes M(m × n)
// (lacuna/complex/construct/graph_complexes.hpp) over Z, Q or Z/p, one line per complex, each
// under a time budget (a stop request through run_control). docs/demo-torsion.md explains it.
//   torsion_hunt --ring Z|Q|Z/p --family matching|chessboard [--rows M] --from A --to B
//                [--budget SECONDS] [--max-cells N]
// The groups are the engine's (exact: unimodular eliminations and Smith forms, docs/homology.md);
// each line ends with checks that do not trust it — face counts by recursions against the
// built complex; Euler–Poincaré from those counts; the connectivity bound of Björner, Lovász,
// Vrećica & Živaljević (1994); published torsion, from memory: Bouc (1992), Shareshian & Wachs
// (2007) — over fields by universal coefficients (Hatcher 2002, Theorem 3A.3).
// Exit status: 0 all checks passed (a stop at the budget is no failure), 1 a check failed,
// 2 bad arguments.
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>

#include <chrono>
#include <condition_variable>
#include <cstdio>
#include <mutex>
#include <optional>
#include <sstream>
#include <string>
#include <thread>

namespace {

struct settings {
  std::string ring = "Z", family = "matching";
  int from = 5, to = 9, rows = 0;
  double budget = 10;
  long long max_cells = 20'000'000;  // building is not under the budget
  std::uint64_t p = 0;               // of Z/p
};

long long checked(long long a, long long b, long long c) {  // a + b·c, never silently wrapped
  long long r = 0;
  if (__builtin_mul_overflow(b, c, &r) || __builtin_add_overflow(a, r, &r)) throw std::overflow_error("beyond 64 bits");
  return r;
}
// f[k] = the number of k-simplices: matchings of k + 1 edges, placements of k + 1 rooks.
// t[a][b][k]: k-matchings of K_a (b = a): vertex a free, or paired with one of a − 1 others;
// or placements of k rooks on an a × b board: the last row empty, or a rook on one of b squares.
std::vector<long long> face_counts(bool matching, int m, int n) {
  std::vector t(m + 1, std::vector(n + 1, std::vector<long long>(n + 2, 0)));
  for (int a = 0; a <= m; ++a)
    for (int b = 0; b <= n; ++b)
      for (int k = 0; k <= n + 1; ++k)
        t[a][b][k] = k == 0 ? 1
                     : matching ? (a != b || a < 2 ? 0 : checked(t[a - 1][b - 1][k], a - 1, t[a - 2][b - 2][k - 1]))
                                : (a == 0 || b == 0 ? 0 : checked(t[a - 1][b][k], b, t[a - 1][b - 1][k - 1]));
  std::vector<long long> f;
  for (int k = 1; k <= n + 1 && t[m][n][k] > 0; ++k) f.push_back(t[m][n][k]);
  return f;
}

// "Z^42 + (Z/3)^8" over Z; a dimension over a field: "Q^5", "Z/3" (dimension 1), "(Z/3)^8"
template <class R>
std::string group_text(const lacuna::homology_group<R>& g, const std::string& field) {
  std::ostringstream o;
  auto power = [&](const std::string& x, std::size_t e) { o << (o.tellp() > 0 ? " + " : "") << (e == 1 ? x : (x.size() > 1 ? "(" + x + ")" : x) + "^" + std::to_string(e)); };
  if (g.rank > 0) power(field, g.rank);
  for (std::size_t i = 0, j = 0; i < g.torsion.size(); i = j) {
    while (j < g.torsion.size() && g.torsion[j] == g.torsion[i]) ++j;
    std::ostringstream t;
    t << "Z/" << g.torsion[i];
    power(t.str(), j - i);
  }
  return o.tellp() > 0 ? o.str() : "0";
}

// Runs homology under the budget: a timer thread requests the stop unless the computation
// ends first. nullopt when stopped (lacuna::computation_stopped: nothing partial is returned).
template <class R, class C>
std::optional<lacuna::homology_result<R>> under_budget(const C& c, double budget, const R& ring_one) {
  std::stop_source stop;
  std::jthread timer([&](std::stop_token done) {
    std::mutex mx;
    std::condition_variable_any cv;
    std::unique_lock lock(mx);
    cv.wait_for(lock, done, std::chrono::duration<double>(budget), [] { return false; });
    if (!done.stop_requested()) stop.request_stop();
  });
  try {
    return lacuna::homology<R>(c, {.reduced = true, .control = {.stop = stop.get_token()}}, lacuna::sparse_elimination{}, ring_one);
  } catch (const lacuna::computation_stopped&) {
    return std::nullopt;
  }
}

template <class R>
bool hunt(const settings& s, const R& ring_one) {
  const std::string field = s.ring == "Z" ? "Z" : s.ring;
  bool all_ok = true;
  for (int n = s.from; n <= s.to; ++n) {
    const bool matching = s.family == "matching";
    const int r = s.rows > 0 ? s.rows : n, m = matching ? n : std::min(r, n), w = matching ? n : std::max(r, n);
    const std::string name = matching ? "M(K_" + std::to_string(n) + ")" : "M(" + std::to_string(m) + "x" + std::to_string(w) + ")";
    std::vector<long long> f;
    long long cells = 0, chi = -1;  // reduced: the empty simplex counts in degree -1
    try {
      f = face_counts(matching, m, w);
      for (std::size_t k = 0; k < f.size(); ++k) cells = checked(cells, 1, f[k]), chi += (k % 2 ? -1 : 1) * f[k];
    } catch (const std::overflow_error&) {
      cells = -1;
    }
    if (cells < 0 || cells > s.max_cells) return std::printf("%-10s not built: more than %lld cells\n", name.c_str(), s.max_cells), all_ok;
    const auto c = matching ? lacuna::matching_complex(n) : lacuna::chessboard_complex(m, w);
    bool ok = lacuna::top_dimension(c) + 1 == std::ssize(f);
    for (std::size_t k = 0; ok && k < f.size(); ++k) ok = static_cast<long long>(lacuna::cell_count(c, static_cast<int>(k))) == f[k];
    std::printf("%-10s %9lld cells  ", name.c_str(), cells);
    std::fflush(stdout);
    const auto t0 = std::chrono::steady_clock::now();
    const auto h = under_budget(c, s.budget, ring_one);
    const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    if (!h) return std::printf("stopped at the budget of %g s (after %.2f s)\n", s.budget, secs), all_ok;  // larger ones take longer
    std::string groups, checks = ok ? "faces ok" : "faces FAIL";
    long long chi_h = 0;
    // Björner, Lovász, Vrećica & Živaljević (1994), from memory: H~_k = 0 for k < ν
    const int nu = matching ? (n + 1) / 3 - 1 : std::min(m, (m + w + 1) / 3) - 1;
    bool connected = true;
    for (const auto& g : h->groups) {
      if (g.rank > 0 || !g.torsion.empty()) groups += "H~_" + std::to_string(g.dimension) + " = " + group_text(g, field) + "  ";
      chi_h += (g.dimension % 2 ? -1 : 1) * static_cast<long long>(g.rank);
      connected = connected && (g.dimension >= nu || (g.rank == 0 && g.torsion.empty()));
    }
    auto claim = [&](const char* source, bool holds) {
      checks += std::string(", ") + source + (holds ? " ok" : " FAIL");
      ok = ok && holds;
    };
    claim("euler", chi_h == chi);
    claim("BLVZ94", connected);
    const lacuna::homology_group<R> none{};
    const auto& b = nu < std::ssize(h->groups) ? h->groups[static_cast<std::size_t>(nu)] : none;
    std::size_t threes = 0, by3 = 0;  // torsion factors equal to 3, divisible by 3 (over Z only)
    if constexpr (std::same_as<R, lacuna::integer>)
      for (const auto& t : b.torsion) threes += t == R(3), by3 += t % R(3) == R(0);
    const bool z = s.ring == "Z";
    // Published, from memory (Bouc 1992; Shareshian & Wachs 2007): H~_1(M(K_7)) = Z/3; for
    // n ≡ 1 mod 3, n ≥ 7, H~_ν(M(K_n)) is finite, non-zero, of exponent 3; it has 3-torsion for
    // n = 9 and n ≥ 12; H~_ν(M(m × n)) has 3-torsion for m ≤ n ≤ 2m − 5, and is Z/3 when also
    // m + n ≡ 1 mod 3. Over a field, with H~_(ν−1) = 0 (universal coefficients): a finite 3-group
    // has dimension 0 over Q and Z/p, p ≠ 3, and a positive one over Z/3 (1 for Z/3).
    const bool exp3 = z ? b.rank == 0 && !b.torsion.empty() && threes == b.torsion.size() : (b.rank > 0) == (s.p == 3);
    const bool z3 = z ? b.rank == 0 && b.torsion.size() == 1 && threes == 1 : b.rank == (s.p == 3 ? 1u : 0u);  // Z/3
    if (matching && n == 7) claim("Bouc92", z3);
    if (matching && n % 3 == 1 && n >= 7) claim("SW07", exp3);
    if (z && matching && (n == 9 || (n >= 12 && n % 3 != 1))) claim("SW07", by3 > 0);
    if (z && !matching && w <= 2 * m - 5) claim("SW07", by3 > 0);
    if (!matching && w <= 2 * m - 5 && (m + w) % 3 == 1) claim("SW07", z3);
    std::printf("%s %.3f s  [%s]\n", (groups.empty() ? "all 0  " : groups).c_str(), secs, checks.c_str());
    all_ok = all_ok && ok;
  }
  return all_ok;
}

}  // namespace

int main(int argc, char** argv) {
  settings s;
  try {
    for (int i = 1; i < argc; i += 2) {
      const std::string key = argv[i], value = i + 1 < argc ? argv[i + 1] : throw std::invalid_argument(key + " needs a value");
      auto number = [&](auto& out, const std::string& text) {
        std::istringstream in(text);
        if (!(in >> out) || !in.eof()) throw std::invalid_argument(key + ": not a number: " + text);
      };
      if (key == "--ring") s.ring = value;
      else if (key == "--family") s.family = value;
      else if (key == "--from") number(s.from, value);
      else if (key == "--to") number(s.to, value);
      else if (key == "--rows") number(s.rows, value);
      else if (key == "--budget") number(s.budget, value);
      else if (key == "--max-cells") number(s.max_cells, value);
      else throw std::invalid_argument("unknown option " + key);
      if (key == "--ring" && value.rfind("Z/", 0) == 0) number(s.p, value.substr(2)), (void)lacuna::prime_modulus(s.p);  // throws unless prime
      else if (key == "--ring" && value != "Z" && value != "Q") throw std::invalid_argument("--ring is Z, Q or Z/p");
    }
    if ((s.family != "matching" && s.family != "chessboard") || s.from < 1 + (s.family == "matching") || s.to < s.from || s.to > 40 ||
        s.rows < 0 || s.rows > 40 || !(s.budget > 0))
      throw std::invalid_argument("need --family matching or chessboard, 2 <= --from <= --to <= 40 (1 for boards), 0 <= --rows <= 40, --budget > 0");
    std::printf("reduced homology of %s complexes over %s, budget %g s per complex\n", s.family.c_str(), s.ring.c_str(), s.budget);
    const bool ok = s.ring == "Z" ? hunt(s, lacuna::integer(1)) : s.ring == "Q" ? hunt(s, lacuna::rational(1)) : hunt(s, lacuna::mod_p_dynamic(1, s.p));
    return ok ? 0 : 1;
  } catch (const std::exception& e) {  // bad arguments
    std::fprintf(stderr, "torsion_hunt: %s\n", e.what());
    return 2;
  }
}

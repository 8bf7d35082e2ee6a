// examples/cli/coefficients.hpp — the one reader of the --coefficients text of the lacuna tools
// (`lacuna homology`, `lacuna cohomology`, `lacuna persistence` and lacuna-mpi): Z, Q or Z/p for
// a prime p below 2^62, the modulus read by the tools' one number parser (options.hpp: decimal,
// leading zeros dropped). Persistence asks for a field (coefficient_use::field): Z is refused
// there with its own reason. The messages are those of docs/cli.md and docs/persistence-cli.md.
#pragma once

#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>

#include "options.hpp"

#include <cstdint>
#include <stdexcept>
#include <string>
#include <string_view>

namespace lacuna_cli {

/// Exit status 2 with this message (already "FILE:LINE: ..." or "lacuna: ...").
struct usage_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

/// The coefficients chosen: their kind, the prime of Z/p, and their text as printed.
struct coefficients {
  enum kind { integers, rationals, mod_p } k = integers;
  std::uint64_t p = 0;
  std::string text = "Z";
};

/// What a subcommand accepts: every ring of the tool (homology), or fields only (persistence).
enum class coefficient_use { any_ring, field };

/// Reads the --coefficients text `s`; throws usage_error with the one line to print.
inline coefficients parse_coefficients(const std::string& s, coefficient_use use = coefficient_use::any_ring) {
  const bool field = use == coefficient_use::field;
  const std::string expected = field ? "expected Z/p for a prime p, or Q" : "expected Z, Q or Z/p for a prime p";
  coefficients c;
  c.text = s;
  if (s == "Z") {
    if (field)
      throw usage_error("lacuna: --coefficients Z: persistence needs a field (barcodes exist over a field only): use "
                        "Z/p for a prime p, or Q");
    return c;
  }
  if (s == "Q") {
    c.k = coefficients::rationals;
    return c;
  }
  if (s.size() > 2 && s.rfind("Z/", 0) == 0) {
    const auto d = parse_decimal(std::string_view(s).substr(2), false);
    if (d.status == number_status::too_large ||
        (d.status == number_status::ok && d.magnitude >= lacuna::mod_p_modulus_limit))
      throw usage_error("lacuna: --coefficients " + s + ": the prime must be below 2^62");
    if (d.status != number_status::ok) throw usage_error("lacuna: --coefficients " + s + ": " + expected);
    const std::uint64_t p = d.magnitude;
    if (!lacuna::is_prime(p))
      throw usage_error("lacuna: --coefficients " + s + ": " + std::to_string(p) + " is not a prime");
    c.k = coefficients::mod_p;
    c.p = p;
    c.text = "Z/" + std::to_string(p);
    return c;
  }
  throw usage_error("lacuna: --coefficients " + s + ": " + expected);
}

}  // namespace lacuna_cli

// examples/cli/persistence_report.hpp — the report of `lacuna persistence` (text, --json, and
// the --diagram / --barcode pictures; docs/persistence-cli.md) and what it needs: the field,
// the --up-to value, and the diagrams as printed. Shared by the one-process tool
// (persistence.cpp) and the MPI tool (examples/cli-mpi/), so that both print the same answer
// the same way, byte for byte.
#pragma once

#include <lacuna/io/persistence_svg.hpp>
#include <lacuna/io/text_lines.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include "coefficients.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <limits>
#include <optional>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna_cli {

/// The highest --max-dimension of `lacuna persistence` (a diagram per dimension is printed,
/// empty or not).
constexpr long long max_dimension_limit = 1000;

/// Runs fn(ring_one) with the one of the chosen field (Z/2 by its own type, Z/p by the
/// run-time modulus type, Q). Precondition: `co` was read with coefficient_use::field.
template <class Fn>
void with_field(const coefficients& co, Fn&& fn) {
  switch (co.k) {
    case coefficients::rationals:
      return fn(lacuna::one<lacuna::rational>());
    case coefficients::mod_p:
      if (co.p == 2) return fn(lacuna::one<lacuna::z2>());
      return fn(lacuna::mod_p_dynamic(1, co.p));
    case coefficients::integers:
      break;
  }
  throw std::logic_error("lacuna: persistence over the integers was not refused");
}

/// A value as a JSON number: integers (image samples) in decimal, doubles as the shortest
/// decimal that reads back as the same double.
template <class V>
std::string value_text(const V& v) {
  if constexpr (std::is_floating_point_v<V>) {
    char buf[64];
    const auto r = std::to_chars(buf, buf + sizeof buf, v);
    return std::string(buf, r.ptr);
  } else {
    return std::to_string(v);
  }
}

/// --up-to V as a double (a decimal of the file formats); throws usage_error otherwise.
inline double parse_up_to(const std::string& v) {
  double x = 0;
  if (lacuna::io::text_detail::parse_decimal(v, x) != lacuna::io::text_detail::decimal_status::ok)
    throw usage_error("lacuna: --up-to " + lacuna::io::text_detail::quote(v) +
                      " is not a number (a decimal such as 2, -0.75 or 1.5e-3)");
  return x;
}

/// --up-to V on integer samples (images and volumes): the last sample value that enters —
/// floor(V) going up, ceil(V) going down — or `nothing` when no sample can enter by V.
struct sample_cut {
  bool nothing = false;
  std::optional<std::int32_t> last{};
};

inline sample_cut cut_of_samples(const std::optional<std::string>& up_to, bool superlevel) {
  sample_cut c;
  if (!up_to) return c;
  const double v = parse_up_to(*up_to);
  const double lo = std::numeric_limits<std::int32_t>::min(), hi = std::numeric_limits<std::int32_t>::max();
  const double cut = superlevel ? std::ceil(v) : std::floor(v);
  if (superlevel ? cut > hi : cut < lo)
    c.nothing = true;
  else
    c.last = static_cast<std::int32_t>(std::clamp(cut, lo, hi));
  return c;
}

/// One term of a printed cocycle: its coefficient as text and its simplex, points numbered
/// from 1 in the order of the file.
struct cocycle_term {
  std::string coefficient;
  std::vector<std::uint32_t> points;
};

/// The diagrams as printed: per dimension, the pairs' values as text and as doubles (for the
/// pictures), and with --cycles a cocycle per pair.
struct persistence_outcome {
  std::string filtration;
  bool superlevel = false;
  std::vector<std::vector<std::pair<std::string, std::optional<std::string>>>> text;
  std::vector<std::vector<lacuna::io::diagram_interval>> values;
  bool has_cocycles = false;
  std::vector<std::vector<std::vector<cocycle_term>>> cocycles;  // [k][j]: of text[k][j]
};

/// Empty diagrams of dimensions 0..top (none when top < 0).
inline void no_pairs(long long top, persistence_outcome& out) {
  out.text.assign(static_cast<std::size_t>(std::max<long long>(top + 1, 0)), {});
  out.values.assign(out.text.size(), {});
}

/// Copies the diagrams of a result (pairs of persistence zero already dropped) into `out`, with
/// empty diagrams up to dimension `top` where the result has fewer.
template <class Result>
void collect(const Result& r, long long top, persistence_outcome& out) {
  out.text.assign(static_cast<std::size_t>(top + 1), {});
  out.values.assign(static_cast<std::size_t>(top + 1), {});
  for (const auto& d : r.diagrams) {
    if (d.dimension < 0 || d.dimension > top) continue;
    const auto k = static_cast<std::size_t>(d.dimension);
    for (const auto& p : d.pairs) {
      std::optional<std::string> death;
      std::optional<double> death_value;
      if (!p.essential()) {
        death = value_text(*p.death);
        death_value = static_cast<double>(*p.death);
      }
      out.text[k].emplace_back(value_text(p.birth), std::move(death));
      out.values[k].emplace_back(static_cast<double>(p.birth), death_value);
    }
  }
}

/// collect() of a whole filtration's result cut after `last` when given (lacuna::up_to: the
/// persistence of the cut filtration), pairs of persistence zero dropped. The two steps
/// commute: a pair of persistence zero stays one or goes under the cut.
template <class Result, class V>
void collect_up_to(Result r, const std::optional<V>& last, long long top, persistence_outcome& out) {
  if (last) r = lacuna::up_to(std::move(r), *last);
  collect(lacuna::without_zero_persistence(std::move(r)), top, out);
}

/// The --json object (docs/persistence-cli.md).
inline std::string persistence_json(const persistence_outcome& o, const coefficients& co) {
  std::string s = "{\n  \"coefficients\": \"" + co.text + "\",\n  \"filtration\": \"" + o.filtration +
                  "\",\n  \"diagrams\": [";
  for (std::size_t k = 0; k < o.text.size(); ++k) {
    s += k ? ",\n    " : "\n    ";
    s += "{\"dimension\": " + std::to_string(k) + ", \"pairs\": [";
    for (std::size_t j = 0; j < o.text[k].size(); ++j) {
      const auto& [b, d] = o.text[k][j];
      s += (j ? ", [" : "[") + b + ", " + (d ? *d : std::string("null")) + "]";
    }
    s += "]}";
  }
  s += o.text.empty() ? "]" : "\n  ]";
  if (o.has_cocycles) {
    // an extension of the contract's layout (docs/persistence-cli.md): one cocycle per pair
    s += ",\n  \"representatives\": [";
    for (std::size_t k = 0; k < o.cocycles.size(); ++k) {
      s += k ? ",\n    " : "\n    ";
      s += "{\"dimension\": " + std::to_string(k) + ", \"cocycles\": [";
      for (std::size_t j = 0; j < o.cocycles[k].size(); ++j) {
        s += j ? ",\n      [" : "\n      [";
        const auto& terms = o.cocycles[k][j];
        for (std::size_t i = 0; i < terms.size(); ++i) {
          s += i ? ", [" : "[";
          s += terms[i].coefficient;
          s += ", [";
          for (std::size_t v = 0; v < terms[i].points.size(); ++v) {
            if (v) s += ", ";
            s += std::to_string(terms[i].points[v]);
          }
          s += "]]";
        }
        s += "]";
      }
      s += o.cocycles[k].empty() ? "]}" : "\n    ]}";
    }
    s += o.cocycles.empty() ? "]" : "\n  ]";
  }
  s += "\n}\n";
  return s;
}

/// The text report (docs/persistence-cli.md); `file` names the input on its first line.
inline std::string persistence_text(const persistence_outcome& o, const coefficients& co, const std::string& file) {
  std::string s = "persistence of " + file + " over " + co.text + " (" + o.filtration + " filtration";
  s += o.superlevel ? ", values decreasing)\n" : ")\n";
  if (o.text.empty()) s += "no cells: no diagrams\n";
  for (std::size_t k = 0; k < o.text.size(); ++k) {
    const auto n = o.text[k].size();
    s += "dimension " + std::to_string(k) + ": " + std::to_string(n) + (n == 1 ? " class" : " classes") + "\n";
    for (std::size_t j = 0; j < n; ++j) {
      const auto& [b, d] = o.text[k][j];
      s += "  born " + b + ", " + (d ? "dies " + *d : std::string("never dies")) + "\n";
      if (!o.has_cocycles) continue;
      s += "    cocycle:";
      const auto& terms = o.cocycles[k][j];
      for (std::size_t i = 0; i < terms.size(); ++i) {
        std::string c = terms[i].coefficient;
        const bool negative = !c.empty() && c[0] == '-';
        if (negative) c.erase(0, 1);
        s += i == 0 ? (negative ? " -" : " ") : (negative ? " - " : " + ");
        if (c != "1") {
          s += c;
          s += '*';
        }
        s += "[";
        for (std::size_t v = 0; v < terms[i].points.size(); ++v) {
          if (v) s += ' ';
          s += std::to_string(terms[i].points[v]);
        }
        s += "]";
      }
      s += "\n";
    }
  }
  return s;
}

/// Writes `content` to `path` whole; throws usage_error when it cannot.
inline void write_report_file(const std::string& path, const std::string& content) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  if (out) out << content;
  if (!out || !out.flush()) throw usage_error(path + ": cannot write the file");
}

/// --diagram OUT.svg and --barcode OUT.svg (either may be empty: not asked), titled
/// "FILE (filtration, coefficients)".
inline void write_pictures(const persistence_outcome& o, const coefficients& co, const std::string& file,
                           const std::string& diagram, const std::string& barcode) {
  const std::string title = file + " (" + o.filtration + ", " + co.text + ")";
  const lacuna::io::persistence_picture_options pictures{.title = title, .superlevel = o.superlevel};
  if (!diagram.empty()) write_report_file(diagram, lacuna::io::persistence_diagram_svg(o.values, pictures));
  if (!barcode.empty()) write_report_file(barcode, lacuna::io::barcode_svg(o.values, pictures));
}

}  // namespace lacuna_cli

// examples/cli/homology_report.hpp — the report of `lacuna homology` and `lacuna cohomology`
// (human text and --json, docs/formats.md) and what it needs: the run options (the coefficients
// and the one-line usage error come from coefficients.hpp). Shared by the one-process tool
// (main.cpp) and the MPI tool (examples/cli-mpi/), so that both print the same answer the same way.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/homology/result.hpp>
#include <lacuna/io/line_reader.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include "coefficients.hpp"
#include "options.hpp"

#include <concepts>
#include <cstdint>
#include <cstdio>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

namespace lacuna_cli {

// ---- output -----------------------------------------------------------------------------

/// Appends s as a JSON string literal, always valid UTF-8: control characters escaped, and
/// every byte that is not part of a well-formed UTF-8 sequence (a file name in another
/// encoding) written as U+FFFD, the replacement character (docs/cli.md, *JSON layout*).
inline void append_json_string(std::string& out, const std::string& s) {
  out += '"';
  for (std::size_t i = 0; i < s.size();) {
    const auto ch = static_cast<unsigned char>(s[i]);
    if (ch >= 0x80) {
      const std::size_t n = lacuna::io::utf8_sequence_length(s, i);
      if (n == 0) {
        out += "\uFFFD";
        ++i;
      } else {
        out.append(s, i, n);
        i += n;
      }
      continue;
    }
    ++i;
    if (ch >= 0x20 && ch != '"' && ch != '\\') {
      out += static_cast<char>(ch);
      continue;
    }
    switch (ch) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\r': out += "\\r"; break;
      case '\t': out += "\\t"; break;
      default: {
        char buf[8];
        std::snprintf(buf, sizeof buf, "\\u%04x", ch);
        out += buf;
      }
    }
  }
  out += '"';
}
inline std::string text_of(const lacuna::integer& x) { return x.to_string(); }
inline std::string text_of(const lacuna::z2& x) { return x == lacuna::one<lacuna::z2>() ? "1" : "0"; }
inline std::string text_of(const lacuna::mod_p_dynamic& x, std::uint64_t p) {
  if (x.is_bound()) return std::to_string(x.value());
  return std::to_string(lacuna::mod_p_dynamic(x.unbound_value(), p).value());
}

/// Integer coefficients for a chain: over Q, the chain scaled to a primitive integer one
/// (any non-zero multiple of a generator over Q is one too).
template <class R>
std::vector<std::string> chain_coefficients(const lacuna::chain<R>& ch, const coefficients& co) {
  std::vector<std::string> out;
  if constexpr (std::same_as<R, lacuna::rational>) {
    using big = boost::multiprecision::cpp_int;
    big l = 1;
    for (const auto& t : ch.terms) {
      const big d = boost::multiprecision::denominator(t.coefficient.value());
      l = l / boost::multiprecision::gcd(l, d) * d;
    }
    big g = 0;
    std::vector<big> nums;
    for (const auto& t : ch.terms) {
      const auto& v = t.coefficient.value();
      nums.push_back(boost::multiprecision::numerator(v) * (l / boost::multiprecision::denominator(v)));
      g = boost::multiprecision::gcd(g, nums.back());
    }
    for (auto& n : nums) out.push_back((g == 0 ? n : n / g).str());
  } else if constexpr (std::same_as<R, lacuna::mod_p_dynamic>) {
    for (const auto& t : ch.terms) out.push_back(text_of(t.coefficient, co.p));
  } else {
    for (const auto& t : ch.terms) out.push_back(text_of(t.coefficient));
  }
  return out;
}

inline std::string group_text(std::size_t rank, const std::vector<std::string>& torsion, const coefficients& co) {
  std::string base = co.k == coefficients::integers ? "Z" : co.k == coefficients::rationals ? "Q" : "(" + co.text + ")";
  if (co.k == coefficients::integers) base = "Z";
  std::vector<std::string> parts;
  if (rank == 1) parts.push_back(co.k == coefficients::mod_p ? co.text : base);
  if (rank > 1) parts.push_back(base + "^" + std::to_string(rank));
  // Equal torsion factors are written once with an exponent: (Z/2)^3.
  for (std::size_t i = 0; i < torsion.size();) {
    std::size_t j = i;
    while (j < torsion.size() && torsion[j] == torsion[i]) ++j;
    parts.push_back(j - i == 1 ? "Z/" + torsion[i] : "(Z/" + torsion[i] + ")^" + std::to_string(j - i));
    i = j;
  }
  if (parts.empty()) return "0";
  std::string s = parts[0];
  for (std::size_t i = 1; i < parts.size(); ++i) s += " \u2295 " + parts[i];
  return s;
}

/// marks[k][i]: the i-th k-cell of FILE is a cell of SUB.
using marks_t = std::vector<std::vector<bool>>;

struct run_options {
  std::string file;
  std::string relative;  ///< SUB of --relative (or of the sequence subcommand); empty: none
  bool cohomology = false;  ///< the cohomology subcommand: H^k with cocycle generators
  bool reduced = false;     ///< homology --reduced: the homology of the augmented complex
  bool check = false;       ///< homology --check: Euler and universal-coefficient identities
  coefficients co;
  bool generators = false;
  bool json = false;
  bool quiet = false;
  std::optional<std::int64_t> threshold;
  std::optional<std::uint64_t> max_cells;           ///< unset: each reader's own default
  std::optional<std::uint64_t> max_facet_vertices;  ///< .facets: labels per line; unset: the reader's
  std::string reduction = "auto";  ///< --reduction: auto, none, collapses, coreductions, both, morse
  std::optional<std::uint64_t> max_memory;  ///< --max-memory in bytes; unset: a quarter of the machine's memory
  std::string certificate;  ///< --certificate OUT.json; empty: none (docs/certificates.md)
  std::string picture;      ///< homology --picture OUT.svg: the H_1 generators on the image; empty: none
};

/// The pre-reduction of --reduction. auto: the Morse complex for images and volumes (implicit,
/// a few bytes per cell), coreductions and collapses for every other input.
template <class C>
lacuna::sparse_elimination algorithm_for(const run_options& o) {
  using lacuna::pre_reduction;
  lacuna::sparse_elimination a;
  if (o.reduction == "none")
    a.reduction = pre_reduction::none;
  else if (o.reduction == "collapses")
    a.reduction = pre_reduction::collapses;
  else if (o.reduction == "coreductions")
    a.reduction = pre_reduction::coreductions;
  else if (o.reduction == "morse" || (o.reduction == "auto" && lacuna::has_implicit_morse_complex<C>))
    a.reduction = pre_reduction::morse;
  return a;
}

inline lacuna::io::facets_read_options facets_options(const run_options& o) {
  lacuna::io::facets_read_options f;
  if (o.max_cells) f.max_cells = static_cast<std::size_t>(*o.max_cells);
  if (o.max_facet_vertices) f.max_facet_vertices = static_cast<std::size_t>(*o.max_facet_vertices);
  return f;
}

template <class R, class C>
void report(const C& cx, const lacuna::homology_result<R>& h, const run_options& o, std::string& out,
            const marks_t* marks = nullptr, const std::vector<lacuna::identity_check>* checks = nullptr) {
  const int top = lacuna::top_dimension(cx);
  std::vector<std::size_t> cells;
  // Of a pair (X, A): the cells of X not in A, which span the relative chain complex.
  for (int k = 0; k <= top; ++k) {
    std::size_t n = lacuna::cell_count(cx, k);
    if (marks)
      for (bool b : (*marks)[static_cast<std::size_t>(k)]) n -= b ? 1 : 0;
    cells.push_back(n);
  }
  std::int64_t chi = 0;
  for (std::size_t k = 0; k < cells.size(); ++k)
    chi += (k % 2 == 0 ? 1 : -1) * static_cast<std::int64_t>(cells[k]);
  auto torsion_texts = [](const lacuna::homology_group<R>& g) {
    std::vector<std::string> t;
    if constexpr (std::same_as<R, lacuna::integer>)
      for (const auto& x : g.torsion) t.push_back(x.to_string());
    return t;
  };
  auto order_text = [](const lacuna::homology_group<R>& g, std::size_t i) -> std::string {
    if constexpr (std::same_as<R, lacuna::integer>)
      return g.orders[i].to_string();
    else
      return "0";
  };
  auto num = [&out](auto v) { out += std::to_string(v); };
  if (o.json) {
    out += "{\n  \"coefficients\": ";
    append_json_string(out, o.co.text);
    if (!o.relative.empty()) {
      out += ",\n  \"relative_to\": ";
      append_json_string(out, o.relative);
    }
    if (o.reduced) out += ",\n  \"reduced\": true";
    out += ",\n  \"cells\": [";
    for (std::size_t k = 0; k < cells.size(); ++k) {
      if (k) out += ", ";
      num(cells[k]);
    }
    out += "],\n  \"euler_characteristic\": ";
    num(chi);
    // cohomology: the same layout under the key "cohomology", cochains under "cochain"
    out += o.cohomology ? ",\n  \"cohomology\": [" : ",\n  \"homology\": [";
    for (std::size_t k = 0; k < h.groups.size(); ++k) {
      const auto& g = h.groups[k];
      out += k ? ",\n" : "\n";
      out += "    {\"dimension\": ";
      num(g.dimension);
      out += ", \"rank\": ";
      num(g.rank);
      out += ", \"torsion\": [";
      const auto tt = torsion_texts(g);
      for (std::size_t i = 0; i < tt.size(); ++i) out += (i ? ", " : "") + tt[i];
      out += "]";
      if (o.generators) {
        out += ", \"generators\": [";
        for (std::size_t i = 0; i < g.generators.size(); ++i) {
          const auto& ch = g.generators[i];
          const auto coeffs = chain_coefficients(ch, o.co);
          out += i ? ",\n      " : "\n      ";
          out += "{\"order\": " + order_text(g, i) + (o.cohomology ? ", \"cochain\": [" : ", \"chain\": [");
          for (std::size_t j = 0; j < coeffs.size(); ++j) {
            out += j ? ", [" : "[";
            out += coeffs[j];
            out += ", ";
            append_json_string(out, lacuna::cell_name(cx, ch.dimension, ch.terms[j].cell));
            out += ']';
          }
          out += "]}";
        }
        out += g.generators.empty() ? "]" : "\n    ]";
      }
      out += "}";
    }
    out += h.groups.empty() ? "]" : "\n  ]";
    if (checks) {  // --check: after the fixed keys (an extension, docs/cli.md)
      out += ",\n  \"checks\": [";
      for (std::size_t i = 0; i < checks->size(); ++i) {
        const auto& c = (*checks)[i];
        out += i ? ",\n    {\"statement\": " : "\n    {\"statement\": ";
        append_json_string(out, c.statement);
        out += ", \"predicted\": " + c.predicted + ", \"computed\": " + c.computed + ", \"holds\": true}";
      }
      out += checks->empty() ? "]" : "\n  ]";
    }
    out += "\n}\n";
    return;
  }
  out += std::string(o.reduced ? "reduced " : "") + (o.cohomology ? "cohomology" : "homology") + " of " + o.file +
         (o.relative.empty() ? "" : " relative to " + o.relative) + " over " + o.co.text + "\n";
  out += "cells:";
  if (cells.empty()) out += " none (the empty complex)";
  for (std::size_t k = 0; k < cells.size(); ++k)
    out += (k ? ", " : " ") + std::to_string(cells[k]) + " in dimension " + std::to_string(k);
  out += "\nEuler characteristic: " + std::to_string(chi) + "\n";
  for (const auto& g : h.groups) {
    out += (o.cohomology ? "H^" : "H_") + std::to_string(g.dimension) + " = " + group_text(g.rank, torsion_texts(g), o.co) +
           "\n";
    if (!o.generators) continue;
    for (std::size_t i = 0; i < g.generators.size(); ++i) {
      const auto& ch = g.generators[i];
      const auto coeffs = chain_coefficients(ch, o.co);
      const std::string order = order_text(g, i);
      out += "  generator (" + (order == "0" ? std::string("free") : "order " + order) + "): ";
      for (std::size_t j = 0; j < coeffs.size(); ++j) {
        std::string c = coeffs[j];
        const bool neg = !c.empty() && c[0] == '-';
        if (neg) c = c.substr(1);
        out += j == 0 ? (neg ? "-" : "") : (neg ? " - " : " + ");
        if (c != "1") out += c + "*";
        out += "[" + lacuna::cell_name(cx, ch.dimension, ch.terms[j].cell) + "]";
      }
      out += "\n";
    }
  }
  if (checks)
    for (const auto& c : *checks) out += "check: " + c.statement + ": " + c.predicted + " = " + c.computed + "\n";
}

}  // namespace lacuna_cli

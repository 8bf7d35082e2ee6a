// The lacuna command-line tool: the library's engine on files. shared/FORMATS.md fixes the
// input formats, the JSON output and the error contract (exit status 2, one line
// "FILE:LINE: what is wrong"); docs/cli.md describes the rest.
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/polygon_mesh.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/obj.hpp>
#include <lacuna/io/off.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <CLI/CLI.hpp>
#include <unistd.h>

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <csignal>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <mutex>
#include <optional>
#include <sstream>
#include <string>
#include <thread>
#include <variant>

namespace {

/// Exit status 2 with this message (already "FILE:LINE: ..." or "lacuna: ...").
struct usage_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

struct coefficients {
  enum kind { integers, rationals, mod_p } k = integers;
  std::uint64_t p = 0;
  std::string text = "Z";
};

coefficients parse_coefficients(const std::string& s) {
  coefficients c;
  c.text = s;
  if (s == "Z") return c;
  if (s == "Q") {
    c.k = coefficients::rationals;
    return c;
  }
  if (s.size() > 2 && s.rfind("Z/", 0) == 0) {
    const std::string digits = s.substr(2);
    if (digits.find_first_not_of("0123456789") != std::string::npos || digits.size() > 19)
      throw usage_error("lacuna: --coefficients " + s + ": expected Z, Q or Z/p for a prime p");
    const std::uint64_t p = std::stoull(digits);
    if (p >= lacuna::mod_p_modulus_limit)
      throw usage_error("lacuna: --coefficients " + s + ": the prime must be below 2^62");
    if (!lacuna::is_prime(p)) throw usage_error("lacuna: --coefficients " + s + ": " + digits + " is not a prime");
    c.k = coefficients::mod_p;
    c.p = p;
    c.text = "Z/" + std::to_string(p);
    return c;
  }
  throw usage_error("lacuna: --coefficients " + s + ": expected Z, Q or Z/p for a prime p");
}

// ---- progress on a terminal ------------------------------------------------------------

/// Prints the current phase on stderr, once a second, after the first second, when stderr
/// is a terminal and --quiet is not given.
class progress_line {
 public:
  explicit progress_line(bool enabled) : enabled_(enabled && ::isatty(2)) {
    if (enabled_) worker_ = std::thread([this] { loop(); });
  }
  ~progress_line() { stop(); }
  void phase(const char* p) { phase_.store(p); }
  void stop() {
    if (!enabled_) return;
    {
      std::lock_guard<std::mutex> lock(m_);
      done_ = true;
    }
    cv_.notify_all();
    if (worker_.joinable()) worker_.join();
    if (printed_) std::fputs("\r\033[K", stderr);
    enabled_ = false;
  }

 private:
  void loop() {
    const auto start = std::chrono::steady_clock::now();
    std::unique_lock<std::mutex> lock(m_);
    while (!cv_.wait_for(lock, std::chrono::milliseconds(250), [this] { return done_; })) {
      const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
      if (s < 1.0) continue;
      std::fprintf(stderr, "\r\033[Klacuna: %s (%.0f s)", phase_.load(), s);
      std::fflush(stderr);
      printed_ = true;
    }
  }
  bool enabled_;
  std::atomic<const char*> phase_{"reading"};
  std::thread worker_;
  std::mutex m_;
  std::condition_variable cv_;
  bool done_ = false;
  bool printed_ = false;
};

// ---- output -----------------------------------------------------------------------------

/// Appends s as a JSON string literal.
void append_json_string(std::string& out, const std::string& s) {
  out += '"';
  for (unsigned char ch : s) {
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
std::string text_of(const lacuna::integer& x) { return x.to_string(); }
std::string text_of(const lacuna::z2& x) { return x == lacuna::one<lacuna::z2>() ? "1" : "0"; }
std::string text_of(const lacuna::mod_p_dynamic& x, std::uint64_t p) {
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

std::string group_text(std::size_t rank, const std::vector<std::string>& torsion, const coefficients& co) {
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

struct run_options {
  std::string file;
  coefficients co;
  bool generators = false;
  bool json = false;
  bool quiet = false;
  std::optional<std::int64_t> threshold;
  std::uint64_t max_cells = std::uint64_t{1} << 32;
};

template <class R, class C>
void report(const C& cx, const lacuna::homology_result<R>& h, const run_options& o, std::string& out) {
  const int top = lacuna::top_dimension(cx);
  std::vector<std::size_t> cells;
  for (int k = 0; k <= top; ++k) cells.push_back(lacuna::cell_count(cx, k));
  const std::int64_t chi = lacuna::euler_characteristic(cx);
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
    out += ",\n  \"cells\": [";
    for (std::size_t k = 0; k < cells.size(); ++k) {
      if (k) out += ", ";
      num(cells[k]);
    }
    out += "],\n  \"euler_characteristic\": ";
    num(chi);
    out += ",\n  \"homology\": [";
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
          out += "{\"order\": " + order_text(g, i) + ", \"chain\": [";
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
    out += "\n}\n";
    return;
  }
  out += "homology of " + o.file + " over " + o.co.text + "\n";
  out += "cells:";
  if (cells.empty()) out += " none (the empty complex)";
  for (std::size_t k = 0; k < cells.size(); ++k)
    out += (k ? ", " : " ") + std::to_string(cells[k]) + " in dimension " + std::to_string(k);
  out += "\nEuler characteristic: " + std::to_string(chi) + "\n";
  for (const auto& g : h.groups) {
    out += "H_" + std::to_string(g.dimension) + " = " + group_text(g.rank, torsion_texts(g), o.co) + "\n";
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
}

template <class C>
void compute_and_report(const C& cx, const run_options& o, progress_line& progress) {
  progress.phase("computing homology");
  // Generators without coordinates: the tool never asks for classes of other cycles.
  // Both cores where the work splits: lacuna's own complexes are safe to read from two threads.
  lacuna::homology_options ho{.generators = o.generators, .keep_basis = false, .threads = 2};
  std::string out;  // nothing reaches stdout until the whole answer is known
  switch (o.co.k) {
    case coefficients::integers:
      report(cx, lacuna::homology<lacuna::integer>(cx, ho), o, out);
      break;
    case coefficients::rationals:
      report(cx, lacuna::homology<lacuna::rational>(cx, ho), o, out);
      break;
    case coefficients::mod_p:
      if (o.co.p == 2)
        report(cx, lacuna::homology<lacuna::z2>(cx, ho), o, out);
      else
        report(cx,
               lacuna::homology<lacuna::mod_p_dynamic>(cx, ho, lacuna::sparse_elimination{},
                                                       lacuna::mod_p_dynamic(1, o.co.p)),
               o, out);
      break;
  }
  progress.stop();
  if (std::fwrite(out.data(), 1, out.size(), stdout) != out.size() || std::fflush(stdout) != 0)
    throw std::runtime_error("cannot write the result to standard output");
}

std::string extension_of(const std::string& file) {
  std::string ext = std::filesystem::path(file).extension().string();
  for (auto& ch : ext) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  return ext;
}

void run_homology(const run_options& o) {
  if (!std::filesystem::exists(o.file)) throw usage_error(o.file + ": no such file");
  if (std::filesystem::is_directory(o.file)) throw usage_error(o.file + ": is a directory, not a file");
  progress_line progress(!o.quiet);
  const std::string ext = extension_of(o.file);
  lacuna::io::read_limits limits;
  limits.max_cells = o.max_cells;
  lacuna::io::image_options image{.threshold = o.threshold, .limits = limits};
  if (o.threshold && ext != ".pbm" && ext != ".pgm" && ext != ".nrrd")
    throw usage_error("lacuna: --threshold applies to images and volumes (.pbm, .pgm, .nrrd), not to " + o.file);
  if (ext == ".facets") {
    compute_and_report(lacuna::io::read_facets(std::filesystem::path(o.file), {.max_cells = o.max_cells}), o, progress);
  } else if (ext == ".cells") {
    compute_and_report(lacuna::io::read_cells(std::filesystem::path(o.file), {.max_cells = o.max_cells}), o, progress);
  } else if (ext == ".off") {
    compute_and_report(lacuna::io::read_off(std::filesystem::path(o.file), limits), o, progress);
  } else if (ext == ".obj") {
    compute_and_report(lacuna::io::read_obj(std::filesystem::path(o.file), limits), o, progress);
  } else if (ext == ".pbm" || ext == ".pgm") {
    compute_and_report(lacuna::io::read_netpbm(std::filesystem::path(o.file), image), o, progress);
  } else if (ext == ".nrrd") {
    compute_and_report(lacuna::io::read_nrrd<3>(std::filesystem::path(o.file), image), o, progress);
  } else {
    throw usage_error(o.file + ": unknown file type '" + ext +
                      "' (expected .facets, .cells, .off, .obj, .pbm, .pgm or .nrrd)");
  }
}

/// An error message as one line: control characters (a newline in a file name, say) are
/// shown as '?', so that the message stays the single line FORMATS.md promises.
std::string one_line(std::string s) {
  for (auto& ch : s)
    if (static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f) ch = '?';
  return s;
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"lacuna: exact homology of cell complexes from files"};
  app.require_subcommand(1);
  run_options o;
  std::string coeff_text = "Z";
  auto* hom = app.add_subcommand("homology", "homology groups (ranks and torsion), optionally with generators");
  hom->add_option("--coefficients", coeff_text, "Z (default), Q, or Z/p for a prime p");
  hom->add_flag("--generators", o.generators, "print one cycle per free summand and per torsion factor");
  hom->add_flag("--json", o.json, "one JSON object (shared/FORMATS.md)");
  hom->add_flag("--quiet", o.quiet, "no progress on stderr");
  hom->add_option("--threshold", o.threshold, "images and volumes: foreground is a value >= T");
  hom->add_option("--max-cells", o.max_cells, "refuse inputs announcing more cells than this")
      ->check(CLI::Validator(  // CLI11 would read -1 as 2^64 - 1
          [](std::string& v) { return v.find('-') == std::string::npos ? std::string() : "must not be negative"; },
          "N"));
  hom->add_option("FILE", o.file, "input: .facets .cells .off .obj .pbm .pgm .nrrd")->required();
  try {
    try {
      app.parse(argc, argv);
    } catch (const CLI::CallForHelp&) {
      std::cout << app.help();
      return 0;
    } catch (const CLI::CallForAllHelp&) {
      std::cout << app.help("", CLI::AppFormatMode::All);
      return 0;
    } catch (const CLI::ParseError& e) {
      std::string msg = e.what();
      if (auto nl = msg.find('\n'); nl != std::string::npos) msg = msg.substr(0, nl);
      throw usage_error("lacuna: " + msg + " (lacuna --help)");
    }
    o.co = parse_coefficients(coeff_text);
    if (hom->parsed()) run_homology(o);
    return 0;
  } catch (const usage_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const lacuna::parse_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const std::bad_alloc&) {
    std::cerr << one_line(o.file + ": not enough memory for this input") << "\n";
  } catch (const std::exception& e) {
    std::cerr << one_line(o.file + ": " + e.what()) << "\n";
  }
  return 2;
}

// lacuna/io/certificate_json.hpp — homology certificates (homology/certificate.hpp) as JSON
// files: write_certificate_json and read_certificate_json. The layout is documented in
// docs/certificates.md ("The certificate file"); cells are named as the tool names them
// (lacuna::cell_name), so the file can be read against the input file by any program.
// Certificates of reduced homology, of a pair and of cohomology (certificate_kind) add the
// optional keys "kind", "augmented" and "subcomplex"; the keys of the first layout keep their
// meaning, read in the kind's own degrees (docs/certificates.md, "The certificate file").
//
// Over the integers coefficients are JSON integers of any size; over Z/2 they are 0 or 1.
// The reader is a small JSON parser of its own (objects, arrays, strings, integers; no
// floating point), and every error names the file and what is wrong.
#pragma once

#include <lacuna/complex/concepts.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/z2.hpp>

#include <cstdint>
#include <istream>
#include <iterator>
#include <map>
#include <memory>
#include <ostream>
#include <stdexcept>
#include <string>
#include <unordered_map>
#include <vector>

namespace lacuna::io {

/// A malformed certificate file: what is wrong, with the file's name.
class certificate_format_error : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

namespace detail::cert_json {

inline void string_out(std::ostream& os, const std::string& s) {
  os << '"';
  for (const char c : s) {
    const auto ch = static_cast<unsigned char>(c);
    if (ch == '"') os << "\\\"";
    else if (ch == '\\') os << "\\\\";
    else if (ch < 0x20) {
      const char* hex = "0123456789abcdef";
      os << "\\u00" << hex[ch >> 4] << hex[ch & 15];
    } else os << static_cast<char>(ch);
  }
  os << '"';
}

template <class R>
std::string coefficient_text(const R& x) {
  if constexpr (std::same_as<R, integer>)
    return x.to_string();
  else
    return x == one<R>() ? "1" : "0";
}

template <class R, cell_complex C>
void chain_out(std::ostream& os, const C& c, const chain<R>& ch) {
  os << '[';
  for (std::size_t j = 0; j < ch.terms.size(); ++j) {
    os << (j ? ", [" : "[") << coefficient_text(ch.terms[j].coefficient) << ", ";
    string_out(os, lacuna::cell_name(c, ch.dimension, ch.terms[j].cell));
    os << ']';
  }
  os << ']';
}

/// A parsed JSON value (numbers kept as their text: integers of any size).
struct value {
  enum kind_t { object, array, string, number, literal } kind = literal;
  std::string text;  // string, number or literal
  std::vector<std::string> keys;  // an object's keys, and their values in the same order
  std::vector<value> members;     // (two vectors: a pair with the incomplete value is not allowed)
  std::vector<value> items;
  const value* find(const std::string& key) const {
    for (std::size_t i = 0; i < keys.size(); ++i)
      if (keys[i] == key) return &members[i];
    return nullptr;
  }
};

class parser {
 public:
  parser(std::string text, std::string file) : s_(std::move(text)), file_(std::move(file)) {}
  value parse() {
    value v = parse_value(0);
    skip();
    if (i_ != s_.size()) fail("text after the JSON value");
    return v;
  }
  [[noreturn]] void fail(const std::string& what) const {
    std::size_t line = 1;
    for (std::size_t j = 0; j < i_ && j < s_.size(); ++j) line += s_[j] == '\n';
    throw certificate_format_error(file_ + ":" + std::to_string(line) + ": " + what);
  }

 private:
  void skip() {
    while (i_ < s_.size() && (s_[i_] == ' ' || s_[i_] == '\n' || s_[i_] == '\r' || s_[i_] == '\t')) ++i_;
  }
  value parse_value(int depth) {
    if (depth > 64) fail("nested too deeply");
    skip();
    if (i_ >= s_.size()) fail("unexpected end of the file");
    value v;
    const char ch = s_[i_];
    if (ch == '{') {
      v.kind = value::object;
      ++i_;
      skip();
      if (i_ < s_.size() && s_[i_] == '}') return ++i_, v;
      for (;;) {
        skip();
        if (i_ >= s_.size() || s_[i_] != '"') fail("expected a key");
        std::string key = parse_string();
        skip();
        if (i_ >= s_.size() || s_[i_] != ':') fail("expected ':'");
        ++i_;
        v.keys.push_back(std::move(key));
        v.members.push_back(parse_value(depth + 1));
        skip();
        if (i_ < s_.size() && s_[i_] == ',') { ++i_; continue; }
        if (i_ < s_.size() && s_[i_] == '}') return ++i_, v;
        fail("expected ',' or '}'");
      }
    }
    if (ch == '[') {
      v.kind = value::array;
      ++i_;
      skip();
      if (i_ < s_.size() && s_[i_] == ']') return ++i_, v;
      for (;;) {
        v.items.push_back(parse_value(depth + 1));
        skip();
        if (i_ < s_.size() && s_[i_] == ',') { ++i_; continue; }
        if (i_ < s_.size() && s_[i_] == ']') return ++i_, v;
        fail("expected ',' or ']'");
      }
    }
    if (ch == '"') {
      v.kind = value::string;
      v.text = parse_string();
      return v;
    }
    if (ch == '-' || (ch >= '0' && ch <= '9')) {
      v.kind = value::number;
      const std::size_t b = i_;
      if (s_[i_] == '-') ++i_;
      while (i_ < s_.size() && s_[i_] >= '0' && s_[i_] <= '9') ++i_;
      if (i_ == b || (s_[b] == '-' && i_ == b + 1)) fail("a malformed number");
      if (i_ < s_.size() && (s_[i_] == '.' || s_[i_] == 'e' || s_[i_] == 'E')) fail("a number that is not an integer");
      v.text = s_.substr(b, i_ - b);
      return v;
    }
    for (const char* lit : {"true", "false", "null"})
      if (s_.compare(i_, std::char_traits<char>::length(lit), lit) == 0) {
        v.text = lit;
        i_ += std::char_traits<char>::length(lit);
        return v;
      }
    fail("unexpected character");
  }
  std::string parse_string() {
    ++i_;  // the opening quote
    std::string out;
    while (i_ < s_.size() && s_[i_] != '"') {
      char ch = s_[i_++];
      if (ch != '\\') {
        out += ch;
        continue;
      }
      if (i_ >= s_.size()) break;
      const char e = s_[i_++];
      switch (e) {
        case '"': out += '"'; break;
        case '\\': out += '\\'; break;
        case '/': out += '/'; break;
        case 'n': out += '\n'; break;
        case 'r': out += '\r'; break;
        case 't': out += '\t'; break;
        case 'b': out += '\b'; break;
        case 'f': out += '\f'; break;
        case 'u': {
          if (i_ + 4 > s_.size()) fail("a malformed \\u escape");
          const unsigned cp = static_cast<unsigned>(std::stoul(s_.substr(i_, 4), nullptr, 16));
          i_ += 4;
          if (cp < 0x80) {
            out += static_cast<char>(cp);
          } else if (cp < 0x800) {
            out += static_cast<char>(0xC0 | (cp >> 6));
            out += static_cast<char>(0x80 | (cp & 0x3F));
          } else {
            out += static_cast<char>(0xE0 | (cp >> 12));
            out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
            out += static_cast<char>(0x80 | (cp & 0x3F));
          }
          break;
        }
        default: fail("an unknown escape in a string");
      }
    }
    if (i_ >= s_.size()) fail("a string without its closing quote");
    ++i_;
    return out;
  }
  std::string s_, file_;
  std::size_t i_ = 0;
};

}  // namespace detail::cert_json

/// Writes a certificate of c's homology over R (lacuna::integer or z2) as JSON, in the layout
/// of docs/certificates.md. `coefficients` is the text written under "coefficients" (Z, Z/2).
/// A certificate of another kind than absolute homology (cert.kind) adds the optional keys
/// "kind", "augmented" (reduced: the cell of degree −1 is named "*") and "subcomplex"
/// (relative: the name of the subcomplex's file, `subcomplex`, for the reader's information).
template <class R, cell_complex C>
  requires(std::same_as<R, integer> || std::same_as<R, z2>)
void write_certificate_json(std::ostream& os, const C& c, const homology_certificate<R>& cert,
                            const std::string& coefficients, const std::string& subcomplex = {}) {
  using namespace detail::cert_json;
  const bool coh = cert.kind == certificate_kind::cohomology;
  auto name = [&](int k, std::size_t i) { return k < 0 ? std::string("*") : lacuna::cell_name(c, k, i); };
  os << "{\n  \"certificate\": \"lacuna homology certificate 1\",\n  \"coefficients\": ";
  string_out(os, coefficients);
  if (cert.kind != certificate_kind::absolute) {
    os << ",\n  \"kind\": ";
    string_out(os, certificate_kind_name(cert.kind));
  }
  if (cert.kind == certificate_kind::reduced) os << ",\n  \"augmented\": true";
  if (cert.kind == certificate_kind::relative && !subcomplex.empty()) {
    os << ",\n  \"subcomplex\": ";
    string_out(os, subcomplex);
  }
  os << ",\n  \"cells\": [";
  for (int k = 0; k <= lacuna::top_dimension(c); ++k) os << (k ? ", " : "") << lacuna::cell_count(c, k);
  os << "],\n  \"groups\": [";
  for (std::size_t k = 0; k < cert.groups.size(); ++k) {
    const auto& g = cert.groups[k];
    os << (k ? ",\n" : "\n") << "    {\"dimension\": " << g.dimension << ", \"rank\": " << g.rank << ", \"torsion\": [";
    for (std::size_t i = 0; i < g.torsion.size(); ++i) os << (i ? ", " : "") << coefficient_text(g.torsion[i]);
    os << "], \"generators\": [";
    for (std::size_t j = 0; j < g.generators.size(); ++j) {
      os << (j ? ",\n      " : "\n      ") << "{\"order\": "
         << (j < g.rank ? std::string("0") : coefficient_text(g.torsion[j - g.rank])) << ",\n       \"chain\": ";
      chain_out(os, c, g.generators[j]);
      os << ",\n       \"cocycle\": ";
      chain_out(os, c, j < g.cocycles.size() ? g.cocycles[j] : chain<R>{g.dimension, {}});
      if (j >= g.rank && j - g.rank < g.bounding_chains.size()) {
        os << ",\n       \"bounding_chain\": ";
        chain_out(os, c, g.bounding_chains[j - g.rank]);
      }
      os << '}';
    }
    os << (g.generators.empty() ? "]}" : "\n    ]}");
  }
  os << (cert.groups.empty() ? "]" : "\n  ]") << ",\n  \"rank_witnesses\": [";
  bool first = true;
  // The maps witnessed: ∂_k for k = 1..top (reduced: also ε = ∂_0, rows "*"); cohomology δ_k
  // for k = 0..top−1, rows the (k+1)-cells.
  const std::size_t from = cert.kind == certificate_kind::reduced || coh ? 0 : 1;
  const std::size_t to = coh && !cert.ranks.empty() ? cert.ranks.size() - 1 : cert.ranks.size();
  for (std::size_t k = from; k < to; ++k) {
    const auto& w = cert.ranks[k];
    const int row_dim = coh ? static_cast<int>(k) + 1 : static_cast<int>(k) - 1;
    os << (first ? "\n" : ",\n") << "    {\"dimension\": " << k << ", \"prime\": " << w.prime << ", \"pivots\": [";
    first = false;
    for (std::size_t i = 0; i < w.rows.size(); ++i) {
      os << (i ? ", [" : "[");
      string_out(os, name(row_dim, w.rows[i]));
      os << ", ";
      string_out(os, name(static_cast<int>(k), w.columns[i]));
      os << ']';
    }
    os << "]}";
  }
  os << (first ? "]" : "\n  ]");
  // Torsion witnesses (over Z): one per boundary map ∂_{k+1} whose group H_k needs one.
  if (!cert.torsion.empty()) {
    os << ",\n  \"torsion_witnesses\": [";
    auto cells = [&](int k, const std::vector<std::size_t>& v) {
      os << '[';
      for (std::size_t i = 0; i < v.size(); ++i) {
        if (i) os << ", ";
        string_out(os, lacuna::cell_name(c, k, v[i]));
      }
      os << ']';
    };
    first = true;
    for (std::size_t k = 0; k < cert.torsion.size(); ++k) {
      const auto& w = cert.torsion[k];
      if (w.minors.empty() && w.pivot_rows.empty()) continue;
      const int kk = static_cast<int>(k), col_dim = coh ? kk - 1 : kk + 1;  // the map ∂_{k+1}, or δ_{k−1}
      os << (first ? "\n" : ",\n") << "    {\"dimension\": " << col_dim << ", \"pivots\": [";
      first = false;
      for (std::size_t i = 0; i < w.pivot_rows.size(); ++i) {
        os << (i ? ", [" : "[");
        string_out(os, lacuna::cell_name(c, kk, w.pivot_rows[i]));
        os << ", ";
        string_out(os, lacuna::cell_name(c, col_dim, w.pivot_columns[i]));
        os << ']';
      }
      os << "],\n     \"minors\": [";
      for (std::size_t i = 0; i < w.minors.size(); ++i) {
        os << (i ? ", " : "") << "{\"rows\": ";
        cells(kk, w.minors[i].rows);
        os << ", \"columns\": ";
        cells(col_dim, w.minors[i].columns);
        os << '}';
      }
      os << "]}";
    }
    os << (first ? "]" : "\n  ]");
  }
  os << "\n}\n";
}

/// Reads a certificate written by write_certificate_json against the complex c it describes:
/// cells are looked up by name in c. Throws certificate_format_error naming `file` for text
/// that is not such a certificate (malformed JSON, a key missing, a cell that c does not
/// have, a coefficient that is not an integer). Whether the certificate is right is for
/// check_certificate to say. The optional "kind" sets cert.kind; `subcomplex`, if given,
/// receives the optional "subcomplex" (the file a relative certificate was written for).
template <class R, cell_complex C>
  requires(std::same_as<R, integer> || std::same_as<R, z2>)
homology_certificate<R> read_certificate_json(std::istream& in, const C& c, const std::string& file,
                                              std::string* subcomplex = nullptr) {
  using namespace detail::cert_json;
  std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  parser p(std::move(text), file);
  const value root = p.parse();
  auto bad = [&](const std::string& what) { return certificate_format_error(file + ": " + what); };
  auto need = [&](const value& v, const std::string& key, value::kind_t kind) -> const value& {
    const value* x = v.find(key);
    if (!x || x->kind != kind) throw bad("expected \"" + key + "\" of the right kind");
    return *x;
  };
  if (root.kind != value::object) throw bad("not a JSON object");
  const value& tag = need(root, "certificate", value::string);
  if (tag.text != "lacuna homology certificate 1") throw bad("not a lacuna homology certificate (\"" + tag.text + "\")");
  auto number = [&](const value& v) -> R {
    if (v.kind != value::number) throw bad("expected an integer, got \"" + v.text + "\"");
    if constexpr (std::same_as<R, integer>) {
      return integer(integer::big_type(v.text));
    } else {
      const char last = v.text.back();
      return R((last - '0') % 2);
    }
  };
  auto count = [&](const value& v) -> std::size_t {
    if (v.kind != value::number || v.text.empty() || v.text[0] == '-' || v.text.size() > 18)
      throw bad("expected a count, got \"" + v.text + "\"");
    return static_cast<std::size_t>(std::stoull(v.text));
  };
  homology_certificate<R> cert;
  if (const value* kv = root.find("kind")) {
    if (kv->kind != value::string) throw bad("expected \"kind\" of the right kind");
    bool known = false;
    for (auto k : {certificate_kind::absolute, certificate_kind::reduced, certificate_kind::relative, certificate_kind::cohomology})
      if (kv->text == certificate_kind_name(k)) cert.kind = k, known = true;
    if (!known) throw bad("an unknown kind of certificate \"" + kv->text + "\"");
  }
  if (const value* sv = root.find("subcomplex"); sv && subcomplex) {
    if (sv->kind != value::string) throw bad("expected \"subcomplex\" of the right kind");
    *subcomplex = sv->text;
  }
  const bool coh = cert.kind == certificate_kind::cohomology, red = cert.kind == certificate_kind::reduced;
  const int top = lacuna::top_dimension(c);
  std::vector<std::unordered_map<std::string, std::size_t>> index(static_cast<std::size_t>(top + 1));
  auto cell = [&](int k, const value& name) -> std::size_t {
    if (k == -1 && red && name.kind == value::string && name.text == "*") return 0;  // the augmentation cell
    if (k < 0 || k > top) throw bad("a chain of dimension " + std::to_string(k) + ", the complex has dimension " + std::to_string(top));
    auto& m = index[static_cast<std::size_t>(k)];
    if (m.empty())
      for (std::size_t i = 0; i < lacuna::cell_count(c, k); ++i) m.emplace(lacuna::cell_name(c, k, i), i);
    if (name.kind != value::string) throw bad("expected a cell name");
    auto it = m.find(name.text);
    if (it == m.end()) throw bad("no " + std::to_string(k) + "-cell is named \"" + name.text + "\"");
    return it->second;
  };
  auto chain_in = [&](const value& v, int k) {
    if (v.kind != value::array) throw bad("expected a chain");
    chain<R> ch{k, {}};
    for (const auto& t : v.items) {
      if (t.kind != value::array || t.items.size() != 2) throw bad("expected a term [coefficient, \"cell\"]");
      ch.terms.push_back({cell(k, t.items[1]), number(t.items[0])});
    }
    const std::size_t before = ch.terms.size();
    ch.normalize_terms();
    if (ch.terms.size() != before) throw bad("a chain names a cell twice, or has a zero coefficient");
    return ch;
  };
  for (const auto& gv : need(root, "groups", value::array).items) {
    if (gv.kind != value::object) throw bad("expected a group object");
    certified_group<R> g;
    g.dimension = static_cast<int>(count(need(gv, "dimension", value::number)));
    g.rank = count(need(gv, "rank", value::number));
    for (const auto& t : need(gv, "torsion", value::array).items) g.torsion.push_back(number(t));
    for (const auto& z : need(gv, "generators", value::array).items) {
      if (z.kind != value::object) throw bad("expected a generator object");
      // "order" repeats the torsion list (0 for free generators); a file where they differ
      // is refused rather than read one way or the other.
      const std::size_t j = g.generators.size();
      const R order = number(need(z, "order", value::number));
      const R expect = j < g.rank ? zero<R>() : (j - g.rank < g.torsion.size() ? g.torsion[j - g.rank] : zero<R>());
      if (!(order == expect))
        throw bad((coh ? "H^" : "H_") + std::to_string(g.dimension) + " generator " + std::to_string(j) + " has order " +
                  coefficient_text(order) + ", the rank and torsion list give " + coefficient_text(expect));
      g.generators.push_back(chain_in(need(z, "chain", value::array), g.dimension));
      g.cocycles.push_back(chain_in(need(z, "cocycle", value::array), g.dimension));
      if (const value* w = z.find("bounding_chain")) g.bounding_chains.push_back(chain_in(*w, coh ? g.dimension - 1 : g.dimension + 1));
    }
    cert.groups.push_back(std::move(g));
  }
  cert.ranks.assign(static_cast<std::size_t>(top + 1), {});
  for (const auto& wv : need(root, "rank_witnesses", value::array).items) {
    if (wv.kind != value::object) throw bad("expected a rank witness object");
    const std::size_t k = count(need(wv, "dimension", value::number));
    const std::size_t lo = red || coh ? 0 : 1, hi = coh ? static_cast<std::size_t>(top) - 1 : static_cast<std::size_t>(top);
    if (top < 0 || k < lo || k > hi || (coh && top < 1)) throw bad("a rank witness of dimension " + std::to_string(k));
    auto& w = cert.ranks[k];
    w.prime = count(need(wv, "prime", value::number));
    for (const auto& pv : need(wv, "pivots", value::array).items) {
      if (pv.kind != value::array || pv.items.size() != 2) throw bad("expected a pivot [\"row cell\", \"column cell\"]");
      w.rows.push_back(cell(coh ? static_cast<int>(k) + 1 : static_cast<int>(k) - 1, pv.items[0]));
      w.columns.push_back(cell(static_cast<int>(k), pv.items[1]));
    }
  }
  // "torsion_witnesses" came after the first layout: a certificate without it is read, and
  // check_certificate then says that the torsion is not proved complete.
  if (const value* tv = root.find("torsion_witnesses")) {
    if (tv->kind != value::array) throw bad("expected \"torsion_witnesses\" of the right kind");
    cert.torsion.assign(static_cast<std::size_t>(top + 1), {});
    std::vector<char> seen(static_cast<std::size_t>(top + 1), 0);
    for (const auto& wv : tv->items) {
      if (wv.kind != value::object) throw bad("expected a torsion witness object");
      // "dimension": the map, ∂_d (group d − 1) or, for cohomology, δ_d (group d + 1)
      const std::size_t d = count(need(wv, "dimension", value::number));
      const std::size_t g = coh ? d + 1 : d - 1;
      if ((coh ? d + 1 > static_cast<std::size_t>(top) : d < 1 || d > static_cast<std::size_t>(top)))
        throw bad("a torsion witness of dimension " + std::to_string(d));
      if (seen[g]) throw bad("two torsion witnesses of dimension " + std::to_string(d));
      seen[g] = 1;
      auto& w = cert.torsion[g];
      const int k = static_cast<int>(g), col = static_cast<int>(d);
      for (const auto& pv : need(wv, "pivots", value::array).items) {
        if (pv.kind != value::array || pv.items.size() != 2) throw bad("expected a pivot [\"row cell\", \"column cell\"]");
        w.pivot_rows.push_back(cell(k, pv.items[0]));
        w.pivot_columns.push_back(cell(col, pv.items[1]));
      }
      for (const auto& mv : need(wv, "minors", value::array).items) {
        if (mv.kind != value::object) throw bad("expected a minor object {\"rows\": [...], \"columns\": [...]}");
        minor_block b;
        for (const auto& x : need(mv, "rows", value::array).items) b.rows.push_back(cell(k, x));
        for (const auto& x : need(mv, "columns", value::array).items) b.columns.push_back(cell(col, x));
        w.minors.push_back(std::move(b));
      }
    }
  }
  return cert;
}

}  // namespace lacuna::io

// certificate_check FILE CERTIFICATE.json [SUB] — checks a certificate written by
// `lacuna homology --certificate` (also with --reduced or --relative SUB) or `lacuna
// cohomology --certificate` against the input file, without the homology engine: it
// includes the readers of lacuna/io/, the certificate reader, and the checker of
// lacuna/homology/certificate.hpp (boundaries of the complex, exact integers, one elimination
// modulo a prime per boundary map, exact determinants of the torsion witnesses' minors over Z;
// docs/certificates.md says what a valid certificate proves). Prints "valid" and the groups,
// or "invalid: " and the first failure. Exit status: 0 valid, 1 invalid, 2 for files that
// cannot be read (one line on standard error), 3 ("incomplete: ") for a certificate over Z
// without torsion witnesses (an older layout) that passes every other check: it proves the
// groups only up to a finite summand that may hold torsion left out.
// A certificate of relative homology (its "kind" is "relative") needs SUB, the subcomplex in
// FILE's format: its cells are found in FILE by name (a .facets simplex by its labels), and
// the checker verifies that they form a subcomplex (closed under faces) before checking the
// witnesses on the quotient C(FILE)/C(SUB).
#include <lacuna/homology/certificate.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/certificate_json.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/obj.hpp>
#include <lacuna/io/off.hpp>

#include <algorithm>
#include <cstdio>
#include <exception>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <string>
#include <vector>

namespace {

std::string extension(const std::string& file) {
  std::string e = std::filesystem::path(file).extension().string();
  std::transform(e.begin(), e.end(), e.begin(), [](unsigned char ch) { return static_cast<char>(std::tolower(ch)); });
  return e;
}

/// "Z" or "Z/2", from the certificate's "coefficients" key (read before the whole file is).
std::string coefficients_of(const std::string& cert_file) {
  std::ifstream in(cert_file, std::ios::binary);
  if (!in) throw std::runtime_error(cert_file + ": cannot be read");
  std::string head(4096, '\0');
  in.read(head.data(), static_cast<std::streamsize>(head.size()));
  head.resize(static_cast<std::size_t>(in.gcount()));
  const auto k = head.find("\"coefficients\"");
  if (k == std::string::npos) throw std::runtime_error(cert_file + ": no \"coefficients\" near the top");
  const auto a = head.find('"', head.find(':', k) + 1), b = head.find('"', a + 1);
  if (a == std::string::npos || b == std::string::npos) throw std::runtime_error(cert_file + ": malformed \"coefficients\"");
  return head.substr(a + 1, b - a - 1);
}

using marks_t = std::vector<std::vector<bool>>;

marks_t no_marks(int top, auto count) {
  marks_t m(static_cast<std::size_t>(std::max(top + 1, 0)));
  for (int k = 0; k <= top; ++k) m[static_cast<std::size_t>(k)].assign(count(k), false);
  return m;
}

/// The cells of SUB (a facet list) marked in X, each simplex found by its labels.
marks_t marks_in(const lacuna::simplicial_complex<std::string>& x, const lacuna::simplicial_complex<std::string>& a,
                 const std::string& sub) {
  marks_t m = no_marks(x.top_dimension(), [&](int k) { return x.cell_count(k); });
  for (int k = 0; k <= a.top_dimension(); ++k)
    for (std::size_t i = 0; i < a.cell_count(k); ++i) {
      std::vector<std::string> labels;
      for (auto v : a.vertices(k, i)) labels.push_back(a.label(v));
      const auto f = x.find_labels(labels);
      if (!f) throw std::runtime_error(sub + ": the simplex '" + a.cell_name(k, i) + "' is not a simplex of the complex");
      m[static_cast<std::size_t>(k)][*f] = true;
    }
  return m;
}

/// The cells of SUB (a cell list) marked in X, each found by its name and dimension.
marks_t marks_in(const lacuna::cell_list& x, const lacuna::cell_list& a, const std::string& sub) {
  marks_t m = no_marks(x.top_dimension(), [&](int k) { return x.cell_count(k); });
  for (int k = 0; k <= a.top_dimension(); ++k)
    for (std::size_t i = 0; i < a.cell_count(k); ++i) {
      const auto f = x.find(a.cell_name(k, i));
      if (!f || f->first != k)
        throw std::runtime_error(sub + ": the cell '" + a.cell_name(k, i) + "' is not a " + std::to_string(k) +
                                 "-cell of the complex");
      m[static_cast<std::size_t>(k)][f->second] = true;
    }
  return m;
}

template <class R, class C>
int check(const C& c, const std::string& cert_file, const marks_t* marks) {
  std::ifstream in(cert_file, std::ios::binary);
  if (!in) throw std::runtime_error(cert_file + ": cannot be read");
  std::string recorded;
  const auto cert = lacuna::io::read_certificate_json<R>(in, c, cert_file, &recorded);
  if (cert.kind == lacuna::certificate_kind::relative && !marks)
    throw std::runtime_error(cert_file + ": a certificate of relative homology is checked with its subcomplex: "
                             "certificate_check FILE CERTIFICATE.json SUB" +
                             (recorded.empty() ? std::string() : " (it was written for " + recorded + ")"));
  if (cert.kind != lacuna::certificate_kind::relative && marks)
    throw std::runtime_error(cert_file + ": SUB is given, but the certificate is not one of relative homology");
  const auto rep = marks ? lacuna::check_certificate(c, cert, *marks) : lacuna::check_certificate(c, cert);
  if (rep.torsion_unproved) {  // a certificate of an older lacuna: everything but K = 0 holds
    std::cout << "incomplete: " << rep.first_failure << "\n";
    return 3;
  }
  if (!rep.ok) {
    std::cout << "invalid: " << rep.first_failure << "\n";
    return 1;
  }
  std::cout << "valid (" << rep.checks << " checks)\n";
  const auto kind = cert.kind;
  for (const auto& g : cert.groups) {
    const std::string d = std::to_string(g.dimension);
    std::cout << (kind == lacuna::certificate_kind::cohomology ? "H^" + d
                  : kind == lacuna::certificate_kind::reduced  ? "H~_" + d
                  : kind == lacuna::certificate_kind::relative ? "H_" + d + "(X, A)"
                                                               : "H_" + d)
              << ": rank " << g.rank;
    if (!g.torsion.empty()) {
      std::cout << ", torsion";
      for (const auto& t : g.torsion) std::cout << ' ' << lacuna::io::detail::cert_json::coefficient_text(t);
    }
    std::cout << "\n";
  }
  return 0;
}

template <class C>
int check_any(const C& c, const std::string& co, const std::string& cert_file, const marks_t* marks = nullptr) {
  if (co == "Z") return check<lacuna::integer>(c, cert_file, marks);
  if (co == "Z/2") return check<lacuna::z2>(c, cert_file, marks);
  throw std::runtime_error(cert_file + ": certificates over " + co + " are not read (Z and Z/2 are)");
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 3 && argc != 4) {
    std::fprintf(stderr, "usage: certificate_check FILE CERTIFICATE.json [SUB]\n");
    return 2;
  }
  const std::string file = argv[1], cert = argv[2], sub = argc == 4 ? argv[3] : "";
  try {
    const std::string co = coefficients_of(cert);
    const std::string ext = extension(file);
    const std::filesystem::path path(file);
    if (!sub.empty() && extension(sub) != ext) {
      std::fprintf(stderr, "%s: SUB must be in the format of FILE (a %s file)\n", sub.c_str(), ext.c_str());
      return 2;
    }
    if (ext == ".cells") {
      const auto x = lacuna::io::read_cells(path);
      if (sub.empty()) return check_any(x, co, cert);
      const auto m = marks_in(x, lacuna::io::read_cells(std::filesystem::path(sub)), sub);
      return check_any(x, co, cert, &m);
    }
    if (ext == ".facets") {
      const auto x = lacuna::io::read_facets(path);
      if (sub.empty()) return check_any(x, co, cert);
      const auto m = marks_in(x, lacuna::io::read_facets(std::filesystem::path(sub)), sub);
      return check_any(x, co, cert, &m);
    }
    if (!sub.empty()) {
      std::fprintf(stderr, "%s: a subcomplex is read from .cells and .facets files only\n", sub.c_str());
      return 2;
    }
    if (ext == ".off") return check_any(lacuna::io::read_off(path), co, cert);
    if (ext == ".obj") return check_any(lacuna::io::read_obj(path), co, cert);
    if (ext == ".pbm" || ext == ".pgm") return check_any(lacuna::io::read_netpbm(path), co, cert);
    if (ext == ".nrrd") return check_any(lacuna::io::read_nrrd<3>(path), co, cert);
    std::fprintf(stderr, "%s: unknown file type '%s'\n", file.c_str(), ext.c_str());
    return 2;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "%s\n", e.what());
    return 2;
  }
}

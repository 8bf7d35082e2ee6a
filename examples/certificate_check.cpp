// certificate_check FILE CERTIFICATE.json — checks a certificate written by
// `lacuna homology --certificate` against the input file, without the homology engine: it
// includes the readers of lacuna/io/, the certificate reader, and the checker of
// lacuna/homology/certificate.hpp (boundaries of the complex, exact integers, one elimination
// modulo a prime per boundary map, exact determinants of the torsion witnesses' minors over Z;
// docs/certificates.md says what a valid certificate proves). Prints "valid" and the groups,
// or "invalid: " and the first failure. Exit status: 0 valid, 1 invalid, 2 for files that
// cannot be read (one line on standard error), 3 ("incomplete: ") for a certificate over Z
// without torsion witnesses (an older layout) that passes every other check: it proves the
// groups only up to a finite summand that may hold torsion left out.
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

template <class R, class C>
int check(const C& c, const std::string& cert_file) {
  std::ifstream in(cert_file, std::ios::binary);
  if (!in) throw std::runtime_error(cert_file + ": cannot be read");
  const auto cert = lacuna::io::read_certificate_json<R>(in, c, cert_file);
  const auto rep = lacuna::check_certificate(c, cert);
  if (rep.torsion_unproved) {  // a certificate of an older lacuna: everything but K = 0 holds
    std::cout << "incomplete: " << rep.first_failure << "\n";
    return 3;
  }
  if (!rep.ok) {
    std::cout << "invalid: " << rep.first_failure << "\n";
    return 1;
  }
  std::cout << "valid (" << rep.checks << " checks)\n";
  for (const auto& g : cert.groups) {
    std::cout << "H_" << g.dimension << ": rank " << g.rank;
    if (!g.torsion.empty()) {
      std::cout << ", torsion";
      for (const auto& t : g.torsion) std::cout << ' ' << lacuna::io::detail::cert_json::coefficient_text(t);
    }
    std::cout << "\n";
  }
  return 0;
}

template <class C>
int check_any(const C& c, const std::string& co, const std::string& cert_file) {
  if (co == "Z") return check<lacuna::integer>(c, cert_file);
  if (co == "Z/2") return check<lacuna::z2>(c, cert_file);
  throw std::runtime_error(cert_file + ": certificates over " + co + " are not read (Z and Z/2 are)");
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 3) {
    std::fprintf(stderr, "usage: certificate_check FILE CERTIFICATE.json\n");
    return 2;
  }
  const std::string file = argv[1], cert = argv[2];
  try {
    const std::string co = coefficients_of(cert);
    const std::string ext = extension(file);
    const std::filesystem::path path(file);
    if (ext == ".cells") return check_any(lacuna::io::read_cells(path), co, cert);
    if (ext == ".facets") return check_any(lacuna::io::read_facets(path), co, cert);
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

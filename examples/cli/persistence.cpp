// `lacuna persistence [OPTIONS] FILE`: persistent homology of a point cloud, a distance
// matrix, an image or volume, or a complex with values, as the Persistence section of the
// tool's contract fixes it (docs/persistence-cli.md): the options, their defaults, the JSON
// layout, the order of the pairs, values as the shortest decimal that reads back as the same
// double, and exit status 2 with one line on stderr for every bad input.
#include "persistence.hpp"
#include "options.hpp"
#include "persistence_report.hpp"

#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/persistence/persistence.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/persistence/values_filtration.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/io/distances.hpp>
#include <lacuna/io/links.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/persistence_svg.hpp>
#include <lacuna/io/points.hpp>
#include <lacuna/io/values.hpp>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <charconv>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <limits>
#include <new>
#include <stdexcept>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace lacuna_cli {

namespace {

/// The coefficients of a cocycle as text: residues 1..p-1 over Z/p; over Q the cocycle scaled
/// to coprime integers (a non-zero multiple of a representative cocycle is one too).
template <class R>
std::vector<std::string> coefficient_texts(const lacuna::rips_cochain<R>& z, std::uint64_t p) {
  std::vector<std::string> out;
  if constexpr (std::is_same_v<R, lacuna::rational>) {
    using big = boost::multiprecision::cpp_int;
    big l = 1;
    for (const auto& c : z.coefficients) {
      const big d = boost::multiprecision::denominator(c.value());
      l = l / boost::multiprecision::gcd(l, d) * d;
    }
    big g = 0;
    std::vector<big> nums;
    for (const auto& c : z.coefficients) {
      nums.push_back(boost::multiprecision::numerator(c.value()) * (l / boost::multiprecision::denominator(c.value())));
      g = boost::multiprecision::gcd(g, nums.back());
    }
    for (auto& n : nums) out.push_back((g == 0 ? n : n / g).str());
  } else if constexpr (std::is_same_v<R, lacuna::mod_p_dynamic>) {
    for (const auto& c : z.coefficients)
      out.push_back(std::to_string(c.is_bound() ? c.value() : lacuna::mod_p_dynamic(c.unbound_value(), p).value()));
  } else {
    for (const auto& c : z.coefficients) out.push_back(c == lacuna::one<R>() ? "1" : "0");
  }
  return out;
}

/// The persistence of f over the field of `ring_one`, diagrams 0..top, pairs of persistence zero
/// dropped, cut after `last` when given.
template <class F, class R, class V = lacuna::filtration_value_t<F>>
void compute(const F& f, long long top, const std::optional<V>& last, const run_context& context, const R& ring_one,
             persistence_outcome& out) {
  lacuna::persistence_options o{.max_dimension = static_cast<int>(top)};
  o.control.stop = context.stop;
  collect_up_to(lacuna::persistence<R>(f, o, lacuna::automatic_persistence{}, ring_one), last, top, out);
}

std::string extension_of(const std::string& file) {
  std::string ext = std::filesystem::path(file).extension().string();
  for (auto& ch : ext) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  return ext;
}

void check_input(const std::string& f) {
  if (!std::filesystem::exists(f)) throw usage_error(f + ": no such file");
  if (std::filesystem::is_directory(f)) throw usage_error(f + ": is a directory, not a file");
}

// ---- the inputs ---------------------------------------------------------------------------

/// The metric of a .distances file (a full or lower-triangular matrix) or of a .links file
/// (sparse: only the pairs listed).
lacuna::rips_metric read_distance_matrix(const std::string& file) {
  if (extension_of(file) == ".links") {
    const auto l = lacuna::io::read_links(std::filesystem::path(file));
    std::vector<lacuna::rips_metric::link> links;
    links.reserve(l.pairs.size());
    for (const auto& p : l.pairs) links.push_back({p.a, p.b, p.distance});
    return lacuna::rips_metric::from_links(l.points, links);  // the reader refused what this would
  }
  const auto d = lacuna::io::read_distances(std::filesystem::path(file));
  std::vector<double> full(d.size() * d.size());
  for (std::size_t i = 0; i < d.size(); ++i)
    for (std::size_t j = 0; j < d.size(); ++j) full[i * d.size() + j] = d(i, j);
  return lacuna::rips_metric::from_distances(d.size(), full);
}

/// The explicit Vietoris–Rips route (rips_filtration, every simplex built, then
/// lacuna::persistence) instead of the implicit one: the hidden flag --explicit-rips, kept to
/// check one route against the other on real files. Both print the same bytes.
bool explicit_rips_route = false;

void run_rips_explicit(const persistence_command::settings& s, const coefficients& field, const run_context& context,
                       persistence_outcome& out) {
  const std::string ext = extension_of(s.file);
  const long long top = s.max_dimension.value_or(1);
  lacuna::rips_options ro{.max_dimension = static_cast<int>(top + 1)};
  if (s.up_to) ro.threshold = parse_up_to(*s.up_to);
  ro.control = nullptr;
  out.filtration = "vietoris-rips";
  lacuna::rips_filtration f;
  if (ext == ".distances" || ext == ".links") {
    const auto m = read_distance_matrix(s.file);
    std::vector<double> full(m.size() * m.size());
    for (std::size_t i = 0; i < m.size(); ++i)
      for (std::size_t j = 0; j < m.size(); ++j) full[i * m.size() + j] = m.distance(i, j);
    // a pair a .links file does not list: longer than every edge kept (the threshold, or the
    // longest listed distance), and cut off by a threshold just below it
    double longest = 0;
    for (std::size_t i = 0; i < full.size(); ++i)
      if (std::isfinite(full[i])) longest = std::max(longest, full[i]);
    if (ext == ".links") {
      const double cut = ro.threshold ? std::min(*ro.threshold, longest) : longest;
      for (auto& x : full)
        if (!std::isfinite(x)) x = 2 * cut + 1;
      ro.threshold = cut;
    }
    f = lacuna::rips_filtration::from_distances(m.size(), full, ro);
  } else {
    const auto c = lacuna::io::read_points(std::filesystem::path(s.file));
    if (!c.empty()) f = lacuna::rips_filtration::from_points(c.coordinates, c.dimension, ro);
  }
  with_field(field, [&](const auto& ring_one) {
    compute(f, top, std::optional<double>{}, context, ring_one, out);
  });
}

/// Vietoris–Rips without building the complex (lacuna/persistence/implicit_rips.hpp): the same
/// pairs of positive persistence as the explicit route (the pairs of persistence zero, which
/// the tool drops, are not computed). With --up-to V the edges longer than V are left out, as
/// there; without it the enclosing radius cuts the filtration, which changes no pair the tool
/// prints (the explicit route, which keeps every edge, gives the same output).
void run_rips(const persistence_command::settings& s, const coefficients& field, const run_context& context,
              persistence_outcome& out) {
  if (explicit_rips_route) return run_rips_explicit(s, field, context, out);
  const std::string ext = extension_of(s.file);
  const long long top = s.max_dimension.value_or(1);
  lacuna::implicit_rips_options o{.max_dimension = static_cast<int>(top)};
  if (s.up_to) o.threshold = parse_up_to(*s.up_to);
  o.control.stop = context.stop;
  o.control.progress = context.progress;
  o.threads = 2;  // both cores; the result does not depend on it
  out.filtration = "vietoris-rips";
  lacuna::rips_metric m;
  if (ext == ".distances" || ext == ".links") {
    m = read_distance_matrix(s.file);
  } else {
    const auto c = lacuna::io::read_points(std::filesystem::path(s.file));
    if (!c.empty()) m = lacuna::rips_metric::from_points(c.coordinates, c.dimension);
  }
  with_field(field, [&](const auto& ring_one) {
    using R = std::remove_cvref_t<decltype(ring_one)>;
    if (!s.cycles) return collect(lacuna::implicit_rips_persistence<R>(m, o, ring_one), top, out);
    const auto r = lacuna::implicit_rips_persistence_with_cocycles<R>(m, o, ring_one);
    collect(r.persistence, top, out);
    out.has_cocycles = true;
    out.cocycles.assign(out.text.size(), {});
    for (std::size_t k = 0; k < r.cocycles.size() && k < out.cocycles.size(); ++k)
      for (const auto& z : r.cocycles[k]) {
        const auto coefficients = coefficient_texts(z, field.p);
        auto& terms = out.cocycles[k].emplace_back();
        for (std::size_t i = 0; i < z.size(); ++i) {
          cocycle_term t{coefficients[i], {}};
          for (std::uint32_t v : z.simplex(i)) t.points.push_back(v + 1);
          terms.push_back(std::move(t));
        }
      }
  });
}

/// The values of VALUES resolved against the complex, checked into a filtration; errors at the
/// lines of VALUES (or of FILE, for a cell with no value and no faces).
template <class C>
void run_values(const C& complex, lacuna::io::value_names kind, const persistence_command::settings& s,
                const coefficients& field, const run_context& context, persistence_outcome& out) {
  const auto list = lacuna::io::read_values(std::filesystem::path(s.values), {.names = kind});
  const auto resolved = lacuna::io::resolve_values(list, complex, s.file);
  const int dims = lacuna::top_dimension(complex) + 1;
  std::vector<std::vector<std::optional<double>>> partial(static_cast<std::size_t>(std::max(dims, 0)));
  std::vector<std::vector<std::size_t>> line(partial.size());
  for (int k = 0; k < dims; ++k) {
    partial[static_cast<std::size_t>(k)].resize(lacuna::cell_count(complex, k));
    line[static_cast<std::size_t>(k)].resize(lacuna::cell_count(complex, k), 0);
  }
  for (const auto& v : resolved) {
    partial[static_cast<std::size_t>(v.dimension)][v.index] = v.value;
    line[static_cast<std::size_t>(v.dimension)][v.index] = v.line;
  }
  using filtration_t = lacuna::values_filtration<C, double>;
  std::optional<filtration_t> f;
  try {
    f.emplace(filtration_t::from_partial_values(complex, partial));
  } catch (const lacuna::filtration_error& e) {
    const auto k = e.dimension();
    const auto i = e.index();
    if (k < 0 || k >= dims) throw;
    const std::string name = lacuna::cell_name(complex, k, i);
    const std::size_t at = line[static_cast<std::size_t>(k)][i];
    if (e.face_index() != lacuna::filtration_error::npos && at != 0) {
      // the library's message names the cell, its value, the face and the face's value
      std::string message = e.what();
      if (message.rfind("lacuna: ", 0) == 0) message.erase(0, 8);
      throw lacuna::parse_error(s.values, at, message);
    }
    if (at == 0 && e.face_index() == lacuna::filtration_error::npos) {
      std::ifstream in(s.file, std::ios::binary);
      const std::size_t file_line = lacuna::io::line_of_cell(in, kind, name);
      throw lacuna::parse_error(s.file, file_line,
                                "the cell '" + name + "' has no value in " + s.values + " and no faces to take one from");
    }
    throw;
  }
  const long long top = s.max_dimension.value_or(lacuna::top_dimension(complex));
  std::optional<double> last;
  if (s.up_to) last = parse_up_to(*s.up_to);
  out.filtration = "values";
  with_field(field, [&](const auto& ring_one) { compute(*f, top, last, context, ring_one, out); });
}

/// The sublevel (or superlevel) filtration of an image's or a volume's samples. --up-to V keeps
/// the cells entering at V or before in the filtration: samples <= V, or >= V with
/// --superlevel; the cut is made on the pairs, which is the persistence of the cut filtration.
template <std::size_t D>
void run_samples(const std::array<std::size_t, D>& extents, std::vector<std::int32_t> samples,
                 const persistence_command::settings& s, const coefficients& field, const run_context& context,
                 persistence_outcome& out) {
  const auto direction = s.superlevel ? lacuna::level_sets::superlevel : lacuna::level_sets::sublevel;
  const lacuna::cubical_filtration<D, std::int32_t> f(extents, std::move(samples), direction);
  const long long top = s.max_dimension.value_or(lacuna::top_dimension(f));
  out.filtration = s.superlevel ? "superlevel" : "sublevel";
  const sample_cut cut = cut_of_samples(s.up_to, s.superlevel);
  if (cut.nothing) return no_pairs(top, out);
  with_field(field, [&](const auto& ring_one) { compute(f, top, cut.last, context, ring_one, out); });
}

}  // namespace

persistence_command::persistence_command(CLI::App& app) {
  sub_ = app.add_subcommand("persistence", "persistent homology: diagrams of a filtration over a field");
  sub_->add_option("--coefficients", s_.coefficients, "Z/p for a prime p (default Z/2), or Q");
  sub_->add_option("--max-dimension", s_.max_dimension_text,
                   "diagrams of dimensions 0..D (default: 1 for point clouds and distance matrices, the top "
                   "dimension otherwise)")
      ->type_name("D");
  sub_->add_option("--up-to", s_.up_to, "keep only the cells entering at V or before (Vietoris-Rips: edges <= V)")
      ->type_name("V");
  sub_->add_option("--values", s_.values, ".facets and .cells: the value at which each listed cell enters")
      ->type_name("VALUES");
  sub_->add_flag("--superlevel", s_.superlevel, "images and volumes: the filtration runs from the largest value down");
  sub_->add_flag("--json", s_.json, "one JSON object");
  sub_->add_flag("--cycles", s_.cycles,
                 "point clouds and distance matrices: also a representative cocycle of each class (points numbered "
                 "from 1)");
  sub_->add_option("--diagram", s_.diagram, "also write the persistence diagram as SVG")->type_name("OUT.svg");
  sub_->add_option("--barcode", s_.barcode, "also write the barcode as SVG")->type_name("OUT.svg");
  sub_->add_flag_callback("--explicit-rips", [] { explicit_rips_route = true; },
                          "Vietoris-Rips: build every simplex (the explicit route), to check the implicit one")
      ->group("");
  sub_->add_flag("--quiet", s_.quiet, "no progress line on stderr");
  sub_->add_option("FILE", s_.file, "input: .points .csv .distances .links .pgm .nrrd, or .facets .cells with --values")
      ->required();
}

bool persistence_command::parsed() const { return sub_ && sub_->parsed(); }

int persistence_command::run(const run_context& context) const {
  settings s = s_;
  const auto one_line = [](std::string m) {
    for (auto& ch : m)
      if (static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f) ch = '?';
    return m;
  };
  try {
    const coefficients field = parse_coefficients(s.coefficients, coefficient_use::field);
    // The one number parser of the tool (options.hpp): decimal only, "010" is 10, "" refused.
    if (s.max_dimension_text)
      s.max_dimension = parse_number<long long>(*s.max_dimension_text, "--max-dimension", 0, max_dimension_limit);
    check_input(s.file);
    const std::string ext = extension_of(s.file);
    const bool cloud = ext == ".points" || ext == ".csv" || ext == ".distances" || ext == ".links";
    const bool complex = ext == ".facets" || ext == ".cells";
    const bool image = ext == ".pgm" || ext == ".nrrd";
    if (!cloud && !complex && !image)
      throw usage_error(s.file + ": unknown file type '" + ext +
                      "' for persistence (expected .points, .csv, .distances, .links, .pgm, .nrrd, or .facets or .cells "
                      "with --values)");
    if (complex && s.values.empty())
      throw usage_error("lacuna: persistence of " + s.file + " needs --values VALUES (the value at which each cell enters)");
    if (!complex && !s.values.empty())
      throw usage_error("lacuna: --values applies to .facets and .cells files, not to " + s.file);
    if (s.superlevel && !image)
      throw usage_error("lacuna: --superlevel applies to images and volumes (.pgm, .nrrd), not to " + s.file);
    if (s.cycles && !cloud)
      throw usage_error("lacuna: --cycles applies to point clouds and distance matrices (.points, .csv, .distances, .links), "
                      "not to " + s.file);
    if (s.cycles && explicit_rips_route)
      throw usage_error("lacuna: --cycles takes the cocycles of the implicit Vietoris-Rips route, not --explicit-rips");
    if (s.up_to) parse_up_to(*s.up_to);
    if (!s.values.empty()) check_input(s.values);
    persistence_outcome out;
    out.superlevel = s.superlevel;
    if (cloud) {
      run_rips(s, field, context, out);
    } else if (ext == ".facets") {
      const auto c = lacuna::io::read_facets(std::filesystem::path(s.file));
      run_values(c, lacuna::io::value_names::simplex, s, field, context, out);
    } else if (ext == ".cells") {
      const auto c = lacuna::io::read_cells(std::filesystem::path(s.file));
      run_values(c, lacuna::io::value_names::cell, s, field, context, out);
    } else if (ext == ".pgm") {
      auto [extents, samples] = lacuna::io::read_netpbm_samples(std::filesystem::path(s.file));
      run_samples<2>(extents, std::move(samples), s, field, context, out);
    } else {
      auto [extents, samples] = lacuna::io::read_nrrd_samples<3>(std::filesystem::path(s.file));
      run_samples<3>(extents, std::move(samples), s, field, context, out);
    }
    write_pictures(out, field, s.file, s.diagram, s.barcode);
    const std::string result = s.json ? persistence_json(out, field) : persistence_text(out, field, s.file);
    if (context.begin_output && !context.begin_output()) throw lacuna::computation_stopped();
    std::cout << result << std::flush;
    return 0;
  } catch (const lacuna::computation_stopped&) {
    return context.interrupted ? context.interrupted() : 130;
  } catch (const option_error& e) {
    std::cerr << one_line(e.what()) << "\n";
    return 2;
  } catch (const usage_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const lacuna::parse_error& e) {
    std::cerr << one_line(e.what()) << "\n";
  } catch (const std::bad_alloc&) {
    std::cerr << one_line(s.file + ": not enough memory for this input") << "\n";
  } catch (const std::exception& e) {
    std::cerr << one_line(s.file + ": " + e.what()) << "\n";
  }
  return 2;
}

}  // namespace lacuna_cli

// lacuna-mpi: `lacuna homology` and `lacuna persistence` on many MPI ranks (docs/cli-mpi.md).
// Started by mpirun / mpiexec; every rank runs this program with the same arguments.
// `lacuna-mpi homology` serves:
//   * a complex in pieces: .facets files dealt to the ranks (file i to rank i mod N), or one
//     pattern holding %r that every rank expands to its own file (piece-%r.facets);
//   * a NRRD volume (.nrrd), every rank reading only its slabs.
// `lacuna-mpi persistence` serves a NRRD volume (sublevel or superlevel filtration of its
// samples), every rank reading only its slabs (distributed/volume_persistence.hpp).
// The answer (text or --json) is the one the one-process subcommand prints for the whole input,
// printed by rank 0 alone, through the same report (examples/cli/homology_report.hpp,
// examples/cli/persistence_report.hpp). An error prints one line on every rank ("lacuna: rank R
// of N failed while PHASE: FILE:LINE: problem") and every rank exits with status 2.
#include <lacuna/distributed/complex_pieces.hpp>
#include <lacuna/distributed/volume_homology.hpp>
#include <lacuna/distributed/volume_persistence.hpp>

#include "../cli/homology_report.hpp"
#include "../cli/options.hpp"
#include "../cli/persistence_report.hpp"

#include <CLI/CLI.hpp>
#include <mpi.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <optional>
#include <string>
#include <vector>

namespace {

using lacuna_cli::coefficients;
using lacuna_cli::usage_error;

int rank_of(MPI_Comm comm) {
  int r = 0;
  MPI_Comm_rank(comm, &r);
  return r;
}
int size_of(MPI_Comm comm) {
  int n = 1;
  MPI_Comm_size(comm, &n);
  return n;
}

/// The union complex as the report sees it: its cell counts (the JSON "cells" and the Euler
/// characteristic). Generators are not offered, so no cell is ever named.
struct counted_cells {
  std::vector<std::uint64_t> cells;
  int top_dimension() const noexcept { return static_cast<int>(cells.size()) - 1; }
  std::size_t cell_count(int k) const noexcept {
    return k < 0 || k > top_dimension() ? 0 : static_cast<std::size_t>(cells[static_cast<std::size_t>(k)]);
  }
  std::string cell_name(int k, std::size_t i) const { return std::to_string(k) + ":" + std::to_string(i); }
};

bool ends_with(const std::string& s, const std::string& suffix) {
  return s.size() >= suffix.size() && s.compare(s.size() - suffix.size(), suffix.size(), suffix) == 0;
}

/// The .facets files this rank reads: FILE i goes to rank i mod N; a single FILE holding %r is
/// a pattern, %r replaced by the rank's number on every rank.
std::vector<std::filesystem::path> files_of_rank(const std::vector<std::string>& files, int rank, int size) {
  std::vector<std::filesystem::path> mine;
  if (files.size() == 1 && files[0].find("%r") != std::string::npos) {
    std::string f = files[0];
    for (std::size_t at = f.find("%r"); at != std::string::npos; at = f.find("%r", at))
      f.replace(at, 2, std::to_string(rank));
    mine.emplace_back(f);
    return mine;
  }
  for (std::size_t i = 0; i < files.size(); ++i)
    if (static_cast<int>(i % static_cast<std::size_t>(size)) == rank) mine.emplace_back(files[i]);
  return mine;
}

/// Computes and, on rank 0, prints the homology of the input over R.
template <class R>
void run(const lacuna_cli::run_options& o, const std::vector<std::string>& files, const R& ring_one) {
  MPI_Comm comm = MPI_COMM_WORLD;
  const int rank = rank_of(comm), size = size_of(comm);
  const lacuna::homology_options ho{.generators = false, .reduced = o.reduced, .keep_basis = false};
  counted_cells counts;
  lacuna::homology_result<R> h;
  if (files.size() == 1 && ends_with(files[0], ".nrrd")) {
    lacuna::distributed::volume_options vo{.threshold = o.threshold, .homology = ho};
    if (o.max_cells) vo.limits.max_cells = *o.max_cells;
    auto r = lacuna::distributed::volume_homology<R>(comm, files[0], vo, ring_one);
    h = std::move(r.result);
    counts.cells = std::move(r.cells);  // counted by the slabs, each cell once
    if (o.reduced && counts.cells.empty())  // as lacuna homology --reduced refuses it, on every rank
      throw usage_error(o.file + ": the complex is empty: its reduced homology is Z in dimension -1, which --reduced "
                                 "does not print");
  } else {
    lacuna::distributed::piece_options po;
    if (o.max_cells) po.read.max_cells = static_cast<std::size_t>(*o.max_cells);
    if (o.max_facet_vertices) po.read.max_facet_vertices = static_cast<std::size_t>(*o.max_facet_vertices);
    const auto piece = lacuna::distributed::read_piece(comm, files_of_rank(files, rank, size), po);
    // The reduced homology of the empty complex is refused as `lacuna homology --reduced` does,
    // on every rank alike (the union is empty when every piece is).
    int top = piece.top_dimension(), global_top = -1;
    MPI_Allreduce(&top, &global_top, 1, MPI_INT, MPI_MAX, comm);
    if (o.reduced && global_top < 0)
      throw usage_error(o.file + ": the complex is empty: its reduced homology is Z in dimension -1, which --reduced "
                                 "does not print");
    lacuna::distributed::pieces_residual residual;
    h = lacuna::distributed::pieces_homology<R>(comm, piece, ho, lacuna::sparse_elimination{}, ring_one, &residual);
    counts.cells = residual.cells;
  }
  if (rank != 0) return;
  std::string out;
  lacuna_cli::report(counts, h, o, out);
  if (std::fwrite(out.data(), 1, out.size(), stdout) != out.size() || std::fflush(stdout) != 0)
    throw std::runtime_error("cannot write the result to standard output");
}

/// What `lacuna-mpi persistence` was asked (the options of `lacuna persistence` it serves).
struct persistence_request {
  std::string file;
  lacuna_cli::coefficients co;
  std::optional<long long> max_dimension;
  std::optional<std::string> up_to;
  bool superlevel = false;
  bool json = false;
  std::string diagram, barcode;
};

/// Computes the persistence of the volume over the field of `ring_one` and, on rank 0, writes
/// the pictures and prints the report: the steps of `lacuna persistence FILE.nrrd` after its
/// reading (examples/cli/persistence.cpp, run_samples), on the diagrams of
/// distributed::volume_persistence, which are the one-process diagrams (the proof is in that
/// header's comment: a Morse complex under a matching of equal values, Mischaikow & Nanda 2013).
template <class R>
void run_persistence(const persistence_request& q, const R& ring_one) {
  MPI_Comm comm = MPI_COMM_WORLD;
  const int rank = rank_of(comm);
  // a volume has at least one voxel (NRRD sizes are positive): the one-process default top
  // dimension is that of the grid, 3; --max-dimension above 3 prints empty diagrams up to it
  const long long top = q.max_dimension.value_or(3);
  lacuna_cli::persistence_outcome out;
  out.superlevel = q.superlevel;
  out.filtration = q.superlevel ? "superlevel" : "sublevel";
  const lacuna_cli::sample_cut cut = lacuna_cli::cut_of_samples(q.up_to, q.superlevel);
  // computed even when no sample enters by V (an --up-to below every 32-bit value), so that a
  // bad file is refused as the one-process tool, which reads the samples first, refuses it
  const lacuna::distributed::volume_persistence_options po{
      .direction = q.superlevel ? lacuna::level_sets::superlevel : lacuna::level_sets::sublevel,
      .max_dimension = static_cast<int>(std::min<long long>(top, 3))};
  auto r = lacuna::distributed::volume_persistence<R>(comm, q.file, po, ring_one);
  if (cut.nothing)
    lacuna_cli::no_pairs(top, out);
  else if (r.has_result)
    lacuna_cli::collect_up_to(std::move(r.result), cut.last, top, out);
  // the pictures and the report, on rank 0; a failure there (a picture that cannot be
  // written) ends every rank with its one line
  lacuna::distributed::collective_phase(comm, "writing the result", [&] {
    if (rank != 0) return;
    lacuna_cli::write_pictures(out, q.co, q.file, q.diagram, q.barcode);
    const std::string text = q.json ? lacuna_cli::persistence_json(out, q.co) : lacuna_cli::persistence_text(out, q.co, q.file);
    if (std::fwrite(text.data(), 1, text.size(), stdout) != text.size() || std::fflush(stdout) != 0)
      throw std::runtime_error("cannot write the result to standard output");
  });
}

/// The one line of an error: control characters shown as '?'.
std::string one_line(std::string s) {
  for (auto& ch : s)
    if (static_cast<unsigned char>(ch) < 0x20 || ch == 0x7f) ch = '?';
  return s;
}

/// Prints the one line of an error on stderr in one write, line end included, so that the lines
/// of ranks that fail together are not cut into one another.
void print_error(const std::string& message) {
  const std::string line = one_line(message) + "\n";
  std::fwrite(line.data(), 1, line.size(), stderr);
  std::fflush(stderr);
}

int main_of_rank(int argc, char** argv) {
  CLI::App app{"lacuna-mpi: exact homology of a complex in pieces or of a volume, and persistence of a volume, on MPI "
               "ranks"};
  app.set_version_flag("--version", std::string("lacuna-mpi ") + LACUNA_VERSION, "print the version and exit");
  app.require_subcommand(1);
  lacuna_cli::run_options o;
  std::vector<std::string> files;
  std::string coefficient_text = "Z";
  std::optional<std::string> threshold, max_cells, max_facet;
  // options of `lacuna homology` not offered here: taken (and hidden from --help) so that they
  // are refused with a reason rather than as unknown
  bool generators = false, check = false;
  std::optional<std::string> relative, certificate, picture, max_memory, reduction;
  auto* hom = app.add_subcommand("homology", "homology groups (ranks and torsion) of the whole input");
  hom->add_option("--coefficients", coefficient_text, "Z (default), Q, or Z/p for a prime p");
  hom->add_flag("--json", o.json, "one JSON object (docs/formats.md), as lacuna homology --json");
  hom->add_flag("--quiet", o.quiet, "no progress on stderr (none is printed by lacuna-mpi)");
  hom->add_flag("--reduced", o.reduced, "reduced homology (of the augmented complex)");
  hom->add_option("--threshold", threshold, "volumes: foreground is a value >= T")->type_name("T");
  hom->add_option("--max-facet-vertices", max_facet, ".facets: refuse a line of more labels than this (default 20)")
      ->type_name("N");
  hom->add_option("--max-cells", max_cells, "refuse a piece or volume announcing more cells than this")->type_name("N");
  hom->add_flag("--generators", generators)->group("");
  hom->add_flag("--check", check)->group("");
  hom->add_option("--relative", relative)->group("");
  hom->add_option("--certificate", certificate)->group("");
  hom->add_option("--picture", picture)->group("");
  hom->add_option("--max-memory", max_memory)->group("");
  hom->add_option("--reduction", reduction)->group("");
  hom->add_option("FILE", files, "one .nrrd volume, or .facets pieces (FILE i read by rank i mod N; one FILE with %r: "
                                 "every rank reads its own, %r its rank)")
      ->required();
  // `lacuna persistence` for volumes (examples/cli/persistence.cpp registers the same options)
  persistence_request pq;
  std::string field_text = "Z/2";
  std::optional<std::string> max_dimension_text, values;
  std::vector<std::string> per_files;
  bool per_quiet = false, cycles = false;
  auto* per = app.add_subcommand("persistence", "persistence diagrams of a volume's sublevel (or superlevel) filtration");
  per->add_option("--coefficients", field_text, "Z/p for a prime p (default Z/2), or Q");
  per->add_option("--max-dimension", max_dimension_text, "diagrams of dimensions 0..D (default 3)")->type_name("D");
  per->add_option("--up-to", pq.up_to, "keep only the cells entering at V or before")->type_name("V");
  per->add_flag("--superlevel", pq.superlevel, "the filtration runs from the largest value down");
  per->add_flag("--json", pq.json, "one JSON object, as lacuna persistence --json");
  per->add_option("--diagram", pq.diagram, "also write the persistence diagram as SVG (rank 0)")->type_name("OUT.svg");
  per->add_option("--barcode", pq.barcode, "also write the barcode as SVG (rank 0)")->type_name("OUT.svg");
  per->add_flag("--quiet", per_quiet, "no progress on stderr (none is printed by lacuna-mpi)");
  per->add_option("--values", values)->group("");
  per->add_flag("--cycles", cycles)->group("");
  per->add_option("FILE", per_files, "one .nrrd volume")->required();
  try {
    try {
      app.parse(argc, argv);
    } catch (const CLI::CallForHelp&) {
      if (rank_of(MPI_COMM_WORLD) == 0) std::cout << app.help();
      return 0;
    } catch (const CLI::CallForAllHelp&) {
      if (rank_of(MPI_COMM_WORLD) == 0) std::cout << app.help("", CLI::AppFormatMode::All);
      return 0;
    } catch (const CLI::CallForVersion& e) {
      if (rank_of(MPI_COMM_WORLD) == 0) std::cout << e.what() << "\n";
      return 0;
    } catch (const CLI::ParseError& e) {
      std::string msg = e.what();
      if (auto nl = msg.find('\n'); nl != std::string::npos) msg = msg.substr(0, nl);
      throw usage_error("lacuna-mpi: " + msg + " (lacuna-mpi --help)");
    }
    const auto refuse = [](bool given, const char* option, const char* why) {
      if (given) throw usage_error(std::string("lacuna-mpi: ") + option + " is not offered by lacuna-mpi (" + why + ")");
    };
    if (per->parsed()) {
      refuse(values.has_value(), "--values", "it gives the values of .facets and .cells files, which lacuna-mpi "
                                             "persistence does not read; lacuna persistence --values");
      refuse(cycles, "--cycles", "it applies to point clouds and distance matrices; lacuna persistence --cycles");
      pq.co = lacuna_cli::parse_coefficients(field_text, lacuna_cli::coefficient_use::field);
      if (max_dimension_text)
        pq.max_dimension = lacuna_cli::parse_number<long long>(*max_dimension_text, "--max-dimension", 0,
                                                               lacuna_cli::max_dimension_limit);
      if (per_files.size() != 1)
        throw usage_error("lacuna-mpi: persistence reads one .nrrd volume, not " + std::to_string(per_files.size()) +
                          " files");
      pq.file = per_files[0];
      std::string ext = std::filesystem::path(pq.file).extension().string();
      for (auto& ch : ext) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
      if (ext != ".nrrd")
        throw usage_error("lacuna-mpi: " + pq.file + ": lacuna-mpi persistence reads .nrrd volumes only (lacuna "
                          "persistence reads the other formats)");
      if (pq.up_to) lacuna_cli::parse_up_to(*pq.up_to);
      lacuna_cli::with_field(pq.co, [&](const auto& ring_one) { run_persistence(pq, ring_one); });
      return 0;
    }
    refuse(generators, "--generators", "the ranks keep no maps back to the cells; lacuna homology --generators");
    refuse(check, "--check", "lacuna homology --check");
    refuse(relative.has_value(), "--relative", "lacuna homology --relative");
    refuse(certificate.has_value(), "--certificate", "lacuna homology --certificate");
    refuse(picture.has_value(), "--picture", "lacuna homology --picture");
    refuse(max_memory.has_value(), "--max-memory", "each rank takes the memory its part needs");
    refuse(reduction.has_value(), "--reduction", "the ranks reduce their own parts; the root's engine chooses its own");
    if (threshold) o.threshold = lacuna_cli::parse_number<std::int64_t>(*threshold, "--threshold");
    if (max_cells) o.max_cells = lacuna_cli::parse_number<std::uint64_t>(*max_cells, "--max-cells");
    if (max_facet) o.max_facet_vertices = lacuna_cli::parse_number<std::uint64_t>(*max_facet, "--max-facet-vertices");
    o.co = lacuna_cli::parse_coefficients(coefficient_text);
    const bool volume = files.size() == 1 && ends_with(files[0], ".nrrd");
    for (const auto& f : files)
      if (!ends_with(f, ".facets") && !(volume && ends_with(f, ".nrrd")))
        throw usage_error("lacuna-mpi: " + f + ": expected .facets pieces or one .nrrd volume");
    if (o.threshold && !volume) throw usage_error("lacuna-mpi: --threshold applies to volumes (.nrrd) only");
    for (std::size_t i = 0; i < files.size(); ++i) o.file += (i ? " " : "") + files[i];
    switch (o.co.k) {
      case coefficients::integers: run(o, files, lacuna::one<lacuna::integer>()); break;
      case coefficients::rationals: run(o, files, lacuna::one<lacuna::rational>()); break;
      case coefficients::mod_p:
        if (o.co.p == 2)
          run(o, files, lacuna::one<lacuna::z2>());
        else
          run(o, files, lacuna::mod_p_dynamic(1, o.co.p));
        break;
    }
    return 0;
  } catch (const lacuna::distributed::distributed_error& e) {
    print_error(e.what());
  } catch (const usage_error& e) {
    print_error(e.what());
  } catch (const lacuna_cli::option_error& e) {
    print_error(e.what());
  } catch (const std::exception& e) {
    print_error("lacuna-mpi: rank " + std::to_string(rank_of(MPI_COMM_WORLD)) + ": " + e.what());
  }
  return 2;
}

}  // namespace

int main(int argc, char** argv) {
  MPI_Init(&argc, &argv);
  const int status = main_of_rank(argc, argv);
  // Every rank ends the same way: the errors that reach here were met by every rank alike
  // (distributed_error, or a usage error of the arguments every rank parses).
  MPI_Finalize();
  return status;
}

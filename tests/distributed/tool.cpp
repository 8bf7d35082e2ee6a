// lacuna-mpi against lacuna: `mpiexec -np N lacuna-mpi homology ...` must print, for N = 1..4,
// exactly what `lacuna homology ...` prints for the whole input (the contract of docs/cli.md and
// docs/formats.md), and end every rank with status 2 and the same one-line error when a piece
// is malformed; a rank killed by a signal ends the whole run, never a hang.
// `lacuna-mpi persistence` must print exactly what `lacuna persistence` prints for the same
// volume and options (docs/persistence-cli.md), and its essential classes must be the Betti
// numbers of the filtration's last set, computed apart (Alexander duality and flood fills,
// tests/cubical/volume_support.hpp; the shapes' textbook groups).
//
// These cases start mpiexec themselves, each child in a clean environment (a process of an MPI
// job cannot start another job with the job's own variables set), so they run in the one-rank
// run of this file (distributed/tool/np1); the runs with more ranks skip them.
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/io/facets.hpp>

#include "cubical/volume_support.hpp"

#include <doctest/doctest.h>
#include <mpi.h>
#include <fcntl.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <array>
#include <chrono>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

extern char** environ;

namespace tool_test {

namespace fs = std::filesystem;

bool single_rank() {
  int n = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &n);
  return n == 1;
}

const std::string bin = LACUNA_BINARY_DIR;

/// A fresh directory for one test case's files.
fs::path scratch(const std::string& name) {
  const auto d = fs::temp_directory_path() / ("lacuna-tool-" + std::to_string(::getpid()) + "-" + name);
  fs::remove_all(d);
  fs::create_directories(d);
  return d;
}

std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// The environment of a child: PATH and what OpenMPI needs on this machine (as the ctest
/// tests of tests/CMakeLists.txt set), nothing of this process's MPI job.
std::vector<std::string> child_environment() {
  std::vector<std::string> env = {"OMPI_ALLOW_RUN_AS_ROOT=1", "OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1",
                                  "OMPI_MCA_btl=self,vader", "OMPI_MCA_btl_vader_single_copy_mechanism=none",
                                  "OMPI_MCA_rmaps_base_oversubscribe=1", "OMPI_MCA_plm=isolated",
                                  "OMPI_MCA_ras=simulator"};
  for (const char* v : {"PATH", "HOME", "TMPDIR"})
    if (const char* x = std::getenv(v)) env.push_back(std::string(v) + "=" + x);
  return env;
}

struct outcome {
  int status = -1;  // exit status, or 128 + signal
  std::string out, err;
  bool timed_out = false;
};

/// Starts argv with stdout and stderr to files in `dir`; returns the child's pid.
pid_t start(const std::vector<std::string>& argv, const fs::path& dir) {
  posix_spawn_file_actions_t fa;
  posix_spawn_file_actions_init(&fa);
  posix_spawn_file_actions_addopen(&fa, 1, (dir / "stdout").c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  posix_spawn_file_actions_addopen(&fa, 2, (dir / "stderr").c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  posix_spawnattr_t attr;
  posix_spawnattr_init(&attr);
  posix_spawnattr_setpgroup(&attr, 0);  // its own process group, to end it whole on a timeout
  posix_spawnattr_setflags(&attr, POSIX_SPAWN_SETPGROUP);
  std::vector<char*> a, e;
  for (const auto& s : argv) a.push_back(const_cast<char*>(s.c_str()));
  a.push_back(nullptr);
  const auto env = child_environment();
  for (const auto& s : env) e.push_back(const_cast<char*>(s.c_str()));
  e.push_back(nullptr);
  pid_t pid = -1;
  const int rc = posix_spawnp(&pid, a[0], &fa, &attr, a.data(), e.data());
  posix_spawn_file_actions_destroy(&fa);
  posix_spawnattr_destroy(&attr);
  REQUIRE(rc == 0);
  return pid;
}

/// Waits for pid at most `seconds` (then kills its process group and says so).
outcome finish(pid_t pid, const fs::path& dir, int seconds) {
  outcome o;
  const auto until = std::chrono::steady_clock::now() + std::chrono::seconds(seconds);
  int st = 0;
  for (;;) {
    const pid_t r = ::waitpid(pid, &st, WNOHANG);
    if (r == pid) break;
    if (std::chrono::steady_clock::now() > until) {
      o.timed_out = true;
      ::kill(-pid, SIGKILL);
      ::waitpid(pid, &st, 0);
      break;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
  }
  o.status = WIFEXITED(st) ? WEXITSTATUS(st) : 128 + WTERMSIG(st);
  o.out = slurp(dir / "stdout");
  o.err = slurp(dir / "stderr");
  return o;
}

outcome run(const std::vector<std::string>& argv, const fs::path& dir, int seconds = 300) {
  return finish(start(argv, dir), dir, seconds);
}

outcome one_process(std::vector<std::string> args, const fs::path& dir) {
  args.insert(args.begin(), bin + "/lacuna");
  return run(args, dir);
}

outcome on_ranks(int n, std::vector<std::string> args, const fs::path& dir) {
  args.insert(args.begin(), {"mpiexec", "--oversubscribe", "-np", std::to_string(n), bin + "/lacuna-mpi"});
  return run(args, dir);
}

using facet_list = std::vector<std::vector<std::string>>;

/// The textbook inputs: the 3 x 3 grid torus and Klein bottle (Hatcher, Algebraic Topology,
/// 2002, §2.1, subdivided; from memory), and the six-vertex projective plane
/// (tests/data/cli/rp2_6.facets).
facet_list grid_surface(bool twist, int n = 3) {
  const auto v = [&](int i, int j) {
    j = ((j % n) + n) % n;
    if (i == n) {
      i = 0;
      if (twist) j = (n - j) % n;
    }
    return "v" + std::to_string(n * i + j);
  };
  facet_list f;
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      f.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return f;
}

facet_list read_list(const fs::path& file) {
  const auto c = lacuna::io::read_facets(file);
  facet_list f;
  for (const auto& [k, i] : c.facets()) {
    std::vector<std::string> s;
    for (auto v : c.vertices(k, i)) s.push_back(c.label(v));
    f.push_back(s);
  }
  return f;
}

void write_list(const fs::path& file, const facet_list& f, std::size_t from = 0, std::size_t step = 1) {
  std::ofstream out(file);
  for (std::size_t i = from; i < f.size(); i += step) {
    for (std::size_t j = 0; j < f[i].size(); ++j) out << (j ? " " : "") << f[i][j];
    out << '\n';
  }
}

/// The whole list and three overlapping pieces (facet i in piece i mod 3, and every fourth
/// facet in piece 0 as well); returns the piece files.
std::vector<std::string> write_pieces(const fs::path& dir, const facet_list& f) {
  write_list(dir / "whole.facets", f);
  std::vector<std::string> files;
  for (int p = 0; p < 3; ++p) {
    facet_list mine;
    for (std::size_t i = 0; i < f.size(); ++i)
      if (static_cast<int>(i % 3) == p || (p == 0 && i % 4 == 0)) mine.push_back(f[i]);
    const auto file = dir / ("piece-" + std::to_string(p) + ".facets");
    write_list(file, mine);
    files.push_back(file.string());
  }
  return files;
}

TEST_CASE("lacuna-mpi homology: the same output as lacuna homology, on 1 to 4 ranks") {
  if (!single_rank()) return;
  const auto dir = scratch("same");
  const std::vector<std::pair<std::string, facet_list>> inputs = {
      {"torus", grid_surface(false)},
      {"klein", grid_surface(true)},
      {"rp2", read_list(fs::path(LACUNA_TEST_DATA_DIR) / "cli" / "rp2_6.facets")}};
  const std::vector<std::vector<std::string>> option_sets = {
      {"--json"}, {"--json", "--coefficients", "Z/2"}, {"--json", "--coefficients", "Q"}, {"--json", "--reduced"}, {}};
  for (const auto& [name, f] : inputs) {
    CAPTURE(name);
    const auto sub = dir / name;
    fs::create_directories(sub);
    const auto pieces = write_pieces(sub, f);
    for (const auto& opts : option_sets) {
      std::vector<std::string> args = {"homology"};
      args.insert(args.end(), opts.begin(), opts.end());
      auto whole = args;
      whole.push_back((sub / "whole.facets").string());
      const auto expected = one_process(whole, sub);
      REQUIRE(expected.status == 0);
      for (int n = 1; n <= 4; ++n) {
        CAPTURE(n);
        auto mpi = args;
        mpi.insert(mpi.end(), pieces.begin(), pieces.end());
        const auto got = on_ranks(n, mpi, sub);
        CHECK(got.status == 0);
        CAPTURE(got.err);
        if (opts.empty()) {
          // the text names the input: lacuna-mpi names the list of pieces
          std::string names;
          for (const auto& p : pieces) names += (names.empty() ? "" : " ") + p;
          auto want = expected.out;
          want.replace(want.find((sub / "whole.facets").string()), (sub / "whole.facets").string().size(), names);
          CHECK(got.out == want);
        } else {
          CHECK(got.out == expected.out);
        }
      }
    }
  }
  // a pattern: every rank reads piece-%r.facets (3 files, 3 ranks)
  const auto sub = dir / "torus";
  const auto expected = one_process({"homology", "--json", (sub / "whole.facets").string()}, sub);
  const auto got = on_ranks(3, {"homology", "--json", (sub / "piece-%r.facets").string()}, sub);
  CHECK(got.status == 0);
  CHECK(got.out == expected.out);
  fs::remove_all(dir);
}

TEST_CASE("lacuna-mpi homology: NRRD volumes, the same JSON as lacuna homology") {
  if (!single_rank()) return;
  const auto dir = scratch("volume");
  std::mt19937 rng(7);
  std::vector<fs::path> volumes = {fs::path(LACUNA_TEST_DATA_DIR) / "image" / "hollow.nrrd"};
  for (int v = 0; v < 3; ++v) {
    const int nx = 5 + v, ny = 4 + v, nz = 3 + 2 * v;  // nz = 3, 5, 7 layers: more ranks than layers at nz = 3
    const auto file = dir / ("random-" + std::to_string(v) + ".nrrd");
    std::ofstream out(file, std::ios::binary);
    out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: " << nx << " " << ny << " " << nz << "\nencoding: raw\n\n";
    std::bernoulli_distribution fg(0.55);
    for (int i = 0; i < nx * ny * nz; ++i) out.put(fg(rng) ? static_cast<char>(200) : static_cast<char>(0));
    volumes.push_back(file);
  }
  for (const auto& file : volumes) {
    CAPTURE(file.string());
    for (const char* co : {"Z", "Z/2"}) {
      const auto expected = one_process({"homology", "--json", "--coefficients", co, file.string()}, dir);
      REQUIRE(expected.status == 0);
      for (int n = 1; n <= 4; ++n) {
        CAPTURE(n);
        const auto got = on_ranks(n, {"homology", "--json", "--coefficients", co, file.string()}, dir);
        CAPTURE(got.err);
        CHECK(got.status == 0);
        CHECK(got.out == expected.out);
      }
    }
  }
  fs::remove_all(dir);
}

TEST_CASE("lacuna-mpi: a malformed piece ends every rank with status 2 and one line naming rank, file and line") {
  if (!single_rank()) return;
  const auto dir = scratch("bad");
  const auto pieces = write_pieces(dir, grid_surface(false));
  {
    std::ofstream out(pieces[1], std::ios::app);
    out << "x y x\n";  // a label repeated within one simplex
  }
  const auto got = on_ranks(3, {"homology", "--json", pieces[0], pieces[1], pieces[2]}, dir);
  CHECK(got.status == 2);
  CHECK(got.out.empty());
  // every rank prints the one line
  std::size_t count = 0, at = 0;
  const std::string prefix = "lacuna: rank 1 of 3 failed while reading its piece: " + pieces[1] + ":";
  while ((at = got.err.find(prefix, at)) != std::string::npos) {
    ++count;
    at += prefix.size();
  }
  CAPTURE(got.err);
  CHECK(count == 3);
  CHECK(got.err.find("is repeated within one simplex") != std::string::npos);
  fs::remove_all(dir);
}

// ---- persistence ----------------------------------------------------------------------------

/// A volume of 16-bit samples (axis 0 fastest), written as a raw little-endian NRRD file.
struct gray_volume {
  std::array<std::size_t, 3> n{};
  std::vector<std::uint16_t> samples;
  std::uint16_t& at(std::size_t x, std::size_t y, std::size_t z) { return samples[x + n[0] * (y + n[1] * z)]; }
};

void write_gray(const fs::path& file, const gray_volume& v) {
  std::ofstream out(file, std::ios::binary);
  out << "NRRD0004\ntype: uint16\ndimension: 3\nsizes: " << v.n[0] << " " << v.n[1] << " " << v.n[2]
      << "\nendian: little\nencoding: raw\n\n";
  for (std::uint16_t x : v.samples) {
    out.put(static_cast<char>(x & 0xff));
    out.put(static_cast<char>(x >> 8));
  }
}

/// Porous-like gray levels: white noise blurred (a box blur along each axis, twice) and
/// quantized to `levels` values, so that many cells tie and the sublevel sets have tunnels and
/// cavities.
gray_volume porous_gray(std::array<std::size_t, 3> n, unsigned levels, std::uint64_t seed) {
  std::mt19937_64 gen(seed);
  std::vector<double> f(n[0] * n[1] * n[2]);
  for (auto& x : f) x = std::uniform_real_distribution<double>(0, 1)(gen);
  for (int pass = 0; pass < 2; ++pass)
    for (std::size_t axis = 0; axis < 3; ++axis) {
      const std::size_t stride = axis == 0 ? 1 : axis == 1 ? n[0] : n[0] * n[1];
      std::vector<double> g(f.size());
      for (std::size_t i = 0; i < f.size(); ++i) {
        const std::size_t c = (i / stride) % n[axis];
        double sum = f[i];
        int m = 1;
        if (c > 0) sum += f[i - stride], ++m;
        if (c + 1 < n[axis]) sum += f[i + stride], ++m;
        g[i] = sum / m;
      }
      f = std::move(g);
    }
  const auto [lo, hi] = std::minmax_element(f.begin(), f.end());
  gray_volume v{n, std::vector<std::uint16_t>(f.size())};
  for (std::size_t i = 0; i < f.size(); ++i)
    v.samples[i] = static_cast<std::uint16_t>(std::min<double>(levels - 1, (f[i] - *lo) / (*hi - *lo + 1e-12) * levels));
  return v;
}

/// Samples given by a rule.
template <class F>
gray_volume shaped_gray(std::array<std::size_t, 3> n, F value) {
  gray_volume v{n, std::vector<std::uint16_t>(n[0] * n[1] * n[2])};
  for (std::size_t z = 0; z < n[2]; ++z)
    for (std::size_t y = 0; y < n[1]; ++y)
      for (std::size_t x = 0; x < n[0]; ++x) v.at(x, y, z) = value(x, y, z);
  return v;
}

/// The volumes of the persistence cases (name, samples, values t at which the Betti numbers of
/// the level set are checked).
struct persistence_case {
  std::string name;
  gray_volume v;
  std::vector<int> levels;
};

std::vector<persistence_case> persistence_cases() {
  std::vector<persistence_case> c;
  c.push_back({"porous", porous_gray({9, 8, 13}, 6, 1), {1, 2, 3, 4}});
  // a square ring of value 1 in the x-z plane, 4 elsewhere: every slab along z cuts its tunnel
  // (its sublevel set at 1 is a solid torus, (Z, Z, 0): Hatcher, Algebraic Topology, 2002, from memory)
  c.push_back({"tunnel", shaped_gray({8, 3, 10},
                                     [](std::size_t x, std::size_t y, std::size_t z) -> std::uint16_t {
                                       const bool square = x >= 1 && x <= 6 && z >= 1 && z <= 8 && y == 1;
                                       const bool hole = x >= 3 && x <= 4 && z >= 3 && z <= 6;
                                       return square && !hole ? 1 : 4;
                                     }),
               {1, 2, 4}});
  // a cube shell of value 1, 9 inside, 5 outside, cut through its void (the sublevel set at 1
  // is a 2-sphere thickened, (Z, 0, Z) by Alexander duality; at 5 the void is still there)
  c.push_back({"void", shaped_gray({7, 7, 9},
                                   [](std::size_t x, std::size_t y, std::size_t z) -> std::uint16_t {
                                     const bool outer = x >= 1 && x <= 5 && y >= 1 && y <= 5 && z >= 1 && z <= 7;
                                     const bool inner = x >= 2 && x <= 4 && y >= 2 && y <= 4 && z >= 2 && z <= 6;
                                     return outer && !inner ? 1 : inner ? 9 : 5;
                                   }),
               {1, 5, 9}});
  // every sample zero: one class, born at 0, never dies (the solid box is contractible)
  c.push_back({"constant", shaped_gray({4, 3, 5}, [](std::size_t, std::size_t, std::size_t) -> std::uint16_t { return 0; }),
               {0}});
  // two layers: runs on 3 and 4 ranks leave ranks without a slab
  c.push_back({"flat", porous_gray({6, 5, 2}, 5, 3), {1, 3}});
  return c;
}

/// The number of classes that never die, per dimension, of a `lacuna persistence --json` object
/// (one line per diagram: {"dimension": k, "pairs": [[b, d], ...]}).
std::vector<std::size_t> essential_counts(const std::string& json) {
  std::vector<std::size_t> out;
  std::istringstream in(json);
  for (std::string line; std::getline(in, line);) {
    if (line.find("{\"dimension\": ") == std::string::npos) continue;
    std::size_t n = 0;
    for (std::size_t at = line.find(", null]"); at != std::string::npos; at = line.find(", null]", at + 1)) ++n;
    out.push_back(n);
  }
  return out;
}

TEST_CASE("lacuna-mpi persistence: the same output as lacuna persistence, on 1 to 4 ranks, with pictures") {
  if (!single_rank()) return;
  const auto dir = scratch("persistence");
  const auto cases = persistence_cases();
  for (std::size_t ci = 0; ci < cases.size(); ++ci) {
    const auto& c = cases[ci];
    CAPTURE(c.name);
    const auto file = (dir / (c.name + ".nrrd")).string();
    write_gray(file, c.v);
    std::vector<std::vector<std::string>> option_sets;
    for (const char* field : {"Z/2", "Z/3", "Q"})
      for (const bool super : {false, true}) {
        std::vector<std::string> o = {"--coefficients", field};
        if (super) o.push_back("--superlevel");
        option_sets.push_back(o);
      }
    // the text report, the JSON object, and the cuts
    option_sets.push_back({"--json"});
    option_sets.push_back({"--json", "--superlevel", "--coefficients", "Q"});
    option_sets.push_back({"--max-dimension", "1"});
    option_sets.push_back({"--max-dimension", "5", "--json"});
    option_sets.push_back({"--up-to", std::to_string(c.levels.front()), "--coefficients", "Z/3"});
    option_sets.push_back({"--up-to", "2.5", "--superlevel", "--json"});
    option_sets.push_back({"--up-to", "-3000000000", "--json"});  // below every sample: nothing enters
    // the pictures: the same SVG files (written by rank 0), and the same report beside them
    {
      const auto pic = [&](const std::string& tag) {
        return std::vector<std::string>{"persistence", "--superlevel", "--diagram", (dir / ("d" + tag + ".svg")).string(),
                                        "--barcode", (dir / ("b" + tag + ".svg")).string(), file};
      };
      const auto one = one_process(pic("1"), dir);
      const auto got = on_ranks(3, pic("3"), dir);
      REQUIRE(one.status == 0);
      CHECK(got.status == 0);
      CHECK(got.out == one.out);
      CHECK(slurp(dir / "d1.svg").find("<svg") != std::string::npos);
      CHECK(slurp(dir / "d3.svg") == slurp(dir / "d1.svg"));
      CHECK(slurp(dir / "b3.svg") == slurp(dir / "b1.svg"));
    }
    // every other option set on each volume (so each set meets half of the volumes), on one
    // number of ranks, 1 to 4 taken in turn: a run of mpiexec costs about a second of start-up
    for (std::size_t i = 0; i < option_sets.size(); ++i) {
      if ((i + ci) % 2 != 0) continue;
      const auto& opts = option_sets[i];
      std::string given;
      for (const auto& o : opts) given += o + " ";
      CAPTURE(given);
      std::vector<std::string> args = {"persistence"};
      args.insert(args.end(), opts.begin(), opts.end());
      args.push_back(file);
      const auto expected = one_process(args, dir);
      REQUIRE(expected.status == 0);
      const int n = static_cast<int>(1 + ((i + ci) / 2) % 4);
      CAPTURE(n);
      const auto got = on_ranks(n, args, dir);
      CAPTURE(got.err);
      CHECK(got.status == 0);
      CHECK(got.out == expected.out);
    }
  }
  fs::remove_all(dir);
}

TEST_CASE("lacuna-mpi persistence: the essential classes are the Betti numbers of the last level set") {
  if (!single_rank()) return;
  const auto dir = scratch("persistence-truth");
  for (const auto& c : persistence_cases()) {
    CAPTURE(c.name);
    const auto file = (dir / (c.name + ".nrrd")).string();
    write_gray(file, c.v);
    // the whole filtration ends with the solid box: contractible, (Z, 0, 0, 0)
    for (const char* direction : {"--quiet", "--superlevel"}) {
      const auto got = on_ranks(3, {"persistence", "--json", direction, file}, dir);
      REQUIRE(got.status == 0);
      CHECK(essential_counts(got.out) == std::vector<std::size_t>{1, 0, 0, 0});
    }
    // cut at t: the persistence of the cut filtration, whose essential classes are the Betti
    // numbers of {sample <= t} (or {sample >= t} going down), computed by duality_betti
    for (int t : c.levels)
      for (const bool super : {false, true}) {
        CAPTURE(t);
        CAPTURE(super);
        lacuna_volumes::volume set{c.v.n, std::vector<std::uint8_t>(c.v.samples.size())};
        for (std::size_t i = 0; i < set.voxels.size(); ++i)
          set.voxels[i] = super ? c.v.samples[i] >= t : c.v.samples[i] <= t;
        const auto truth = lacuna_volumes::duality_betti(set);
        std::vector<std::string> args = {"persistence", "--json", "--coefficients", "Z/3", "--up-to", std::to_string(t)};
        if (super) args.push_back("--superlevel");
        args.push_back(file);
        const auto got = on_ranks(2 + t % 3, args, dir);
        REQUIRE(got.status == 0);
        const auto e = essential_counts(got.out);
        REQUIRE(e.size() == 4);
        CHECK(e[0] == truth.b0);
        CHECK(e[1] == truth.b1);
        CHECK(e[2] == truth.b2);
        CHECK(e[3] == 0);
      }
  }
  // the shapes' textbook groups at their first value: the solid torus (Z, Z, 0), the sphere (Z, 0, Z)
  const auto cases = persistence_cases();
  for (const auto& [index, want] : std::vector<std::pair<std::size_t, std::vector<std::size_t>>>{
           {1, {1, 1, 0, 0}}, {2, {1, 0, 1, 0}}}) {
    const auto got = on_ranks(4, {"persistence", "--json", "--up-to", "1", (dir / (cases[index].name + ".nrrd")).string()}, dir);
    CHECK(essential_counts(got.out) == want);
  }
  fs::remove_all(dir);
}

/// The number of times `line` appears in `text`.
std::size_t occurrences(const std::string& text, const std::string& line) {
  std::size_t count = 0;
  for (std::size_t at = text.find(line); at != std::string::npos; at = text.find(line, at + line.size())) ++count;
  return count;
}

TEST_CASE("lacuna-mpi persistence: refused options and bad files end every rank with status 2 and one line") {
  if (!single_rank()) return;
  const auto dir = scratch("persistence-errors");
  const auto file = (dir / "v.nrrd").string();
  write_gray(file, porous_gray({4, 4, 6}, 3, 5));
  const auto refused = [&](std::vector<std::string> args, const std::string& line) {
    CAPTURE(line);
    const auto got = on_ranks(3, args, dir);
    CHECK(got.status == 2);
    CHECK(got.out.empty());
    CAPTURE(got.err);
    CHECK(occurrences(got.err, line) == 3);  // every rank prints the one line
  };
  refused({"persistence", "--cycles", file}, "lacuna-mpi: --cycles is not offered by lacuna-mpi (");
  refused({"persistence", "--values", "v.values", file}, "lacuna-mpi: --values is not offered by lacuna-mpi (");
  refused({"persistence", "--coefficients", "Z", file}, "lacuna: --coefficients Z: persistence needs a field");
  refused({"persistence", "--coefficients", "Z/4", file}, "lacuna: --coefficients Z/4: 4 is not a prime\n");
  refused({"persistence", "--max-dimension", "-1", file}, "lacuna: --max-dimension '-1': must not be negative\n");
  refused({"persistence", "--up-to", "x", file}, "lacuna: --up-to 'x' is not a number");
  refused({"persistence", (dir / "c.facets").string()}, "lacuna-mpi persistence reads .nrrd volumes only");
  refused({"persistence", file, file}, "lacuna-mpi: persistence reads one .nrrd volume, not 2 files\n");
  // a picture that cannot be written: rank 0 fails, every rank says so
  refused({"persistence", "--diagram", (dir / "no" / "d.svg").string(), file},
          "lacuna: rank 0 of 3 failed while writing the result: " + (dir / "no" / "d.svg").string() +
              ": cannot write the file\n");
  // a file that does not exist, and a 16-bit volume without its byte order
  refused({"persistence", (dir / "none.nrrd").string()}, "lacuna: rank 0 of 3 failed while reading the volume header: ");
  {
    std::ofstream out(dir / "bad.nrrd", std::ios::binary);
    out << "NRRD0004\ntype: uint16\ndimension: 3\nsizes: 2 2 4\nencoding: raw\n\n";
  }
  refused({"persistence", (dir / "bad.nrrd").string()}, "lacuna: rank 0 of 3 failed while reading the volume header: ");
  // the same messages as lacuna persistence for the options both read
  for (const auto& args : std::vector<std::vector<std::string>>{{"persistence", "--coefficients", "Z", file},
                                                                {"persistence", "--coefficients", "Z/4", file},
                                                                {"persistence", "--up-to", "x", file}}) {
    const auto one = one_process(args, dir);
    const auto got = on_ranks(2, args, dir);
    CHECK(one.status == 2);
    CHECK(got.status == 2);
    CHECK(occurrences(got.err, one.err) == 2);
  }
  fs::remove_all(dir);
}

/// The processes whose parent is `parent` (from /proc).
std::vector<pid_t> children_of(pid_t parent) {
  std::vector<pid_t> out;
  for (const auto& e : fs::directory_iterator("/proc")) {
    const auto name = e.path().filename().string();
    if (name.find_first_not_of("0123456789") != std::string::npos) continue;
    std::ifstream stat(e.path() / "stat");
    std::string line;
    if (!std::getline(stat, line)) continue;
    const auto close = line.rfind(')');
    if (close == std::string::npos) continue;
    std::istringstream rest(line.substr(close + 2));
    char state = 0;
    pid_t ppid = 0;
    rest >> state >> ppid;
    if (ppid == parent) out.push_back(static_cast<pid_t>(std::stol(name)));
  }
  return out;
}

TEST_CASE("lacuna-mpi: a rank killed by SIGKILL ends the whole run with an error, never a hang") {
  if (!single_rank()) return;
  const auto dir = scratch("kill");
  // a large torus (a 600 x 600 grid, 720 000 triangles), in three pieces: seconds of work
  const auto pieces = write_pieces(dir, grid_surface(false, 600));
  const pid_t mpiexec = start({"mpiexec", "--oversubscribe", "-np", "3", bin + "/lacuna-mpi", "homology", "--json",
                               pieces[0], pieces[1], pieces[2]},
                              dir);
  // wait for the three ranks to exist, then kill one of them
  std::vector<pid_t> ranks;
  for (int tries = 0; tries < 400 && ranks.size() < 3; ++tries) {
    std::this_thread::sleep_for(std::chrono::milliseconds(25));
    ranks = children_of(mpiexec);
  }
  REQUIRE(ranks.size() == 3);
  std::this_thread::sleep_for(std::chrono::milliseconds(300));
  CHECK(::kill(ranks[1], SIGKILL) == 0);
  // bounded wait: the run must end by itself (120 s is far beyond what ending takes)
  const auto got = finish(mpiexec, dir, 120);
  CHECK_FALSE(got.timed_out);
  CHECK(got.status != 0);
  CHECK(got.out.empty());
  CAPTURE(got.err);
  CHECK_FALSE(got.err.empty());
  fs::remove_all(dir);
}

}  // namespace tool_test

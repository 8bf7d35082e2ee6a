// The memory budget of the tool (docs/cli.md, *Memory budget*) on the hostile volumes of
// issue 14, item 7: small files (a few KB to a MB) whose homology needs gigabytes. Each runs
// under `ulimit -v` through a shell; the tool must end with the right answer (status 0) or with
// the one-line refusal that names --max-memory (status 2, nothing on stdout) — never a crash,
// a signal, or partial output. Volumes are made here, in a temporary directory.
//
// Expected answers: a lattice of voxel tubes along the axes, every `step` voxels, is a
// thickening of the grid graph on its crossings (m^3 nodes, 3 (m-1) m^2 edges), so it is
// connected with H_1 of rank edges - nodes + 1 and nothing above (the cycle rank of a connected
// graph); an all-zero volume is the empty complex (docs/formats.md: cells and homology []).
#include "json_checks.hpp"
#include "run.hpp"

#include <cstdio>
#include <fstream>
#include <string>
#include <vector>

namespace cli_memory_budget_test {

using cli_test::temp_dir;

/// Writes a uint8 NRRD of n^3 voxels, voxel(x, y, z) from f, raw or through gzip -1.
template <class F>
std::string write_volume(const temp_dir& dir, const std::string& name, std::size_t n, bool gzip, F f) {
  const auto path = (dir.path() / name).string();
  {
    std::ofstream out(path, std::ios::binary);
    out << "NRRD0004\ntype: uint8\ndimension: 3\nsizes: " << n << ' ' << n << ' ' << n
        << "\nencoding: " << (gzip ? "gzip" : "raw") << "\n\n";
    if (!gzip) {
      std::string slice(n * n, '\0');
      for (std::size_t z = 0; z < n; ++z) {
        for (std::size_t y = 0; y < n; ++y)
          for (std::size_t x = 0; x < n; ++x) slice[y * n + x] = f(x, y, z) ? '\1' : '\0';
        out.write(slice.data(), static_cast<std::streamsize>(slice.size()));
      }
      return path;
    }
  }
  std::FILE* pipe = ::popen(("gzip -1 >> '" + path + "'").c_str(), "w");
  REQUIRE(pipe != nullptr);
  std::string slice(n * n, '\0');
  for (std::size_t z = 0; z < n; ++z) {
    for (std::size_t y = 0; y < n; ++y)
      for (std::size_t x = 0; x < n; ++x) slice[y * n + x] = f(x, y, z) ? '\1' : '\0';
    REQUIRE(std::fwrite(slice.data(), 1, slice.size(), pipe) == slice.size());
  }
  REQUIRE(::pclose(pipe) == 0);
  return path;
}

/// Runs the tool under ulimit -v `kib`.
inline cli_test::result run_limited(std::size_t kib, const std::vector<std::string>& args) {
  std::string cmd = "ulimit -v " + std::to_string(kib) + " && exec \"$0\"";
  for (std::size_t i = 0; i < args.size(); ++i) cmd += " \"$" + std::to_string(i + 1) + "\"";
  std::vector<std::string> argv{"-c", cmd, cli_test::tool().string()};
  argv.insert(argv.end(), args.begin(), args.end());
  return cli_test::run_program("/bin/sh", argv);
}

/// The run ended with a result (returned true) or with the budget's one-line refusal.
inline bool answered(const cli_test::result& r) {
  CAPTURE(r.err);
  CHECK((r.status == 0 || r.status == 2));  // not a signal, not an abort
  if (r.status == 0) return true;
  const auto line = cli_test::expect_error(r);
  CHECK(line.find("--max-memory raises the limit") != std::string::npos);
  return false;
}

inline bool on_lattice(std::size_t x, std::size_t y, std::size_t z, std::size_t step) {
  return (x % step == 0) + (y % step == 0) + (z % step == 0) >= 2;
}

}  // namespace cli_memory_budget_test

TEST_CASE("memory budget: an 800^3 block of ones in 0.5 MB of gzip is refused by its estimate") {
  using namespace cli_memory_budget_test;
  temp_dir dir;
  const auto ones = write_volume(dir, "ones800.nrrd", 800, true, [](auto, auto, auto) { return true; });
  // 3 GiB: the estimate (about 3.8 GB with what reading took) is above it; at once, by estimate
  const auto r = run_limited(std::size_t{3} << 20, {"homology", "--quiet", "--json", ones});
  const auto line = cli_test::expect_error(r);
  CHECK(line.rfind(ones + ": would need about ", 0) == 0);
  CHECK(line.find("--max-memory raises the limit") != std::string::npos);
  // --max-memory below the machine's quarter does the same without ulimit
  const auto r2 = cli_test::run({"homology", "--quiet", "--max-memory", "2G", ones});
  CHECK(cli_test::expect_error(r2).find("would need about") != std::string::npos);
}

TEST_CASE("memory budget: an all-zero 800^3 volume is the empty complex, within 3 GiB") {
  using namespace cli_memory_budget_test;
  temp_dir dir;
  const auto zeros = write_volume(dir, "zeros800.nrrd", 800, true, [](auto, auto, auto) { return false; });
  const auto r = run_limited(std::size_t{3} << 20, {"homology", "--quiet", "--json", zeros});
  REQUIRE(answered(r));
  const auto j = cli_test::parse_result(r);
  CHECK(j["cells"].empty());
  CHECK(j["homology"].empty());
}

TEST_CASE("memory budget: lattices, with and without generators, under 1 GiB") {
  using namespace cli_memory_budget_test;
  temp_dir dir;
  // 200^3, tubes every 4 voxels: 50^3 crossings, 3 * 49 * 50^2 edges
  const auto lattice =
      write_volume(dir, "lattice200.nrrd", 200, false, [](auto x, auto y, auto z) { return on_lattice(x, y, z, 4); });
  const std::uint64_t b1 = 3 * 49 * 50 * 50 - 50 * 50 * 50 + 1;  // the grid graph's cycle rank: 242501
  const std::vector<cli_test::group> want{{1, {}}, {b1, {}}, {0, {}}, {0, {}}};
  auto r = run_limited(std::size_t{1} << 20, {"homology", "--quiet", "--json", lattice});
  if (answered(r)) CHECK(cli_test::groups_of(cli_test::parse_result(r)) == want);
  // with generators (4.7 GB on the tool without a budget): the answer or the refusal
  r = run_limited(std::size_t{1} << 20, {"homology", "--quiet", "--json", "--generators", lattice});
  if (answered(r)) CHECK(cli_test::groups_of(cli_test::parse_result(r, true)) == want);
  // 800^3, tubes every 8 voxels, 0.9 MB of gzip: 100^3 crossings (3.2 GB without a budget)
  const auto big =
      write_volume(dir, "lattice800.nrrd", 800, true, [](auto x, auto y, auto z) { return on_lattice(x, y, z, 8); });
  r = run_limited(std::size_t{3} << 20, {"homology", "--quiet", "--json", big});
  if (answered(r))
    CHECK(cli_test::groups_of(cli_test::parse_result(r)) ==
          std::vector<cli_test::group>{{1, {}}, {3 * 99 * 100 * 100 - 100 * 100 * 100 + 1, {}}, {0, {}}, {0, {}}});
}

TEST_CASE("memory budget: a 100^3 checkerboard with generators (4 KB of gzip) under 1 GiB") {
  using namespace cli_memory_budget_test;
  temp_dir dir;
  const auto checker =
      write_volume(dir, "checker100.nrrd", 100, true, [](auto x, auto y, auto z) { return (x + y + z) % 2 == 1; });
  const auto r = run_limited(std::size_t{1} << 20, {"homology", "--quiet", "--json", "--generators", checker});
  if (answered(r)) (void)cli_test::parse_result(r, true);  // the layout, χ against the ranks
}

// fuzz/fuzz_cli.cpp — libFuzzer target: the command-line tool's argument parsing (CLI11
// options, --coefficients Z|Q|Z/p, --threshold, --max-cells, the file checks), with
// examples/cli/main.cpp compiled unchanged (its main renamed). The input is split at NUL
// and newline bytes into arguments after "lacuna".
// Findings: an exception escaping main, an exit status other than 0 and 2, an error that is
// not exactly one line on stderr (the contract of docs/formats.md, *Errors*), or a sanitizer report.
// Inputs naming an existing file or directory are skipped, so that the fuzzer never reads
// (or computes the homology of) whatever lies on the disk.
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <iostream>
#include <sstream>
#include <string>
#include <system_error>
#include <vector>

#define main lacuna_cli_main
#include LACUNA_CLI_MAIN
#undef main

#include <cstdio>
#include <cstdlib>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size > 4096) return -1;
  std::vector<std::string> args{"lacuna"};
  std::string cur;
  for (std::size_t i = 0; i <= size; ++i) {
    if (i == size || data[i] == 0 || data[i] == '\n') {
      args.push_back(cur);
      cur.clear();
      if (args.size() > 32) return -1;
    } else {
      cur.push_back(static_cast<char>(data[i]));
    }
  }
  for (std::size_t i = 1; i < args.size(); ++i) {
    std::error_code ec;
    if (!args[i].empty() && std::filesystem::exists(args[i], ec)) return -1;
  }
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);

  std::ostringstream out, err;
  auto* old_out = std::cout.rdbuf(out.rdbuf());
  auto* old_err = std::cerr.rdbuf(err.rdbuf());
  const int rc = lacuna_cli_main(static_cast<int>(args.size()), argv.data());
  std::cout.rdbuf(old_out);
  std::cerr.rdbuf(old_err);

  const std::string e = err.str();
  auto fail = [&](const char* what) {
    std::fprintf(stderr, "lacuna fuzz finding: %s (exit status %d, stderr: %s)\n", what, rc, e.c_str());
    std::abort();
  };
  if (rc != 0 && rc != 2) fail("exit status other than 0 and 2");
  if (rc == 2 && (e.empty() || e.back() != '\n' || e.find('\n') != e.size() - 1))
    fail("the error is not exactly one line");
  if (rc == 0 && !e.empty()) fail("success with a message on stderr");
  return 0;
}

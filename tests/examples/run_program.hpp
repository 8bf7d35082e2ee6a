// Runs a program that the build put in build/bin (LACUNA_BINARY_DIR) through the shell, for
// the tests of tests/examples/, and returns its exit status and what it printed.
#pragma once

#include <doctest/doctest.h>

#include <sys/wait.h>

#include <cstdio>
#include <string>

namespace examples_support {

struct run_result {
  int status = -1;   // the exit status, or -1 when the program did not exit normally
  std::string text;  // standard output, and standard error too when asked for
};

inline run_result run_program(const std::string& program_and_arguments, bool with_stderr) {
  std::string cmd = std::string(LACUNA_BINARY_DIR) + "/" + program_and_arguments;
  if (with_stderr) cmd += " 2>&1";
  run_result r;
  FILE* out = popen(cmd.c_str(), "r");
  REQUIRE(out != nullptr);
  char buf[4096];
  std::size_t n = 0;
  while ((n = std::fread(buf, 1, sizeof buf, out)) > 0) r.text.append(buf, n);
  const int raw = pclose(out);
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  return r;
}

}  // namespace examples_support

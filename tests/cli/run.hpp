// tests/cli/run.hpp — runs build/bin/lacuna as a subprocess for the tests in tests/cli/.
//
//   run({"homology", "--json", file})  -> {out, err, status}
//
// stdout and stderr are captured separately (both read through poll, so that neither pipe can
// fill up and block the tool); status is the exit status, or -N when signal N ended the tool.
// Also: a temporary directory that removes itself, a file writer, and the path of
// tests/data/cli/.
#pragma once

#include <doctest/doctest.h>
#include <fcntl.h>
#include <poll.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <csignal>
#include <cerrno>
#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <sstream>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

extern char** environ;

namespace cli_test {

inline std::filesystem::path tool() { return std::filesystem::path(LACUNA_BINARY_DIR) / "lacuna"; }
/// The standalone certificate checker (examples/certificate_check.cpp).
inline std::filesystem::path checker() { return std::filesystem::path(LACUNA_BINARY_DIR) / "certificate_check"; }
/// The bytes of a file the tool wrote (empty when it cannot be read).
inline std::string slurp(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  std::stringstream s;
  s << f.rdbuf();
  return s.str();
}
inline std::filesystem::path data(const std::string& name) {
  return std::filesystem::path(LACUNA_TEST_DATA_DIR) / "cli" / name;
}

struct result {
  std::string out;
  std::string err;
  int status = -1000;
  /// The lines of stderr (a final line without '\n' counts too).
  std::vector<std::string> err_lines() const {
    std::vector<std::string> lines;
    std::size_t start = 0;
    while (start < err.size()) {
      const auto nl = err.find('\n', start);
      if (nl == std::string::npos) {
        lines.push_back(err.substr(start));
        break;
      }
      lines.push_back(err.substr(start, nl - start));
      start = nl + 1;
    }
    return lines;
  }
};

/// A signal to send the tool once, `after_ms` milliseconds after it started.
struct send_signal {
  int signal;
  int after_ms;
};

/// Runs the tool with `args`. When `stderr_fd` is given, the tool's stderr is that descriptor
/// (a pseudo-terminal, say) and result::err stays empty. With `sig`, that signal is sent to
/// the tool once, at the time it names (if the tool is still running).
inline result run_program(const std::string& program, const std::vector<std::string>& args,
                          std::optional<int> stderr_fd = std::nullopt, std::optional<send_signal> sig = std::nullopt);
inline result run(const std::vector<std::string>& args, std::optional<int> stderr_fd = std::nullopt,
                  std::optional<send_signal> sig = std::nullopt) {
  if (!std::filesystem::exists(tool()))
    throw std::runtime_error(tool().string() + " does not exist: build the target lacuna_cli first");
  return run_program(tool().string(), args, stderr_fd, sig);
}

/// Runs `program` (a path) with `args`, as run() runs the tool (a shell that sets a ulimit, say).
inline result run_program(const std::string& program, const std::vector<std::string>& args,
                          std::optional<int> stderr_fd, std::optional<send_signal> sig) {
  int out_pipe[2], err_pipe[2];
  if (::pipe(out_pipe) != 0 || ::pipe(err_pipe) != 0) throw std::runtime_error("pipe failed");
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_adddup2(&actions, out_pipe[1], 1);
  posix_spawn_file_actions_adddup2(&actions, stderr_fd ? *stderr_fd : err_pipe[1], 2);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  for (int fd : {out_pipe[0], out_pipe[1], err_pipe[0], err_pipe[1]}) posix_spawn_file_actions_addclose(&actions, fd);
  std::vector<std::string> argv_text{program};
  argv_text.insert(argv_text.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (auto& a : argv_text) argv.push_back(a.data());
  argv.push_back(nullptr);
  pid_t pid = 0;
  const int rc = ::posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  ::close(out_pipe[1]);
  ::close(err_pipe[1]);
  if (rc != 0) {
    ::close(out_pipe[0]);
    ::close(err_pipe[0]);
    throw std::runtime_error("posix_spawn failed");
  }
  result r;
  pollfd fds[2] = {{out_pipe[0], POLLIN, 0}, {err_pipe[0], POLLIN, 0}};
  std::string* sinks[2] = {&r.out, &r.err};
  int open_count = 2;
  char buf[65536];
  const auto started = std::chrono::steady_clock::now();
  bool signalled = false;
  while (open_count > 0) {
    int timeout = -1;
    if (sig && !signalled) {
      const auto elapsed =
          std::chrono::duration_cast<std::chrono::milliseconds>(std::chrono::steady_clock::now() - started).count();
      if (elapsed >= sig->after_ms) {
        ::kill(pid, sig->signal);
        signalled = true;
      } else {
        timeout = static_cast<int>(sig->after_ms - elapsed);
      }
    }
    const int ready = ::poll(fds, 2, timeout);
    if (ready < 0) {
      if (errno == EINTR) continue;
      break;
    }
    if (ready == 0) continue;
    for (int i = 0; i < 2; ++i) {
      if (fds[i].fd < 0 || fds[i].revents == 0) continue;
      const ssize_t n = ::read(fds[i].fd, buf, sizeof buf);
      if (n > 0) {
        sinks[i]->append(buf, static_cast<std::size_t>(n));
      } else {
        ::close(fds[i].fd);
        fds[i].fd = -1;
        --open_count;
      }
    }
  }
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0 && errno == EINTR) {
  }
  r.status = WIFEXITED(status) ? WEXITSTATUS(status) : WIFSIGNALED(status) ? -WTERMSIG(status) : -1000;
  return r;
}

/// Everything a tool wrote to a pseudo-terminal, read from its master side after it exited.
inline std::string drain_terminal(int master) {
  std::string out;
  char buf[4096];
  for (;;) {
    pollfd p{master, POLLIN, 0};
    if (::poll(&p, 1, 200) <= 0) break;
    const ssize_t n = ::read(master, buf, sizeof buf);
    if (n <= 0) break;
    out.append(buf, static_cast<std::size_t>(n));
  }
  return out;
}

/// A fresh directory under the system's temporary directory, removed with its contents.
class temp_dir {
 public:
  temp_dir() {
    std::string pattern = (std::filesystem::temp_directory_path() / "lacuna-cli-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) throw std::runtime_error("mkdtemp failed");
    path_ = pattern;
  }
  ~temp_dir() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  temp_dir(const temp_dir&) = delete;
  temp_dir& operator=(const temp_dir&) = delete;
  const std::filesystem::path& path() const { return path_; }
  /// Writes `bytes` to the file `name` in this directory and returns its path as text.
  std::string write(const std::string& name, std::string_view bytes) const {
    const auto p = path_ / name;
    std::ofstream f(p, std::ios::binary);
    f.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    if (!f) throw std::runtime_error("cannot write " + p.string());
    return p.string();
  }

 private:
  std::filesystem::path path_;
};

/// Checks the error contract: status 2, nothing on stdout, exactly one line on stderr, and
/// returns that line.
inline std::string expect_error(const result& r) {
  CHECK(r.status == 2);
  CHECK(r.out.empty());
  const auto lines = r.err_lines();
  CHECK(lines.size() == 1);
  CHECK((!r.err.empty() && r.err.back() == '\n'));
  return lines.empty() ? std::string() : lines.front();
}

}  // namespace cli_test

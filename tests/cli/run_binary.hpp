#pragma once
// Runs the built bine binary as a child process (fork/exec, no shell), capturing stdout, stderr
// and how it ended, for the end-to-end tests.
#include <fcntl.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace bine::test {

struct RunResult {
  bool exited = false;  // false: killed by a signal
  int status = -1;      // exit status when exited, else the signal number
  std::string out;
  std::string err;
};

inline std::string slurp(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

/// A fresh folder under the system temp directory, removed with its contents on destruction.
class TempDir {
 public:
  TempDir() {
    std::string pattern = (std::filesystem::temp_directory_path() / "bine-test-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) std::abort();
    path_ = pattern;
  }
  ~TempDir() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

/// Runs BINE_BINARY with `args` (argv[1..]), with BINE_DATA unset so the source-tree data are used.
inline RunResult run_bine(const std::vector<std::string>& args) {
  static int counter = 0;
  const TempDir scratch;
  const auto out_path = scratch.path() / ("out" + std::to_string(counter));
  const auto err_path = scratch.path() / ("err" + std::to_string(counter++));
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int out = ::open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    const int err = ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    if (out < 0 || err < 0) ::_exit(127);
    ::dup2(out, STDOUT_FILENO);
    ::dup2(err, STDERR_FILENO);
    ::unsetenv("BINE_DATA");
    std::vector<char*> argv;
    std::string program = BINE_BINARY;
    argv.push_back(program.data());
    std::vector<std::string> copies(args);
    for (auto& arg : copies) argv.push_back(arg.data());
    argv.push_back(nullptr);
    ::execv(program.c_str(), argv.data());
    ::_exit(127);
  }
  RunResult result;
  int wait_status = 0;
  if (pid < 0 || ::waitpid(pid, &wait_status, 0) != pid) return result;
  result.exited = WIFEXITED(wait_status);
  result.status = result.exited ? WEXITSTATUS(wait_status) : WTERMSIG(wait_status);
  result.out = slurp(out_path);
  result.err = slurp(err_path);
  return result;
}

}  // namespace bine::test

#pragma once
// The one runner of child processes (fork/exec, no shell) in the tests: the built bine binary for
// the few tests that need a real process (the exit status its parent sees, whether it died of a
// signal, that the binary behaves as the in-process door run_in_process.hpp does), and the SciPy
// reference scripts.
#include <fcntl.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>

#include <string>
#include <string_view>
#include <vector>

#include "cli/temp_dir.hpp"

extern char** environ;

namespace bine::test {

/// How the child ended and what it wrote.
struct ProcessRun {
  bool exited = false;  // false: killed by a signal
  int status = -1;      // exit status when exited, else the signal number
  std::string out;
  std::string err;
};

/// Runs `path` with `args` (argv[1..]), with BINE_DATA unset so the source-tree data are used.
inline ProcessRun run_program(const std::string& path, const std::vector<std::string>& args) {
  const TempDir scratch;
  const auto out_path = scratch.path() / "out";
  const auto err_path = scratch.path() / "err";
  std::string program = path;
  std::vector<std::string> copies(args);
  std::vector<char*> argv{program.data()};
  for (auto& arg : copies) argv.push_back(arg.data());
  argv.push_back(nullptr);
  std::vector<char*> envp;  // this process's environment without BINE_DATA
  for (char** entry = environ; *entry != nullptr; ++entry)
    if (std::string_view(*entry).rfind("BINE_DATA=", 0) != 0) envp.push_back(*entry);
  envp.push_back(nullptr);
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int out = ::open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    const int err = ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    if (out < 0 || err < 0) ::_exit(127);
    ::dup2(out, STDOUT_FILENO);
    ::dup2(err, STDERR_FILENO);
    ::execve(program.c_str(), argv.data(), envp.data());
    ::_exit(127);
  }
  ProcessRun result;
  int wait_status = 0;
  if (pid < 0 || ::waitpid(pid, &wait_status, 0) != pid) return result;
  result.exited = WIFEXITED(wait_status);
  result.status = result.exited ? WEXITSTATUS(wait_status) : WTERMSIG(wait_status);
  result.out = slurp(out_path);
  result.err = slurp(err_path);
  return result;
}

/// Runs BINE_BINARY with `args`.
inline ProcessRun run_bine(const std::vector<std::string>& args) { return run_program(BINE_BINARY, args); }

}  // namespace bine::test

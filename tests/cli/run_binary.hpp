#pragma once
// The one runner of child processes (fork/exec, no shell) in the tests: the built bine binary for
// the few tests that need a real process (the exit status its parent sees, whether it died of a
// signal, that the binary behaves as the in-process door run_in_process.hpp does), and the SciPy
// reference scripts.
#include <fcntl.h>
#include <sys/resource.h>
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
  long peak_memory_kb = 0;  // the child's peak resident set (getrusage ru_maxrss, kB on Linux)
};

/// Where the child's stdout goes: captured in ProcessRun::out, /dev/full (every write fails with
/// ENOSPC), or closed (every write fails with EBADF).
enum class Stdout { captured, full_disk, closed };

/// What else a child gets: extra environment entries ("TZ=..."), replacing any of the same name,
/// and where its stdout goes.
struct ChildSetup {
  std::vector<std::string> env;
  Stdout out = Stdout::captured;
};

/// Runs `path` with `args` (argv[1..]), with BINE_DATA unset so the source-tree data are used.
inline ProcessRun run_program(const std::string& path, const std::vector<std::string>& args,
                              const ChildSetup& setup = {}) {
  const TempDir scratch;
  const auto out_path = scratch.path() / "out";
  const auto err_path = scratch.path() / "err";
  std::string program = path;
  std::vector<std::string> copies(args);
  std::vector<char*> argv{program.data()};
  for (auto& arg : copies) argv.push_back(arg.data());
  argv.push_back(nullptr);
  std::vector<char*> envp;  // this process's environment without BINE_DATA
  std::vector<std::string> extra(setup.env);
  auto replaced = [&](std::string_view entry) {
    for (const auto& mine : extra)
      if (entry.substr(0, entry.find('=') + 1) == std::string_view(mine).substr(0, mine.find('=') + 1)) return true;
    return false;
  };
  for (char** entry = environ; *entry != nullptr; ++entry)
    if (std::string_view(*entry).rfind("BINE_DATA=", 0) != 0 && !replaced(*entry)) envp.push_back(*entry);
  for (auto& entry : extra) envp.push_back(entry.data());
  envp.push_back(nullptr);
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int out = setup.out == Stdout::full_disk ? ::open("/dev/full", O_WRONLY)
                                                   : ::open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    const int err = ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    if (out < 0 || err < 0) ::_exit(127);
    ::dup2(out, STDOUT_FILENO);
    ::dup2(err, STDERR_FILENO);
    if (setup.out == Stdout::closed) ::close(STDOUT_FILENO);
    ::execve(program.c_str(), argv.data(), envp.data());
    ::_exit(127);
  }
  ProcessRun result;
  int wait_status = 0;
  struct rusage usage {};
  if (pid < 0 || ::wait4(pid, &wait_status, 0, &usage) != pid) return result;
  result.peak_memory_kb = usage.ru_maxrss;
  result.exited = WIFEXITED(wait_status);
  result.status = result.exited ? WEXITSTATUS(wait_status) : WTERMSIG(wait_status);
  result.out = slurp(out_path);
  result.err = slurp(err_path);
  return result;
}

/// Runs BINE_BINARY with `args`.
inline ProcessRun run_bine(const std::vector<std::string>& args, const ChildSetup& setup = {}) {
  return run_program(BINE_BINARY, args, setup);
}

}  // namespace bine::test

#pragma once
// Runs the built bine through the shell with the source-tree data and captures stdout, stderr and
// the exit status, for the end-to-end tests of ibu, age and rebalance.
#include <sys/wait.h>

#include <cstdlib>
#include <string>

#include "cli/run_binary.hpp"

namespace bine::test {

struct CommandOutput {
  int status = -1;
  std::string out;
  std::string err;
};

/// A fixture file under tests/fixtures.
inline std::string fixture(const std::string& name) { return std::string(BINE_TEST_DIR) + "/fixtures/" + name; }

/// Runs `bine --data <source data> ARGS` (ARGS already shell-quoted).
inline CommandOutput run_command(const std::string& args) {
  const TempDir dir;
  const std::string command = std::string("'") + BINE_BINARY + "' --data '" + BINE_SOURCE_DATA_DIR + "' " + args +
                              " >'" + (dir.path() / "out").string() + "' 2>'" + (dir.path() / "err").string() + "'";
  const int raw = std::system(command.c_str());
  CommandOutput result;
  result.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  result.out = slurp(dir.path() / "out");
  result.err = slurp(dir.path() / "err");
  return result;
}

}  // namespace bine::test

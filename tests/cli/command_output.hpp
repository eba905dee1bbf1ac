#pragma once
// Runs the built bine through the shell with the source-tree data and captures stdout, stderr and
// the exit status, for the end-to-end tests of ibu, age and rebalance.
#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace bine::test {

struct CommandOutput {
  int status = -1;
  std::string out;
  std::string err;
};

inline std::string read_all(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

/// A fixture file under tests/fixtures.
inline std::string fixture(const std::string& name) { return std::string(BINE_TEST_DIR) + "/fixtures/" + name; }

/// Runs `bine --data <source data> ARGS` (ARGS already shell-quoted).
inline CommandOutput run_command(const std::string& args) {
  std::string pattern = (std::filesystem::temp_directory_path() / "bine-h3-XXXXXX").string();
  if (::mkdtemp(pattern.data()) == nullptr) return {};
  const std::filesystem::path dir(pattern);
  const std::string command = std::string("'") + BINE_BINARY + "' --data '" + BINE_SOURCE_DATA_DIR + "' " + args +
                              " >'" + (dir / "out").string() + "' 2>'" + (dir / "err").string() + "'";
  const int raw = std::system(command.c_str());
  CommandOutput result;
  result.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  result.out = read_all(dir / "out");
  result.err = read_all(dir / "err");
  std::error_code ignored;
  std::filesystem::remove_all(dir, ignored);
  return result;
}

}  // namespace bine::test

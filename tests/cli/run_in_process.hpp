#pragma once
// The door every end-to-end test goes through: the whole command line run in-process by
// bine::cli::run, the same dispatcher main() calls, with stdout and stderr captured in strings.
// The shipped descriptor data are named with --data, so no result depends on BINE_DATA or the
// folder the tests run from. Tests that need a real process use run_binary.hpp instead.
#include <sstream>
#include <string>
#include <vector>

#include "cli/app.hpp"

namespace bine::test {

/// How one command line ended: its exit status and everything it wrote.
struct CliRun {
  int status = -1;
  std::string out;
  std::string err;
};

/// The argv a test's `args` become: "bine", then `--data <source-tree descriptor-data>` unless the
/// arguments name a data folder themselves, then `args`.
inline std::vector<std::string> cli_argv(const std::vector<std::string>& args) {
  std::vector<std::string> argv{"bine"};
  bool names_data = false;
  for (const auto& arg : args) names_data = names_data || arg == "--data" || arg.rfind("--data=", 0) == 0;
  if (!names_data) argv.insert(argv.end(), {"--data", BINE_SOURCE_DATA_DIR});
  argv.insert(argv.end(), args.begin(), args.end());
  return argv;
}

/// Runs `bine ARGS` in-process (ARGS are argv[1..], one word each, no shell quoting).
inline CliRun run_cli(const std::vector<std::string>& args) {
  std::vector<std::string> words = cli_argv(args);
  std::vector<char*> argv;
  for (auto& word : words) argv.push_back(word.data());
  argv.push_back(nullptr);
  std::ostringstream out;
  std::ostringstream err;
  CliRun run;
  run.status = bine::cli::run(static_cast<int>(words.size()), argv.data(), out, err);
  run.out = out.str();
  run.err = err.str();
  return run;
}

/// A fixture file under tests/fixtures.
inline std::string fixture(const std::string& name) { return std::string(BINE_TEST_DIR) + "/fixtures/" + name; }

/// A file under the shipped descriptor-data/examples.
inline std::string example(const std::string& name) { return std::string(BINE_SOURCE_DATA_DIR) + "/examples/" + name; }

}  // namespace bine::test

// Refactoring guard, not a check of correctness: tests/golden/demo-output.txt holds the text output
// of tools/demo captured before the CLI and blend engine were restructured (first line the demo
// banner, then one block per command, each starting with "$ bine ARGS"). This test runs every
// command of that file in-process from the repository root, where its relative paths point, and
// compares the output with the block byte for byte, so a restructuring that changes any output
// fails here. The expected text is the program's own earlier output, so it proves nothing about
// whether the numbers are right (the other tests do that). A deliberate change of output updates
// the file in the same commit (run tools/demo and copy its output over the file).
#include <doctest/doctest.h>

#include <filesystem>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;

constexpr std::string_view kPrompt = "$ bine ";

struct DemoBlock {
  std::string command;  // the line after "$ bine "
  std::string output;   // every byte the command printed
};

/// The blocks of the demo file. The demo prints a blank line before each prompt, which is not part
/// of the previous command's output.
std::vector<DemoBlock> demo_blocks(const std::string& text) {
  std::vector<DemoBlock> blocks;
  const std::string separator = "\n\n" + std::string(kPrompt);
  std::size_t at = text.find(separator);
  while (at != std::string::npos) {
    const std::size_t command_start = at + separator.size();
    const std::size_t command_end = text.find('\n', command_start);
    if (command_end == std::string::npos) break;
    const std::size_t next = text.find(separator, command_end);
    const std::size_t output_end = next == std::string::npos ? text.size() : next + 1;
    blocks.push_back({text.substr(command_start, command_end - command_start),
                      text.substr(command_end + 1, output_end - command_end - 1)});
    at = next;
  }
  return blocks;
}

/// Splits a demo command into words at spaces; a double-quoted word loses its quotes.
std::vector<std::string> words(const std::string& command) {
  std::vector<std::string> result;
  std::string word;
  bool quoted = false;
  bool in_word = false;
  for (const char c : command) {
    if (c == '"') {
      quoted = !quoted;
      in_word = true;
    } else if (c == ' ' && !quoted) {
      if (in_word) result.push_back(word);
      word.clear();
      in_word = false;
    } else {
      word += c;
      in_word = true;
    }
  }
  if (in_word) result.push_back(word);
  return result;
}

/// The first line where `actual` and `expected` differ, for the failure message.
std::string first_difference(const std::string& actual, const std::string& expected) {
  std::istringstream a(actual);
  std::istringstream e(expected);
  std::string line_a;
  std::string line_e;
  for (int line = 1;; ++line) {
    const bool more_a = static_cast<bool>(std::getline(a, line_a));
    const bool more_e = static_cast<bool>(std::getline(e, line_e));
    if (!more_a && !more_e) return "same lines; they differ in the final newline";
    if (!more_a || !more_e || line_a != line_e)
      return "line " + std::to_string(line) + ": expected \"" + (more_e ? line_e : "<end>") + "\", got \"" +
             (more_a ? line_a : "<end>") + "\"";
  }
}

/// Runs from the repository root while alive (the demo's paths are relative to it).
class InRepositoryRoot {
 public:
  InRepositoryRoot() : previous_(fs::current_path()) { fs::current_path(fs::path(BINE_TEST_DIR).parent_path()); }
  ~InRepositoryRoot() { fs::current_path(previous_); }
  InRepositoryRoot(const InRepositoryRoot&) = delete;
  InRepositoryRoot& operator=(const InRepositoryRoot&) = delete;

 private:
  fs::path previous_;
};

}  // namespace

TEST_CASE("the demo's output is byte for byte the output captured before the restructuring") {
  const std::string golden = bine::test::slurp(fs::path(BINE_TEST_DIR) / "golden" / "demo-output.txt");
  REQUIRE(golden.rfind("bine demo:", 0) == 0);
  const auto blocks = demo_blocks(golden);
  REQUIRE(blocks.size() >= 6);  // catalog, ibu, rebalance, two swaps, blend
  const InRepositoryRoot root;
  for (const auto& block : blocks) {
    INFO("$ bine " << block.command);
    const auto run = bine::test::run_cli(words(block.command));
    CHECK(run.status == 0);
    CHECK(run.err.empty());
    const bool same = run.out == block.output;
    CHECK_MESSAGE(same, first_difference(run.out, block.output));
  }
}

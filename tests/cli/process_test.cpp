// The built binary as a real process, through the one process runner (run_binary.hpp): it must
// end with the same exit status and print the same bytes as the in-process door the other
// end-to-end tests use, and the in-process door must not let anything escape to this process's
// own stdout or stderr (else in-process tests would miss output a brewer sees).
#include <doctest/doctest.h>
#include <fcntl.h>
#include <unistd.h>

#include <cstdio>
#include <iostream>
#include <string>
#include <vector>

#include "cli/run_binary.hpp"
#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::example;
using bine::test::run_bine;
using bine::test::run_cli;

TEST_CASE("the binary and the in-process door agree: --version, bad input (exit 2), infeasible (exit 3)") {
  const std::vector<std::vector<std::string>> command_lines{
      {"--version"},
      {"swap", "Tidewel"},  // a misspelt variety: bad input
      // 2 IBU is below what the kept 10-minute addition alone gives: infeasible.
      {"blend", "--target", "floral=4", "--recipe", example("pale-ale.json"), "--ibu", "2"},
  };
  const std::vector<int> expected_status{0, 2, 3};
  for (std::size_t i = 0; i < command_lines.size(); ++i) {
    const auto& args = command_lines[i];
    INFO("bine " << args.front() << " ...");
    const auto process = run_bine(args);
    const auto in_process = run_cli(args);
    REQUIRE(process.exited);  // not ended by a signal
    CHECK(process.status == expected_status[i]);
    CHECK(in_process.status == process.status);
    CHECK(in_process.out == process.out);
    CHECK(in_process.err == process.err);
  }
  // The version line carries the project version (CMakeLists.txt project(... VERSION ...)).
  CHECK(run_bine({"--version"}).out == std::string("bine ") + BINE_VERSION + "\n");
}

namespace {

/// Points file descriptors 1 and 2 at `path` while alive, then restores them.
class RedirectedStdStreams {
 public:
  explicit RedirectedStdStreams(const std::filesystem::path& path) {
    std::cout.flush();
    std::cerr.flush();
    std::fflush(nullptr);
    saved_out_ = ::dup(STDOUT_FILENO);
    saved_err_ = ::dup(STDERR_FILENO);
    const int file = ::open(path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    ::dup2(file, STDOUT_FILENO);
    ::dup2(file, STDERR_FILENO);
    ::close(file);
  }
  ~RedirectedStdStreams() {
    std::cout.flush();
    std::cerr.flush();
    std::fflush(nullptr);
    ::dup2(saved_out_, STDOUT_FILENO);
    ::dup2(saved_err_, STDERR_FILENO);
    ::close(saved_out_);
    ::close(saved_err_);
  }
  RedirectedStdStreams(const RedirectedStdStreams&) = delete;
  RedirectedStdStreams& operator=(const RedirectedStdStreams&) = delete;

 private:
  int saved_out_ = -1;
  int saved_err_ = -1;
};

}  // namespace

TEST_CASE("in-process runs write only to the captured streams, never to the process's stdout or stderr") {
  const bine::test::TempDir dir;
  const auto leaked = dir.path() / "leaked";
  std::vector<bine::test::CliRun> runs;
  {
    const RedirectedStdStreams redirect(leaked);
    runs.push_back(run_cli({"--timings", "ibu", example("pale-ale.json")}));  // text, cautions, timers
    runs.push_back(run_cli({"--help"}));
    runs.push_back(run_cli({"--version"}));
    runs.push_back(run_cli({"swap", "Tidewel"}));  // an error line
    runs.push_back(run_cli({"nosuchcommand"}));    // a parse error
  }
  CHECK(bine::test::slurp(leaked).empty());
  // Each run did write something, to the captured streams.
  for (const auto& run : runs) CHECK(!(run.out + run.err).empty());
  CHECK(runs[0].err.find("load data") != std::string::npos);  // --timings names the phase on err
}

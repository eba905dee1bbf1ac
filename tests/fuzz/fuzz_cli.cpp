// Fuzz target: the command line, run in-process through the same dispatcher as the bine binary.
// The input is split into arguments at NUL or newline bytes. Every run must end with status 0, 2
// or 3 (never 70, an internal error), and every line it prints to stderr must start with "bine: ".
//
// Safety: the target works in a scratch folder holding copies of the example files and the
// lexicon, and skips argument lists containing '/', so no run can read devices or write outside
// that folder. If a run changes the folder (a --write), the copies are restored before the next one.
#include <sys/stat.h>
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <sstream>
#include <string>
#include <vector>

#include "cli/app.hpp"
#include "fuzz_support.hpp"

namespace {

namespace fs = std::filesystem;

struct Scratch {
  fs::path dir;
  fs::file_time_type stamp;
};

Scratch& scratch() {
  static Scratch s;
  return s;
}

void fill_scratch() {
  const fs::path data = BINE_SOURCE_DATA_DIR;
  auto& s = scratch();
  for (const auto& entry : fs::directory_iterator(s.dir)) fs::remove_all(entry.path());
  for (const auto& entry : fs::directory_iterator(data / "examples"))
    fs::copy_file(entry.path(), s.dir / entry.path().filename());
  fs::copy_file(data / "catalog" / "demo.json", s.dir / "catalog.json");
  fs::copy_file(data / "lexicon.json", s.dir / "lexicon.json");
  s.stamp = fs::last_write_time(s.dir);
}

}  // namespace

extern "C" int LLVMFuzzerInitialize(int* /*argc*/, char*** /*argv*/) {
  std::string pattern = (fs::temp_directory_path() / "bine-fuzz-cli-XXXXXX").string();
  if (::mkdtemp(pattern.data()) == nullptr) std::abort();
  scratch().dir = pattern;
  fill_scratch();
  fs::current_path(scratch().dir);
  ::setenv("BINE_DATA", BINE_SOURCE_DATA_DIR, 1);
  ::setenv("OPENBLAS_NUM_THREADS", "1", 1);
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  std::vector<std::string> args{"bine"};
  std::string current;
  for (std::size_t i = 0; i < size; ++i) {
    const char c = static_cast<char>(data[i]);
    if (c == '\0' || c == '\n') {
      args.push_back(current);
      current.clear();
    } else {
      current += c;
    }
  }
  if (!current.empty()) args.push_back(current);
  if (args.size() > 24) return 0;
  for (const auto& arg : args)
    if (arg.find('/') != std::string::npos) return 0;

  std::vector<char*> argv;
  for (auto& arg : args) argv.push_back(arg.data());
  argv.push_back(nullptr);
  std::ostringstream out;
  std::ostringstream err;
  const int status = bine::cli::run(static_cast<int>(args.size()), argv.data(), out, err);
  bine::fuzz::require(status == 0 || status == bine::kExitBadInput || status == bine::kExitInfeasible);
  if (status != 0) {
    std::istringstream lines(err.str());
    std::string line;
    bool any = false;
    while (std::getline(lines, line)) {
      bine::fuzz::require(line.rfind("bine: ", 0) == 0);
      any = true;
    }
    bine::fuzz::require(any);
  }
  std::error_code ec;
  if (fs::last_write_time(scratch().dir, ec) != scratch().stamp) fill_scratch();
  return 0;
}

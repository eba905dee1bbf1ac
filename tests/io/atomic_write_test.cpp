// write_file_atomically: a process killed in the middle of writing must leave the old file intact
// (the new content goes to a temporary file in the same folder, which is renamed over the target
// only once complete and flushed).
#include <doctest/doctest.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <thread>

#include "io/file_io.hpp"
#include "model/errors.hpp"

namespace {

namespace fs = std::filesystem;

std::string read_bytes(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

struct Folder {
  Folder() {
    std::string pattern = (fs::temp_directory_path() / "bine-atomic-XXXXXX").string();
    REQUIRE(::mkdtemp(pattern.data()) != nullptr);
    path = pattern;
  }
  ~Folder() {
    std::error_code ec;
    fs::remove_all(path, ec);
  }
  fs::path path;
};

bool temp_file_exists(const fs::path& folder, const std::string& target_name) {
  for (const auto& entry : fs::directory_iterator(folder))
    if (entry.path().filename().string().rfind("." + target_name + ".", 0) == 0) return true;
  return false;
}

}  // namespace

TEST_CASE("a write killed midway leaves the old file byte for byte") {
  const Folder folder;
  const fs::path target = folder.path / "recipe.json";
  const std::string old_content = "{\"name\": \"the brewer's recipe before the write\"}\n";
  { std::ofstream(target, std::ios::binary) << old_content; }

  // 64 MB of new content: long enough to write that a kill lands mid-write.
  constexpr std::size_t kNewBytes = 64u * 1024u * 1024u;
  int killed_midway = 0;
  for (int attempt = 0; attempt < 5 && killed_midway < 2; ++attempt) {
    const pid_t child = ::fork();
    REQUIRE(child >= 0);
    if (child == 0) {
      const std::string content(kNewBytes, 'x');
      try {
        bine::write_file_atomically(target, content);
      } catch (...) {
        ::_exit(2);
      }
      ::_exit(0);
    }
    // Kill as soon as the temporary file appears (the child is then writing it).
    const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(20);
    while (!temp_file_exists(folder.path, "recipe.json") && std::chrono::steady_clock::now() < deadline)
      std::this_thread::sleep_for(std::chrono::microseconds(50));
    ::kill(child, SIGKILL);
    int status = 0;
    REQUIRE(::waitpid(child, &status, 0) == child);
    const std::string now = read_bytes(target);
    const bool complete_new = now == std::string(kNewBytes, 'x');
    // Whatever happened, the target is one of the two complete versions, never a part.
    CHECK((now == old_content || complete_new));
    if (WIFSIGNALED(status) && now == old_content) {
      // Killed while writing: the half-written temporary file is left beside the intact original.
      CHECK(temp_file_exists(folder.path, "recipe.json"));
      ++killed_midway;
    } else if (complete_new) {
      // The child won the race (a busy machine can delay the kill): start again from the old file.
      std::ofstream(target, std::ios::binary | std::ios::trunc) << old_content;
    }
    for (const auto& entry : fs::directory_iterator(folder.path))  // leftovers of the killed writer
      if (entry.path() != target) fs::remove(entry.path());
  }
  CHECK(killed_midway >= 1);
}

TEST_CASE("a completed write replaces the file exactly and leaves no temporary file") {
  const Folder folder;
  const fs::path target = folder.path / "stock.json";
  { std::ofstream(target, std::ios::binary) << "old"; }
  const std::string content = "{\"lots\": []}\n\xc3\xa9\n";  // includes a UTF-8 byte pair
  bine::write_file_atomically(target, content);
  CHECK(read_bytes(target) == content);
  CHECK(!temp_file_exists(folder.path, "stock.json"));
  int entries = 0;
  for ([[maybe_unused]] const auto& entry : fs::directory_iterator(folder.path)) ++entries;
  CHECK(entries == 1);
}

TEST_CASE("writing into a missing folder or onto a directory is bad input naming the file") {
  const Folder folder;
  const fs::path missing = folder.path / "no-such-folder" / "out.json";
  try {
    bine::write_file_atomically(missing, "x");
    FAIL("expected InputError");
  } catch (const bine::InputError& error) {
    CHECK(std::string(error.what()).find(missing.string()) == 0);
    CHECK(std::string(error.what()).find("does not exist") != std::string::npos);
  }
  fs::create_directory(folder.path / "a-folder");
  CHECK_THROWS_AS(bine::write_file_atomically(folder.path / "a-folder", "x"), bine::InputError);
  CHECK(fs::is_directory(folder.path / "a-folder"));
}

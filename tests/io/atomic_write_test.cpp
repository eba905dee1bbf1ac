// write_file_atomically: a process killed in the middle of writing must leave the old file intact
// (the new content goes to a temporary file in the same folder, which is renamed over the target
// only once complete and flushed).
#include <doctest/doctest.h>
#include <signal.h>
#include <sys/stat.h>
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

TEST_CASE("a write through a symlink replaces the link's target and keeps the link") {
  const Folder folder;
  fs::create_directory(folder.path / "recipes");
  const fs::path real = folder.path / "recipes" / "pale.json";
  { std::ofstream(real, std::ios::binary) << "old"; }
  const fs::path link = folder.path / "current.json";
  fs::create_symlink("recipes/pale.json", link);  // relative, as people make them
  bine::write_file_atomically(link, "new");
  CHECK(fs::is_symlink(fs::symlink_status(link)));
  CHECK(read_bytes(real) == "new");
  // The temporary file was made beside the target, and is gone.
  CHECK(!temp_file_exists(folder.path / "recipes", "pale.json"));
  CHECK(!temp_file_exists(folder.path, "current.json"));
}

TEST_CASE("a write keeps the old file's permission bits and a new file gets 0666 less the umask") {
  const Folder folder;
  const fs::path target = folder.path / "private.json";
  { std::ofstream(target, std::ios::binary) << "old"; }
  fs::permissions(target, fs::perms::owner_read | fs::perms::owner_write);  // 0600
  bine::write_file_atomically(target, "new");
  CHECK(fs::status(target).permissions() == (fs::perms::owner_read | fs::perms::owner_write));
  const mode_t mask = ::umask(022);
  const fs::path fresh = folder.path / "fresh.json";
  bine::write_file_atomically(fresh, "new");
  ::umask(mask);
  CHECK(static_cast<unsigned>(fs::status(fresh).permissions()) == 0644u);  // 0666 & ~022, POSIX creat
}

TEST_CASE("a write refuses an empty name and targets that are not regular files") {
  const Folder folder;
  CHECK_THROWS_WITH_AS(bine::write_file_atomically("", "x"), doctest::Contains("an empty output file name"),
                       bine::InputError);
  // /dev/null is a device (as /dev/stdout becomes once its links are followed): never replaced.
  CHECK_THROWS_WITH_AS(bine::write_file_atomically("/dev/null", "x"), doctest::Contains("is not a regular file"),
                       bine::InputError);
  CHECK(fs::is_character_file("/dev/null"));
  const fs::path pipe = folder.path / "pipe.json";
  REQUIRE(::mkfifo(pipe.c_str(), 0600) == 0);
  const fs::path link = folder.path / "link.json";
  fs::create_symlink(pipe, link);
  CHECK_THROWS_WITH_AS(bine::write_file_atomically(link, "x"), doctest::Contains("is not a regular file"),
                       bine::InputError);
  CHECK(fs::is_fifo(pipe));
  CHECK(fs::is_symlink(fs::symlink_status(link)));
}

TEST_CASE("a write replaces the file, so another hard link to it keeps the old content") {
  // The documented choice (README, Writes): rename gives the name a new inode, POSIX rename(2); the
  // other name still points at the old one.
  const Folder folder;
  const fs::path target = folder.path / "recipe.json";
  const fs::path other = folder.path / "recipe-copy.json";
  { std::ofstream(target, std::ios::binary) << "old"; }
  fs::create_hard_link(target, other);
  REQUIRE(fs::hard_link_count(target) == 2);
  bine::write_file_atomically(target, "new");
  CHECK(read_bytes(target) == "new");
  CHECK(read_bytes(other) == "old");
  CHECK(fs::hard_link_count(target) == 1);
  CHECK(fs::hard_link_count(other) == 1);
  CHECK(!temp_file_exists(folder.path, "recipe.json"));
}

TEST_CASE("SIGTERM, SIGINT or SIGHUP during a write removes the temporary file and leaves the old one") {
  const Folder folder;
  const fs::path target = folder.path / "recipe.json";
  const std::string old_content = "{\"name\": \"before\"}\n";
  constexpr std::size_t kNewBytes = 64u * 1024u * 1024u;
  const int signals[] = {SIGTERM, SIGINT, SIGHUP};
  int interrupted_by[3] = {0, 0, 0};
  const auto each_interrupted = [&] { return interrupted_by[0] > 0 && interrupted_by[1] > 0 && interrupted_by[2] > 0; };
  for (int attempt = 0; attempt < 9 && !each_interrupted(); ++attempt) {
    { std::ofstream(target, std::ios::binary | std::ios::trunc) << old_content; }
    const int signal_number = signals[attempt % 3];
    const pid_t child = ::fork();
    REQUIRE(child >= 0);
    if (child == 0) {
      // As in bine itself: the default actions (the test runner catches SIGTERM and SIGINT).
      ::signal(SIGTERM, SIG_DFL);
      ::signal(SIGINT, SIG_DFL);
      ::signal(SIGHUP, SIG_DFL);
      const std::string content(kNewBytes, 'x');
      try {
        bine::write_file_atomically(target, content);
      } catch (...) {
        ::_exit(2);
      }
      ::_exit(0);
    }
    const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(20);
    while (!temp_file_exists(folder.path, "recipe.json") && std::chrono::steady_clock::now() < deadline)
      std::this_thread::sleep_for(std::chrono::microseconds(50));
    ::kill(child, signal_number);
    int status = 0;
    REQUIRE(::waitpid(child, &status, 0) == child);
    const std::string now = read_bytes(target);
    CHECK((now == old_content || now == std::string(kNewBytes, 'x')));  // never a part
    if (WIFSIGNALED(status)) {
      // Ended by the signal as it would have been, after removing its temporary file.
      CHECK(WTERMSIG(status) == signal_number);
      if (now == old_content) ++interrupted_by[attempt % 3];  // else it was caught just after the rename
    }
    CHECK(!temp_file_exists(folder.path, "recipe.json"));
  }
  // Each signal caught a write at least once in its three attempts.
  CHECK(each_interrupted());
}

TEST_CASE("a file bine reads again is written up to the size bine reads and refused one byte past it") {
  // kMaxInputBytes is 32 x 1024 x 1024 = 33,554,432 bytes (hand arithmetic); the reader takes a
  // file of exactly that size, so the writer must too, and nothing larger.
  const Folder folder;
  const fs::path target = folder.path / "catalog.json";
  const std::string at_limit(33554432, ' ');
  bine::write_loadable_file(target, at_limit);
  CHECK(bine::read_text_file(target).size() == 33554432u);
  { std::ofstream(target, std::ios::binary | std::ios::trunc) << "old"; }
  CHECK_THROWS_WITH_AS(bine::write_loadable_file(target, at_limit + " "),
                       doctest::Contains("catalog.json would be a 33.6 MB file, larger than the 32 MB bine reads"),
                       bine::Infeasible);  // 33,554,433 / 10^6 = 33.55 MB, 33.6 to one decimal
  CHECK(read_bytes(target) == "old");
  CHECK(!temp_file_exists(folder.path, "catalog.json"));
}

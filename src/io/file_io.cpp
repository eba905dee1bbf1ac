#include "io/file_io.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <array>
#include <cerrno>
#include <csignal>
#include <cstring>

#include "model/errors.hpp"

namespace bine {

namespace {

// Closes a descriptor when the scope ends.
struct FdCloser {
  int fd;
  ~FdCloser() {
    if (fd >= 0) ::close(fd);
  }
};

std::string too_big(const std::string& name, double bytes) {
  return fmt::format("{}: file is {:.1f} MB, larger than the {} MB limit (is this the right file?)", name, bytes / 1e6,
                     kMaxInputBytes / (1024 * 1024));
}

}  // namespace

// Opened without blocking (a FIFO or a device would wait for a writer forever), then checked with
// fstat on the open descriptor, so what is read is what was checked. Symlinks are followed.
std::string read_text_file(const std::filesystem::path& path) {
  const std::string name = path.string();
  const int fd = ::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_CLOEXEC | O_NOCTTY);
  if (fd < 0) {
    if (errno == ENOENT || errno == ENOTDIR) throw InputError(name + ": file not found");
    throw InputError(fmt::format("{}: cannot be read ({})", name, std::strerror(errno)));
  }
  const FdCloser closer{fd};
  struct stat info {};
  if (::fstat(fd, &info) != 0) throw InputError(fmt::format("{}: cannot be read ({})", name, std::strerror(errno)));
  if (S_ISDIR(info.st_mode)) throw InputError(name + ": is a directory (expected a file)");
  if (!S_ISREG(info.st_mode))
    throw InputError(name + ": is not a regular file (a pipe, device or socket; expected a JSON file)");
  if (static_cast<std::uintmax_t>(info.st_size) > kMaxInputBytes)
    throw InputError(too_big(name, static_cast<double>(info.st_size)));
  std::string content;
  content.reserve(static_cast<std::size_t>(info.st_size));
  char buffer[1 << 16];
  for (;;) {
    const ssize_t n = ::read(fd, buffer, sizeof buffer);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) throw InputError(fmt::format("{}: cannot be read ({})", name, std::strerror(errno)));
    if (n == 0) break;
    content.append(buffer, static_cast<std::size_t>(n));
    if (content.size() > kMaxInputBytes) throw InputError(too_big(name, static_cast<double>(content.size())));
  }
  return content;
}

std::string read_file_head(const std::filesystem::path& path, std::size_t bytes) {
  const int fd = ::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_CLOEXEC | O_NOCTTY);
  if (fd < 0) return {};
  const FdCloser closer{fd};
  struct stat info {};
  if (::fstat(fd, &info) != 0 || !S_ISREG(info.st_mode)) return {};
  std::string head(bytes, '\0');
  std::size_t got = 0;
  while (got < bytes) {
    const ssize_t n = ::read(fd, head.data() + got, bytes - got);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) break;
    got += static_cast<std::size_t>(n);
  }
  head.resize(got);
  return head;
}

namespace {

// The temporary file being written, for the signal handler to remove. A fixed buffer and a flag,
// because a handler may only touch such state and call async-signal-safe functions (unlink, raise).
char g_temp_path[4096];
volatile std::sig_atomic_t g_temp_armed = 0;

extern "C" void remove_temp_and_reraise(int signal_number) {
  if (g_temp_armed != 0) ::unlink(g_temp_path);
  ::signal(signal_number, SIG_DFL);
  ::raise(signal_number);
}

// Removes the temporary file when SIGTERM, SIGINT or SIGHUP arrive while it exists (the signal then
// ends the process as it would have), and restores the previous handlers when the write is done.
class TempFileGuard {
 public:
  // Takes the mkstemp pattern; creates the file with mkstemp in place (so the handler knows its
  // name from the moment it exists) and returns the descriptor, or -1 with errno set.
  explicit TempFileGuard(const std::string& pattern) {
    if (pattern.size() >= sizeof g_temp_path) throw InputError(pattern + ": the file name is too long");
    pattern.copy(g_temp_path, pattern.size());
    g_temp_path[pattern.size()] = '\0';
    struct sigaction action {};
    action.sa_handler = remove_temp_and_reraise;
    sigemptyset(&action.sa_mask);
    // Only signals that would end bine anyway: one the caller ignores (nohup) stays ignored.
    for (std::size_t i = 0; i < kSignals.size(); ++i)
      if (::sigaction(kSignals[i], nullptr, &previous_[i]) == 0 && previous_[i].sa_handler == SIG_DFL)
        ::sigaction(kSignals[i], &action, nullptr);
    g_temp_armed = 1;
  }
  int create() { return ::mkstemp(g_temp_path); }
  std::string path() const { return g_temp_path; }
  ~TempFileGuard() {
    g_temp_armed = 0;
    for (std::size_t i = 0; i < kSignals.size(); ++i) ::sigaction(kSignals[i], &previous_[i], nullptr);
  }
  TempFileGuard(const TempFileGuard&) = delete;
  TempFileGuard& operator=(const TempFileGuard&) = delete;

 private:
  static constexpr std::array<int, 3> kSignals{SIGTERM, SIGINT, SIGHUP};
  std::array<struct sigaction, 3> previous_{};
};

// Where a write to `path` lands: symlinks are followed to their target (so a link stays a link and
// its target gets the new content), up to 40 links as the kernel does.
std::filesystem::path write_target(const std::filesystem::path& path) {
  namespace fs = std::filesystem;
  fs::path target = path;
  std::error_code ec;
  for (int links = 0; fs::is_symlink(fs::symlink_status(target, ec)); ++links) {
    if (links == 40) throw InputError(path.string() + ": too many symbolic links");
    const fs::path next = fs::read_symlink(target, ec);
    if (ec) throw InputError(fmt::format("{}: cannot follow the link ({})", path.string(), ec.message()));
    target = next.is_absolute() ? next : target.parent_path() / next;
  }
  return target;
}

// The permission bits the new file gets: the old file's when it exists, else 0666 less the umask,
// as for any newly created file.
mode_t new_file_mode(const struct stat* old) {
  if (old != nullptr) return old->st_mode & 07777;
  const mode_t mask = ::umask(0);
  ::umask(mask);
  return 0666 & ~mask;
}

// Checks the name and what is there now; fills `old` when a regular file will be replaced.
std::filesystem::path checked_target(const std::filesystem::path& path, struct stat& old, bool& exists) {
  const std::string name = path.string();
  if (name.empty()) throw InputError("an empty output file name (expected a file name such as out.json)");
  const std::filesystem::path target = write_target(path);
  exists = ::stat(target.c_str(), &old) == 0;
  if (exists && S_ISDIR(old.st_mode)) throw InputError(name + ": is a directory (expected a file name)");
  if (exists && !S_ISREG(old.st_mode))
    throw InputError(name + ": is not a regular file (a device, pipe or socket; bine writes only regular files)");
  std::filesystem::path folder = target.parent_path();
  if (folder.empty()) folder = ".";
  std::error_code ec;
  if (!std::filesystem::is_directory(folder, ec))
    throw InputError(fmt::format("{}: folder {} does not exist", name, folder.string()));
  return target;
}

}  // namespace

// The new content goes to a temporary file beside the target (the link's target for a symlink),
// which is flushed to disk and renamed over it, so a reader sees the old file or the new one, never
// a part. The old file's permission bits are kept; other hard links to it keep the old content.
void write_file_atomically(const std::filesystem::path& path, std::string_view content) {
  const std::string name = path.string();
  struct stat old {};
  bool exists = false;
  const std::filesystem::path target = checked_target(path, old, exists);
  std::filesystem::path folder = target.parent_path();
  if (folder.empty()) folder = ".";
  // Built piecewise: GCC 12 at -O3 warns falsely (-Wrestrict) on "." + std::string.
  std::string temp_name = ".";
  temp_name += target.filename().string();
  temp_name += ".XXXXXX";
  TempFileGuard guard((folder / temp_name).string());
  const int fd = guard.create();
  if (fd < 0) throw InputError(fmt::format("{}: cannot write in {} ({})", name, folder.string(), std::strerror(errno)));
  const std::string temp = guard.path();
  auto fail = [&](const char* what) {
    const int saved = errno;
    ::close(fd);
    ::unlink(temp.c_str());
    throw InputError(fmt::format("{}: {} failed ({})", name, what, std::strerror(saved)));
  };
  std::size_t written = 0;
  while (written < content.size()) {
    const ssize_t n = ::write(fd, content.data() + written, content.size() - written);
    if (n < 0) {
      if (errno == EINTR) continue;
      fail("writing");
    }
    written += static_cast<std::size_t>(n);
  }
  if (::fchmod(fd, new_file_mode(exists ? &old : nullptr)) != 0) fail("setting permissions");
  if (::fsync(fd) != 0) fail("flushing");
  if (::close(fd) != 0) {
    ::unlink(temp.c_str());
    throw InputError(fmt::format("{}: closing failed ({})", name, std::strerror(errno)));
  }
  if (::rename(temp.c_str(), target.c_str()) != 0) {
    const int saved = errno;
    ::unlink(temp.c_str());
    throw InputError(fmt::format("{}: cannot replace the file ({})", name, std::strerror(saved)));
  }
}

void check_readable_size(std::string_view content, const std::string& what) {
  if (content.size() <= kMaxInputBytes) return;
  throw Infeasible(fmt::format("{} would be a {:.1f} MB file, larger than the {} MB bine reads, so it is not written",
                               what, static_cast<double>(content.size()) / 1e6, kMaxInputBytes / (1024 * 1024)));
}

void write_loadable_file(const std::filesystem::path& path, std::string_view content) {
  check_readable_size(content, path.string());
  write_file_atomically(path, content);
}

}  // namespace bine

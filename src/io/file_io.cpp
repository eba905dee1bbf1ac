#include "io/file_io.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

#include "model/errors.hpp"

namespace bine {

std::string read_text_file(const std::filesystem::path& path) {
  const std::string name = path.string();
  std::error_code ec;
  const auto status = std::filesystem::status(path, ec);
  if (ec || !std::filesystem::exists(status)) throw InputError(name + ": file not found");
  if (std::filesystem::is_directory(status)) throw InputError(name + ": is a directory (expected a file)");
  const auto size = std::filesystem::file_size(path, ec);
  if (!ec && size > kMaxInputBytes)
    throw InputError(fmt::format("{}: file is {:.1f} MB, larger than the {} MB limit (is this the right file?)", name,
                                 static_cast<double>(size) / 1e6, kMaxInputBytes / (1024 * 1024)));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(fmt::format("{}: cannot be read ({})", name, std::strerror(errno)));
  std::string content;
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0) {
    content.append(buffer, static_cast<std::size_t>(in.gcount()));
    if (content.size() > kMaxInputBytes)
      throw InputError(fmt::format("{}: file is larger than the {} MB limit", name, kMaxInputBytes / (1024 * 1024)));
  }
  if (in.bad()) throw InputError(fmt::format("{}: cannot be read", name));
  return content;
}

void write_file_atomically(const std::filesystem::path& path, std::string_view content) {
  const std::string name = path.string();
  std::filesystem::path folder = path.parent_path();
  if (folder.empty()) folder = ".";
  std::error_code ec;
  if (!std::filesystem::is_directory(folder, ec))
    throw InputError(fmt::format("{}: folder {} does not exist", name, folder.string()));
  if (std::filesystem::is_directory(path, ec)) throw InputError(name + ": is a directory (expected a file name)");
  // Built piecewise: GCC 12 at -O3 warns falsely (-Wrestrict) on "." + std::string.
  std::string temp_name = ".";
  temp_name += path.filename().string();
  temp_name += ".XXXXXX";
  std::string temp = (folder / temp_name).string();
  const int fd = ::mkstemp(temp.data());
  if (fd < 0) throw InputError(fmt::format("{}: cannot write in {} ({})", name, folder.string(), std::strerror(errno)));
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
  if (::fchmod(fd, 0644) != 0) fail("setting permissions");
  if (::fsync(fd) != 0) fail("flushing");
  if (::close(fd) != 0) {
    ::unlink(temp.c_str());
    throw InputError(fmt::format("{}: closing failed ({})", name, std::strerror(errno)));
  }
  if (::rename(temp.c_str(), path.c_str()) != 0) {
    const int saved = errno;
    ::unlink(temp.c_str());
    throw InputError(fmt::format("{}: cannot replace the file ({})", name, std::strerror(saved)));
  }
}

}  // namespace bine

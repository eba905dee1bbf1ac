#pragma once
// Reading input files with clear errors, and writing output files atomically (temporary file in
// the same folder, flushed, fsync'd, renamed over the target), so a crash never leaves half a file.
#include <filesystem>
#include <string>
#include <string_view>

namespace bine {

/// Largest input file we read (bytes). Real catalogs and recipes are far smaller.
inline constexpr std::uintmax_t kMaxInputBytes = 32u * 1024u * 1024u;

/// Reads a whole text file. Throws InputError naming the file when it does not exist, is a
/// directory, cannot be read, or is larger than kMaxInputBytes.
std::string read_text_file(const std::filesystem::path& path);

/// Writes `content` to `path` atomically. Throws InputError naming the file when the folder does
/// not exist or cannot be written.
void write_file_atomically(const std::filesystem::path& path, std::string_view content);

}  // namespace bine

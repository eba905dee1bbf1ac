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

/// The first `bytes` bytes of a regular file (fewer if it is shorter), read without blocking; empty
/// when the file is missing or not a regular file (a pipe or device is never waited on).
std::string read_file_head(const std::filesystem::path& path, std::size_t bytes);

/// Writes `content` to `path` atomically. Throws InputError naming the file when the folder does
/// not exist or cannot be written.
void write_file_atomically(const std::filesystem::path& path, std::string_view content);

/// Throws Infeasible (exit 3), "WHAT would be a 79.3 MB file, larger than the 32 MB bine reads, so
/// it is not written", when `content` is larger than read_text_file reads.
void check_readable_size(std::string_view content, const std::string& what);

/// write_file_atomically for a file bine reads again (recipe, catalog, stock, brewhouse profile):
/// refused first by check_readable_size ("FILE would be ..."), so nothing, not even a temporary
/// file, is written that the loader would refuse.
void write_loadable_file(const std::filesystem::path& path, std::string_view content);

}  // namespace bine

#include "io/data_dir.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <exception>
#include <thread>

#include "io/compiled_catalog.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace bine {

std::filesystem::path resolve_data_dir(const DataFolderChoice& choice) {
  namespace fs = std::filesystem;
  std::error_code ec;
  auto usable = [&](const fs::path& dir) { return fs::is_regular_file(dir / "lexicon.json", ec); };
  if (!choice.folder.empty()) {
    if (!usable(choice.folder))
      throw InputError(choice.named_by + ": no lexicon.json in this folder (expected a descriptor-data folder)");
    return choice.folder;
  }
  const fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (!ec) {
    const fs::path installed = exe.parent_path().parent_path() / "share" / "bine" / "descriptor-data";
    if (usable(installed)) return installed;
  }
  const fs::path source = BINE_SOURCE_DATA_DIR;
  if (usable(source)) return source;
  throw InputError("no descriptor data found (use --data DIR or set BINE_DATA)");
}

std::vector<std::filesystem::path> shipped_catalog_files(const std::filesystem::path& data_dir) {
  std::vector<std::filesystem::path> files;
  std::error_code ec;
  for (const auto& entry : std::filesystem::directory_iterator(data_dir / "catalog", ec))
    if (entry.path().extension() == ".json") files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  return files;
}

std::vector<std::filesystem::path> chosen_catalog_files(const std::filesystem::path& data_dir,
                                                        const std::vector<std::string>& user_catalogs) {
  namespace fs = std::filesystem;
  const std::vector<fs::path> shipped = shipped_catalog_files(data_dir);
  if (user_catalogs.empty()) return shipped;
  std::vector<fs::path> files;
  for (const auto& given : user_catalogs) {
    const fs::path path(given);
    const auto named = std::find_if(shipped.begin(), shipped.end(), [&](const fs::path& file) {
      return !path.has_parent_path() && !path.has_extension() && file.stem() == path;
    });
    files.push_back(named != shipped.end() ? *named : path);
  }
  return files;
}

bool is_shipped_catalog(const std::filesystem::path& data_dir, const std::filesystem::path& file) {
  const auto shipped = shipped_catalog_files(data_dir);
  return std::find(shipped.begin(), shipped.end(), file) != shipped.end();
}

CatalogSource catalog_source(const std::filesystem::path& data_dir, const std::filesystem::path& file,
                             const Catalog& loaded) {
  return {loaded.names.empty() ? file.stem().string() : loaded.names.front(),
          is_shipped_catalog(data_dir, file) ? "shipped " + file.filename().string() : file.string(), loaded.demo};
}

namespace {

/// Loads the files in parallel (one thread per core at most, files taken in turn), each catalog in
/// its place; the first file in order that fails throws its error, as a load one by one would.
std::vector<Catalog> load_catalogs(const std::vector<std::filesystem::path>& files, const Lexicon& lexicon) {
  std::vector<Catalog> catalogs(files.size());
  std::vector<std::exception_ptr> errors(files.size());
  std::atomic<std::size_t> next{0};
  const auto work = [&] {
    for (std::size_t i = next++; i < files.size(); i = next++) {
      try {
        catalogs[i] = load_catalog(files[i], lexicon);
      } catch (...) {
        errors[i] = std::current_exception();
      }
    }
  };
  const std::size_t cores = std::max(1u, std::thread::hardware_concurrency());
  std::vector<std::thread> helpers;
  for (std::size_t t = 1; t < std::min(cores, files.size()); ++t) helpers.emplace_back(work);
  work();
  for (auto& helper : helpers) helper.join();
  for (const auto& error : errors)
    if (error) std::rethrow_exception(error);
  return catalogs;
}

}  // namespace

DataSet load_data(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs) {
  namespace fs = std::filesystem;
  DataSet data;
  data.data_dir = resolve_data_dir(choice);
  data.lexicon = load_lexicon(data.data_dir / "lexicon.json");
  const std::vector<fs::path> files = chosen_catalog_files(data.data_dir, user_catalogs);
  if (std::any_of(files.begin(), files.end(), [](const fs::path& file) { return is_compiled_catalog(file); })) {
    data.catalog = load_catalogs_with_compiled(data.data_dir, data.lexicon, files, data.notes, data.sources);
    return data;
  }
  const std::vector<Catalog> catalogs = load_catalogs(files, data.lexicon);
  for (std::size_t i = 0; i < files.size(); ++i)
    data.sources.push_back(catalog_source(data.data_dir, files[i], catalogs[i]));
  data.catalog = merge_catalogs(catalogs);
  return data;
}

std::string catalogs_used_line(const DataSet& data) {
  std::string line = "Catalogs used: ";
  for (std::size_t i = 0; i < data.sources.size(); ++i) {
    const CatalogSource& source = data.sources[i];
    line += fmt::format("{}{} ({}{})", i == 0 ? "" : "; ", source.name, source.file,
                        source.demo ? "; invented demo data, not real varieties: load your own with --catalog FILE "
                                      "for brewing"
                                    : "");
  }
  if (data.sources.empty()) line += "none";
  return line + ".";
}

}  // namespace bine

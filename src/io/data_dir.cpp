#include "io/data_dir.hpp"

#include <algorithm>

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

DataSet load_data(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs) {
  namespace fs = std::filesystem;
  DataSet data;
  data.data_dir = resolve_data_dir(choice);
  data.lexicon = load_lexicon(data.data_dir / "lexicon.json");
  if (std::any_of(user_catalogs.begin(), user_catalogs.end(),
                  [](const std::string& file) { return is_compiled_catalog(file); })) {
    data.catalog = load_catalogs_with_compiled(data.data_dir, data.lexicon, user_catalogs, data.notes);
    return data;
  }
  std::vector<fs::path> files = shipped_catalog_files(data.data_dir);
  for (const auto& file : user_catalogs) files.emplace_back(file);
  std::vector<Catalog> catalogs;
  for (const auto& file : files) catalogs.push_back(load_catalog(file, data.lexicon));
  data.catalog = merge_catalogs(catalogs);
  return data;
}

}  // namespace bine

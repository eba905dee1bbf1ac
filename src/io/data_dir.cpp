#include "io/data_dir.hpp"

#include <algorithm>

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

DataSet load_data(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs) {
  namespace fs = std::filesystem;
  DataSet data;
  data.data_dir = resolve_data_dir(choice);
  data.lexicon = load_lexicon(data.data_dir / "lexicon.json");
  std::vector<fs::path> files;
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(data.data_dir / "catalog", ec))
    if (entry.path().extension() == ".json") files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  for (const auto& file : user_catalogs) files.emplace_back(file);
  std::vector<Catalog> catalogs;
  for (const auto& file : files) catalogs.push_back(load_catalog(file, data.lexicon));
  data.catalog = merge_catalogs(catalogs);
  return data;
}

}  // namespace bine

#pragma once
// Locating and loading the descriptor data: the lexicon and the catalogs.
#include <filesystem>
#include <string>
#include <vector>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

struct DataSet {
  std::filesystem::path data_dir;
  Lexicon lexicon;
  Catalog catalog;                 // the data dir's catalogs, then --catalog files, merged
  std::vector<std::string> notes;  // for the brewer: a stale compiled catalog read from its sources, ...
};

/// Where the brewer named a data folder, for messages: `folder` and the words that named it
/// ("--data DIR", "BINE_DATA=DIR"). An empty folder means "not named".
struct DataFolderChoice {
  std::string folder;
  std::string named_by;
};

/// The data folder: the one the brewer named, else ../share/bine/descriptor-data next to the
/// installed executable, else the source tree's descriptor-data. Throws InputError when the chosen
/// folder has no lexicon.json. Reads no environment variable (the command line does, once).
std::filesystem::path resolve_data_dir(const DataFolderChoice& choice);

/// The catalogs shipped in the data folder: DATA/catalog/*.json sorted by name.
std::vector<std::filesystem::path> shipped_catalog_files(const std::filesystem::path& data_dir);

/// Loads the lexicon, every catalog under DATA/catalog (sorted by name), then the user catalogs.
/// A compiled catalog among them (io/compiled_catalog.hpp) stands for the shipped catalogs and the
/// files it was compiled from.
DataSet load_data(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs);

}  // namespace bine

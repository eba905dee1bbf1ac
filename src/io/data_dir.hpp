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
  Catalog catalog;  // the data dir's catalogs, then --catalog files, merged
};

/// The data folder: the --data option, else $BINE_DATA, else ../share/bine/descriptor-data next to
/// the installed executable, else the source tree's descriptor-data. Throws InputError when the
/// chosen folder has no lexicon.json.
std::filesystem::path resolve_data_dir(const std::string& option);

/// Loads the lexicon, every catalog under DATA/catalog (sorted by name), then the user catalogs.
DataSet load_data(const std::string& data_option, const std::vector<std::string>& user_catalogs);

}  // namespace bine

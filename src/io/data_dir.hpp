#pragma once
// Locating and loading the descriptor data: the lexicon and the catalogs.
#include <filesystem>
#include <string>
#include <vector>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// One catalog a command's figures came from, for the line every output carries.
struct CatalogSource {
  std::string name;   // the catalog's own name
  std::string file;   // as loaded
  bool demo = false;  // invented demo data
};

struct DataSet {
  std::filesystem::path data_dir;
  Lexicon lexicon;
  Catalog catalog;                     // the catalogs below, merged
  std::vector<CatalogSource> sources;  // in load order
  std::vector<std::string> notes;      // for the brewer: a stale compiled catalog read from its sources, ...
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

/// The catalog files a command reads: without `user_catalogs`, every shipped catalog; with them,
/// only those, where an entry that is the bare name of a shipped catalog (no folder, no extension:
/// "demo") means that shipped catalog, so the demo data is mixed into the brewer's own only when
/// asked for by name.
std::vector<std::filesystem::path> chosen_catalog_files(const std::filesystem::path& data_dir,
                                                        const std::vector<std::string>& user_catalogs);

/// How a loaded catalog file is named in the "Catalogs used" line.
CatalogSource catalog_source(const std::filesystem::path& data_dir, const std::filesystem::path& file,
                             const Catalog& loaded);

/// Loads the lexicon and the catalogs of chosen_catalog_files. A compiled catalog among them
/// (io/compiled_catalog.hpp) stands for the files it was compiled from.
DataSet load_data(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs);

/// "Catalogs used: A (file; invented demo data ...); B (file)." for the end of a text output.
std::string catalogs_used_line(const DataSet& data);

}  // namespace bine

#pragma once
// Compiled catalogs: the catalogs a command would load for the files given (see chosen_catalog_files),
// turned once into a SQLite database NAME.bine of the varieties with a folded-name index, and beside
// it one faiss index per question (NAME.bine-STAMP.aroma.faiss, ...bittering.faiss) written with
// faiss::write_index. The database carries the stamp: a content hash of every source file, of the
// lexicon and of the vectorizer and index settings, so a catalog that no longer matches its sources
// is detected and named. A process using it reads the index and only the rows it needs.
// See compiled_catalog.cpp for the layout and the freshness rules.
#include <cstdint>
#include <filesystem>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/aroma_vector.hpp"
#include "engine/blend.hpp"
#include "engine/hop_index.hpp"
#include "engine/substitutes.hpp"
#include "io/data_dir.hpp"
#include "model/hops.hpp"
#include "model/lexicon.hpp"

struct sqlite3;

namespace bine {

/// True when the file starts like a SQLite database (a compiled catalog, or not one of our files).
bool is_compiled_catalog(const std::filesystem::path& path);

/// 64-bit FNV-1a hash of a file's bytes (the content stamp of a source). Throws InputError when
/// the file cannot be read.
std::uint64_t hash_file(const std::filesystem::path& path);

/// One file a compiled catalog was made from, as it was then.
struct StampedFile {
  std::string role;  // "lexicon", "shipped" (a catalog of the data folder, named "demo") or "source"
  std::string path;  // as given (for messages and to read it again)
  std::string absolute;
  std::uintmax_t bytes = 0;
  std::int64_t modified_ns = 0;
  std::uint64_t hash = 0;
};

/// Stamps `path` (size, modification time, content hash) for `role`.
StampedFile stamp_file(const std::filesystem::path& path, std::string role);

/// The settings a compiled catalog's vectors and indexes depend on, as one string (its hash is part
/// of the stamp); a bine whose defaults changed finds older compiled catalogs stale.
std::string vector_settings_fingerprint(const VectorSettings& vectors, const IndexSettings& index);

/// What to compile: the merged catalog (data folder + sources), the files it came from, and the
/// indexes built over it for each question.
struct CompileInput {
  const Catalog* catalog = nullptr;
  const Lexicon* lexicon = nullptr;
  std::vector<StampedFile> files;
  std::string settings;  // vector_settings_fingerprint
  CatalogSpread spread;
  const HopIndex* aroma_index = nullptr;
  const HopIndex* bittering_index = nullptr;
};

/// Writes NAME.bine and its index files, each atomically (indexes first, the database last, so a
/// reader sees the old catalog or the new one), then removes index files of earlier compiles.
/// Returns the files written.
std::vector<std::filesystem::path> write_compiled_catalog(const std::filesystem::path& out, const CompileInput& input);

/// A compiled catalog opened read-only. Rows are read on demand.
class CompiledCatalog {
 public:
  /// Opens `path`; InputError naming the file when it is not a compiled catalog of this format.
  explicit CompiledCatalog(const std::filesystem::path& path);
  ~CompiledCatalog();
  CompiledCatalog(CompiledCatalog&&) noexcept;
  CompiledCatalog& operator=(CompiledCatalog&&) noexcept;
  CompiledCatalog(const CompiledCatalog&) = delete;
  CompiledCatalog& operator=(const CompiledCatalog&) = delete;

  const std::filesystem::path& path() const { return path_; }
  std::size_t size() const { return size_; }
  const std::vector<std::string>& catalog_names() const { return catalog_names_; }
  bool demo() const { return demo_; }
  const std::vector<StampedFile>& files() const { return files_; }
  /// The catalog files compiled in (role "shipped" or "source"), in order.
  std::vector<std::string> source_paths() const;

  /// Why the catalog no longer matches: a source (a shipped one in `data_dir`) or the lexicon changed,
  /// or the settings differ. Empty when it matches. Files that are gone are listed in `unchecked`.
  std::string staleness(const std::filesystem::path& data_dir, std::vector<std::string>& unchecked) const;

  std::optional<std::size_t> position_of(std::string_view name) const;
  Variety row(std::size_t position, const Lexicon& lexicon) const;
  std::vector<std::string> names() const;
  /// Every row, as load_catalog would give them (names, demo flag, name index).
  Catalog load_all(const Lexicon& lexicon) const;
  /// Calls `each` with every row in order, one at a time (nothing else is held).
  void for_each_row(const Lexicon& lexicon, const std::function<void(const Variety&)>& each) const;
  /// Calls `each` with every row as blend's catalog mode reads it (name, purpose, oil, alpha and the
  /// aroma profile stored at compile time), in order, without building varieties.
  void for_each_blend_row(const std::function<void(const CatalogBlendRow&)>& each) const;
  /// A catalog of only the rows with these names (folded comparison, in catalog order; unknown names
  /// are left out), with the compiled catalog's catalog names and demo flag.
  Catalog only(const std::vector<std::string>& names, const Lexicon& lexicon) const;
  CatalogSpread spread() const;
  /// Reads the index for one question with faiss::read_index.
  HopIndex read_index(SwapPurpose purpose, const IndexSettings& settings = {}) const;

 private:
  std::filesystem::path path_;
  std::unique_ptr<sqlite3, int (*)(sqlite3*)> db_;
  std::size_t size_ = 0;
  std::vector<std::string> catalog_names_;
  bool demo_ = false;
  std::vector<StampedFile> files_;
  std::string stamp_;
  std::string settings_;
};

/// A compiled catalog as a substitute source for one question: its index and vectorizer, and rows
/// fetched by position.
class CompiledSubstituteCatalog final : public SubstituteCatalog {
 public:
  CompiledSubstituteCatalog(const CompiledCatalog& compiled, const Lexicon& lexicon, SwapPurpose purpose,
                            const SubstituteSettings& settings = {});
  std::size_t size() const override { return compiled_->size(); }
  std::optional<std::size_t> position_of(std::string_view name) const override;
  Variety row(std::size_t position) const override;
  std::vector<std::string> names() const override;
  const Vectorizer& vectorizer() const override { return vectorizer_; }
  const HopIndex& index() const override { return index_; }

 private:
  const CompiledCatalog* compiled_;
  const Lexicon* lexicon_;
  Vectorizer vectorizer_;
  HopIndex index_;
};

/// The compiled catalog among `user_catalogs` when it is the only catalog file given and matches
/// its sources and `data_dir` (so a command may read it row by row), else nullopt. Sources that are
/// gone (so not checked) are named in `notes`.
std::optional<CompiledCatalog> sole_fresh_compiled_catalog(const std::filesystem::path& data_dir,
                                                           const std::vector<std::string>& user_catalogs,
                                                           std::vector<std::string>& notes);

/// The "Catalogs used" entry of a compiled catalog: its catalogs' names and its file.
CatalogSource compiled_catalog_source(const CompiledCatalog& compiled);

/// Loads the catalogs when `files` (chosen_catalog_files) hold a compiled catalog: its rows, then the
/// other files given, each named in `sources`. A stale compiled catalog is named in `notes` and its
/// JSON sources are read instead when they are all there; else InputError naming what changed and
/// the command that recompiles. At most one compiled catalog.
Catalog load_catalogs_with_compiled(const std::filesystem::path& data_dir, const Lexicon& lexicon,
                                    const std::vector<std::filesystem::path>& files, std::vector<std::string>& notes,
                                    std::vector<CatalogSource>& sources);

/// What a command reads from the catalogs when it needs only some varieties by name.
struct CatalogSubset {
  DataSet data;                             // data.catalog: the rows asked for, or every catalog
  std::optional<CompiledCatalog> compiled;  // set when data.catalog holds only the rows asked for
};

/// With one compiled catalog given alone, matching its sources and knowing every name in `names`
/// (empty ones aside): `data.catalog` holds only those rows, with the lexicon and the sources line
/// as load_data gives them, and `compiled` is open for the rest. Otherwise load_data's full data
/// set without `compiled`, so an unknown name gets the usual message with the closest names.
CatalogSubset load_data_for_names(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs,
                                  const std::vector<std::string>& names);

}  // namespace bine

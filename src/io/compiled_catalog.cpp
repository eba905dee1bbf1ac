// Compiled catalogs: one SQLite database and two faiss index files.
//
// Layout of NAME.bine (SQLite 3):
//   meta(key, value)       format, stamp, settings fingerprint, demo flag, catalog names (JSON),
//                          the catalog spread (doubles), row count, the index file of each question
//                          and its size in bytes
//   files(...)             every file compiled in: role, path as given, absolute path, size,
//                          modification time (ns) and FNV-1a content hash
//   varieties(id, ...)     one row per variety in merged order (id = position = index row id):
//                          name, folded name (unique index: look-ups never scan), the numbers as
//                          REAL (8-byte IEEE, so values come back bit for bit), oils and aroma as
//                          blobs of (index, value...) doubles in native byte order, tags as JSON,
//                          and the aroma profile blend reads (one double per lexicon axis, NULL
//                          when the variety has none), so a blend builds its candidates from a few
//                          columns instead of whole varieties
// Beside it, NAME.bine-STAMP.aroma.faiss and NAME.bine-STAMP.bittering.faiss: faiss::write_index of
// the flat or HNSW index over each question's vectors (HopIndex decides the kind by size). The
// stamp in the file names ties each index to its database.
//
// Writing. The database is built in memory, serialised (sqlite3_serialize) and written with
// write_file_atomically, like every file bine writes; the index files are written the same way,
// before it. Index files of earlier compiles of the same NAME are removed afterwards.
//
// Freshness. The stamp is FNV-1a (Fowler, Noll, Vo; 64-bit, offset 14695981039346656037, prime
// 1099511628211) over the content hashes of the files and the settings fingerprint. Opening checks
// each file as git checks its work tree: same size and modification time means unchanged; else the
// content hash decides. A source that is gone cannot be checked and is noted; the lexicon and the
// shipped catalogs compiled in ("demo") must match the ones in the data folder in use.
#include "io/compiled_catalog.hpp"

#include <faiss/impl/io.h>
#include <faiss/index_io.h>
#include <fmt/format.h>
#include <fmt/ranges.h>
#include <sqlite3.h>

#include <algorithm>
#include <array>
#include <cstring>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <set>

#include "engine/blend.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

namespace fs = std::filesystem;

constexpr std::string_view kFormat = "bine compiled catalog 2";
constexpr std::uint64_t kFnvOffset = 14695981039346656037ull;
constexpr std::uint64_t kFnvPrime = 1099511628211ull;

std::uint64_t fnv1a(std::uint64_t hash, const void* data, std::size_t bytes) {
  const auto* p = static_cast<const unsigned char*>(data);
  for (std::size_t i = 0; i < bytes; ++i) hash = (hash ^ p[i]) * kFnvPrime;
  return hash;
}

std::string hex(std::uint64_t value) { return fmt::format("{:016x}", value); }

std::int64_t modified_ns(const fs::path& path) {
  std::error_code ec;
  const auto time = fs::last_write_time(path, ec);
  if (ec) return 0;
  return std::chrono::duration_cast<std::chrono::nanoseconds>(time.time_since_epoch()).count();
}

/// A prepared statement, finalised at scope end.
class Statement {
 public:
  Statement(sqlite3* db, std::string_view sql, const std::string& file) : file_(file) {
    if (sqlite3_prepare_v2(db, sql.data(), static_cast<int>(sql.size()), &statement_, nullptr) != SQLITE_OK)
      throw InputError(fmt::format("{}: not a compiled catalog of this bine ({})", file, sqlite3_errmsg(db)));
  }
  ~Statement() { sqlite3_finalize(statement_); }
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;
  sqlite3_stmt* get() const { return statement_; }
  bool step() {
    const int rc = sqlite3_step(statement_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    throw InputError(
        fmt::format("{}: cannot read the compiled catalog ({})", file_, sqlite3_errmsg(sqlite3_db_handle(statement_))));
  }
  void reset() {
    sqlite3_reset(statement_);
    sqlite3_clear_bindings(statement_);
  }
  void bind(int at, std::string_view text) {
    sqlite3_bind_text(statement_, at, text.data(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
  }
  void bind(int at, double value) { sqlite3_bind_double(statement_, at, value); }
  void bind(int at, std::int64_t value) { sqlite3_bind_int64(statement_, at, value); }
  void bind_blob(int at, const std::vector<double>& values) {
    sqlite3_bind_blob(statement_, at, values.data(), static_cast<int>(values.size() * sizeof(double)),
                      SQLITE_TRANSIENT);
  }
  void bind_null(int at) { sqlite3_bind_null(statement_, at); }
  bool is_null(int at) const { return sqlite3_column_type(statement_, at) == SQLITE_NULL; }
  std::string text(int at) const {
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(statement_, at));
    return p ? std::string(p, static_cast<std::size_t>(sqlite3_column_bytes(statement_, at))) : std::string();
  }
  double real(int at) const { return sqlite3_column_double(statement_, at); }
  std::int64_t integer(int at) const { return sqlite3_column_int64(statement_, at); }
  std::vector<double> doubles(int at) const {
    const void* p = sqlite3_column_blob(statement_, at);
    const auto bytes = static_cast<std::size_t>(sqlite3_column_bytes(statement_, at));
    std::vector<double> values(bytes / sizeof(double));
    if (p && !values.empty()) std::memcpy(values.data(), p, values.size() * sizeof(double));
    return values;
  }

 private:
  sqlite3_stmt* statement_ = nullptr;
  std::string file_;
};

void exec(sqlite3* db, const char* sql) {
  char* message = nullptr;
  if (sqlite3_exec(db, sql, nullptr, nullptr, &message) != SQLITE_OK) {
    const std::string text = message ? message : "unknown";
    sqlite3_free(message);
    throw std::runtime_error("compiled catalog: " + text);
  }
}

constexpr const char* kSchema =
    "CREATE TABLE meta(key TEXT PRIMARY KEY, value);"
    "CREATE TABLE files(id INTEGER PRIMARY KEY, role TEXT, path TEXT, absolute TEXT, bytes INTEGER,"
    " modified_ns INTEGER, hash TEXT);"
    "CREATE TABLE varieties(id INTEGER PRIMARY KEY, name TEXT, folded TEXT, source TEXT, origin TEXT,"
    " purpose INTEGER, alpha_min REAL, alpha_max REAL, beta_min REAL, beta_max REAL, cohumulone_min REAL,"
    " cohumulone_max REAL, oil_min REAL, oil_max REAL, stability REAL, oils BLOB, aroma BLOB, tags TEXT,"
    " profile BLOB);";

void bind_range(Statement& insert, int at, const std::optional<Range>& range) {
  if (range) {
    insert.bind(at, range->min);
    insert.bind(at + 1, range->max);
  } else {
    insert.bind_null(at);
    insert.bind_null(at + 1);
  }
}

std::optional<Range> read_range(const Statement& row, int at) {
  if (row.is_null(at)) return std::nullopt;
  return Range{row.real(at), row.real(at + 1)};
}

void insert_variety(Statement& insert, std::int64_t id, const Variety& v, const Lexicon& lexicon) {
  insert.reset();
  insert.bind(1, id);
  insert.bind(2, v.name);
  insert.bind(3, fold_name(v.name));
  insert.bind(4, v.source_file);
  insert.bind(5, v.origin);
  if (v.purpose)
    insert.bind(6, static_cast<std::int64_t>(*v.purpose));
  else
    insert.bind_null(6);
  bind_range(insert, 7, v.alpha_acid);
  bind_range(insert, 9, v.beta_acid);
  bind_range(insert, 11, v.cohumulone);
  bind_range(insert, 13, v.total_oil);
  if (v.stability)
    insert.bind(15, *v.stability);
  else
    insert.bind_null(15);
  std::vector<double> oils;
  const auto& compounds = oil_compounds();
  for (const auto& [compound, range] : v.oils) {
    const auto at = std::find(compounds.begin(), compounds.end(), compound) - compounds.begin();
    oils.insert(oils.end(), {static_cast<double>(at), range.min, range.max});
  }
  insert.bind_blob(16, oils);
  if (v.aroma) {
    std::vector<double> aroma;
    for (const auto& [axis, value] : *v.aroma)
      aroma.insert(aroma.end(), {static_cast<double>(lexicon.axis_index(axis).value_or(0)), value});
    insert.bind_blob(17, aroma);
  } else {
    insert.bind_null(17);
  }
  if (v.tags.empty())
    insert.bind_null(18);
  else
    insert.bind(18, nlohmann::json(v.tags).dump());
  Eigen::VectorXd profile;
  if (catalog_blend_row(v, lexicon, profile).aroma != nullptr)
    insert.bind_blob(19, std::vector<double>(profile.data(), profile.data() + profile.size()));
  else
    insert.bind_null(19);
  insert.step();
}

Variety variety_from_row(const Statement& row, const Lexicon& lexicon) {
  Variety v;
  v.name = row.text(0);
  v.source_file = row.text(1);
  v.origin = row.text(2);
  if (!row.is_null(3)) v.purpose = static_cast<Purpose>(row.integer(3));
  v.alpha_acid = read_range(row, 4);
  v.beta_acid = read_range(row, 6);
  v.cohumulone = read_range(row, 8);
  v.total_oil = read_range(row, 10);
  if (!row.is_null(12)) v.stability = row.real(12);
  const auto& compounds = oil_compounds();
  const std::vector<double> oils = row.doubles(13);
  for (std::size_t i = 0; i + 2 < oils.size(); i += 3) {
    const auto at = static_cast<std::size_t>(oils[i]);
    if (at < compounds.size()) v.oils[compounds[at]] = Range{oils[i + 1], oils[i + 2]};
  }
  if (!row.is_null(14)) {
    std::map<std::string, double> aroma;
    const std::vector<double> values = row.doubles(14);
    for (std::size_t i = 0; i + 1 < values.size(); i += 2) {
      const auto at = static_cast<std::size_t>(values[i]);
      if (at < lexicon.axes().size()) aroma[lexicon.axes()[at].name] = values[i + 1];
    }
    v.aroma = std::move(aroma);
  }
  if (!row.is_null(15)) v.tags = nlohmann::json::parse(row.text(15)).get<std::vector<std::string>>();
  return v;
}

constexpr const char* kSelectVariety =
    "SELECT name, source, origin, purpose, alpha_min, alpha_max, beta_min, beta_max, cohumulone_min,"
    " cohumulone_max, oil_min, oil_max, stability, oils, aroma, tags FROM varieties";

std::vector<double> spread_values(const CatalogSpread& spread) {
  std::vector<double> values;
  for (const auto& s : spread.oils) values.insert(values.end(), {s.mean, s.sd});
  for (const auto& s : spread.chemistry) values.insert(values.end(), {s.mean, s.sd});
  return values;
}

std::string index_bytes(const HopIndex& index) {
  faiss::VectorIOWriter writer;
  faiss::write_index(&index.faiss_index(), &writer);
  return std::string(writer.data.begin(), writer.data.end());
}

std::string index_file_name(const fs::path& out, std::string_view stamp, SwapPurpose purpose) {
  return fmt::format("{}-{}.{}.faiss", out.filename().string(), stamp, to_string(purpose));
}

std::string stamp_of(const CompileInput& input) {
  std::uint64_t hash = kFnvOffset;
  for (const auto& file : input.files) {
    hash = fnv1a(hash, file.role.data(), file.role.size());
    hash = fnv1a(hash, &file.hash, sizeof file.hash);
  }
  hash = fnv1a(hash, input.settings.data(), input.settings.size());
  return hex(hash);
}

void put_meta(sqlite3* db, std::string_view key, std::string_view value) {
  Statement insert(db, "INSERT INTO meta(key, value) VALUES(?, ?)", "compiled catalog");
  insert.bind(1, key);
  insert.bind(2, value);
  insert.step();
}

void fill_database(sqlite3* db, const CompileInput& input, const std::string& stamp,
                   const std::array<std::pair<std::string, std::size_t>, 2>& indexes) {
  exec(db, kSchema);
  exec(db, "BEGIN");
  put_meta(db, "format", kFormat);
  put_meta(db, "stamp", stamp);
  put_meta(db, "settings", input.settings);
  put_meta(db, "demo", input.catalog->demo ? "1" : "0");
  put_meta(db, "catalog_names", nlohmann::json(input.catalog->names).dump());
  put_meta(db, "count", std::to_string(input.catalog->varieties.size()));
  put_meta(db, "aroma_index", indexes[0].first);
  put_meta(db, "aroma_index_bytes", std::to_string(indexes[0].second));
  put_meta(db, "bittering_index", indexes[1].first);
  put_meta(db, "bittering_index_bytes", std::to_string(indexes[1].second));
  {
    Statement spread(db, "INSERT INTO meta(key, value) VALUES('spread', ?)", "compiled catalog");
    spread.bind_blob(1, spread_values(input.spread));
    spread.step();
  }
  Statement file(db, "INSERT INTO files(role, path, absolute, bytes, modified_ns, hash) VALUES(?, ?, ?, ?, ?, ?)",
                 "compiled catalog");
  for (const auto& f : input.files) {
    file.reset();
    file.bind(1, f.role);
    file.bind(2, f.path);
    file.bind(3, f.absolute);
    file.bind(4, static_cast<std::int64_t>(f.bytes));
    file.bind(5, f.modified_ns);
    file.bind(6, hex(f.hash));
    file.step();
  }
  Statement insert(db, "INSERT INTO varieties VALUES(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                   "compiled catalog");
  std::int64_t id = 0;
  for (const auto& variety : input.catalog->varieties) insert_variety(insert, id++, variety, *input.lexicon);
  exec(db, "CREATE UNIQUE INDEX varieties_by_folded ON varieties(folded)");
  exec(db, "COMMIT");
}

std::string serialised(sqlite3* db) {
  sqlite3_int64 size = 0;
  unsigned char* bytes = sqlite3_serialize(db, "main", &size, 0);
  if (!bytes) throw std::bad_alloc();
  std::string out(reinterpret_cast<const char*>(bytes), static_cast<std::size_t>(size));
  sqlite3_free(bytes);
  return out;
}

/// Index files of earlier compiles of `out` (same name, another stamp).
void remove_old_indexes(const fs::path& out, std::string_view stamp) {
  std::error_code ec;
  const fs::path folder = out.has_parent_path() ? out.parent_path() : fs::path(".");
  const std::string prefix = out.filename().string() + "-";
  for (const auto& entry : fs::directory_iterator(folder, ec)) {
    const std::string name = entry.path().filename().string();
    if (name.rfind(prefix, 0) != 0 || entry.path().extension() != ".faiss") continue;
    if (name.compare(prefix.size(), stamp.size(), stamp) == 0) continue;
    fs::remove(entry.path(), ec);
  }
}

bool same_content(const StampedFile& stamped, const fs::path& path) {
  std::error_code ec;
  const auto bytes = fs::file_size(path, ec);
  if (ec || bytes != stamped.bytes) return false;
  if (modified_ns(path) == stamped.modified_ns) return true;
  return hash_file(path) == stamped.hash;
}

}  // namespace

bool is_compiled_catalog(const fs::path& path) {
  static constexpr std::string_view kSqliteHeader{"SQLite format 3\0", 16};
  return read_file_head(path, kSqliteHeader.size()) == kSqliteHeader;
}

std::uint64_t hash_file(const fs::path& path) {
  std::error_code ec;
  if (!fs::is_regular_file(path, ec))  // a pipe or device is never opened (it would block)
    throw InputError(fmt::format("{}: not a regular file (expected a catalog file)", path.string()));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(fmt::format("{}: cannot read this file", path.string()));
  std::uint64_t hash = kFnvOffset;
  std::vector<char> buffer(1 << 20);
  while (in) {
    in.read(buffer.data(), static_cast<std::streamsize>(buffer.size()));
    hash = fnv1a(hash, buffer.data(), static_cast<std::size_t>(in.gcount()));
  }
  return hash;
}

StampedFile stamp_file(const fs::path& path, std::string role) {
  std::error_code ec;
  StampedFile stamped;
  stamped.role = std::move(role);
  stamped.path = path.string();
  stamped.absolute = fs::absolute(path, ec).lexically_normal().string();
  stamped.bytes = fs::file_size(path, ec);
  if (ec) throw InputError(fmt::format("{}: cannot read this file ({})", path.string(), ec.message()));
  stamped.modified_ns = modified_ns(path);
  stamped.hash = hash_file(path);
  return stamped;
}

std::string vector_settings_fingerprint(const VectorSettings& vectors, const IndexSettings& index) {
  std::string text = "vectors";
  for (const BlockWeights* w : {&vectors.for_aroma, &vectors.for_bittering}) {
    text += fmt::format(" {:a} {:a} {:a}", w->aroma, w->oils, w->chemistry);
    for (const double e : w->chemistry_emphasis) text += fmt::format(" {:a}", e);
  }
  text += fmt::format(" {:a} {:a}; index {} {} {}; bittering exact", vectors.angle_per_sd, vectors.max_sd,
                      index.exact_up_to, index.hnsw_neighbors, index.hnsw_ef_construction);
  return text;
}

std::vector<fs::path> write_compiled_catalog(const fs::path& out, const CompileInput& input) {
  const std::string stamp = stamp_of(input);
  const fs::path folder = out.parent_path();
  std::array<std::pair<std::string, std::size_t>, 2> indexes;
  std::vector<fs::path> written;
  const std::array<std::pair<SwapPurpose, const HopIndex*>, 2> each{
      {{SwapPurpose::aroma, input.aroma_index}, {SwapPurpose::bittering, input.bittering_index}}};
  for (std::size_t i = 0; i < each.size(); ++i) {
    const std::string bytes = index_bytes(*each[i].second);
    indexes[i] = {index_file_name(out, stamp, each[i].first), bytes.size()};
    write_file_atomically(folder / indexes[i].first, bytes);
    written.push_back(folder / indexes[i].first);
  }
  std::unique_ptr<sqlite3, int (*)(sqlite3*)> db(nullptr, sqlite3_close);
  sqlite3* raw = nullptr;
  if (sqlite3_open(":memory:", &raw) != SQLITE_OK) throw std::bad_alloc();
  db.reset(raw);
  fill_database(db.get(), input, stamp, indexes);
  write_file_atomically(out, serialised(db.get()));
  written.insert(written.begin(), out);
  remove_old_indexes(out, stamp);
  return written;
}

// ---------------------------------------------------------------------------------------------
// Reading

CompiledCatalog::CompiledCatalog(const fs::path& path) : path_(path), db_(nullptr, sqlite3_close) {
  const std::string file = path.string();
  if (!is_compiled_catalog(path))
    throw InputError(fmt::format("{}: not a compiled catalog (expected a file from 'bine catalog compile')", file));
  sqlite3* raw = nullptr;
  const int rc = sqlite3_open_v2(file.c_str(), &raw, SQLITE_OPEN_READONLY | SQLITE_OPEN_NOMUTEX, nullptr);
  db_.reset(raw);
  if (rc != SQLITE_OK) throw InputError(fmt::format("{}: cannot open the compiled catalog", file));
  std::map<std::string, std::string> meta;
  {
    Statement select(db_.get(), "SELECT key, value FROM meta WHERE key != 'spread'", file);
    while (select.step()) meta[select.text(0)] = select.text(1);
  }
  if (meta["format"] != kFormat)
    throw InputError(
        fmt::format("{}: /meta/format: \"{}\" is not a compiled catalog this bine reads (expected "
                    "\"{}\"; compile it again)",
                    file, meta["format"], kFormat));
  stamp_ = meta["stamp"];
  settings_ = meta["settings"];
  demo_ = meta["demo"] == "1";
  size_ = static_cast<std::size_t>(std::stoull(meta["count"]));
  catalog_names_ = nlohmann::json::parse(meta["catalog_names"]).get<std::vector<std::string>>();
  Statement files(db_.get(), "SELECT role, path, absolute, bytes, modified_ns, hash FROM files ORDER BY id", file);
  while (files.step())
    files_.push_back({files.text(0), files.text(1), files.text(2), static_cast<std::uintmax_t>(files.integer(3)),
                      files.integer(4), std::stoull(files.text(5), nullptr, 16)});
}

CompiledCatalog::~CompiledCatalog() = default;
CompiledCatalog::CompiledCatalog(CompiledCatalog&&) noexcept = default;
CompiledCatalog& CompiledCatalog::operator=(CompiledCatalog&&) noexcept = default;

std::vector<std::string> CompiledCatalog::source_paths() const {
  std::vector<std::string> paths;
  for (const auto& f : files_)
    if (f.role == "source" || f.role == "shipped") paths.push_back(f.path);
  return paths;
}

std::string CompiledCatalog::staleness(const fs::path& data_dir, std::vector<std::string>& unchecked) const {
  if (settings_ != vector_settings_fingerprint({}, {}))
    return "it was compiled with other vector or index settings (another version of bine)";
  std::vector<std::string> changed;
  for (const auto& f : files_) {
    if (f.role == "lexicon" && !same_content(f, data_dir / "lexicon.json"))
      changed.push_back((data_dir / "lexicon.json").string());
    if (f.role == "shipped" && !same_content(f, data_dir / "catalog" / fs::path(f.path).filename()))
      changed.push_back(f.path);
    if (f.role != "source") continue;
    std::error_code ec;
    if (!fs::exists(f.absolute, ec))
      unchecked.push_back(f.path);
    else if (!same_content(f, f.absolute))
      changed.push_back(f.path);
  }
  if (changed.empty()) return {};
  std::string list;
  for (const auto& c : changed) list += (list.empty() ? "" : ", ") + c;
  return list + " changed since it was compiled";
}

std::optional<std::size_t> CompiledCatalog::position_of(std::string_view name) const {
  Statement select(db_.get(), "SELECT id FROM varieties WHERE folded = ?", path_.string());
  select.bind(1, fold_name(name));
  if (!select.step()) return std::nullopt;
  return static_cast<std::size_t>(select.integer(0));
}

Variety CompiledCatalog::row(std::size_t position, const Lexicon& lexicon) const {
  Statement select(db_.get(), std::string(kSelectVariety) + " WHERE id = ?", path_.string());
  select.bind(1, static_cast<std::int64_t>(position));
  if (!select.step()) throw std::out_of_range("compiled catalog: no row " + std::to_string(position));
  return variety_from_row(select, lexicon);
}

std::vector<std::string> CompiledCatalog::names() const {
  Statement select(db_.get(), "SELECT name FROM varieties ORDER BY id", path_.string());
  std::vector<std::string> names;
  while (select.step()) names.push_back(select.text(0));
  return names;
}

Catalog CompiledCatalog::load_all(const Lexicon& lexicon) const {
  Catalog catalog;
  catalog.names = catalog_names_;
  catalog.demo = demo_;
  catalog.varieties.reserve(size_);
  Statement select(db_.get(), std::string(kSelectVariety) + " ORDER BY id", path_.string());
  while (select.step()) catalog.varieties.push_back(variety_from_row(select, lexicon));
  index_variety_names(catalog);
  return catalog;
}

void CompiledCatalog::for_each_row(const Lexicon& lexicon, const std::function<void(const Variety&)>& each) const {
  Statement select(db_.get(), std::string(kSelectVariety) + " ORDER BY id", path_.string());
  while (select.step()) each(variety_from_row(select, lexicon));
}

void CompiledCatalog::for_each_blend_row(const std::function<void(const CatalogBlendRow&)>& each) const {
  Statement select(db_.get(),
                   "SELECT name, purpose, oil_min, oil_max, alpha_min, alpha_max, profile FROM varieties ORDER BY id",
                   path_.string());
  Eigen::VectorXd profile;
  while (select.step()) {
    const std::string name = select.text(0);
    CatalogBlendRow row;
    row.name = name;
    row.bittering_only = !select.is_null(1) && static_cast<Purpose>(select.integer(1)) == Purpose::bittering;
    row.total_oil = read_range(select, 2);
    row.alpha_acid = read_range(select, 4);
    if (!select.is_null(6)) {
      const std::vector<double> values = select.doubles(6);
      profile = Eigen::Map<const Eigen::VectorXd>(values.data(), static_cast<Eigen::Index>(values.size()));
      row.aroma = &profile;
    }
    each(row);
  }
}

Catalog CompiledCatalog::only(const std::vector<std::string>& names, const Lexicon& lexicon) const {
  std::set<std::size_t> positions;
  for (const auto& name : names)
    if (const auto position = position_of(name)) positions.insert(*position);
  Catalog catalog;
  catalog.names = catalog_names_;
  catalog.demo = demo_;
  for (const std::size_t position : positions) catalog.varieties.push_back(row(position, lexicon));
  index_variety_names(catalog);
  return catalog;
}

CatalogSpread CompiledCatalog::spread() const {
  Statement select(db_.get(), "SELECT value FROM meta WHERE key = 'spread'", path_.string());
  CatalogSpread spread;
  if (!select.step()) return spread;
  const std::vector<double> values = select.doubles(0);
  const std::size_t oils = oil_compounds().size();
  if (values.size() != 2 * (oils + kChemistryFeatures))
    throw InputError(fmt::format("{}: /meta/spread: damaged (compile it again)", path_.string()));
  for (std::size_t i = 0; i < oils; ++i) spread.oils.push_back({values[2 * i], values[2 * i + 1]});
  for (std::size_t f = 0; f < kChemistryFeatures; ++f)
    spread.chemistry[f] = {values[2 * (oils + f)], values[2 * (oils + f) + 1]};
  return spread;
}

HopIndex CompiledCatalog::read_index(SwapPurpose purpose, const IndexSettings& settings) const {
  const std::string key = std::string(to_string(purpose)) + "_index";
  Statement select(db_.get(), "SELECT value FROM meta WHERE key = ? OR key = ? ORDER BY key", path_.string());
  select.bind(1, key);
  select.bind(2, key + "_bytes");
  std::string name, bytes;
  if (select.step()) name = select.text(0);
  if (select.step()) bytes = select.text(0);
  const fs::path file = path_.parent_path() / name;
  std::error_code ec;
  if (name.empty() || fs::file_size(file, ec) != std::stoull(bytes.empty() ? "0" : bytes) || ec)
    throw InputError(fmt::format("{}: its {} index {} is missing or damaged (compile the catalog again)",
                                 path_.string(), to_string(purpose), file.string()));
  std::unique_ptr<faiss::Index> index(faiss::read_index(file.string().c_str()));
  return HopIndex(std::move(index), settings);
}

CompiledSubstituteCatalog::CompiledSubstituteCatalog(const CompiledCatalog& compiled, const Lexicon& lexicon,
                                                     SwapPurpose purpose, const SubstituteSettings& settings)
    : compiled_(&compiled),
      lexicon_(&lexicon),
      vectorizer_(compiled.spread(), lexicon, purpose, settings.vectors),
      index_(compiled.read_index(purpose, settings.index)) {}

std::optional<std::size_t> CompiledSubstituteCatalog::position_of(std::string_view name) const {
  return compiled_->position_of(name);
}
Variety CompiledSubstituteCatalog::row(std::size_t position) const { return compiled_->row(position, *lexicon_); }
std::vector<std::string> CompiledSubstituteCatalog::names() const { return compiled_->names(); }

// ---------------------------------------------------------------------------------------------
// Choosing between the compiled catalog and its sources

namespace {

/// The note for a compiled catalog whose sources are gone.
std::string unchecked_note(const CompiledCatalog& compiled, const std::vector<std::string>& unchecked) {
  return fmt::format("{}: not checked against its sources, which are gone ({})", compiled.path().string(),
                     fmt::join(unchecked, ", "));
}

}  // namespace

std::optional<CompiledCatalog> sole_fresh_compiled_catalog(const fs::path& data_dir,
                                                           const std::vector<std::string>& user_catalogs,
                                                           std::vector<std::string>& notes) {
  if (user_catalogs.size() != 1 || !is_compiled_catalog(user_catalogs.front())) return std::nullopt;
  CompiledCatalog compiled(user_catalogs.front());
  std::vector<std::string> unchecked;
  if (!compiled.staleness(data_dir, unchecked).empty()) return std::nullopt;
  if (!unchecked.empty()) notes.push_back(unchecked_note(compiled, unchecked));
  return compiled;
}

namespace {

/// The command that compiles `compiled` again from the same files (a shipped catalog by its name).
std::string recompile_command(const CompiledCatalog& compiled) {
  std::string command = "bine catalog compile";
  for (const auto& f : compiled.files())
    if (f.role == "shipped")
      command += " " + fs::path(f.path).stem().string();
    else if (f.role == "source")
      command += " " + f.path;
  return command + " --out " + compiled.path().string();
}

/// The compiled catalog's sources as JSON catalogs (a shipped one from today's data folder).
void load_sources(const CompiledCatalog& compiled, const fs::path& data_dir, const Lexicon& lexicon,
                  std::vector<Catalog>& catalogs, std::vector<CatalogSource>& sources) {
  for (const auto& f : compiled.files()) {
    if (f.role != "shipped" && f.role != "source") continue;
    const fs::path file = f.role == "shipped" ? data_dir / "catalog" / fs::path(f.path).filename() : fs::path(f.path);
    catalogs.push_back(load_catalog(file, lexicon));
    sources.push_back(catalog_source(data_dir, file, catalogs.back()));
  }
}

}  // namespace

CatalogSource compiled_catalog_source(const CompiledCatalog& compiled) {
  std::string name;
  for (const auto& each : compiled.catalog_names()) name += (name.empty() ? "" : " + ") + each;
  return {name.empty() ? compiled.path().stem().string() : name, fmt::format("compiled {}", compiled.path().string()),
          compiled.demo()};
}

Catalog load_catalogs_with_compiled(const fs::path& data_dir, const Lexicon& lexicon,
                                    const std::vector<fs::path>& files, std::vector<std::string>& notes,
                                    std::vector<CatalogSource>& sources) {
  std::vector<fs::path> compiled_files, json_files;
  for (const auto& file : files) (is_compiled_catalog(file) ? compiled_files : json_files).push_back(file);
  if (compiled_files.size() > 1)
    throw InputError(fmt::format("--catalog {}: one compiled catalog at a time (compile all the sources into one)",
                                 compiled_files[1].string()));
  const CompiledCatalog compiled(compiled_files.front());
  std::vector<std::string> unchecked;
  const std::string why = compiled.staleness(data_dir, unchecked);
  std::vector<Catalog> catalogs;
  if (why.empty()) {
    if (!unchecked.empty()) notes.push_back(unchecked_note(compiled, unchecked));
    catalogs.push_back(compiled.load_all(lexicon));
    sources.push_back(compiled_catalog_source(compiled));
  } else {
    if (!unchecked.empty())
      throw InputError(
          fmt::format("{}: stale ({}), and its sources {} are gone (compile it again from the files you "
                      "have, or give them with --catalog)",
                      compiled.path().string(), why, fmt::join(unchecked, ", ")));
    notes.push_back(fmt::format("{} is stale ({}): read its JSON sources instead (recompile: {})",
                                compiled.path().string(), why, recompile_command(compiled)));
    load_sources(compiled, data_dir, lexicon, catalogs, sources);
  }
  for (const auto& file : json_files) {
    catalogs.push_back(load_catalog(file, lexicon));
    sources.push_back(catalog_source(data_dir, file, catalogs.back()));
  }
  return merge_catalogs(catalogs);
}

CatalogSubset load_data_for_names(const DataFolderChoice& choice, const std::vector<std::string>& user_catalogs,
                                  const std::vector<std::string>& names) {
  CatalogSubset subset;
  const fs::path data_dir = resolve_data_dir(choice);
  std::vector<std::string> notes;
  subset.compiled = sole_fresh_compiled_catalog(data_dir, user_catalogs, notes);
  const auto known = [&](const std::string& name) { return name.empty() || subset.compiled->position_of(name); };
  if (!subset.compiled || !std::all_of(names.begin(), names.end(), known)) {
    subset.compiled.reset();
    subset.data = load_data(choice, user_catalogs);
    return subset;
  }
  subset.data.notes = std::move(notes);
  subset.data.data_dir = data_dir;
  subset.data.lexicon = load_lexicon(data_dir / "lexicon.json");
  subset.data.catalog = subset.compiled->only(names, subset.data.lexicon);
  subset.data.sources.push_back(compiled_catalog_source(*subset.compiled));
  return subset;
}

}  // namespace bine

#pragma once
// Loaders for our file types. Each reads from a string (the file name is only for messages),
// collects every problem, and throws one InputError listing them all; otherwise returns the model.
#include <cstdint>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

Lexicon parse_lexicon(std::string_view text, const std::string& file);
/// Aroma axes in the catalog are checked against the lexicon.
Catalog parse_catalog(std::string_view text, const std::string& file, const Lexicon& lexicon);
Stock parse_stock(std::string_view text, const std::string& file);
Recipe parse_recipe(std::string_view text, const std::string& file);

/// A catalog file over the input limit (kMaxInputBytes) is streamed one variety at a time: each
/// variety's JSON may be up to kMaxRecordBytes, the file up to kMaxStreamedCatalogBytes.
inline constexpr std::uintmax_t kMaxRecordBytes = 1u << 20;
inline constexpr std::uintmax_t kMaxStreamedCatalogBytes = std::uintmax_t{4} << 30;

Lexicon load_lexicon(const std::filesystem::path& path);
/// Reads a catalog file; one larger than the input limit is streamed (same checks, same result).
Catalog load_catalog(const std::filesystem::path& path, const Lexicon& lexicon);
/// The streamed reading load_catalog uses for large files, for any size.
Catalog load_catalog_streamed(const std::filesystem::path& path, const Lexicon& lexicon);
Stock load_stock(const std::filesystem::path& path);
Recipe load_recipe(const std::filesystem::path& path);

/// Merges catalogs in order; a variety name (folded) in two catalogs is an error naming both files.
Catalog merge_catalogs(const std::vector<Catalog>& catalogs);

/// Which of our file types a JSON document is, by its top-level keys.
enum class FileKind { catalog, stock, recipe, lexicon, unknown };
FileKind detect_file_kind(const nlohmann::json& document);
std::string_view to_string(FileKind kind);

/// Validates any of our file types; returns the kind. Throws InputError with every problem.
FileKind check_file(const std::filesystem::path& path, const Lexicon& lexicon);

/// A recipe as JSON in our format, in the brewer's notation and key order (for --write).
nlohmann::ordered_json recipe_to_json(const Recipe& recipe);

/// A computed recipe as bine writes it (recipe_to_json, indented), checked first by the recipe
/// loader's own bounds and the input size limit, so bine never shows or writes a recipe it would
/// refuse to read (a NaN amount, an alpha below the bounds, a file over 32 MB). `what` names it in
/// messages ("the rebalanced recipe"). Throws Infeasible with the loader's reason.
std::string checked_recipe_text(const Recipe& recipe, const std::string& what);

/// A catalog as JSON in our catalog format (numbers canonical, doubles printed to read back exactly),
/// named `name`; parse_catalog reads it back to the same varieties.
nlohmann::json catalog_file_json(const Catalog& catalog, const std::string& name);

}  // namespace bine

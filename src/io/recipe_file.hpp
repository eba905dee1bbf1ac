#pragma once
// A recipe file in either of the formats bine reads: our JSON or BeerXML 1.0, told apart by content
// (an XML document starts with '<'), not by extension. Writing a changed recipe goes back in the
// format the output file's extension names (.xml or .beerxml: BeerXML, .json: our JSON), else in
// the format it was read in.
#include <filesystem>
#include <memory>
#include <string>
#include <vector>

#include "io/beerxml.hpp"
#include "model/hops.hpp"

namespace bine {

enum class RecipeFormat { json, beerxml };

/// A recipe as read, with what the reading assumed and, for BeerXML, the document to write back into.
struct RecipeFile {
  Recipe recipe;
  RecipeFormat format = RecipeFormat::json;
  std::vector<std::string> notes;
  std::shared_ptr<BeerXmlRecipe> beerxml;
};

/// Reads a recipe in either format. Throws InputError naming the file and every problem.
RecipeFile read_recipe_file(const std::filesystem::path& path, const BeerXmlReadOptions& options);

/// The format a written recipe takes: by the extension of `path`, else the source's.
RecipeFormat output_format_for(const std::filesystem::path& path, const RecipeFile& source);

/// Writes `after` (a changed copy of `source.recipe`) to `path` atomically in output_format_for's
/// format. BeerXML needs a BeerXML source: everything bine did not change is written back as read.
/// Returns a note for the brewer ("rebalanced recipe written to F (BeerXML 1.0)").
std::string write_recipe_file(const std::filesystem::path& path, const RecipeFile& source, const Recipe& after,
                              const Catalog* catalog);

}  // namespace bine

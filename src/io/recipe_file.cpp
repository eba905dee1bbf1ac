#include "io/recipe_file.hpp"

#include <fmt/format.h>

#include <cctype>

#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace bine {

RecipeFile read_recipe_file(const std::filesystem::path& path, const BeerXmlReadOptions& options) {
  const std::string text = read_text_file(path);
  RecipeFile file;
  if (!looks_like_xml(text)) {
    file.recipe = parse_recipe(text, path.string());
    return file;
  }
  file.format = RecipeFormat::beerxml;
  file.beerxml = std::make_shared<BeerXmlRecipe>(parse_beerxml_recipe(text, path.string(), options));
  file.recipe = file.beerxml->recipe;
  file.notes = file.beerxml->notes;
  return file;
}

RecipeFormat output_format_for(const std::filesystem::path& path, const RecipeFile& source) {
  std::string extension = path.extension().string();
  for (char& c : extension) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (extension == ".xml" || extension == ".beerxml") return RecipeFormat::beerxml;
  if (extension == ".json") return RecipeFormat::json;
  return source.format;
}

std::string write_recipe_file(const std::filesystem::path& path, const RecipeFile& source, const Recipe& after,
                              const Catalog* catalog) {
  if (output_format_for(path, source) == RecipeFormat::json) {
    // Only what loads again: within the size bine reads and every bound of a recipe.
    write_loadable_file(path, checked_recipe_text(after, path.string()));
    return fmt::format("{} (bine JSON)", path.string());
  }
  if (!source.beerxml)
    throw InputError(
        fmt::format("{}: BeerXML is written only for a recipe read from BeerXML (expected a .json "
                    "file name for a recipe read from bine JSON)",
                    path.string()));
  write_loadable_file(path, beerxml_with_recipe(*source.beerxml, after, catalog));
  return fmt::format("{} (BeerXML 1.0)", path.string());
}

}  // namespace bine

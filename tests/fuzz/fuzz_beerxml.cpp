// Fuzz target: BeerXML recipe files. A recipe that reads must survive the --write path: written
// back unchanged into its own document it must read again with the same additions; anything else
// must be one clear InputError line per problem, never a crash or a hang (DOCTYPE, deep nesting).
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"
#include "io/beerxml.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const std::string file = "recipe.xml";
  bine::BeerXmlRecipe read;
  try {
    read = bine::parse_beerxml_recipe(text, file, {});
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, file);
    return 0;
  }
  bine::fuzz::require(std::isfinite(read.recipe.batch_volume_l) && read.recipe.batch_volume_l > 0.0);
  for (const auto& hop : read.recipe.hops) bine::fuzz::require(std::isfinite(hop.grams) && hop.grams > 0.0);
  const std::string written = bine::beerxml_with_recipe(read, read.recipe, nullptr);
  try {
    const auto again = bine::parse_beerxml_recipe(written, "written.xml", {});
    bine::fuzz::require(again.recipe.hops.size() == read.recipe.hops.size());
  } catch (const bine::InputError&) {
    bine::fuzz::require(false);  // we wrote a document we cannot read back
  }
  return 0;
}

// Fuzz target: recipe files. A recipe that loads must also survive the --write path: written back
// in the brewer's notation by recipe_to_json, it must load again with the same additions.
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const std::string file = "recipe.json";
  bine::Recipe recipe;
  try {
    recipe = bine::parse_recipe(text, file);
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, file);
    return 0;
  }
  bine::fuzz::require(std::isfinite(recipe.batch_volume_l) && recipe.batch_volume_l > 0.0);
  for (const auto& hop : recipe.hops) bine::fuzz::require(std::isfinite(hop.grams) && hop.grams > 0.0);
  const std::string written = bine::recipe_to_json(recipe).dump(2);
  try {
    const bine::Recipe again = bine::parse_recipe(written, "written.json");
    bine::fuzz::require(again.hops.size() == recipe.hops.size());
  } catch (const bine::InputError&) {
    bine::fuzz::require(false);  // we wrote a recipe we cannot read back
  }
  return 0;
}

#include "cli/recipe_file_options.hpp"

#include <fmt/format.h>

#include "io/limits.hpp"

namespace bine::cli {

void add_recipe_file_options(CLI::App* command, RecipeFileOptions& options) {
  command->add_option("--recipe-name", options.recipe_name,
                      "BeerXML: the RECIPE to read when the file holds several (its NAME)");
  command->add_option(
      "--whirlpool-temp", options.whirlpool_temp,
      fmt::format("BeerXML: whirlpool temperature of Aroma additions (default {:g}C)", kDefaultAromaTemperatureC));
}

BeerXmlReadOptions read_recipe_file_options(OptionReader& reader, const RecipeFileOptions& options) {
  BeerXmlReadOptions read;
  read.recipe_name = options.recipe_name;
  read.aroma_temperature_c = reader
                                 .optional_quantity("--whirlpool-temp", options.whirlpool_temp, Dimension::temperature,
                                                    limits::whirlpool_temperature)
                                 .value_or(kDefaultAromaTemperatureC);
  return read;
}

}  // namespace bine::cli

#pragma once
// The options of every command that reads a recipe file, for BeerXML recipes: which RECIPE of a
// file with several (--recipe-name) and the whirlpool temperature of an Aroma addition
// (--whirlpool-temp), which BeerXML does not record.
#include <CLI/CLI.hpp>
#include <string>

#include "cli/option_values.hpp"
#include "io/beerxml.hpp"

namespace bine::cli {

struct RecipeFileOptions {
  std::string recipe_name;
  std::string whirlpool_temp;
};

/// Adds --recipe-name and --whirlpool-temp to `command`.
void add_recipe_file_options(CLI::App* command, RecipeFileOptions& options);

/// How to read a BeerXML recipe; problems go to `reader`.
BeerXmlReadOptions read_recipe_file_options(OptionReader& reader, const RecipeFileOptions& options);

}  // namespace bine::cli

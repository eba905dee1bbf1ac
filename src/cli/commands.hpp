#pragma once
// Each command lives in its own file with one options struct, a setup that binds it to CLI11, and a
// run that calls engines and renders. Engines never see argv.
#include <CLI/CLI.hpp>
#include <string>
#include <vector>

#include "io/data_dir.hpp"
#include "model/quantity.hpp"

namespace bine::cli {

/// Options every command shares.
struct GlobalOptions {
  std::string data_dir;               // --data, env BINE_DATA
  std::vector<std::string> catalogs;  // --catalog FILE (repeatable)
  std::string units = "metric";       // --units metric|us
  bool timings = false;               // --timings
  UnitSystem unit_system() const { return units == "us" ? UnitSystem::us : UnitSystem::metric; }
  DataSet load() const { return load_data(data_dir, catalogs); }
};

void setup_catalog_command(CLI::App& app, const GlobalOptions& globals);
void setup_ibu_command(CLI::App& app, const GlobalOptions& globals);
void setup_age_command(CLI::App& app, const GlobalOptions& globals);
void setup_rebalance_command(CLI::App& app, const GlobalOptions& globals);
void setup_swap_command(CLI::App& app, const GlobalOptions& globals);
void setup_blend_command(CLI::App& app, const GlobalOptions& globals);

}  // namespace bine::cli

#pragma once
// Each command lives in its own file: an options struct of strings and flags bound to CLI11 by its
// setup, one parse_<command>_args that turns them into typed values (the only place strings become
// quantities) and reports every problem at once, and a run that loads data, calls engines and
// renders through the Console. Engines never see argv.
#include <CLI/CLI.hpp>
#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "cli/console.hpp"
#include "io/data_dir.hpp"
#include "model/quantity.hpp"

namespace bine::cli {

/// Options every command shares.
struct GlobalOptions {
  DataFolderChoice data;              // --data DIR, else $BINE_DATA (read once, in app.cpp)
  std::vector<std::string> catalogs;  // --catalog FILE (repeatable)
  std::string units = "metric";       // --units metric|us
  bool timings = false;               // --timings
  UnitSystem unit_system() const { return units == "us" ? UnitSystem::us : UnitSystem::metric; }
};

/// The lexicon and every catalog (shipped and --catalog), timed as "load data".
DataSet load_data(const GlobalOptions& globals, const Console& console);

/// The commands the parser knows, each with what to run when the parse chose it.
class CommandTable {
 public:
  using Run = std::function<void(const Console&)>;
  void add(CLI::App* command, Run run) { commands_.emplace_back(command, std::move(run)); }
  /// Runs the command the parse chose; false when none was chosen.
  bool run_chosen(const Console& console) const;

 private:
  std::vector<std::pair<CLI::App*, Run>> commands_;
};

/// For options that name a file bine writes (--write, --html): refuses an empty name (`--write ''`),
/// which would otherwise read as "not given".
inline CLI::Validator output_file_name() {
  return CLI::Validator(
      [](std::string& value) {
        return value.empty() ? std::string("an empty file name (expected a file name such as out.json)")
                             : std::string();
      },
      "FILE");
}

void setup_catalog_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
/// `bine catalog compile`, a subcommand of `catalog`.
void setup_catalog_compile_command(CLI::App& catalog, const GlobalOptions& globals, CommandTable& commands);
void setup_ibu_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_age_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_rebalance_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_swap_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_blend_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_import_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_calibrate_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);
void setup_stock_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands);

}  // namespace bine::cli

// bine: hop substitution, aroma blending and bitterness arithmetic for brewers.
// This file only wires commands; every computation lives in bine_core.
#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <exception>
#include <iostream>

#include "cli/commands.hpp"
#include "model/errors.hpp"

namespace {

int print_error_lines(const std::vector<std::string>& lines) {
  for (const auto& line : lines) std::cerr << "bine: error: " << line << '\n';
  return bine::kExitBadInput;
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{
      "bine: find hop substitutes, design late-hop blends to a target aroma, and hold a recipe's IBU\n"
      "when lots, alpha acids or storage change. All computations run on your CPU; results are\n"
      "estimates from published models. Hot wort scalds: take care around the kettle and whirlpool."};
  app.name("bine");
  app.set_version_flag("--version", std::string("bine ") + BINE_VERSION);
  app.require_subcommand(1);
  app.fallthrough();

  bine::cli::GlobalOptions globals;
  app.add_option("--data", globals.data_dir, "descriptor-data folder (default: $BINE_DATA, else the installed or source-tree data)")
      ->envname("BINE_DATA");
  app.add_option("--catalog", globals.catalogs, "a catalog file of your own, merged with the shipped ones (repeatable)");
  app.add_option("--units", globals.units, "units for text output: metric (g, L, C) or us (oz, gal, F)")
      ->check(CLI::IsMember({"metric", "us"}));
  app.add_flag("--timings", globals.timings, "print phase timings to stderr");

  bine::cli::setup_catalog_command(app, globals);
  bine::cli::setup_ibu_command(app, globals);
  bine::cli::setup_age_command(app, globals);
  bine::cli::setup_rebalance_command(app, globals);
  bine::cli::setup_swap_command(app, globals);
  bine::cli::setup_blend_command(app, globals);

  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    std::cerr << "bine: error: " << e.what() << " (run 'bine --help' or 'bine COMMAND --help')\n";
    return bine::kExitBadInput;
  } catch (const bine::InputError& e) {
    return print_error_lines(e.lines());
  } catch (const bine::Infeasible& e) {
    std::cerr << "bine: cannot do that: " << e.what() << '\n';
    return bine::kExitInfeasible;
  } catch (const std::bad_alloc&) {
    std::cerr << "bine: error: out of memory (is an input unreasonably large?)\n";
    return bine::kExitBadInput;
  } catch (const std::exception& e) {
    // A bug, not bad input: say so plainly rather than leak a library's message.
    std::cerr << "bine: internal error; please report it with the command you ran\n";
    return 70;
  }
  return 0;
}

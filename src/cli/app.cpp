// The command dispatcher: global options, one subcommand per command file, and the one place where
// errors become exit statuses and single lines for the brewer.
#include "cli/app.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <exception>
#include <iostream>
#include <new>

#include "cli/commands.hpp"
#include "cli/remedies.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine::cli {
namespace {

constexpr std::string_view kAbout =
    "bine: find hop substitutes, design late-hop blends to a target aroma, and hold a recipe's IBU\n"
    "when lots, alpha acids or storage change. All computations run on your CPU; results are\n"
    "estimates from published models. Hot wort scalds: take care around the kettle and whirlpool.";

void add_global_options(CLI::App& app, GlobalOptions& globals) {
  app.add_option("--data", globals.data.folder,
                 "descriptor-data folder (default: $BINE_DATA, else the installed or source-tree data)");
  app.add_option("--catalog", globals.catalogs,
                 "a catalog file of your own (repeatable); it replaces the shipped demo catalog, which is mixed "
                 "in only when named: --catalog demo");
  app.add_option("--units", globals.units, "units for text output: metric (g, L, C) or us (oz, gal, F)")
      ->check(CLI::IsMember({"metric", "us"}));
  app.add_flag("--timings", globals.timings, "print phase timings to stderr");
}

/// The data folder: --data, else $BINE_DATA (the only place bine reads it).
void choose_data_folder(GlobalOptions& globals) {
  if (!globals.data.folder.empty()) {
    globals.data.named_by = "--data " + globals.data.folder;
    return;
  }
  if (const char* env = std::getenv("BINE_DATA"); env != nullptr && *env != '\0') {
    globals.data.folder = env;
    globals.data.named_by = std::string("BINE_DATA=") + env;
  }
}

/// The first word of argv that is not an option or an option's value: the command the brewer typed.
std::string typed_command(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    const std::string_view word = argv[i];
    if (word == "--data" || word == "--catalog" || word == "--units") {
      ++i;
      continue;
    }
    if (!word.empty() && word[0] != '-') return std::string(word);
  }
  return {};
}

/// A parse error in words a brewer can act on; an unknown or missing command names the commands.
std::string parse_problem(const CLI::App& app, const CLI::ParseError& error, int argc, char** argv) {
  std::vector<std::string> names;
  for (const CLI::App* command : app.get_subcommands({})) names.push_back(command->get_name());
  std::string listed;
  for (const auto& name : names) listed += (listed.empty() ? "" : ", ") + name;
  if (app.get_subcommands().empty()) {
    const std::string typed = typed_command(argc, argv);
    if (typed.empty()) return fmt::format("no command given (expected one of {})", listed);
    if (std::find(names.begin(), names.end(), typed) == names.end()) {
      const std::string hint = did_you_mean(typed, names);
      return fmt::format("unknown command \"{}\" ({}expected one of {})", typed, hint.empty() ? "" : hint + "; ",
                         listed);
    }
  }
  return std::string(error.what());
}

}  // namespace

bool CommandTable::run_chosen(const Console& console) const {
  for (const auto& [command, run] : commands_) {
    if (!command->parsed()) continue;
    run(console);
    return true;
  }
  return false;
}

DataSet load_data(const GlobalOptions& globals, const Console& console) {
  const auto timer = console.time("load data");
  DataSet data = load_data(globals.data, globals.catalogs);
  for (const auto& note : data.notes) console.err << "bine: note: " << note << '\n';
  return data;
}

namespace {

int run_command_line(int argc, char** argv, std::ostream& out, std::ostream& err) {
  try {
    CLI::App app{std::string(kAbout)};
    app.name("bine");
    app.set_version_flag("--version", std::string("bine ") + BINE_VERSION);
    app.require_subcommand(1);
    app.fallthrough();
    GlobalOptions globals;
    add_global_options(app, globals);
    CommandTable commands;
    setup_catalog_command(app, globals, commands);
    setup_ibu_command(app, globals, commands);
    setup_age_command(app, globals, commands);
    setup_rebalance_command(app, globals, commands);
    setup_swap_command(app, globals, commands);
    setup_blend_command(app, globals, commands);
    setup_import_command(app, globals, commands);
    setup_calibrate_command(app, globals, commands);
    setup_stock_command(app, globals, commands);
    try {
      app.parse(argc, argv);
    } catch (const CLI::CallForHelp& e) {
      return app.exit(e, out, err);
    } catch (const CLI::CallForAllHelp& e) {
      return app.exit(e, out, err);
    } catch (const CLI::CallForVersion& e) {
      return app.exit(e, out, err);
    } catch (const CLI::ParseError& e) {
      err << "bine: error: " << message_line(parse_problem(app, e, argc, argv))
          << " (run 'bine --help' or 'bine COMMAND --help')\n";
      return kExitBadInput;
    }
    choose_data_folder(globals);
    const Console console{out, err, globals.timings, &err == &std::cerr && isatty(STDERR_FILENO) == 1};
    commands.run_chosen(console);
  } catch (const InputError& e) {
    for (const auto& line : e.lines()) err << "bine: error: " << with_remedies(line, e.remedies()) << '\n';
    return kExitBadInput;
  } catch (const Infeasible& e) {
    err << "bine: cannot do that: " << with_remedies(e.what(), e.remedies()) << '\n';
    return kExitInfeasible;
  } catch (const std::bad_alloc&) {
    err << "bine: error: out of memory (is an input unreasonably large?)\n";
    return kExitBadInput;
  } catch (const std::exception&) {
    // A bug, not bad input: say so plainly rather than leak a library's message.
    err << "bine: internal error; please report it with the command you ran\n";
    return 70;
  }
  return 0;
}

}  // namespace

int run(int argc, char** argv, std::ostream& out, std::ostream& err) {
  const int status = run_command_line(argc, argv, out, err);
  // Output that never arrived (a full disk, a closed stdout) is a failure, not a success.
  out.flush();
  if (out) return status;
  // The stream keeps no error code; errno still holds the failed write's when it is one of these.
  const int saved = errno;
  const bool known =
      saved == ENOSPC || saved == EBADF || saved == EIO || saved == EPIPE || saved == EFBIG || saved == EDQUOT;
  err << "bine: error: the output could not be written"
      << (known ? std::string(" (") + std::strerror(saved) + ")" : std::string()) << '\n';
  return status != 0 ? status : kExitOutputFailed;
}

}  // namespace bine::cli

// The command dispatcher: global options, one subcommand per command file, and the one place where
// errors become exit statuses and single lines for the brewer.
#include "cli/app.hpp"

#include <CLI/CLI.hpp>
#include <exception>
#include <iostream>
#include <new>

#include "cli/commands.hpp"
#include "model/errors.hpp"

namespace bine::cli {
namespace {

/// Commands print to std::cout (and warnings or timings to std::cerr); while run() is active those
/// point at the caller's streams, so tests and the fuzzer can capture or drop them in-process.
/// Restored on every exit path.
class Redirect {
 public:
  Redirect(std::ostream& standard, std::ostream& to)
      : standard_(standard), saved_(&standard == &to ? nullptr : standard.rdbuf(to.rdbuf())) {}
  ~Redirect() {
    if (saved_ != nullptr) standard_.rdbuf(saved_);
  }
  Redirect(const Redirect&) = delete;
  Redirect& operator=(const Redirect&) = delete;

 private:
  std::ostream& standard_;
  std::streambuf* saved_;
};

int print_error_lines(std::ostream& err, const std::vector<std::string>& lines) {
  for (const auto& line : lines) err << "bine: error: " << line << '\n';
  return kExitBadInput;
}

}  // namespace

int run(int argc, char** argv, std::ostream& out, std::ostream& err) {
  const Redirect redirect_out(std::cout, out);
  const Redirect redirect_err(std::cerr, err);
  try {
    CLI::App app{
        "bine: find hop substitutes, design late-hop blends to a target aroma, and hold a recipe's IBU\n"
        "when lots, alpha acids or storage change. All computations run on your CPU; results are\n"
        "estimates from published models. Hot wort scalds: take care around the kettle and whirlpool."};
    app.name("bine");
    app.set_version_flag("--version", std::string("bine ") + BINE_VERSION);
    app.require_subcommand(1);
    app.fallthrough();

    GlobalOptions globals;
    app.add_option("--data", globals.data_dir,
                   "descriptor-data folder (default: $BINE_DATA, else the installed or source-tree data)")
        ->envname("BINE_DATA");
    app.add_option("--catalog", globals.catalogs,
                   "a catalog file of your own, merged with the shipped ones (repeatable)");
    app.add_option("--units", globals.units, "units for text output: metric (g, L, C) or us (oz, gal, F)")
        ->check(CLI::IsMember({"metric", "us"}));
    app.add_flag("--timings", globals.timings, "print phase timings to stderr");

    setup_catalog_command(app, globals);
    setup_ibu_command(app, globals);
    setup_age_command(app, globals);
    setup_rebalance_command(app, globals);
    setup_swap_command(app, globals);
    setup_blend_command(app, globals);

    try {
      app.parse(argc, argv);
    } catch (const CLI::CallForHelp& e) {
      return app.exit(e, out, err);
    } catch (const CLI::CallForAllHelp& e) {
      return app.exit(e, out, err);
    } catch (const CLI::CallForVersion& e) {
      return app.exit(e, out, err);
    } catch (const CLI::ParseError& e) {
      err << "bine: error: " << e.what() << " (run 'bine --help' or 'bine COMMAND --help')\n";
      return kExitBadInput;
    }
  } catch (const InputError& e) {
    return print_error_lines(err, e.lines());
  } catch (const Infeasible& e) {
    err << "bine: cannot do that: " << e.what() << '\n';
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

}  // namespace bine::cli

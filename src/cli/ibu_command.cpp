#include "cli/commands.hpp"

namespace bine::cli {

void setup_ibu_command(CLI::App& app, const GlobalOptions& /*globals*/) {
  app.add_subcommand("ibu", "(not yet available)");
}

}  // namespace bine::cli

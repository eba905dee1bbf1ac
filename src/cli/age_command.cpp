#include "cli/commands.hpp"

namespace bine::cli {

void setup_age_command(CLI::App& app, const GlobalOptions& /*globals*/) {
  app.add_subcommand("age", "(not yet available)");
}

}  // namespace bine::cli

#include "cli/commands.hpp"

namespace bine::cli {

void setup_swap_command(CLI::App& app, const GlobalOptions& /*globals*/) {
  app.add_subcommand("swap", "(not yet available)");
}

}  // namespace bine::cli

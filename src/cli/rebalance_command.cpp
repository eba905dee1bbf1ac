#include "cli/commands.hpp"

namespace bine::cli {

void setup_rebalance_command(CLI::App& app, const GlobalOptions& /*globals*/) {
  app.add_subcommand("rebalance", "(not yet available)");
}

}  // namespace bine::cli

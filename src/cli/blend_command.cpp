#include "cli/commands.hpp"

namespace bine::cli {

void setup_blend_command(CLI::App& app, const GlobalOptions& /*globals*/) {
  app.add_subcommand("blend", "(not yet available)");
}

}  // namespace bine::cli

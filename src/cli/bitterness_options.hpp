#pragma once
// The options that choose how bitterness is computed (--model, --pellet-factor, --calibration),
// bound and read the same way by every command that computes IBU.
#include <CLI/CLI.hpp>
#include <string>

#include "cli/option_values.hpp"
#include "engine/bitterness.hpp"

namespace bine::cli {

struct BitternessOptions {
  std::string model = "tinseth";
  std::string pellet_factor;
  std::string calibration;
};

/// Adds --model, --pellet-factor and --calibration to `command`.
void add_bitterness_options(CLI::App* command, BitternessOptions& options);

/// The settings the options give; problems go to `reader`.
BitternessSettings read_bitterness_options(OptionReader& reader, const BitternessOptions& options);

}  // namespace bine::cli

#pragma once
// The options that choose how bitterness is computed (--model, --pellet-factor, --calibration,
// --brewhouse or BINE_BREWHOUSE), bound and read the same way by every command that computes IBU.
#include <CLI/CLI.hpp>
#include <string>

#include "cli/option_values.hpp"
#include "engine/bitterness.hpp"

namespace bine::cli {

struct BitternessOptions {
  std::string model;  // empty: tinseth, or the profile's
  std::string pellet_factor;
  std::string calibration;
  std::string brewhouse;  // empty: $BINE_BREWHOUSE, if set
};

/// Adds --model and --pellet-factor (the model a calibration fits) to `command`.
void add_model_options(CLI::App* command, BitternessOptions& options);
/// Adds --model, --pellet-factor, --calibration and --brewhouse to `command`.
void add_bitterness_options(CLI::App* command, BitternessOptions& options);

/// Adds --alpha-tolerance (a certificate's alpha tolerance for the IBU intervals) to `command`.
void add_alpha_tolerance_option(CLI::App* command, std::string& tolerance);
/// The tolerance --alpha-tolerance gives, in % of the value (default kDefaultCertificateTolerancePercent).
double read_alpha_tolerance(OptionReader& reader, const std::string& tolerance);

/// The model and pellet factor the options give; problems go to `reader`.
BitternessSettings read_model_options(OptionReader& reader, const BitternessOptions& options);
/// The settings the options give, with the brewhouse profile's model, pellet factor and factors when
/// --brewhouse (else BINE_BREWHOUSE) names one; problems go to `reader`.
BitternessSettings read_bitterness_options(OptionReader& reader, const BitternessOptions& options);

}  // namespace bine::cli

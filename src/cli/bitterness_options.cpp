#include "cli/bitterness_options.hpp"

#include <fmt/format.h>

#include <cmath>
#include <cstdlib>

#include "engine/ibu_interval.hpp"
#include "io/brewhouse_profile.hpp"
#include "io/limits.hpp"
#include "model/errors.hpp"

namespace bine::cli {
namespace {

/// The profile's settings, checked against --model and --pellet-factor if they were given too.
void apply_profile(OptionReader& reader, const BitternessOptions& options, const std::string& named_by,
                   const BrewhouseProfile& profile, BitternessSettings& settings) {
  const auto profile_model = ibu_model_from(profile.model).value_or(IbuModel::tinseth);
  if (!options.model.empty() && ibu_model_from(options.model) && *ibu_model_from(options.model) != profile_model)
    reader.add(fmt::format("--model: {} differs from the {} model the brewhouse profile {} ({}) was fitted with",
                           options.model, profile.model, profile.source_file, named_by));
  if (!options.pellet_factor.empty() && std::abs(settings.pellet_factor - profile.pellet_factor) > 1e-12)
    reader.add(fmt::format("--pellet-factor: {} differs from the {:g} the brewhouse profile {} ({}) was fitted with",
                           options.pellet_factor, profile.pellet_factor, profile.source_file, named_by));
  if (!options.calibration.empty())
    reader.add(fmt::format("--calibration: cannot be given with the brewhouse profile {} ({}), which sets the factor",
                           profile.source_file, named_by));
  settings.model = profile_model;
  settings.pellet_factor = profile.pellet_factor;
  if (profile.boil_factor && profile.late_factor) {
    settings.calibration = profile.boil_factor->value;
    settings.late_calibration = profile.late_factor->value;
  } else {
    settings.calibration = profile.factor.value;
  }
  settings.brewhouse = profile;
}

}  // namespace

void add_model_options(CLI::App* command, BitternessOptions& options) {
  command->add_option("--model", options.model, "tinseth (default) or rager");
  command->add_option("--pellet-factor", options.pellet_factor,
                      "utilization multiplier for pellets and powder (default 1.10, common practice)");
}

void add_bitterness_options(CLI::App* command, BitternessOptions& options) {
  add_model_options(command, options);
  command->add_option("--calibration", options.calibration,
                      "your brewhouse's measured/predicted IBU ratio, applied to every addition (default 1.0)");
  command->add_option("--brewhouse", options.brewhouse,
                      "brewhouse profile from bine calibrate (default: $BINE_BREWHOUSE): its model, pellet factor "
                      "and factors");
}

void add_alpha_tolerance_option(CLI::App* command, std::string& tolerance) {
  command->add_option("--alpha-tolerance", tolerance,
                      "a certificate's alpha tolerance, +- % of the value, read as a 90 % range (default 5 %)");
}

double read_alpha_tolerance(OptionReader& reader, const std::string& tolerance) {
  return reader.optional_quantity("--alpha-tolerance", tolerance, Dimension::percent, limits::alpha_tolerance)
      .value_or(kDefaultCertificateTolerancePercent);
}

BitternessSettings read_model_options(OptionReader& reader, const BitternessOptions& options) {
  BitternessSettings settings;
  if (auto model = ibu_model_from(options.model.empty() ? "tinseth" : options.model))
    settings.model = *model;
  else
    reader.add(fmt::format("--model: \"{}\": unknown model (expected tinseth or rager)", options.model));
  if (auto factor =
          reader.optional_quantity("--pellet-factor", options.pellet_factor, Dimension::number, limits::pellet_factor))
    settings.pellet_factor = *factor;
  return settings;
}

BitternessSettings read_bitterness_options(OptionReader& reader, const BitternessOptions& options) {
  BitternessSettings settings = read_model_options(reader, options);
  if (auto factor =
          reader.optional_quantity("--calibration", options.calibration, Dimension::number, limits::calibration))
    settings.calibration = *factor;
  std::string path = options.brewhouse;
  std::string named_by = "--brewhouse";
  if (path.empty())
    if (const char* env = std::getenv("BINE_BREWHOUSE"); env != nullptr && *env != '\0') {
      path = env;
      named_by = "BINE_BREWHOUSE";
    }
  if (path.empty()) return settings;
  try {
    apply_profile(reader, options, named_by, load_brewhouse_profile(path), settings);
  } catch (const InputError& error) {
    for (const auto& line : error.lines()) reader.add(line + fmt::format(" (the brewhouse profile, {})", named_by));
  }
  return settings;
}

}  // namespace bine::cli

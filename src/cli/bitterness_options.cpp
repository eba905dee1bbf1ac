#include "cli/bitterness_options.hpp"

#include <fmt/format.h>

#include "io/limits.hpp"

namespace bine::cli {

void add_bitterness_options(CLI::App* command, BitternessOptions& options) {
  command->add_option("--model", options.model, "tinseth (default) or rager");
  command->add_option("--pellet-factor", options.pellet_factor,
                      "utilization multiplier for pellets and powder (default 1.10, common practice)");
  command->add_option("--calibration", options.calibration,
                      "your brewhouse's measured/predicted IBU ratio, applied to every addition (default 1.0)");
}

BitternessSettings read_bitterness_options(OptionReader& reader, const BitternessOptions& options) {
  BitternessSettings settings;
  if (auto model = ibu_model_from(options.model))
    settings.model = *model;
  else
    reader.add(fmt::format("--model: \"{}\": unknown model (expected tinseth or rager)", options.model));
  if (auto factor =
          reader.optional_quantity("--pellet-factor", options.pellet_factor, Dimension::number, limits::pellet_factor))
    settings.pellet_factor = *factor;
  if (auto factor =
          reader.optional_quantity("--calibration", options.calibration, Dimension::number, limits::calibration))
    settings.calibration = *factor;
  return settings;
}

}  // namespace bine::cli

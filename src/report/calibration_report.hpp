#pragma once
// Rendering a brewhouse calibration (bine calibrate) as text or JSON.
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>

#include "engine/calibration.hpp"
#include "model/brewhouse.hpp"

namespace bine {

/// What the command did besides fitting: the log, the model, where the profile went.
struct CalibrationContext {
  std::string log_file;
  std::string model;  // "tinseth" or "rager"
  double pellet_factor = 1.10;
  std::vector<std::string> brewed;  // brew date of each batch, YYYY-MM-DD
  std::string profile_file;         // empty: not written
  bool drop_outliers = false;
  std::vector<std::string> notes;
};

/// Text: one row per batch (lab, model, fitted IBU, residual, flag), the factor with its 95 %
/// interval, flagged batches, the split if asked, the profile written.
void render_calibration(std::ostream& out, const Calibration& calibration, const CalibrationContext& context,
                        const BrewhouseProfile& profile);
/// JSON of the same; deterministic.
nlohmann::json calibration_to_json(const Calibration& calibration, const CalibrationContext& context,
                                   const BrewhouseProfile& profile);

}  // namespace bine

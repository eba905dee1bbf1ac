#pragma once
// A brewhouse profile: the factors on utilization that a calibration against lab-measured IBU
// found (bine calibrate), read back by every command that computes IBU.
#include <optional>
#include <string>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// A factor with its standard error and 95 % confidence interval (Student's t, `degrees_of_freedom`).
struct FittedFactor {
  double value = 1.0;
  double standard_error = 0.0;
  double low = 1.0;   // 95 % interval
  double high = 1.0;  // 95 % interval
  int degrees_of_freedom = 0;
};

/// What `brewhouse.json` holds.
struct BrewhouseProfile {
  std::string model = "tinseth";            // the IBU model the factors were fitted with
  double pellet_factor = 1.10;              // the pellet factor they were fitted with
  FittedFactor factor;                      // one factor on every addition
  std::optional<FittedFactor> boil_factor;  // with a significant split: boil and first-wort additions
  std::optional<FittedFactor> late_factor;  // with a significant split: whirlpool and flame-out additions
  Date made{};
  std::vector<std::string> batches_used;
  std::vector<std::string> batches_left_out;  // outliers fitted without, on request
  std::string source_file;                    // where it was read from, for messages and outputs
};

}  // namespace bine

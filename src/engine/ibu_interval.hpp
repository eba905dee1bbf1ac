#pragma once
// 90 % intervals around IBU figures: what the alpha in the kettle and the brewhouse factor leave
// uncertain, propagated exactly where the figure is linear in them and by a seeded Monte Carlo
// where it is not. See ibu_interval.cpp and docs/methods.md#ibu-intervals.
#include <optional>
#include <utility>
#include <vector>

namespace bine {

/// Certificate alpha tolerance, +- % of the value, read as a 90 % range (from memory; a setting).
inline constexpr double kDefaultCertificateTolerancePercent = 5.0;
/// Half-width, in points of % left after 6 months, of the stability range used for ageing (ours:
/// half the 15-point spacing of the good / fair / poor classes).
inline constexpr double kStabilityHalfRange = 7.5;
/// Monte Carlo draws and seed (fixed: the same inputs give the same interval).
inline constexpr int kMonteCarloDraws = 10000;
inline constexpr unsigned long long kMonteCarloSeed = 20260315ULL;
/// The interval's coverage.
inline constexpr double kIntervalCoverage = 0.90;

/// Storage ageing between the certificate and the brew day: A = A_cert x exp(-k(S) x exposure),
/// k(S) = ln(100 / S) / 180 per day, exposure = TF x SF x days (engine/storage_loss.hpp).
struct AgeingUncertainty {
  double stability_percent = 65.0;  // S used
  double half_range = kStabilityHalfRange;
  double exposure_days = 0.0;  // TF x SF x days
};

/// One addition: its IBU is `ibu_per_alpha` x alpha (at the central factor). Alpha is normal
/// around `alpha_percent` with standard deviation `alpha_sd` (0: known exactly), then aged.
struct AdditionUncertainty {
  double ibu_per_alpha = 0.0;  // IBU per % alpha in the kettle, at the central factor
  double alpha_percent = 0.0;  // central alpha before ageing (the certificate's, or as used)
  double alpha_sd = 0.0;       // % alpha
  std::optional<AgeingUncertainty> ageing;
  int factor_group = 0;  // 0: boil (or the one factor), 1: late
};

/// A brewhouse factor estimated with Student's t uncertainty: f = value + SE x T(dof).
struct FactorUncertainty {
  double value = 1.0;
  double standard_error = 0.0;
  int degrees_of_freedom = 1;
};

struct IbuRange {
  double low = 0.0;
  double high = 0.0;
};

struct IbuIntervals {
  std::vector<IbuRange> additions;  // one per AdditionUncertainty
  IbuRange total;
  bool monte_carlo = false;  // false: exact (normal, linear)
};

struct RecipeBitterness;
struct BitternessSettings;
struct Catalog;

/// The factor uncertainty per group a profile gives: [boil or one factor, late factor].
std::vector<std::optional<FactorUncertainty>> factor_uncertainties(const BitternessSettings& settings);
/// How one addition of a recipe is uncertain: the recipe's alpha within the certificate tolerance,
/// a catalog midpoint over the catalog's range; the group of its factor.
AdditionUncertainty addition_uncertainty(double ibu, double alpha_percent, bool from_catalog,
                                         std::optional<std::pair<double, double>> catalog_range, bool late,
                                         double tolerance_percent);
/// The intervals of every addition and the total of a recipe's bitterness (bine ibu): catalog
/// midpoints over the variety's catalog range in `catalog`.
IbuIntervals recipe_intervals(const RecipeBitterness& bitterness, const Catalog& catalog, double tolerance_percent);

/// A normal standard deviation from a range read as a 90 % range: (max - min) / (2 x 1.6449).
double sd_from_90_range(double min, double max);

/// The 90 % intervals. `factors[g]` is the factor uncertainty of group g (none: known exactly).
/// Exact when no factor is uncertain and nothing is aged; else 10^4 seeded draws, unless
/// `force_monte_carlo` (for the test that the two agree).
IbuIntervals ibu_intervals(const std::vector<AdditionUncertainty>& additions,
                           const std::vector<std::optional<FactorUncertainty>>& factors,
                           bool force_monte_carlo = false);

}  // namespace bine

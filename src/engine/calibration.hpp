#pragma once
// Calibrating a brewhouse: the factor on utilization that brings the model's IBU to the lab's,
// by least squares through the origin (one factor) or with separate boil and late-hop factors.
// See calibration.cpp and docs/methods.md#calibration.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "engine/cellar.hpp"
#include "engine/rebalance.hpp"
#include "engine/recipe_bitterness.hpp"
#include "model/brewhouse.hpp"

namespace bine {

/// One logged beer: the lab's IBU and the model's IBU at factor 1, split into what the boil
/// (boil and first-wort additions) and the late hops (whirlpool and flame-out additions) gave.
struct CalibrationBatch {
  std::string label;  // "batch 3 (pale-ale.json, 2026-03-14)"
  double lab_ibu = 0.0;
  double boil_ibu = 0.0;
  double late_ibu = 0.0;
  double model_ibu() const { return boil_ibu + late_ibu; }
  bool has_late_hops() const { return late_ibu > 0.0; }
};

/// Least squares through the origin y = f m: the factor, residuals and outliers.
struct OneFactorFit {
  FittedFactor factor;
  double residual_variance = 0.0;  // s^2, IBU^2
  int degrees_of_freedom = 0;      // n - 1
  double t_975 = 0.0;              // t(0.975, n - 1)
  std::vector<double> residuals;   // y_i - f m_i, IBU, one per batch given
  double residual_median = 0.0;
  double robust_sd = 0.0;             // 1.4826 x MAD of the residuals, IBU
  std::vector<std::size_t> outliers;  // batches more than 3 robust deviations off
};

/// y = fb mb + fl ml: two factors and whether they differ (F test against one factor).
struct TwoFactorFit {
  FittedFactor boil;
  FittedFactor late;
  double residual_variance = 0.0;  // s^2, IBU^2
  int degrees_of_freedom = 0;      // n - 2
  double f_statistic = 0.0;        // (RSS1 - RSS2) / (RSS2 / (n - 2))
  double p_value = 1.0;            // P(F(1, n - 2) > f_statistic)
  bool significant = false;        // p < 0.05
  std::vector<double> residuals;
};

/// Fits one factor over `batches` (at least 2, model IBU > 0). Throws InputError otherwise.
OneFactorFit fit_one_factor(const std::vector<CalibrationBatch>& batches);
/// Fits boil and late factors (at least 3 batches whose late shares differ). Throws InputError
/// when the two cannot be told apart.
TwoFactorFit fit_two_factors(const std::vector<CalibrationBatch>& batches);

/// What bine calibrate found: the fit on every batch, the fit without outliers when asked, and the
/// split when asked. `used` are the batches the final factor rests on.
struct Calibration {
  std::vector<CalibrationBatch> batches;
  OneFactorFit all;
  std::optional<OneFactorFit> without_outliers;
  std::optional<TwoFactorFit> split;
  std::vector<std::size_t> used;
  std::size_t late_batches = 0;  // used batches with late hops
  const OneFactorFit& final_fit() const { return without_outliers ? *without_outliers : all; }
};

/// Batches with late hops that --split needs (6, so that 4 degrees of freedom remain).
inline constexpr std::size_t kSplitMinimumLateBatches = 6;

/// Fits one factor; refits without the flagged batches when `drop_outliers`; with `split`, also
/// the boil and late factors (Infeasible with fewer than 6 used batches that have late hops).
Calibration calibrate(std::vector<CalibrationBatch> batches, bool drop_outliers, bool split);

/// The profile to write: the final factor, the split factors when the split is significant, the
/// batches used and left out.
BrewhouseProfile profile_from(const Calibration& calibration, const BitternessSettings& settings, Date made);

/// A logged beer from its bitterness at factor 1: boil and first-wort additions against the late
/// ones (whirlpool and flame-out, engine/bitterness.hpp is_late_addition).
CalibrationBatch calibration_batch(const RecipeBitterness& bitterness, std::string label, double lab_ibu);

/// The recipe as it was brewed from `cellar` (aged to the brew day): the grams as written, weighed
/// from the lots the one allocation rule gives (engine/lot_allocation.hpp, stale lots included: the
/// beer was brewed with them), each part at its lot's alpha and form.
Recipe recipe_as_brewed(const Recipe& recipe, const Cellar& cellar, std::vector<std::string>& notes);

/// Robust deviation multiple beyond which a batch is flagged (3, docs/methods.md#calibration-outliers).
inline constexpr double kOutlierDeviations = 3.0;
/// The scale that makes a MAD estimate a normal standard deviation: 1 / Phi^-1(3/4) = 1.4826.
inline constexpr double kMadToSd = 1.482602218505602;

}  // namespace bine

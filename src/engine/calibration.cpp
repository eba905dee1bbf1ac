// Brewhouse calibration from lab-measured IBU.
//
// Method (docs/methods.md#calibration). Every bitterness model here is linear in its utilization,
// so a brewhouse that gets more or less of it than the model scales every addition's IBU by one
// factor f: y_i = f m_i + error, with y the lab's IBU and m the model's IBU at factor 1. No
// intercept (no hops, no IBU). Ordinary least squares through the origin [Draper N.R. & Smith H.
// 1998, Applied Regression Analysis, 3rd ed., regression through the origin]:
//   f = sum(m y) / sum(m^2); s^2 = sum((y - f m)^2) / (n - 1); SE(f) = s / sqrt(sum(m^2));
//   95 %: f +- t(0.975, n - 1) SE(f).
// Two factors (boil, late): y = fb mb + fl ml, (fb, fl) = (X^T X)^-1 X^T y, s^2 = RSS / (n - 2),
// SE = sqrt(diag(s^2 (X^T X)^-1)), each +- t(0.975, n - 2) SE. The split is tested against one
// factor by the extra-sum-of-squares F test: F = (RSS1 - RSS2) / (RSS2 / (n - 2)) on (1, n - 2)
// degrees of freedom [Draper & Smith 1998, the extra sum of squares principle].
// Outliers: residuals more than 3 robust deviations from their median, the robust deviation being
// 1.4826 x the median absolute deviation (MAD) [Hampel F.R. 1974, J. Am. Stat. Assoc. 69:383-393
// (citation from memory)]. The MAD is used because one bad batch inflates s itself.
#include "engine/calibration.hpp"

#include <fmt/format.h>

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>

#include "engine/lot_allocation.hpp"
#include "engine/statistics.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

double median(std::vector<double> values) {
  if (values.empty()) return 0.0;
  std::sort(values.begin(), values.end());
  const std::size_t n = values.size();
  return n % 2 == 1 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

FittedFactor interval(double value, double standard_error, double t, int degrees_of_freedom) {
  return FittedFactor{value, standard_error, value - t * standard_error, value + t * standard_error,
                      degrees_of_freedom};
}

void flag_outliers(OneFactorFit& fit) {
  fit.residual_median = median(fit.residuals);
  std::vector<double> deviations;
  for (double r : fit.residuals) deviations.push_back(std::abs(r - fit.residual_median));
  fit.robust_sd = kMadToSd * median(deviations);
  if (fit.robust_sd <= 0.0) return;  // more than half the residuals equal: nothing to scale by
  for (std::size_t i = 0; i < fit.residuals.size(); ++i)
    if (deviations[i] > kOutlierDeviations * fit.robust_sd) fit.outliers.push_back(i);
}

}  // namespace

OneFactorFit fit_one_factor(const std::vector<CalibrationBatch>& batches) {
  if (batches.size() < 2)
    throw InputError(fmt::format("{} batch{} to fit: a factor and its interval need at least 2", batches.size(),
                                 batches.size() == 1 ? "" : "es"));
  double smy = 0.0;
  double smm = 0.0;
  for (const auto& batch : batches) {
    smy += batch.model_ibu() * batch.lab_ibu;
    smm += batch.model_ibu() * batch.model_ibu();
  }
  if (smm <= 0.0) throw InputError("every batch has 0 model IBU: there is nothing to calibrate");
  OneFactorFit fit;
  const double f = smy / smm;
  double rss = 0.0;
  for (const auto& batch : batches) {
    const double r = batch.lab_ibu - f * batch.model_ibu();
    fit.residuals.push_back(r);
    rss += r * r;
  }
  fit.degrees_of_freedom = static_cast<int>(batches.size()) - 1;
  fit.residual_variance = rss / fit.degrees_of_freedom;
  fit.t_975 = student_t_quantile(0.975, fit.degrees_of_freedom);
  fit.factor = interval(f, std::sqrt(fit.residual_variance / smm), fit.t_975, fit.degrees_of_freedom);
  flag_outliers(fit);
  return fit;
}

TwoFactorFit fit_two_factors(const std::vector<CalibrationBatch>& batches) {
  const auto n = static_cast<Eigen::Index>(batches.size());
  if (n < 3) throw InputError(fmt::format("{} batches to fit two factors: they need at least 3", n));
  Eigen::MatrixXd x(n, 2);
  Eigen::VectorXd y(n);
  for (Eigen::Index i = 0; i < n; ++i) {
    const auto& batch = batches[static_cast<std::size_t>(i)];
    x(i, 0) = batch.boil_ibu;
    x(i, 1) = batch.late_ibu;
    y(i) = batch.lab_ibu;
  }
  const Eigen::Matrix2d xtx = x.transpose() * x;
  // Collinear columns (every batch with the same late share, or none with late hops) cannot be split.
  const double determinant = xtx.determinant();
  if (!(determinant > 1e-10 * xtx(0, 0) * xtx(1, 1)))
    throw InputError("the batches' late-hop shares do not differ enough to tell a boil factor from a late-hop factor");
  const Eigen::Matrix2d inverse = xtx.inverse();
  const Eigen::Vector2d beta = inverse * (x.transpose() * y);
  const Eigen::VectorXd residuals = y - x * beta;
  TwoFactorFit fit;
  const double rss2 = residuals.squaredNorm();
  fit.degrees_of_freedom = static_cast<int>(n) - 2;
  fit.residual_variance = rss2 / fit.degrees_of_freedom;
  const double t = student_t_quantile(0.975, fit.degrees_of_freedom);
  fit.boil = interval(beta(0), std::sqrt(fit.residual_variance * inverse(0, 0)), t, fit.degrees_of_freedom);
  fit.late = interval(beta(1), std::sqrt(fit.residual_variance * inverse(1, 1)), t, fit.degrees_of_freedom);
  fit.residuals.assign(residuals.data(), residuals.data() + n);
  const OneFactorFit one = fit_one_factor(batches);
  double rss1 = 0.0;
  for (double r : one.residuals) rss1 += r * r;
  fit.f_statistic = fit.residual_variance > 0.0 ? std::max(rss1 - rss2, 0.0) / fit.residual_variance : 0.0;
  fit.p_value = f_distribution_sf(fit.f_statistic, 1.0, fit.degrees_of_freedom);
  fit.significant = fit.p_value < 0.05;
  return fit;
}

Calibration calibrate(std::vector<CalibrationBatch> batches, bool drop_outliers, bool split) {
  Calibration result;
  result.batches = std::move(batches);
  result.all = fit_one_factor(result.batches);
  std::vector<CalibrationBatch> used;
  for (std::size_t i = 0; i < result.batches.size(); ++i) {
    const bool outlier =
        std::find(result.all.outliers.begin(), result.all.outliers.end(), i) != result.all.outliers.end();
    if (drop_outliers && outlier) continue;
    result.used.push_back(i);
    used.push_back(result.batches[i]);
  }
  if (drop_outliers && used.size() < result.batches.size()) result.without_outliers = fit_one_factor(used);
  result.late_batches = static_cast<std::size_t>(
      std::count_if(used.begin(), used.end(), [](const CalibrationBatch& b) { return b.has_late_hops(); }));
  if (split) {
    if (result.late_batches < kSplitMinimumLateBatches)
      throw Infeasible(
          fmt::format("{} of the batches used have late hops: a boil and a late-hop factor need at "
                      "least {} such batches",
                      result.late_batches, kSplitMinimumLateBatches));
    result.split = fit_two_factors(used);
  }
  return result;
}

CalibrationBatch calibration_batch(const RecipeBitterness& bitterness, std::string label, double lab_ibu) {
  CalibrationBatch batch;
  batch.label = std::move(label);
  batch.lab_ibu = lab_ibu;
  for (const auto& line : bitterness.additions)
    (is_late_addition(line.use, line.minutes) ? batch.late_ibu : batch.boil_ibu) += line.bitterness.ibu;
  return batch;
}

Recipe recipe_as_brewed(const Recipe& recipe, const Cellar& cellar, std::vector<std::string>& notes) {
  Recipe written = with_named_lots(recipe, cellar, notes);
  AllocationSettings settings = allocation_of(cellar);
  settings.allow_stale = true;
  // What was weighed is the grams as written: each lot gives one gram per gram.
  std::vector<LotDemand> by_grams;
  for (const HopAddition& hop : written.hops)
    by_grams.push_back(LotDemand{hop.grams, [](const CellarLot&) { return 1.0; }});
  const LotAllocation allocation = allocate_lots(written, cellar, by_grams, settings);
  notes.insert(notes.end(), allocation.notes.begin(), allocation.notes.end());
  Recipe brewed = written;
  brewed.hops.clear();
  for (const auto& a : allocation.additions) {
    const HopAddition& hop = written.hops[a.index];
    if (a.parts.empty()) brewed.hops.push_back(hop);
    for (const auto& part : a.parts) {
      const CellarLot& lot = cellar.lots[part.lot];
      HopAddition piece = hop;
      piece.grams = part.grams;
      piece.lot = lot.code;
      piece.alpha_acid = lot.alpha_today;
      piece.form = lot.lot.form;
      brewed.hops.push_back(piece);
    }
  }
  return brewed;
}

BrewhouseProfile profile_from(const Calibration& calibration, const BitternessSettings& settings, Date made) {
  BrewhouseProfile profile;
  profile.model = std::string(to_string(settings.model));
  profile.pellet_factor = settings.pellet_factor;
  profile.factor = calibration.final_fit().factor;
  if (calibration.split && calibration.split->significant) {
    profile.boil_factor = calibration.split->boil;
    profile.late_factor = calibration.split->late;
  }
  profile.made = made;
  for (std::size_t i = 0; i < calibration.batches.size(); ++i) {
    const bool used = std::find(calibration.used.begin(), calibration.used.end(), i) != calibration.used.end();
    (used ? profile.batches_used : profile.batches_left_out).push_back(calibration.batches[i].label);
  }
  return profile;
}

}  // namespace bine

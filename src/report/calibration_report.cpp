#include "report/calibration_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "report/bitterness_report.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

std::string factor_text(const FittedFactor& factor) {
  return fmt::format("{:.3f} (95 % {:.3f}-{:.3f})", factor.value, factor.low, factor.high);
}

bool is_outlier(const OneFactorFit& fit, std::size_t index) {
  return std::find(fit.outliers.begin(), fit.outliers.end(), index) != fit.outliers.end();
}

bool is_used(const Calibration& calibration, std::size_t index) {
  return std::find(calibration.used.begin(), calibration.used.end(), index) != calibration.used.end();
}

void render_batches(std::ostream& out, const Calibration& calibration) {
  const OneFactorFit& fit = calibration.all;
  TextTable table({{"#", Align::right},
                   {"batch, brewed"},
                   {"lab", Align::right},
                   {"model x1", Align::right},
                   {"late part", Align::right},
                   {"fitted", Align::right},
                   {"residual", Align::right},
                   {"robust dev.", Align::right},
                   {""}});
  for (std::size_t i = 0; i < calibration.batches.size(); ++i) {
    const auto& batch = calibration.batches[i];
    const double deviation = fit.robust_sd > 0.0 ? (fit.residuals[i] - fit.residual_median) / fit.robust_sd : 0.0;
    std::string flag = is_outlier(fit, i) ? "off by > 3" : "";
    if (!is_used(calibration, i)) flag += ", left out";
    table.add_row({std::to_string(i + 1), batch.label, fmt::format("{:.1f} IBU", batch.lab_ibu),
                   fmt::format("{:.1f} IBU", batch.model_ibu()), fmt::format("{:.1f} IBU", batch.late_ibu),
                   fmt::format("{:.1f} IBU", fit.factor.value * batch.model_ibu()),
                   fmt::format("{:+.1f} IBU", fit.residuals[i]), fmt::format("{:+.1f}", deviation), flag});
  }
  table.render(out);
  out << "  (model x1 = the model's IBU at factor 1; fitted = factor x model; residual = lab - fitted; robust dev. "
         "= (residual - median) / (1.4826 x MAD))\n";
}

void render_fit(std::ostream& out, const std::string& title, const OneFactorFit& fit, std::size_t n) {
  out << fmt::format("{}: factor {} from {} batches; t(0.975, {}) = {:.3f}, s = {:.2f} IBU, SE {:.4f}.\n", title,
                     factor_text(fit.factor), n, fit.degrees_of_freedom, fit.t_975, std::sqrt(fit.residual_variance),
                     fit.factor.standard_error);
}

void render_split(std::ostream& out, const TwoFactorFit& split) {
  out << fmt::format(
      "\nSplit: boil factor {}, late-hop factor {}; F = {:.2f} on (1, {}) degrees of freedom, p = {:.3f}: {}.\n",
      factor_text(split.boil), factor_text(split.late), split.f_statistic, split.degrees_of_freedom, split.p_value,
      split.significant ? "the two factors differ (significant at 5 %); the profile keeps both"
                        : "not significant at 5 %; the profile keeps the one factor");
}

}  // namespace

void render_calibration(std::ostream& out, const Calibration& calibration, const CalibrationContext& context,
                        const BrewhouseProfile& profile) {
  out << fmt::format("Brewhouse calibration: {} batches from {}, {} model, pellet factor {:.2f}\n\n",
                     calibration.batches.size(), context.log_file, context.model == "rager" ? "Rager" : "Tinseth",
                     context.pellet_factor);
  render_batches(out, calibration);
  out << '\n';
  render_fit(out, "All batches", calibration.all, calibration.batches.size());
  if (calibration.without_outliers)
    render_fit(out, "Without the flagged batches", *calibration.without_outliers, calibration.used.size());
  if (!calibration.all.outliers.empty() && !context.drop_outliers)
    out << fmt::format(
        "{} batch{} more than 3 robust deviations off: check the lab result and the recipe as brewed; "
        "--without-outliers fits without {}.\n",
        calibration.all.outliers.size(), calibration.all.outliers.size() == 1 ? " is" : "es are",
        calibration.all.outliers.size() == 1 ? "it" : "them");
  if (calibration.used.size() < 5) out << "Few batches: the interval is wide; log more lab results to narrow it.\n";
  if (calibration.split) render_split(out, *calibration.split);
  if (!context.notes.empty()) {
    out << "\nNotes:\n";
    for (const auto& note : context.notes) out << "  - " << note << '\n';
  }
  if (!context.profile_file.empty())
    out << fmt::format("\nWrote brewhouse profile {} ({}, {} model, {} batches, {}).\n", context.profile_file,
                       describe_profile(profile), profile.model, profile.batches_used.size(),
                       format_date(profile.made));
}

nlohmann::json calibration_to_json(const Calibration& calibration, const CalibrationContext& context,
                                   const BrewhouseProfile& profile) {
  using nlohmann::json;
  const auto factor_json = [](const FittedFactor& f) {
    return json{{"value", rounded(f.value, 9)},
                {"standard_error", rounded(f.standard_error, 9)},
                {"low_95", rounded(f.low, 9)},
                {"high_95", rounded(f.high, 9)},
                {"degrees_of_freedom", f.degrees_of_freedom}};
  };
  const auto fit_json = [&](const OneFactorFit& fit) {
    return json{{"factor", factor_json(fit.factor)},
                {"residual_variance", rounded(fit.residual_variance, 9)},
                {"t_975", rounded(fit.t_975, 9)},
                {"robust_sd", rounded(fit.robust_sd, 6)},
                {"outliers", [&] {
                   json list = json::array();
                   for (auto i : fit.outliers) list.push_back(i + 1);
                   return list;
                 }()}};
  };
  json out;
  out["log"] = context.log_file;
  out["model"] = context.model;
  out["pellet_factor"] = context.pellet_factor;
  json batches = json::array();
  for (std::size_t i = 0; i < calibration.batches.size(); ++i) {
    const auto& b = calibration.batches[i];
    batches.push_back({{"index", i + 1},
                       {"batch", b.label},
                       {"brewed", context.brewed[i]},
                       {"lab_ibu", rounded(b.lab_ibu, 3)},
                       {"model_ibu", rounded(b.model_ibu(), 6)},
                       {"boil_ibu", rounded(b.boil_ibu, 6)},
                       {"late_ibu", rounded(b.late_ibu, 6)},
                       {"residual_ibu", rounded(calibration.all.residuals[i], 6)},
                       {"outlier", is_outlier(calibration.all, i)},
                       {"used", is_used(calibration, i)}});
  }
  out["batches"] = std::move(batches);
  out["all"] = fit_json(calibration.all);
  out["without_outliers"] = calibration.without_outliers ? fit_json(*calibration.without_outliers) : json(nullptr);
  if (calibration.split)
    out["split"] = {{"boil", factor_json(calibration.split->boil)},
                    {"late", factor_json(calibration.split->late)},
                    {"residual_variance", rounded(calibration.split->residual_variance, 9)},
                    {"f_statistic", rounded(calibration.split->f_statistic, 9)},
                    {"p_value", rounded(calibration.split->p_value, 9)},
                    {"significant", calibration.split->significant}};
  else
    out["split"] = nullptr;
  out["profile"] = context.profile_file.empty() ? json(nullptr) : json(context.profile_file);
  out["profile_factors"] = describe_profile(profile);
  out["notes"] = context.notes;
  return out;
}

}  // namespace bine

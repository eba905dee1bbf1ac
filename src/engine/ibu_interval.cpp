// IBU intervals (docs/methods.md#ibu-intervals).
//
// Method. Every IBU figure is a sum of additions IBU_i = c_i x A_i x f_g(i)/f_g, with c_i the IBU per
// % alpha at the central factor, A_i the alpha in the kettle and f the brewhouse factor. What is
// uncertain:
//   * A_i from a catalog range [min, max] (no certificate): normal, the range read as its 90 % range
//     (ours), sd = (max - min) / (2 x 1.6449);
//   * A_i from a certificate (or written in the recipe): normal, +- the certificate tolerance (5 %
//     of the value by default, a setting, from memory) read as its 90 % range;
//   * ageing from the certificate to the brew day: A = A_cert exp(-k(S) E), k(S) = ln(100/S)/180
//     [Garetz 1994], with the stability S uniform over S +- 7.5 points (ours);
//   * the brewhouse factor f: f_hat + SE x T, T Student's t with the fit's degrees of freedom
//     (the sampling distribution of a least-squares coefficient [Draper & Smith 1998]).
// Without factor or ageing uncertainty the sum is linear in normal variables, so it is normal with
// variance sum(c_i^2 sd_i^2) and the 90 % interval is exact: mean +- 1.6449 sd. Otherwise (a product
// of uncertain terms, an exponential in S) 10^4 draws from a fixed-seed mt19937_64 (normal by
// Box-Muller, uniform by the 53-bit mantissa) give the 5 % and 95 % points of every addition and of
// the total, the same for the same inputs. A drawn alpha below 0 counts as 0.
#include "engine/ibu_interval.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <random>

#include "engine/cellar.hpp"
#include "engine/recipe_bitterness.hpp"
#include "engine/statistics.hpp"
#include "engine/storage_loss.hpp"
#include "model/catalog_lookup.hpp"

namespace bine {
namespace {

constexpr double kPi = 3.14159265358979323846;

double z_interval() {
  static const double z = normal_quantile(0.5 + 0.5 * kIntervalCoverage);
  return z;
}

/// Deterministic draws from one mt19937_64 stream.
class Draws {
 public:
  explicit Draws(unsigned long long seed) : engine_(seed) {}
  double uniform() { return (static_cast<double>(engine_() >> 11) + 0.5) * 0x1.0p-53; }  // (0, 1)
  double normal() {
    if (spare_) {
      const double value = *spare_;
      spare_.reset();
      return value;
    }
    const double radius = std::sqrt(-2.0 * std::log(uniform()));
    const double angle = 2.0 * kPi * uniform();
    spare_ = radius * std::sin(angle);
    return radius * std::cos(angle);
  }
  /// Student's t as Z / sqrt(chi^2 / dof), chi^2 a sum of dof squared normals.
  double student_t(int dof) {
    const double z = normal();
    double chi2 = 0.0;
    for (int i = 0; i < dof; ++i) {
      const double n = normal();
      chi2 += n * n;
    }
    return z / std::sqrt(chi2 / dof);
  }

 private:
  std::mt19937_64 engine_;
  std::optional<double> spare_;
};

double quantile_of_sorted(const std::vector<double>& sorted, double p) {
  // Linear interpolation between order statistics (the default of numpy.quantile).
  const double position = p * static_cast<double>(sorted.size() - 1);
  const auto below = static_cast<std::size_t>(std::floor(position));
  const std::size_t above = std::min(below + 1, sorted.size() - 1);
  return sorted[below] + (position - static_cast<double>(below)) * (sorted[above] - sorted[below]);
}

IbuRange range_of(std::vector<double> values) {
  std::sort(values.begin(), values.end());
  const double tail = 0.5 * (1.0 - kIntervalCoverage);
  return IbuRange{quantile_of_sorted(values, tail), quantile_of_sorted(values, 1.0 - tail)};
}

/// The exact interval of a sum of independent normal terms: mean +- z sqrt(sum of variances).
IbuRange exact_sum(const std::vector<AdditionUncertainty>& additions, const std::vector<std::size_t>& which) {
  double mean = 0.0;
  double variance = 0.0;
  for (const std::size_t i : which) {
    const auto& a = additions[i];
    mean += a.ibu_per_alpha * a.alpha_percent;
    variance += (a.ibu_per_alpha * a.alpha_sd) * (a.ibu_per_alpha * a.alpha_sd);
  }
  return IbuRange{mean - z_interval() * std::sqrt(variance), mean + z_interval() * std::sqrt(variance)};
}

IbuIntervals exact_intervals(const std::vector<AdditionUncertainty>& additions,
                             const std::vector<std::vector<std::size_t>>& subtotals) {
  IbuIntervals result;
  std::vector<std::size_t> all;
  for (std::size_t i = 0; i < additions.size(); ++i) {
    result.additions.push_back(exact_sum(additions, {i}));
    all.push_back(i);
  }
  result.total = exact_sum(additions, all);
  for (const auto& which : subtotals) result.subtotals.push_back(exact_sum(additions, which));
  return result;
}

double drawn_alpha(const AdditionUncertainty& a, Draws& draws) {
  double alpha = std::max(a.alpha_percent + a.alpha_sd * draws.normal(), 0.0);
  if (a.ageing) {
    const double s =
        std::clamp(a.ageing->stability_percent + a.ageing->half_range * (2.0 * draws.uniform() - 1.0), 1.0, 100.0);
    alpha *= std::exp(-std::log(100.0 / s) / 180.0 * a.ageing->exposure_days);  // Garetz 1994
  }
  return alpha;
}

IbuIntervals monte_carlo_intervals(const std::vector<AdditionUncertainty>& additions,
                                   const std::vector<std::optional<FactorUncertainty>>& factors,
                                   const std::vector<std::vector<std::size_t>>& subtotals) {
  Draws draws(kMonteCarloSeed);
  std::vector<std::vector<double>> per_addition(additions.size());
  std::vector<double> totals;
  totals.reserve(kMonteCarloDraws);
  for (auto& values : per_addition) values.reserve(kMonteCarloDraws);
  std::vector<double> scale(factors.size(), 1.0);
  for (int draw = 0; draw < kMonteCarloDraws; ++draw) {
    for (std::size_t g = 0; g < factors.size(); ++g)
      if (factors[g] && factors[g]->value > 0.0)
        scale[g] = std::max(factors[g]->value + factors[g]->standard_error *
                                                    draws.student_t(std::max(factors[g]->degrees_of_freedom, 1)),
                            0.0) /
                   factors[g]->value;
    double total = 0.0;
    for (std::size_t i = 0; i < additions.size(); ++i) {
      const auto& a = additions[i];
      const auto group = static_cast<std::size_t>(a.factor_group);
      const double ibu = a.ibu_per_alpha * drawn_alpha(a, draws) * (group < scale.size() ? scale[group] : 1.0);
      per_addition[i].push_back(ibu);
      total += ibu;
    }
    totals.push_back(total);
  }
  IbuIntervals result;
  result.monte_carlo = true;
  for (const auto& which : subtotals) {
    std::vector<double> sums(static_cast<std::size_t>(kMonteCarloDraws), 0.0);
    for (const std::size_t i : which)
      for (std::size_t draw = 0; draw < sums.size(); ++draw) sums[draw] += per_addition[i][draw];
    result.subtotals.push_back(range_of(std::move(sums)));
  }
  for (auto& values : per_addition) result.additions.push_back(range_of(std::move(values)));
  result.total = range_of(std::move(totals));
  return result;
}

}  // namespace

double sd_from_90_range(double min, double max) { return (max - min) / (2.0 * z_interval()); }

IbuIntervals ibu_intervals(const std::vector<AdditionUncertainty>& additions,
                           const std::vector<std::optional<FactorUncertainty>>& factors, bool force_monte_carlo,
                           const std::vector<std::vector<std::size_t>>& subtotals) {
  const bool factor_uncertain =
      std::any_of(factors.begin(), factors.end(), [](const auto& f) { return f && f->standard_error > 0.0; });
  const bool aged = std::any_of(additions.begin(), additions.end(), [](const auto& a) { return a.ageing.has_value(); });
  IbuIntervals result = !factor_uncertain && !aged && !force_monte_carlo
                            ? exact_intervals(additions, subtotals)
                            : monte_carlo_intervals(additions, factors, subtotals);
  result.aged = aged;
  return result;
}

std::vector<std::optional<FactorUncertainty>> factor_uncertainties(const BitternessSettings& settings) {
  std::vector<std::optional<FactorUncertainty>> factors(2);
  if (!settings.brewhouse) return factors;
  const BrewhouseProfile& profile = *settings.brewhouse;
  const auto uncertainty = [](const FittedFactor& f) {
    return FactorUncertainty{f.value, f.standard_error, std::max(f.degrees_of_freedom, 1)};
  };
  if (profile.boil_factor && profile.late_factor) {
    factors[0] = uncertainty(*profile.boil_factor);
    factors[1] = uncertainty(*profile.late_factor);
  } else {
    factors[0] = uncertainty(profile.factor);
    factors[1] = factors[0];
  }
  return factors;
}

AdditionUncertainty addition_uncertainty(const IbuTerm& term, double tolerance_percent) {
  AdditionUncertainty a;
  a.alpha_percent = term.alpha_percent;
  a.ibu_per_alpha = term.alpha_percent > 0.0 ? term.ibu / term.alpha_percent : 0.0;
  a.factor_group = term.late ? 1 : 0;
  if (term.origin.ageing) {
    // The draws age the certificate's alpha: the certificate's value is the alpha in the kettle over
    // what is left at the central stability, A / exp(-k(S) E) (Garetz 1994).
    const AgeingUncertainty& ageing = *term.origin.ageing;
    a.ageing = ageing;
    a.alpha_percent =
        term.alpha_percent / std::exp(-std::log(100.0 / ageing.stability_percent) / 180.0 * ageing.exposure_days);
  }
  if (term.origin.catalog_range)
    a.alpha_sd = sd_from_90_range(term.origin.catalog_range->first, term.origin.catalog_range->second);
  else
    a.alpha_sd = sd_from_90_range(a.alpha_percent * (1.0 - tolerance_percent / 100.0),
                                  a.alpha_percent * (1.0 + tolerance_percent / 100.0));
  return a;
}

AgeingUncertainty ageing_uncertainty(double stability_percent, const Storage& storage, double days) {
  return AgeingUncertainty{stability_percent, kStabilityHalfRange,
                           temperature_factor(storage.temperature_c) * package_factor(storage.package) * days};
}

AlphaOrigin lot_alpha_origin(const CellarLot& lot, const Variety* variety) {
  AlphaOrigin origin;
  if (lot.basis == AlphaBasis::aged && lot.lot.storage)
    origin.ageing = ageing_uncertainty(lot.stability_percent, *lot.lot.storage, static_cast<double>(lot.days));
  else if (lot.basis == AlphaBasis::catalog_midpoint && variety != nullptr && variety->alpha_acid)
    origin.catalog_range = std::make_pair(variety->alpha_acid->min, variety->alpha_acid->max);
  return origin;
}

IbuTerm recipe_term(const AdditionLine& line, const Catalog& catalog) {
  IbuTerm term{line.bitterness.ibu, line.alpha_percent, {}, is_late_addition(line.use, line.minutes)};
  const Variety* variety = find_variety(catalog, line.variety);
  if (line.alpha_source == AlphaSource::catalog_midpoint && variety != nullptr && variety->alpha_acid)
    term.origin.catalog_range = std::make_pair(variety->alpha_acid->min, variety->alpha_acid->max);
  return term;
}

IbuIntervals term_intervals(const std::vector<IbuTerm>& terms, const BitternessSettings& settings,
                            double tolerance_percent, const std::vector<std::vector<std::size_t>>& subtotals) {
  std::vector<AdditionUncertainty> additions;
  for (const auto& term : terms) additions.push_back(addition_uncertainty(term, tolerance_percent));
  return ibu_intervals(additions, factor_uncertainties(settings), false, subtotals);
}

IbuIntervals recipe_intervals(const RecipeBitterness& bitterness, const Catalog& catalog, double tolerance_percent) {
  return recipe_intervals(bitterness, catalog, tolerance_percent, {});
}

IbuIntervals recipe_intervals(const RecipeBitterness& bitterness, const Catalog& catalog, double tolerance_percent,
                              const std::vector<std::optional<AlphaOrigin>>& origins) {
  std::vector<IbuTerm> terms;
  for (const auto& line : bitterness.additions) {
    terms.push_back(recipe_term(line, catalog));
    if (line.index < origins.size() && origins[line.index]) terms.back().origin = *origins[line.index];
  }
  return term_intervals(terms, bitterness.settings, tolerance_percent);
}

}  // namespace bine

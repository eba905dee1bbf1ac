// Bitterness: how many IBU one hop addition puts into the wort.
//
// Method. Every model here has the same shape: IBU = U x (mg/L of alpha acid added), where
// mg/L = AA x W x 1000 / V with V the volume at the end of the boil. Only the utilization U differs:
//   * Tinseth (default) [Tinseth G., "Glenn's Hop Utilization Numbers", ca. 1997]:
//       U = B(G) x F(t), B(G) = 1.65 x 0.000125^(G - 1), F(t) = (1 - e^(-0.04 t)) / 4.15.
//   * Rager [Rager J., "Calculating Hop Bitterness in Beer", Zymurgy 13(4), 1990]: U from his
//     table, here through the smooth fit U% = 18.11 + 13.86 tanh((t - 31.32) / 18.27) (from memory,
//     Hall M.L., Zymurgy 1997), and IBU divided by (1 + GA), GA = (G - 1.050) / 0.2 above 1.050.
// Both models then take the pellet factor (x 1.10 for pellets and powder, common practice; a
// setting) and a brewhouse calibration factor (a setting, 1.0 by default). Because U does not depend
// on the amount, IBU is exactly linear in grams x alpha: the rebalance and blend engines rely on it.
//
// Below boiling. Isomerisation slows as the wort cools. Malowicki & Shellhammer (2005, J. Agric.
// Food Chem. 53:4434) measured the rate constant k1 = 7.9e11 exp(-11858 / T) per minute (T in K).
// A stand of t minutes at T counts as t x k1(T) / k1(100 C) boil minutes ("boil-equivalent"), and
// U = B(G) x (1 - e^(-0.04 (t_boil + t_eq))) / 4.15 (derived method, docs/methods.md#boil-equivalent-minutes).
// Whirlpool additions have t_boil = 0; boil and first-wort additions add the recipe's hop_stand, if any.
//
// A whirlpool addition may give its cooling course (straight to an end temperature, or Newton's law
// with a constant): t_eq is then the integral of k1(T(t)) / k1(100 C) over the stand, computed by
// adaptive Simpson quadrature to 1e-12 min (docs/methods.md#cooling-whirlpool). Below 90 C the rates
// are an extrapolation of the fit beyond the range it was measured over; the addition says so.
//
// Simplifications (say them to the brewer): the boil gravity is the recipe's original gravity; the
// boil is at 100 C (no altitude correction); a whirlpool without a course and the recipe's hop stand
// are held at one temperature (real kettles cool; measured whirlpool utilization in a production
// brewery averaged about 30 % of alpha [Justus 2018, MBAA TQ 55(3)], so large kettles can get more
// than this estimate); first-wort hops count the full boil (common practice); dry hops add 0 IBU.
// With Rager, an addition at or after flame-out scales the fit's 0-minute floor (5.1 %) by
// k1(T) / k1(100 C) at the temperature it goes in at (ours, docs/methods.md#rager-stand-floor).
#include "engine/bitterness.hpp"

#include <algorithm>
#include <cmath>

namespace bine {
namespace {

constexpr double kKelvinOffset = 273.15;
constexpr double kBoilCelsius = 100.0;

// Minutes the addition isomerises for, in boil minutes.
double effective_minutes(const HopAddition& hop, const WortContext& wort) {
  switch (hop.use) {
    case HopUse::first_wort:  // in the kettle for the whole boil (common practice)
      return wort.boil_minutes + wort.stand_equivalent_minutes;
    case HopUse::boil:
      return hop.minutes.value_or(0.0) + wort.stand_equivalent_minutes;
    case HopUse::whirlpool:
      if (!hop.minutes || !hop.temperature_c) return 0.0;
      return boil_equivalent_minutes(TemperatureCourse{*hop.temperature_c, *hop.minutes, hop.cooling});
    case HopUse::dry_hop:
      return 0.0;
  }
  return 0.0;
}

// The wort temperature an addition at or after flame-out goes in at; nullopt for hops that boiled.
std::optional<double> flame_out_temperature(const HopAddition& hop, const WortContext& wort) {
  if (hop.use == HopUse::whirlpool) return hop.temperature_c;
  if (hop.use == HopUse::boil && hop.minutes.value_or(0.0) <= 0.0) return wort.stand_temperature_c;
  return std::nullopt;
}

bool sits_below_measured_range(const HopAddition& hop, const WortContext& wort) {
  if (hop.use == HopUse::whirlpool && hop.minutes && hop.temperature_c)
    return TemperatureCourse{*hop.temperature_c, *hop.minutes, hop.cooling}.lowest_c() < kLowestMeasuredCelsius;
  if (hop.use == HopUse::boil || hop.use == HopUse::first_wort)
    return wort.stand_temperature_c && *wort.stand_temperature_c < kLowestMeasuredCelsius;
  return false;
}

// One step of adaptive Simpson quadrature on [a, b] with midpoint m and values fa, fm, fb.
template <typename F>
double adaptive_simpson(const F& f, double a, double b, double fa, double fm, double fb, double whole, double tolerance,
                        int depth) {
  const double m = 0.5 * (a + b);
  const double lm = 0.5 * (a + m);
  const double rm = 0.5 * (m + b);
  const double flm = f(lm);
  const double frm = f(rm);
  const double left = (m - a) / 6.0 * (fa + 4.0 * flm + fm);
  const double right = (b - m) / 6.0 * (fm + 4.0 * frm + fb);
  const double delta = left + right - whole;
  if (depth <= 0 || std::abs(delta) <= 15.0 * tolerance) return left + right + delta / 15.0;
  return adaptive_simpson(f, a, m, fa, flm, fm, left, 0.5 * tolerance, depth - 1) +
         adaptive_simpson(f, m, b, fm, frm, fb, right, 0.5 * tolerance, depth - 1);
}

}  // namespace

double TemperatureCourse::at(double minute) const {
  const double t = std::clamp(minute, 0.0, std::max(minutes, 0.0));
  if (!cooling) return start_c;
  if (cooling->to_c) return minutes > 0.0 ? start_c + (*cooling->to_c - start_c) * t / minutes : start_c;
  // Newton's law of cooling: T(t) = T_ambient + (T0 - T_ambient) e^(-k t).
  return cooling->ambient_c + (start_c - cooling->ambient_c) * std::exp(-cooling->per_minute.value_or(0.0) * t);
}

double boil_equivalent_minutes(const TemperatureCourse& course) {
  if (course.minutes <= 0.0) return 0.0;
  if (!course.cooling) return boil_equivalent_minutes(course.minutes, course.start_c);
  // t_eq = integral_0^t r(T(tau)) d tau, r = k1(T) / k1(100 C) (docs/methods.md#cooling-whirlpool).
  const auto r = [&](double minute) { return relative_isomerization_rate(course.at(minute)); };
  const double a = 0.0;
  const double b = course.minutes;
  const double fa = r(a);
  const double fm = r(0.5 * (a + b));
  const double fb = r(b);
  const double whole = (b - a) / 6.0 * (fa + 4.0 * fm + fb);
  return adaptive_simpson(r, a, b, fa, fm, fb, whole, 1e-12, 40);
}

double rager_flame_out_utilization(double effective_minutes, double celsius) {
  // U = r x U_R(0) + (U_R(t_eq) - U_R(0)), r = k1(T) / k1(100 C) (ours, docs/methods.md#rager-stand-floor).
  const double floor = rager_utilization(0.0);
  return relative_isomerization_rate(celsius) * floor + (rager_utilization(effective_minutes) - floor);
}

bool is_late_addition(HopUse use, std::optional<double> minutes) {
  return use == HopUse::whirlpool || (use == HopUse::boil && minutes.value_or(0.0) <= 0.0);
}

double form_factor(std::optional<HopForm> form, const BitternessSettings& settings) {
  // A hop without a form is taken as pellet (the common case); callers note it.
  return form.value_or(HopForm::pellet) == HopForm::whole ? 1.0 : settings.pellet_factor;
}

std::string_view to_string(IbuModel model) { return model == IbuModel::rager ? "rager" : "tinseth"; }

std::optional<IbuModel> ibu_model_from(std::string_view text) {
  if (text == "tinseth") return IbuModel::tinseth;
  if (text == "rager") return IbuModel::rager;
  return std::nullopt;
}

WortContext wort_of(const Recipe& recipe) {
  WortContext wort;
  wort.volume_l = recipe.batch_volume_l;
  wort.gravity = recipe.original_gravity;  // simplification: boil gravity = OG
  wort.boil_minutes = recipe.boil_minutes;
  if (recipe.hop_stand) {
    wort.stand_equivalent_minutes = boil_equivalent_minutes(recipe.hop_stand->minutes, recipe.hop_stand->temperature_c);
    wort.stand_temperature_c = recipe.hop_stand->temperature_c;
  }
  return wort;
}

double alpha_mg_per_litre(double grams, double alpha_percent, double volume_l) {
  if (volume_l <= 0.0) return 0.0;
  return (alpha_percent / 100.0) * grams * 1000.0 / volume_l;
}

// Tinseth (ca. 1997): B(G) = 1.65 x 0.000125^(G - 1).
double tinseth_gravity_factor(double gravity) { return 1.65 * std::pow(0.000125, gravity - 1.0); }

// Tinseth (ca. 1997): F(t) = (1 - e^(-0.04 t)) / 4.15.
double tinseth_time_factor(double minutes) { return (1.0 - std::exp(-0.04 * std::max(minutes, 0.0))) / 4.15; }

double tinseth_utilization(double gravity, double minutes) {
  return tinseth_gravity_factor(gravity) * tinseth_time_factor(minutes);
}

// Rager (1990) table as the tanh fit U% = 18.11 + 13.86 tanh((t - 31.32) / 18.27) (from memory).
double rager_utilization(double minutes) {
  return (18.11 + 13.86 * std::tanh((std::max(minutes, 0.0) - 31.32) / 18.27)) / 100.0;
}

// Rager (1990): GA = (Gboil - 1.050) / 0.2 when Gboil > 1.050, else 0.
double rager_gravity_adjustment(double gravity) { return gravity > 1.050 ? (gravity - 1.050) / 0.2 : 0.0; }

// Malowicki & Shellhammer (2005): k1 = 7.9e11 x exp(-11858 / T) per minute, T in kelvin.
double isomerization_rate(double celsius) { return 7.9e11 * std::exp(-11858.0 / (celsius + kKelvinOffset)); }

double relative_isomerization_rate(double celsius) {
  // The pre-exponential factor cancels: exp(-11858 (1/T - 1/T_boil)).
  const double t = celsius + kKelvinOffset;
  const double t_boil = kBoilCelsius + kKelvinOffset;
  return std::exp(-11858.0 * (1.0 / t - 1.0 / t_boil));
}

double boil_equivalent_minutes(double minutes, double celsius) {
  return std::max(minutes, 0.0) * relative_isomerization_rate(celsius);
}

AdditionBitterness addition_bitterness(const HopAddition& hop, double alpha_percent, const WortContext& wort,
                                       const BitternessSettings& settings) {
  AdditionBitterness result;
  if (hop.use == HopUse::dry_hop) return result;  // dry hops add no IBU (below isomerisation)
  result.effective_minutes = effective_minutes(hop, wort);
  result.rate_extrapolated = sits_below_measured_range(hop, wort);
  const double brewhouse = is_late_addition(hop.use, hop.minutes)
                               ? settings.late_calibration.value_or(settings.calibration)
                               : settings.calibration;
  const double factors = form_factor(hop.form, settings) * brewhouse;
  const double mg_per_litre = alpha_mg_per_litre(hop.grams, alpha_percent, wort.volume_l);
  switch (settings.model) {
    case IbuModel::tinseth:
      result.utilization = tinseth_utilization(wort.gravity, result.effective_minutes) * factors;
      result.ibu = result.utilization * mg_per_litre;
      break;
    case IbuModel::rager:
      // Rager: IBU = W x U x AA x 1000 / (V x (1 + GA)).
      if (const auto celsius = flame_out_temperature(hop, wort))
        result.utilization = rager_flame_out_utilization(result.effective_minutes, *celsius) * factors;
      else
        result.utilization = rager_utilization(result.effective_minutes) * factors;
      result.ibu = result.utilization * mg_per_litre / (1.0 + rager_gravity_adjustment(wort.gravity));
      break;
  }
  return result;
}

double bu_gu_ratio(double ibu, double original_gravity) {
  const double gravity_units = (original_gravity - 1.0) * 1000.0;
  return gravity_units > 0.0 ? ibu / gravity_units : 0.0;
}

// Reading (common practice): < 0.3 sweet, 0.5-0.6 balanced, 0.8-1.0 very bitter; the gaps between
// those bands are named as gaps rather than given words of our own.
std::string bu_gu_reading(double ratio) {
  if (ratio < 0.3) return "sweet (malt-forward)";
  if (ratio < 0.5) return "between sweet and balanced";
  if (ratio <= 0.6) return "balanced";
  if (ratio < 0.8) return "between balanced and very bitter";
  if (ratio <= 1.0) return "very bitter";
  return "beyond very bitter (above 1.0)";
}

}  // namespace bine

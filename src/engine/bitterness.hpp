#pragma once
// Bitterness models (API shared by ibu, rebalance and blend). See bitterness.cpp for the essay and
// sources (docs/methods.md#bitterness and #below-boiling).
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/brewhouse.hpp"
#include "model/hops.hpp"

namespace bine {

enum class IbuModel { tinseth, rager };
std::string_view to_string(IbuModel model);
/// "tinseth" or "rager"; nullopt otherwise.
std::optional<IbuModel> ibu_model_from(std::string_view text);

struct BitternessSettings {
  IbuModel model = IbuModel::tinseth;
  double pellet_factor = 1.10;                // utilization multiplier for pellets and powder (common practice)
  double calibration = 1.0;                   // brewhouse calibration factor on every addition (boil ones when split)
  std::optional<double> late_calibration;     // a split profile's factor on whirlpool and flame-out additions
  std::optional<BrewhouseProfile> brewhouse;  // the profile the factors came from, if any
};

/// Whirlpool additions and boil additions at 0 minutes (flame-out): the "late" additions a split
/// brewhouse profile gives their own factor (docs/methods.md#calibration-batches).
bool is_late_addition(HopUse use, std::optional<double> minutes);

/// The wort the hops go into: volume at the end of the boil, boil gravity (the recipe's OG is used),
/// boil length, and the boil-equivalent minutes of a hot stand after flame-out (recipe "hop_stand")
/// that boil and first-wort additions sit through.
struct WortContext {
  double volume_l = 0.0;
  double gravity = 1.0;
  double boil_minutes = 60.0;
  double stand_equivalent_minutes = 0.0;
  std::optional<double> stand_temperature_c;  // the hop stand's temperature, when there is one
};
WortContext wort_of(const Recipe& recipe);

struct AdditionBitterness {
  double effective_minutes = 0.0;  // boil minutes + boil-equivalent stand minutes
  double utilization = 0.0;        // fraction of alpha acid turned into measured IBU (incl. factors)
  double ibu = 0.0;
  bool rate_extrapolated = false;  // sat in wort below 90 C, where the k1 fit was not measured
};

/// IBU of one addition of `hop.grams` at `alpha_percent` (the alpha actually in the kettle).
/// Linear in grams x alpha at fixed wort and time. A hop without a form counts as pellet.
AdditionBitterness addition_bitterness(const HopAddition& hop, double alpha_percent, const WortContext& wort,
                                       const BitternessSettings& settings);

// --- The pieces, exposed for tests and for other engines -------------------------------------

/// The utilization factor of a form: the pellet factor for pellets and powder (and a hop without a
/// form), 1 for whole cones. With alpha it is what a gram of hops bitters in proportion to at any time.
double form_factor(std::optional<HopForm> form, const BitternessSettings& settings);

/// Alpha acid dissolved, mg/L: AA (fraction) x W (g) x 1000 / V (L).
double alpha_mg_per_litre(double grams, double alpha_percent, double volume_l);
/// Tinseth's gravity ("bigness") factor B(G) = 1.65 x 0.000125^(G - 1).
double tinseth_gravity_factor(double gravity);
/// Tinseth's time factor F(t) = (1 - e^(-0.04 t)) / 4.15.
double tinseth_time_factor(double minutes);
/// Tinseth utilization U = B(G) x F(t), a fraction.
double tinseth_utilization(double gravity, double minutes);
/// Rager utilization from the tanh fit of his table, a fraction.
double rager_utilization(double minutes);
/// Rager's gravity adjustment GA = (G - 1.050) / 0.2 above 1.050, else 0.
double rager_gravity_adjustment(double gravity);
/// Isomerisation rate constant k1 (alpha -> iso-alpha), per minute, at a temperature in C
/// (Malowicki & Shellhammer 2005).
double isomerization_rate(double celsius);
/// k1(T) / k1(100 C): how fast isomerisation runs at T relative to a boil.
double relative_isomerization_rate(double celsius);
/// Boil-equivalent minutes of `minutes` held at `celsius`.
double boil_equivalent_minutes(double minutes, double celsius);
/// Lowest temperature, C, at which the Malowicki & Shellhammer rates were measured (from memory).
inline constexpr double kLowestMeasuredCelsius = 90.0;

/// A whirlpool's temperature over its minutes: held at `start_c`, or cooling as `cooling` says.
struct TemperatureCourse {
  double start_c = 100.0;
  double minutes = 0.0;
  std::optional<Cooling> cooling;
  /// Wort temperature, C, `minute` minutes after the addition.
  double at(double minute) const;
  /// The lowest temperature of the course (at its end: courses only cool).
  double lowest_c() const { return at(minutes); }
};
/// Boil-equivalent minutes of a course: the integral of k1(T(t)) / k1(100 C) over its minutes
/// (adaptive Simpson quadrature, docs/methods.md#cooling-whirlpool).
double boil_equivalent_minutes(const TemperatureCourse& course);
/// Rager's 0-minute floor for an addition at or after flame-out in wort at `celsius`, scaled by
/// k1(T) / k1(100 C), plus what its boil-equivalent minutes earn (ours, docs/methods.md#rager-stand-floor).
double rager_flame_out_utilization(double effective_minutes, double celsius);

/// BU:GU = IBU / ((OG - 1) x 1000); 0 when OG is 1.000.
double bu_gu_ratio(double ibu, double original_gravity);
/// The common-practice reading of a BU:GU ratio, in words ("balanced", "very bitter" ...).
std::string bu_gu_reading(double ratio);

}  // namespace bine

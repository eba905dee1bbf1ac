// Alpha acid lost in storage.
//
// Method [Garetz M. 1994, "Hop Storage: How to Get - and Keep - Your Hops' Optimum Value",
// Brewing Techniques 2(1)]: alpha acid decays first-order,
//   A(D) = A0 x exp(-k x TF x SF x D), D in days,
//   k  = ln(100 / (100 - PL)) / 180 per day, PL = % of alpha lost in 6 months at 20 C, open;
//   TF = 2^((T - 20) / 15): the rate halves for every 15 C colder;
//   SF = 1.0 open / not airtight, 0.75 sealed with air, 0.5 vacuum or inert gas (from memory).
// By construction 180 days at 20 C open leave exactly (100 - PL) %, the variety's stability.
//
// The variety property PL comes from the catalog's "stability" (% remaining, PL = 100 - it) or from a
// word class (good ~80 %, fair ~65 %, poor ~50 % remaining; common practice). A measured Hop Storage
// Index is a state, not a rate: % lost = 110 x log10(HSI / 0.25) [Garetz 1994, after Nickerson &
// Likens 1979, J. Am. Soc. Brew. Chem. 37:184] is what the sample had lost when it was analysed
// (0 at or below HSI 0.25: fresh). It never sets PL (docs/methods.md#hsi; engine/cellar.cpp).
//
// Limits: TF is a fit for cold storage; above 20 C it is extrapolated (flagged). The model ignores
// light, moisture and the loss before packaging.
#include "engine/storage_loss.hpp"

#include <algorithm>
#include <cmath>

namespace bine {

std::optional<double> stability_of_class(std::string_view word) {
  if (word == "good") return kStabilityGood;
  if (word == "fair") return kStabilityFair;
  if (word == "poor") return kStabilityPoor;
  return std::nullopt;
}

// Garetz (1994): k = ln(100 / (100 - PL)) / 180 per day.
double loss_rate_per_day(double percent_lost_six_months) {
  const double lost = std::clamp(percent_lost_six_months, 0.0, 99.999);
  return std::log(100.0 / (100.0 - lost)) / 180.0;
}

// Garetz (1994): TF = 2^((T - 20) / 15).
double temperature_factor(double celsius) { return std::exp2((celsius - 20.0) / 15.0); }

// Garetz (1994), SF values from memory.
double package_factor(Package package) {
  switch (package) {
    case Package::open:
      return 1.0;
    case Package::sealed:
      return 0.75;
    case Package::vacuum:
      return 0.5;
  }
  return 1.0;
}

// Garetz (1994) after Nickerson & Likens (1979): % lost = 110 x log10(HSI / 0.25).
double percent_lost_from_hsi(double hsi) {
  if (hsi <= 0.25) return 0.0;
  return std::min(110.0 * std::log10(hsi / 0.25), 99.999);
}

AgedAlpha age_alpha(const StorageHistory& history) {
  AgedAlpha aged;
  aged.rate_per_day = loss_rate_per_day(100.0 - history.stability_percent);
  aged.temperature_factor = temperature_factor(history.storage.temperature_c);
  aged.package_factor = package_factor(history.storage.package);
  aged.warm_extrapolation = history.storage.temperature_c > 20.0;
  const double days = std::max(history.days, 0.0);
  aged.remaining = std::exp(-aged.rate_per_day * aged.temperature_factor * aged.package_factor * days);
  aged.alpha_percent = history.alpha_percent * aged.remaining;
  return aged;
}

long days_between(Date from, Date to) { return static_cast<long>((to - from).count()); }

}  // namespace bine

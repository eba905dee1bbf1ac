#pragma once
// Alpha acid lost in the cold store: first-order loss after Garetz (1994). See storage_loss.cpp.
#include <optional>
#include <string>
#include <string_view>

#include "model/hops.hpp"

namespace bine {

/// Stability classes where only a word is known (common practice): % of alpha left after
/// 6 months at 20 C.
inline constexpr double kStabilityGood = 80.0;
inline constexpr double kStabilityFair = 65.0;
inline constexpr double kStabilityPoor = 50.0;
/// "good", "fair" or "poor" -> % remaining; nullopt for any other word.
std::optional<double> stability_of_class(std::string_view word);

/// First-order loss rate k per day at 20 C, open, from the % of alpha LOST in 6 months (180 days).
double loss_rate_per_day(double percent_lost_six_months);
/// TF = 2^((T - 20) / 15): the rate halves for every 15 C colder.
double temperature_factor(double celsius);
/// SF: 1.0 open, 0.75 sealed with air, 0.5 vacuum or inert gas (values from memory).
double package_factor(Package package);
/// % of alpha the sample had lost when analysed, from its Hop Storage Index: 110 x log10(HSI / 0.25),
/// floored at 0. A state on the analysis date, never a storage rate.
double percent_lost_from_hsi(double hsi);

/// The storage history of one lot.
struct StorageHistory {
  double alpha_percent = 0.0;                 // certificate alpha at packaging
  double stability_percent = kStabilityFair;  // % left after 6 months at 20 C
  Storage storage;
  double days = 0.0;  // days from packaging to the brew day
};

struct AgedAlpha {
  double alpha_percent = 0.0;  // estimated alpha today
  double remaining = 1.0;      // fraction of the certificate alpha left
  double rate_per_day = 0.0;   // k at 20 C, open
  double temperature_factor = 1.0;
  double package_factor = 1.0;
  bool warm_extrapolation = false;  // stored above 20 C: the model is extrapolated
};

/// A(D) = A0 x exp(-k x TF x SF x D).
AgedAlpha age_alpha(const StorageHistory& history);

/// Whole days from `from` to `to` (negative when `to` is earlier).
long days_between(Date from, Date to);

}  // namespace bine

#pragma once
// 90 % intervals around IBU figures: what the alpha in the kettle and the brewhouse factor leave
// uncertain, propagated exactly where the figure is linear in them and by a seeded Monte Carlo
// where it is not. See ibu_interval.cpp and docs/methods.md#ibu-intervals.
#include <cstddef>
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
  std::vector<IbuRange> subtotals;  // one per subtotal asked for (a sum over some additions)
  bool monte_carlo = false;         // false: exact (normal, linear)
  bool aged = false;                // some alpha was aged from a certificate over a stability range
};

/// How an alpha acid figure is known, which sets what is uncertain about it: the midpoint of a catalog
/// range, a certificate's aged to the brew day, else a certificate's (or a value the brewer wrote)
/// within the certificate tolerance.
struct AlphaOrigin {
  std::optional<std::pair<double, double>> catalog_range;  // the alpha is this range's midpoint
  std::optional<AgeingUncertainty> ageing;                 // the alpha is a certificate's, aged
};

/// One IBU figure and how the alpha behind it is known: what an interval is computed from.
struct IbuTerm {
  double ibu = 0.0;
  double alpha_percent = 0.0;  // in the kettle (aged, when aged)
  AlphaOrigin origin;
  bool late = false;  // takes a split profile's late-hop factor
};

struct RecipeBitterness;
struct AdditionLine;
struct BitternessSettings;
struct Catalog;
struct CellarLot;
struct Storage;
struct Variety;

/// The factor uncertainty per group a profile gives: [boil or one factor, late factor].
std::vector<std::optional<FactorUncertainty>> factor_uncertainties(const BitternessSettings& settings);
/// How one term is uncertain: a catalog midpoint over the catalog's range, a certificate within
/// `tolerance_percent` (before its ageing, when aged); the group of its factor.
AdditionUncertainty addition_uncertainty(const IbuTerm& term, double tolerance_percent);
/// The ageing from a certificate to the brew day: stability S +- kStabilityHalfRange, exposure TF x SF x days.
AgeingUncertainty ageing_uncertainty(double stability_percent, const Storage& storage, double days);
/// How a cold-store lot's alpha on the brew day is known (`variety` gives a catalog midpoint's range).
AlphaOrigin lot_alpha_origin(const CellarLot& lot, const Variety* variety);
/// A recipe addition's term as computed: its catalog midpoint over the variety's range in `catalog`,
/// else its written alpha.
IbuTerm recipe_term(const AdditionLine& line, const Catalog& catalog);
/// The intervals of `terms` (one each, the total, and each subtotal: indices into `terms`) with the
/// factor uncertainty of `settings`' brewhouse profile.
IbuIntervals term_intervals(const std::vector<IbuTerm>& terms, const BitternessSettings& settings,
                            double tolerance_percent, const std::vector<std::vector<std::size_t>>& subtotals = {});
/// The intervals of every addition and the total of a recipe's bitterness (bine ibu): catalog
/// midpoints over the variety's catalog range in `catalog`.
IbuIntervals recipe_intervals(const RecipeBitterness& bitterness, const Catalog& catalog, double tolerance_percent);
/// The same, where `origins[i]` (when given) says how recipe.hops[i]'s alpha is known instead (a stock
/// lot the recipe names, its alpha on the brew day: engine/lot_allocation.hpp named_lot_alpha_origins).
IbuIntervals recipe_intervals(const RecipeBitterness& bitterness, const Catalog& catalog, double tolerance_percent,
                              const std::vector<std::optional<AlphaOrigin>>& origins);

/// A normal standard deviation from a range read as a 90 % range: (max - min) / (2 x 1.6449).
double sd_from_90_range(double min, double max);

/// The 90 % intervals. `factors[g]` is the factor uncertainty of group g (none: known exactly).
/// Exact when no factor is uncertain and nothing is aged; else 10^4 seeded draws, unless
/// `force_monte_carlo` (for the test that the two agree). `subtotals` lists sums over some
/// additions (indices) whose intervals are wanted too.
IbuIntervals ibu_intervals(const std::vector<AdditionUncertainty>& additions,
                           const std::vector<std::optional<FactorUncertainty>>& factors, bool force_monte_carlo = false,
                           const std::vector<std::vector<std::size_t>>& subtotals = {});

}  // namespace bine

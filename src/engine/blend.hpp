#pragma once
// Designing late hops (whirlpool + dry hop) to a target aroma while holding total IBU.
// See blend.cpp for the model, the constraints as linear rows in the oil shares, and pool choice
// (docs/methods.md#blend).
#include <Eigen/Dense>
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/bitterness.hpp"
#include "engine/blend_plan.hpp"
#include "engine/cellar.hpp"
#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// A variety (catalog mode) or a lot on hand (stock mode) that may go into the blend.
struct BlendCandidate {
  std::string variety;
  std::string lot;               // empty in catalog mode
  Eigen::VectorXd aroma;         // intensities 0-5 per lexicon axis
  double oil_ml_per_100g = 0.0;  // lot value, else the catalog range midpoint
  double alpha_percent = 0.0;    // lot alpha on the brew day, else the catalog range midpoint
  std::string alpha_note;        // how alpha_percent was obtained
  AlphaOrigin alpha_origin;      // how alpha_percent is known (its interval)
  HopForm form = HopForm::pellet;
  std::optional<double> on_hand_g;  // stock mode only
};

/// Candidates plus what was left out and why (one note per reason with the names).
struct CandidateSet {
  std::vector<BlendCandidate> candidates;
  std::vector<std::string> notes;
  std::size_t without_aroma = 0;  // skipped: no aroma data (no intensities, tags or oils)
};

/// Catalog mode (cellar == nullptr): every variety with aroma data whose purpose is not bittering-
/// only, at its catalog midpoints. Stock mode: every lot with grams on hand whose variety the catalog
/// knows, with its alpha on the cellar's brew day; stale lots only when `allow_stale`. `exclude`
/// names a variety to leave out (the one the target imitates). Varieties without oil data are
/// skipped and noted.
CandidateSet blend_candidates(const Catalog& catalog, const Lexicon& lexicon, const Cellar* cellar,
                              std::string_view exclude, bool allow_stale = false);

/// What catalog mode takes from a variety: a compiled catalog stores it per row (the aroma profile
/// computed at compile time with the stamped lexicon), so a blend reads no whole varieties.
struct CatalogBlendRow {
  std::string_view name;
  bool bittering_only = false;
  const Eigen::VectorXd* aroma = nullptr;  // the aroma profile's intensities; null when it has none
  std::optional<Range> total_oil;
  std::optional<Range> alpha_acid;
};

/// The blend row of `variety`: its aroma profile is computed into `aroma`, which the row points to
/// when the profile is usable (some source, some intensity above 0).
CatalogBlendRow catalog_blend_row(const Variety& variety, const Lexicon& lexicon, Eigen::VectorXd& aroma);

/// Calls its argument once per row of a catalog, in catalog order (a compiled catalog's rows read
/// one at a time, so a large catalog is never held whole).
using BlendRowStream = std::function<void(const std::function<void(const CatalogBlendRow&)>&)>;
/// Catalog mode of blend_candidates over a stream of rows: the same candidates and notes.
CandidateSet blend_candidates_streamed(const BlendRowStream& each_row, std::string_view exclude);

/// The aroma to aim at and the weight of each axis in the objective.
struct BlendTarget {
  Eigen::VectorXd intensity;
  Eigen::VectorXd weight;
  std::vector<bool> named;  // axes an aroma spec names, or all axes for a variety's profile
};

/// An aroma spec: named axes weigh 1, the others `others_weight` with target 0.
BlendTarget target_from_spec(const Eigen::VectorXd& intensity, const std::vector<bool>& named, double others_weight);
/// A variety's profile, every axis weight 1.
BlendTarget target_like(const Eigen::VectorXd& profile);

/// How many candidates feed the subset search.
struct PoolSettings {
  std::size_t nearest = 24;           // best single varieties (nearest profiles in the weighted metric)
  std::size_t per_axis = 8;           // strongest candidates on each axis the target names
  std::size_t swap_rounds = 4;        // local-improvement rounds over the whole catalog after the pool
  std::size_t subset_budget = 50000;  // subsets solved at most in one pool search before it is bounded
  bool exhaustive = false;            // every candidate (for benchmarks and tests)
};

struct BlendRequest {
  BlendTarget target;
  std::vector<BlendCandidate> candidates;
  std::size_t max_varieties = 3;
  BlendPlan plan;  // wort, IBU budget, bittering charge, whirlpool stand, late-hop amount
  PoolSettings pool;
  /// Round the amounts as the brewer weighs them (in plan.mass_unit) and re-solve the bittering
  /// charge for them; false keeps the exact solution.
  bool weighed = false;
};

struct BlendPart {
  std::size_t candidate = 0;  // index into BlendRequest::candidates
  std::string variety;
  std::string lot;
  double oil_share = 0.0;  // x_i
  double alpha_percent = 0.0;
  double oil_ml_per_100g = 0.0;
  HopForm form = HopForm::pellet;
  double grams = 0.0;
  double whirlpool_g = 0.0;
  double dry_hop_g = 0.0;
  double whirlpool_ibu = 0.0;
  std::optional<double> left_g;  // stock left after the blend (and bittering charge)
};

/// What the search chose and what follows from it; the target and the plan stay in the request.
struct BlendResult {
  Eigen::VectorXd profile;       // P = sum x_i s_i
  double objective = 0.0;        // J
  double fit = 0.0;              // sqrt(J / sum w), axis units
  std::vector<BlendPart> parts;  // by descending oil share
  double late_grams = 0.0;
  double whirlpool_grams = 0.0;  // the whirlpool share of late_grams
  double oil_ml = 0.0;           // oil delivered by the late hops
  double late_ibu = 0.0;
  double bittering_grams = 0.0;  // of the plan's bittering hop
  double bittering_ibu = 0.0;
  std::optional<double> bittering_left_g;
  double total_ibu = 0.0;
  std::size_t pool_size = 0;
  std::size_t subsets_solved = 0;
};

/// Chooses up to max_varieties candidates and their oil shares. Throws Infeasible with the reason
/// and what would make it feasible.
BlendResult design_blend(const BlendRequest& request);

/// The 90 % intervals of a blend's IBU figures (docs/methods.md#ibu-intervals).
struct BlendIntervals {
  std::vector<IbuRange> parts;        // each part's whirlpool IBU, as result.parts
  std::optional<IbuRange> bittering;  // the bittering charge's IBU
  IbuRange kept;                      // the boil additions kept
  IbuRange late;                      // the whirlpool share of the blend
  IbuRange total;
  bool monte_carlo = false;
  bool aged = false;
};
/// Each part from its candidate's alpha, the charge from its hop's, the kept additions from theirs,
/// with the plan's brewhouse factor uncertainty; certificates within `tolerance_percent`.
BlendIntervals blend_intervals(const BlendRequest& request, const BlendResult& result, double tolerance_percent);

/// IBU from one gram of a candidate in the plan's whirlpool (linear in grams, bitterness engine).
double whirlpool_ibu_per_gram(const BlendCandidate& candidate, const BlendPlan& plan);
/// IBU from one gram of the bittering hop.
double bittering_ibu_per_gram(const BitteringHop& hop, const BlendPlan& plan);

}  // namespace bine

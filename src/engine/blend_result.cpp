// The chosen blend in the brewer's terms: grams per part from the oil shares
// (docs/methods.md#blend-amounts), the whirlpool and dry-hop split, the whirlpool IBU, the bittering
// charge re-solved to hold the IBU (docs/methods.md#bittering-charge) and the stock left.
#include <algorithm>
#include <cmath>

#include "engine/blend_steps.hpp"
#include "model/quantity.hpp"

namespace bine::blend_steps {
namespace {

/// One part per member with a share above 1e-9, adding its grams, oil, IBU and aroma to the totals.
void add_parts(const BlendRequest& request, const BestBlend& best, BlendResult& result) {
  const double share = request.plan.ibu.whirlpool_share;
  const Eigen::VectorXd grams = grams_for(best.shares, best.subset, request);
  for (std::size_t k = 0; k < best.subset.size(); ++k) {
    if (best.shares[at(k)] < 1e-9) continue;
    const BlendCandidate& candidate = request.candidates[best.subset[k]];
    BlendPart part;
    part.candidate = best.subset[k];
    part.variety = candidate.variety;
    part.lot = candidate.lot;
    part.oil_share = best.shares[at(k)];
    part.alpha_percent = candidate.alpha_percent;
    part.oil_ml_per_100g = candidate.oil_ml_per_100g;
    part.form = candidate.form;
    part.grams = grams[at(k)];
    part.whirlpool_g = share * part.grams;
    part.dry_hop_g = part.grams - part.whirlpool_g;
    part.whirlpool_ibu = part.whirlpool_g * whirlpool_ibu_per_gram(candidate, request.plan);
    result.profile += part.oil_share * candidate.aroma;
    result.late_grams += part.grams;
    result.oil_ml += part.grams * candidate.oil_ml_per_100g / 100.0;
    result.late_ibu += part.whirlpool_ibu;
    if (candidate.on_hand_g) part.left_g = *candidate.on_hand_g - part.grams;
    result.parts.push_back(part);
  }
  result.whirlpool_grams = result.late_grams * share;
  std::stable_sort(result.parts.begin(), result.parts.end(),
                   [](const BlendPart& l, const BlendPart& r) { return l.oil_share > r.oil_share; });
}

/// What is left of the bittering charge's lot once the charge and every blend part drawn from the
/// same lot are taken; each such part shows the lot as left after it.
void bittering_lot_left(const BitteringHop& bittering, BlendResult& result) {
  double left = *bittering.on_hand_g - result.bittering_grams;
  for (auto& part : result.parts)
    if (!bittering.lot.empty() && part.lot == bittering.lot) {
      left -= part.grams;
      part.left_g = left;
    }
  result.bittering_left_g = left;
}

/// b = (T - K - late IBU) / u_b, and what is left of its lot after the charge and any blend part
/// from the same lot.
void add_bittering_charge(const BlendRequest& request, const Prepared& prepared, BlendResult& result) {
  const std::optional<BitteringHop>& bittering = request.plan.bittering;
  if (!bittering || prepared.bittering_per_gram <= 0.0) return;
  result.bittering_grams = std::max(
      0.0, (request.plan.ibu.target_ibu - request.plan.ibu.kept_ibu - result.late_ibu) / prepared.bittering_per_gram);
  result.bittering_ibu = result.bittering_grams * prepared.bittering_per_gram;
  if (!bittering->on_hand_g) return;
  bittering_lot_left(*bittering, result);
}

/// Stock left of each lot once every part and the charge are taken.
void stock_left(const BlendRequest& request, BlendResult& result) {
  for (auto& part : result.parts)
    if (const auto& on_hand = request.candidates[part.candidate].on_hand_g) part.left_g = *on_hand - part.grams;
  result.bittering_left_g.reset();
  const std::optional<BitteringHop>& bittering = request.plan.bittering;
  if (!bittering || !bittering->on_hand_g) return;
  bittering_lot_left(*bittering, result);
}

}  // namespace

void weigh_result(const BlendRequest& request, const Prepared& prepared, BlendResult& result) {
  const std::string_view unit = request.plan.mass_unit;
  result.late_grams = result.whirlpool_grams = result.oil_ml = result.late_ibu = 0.0;
  for (auto& part : result.parts) {
    const BlendCandidate& candidate = request.candidates[part.candidate];
    const double whirlpool = part.whirlpool_g;
    part.whirlpool_g = weighed_grams(whirlpool, unit);
    part.dry_hop_g = weighed_grams(part.grams - whirlpool, unit);
    part.grams = part.whirlpool_g + part.dry_hop_g;
    part.whirlpool_ibu = part.whirlpool_g * whirlpool_ibu_per_gram(candidate, request.plan);
    result.late_grams += part.grams;
    result.whirlpool_grams += part.whirlpool_g;
    result.oil_ml += part.grams * candidate.oil_ml_per_100g / 100.0;
    result.late_ibu += part.whirlpool_ibu;
  }
  if (request.plan.bittering && prepared.bittering_per_gram > 0.0) {
    const double exact = std::max(
        0.0, (request.plan.ibu.target_ibu - request.plan.ibu.kept_ibu - result.late_ibu) / prepared.bittering_per_gram);
    result.bittering_grams = weighed_grams(exact, unit);
    result.bittering_ibu = result.bittering_grams * prepared.bittering_per_gram;
  }
  result.total_ibu = request.plan.ibu.kept_ibu + result.late_ibu + result.bittering_ibu;
  stock_left(request, result);
}

BlendResult assemble_result(const BlendRequest& request, const Prepared& prepared, const BestBlend& best) {
  BlendResult result;
  result.objective = std::max(0.0, best.objective);
  result.fit = std::sqrt(result.objective / request.target.weight.sum());
  result.profile = Eigen::VectorXd::Zero(request.target.intensity.size());
  add_parts(request, best, result);
  add_bittering_charge(request, prepared, result);
  result.total_ibu = request.plan.ibu.kept_ibu + result.late_ibu + result.bittering_ibu;
  return result;
}

}  // namespace bine::blend_steps

// The 90 % intervals of a blend's IBU (docs/methods.md#ibu-intervals): the grams are fixed by the
// search, and what the brew will give with them stays uncertain through the alpha behind each term
// (a part's lot or catalog midpoint, the bittering charge's, the kept boil additions') and the
// brewhouse factor. One term per IBU figure, through the one interval engine (ibu_interval.cpp);
// the kept additions and the blend's whirlpool IBU are subtotals of the same draws.
#include "engine/blend.hpp"
#include "engine/ibu_interval.hpp"

namespace bine {

BlendIntervals blend_intervals(const BlendRequest& request, const BlendResult& result, double tolerance_percent) {
  const BlendPlan& plan = request.plan;
  std::vector<IbuTerm> terms;
  std::vector<std::size_t> late;
  std::vector<std::size_t> kept;
  for (const auto& part : result.parts) {
    const AlphaOrigin origin =
        part.candidate < request.candidates.size() ? request.candidates[part.candidate].alpha_origin : AlphaOrigin{};
    late.push_back(terms.size());
    terms.push_back(IbuTerm{part.whirlpool_ibu, part.alpha_percent, origin, true});  // whirlpool: a late addition
  }
  for (const auto& term : plan.kept_terms) {
    kept.push_back(terms.size());
    terms.push_back(term);
  }
  const std::size_t bittering = terms.size();
  if (plan.bittering)
    terms.push_back(IbuTerm{result.bittering_ibu, plan.bittering->alpha_percent, plan.bittering->alpha_origin,
                            is_late_addition(plan.bittering->use.value_or(HopUse::boil), plan.bittering->minutes)});
  const IbuIntervals intervals = term_intervals(terms, plan.bitterness, tolerance_percent, {late, kept});
  BlendIntervals out;
  out.parts.assign(intervals.additions.begin(), intervals.additions.begin() + static_cast<long>(late.size()));
  if (plan.bittering) out.bittering = intervals.additions[bittering];
  out.late = intervals.subtotals[0];
  out.kept = intervals.subtotals[1];
  out.total = intervals.total;
  out.monte_carlo = intervals.monte_carlo;
  out.aged = intervals.aged;
  return out;
}

}  // namespace bine

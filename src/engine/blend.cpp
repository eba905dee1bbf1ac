// Late-hop blend design: the model, its constraints, and the search over subsets. The method in
// full, with check values, is docs/methods.md#blend; the steps of design_blend live in the files
// named in blend_steps.hpp.
//
// Model (a linear first approximation, docs/methods.md#blend-profile). Candidate i has aroma
// intensities s_i (0-5 per axis) and total oil O_i (mL/100 g). With late grams g_i the blend's
// profile is the oil-weighted mean
//     P = sum_i g_i O_i s_i / sum_i g_i O_i = sum_i x_i s_i,   x_i = g_i O_i / sum_j g_j O_j,
// so P is linear in the oil shares x (x >= 0, sum x = 1) and J = sum_a w_a (P_a - t_a)^2 is a convex
// quadratic in x (docs/methods.md#blend-objective). Real aromas do not add linearly: linalool,
// geraniol and citronellol act together toward citrus (Takoi K. et al. 2010, J. Inst. Brew.
// 116:251-260); the model ignores that.
//
// Amounts (docs/methods.md#blend-amounts). With a fixed total of late grams G (rate x volume), the
// grams follow from the shares as
//     g_i = G u_i / sum_j u_j,   u_i = x_i / O_i,
// and with a fixed oil dose D mL (dose x volume) as g_i = 100 D x_i / O_i. Every limit we need
// is linear in the grams, a^T g <= beta, and stays linear in x: with fixed G it is equivalent to
// sum_i (G a_i - beta) x_i / O_i <= 0 (multiply through by sum_j u_j > 0); with fixed D it is
// sum_i 100 D a_i x_i / O_i <= beta. So the QP in x is exact for both ways of fixing the amount
// (docs/methods.md#blend-qp, solved in blend_solver.cpp).
//
// Limits, each one such row: whirlpool IBU c^T g with c_i = split x IBU per gram of candidate i in the
// whirlpool (the bitterness engine, linear in grams); the bittering charge
// b = (T - kept - c^T g) / u_b must be >= 0, i.e. c^T g <= T - kept (docs/methods.md#bittering-charge);
// with stock, g_i <= on hand and b <= on hand of its lot (minus the blend's grams of that lot if it is
// also a candidate); without a bittering charge, c^T g = T - kept (an equality). Dry hops add no IBU
// in this model.
//
// Search (docs/methods.md#blend-search). Solving every subset of up to K candidates is exact but grows
// as N^3. We solve every subset of a pool: the `nearest` best single candidates (for one candidate J is
// its weighted distance to the target, so these are the target's nearest neighbours in the objective's
// own metric, found with the faiss inner-product index of hop_index.hpp) plus the `per_axis` strongest
// candidates on each axis the target names, so that a citrus hop and a floral hop that are each far
// from a citrus-floral target still meet. The pool alone misses targets whose optimum is (nearly)
// exact but needs a partner that is neither near the target nor strong on a named axis (the complement
// of a near candidate). So the pool's best subset is then improved by local search over the whole
// catalog: add any candidate while below K members, or swap one member for any candidate, keeping the
// best move, until no move lowers J (each round K x N QPs). The benchmark (tools/bench/blend_bench.cpp)
// measures the gap to the exhaustive search.
#include "engine/blend.hpp"

#include "engine/blend_steps.hpp"

namespace bine {

BlendTarget target_from_spec(const Eigen::VectorXd& intensity, const std::vector<bool>& named, double others_weight) {
  BlendTarget target;
  target.intensity = intensity;
  target.weight = Eigen::VectorXd::Constant(intensity.size(), others_weight);
  target.named = named;
  for (Eigen::Index a = 0; a < intensity.size(); ++a)
    if (named[static_cast<std::size_t>(a)]) target.weight[a] = 1.0;
  return target;
}

BlendTarget target_like(const Eigen::VectorXd& profile) {
  BlendTarget target;
  target.intensity = profile;
  target.weight = Eigen::VectorXd::Ones(profile.size());
  target.named.assign(static_cast<std::size_t>(profile.size()), true);
  return target;
}

BlendResult design_blend(const BlendRequest& request) {
  using namespace blend_steps;
  // 1. Check the request: candidates, amount, kept IBU and stock, before any search.
  check_request(request);
  // 2. The objective's terms and the limits, which do not depend on the subset.
  Prepared prepared = prepare(request);
  SubsetSearch search{request, prepared, gram_limits(request, prepared)};
  // 3. Search every subset of the pool.
  std::vector<std::size_t> pool = choose_pool(request, prepared);
  BestBlend best = search_every_subset(search, pool);
  // 4. Widen if infeasible: the limits may exclude the whole pool (too bitter for the IBU left, too
  //    little stock), so search again with the least and most bitter candidates and the largest lots.
  if (!best.found() && !request.pool.exhaustive) {
    pool = widen_pool(pool, request, prepared);
    best = search_every_subset(search, pool);
  }
  if (!best.found()) explain_infeasible(request, prepared);
  // 5. Improve locally over every candidate.
  if (!request.pool.exhaustive) improve_locally(search, best);
  // 6. Assemble the result: grams, IBU, bittering charge, stock left; the IBU must be held.
  BlendResult result = assemble_result(request, prepared, best);
  result.pool_size = pool.size();
  result.subsets_solved = search.solved;
  check_ibu_held(request, result);
  // 7. As weighed, when asked.
  if (request.weighed) weigh_result(request, prepared, result);
  return result;
}

}  // namespace bine

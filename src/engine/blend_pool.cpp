// Which candidates the subset search sees (docs/methods.md#blend-search): the target's nearest
// neighbours in the objective's own metric, found by an exact inner-product scan (a flat faiss index
// of hop_index.hpp: the rows depend on the target's weights, so a graph index would be built for one
// query and cost far more than the scan, 10^5 rows of a dozen floats), plus the strongest candidates on each axis the
// target names; and, when the limits exclude every subset of that pool, a wider pool with the least and most bitter
// candidates per gram and the largest lots.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "engine/blend_steps.hpp"
#include "engine/hop_index.hpp"

namespace bine::blend_steps {
namespace {

/// Marks the `nearest` candidates with the smallest J alone. J of a single candidate is
/// s^T W s - 2 s^T W t + t^T W t, so with rows [W^1/2 s, -s^T W s / 2] and the query [W^1/2 t, 1]
/// the largest inner product is the smallest J: an exact inner-product search in J's own metric.
void mark_nearest(const BlendRequest& request, const Prepared& prepared, std::vector<bool>& chosen) {
  const std::size_t n = request.candidates.size();
  const Index axes = request.target.intensity.size();
  const int dimensions = static_cast<int>(axes) + 1;
  const Eigen::VectorXd root_w = request.target.weight.cwiseSqrt();
  std::vector<float> rows(n * static_cast<std::size_t>(dimensions));
  for (std::size_t i = 0; i < n; ++i) {
    float* row = rows.data() + i * static_cast<std::size_t>(dimensions);
    for (Index a = 0; a < axes; ++a) row[a] = static_cast<float>(root_w[a] * request.candidates[i].aroma[a]);
    row[axes] = static_cast<float>(-0.5 * prepared.self[at(i)]);
  }
  std::vector<float> query(static_cast<std::size_t>(dimensions), 1.0f);
  for (Index a = 0; a < axes; ++a)
    query[static_cast<std::size_t>(a)] = static_cast<float>(root_w[a] * request.target.intensity[a]);
  const IndexKind exact = IndexKind::exact;  // one query over target-weighted rows: scan, never a graph
  const HopIndex index(dimensions, rows, {}, &exact);
  for (const IndexHit& hit : index.search(query.data(), std::min(n, request.pool.nearest)))
    chosen[static_cast<std::size_t>(hit.id)] = true;
}

/// Marks the `per_axis` strongest candidates on axis `a`: strong on it and quiet on the axes the
/// target wants at 0 (intensity on the axis less the weighted size of the off-target aroma).
void mark_strongest(const BlendRequest& request, Index a, std::vector<bool>& chosen) {
  const std::size_t n = request.candidates.size();
  const auto score = [&](std::size_t i) {
    const Eigen::VectorXd& s = request.candidates[i].aroma;
    double off = 0.0;
    for (Index b = 0; b < s.size(); ++b)
      if (request.target.intensity[b] <= 0.0) off += request.target.weight[b] * s[b] * s[b];
    return s[a] - std::sqrt(off);
  };
  std::vector<double> scores(n);
  for (std::size_t i = 0; i < n; ++i) scores[i] = score(i);
  std::vector<std::size_t> strongest(n);
  std::iota(strongest.begin(), strongest.end(), 0);
  // Only the first per_axis are needed: a partial sort, ties broken by position (as a stable sort
  // of positions in order would), so the same candidates are marked as by sorting them all.
  const std::size_t take = std::min(n, request.pool.per_axis);
  std::partial_sort(
      strongest.begin(), strongest.begin() + static_cast<std::ptrdiff_t>(take), strongest.end(),
      [&](std::size_t l, std::size_t r) { return scores[l] > scores[r] || (scores[l] == scores[r] && l < r); });
  for (std::size_t k = 0; k < take; ++k) chosen[strongest[k]] = true;
}

std::vector<std::size_t> indices_of(const std::vector<bool>& chosen) {
  std::vector<std::size_t> result;
  for (std::size_t i = 0; i < chosen.size(); ++i)
    if (chosen[i]) result.push_back(i);
  return result;
}

}  // namespace

std::vector<std::size_t> choose_pool(const BlendRequest& request, const Prepared& prepared) {
  const std::size_t n = request.candidates.size();
  if (request.pool.exhaustive) return indices_of(std::vector<bool>(n, true));
  std::vector<bool> chosen(n, false);
  mark_nearest(request, prepared, chosen);
  for (Index a = 0; a < request.target.intensity.size(); ++a)
    if (request.target.named[static_cast<std::size_t>(a)] && request.target.intensity[a] > 0.0)
      mark_strongest(request, a, chosen);
  return indices_of(chosen);
}

std::vector<std::size_t> widen_pool(const std::vector<std::size_t>& pool, const BlendRequest& request,
                                    const Prepared& prepared) {
  const std::size_t n = request.candidates.size();
  std::vector<bool> chosen(n, false);
  for (const std::size_t i : pool) chosen[i] = true;
  std::vector<std::size_t> order(n);
  std::iota(order.begin(), order.end(), 0);
  const std::size_t take = std::min(n, request.pool.per_axis);
  const auto add_first = [&](auto less) {
    std::stable_sort(order.begin(), order.end(), less);
    for (std::size_t k = 0; k < take; ++k) chosen[order[k]] = true;
  };
  add_first([&](std::size_t l, std::size_t r) { return prepared.ibu_per_gram[at(l)] < prepared.ibu_per_gram[at(r)]; });
  add_first([&](std::size_t l, std::size_t r) { return prepared.ibu_per_gram[at(l)] > prepared.ibu_per_gram[at(r)]; });
  add_first([&](std::size_t l, std::size_t r) {
    return request.candidates[l].on_hand_g.value_or(0.0) > request.candidates[r].on_hand_g.value_or(0.0);
  });
  return indices_of(chosen);
}

}  // namespace bine::blend_steps

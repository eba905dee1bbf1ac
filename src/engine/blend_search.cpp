// The search over subsets (docs/methods.md#blend-search): every subset of the pool with up to K
// members, smaller subsets first, then local moves over the whole candidate list. Both keep one
// best-so-far (BestBlend) and count every QP solved.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "engine/blend_steps.hpp"

namespace bine::blend_steps {
namespace {

/// Calls visit(subset) for every subset of `pool` of size `from`..k, smaller subsets first.
template <typename Visit>
void for_each_subset(const std::vector<std::size_t>& pool, std::size_t from, std::size_t k, Visit visit) {
  std::vector<std::size_t> subset;
  for (std::size_t size = from; size <= std::min(k, pool.size()); ++size) {
    std::vector<std::size_t> index(size);
    std::iota(index.begin(), index.end(), 0);
    while (true) {
      subset.clear();
      for (std::size_t i : index) subset.push_back(pool[i]);
      visit(subset);
      std::size_t p = size;
      while (p > 0 && index[p - 1] == pool.size() - size + p - 1) --p;
      if (p == 0) break;
      ++index[p - 1];
      for (std::size_t q = p; q < size; ++q) index[q] = index[q - 1] + 1;
    }
  }
}

/// The best single move from `best`: below K members add a candidate, at K replace one member with
/// a candidate; ties keep the first in candidate order. None found: the result is not found().
BestBlend best_move(SubsetSearch& search, const BestBlend& best) {
  BestBlend move;
  move.objective = best.objective;  // a move must lower J
  std::vector<std::size_t> trial;
  for (std::size_t j = 0; j < search.request.candidates.size(); ++j) {
    if (std::find(best.subset.begin(), best.subset.end(), j) != best.subset.end()) continue;
    if (best.subset.size() < search.request.max_varieties) {
      trial = best.subset;
      trial.push_back(j);
      offer(search, trial, move);
      continue;
    }
    for (std::size_t k = 0; k < best.subset.size(); ++k) {
      trial = best.subset;
      trial[k] = j;
      offer(search, trial, move);
    }
  }
  return move;
}

}  // namespace

void offer(SubsetSearch& search, const std::vector<std::size_t>& subset, BestBlend& best) {
  ++search.solved;
  const BlendQpSolution solution = solve_subset(subset, search.request, search.prepared, search.limits);
  if (solution.feasible && solution.objective < best.objective - 1e-12) {
    best.objective = solution.objective;
    best.subset = subset;
    best.shares = solution.shares;
  }
}

/// Subsets of n things with `from` to k members, saturating at twice `budget`.
std::size_t subsets_between(std::size_t n, std::size_t from, std::size_t k, std::size_t budget) {
  std::size_t total = 0;
  for (std::size_t size = from; size <= std::min(n, k); ++size) {
    double count = 1.0;  // C(n, size)
    for (std::size_t i = 0; i < size; ++i) count = count * static_cast<double>(n - i) / static_cast<double>(i + 1);
    total += static_cast<std::size_t>(std::min(count, 2.0 * static_cast<double>(budget)));
  }
  return total;
}

BestBlend search_every_subset(SubsetSearch& search, const std::vector<std::size_t>& pool) {
  prepare_gram(search.prepared, pool, search.request);
  BestBlend best;
  const auto visit = [&](const std::vector<std::size_t>& subset) { offer(search, subset, best); };
  const std::size_t k = search.request.max_varieties;
  const std::size_t budget = search.request.pool.subset_budget;
  if (search.request.pool.exhaustive || subsets_between(pool.size(), 1, k, budget) <= budget) {
    for_each_subset(pool, 1, k, visit);
    return best;
  }
  // Bounded: every subset of the pool up to the largest size whose count stays within half the
  // budget, then the larger subsets (up to K) of the relaxation's heaviest members.
  search.bounded = true;
  std::size_t small = 1;
  while (small < k && subsets_between(pool.size(), 1, small + 1, budget) <= budget / 2) ++small;
  for_each_subset(pool, 1, small, visit);
  const Relaxation relaxed = relax_pool(search.prepared, pool);
  std::vector<std::size_t> heavy = relaxed.members;
  while (heavy.size() > k && subsets_between(heavy.size(), small + 1, k, budget) > budget / 2) heavy.pop_back();
  std::sort(heavy.begin(), heavy.end());  // candidate order, as in the pool
  for_each_subset(heavy, small + 1, k, visit);
  return best;
}

void improve_locally(SubsetSearch& search, BestBlend& best) {
  // Each round is at most K x N small QPs; a blend at J = 0 cannot improve. After a bounded pool
  // search the best may have fewer than K members: K more rounds let it grow to K first.
  const std::size_t rounds = search.request.pool.swap_rounds + (search.bounded ? search.request.max_varieties : 0);
  for (std::size_t round = 0; round < rounds && best.objective > 1e-12; ++round) {
    BestBlend move = best_move(search, best);
    if (!move.found()) break;
    best = std::move(move);
  }
}

}  // namespace bine::blend_steps

// The search over subsets (docs/methods.md#blend-search): every subset of the pool with up to K
// members, smaller subsets first, then local moves over the whole candidate list. Both keep one
// best-so-far (BestBlend) and count every QP solved.
#include <algorithm>
#include <numeric>

#include "engine/blend_steps.hpp"

namespace bine::blend_steps {
namespace {

/// Calls visit(subset) for every subset of `pool` of size 1..k, smaller subsets first.
template <typename Visit>
void for_each_subset(const std::vector<std::size_t>& pool, std::size_t k, Visit visit) {
  std::vector<std::size_t> subset;
  for (std::size_t size = 1; size <= std::min(k, pool.size()); ++size) {
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

BestBlend search_every_subset(SubsetSearch& search, const std::vector<std::size_t>& pool) {
  prepare_gram(search.prepared, pool, search.request);
  BestBlend best;
  for_each_subset(pool, search.request.max_varieties,
                  [&](const std::vector<std::size_t>& subset) { offer(search, subset, best); });
  return best;
}

void improve_locally(SubsetSearch& search, BestBlend& best) {
  // Each round is at most K x N small QPs; a blend at J = 0 cannot improve.
  for (std::size_t round = 0; round < search.request.pool.swap_rounds && best.objective > 1e-12; ++round) {
    BestBlend move = best_move(search, best);
    if (!move.found()) break;
    best = std::move(move);
  }
}

}  // namespace bine::blend_steps

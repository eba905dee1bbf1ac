#pragma once
// The steps of design_blend (blend.cpp), for the files that hold them; not part of the engine's
// interface. The objective's terms and every limit as a row in the shares of one subset
// (blend_limits.cpp), the pool of candidates to search (blend_pool.cpp), the subset search and local
// improvement with one best-so-far (blend_search.cpp), the checks and the reasons a request cannot be
// met (blend_checks.cpp), and the grams, IBU and stock of the chosen blend (blend_result.cpp).
#include <Eigen/Dense>
#include <cstddef>
#include <limits>
#include <optional>
#include <vector>

#include "engine/blend.hpp"
#include "engine/blend_solver.hpp"

namespace bine::blend_steps {

using Index = Eigen::Index;

inline Index at(std::size_t i) { return static_cast<Index>(i); }

// --- blend_limits.cpp: the QP of one subset (docs/methods.md#blend-amounts) ---

/// Everything about the candidates that does not depend on the subset.
struct Prepared {
  Eigen::MatrixXd gram;          // s_i^T W s_j over the pool (rows in pool order)
  std::vector<Index> position;   // candidate -> row of gram, -1 outside the pool
  Eigen::MatrixXd aroma;         // s_i as columns, every candidate
  Eigen::MatrixXd weighted;      // W s_i as columns
  Eigen::VectorXd self;          // s_i^T W s_i for every candidate
  Eigen::VectorXd linear;        // s_i^T W t
  double constant = 0.0;         // t^T W t
  Eigen::VectorXd ibu_per_gram;  // c_i (whirlpool share included)
  double bittering_per_gram = 0.0;
};

/// A limit a^T g <= beta on the late grams g of every candidate.
struct GramRow {
  Eigen::VectorXd a;  // coefficients on g
  double beta = 0.0;
};

/// Every limit of a request: rows a^T g <= beta and, without a bittering charge, one equality.
struct SubsetLimits {
  std::vector<GramRow> rows;
  std::optional<GramRow> equality;
};

/// The objective's terms and the IBU per gram of every candidate.
Prepared prepare(const BlendRequest& request);
/// The Gram matrix over the pool only (a 1,000 x 1,000 one costs more than the whole search).
void prepare_gram(Prepared& prepared, const std::vector<std::size_t>& pool, const BlendRequest& request);
/// The IBU and stock limits as rows in the grams.
SubsetLimits gram_limits(const BlendRequest& request, const Prepared& prepared);
/// The exact QP over the shares of `subset`.
BlendQpSolution solve_subset(const std::vector<std::size_t>& subset, const BlendRequest& request,
                             const Prepared& prepared, const SubsetLimits& limits);
/// Grams of each subset member for shares x.
Eigen::VectorXd grams_for(const Eigen::VectorXd& x, const std::vector<std::size_t>& subset,
                          const BlendRequest& request);

// --- blend_pool.cpp: which candidates the subset search sees (docs/methods.md#blend-search) ---

/// Candidate indices to search: nearest in the objective's metric plus strongest per named axis.
std::vector<std::size_t> choose_pool(const BlendRequest& request, const Prepared& prepared);
/// The pool plus the `per_axis` least and most bitter candidates per gram and the largest lots.
std::vector<std::size_t> widen_pool(const std::vector<std::size_t>& pool, const BlendRequest& request,
                                    const Prepared& prepared);

// --- blend_search.cpp: subsets and local moves (docs/methods.md#blend-search) ---

/// The best feasible subset found so far and its shares (none yet: infinite objective).
struct BestBlend {
  double objective = std::numeric_limits<double>::infinity();
  std::vector<std::size_t> subset;
  Eigen::VectorXd shares;

  bool found() const { return !subset.empty(); }
};

/// What every subset solve needs, and how many subsets were solved.
struct SubsetSearch {
  const BlendRequest& request;
  Prepared& prepared;
  SubsetLimits limits;
  std::size_t solved = 0;
  bool bounded = false;  // the pool had too many subsets to solve them all (see search_every_subset)
};

/// Subsets solved at most in one pool search before it is bounded (docs/methods.md#blend-search).
inline constexpr std::size_t kSubsetBudget = 50000;

/// Solves `subset` and keeps it in `best` when feasible and lower than best by more than 1e-12
/// (ties keep the smaller, earlier subset).
void offer(SubsetSearch& search, const std::vector<std::size_t>& subset, BestBlend& best);
/// The best of every subset of `pool` with 1 to max_varieties members; when they number more than
/// kSubsetBudget (K = 5 or 6 with many axes named), the best of every subset small enough to fit
/// the budget and of every subset of up to K of the relaxation's heaviest members, and `bounded`.
BestBlend search_every_subset(SubsetSearch& search, const std::vector<std::size_t>& pool);
/// Local improvement over every candidate: adds while below max_varieties members, else swaps one,
/// taking the best move until none lowers J (at most `swap_rounds` rounds).
void improve_locally(SubsetSearch& search, BestBlend& best);

// --- blend_relaxation.cpp: the blend over the whole pool without K or the limits ---

/// The least J over every mix of the pool (no K, no IBU or stock rows): a lower bound for every
/// subset, and the members it uses (at most axes + 1), heaviest first.
struct Relaxation {
  double objective = 0.0;
  std::vector<std::size_t> members;  // candidate indices
  std::vector<double> weights;       // their oil shares
};
/// Wolfe's nearest-point algorithm over the pool; needs prepare_gram(pool) first.
Relaxation relax_pool(const Prepared& prepared, const std::vector<std::size_t>& pool);

// --- blend_checks.cpp: what makes a request infeasible ---

/// Throws Infeasible when the request cannot be met whatever the search finds.
void check_request(const BlendRequest& request);
/// Throws Infeasible saying which limit excluded every subset searched.
[[noreturn]] void explain_infeasible(const BlendRequest& request, const Prepared& prepared);
/// Throws Infeasible when the blend and the bittering charge do not add up to the IBU to hold.
void check_ibu_held(const BlendRequest& request, const BlendResult& result);

// --- blend_result.cpp: the chosen blend in grams, IBU and stock left ---

/// The parts, profile, bittering charge and totals of the best blend.
BlendResult assemble_result(const BlendRequest& request, const Prepared& prepared, const BestBlend& best);
/// The blend as weighed: each whirlpool and dry-hop amount rounded as the brewer weighs it (in the
/// plan's mass unit), the whirlpool IBU from those amounts, then the bittering charge re-solved and
/// weighed. Every figure of the result is then that of the recipe bine writes.
void weigh_result(const BlendRequest& request, const Prepared& prepared, BlendResult& result);

}  // namespace bine::blend_steps

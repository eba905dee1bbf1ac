// Does the blend search find the best blend of up to K = 5 and 6 varieties? On small random problems
// (12-16 candidates, every one of 14 axes named) the test computes the optimum itself by brute force and
// compares design_blend's objective with it to 1e-6 relative.
//
// Reference (independent of the engine's QP solver, blend_solver.cpp): the least J over the simplex of a
// subset S is reached on some face T of S where the weights are all positive and are the affine
// least-squares minimiser of T (minimise ||W^1/2 (S_T w - t)||^2 subject to sum w = 1, no sign limits);
// every such affine minimiser with w >= 0 is a feasible blend. So the optimum over every subset of up to K
// candidates is the least J over every T of up to K members whose affine minimiser has w >= 0. Each T is
// solved by eliminating the last weight (w_last = 1 - sum of the others) and Eigen's column-pivoting
// Householder QR on the remaining unconstrained least squares (Golub and Van Loan, Matrix Computations,
// 4th ed., 5.4 and 6.2: least squares with a linear equality by elimination).
//
// The IBU and stock limits are kept slack by construction (no stock; even the whole late amount of the
// most bitter candidate in the whirlpool gives less IBU than the room left, checked below), so the
// reference needs no limit rows.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <random>
#include <vector>

#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"

namespace {

using bine::BlendCandidate;
using bine::BlendRequest;

constexpr Eigen::Index kAxes = 14;

/// 20 L at 1.050, 4 g/L late (80 g), 30 % whirlpool at 80 C for 20 min, 35 IBU, 12 % bittering hop.
BlendRequest brew() {
  BlendRequest request;
  request.plan.wort = {20.0, 1.050, 60.0, 0.0, std::nullopt};
  request.plan.late = bine::late_amount({bine::LateDose::Kind::grams_per_litre, 4.0}, 20.0);
  request.plan.ibu.whirlpool_share = 0.3;
  request.plan.ibu.target_ibu = 35.0;
  bine::BitteringHop bittering;
  bittering.variety = "bitter";
  bittering.alpha_percent = 12.0;
  request.plan.bittering = bittering;
  return request;
}

/// Candidates with 3-7 non-zero axes at intensities 0.5-5, oil 0.5-3 mL/100 g, alpha 3-6 %.
std::vector<BlendCandidate> random_candidates(std::size_t count, std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::uniform_int_distribution<Eigen::Index> axis(0, kAxes - 1);
  std::vector<BlendCandidate> candidates(count);
  for (std::size_t i = 0; i < count; ++i) {
    BlendCandidate& c = candidates[i];
    c.variety = "random-" + std::to_string(i);
    c.aroma = Eigen::VectorXd::Zero(kAxes);
    const int axes = 3 + static_cast<int>(unit(random) * 5.0);
    for (int k = 0; k < axes; ++k) c.aroma[axis(random)] = 0.5 + 4.5 * unit(random);
    c.oil_ml_per_100g = 0.5 + 2.5 * unit(random);
    c.alpha_percent = 3.0 + 3.0 * unit(random);
  }
  return candidates;
}

/// Least J of the affine minimiser of the columns `members` of s, or infinity when a weight is < 0.
double affine_subset_objective(const Eigen::MatrixXd& s, const std::vector<Eigen::Index>& members,
                               const Eigen::VectorXd& target, const Eigen::VectorXd& root_w) {
  const auto m = static_cast<Eigen::Index>(members.size());
  const Eigen::VectorXd last = root_w.cwiseProduct(s.col(members.back()));
  Eigen::VectorXd w(m);
  if (m == 1) {
    w[0] = 1.0;
  } else {
    // W^1/2 (s_last + sum_k v_k (s_k - s_last) - t): least squares in v.
    Eigen::MatrixXd a(kAxes, m - 1);
    for (Eigen::Index k = 0; k + 1 < m; ++k)
      a.col(k) = root_w.cwiseProduct(s.col(members[static_cast<std::size_t>(k)])) - last;
    const Eigen::VectorXd b = root_w.cwiseProduct(target) - last;
    const Eigen::VectorXd v = a.colPivHouseholderQr().solve(b);
    w.head(m - 1) = v;
    w[m - 1] = 1.0 - v.sum();
  }
  if (w.minCoeff() < -1e-12) return std::numeric_limits<double>::infinity();
  w = w.cwiseMax(0.0);
  w /= w.sum();
  Eigen::VectorXd profile = Eigen::VectorXd::Zero(kAxes);
  for (Eigen::Index k = 0; k < m; ++k) profile += w[k] * s.col(members[static_cast<std::size_t>(k)]);
  return (root_w.cwiseProduct(profile - target)).squaredNorm();
}

/// The brute-force optimum over every subset of up to k candidates (see the file comment).
double brute_force_optimum(const std::vector<BlendCandidate>& candidates, const bine::BlendTarget& target,
                           std::size_t k) {
  const auto n = static_cast<Eigen::Index>(candidates.size());
  Eigen::MatrixXd s(kAxes, n);
  for (Eigen::Index i = 0; i < n; ++i) s.col(i) = candidates[static_cast<std::size_t>(i)].aroma;
  const Eigen::VectorXd root_w = target.weight.cwiseSqrt();
  double best = std::numeric_limits<double>::infinity();
  for (std::size_t size = 1; size <= k; ++size) {
    std::vector<Eigen::Index> index(size);
    std::iota(index.begin(), index.end(), 0);
    while (true) {
      best = std::min(best, affine_subset_objective(s, index, target.intensity, root_w));
      std::size_t p = size;
      while (p > 0 && index[p - 1] == n - static_cast<Eigen::Index>(size - p) - 1) --p;
      if (p == 0) break;
      ++index[p - 1];
      for (std::size_t q = p; q < size; ++q) index[q] = index[q - 1] + 1;
    }
  }
  return best;
}

/// How many of `cases` random problems (seeded) design_blend solves to the brute-force optimum.
std::size_t matches_of(std::size_t cases, std::size_t k, std::size_t subset_budget, unsigned seed) {
  std::mt19937 random(seed);
  std::uniform_int_distribution<std::size_t> pool_size(12, 16);
  std::uniform_int_distribution<int> level(0, 4);
  std::size_t matched = 0;
  for (std::size_t c = 0; c < cases; ++c) {
    BlendRequest request = brew();
    request.max_varieties = k;
    request.pool.subset_budget = subset_budget;
    request.candidates = random_candidates(pool_size(random), random);
    Eigen::VectorXd intensity(kAxes);
    for (Eigen::Index a = 0; a < kAxes; ++a) intensity[a] = level(random);
    request.target = bine::target_from_spec(intensity, std::vector<bool>(kAxes, true), 0.25);
    // The limits are slack: the most bitter candidate as the whole late amount stays within the room.
    double most_bitter = 0.0;
    for (const auto& candidate : request.candidates)
      most_bitter = std::max(most_bitter, bine::whirlpool_ibu_per_gram(candidate, request.plan));
    REQUIRE(request.plan.ibu.whirlpool_share * most_bitter * request.plan.late.total < request.plan.ibu.room());
    const double reference = brute_force_optimum(request.candidates, request.target, k);
    const double found = bine::design_blend(request).objective;
    const double case_number = static_cast<double>(c);
    INFO("case " << case_number << ": found J " << found << ", brute-force optimum " << reference);
    CHECK(found <= reference + 1e-6 * std::max(reference, 1e-3));
    CHECK(found >= reference - 1e-6 * std::max(reference, 1e-3));  // never below the true optimum
    if (std::abs(found - reference) <= 1e-6 * std::max(reference, 1e-3)) ++matched;
  }
  return matched;
}

}  // namespace

TEST_CASE("the blend search reaches the brute-force optimum at K 5 and 6 with every axis named") {
  // Default settings: 12-16 candidates fit the subset budget, so this is the plain pool search.
  for (const std::size_t k : {std::size_t{5}, std::size_t{6}}) {
    const std::size_t matched = matches_of(20, k, bine::PoolSettings{}.subset_budget, 16);
    MESSAGE("K " << k << ", default budget: " << matched << " of 20 at the brute-force optimum");
  }
}

TEST_CASE("the bounded blend search reaches the brute-force optimum at K 5 and 6 (budget forced small)") {
  // A budget of 300 subsets makes the search bounded on 12-16 candidates, as 50,000 does on the demo
  // catalog: the same path (small subsets, the relaxation's support, local moves) at a testable size.
  for (const std::size_t k : {std::size_t{5}, std::size_t{6}}) {
    const std::size_t matched = matches_of(30, k, 300, 61);
    MESSAGE("K " << k << ", budget 300: " << matched << " of 30 at the brute-force optimum");
  }
}

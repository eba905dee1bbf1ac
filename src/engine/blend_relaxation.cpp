// The blend over the whole pool at once, without the cardinality limit K or the IBU and stock rows
// (docs/methods.md#blend-search): minimise J(x) = ||sum_i x_i (s_i - t)||_W^2 over the simplex. That
// is the point of least W-norm in the convex hull of the points p_i = s_i - t, found exactly by
// Wolfe's algorithm (Wolfe P., "Finding the nearest point in a polytope", Math. Programming 11,
// 1976, 128-149): keep an affinely independent corral of points; a major step adds the point with
// the least inner product with the current nearest point y (if it is not already at least y.y,
// y is optimal: the optimality condition of the min-norm point); a minor step moves to the affine
// minimiser of the corral, or as far toward it as the weights stay >= 0, dropping a point that
// reaches 0. The answer uses at most (axes + 1) points, whatever the pool size, so it is sparse.
//
// What it is for: the search over subsets of K members from a pool of N grows as C(N, K) (at K = 5
// with every axis named, every one of 7.6 million subsets of the demo catalog). The relaxation's
// support is where the best blends live; the subsets of its heaviest members are solved exactly
// (with every limit) as seeds for the local search. It is a heuristic: the K-sparse best blend need
// not lie in the relaxation's support, and the benchmark measures the gap to the exhaustive search.
// Its minimum J is a lower bound for every subset's J, so a seed at that value ends the search.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "engine/blend_steps.hpp"

namespace bine::blend_steps {
namespace {

constexpr double kTolerance = 1e-12;
constexpr int kMaxSteps = 2000;

/// Q_kl = (s_k - t)^T W (s_l - t) over the pool (rows in pool order).
Eigen::MatrixXd centred_gram(const Prepared& prepared, const std::vector<std::size_t>& pool) {
  const Index n = at(pool.size());
  Eigen::MatrixXd q(n, n);
  for (Index k = 0; k < n; ++k)
    for (Index l = 0; l < n; ++l)
      q(k, l) = prepared.gram(k, l) - prepared.linear[at(pool[static_cast<std::size_t>(k)])] -
                prepared.linear[at(pool[static_cast<std::size_t>(l)])] + prepared.constant;
  return q;
}

/// Weights w on the corral with sum 1 minimising w^T Q w (affine minimiser, signs free).
Eigen::VectorXd affine_minimiser(const Eigen::MatrixXd& q, const std::vector<Index>& corral) {
  const Index m = at(corral.size());
  Eigen::MatrixXd kkt = Eigen::MatrixXd::Zero(m + 1, m + 1);
  for (Index a = 0; a < m; ++a) {
    for (Index b = 0; b < m; ++b)
      kkt(a, b) = q(corral[static_cast<std::size_t>(a)], corral[static_cast<std::size_t>(b)]);
    kkt(a, m) = 1.0;
    kkt(m, a) = 1.0;
  }
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(m + 1);
  rhs[m] = 1.0;
  return Eigen::CompleteOrthogonalDecomposition<Eigen::MatrixXd>(kkt).solve(rhs).head(m);
}

/// Minor steps: from weights x on the corral toward the affine minimiser, dropping points at 0.
void minor_steps(const Eigen::MatrixXd& q, std::vector<Index>& corral, Eigen::VectorXd& x) {
  for (int step = 0; step < kMaxSteps; ++step) {
    const Eigen::VectorXd w = affine_minimiser(q, corral);
    if (w.minCoeff() > kTolerance) {
      x = w;
      return;
    }
    double theta = 1.0;
    for (Index a = 0; a < w.size(); ++a)
      if (w[a] <= kTolerance && x[a] - w[a] > 0.0) theta = std::min(theta, x[a] / (x[a] - w[a]));
    x = x + theta * (w - x);
    std::vector<Index> kept;
    std::vector<double> weights;
    for (Index a = 0; a < x.size(); ++a)
      if (x[a] > kTolerance) {
        kept.push_back(corral[static_cast<std::size_t>(a)]);
        weights.push_back(x[a]);
      }
    corral = kept;
    x = Eigen::Map<Eigen::VectorXd>(weights.data(), at(weights.size()));
    x /= x.sum();
  }
}

}  // namespace

Relaxation relax_pool(const Prepared& prepared, const std::vector<std::size_t>& pool) {
  Relaxation result;
  if (pool.empty()) return result;
  const Eigen::MatrixXd q = centred_gram(prepared, pool);
  Index first = 0;
  q.diagonal().minCoeff(&first);
  std::vector<Index> corral{first};
  Eigen::VectorXd x = Eigen::VectorXd::Ones(1);
  for (int step = 0; step < kMaxSteps; ++step) {
    // y.p_k for every k is (Q x)_k over the corral's columns; y.y = x^T Q_cc x.
    Eigen::VectorXd qx = Eigen::VectorXd::Zero(q.rows());
    for (std::size_t a = 0; a < corral.size(); ++a) qx += x[at(a)] * q.col(corral[a]);
    double yy = 0.0;
    for (std::size_t a = 0; a < corral.size(); ++a) yy += x[at(a)] * qx[corral[a]];
    Index best = 0;
    const double least = qx.minCoeff(&best);
    const bool in_corral = std::find(corral.begin(), corral.end(), best) != corral.end();
    if (least >= yy - 1e-10 * std::max(1.0, std::abs(yy)) || in_corral) break;
    corral.push_back(best);
    x.conservativeResize(x.size() + 1);
    x[x.size() - 1] = 0.0;
    minor_steps(q, corral, x);
  }
  const Eigen::VectorXd qx = [&] {
    Eigen::VectorXd v = Eigen::VectorXd::Zero(q.rows());
    for (std::size_t a = 0; a < corral.size(); ++a) v += x[at(a)] * q.col(corral[a]);
    return v;
  }();
  result.objective = 0.0;
  for (std::size_t a = 0; a < corral.size(); ++a) result.objective += x[at(a)] * qx[corral[a]];
  // Heaviest first.
  std::vector<std::size_t> order(corral.size());
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](std::size_t l, std::size_t r) { return x[at(l)] > x[at(r)]; });
  for (const std::size_t a : order) {
    result.members.push_back(pool[static_cast<std::size_t>(corral[a])]);
    result.weights.push_back(x[at(a)]);
  }
  return result;
}

}  // namespace bine::blend_steps

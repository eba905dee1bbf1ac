// Exact solution of the small blend QP by enumerating active sets.
//
// Problem. For a fixed subset of n varieties the blend's aroma profile is linear in the oil shares x
// (P = A x, one column of A per variety), so the weighted squared distance to the target,
// J(x) = (A x - b)^T W (A x - b), is a convex quadratic. The constraints are all linear: x >= 0,
// sum(x) = 1, the late-hop IBU and stock limits written as rows C x <= d (blend.cpp shows how the
// gram-based limits become linear in x), and, without a bittering charge, one equality e^T x = e0.
//
// Method. A convex QP attains its minimum x* (the feasible set is inside the simplex, so bounded).
// Let F be the face of the feasible polytope whose relative interior holds x*, described by the
// constraints active there. Inside F every direction in its affine hull is feasible both ways, so x*
// also minimises J over that affine hull; the minimiser over an affine set solves the equality-
// constrained KKT system
//     [ H_SS  E^T ] [x_S]   [f_S]
//     [ E     0   ] [ l ] = [ e ]
// where S is the support of x (the variables not held at 0) and E stacks the equalities and the
// active inequality rows restricted to S. We enumerate every support S and every set of active
// general rows of size at most |S| minus the number of equalities, solve each system, and keep the
// primal-feasible point of least J. When H is singular (two lots of one variety have the same
// profile), the minimiser over an affine hull is not unique and the least-norm solution may leave
// the polytope; a vertex of the optimal set is then the unique minimiser of a smaller face, which
// the enumeration also visits, so the minimum over feasible candidates is still exactly J(x*).
// A candidate that is also dual feasible (multipliers of active inequalities and of the zeroed
// shares >= 0) satisfies the KKT conditions of the whole problem, which for a convex QP proves it
// optimal, and the search stops there; that is the usual case and the first few systems find it.
//
// Why this and not an iterative active-set or interior-point code: n is at most K (default 3), so
// there are a few dozen systems of size <= 2n + 2; enumeration is exact, has no cycling or
// step-length logic to get wrong, and costs about a microsecond per system. Its cost grows as
// 2^n x 2^m, so it is meant for n up to about 8 and m up to about 12; the blend never exceeds that.
// Sources: the KKT conditions for convex QPs and the face argument are textbook (Nocedal J. &
// Wright S.J., Numerical Optimization, 2nd ed. 2006, ch. 16, from memory for the chapter number).
// Limits: tolerances are 1e-9 relative to each row's scale; rows are normalised before comparison.
#include "engine/blend_solver.hpp"

#include <algorithm>
#include <bit>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

namespace bine {
namespace {

constexpr double kTolerance = 1e-9;

using Index = Eigen::Index;
// KKT systems have at most 2n rows (n shares, at most n equalities and active rows); a fixed
// capacity keeps them off the heap. n is limited to kMaxShares.
constexpr int kMaxShares = 8;
using KktMatrix =
    Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::ColMajor, 2 * kMaxShares, 2 * kMaxShares>;
using KktVector = Eigen::Matrix<double, Eigen::Dynamic, 1, Eigen::ColMajor, 2 * kMaxShares, 1>;

/// Scales each inequality row so that its largest coefficient or bound is 1.
void normalise_rows(Eigen::MatrixXd& c, Eigen::VectorXd& d) {
  for (Index r = 0; r < c.rows(); ++r) {
    const double scale = std::max(c.row(r).cwiseAbs().maxCoeff(), std::abs(d[r]));
    if (scale > 0.0) {
      c.row(r) /= scale;
      d[r] /= scale;
    }
  }
}

/// Solves M z = r; least-norm solution when M is singular.
KktVector solve_kkt(const KktMatrix& m, const KktVector& r) {
  Eigen::FullPivLU<KktMatrix> lu(m);
  if (lu.isInvertible()) return lu.solve(r);
  return Eigen::CompleteOrthogonalDecomposition<KktMatrix>(m).solve(r);
}

}  // namespace

BlendQp qp_from_least_squares(const Eigen::MatrixXd& a, const Eigen::VectorXd& b, const Eigen::VectorXd& w) {
  BlendQp qp;
  const Eigen::MatrixXd wa = w.asDiagonal() * a;
  qp.hessian = a.transpose() * wa;
  qp.linear = wa.transpose() * b;
  qp.constant = b.dot(w.cwiseProduct(b));
  qp.inequality.resize(0, a.cols());
  qp.inequality_bound.resize(0);
  return qp;
}

double blend_qp_objective(const BlendQp& qp, const Eigen::VectorXd& x) {
  return x.dot(qp.hessian * x) - 2.0 * qp.linear.dot(x) + qp.constant;
}

BlendQpSolution solve_blend_qp(const BlendQp& qp) {
  BlendQpSolution best;
  const Index n = qp.hessian.rows();
  if (n == 0) return best;
  if (n > kMaxShares) throw std::invalid_argument("solve_blend_qp: more than 8 shares");
  Eigen::MatrixXd c = qp.inequality;
  Eigen::VectorXd d = qp.inequality_bound;
  normalise_rows(c, d);
  Eigen::VectorXd e;
  double e0 = 0.0;
  if (qp.equality) {
    e = *qp.equality;
    e0 = qp.equality_bound;
    const double scale = std::max(e.cwiseAbs().maxCoeff(), std::abs(e0));
    if (scale > 0.0) {
      e /= scale;
      e0 /= scale;
    }
  }
  const Index m = c.rows();
  const int equalities = qp.equality ? 2 : 1;
  const double dual_tolerance = kTolerance * (1.0 + qp.hessian.cwiseAbs().maxCoeff() + qp.linear.cwiseAbs().maxCoeff());

  // Supports from the largest down: an interior optimum is found by the first system.
  std::vector<unsigned> supports;
  for (unsigned s = 1; s < (1u << n); ++s) supports.push_back(s);
  std::stable_sort(supports.begin(), supports.end(),
                   [](unsigned l, unsigned r) { return std::popcount(l) > std::popcount(r); });
  std::vector<unsigned> row_sets;
  for (unsigned a = 0; a < (1u << m); ++a) row_sets.push_back(a);
  std::stable_sort(row_sets.begin(), row_sets.end(),
                   [](unsigned l, unsigned r) { return std::popcount(l) < std::popcount(r); });

  double best_objective = std::numeric_limits<double>::infinity();
  std::vector<Index> vars;
  std::vector<Index> rows;
  // Returns when a KKT point is found; otherwise visits every active set.
  const auto search = [&] {
    for (const unsigned support : supports) {
      vars.clear();
      for (Index i = 0; i < n; ++i)
        if (support & (1u << i)) vars.push_back(i);
      const auto k = static_cast<Index>(vars.size());
      for (const unsigned active : row_sets) {
        if (std::popcount(active) + equalities > k) break;  // sorted by size: no larger set fits
        rows.clear();
        for (Index r = 0; r < m; ++r)
          if (active & (1u << r)) rows.push_back(r);
        const Index q = equalities + static_cast<Index>(rows.size());
        KktMatrix kkt = KktMatrix::Zero(k + q, k + q);
        KktVector rhs(k + q);
        for (Index i = 0; i < k; ++i) {
          for (Index j = 0; j < k; ++j) kkt(i, j) = qp.hessian(vars[i], vars[j]);
          rhs[i] = qp.linear[vars[i]];
          Index row = k;
          kkt(i, row) = kkt(row, i) = 1.0;  // sum(x) = 1
          ++row;
          if (qp.equality) {
            kkt(i, row) = kkt(row, i) = e[vars[i]];
            ++row;
          }
          for (const Index r : rows) {
            kkt(i, row) = kkt(row, i) = c(r, vars[i]);
            ++row;
          }
        }
        Index row = k;
        rhs[row++] = 1.0;
        if (qp.equality) rhs[row++] = e0;
        for (const Index r : rows) rhs[row++] = d[r];
        const KktVector z = solve_kkt(kkt, rhs);
        ++best.systems_solved;
        const bool solved = (kkt * z - rhs).cwiseAbs().maxCoeff() <= dual_tolerance * (1.0 + rhs.cwiseAbs().maxCoeff());

        Eigen::VectorXd x = Eigen::VectorXd::Zero(n);
        for (Index i = 0; i < k; ++i) x[vars[i]] = z[i];
        // Primal feasibility of the whole problem.
        if (x.minCoeff() < -kTolerance || std::abs(x.sum() - 1.0) > kTolerance) continue;
        if (m > 0 && ((c * x) - d).maxCoeff() > kTolerance) continue;
        if (qp.equality && std::abs(e.dot(x) - e0) > kTolerance) continue;
        const double objective = blend_qp_objective(qp, x);
        if (objective < best_objective) {
          best_objective = objective;
          best.feasible = true;
          best.shares = x;
          best.objective = objective;
        }
        // Dual feasibility: active rows pull with l >= 0; zeroed shares must not want to grow.
        bool dual_ok = solved;
        for (std::size_t a = 0; a < rows.size() && dual_ok; ++a)
          dual_ok = z[k + equalities + static_cast<Index>(a)] >= -dual_tolerance;
        if (dual_ok && k < n) {
          Eigen::VectorXd gradient = qp.hessian * x - qp.linear + Eigen::VectorXd::Constant(n, z[k]);
          if (qp.equality) gradient += z[k + 1] * e;
          for (std::size_t a = 0; a < rows.size(); ++a)
            gradient += z[k + equalities + static_cast<Index>(a)] * c.row(rows[a]).transpose();
          for (Index i = 0; i < n && dual_ok; ++i)
            if (!(support & (1u << i))) dual_ok = gradient[i] >= -dual_tolerance;
        }
        if (dual_ok) return;  // a KKT point of a convex problem: optimal
      }
    }
  };
  search();
  if (best.feasible) {
    best.shares = best.shares.cwiseMax(0.0);
    best.shares /= best.shares.sum();
    best.objective = blend_qp_objective(qp, best.shares);
  }
  return best;
}

}  // namespace bine

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
#include <utility>
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

/// The QP with its rows scaled for comparison, and the tolerance on multipliers and residuals.
struct ScaledQp {
  const BlendQp& qp;
  Eigen::MatrixXd c;  // C, rows scaled to a largest entry of 1
  Eigen::VectorXd d;
  Eigen::VectorXd e;  // e, scaled likewise, when the QP has the equality
  double e0 = 0.0;
  int equalities = 1;  // sum(x) = 1, and e^T x = e0 when present
  double dual_tolerance = 0.0;

  Index n() const { return qp.hessian.rows(); }
  Index m() const { return c.rows(); }
};

ScaledQp scaled(const BlendQp& qp) {
  ScaledQp p{qp, qp.inequality, qp.inequality_bound, Eigen::VectorXd(), 0.0, qp.equality ? 2 : 1, 0.0};
  normalise_rows(p.c, p.d);
  if (qp.equality) {
    p.e = *qp.equality;
    p.e0 = qp.equality_bound;
    const double scale = std::max(p.e.cwiseAbs().maxCoeff(), std::abs(p.e0));
    if (scale > 0.0) {
      p.e /= scale;
      p.e0 /= scale;
    }
  }
  p.dual_tolerance = kTolerance * (1.0 + qp.hessian.cwiseAbs().maxCoeff() + qp.linear.cwiseAbs().maxCoeff());
  return p;
}

/// The bit sets first .. 2^count - 1 ordered by their number of members (stable).
std::vector<unsigned> bit_sets_by_size(unsigned first, Index count, bool largest_first) {
  std::vector<unsigned> sets;
  for (unsigned s = first; s < (1u << count); ++s) sets.push_back(s);
  std::stable_sort(sets.begin(), sets.end(), [largest_first](unsigned l, unsigned r) {
    return largest_first ? std::popcount(l) > std::popcount(r) : std::popcount(l) < std::popcount(r);
  });
  return sets;
}

/// The indices below `count` whose bit is set.
void members(unsigned bits, Index count, std::vector<Index>& out) {
  out.clear();
  for (Index i = 0; i < count; ++i)
    if (bits & (1u << i)) out.push_back(i);
}

/// The KKT system of one support `vars` and set of active rows `rows` (see the essay).
std::pair<KktMatrix, KktVector> kkt_system(const ScaledQp& p, const std::vector<Index>& vars,
                                           const std::vector<Index>& rows) {
  const BlendQp& qp = p.qp;
  const auto k = static_cast<Index>(vars.size());
  const Index q = p.equalities + static_cast<Index>(rows.size());
  KktMatrix kkt = KktMatrix::Zero(k + q, k + q);
  KktVector rhs(k + q);
  for (Index i = 0; i < k; ++i) {
    for (Index j = 0; j < k; ++j) kkt(i, j) = qp.hessian(vars[i], vars[j]);
    rhs[i] = qp.linear[vars[i]];
    Index row = k;
    kkt(i, row) = kkt(row, i) = 1.0;  // sum(x) = 1
    ++row;
    if (qp.equality) {
      kkt(i, row) = kkt(row, i) = p.e[vars[i]];
      ++row;
    }
    for (const Index r : rows) {
      kkt(i, row) = kkt(row, i) = p.c(r, vars[i]);
      ++row;
    }
  }
  Index row = k;
  rhs[row++] = 1.0;
  if (qp.equality) rhs[row++] = p.e0;
  for (const Index r : rows) rhs[row++] = p.d[r];
  return {kkt, rhs};
}

/// Primal feasibility of the whole problem.
bool primal_feasible(const ScaledQp& p, const Eigen::VectorXd& x) {
  if (x.minCoeff() < -kTolerance || std::abs(x.sum() - 1.0) > kTolerance) return false;
  if (p.m() > 0 && ((p.c * x) - p.d).maxCoeff() > kTolerance) return false;
  if (p.qp.equality && std::abs(p.e.dot(x) - p.e0) > kTolerance) return false;
  return true;
}

/// Dual feasibility: active rows pull with l >= 0; zeroed shares must not want to grow.
bool dual_feasible(const ScaledQp& p, const KktVector& z, const Eigen::VectorXd& x, unsigned support, Index k,
                   const std::vector<Index>& rows) {
  for (std::size_t a = 0; a < rows.size(); ++a)
    if (!(z[k + p.equalities + static_cast<Index>(a)] >= -p.dual_tolerance)) return false;
  const Index n = p.n();
  if (k == n) return true;
  Eigen::VectorXd gradient = p.qp.hessian * x - p.qp.linear + Eigen::VectorXd::Constant(n, z[k]);
  if (p.qp.equality) gradient += z[k + 1] * p.e;
  for (std::size_t a = 0; a < rows.size(); ++a)
    gradient += z[k + p.equalities + static_cast<Index>(a)] * p.c.row(rows[a]).transpose();
  for (Index i = 0; i < n; ++i)
    if (!(support & (1u << i)) && !(gradient[i] >= -p.dual_tolerance)) return false;
  return true;
}

/// Solves one active set's system and keeps a primal-feasible point of lower J in `best`. True when
/// the point is a KKT point of the whole problem (optimal, so the search can stop).
bool try_active_set(const ScaledQp& p, unsigned support, const std::vector<Index>& vars, const std::vector<Index>& rows,
                    double& best_objective, BlendQpSolution& best) {
  const auto [kkt, rhs] = kkt_system(p, vars, rows);
  const KktVector z = solve_kkt(kkt, rhs);
  ++best.systems_solved;
  const bool solved = (kkt * z - rhs).cwiseAbs().maxCoeff() <= p.dual_tolerance * (1.0 + rhs.cwiseAbs().maxCoeff());
  const auto k = static_cast<Index>(vars.size());
  Eigen::VectorXd x = Eigen::VectorXd::Zero(p.n());
  for (Index i = 0; i < k; ++i) x[vars[i]] = z[i];
  if (!primal_feasible(p, x)) return false;
  const double objective = blend_qp_objective(p.qp, x);
  if (objective < best_objective) {
    best_objective = objective;
    best.feasible = true;
    best.shares = x;
    best.objective = objective;
  }
  return solved && dual_feasible(p, z, x, support, k, rows);
}

/// Visits supports from the largest down (an interior optimum is found by the first system) and,
/// for each, sets of active rows from the smallest up; stops at a KKT point.
void enumerate_active_sets(const ScaledQp& p, BlendQpSolution& best) {
  const std::vector<unsigned> supports = bit_sets_by_size(1, p.n(), true);
  const std::vector<unsigned> row_sets = bit_sets_by_size(0, p.m(), false);
  double best_objective = std::numeric_limits<double>::infinity();
  std::vector<Index> vars;
  std::vector<Index> rows;
  for (const unsigned support : supports) {
    members(support, p.n(), vars);
    const auto k = static_cast<Index>(vars.size());
    for (const unsigned active : row_sets) {
      if (std::popcount(active) + p.equalities > k) break;  // sorted by size: no larger set fits
      members(active, p.m(), rows);
      if (try_active_set(p, support, vars, rows, best_objective, best)) return;
    }
  }
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
  enumerate_active_sets(scaled(qp), best);
  if (best.feasible) {
    best.shares = best.shares.cwiseMax(0.0);
    best.shares /= best.shares.sum();
    best.objective = blend_qp_objective(qp, best.shares);
  }
  return best;
}

}  // namespace bine

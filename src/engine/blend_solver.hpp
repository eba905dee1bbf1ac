#pragma once
// The exact QP behind a blend of a few varieties: minimise a weighted squared distance of the blend's
// aroma profile from a target over the oil shares of a fixed subset. See blend_solver.cpp for the
// method (exact enumeration of active sets), why it was chosen and its limits.
#include <Eigen/Dense>
#include <optional>

namespace bine {

/// One blend QP in Gram form over n shares x:
///   minimise J(x) = x^T H x - 2 f^T x + c
///   subject to x >= 0, sum(x) = 1, C x <= d (row-wise), and, when present, e^T x = e0.
/// For J = (A x - b)^T W (A x - b): H = A^T W A, f = A^T W b, c = b^T W b (see qp_from_least_squares).
struct BlendQp {
  Eigen::MatrixXd hessian;                  // H, n x n, symmetric positive semi-definite
  Eigen::VectorXd linear;                   // f, n
  double constant = 0.0;                    // c
  Eigen::MatrixXd inequality;               // C, m x n (m may be 0)
  Eigen::VectorXd inequality_bound;         // d, m
  std::optional<Eigen::VectorXd> equality;  // e, n (besides sum(x) = 1)
  double equality_bound = 0.0;              // e0
};

/// The minimiser, or feasible == false when no x satisfies the constraints.
struct BlendQpSolution {
  bool feasible = false;
  Eigen::VectorXd shares;  // x, sums to 1
  double objective = 0.0;  // J(x), >= 0 up to rounding for least-squares problems
  int systems_solved = 0;  // KKT systems solved (for benchmarks)
};

/// Builds the Gram form of J = (A x - b)^T diag(w) (A x - b) with no constraints besides the simplex.
BlendQp qp_from_least_squares(const Eigen::MatrixXd& a, const Eigen::VectorXd& b, const Eigen::VectorXd& w);

/// Solves the QP exactly by enumerating active sets (n up to about 8; blends use n <= K = 3..4).
/// Constraint rows are compared with a tolerance of 1e-9 relative to their scale.
BlendQpSolution solve_blend_qp(const BlendQp& qp);

/// J(x) in Gram form, clamped at 0 from below only by the caller if it wants.
double blend_qp_objective(const BlendQp& qp, const Eigen::VectorXd& x);

}  // namespace bine

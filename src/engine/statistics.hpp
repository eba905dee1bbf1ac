#pragma once
// The few distributions the calibration and the IBU intervals need: Student's t and Fisher's F
// through the regularized incomplete beta function, and the standard normal. See statistics.cpp.
namespace bine {

/// Regularized incomplete beta function I_x(a, b), 0 <= x <= 1, a, b > 0.
double regularized_incomplete_beta(double x, double a, double b);
/// P(T <= t) for Student's t with `dof` degrees of freedom.
double student_t_cdf(double t, double dof);
/// The p-quantile of Student's t with `dof` degrees of freedom (0 < p < 1).
double student_t_quantile(double p, double dof);
/// P(F > f) for Fisher's F with (d1, d2) degrees of freedom.
double f_distribution_sf(double f, double d1, double d2);
/// The p-quantile of the standard normal distribution (0 < p < 1).
double normal_quantile(double p);
/// P(Z <= z) for the standard normal distribution.
double normal_cdf(double z);

}  // namespace bine

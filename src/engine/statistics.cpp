// Distributions for the calibration's confidence intervals and tests (docs/methods.md#calibration-one-factor).
//
// Method. Student's t and Fisher's F are both read through the regularized incomplete beta
// function I_x(a, b) [Abramowitz M. & Stegun I.A. 1964, Handbook of Mathematical Functions, 26.5.27
// and 26.6.2 (equation numbers from memory)]: for t with n degrees of freedom,
// P(|T| > t) = I_{n / (n + t^2)}(n/2, 1/2); for F with (d1, d2), P(F > f) = I_{d2 / (d2 + d1 f)}(d2/2, d1/2).
// I_x is evaluated by its continued fraction with the modified Lentz algorithm (Press W.H. et al.,
// Numerical Recipes, 3rd ed. 2007, section 6.4), to relative 1e-15; quantiles are found by bisection
// on the CDF to 1e-14 (monotone, so always converges). The normal quantile inverts std::erfc the
// same way. Tests compare against scipy.stats to 1e-9.
#include "engine/statistics.hpp"

#include <cmath>
#include <limits>

namespace bine {
namespace {

// Continued fraction for I_x(a, b) (Numerical Recipes 6.4, modified Lentz).
double beta_continued_fraction(double x, double a, double b) {
  constexpr double kTiny = 1e-300;
  constexpr double kEpsilon = 1e-16;
  const double qab = a + b;
  const double qap = a + 1.0;
  const double qam = a - 1.0;
  double c = 1.0;
  double d = 1.0 - qab * x / qap;
  if (std::abs(d) < kTiny) d = kTiny;
  d = 1.0 / d;
  double h = d;
  for (int m = 1; m <= 10000; ++m) {
    const double m2 = 2.0 * m;
    double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
    d = 1.0 + aa * d;
    if (std::abs(d) < kTiny) d = kTiny;
    c = 1.0 + aa / c;
    if (std::abs(c) < kTiny) c = kTiny;
    d = 1.0 / d;
    h *= d * c;
    aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
    d = 1.0 + aa * d;
    if (std::abs(d) < kTiny) d = kTiny;
    c = 1.0 + aa / c;
    if (std::abs(c) < kTiny) c = kTiny;
    d = 1.0 / d;
    const double step = d * c;
    h *= step;
    if (std::abs(step - 1.0) < kEpsilon) break;
  }
  return h;
}

// Bisection for the p-quantile of a monotone increasing CDF on [low, high].
template <typename Cdf>
double bisect_quantile(const Cdf& cdf, double p, double low, double high) {
  while (cdf(low) > p) low *= 2.0;
  while (cdf(high) < p) high *= 2.0;
  for (int i = 0; i < 400 && high - low > 1e-15 * std::max(1.0, std::abs(high)); ++i) {
    const double mid = 0.5 * (low + high);
    (cdf(mid) < p ? low : high) = mid;
  }
  return 0.5 * (low + high);
}

}  // namespace

double regularized_incomplete_beta(double x, double a, double b) {
  if (x <= 0.0) return 0.0;
  if (x >= 1.0) return 1.0;
  const double log_front = std::lgamma(a + b) - std::lgamma(a) - std::lgamma(b) + a * std::log(x) + b * std::log1p(-x);
  const double front = std::exp(log_front);
  // The continued fraction converges fast for x < (a + 1) / (a + b + 2); use the symmetry otherwise.
  if (x < (a + 1.0) / (a + b + 2.0)) return front * beta_continued_fraction(x, a, b) / a;
  return 1.0 - front * beta_continued_fraction(1.0 - x, b, a) / b;
}

double student_t_cdf(double t, double dof) {
  // P(|T| > |t|) = I_{n / (n + t^2)}(n / 2, 1 / 2).
  const double tail = 0.5 * regularized_incomplete_beta(dof / (dof + t * t), 0.5 * dof, 0.5);
  return t >= 0.0 ? 1.0 - tail : tail;
}

double student_t_quantile(double p, double dof) {
  if (p == 0.5) return 0.0;
  if (p < 0.5) return -student_t_quantile(1.0 - p, dof);
  return bisect_quantile([dof](double t) { return student_t_cdf(t, dof); }, p, 0.0, 1.0);
}

double f_distribution_sf(double f, double d1, double d2) {
  if (f <= 0.0) return 1.0;
  return regularized_incomplete_beta(d2 / (d2 + d1 * f), 0.5 * d2, 0.5 * d1);
}

double normal_cdf(double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); }

double normal_quantile(double p) {
  if (p == 0.5) return 0.0;
  if (p < 0.5) return -normal_quantile(1.0 - p);
  return bisect_quantile(normal_cdf, p, 0.0, 1.0);
}

}  // namespace bine

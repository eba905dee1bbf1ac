// IBU intervals: exact propagation on a linear case against the normal quantile (scipy.stats.norm.ppf
// (0.95) = 1.6448536, Debian python3-scipy), the seeded Monte Carlo against that exact answer, and
// Monte Carlo cases whose 5 % and 95 % points are known in closed form (Student's t quantile
// scipy.stats.t.ppf(0.95, 9) = 1.8331129; a monotone function of a uniform stability).
#include "engine/ibu_interval.hpp"

#include <doctest/doctest.h>

#include <cmath>

namespace {

using bine::AdditionUncertainty;
using bine::FactorUncertainty;

constexpr double kZ95 = 1.6448536269514722;  // scipy.stats.norm.ppf(0.95)

AdditionUncertainty addition(double ibu_per_alpha, double alpha, double sd) {
  AdditionUncertainty a;
  a.ibu_per_alpha = ibu_per_alpha;
  a.alpha_percent = alpha;
  a.alpha_sd = sd;
  return a;
}

}  // namespace

TEST_CASE("a linear case: exact normal propagation, and the Monte Carlo agrees with it") {
  // IBU = 2.5 x A1 + 0.8 x A2, A1 ~ N(12, 0.4), A2 ~ N(7, 0.6): mean 35.6, sd = sqrt(1^2 + 0.48^2)
  // = 1.10924 (hand arithmetic); 90 %: 35.6 -+ 1.6449 x 1.10924 = 33.7754-37.4246.
  const std::vector<AdditionUncertainty> additions{addition(2.5, 12.0, 0.4), addition(0.8, 7.0, 0.6)};
  const auto exact = bine::ibu_intervals(additions, {});
  CHECK_FALSE(exact.monte_carlo);
  const double sd = std::sqrt(1.0 + 0.48 * 0.48);
  CHECK(exact.total.low == doctest::Approx(35.6 - kZ95 * sd).epsilon(1e-12));
  CHECK(exact.total.high == doctest::Approx(35.6 + kZ95 * sd).epsilon(1e-12));
  CHECK(exact.additions[0].low == doctest::Approx(30.0 - kZ95 * 1.0).epsilon(1e-12));
  const auto drawn = bine::ibu_intervals(additions, {}, true);
  CHECK(drawn.monte_carlo);
  // 10^4 draws: the standard error of a 5 % point is about 0.021 sd (sqrt(0.05 x 0.95 / 10^4) /
  // phi(1.645)); within 0.1 sd is five of those.
  CHECK(std::abs(drawn.total.low - exact.total.low) < 0.1 * sd);
  CHECK(std::abs(drawn.total.high - exact.total.high) < 0.1 * sd);
  CHECK(std::abs(drawn.additions[1].low - exact.additions[1].low) < 0.1 * 0.48);
  // Seeded: the same inputs give the same interval.
  const auto again = bine::ibu_intervals(additions, {}, true);
  CHECK(again.total.low == drawn.total.low);
  CHECK(again.total.high == drawn.total.high);
}

TEST_CASE("the brewhouse factor's interval: Student's t quantiles through the Monte Carlo") {
  // Alpha known exactly, f = 0.9 + 0.02 T(9): IBU = 30 x f / 0.9, so its 5 % and 95 % points are
  // 30 x (1 -+ 1.8331 x 0.02 / 0.9) = 28.7779-31.2221 (scipy.stats.t.ppf(0.95, 9) = 1.8331129).
  const std::vector<AdditionUncertainty> additions{addition(3.0, 10.0, 0.0)};
  const std::vector<std::optional<FactorUncertainty>> factors{FactorUncertainty{0.9, 0.02, 9}};
  const auto result = bine::ibu_intervals(additions, factors);
  CHECK(result.monte_carlo);
  const double half = 30.0 * 1.8331129326536335 * 0.02 / 0.9;
  CHECK(result.total.low == doctest::Approx(30.0 - half).epsilon(4e-3));
  CHECK(result.total.high == doctest::Approx(30.0 + half).epsilon(4e-3));
}

TEST_CASE("ageing over a uniform stability range: the points of a monotone function of S") {
  // A = 10 x exp(-ln(100/S)/180 x 200), S uniform on 65 +- 7.5: IBU = 2 A rises with S, so its 5 %
  // point is at S = 57.5 + 0.05 x 15 = 58.25 and its 95 % point at S = 71.75 (hand arithmetic,
  // Garetz 1994 loss law).
  AdditionUncertainty a = addition(2.0, 10.0, 0.0);
  a.ageing = bine::AgeingUncertainty{65.0, 7.5, 200.0};
  const auto result = bine::ibu_intervals({a}, {});
  const auto ibu_at = [](double s) { return 20.0 * std::exp(-std::log(100.0 / s) / 180.0 * 200.0); };
  CHECK(result.total.low == doctest::Approx(ibu_at(58.25)).epsilon(2e-3));
  CHECK(result.total.high == doctest::Approx(ibu_at(71.75)).epsilon(2e-3));
}

TEST_CASE("a catalog range read as a 90 % range gives back that range for one addition") {
  // Alpha 10-12 % (midpoint 11), 3 IBU per % alpha: the interval is 30-36 IBU (by construction of
  // sd = (max - min) / (2 x 1.6449); docs/methods.md#ibu-intervals).
  const double sd = bine::sd_from_90_range(10.0, 12.0);
  const auto result = bine::ibu_intervals({addition(3.0, 11.0, sd)}, {});
  CHECK(result.total.low == doctest::Approx(30.0).epsilon(1e-9));
  CHECK(result.total.high == doctest::Approx(36.0).epsilon(1e-9));
}

TEST_CASE("subtotals: the exact interval of a sum over some terms, and the same subset by the draws") {
  // 2.5 x A1 + 0.8 x A2 + 1.0 x A3 with A3 ~ N(5, 0.5); the subtotal of terms 0 and 1 is the first
  // case's sum, 35.6 -+ 1.6449 x 1.10924 (hand arithmetic above); the subtotal of term 2 alone is
  // 5 -+ 1.6449 x 0.5.
  const std::vector<AdditionUncertainty> additions{addition(2.5, 12.0, 0.4), addition(0.8, 7.0, 0.6),
                                                   addition(1.0, 5.0, 0.5)};
  const auto exact = bine::ibu_intervals(additions, {}, false, {{0, 1}, {2}, {}});
  REQUIRE(exact.subtotals.size() == 3);
  const double sd = std::sqrt(1.0 + 0.48 * 0.48);
  CHECK(exact.subtotals[0].low == doctest::Approx(35.6 - kZ95 * sd).epsilon(1e-12));
  CHECK(exact.subtotals[0].high == doctest::Approx(35.6 + kZ95 * sd).epsilon(1e-12));
  CHECK(exact.subtotals[1].low == doctest::Approx(5.0 - kZ95 * 0.5).epsilon(1e-12));
  CHECK(exact.subtotals[2].low == 0.0);  // an empty sum is 0 IBU, known exactly
  CHECK(exact.subtotals[2].high == 0.0);
  const auto drawn = bine::ibu_intervals(additions, {}, true, {{0, 1}});
  CHECK(std::abs(drawn.subtotals[0].low - exact.subtotals[0].low) < 0.1 * sd);  // 0.1 sd: see the first case
  CHECK(std::abs(drawn.subtotals[0].high - exact.subtotals[0].high) < 0.1 * sd);
}

TEST_CASE("an aged term: the certificate's alpha before ageing, its tolerance around that, the ageing drawn") {
  // 20 IBU from 8.834 % in the kettle, aged from a certificate at stability 80 % over an exposure of
  // 100 days: left = exp(-ln(100/80)/180 x 100) = 0.88340, so the certificate said 8.834 / 0.88340
  // = 10.000 % (Garetz 1994; hand arithmetic), and 5 % of it read as a 90 % range gives sd
  // (10.5 - 9.5) / (2 x 1.6449) = 0.30397. IBU per % alpha in the kettle: 20 / 8.834 = 2.2640.
  const double left = std::exp(-std::log(100.0 / 80.0) / 180.0 * 100.0);
  bine::IbuTerm term;
  term.ibu = 20.0;
  term.alpha_percent = 10.0 * left;
  term.origin.ageing = bine::AgeingUncertainty{80.0, 7.5, 100.0};
  const AdditionUncertainty a = bine::addition_uncertainty(term, 5.0);
  CHECK(a.alpha_percent == doctest::Approx(10.0).epsilon(1e-12));
  CHECK(a.alpha_sd == doctest::Approx(1.0 / (2.0 * kZ95)).epsilon(1e-9));
  CHECK(a.ibu_per_alpha == doctest::Approx(20.0 / (10.0 * left)).epsilon(1e-12));
  CHECK(a.ageing.has_value());
  // Its interval holds the 20 IBU it stands for, and is drawn.
  const auto result = bine::ibu_intervals({a}, {});
  CHECK(result.monte_carlo);
  CHECK(result.aged);
  CHECK(result.total.low < 20.0);
  CHECK(result.total.high > 20.0);
  // A catalog term: the range's ends, whatever the tolerance (sd from the range, the first case).
  bine::IbuTerm catalog{33.0, 11.0, {std::make_pair(10.0, 12.0), std::nullopt}, false};
  const auto ranged = bine::ibu_intervals({bine::addition_uncertainty(catalog, 25.0)}, {});
  CHECK(ranged.total.low == doctest::Approx(30.0).epsilon(1e-9));
  CHECK(ranged.total.high == doctest::Approx(36.0).epsilon(1e-9));
}

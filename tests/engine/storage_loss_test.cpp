// Alpha-acid storage loss against Garetz (1994) and the check values of docs/methods.md.
#include "engine/storage_loss.hpp"

#include <doctest/doctest.h>

#include <cmath>

namespace {

bine::StorageHistory history(double alpha, double stability, double celsius, bine::Package package, double days) {
  return bine::StorageHistory{alpha, stability, bine::Storage{celsius, package}, days};
}

}  // namespace

TEST_CASE("k = ln(100 / (100 - PL)) / 180: 0.003851 per day for PL 50 (Garetz 1994, docs/methods.md)") {
  CHECK(bine::loss_rate_per_day(50) == doctest::Approx(0.003851).epsilon(2e-4));
  CHECK(bine::loss_rate_per_day(0) == 0.0);
}

TEST_CASE("temperature and package factors (Garetz 1994, SF values from memory)") {
  // TF = 2^((T - 20) / 15): 1 at 20 C, 1/2 at 5 C, 1/4 at -10 C.
  CHECK(bine::temperature_factor(20) == doctest::Approx(1.0));
  CHECK(bine::temperature_factor(5) == doctest::Approx(0.5));
  CHECK(bine::temperature_factor(-10) == doctest::Approx(0.25));
  CHECK(bine::package_factor(bine::Package::open) == 1.0);
  CHECK(bine::package_factor(bine::Package::sealed) == 0.75);
  CHECK(bine::package_factor(bine::Package::vacuum) == 0.5);
}

TEST_CASE("6.0 % AA, PL 50, vacuum, -18 C, 365 days leaves 5.31 % (88.6 %) (docs/methods.md)") {
  const auto aged = bine::age_alpha(history(6.0, 50.0, -18.0, bine::Package::vacuum, 365));
  CHECK(aged.alpha_percent == doctest::Approx(5.31).epsilon(1e-3));
  CHECK(aged.remaining == doctest::Approx(0.886).epsilon(1e-3));
  CHECK_FALSE(aged.warm_extrapolation);
}

TEST_CASE("180 days at 20 C, open, leave exactly the stability fraction") {
  // By construction of k: exp(-ln(100 / S) x 180 / 180) = S / 100.
  for (double stability : {50.0, 65.0, 80.0, 93.5}) {
    const auto aged = bine::age_alpha(history(10.0, stability, 20.0, bine::Package::open, 180));
    CHECK(aged.remaining == doctest::Approx(stability / 100.0).epsilon(1e-12));
    CHECK(aged.alpha_percent == doctest::Approx(stability / 10.0).epsilon(1e-12));
  }
}

TEST_CASE("no time, no loss, warm storage is flagged as extrapolated") {
  CHECK(bine::age_alpha(history(9.0, 50, 4, bine::Package::sealed, 0)).alpha_percent == 9.0);
  CHECK(bine::age_alpha(history(9.0, 50, 30, bine::Package::open, 10)).warm_extrapolation);
}

// Check values are printed to 3 digits, so the tolerance is half a unit of the last digit.
TEST_CASE("HSI 0.31 / 0.40 -> 10.3 / 22.5 % lost (Garetz 1994 after Nickerson & Likens 1979)") {
  CHECK(bine::percent_lost_from_hsi(0.31) == doctest::Approx(10.3).epsilon(5e-3));
  CHECK(bine::percent_lost_from_hsi(0.40) == doctest::Approx(22.5).epsilon(3e-3));
  CHECK(bine::percent_lost_from_hsi(0.25) == 0.0);
  CHECK(bine::percent_lost_from_hsi(0.20) == 0.0);
}

TEST_CASE("stability classes (common practice): good 80, fair 65, poor 50") {
  CHECK(bine::stability_of_class("good") == 80.0);
  CHECK(bine::stability_of_class("fair") == 65.0);
  CHECK(bine::stability_of_class("poor") == 50.0);
  CHECK_FALSE(bine::stability_of_class("great").has_value());
}

TEST_CASE("days between dates") {
  // Hand count: 2025-12-01 -> 2026-12-01 spans no 29 February: 365 days; 2024 was a leap year.
  CHECK(bine::days_between(*bine::parse_date("2025-12-01"), *bine::parse_date("2026-12-01")) == 365);
  CHECK(bine::days_between(*bine::parse_date("2024-01-01"), *bine::parse_date("2025-01-01")) == 366);
  CHECK(bine::days_between(*bine::parse_date("2026-01-02"), *bine::parse_date("2026-01-01")) == -1);
}

// Brewhouse calibration against SciPy (tests/engine/calibration_reference.py: scipy.optimize.lsq_linear,
// scipy.stats.t, scipy.stats.f, scipy.stats.median_abs_deviation, Debian python3-scipy) to 1e-9, and
// the check values of docs/methods.md#calibration (derived there, the inputs illustrative).
#include "engine/calibration.hpp"

#include <doctest/doctest.h>

#include <array>
#include <nlohmann/json.hpp>
#include <random>
#include <string>
#include <vector>

#include "cli/run_binary.hpp"
#include "engine/statistics.hpp"
#include "model/errors.hpp"

namespace {

using bine::CalibrationBatch;
using nlohmann::json;

std::vector<CalibrationBatch> batches(const std::vector<double>& boil, const std::vector<double>& late,
                                      const std::vector<double>& lab) {
  std::vector<CalibrationBatch> out;
  for (std::size_t i = 0; i < lab.size(); ++i)
    out.push_back(CalibrationBatch{"batch " + std::to_string(i + 1), lab[i], boil[i], late[i]});
  return out;
}

json problem_json(const std::vector<CalibrationBatch>& set, bool split) {
  json boil = json::array(), late = json::array(), lab = json::array();
  for (const auto& b : set) {
    boil.push_back(b.boil_ibu);
    late.push_back(b.late_ibu);
    lab.push_back(b.lab_ibu);
  }
  return {{"boil", boil}, {"late", late}, {"lab", lab}, {"split", split}};
}

json scipy(const json& request) {
  const auto run = bine::test::run_program(
      BINE_PYTHON, {std::string(BINE_TEST_DIR) + "/engine/calibration_reference.py", request.dump()});
  INFO(run.err);
  REQUIRE(run.exited);
  REQUIRE(run.status == 0);
  return json::parse(run.out);
}

/// Seeded sets of 6-14 beers: model IBU 15-60, late share 0-60 %, lab = 0.9 boil + 0.7 late + noise.
std::vector<std::vector<CalibrationBatch>> random_sets() {
  std::mt19937_64 random(20260315);
  std::uniform_real_distribution<double> ibu(15.0, 60.0), share(0.0, 0.6), noise(-2.0, 2.0);
  std::vector<std::vector<CalibrationBatch>> sets;
  for (int s = 0; s < 20; ++s) {
    std::vector<double> boil, late, lab;
    const int n = 6 + s % 9;
    for (int i = 0; i < n; ++i) {
      const double total = ibu(random);
      const double l = total * share(random);
      boil.push_back(total - l);
      late.push_back(l);
      lab.push_back(0.9 * (total - l) + 0.7 * l + noise(random));
    }
    sets.push_back(batches(boil, late, lab));
  }
  return sets;
}

}  // namespace

TEST_CASE("one factor through the origin matches docs/methods.md (illustrative inputs, derived values)") {
  // m = 20, 30, 40, 50, 35; y = 18, 27, 37, 44, 31: f 0.8958, s^2 0.5340, SE 0.00898, 0.8709-0.9208.
  const auto fit = bine::fit_one_factor(batches({20, 30, 40, 50, 35}, {0, 0, 0, 0, 0}, {18, 27, 37, 44, 31}));
  CHECK(fit.factor.value == doctest::Approx(0.8958).epsilon(1e-4));
  CHECK(fit.residual_variance == doctest::Approx(0.5340).epsilon(1e-3));
  CHECK(fit.factor.standard_error == doctest::Approx(0.00898).epsilon(1e-3));
  CHECK(fit.factor.low == doctest::Approx(0.8709).epsilon(1e-4));
  CHECK(fit.factor.high == doctest::Approx(0.9208).epsilon(1e-4));
  CHECK(fit.degrees_of_freedom == 4);
  CHECK(fit.t_975 == doctest::Approx(2.776).epsilon(1e-3));  // Student's t table, 4 d.f.
}

TEST_CASE("two factors match docs/methods.md (illustrative inputs, derived values)") {
  const auto fit =
      bine::fit_two_factors(batches({25, 30, 35, 20, 40, 28}, {5, 10, 2, 15, 8, 12}, {27, 34, 33, 30, 42, 35}));
  CHECK(fit.boil.value == doctest::Approx(0.8947).epsilon(1e-4));
  CHECK(fit.boil.low == doctest::Approx(0.8575).epsilon(1e-4));
  CHECK(fit.boil.high == doctest::Approx(0.9319).epsilon(1e-4));
  CHECK(fit.late.value == doctest::Approx(0.7985).epsilon(1e-4));
  CHECK(fit.late.low == doctest::Approx(0.6819).epsilon(1e-4));
  CHECK(fit.late.high == doctest::Approx(0.9152).epsilon(1e-4));
  CHECK(fit.residual_variance == doctest::Approx(0.3204).epsilon(1e-3));
}

TEST_CASE("factors, intervals, residuals, robust deviation and split test match SciPy to 1e-9") {
  const auto sets = random_sets();
  json request{{"fits", json::array()}};
  for (const auto& set : sets) request["fits"].push_back(problem_json(set, true));
  const json reference = scipy(request);
  for (std::size_t s = 0; s < sets.size(); ++s) {
    INFO("set " << s);
    const json& r = reference["fits"][s];
    const auto one = bine::fit_one_factor(sets[s]);
    CHECK(one.factor.value == doctest::Approx(r["factor"].get<double>()).epsilon(1e-9));
    CHECK(one.factor.standard_error == doctest::Approx(r["se"].get<double>()).epsilon(1e-9));
    CHECK(one.factor.low == doctest::Approx(r["low"].get<double>()).epsilon(1e-9));
    CHECK(one.factor.high == doctest::Approx(r["high"].get<double>()).epsilon(1e-9));
    CHECK(one.t_975 == doctest::Approx(r["t"].get<double>()).epsilon(1e-9));
    CHECK(one.residual_variance == doctest::Approx(r["s2"].get<double>()).epsilon(1e-9));
    CHECK(one.robust_sd == doctest::Approx(r["robust_sd"].get<double>()).epsilon(1e-9));
    for (std::size_t i = 0; i < one.residuals.size(); ++i)
      CHECK(one.residuals[i] == doctest::Approx(r["residuals"][i].get<double>()).epsilon(1e-9));
    const auto two = bine::fit_two_factors(sets[s]);
    const json& split = r["split"];
    CHECK(two.boil.value == doctest::Approx(split["boil"].get<double>()).epsilon(1e-9));
    CHECK(two.late.value == doctest::Approx(split["late"].get<double>()).epsilon(1e-9));
    CHECK(two.boil.low == doctest::Approx(split["boil_low"].get<double>()).epsilon(1e-9));
    CHECK(two.boil.high == doctest::Approx(split["boil_high"].get<double>()).epsilon(1e-9));
    CHECK(two.late.low == doctest::Approx(split["late_low"].get<double>()).epsilon(1e-9));
    CHECK(two.late.high == doctest::Approx(split["late_high"].get<double>()).epsilon(1e-9));
    CHECK(two.f_statistic == doctest::Approx(split["f"].get<double>()).epsilon(1e-8));
    CHECK(two.p_value == doctest::Approx(split["p"].get<double>()).epsilon(1e-8));
  }
}

TEST_CASE("Student's t quantiles, F tails and normal quantiles match scipy.stats") {
  json request{{"t", json::array()}, {"t_cdf", json::array()}, {"f", json::array()}, {"normal", json::array()}};
  std::vector<std::pair<double, double>> t_args;
  for (double dof : {1.0, 2.0, 3.0, 4.0, 5.0, 8.0, 9.0, 12.0, 20.0, 30.0, 60.0, 200.0, 2.5})
    for (double p : {0.95, 0.975, 0.995, 0.6}) t_args.emplace_back(p, dof);
  for (const auto& [p, dof] : t_args) {
    request["t"].push_back({p, dof});
    request["t_cdf"].push_back({bine::student_t_quantile(p, dof), dof});
  }
  const std::vector<std::array<double, 3>> f_args{{3.22, 1, 4}, {0.5, 1, 10}, {12.0, 1, 7}, {0.01, 2, 3}, {40, 1, 20}};
  for (const auto& a : f_args) request["f"].push_back({a[0], a[1], a[2]});
  for (double p : {0.95, 0.975, 0.6, 0.999}) request["normal"].push_back(p);
  const json reference = scipy(request);
  // Our quantile is where SciPy's t.cdf reaches p, to 1e-13; SciPy's own t.ppf (cdflib's inverse in
  // SciPy 1.10) is within about 1e-10 in p of that, so the quantiles agree to 1e-8 relative.
  for (std::size_t i = 0; i < t_args.size(); ++i) {
    CHECK(reference["t_cdf"][i].get<double>() == doctest::Approx(t_args[i].first).epsilon(1e-13));
    CHECK(bine::student_t_quantile(t_args[i].first, t_args[i].second) ==
          doctest::Approx(reference["t"][i].get<double>()).epsilon(1e-8));
  }
  for (std::size_t i = 0; i < f_args.size(); ++i)
    CHECK(bine::f_distribution_sf(f_args[i][0], f_args[i][1], f_args[i][2]) ==
          doctest::Approx(reference["f"][i].get<double>()).epsilon(1e-9));
  const std::vector<double> normal_p{0.95, 0.975, 0.6, 0.999};
  for (std::size_t i = 0; i < normal_p.size(); ++i)
    CHECK(bine::normal_quantile(normal_p[i]) == doctest::Approx(reference["normal"][i].get<double>()).epsilon(1e-9));
  // Table values (Student's t, from any statistics table): t(0.975, 1) = 12.706, t(0.975, 9) = 2.262.
  CHECK(bine::student_t_quantile(0.975, 1) == doctest::Approx(12.706).epsilon(1e-4));
  CHECK(bine::student_t_quantile(0.975, 9) == doctest::Approx(2.262).epsilon(1e-3));
}

TEST_CASE("a batch far off is flagged by its robust deviation, and fitted without on request") {
  // Nine beers on f = 0.9 with small scatter and one at 30 % above (a lab mix-up); hand arithmetic:
  // the other residuals are within +-1 IBU, the tenth about +11 IBU.
  std::vector<double> model{30, 35, 40, 45, 50, 32, 38, 42, 48, 36};
  std::vector<double> lab;
  const std::vector<double> scatter{0.5, -0.4, 0.3, -0.6, 0.2, 0.4, -0.3, 0.6, -0.5, 0.0};
  for (std::size_t i = 0; i < model.size(); ++i) lab.push_back(0.9 * model[i] + scatter[i]);
  lab[9] = 1.2 * model[9];
  const auto set = batches(model, std::vector<double>(model.size(), 0.0), lab);
  const auto kept = bine::calibrate(set, false, false);
  REQUIRE(kept.all.outliers.size() == 1);
  CHECK(kept.all.outliers[0] == 9);
  CHECK_FALSE(kept.without_outliers.has_value());
  CHECK(kept.used.size() == 10);
  const auto dropped = bine::calibrate(set, true, false);
  REQUIRE(dropped.without_outliers.has_value());
  CHECK(dropped.used.size() == 9);
  // Without the tenth the factor is back near 0.9 (the scatter is small): within 0.01.
  CHECK(dropped.final_fit().factor.value == doctest::Approx(0.9).epsilon(0.01));
  CHECK(kept.all.factor.value > dropped.final_fit().factor.value);
}

TEST_CASE("split needs 6 batches with late hops, and boil-only batches cannot be split") {
  const auto few = batches({20, 30, 40, 50, 35, 25}, {5, 0, 4, 0, 6, 3}, {22, 27, 40, 45, 37, 25});
  CHECK_THROWS_AS(bine::calibrate(few, false, true), bine::Infeasible);
  const auto boil_only = batches({20, 30, 40}, {0, 0, 0}, {18, 27, 36});
  CHECK_THROWS_AS(bine::fit_two_factors(boil_only), bine::InputError);
  CHECK_THROWS_AS(bine::fit_one_factor(batches({20}, {0}, {18})), bine::InputError);
}

// End-to-end (in-process): bine calibrate on a 10-batch fixture log (two fixture recipes, lab IBU
// invented for the test), the profile it writes, and ibu reading the profile back. Expected values
// are derived by hand from the published formulas: the model IBU of h3-single-boil.json is
// 140 mg/L x Tinseth U(1.050, 60) = 32.29297 IBU and of h3-whirlpool.json 500 mg/L x U(1.050,
// 20 x k1(80 C)/k1(100 C)) = 15.71580 IBU (Tinseth; Malowicki & Shellhammer 2005); the factor is
// sum(m y) / sum(m^2) with its t interval (Draper & Smith 1998), evaluated with NumPy and
// scipy.stats.t / scipy.stats.median_abs_deviation.
#include <doctest/doctest.h>

#include <filesystem>
#include <nlohmann/json.hpp>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;

TEST_CASE("calibrate: factor, 95 % interval and the flagged batch of a 10-batch log (CSV and JSON agree)") {
  const bine::test::TempDir dir;
  const std::string profile = (dir.path() / "brewhouse.json").string();
  const auto csv =
      run_cli({"calibrate", fixture("bh-batches.csv"), "--out", profile, "--date", "2026-06-01", "--json"});
  INFO(csv.err);
  REQUIRE(csv.status == 0);
  const auto result = nlohmann::json::parse(csv.out);
  // f = 0.934618, SE 0.038086, 95 % 0.848460-1.020775 (t(0.975, 9) = 2.262157).
  CHECK(result["all"]["factor"]["value"].get<double>() == doctest::Approx(0.9346177971).epsilon(1e-8));
  CHECK(result["all"]["factor"]["low_95"].get<double>() == doctest::Approx(0.8484604231).epsilon(1e-8));
  CHECK(result["all"]["factor"]["high_95"].get<double>() == doctest::Approx(1.0207751712).epsilon(1e-8));
  CHECK(result["batches"][0]["model_ibu"].get<double>() == doctest::Approx(32.29297).epsilon(1e-6));
  CHECK(result["batches"][1]["late_ibu"].get<double>() == doctest::Approx(15.71580).epsilon(1e-6));
  // Batch 9 (lab 38.0 against 30.2 fitted) is 10.2 robust deviations off; the others within 1.5.
  REQUIRE(result["all"]["outliers"].size() == 1);
  CHECK(result["all"]["outliers"][0] == 9);
  const auto json_log =
      run_cli({"calibrate", fixture("bh-batches.json"), "--no-write", "--date", "2026-06-01", "--json"});
  REQUIRE(json_log.status == 0);
  CHECK(nlohmann::json::parse(json_log.out)["all"] == result["all"]);

  // The profile: one factor, the model, the date, all 10 batches used.
  const auto written = nlohmann::json::parse(bine::test::slurp(profile));
  CHECK(written["model"] == "tinseth");
  CHECK(written["date"] == "2026-06-01");
  CHECK(written["batches_used"].size() == 10);
  CHECK(written["factor"]["value"].get<double>() == doctest::Approx(0.9346177971).epsilon(1e-8));

  // ibu with the profile: 32.29297 x 0.934618 = 30.1816 IBU, and the output names the profile.
  const auto ibu = run_cli({"ibu", fixture("h3-single-boil.json"), "--brewhouse", profile, "--json"});
  INFO(ibu.err);
  REQUIRE(ibu.status == 0);
  const auto ibu_json = nlohmann::json::parse(ibu.out);
  CHECK(ibu_json["total_ibu"].get<double>() == doctest::Approx(30.1816).epsilon(5e-5));  // JSON: 3 decimals
  CHECK(ibu_json["brewhouse"]["file"] == profile);
  const auto text = run_cli({"ibu", fixture("h3-single-boil.json"), "--brewhouse", profile});
  CHECK(text.out.find("brewhouse profile " + profile) != std::string::npos);
  CHECK(text.out.find("factor 0.935 (95 % 0.848-1.021)") != std::string::npos);
}

TEST_CASE("calibrate --without-outliers refits without batch 9") {
  // Without batch 9: f = 0.887917, 95 % 0.850683-0.925150 (t(0.975, 8) = 2.306).
  const bine::test::TempDir dir;
  const std::string profile = (dir.path() / "brewhouse.json").string();
  const auto run = run_cli({"calibrate", fixture("bh-batches.csv"), "--without-outliers", "--out", profile, "--date",
                            "2026-06-01", "--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const auto result = nlohmann::json::parse(run.out);
  CHECK(result["without_outliers"]["factor"]["value"].get<double>() == doctest::Approx(0.8879165420).epsilon(1e-8));
  CHECK(result["without_outliers"]["factor"]["low_95"].get<double>() == doctest::Approx(0.8506832353).epsilon(1e-8));
  CHECK(result["without_outliers"]["factor"]["high_95"].get<double>() == doctest::Approx(0.9251498487).epsilon(1e-8));
  const auto written = nlohmann::json::parse(bine::test::slurp(profile));
  CHECK(written["batches_used"].size() == 9);
  CHECK(written["batches_left_out"].size() == 1);
  CHECK(written["factor"]["value"].get<double>() == doctest::Approx(0.8879165420).epsilon(1e-8));
}

TEST_CASE("calibrate: bad log lines, a split without enough late batches, and a profile that clashes") {
  const auto bad = run_cli({"calibrate", fixture("bh-batches-bad.csv"), "--no-write"});
  CHECK(bad.status == 2);
  CHECK(bad.err.find("bh-batches-bad.csv: row 2: brewed: \"2026-02-30\" is not a date") != std::string::npos);
  CHECK(bad.err.find("bh-batches-bad.csv: row 3: lab_ibu: \"lots\" is not a number") != std::string::npos);
  // Five of the ten batches have late hops: --split needs six (exit 3, cannot be met).
  const auto split = run_cli({"calibrate", fixture("bh-batches.csv"), "--split", "--no-write"});
  CHECK(split.status == 3);
  CHECK(split.err.find("5 of the batches used have late hops") != std::string::npos);
  const bine::test::TempDir dir;
  const std::string profile = (dir.path() / "brewhouse.json").string();
  REQUIRE(run_cli({"calibrate", fixture("bh-batches.csv"), "--out", profile}).status == 0);
  const auto clash = run_cli({"ibu", fixture("h3-single-boil.json"), "--brewhouse", profile, "--model", "rager"});
  CHECK(clash.status == 2);
  CHECK(clash.err.find("--model: rager differs from the tinseth model") != std::string::npos);
  const auto both = run_cli({"ibu", fixture("h3-single-boil.json"), "--brewhouse", profile, "--calibration", "0.9"});
  CHECK(both.status == 2);
}

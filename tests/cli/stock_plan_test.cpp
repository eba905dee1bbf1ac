// bine stock plan, in-process on the test fixtures plan-stock.json, plan-dry-hop-a.json,
// plan-dry-hop-b.json and plan-schedule.json/.csv (invented lots and recipes, test fixtures only),
// with the test catalog stock-ledger-catalog.json (no stabilities: the fair class, 65 % of the alpha
// left after 180 days at 20 C).
//
// Hand arithmetic for the walk (docs/methods.md#stock-plan):
//   The schedule lists B (2026-03-15, 2 batches) before A (2026-02-01, 2 batches); the walk takes A first.
//   Every addition is a dry hop and no lot gives its oil, so each holds its grams as written.
//   FP-1 Fernlight, 100 g at -2 C vacuum: A takes 30 g x 2 = 60 g, leaving 40 g; B needs 30 g x 2 =
//   60 g, so it takes the 40 g and is short 60 g - 40 g = 20 g of Fernlight, by 2026-03-15.
//   BP-1 Brackenmoor, 250 g, packaged 2025-11-01 at 20 C open (temperature and package factors 1):
//   Garetz first-order loss A(D) / A0 = exp(-k D), k = ln(100 / 65) / 180 = 0.430783 / 180 =
//   0.00239324 per day. Stale below 75 %: D = ln(1 / 0.75) / k = 0.287682 / 0.00239324 = 120.2, so
//   day 121 = 2026-03-02 (Nov 30 + Dec 31 + Jan 31 + Feb 28 = 120 days to 2026-03-01). On A's day
//   (92 days) exp(-0.220178) = 80.2 % (fresh, and A asks for none); on B's day (134 days)
//   exp(-0.320694) = 72.6 %: stale, left out, still holding its 250 g, so B's 20 g x 2 = 40 g of
//   Brackenmoor is short (no usable lot: the addition as written).
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;
using bine::test::slurp;
using nlohmann::json;

namespace {

bine::test::CliRun plan(const std::string& schedule, std::vector<std::string> extra = {}) {
  std::vector<std::string> args{"--catalog", fixture("stock-ledger-catalog.json"), "stock",
                                "--stock",   fixture("plan-stock.json"),           "plan",
                                schedule};
  args.insert(args.end(), extra.begin(), extra.end());
  return run_cli(args);
}

}  // namespace

TEST_CASE("stock plan walks the brews in date order and finds the second short by the hand-computed grams") {
  const std::string before = slurp(fixture("plan-stock.json"));
  const auto run = plan(fixture("plan-schedule.json"), {"--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json out = json::parse(run.out);
  REQUIRE(out["brews"].size() == 2);
  CHECK(out["brews"][0]["on"] == "2026-02-01");  // date order, not file order
  CHECK(out["brews"][0]["takes"][0]["lot"] == "FP-1");
  CHECK(out["brews"][0]["takes"][0]["grams"].get<double>() == 60.0);  // hand arithmetic: 30 g x 2
  CHECK(out["brews"][1]["takes"][0]["grams"].get<double>() == 40.0);  // hand arithmetic: 100 g - 60 g
  REQUIRE(out["short"].size() == 2);
  CHECK(out["short"][0]["variety"] == "Fernlight");
  CHECK(out["short"][0]["grams"].get<double>() == 20.0);  // hand arithmetic: 60 g - 40 g
  CHECK(out["short"][0]["by"] == "2026-03-15");
  CHECK(out["short"][1]["variety"] == "Brackenmoor");
  CHECK(out["short"][1]["grams"].get<double>() == 40.0);  // hand arithmetic: 20 g x 2, no usable lot
  // It never writes the stock.
  CHECK(slurp(fixture("plan-stock.json")) == before);
  CHECK_FALSE(std::filesystem::exists(fixture("plan-stock.json") + ".journal"));
}

TEST_CASE("stock plan names a lot that turns stale between the two brew dates (Garetz first-order loss)") {
  const auto run = plan(fixture("plan-schedule.json"), {"--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json out = json::parse(run.out);
  REQUIRE(out["stale"].size() == 1);
  const json& lot = out["stale"][0];
  CHECK(lot["lot"] == "BP-1");
  CHECK(lot["stale_from"] == "2026-03-02");         // hand arithmetic: day 121 after 2025-11-01 (header)
  CHECK(lot["stale_on_brew"] == "2026-03-15");      // fresh on 2026-02-01 (80.2 %), stale on 2026-03-15 (72.6 %)
  CHECK(lot["grams_left"].get<double>() == 250.0);  // A takes none of it
  CHECK(lot["wanted_by"] == "Plan fixture B");
  CHECK(lot["taken_stale"] == false);
  // With --stale-below 70 %: 72.6 % is fresh on 2026-03-15, so nothing turns stale and B takes
  // 40 g of BP-1 (hand arithmetic: 20 g x 2 batches).
  const json allowed = json::parse(plan(fixture("plan-schedule.json"), {"--json", "--stale-below", "70"}).out);
  CHECK(allowed["stale"].empty());
  CHECK(allowed["brews"][1]["takes"][1]["lot"] == "BP-1");
  CHECK(allowed["brews"][1]["takes"][1]["grams"].get<double>() == 40.0);
}

TEST_CASE("stock plan reads the CSV schedule as the JSON one, and prints units in text") {
  const json from_json = json::parse(plan(fixture("plan-schedule.json"), {"--json"}).out);
  const auto csv = plan(fixture("plan-schedule.csv"), {"--json"});
  INFO(csv.err);
  REQUIRE(csv.status == 0);
  const json from_csv = json::parse(csv.out);
  CHECK(from_csv["short"] == from_json["short"]);
  CHECK(from_csv["stale"] == from_json["stale"]);
  const auto text = plan(fixture("plan-schedule.json"));
  REQUIRE(text.status == 0);
  CHECK(text.out.find("Fernlight    20.0 g  2026-03-15") != std::string::npos);
  CHECK(text.out.find("BP-1  Brackenmoor  2026-03-02  2026-03-15         250 g") != std::string::npos);
}

TEST_CASE("stock plan: a bad date in the schedule is one line naming file, line, field and value, exit 2") {
  const bine::test::TempDir dir;
  const auto csv = dir.path() / "schedule.csv";
  std::ofstream(csv) << "recipe,on,batches\n" << fixture("plan-dry-hop-a.json") << ",2026-02-30,2\n";
  const auto run = plan(csv.string());
  CHECK(run.status == 2);
  CHECK(run.err == "bine: error: " + csv.string() +
                       ": line 2: on: \"2026-02-30\" is not a date that exists (expected YYYY-MM-DD)\n");
  const auto json_file = dir.path() / "schedule.json";
  std::ofstream(json_file) << R"({"brews": [{"recipe": "a.json", "on": "2026-02-30"}]})";
  const auto from_json = plan(json_file.string());
  CHECK(from_json.status == 2);
  CHECK(from_json.err == "bine: error: " + json_file.string() +
                             ": /brews/0/on: \"2026-02-30\" is not a date that exists (expected YYYY-MM-DD)\n");
}

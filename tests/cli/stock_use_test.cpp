// bine stock use, in-process on a copy of tests/fixtures/stock-ledger.json: the recipe's grams taken
// from the lots rebalance --stock chooses (docs/methods.md#lot-choice), journalled, and nothing
// changed when the stock falls short.
//
// The stock on 2026-03-02 (Garetz storage loss; Fernlight's test catalog, stock-ledger-catalog.json,
// gives no stability, so the fair class, 65 % left after 180 days at 20 C, k = ln(100 / 65) / 180
// per day):
//   FL-1: packaged 2026-01-01, 5 C vacuum, 1 kg: 60 days at TF = 2^(-15/15) = 0.5, SF = 0.5 leave
//         0.65^(60 x 0.25 / 180) = 96.5 %: fresh.
//   FL-2: packaged 2025-08-14, 20 C open, 500 g: 200 days leave 0.65^(200 / 180) = 62.0 %: stale
//         below 75 %, so left out unless --allow-stale.
// The recipe (use-dry-hop.json) is one dry hop of 10 g; the lots give no oil, so it holds its grams.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"
#include "io/stock_ledger.hpp"

using bine::test::fixture;
using bine::test::run_cli;
using bine::test::slurp;
using nlohmann::json;

namespace {

struct ScratchStock {
  bine::test::TempDir dir;
  std::filesystem::path file = dir.path() / "stock.json";
  ScratchStock() { std::filesystem::copy_file(fixture("stock-ledger.json"), file); }
  std::vector<json> journal() const {
    std::vector<json> lines;
    std::ifstream in(file.string() + ".journal");
    for (std::string line; std::getline(in, line);) lines.push_back(json::parse(line));
    return lines;
  }
  /// The amount on hand of lot `index` as the file stores it after a change ("970 g").
  std::string on_hand(std::size_t index) const {
    return json::parse(slurp(file))["lots"][index]["on_hand"].get<std::string>();
  }
};

bine::test::CliRun use(const ScratchStock& stock, std::vector<std::string> extra) {
  std::vector<std::string> args{
      "--catalog", fixture("stock-ledger-catalog.json"), "stock", "--stock",   stock.file.string(),
      "use",       fixture("use-dry-hop.json"),          "--on",  "2026-03-02"};
  args.insert(args.end(), extra.begin(), extra.end());
  return run_cli(args);
}

}  // namespace

TEST_CASE("stock use takes the recipe's grams from the oldest fresh lot, for every batch, and journals it") {
  const ScratchStock stock;
  const auto run = use(stock, {"--batches", "3"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  // FL-2 is older but stale, so FL-1: 10 g x 3 batches = 30 g, 1000 g -> 970 g.
  CHECK(stock.on_hand(0) == "970 g");
  CHECK(stock.on_hand(1) == "500 g");
  const auto lines = stock.journal();
  REQUIRE(lines.size() == 1);
  const json& entry = lines[0];
  CHECK(entry["command"] == "use");
  CHECK(entry["recipe"] == "stock use fixture: 10 g dry hop");
  CHECK(entry["recipe_sha256"] == bine::sha256_hex(slurp(fixture("use-dry-hop.json"))));
  CHECK(entry["batches"] == 3);
  CHECK(entry["on"] == "2026-03-02");
  REQUIRE(entry["changes"].size() == 1);
  CHECK(entry["changes"][0]["lot"] == "FL-1");
  CHECK(entry["changes"][0]["before_g"].get<double>() == 1000.0);
  CHECK(entry["changes"][0]["after_g"].get<double>() == 970.0);
  CHECK(entry["stock_after"] == bine::sha256_hex(slurp(stock.file)));
  CHECK(run.out.find("10.0 g from lot FL-1") != std::string::npos);
  // Undo puts the 30 g back.
  REQUIRE(run_cli({"stock", "--stock", stock.file.string(), "undo"}).status == 0);
  CHECK(stock.on_hand(0) == "1000 g");
}

TEST_CASE("stock use with --allow-stale takes the older lot, as rebalance does") {
  const ScratchStock stock;
  const auto run = use(stock, {"--allow-stale"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  // Oldest packaging first: FL-2 (2025-08-14) before FL-1 (2026-01-01): 500 g -> 490 g.
  CHECK(stock.on_hand(1) == "490 g");
  CHECK(json::parse(slurp(stock.file))["lots"][0]["on_hand"] == "1 kg");  // FL-1 untouched, as written
}

TEST_CASE("stock use short of stock changes nothing and exits 3 naming the lot and the grams missing") {
  const ScratchStock stock;
  const std::string before = slurp(stock.file);
  const auto run = use(stock, {"--batches", "200"});
  // 200 batches of 10 g = 2000 g from FL-1 alone (FL-2 is stale): 1000 g short.
  CHECK(run.status == 3);
  CHECK(run.err.find("lot FL-1 (Fernlight): short 1.00 kg (needs 2.00 kg, has 1.00 kg)") != std::string::npos);
  CHECK(run.err.find("nothing was deducted") != std::string::npos);
  CHECK(slurp(stock.file) == before);
  CHECK_FALSE(std::filesystem::exists(stock.file.string() + ".journal"));
}

TEST_CASE("stock use refuses an addition the stock holds no lot for, and bad --batches, changing nothing") {
  const ScratchStock stock;
  const std::string before = slurp(stock.file);
  // lots-15g.json bitters with Fixture Bitter, of which stock-ledger.json holds no lot.
  const auto missing =
      run_cli({"--catalog", fixture("h3-catalog.json"), "--catalog", fixture("stock-ledger-catalog.json"), "stock",
               "--stock", stock.file.string(), "use", fixture("lots-15g.json"), "--on", "2026-03-02"});
  CHECK(missing.status == 3);
  CHECK(missing.err.find("addition 1 (Fixture Bitter, boil 60 min): no usable lot in") != std::string::npos);
  const auto zero = use(stock, {"--batches", "0"});
  CHECK(zero.status == 2);
  CHECK(zero.err.find("--batches") != std::string::npos);
  CHECK(slurp(stock.file) == before);
}

TEST_CASE("stock use --json gives the lots taken, each lot's grams before and after, and each addition's lot") {
  const ScratchStock stock;
  const auto run = use(stock, {"--batches", "2", "--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json out = json::parse(run.out);
  CHECK(out["command"] == "use");
  CHECK(out["journal_entry"] == 1);
  CHECK(out["batches"] == 2);
  CHECK(out["on"] == "2026-03-02");
  REQUIRE(out["additions"].size() == 1);
  const json& row = out["additions"][0];
  CHECK(row["addition"] == 1);
  CHECK(row["lot"] == "FL-1");  // FL-2 is older but stale (header: 62.0 % left)
  CHECK(row["use"] == "dry-hop");
  // Hand arithmetic: the dry hop holds its 10 g per batch (no lot oil), 2 batches = 20 g.
  CHECK(row["grams_per_batch"].get<double>() == 10.0);
  CHECK(row["grams"].get<double>() == 20.0);
  REQUIRE(out["lots"].size() == 1);
  const json& lot = out["lots"][0];
  CHECK(lot["lot"] == "FL-1");
  CHECK(lot["before_g"].get<double>() == 1000.0);  // the fixture's "1 kg"
  CHECK(lot["after_g"].get<double>() == 980.0);    // hand arithmetic: 1000 g - 20 g
  CHECK(lot["taken_g"].get<double>() == 20.0);
  CHECK(stock.on_hand(0) == "980 g");
  // The JSON speaks for the journal entry it wrote.
  CHECK(stock.journal().back()["id"] == out["journal_entry"]);
}

// End-to-end (in-process, run_in_process.hpp): bine swap on the demo catalog and stock. Expected values come from the
// input files (lot codes on hand) and from hand arithmetic, never from a previous run's output.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <set>
#include <string>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;
using bine::test::run_cli;

const std::string kData = BINE_SOURCE_DATA_DIR;
const std::string kStock = kData + "/examples/stock.json";

}  // namespace

TEST_CASE("swap --json has the documented keys, values in range, and is deterministic") {
  const auto first = run_cli({"swap", "Tidewell", "--pairs", "--json"});
  REQUIRE(first.status == 0);
  const auto second = run_cli({"swap", "Tidewell", "--pairs", "--json"});
  CHECK(first.out == second.out);
  const auto doc = nlohmann::json::parse(first.out);
  CHECK(doc.at("query").at("variety") == "Tidewell");
  CHECK(doc.at("for") == "aroma");
  REQUIRE(doc.at("substitutes").size() == 5);
  double previous = 101.0;
  for (const auto& s : doc.at("substitutes")) {
    CHECK(s.at("variety") != "Tidewell");
    const double similarity = s.at("similarity");
    CHECK(similarity >= 0.0);
    CHECK(similarity <= 100.0);
    CHECK(similarity <= previous);  // best first
    previous = similarity;
    CHECK(s.contains("amount_factor"));
    CHECK(s.at("differences").is_array());
  }
  REQUIRE(doc.contains("pairs"));
  for (const auto& p : doc.at("pairs")) {
    CHECK(p.at("varieties").size() == 2);
    CHECK(double(p.at("shares")[0]) + double(p.at("shares")[1]) == doctest::Approx(1.0).epsilon(1e-3));
    CHECK(double(p.at("similarity")) > double(doc.at("substitutes")[0].at("similarity")));
  }
}

TEST_CASE("swap --stock lists only lots on hand, with alpha today below the certificate") {
  std::map<std::string, double> certificate;  // lot -> certificate alpha, from the stock file
  {
    std::ifstream in(kStock);
    const auto stock = nlohmann::json::parse(in);
    for (const auto& lot : stock.at("lots"))
      if (lot.at("variety") != "Tidewell") certificate[lot.at("lot")] = lot.at("alpha_acid");
  }
  const auto run = run_cli({"swap", "Tidewell", "--stock", kStock, "--on", "2026-12-01", "--top", "100", "--json"});
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  CHECK(doc.at("stock").at("on") == "2026-12-01");
  std::set<std::string> seen;
  for (const auto& s : doc.at("substitutes")) {
    const std::string lot = s.at("lot");
    REQUIRE(certificate.count(lot) == 1);
    seen.insert(lot);
    CHECK(double(s.at("on_hand_g")) > 0.0);
    // Every demo lot was packaged before 2026-12-01, so first-order loss leaves less than it started with.
    CHECK(double(s.at("alpha_today_percent")) < certificate[lot]);
  }
  CHECK(seen.size() == certificate.size());
}

TEST_CASE("a renamed copy given with --catalog is the first substitute, bittering factor by hand") {
  const bine::test::TempDir dir;
  const fs::path mine = dir.path() / "mine.json";
  {
    // Keelstone's catalog entry under another name: same alpha range, so the factor is x / x = 1.
    std::ifstream in(kData + "/catalog/demo.json");
    const auto demo = nlohmann::json::parse(in);
    nlohmann::json copy;
    for (const auto& v : demo.at("varieties"))
      if (v.at("name") == "Keelstone") copy = v;
    copy["name"] = "Keelstone Twin";
    std::ofstream(mine) << nlohmann::json{{"catalog", {{"name", "mine"}}}, {"varieties", {copy}}}.dump();
  }
  const auto run =
      run_cli({"--catalog", "demo", "--catalog", mine.string(), "swap", "keelstone", "--for", "bittering", "--json"});
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  const auto& best = doc.at("substitutes")[0];
  CHECK(best.at("variety") == "Keelstone Twin");
  CHECK(double(best.at("similarity")) >= 99.0);
  CHECK(double(best.at("amount_factor")) == doctest::Approx(1.0));  // same alpha midpoint: x / x = 1
}

TEST_CASE("swap text honours --units us, and --html writes a page with charts") {
  const bine::test::TempDir dir;
  const fs::path html = dir.path() / "swap.html";
  const auto run = run_cli({"--units", "us", "swap", "Tidewell", "--stock", kStock, "--on", "2026-12-01", "--top", "20",
                            "--html", html.string()});
  REQUIRE(run.status == 0);
  // Seawick SW-25-021 is "3 lb" and Warmstrand WS-25-040 "12 oz" on hand in the stock file. WS-25-040
  // (6.8 %, packaged 2025-05-02, -2 C vacuum, stability 52 %) keeps 68.4 % by 2026-12-01 (Garetz 1994,
  // hand: k = ln(100/52)/180 = 0.0036329, TF 2^(-22/15) = 0.36182, SF 0.5, 578 d: exp(-0.37988) = 0.6840;
  // below 75 %): stale, so it is listed last, marked.
  CHECK(run.out.find("3.00 lb") != std::string::npos);
  CHECK(run.out.find("12.00 oz") != std::string::npos);
  CHECK(run.out.find("(stale)") != std::string::npos);
  CHECK(run.out.find("stale: ") != std::string::npos);
  CHECK(run.out.find(" kg") == std::string::npos);
  CHECK(run.out.find("hop creep") != std::string::npos);
  const std::string page = bine::test::slurp(html);
  CHECK(page.find("<svg") != std::string::npos);
  CHECK(page.find("<script") == std::string::npos);
}

TEST_CASE("swap rejects bad input with one clear line each and exit 2") {
  auto run = run_cli({"swap", "Tidewel"});
  CHECK(run.status == 2);
  CHECK(run.err.find("Tidewell") != std::string::npos);  // did you mean
  run = run_cli({"swap", "Tidewell", "--for", "flavour", "--top", "0"});
  CHECK(run.status == 2);
  CHECK(run.err.find("--for: \"flavour\"") != std::string::npos);
  CHECK(run.err.find("--top: 0") != std::string::npos);
  run = run_cli({"swap", "Tidewell", "--stock", kStock, "--on", "2026-02-30"});
  CHECK(run.status == 2);
  CHECK(run.err.find("--on") != std::string::npos);
}

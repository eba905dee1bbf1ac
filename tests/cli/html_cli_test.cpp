// End-to-end (in-process): --html FILE on every command that writes a page, beside the text or
// JSON output of the same run. The figures come from fixture files and hand arithmetic written
// beside them; the browser check (tests/browser) checks every number against the JSON.
#include <doctest/doctest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;
using bine::test::fixture;
using bine::test::run_cli;
using bine::test::slurp;

bool has(const std::string& text, const std::string& needle) { return text.find(needle) != std::string::npos; }

}  // namespace

TEST_CASE("ibu --html: the schedule as weighed, the IBU chart, BU:GU and the hot-wort caution in its box") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "sheet.html";
  const auto run = run_cli({"ibu", fixture("h3-whirlpool.json"), "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  CHECK(has(run.out, "BU:GU"));  // the text output is printed as without --html
  const std::string html = slurp(page);
  // The fixture: 100 g whole hops at 10 % alpha, whirlpool 20 min at 80 C.
  CHECK(has(html, "data-json=\"/additions/0/grams\">100 g</td>"));
  CHECK(has(html, "data-json=\"/additions/0/alpha_acid\">10.0 %</td>"));
  CHECK(has(html, "data-json=\"/additions/0/temperature_c\">80 C</td>"));
  CHECK(has(html, "data-json=\"/additions/0/minutes\">20 min</td>"));
  CHECK(has(html, "<title id=\"ibu-t\">IBU per addition</title>"));
  CHECK(has(html, ">bitterness (IBU)</text>"));
  const auto box = html.find("<section class=\"caution\">");
  REQUIRE(box != std::string::npos);
  CHECK(html.find("scalds", box) != std::string::npos);
  CHECK(html.find("toxic to dogs", box) != std::string::npos);
  CHECK(has(html, "recipe: " + fixture("h3-whirlpool.json")));
  CHECK_FALSE(has(html, "<script"));
}

TEST_CASE("age --html: certificate and brew-day alpha, stability source, no catalog named when none was read") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "lot.html";
  // docs/methods.md check value (as in ibu_cli_test): 6.0 %, stability 50, vacuum, -18 C, 365 days -> 5.31 %.
  const auto run = run_cli({"age", "--alpha", "6.0", "--packaged", "2025-01-01", "--stored", "-18 C,vacuum",
                            "--stability", "50", "--on", "2026-01-01", "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const std::string html = slurp(page);
  CHECK(has(html, "data-json=\"/alpha_acid_packaged\">6.00 %</td>"));
  CHECK(has(html, "data-json=\"/alpha_acid\">5.3"));  // 5.31 % to the check value's 3 digits
  CHECK(has(html, "data-json=\"/days\">365 d</td>"));
  CHECK(has(html, ">--stability</td>"));
  CHECK_FALSE(has(html, "catalogs:"));
}

TEST_CASE("--html into a folder that does not exist: one clear line, exit 2, no file") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "missing" / "sheet.html";
  const auto run = run_cli({"ibu", fixture("h3-whirlpool.json"), "--html", page.string()});
  CHECK(run.status == 2);
  CHECK(has(run.err, "does not exist"));
  CHECK_FALSE(fs::exists(page));
}

TEST_CASE("stock list --html: every lot on the day, the alpha chart, totals, the caution box and the demo marker") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "cold-store.html";
  const auto run = run_cli({"--catalog", "demo", "--catalog", fixture("csv-out-catalog.json"), "stock", "list",
                            fixture("csv-out-stock.json"), "--on", "2026-03-02", "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  CHECK(has(run.out, "Per variety:"));  // the text list is printed as without --html
  const std::string html = slurp(page);
  // Hand arithmetic (as in csv_output_test): 10 % x exp(-(-ln 0.70 / 180) x 0.25 x 60) = 9.707 %,
  // 97.07 % of the certificate left, 521 days until below 75 %; 1 kg on hand.
  CHECK(has(html, "data-json=\"/lots/0/alpha_today\">9.71 %</td>"));
  CHECK(has(html, "data-json=\"/lots/0/remaining\" data-scale=\"100\">97 %</td>"));
  CHECK(has(html, "data-json=\"/lots/0/days_until_stale\">521 days</td>"));
  CHECK(has(html, "data-json=\"/lots/0/on_hand_g\" data-scale=\"0.001\">1.00 kg</td>"));
  CHECK(has(html, "Q-1, &quot;A&quot;"));
  CHECK(has(html, "<title id=\"alpha-t\">"));
  // Totals: 1000 g + 250 g = 1.25 kg over both varieties, as a checked sum.
  CHECK(has(html, "data-sum=\"yes\">1.25 kg</td>"));
  const auto box = html.find("<section class=\"caution\">");
  REQUIRE(box != std::string::npos);
  CHECK(html.find("toxic to dogs", box) != std::string::npos);
  // The catalogs named on the command line include the shipped demo one, marked as invented.
  CHECK(has(html, "invented demo data"));
  CHECK(has(html, "stock: " + fixture("csv-out-stock.json")));
  CHECK_FALSE(has(html, "<script"));
}

TEST_CASE("stock list --html with a data folder of our own: no demo marker") {
  const bine::test::TempDir dir;
  fs::create_directories(dir.path() / "data" / "catalog");
  fs::copy_file(std::string(BINE_SOURCE_DATA_DIR) + "/lexicon.json", dir.path() / "data" / "lexicon.json");
  fs::copy_file(fixture("csv-out-catalog.json"), dir.path() / "data" / "catalog" / "mine.json");
  const fs::path page = dir.path() / "cold-store.html";
  const auto run = run_cli({"--data", (dir.path() / "data").string(), "stock", "list", fixture("csv-out-stock.json"),
                            "--on", "2026-03-02", "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const std::string html = slurp(page);
  CHECK(has(html, "csv output fixtures (invented for tests)"));
  CHECK_FALSE(has(html, "invented demo data"));
}

TEST_CASE("swap --for bittering --stock --html: each chart shows the lot's alpha on the brew day, as the JSON does") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "swap.html";
  const auto run =
      run_cli({"--catalog", fixture("csv-out-catalog.json"), "swap", "Fixture Twin", "--for", "bittering", "--stock",
               fixture("csv-out-stock.json"), "--on", "2026-03-02", "--json", "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  const std::string html = slurp(page);
  // Hand arithmetic (as in the stock list test): lot Q-1 of 10 % packaged 2026-01-01, vacuum at 5 C,
  // stability 70: 10 % x exp(-(-ln 0.70 / 180) x 0.25 x 60) = 9.707 % on 2026-03-02, charted to one
  // decimal; its catalog midpoint (9 + 11) / 2 = 10.0 % is not what the chart shows.
  REQUIRE(doc.at("substitutes").at(0).at("lot") == "Q-1, \"A\"");
  CHECK(doc.at("substitutes").at(0).at("alpha_today_percent").get<double>() == doctest::Approx(9.71));
  const auto start = html.find("<title id=\"bitter1-t\">");
  REQUIRE(start != std::string::npos);
  const std::string chart = html.substr(start, html.find("</figure>", start) - start);
  CHECK(has(chart, "data-json=\"/substitutes/0/alpha_today_percent\">9.7 %</text>"));
  CHECK_FALSE(has(chart, "10.0 %"));
  CHECK(has(html, "alpha of lot <span class=\"nb\">Q-1,</span> &quot;A&quot; on the brew day"));
}

TEST_CASE("swap --for bittering --html without stock: the chart says every value is a catalog midpoint") {
  const bine::test::TempDir dir;
  const fs::path page = dir.path() / "swap.html";
  const auto run = run_cli({"--catalog", fixture("csv-out-catalog.json"), "swap", "Fixture Twin", "--for", "bittering",
                            "--html", page.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const std::string html = slurp(page);
  CHECK(has(html, "Every value: the middle of the catalog range."));
  CHECK_FALSE(has(html, "alpha_today_percent"));
  // Catalog midpoints by hand: Test, "quoted" hop (9 + 11) / 2 = 10.0 %; Fixture Twin (6 + 8) / 2 = 7.0 %.
  CHECK(has(html, ": 10.0 %</title>"));
  CHECK(has(html, ": 7.0 %</title>"));
}

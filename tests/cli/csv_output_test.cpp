// End-to-end (in-process): --csv on catalog list, swap and stock list. Each CSV is read back with
// our own libcsv reader (io/csv_table) and compared with the --json output of the same command: as
// many rows as the JSON lists, every figure equal to the JSON's, names with commas and quotes
// whole. The fixtures (tests/fixtures/csv-out-*.json) are invented; figures checked by hand are
// worked out beside them.
#include <doctest/doctest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"
#include "io/csv_table.hpp"

namespace {

namespace fs = std::filesystem;
using bine::test::fixture;
using bine::test::run_cli;
using nlohmann::json;

const std::string kQuoted = "Test, \"quoted\" hop";  // the fixture variety with a comma and quotes

/// A CSV output read back: the header and the rows, a field looked up by its header.
struct Sheet {
  bine::CsvTable table;
  explicit Sheet(const std::string& text) : table(bine::parse_csv(text, "stdout")) {}
  std::size_t column(const std::string& header) const {
    const auto& h = table.header.fields;
    const auto it = std::find(h.begin(), h.end(), header);
    REQUIRE_MESSAGE(it != h.end(), "no column \"" << header << "\"");
    return static_cast<std::size_t>(it - h.begin());
  }
  const std::string& at(std::size_t row, const std::string& header) const {
    return table.rows.at(row).fields.at(column(header));
  }
  double number(std::size_t row, const std::string& header) const {
    const auto value = bine::parse_spreadsheet_number(at(row, header));
    REQUIRE_MESSAGE(value, header << ": \"" << at(row, header) << "\" is not a number");
    return *value;
  }
};

/// A CSV field against the JSON value of the same figure: both empty/null, or the same number.
void check_same(const Sheet& sheet, std::size_t row, const std::string& header, const json& value) {
  INFO(header << " row " << row);
  if (value.is_null()) {
    CHECK(sheet.at(row, header).empty());
  } else if (value.is_boolean()) {
    CHECK(sheet.at(row, header) == (value.get<bool>() ? "true" : "false"));
  } else if (value.is_string()) {
    CHECK(sheet.at(row, header) == value.get<std::string>());
  } else {
    CHECK(sheet.number(row, header) == value.get<double>());  // the same rounding: equal, not close
  }
}

bool has(const std::string& text, const std::string& needle) { return text.find(needle) != std::string::npos; }

}  // namespace

TEST_CASE("catalog list --csv: a row per variety the JSON lists, ranges as min and max, quoted names whole") {
  const std::vector<std::string> args{"--catalog", "demo", "--catalog", fixture("csv-out-catalog.json"),
                                      "catalog",   "list"};
  auto csv_args = args, json_args = args;
  csv_args.push_back("--csv");
  json_args.push_back("--json");
  const auto csv = run_cli(csv_args);
  const auto doc_run = run_cli(json_args);
  INFO(csv.err);
  REQUIRE(csv.status == 0);
  REQUIRE(doc_run.status == 0);
  const json doc = json::parse(doc_run.out);
  const Sheet sheet(csv.out);
  CHECK(has(csv.out, "\r\n"));  // RFC 4180 line ends
  REQUIRE(sheet.table.rows.size() == doc["varieties"].size());
  // The catalogs used, the shipped demo marked as invented: said on stderr, so the output stays one table.
  CHECK(has(csv.err, "bine: note: Catalogs used: bine demo catalog (shipped demo.json; invented demo data"));
  const std::vector<std::pair<std::string, std::string>> ranges{{"alpha_acid", "alpha acid"},
                                                                {"beta_acid", "beta acid"},
                                                                {"cohumulone", "cohumulone"},
                                                                {"total_oil", "total oil"}};
  const std::vector<std::string> units{"%", "%", "% of alpha", "mL/100 g"};
  for (std::size_t i = 0; i < sheet.table.rows.size(); ++i) {
    const json& v = doc["varieties"][i];  // the same order: catalog order
    CHECK(sheet.at(i, "variety") == v["name"].get<std::string>());
    for (std::size_t r = 0; r < ranges.size(); ++r) {
      const auto& [key, words] = ranges[r];
      check_same(sheet, i, words + " min (" + units[r] + ")", v.contains(key) ? v[key][0] : json());
      check_same(sheet, i, words + " max (" + units[r] + ")", v.contains(key) ? v[key][1] : json());
    }
    check_same(sheet, i, "stability (% of alpha left after 6 months at 20 C)",
               v.contains("stability") ? v["stability"] : json());
    if (v.contains("aroma"))
      for (const auto& [axis, value] : v["aroma"].items()) check_same(sheet, i, "aroma " + axis + " (0-5)", value);
  }
  // The fixture's quoted variety, every field as the catalog file gives it.
  std::size_t q = 0;
  while (q < sheet.table.rows.size() && sheet.at(q, "variety") != kQuoted) ++q;
  REQUIRE(q < sheet.table.rows.size());
  CHECK(sheet.at(q, "origin") == "Nowhere; \"test\" land");
  CHECK(sheet.at(q, "alpha acid min (%)") == "9");
  CHECK(sheet.at(q, "alpha acid max (%)") == "11");
  CHECK(sheet.at(q, "myrcene max (% of oil)") == "50");
  CHECK(sheet.at(q, "humulene min (% of oil)").empty());
  CHECK(sheet.at(q, "aroma citrus (0-5)") == "4");
  CHECK(sheet.at(q, "aroma pine (0-5)") == "0");  // an axis the variety leaves out is 0
  CHECK(sheet.at(q, "tags") == "lemon, rose");
  CHECK(sheet.at(q, "catalog file") == fixture("csv-out-catalog.json"));
}

/// `swap QUERY --pairs` as CSV and as JSON over the shipped and the fixture catalog: the same rows,
/// the same figures. Returns the CSV read back and the JSON.
std::pair<Sheet, json> swap_both_ways(const std::string& query) {
  const std::vector<std::string> args{"--catalog", "demo", "--catalog", fixture("csv-out-catalog.json"), "swap", query,
                                      "--top",     "6",    "--pairs"};
  auto csv_args = args, json_args = args;
  csv_args.push_back("--csv");
  json_args.push_back("--json");
  const auto csv = run_cli(csv_args);
  const auto doc_run = run_cli(json_args);
  INFO(query << ": " << csv.err);
  REQUIRE(csv.status == 0);
  REQUIRE(doc_run.status == 0);
  // The notes the text prints under its tables (the catalogs used, demo marked) go to stderr.
  CHECK(has(csv.err, "bine: note: Catalogs used: bine demo catalog (shipped demo.json; invented demo data"));
  const json doc = json::parse(doc_run.out);
  const Sheet sheet(csv.out);
  const json& subs = doc["substitutes"];
  const json& pairs = doc["pairs"];
  REQUIRE(sheet.table.rows.size() == subs.size() + 2 * pairs.size());
  for (std::size_t i = 0; i < subs.size(); ++i) {
    CHECK(sheet.at(i, "kind") == "substitute");
    CHECK(sheet.at(i, "rank") == std::to_string(i + 1));
    check_same(sheet, i, "variety", subs[i]["variety"]);
    check_same(sheet, i, "similarity (0-100)", subs[i]["similarity"]);
    check_same(sheet, i, "confidence (0-1)", subs[i]["confidence"]);
    check_same(sheet, i, "g per g replaced (g/g)", subs[i]["amount_factor"]);
    check_same(sheet, i, "amount basis", subs[i]["amount_basis"]);
    check_same(sheet, i, "on hand (g)", subs[i]["on_hand_g"]);  // null without --stock
  }
  for (std::size_t p = 0; p < pairs.size(); ++p)
    for (std::size_t k = 0; k < 2; ++k) {
      const std::size_t row = subs.size() + 2 * p + k;
      CHECK(sheet.at(row, "kind") == "blend");
      CHECK(sheet.at(row, "rank") == std::to_string(p + 1));
      check_same(sheet, row, "variety", pairs[p]["varieties"][k]);
      check_same(sheet, row, "share (fraction by weight)", pairs[p]["shares"][k]);
      check_same(sheet, row, "g per g replaced (g/g)", pairs[p]["grams_per_gram"][k]);
      check_same(sheet, row, "similarity (0-100)", pairs[p]["similarity"]);
    }
  return {sheet, doc};
}

TEST_CASE("swap --csv: a row per substitute the JSON lists, two per blend, figures equal to the JSON") {
  const auto [twin, twin_doc] = swap_both_ways("Fixture Twin");
  // The quoted variety has the same aroma as Fixture Twin, so it ranks first. Its amount factor by
  // hand arithmetic: oil midpoints 1.5 / 2.0 mL/100 g (fixture ranges 1.4-1.6 and 1.9-2.1) = 0.75 g/g.
  CHECK(twin.at(0, "variety") == kQuoted);
  CHECK(twin.number(0, "g per g replaced (g/g)") == doctest::Approx(0.75));
  // A query whose best blends beat its best single substitute: the blend rows are checked too.
  const auto [far, far_doc] = swap_both_ways("Fixture Far Off");
  CHECK_FALSE(far_doc["pairs"].empty());
}

TEST_CASE("swap --csv from stock: lot codes with commas and quotes, alpha on the brew day by hand") {
  const auto csv = run_cli({"--catalog", fixture("csv-out-catalog.json"), "swap", "Fixture Twin", "--stock",
                            fixture("csv-out-stock.json"), "--on", "2026-03-02", "--csv"});
  const auto doc_run = run_cli({"--catalog", fixture("csv-out-catalog.json"), "swap", "Fixture Twin", "--stock",
                                fixture("csv-out-stock.json"), "--on", "2026-03-02", "--json"});
  INFO(csv.err);
  REQUIRE(csv.status == 0);
  REQUIRE(doc_run.status == 0);
  const json doc = json::parse(doc_run.out);
  const Sheet sheet(csv.out);
  REQUIRE(sheet.table.rows.size() == doc["substitutes"].size());
  for (std::size_t i = 0; i < sheet.table.rows.size(); ++i) {
    check_same(sheet, i, "lot", doc["substitutes"][i]["lot"]);
    check_same(sheet, i, "on hand (g)", doc["substitutes"][i]["on_hand_g"]);
    check_same(sheet, i, "alpha today (%)", doc["substitutes"][i]["alpha_today_percent"]);
    check_same(sheet, i, "stale", doc["substitutes"][i]["stale"]);
  }
  REQUIRE(sheet.at(0, "lot") == "Q-1, \"A\"");
  CHECK(sheet.at(0, "on hand (g)") == "1000");  // "1 kg" in the fixture
  // Hand arithmetic (first-order loss, Garetz 1994, as docs/methods.md): stability 70 % left after
  // 180 days at 20 C open, k = -ln(0.70) / 180 = 0.0019815 per day; 60 days (2026-01-01 to
  // 2026-03-02) at 5 C vacuum, TF = 2^((5 - 20) / 15) = 0.5, SF = 0.5 (from memory):
  // 10 % x exp(-0.0019815 x 0.25 x 60) = 9.707 %, shown to 2 decimals as the JSON: 9.71.
  CHECK(sheet.number(0, "alpha today (%)") == doctest::Approx(9.71));
}

TEST_CASE("stock list --csv: a row per lot the JSON lists, figures equal to the JSON, units in the headers") {
  const std::vector<std::string> args{"--catalog", fixture("csv-out-catalog.json"), "stock",
                                      "list",      fixture("csv-out-stock.json"),   "--on",
                                      "2026-03-02"};
  auto csv_args = args, json_args = args;
  csv_args.push_back("--csv");
  json_args.push_back("--json");
  const auto csv = run_cli(csv_args);
  const auto doc_run = run_cli(json_args);
  INFO(csv.err);
  REQUIRE(csv.status == 0);
  REQUIRE(doc_run.status == 0);
  const json doc = json::parse(doc_run.out);
  const Sheet sheet(csv.out);
  REQUIRE(sheet.table.rows.size() == doc["lots"].size());
  const std::vector<std::pair<std::string, std::string>> same{
      {"lot", "lot"},
      {"variety", "variety"},
      {"days stored (days)", "days_stored"},
      {"alpha today (%)", "alpha_today"},
      {"aged", "aged"},
      {"alpha left (fraction of certificate)", "remaining"},
      {"stability (% of alpha left after 6 months at 20 C)", "stability_percent"},
      {"stability from", "stability_source"},
      {"HSI", "hsi"},
      {"HSI loss (%)", "hsi_loss_percent"},
      {"stale", "stale"},
      {"stale reason", "stale_reason"},
      {"days until stale (days)", "days_until_stale"},
      {"on hand (g)", "on_hand_g"}};
  for (std::size_t i = 0; i < sheet.table.rows.size(); ++i)
    for (const auto& [header, key] : same) check_same(sheet, i, header, doc["lots"][i][key]);
  // The lot with a comma and quotes in its code and variety, whole.
  CHECK(sheet.at(0, "lot") == "Q-1, \"A\"");
  CHECK(sheet.at(0, "variety") == kQuoted);
  CHECK(sheet.at(0, "certificate alpha (%)") == "10");
  CHECK(sheet.at(0, "stored at (C)") == "5");
  CHECK(sheet.at(0, "package") == "vacuum");
  // Hand arithmetic as in the swap test: remaining exp(-0.0019815 x 0.25 x 60) = 0.970714;
  // below 75 % after ln(4/3) / (0.0019815 x 0.25) = 580.7 -> 581 days from packaging, 521 from 2026-03-02.
  CHECK(sheet.number(0, "alpha left (fraction of certificate)") == doctest::Approx(0.970714).epsilon(1e-5));
  CHECK(sheet.at(0, "days until stale (days)") == "521");
  CHECK(sheet.at(1, "aged") == "false");  // no packaged date or storage
  CHECK(sheet.at(1, "alpha left (fraction of certificate)").empty());
  CHECK_FALSE(has(csv.err, "listed for today"));  // --on given
  CHECK(has(csv.err, "bine: note: Catalogs used: csv output fixtures (invented for tests)"));
}

TEST_CASE("--csv with --json or --html: one line naming both, exit 2, no page written") {
  const bine::test::TempDir dir;
  const std::string page = (dir.path() / "page.html").string();
  const std::vector<std::vector<std::string>> lines{
      {"catalog", "list", "--csv", "--json"},
      {"swap", "Tidewell", "--csv", "--json"},
      {"swap", "Tidewell", "--csv", "--html", page},
      {"stock", "list", fixture("csv-out-stock.json"), "--csv", "--json"},
      {"stock", "list", fixture("csv-out-stock.json"), "--csv", "--html", page}};
  for (const auto& line : lines) {
    const auto run = run_cli(line);
    INFO(line[0] << " " << line[line.size() - 2] << " " << line.back());
    CHECK(run.status == 2);
    CHECK(run.out.empty());
    CHECK(std::count(run.err.begin(), run.err.end(), '\n') == 1);
    CHECK(has(run.err, "bine: error: --csv: not with --"));
    CHECK_FALSE(fs::exists(page));
  }
  const auto recipe = run_cli({"swap", "Tidewell", "--recipe", bine::test::example("pale-ale.json"), "--csv"});
  CHECK(recipe.status == 2);
  CHECK(has(recipe.err, "--csv: not with --recipe"));
}

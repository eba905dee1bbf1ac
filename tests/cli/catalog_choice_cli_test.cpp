// End-to-end (in-process): which catalogs a command reads and how its output names them. Expected
// counts come from the input files themselves (the shipped demo catalog, a catalog written here), never
// from a previous run's output.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;
using bine::test::run_cli;

/// How many varieties the shipped demo catalog lists, read from the file.
std::size_t demo_variety_count() {
  std::ifstream in(std::string(BINE_SOURCE_DATA_DIR) + "/catalog/demo.json");
  return nlohmann::json::parse(in).at("varieties").size();
}

/// A brewer's own catalog (not demo data) with two varieties, written under `dir`.
fs::path own_catalog(const fs::path& dir) {
  const fs::path file = dir / "cellar-catalog.json";
  const nlohmann::json doc = {
      {"catalog", {{"name", "our cellar"}}},
      {"varieties",
       {{{"name", "Own Bitter"}, {"purpose", "bittering"}, {"alpha_acid", {12.0, 14.0}}, {"total_oil", {1.5, 2.5}}},
        {{"name", "Own Aroma"}, {"purpose", "aroma"}, {"alpha_acid", {4.0, 6.0}}, {"total_oil", {1.0, 2.0}}}}}};
  std::ofstream(file) << doc.dump();
  return file;
}

}  // namespace

TEST_CASE("without --catalog the shipped demo is read and every output says it is invented") {
  const auto run = run_cli({"catalog", "list", "--json"});
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  REQUIRE(doc.at("catalogs_used").size() == 1);
  CHECK(doc.at("catalogs_used")[0].at("demo") == true);
  CHECK(doc.at("varieties").size() == demo_variety_count());
  const auto text = run_cli({"swap", "Tidewell", "--top", "2"});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("Catalogs used: ") != std::string::npos);
  CHECK(text.out.find("invented demo data") != std::string::npos);
}

TEST_CASE("a brewer's --catalog replaces the demo, and --catalog demo mixes it back in") {
  const bine::test::TempDir dir;
  const std::string mine = own_catalog(dir.path()).string();
  const auto own = run_cli({"--catalog", mine, "catalog", "list", "--json"});
  REQUIRE(own.status == 0);
  const auto doc = nlohmann::json::parse(own.out);
  CHECK(doc.at("varieties").size() == 2);  // the two written above, no demo variety
  REQUIRE(doc.at("catalogs_used").size() == 1);
  CHECK(doc.at("catalogs_used")[0].at("name") == "our cellar");
  CHECK(doc.at("catalogs_used")[0].at("file") == mine);
  CHECK(doc.at("catalogs_used")[0].at("demo") == false);
  const auto own_text = run_cli({"--catalog", mine, "catalog", "list"});
  REQUIRE(own_text.status == 0);
  CHECK(own_text.out.find("invented demo data") == std::string::npos);
  // A demo variety is unknown now, as it would be in the brewer's own cellar.
  CHECK(run_cli({"--catalog", mine, "swap", "Tidewell"}).status == 2);

  const auto both = run_cli({"--catalog", "demo", "--catalog", mine, "catalog", "list", "--json"});
  REQUIRE(both.status == 0);
  const auto mixed = nlohmann::json::parse(both.out);
  CHECK(mixed.at("varieties").size() == demo_variety_count() + 2);
  REQUIRE(mixed.at("catalogs_used").size() == 2);
  CHECK(mixed.at("catalogs_used")[0].at("demo") == true);
  CHECK(mixed.at("catalogs_used")[1].at("demo") == false);
}

TEST_CASE("a blend target may name a lexicon tag: lemon=4 is read as citrus=4 and the output says so") {
  // descriptor-data/lexicon.json lists "lemon" among the citrus axis's tags.
  const std::string recipe = bine::test::example("pale-ale.json");
  const auto by_tag = run_cli({"blend", "--target", "lemon=4,floral=3", "--recipe", recipe, "--json"});
  const auto by_axis = run_cli({"blend", "--target", "citrus=4,floral=3", "--recipe", recipe, "--json"});
  REQUIRE(by_tag.status == 0);
  REQUIRE(by_axis.status == 0);
  auto tag_doc = nlohmann::json::parse(by_tag.out);
  auto axis_doc = nlohmann::json::parse(by_axis.out);
  CHECK(tag_doc.at("varieties") == axis_doc.at("varieties"));
  CHECK(tag_doc.at("weights") == axis_doc.at("weights"));
  CHECK(tag_doc.at("target") == axis_doc.at("target"));
  const auto text = run_cli({"blend", "--target", "lemon=4,floral=3", "--recipe", recipe});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("lemon=4 read as citrus=4") != std::string::npos);
}

TEST_CASE("an axis given twice in a target, by name or by tag, is refused with one line") {
  for (const std::string spec : {"citrus=4,citrus=2", "citrus=4,lemon=2"}) {
    CAPTURE(spec);
    const auto run = run_cli({"blend", "--target", spec, "--recipe", bine::test::example("pale-ale.json")});
    CHECK(run.status == 2);
    CHECK(run.err.find("both set the citrus axis") != std::string::npos);
    CHECK(run.out.empty());
  }
}

TEST_CASE("a recipe variety no catalog knows: refused with the closest name unless the recipe gives the values") {
  const bine::test::TempDir dir;
  std::ifstream in(bine::test::example("pale-ale.json"));
  nlohmann::json recipe = nlohmann::json::parse(in);
  recipe["hops"][0]["variety"] = "Keelstne";  // the demo catalog has Keelstone
  const fs::path with_alpha = dir.path() / "with-alpha.json";
  std::ofstream(with_alpha) << recipe.dump();
  // The recipe gives this boil addition's alpha acid, all ibu needs: it runs, and says what it noticed.
  const auto runs = run_cli({"ibu", with_alpha.string()});
  REQUIRE(runs.status == 0);
  CHECK(runs.out.find("\"Keelstne\" is not in the loaded catalogs (did you mean Keelstone?)") != std::string::npos);
  // Without the alpha the catalog would have to supply it: exit 2, one line, the file, field and hint.
  recipe["hops"][0].erase("alpha_acid");
  const fs::path without = dir.path() / "without-alpha.json";
  std::ofstream(without) << recipe.dump();
  const auto refused = run_cli({"ibu", without.string()});
  CHECK(refused.status == 2);
  CHECK(refused.out.empty());
  CHECK(refused.err.find(without.string() + ": /hops/0/alpha_acid: is missing") != std::string::npos);
  CHECK(refused.err.find("did you mean Keelstone?") != std::string::npos);
}

TEST_CASE("a stock lot of a variety no catalog knows stops every stock-reading command with the closest name") {
  const bine::test::TempDir dir;
  std::ifstream in(bine::test::example("stock.json"));
  nlohmann::json stock = nlohmann::json::parse(in);
  const std::string real = stock["lots"][0]["variety"];
  const std::string typo = real.substr(0, real.size() - 1);
  stock["lots"][0]["variety"] = typo;
  const fs::path file = dir.path() / "stock.json";
  std::ofstream(file) << stock.dump();
  const std::vector<std::vector<std::string>> commands = {
      {"stock", "list", file.string(), "--on", "2026-12-01"},
      {"swap", "Tidewell", "--stock", file.string(), "--on", "2026-12-01"},
      {"rebalance", bine::test::example("pale-ale.json"), "--stock", file.string(), "--on", "2026-12-01"},
      {"blend", "--target", "citrus=4", "--recipe", bine::test::example("pale-ale.json"), "--stock", file.string(),
       "--on", "2026-12-01"}};
  for (const auto& args : commands) {
    CAPTURE(args[0]);
    const auto run = run_cli(args);
    CHECK(run.status == 2);
    CHECK(run.out.empty());
    CHECK(run.err.find(file.string() + ": /lots/0/variety: \"" + typo + "\"") != std::string::npos);
    CHECK(run.err.find("did you mean " + real) != std::string::npos);
  }
}

TEST_CASE("several catalog files load in the order given, and the first bad one in that order is the error") {
  // The files are loaded on several threads; the merged catalog and the error must not depend on it.
  const bine::test::TempDir dir;
  const std::string mine = own_catalog(dir.path()).string();
  const auto both = run_cli({"--catalog", "demo", "--catalog", mine, "catalog", "list", "--json"});
  REQUIRE(both.status == 0);
  const auto doc = nlohmann::json::parse(both.out);
  REQUIRE(doc.at("catalogs_used").size() == 2);
  CHECK(doc.at("catalogs_used")[1].at("name") == "our cellar");
  CHECK(doc.at("varieties").size() == demo_variety_count() + 2);
  const fs::path bad_first = dir.path() / "bad-first.json";
  const fs::path bad_second = dir.path() / "bad-second.json";
  std::ofstream(bad_first) << "{\"varieties\": 7}";
  std::ofstream(bad_second) << "{\"varieties\": [";
  const auto bad = run_cli(
      {"--catalog", mine, "--catalog", bad_first.string(), "--catalog", bad_second.string(), "catalog", "list"});
  CHECK(bad.status == 2);
  CHECK(bad.err.find(bad_first.string()) != std::string::npos);
  CHECK(bad.err.find(bad_second.string()) == std::string::npos);
}

// The catalog renderers (bine catalog list / show) on hand-built varieties: ranges with their units
// at one decimal, the strongest aroma axes first, the demo-data notice, and the JSON form carrying
// the values as given. Expected text written by hand from the structs.
#include "report/catalog_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

namespace {

using namespace bine;

Lexicon two_axes() { return Lexicon({{"citrus", "", {"lime"}}, {"floral", "", {"rose"}}}, {}); }

Variety full_variety() {
  Variety v;
  v.name = "Zeta Test";
  v.origin = "Testland";
  v.purpose = Purpose::dual;
  v.alpha_acid = Range{9.0, 11.5};
  v.beta_acid = Range{4.0, 4.0};
  v.cohumulone = Range{22.0, 26.0};
  v.total_oil = Range{1.2, 1.86};
  v.oils["myrcene"] = Range{40.0, 50.0};
  v.stability = 72.0;
  v.aroma = std::map<std::string, double>{{"citrus", 3.5}, {"floral", 1.4}};
  v.tags = {"lime", "rose"};
  v.source_file = "mine.json";
  return v;
}

}  // namespace

TEST_CASE("range text: one decimal, a unit, no space before %, a single value when min equals max") {
  CHECK(range_text(Range{9.0, 11.5}, "%") == "9.0-11.5%");
  CHECK(range_text(Range{4.0, 4.0}, "%") == "4.0%");
  CHECK(range_text(Range{1.2, 1.86}, "mL/100 g") == "1.2-1.9 mL/100 g");
  CHECK(range_text(std::nullopt, "%") == "n/a");
}

TEST_CASE("catalog list: sorted by name, strongest aromas first, the demo notice when demo data are in") {
  Catalog catalog;
  catalog.varieties.push_back(full_variety());
  Variety tagged;
  tagged.name = "Alpha Test";
  tagged.tags = {"lime", "rose"};
  catalog.varieties.push_back(tagged);
  Variety bare;
  bare.name = "Mid Test";
  catalog.varieties.push_back(bare);
  catalog.demo = true;
  std::ostringstream out;
  render_catalog_list(out, catalog, two_axes());
  const std::string text = out.str();
  const auto alpha = text.find("Alpha Test");
  const auto mid = text.find("Mid Test");
  const auto zeta = text.find("Zeta Test");
  REQUIRE(zeta != std::string::npos);
  CHECK(alpha < mid);
  CHECK(mid < zeta);
  CHECK(text.find("tags: lime, rose") != std::string::npos);
  CHECK(text.find("no aroma data") != std::string::npos);
  CHECK(text.find("9.0-11.5%  1.2-1.9 mL/100 g  citrus 3.5, floral 1.4") != std::string::npos);
  CHECK(text.find("3 varieties (includes the invented demo catalog") != std::string::npos);

  catalog.demo = false;
  std::ostringstream own;
  render_catalog_list(own, catalog, two_axes());
  CHECK(own.str().find("3 varieties\n") != std::string::npos);
  CHECK(own.str().find("invented") == std::string::npos);
}

TEST_CASE("catalog show: every field with its unit, n/a for what is missing, aroma bars of 4 marks per point") {
  std::ostringstream out;
  render_variety(out, full_variety(), two_axes());
  const std::string text = out.str();
  CHECK(text.find("Zeta Test\n") == 0);
  CHECK(text.find("  alpha acid            9.0-11.5%\n") != std::string::npos);  // label padded to 22
  CHECK(text.find("  cohumulone            22.0-26.0 % of alpha\n") != std::string::npos);
  CHECK(text.find("  myrcene               40.0-50.0 % of oil\n") != std::string::npos);
  CHECK(text.find("  humulene              n/a\n") != std::string::npos);
  CHECK(text.find("  storage stability     72% of alpha left after 6 months at 20 C\n") != std::string::npos);
  // 3.5 x 4 = 14 marks; 1.4 x 4 = 5.6, rounded to 6 marks.
  CHECK(text.find("    citrus         3.5  ##############\n") != std::string::npos);
  CHECK(text.find("    floral         1.4  ######\n") != std::string::npos);
  CHECK(text.find("  from                  mine.json\n") != std::string::npos);
}

TEST_CASE("variety JSON carries the ranges as given and leaves out what is missing") {
  const auto json = variety_to_json(full_variety());
  CHECK(json["alpha_acid"] == nlohmann::json::array({9.0, 11.5}));
  CHECK(json["total_oil"] == nlohmann::json::array({1.2, 1.86}));
  CHECK(json["oils"]["myrcene"] == nlohmann::json::array({40.0, 50.0}));
  CHECK(json["stability"].get<double>() == 72.0);
  CHECK(json["aroma"]["floral"].get<double>() == 1.4);
  Variety bare;
  bare.name = "Bare";
  const auto minimal = variety_to_json(bare);
  CHECK_FALSE(minimal.contains("alpha_acid"));
  CHECK_FALSE(minimal.contains("purpose"));
  CHECK(minimal["name"] == "Bare");
}

// The bitterness renderer (bine ibu) on hand-built results: the numbers shown are the struct's
// numbers at the documented rounding (text: 1 decimal for grams, alpha, utilization and IBU; JSON:
// grams 3, utilization 5, IBU 3, BU:GU 4 decimals), every number carries its unit, and the hot-wort
// and dry-hop cautions appear exactly when the recipe has a whirlpool, a hop stand or a dry hop.
// Unit conversions use the exact definitions 1 oz = 28.349523125 g, 1 US gal = 3.785411784 L and
// F = 1.8 C + 32 (hand arithmetic).
#include "report/bitterness_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

namespace {

using namespace bine;

/// Counts the non-overlapping occurrences of `needle` in `text`.
std::size_t count(const std::string& text, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t at = text.find(needle); at != std::string::npos; at = text.find(needle, at + needle.size())) ++n;
  return n;
}

HopAddition addition(HopUse use, double grams, std::optional<double> minutes, std::optional<double> temperature = {}) {
  HopAddition hop;
  hop.variety = "Test Hop";
  hop.grams = grams;
  hop.use = use;
  hop.minutes = minutes;
  hop.temperature_c = temperature;
  hop.form = HopForm::pellet;
  return hop;
}

Recipe recipe_with(std::vector<HopAddition> hops) {
  Recipe recipe;
  recipe.name = "Hand-built ale";
  recipe.batch_volume_l = 20.0;
  recipe.original_gravity = 1.052;
  recipe.boil_minutes = 60.0;
  recipe.hops = std::move(hops);
  return recipe;
}

AdditionLine line_for(std::size_t index, const HopAddition& hop, double alpha, double utilization, double ibu) {
  AdditionLine line;
  line.index = index;
  line.variety = hop.variety;
  line.use = hop.use;
  line.minutes = hop.minutes;
  line.temperature_c = hop.temperature_c;
  line.grams = hop.grams;
  line.form = HopForm::pellet;
  line.alpha_percent = alpha;
  line.bitterness.effective_minutes = hop.use == HopUse::dry_hop ? 0.0 : hop.minutes.value_or(0.0);
  line.bitterness.utilization = utilization;
  line.bitterness.ibu = ibu;
  return line;
}

/// A boil addition of 28.04 g at 10.04 % alpha, utilization 0.23071, 32.3449 IBU; BU:GU 0.62202.
struct BoilOnly {
  Recipe recipe = recipe_with({addition(HopUse::boil, 28.04, 60.0)});
  RecipeBitterness bitterness;
  BoilOnly() {
    bitterness.additions.push_back(line_for(0, recipe.hops[0], 10.04, 0.230712, 32.3449));
    bitterness.total_ibu = 32.3449;
    bitterness.bu_gu = 0.622017;
    bitterness.bu_gu_reading = "a reading written for this test";
  }
};

}  // namespace

TEST_CASE("ibu text shows the struct's numbers to one decimal, each with its unit") {
  const BoilOnly f;
  std::ostringstream out;
  render_bitterness(out, f.recipe, f.bitterness, UnitSystem::metric);
  const std::string text = out.str();
  CHECK(text.find("Hand-built ale: 20.0 L at OG 1.052, 60 min boil; Tinseth model") == 0);
  CHECK(text.find("28.0 g") != std::string::npos);    // 28.04 g
  CHECK(text.find("10.0 %") != std::string::npos);    // 10.04 % alpha
  CHECK(text.find("23.1 %") != std::string::npos);    // 100 x 0.230712 = 23.07 % utilization
  CHECK(text.find("60.0 min") != std::string::npos);  // boil-equivalent minutes
  CHECK(count(text, "32.3 IBU") == 3);                // the addition, the total row and the last line
  // The last line: total, OG and BU:GU to 2 decimals (0.622017 -> 0.62) with the struct's reading.
  CHECK(text.find("\nTotal 32.3 IBU at OG 1.052: BU:GU 0.62, a reading written for this test (common-practice "
                  "reading).\n") != std::string::npos);
  CHECK(text.rfind("\nTotal ") == text.rfind('\n', text.size() - 2));  // and it is the last line
}

TEST_CASE("ibu text in US units: oz, gal and F, and a target IBU shows the signed difference") {
  Recipe recipe = recipe_with({addition(HopUse::boil, 28.04, 60.0), addition(HopUse::whirlpool, 100.0, 20.0, 80.0)});
  recipe.target_ibu = 40.0;
  RecipeBitterness bitterness;
  bitterness.additions.push_back(line_for(0, recipe.hops[0], 10.0, 0.23, 32.25));
  bitterness.additions.push_back(line_for(1, recipe.hops[1], 10.0, 0.0314, 15.7));
  bitterness.total_ibu = 47.95;
  std::ostringstream out;
  render_bitterness(out, recipe, bitterness, UnitSystem::us);
  const std::string text = out.str();
  CHECK(text.find("5.28 gal") != std::string::npos);                   // 20 / 3.785411784 = 5.283
  CHECK(text.find("0.99 oz") != std::string::npos);                    // 28.04 / 28.349523125 = 0.989
  CHECK(text.find("3.53 oz") != std::string::npos);                    // 100 / 28.349523125 = 3.527
  CHECK(text.find("whirlpool 20 min at 176 F") != std::string::npos);  // 1.8 x 80 + 32
  CHECK(text.find(" g ") == std::string::npos);
  CHECK(text.find(" L ") == std::string::npos);
  // 47.95 - 40 = +7.95, shown to one decimal with its sign.
  CHECK(text.find("Target 40.0 IBU; computed 48.0 IBU (+8.0 IBU).") != std::string::npos);
}

TEST_CASE("ibu cautions: hot wort with a whirlpool or a hop stand, refermentation with a dry hop, dogs always") {
  // Hops, boiled or not, are toxic to dogs (common practice): every recipe with hops says so, last.
  const Recipe boil = recipe_with({addition(HopUse::boil, 20.0, 60.0)});
  REQUIRE(cautions_for(boil).size() == 1);
  CHECK(cautions_for(boil)[0] == dogs_caution());
  CHECK(cautions_for(boil)[0].find("toxic to dogs") != std::string::npos);

  const Recipe whirlpool = recipe_with({addition(HopUse::whirlpool, 40.0, 20.0, 80.0)});
  REQUIRE(cautions_for(whirlpool).size() == 2);
  CHECK(cautions_for(whirlpool)[0].find("scalds") != std::string::npos);

  Recipe stand = boil;  // no whirlpool addition, but the wort is held hot after flame-out
  stand.hop_stand = HopStand{20.0, 85.0};
  REQUIRE(cautions_for(stand).size() == 2);
  CHECK(cautions_for(stand)[0] == hot_wort_caution());

  const Recipe dry = recipe_with({addition(HopUse::dry_hop, 50.0, 5760.0)});
  REQUIRE(cautions_for(dry).size() == 2);
  CHECK(cautions_for(dry)[0].find("hop creep") != std::string::npos);
  CHECK(cautions_for(dry)[0].find("over-pressurise") != std::string::npos);
  CHECK(cautions_for(dry)[1].find("toxic to dogs") != std::string::npos);

  // Both late uses: each caution once, in the text as well.
  const Recipe both =
      recipe_with({addition(HopUse::whirlpool, 40.0, 20.0, 80.0), addition(HopUse::dry_hop, 50.0, 5760.0)});
  RecipeBitterness bitterness;
  bitterness.additions.push_back(line_for(0, both.hops[0], 7.0, 0.03, 4.2));
  bitterness.additions.push_back(line_for(1, both.hops[1], 7.0, 0.0, 0.0));
  std::ostringstream out;
  render_bitterness(out, both, bitterness, UnitSystem::metric);
  CHECK(count(out.str(), std::string(hot_wort_caution())) == 1);
  CHECK(count(out.str(), std::string(dry_hop_caution())) == 1);
  CHECK(out.str().find("dry-hop 4 d") != std::string::npos);  // 5760 min = 4 days
}

TEST_CASE("ibu JSON carries the struct's numbers in canonical units at the documented rounding") {
  const BoilOnly f;
  const auto json = bitterness_to_json(f.recipe, f.bitterness);
  CHECK(json["recipe"] == "Hand-built ale");
  CHECK(json["model"] == "tinseth");
  CHECK(json["batch_volume_l"].get<double>() == 20.0);
  CHECK(json["total_ibu"].get<double>() == 32.345);  // 32.3449 to 3 decimals
  CHECK(json["bu_gu"].get<double>() == 0.622);       // 0.622017 to 4 decimals: 0.6220
  REQUIRE(json["additions"].size() == 1);
  const auto& a = json["additions"][0];
  CHECK(a["index"] == 1);  // 1-based for brewers
  CHECK(a["grams"].get<double>() == 28.04);
  CHECK(a["alpha_acid"].get<double>() == 10.04);
  CHECK(a["utilization"].get<double>() == 0.23071);
  CHECK(a["ibu"].get<double>() == 32.345);
  CHECK(a["temperature_c"].is_null());
  REQUIRE(json["cautions"].size() == 1);  // a boil addition only: dogs
  CHECK(json["cautions"][0] == std::string(dogs_caution()));
}

TEST_CASE("minutes and uses in words") {
  CHECK(format_minutes(60.0) == "60 min");
  CHECK(format_minutes(90.0) == "90 min");
  CHECK(format_minutes(2.5) == "2.5 min");
  CHECK(format_minutes(1440.0) == "1 d");    // 24 x 60
  CHECK(format_minutes(5040.0) == "3.5 d");  // 3.5 x 1440
  CHECK(describe_use(HopUse::first_wort, 60.0, std::nullopt, UnitSystem::metric) == "first-wort");
  CHECK(describe_use(HopUse::whirlpool, 30.0, 79.6, UnitSystem::metric) == "whirlpool 30 min at 80 C");
}

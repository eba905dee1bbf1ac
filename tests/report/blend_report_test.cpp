// The blend renderers on a hand-built request and result: grams, oil, shares, profile, fit and IBU
// shown are the struct's at the documented rounding (text: grams as format_mass, shares and the
// whirlpool share to whole %, profile 1 decimal, weights and fit 2, IBU 1; JSON: grams 2, shares 4,
// fit 4, IBU 2), each with its unit; the hot-wort caution appears only when some hops go into the
// whirlpool, the refermentation caution only when some are dry hops, the dogs caution always; the
// HTML page escapes names and runs no script. Mass: 1 oz = 28.349523125 g (exact definition).
#include "report/blend_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

#include "report/html_reports.hpp"

namespace {

using namespace bine;

Eigen::VectorXd vec3(double a, double b, double c) {
  Eigen::VectorXd v(3);
  v << a, b, c;
  return v;
}

BlendPart part(std::string variety, std::string lot, double whirlpool_g, double dry_hop_g, double share, double ibu) {
  BlendPart p;
  p.variety = std::move(variety);
  p.lot = std::move(lot);
  p.whirlpool_g = whirlpool_g;
  p.dry_hop_g = dry_hop_g;
  p.grams = whirlpool_g + dry_hop_g;
  p.oil_share = share;
  p.whirlpool_ibu = ibu;
  p.alpha_percent = 7.3;
  return p;
}

/// Two lots from stock, a third of the late hops in an 80 C whirlpool, a bittering charge re-solved.
struct Blended {
  Lexicon lexicon{{{"citrus", "", {}}, {"floral", "", {}}, {"pine", "", {}}}, {}};
  BlendRequest request;
  BlendResult result;
  BlendReportContext context;
  Blended() {
    request.target = {vec3(4.0, 4.0, 0.0), vec3(1.0, 1.0, 0.25), {true, true, false}};
    BlendPlan& plan = request.plan;
    plan.ibu.target_ibu = 38.0;
    plan.ibu.target_source = IbuTargetSource::recipe_target;
    plan.ibu.kept_ibu = 5.52;
    plan.ibu.whirlpool_share = 0.33;
    plan.kept = {1};
    plan.whirlpool_temperature_c = 80.0;
    plan.whirlpool_minutes = 20.0;
    BitteringHop bittering;
    bittering.variety = "Bitter Test";
    bittering.lot = "BT-7";
    bittering.alpha_percent = 13.4;
    bittering.minutes = 60.0;
    plan.bittering = bittering;

    result.parts = {part("Tide Test", "TT-1", 14.1149, 28.2298, 0.66014, 1.7341),
                    part("Rose <Test>", "R&1", 12.2851, 25.3702, 0.33986, 1.0759)};
    result.parts[0].left_g = 9957.6553;
    result.parts[1].left_g = 1462.3447;
    result.profile = vec3(3.0449, 2.7151, 0.04);
    result.fit = 0.76493;
    result.objective = 0.5851;
    result.late_grams = 80.0;
    result.whirlpool_grams = 26.4;
    result.oil_ml = 1.1234;
    result.late_ibu = 2.81;
    result.bittering_grams = 17.8449;
    result.bittering_ibu = 29.6701;
    result.bittering_left_g = 2982.1551;
    result.total_ibu = 38.0012;

    context.lexicon = &lexicon;
    context.request = &request;
    context.recipe_name = "Ale <One> & \"Two\"";
    context.stock_mode = true;
    context.notes = {"a note for this test"};
  }
  std::string text(UnitSystem units = UnitSystem::metric) const {
    std::ostringstream out;
    render_blend_text(out, result, context, units);
    return out.str();
  }
};

bool has(const std::string& text, const std::string& needle) { return text.find(needle) != std::string::npos; }

}  // namespace

TEST_CASE("blend text: amounts, shares, profile and IBU are the struct's, each with its unit") {
  const Blended f;
  const std::string text = f.text();
  CHECK(text.find("Late-hop blend for Ale <One> & \"Two\"\n") == 0);
  // 80 g, 1.1234 mL -> 1.1 mL, whirlpool share 0.33 -> 33 %, 80 C for 20 min.
  CHECK(has(text, "  80.0 g of late hops, 1.1 mL of oil; 33 % in the whirlpool (80 C for 20 min), the rest dry hop\n"));
  // Tide Test: 14.1149 + 28.2298 = 42.3447 g; share 0.66014 -> 66 %; 1.7341 -> 1.7 IBU.
  CHECK(has(text, "Tide Test (TT-1)      14.1 g   28.2 g  42.3 g       66 %  1.7 IBU"));
  CHECK(has(text, "fit 0.76 on the 0-5 scale"));
  CHECK(has(text, "  citrus     4.0    3.0    1.00\n"));
  CHECK(has(text, "  floral     4.0    2.7    1.00\n"));
  CHECK_FALSE(has(text, "  pine"));  // target 0 and blend 0.04: below the 0.05 shown
  CHECK(has(text, "Bitterness held at 38.0 IBU"));
  CHECK(has(text, "bittering: Bitter Test (BT-7) at 13.4 % alpha, 60 min  17.8 g  29.7 IBU"));
  CHECK(has(text, "other boil additions (kept)"));
  CHECK(has(text, "5.5 IBU"));  // kept 5.52
  CHECK(has(text, "whirlpool (blend)"));
  CHECK(has(text, "26.4 g   2.8 IBU"));
  CHECK(has(text, "38.0 IBU"));  // total 38.0012
  // Stock left: 9957.6553 g -> 9.96 kg; the bittering lot, not a blend part, listed after them.
  CHECK(has(text, "  Tide Test (TT-1)    9.96 kg\n"));
  CHECK(has(text, "  Bitter Test (BT-7)  2.98 kg\n"));
  CHECK(has(text, "  - a note for this test\n"));
}

TEST_CASE("blend text in US units: oz and lb, F") {
  const Blended f;
  const std::string text = f.text(UnitSystem::us);
  CHECK(has(text, "2.82 oz of late hops"));  // 80 / 28.349523125 = 2.822
  CHECK(has(text, "(176 F for 20 min)"));
  CHECK(has(text, "0.50 oz"));   // 14.1149 / 28.349523125 = 0.498
  CHECK(has(text, "21.95 lb"));  // 9957.6553 / 453.59237 = 21.953
  CHECK_FALSE(has(text, " kg"));
}

TEST_CASE("blend cautions follow where the hops go: whirlpool, dry hop, and dogs always") {
  Blended f;
  auto cautions = blend_cautions(f.result);
  auto any = [&](const std::string& words) {
    for (const auto& c : cautions)
      if (has(c, words)) return true;
    return false;
  };
  CHECK(any("near-boiling wort"));
  CHECK(any("hop creep"));
  CHECK(any("over-pressurise"));
  CHECK(any("toxic to dogs"));
  CHECK(any("local rules and licensed practice"));

  for (auto& p : f.result.parts) p.whirlpool_g = 0.0;  // all dry hop
  cautions = blend_cautions(f.result);
  CHECK_FALSE(any("near-boiling wort"));
  CHECK(any("hop creep"));
  CHECK(any("toxic to dogs"));

  for (auto& p : f.result.parts) {  // all whirlpool
    p.whirlpool_g = 10.0;
    p.dry_hop_g = 0.0;
  }
  cautions = blend_cautions(f.result);
  CHECK(any("near-boiling wort"));
  CHECK_FALSE(any("hop creep"));
  CHECK(any("toxic to dogs"));
  // The text lists the same cautions.
  for (const auto& c : cautions) CHECK(has(f.text(), "  - " + c + "\n"));
}

TEST_CASE("blend JSON: canonical units at the documented rounding") {
  const Blended f;
  const auto json = blend_to_json(f.result, f.context);
  CHECK(json["target"]["citrus"].get<double>() == 4.0);
  CHECK(json["weights"]["pine"].get<double>() == 0.25);
  CHECK(json["profile"]["citrus"].get<double>() == 3.0449);
  CHECK(json["fit"].get<double>() == 0.7649);
  REQUIRE(json["varieties"].size() == 2);
  const auto& first = json["varieties"][0];
  CHECK(first["lot"] == "TT-1");
  CHECK(first["grams"].get<double>() == 42.34);  // 42.3447
  CHECK(first["share"].get<double>() == 0.6601);
  CHECK(first["whirlpool_g"].get<double>() == 14.11);
  CHECK(first["whirlpool_ibu"].get<double>() == 1.73);
  CHECK(first["left_g"].get<double>() == 9957.66);
  CHECK(json["bittering"]["grams"].get<double>() == 17.84);
  CHECK(json["bittering"]["lot"] == "BT-7");
  CHECK(json["bittering"]["left_g"].get<double>() == 2982.16);
  CHECK(json["oil_ml"].get<double>() == 1.123);
  CHECK(json["whirlpool_temperature_c"].get<double>() == 80.0);
  CHECK(json["ibu"]["kept"].get<double>() == 5.52);
  CHECK(json["total_ibu"].get<double>() == 38.0);
  CHECK(json["cautions"].size() == 4);
}

TEST_CASE("blend HTML escapes the recipe and lot names and holds no script") {
  const Blended f;
  const std::string page = blend_html(f.result, f.context, UnitSystem::metric, {"2026-12-01", "0.1.0", {}});
  CHECK(has(page, "<h1>Late-hop blend for Ale &lt;One&gt; &amp; &quot;Two&quot;</h1>"));
  CHECK(has(page, "Rose &lt;Test&gt; (R&amp;1)"));
  CHECK_FALSE(has(page, "<One>"));
  CHECK_FALSE(has(page, "<Test>"));
  CHECK_FALSE(has(page, "R&1"));
  CHECK(has(page, "<svg"));
  CHECK_FALSE(has(page, "<script"));
  CHECK(has(page, "toxic to dogs"));
}

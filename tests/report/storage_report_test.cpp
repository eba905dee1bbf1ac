// The storage-loss renderer (bine age) on hand-built estimates: the alpha, the share left, the days,
// the factors are the struct's at the documented rounding (text: alpha 2 decimals, share 1, rate 6,
// factors 3 and 2; JSON: alpha 4, remaining 6), each with its unit, and warm storage is flagged.
// F = 1.8 C + 32 (exact definition).
#include "report/storage_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

namespace {

using namespace bine;

struct Aged {
  AgeQuery query;
  AgedAlpha aged;
  Aged() {
    query.history.alpha_percent = 6.0;
    query.history.stability_percent = 50.0;
    query.history.storage = Storage{-18.0, Package::vacuum};
    query.history.days = 365.0;
    query.packaged = *parse_date("2025-12-01");
    query.on = *parse_date("2026-12-01");
    query.stability_source = "--stability";
    aged.alpha_percent = 5.313914;
    aged.remaining = 0.885652;
    aged.rate_per_day = 0.0038508;
    aged.temperature_factor = 0.189465;
    aged.package_factor = 0.5;
  }
};

}  // namespace

TEST_CASE("age text: the estimate, the storage and the model's factors with units") {
  const Aged f;
  std::ostringstream out;
  render_age(out, f.query, f.aged, UnitSystem::metric);
  const std::string text = out.str();
  // 5.313914 -> 5.31 %; 100 x 0.885652 = 88.6 % of the 6.00 %.
  CHECK(text.find("Estimated alpha acid on 2026-12-01: 5.31 % (88.6 % of the 6.00 % at packaging)\n") == 0);
  CHECK(text.find("packaged 2025-12-01, 365 days stored at -18 C, vacuum") != std::string::npos);
  CHECK(text.find("stability 50.0 % of alpha left after 6 months at 20 C (--stability)") != std::string::npos);
  CHECK(text.find("loss rate 0.003851 per day (20 C, open) x temperature factor 0.189 x package factor 0.50") !=
        std::string::npos);
  CHECK(text.find("stored above") == std::string::npos);
  CHECK(text.find("(today; pass --on to reproduce)") == std::string::npos);
}

TEST_CASE("age text in US units gives F, and warm storage is called an extrapolation") {
  Aged f;
  f.query.history.storage = Storage{25.0, Package::open};
  f.aged.warm_extrapolation = true;
  std::ostringstream out;
  render_age(out, f.query, f.aged, UnitSystem::us);
  const std::string text = out.str();
  CHECK(text.find("stored at 77 F, open") != std::string::npos);    // 1.8 x 25 + 32
  CHECK(text.find("after 6 months at 68 F") != std::string::npos);  // 1.8 x 20 + 32
  CHECK(text.find("note: stored above 68 F") != std::string::npos);
  CHECK(text.find(" C") == std::string::npos);
}

TEST_CASE("age JSON: canonical units and the documented rounding") {
  Aged f;
  f.query.notes = {"a note"};
  f.aged.warm_extrapolation = true;
  const auto json = age_to_json(f.query, f.aged);
  CHECK(json["alpha_acid"].get<double>() == 5.3139);  // 4 decimals
  CHECK(json["alpha_acid_packaged"].get<double>() == 6.0);
  CHECK(json["remaining"].get<double>() == 0.885652);
  CHECK(json["days"] == 365);
  CHECK(json["storage"]["temperature_c"].get<double>() == -18.0);
  CHECK(json["storage"]["package"] == "vacuum");
  CHECK(json["rate_per_day"].get<double>() == 0.0038508);
  CHECK(json["temperature_factor"].get<double>() == 0.189465);
  REQUIRE(json["notes"].size() == 2);  // the query's note and the warm-storage note
  CHECK(json["notes"][1].get<std::string>().find("extrapolated") != std::string::npos);
}

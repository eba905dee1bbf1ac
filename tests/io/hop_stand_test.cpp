// The recipe key "hop_stand": read with units and bounds, written back by recipe_to_json.
#include <doctest/doctest.h>

#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace {

std::string recipe_with_stand(const std::string& stand) {
  return R"({"name": "stand", "batch_volume": "20 L", "original_gravity": 1.050, "boil_time": "60 min",
             "hop_stand": )" +
         stand + R"(, "hops": [{"variety": "X", "amount": "28 g", "alpha_acid": 10, "use": "boil", "time": 60}]})";
}

}  // namespace

TEST_CASE("hop_stand is read in canonical units and written back in the brewer's units") {
  // 176 F = (176 - 32) x 5 / 9 = 80 C; 0.5 h = 30 min.
  const auto recipe = bine::parse_recipe(recipe_with_stand(R"({"time": "0.5 h", "temperature": "176 F"})"), "r.json");
  REQUIRE(recipe.hop_stand.has_value());
  CHECK(recipe.hop_stand->minutes == doctest::Approx(30.0));
  CHECK(recipe.hop_stand->temperature_c == doctest::Approx(80.0));
  const auto json = bine::recipe_to_json(recipe);
  CHECK(json["hop_stand"]["time"] == "0.5 h");
  CHECK(json["hop_stand"]["temperature"] == "176 F");
  const auto again = bine::parse_recipe(json.dump(), "again.json");
  REQUIRE(again.hop_stand.has_value());
  CHECK(again.hop_stand->minutes == doctest::Approx(30.0));
}

TEST_CASE("hop_stand problems are named by pointer") {
  try {
    bine::parse_recipe(recipe_with_stand(R"({"time": "20 min", "temperature": "120 C", "stir": true})"), "r.json");
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    bool temperature = false;
    bool unknown = false;
    for (const auto& line : e.lines()) {
      temperature = temperature || line.find("r.json: /hop_stand/temperature:") == 0;
      unknown = unknown || line.find("r.json: /hop_stand/stir:") == 0;
    }
    CHECK(temperature);
    CHECK(unknown);
  }
  CHECK_THROWS_AS(bine::parse_recipe(recipe_with_stand(R"({"temperature": "80 C"})"), "r.json"), bine::InputError);
}

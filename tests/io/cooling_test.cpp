// A whirlpool addition's "cooling" course: read with units and bounds, written back by
// recipe_to_json, and every problem named by its pointer.
#include <doctest/doctest.h>

#include <string>

#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace {

std::string recipe_with_whirlpool(const std::string& extra, const std::string& use = "whirlpool") {
  return R"({"name": "cool", "batch_volume": "20 L", "original_gravity": 1.050, "boil_time": "60 min",
             "hops": [{"variety": "X", "amount": "50 g", "alpha_acid": 10, "use": ")" +
         use + R"(", "time": "25 min", "temperature": "98 C", )" + extra + "}]}";
}

std::vector<std::string> problems_of(const std::string& text) {
  try {
    bine::parse_recipe(text, "r.json");
  } catch (const bine::InputError& e) {
    return e.lines();
  }
  return {};
}

bool has_line_starting(const std::vector<std::string>& lines, const std::string& start) {
  for (const auto& line : lines)
    if (line.rfind(start, 0) == 0) return true;
  return false;
}

}  // namespace

TEST_CASE("cooling to an end temperature, or by a constant toward ambient, is read and written back") {
  // 179.6 F = (179.6 - 32) x 5 / 9 = 82 C (exact unit definition).
  const auto straight = bine::parse_recipe(recipe_with_whirlpool(R"("cooling": {"to": "179.6 F"})"), "r.json");
  REQUIRE(straight.hops[0].cooling.has_value());
  CHECK(straight.hops[0].cooling->to_c.value_or(0.0) == doctest::Approx(82.0));
  CHECK_FALSE(straight.hops[0].cooling->per_minute.has_value());
  const auto again = bine::parse_recipe(bine::recipe_to_json(straight).dump(), "again.json");
  REQUIRE(again.hops[0].cooling.has_value());
  CHECK(again.hops[0].cooling->to_c.value_or(0.0) == doctest::Approx(82.0));

  const auto newton =
      bine::parse_recipe(recipe_with_whirlpool(R"("cooling": {"constant": 0.01, "ambient": "15 C"})"), "r.json");
  REQUIRE(newton.hops[0].cooling.has_value());
  CHECK(newton.hops[0].cooling->per_minute.value_or(0.0) == doctest::Approx(0.01));
  CHECK(newton.hops[0].cooling->ambient_c == doctest::Approx(15.0));
  const auto round_trip = bine::parse_recipe(bine::recipe_to_json(newton).dump(), "again.json");
  CHECK(round_trip.hops[0].cooling->ambient_c == doctest::Approx(15.0));
  // Ambient defaults to 20 C (a room; stated in docs/methods.md#cooling-whirlpool).
  const auto room = bine::parse_recipe(recipe_with_whirlpool(R"("cooling": {"constant": 0.01})"), "r.json");
  CHECK(room.hops[0].cooling->ambient_c == doctest::Approx(20.0));
}

TEST_CASE("cooling problems are named by pointer") {
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": {"to": "99 C"})")),
                          "r.json: /hops/0/cooling/to: 99 C is warmer"));
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": {})")),
                          "r.json: /hops/0/cooling: give either"));
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": {"to": "80 C", "constant": 0.01})")),
                          "r.json: /hops/0/cooling: give either"));
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": {"constant": 5})")),
                          "r.json: /hops/0/cooling/constant:"));
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": {"to": "80 C", "rate": 1})")),
                          "r.json: /hops/0/cooling/rate:"));
  CHECK(has_line_starting(problems_of(recipe_with_whirlpool(R"("cooling": "fast")")), "r.json: /hops/0/cooling:"));
}

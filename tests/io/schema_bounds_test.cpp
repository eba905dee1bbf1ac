// One set of bounds: the recipe schema (descriptor-data/schema/recipe.schema.json) states for bare
// numbers exactly the hard bounds the loader enforces (io/limits.hpp), so that a file the schema
// accepts is a file bine reads, and what bine writes (which passes the same bounds) the schema
// accepts. Strings with units ("25 g", "176 F") cannot be bounded by a schema pattern; the loader
// checks them after conversion. The expected values are the limits themselves; the test checks
// the two places agree.
#include <doctest/doctest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/temp_dir.hpp"
#include "io/limits.hpp"

namespace {

using nlohmann::json;

json recipe_schema() {
  return json::parse(bine::test::slurp(std::filesystem::path(BINE_SOURCE_DATA_DIR) / "schema" / "recipe.schema.json"));
}

/// The bare-number branch of a definition (its "oneOf" number entry, or the definition itself).
const json& number_branch(const json& definition) {
  if (definition.contains("oneOf"))
    for (const auto& branch : definition["oneOf"])
      if (branch.value("type", "") == "number") return branch;
  return definition;
}

const json& resolve(const json& schema, const json& property) {
  if (property.contains("$ref")) {
    const std::string ref = property["$ref"];
    return schema["$defs"][ref.substr(std::string("#/$defs/").size())];
  }
  return property;
}

void check_bounds(const json& schema, const json& property, const bine::Bounds& bounds) {
  const json& number = number_branch(resolve(schema, property));
  INFO(bounds.what);
  if (bounds.min_exclusive) {
    REQUIRE(number.contains("exclusiveMinimum"));
    CHECK(number["exclusiveMinimum"].get<double>() == bounds.min);
  } else {
    REQUIRE(number.contains("minimum"));
    CHECK(number["minimum"].get<double>() == bounds.min);
  }
  REQUIRE(number.contains("maximum"));
  CHECK(number["maximum"].get<double>() == bounds.max);
}

}  // namespace

TEST_CASE("the recipe schema's number bounds are the loader's bounds") {
  namespace limits = bine::limits;
  const json schema = recipe_schema();
  const json& top = schema["properties"];
  check_bounds(schema, top["batch_volume"], limits::batch_volume);
  check_bounds(schema, top["original_gravity"], limits::gravity);
  check_bounds(schema, top["boil_time"], limits::boil_time);
  check_bounds(schema, top["target_ibu"], limits::target_ibu);
  check_bounds(schema, top["hop_stand"]["properties"]["time"], limits::boil_time);
  check_bounds(schema, top["hop_stand"]["properties"]["temperature"], limits::whirlpool_temperature);
  const json& addition = schema["$defs"]["addition"]["properties"];
  check_bounds(schema, addition["amount"], limits::hop_mass);
  check_bounds(schema, addition["alpha_acid"], limits::alpha_acid);
  check_bounds(schema, addition["total_oil"], limits::total_oil);
  check_bounds(schema, addition["time"], limits::addition_time);
  check_bounds(schema, addition["temperature"], limits::whirlpool_temperature);
  const json& cooling = addition["cooling"]["properties"];
  check_bounds(schema, cooling["to"], limits::whirlpool_temperature);
  check_bounds(schema, cooling["constant"], limits::cooling_constant);
  check_bounds(schema, cooling["ambient"], limits::ambient_temperature);
}

namespace {

/// The guard's limit for the array at `pointer` (kJsonArrayLimits), else its default.
std::size_t guard_limit(std::string_view pointer) {
  for (const auto& limit : bine::kJsonArrayLimits)
    if (limit.pointer == pointer) return limit.max;
  return bine::kMaxJsonArrayElements;
}

json schema_named(const std::string& name) {
  return json::parse(bine::test::slurp(std::filesystem::path(BINE_SOURCE_DATA_DIR) / "schema" / name));
}

}  // namespace

TEST_CASE("the schemas' maxItems are the JSON guard's array limits") {
  CHECK(recipe_schema()["properties"]["hops"]["maxItems"].get<std::size_t>() == guard_limit("/hops"));
  CHECK(schema_named("stock.schema.json")["properties"]["lots"]["maxItems"].get<std::size_t>() == guard_limit("/lots"));
  const json catalog = schema_named("catalog.schema.json");
  CHECK(catalog["properties"]["varieties"]["maxItems"].get<std::size_t>() == guard_limit("/varieties"));
  CHECK(catalog["$defs"]["variety"]["properties"]["tags"]["maxItems"].get<std::size_t>() ==
        guard_limit("/varieties/*/tags"));
  CHECK(schema_named("lexicon.schema.json")["properties"]["compounds"]["maxItems"].get<std::size_t>() ==
        guard_limit("/compounds"));
}

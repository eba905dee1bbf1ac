// brewhouse.json written and read back, and its problems named by pointer; the batch log's JSON form.
#include "io/brewhouse_profile.hpp"

#include <doctest/doctest.h>

#include "io/batch_log.hpp"
#include "model/errors.hpp"

namespace {

bool has_line_starting(const std::vector<std::string>& lines, const std::string& start) {
  for (const auto& line : lines)
    if (line.rfind(start, 0) == 0) return true;
  return false;
}

}  // namespace

TEST_CASE("a split brewhouse profile survives writing and reading") {
  bine::BrewhouseProfile profile;
  profile.model = "rager";
  profile.pellet_factor = 1.05;
  profile.factor = {0.9, 0.02, 0.85, 0.95, 9};
  profile.boil_factor = bine::FittedFactor{0.95, 0.02, 0.9, 1.0, 8};
  profile.late_factor = bine::FittedFactor{0.7, 0.05, 0.6, 0.8, 8};
  profile.made = *bine::parse_date("2026-06-01");
  profile.batches_used = {"a", "b"};
  const auto text = bine::brewhouse_profile_to_json(profile).dump();
  const auto back = bine::parse_brewhouse_profile(text, "p.json");
  CHECK(back.model == "rager");
  CHECK(back.pellet_factor == 1.05);
  CHECK(back.factor.degrees_of_freedom == 9);
  REQUIRE(back.late_factor.has_value());
  CHECK(back.late_factor->value == 0.7);
  CHECK(bine::format_date(back.made) == "2026-06-01");
  CHECK(back.batches_used == profile.batches_used);
}

TEST_CASE("brewhouse profile problems are named by pointer") {
  try {
    bine::parse_brewhouse_profile(
        R"({"bine_brewhouse": 1, "model": "guess", "pellet_factor": 1.1, "date": "2026-13-01",
            "factor": {"value": 0.9, "standard_error": 0.01, "low_95": 0.95, "high_95": 0.99, "degrees_of_freedom": 4},
            "late_factor": {"value": 0.7, "standard_error": 0.01, "low_95": 0.6, "high_95": 0.8, "degrees_of_freedom": 4}})",
        "p.json");
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    CHECK(has_line_starting(e.lines(), "p.json: /model:"));
    CHECK(has_line_starting(e.lines(), "p.json: /date:"));
    CHECK(has_line_starting(e.lines(), "p.json: /factor: the interval"));
    CHECK(has_line_starting(e.lines(), "p.json: /boil_factor: is missing"));
  }
}

TEST_CASE("the JSON batch log resolves recipe paths beside the log and names bad fields") {
  const auto log = bine::parse_batch_log_json(
      R"({"batches": [{"recipe": "pale.json", "brewed": "2026-03-01", "lab_ibu": 31.5, "stock": "cold.json"}]})",
      "/brew/log.json");
  REQUIRE(log.batches.size() == 1);
  CHECK(log.batches[0].recipe == std::filesystem::path("/brew/pale.json"));
  CHECK(log.batches[0].stock.value() == std::filesystem::path("/brew/cold.json"));
  CHECK(log.batches[0].lab_ibu == 31.5);
  try {
    bine::parse_batch_log_json(R"({"batches": [{"recipe": "pale.json", "brewed": "2026-03-01", "lab_ibu": 900}]})",
                               "log.json");
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    CHECK(has_line_starting(e.lines(), "log.json: /batches/0/lab_ibu:"));
  }
}

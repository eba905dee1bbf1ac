// Cooling whirlpools: the boil-equivalent minutes of a temperature course against SciPy's quad
// (tests/engine/cooling_reference.py, Debian python3-scipy) and hand arithmetic, and Rager's
// 0-minute floor scaled by k1(T) / k1(100 C) for additions at or after flame-out (our derived
// method, docs/methods.md#rager-stand-floor, check values derived there).
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_binary.hpp"
#include "engine/bitterness.hpp"

namespace {

using bine::Cooling;
using bine::TemperatureCourse;

TemperatureCourse straight(double from_c, double to_c, double minutes) {
  Cooling cooling;
  cooling.to_c = to_c;
  return TemperatureCourse{from_c, minutes, cooling};
}

TemperatureCourse newton(double from_c, double per_minute, double ambient_c, double minutes) {
  Cooling cooling;
  cooling.per_minute = per_minute;
  cooling.ambient_c = ambient_c;
  return TemperatureCourse{from_c, minutes, cooling};
}

nlohmann::json course_json(const TemperatureCourse& course) {
  nlohmann::json out{{"start_c", course.start_c}, {"minutes", course.minutes}};
  if (course.cooling->to_c) out["to_c"] = *course.cooling->to_c;
  if (course.cooling->per_minute) {
    out["per_minute"] = *course.cooling->per_minute;
    out["ambient_c"] = course.cooling->ambient_c;
  }
  return out;
}

/// SciPy quad of r(T(t)) over each course.
std::vector<double> scipy_integrals(const std::vector<TemperatureCourse>& courses) {
  nlohmann::json input = nlohmann::json::array();
  for (const auto& course : courses) input.push_back(course_json(course));
  const auto run =
      bine::test::run_program(BINE_PYTHON, {std::string(BINE_TEST_DIR) + "/engine/cooling_reference.py", input.dump()});
  INFO(run.err);
  REQUIRE(run.exited);
  REQUIRE(run.status == 0);
  return nlohmann::json::parse(run.out).get<std::vector<double>>();
}

bine::HopAddition whirlpool(double minutes, double celsius, std::optional<Cooling> cooling = std::nullopt) {
  bine::HopAddition hop;
  hop.variety = "Test";
  hop.grams = 100.0;
  hop.use = bine::HopUse::whirlpool;
  hop.minutes = minutes;
  hop.temperature_c = celsius;
  hop.cooling = cooling;
  hop.form = bine::HopForm::whole;
  return hop;
}

bine::WortContext wort_1050() {
  bine::WortContext wort;
  wort.volume_l = 20.0;
  wort.gravity = 1.050;
  return wort;
}

}  // namespace

TEST_CASE("boil-equivalent minutes of cooling courses match scipy.integrate.quad to 1e-9") {
  // Reference: scipy.integrate.quad of exp(-11858 (1/T - 1/373.15)) over each course
  // (Malowicki & Shellhammer 2005 k1 ratio), epsabs = epsrel = 1e-13.
  const std::vector<TemperatureCourse> courses{
      straight(98.0, 82.0, 25.0),        // "98 C to 82 C over 25 min"
      straight(100.0, 70.0, 45.0),       // a long slow kettle
      newton(95.0, 0.01, 20.0, 60.0),    // Newton's law, k 0.01/min to 20 C
      newton(99.0, 0.2, 15.0, 90.0),     // a fast chill: most of the stand is cold
      newton(85.0, 0.002, 25.0, 600.0),  // a 10 h stand in a large, slow kettle
  };
  const auto reference = scipy_integrals(courses);
  REQUIRE(reference.size() == courses.size());
  for (std::size_t i = 0; i < courses.size(); ++i) {
    INFO("course " << i);
    CHECK(bine::boil_equivalent_minutes(courses[i]) == doctest::Approx(reference[i]).epsilon(1e-9));
  }
}

TEST_CASE("a held course is t x r(T), and a straight course lies between its end temperatures") {
  // docs/methods.md check value: 20 min at 80 C is 3.31 boil minutes (r(80 C) = 0.1653, derived).
  CHECK(bine::boil_equivalent_minutes(straight(80.0, 80.0, 20.0)) == doctest::Approx(3.30699).epsilon(1e-5));
  CHECK(bine::boil_equivalent_minutes(TemperatureCourse{80.0, 20.0, std::nullopt}) ==
        doctest::Approx(3.30699).epsilon(1e-5));
  // r rises with T, so 25 x r(82) < t_eq < 25 x r(98) (bounds of the integral, hand reasoning).
  const double t_eq = bine::boil_equivalent_minutes(straight(98.0, 82.0, 25.0));
  CHECK(t_eq > 25.0 * bine::relative_isomerization_rate(82.0));
  CHECK(t_eq < 25.0 * bine::relative_isomerization_rate(98.0));
  // Newton's law: T(t) = 20 + 75 e^(-0.01 t); at 60 min 20 + 75 x 0.548812 = 61.16 C (hand arithmetic).
  CHECK(newton(95.0, 0.01, 20.0, 60.0).at(60.0) == doctest::Approx(61.1609).epsilon(1e-5));
  CHECK(straight(98.0, 82.0, 25.0).at(12.5) == doctest::Approx(90.0));
}

TEST_CASE("a cooling whirlpool takes its integral under Tinseth and is flagged below 90 C") {
  Cooling to82;
  to82.to_c = 82.0;
  const auto result = bine::addition_bitterness(whirlpool(25.0, 98.0, to82), 10.0, wort_1050(), {});
  const double t_eq = bine::boil_equivalent_minutes(straight(98.0, 82.0, 25.0));
  // Tinseth: U = B(1.050) x (1 - e^(-0.04 t_eq)) / 4.15; 100 g at 10 % in 20 L = 500 mg/L.
  CHECK(result.effective_minutes == doctest::Approx(t_eq));
  CHECK(result.utilization == doctest::Approx(bine::tinseth_utilization(1.050, t_eq)));
  CHECK(result.ibu == doctest::Approx(500.0 * bine::tinseth_utilization(1.050, t_eq)));
  CHECK(result.rate_extrapolated);  // ends at 82 C, below the 90 C the fit was measured down to
  Cooling to92;
  to92.to_c = 92.0;
  CHECK_FALSE(bine::addition_bitterness(whirlpool(25.0, 98.0, to92), 10.0, wort_1050(), {}).rate_extrapolated);
  CHECK(bine::addition_bitterness(whirlpool(20.0, 80.0), 10.0, wort_1050(), {}).rate_extrapolated);
}

TEST_CASE("Rager: the 0-minute floor is scaled by k1(T)/k1(100 C) at or after flame-out") {
  bine::BitternessSettings rager;
  rager.model = bine::IbuModel::rager;
  // docs/methods.md#rager-stand-floor (derived): whole hops, G 1.050.
  CHECK(bine::addition_bitterness(whirlpool(20.0, 80.0), 10.0, wort_1050(), rager).utilization ==
        doctest::Approx(0.01210).epsilon(2e-3));
  CHECK(bine::addition_bitterness(whirlpool(20.0, 100.0), 10.0, wort_1050(), rager).utilization ==
        doctest::Approx(0.10475).epsilon(1e-3));
  CHECK(bine::addition_bitterness(whirlpool(20.0, 20.0), 10.0, wort_1050(), rager).utilization ==
        doctest::Approx(0.000012).epsilon(0.05));
  // A 0-minute boil addition under a 20 min stand at 80 C gets the same; one boiled 5 min keeps
  // U_R(5 + t_eq) (the floor survives as a step).
  bine::WortContext stand = wort_1050();
  stand.stand_equivalent_minutes = bine::boil_equivalent_minutes(20.0, 80.0);
  stand.stand_temperature_c = 80.0;
  bine::HopAddition flame_out = whirlpool(0.0, 100.0);
  flame_out.use = bine::HopUse::boil;
  flame_out.temperature_c.reset();
  CHECK(bine::addition_bitterness(flame_out, 10.0, stand, rager).utilization == doctest::Approx(0.01210).epsilon(2e-3));
  flame_out.minutes = 5.0;
  CHECK(bine::addition_bitterness(flame_out, 10.0, stand, rager).utilization ==
        doctest::Approx(bine::rager_utilization(5.0 + stand.stand_equivalent_minutes)));
}

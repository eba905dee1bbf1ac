// Unit conversions against exact definitions (NIST Handbook 44, Appendix C, "General tables of units
// of measurement"): 1 oz = 28.349523125 g, 1 lb = 453.59237 g, 1 US gal = 3.785411784 L,
// 1 US beer barrel = 31 US gal; temperature F = C x 9/5 + 32 (definition of the Fahrenheit scale).
#include "model/quantity.hpp"

#include <doctest/doctest.h>

using bine::Dimension;
using bine::parse_quantity;

namespace {
double value_of(std::string_view text, Dimension dimension) {
  const auto parsed = parse_quantity(text, dimension);
  REQUIRE_MESSAGE(parsed.value.has_value(), parsed.error);
  return *parsed.value;
}
}  // namespace

TEST_CASE("mass units convert to grams by exact definitions") {
  CHECK(value_of("28 g", Dimension::mass) == doctest::Approx(28.0).epsilon(1e-15));
  CHECK(value_of("1.5 kg", Dimension::mass) == doctest::Approx(1500.0).epsilon(1e-15));
  CHECK(value_of("1 oz", Dimension::mass) == doctest::Approx(28.349523125).epsilon(1e-15));  // NIST HB44
  CHECK(value_of("2oz", Dimension::mass) == doctest::Approx(56.69904625).epsilon(1e-15));
  CHECK(value_of("1 lb", Dimension::mass) == doctest::Approx(453.59237).epsilon(1e-15));  // NIST HB44
  CHECK(value_of("3 lb", Dimension::mass) == doctest::Approx(1360.77711).epsilon(1e-15));
  CHECK(value_of("250 mg", Dimension::mass) == doctest::Approx(0.25).epsilon(1e-15));
  CHECK(value_of("12", Dimension::mass) == doctest::Approx(12.0));  // bare number: canonical unit g
  // 16 oz = 1 lb exactly (avoirdupois definition).
  CHECK(value_of("16 oz", Dimension::mass) == doctest::Approx(value_of("1 lb", Dimension::mass)).epsilon(1e-15));
}

TEST_CASE("volume units convert to litres by exact definitions") {
  CHECK(value_of("20 L", Dimension::volume) == doctest::Approx(20.0));
  CHECK(value_of("20 l", Dimension::volume) == doctest::Approx(20.0));
  CHECK(value_of("10 hL", Dimension::volume) == doctest::Approx(1000.0));
  CHECK(value_of("500 mL", Dimension::volume) == doctest::Approx(0.5));
  CHECK(value_of("1 gal", Dimension::volume) == doctest::Approx(3.785411784).epsilon(1e-15));  // NIST HB44
  CHECK(value_of("5.5 gal", Dimension::volume) == doctest::Approx(20.819764812).epsilon(1e-14));
  // 1 US beer barrel = 31 US gal = 117.347765304 L (27 CFR 25.11).
  CHECK(value_of("1 bbl", Dimension::volume) == doctest::Approx(117.347765304).epsilon(1e-14));
}

TEST_CASE("temperatures convert to Celsius") {
  CHECK(value_of("80 C", Dimension::temperature) == doctest::Approx(80.0));
  CHECK(value_of("176 F", Dimension::temperature) == doctest::Approx(80.0));  // (176 - 32) x 5/9 = 80
  CHECK(value_of("212 F", Dimension::temperature) == doctest::Approx(100.0));
  CHECK(value_of("32F", Dimension::temperature) == doctest::Approx(0.0));
  CHECK(value_of("0 F", Dimension::temperature) == doctest::Approx(-17.7777777778));  // -160/9
  CHECK(value_of("-2 C", Dimension::temperature) == doctest::Approx(-2.0));
  CHECK(value_of("80 \xC2\xB0"
                 "C",
                 Dimension::temperature) == doctest::Approx(80.0));  // degree sign
  CHECK(bine::celsius_to_fahrenheit(-40.0) == doctest::Approx(-40.0));
}

TEST_CASE("times convert to minutes") {
  CHECK(value_of("60 min", Dimension::time) == doctest::Approx(60.0));
  CHECK(value_of("1.5 h", Dimension::time) == doctest::Approx(90.0));
  CHECK(value_of("4 d", Dimension::time) == doctest::Approx(5760.0));  // 4 x 24 x 60
  CHECK(value_of("20", Dimension::time) == doctest::Approx(20.0));
}

TEST_CASE("gravity as SG or degrees Plato") {
  CHECK(value_of("1.050", Dimension::gravity) == doctest::Approx(1.050));
  CHECK(value_of("1.050 SG", Dimension::gravity) == doctest::Approx(1.050));
  // Plato <-> SG by the cubic fit of the ASBC extract table as widely published (from memory):
  // P = -616.868 + 1111.14 SG - 630.272 SG^2 + 135.997 SG^3. Hand arithmetic at SG 1.050:
  // 1111.14 x 1.05 = 1166.697; 630.272 x 1.1025 = 694.87488; 135.997 x 1.157625 = 157.433527;
  // -616.868 + 1166.697 - 694.87488 + 157.433527 = 12.387647 P.
  CHECK(bine::plato_from_sg(1.050) == doctest::Approx(12.387647).epsilon(1e-6));
  // Common practice: 12 P is about 1.048 SG and 1 P is about 4 gravity points near 1.040-1.060.
  CHECK(value_of("12 P", Dimension::gravity) == doctest::Approx(1.0484).epsilon(2e-4));
  CHECK(value_of("12.387647 P", Dimension::gravity) == doctest::Approx(1.050).epsilon(1e-6));
  // The two directions are exact inverses over the brewing range.
  for (double plato = 0.0; plato <= 30.0; plato += 2.5)
    CHECK(bine::plato_from_sg(bine::sg_from_plato(plato)) == doctest::Approx(plato).epsilon(1e-10));
}

TEST_CASE("percent and oil content") {
  CHECK(value_of("12.5 %", Dimension::percent) == doctest::Approx(12.5));
  CHECK(value_of("12.5", Dimension::percent) == doctest::Approx(12.5));
  CHECK(value_of("1.4 mL/100 g", Dimension::oil_content) == doctest::Approx(1.4));
  CHECK(value_of("1.4 ml/100g", Dimension::oil_content) == doctest::Approx(1.4));
}

TEST_CASE("bad quantity strings say what is wrong and what is expected") {
  auto error_of = [](std::string_view text, Dimension dimension) {
    const auto parsed = parse_quantity(text, dimension);
    REQUIRE_FALSE(parsed.value.has_value());
    return parsed.error;
  };
  CHECK(error_of("28 gr", Dimension::mass) == "\"28 gr\" is not a mass (use g, kg, oz or lb)");
  CHECK(error_of("20 L", Dimension::mass).find("is not a mass") != std::string::npos);
  CHECK(error_of("", Dimension::volume).find("is empty") != std::string::npos);
  CHECK(error_of("nan g", Dimension::mass).find("not a finite number") != std::string::npos);
  CHECK(error_of("inf g", Dimension::mass).find("not a finite number") != std::string::npos);
  CHECK(error_of("1e999 g", Dimension::mass).find("out of range") != std::string::npos);
  CHECK(error_of("80 K", Dimension::temperature).find("use C or F") != std::string::npos);
  CHECK(error_of("99 P", Dimension::gravity).find("0-40 degrees Plato") != std::string::npos);
  CHECK(error_of("twelve", Dimension::percent).find("is not a percentage") != std::string::npos);
}

TEST_CASE("formatting always carries a unit") {
  using bine::UnitSystem;
  CHECK(bine::format_mass(28.349523125, UnitSystem::us) == "1.00 oz");
  CHECK(bine::format_mass(453.59237 * 2, UnitSystem::us) == "2.00 lb");
  CHECK(bine::format_mass(28.0, UnitSystem::metric) == "28.0 g");
  CHECK(bine::format_mass(2500.0, UnitSystem::metric) == "2.50 kg");
  CHECK(bine::format_volume(3.785411784 * 5.0, UnitSystem::us) == "5.00 gal");
  CHECK(bine::format_temperature(80.0, UnitSystem::us) == "176 F");
  CHECK(bine::format_temperature(80.0, UnitSystem::metric) == "80 C");
  // -18 C = -0.4 F (F = 1.8 C + 32, exact): rounds to 0 F, never "-0 F".
  CHECK(bine::format_temperature(-18.0, UnitSystem::us) == "0 F");
  CHECK(bine::format_temperature(-0.3, UnitSystem::metric) == "0 C");
}

TEST_CASE("large US volumes are shown in US beer barrels (1 bbl = 31 US gal)") {
  using bine::UnitSystem;
  // 20 hL = 2000 L = 2000 / 3.785411784 = 528.34 gal = 17.04 bbl.
  CHECK(bine::format_volume(2000.0, UnitSystem::us) == "17.0 bbl");
  // 31 gal is one barrel; 30 gal stays in gallons.
  CHECK(bine::format_volume(31.0 * 3.785411784, UnitSystem::us) == "1.00 bbl");
  CHECK(bine::format_volume(30.0 * 3.785411784, UnitSystem::us) == "30.0 gal");
}

TEST_CASE("the unit a quantity was written in is kept, and the value is written back in it") {
  CHECK(parse_quantity("1.5 oz", Dimension::mass).unit == "oz");
  CHECK(parse_quantity("3 lbs", Dimension::mass).unit == "lb");
  CHECK(parse_quantity("5.5 Gal", Dimension::volume).unit == "gal");
  CHECK(parse_quantity("176 F", Dimension::temperature).unit == "F");
  CHECK(parse_quantity("12.4 P", Dimension::gravity).unit == "P");
  CHECK(parse_quantity("20", Dimension::volume).unit.empty());
  // Written back to 10 significant digits in the same unit, the value reads back as written.
  CHECK(bine::format_in_unit(value_of("5.5 gal", Dimension::volume), Dimension::volume, "gal") == "5.5 gal");
  CHECK(bine::format_in_unit(value_of("12.4 P", Dimension::gravity), Dimension::gravity, "P") == "12.4 P");
  CHECK(bine::format_in_unit(value_of("176 F", Dimension::temperature), Dimension::temperature, "F") == "176 F");
  CHECK(bine::format_in_unit(value_of("0.5 h", Dimension::time), Dimension::time, "h") == "0.5 h");
  CHECK(bine::format_in_unit(28.349523125 * 1.23, Dimension::mass, "oz") == "1.23 oz");
  CHECK(bine::format_in_unit(1.0516, Dimension::gravity, "") == "1.0516");
  CHECK(bine::format_in_unit(20.0, Dimension::volume, "") == "20 L");
  // Plato shown back as Plato (ASBC cubic, docs/methods.md#plato).
  CHECK(bine::format_gravity(value_of("12.4 P", Dimension::gravity), "P") == "12.4 P");
  CHECK(bine::format_gravity(1.052, "") == "1.052");
}

TEST_CASE("amounts are rounded as a brewer weighs them") {
  // Common practice: 0.1 g below 100 g, 1 g from 100 g, kg to 1 g, oz and lb to 0.01.
  CHECK(bine::weighed_grams(22.105, "g") == doctest::Approx(22.1));
  CHECK(bine::weighed_grams(22.105, "") == doctest::Approx(22.1));
  CHECK(bine::weighed_grams(110.53, "g") == doctest::Approx(111.0));
  CHECK(bine::weighed_grams(2345.6, "kg") == doctest::Approx(2346.0));
  // 54.468 g = 1.9213 oz -> 1.92 oz = 54.431 g.
  CHECK(bine::weighed_grams(54.468, "oz") == doctest::Approx(1.92 * 28.349523125));
  // 1000 g = 2.2046 lb -> 2.20 lb = 997.90 g.
  CHECK(bine::weighed_grams(1000.0, "lb") == doctest::Approx(2.2 * 453.59237));
  // Never to zero: 0.02 g stays one step.
  CHECK(bine::weighed_grams(0.02, "g") == doctest::Approx(0.1));
}

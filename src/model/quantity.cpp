#include "model/quantity.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>

#include "model/names.hpp"

namespace bine {
namespace {

struct Unit {
  std::string_view symbol;   // lower case, as matched
  double factor;             // canonical = value * factor
  std::string_view written;  // the usual spelling, for ParsedQuantity::unit and for writing
};

constexpr std::array kMassUnits{Unit{"g", 1.0, "g"},
                                Unit{"gram", 1.0, "g"},
                                Unit{"grams", 1.0, "g"},
                                Unit{"kg", 1000.0, "kg"},
                                Unit{"mg", 0.001, "mg"},
                                Unit{"oz", kGramsPerOunce, "oz"},
                                Unit{"lb", kGramsPerPound, "lb"},
                                Unit{"lbs", kGramsPerPound, "lb"}};
constexpr std::array kVolumeUnits{Unit{"l", 1.0, "L"},
                                  Unit{"litre", 1.0, "L"},
                                  Unit{"liter", 1.0, "L"},
                                  Unit{"litres", 1.0, "L"},
                                  Unit{"liters", 1.0, "L"},
                                  Unit{"hl", 100.0, "hL"},
                                  Unit{"ml", 0.001, "mL"},
                                  Unit{"gal", kLitresPerUsGallon, "gal"},
                                  Unit{"bbl", kUsGallonsPerBeerBarrel* kLitresPerUsGallon, "bbl"}};
constexpr std::array kTimeUnits{Unit{"min", 1.0, "min"},     Unit{"mins", 1.0, "min"}, Unit{"minute", 1.0, "min"},
                                Unit{"minutes", 1.0, "min"}, Unit{"h", 60.0, "h"},     Unit{"hr", 60.0, "h"},
                                Unit{"hour", 60.0, "h"},     Unit{"hours", 60.0, "h"}, Unit{"d", 1440.0, "d"},
                                Unit{"day", 1440.0, "d"},    Unit{"days", 1440.0, "d"}};
constexpr std::array kPercentUnits{Unit{"%", 1.0, "%"}};
constexpr std::array kOilUnits{Unit{"ml/100g", 1.0, "mL/100 g"}, Unit{"ml/100 g", 1.0, "mL/100 g"}};
// Rates and doses are matched with spaces removed ("6 g / L" is "6g/l").
constexpr std::array kHopRateUnits{
    Unit{"g/l", 1.0, "g/L"}, Unit{"g/hl", 0.01, "g/hL"}, Unit{"kg/hl", 10.0, "kg/hL"},
    Unit{"oz/gal", kGramsPerOunce / kLitresPerUsGallon, "oz/gal"},
    Unit{"lb/bbl", kGramsPerPound / (kUsGallonsPerBeerBarrel * kLitresPerUsGallon), "lb/bbl"}};
constexpr std::array kOilDoseUnits{Unit{"ml/hl", 1.0, "mL/hL"}, Unit{"ml/l", 100.0, "mL/L"}};

std::string lower(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

std::string_view trim(std::string_view text) { return trim_space(text); }

std::string without_spaces(std::string text) {
  std::erase(text, ' ');
  return text;
}

template <std::size_t N>
const Unit* unit_for(const std::array<Unit, N>& units, const std::string& symbol) {
  for (const auto& unit : units)
    if (unit.symbol == symbol) return &unit;
  return nullptr;
}

template <std::size_t N>
const Unit* written_unit(const std::array<Unit, N>& units, std::string_view written) {
  for (const auto& unit : units)
    if (unit.written == written) return &unit;
  return nullptr;
}

/// The unit table of a dimension with a plain factor (not temperature, gravity or number).
const Unit* find_unit(Dimension dimension, const std::string& symbol) {
  switch (dimension) {
    case Dimension::mass:
      return unit_for(kMassUnits, symbol);
    case Dimension::volume:
      return unit_for(kVolumeUnits, symbol);
    case Dimension::time:
      return unit_for(kTimeUnits, symbol);
    case Dimension::percent:
      return unit_for(kPercentUnits, symbol);
    case Dimension::oil_content:
      return unit_for(kOilUnits, symbol);
    case Dimension::hop_rate:
      return unit_for(kHopRateUnits, without_spaces(symbol));
    case Dimension::oil_dose:
      return unit_for(kOilDoseUnits, without_spaces(symbol));
    case Dimension::temperature:
    case Dimension::gravity:
    case Dimension::number:
      return nullptr;
  }
  return nullptr;
}

const Unit* find_written_unit(Dimension dimension, std::string_view written) {
  switch (dimension) {
    case Dimension::mass:
      return written_unit(kMassUnits, written);
    case Dimension::volume:
      return written_unit(kVolumeUnits, written);
    case Dimension::time:
      return written_unit(kTimeUnits, written);
    case Dimension::oil_content:
      return written_unit(kOilUnits, written);
    case Dimension::hop_rate:
      return written_unit(kHopRateUnits, written);
    case Dimension::oil_dose:
      return written_unit(kOilDoseUnits, written);
    default:
      return nullptr;
  }
}

ParsedQuantity fail(std::string message) { return {std::nullopt, std::move(message), {}}; }

}  // namespace

std::string_view canonical_unit(Dimension dimension) {
  switch (dimension) {
    case Dimension::mass:
      return "g";
    case Dimension::volume:
      return "L";
    case Dimension::temperature:
      return "C";
    case Dimension::time:
      return "min";
    case Dimension::percent:
      return "%";
    case Dimension::oil_content:
      return "mL/100 g";
    case Dimension::gravity:
      return "SG";
    case Dimension::number:
      return "";
    case Dimension::hop_rate:
      return "g/L";
    case Dimension::oil_dose:
      return "mL/hL";
  }
  return "";
}

std::string_view accepted_units(Dimension dimension) {
  switch (dimension) {
    case Dimension::mass:
      return "use g, kg, oz or lb";
    case Dimension::volume:
      return "use L, hL, mL, gal (US) or bbl (US beer barrel)";
    case Dimension::temperature:
      return "use C or F";
    case Dimension::time:
      return "use min, h or d";
    case Dimension::percent:
      return "use a number in %";
    case Dimension::oil_content:
      return "use a number in mL/100 g";
    case Dimension::gravity:
      return "use a specific gravity such as 1.050 or degrees Plato such as 12.4 P";
    case Dimension::number:
      return "use a plain number";
    case Dimension::hop_rate:
      return "use g/L, g/hL, oz/gal or lb/bbl";
    case Dimension::oil_dose:
      return "use mL/hL or mL/L";
  }
  return "";
}

std::string_view dimension_noun(Dimension dimension) {
  switch (dimension) {
    case Dimension::mass:
      return "a mass";
    case Dimension::volume:
      return "a volume";
    case Dimension::temperature:
      return "a temperature";
    case Dimension::time:
      return "a time";
    case Dimension::percent:
      return "a percentage";
    case Dimension::oil_content:
      return "an oil content";
    case Dimension::gravity:
      return "a gravity";
    case Dimension::number:
      return "a number";
    case Dimension::hop_rate:
      return "a hop rate";
    case Dimension::oil_dose:
      return "an oil dose";
  }
  return "";
}

double fahrenheit_to_celsius(double fahrenheit) { return (fahrenheit - 32.0) * 5.0 / 9.0; }
double celsius_to_fahrenheit(double celsius) { return celsius * 9.0 / 5.0 + 32.0; }

double plato_from_sg(double sg) { return -616.868 + 1111.14 * sg - 630.272 * sg * sg + 135.997 * sg * sg * sg; }

double sg_from_plato(double plato) {
  // Start from the common rule of thumb SG ~ 1 + P / 250 and polish with Newton's method on the
  // cubic; its derivative is positive over the brewing range (0-40 P), so this converges fast.
  double sg = 1.0 + plato / 250.0;
  for (int i = 0; i < 50; ++i) {
    const double f = plato_from_sg(sg) - plato;
    const double df = 1111.14 - 2.0 * 630.272 * sg + 3.0 * 135.997 * sg * sg;
    const double step = f / df;
    sg -= step;
    if (std::abs(step) < 1e-14) break;
  }
  return sg;
}

ParsedQuantity parse_quantity(std::string_view text, Dimension dimension) {
  const std::string_view trimmed = trim(text);
  const std::string quoted = fmt::format("\"{}\"", text);
  if (trimmed.empty()) return fail(fmt::format("{} is empty ({})", quoted, accepted_units(dimension)));
  double number = 0.0;
  const char* first = trimmed.data();
  const char* last = trimmed.data() + trimmed.size();
  if (*first == '+') ++first;
  const auto [ptr, ec] = std::from_chars(first, last, number);
  if (ec == std::errc::result_out_of_range)
    return fail(fmt::format("{} is out of range ({})", quoted, accepted_units(dimension)));
  if (ec != std::errc() || ptr == first)
    return fail(fmt::format("{} is not {} ({})", quoted, dimension_noun(dimension), accepted_units(dimension)));
  if (!std::isfinite(number))
    return fail(fmt::format("{} is not a finite number ({})", quoted, accepted_units(dimension)));
  std::string unit = lower(trim(std::string_view(ptr, static_cast<std::size_t>(last - ptr))));
  // Accept a degree sign before C/F/P (UTF-8 "\xC2\xB0") and "deg".
  for (std::string_view degree : {"\xC2\xB0", "deg "}) {
    if (unit.rfind(degree, 0) == 0) unit = lower(trim(std::string_view(unit).substr(degree.size())));
  }
  const auto not_unit = [&] {
    return fail(fmt::format("{} is not {} ({})", quoted, dimension_noun(dimension), accepted_units(dimension)));
  };
  // A number near the double limit can overflow in the conversion ("1e308 F", "1.7e308 kg").
  const auto checked = [&](double canonical, std::string_view written) -> ParsedQuantity {
    if (!std::isfinite(canonical))
      return fail(fmt::format("{} is out of range ({})", quoted, accepted_units(dimension)));
    return {canonical, {}, std::string(written)};
  };
  switch (dimension) {
    case Dimension::number:
      if (!unit.empty()) return not_unit();
      return {number, {}, {}};
    case Dimension::temperature:
      if (unit.empty()) return {number, {}, {}};
      if (unit == "c") return {number, {}, "C"};
      if (unit == "f") return checked(fahrenheit_to_celsius(number), "F");
      return not_unit();
    case Dimension::gravity:
      if (unit.empty()) return {number, {}, {}};
      if (unit == "sg") return {number, {}, "SG"};
      if (unit == "p" || unit == "plato") {
        if (number < 0.0 || number > 40.0) return fail(fmt::format("{} is outside 0-40 degrees Plato", quoted));
        return {sg_from_plato(number), {}, "P"};
      }
      return not_unit();
    default:
      break;
  }
  if (unit.empty()) return checked(number, {});
  const Unit* found = find_unit(dimension, unit);
  if (found == nullptr) return not_unit();
  return checked(number * found->factor, found->written);
}

std::string format_in_unit(double canonical, Dimension dimension, std::string_view unit) {
  double value = canonical;
  if (dimension == Dimension::temperature && unit == "F")
    value = celsius_to_fahrenheit(canonical);
  else if (dimension == Dimension::gravity && unit == "P")
    value = plato_from_sg(canonical);
  else if (const Unit* found = find_written_unit(dimension, unit); found != nullptr)
    value = canonical / found->factor;
  else
    unit = dimension == Dimension::gravity ? std::string_view() : canonical_unit(dimension);
  std::string text = fmt::format("{:.10g}", value);
  if (text == "-0") text = "0";
  if (!unit.empty() && unit != "SG") text += " " + std::string(unit);
  return text;
}

double weighed_grams(double grams, std::string_view unit) {
  // The step a brewer weighs to, in grams (common practice).
  double step = grams < 100.0 ? 0.1 : 1.0;
  if (unit == "kg") step = 1.0;
  if (unit == "oz") step = 0.01 * kGramsPerOunce;
  if (unit == "lb") step = 0.01 * kGramsPerPound;
  if (!(grams > 0.0)) return grams;
  return std::max(step, std::round(grams / step) * step);
}

std::string format_gravity(double specific_gravity, std::string_view unit) {
  if (unit == "P") return fmt::format("{:.1f} P", plato_from_sg(specific_gravity));
  return fmt::format("{:.3f}", specific_gravity);
}

namespace {
std::string trim_number(double value, int decimals) {
  std::string text = fmt::format("{:.{}f}", value, decimals);
  // -0.4 rounds to "-0": a brewer reads that as a sign error.
  if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
  return text;
}
int decimals_for(double value) {
  const double magnitude = std::abs(value);
  if (magnitude >= 100.0) return 0;
  if (magnitude >= 10.0) return 1;
  return 2;
}
}  // namespace

std::string format_mass(double grams, UnitSystem units) {
  if (units == UnitSystem::us) {
    const double ounces = grams / kGramsPerOunce;
    if (ounces >= 16.0) return trim_number(grams / kGramsPerPound, 2) + " lb";
    return trim_number(ounces, 2) + " oz";
  }
  if (std::abs(grams) >= 1000.0) return trim_number(grams / 1000.0, 2) + " kg";
  return trim_number(grams, std::abs(grams) >= 100.0 ? 0 : 1) + " g";
}

std::string format_volume(double litres, UnitSystem units) {
  if (units == UnitSystem::us) {
    const double gallons = litres / kLitresPerUsGallon;
    if (gallons >= kUsGallonsPerBeerBarrel) {
      const double barrels = gallons / kUsGallonsPerBeerBarrel;
      return trim_number(barrels, decimals_for(barrels)) + " bbl";
    }
    return trim_number(gallons, decimals_for(gallons)) + " gal";
  }
  if (litres >= 1000.0) return trim_number(litres / 100.0, 1) + " hL";
  return trim_number(litres, decimals_for(litres)) + " L";
}

std::string format_temperature(double celsius, UnitSystem units) {
  if (units == UnitSystem::us) return trim_number(celsius_to_fahrenheit(celsius), 0) + " F";
  return trim_number(celsius, 0) + " C";
}

}  // namespace bine

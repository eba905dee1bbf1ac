#include "model/quantity.hpp"

#include <fmt/format.h>

#include <array>
#include <cctype>
#include <charconv>
#include <cmath>

#include "model/names.hpp"

namespace bine {
namespace {

struct Unit {
  std::string_view symbol;
  double factor;  // canonical = value * factor (+ offset handled separately for temperature)
};

constexpr std::array kMassUnits{
    Unit{"g", 1.0},    Unit{"gram", 1.0},          Unit{"grams", 1.0},         Unit{"kg", 1000.0},
    Unit{"mg", 0.001}, Unit{"oz", kGramsPerOunce}, Unit{"lb", kGramsPerPound}, Unit{"lbs", kGramsPerPound}};
constexpr std::array kVolumeUnits{Unit{"l", 1.0},
                                  Unit{"litre", 1.0},
                                  Unit{"liter", 1.0},
                                  Unit{"litres", 1.0},
                                  Unit{"liters", 1.0},
                                  Unit{"hl", 100.0},
                                  Unit{"ml", 0.001},
                                  Unit{"gal", kLitresPerUsGallon},
                                  Unit{"bbl", kUsGallonsPerBeerBarrel* kLitresPerUsGallon}};
constexpr std::array kTimeUnits{Unit{"min", 1.0},  Unit{"mins", 1.0},   Unit{"minute", 1.0}, Unit{"minutes", 1.0},
                                Unit{"h", 60.0},   Unit{"hr", 60.0},    Unit{"hour", 60.0},  Unit{"hours", 60.0},
                                Unit{"d", 1440.0}, Unit{"day", 1440.0}, Unit{"days", 1440.0}};
constexpr std::array kPercentUnits{Unit{"%", 1.0}};
constexpr std::array kOilUnits{Unit{"ml/100g", 1.0}, Unit{"ml/100 g", 1.0}};
// Rates and doses are matched with spaces removed ("6 g / L" is "6g/l").
constexpr std::array kHopRateUnits{Unit{"g/l", 1.0}, Unit{"g/hl", 0.01}, Unit{"kg/hl", 10.0},
                                   Unit{"oz/gal", kGramsPerOunce / kLitresPerUsGallon},
                                   Unit{"lb/bbl", kGramsPerPound / (kUsGallonsPerBeerBarrel * kLitresPerUsGallon)}};
constexpr std::array kOilDoseUnits{Unit{"ml/hl", 1.0}, Unit{"ml/l", 100.0}};

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
std::optional<double> factor_for(const std::array<Unit, N>& units, const std::string& symbol) {
  for (const auto& unit : units)
    if (unit.symbol == symbol) return unit.factor;
  return std::nullopt;
}

ParsedQuantity fail(std::string message) { return {std::nullopt, std::move(message)}; }

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
  std::optional<double> factor;
  // A number near the double limit can overflow in the conversion ("1e308 F", "1.7e308 kg").
  const auto checked = [&](double canonical) -> ParsedQuantity {
    if (!std::isfinite(canonical))
      return fail(fmt::format("{} is out of range ({})", quoted, accepted_units(dimension)));
    return {canonical, {}};
  };
  switch (dimension) {
    case Dimension::mass:
      factor = unit.empty() ? 1.0 : factor_for(kMassUnits, unit);
      break;
    case Dimension::volume:
      factor = unit.empty() ? 1.0 : factor_for(kVolumeUnits, unit);
      break;
    case Dimension::time:
      factor = unit.empty() ? 1.0 : factor_for(kTimeUnits, unit);
      break;
    case Dimension::percent:
      factor = unit.empty() ? 1.0 : factor_for(kPercentUnits, unit);
      break;
    case Dimension::oil_content:
      factor = unit.empty() ? 1.0 : factor_for(kOilUnits, unit);
      break;
    case Dimension::number:
      factor = unit.empty() ? std::optional<double>(1.0) : std::nullopt;
      break;
    case Dimension::hop_rate:
      factor = unit.empty() ? 1.0 : factor_for(kHopRateUnits, without_spaces(unit));
      break;
    case Dimension::oil_dose:
      factor = unit.empty() ? 1.0 : factor_for(kOilDoseUnits, without_spaces(unit));
      break;
    case Dimension::temperature:
      if (unit.empty() || unit == "c") return {number, {}};
      if (unit == "f") return checked(fahrenheit_to_celsius(number));
      return not_unit();
    case Dimension::gravity:
      if (unit.empty() || unit == "sg") return {number, {}};
      if (unit == "p" || unit == "plato") {
        if (number < 0.0 || number > 40.0) return fail(fmt::format("{} is outside 0-40 degrees Plato", quoted));
        return {sg_from_plato(number), {}};
      }
      return not_unit();
  }
  if (!factor) return not_unit();
  return checked(number * *factor);
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

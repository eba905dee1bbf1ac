#pragma once
// Quantities with units. Files and options may give a bare number in the field's canonical unit or a
// string with a unit ("28 g", "1.5 oz", "5.5 gal", "176 F", "12.4 P"); both are parsed once, at
// load, into the canonical unit. Canonical units: g, L, C, minutes, %, mL/100 g, specific gravity.
// Conversion factors are exact definitions (NIST Handbook 44, Appendix C):
//   1 oz (avoirdupois) = 28.349523125 g, 1 lb = 453.59237 g,
//   1 US gal = 3.785411784 L, 1 US beer barrel = 31 US gal;
// so 1 oz/gal = 7.48915... g/L and 1 lb/bbl = 3.86535... g/L (derived).
#include <optional>
#include <string>
#include <string_view>

namespace bine {

/// `number` is a plain number without a unit (aroma intensity 0-5, HSI, IBU). `hop_rate` is grams of
/// hops per litre of wort (g/L), `oil_dose` millilitres of hop oil per hectolitre (mL/hL).
enum class Dimension { mass, volume, temperature, time, percent, oil_content, gravity, number, hop_rate, oil_dose };

/// The canonical unit's symbol, for messages and output ("g", "L", "C", "min", "%", "mL/100 g", "SG",
/// "g/L", "mL/hL").
std::string_view canonical_unit(Dimension dimension);
/// The accepted units in words, for "(use ...)" hints in error messages.
std::string_view accepted_units(Dimension dimension);
/// A noun for the dimension ("a mass", "a volume"), for messages.
std::string_view dimension_noun(Dimension dimension);

/// Result of parsing: the value in the canonical unit, or an error text saying what is wrong.
struct ParsedQuantity {
  std::optional<double> value;
  std::string error;  // set when !value
  std::string unit;   // the unit as written, in its usual spelling ("oz", "gal", "F", "P"); empty for a bare number
};

/// Parses "28 g", "1.5oz", "12.4 P", "-2 C" ... into the canonical unit. A bare number ("20") is
/// taken in the canonical unit. Never throws.
ParsedQuantity parse_quantity(std::string_view text, Dimension dimension);

// Exact conversion constants.
inline constexpr double kGramsPerOunce = 28.349523125;
inline constexpr double kGramsPerPound = 453.59237;
inline constexpr double kLitresPerUsGallon = 3.785411784;
inline constexpr double kUsGallonsPerBeerBarrel = 31.0;

double fahrenheit_to_celsius(double fahrenheit);
double celsius_to_fahrenheit(double celsius);

/// Degrees Plato from specific gravity (20/20 C), by the cubic fit of the ASBC extract table
/// as widely published: P = -616.868 + 1111.14 SG - 630.272 SG^2 + 135.997 SG^3.
double plato_from_sg(double specific_gravity);
/// Specific gravity from degrees Plato: the exact inverse of plato_from_sg (Newton iteration),
/// so that a round trip returns the input.
double sg_from_plato(double plato);

/// A canonical value in `unit` (a spelling ParsedQuantity::unit gives: "oz", "gal", "F", "P" ...) with
/// the unit, to 10 significant digits so that reading it back returns the value ("12.4 P", "5.5 gal").
/// An empty or unknown unit writes the canonical unit.
std::string format_in_unit(double canonical, Dimension dimension, std::string_view unit);

/// A hop amount rounded as a brewer weighs it in `unit` (common practice): grams to 0.1 g below 100 g
/// and to 1 g above, kg to 1 g, oz and lb to 0.01. Never rounds a positive amount to zero.
double weighed_grams(double grams, std::string_view unit);

/// Original gravity as the brewer gave it: "12.4 P" when `unit` is "P", else "1.052".
std::string format_gravity(double specific_gravity, std::string_view unit);

/// Unit system used for text output.
enum class UnitSystem { metric, us };

/// Formats a canonical value for a brewer in the chosen unit system, always with its unit:
/// mass 28.3 g / 1.00 oz (kg and lb above 1000 g / 1 lb), volume 20.0 L / 5.28 gal (hL from 1000 L,
/// bbl from one US beer barrel),
/// temperature 80 C / 176 F.
std::string format_mass(double grams, UnitSystem units);
std::string format_volume(double litres, UnitSystem units);
std::string format_temperature(double celsius, UnitSystem units);

}  // namespace bine

#include "report/html_cells.hpp"

#include <fmt/format.h>

#include <cmath>

#include "report/bitterness_report.hpp"
#include "report/catalog_report.hpp"

namespace bine::html {

Cell mass_cell(double grams, UnitSystem units, std::string pointer) {
  // The factors mirror format_mass's choice of unit.
  double scale = 1.0;
  if (units == UnitSystem::us)
    scale = std::abs(grams) / kGramsPerOunce >= 16.0 ? 1.0 / kGramsPerPound : 1.0 / kGramsPerOunce;
  else if (std::abs(grams) >= 1000.0)
    scale = 0.001;
  return Cell(format_mass(grams, units), std::move(pointer), scale);
}

Cell temperature_cell(std::optional<double> celsius, UnitSystem units, std::string pointer) {
  if (!celsius) return Cell("-");
  return Cell(format_temperature(*celsius, units), units == UnitSystem::metric ? std::move(pointer) : "");
}

Cell number_cell(double value, int decimals, std::string_view unit, std::string pointer, double scale) {
  return Cell(fmt::format("{:.{}f}{}", value * scale, decimals, unit), std::move(pointer), scale);
}

Cell ibu_cell(double ibu, const IbuRange* range, const std::string& pointer) {
  if (range == nullptr) return number_cell(ibu, 1, " IBU", pointer);
  return Cell(ibu_figure(ibu, range), pointer + " " + pointer + "_low " + pointer + "_high");
}

}  // namespace bine::html

namespace bine::html {

std::string pointer_token(std::string_view key) {
  std::string out;
  for (char c : key) {
    if (c == '~')
      out += "~0";
    else if (c == '/')
      out += "~1";
    else
      out += c;
  }
  return out;
}

Cell range_cell(const std::optional<Range>& range, std::string_view unit, const std::string& pointer) {
  if (!range) return Cell("n/a");
  if (range->min == range->max) return Cell(range_text(range, unit), pointer + "/0");
  return Cell(range_text(range, unit), pointer + "/0 " + pointer + "/1");
}

std::vector<std::string> boxed(std::vector<std::string> cautions) {
  for (auto& caution : cautions) {
    if (caution.starts_with("Caution: ")) caution.erase(0, 9);
    if (!caution.empty() && caution[0] >= 'a' && caution[0] <= 'z')
      caution[0] = static_cast<char>(caution[0] - 'a' + 'A');
  }
  return cautions;
}

}  // namespace bine::html

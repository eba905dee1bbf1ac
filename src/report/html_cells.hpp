#pragma once
// Table cells for figures with units, each tied to the JSON value it shows (html_table.hpp): a
// mass in g or kg (or oz, lb) carries the factor from the JSON's grams to the number written, so
// the page's numbers can be checked against the --json document of the same run.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/ibu_interval.hpp"
#include "model/hops.hpp"
#include "model/quantity.hpp"
#include "report/html_table.hpp"

namespace bine::html {

/// `grams` as format_mass writes it; `pointer` names the JSON grams.
Cell mass_cell(double grams, UnitSystem units, std::string pointer);
/// `celsius` as format_temperature writes it; tied to the JSON only in metric (F is not a factor).
Cell temperature_cell(std::optional<double> celsius, UnitSystem units, std::string pointer);
/// A plain number written as fmt `{:.Nf}` plus `unit` (" IBU", " %"), times `scale` of the JSON.
Cell number_cell(double value, int decimals, std::string_view unit, std::string pointer, double scale = 1.0);
/// An IBU as ibu_figure writes it ("38.9 IBU (35.0-43.0)"), tied to `pointer` and, with a range, to
/// the pointer's _low and _high values (put_interval).
Cell ibu_cell(double ibu, const IbuRange* range, const std::string& pointer);

}  // namespace bine::html

namespace bine::html {

/// `key` as one JSON pointer token (RFC 6901: "~" as "~0", "/" as "~1").
std::string pointer_token(std::string_view key);
/// A [min, max] range as range_text writes it ("9.0-11.0 %"), tied to both ends in the JSON
/// (pointer/0 and pointer/1); "n/a" without a range.
Cell range_cell(const std::optional<Range>& range, std::string_view unit, const std::string& pointer);
/// Cautions without the "Caution: " the text reports put in front (the page boxes them).
std::vector<std::string> boxed(std::vector<std::string> cautions);

}  // namespace bine::html

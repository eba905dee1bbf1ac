#pragma once
// Small formatting pieces every report shares: rounding for stable JSON, escaping for HTML.
#include <string>
#include <string_view>

namespace bine {

/// `value` rounded to `decimals` places, for stable, readable JSON (never "-0").
double rounded(double value, int decimals);

/// Text made safe inside HTML elements and attribute values.
std::string html_escape(std::string_view text);

}  // namespace bine

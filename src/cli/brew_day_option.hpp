#pragma once
// The --on DATE option shared by age and rebalance: the day the hops are weighed out. Defaults to
// today's date from the system clock, which the output then prints so the run can be repeated.
#include <string>

#include "model/hops.hpp"

namespace bine::cli {

struct BrewDay {
  Date date;
  bool from_clock = false;  // --on was not given
};

/// Parses --on (YYYY-MM-DD), or takes today's UTC date when `text` is empty. Throws InputError
/// "--on: VALUE: ..." for a malformed or impossible date.
BrewDay brew_day_from_option(const std::string& text);

/// Parses a date option; throws InputError "`option`: VALUE: not a date (expected YYYY-MM-DD)".
Date date_from_option(const std::string& option, const std::string& text);

}  // namespace bine::cli

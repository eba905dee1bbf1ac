#include "cli/brew_day_option.hpp"

#include <fmt/format.h>

#include <chrono>

#include "model/errors.hpp"

namespace bine::cli {

Date date_from_option(const std::string& option, const std::string& text) {
  if (auto date = parse_date(text)) return *date;
  throw InputError(fmt::format("{}: \"{}\": not a date (expected YYYY-MM-DD, a day that exists)", option, text));
}

BrewDay brew_day_from_option(const std::string& text) {
  if (text.empty()) return BrewDay{std::chrono::floor<std::chrono::days>(std::chrono::system_clock::now()), true};
  return BrewDay{date_from_option("--on", text), false};
}

}  // namespace bine::cli

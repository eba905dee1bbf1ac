#include "cli/option_values.hpp"

#include <fmt/format.h>

#include <charconv>
#include <chrono>
#include <cmath>
#include <ctime>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine::cli {

// The brewer's calendar date: local time (TZ), not UTC, so at 00:30 in UTC+14 it is already today.
Date today() {
  ::tzset();  // localtime_r need not read TZ itself (POSIX)
  const std::time_t now = std::time(nullptr);
  std::tm local{};
  if (::localtime_r(&now, &local) == nullptr)
    return std::chrono::floor<std::chrono::days>(std::chrono::system_clock::now());
  const std::chrono::year_month_day date{std::chrono::year(local.tm_year + 1900),
                                         std::chrono::month(static_cast<unsigned>(local.tm_mon + 1)),
                                         std::chrono::day(static_cast<unsigned>(local.tm_mday))};
  return std::chrono::sys_days(date);
}

std::optional<double> OptionReader::quantity(std::string_view option, std::string_view text, Dimension dimension,
                                             const Bounds& bounds) {
  const ParsedQuantity parsed = parse_quantity(text, dimension);
  if (!parsed.value) {
    add(fmt::format("{}: {}", option, parsed.error));
    return std::nullopt;
  }
  if (auto problem = bounds_problem(*parsed.value, dimension, bounds)) {
    add(fmt::format("{}: {}", option, *problem));
    return std::nullopt;
  }
  return parsed.value;
}

std::optional<double> OptionReader::optional_quantity(std::string_view option, std::string_view text,
                                                      Dimension dimension, const Bounds& bounds) {
  if (text.empty()) return std::nullopt;
  return quantity(option, text, dimension, bounds);
}

std::optional<std::size_t> OptionReader::count(std::string_view option, std::string_view text, const Bounds& bounds,
                                               std::size_t fallback) {
  if (text.empty()) return fallback;
  const std::string_view trimmed = trim_space(text);
  long long value = 0;
  const auto [end, error] = std::from_chars(trimmed.data(), trimmed.data() + trimmed.size(), value);
  if (error != std::errc() || end != trimmed.data() + trimmed.size() || trimmed.empty()) {
    add(fmt::format("{}: \"{}\" is not a whole number", option, text));
    return std::nullopt;
  }
  if (static_cast<double>(value) < bounds.min || static_cast<double>(value) > bounds.max) {
    add(fmt::format("{}: {} is outside the range for {} (expected {:g}-{:g})", option, value, bounds.what, bounds.min,
                    bounds.max));
    return std::nullopt;
  }
  return static_cast<std::size_t>(value);
}

std::optional<Date> OptionReader::date(std::string_view option, std::string_view text) {
  if (auto parsed = parse_date(text)) return parsed;
  add(fmt::format("{}: \"{}\": not a date (expected YYYY-MM-DD, a day that exists)", option, text));
  return std::nullopt;
}

std::optional<BrewDay> OptionReader::brew_day(std::string_view text) {
  if (text.empty()) return BrewDay{today(), true};
  if (auto parsed = date("--on", text)) return BrewDay{*parsed, false};
  return std::nullopt;
}

void OptionReader::require(bool condition, std::string line) {
  if (!condition) add(std::move(line));
}

void OptionReader::throw_if_any() const {
  if (problems_.empty()) return;
  if (problems_.size() <= kMaxProblemLines) throw InputError(problems_);
  std::vector<std::string> lines(problems_.begin(), problems_.begin() + kMaxProblemLines);
  lines.push_back(more_problems_line("", problems_.size() - kMaxProblemLines));
  throw InputError(std::move(lines));
}

}  // namespace bine::cli

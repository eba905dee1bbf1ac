#include "model/hops.hpp"

#include <fmt/format.h>

#include <charconv>

namespace bine {

std::string_view amount_unit(const Recipe& recipe, const HopAddition& hop) {
  return hop.amount_unit.empty() ? std::string_view(recipe.notation.mass) : std::string_view(hop.amount_unit);
}

std::string_view to_string(Purpose purpose) {
  switch (purpose) {
    case Purpose::aroma:
      return "aroma";
    case Purpose::bittering:
      return "bittering";
    case Purpose::dual:
      return "dual";
  }
  return "";
}
std::string_view to_string(HopForm form) {
  switch (form) {
    case HopForm::pellet:
      return "pellet";
    case HopForm::whole:
      return "whole";
    case HopForm::powder:
      return "powder";
  }
  return "";
}
std::string_view to_string(Package package) {
  switch (package) {
    case Package::vacuum:
      return "vacuum";
    case Package::sealed:
      return "sealed";
    case Package::open:
      return "open";
  }
  return "";
}
std::string_view to_string(HopUse use) {
  switch (use) {
    case HopUse::first_wort:
      return "first-wort";
    case HopUse::boil:
      return "boil";
    case HopUse::whirlpool:
      return "whirlpool";
    case HopUse::dry_hop:
      return "dry-hop";
  }
  return "";
}

std::optional<Purpose> purpose_from(std::string_view text) {
  for (auto value : {Purpose::aroma, Purpose::bittering, Purpose::dual})
    if (to_string(value) == text) return value;
  return std::nullopt;
}
std::optional<HopForm> form_from(std::string_view text) {
  for (auto value : {HopForm::pellet, HopForm::whole, HopForm::powder})
    if (to_string(value) == text) return value;
  return std::nullopt;
}
std::optional<Package> package_from(std::string_view text) {
  for (auto value : {Package::vacuum, Package::sealed, Package::open})
    if (to_string(value) == text) return value;
  return std::nullopt;
}
std::optional<HopUse> use_from(std::string_view text) {
  for (auto value : {HopUse::first_wort, HopUse::boil, HopUse::whirlpool, HopUse::dry_hop})
    if (to_string(value) == text) return value;
  return std::nullopt;
}

std::optional<Date> parse_date(std::string_view text) {
  if (text.size() != 10 || text[4] != '-' || text[7] != '-') return std::nullopt;
  int y = 0;
  unsigned m = 0;
  unsigned d = 0;
  auto read = [&](std::size_t at, std::size_t len, auto& out) {
    const char* first = text.data() + at;
    auto [ptr, ec] = std::from_chars(first, first + len, out);
    return ec == std::errc() && ptr == first + len;
  };
  if (!read(0, 4, y) || !read(5, 2, m) || !read(8, 2, d)) return std::nullopt;
  const std::chrono::year_month_day ymd{std::chrono::year{y}, std::chrono::month{m}, std::chrono::day{d}};
  if (!ymd.ok()) return std::nullopt;
  return std::chrono::sys_days{ymd};
}

std::string format_date(Date date) {
  const std::chrono::year_month_day ymd{date};
  return fmt::format("{:04}-{:02}-{:02}", static_cast<int>(ymd.year()), static_cast<unsigned>(ymd.month()),
                     static_cast<unsigned>(ymd.day()));
}

}  // namespace bine

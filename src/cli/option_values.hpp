#pragma once
// The one place where command-line strings become values: quantities with units, whole numbers,
// dates and the brew day, each checked against the bounds in io/limits.hpp. Every problem is
// collected as "OPTION: what is wrong (what is expected)" so a command reports them all at once.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "io/json_fields.hpp"
#include "model/hops.hpp"
#include "model/quantity.hpp"

namespace bine::cli {

/// The day the hops are weighed out (--on), or today's date when the option was not given.
struct BrewDay {
  Date date;
  bool from_clock = false;  // --on not given: the output says so, so the run can be repeated
};

/// Today's local calendar date (the TZ of the brewer's machine, not UTC).
Date today();

class OptionReader {
 public:
  /// A quantity with a unit ("20L", "5.5 gal", "6 g/L"); a bare number is in the canonical unit.
  std::optional<double> quantity(std::string_view option, std::string_view text, Dimension dimension,
                                 const Bounds& bounds);
  /// As quantity(), but an empty `text` (option not given) is no problem and gives nullopt.
  std::optional<double> optional_quantity(std::string_view option, std::string_view text, Dimension dimension,
                                          const Bounds& bounds);
  /// A whole number within bounds ("--top 5"); an empty `text` gives `fallback`.
  std::optional<std::size_t> count(std::string_view option, std::string_view text, const Bounds& bounds,
                                   std::size_t fallback);
  /// A date, YYYY-MM-DD, that exists.
  std::optional<Date> date(std::string_view option, std::string_view text);
  /// --on: a date, or today when `text` is empty.
  std::optional<BrewDay> brew_day(std::string_view text);

  /// A problem found by the command itself.
  void add(std::string line) { problems_.push_back(std::move(line)); }
  /// Adds `line` when `condition` does not hold.
  void require(bool condition, std::string line);
  bool ok() const { return problems_.empty(); }
  /// Throws InputError listing every problem, if there is any.
  void throw_if_any() const;

 private:
  std::vector<std::string> problems_;
};

}  // namespace bine::cli

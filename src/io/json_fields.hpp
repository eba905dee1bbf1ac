#pragma once
// Reading our JSON files field by field while collecting every problem with its JSON pointer.
// Loaders describe each object with a FieldReader: which keys exist, which are required, their
// dimension and hard bounds. Nothing here throws on bad data; problems go to Diagnostics.
#include <initializer_list>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "io/json_guard.hpp"
#include "model/errors.hpp"
#include "model/hops.hpp"
#include "model/quantity.hpp"

namespace bine {

/// Hard bounds for a numeric field, in the canonical unit, with a few words saying what it is.
struct Bounds {
  double min;
  double max;
  std::string_view what;       // "alpha acid", "batch volume" ...
  bool min_exclusive = false;  // true: the value must be > min (amounts, volumes)
};

/// Parses JSON text through JsonGuard; on failure reports "not valid JSON at line L, column C (...)"
/// and returns nullopt. Rejects NaN/Infinity (not JSON), numbers too large for a double, nesting
/// deeper than kMaxJsonDepth, a key given twice in one object and an array longer than its limit
/// (kJsonArrayLimits, kMaxJsonArrayElements), each while parsing.
std::optional<nlohmann::json> parse_json_text(std::string_view text, Diagnostics& diagnostics);

/// A short printable form of a JSON value for messages (strings quoted, long values cut).
std::string brief(const nlohmann::json& value);

class FieldReader {
 public:
  /// Reports "must be an object" when `value` is not one; every read then returns nullopt.
  FieldReader(const nlohmann::json& value, std::string pointer, Diagnostics& diagnostics);

  bool ok() const { return object_ != nullptr; }
  const std::string& pointer() const { return pointer_; }
  std::string at(std::string_view key) const { return pointer_join(pointer_, key); }
  bool has(std::string_view key) const;
  const nlohmann::json* raw(std::string_view key) const;

  /// Reports keys not in `known` ("unknown key; expected one of ..." with a did-you-mean).
  void allow_only(std::initializer_list<std::string_view> known);

  std::optional<std::string> text(std::string_view key, bool required);
  /// A name (variety, lot, axis): text without control characters (model/names.hpp name_problem).
  std::optional<std::string> name(std::string_view key, bool required);
  std::optional<bool> boolean(std::string_view key, bool required);
  /// A number in the canonical unit or a string with a unit, checked against bounds.
  std::optional<double> quantity(std::string_view key, Dimension dimension, const Bounds& bounds, bool required);
  /// A [min, max] pair of numbers in the canonical unit, each within bounds, min <= max.
  std::optional<Range> range(std::string_view key, Dimension dimension, const Bounds& bounds, bool required);
  std::optional<Date> date(std::string_view key, bool required);

  Diagnostics& diagnostics() { return diagnostics_; }

 private:
  void missing(std::string_view key);

  const nlohmann::json* object_ = nullptr;
  std::string pointer_;
  Diagnostics& diagnostics_;
};

/// Checks one value in the canonical unit against bounds; reports and returns false when outside.
/// For percentages, a value that would fit when multiplied by 100 is called out as a fraction.
bool check_bounds(double value, Dimension dimension, const Bounds& bounds, const std::string& pointer,
                  Diagnostics& diagnostics);

/// The problem with a value outside bounds ("25% is outside the range for alpha acid (expected
/// 0.5-22%)", or "0.12 looks like a fraction ..."), or nullopt when it is within them.
std::optional<std::string> bounds_problem(double value, Dimension dimension, const Bounds& bounds);

/// Reads a quantity from a JSON number or string, then checks bounds. `what` is the value's
/// pointer for messages.
std::optional<double> read_quantity(const nlohmann::json& value, Dimension dimension, const Bounds& bounds,
                                    const std::string& pointer, Diagnostics& diagnostics);

}  // namespace bine

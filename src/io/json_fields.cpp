#include "io/json_fields.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "model/names.hpp"

namespace bine {
namespace {

std::string number_text(double value) {
  std::string text = fmt::format("{:.6g}", value);
  return text;
}

std::string bounds_text(const Bounds& bounds, Dimension dimension) {
  const auto unit = canonical_unit(dimension);
  const std::string spacer = (unit == "%" || unit.empty()) ? "" : " ";
  if (bounds.min_exclusive && bounds.max >= 1e300)
    return fmt::format("more than {}{}{}", number_text(bounds.min), spacer, unit);
  if (bounds.max >= 1e300) return fmt::format("at least {}{}{}", number_text(bounds.min), spacer, unit);
  if (bounds.min_exclusive)
    return fmt::format("more than {} and at most {}{}{}", number_text(bounds.min), number_text(bounds.max), spacer,
                       unit);
  // "-40 to 40 C" reads better than "-40-40 C".
  const char* dash = bounds.min < 0.0 ? " to " : "-";
  return fmt::format("{}{}{}{}{}", number_text(bounds.min), dash, number_text(bounds.max), spacer, unit);
}

std::string value_with_unit(double value, Dimension dimension) {
  const auto unit = canonical_unit(dimension);
  return number_text(value) + (unit == "%" || unit.empty() ? "" : " ") + std::string(unit);
}

std::string type_name(const nlohmann::json& value) {
  switch (value.type()) {
    case nlohmann::json::value_t::null:
      return "null";
    case nlohmann::json::value_t::object:
      return "an object";
    case nlohmann::json::value_t::array:
      return "an array";
    case nlohmann::json::value_t::string:
      return "a string";
    case nlohmann::json::value_t::boolean:
      return "true/false";
    default:
      return "a number";
  }
}

void report_guard_stop(std::string_view text, const JsonGuardStop& stop, Diagnostics& diagnostics) {
  switch (stop.kind) {
    case JsonGuardStop::Kind::too_deep: {
      const TextPosition at = position_of_depth(text, kMaxJsonDepth + 1);
      diagnostics.add_file(
          fmt::format("nested deeper than {} levels at line {}, column {} (bine files need fewer than 10)",
                      kMaxJsonDepth, at.line, at.column));
      break;
    }
    case JsonGuardStop::Kind::duplicate_key:
      diagnostics.add(stop.pointer, fmt::format("the key {} appears twice in this object (keep one)",
                                                brief(nlohmann::json(stop.key))));
      break;
    case JsonGuardStop::Kind::too_many:
      diagnostics.add(stop.pointer, stop.noun.empty()
                                        ? fmt::format("more than {} elements (an array here holds at most {})",
                                                      grouped(stop.max), grouped(stop.max))
                                        : fmt::format("more than {} {} (one file holds at most {})", grouped(stop.max),
                                                      stop.noun, grouped(stop.max)));
      break;
    case JsonGuardStop::Kind::not_finite:
    case JsonGuardStop::Kind::none:
      diagnostics.add_file("a number is too large to represent (keep values in their usual ranges)");
      break;
  }
}

}  // namespace

TextPosition position_of_depth(std::string_view text, std::size_t depth) {
  TextPosition at;
  std::size_t level = 0;
  bool in_string = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (in_string) {
      if (c == '\\')
        ++i, ++at.column;
      else if (c == '"')
        in_string = false;
    } else if (c == '"') {
      in_string = true;
    } else if (c == '[' || c == '{') {
      if (++level >= depth) return at;
    } else if (c == ']' || c == '}') {
      if (level > 0) --level;
    } else if (c == '\n') {
      ++at.line;
      at.column = 0;
    }
    ++at.column;
  }
  return at;
}

std::optional<nlohmann::json> parse_json_text(std::string_view text, Diagnostics& diagnostics) {
  try {
    nlohmann::json value;
    nlohmann::detail::json_sax_dom_parser<nlohmann::json> builder(value, true);
    JsonGuard guard(builder);
    if (nlohmann::json::sax_parse(text.begin(), text.end(), &guard)) return value;
    report_guard_stop(text, guard.stop(), diagnostics);
    return std::nullopt;
  } catch (const nlohmann::json::out_of_range&) {
    diagnostics.add_file("a number is too large to represent (keep values in their usual ranges)");
    return std::nullopt;
  } catch (const nlohmann::json::parse_error& error) {
    // Translate the byte offset into line and column; drop the library's own wording.
    const std::size_t offset = std::min<std::size_t>(error.byte == 0 ? 0 : error.byte - 1, text.size());
    std::size_t line = 1;
    std::size_t column = 1;
    for (std::size_t i = 0; i < offset; ++i) {
      if (text[i] == '\n') {
        ++line;
        column = 1;
      } else {
        ++column;
      }
    }
    std::string why = "check for a missing comma, quote or bracket";
    const std::string library_text = error.what();
    const std::string_view rest = text.substr(offset);
    const auto starts = [&](std::string_view word) { return rest.substr(0, word.size()) == word; };
    if (library_text.find("UTF-8") != std::string::npos)
      why = "the text is not valid UTF-8";
    else if (starts("NaN") || starts("nan") || starts("Infinity") || starts("-Infinity") || starts("inf"))
      why = "NaN and Infinity are not numbers in JSON; give a finite number";
    else if (offset >= text.size())
      why = "the file ends too early";
    if (text.empty() || text.find_first_not_of(" \t\r\n") == std::string_view::npos) {
      diagnostics.add_file("the file is empty (expected a JSON document)");
    } else {
      diagnostics.add_file(fmt::format("not valid JSON at line {}, column {} ({})", line, column, why));
    }
    return std::nullopt;
  }
}

std::string pointer_join(const std::string& pointer, std::string_view key) {
  std::string out = pointer + "/";
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

std::string brief(const nlohmann::json& value) {
  const std::string text = value.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
  const std::string_view kept = first_characters(text, 40);
  return kept.size() == text.size() ? text : std::string(first_characters(text, 37)) + "...";
}

FieldReader::FieldReader(const nlohmann::json& value, std::string pointer, Diagnostics& diagnostics)
    : pointer_(std::move(pointer)), diagnostics_(diagnostics) {
  if (value.is_object()) {
    object_ = &value;
  } else {
    diagnostics_.add(pointer_, fmt::format("is {} (expected an object)", type_name(value)));
  }
}

bool FieldReader::has(std::string_view key) const {
  const nlohmann::json* value = raw(key);
  return value != nullptr && !value->is_null();
}

const nlohmann::json* FieldReader::raw(std::string_view key) const {
  if (object_ == nullptr) return nullptr;
  auto it = object_->find(key);
  if (it == object_->end()) return nullptr;
  return &*it;
}

void FieldReader::allow_only(std::initializer_list<std::string_view> known) {
  if (object_ == nullptr) return;
  std::vector<std::string> names(known.begin(), known.end());
  for (const auto& [key, value] : object_->items()) {
    if (std::find(names.begin(), names.end(), key) != names.end()) continue;
    std::string hint = did_you_mean(key, names);
    if (hint.empty()) {
      hint = "expected one of ";
      for (std::size_t i = 0; i < names.size(); ++i) hint += (i ? ", " : "") + names[i];
    }
    diagnostics_.add(at(key), fmt::format("unknown key \"{}\" ({})", key, hint));
  }
}

void FieldReader::missing(std::string_view key) { diagnostics_.add(at(key), "is missing (required)"); }

std::optional<std::string> FieldReader::text(std::string_view key, bool required) {
  const auto* value = raw(key);
  if (value == nullptr || value->is_null()) {
    if (required && object_ != nullptr) missing(key);
    return std::nullopt;
  }
  if (!value->is_string()) {
    diagnostics_.add(at(key), fmt::format("{} is {} (expected a string)", brief(*value), type_name(*value)));
    return std::nullopt;
  }
  auto result = value->get<std::string>();
  if (required && result.find_first_not_of(" \t") == std::string::npos) {
    diagnostics_.add(at(key), "is empty (expected a name)");
    return std::nullopt;
  }
  return result;
}

std::optional<std::string> FieldReader::name(std::string_view key, bool required) {
  auto result = text(key, required);
  if (!result) return result;
  if (auto problem = name_problem(*result)) {
    diagnostics_.add(at(key), fmt::format("{} {}", brief(nlohmann::json(*result)), *problem));
    return std::nullopt;
  }
  return result;
}

std::optional<bool> FieldReader::boolean(std::string_view key, bool required) {
  const auto* value = raw(key);
  if (value == nullptr || value->is_null()) {
    if (required && object_ != nullptr) missing(key);
    return std::nullopt;
  }
  if (!value->is_boolean()) {
    diagnostics_.add(at(key), fmt::format("{} is {} (expected true or false)", brief(*value), type_name(*value)));
    return std::nullopt;
  }
  return value->get<bool>();
}

std::optional<std::string> bounds_problem(double value, Dimension dimension, const Bounds& bounds) {
  const bool below = bounds.min_exclusive ? value <= bounds.min : value < bounds.min;
  if (!below && value <= bounds.max) return std::nullopt;
  if (dimension == Dimension::percent && value > 0.0 && value < 1.0 && value * 100.0 >= bounds.min &&
      value * 100.0 <= bounds.max) {
    return fmt::format("{} looks like a fraction; {} is in % (write {} for {} %)", number_text(value), bounds.what,
                       number_text(value * 100.0), number_text(value * 100.0));
  }
  return fmt::format("{} is outside the range for {} (expected {})", value_with_unit(value, dimension), bounds.what,
                     bounds_text(bounds, dimension));
}

bool check_bounds(double value, Dimension dimension, const Bounds& bounds, const std::string& pointer,
                  Diagnostics& diagnostics) {
  auto problem = bounds_problem(value, dimension, bounds);
  if (problem) diagnostics.add(pointer, *problem);
  return !problem;
}

std::optional<double> read_quantity(const nlohmann::json& value, Dimension dimension, const Bounds& bounds,
                                    const std::string& pointer, Diagnostics& diagnostics) {
  double number = 0.0;
  if (value.is_number()) {
    number = value.get<double>();
  } else if (value.is_string()) {
    const auto parsed = parse_quantity(value.get<std::string>(), dimension);
    if (!parsed.value) {
      diagnostics.add(pointer, parsed.error);
      return std::nullopt;
    }
    number = *parsed.value;
  } else {
    diagnostics.add(pointer, fmt::format("{} is {} (expected {}: a number in {} or a string with a unit; {})",
                                         brief(value), type_name(value), dimension_noun(dimension),
                                         canonical_unit(dimension), accepted_units(dimension)));
    return std::nullopt;
  }
  if (!std::isfinite(number)) {
    diagnostics.add(pointer, fmt::format("{} is not a finite number", brief(value)));
    return std::nullopt;
  }
  if (!check_bounds(number, dimension, bounds, pointer, diagnostics)) return std::nullopt;
  return number;
}

std::optional<double> FieldReader::quantity(std::string_view key, Dimension dimension, const Bounds& bounds,
                                            bool required) {
  const auto* value = raw(key);
  if (value == nullptr || value->is_null()) {
    if (required && object_ != nullptr) missing(key);
    return std::nullopt;
  }
  return read_quantity(*value, dimension, bounds, at(key), diagnostics_);
}

std::optional<Range> FieldReader::range(std::string_view key, Dimension dimension, const Bounds& bounds,
                                        bool required) {
  const auto* value = raw(key);
  if (value == nullptr || value->is_null()) {
    if (required && object_ != nullptr) missing(key);
    return std::nullopt;
  }
  // A single number is accepted as a range of one value.
  if (value->is_number() || value->is_string()) {
    auto single = read_quantity(*value, dimension, bounds, at(key), diagnostics_);
    if (!single) return std::nullopt;
    return Range{*single, *single};
  }
  if (!value->is_array() || value->size() != 2) {
    diagnostics_.add(at(key), fmt::format("{} is not a range (expected [min, max] in {})", brief(*value),
                                          canonical_unit(dimension)));
    return std::nullopt;
  }
  const auto low = read_quantity((*value)[0], dimension, bounds, at(key) + "/0", diagnostics_);
  const auto high = read_quantity((*value)[1], dimension, bounds, at(key) + "/1", diagnostics_);
  if (!low || !high) return std::nullopt;
  if (*low > *high) {
    diagnostics_.add(at(key), fmt::format("min {} is greater than max {} (expected [min, max])", number_text(*low),
                                          number_text(*high)));
    return std::nullopt;
  }
  return Range{*low, *high};
}

std::optional<Date> FieldReader::date(std::string_view key, bool required) {
  auto value = text(key, required);
  if (!value) return std::nullopt;
  auto parsed = parse_date(*value);
  if (!parsed) {
    diagnostics_.add(at(key), fmt::format("\"{}\" is not a date that exists (expected YYYY-MM-DD)", *value));
    return std::nullopt;
  }
  return parsed;
}

}  // namespace bine

// brewhouse.json, read and written (docs/methods.md#brewhouse-profile).
#include "io/brewhouse_profile.hpp"

#include <fmt/format.h>

#include "io/file_io.hpp"
#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "model/errors.hpp"

namespace bine {
namespace {

using nlohmann::json;

constexpr int kFormatVersion = 1;

json factor_json(const FittedFactor& factor) {
  return {{"value", factor.value},
          {"standard_error", factor.standard_error},
          {"low_95", factor.low},
          {"high_95", factor.high},
          {"degrees_of_freedom", factor.degrees_of_freedom}};
}

std::optional<FittedFactor> read_factor(FieldReader& top, std::string_view key, bool required,
                                        Diagnostics& diagnostics) {
  const json* raw = top.raw(key);
  if (raw == nullptr || raw->is_null()) {
    if (required) diagnostics.add(top.at(key), "is missing (required)");
    return std::nullopt;
  }
  FieldReader reader(*raw, top.at(key), diagnostics);
  reader.allow_only({"value", "standard_error", "low_95", "high_95", "degrees_of_freedom"});
  FittedFactor factor;
  factor.value = reader.quantity("value", Dimension::number, limits::calibration, true).value_or(1.0);
  factor.standard_error =
      reader.quantity("standard_error", Dimension::number, limits::factor_standard_error, true).value_or(0.0);
  factor.low = reader.quantity("low_95", Dimension::number, limits::factor_bound, true).value_or(factor.value);
  factor.high = reader.quantity("high_95", Dimension::number, limits::factor_bound, true).value_or(factor.value);
  factor.degrees_of_freedom = static_cast<int>(
      reader.quantity("degrees_of_freedom", Dimension::number, limits::degrees_of_freedom, true).value_or(1.0));
  if (factor.low > factor.value || factor.high < factor.value)
    diagnostics.add(top.at(key), fmt::format("the interval {:g}-{:g} does not contain the factor {:g}", factor.low,
                                             factor.high, factor.value));
  return factor;
}

std::vector<std::string> read_names(FieldReader& top, std::string_view key, Diagnostics& diagnostics) {
  std::vector<std::string> names;
  const json* raw = top.raw(key);
  if (raw == nullptr || raw->is_null()) return names;
  if (!raw->is_array()) {
    diagnostics.add(top.at(key), "is not an array (expected a list of batch names)");
    return names;
  }
  for (std::size_t i = 0; i < raw->size(); ++i) {
    if ((*raw)[i].is_string())
      names.push_back((*raw)[i].get<std::string>());
    else
      diagnostics.add(top.at(key) + "/" + std::to_string(i), "is not a string (expected a batch name)");
  }
  return names;
}

}  // namespace

json brewhouse_profile_to_json(const BrewhouseProfile& profile) {
  json out;
  out["bine_brewhouse"] = kFormatVersion;
  out["model"] = profile.model;
  out["pellet_factor"] = profile.pellet_factor;
  out["factor"] = factor_json(profile.factor);
  if (profile.boil_factor && profile.late_factor) {
    out["boil_factor"] = factor_json(*profile.boil_factor);
    out["late_factor"] = factor_json(*profile.late_factor);
  }
  out["date"] = format_date(profile.made);
  out["batches_used"] = profile.batches_used;
  out["batches_left_out"] = profile.batches_left_out;
  return out;
}

BrewhouseProfile parse_brewhouse_profile(std::string_view text, const std::string& file) {
  Diagnostics diagnostics(file);
  const auto document = parse_json_text(text, diagnostics);
  diagnostics.throw_if_any();
  FieldReader top(*document, "", diagnostics);
  top.allow_only({"bine_brewhouse", "model", "pellet_factor", "factor", "boil_factor", "late_factor", "date",
                  "batches_used", "batches_left_out", "notes"});
  BrewhouseProfile profile;
  profile.source_file = file;
  if (const auto version = top.quantity("bine_brewhouse", Dimension::number, limits::profile_version, true);
      version && *version != kFormatVersion)
    diagnostics.add("/bine_brewhouse", fmt::format("{:g} is not a version this bine reads (expected 1)", *version));
  profile.model = top.text("model", true).value_or("tinseth");
  if (profile.model != "tinseth" && profile.model != "rager")
    diagnostics.add("/model", fmt::format("\"{}\" is not a model (expected tinseth or rager)", profile.model));
  profile.pellet_factor = top.quantity("pellet_factor", Dimension::number, limits::pellet_factor, true).value_or(1.10);
  profile.factor = read_factor(top, "factor", true, diagnostics).value_or(FittedFactor{});
  profile.boil_factor = read_factor(top, "boil_factor", false, diagnostics);
  profile.late_factor = read_factor(top, "late_factor", false, diagnostics);
  if (profile.boil_factor.has_value() != profile.late_factor.has_value())
    diagnostics.add(profile.boil_factor ? "/late_factor" : "/boil_factor",
                    "is missing (a split profile gives both boil_factor and late_factor)");
  profile.made = top.date("date", true).value_or(Date{});
  profile.batches_used = read_names(top, "batches_used", diagnostics);
  profile.batches_left_out = read_names(top, "batches_left_out", diagnostics);
  diagnostics.throw_if_any();
  return profile;
}

BrewhouseProfile load_brewhouse_profile(const std::filesystem::path& path) {
  return parse_brewhouse_profile(read_text_file(path), path.string());
}

void write_brewhouse_profile(const std::filesystem::path& path, const BrewhouseProfile& profile) {
  write_loadable_file(path, brewhouse_profile_to_json(profile).dump(2) + "\n");
}

}  // namespace bine

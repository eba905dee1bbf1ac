#include "io/loaders.hpp"

#include <fmt/format.h>

#include <cmath>
#include <fstream>
#include <map>
#include <set>

#include "io/file_io.hpp"
#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

using nlohmann::json;

json parse_or_throw(std::string_view text, Diagnostics& diagnostics) {
  auto document = parse_json_text(text, diagnostics);
  diagnostics.throw_if_any();
  return std::move(*document);
}

// Reads an array at `key`, calling `each(element, pointer)`.
template <typename Each>
void for_each_in_array(FieldReader& reader, std::string_view key, bool required, Each each) {
  const json* value = reader.raw(key);
  if (value == nullptr || value->is_null()) {
    if (required && reader.ok()) reader.diagnostics().add(reader.at(key), "is missing (required)");
    return;
  }
  if (!value->is_array()) {
    reader.diagnostics().add(reader.at(key), fmt::format("{} is not an array (expected [ ... ])", brief(*value)));
    return;
  }
  for (std::size_t i = 0; i < value->size(); ++i) each((*value)[i], reader.at(key) + "/" + std::to_string(i));
}

template <typename Enum, typename From>
std::optional<Enum> read_enum(FieldReader& reader, std::string_view key, bool required, From from,
                              std::string_view choices) {
  auto value = reader.text(key, required);
  if (!value) return std::nullopt;
  auto parsed = from(*value);
  if (!parsed) reader.diagnostics().add(reader.at(key), fmt::format("\"{}\" is not one of {}", *value, choices));
  return parsed;
}

// ---------------------------------------------------------------------------------------------
// Lexicon

Lexicon lexicon_from(const json& document, Diagnostics& diagnostics) {
  FieldReader top(document, "", diagnostics);
  top.allow_only({"lexicon", "axes", "compounds"});
  std::vector<AromaAxis> axes;
  std::set<std::string> seen_axes;
  std::set<std::string> seen_tags;
  for_each_in_array(top, "axes", true, [&](const json& element, const std::string& pointer) {
    FieldReader reader(element, pointer, diagnostics);
    reader.allow_only({"name", "description", "tags"});
    AromaAxis axis;
    axis.name = reader.name("name", true).value_or("");
    axis.description = reader.text("description", false).value_or("");
    if (!axis.name.empty() && !seen_axes.insert(fold_name(axis.name)).second)
      diagnostics.add(reader.at("name"), fmt::format("axis \"{}\" appears twice", axis.name));
    for_each_in_array(reader, "tags", false, [&](const json& tag, const std::string& tag_pointer) {
      if (!tag.is_string()) {
        diagnostics.add(tag_pointer, fmt::format("{} is not a string (expected a tag)", brief(tag)));
        return;
      }
      const auto text = tag.get<std::string>();
      if (!seen_tags.insert(fold_name(text)).second)
        diagnostics.add(tag_pointer, fmt::format("tag \"{}\" maps onto more than one axis", text));
      axis.tags.push_back(text);
    });
    axes.push_back(std::move(axis));
  });
  std::vector<CompoundAssociation> compounds;
  for_each_in_array(top, "compounds", false, [&](const json& element, const std::string& pointer) {
    FieldReader reader(element, pointer, diagnostics);
    reader.allow_only({"name", "axes", "source", "note"});
    CompoundAssociation compound;
    compound.compound = reader.name("name", true).value_or("");
    compound.source = reader.text("source", true).value_or("");
    if (const json* weights = reader.raw("axes"); weights != nullptr) {
      FieldReader weights_reader(*weights, reader.at("axes"), diagnostics);
      if (weights_reader.ok()) {
        for (const auto& [axis, weight] : weights->items()) {
          if (!seen_axes.count(fold_name(axis))) {
            diagnostics.add(weights_reader.at(axis), fmt::format("\"{}\" is not an axis of this lexicon", axis));
            continue;
          }
          if (auto w = read_quantity(weight, Dimension::number, Bounds{0.0, 1.0, "a compound weight"},
                                     weights_reader.at(axis), diagnostics))
            compound.axes[axis] = *w;
        }
      }
    }
    compounds.push_back(std::move(compound));
  });
  if (axes.empty() && diagnostics.empty()) diagnostics.add("/axes", "is empty (expected at least one aroma axis)");
  return Lexicon(std::move(axes), std::move(compounds));
}

// ---------------------------------------------------------------------------------------------
// Catalog

Variety variety_from(const json& element, const std::string& pointer, const Lexicon& lexicon,
                     Diagnostics& diagnostics) {
  FieldReader reader(element, pointer, diagnostics);
  reader.allow_only({"name", "origin", "purpose", "alpha_acid", "beta_acid", "cohumulone", "total_oil", "oils",
                     "stability", "aroma", "tags", "notes"});
  Variety variety;
  variety.name = reader.name("name", true).value_or("");
  variety.origin = reader.text("origin", false).value_or("");
  variety.purpose = read_enum<Purpose>(reader, "purpose", false, purpose_from, "aroma, bittering or dual");
  variety.alpha_acid = reader.range("alpha_acid", Dimension::percent, limits::alpha_acid, false);
  variety.beta_acid = reader.range("beta_acid", Dimension::percent, limits::beta_acid, false);
  variety.cohumulone = reader.range("cohumulone", Dimension::percent, limits::cohumulone, false);
  variety.total_oil = reader.range("total_oil", Dimension::oil_content, limits::total_oil, false);
  variety.stability = reader.quantity("stability", Dimension::percent, limits::stability, false);
  if (const json* oils = reader.raw("oils"); oils != nullptr && !oils->is_null()) {
    FieldReader oil_reader(*oils, reader.at("oils"), diagnostics);
    if (oil_reader.ok()) {
      double sum_of_minimums = 0.0;
      for (const auto& [compound, value] : oils->items()) {
        const auto& known = oil_compounds();
        if (std::find(known.begin(), known.end(), compound) == known.end()) {
          std::string hint = did_you_mean(compound, known);
          diagnostics.add(oil_reader.at(compound),
                          fmt::format("unknown oil compound \"{}\" ({})", compound,
                                      hint.empty() ? "expected myrcene, humulene, caryophyllene, farnesene, "
                                                     "linalool or geraniol"
                                                   : hint));
          continue;
        }
        if (auto range = oil_reader.range(compound, Dimension::percent, limits::oil_fraction, false)) {
          variety.oils[compound] = *range;
          sum_of_minimums += range->min;
        }
      }
      if (sum_of_minimums > 100.0 + 1e-9)
        diagnostics.add(reader.at("oils"), fmt::format("oil fractions sum to {:.1f} % at their minimums "
                                                       "(expected at most 100 % of total oil)",
                                                       sum_of_minimums));
    }
  }
  if (const json* aroma = reader.raw("aroma"); aroma != nullptr && !aroma->is_null()) {
    FieldReader aroma_reader(*aroma, reader.at("aroma"), diagnostics);
    if (aroma_reader.ok()) {
      std::map<std::string, double> intensities;
      for (const auto& [axis, value] : aroma->items()) {
        const auto index = lexicon.axis_index(axis);
        if (!index) {
          std::string hint = did_you_mean(axis, lexicon.axis_names());
          diagnostics.add(aroma_reader.at(axis), fmt::format("unknown aroma axis \"{}\" ({})", axis,
                                                             hint.empty() ? "see the axes in lexicon.json" : hint));
          continue;
        }
        if (auto v =
                read_quantity(value, Dimension::number, limits::aroma_intensity, aroma_reader.at(axis), diagnostics))
          intensities[lexicon.axes()[*index].name] = *v;
      }
      variety.aroma = std::move(intensities);
    }
  }
  for_each_in_array(reader, "tags", false, [&](const json& tag, const std::string& tag_pointer) {
    if (!tag.is_string()) {
      diagnostics.add(tag_pointer, fmt::format("{} is not a string (expected a descriptor)", brief(tag)));
      return;
    }
    variety.tags.push_back(tag.get<std::string>());
  });
  return variety;
}

/// The top level of a catalog file but its varieties: allowed keys, the "catalog" block.
void catalog_meta(FieldReader& top, const std::string& file, Diagnostics& diagnostics, Catalog& catalog) {
  top.allow_only({"catalog", "varieties"});
  std::string name = file;
  if (const json* meta = top.raw("catalog"); meta != nullptr) {
    FieldReader meta_reader(*meta, "/catalog", diagnostics);
    meta_reader.allow_only({"name", "demo", "source"});
    name = meta_reader.text("name", false).value_or(file);
    catalog.demo = meta_reader.boolean("demo", false).value_or(false);
    meta_reader.text("source", false);
  }
  catalog.names.push_back(name);
}

/// One element of "varieties": checked, and added unless its name is empty or already defined.
void add_variety(const json& element, const std::string& pointer, const std::string& file, const Lexicon& lexicon,
                 Diagnostics& diagnostics, Catalog& catalog, std::map<std::string, std::string>& seen) {
  Variety variety = variety_from(element, pointer, lexicon, diagnostics);
  if (variety.name.empty()) return;
  auto [it, inserted] = seen.emplace(fold_name(variety.name), pointer);
  if (!inserted) {
    diagnostics.add(pointer + "/name",
                    fmt::format("variety \"{}\" is already defined at {}", variety.name, it->second));
    return;
  }
  variety.source_file = file;
  if (diagnostics.empty()) catalog.varieties.push_back(std::move(variety));  // else the file is refused
}

Catalog catalog_from(const json& document, const std::string& file, const Lexicon& lexicon, Diagnostics& diagnostics) {
  Catalog catalog;
  FieldReader top(document, "", diagnostics);
  catalog_meta(top, file, diagnostics, catalog);
  std::map<std::string, std::string> seen;  // folded name -> pointer
  for_each_in_array(top, "varieties", true, [&](const json& element, const std::string& pointer) {
    add_variety(element, pointer, file, lexicon, diagnostics, catalog, seen);
  });
  if (catalog.varieties.empty() && diagnostics.empty())
    diagnostics.add("/varieties", "is empty (expected at least one variety)");
  index_variety_names(catalog);
  return catalog;
}

// ---------------------------------------------------------------------------------------------
// Stock

// A lot's "rub_test": {"scored": DATE, "scores": {"citrus": 4, ...}}. The axis names are checked
// against the lexicon where the scores are used (engine/aroma_profile lot_aroma), as the stock file
// is read without one.
std::optional<RubTest> read_rub_test(FieldReader& reader, Diagnostics& diagnostics) {
  const json* raw = reader.raw("rub_test");
  if (raw == nullptr || raw->is_null()) return std::nullopt;
  FieldReader test_reader(*raw, reader.at("rub_test"), diagnostics);
  if (!test_reader.ok()) return std::nullopt;
  test_reader.allow_only({"scored", "scores", "notes"});
  RubTest test;
  const auto scored = test_reader.date("scored", true);
  test_reader.text("notes", false);
  const json* scores = test_reader.raw("scores");
  if (scores == nullptr || scores->is_null()) {
    diagnostics.add(test_reader.at("scores"), "is missing (expected 0-5 per aroma axis, e.g. {\"citrus\": 4})");
    return std::nullopt;
  }
  FieldReader scores_reader(*scores, test_reader.at("scores"), diagnostics);
  if (!scores_reader.ok()) return std::nullopt;
  bool whole = scored.has_value();
  for (const auto& [axis, value] : scores->items()) {
    const auto score =
        read_quantity(value, Dimension::number, limits::aroma_intensity, scores_reader.at(axis), diagnostics);
    if (score)
      test.scores.emplace_back(axis, *score);
    else
      whole = false;
  }
  if (whole && test.scores.empty())
    diagnostics.add(test_reader.at("scores"), "is empty (expected 0-5 per aroma axis, e.g. {\"citrus\": 4})");
  if (!whole || test.scores.empty()) return std::nullopt;
  test.scored = *scored;
  return test;
}

Stock stock_from(const json& document, const std::string& file, Diagnostics& diagnostics) {
  FieldReader top(document, "", diagnostics);
  top.allow_only({"stock", "lots"});
  Stock stock;
  stock.source_file = file;
  if (const json* meta = top.raw("stock"); meta != nullptr) {
    FieldReader meta_reader(*meta, "/stock", diagnostics);
    meta_reader.allow_only({"name", "demo", "source"});
    stock.name = meta_reader.text("name", false).value_or("");
    meta_reader.boolean("demo", false);
    meta_reader.text("source", false);
  }
  std::set<std::string> lot_codes;
  for_each_in_array(top, "lots", true, [&](const json& element, const std::string& pointer) {
    FieldReader reader(element, pointer, diagnostics);
    reader.allow_only({"variety", "lot", "form", "alpha_acid", "beta_acid", "total_oil", "packaged", "storage",
                       "on_hand", "hsi", "rub_test", "notes"});
    Lot lot;
    lot.variety = reader.name("variety", true).value_or("");
    lot.lot = reader.name("lot", false).value_or("");
    if (!lot.lot.empty() && !lot_codes.insert(fold_name(lot.lot)).second)
      diagnostics.add(reader.at("lot"), fmt::format("lot \"{}\" appears twice", lot.lot));
    lot.form =
        read_enum<HopForm>(reader, "form", false, form_from, "pellet, whole or powder").value_or(HopForm::pellet);
    lot.alpha_acid = reader.quantity("alpha_acid", Dimension::percent, limits::alpha_acid, false);
    lot.beta_acid = reader.quantity("beta_acid", Dimension::percent, limits::beta_acid, false);
    lot.total_oil = reader.quantity("total_oil", Dimension::oil_content, limits::total_oil, false);
    lot.packaged = reader.date("packaged", false);
    lot.on_hand_g = reader.quantity("on_hand", Dimension::mass, limits::stock_mass, false);
    lot.hsi = reader.quantity("hsi", Dimension::number, limits::hsi, false);
    lot.rub_test = read_rub_test(reader, diagnostics);
    if (const json* storage = reader.raw("storage"); storage != nullptr && !storage->is_null()) {
      FieldReader storage_reader(*storage, reader.at("storage"), diagnostics);
      storage_reader.allow_only({"temperature", "package"});
      auto temperature =
          storage_reader.quantity("temperature", Dimension::temperature, limits::storage_temperature, true);
      auto package = read_enum<Package>(storage_reader, "package", true, package_from, "vacuum, sealed or open");
      if (temperature && package) lot.storage = Storage{*temperature, *package};
    }
    if (diagnostics.empty()) stock.lots.push_back(std::move(lot));  // else the file is refused: keep none
  });
  return stock;
}

// ---------------------------------------------------------------------------------------------
// Recipe

// A whirlpool addition's "cooling": {"to": "82 C"} or {"constant": 0.01, "ambient": "20 C"}.
std::optional<Cooling> read_cooling(FieldReader& reader, std::optional<HopUse> use, std::optional<double> start_c,
                                    Diagnostics& diagnostics) {
  const json* raw = reader.raw("cooling");
  if (raw == nullptr || raw->is_null()) return std::nullopt;
  if (use && use != HopUse::whirlpool) {
    diagnostics.add(reader.at("cooling"),
                    fmt::format("only a whirlpool addition takes a cooling course (this one is {})", to_string(*use)));
    return std::nullopt;
  }
  const std::size_t problems_before = diagnostics.lines().size();
  FieldReader course(*raw, reader.at("cooling"), diagnostics);
  course.allow_only({"to", "constant", "ambient"});
  Cooling cooling;
  cooling.to_c = course.quantity("to", Dimension::temperature, limits::whirlpool_temperature, false);
  cooling.per_minute = course.quantity("constant", Dimension::number, limits::cooling_constant, false);
  cooling.ambient_c =
      course.quantity("ambient", Dimension::temperature, limits::ambient_temperature, false).value_or(20.0);
  if (!course.ok() || diagnostics.lines().size() != problems_before) return std::nullopt;
  if (cooling.to_c.has_value() == cooling.per_minute.has_value()) {
    diagnostics.add(reader.at("cooling"),
                    "give either \"to\" (the temperature at the end of the stand) or \"constant\" (per minute)");
    return std::nullopt;
  }
  if (cooling.to_c && start_c && *cooling.to_c > *start_c)
    diagnostics.add(course.at("to"), fmt::format("{:g} C is warmer than the {:g} C the addition goes in at (a "
                                                 "cooling course only cools)",
                                                 *cooling.to_c, *start_c));
  if (cooling.per_minute && course.has("ambient") && start_c && cooling.ambient_c > *start_c)
    diagnostics.add(course.at("ambient"), fmt::format("{:g} C is warmer than the {:g} C the addition goes in at",
                                                      cooling.ambient_c, *start_c));
  return cooling;
}

/// The unit a field was written in ("oz", "gal", "P"; empty for a bare number or a missing field).
std::string unit_written(const FieldReader& reader, std::string_view key, Dimension dimension) {
  const json* value = reader.raw(key);
  if (value == nullptr || !value->is_string()) return {};
  return parse_quantity(value->get<std::string>(), dimension).unit;
}

/// The recipe-wide notation: volume, gravity and boil time as written; the first temperature and
/// hop amount written with a unit.
void read_notation(const FieldReader& top, Recipe& recipe) {
  recipe.notation.volume = unit_written(top, "batch_volume", Dimension::volume);
  recipe.notation.gravity = unit_written(top, "original_gravity", Dimension::gravity);
  recipe.notation.boil_time = unit_written(top, "boil_time", Dimension::time);
  for (const auto& hop : recipe.hops)
    if (recipe.notation.mass.empty()) recipe.notation.mass = hop.amount_unit;
}

Recipe recipe_from(const json& document, const std::string& file, Diagnostics& diagnostics) {
  FieldReader top(document, "", diagnostics);
  top.allow_only({"name", "batch_volume", "original_gravity", "boil_time", "target_ibu", "hop_stand", "hops", "notes"});
  Recipe recipe;
  recipe.source_file = file;
  recipe.name = top.text("name", false).value_or("");
  recipe.batch_volume_l = top.quantity("batch_volume", Dimension::volume, limits::batch_volume, true).value_or(0.0);
  recipe.original_gravity = top.quantity("original_gravity", Dimension::gravity, limits::gravity, true).value_or(1.0);
  recipe.boil_minutes = top.quantity("boil_time", Dimension::time, limits::boil_time, true).value_or(0.0);
  recipe.target_ibu = top.quantity("target_ibu", Dimension::number, limits::target_ibu, false);
  if (const json* stand = top.raw("hop_stand"); stand != nullptr && !stand->is_null()) {
    FieldReader stand_reader(*stand, top.at("hop_stand"), diagnostics);
    stand_reader.allow_only({"time", "temperature"});
    auto minutes = stand_reader.quantity("time", Dimension::time, limits::boil_time, true);
    auto temperature =
        stand_reader.quantity("temperature", Dimension::temperature, limits::whirlpool_temperature, true);
    if (minutes && temperature) recipe.hop_stand = HopStand{*minutes, *temperature};
    recipe.notation.stand_time = unit_written(stand_reader, "time", Dimension::time);
    recipe.notation.temperature = unit_written(stand_reader, "temperature", Dimension::temperature);
  }
  for_each_in_array(top, "hops", true, [&](const json& element, const std::string& pointer) {
    FieldReader reader(element, pointer, diagnostics);
    reader.allow_only({"variety", "lot", "amount", "alpha_acid", "total_oil", "use", "time", "temperature", "cooling",
                       "form", "notes"});
    HopAddition hop;
    hop.variety = reader.name("variety", false).value_or("");
    hop.lot = reader.name("lot", false).value_or("");
    if (hop.variety.empty() && hop.lot.empty() && reader.ok())
      diagnostics.add(reader.at("variety"), "is missing (give a variety or a lot)");
    hop.grams = reader.quantity("amount", Dimension::mass, limits::hop_mass, true).value_or(0.0);
    hop.alpha_acid = reader.quantity("alpha_acid", Dimension::percent, limits::alpha_acid, false);
    hop.total_oil = reader.quantity("total_oil", Dimension::oil_content, limits::total_oil, false);
    hop.amount_unit = unit_written(reader, "amount", Dimension::mass);
    hop.time_unit = unit_written(reader, "time", Dimension::time);
    if (recipe.notation.temperature.empty())
      recipe.notation.temperature = unit_written(reader, "temperature", Dimension::temperature);
    const auto use = read_enum<HopUse>(reader, "use", true, use_from, "first-wort, boil, whirlpool or dry-hop");
    hop.use = use.value_or(HopUse::boil);
    hop.minutes = reader.quantity("time", Dimension::time, limits::addition_time, false);
    hop.temperature_c = reader.quantity("temperature", Dimension::temperature, limits::whirlpool_temperature, false);
    hop.form = read_enum<HopForm>(reader, "form", false, form_from, "pellet, whole or powder");
    hop.cooling = read_cooling(reader, use, hop.temperature_c, diagnostics);
    if (use == HopUse::boil && !hop.minutes && !reader.has("time") && reader.ok())
      diagnostics.add(reader.at("time"), "is missing (a boil addition needs its minutes before flame-out)");
    if (use == HopUse::whirlpool) {
      if (!reader.has("temperature") && reader.ok())
        diagnostics.add(reader.at("temperature"), "is missing (a whirlpool addition needs its temperature)");
      if (!reader.has("time") && reader.ok())
        diagnostics.add(reader.at("time"), "is missing (a whirlpool addition needs its stand minutes)");
    }
    if (use && use != HopUse::whirlpool && reader.has("temperature"))
      diagnostics.add(reader.at("temperature"),
                      fmt::format("only a whirlpool addition takes a temperature (this one is {})", to_string(*use)));
    if (use == HopUse::boil && hop.minutes && recipe.boil_minutes > 0.0 && *hop.minutes > recipe.boil_minutes + 1e-9)
      diagnostics.add(reader.at("time"), fmt::format("{:g} min is longer than the boil time of {:g} min", *hop.minutes,
                                                     recipe.boil_minutes));
    if (diagnostics.empty()) recipe.hops.push_back(std::move(hop));  // else the file is refused: keep none
  });
  read_notation(top, recipe);
  return recipe;
}

template <typename Parse>
auto parse_with(std::string_view text, const std::string& file, Parse parse) {
  Diagnostics diagnostics(file);
  const json document = parse_or_throw(text, diagnostics);
  auto result = parse(document, diagnostics);
  diagnostics.throw_if_any();
  return result;
}

// ---------------------------------------------------------------------------------------------
// Streaming a large catalog
//
// A catalog file over kMaxInputBytes is read as a stream: nlohmann's parser with a callback hands
// over each element of "varieties" once it is complete; it is checked and kept as a Variety and its
// JSON is discarded (the callback returns false), so memory holds one record's JSON at a time and the
// input limit applies per record (kMaxRecordBytes), the file up to kMaxStreamedCatalogBytes.

/// A record past kMaxRecordBytes, thrown out of the parser callback.
struct RecordTooLarge {
  std::string pointer;
};

bool all_finite(const json& value) {
  std::vector<const json*> todo{&value};
  while (!todo.empty()) {
    const json* node = todo.back();
    todo.pop_back();
    if (node->is_number_float() && !std::isfinite(node->get<double>())) return false;
    if (node->is_structured())
      for (const auto& child : *node) todo.push_back(&child);
  }
  return true;
}

/// Line and column (1-based) of byte `offset` of the file.
std::pair<std::size_t, std::size_t> locate(const std::filesystem::path& path, std::size_t offset) {
  std::ifstream in(path, std::ios::binary);
  std::size_t line = 1, column = 1;
  char c = 0;
  for (std::size_t i = 0; i < offset && in.get(c); ++i) {
    if (c == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
  }
  return {line, column};
}

/// The residual document (varieties discarded): its "catalog" block, and "varieties" present as an array.
void finish_streamed(const json& document, const std::string& file, bool had_array, Diagnostics& diagnostics,
                     Catalog& catalog) {
  FieldReader top(document, "", diagnostics);
  catalog_meta(top, file, diagnostics, catalog);
  const json* varieties = top.raw("varieties");
  if (top.ok() && (varieties == nullptr || varieties->is_null()))
    diagnostics.add("/varieties", "is missing (required)");
  else if (varieties != nullptr && !had_array)
    diagnostics.add("/varieties", fmt::format("{} is not an array (expected [ ... ])", brief(*varieties)));
  if (catalog.varieties.empty() && diagnostics.empty())
    diagnostics.add("/varieties", "is empty (expected at least one variety)");
}

}  // namespace

Catalog load_catalog_streamed(const std::filesystem::path& path, const Lexicon& lexicon) {
  const std::string file = path.string();
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(file + ": cannot read this file");
  Diagnostics diagnostics(file);
  Catalog catalog;
  std::map<std::string, std::string> seen;  // folded name -> pointer
  std::string top_key;                      // key of the top-level value being read
  bool in_array = false, had_array = false;
  std::size_t element = 0;
  std::streamoff record_start = 0;
  std::size_t events = 0;
  const auto too_large = [&] { return static_cast<std::uintmax_t>(in.tellg() - record_start) > kMaxRecordBytes; };
  using event_t = json::parse_event_t;
  const json::parser_callback_t callback = [&](int depth, event_t event, json& parsed) -> bool {
    if (depth == 1 && event == event_t::key) top_key = parsed.get<std::string>();
    if (depth == 1 && top_key == "varieties" && event == event_t::array_start) in_array = had_array = true;
    if (depth == 1 && event == event_t::array_end) in_array = false;
    if (!in_array || depth < 2) return true;
    if (depth > 2 || event == event_t::key) {
      if (++events % 4096 == 0 && too_large()) throw RecordTooLarge{"/varieties/" + std::to_string(element)};
      return true;
    }
    if (event == event_t::object_start || event == event_t::array_start) {
      record_start = in.tellg();
      events = 0;
      return true;
    }
    const std::string pointer = "/varieties/" + std::to_string(element++);
    if (event != event_t::value && too_large()) throw RecordTooLarge{pointer};
    if (!all_finite(parsed))
      diagnostics.add(pointer, "a number is too large to represent (keep values in their usual ranges)");
    else
      add_variety(parsed, pointer, file, lexicon, diagnostics, catalog, seen);
    return false;  // discard the record's JSON
  };
  try {
    const json document = json::parse(in, callback, true, false);
    finish_streamed(document, file, had_array, diagnostics, catalog);
  } catch (const RecordTooLarge& error) {
    diagnostics.add(error.pointer, fmt::format("one variety is larger than {} MiB (check the file for a broken record)",
                                               kMaxRecordBytes >> 20));
  } catch (const json::out_of_range&) {
    diagnostics.add_file("a number is too large to represent (keep values in their usual ranges)");
  } catch (const json::parse_error& error) {
    const auto [line, column] = locate(path, error.byte == 0 ? 0 : error.byte - 1);
    diagnostics.add_file(
        fmt::format("not valid JSON at line {}, column {} (check for a missing comma, quote or "
                    "bracket, or whether the file ends too early)",
                    line, column));
  }
  diagnostics.throw_if_any();
  index_variety_names(catalog);
  return catalog;
}

Lexicon parse_lexicon(std::string_view text, const std::string& file) {
  return parse_with(text, file, [&](const json& d, Diagnostics& diag) { return lexicon_from(d, diag); });
}
Catalog parse_catalog(std::string_view text, const std::string& file, const Lexicon& lexicon) {
  return parse_with(text, file, [&](const json& d, Diagnostics& diag) { return catalog_from(d, file, lexicon, diag); });
}
Stock parse_stock(std::string_view text, const std::string& file) {
  return parse_with(text, file, [&](const json& d, Diagnostics& diag) { return stock_from(d, file, diag); });
}
Recipe parse_recipe(std::string_view text, const std::string& file) {
  return parse_with(text, file, [&](const json& d, Diagnostics& diag) { return recipe_from(d, file, diag); });
}

Lexicon load_lexicon(const std::filesystem::path& path) { return parse_lexicon(read_text_file(path), path.string()); }
Catalog load_catalog(const std::filesystem::path& path, const Lexicon& lexicon) {
  std::error_code ec;
  const std::uintmax_t bytes = std::filesystem::file_size(path, ec);
  if (!ec && bytes > kMaxInputBytes && std::filesystem::is_regular_file(path, ec)) {
    if (bytes > kMaxStreamedCatalogBytes)
      throw InputError(fmt::format("{}: the file is {} MiB (catalogs are read up to {} MiB)", path.string(),
                                   bytes >> 20, kMaxStreamedCatalogBytes >> 20));
    return load_catalog_streamed(path, lexicon);
  }
  return parse_catalog(read_text_file(path), path.string(), lexicon);
}
Stock load_stock(const std::filesystem::path& path) { return parse_stock(read_text_file(path), path.string()); }
Recipe load_recipe(const std::filesystem::path& path) { return parse_recipe(read_text_file(path), path.string()); }

Catalog merge_catalogs(const std::vector<Catalog>& catalogs) {
  Catalog merged;
  std::map<std::string, const Variety*> seen;
  std::vector<std::string> problems;
  for (const auto& catalog : catalogs) {
    merged.names.insert(merged.names.end(), catalog.names.begin(), catalog.names.end());
    merged.demo = merged.demo || catalog.demo;
    for (const auto& variety : catalog.varieties) {
      auto [it, inserted] = seen.emplace(fold_name(variety.name), &variety);
      if (!inserted) {
        problems.push_back(fmt::format("{}: variety \"{}\" is also defined in {} (rename one of them)",
                                       variety.source_file, variety.name, it->second->source_file));
        continue;
      }
    }
  }
  if (!problems.empty()) throw InputError(problems);
  for (const auto& catalog : catalogs)
    merged.varieties.insert(merged.varieties.end(), catalog.varieties.begin(), catalog.varieties.end());
  index_variety_names(merged);
  return merged;
}

FileKind detect_file_kind(const json& document) {
  if (!document.is_object()) return FileKind::unknown;
  if (document.contains("varieties")) return FileKind::catalog;
  if (document.contains("lots")) return FileKind::stock;
  if (document.contains("hops")) return FileKind::recipe;
  if (document.contains("axes")) return FileKind::lexicon;
  return FileKind::unknown;
}

std::string_view to_string(FileKind kind) {
  switch (kind) {
    case FileKind::catalog:
      return "catalog";
    case FileKind::stock:
      return "stock";
    case FileKind::recipe:
      return "recipe";
    case FileKind::lexicon:
      return "lexicon";
    case FileKind::unknown:
      return "unknown";
  }
  return "unknown";
}

FileKind check_file(const std::filesystem::path& path, const Lexicon& lexicon) {
  const std::string text = read_text_file(path);
  const std::string file = path.string();
  const FileKind kind = [&] {  // the document goes before the file is parsed again as its kind
    Diagnostics diagnostics(file);
    return detect_file_kind(parse_or_throw(text, diagnostics));
  }();
  switch (kind) {
    case FileKind::catalog:
      parse_catalog(text, file, lexicon);
      break;
    case FileKind::stock:
      parse_stock(text, file);
      break;
    case FileKind::recipe:
      parse_recipe(text, file);
      break;
    case FileKind::lexicon:
      parse_lexicon(text, file);
      break;
    case FileKind::unknown:
      throw InputError(file +
                       ": /: not a bine file (expected a catalog with \"varieties\", a stock file with "
                       "\"lots\", a recipe with \"hops\" or a lexicon with \"axes\")");
  }
  return kind;
}

nlohmann::ordered_json recipe_to_json(const Recipe& recipe) {
  using ordered = nlohmann::ordered_json;
  // Written in the brewer's notation (docs/methods.md#recipe-files): every quantity in the unit it
  // was read in, to 10 significant digits, so that reading the file back gives the same recipe.
  const RecipeNotation& notation = recipe.notation;
  ordered out;
  if (!recipe.name.empty()) out["name"] = recipe.name;
  out["batch_volume"] = format_in_unit(recipe.batch_volume_l, Dimension::volume, notation.volume);
  out["original_gravity"] = format_in_unit(recipe.original_gravity, Dimension::gravity, notation.gravity);
  out["boil_time"] = format_in_unit(recipe.boil_minutes, Dimension::time, notation.boil_time);
  if (recipe.target_ibu) out["target_ibu"] = std::round(*recipe.target_ibu * 10.0) / 10.0;
  if (recipe.hop_stand)
    out["hop_stand"] = {
        {"time", format_in_unit(recipe.hop_stand->minutes, Dimension::time, notation.stand_time)},
        {"temperature", format_in_unit(recipe.hop_stand->temperature_c, Dimension::temperature, notation.temperature)}};
  ordered hops = ordered::array();
  for (const auto& hop : recipe.hops) {
    ordered h;
    if (!hop.variety.empty()) h["variety"] = hop.variety;
    if (!hop.lot.empty()) h["lot"] = hop.lot;
    h["amount"] = format_in_unit(hop.grams, Dimension::mass, amount_unit(recipe, hop));
    // Alpha and oil as the amounts were worked out for them (engines record 0.01; a catalog midpoint
    // may carry a third decimal), so that the file reads back to the same IBU.
    if (hop.alpha_acid) h["alpha_acid"] = std::round(*hop.alpha_acid * 1e4) / 1e4;
    if (hop.total_oil) h["total_oil"] = std::round(*hop.total_oil * 1e4) / 1e4;
    h["use"] = std::string(to_string(hop.use));
    if (hop.minutes) h["time"] = format_in_unit(*hop.minutes, Dimension::time, hop.time_unit);
    if (hop.temperature_c)
      h["temperature"] = format_in_unit(*hop.temperature_c, Dimension::temperature, notation.temperature);
    if (hop.cooling && hop.cooling->to_c)
      h["cooling"] = {{"to", format_in_unit(*hop.cooling->to_c, Dimension::temperature, notation.temperature)}};
    if (hop.cooling && hop.cooling->per_minute)
      h["cooling"] = {
          {"constant", *hop.cooling->per_minute},
          {"ambient", format_in_unit(hop.cooling->ambient_c, Dimension::temperature, notation.temperature)}};
    if (hop.form) h["form"] = std::string(to_string(*hop.form));
    hops.push_back(std::move(h));
  }
  out["hops"] = std::move(hops);
  return out;
}

std::string checked_recipe_text(const Recipe& recipe, const std::string& what) {
  std::string text = recipe_to_json(recipe).dump(2) + "\n";
  check_readable_size(text, what);
  try {
    parse_recipe(text, what);
  } catch (const InputError& error) {
    throw Infeasible(fmt::format("the result is outside what a recipe may hold, so it is neither shown nor written: {}",
                                 error.lines().front()));
  }
  return text;
}

namespace {

json range_json(const Range& range) { return json::array({range.min, range.max}); }

json variety_file_json(const Variety& v) {
  json out;
  out["name"] = v.name;
  if (!v.origin.empty()) out["origin"] = v.origin;
  if (v.purpose) out["purpose"] = std::string(to_string(*v.purpose));
  if (v.alpha_acid) out["alpha_acid"] = range_json(*v.alpha_acid);
  if (v.beta_acid) out["beta_acid"] = range_json(*v.beta_acid);
  if (v.cohumulone) out["cohumulone"] = range_json(*v.cohumulone);
  if (v.total_oil) out["total_oil"] = range_json(*v.total_oil);
  if (!v.oils.empty()) {
    json oils;
    for (const auto& [compound, range] : v.oils) oils[compound] = range_json(range);
    out["oils"] = std::move(oils);
  }
  if (v.stability) out["stability"] = *v.stability;
  if (v.aroma) out["aroma"] = *v.aroma;
  if (!v.tags.empty()) out["tags"] = v.tags;
  return out;
}

}  // namespace

json catalog_file_json(const Catalog& catalog, const std::string& name) {
  json varieties = json::array();
  for (const auto& variety : catalog.varieties) varieties.push_back(variety_file_json(variety));
  return json{{"catalog", {{"name", name}, {"demo", catalog.demo}}}, {"varieties", std::move(varieties)}};
}

}  // namespace bine

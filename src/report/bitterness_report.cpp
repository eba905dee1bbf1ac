#include "report/bitterness_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "report/table.hpp"

namespace bine {

std::string format_minutes(double minutes) {
  if (minutes >= 1440.0) return fmt::format("{:g} d", rounded(minutes / 1440.0, 2));
  return fmt::format("{:g} min", rounded(minutes, 1));
}

std::string describe_use(HopUse use, std::optional<double> minutes, std::optional<double> temperature_c,
                         UnitSystem units) {
  std::string text(to_string(use));
  if (use != HopUse::first_wort && minutes) text += " " + format_minutes(*minutes);
  if (use == HopUse::whirlpool && temperature_c) text += " at " + format_temperature(*temperature_c, units);
  return text;
}

std::string describe_use(const HopAddition& hop, UnitSystem units) {
  if (hop.use != HopUse::whirlpool || !hop.cooling || !hop.temperature_c)
    return describe_use(hop.use, hop.minutes, hop.temperature_c, units);
  std::string text = describe_use(hop.use, hop.minutes, std::nullopt, units);
  text += " from " + format_temperature(*hop.temperature_c, units);
  if (hop.cooling->to_c) return text + " to " + format_temperature(*hop.cooling->to_c, units);
  return text + fmt::format(", cooling k {:.3g}/min to {}", hop.cooling->per_minute.value_or(0.0),
                            format_temperature(hop.cooling->ambient_c, units));
}

namespace {

std::string factor_text(const FittedFactor& factor) {
  return fmt::format("{:.3f} (95 % {:.3f}-{:.3f})", factor.value, factor.low, factor.high);
}

nlohmann::json factor_json(const FittedFactor& factor) {
  return {
      {"value", rounded(factor.value, 6)}, {"low_95", rounded(factor.low, 6)}, {"high_95", rounded(factor.high, 6)}};
}

}  // namespace

std::string describe_profile(const BrewhouseProfile& profile) {
  if (profile.boil_factor && profile.late_factor)
    return fmt::format("boil factor {}, late-hop factor {}", factor_text(*profile.boil_factor),
                       factor_text(*profile.late_factor));
  return "factor " + factor_text(profile.factor);
}

std::string brewhouse_line(const BitternessSettings& settings) {
  if (!settings.brewhouse) return "";
  const BrewhouseProfile& profile = *settings.brewhouse;
  return fmt::format("Brewhouse profile {} (fitted {} on {} batches): {}", profile.source_file,
                     format_date(profile.made), profile.batches_used.size(), describe_profile(profile));
}

nlohmann::json brewhouse_json(const BitternessSettings& settings) {
  if (!settings.brewhouse) return nullptr;
  const BrewhouseProfile& profile = *settings.brewhouse;
  nlohmann::json out{{"file", profile.source_file},
                     {"date", format_date(profile.made)},
                     {"batches", profile.batches_used.size()},
                     {"factor", factor_json(profile.factor)}};
  if (profile.boil_factor && profile.late_factor) {
    out["boil_factor"] = factor_json(*profile.boil_factor);
    out["late_factor"] = factor_json(*profile.late_factor);
  }
  return out;
}

std::string_view hot_wort_caution() {
  return "Caution: whirlpool and hop-stand wort is near boiling and scalds; keep lids, hoses and hands clear, and "
         "follow your brewhouse's safety rules.";
}

std::string_view dry_hop_caution() {
  return "Caution: dry hops can restart fermentation (hop creep) and over-pressurise bottles or kegs; package only "
         "after the gravity has been stable for several days.";
}

std::string_view dogs_caution() {
  return "Caution: hops, fresh or spent, are toxic to dogs: keep them out of their reach.";
}

std::vector<std::string> cautions_for(const Recipe& recipe) {
  std::vector<std::string> cautions;
  const auto uses = [&](HopUse use) {
    return std::any_of(recipe.hops.begin(), recipe.hops.end(), [&](const HopAddition& h) { return h.use == use; });
  };
  if (uses(HopUse::whirlpool) || recipe.hop_stand) cautions.emplace_back(hot_wort_caution());
  if (uses(HopUse::dry_hop)) cautions.emplace_back(dry_hop_caution());
  if (!recipe.hops.empty()) cautions.emplace_back(dogs_caution());
  return cautions;
}

namespace {

std::string_view alpha_source_text(AlphaSource source) {
  switch (source) {
    case AlphaSource::recipe:
      return "recipe";
    case AlphaSource::catalog_midpoint:
      return "catalog midpoint";
    case AlphaSource::none:
      return "none";
  }
  return "";
}

std::string model_line(const RecipeBitterness& bitterness) {
  const BitternessSettings& settings = bitterness.settings;
  const std::string model = settings.model == IbuModel::rager ? "Rager" : "Tinseth";
  if (settings.brewhouse)
    return fmt::format("{} model, pellet factor {:.2f}, brewhouse profile {}", model, settings.pellet_factor,
                       settings.brewhouse->source_file);
  return fmt::format("{} model, pellet factor {:.2f}, calibration {:.2f}", model, settings.pellet_factor,
                     settings.calibration);
}

}  // namespace

std::string ibu_with_interval(double ibu, const IbuRange& range) {
  const int decimals = range.high - range.low < 5.0 ? 1 : 0;
  return fmt::format("{:.1f} IBU ({:.{}f}-{:.{}f})", ibu, std::max(range.low, 0.0), decimals, range.high, decimals);
}

std::string ibu_figure(double ibu, const IbuRange* range) {
  return range == nullptr ? fmt::format("{:.1f} IBU", ibu) : ibu_with_interval(ibu, *range);
}

void put_interval(nlohmann::json& object, const std::string& key, const IbuRange& range) {
  object[key + "_low"] = rounded(std::max(range.low, 0.0), 3);
  object[key + "_high"] = rounded(range.high, 3);
}

nlohmann::json interval_json(bool monte_carlo) {
  return {{"coverage", kIntervalCoverage}, {"monte_carlo", monte_carlo}};
}

std::string interval_legend(bool brewhouse, bool aged, bool monte_carlo) {
  std::string sources = "the alpha's catalog range or certificate tolerance";
  if (aged) sources += std::string(brewhouse ? ", " : " and ") + "the stability range of its ageing";
  if (brewhouse) sources += " and the brewhouse factor";
  return fmt::format("(IBU (low-high) = 90 % interval from {}; {})", sources,
                     monte_carlo ? "10^4 seeded draws" : "exact, linear");
}

void render_bitterness(std::ostream& out, const Recipe& recipe, const RecipeBitterness& bitterness, UnitSystem units,
                       const IbuIntervals* intervals) {
  const auto ibu_text = [&](double ibu, std::optional<std::size_t> row) {
    if (intervals == nullptr) return ibu_figure(ibu, nullptr);
    return ibu_figure(ibu, row ? &intervals->additions[*row] : &intervals->total);
  };
  out << fmt::format("{}: {} at OG {}, {} boil; {}\n\n", recipe.name.empty() ? recipe.source_file : recipe.name,
                     format_volume(recipe.batch_volume_l, units),
                     format_gravity(recipe.original_gravity, recipe.notation.gravity),
                     format_minutes(recipe.boil_minutes), model_line(bitterness));
  TextTable table({{"#", Align::right},
                   {"variety"},
                   {"use"},
                   {"boil-eq.", Align::right},
                   {"amount", Align::right},
                   {"form"},
                   {"alpha", Align::right},
                   {"util.", Align::right},
                   {"IBU", Align::right}});
  std::size_t row = 0;
  for (const auto& line : bitterness.additions) {
    const bool dry = line.use == HopUse::dry_hop;
    table.add_row({std::to_string(line.index + 1),
                   line.lot.empty() || line.lot == line.variety ? line.variety
                                                                : fmt::format("{} (lot {})", line.variety, line.lot),
                   describe_use(recipe.hops[line.index], units) + (line.bitterness.rate_extrapolated ? " ~" : ""),
                   dry ? "-" : fmt::format("{:.1f} min", line.bitterness.effective_minutes),
                   format_mass(line.grams, units), std::string(to_string(line.form)) + (line.form_assumed ? "*" : ""),
                   line.alpha_source == AlphaSource::none ? "-" : fmt::format("{:.1f} %", line.alpha_percent),
                   dry ? "-" : fmt::format("{:.1f} %", 100.0 * line.bitterness.utilization),
                   dry ? fmt::format("{:.1f} IBU", line.bitterness.ibu) : ibu_text(line.bitterness.ibu, row)});
    ++row;
  }
  table.add_rule();
  table.add_row({"", "total", "", "", "", "", "", "", ibu_text(bitterness.total_ibu, std::nullopt)});
  table.render(out);
  out << "  (boil-eq. = minutes counted as boiling; util. = alpha acid turned into IBU, with form and "
         "calibration factors)\n";
  if (intervals != nullptr)
    out << "  " << interval_legend(bitterness.settings.brewhouse.has_value(), intervals->aged, intervals->monte_carlo)
        << '\n';
  if (std::any_of(bitterness.additions.begin(), bitterness.additions.end(),
                  [](const AdditionLine& line) { return line.bitterness.rate_extrapolated; }))
    out << "  ~ sits in wort below 90 C: the isomerisation rate fit (Malowicki & Shellhammer 2005) is "
           "extrapolated there\n";

  if (recipe.hop_stand)
    out << fmt::format(
        "\nHop stand: {} at {} after flame-out counts as {:.1f} boil minutes for boil and first-wort "
        "additions (Malowicki & Shellhammer 2005 rates{}).\n",
        format_minutes(recipe.hop_stand->minutes), format_temperature(recipe.hop_stand->temperature_c, units),
        bitterness.wort.stand_equivalent_minutes,
        recipe.hop_stand->temperature_c < kLowestMeasuredCelsius ? ", extrapolated below 90 C" : "");
  if (bitterness.settings.brewhouse) out << '\n' << brewhouse_line(bitterness.settings) << ".\n";
  if (recipe.target_ibu)
    out << fmt::format("\nTarget {:.1f} IBU; computed {:.1f} IBU ({:+.1f} IBU).\n", *recipe.target_ibu,
                       bitterness.total_ibu, bitterness.total_ibu - *recipe.target_ibu);
  if (!bitterness.notes.empty()) {
    out << "\nNotes:\n";
    for (const auto& note : bitterness.notes) out << "  - " << note << '\n';
  }
  for (const auto& caution : cautions_for(recipe)) out << '\n' << caution << '\n';
  out << fmt::format("\nTotal {:.1f} IBU at OG {}: BU:GU {:.2f}, {} (common-practice reading).\n", bitterness.total_ibu,
                     format_gravity(recipe.original_gravity, recipe.notation.gravity), bitterness.bu_gu,
                     bitterness.bu_gu_reading);
}

nlohmann::json bitterness_to_json(const Recipe& recipe, const RecipeBitterness& bitterness,
                                  const IbuIntervals* intervals) {
  using nlohmann::json;
  json out;
  out["recipe"] = recipe.name;
  out["model"] = std::string(to_string(bitterness.settings.model));
  out["pellet_factor"] = bitterness.settings.pellet_factor;
  out["calibration"] = bitterness.settings.calibration;
  if (bitterness.settings.late_calibration) out["late_calibration"] = *bitterness.settings.late_calibration;
  out["brewhouse"] = brewhouse_json(bitterness.settings);
  out["batch_volume_l"] = recipe.batch_volume_l;
  out["original_gravity"] = rounded(recipe.original_gravity, 4);
  out["boil_minutes"] = recipe.boil_minutes;
  if (recipe.hop_stand)
    out["hop_stand"] = {{"minutes", recipe.hop_stand->minutes},
                        {"temperature_c", recipe.hop_stand->temperature_c},
                        {"boil_equivalent_minutes", rounded(bitterness.wort.stand_equivalent_minutes, 3)}};
  json additions = json::array();
  for (const auto& line : bitterness.additions) {
    json a;
    a["index"] = line.index + 1;
    a["variety"] = line.variety;
    if (!line.lot.empty()) a["lot"] = line.lot;
    a["use"] = std::string(to_string(line.use));
    a["minutes"] = line.minutes ? json(rounded(*line.minutes, 3)) : json(nullptr);
    a["temperature_c"] = line.temperature_c ? json(rounded(*line.temperature_c, 3)) : json(nullptr);
    if (const auto& cooling = recipe.hops[line.index].cooling) {
      if (cooling->to_c) a["cooling"] = {{"to_c", rounded(*cooling->to_c, 3)}};
      if (cooling->per_minute)
        a["cooling"] = {{"constant_per_minute", *cooling->per_minute}, {"ambient_c", rounded(cooling->ambient_c, 3)}};
    }
    a["rate_extrapolated"] = line.bitterness.rate_extrapolated;
    a["grams"] = rounded(line.grams, 3);
    a["form"] = std::string(to_string(line.form));
    a["form_assumed"] = line.form_assumed;
    a["alpha_acid"] = line.alpha_source == AlphaSource::none ? json(nullptr) : json(rounded(line.alpha_percent, 3));
    a["alpha_source"] = std::string(alpha_source_text(line.alpha_source));
    a["effective_minutes"] = rounded(line.bitterness.effective_minutes, 3);
    a["utilization"] = rounded(line.bitterness.utilization, 5);
    a["ibu"] = rounded(line.bitterness.ibu, 3);
    if (intervals != nullptr) put_interval(a, "ibu", intervals->additions[additions.size()]);
    additions.push_back(std::move(a));
  }
  out["additions"] = std::move(additions);
  out["total_ibu"] = rounded(bitterness.total_ibu, 3);
  if (intervals != nullptr) {
    put_interval(out, "total_ibu", intervals->total);
    out["interval"] = interval_json(intervals->monte_carlo);
  }
  out["bu_gu"] = rounded(bitterness.bu_gu, 4);
  out["bu_gu_reading"] = bitterness.bu_gu_reading;
  out["notes"] = bitterness.notes;
  out["cautions"] = cautions_for(recipe);
  return out;
}

}  // namespace bine

#include "report/rebalance_report.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "model/names.hpp"
#include "report/bitterness_report.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

std::string lot_line(const ReplacementLot& lot, UnitSystem units) {
  std::string text = fmt::format("{}: ", lot.variety);
  if (!lot.lot_code.empty()) {
    text += fmt::format("lot {}", lot.lot_code);
    if (!lot.chosen.empty()) text += fmt::format(" ({})", lot.chosen);
    text += "; ";
  }
  if (lot.certificate_alpha && lot.packaged && lot.storage) {
    text += fmt::format(
        "{:.1f} % packaged {}, {} at {}, {}; stability {:.0f} % ({}) -> {:.2f} % alpha on brew "
        "day ({:.1f} % left)",
        *lot.certificate_alpha, format_date(*lot.packaged),
        count_of(static_cast<std::size_t>(std::max(0L, lot.days)), "day", "days"),
        format_temperature(lot.storage->temperature_c, units), to_string(lot.storage->package),
        lot.stability_percent.value_or(0.0), lot.stability_source, lot.alpha_percent, 100.0 * lot.remaining);
  } else {
    text += fmt::format("{:.2f} % alpha", lot.alpha_percent);
  }
  if (lot.total_oil) text += fmt::format(", oil {:.2f} mL/100 g", *lot.total_oil);
  if (lot.form) text += fmt::format(", {}", to_string(*lot.form));
  if (lot.on_hand_g) text += fmt::format(", {} on hand", format_mass(*lot.on_hand_g, units));
  if (!lot.hsi_note.empty()) text += "; " + lot.hsi_note;
  if (lot.stale) text += fmt::format("; stale ({}), used as allowed", lot.stale_reason);
  return text;
}

/// "TW-25-044", or "TW-25-044, part 1 of 2 of addition 3" for a split addition.
std::string lot_cell(const RebalancedAddition& row) {
  const std::string lot = row.lot.empty() ? "-" : row.lot;
  if (row.parts < 2) return lot;
  return fmt::format("{}, part {} of {} of addition {}", lot, row.part, row.parts, row.index + 1);
}

/// Whether the stock covers the recipe: shortfalls, additions no lot was found for, lots without an
/// amount. "Stock covers every addition." only when every addition was weighed from a lot whose
/// amount on hand covers it.
void render_stock_cover(std::ostream& out, const Recipe& recipe, const RebalanceResult& result, bool from_stock,
                        UnitSystem units) {
  if (!result.shortfalls.empty()) {
    out << "Stock shortfalls:\n";
    for (const auto& s : result.shortfalls)
      out << fmt::format("  {} (lot {}): need {}, have {}, short {}\n", s.variety, s.lot,
                         format_mass(s.needed_g, units), format_mass(s.on_hand_g, units),
                         format_mass(s.needed_g - s.on_hand_g, units));
  }
  if (!from_stock) return;
  for (const std::size_t index : result.without_lot) {
    const HopAddition& hop = recipe.hops[index];
    out << fmt::format("No stock lot for addition {} ({}, {}): kept as written, the stock does not cover it.\n",
                       index + 1, hop.variety.empty() ? hop.lot : hop.variety, describe_use(hop, units));
  }
  for (const auto& code : result.lots_without_amount)
    out << fmt::format("Lot {} gives no amount on hand: its draw is not checked against the stock.\n", code);
  if (result.shortfalls.empty() && result.without_lot.empty() && result.lots_without_amount.empty())
    out << "Stock covers every addition.\n";
}

nlohmann::json split_additions_json(const RebalanceResult& result, const RebalanceIntervals* intervals) {
  nlohmann::json splits = nlohmann::json::array();
  for (const SplitAddition& split : split_additions(result, intervals)) {
    nlohmann::json s;
    s["index"] = split.index + 1;
    s["parts"] = split.parts;
    s["ibu_before"] = rounded(split.ibu_before, 3);
    s["ibu_after"] = rounded(split.ibu_after, 3);
    if (split.before != nullptr) put_interval(s, "ibu_before", *split.before);
    if (split.after != nullptr) put_interval(s, "ibu_after", *split.after);
    splits.push_back(std::move(s));
  }
  return splits;
}

/// Each addition split across lots, with its parts' IBU together (as written and rebalanced, each with
/// its interval when shown).
void render_splits(std::ostream& out, const Recipe& recipe, const RebalanceResult& result,
                   const RebalanceIntervals* intervals) {
  for (const SplitAddition& split : split_additions(result, intervals)) {
    const HopUse use = recipe.hops[split.index].use;
    std::string text = fmt::format(
        "Addition {} is split across lots: one lot has too little, and its parts together hold {}", split.index + 1,
        use == HopUse::boil || use == HopUse::first_wort ? "its IBU" : "what it delivers (oil, else grams)");
    if (use != HopUse::dry_hop)
      text += fmt::format("; together {} as written, {} rebalanced", ibu_figure(split.ibu_before, split.before),
                          ibu_figure(split.ibu_after, split.after));
    out << text << ".\n";
  }
}

/// Who took the IBU change, and the total it holds at (`total`: its interval, when shown).
void render_held_total(std::ostream& out, const Recipe& recipe, const RebalanceResult& result, UnitSystem units,
                       const IbuRange* total) {
  const std::string weighed = weighing_note(result);
  if (result.absorber) {
    const auto& row = result.additions[*result.absorber];
    const HopAddition& hop = recipe.hops[row.index];
    out << fmt::format(
        "Addition {} ({}, {}) absorbed the IBU change of {:+.2f} IBU from the other additions (its own IBU "
        "changed by {:+.2f} IBU), so the total holds at {}{}.\n",
        row.index + 1, row.variety, describe_use(hop, units), -result.ibu_change_absorbed + 0.0,
        result.ibu_change_absorbed, ibu_figure(result.after.total_ibu, total), weighed);
  } else if (result.whirlpool_scaled) {
    out << fmt::format(
        "No boil addition: the new lots changed the whirlpool IBU by {:+.2f} IBU and the whirlpool additions "
        "were scaled to make it up, so the total holds at {}{} but their aroma changes.\n",
        -result.ibu_change_absorbed + 0.0, ibu_figure(result.after.total_ibu, total), weighed);
  } else {
    out << fmt::format("Each addition holds its own IBU; the total stays at {}{}.\n",
                       ibu_figure(result.after.total_ibu, total), weighed);
  }
}

}  // namespace

// The amounts are weighed to 0.1 g (1 g above 100 g) after the exact solve; that rounding moves the
// total a little.
std::string weighing_note(const RebalanceResult& result) {
  const double before = result.before.total_ibu;
  const double after = result.after.total_ibu;
  if (fmt::format("{:.1f}", before) == fmt::format("{:.1f}", after)) return {};
  return fmt::format(" ({:.1f} IBU as written: weighing the amounts to 0.1 g moves the total by {:+.2f} IBU)", before,
                     after - before);
}

std::vector<SplitAddition> split_additions(const RebalanceResult& result, const RebalanceIntervals* intervals) {
  std::vector<SplitAddition> splits;
  for (const auto& row : result.additions) {
    if (row.parts < 2) continue;
    if (row.part == 1) {
      SplitAddition split;
      split.index = row.index;
      split.parts = row.parts;
      if (intervals != nullptr)
        for (const auto& s : intervals->split)
          if (s.index == row.index) {
            split.before = &s.before;
            split.after = &s.after;
          }
      splits.push_back(split);
    }
    splits.back().ibu_before += row.ibu_before;
    splits.back().ibu_after += row.ibu_after;
  }
  return splits;
}

void render_rebalance_changes(std::ostream& out, const Recipe& recipe, const RebalanceResult& result, bool from_stock,
                              UnitSystem units, const RebalanceIntervals* intervals) {
  // The interval of addition row k (or of the total, without k) as written or as rebalanced.
  const auto range = [&](bool after, std::optional<std::size_t> k) -> const IbuRange* {
    if (intervals == nullptr) return nullptr;
    const IbuIntervals& which = after ? intervals->after : intervals->before;
    return k ? &which.additions[*k] : &which.total;
  };
  TextTable table({{"#", Align::right},
                   {"variety"},
                   {"use"},
                   {"alpha before", Align::right},
                   {"after", Align::right},
                   {"amount before", Align::right},
                   {"after", Align::right},
                   {"IBU before", Align::right},
                   {"after", Align::right},
                   {"rule"},
                   {"lot"}});
  for (std::size_t k = 0; k < result.additions.size(); ++k) {
    const RebalancedAddition& row = result.additions[k];
    const HopAddition& hop = recipe.hops[row.index];
    const bool dry = row.use == HopUse::dry_hop;
    const std::string variety = row.variety_after.empty() || row.variety_after == row.variety
                                    ? row.variety
                                    : row.variety + " -> " + row.variety_after;
    table.add_row(
        {std::to_string(row.index + 1), variety, describe_use(hop, units), fmt::format("{:.2f} %", row.alpha_before),
         fmt::format("{:.2f} %", row.alpha_after), format_mass(row.grams_before, units),
         format_mass(row.grams_after, units), dry ? "-" : ibu_figure(row.ibu_before, range(false, k)),
         dry ? "-" : ibu_figure(row.ibu_after, range(true, k)), std::string(to_string(row.rule)), lot_cell(row)});
  }
  table.add_rule();
  table.add_row({"", "total", "", "", "", "", "", ibu_figure(result.before.total_ibu, range(false, std::nullopt)),
                 ibu_figure(result.after.total_ibu, range(true, std::nullopt)), "", ""});
  table.render(out);
  if (intervals != nullptr)
    out << "  "
        << interval_legend(result.after.settings.brewhouse.has_value(), intervals->before.aged || intervals->after.aged,
                           intervals->before.monte_carlo || intervals->after.monte_carlo)
        << '\n';
  render_splits(out, recipe, result, intervals);

  out << '\n';
  render_held_total(out, recipe, result, units, range(true, std::nullopt));
  render_stock_cover(out, recipe, result, from_stock, units);
}

void render_rebalance(std::ostream& out, const Recipe& recipe, const RebalanceContext& context,
                      const RebalanceResult& result, UnitSystem units) {
  out << fmt::format("Rebalance of {} for brew day {}{} ({} model)\n\n",
                     recipe.name.empty() ? recipe.source_file : recipe.name, format_date(context.on),
                     context.on_from_clock ? " (today; pass --on to reproduce)" : "",
                     result.before.settings.model == IbuModel::rager ? "Rager" : "Tinseth");
  if (result.before.settings.brewhouse) out << brewhouse_line(result.before.settings) << ".\n\n";
  out << (context.from_stock ? "Lots from stock (alpha aged to brew day, Garetz 1994):\n" : "New lots:\n");
  for (const auto& lot : context.lots) out << "  " << lot_line(lot, units) << '\n';
  out << '\n';

  render_rebalance_changes(out, recipe, result, context.from_stock, units, context.intervals);
  std::vector<std::string> notes = result.notes;
  notes.insert(notes.end(), result.before.notes.begin(), result.before.notes.end());
  if (!notes.empty()) {
    out << "\nNotes:\n";
    for (const auto& note : notes) out << "  - " << note << '\n';
  }
  for (const auto& caution : cautions_for(recipe)) out << '\n' << caution << '\n';
}

nlohmann::json rebalance_changes_json(const RebalanceResult& result, const RebalanceIntervals* intervals) {
  using nlohmann::json;
  json out;
  json additions = json::array();
  for (const auto& row : result.additions) {
    const std::size_t k = additions.size();
    json a;
    a["index"] = row.index + 1;
    a["variety"] = row.variety;
    if (!row.variety_after.empty() && row.variety_after != row.variety) a["variety_after"] = row.variety_after;
    a["use"] = std::string(to_string(row.use));
    a["grams_before"] = rounded(row.grams_before, 3);
    a["grams_after"] = rounded(row.grams_after, 3);
    a["alpha_before"] = rounded(row.alpha_before, 4);
    a["alpha_after"] = rounded(row.alpha_after, 4);
    a["ibu_before"] = rounded(row.ibu_before, 3);
    a["ibu_after"] = rounded(row.ibu_after, 3);
    if (intervals != nullptr) {
      put_interval(a, "ibu_before", intervals->before.additions[k]);
      put_interval(a, "ibu_after", intervals->after.additions[k]);
    }
    a["oil_before"] = row.oil_before ? json(rounded(*row.oil_before, 4)) : json(nullptr);
    a["oil_after"] = row.oil_after ? json(rounded(*row.oil_after, 4)) : json(nullptr);
    a["rule"] = std::string(to_string(row.rule));
    a["lot"] = row.lot.empty() ? json(nullptr) : json(row.lot);
    if (row.parts > 1) a["part"] = {{"of_addition", row.index + 1}, {"part", row.part}, {"parts", row.parts}};
    additions.push_back(std::move(a));
  }
  out["additions"] = std::move(additions);
  out["total_ibu_before"] = rounded(result.before.total_ibu, 3);
  out["total_ibu_after"] = rounded(result.after.total_ibu, 3);
  if (intervals != nullptr) {
    put_interval(out, "total_ibu_before", intervals->before.total);
    put_interval(out, "total_ibu_after", intervals->after.total);
    out["interval"] = interval_json(intervals->before.monte_carlo || intervals->after.monte_carlo);
  }
  out["absorbed_by"] = result.absorber ? json(result.additions[*result.absorber].index + 1) : json(nullptr);
  out["ibu_change_absorbed"] = rounded(result.ibu_change_absorbed, 3);
  out["whirlpool_scaled"] = result.whirlpool_scaled;
  json shortfalls = json::array();
  for (const auto& s : result.shortfalls)
    shortfalls.push_back({{"variety", s.variety},
                          {"lot", s.lot},
                          {"needed_g", rounded(s.needed_g, 3)},
                          {"on_hand_g", rounded(s.on_hand_g, 3)},
                          {"short_g", rounded(s.needed_g - s.on_hand_g, 3)}});
  out["shortfalls"] = std::move(shortfalls);
  json without = json::array();
  for (const std::size_t index : result.without_lot) without.push_back(index + 1);
  out["additions_without_lot"] = std::move(without);
  out["lots_without_amount"] = result.lots_without_amount;
  out["split_additions"] = split_additions_json(result, intervals);
  return out;
}

nlohmann::json rebalance_to_json(const Recipe& recipe, const RebalanceContext& context, const RebalanceResult& result) {
  using nlohmann::json;
  json out;
  out["recipe"] = recipe.name;
  out["model"] = std::string(to_string(result.before.settings.model));
  out["brewhouse"] = brewhouse_json(result.before.settings);
  out["on"] = format_date(context.on);
  json lots = json::array();
  for (const auto& lot : context.lots) {
    json l;
    l["variety"] = lot.variety;
    l["lot"] = lot.lot_code.empty() ? json(nullptr) : json(lot.lot_code);
    l["alpha_acid"] = rounded(lot.alpha_percent, 4);
    l["alpha_acid_certificate"] = lot.certificate_alpha ? json(rounded(*lot.certificate_alpha, 4)) : json(nullptr);
    l["packaged"] = lot.packaged ? json(format_date(*lot.packaged)) : json(nullptr);
    l["days"] = lot.days;
    l["remaining"] = rounded(lot.remaining, 5);
    l["stability_percent"] = lot.stability_percent ? json(rounded(*lot.stability_percent, 3)) : json(nullptr);
    l["stability_source"] = lot.stability_source;
    l["total_oil"] = lot.total_oil ? json(rounded(*lot.total_oil, 4)) : json(nullptr);
    l["on_hand_g"] = lot.on_hand_g ? json(rounded(*lot.on_hand_g, 3)) : json(nullptr);
    if (!lot.chosen.empty()) l["chosen"] = lot.chosen;
    l["stale"] = lot.stale;
    if (lot.stale) l["stale_reason"] = lot.stale_reason;
    lots.push_back(std::move(l));
  }
  out["lots"] = std::move(lots);
  out.update(rebalance_changes_json(result, context.intervals));
  std::vector<std::string> notes = result.notes;
  notes.insert(notes.end(), result.before.notes.begin(), result.before.notes.end());
  out["notes"] = notes;
  out["cautions"] = cautions_for(recipe);
  return out;
}

}  // namespace bine

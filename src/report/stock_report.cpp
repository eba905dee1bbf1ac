#include "report/stock_report.hpp"

#include <fmt/format.h>

#include "report/csv_sheet.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

std::string hsi_cell(const StockLine& line) {
  if (!line.lot.hsi || !line.hsi_loss_percent) return "not measured";
  return fmt::format("{:.2f} ({:.1f} % lost)", *line.lot.hsi, *line.hsi_loss_percent);
}

std::string keeps_cell(const StockLine& line) {
  if (!line.days_until_stale) return "not aged";
  if (*line.days_until_stale == 0) return "below now";
  return fmt::format("{} days", *line.days_until_stale);
}

void render_lots(std::ostream& out, const StockView& view, UnitSystem units) {
  TextTable table({{"Lot"},
                   {"Variety"},
                   {"Alpha today", Align::right},
                   {"Left", Align::right},
                   {"HSI"},
                   {"Stale"},
                   {"Until stale", Align::right},
                   {"On hand", Align::right}});
  for (const StockLine& line : view.lots) {
    const std::string alpha = line.alpha_today ? fmt::format("{:.2f} %", *line.alpha_today) : "unknown";
    const std::string left = line.aged ? fmt::format("{:.0f} %", 100.0 * line.remaining) : "-";
    table.add_row({line.code, line.lot.variety, alpha, left, hsi_cell(line), line.stale ? "STALE" : "no",
                   keeps_cell(line), line.lot.on_hand_g ? format_mass(*line.lot.on_hand_g, units) : "not given"});
  }
  table.render(out, "  ");
}

void render_totals(std::ostream& out, const StockView& view, UnitSystem units) {
  TextTable table({{"Variety"}, {"Lots", Align::right}, {"On hand", Align::right}, {"Of it stale", Align::right}});
  double all = 0.0;
  for (const VarietyTotal& total : view.totals) {
    table.add_row({total.variety, fmt::format("{}", total.lots), format_mass(total.on_hand_g, units),
                   total.stale_g == 0.0 ? "-" : format_mass(total.stale_g, units)});
    all += total.on_hand_g;
  }
  table.add_rule();
  table.add_row({"All", fmt::format("{}", view.lots.size()), format_mass(all, units), ""});
  table.render(out, "  ");
}

std::string signed_mass(double grams, UnitSystem units) {
  return (grams >= 0.0 ? "+" : "-") + format_mass(std::abs(grams), units);
}

}  // namespace

void render_stock_list(std::ostream& out, const StockView& view, UnitSystem units) {
  out << fmt::format("{}: {} lots on {} (alpha aged to that day; stale below {:.0f} % of the certificate alpha)\n",
                     view.name, view.lots.size(), format_date(view.on), 100.0 * view.stale_below);
  render_lots(out, view, units);
  out << "Per variety:\n";
  render_totals(out, view, units);
  for (const StockLine& line : view.lots)
    if (line.stale) out << fmt::format("  stale: {}: {}\n", line.code, line.stale_reason);
  for (const StockLine& line : view.lots)
    if (!line.aged)
      out << fmt::format("  note: {} has no alpha, packaged date or storage; {}\n", line.code,
                         line.alpha_today ? "its certificate alpha is shown unaged" : "its alpha is unknown");
  out << "Alpha aged with the storage model of bine age (Garetz 1994); until stale: days at the lot's storage "
         "until its alpha falls below the stale share.\n";
}

nlohmann::json stock_list_to_json(const StockView& view) {
  nlohmann::json out;
  out["stock"] = view.name;
  out["on"] = format_date(view.on);
  out["stale_below"] = view.stale_below;
  out["lots"] = nlohmann::json::array();
  for (const StockLine& line : view.lots) {
    nlohmann::json j;
    j["lot"] = line.code;
    j["variety"] = line.lot.variety;
    j["alpha_today"] = line.alpha_today ? nlohmann::json(rounded(*line.alpha_today, 4)) : nlohmann::json();
    j["aged"] = line.aged;
    j["remaining"] = line.aged ? nlohmann::json(rounded(line.remaining, 6)) : nlohmann::json();
    j["days_stored"] = line.days;
    j["stability_percent"] = rounded(line.stability_percent, 4);
    j["stability_source"] = line.stability_source;
    j["hsi"] = line.lot.hsi ? nlohmann::json(*line.lot.hsi) : nlohmann::json();
    j["hsi_loss_percent"] =
        line.hsi_loss_percent ? nlohmann::json(rounded(*line.hsi_loss_percent, 3)) : nlohmann::json();
    j["stale"] = line.stale;
    j["stale_reason"] = line.stale_reason;
    j["days_until_stale"] = line.days_until_stale ? nlohmann::json(*line.days_until_stale) : nlohmann::json();
    j["on_hand_g"] = line.lot.on_hand_g ? nlohmann::json(rounded(*line.lot.on_hand_g, 2)) : nlohmann::json();
    out["lots"].push_back(j);
  }
  out["varieties"] = nlohmann::json::array();
  for (const VarietyTotal& total : view.totals)
    out["varieties"].push_back({{"variety", total.variety},
                                {"lots", total.lots},
                                {"on_hand_g", rounded(total.on_hand_g, 2)},
                                {"stale_g", rounded(total.stale_g, 2)}});
  return out;
}

std::string stock_list_to_csv(const StockView& view) {
  CsvSheet sheet({"lot", "variety", "form", "certificate alpha (%)", "packaged", "stored at (C)", "package",
                  "days stored (days)", "alpha today (%)", "aged", "alpha left (fraction of certificate)",
                  "stability (% of alpha left after 6 months at 20 C)", "stability from", "HSI", "HSI loss (%)",
                  "stale", "stale reason", "days until stale (days)", "on hand (g)"});
  const auto rounded_or_null = [](const std::optional<double>& value, int decimals) {
    return value ? std::optional<double>(rounded(*value, decimals)) : std::nullopt;
  };
  for (const StockLine& line : view.lots) {
    const Lot& lot = line.lot;
    sheet.add_row({line.code, lot.variety, std::string(to_string(lot.form)), csv_number(lot.alpha_acid),
                   lot.packaged ? format_date(*lot.packaged) : "",
                   lot.storage ? csv_number(lot.storage->temperature_c) : "",
                   lot.storage ? std::string(to_string(lot.storage->package)) : "", fmt::format("{}", line.days),
                   csv_number(rounded_or_null(line.alpha_today, 4)), csv_bool(line.aged),
                   line.aged ? csv_number(rounded(line.remaining, 6)) : "",
                   csv_number(rounded(line.stability_percent, 4)), line.stability_source, csv_number(lot.hsi),
                   csv_number(rounded_or_null(line.hsi_loss_percent, 3)), csv_bool(line.stale), line.stale_reason,
                   line.days_until_stale ? fmt::format("{}", *line.days_until_stale) : "",
                   csv_number(rounded_or_null(lot.on_hand_g, 2))});
  }
  return sheet.str();
}

void render_change(std::ostream& out, const JournalEntry& entry, UnitSystem units) {
  out << fmt::format("journal entry {} ({}{}):\n", entry.id, entry.command,
                     entry.undoes ? fmt::format(" of entry {}", *entry.undoes) : std::string());
  for (const LotChange& change : entry.changes) {
    out << fmt::format("  {} {}: {} -> {} ({}){}\n", change.lot, change.variety, format_mass(change.before_g, units),
                       format_mass(change.after_g, units), signed_mass(change.after_g - change.before_g, units),
                       change.kind == LotChangeKind::added     ? ", new lot"
                       : change.kind == LotChangeKind::removed ? ", lot taken out"
                                                               : "");
  }
}

void render_history(std::ostream& out, const std::vector<JournalEntry>& entries, UnitSystem units) {
  if (entries.empty()) {
    out << "No journal entries.\n";
    return;
  }
  for (const JournalEntry& entry : entries) {
    std::string what = entry.command;
    if (!entry.recipe.empty()) what += fmt::format(" {} x{} on {}", entry.recipe, entry.batches, entry.on);
    if (entry.undoes) what += fmt::format(" of entry {}", *entry.undoes);
    if (!entry.reason.empty()) what += fmt::format(" ({})", entry.reason);
    out << fmt::format("{:>4}  {}  {}\n", entry.id, entry.time, what);
    for (const LotChange& change : entry.changes)
      out << fmt::format("        {} {}: {} -> {} ({})\n", change.lot, change.variety,
                         format_mass(change.before_g, units), format_mass(change.after_g, units),
                         signed_mass(change.after_g - change.before_g, units));
  }
}

nlohmann::json history_to_json(const std::vector<JournalEntry>& entries) {
  nlohmann::json out = nlohmann::json::array();
  for (const JournalEntry& entry : entries) out.push_back(nlohmann::json::parse(entry_to_json(entry).dump()));
  return out;
}

nlohmann::json stock_use_to_json(const JournalEntry& entry, const std::vector<RebalancedAddition>& additions,
                                 const std::string& stock_file, const std::string& journal_file) {
  const double batches = static_cast<double>(entry.batches);
  nlohmann::json rows = nlohmann::json::array();
  for (const RebalancedAddition& row : additions)
    rows.push_back({{"addition", row.index + 1},
                    {"part", row.part},
                    {"parts", row.parts},
                    {"variety", row.variety},
                    {"use", std::string(to_string(row.use))},
                    {"lot", row.lot},
                    {"alpha_percent", row.alpha_after},
                    {"grams_as_written_per_batch", ledger_grams(row.grams_before)},
                    {"grams_per_batch", ledger_grams(row.grams_after)},
                    {"grams", ledger_grams(row.grams_after * batches)}});
  nlohmann::json lots = nlohmann::json::array();
  for (const LotChange& change : entry.changes)
    lots.push_back({{"index", change.index},
                    {"lot", change.lot},
                    {"variety", change.variety},
                    {"before_g", change.before_g},
                    {"after_g", change.after_g},
                    {"taken_g", ledger_grams(change.before_g - change.after_g)}});
  return {{"command", "use"},
          {"journal_entry", entry.id},
          {"recipe", entry.recipe},
          {"recipe_file", entry.recipe_file},
          {"recipe_sha256", entry.recipe_sha256},
          {"batches", entry.batches},
          {"on", entry.on},
          {"additions", rows},
          {"lots", lots},
          {"stock_file", stock_file},
          {"journal_file", journal_file}};
}

}  // namespace bine

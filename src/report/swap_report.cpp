#include "report/swap_report.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cmath>

#include "report/catalog_report.hpp"
#include "report/csv_sheet.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

nlohmann::json range_or_null(const std::optional<Range>& range) {
  if (!range) return nullptr;
  return nlohmann::json::array({rounded(range->min, 2), rounded(range->max, 2)});
}

nlohmann::json chemistry_json(const Variety& v) {
  return {{"alpha_acid_percent", range_or_null(v.alpha_acid)},
          {"beta_acid_percent", range_or_null(v.beta_acid)},
          {"cohumulone_percent_of_alpha", range_or_null(v.cohumulone)},
          {"total_oil_ml_per_100g", range_or_null(v.total_oil)}};
}

nlohmann::json aroma_json(const Eigen::VectorXd& aroma, const std::vector<std::string>& axes) {
  nlohmann::json out = nlohmann::json::object();
  for (std::size_t a = 0; a < axes.size() && static_cast<Eigen::Index>(a) < aroma.size(); ++a)
    if (aroma[static_cast<Eigen::Index>(a)] != 0.0) out[axes[a]] = rounded(aroma[static_cast<Eigen::Index>(a)], 2);
  return out;
}

std::vector<std::string> difference_words(const Substitute& s) {
  std::vector<std::string> words;
  for (const auto& d : s.differences) words.push_back((d.delta > 0.0 ? "more " : "less ") + d.axis);
  return words;
}

std::string name_of(const Substitute& s) {
  return s.lot ? fmt::format("{} ({})", s.variety.name, s.lot->lot) : s.variety.name;
}

std::string factor_text(const Substitute& s) {
  if (!s.amount_factor) return s.amount_basis;
  return fmt::format("{:.2f} g/g", *s.amount_factor);
}

std::string words_text(const Substitute& s, const SwapResult& r) {
  if (!r.missing_aroma.size() || r.missing_source == AromaSource::none || s.aroma_source == AromaSource::none)
    return "n/a (no aroma data)";
  return differences_in_words(s.differences);
}

std::string chemistry_cell(const std::optional<Range>& range, std::string_view unit) { return range_text(range, unit); }

/// The two-variety blends that beat the best single substitute, with grams per gram of the missing one.
void render_pairs(std::ostream& out, const SwapResult& r) {
  out << "\nTwo-variety blends that match better than the best single substitute (shares by weight)\n";
  TextTable pairs({{"Blend", Align::left},
                   {"Shares", Align::right},
                   {"Per g of " + r.missing.name, Align::right},
                   {"Similarity", Align::right}});
  for (const auto& p : r.pairs) {
    const auto label = [&](int i) {
      return p.lots[i].empty() ? p.varieties[i] : fmt::format("{} ({})", p.varieties[i], p.lots[i]);
    };
    const auto per_gram = [&](int i) {
      return p.grams_per_gram[i] ? fmt::format("{:.2f} g", *p.grams_per_gram[i]) : std::string("n/a");
    };
    pairs.add_row({label(0) + " + " + label(1),
                   fmt::format("{:.0f} % + {:.0f} %", 100.0 * p.shares[0], 100.0 * p.shares[1]),
                   per_gram(0) + " + " + per_gram(1), fmt::format("{:.0f}/100", p.similarity)});
  }
  pairs.render(out);
}

}  // namespace

nlohmann::json swap_to_json(const SwapResult& r, bool with_pairs) {
  nlohmann::json out;
  out["query"] = {{"variety", r.missing.name},
                  {"aroma", aroma_json(r.missing_aroma, r.axes)},
                  {"aroma_source", std::string(to_string(r.missing_source))},
                  {"chemistry", chemistry_json(r.missing)}};
  out["for"] = std::string(to_string(r.purpose));
  out["index"] = r.index_kind == IndexKind::exact ? "exact" : "hnsw";
  out["candidates"] = r.candidates;
  if (r.from_stock) {
    out["stock"] = {{"name", r.stock_name}, {"on", r.on ? format_date(*r.on) : ""}};
  } else {
    out["stock"] = nullptr;
  }
  nlohmann::json list = nlohmann::json::array();
  for (const auto& s : r.substitutes) {
    nlohmann::json item;
    item["variety"] = s.variety.name;
    item["lot"] = s.lot ? nlohmann::json(s.lot->lot) : nlohmann::json(nullptr);
    item["on_hand_g"] =
        (s.lot && s.lot->on_hand_g) ? nlohmann::json(rounded(*s.lot->on_hand_g, 1)) : nlohmann::json(nullptr);
    item["alpha_today_percent"] = s.alpha_today ? nlohmann::json(rounded(*s.alpha_today, 2)) : nlohmann::json(nullptr);
    if (s.lot) {
      item["alpha_note"] = s.alpha_note;
      item["stale"] = s.stale;
      if (s.stale) item["stale_reason"] = s.stale_reason;
    }
    item["similarity"] = rounded(s.similarity, 1);
    item["confidence"] = rounded(s.confidence, 2);
    item["amount_factor"] = s.amount_factor ? nlohmann::json(rounded(*s.amount_factor, 3)) : nlohmann::json(nullptr);
    item["amount_basis"] = s.amount_basis;
    item["differences"] = difference_words(s);
    nlohmann::json delta = nlohmann::json::object();
    for (const auto& d : s.differences) delta[d.axis] = rounded(d.delta, 2);
    item["aroma_delta"] = delta;
    item["aroma"] = aroma_json(s.aroma, r.axes);
    item["aroma_source"] = std::string(to_string(s.aroma_source));
    item["chemistry"] = chemistry_json(s.variety);
    list.push_back(item);
  }
  out["substitutes"] = list;
  if (with_pairs) {
    nlohmann::json pairs = nlohmann::json::array();
    for (const auto& p : r.pairs) {
      nlohmann::json item{{"varieties", p.varieties},
                          {"shares", {rounded(p.shares[0], 3), rounded(p.shares[1], 3)}},
                          {"similarity", rounded(p.similarity, 1)}};
      if (!p.lots[0].empty() || !p.lots[1].empty()) item["lots"] = p.lots;
      nlohmann::json per_gram = nlohmann::json::array();
      for (const auto& g : p.grams_per_gram) per_gram.push_back(g ? nlohmann::json(rounded(*g, 3)) : nullptr);
      item["grams_per_gram"] = per_gram;
      pairs.push_back(item);
    }
    out["pairs"] = pairs;
  }
  out["notes"] = r.notes;
  return out;
}

std::string swap_to_csv(const SwapResult& r, bool with_pairs) {
  CsvSheet sheet({"kind", "rank", "variety", "lot", "on hand (g)", "alpha today (%)", "stale", "similarity (0-100)",
                  "confidence (0-1)", "g per g replaced (g/g)", "share (fraction by weight)", "amount basis",
                  "aroma differences"});
  const auto maybe = [](const std::optional<double>& value, int decimals) {
    return value ? csv_number(rounded(*value, decimals)) : std::string();
  };
  for (std::size_t i = 0; i < r.substitutes.size(); ++i) {
    const Substitute& s = r.substitutes[i];
    sheet.add_row({"substitute", std::to_string(i + 1), s.variety.name, s.lot ? s.lot->lot : "",
                   maybe(s.lot ? s.lot->on_hand_g : std::nullopt, 1), maybe(s.alpha_today, 2),
                   s.lot ? csv_bool(s.stale) : "", csv_number(rounded(s.similarity, 1)),
                   csv_number(rounded(s.confidence, 2)), maybe(s.amount_factor, 3), "", s.amount_basis,
                   fmt::format("{}", fmt::join(difference_words(s), ", "))});
  }
  if (with_pairs)
    for (std::size_t p = 0; p < r.pairs.size(); ++p)
      for (std::size_t k = 0; k < 2; ++k) {
        const SubstitutePair& pair = r.pairs[p];
        sheet.add_row({"blend", std::to_string(p + 1), pair.varieties[k], pair.lots[k], "", "", "",
                       csv_number(rounded(pair.similarity, 1)), "", maybe(pair.grams_per_gram[k], 3),
                       csv_number(rounded(pair.shares[k], 3)), "", ""});
      }
  return sheet.str();
}

void render_swap(std::ostream& out, const SwapResult& r, UnitSystem units, bool with_pairs) {
  out << fmt::format("Substitutes for {} ({} swap", r.missing.name, to_string(r.purpose));
  if (r.from_stock)
    out << fmt::format("; lots on hand in {}, alpha aged to {}", r.stock_name, r.on ? format_date(*r.on) : "?");
  out << ")\n";
  out << fmt::format("Amount factor: grams of substitute per gram of {} that hold the {}.\n\n", r.missing.name,
                     r.purpose == SwapPurpose::aroma ? "oil delivered (aroma)" : "IBU (alpha acid)");

  std::vector<TextTable::Column> columns{{"#", Align::right}, {"Substitute", Align::left}};
  if (r.from_stock) {
    columns.push_back({"Lot", Align::left});
    columns.push_back({"On hand", Align::right});
    columns.push_back({"Alpha today", Align::right});
  }
  columns.insert(columns.end(), {{"Similarity", Align::right},
                                 {"Confidence", Align::right},
                                 {"Amount factor", Align::right},
                                 {"Aroma differences", Align::left}});
  TextTable table(columns);
  for (std::size_t i = 0; i < r.substitutes.size(); ++i) {
    const Substitute& s = r.substitutes[i];
    std::vector<std::string> row{std::to_string(i + 1), s.variety.name};
    if (r.from_stock) {
      row.push_back(s.lot ? s.lot->lot : "");
      row.push_back((s.lot && s.lot->on_hand_g) ? format_mass(*s.lot->on_hand_g, units) : "n/a");
      row.push_back(s.alpha_today ? fmt::format("{:.1f} %{}", *s.alpha_today, s.stale ? " (stale)" : "") : "n/a");
    }
    row.insert(row.end(), {fmt::format("{:.0f}/100", s.similarity), fmt::format("{:.0f} %", 100.0 * s.confidence),
                           factor_text(s), words_text(s, r)});
    table.add_row(row);
  }
  table.render(out);
  if (r.from_stock) {
    out << "\nLots on the brew day\n";
    for (const auto& s : r.substitutes)
      if (s.lot) {
        out << fmt::format("  {}: {}\n", name_of(s), s.alpha_note);
        if (s.stale) out << fmt::format("    stale: {}; ranked below every fresh lot\n", s.stale_reason);
      }
  }

  out << "\nChemistry side by side (catalog ranges)\n";
  TextTable chem({{"Variety", Align::left},
                  {"Alpha", Align::right},
                  {"Beta", Align::right},
                  {"Cohumulone", Align::right},
                  {"Total oil", Align::right}});
  auto chem_row = [&](const std::string& label, const Variety& v) {
    chem.add_row({label, chemistry_cell(v.alpha_acid, "%"), chemistry_cell(v.beta_acid, "%"),
                  chemistry_cell(v.cohumulone, "% of alpha"), chemistry_cell(v.total_oil, "mL/100 g")});
  };
  chem_row(r.missing.name + " (missing)", r.missing);
  chem.add_rule();
  for (const auto& s : r.substitutes) chem_row(name_of(s), s.variety);
  chem.render(out);

  if (with_pairs && !r.pairs.empty()) render_pairs(out, r);
  if (!r.notes.empty()) {
    out << '\n';
    for (const auto& note : r.notes) out << "Note: " << note << '\n';
  }
  out << "\nSimilarity compares descriptors, not taste: smell a substitute before committing a batch.\n";
  if (r.purpose == SwapPurpose::aroma)
    out << "Dry hopping can restart fermentation (hop creep): package only after gravity is stable for several days.\n";
  out << "Hops are toxic to dogs: keep spent hops out of their reach.\n";
}

}  // namespace bine

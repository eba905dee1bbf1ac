#include "report/swap_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <sstream>
#include <tuple>

#include "report/catalog_report.hpp"
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

// Grouped bars: for each aroma axis, the missing variety's intensity beside the substitute's (0-5).
std::string aroma_chart(const SwapResult& r, const Substitute& s) {
  const double group = 44.0, bar = 16.0, height = 150.0, top = 20.0, left = 34.0;
  const double width = left + group * static_cast<double>(r.axes.size()) + 10.0;
  std::string svg = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{:.0f}\" height=\"{:.0f}\" role=\"img\" "
      "aria-label=\"aroma of {} and {}\">\n",
      width, top + height + 70.0, html_escape(r.missing.name), html_escape(name_of(s)));
  for (int level = 0; level <= 5; ++level) {
    const double y = top + height - height * level / 5.0;
    svg += fmt::format(
        "<line x1=\"{:.0f}\" y1=\"{:.1f}\" x2=\"{:.0f}\" y2=\"{:.1f}\" class=\"grid\"/>"
        "<text x=\"{:.0f}\" y=\"{:.1f}\" class=\"tick\">{}</text>\n",
        left, y, width - 10.0, y, left - 6.0, y + 4.0, level);
  }
  for (std::size_t a = 0; a < r.axes.size(); ++a) {
    const auto i = static_cast<Eigen::Index>(a);
    const double x = left + group * static_cast<double>(a) + 5.0;
    const double want = i < r.missing_aroma.size() ? r.missing_aroma[i] : 0.0;
    const double got = i < s.aroma.size() ? s.aroma[i] : 0.0;
    svg += fmt::format(
        "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.0f}\" height=\"{:.1f}\" class=\"want\">"
        "<title>{} {}: {:.1f}</title></rect>\n",
        x, top + height - height * want / 5.0, bar, height * want / 5.0, html_escape(r.missing.name),
        html_escape(r.axes[a]), want);
    svg += fmt::format(
        "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.0f}\" height=\"{:.1f}\" class=\"got\">"
        "<title>{} {}: {:.1f}</title></rect>\n",
        x + bar, top + height - height * got / 5.0, bar, height * got / 5.0, html_escape(name_of(s)),
        html_escape(r.axes[a]), got);
    svg +=
        fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" class=\"axis\" transform=\"rotate(40 {:.1f} {:.1f})\">{}</text>\n",
                    x + 4.0, top + height + 14.0, x + 4.0, top + height + 14.0, html_escape(r.axes[a]));
  }
  svg += "</svg>\n";
  return svg;
}

std::string chemistry_cell(const std::optional<Range>& range, std::string_view unit) { return range_text(range, unit); }

std::optional<double> mid_of(const std::optional<Range>& range) {
  if (!range) return std::nullopt;
  return range->mid();
}

/// The three values a bittering swap turns on: alpha (the lot's today when from stock), beta and
/// cohumulone (catalog midpoints unless the lot has its own beta).
std::array<std::optional<double>, 3> bittering_values(const Variety& variety, const Substitute* s) {
  std::optional<double> alpha = mid_of(variety.alpha_acid);
  std::optional<double> beta = mid_of(variety.beta_acid);
  if (s != nullptr && s->alpha_today) alpha = s->alpha_today;
  if (s != nullptr && s->lot && s->lot->beta_acid) beta = s->lot->beta_acid;
  return {alpha, beta, mid_of(variety.cohumulone)};
}

// Grouped bars for a bittering swap: alpha acid, beta acid and cohumulone of the missing variety
// beside the substitute's, in %, on one scale up to the largest value rounded up to 10 %.
std::string chemistry_chart(const SwapResult& r, const Substitute& s) {
  const std::array<std::string_view, 3> labels{"alpha acid %", "beta acid %", "cohumulone % of alpha"};
  const auto want = bittering_values(r.missing, nullptr);
  const auto got = bittering_values(s.variety, &s);
  double most = 10.0;
  for (std::size_t k = 0; k < 3; ++k) most = std::max({most, want[k].value_or(0.0), got[k].value_or(0.0)});
  const double scale = 10.0 * std::ceil(most / 10.0);
  const double group = 120.0, bar = 30.0, height = 150.0, top = 20.0, left = 34.0;
  const double width = left + group * 3.0 + 10.0;
  std::string svg = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{:.0f}\" height=\"{:.0f}\" role=\"img\" "
      "aria-label=\"alpha, beta and cohumulone of {} and {}\">\n",
      width, top + height + 40.0, html_escape(r.missing.name), html_escape(name_of(s)));
  for (int level = 0; level <= 5; ++level) {
    const double y = top + height - height * level / 5.0;
    svg += fmt::format(
        "<line x1=\"{:.0f}\" y1=\"{:.1f}\" x2=\"{:.0f}\" y2=\"{:.1f}\" class=\"grid\"/>"
        "<text x=\"{:.0f}\" y=\"{:.1f}\" class=\"tick\">{:.0f}</text>\n",
        left, y, width - 10.0, y, left - 6.0, y + 4.0, scale * level / 5.0);
  }
  for (std::size_t k = 0; k < 3; ++k) {
    const double x = left + group * static_cast<double>(k) + 20.0;
    for (const auto& [value, offset, css, who] :
         {std::tuple{want[k], 0.0, "want", r.missing.name}, std::tuple{got[k], bar, "got", name_of(s)}}) {
      if (!value) continue;
      svg += fmt::format(
          "<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.0f}\" height=\"{:.1f}\" class=\"{}\">"
          "<title>{} {}: {:.1f}</title></rect>\n",
          x + offset, top + height - height * *value / scale, bar, height * *value / scale, css, html_escape(who),
          labels[k], *value);
    }
    svg += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" class=\"axis\">{}</text>\n", x, top + height + 16.0, labels[k]);
  }
  svg += "</svg>\n";
  return svg;
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
    if (s.lot) item["alpha_note"] = s.alpha_note;
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
      row.push_back(s.alpha_today ? fmt::format("{:.1f} %", *s.alpha_today) : "n/a");
    }
    row.insert(row.end(), {fmt::format("{:.0f}/100", s.similarity), fmt::format("{:.0f} %", 100.0 * s.confidence),
                           factor_text(s), words_text(s, r)});
    table.add_row(row);
  }
  table.render(out);

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

  if (with_pairs && !r.pairs.empty()) {
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
  if (!r.notes.empty()) {
    out << '\n';
    for (const auto& note : r.notes) out << "Note: " << note << '\n';
  }
  out << "\nSimilarity compares descriptors, not taste: smell a substitute before committing a batch.\n";
  if (r.purpose == SwapPurpose::aroma)
    out << "Dry hopping can restart fermentation (hop creep): package only after gravity is stable for several days.\n";
  out << "Hops are toxic to dogs: keep spent hops out of their reach.\n";
}

std::string swap_html(const SwapResult& r, UnitSystem units, bool with_pairs) {
  std::ostringstream text;
  render_swap(text, r, units, with_pairs);
  std::string html =
      "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>bine swap: " +
      html_escape(r.missing.name) +
      "</title>\n<style>\n"
      "body{font-family:sans-serif;margin:2em;color:#222;max-width:70em}\n"
      "h1{font-size:1.4em}h2{font-size:1.1em;margin-top:1.6em}\n"
      "pre{background:#f4f4f2;padding:1em;overflow-x:auto;font-size:.85em}\n"
      ".grid{stroke:#ddd;stroke-width:1}.tick{font-size:10px;text-anchor:end;fill:#666}\n"
      ".axis{font-size:11px;fill:#333}.want{fill:#4d4d4d}.got{fill:#9bb0a5}\n"
      ".key span{display:inline-block;width:.9em;height:.9em;margin:0 .3em 0 1em;vertical-align:middle}\n"
      "</style>\n</head>\n<body>\n";
  html +=
      "<h1>Substitutes for " + html_escape(r.missing.name) + " (" + std::string(to_string(r.purpose)) + " swap)</h1>\n";
  const std::size_t charts = std::min<std::size_t>(3, r.substitutes.size());
  for (std::size_t i = 0; i < charts; ++i) {
    const Substitute& s = r.substitutes[i];
    html += fmt::format("<h2>{}. {}: similarity {:.0f}/100</h2>\n", i + 1, html_escape(name_of(s)), s.similarity);
    const bool bittering = r.purpose == SwapPurpose::bittering;
    html += fmt::format(
        "<p class=\"key\"><span class=\"want\" style=\"background:#4d4d4d\"></span>{} "
        "<span style=\"background:#9bb0a5\"></span>{} ({})</p>\n",
        html_escape(r.missing.name), html_escape(name_of(s)),
        bittering ? "alpha and beta acid in %, cohumulone in % of alpha" : "aroma intensity 0-5");
    html += bittering ? chemistry_chart(r, s) : aroma_chart(r, s);
  }
  html += "<h2>Details</h2>\n<pre>" + html_escape(text.str()) + "</pre>\n</body>\n</html>\n";
  return html;
}

}  // namespace bine

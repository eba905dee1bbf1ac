// bine swap --html: the ranked substitutes, and the aroma (or, for a bittering swap, the alpha,
// beta and cohumulone) of the missing variety beside each of the best three.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

using html::Cell;

std::string lot_name(const Substitute& s) {
  return s.lot ? fmt::format("{} ({})", s.variety.name, s.lot->lot) : s.variety.name;
}

std::string sub_pointer(std::size_t i, std::string_view key) { return fmt::format("/substitutes/{}/{}", i, key); }

std::string ranking_table(const SwapResult& r, UnitSystem units) {
  std::vector<html::Column> columns{{"substitute, best first"}};
  if (r.from_stock)
    columns.insert(columns.end(), {{"lot", false, true}, {"on hand", true}, {"alpha on brew day", true}});
  columns.insert(columns.end(),
                 {{"similarity", true}, {"confidence", true}, {"g per g replaced", true}, {"aroma differences"}});
  html::Table table("Scale each addition by the grams per gram replaced", columns);
  for (std::size_t i = 0; i < r.substitutes.size(); ++i) {
    const Substitute& s = r.substitutes[i];
    std::vector<Cell> row{fmt::format("{}. {}", i + 1, s.variety.name)};
    if (r.from_stock) {
      row.push_back(s.lot ? s.lot->lot : "-");
      row.push_back((s.lot && s.lot->on_hand_g) ? html::mass_cell(*s.lot->on_hand_g, units, sub_pointer(i, "on_hand_g"))
                                                : Cell("n/a"));
      row.push_back(s.alpha_today ? html::number_cell(*s.alpha_today, 1, " %", sub_pointer(i, "alpha_today_percent"))
                                  : Cell("n/a"));
    }
    row.push_back(html::number_cell(s.similarity, 0, "/100", sub_pointer(i, "similarity")));
    row.push_back(html::number_cell(s.confidence, 0, " %", sub_pointer(i, "confidence"), 100.0));
    row.push_back(s.amount_factor ? html::number_cell(*s.amount_factor, 2, " g/g", sub_pointer(i, "amount_factor"))
                                  : Cell(s.amount_basis, sub_pointer(i, "amount_basis")));
    row.push_back(s.differences.empty() ? "close on every aroma axis" : differences_in_words(s.differences));
    table.add_row(std::move(row));
  }
  return table.str();
}

std::string chemistry_table(const SwapResult& r) {
  html::Table table(
      "Catalog ranges",
      {{"variety"}, {"alpha acid", true}, {"beta acid", true}, {"cohumulone (of alpha)", true}, {"total oil", true}});
  const auto row = [&](const std::string& label, const Variety& v, const std::string& base) {
    table.add_row({label, html::range_cell(v.alpha_acid, "%", base + "/alpha_acid_percent"),
                   html::range_cell(v.beta_acid, "%", base + "/beta_acid_percent"),
                   html::range_cell(v.cohumulone, "%", base + "/cohumulone_percent_of_alpha"),
                   html::range_cell(v.total_oil, "mL/100 g", base + "/total_oil_ml_per_100g")});
  };
  row(r.missing.name + " (missing)", r.missing, "/query/chemistry");
  for (std::size_t i = 0; i < r.substitutes.size(); ++i)
    row(lot_name(r.substitutes[i]), r.substitutes[i].variety, sub_pointer(i, "chemistry"));
  return table.str();
}

double at(const Eigen::VectorXd& v, std::size_t a) {
  const auto i = static_cast<Eigen::Index>(a);
  return i < v.size() ? v[i] : 0.0;
}

// JSON keeps only the axes above zero: a zero bar names no JSON value.
std::string aroma_pointer(const std::string& base, const std::string& axis, double value) {
  return value != 0.0 ? base + "/" + html::pointer_token(axis) : "";
}

html::BarChart aroma_chart(const SwapResult& r, std::size_t i) {
  const Substitute& s = r.substitutes[i];
  html::BarChart chart;
  chart.id = fmt::format("aroma{}", i + 1);
  chart.title = fmt::format("Aroma: {} versus {}", r.missing.name, lot_name(s));
  chart.axis_label = "aroma intensity (0-5 scale)";
  chart.axis_max = 5.0;
  chart.series = {r.missing.name + " (missing)", lot_name(s)};
  chart.description = fmt::format("Per aroma axis, intensity 0-5 of {} then {}:", r.missing.name, lot_name(s));
  for (std::size_t a = 0; a < r.axes.size(); ++a) {
    const double want = at(r.missing_aroma, a), got = at(s.aroma, a);
    if (want < 0.05 && got < 0.05) continue;
    chart.rows.push_back(
        {r.axes[a],
         {want, got},
         {fmt::format("{:.1f}", want), fmt::format("{:.1f}", got)},
         {aroma_pointer("/query/aroma", r.axes[a], want), aroma_pointer(sub_pointer(i, "aroma"), r.axes[a], got)}});
    chart.description += fmt::format(" {} {:.1f} and {:.1f};", r.axes[a], want, got);
  }
  return chart;
}

// The substitute's alpha on the chart: its lot's on the brew day where the report has one (the
// alpha the grams per gram were worked from), else the middle of the catalog range.
bool lot_alpha(const Substitute& s) { return s.lot && s.alpha_today; }

// A bittering swap compares what sets the bitterness: alpha, beta and cohumulone (range midpoints,
// and the lot's alpha on the brew day where there is a lot).
html::BarChart bitter_chart(const SwapResult& r, std::size_t i) {
  const Substitute& s = r.substitutes[i];
  html::BarChart chart;
  chart.id = fmt::format("bitter{}", i + 1);
  chart.title = fmt::format("Bittering acids: {} versus {}", r.missing.name, lot_name(s));
  chart.axis_label = "percent";
  chart.series = {r.missing.name + " (missing)", lot_name(s)};
  const std::string day = r.on ? format_date(*r.on) : "today";
  chart.note = lot_alpha(s) ? fmt::format(
                                  "{}: alpha of lot {} on the brew day ({}), as in the table. {}: alpha, and "
                                  "every beta and cohumulone: the middle of the catalog range.",
                                  s.variety.name, s.lot->lot, day, r.missing.name)
                            : "Every value: the middle of the catalog range.";
  chart.description = fmt::format("{} Percent, {} then {}:", chart.note, r.missing.name, lot_name(s));
  const auto mid = [](const std::optional<Range>& v) { return v ? v->mid() : 0.0; };
  const auto text = [](const std::optional<Range>& v) { return v ? fmt::format("{:.1f} %", v->mid()) : "n/a"; };
  const auto add = [&](std::string_view label, const std::optional<Range>& want, const std::optional<Range>& got) {
    chart.rows.push_back({std::string(label), {mid(want), mid(got)}, {text(want), text(got)}, {}});
    chart.description += fmt::format(" {} {} and {};", label, text(want), text(got));
  };
  if (lot_alpha(s)) {
    const std::string got = fmt::format("{:.1f} %", *s.alpha_today);
    chart.rows.push_back({"alpha acid (% w/w)",
                          {mid(r.missing.alpha_acid), *s.alpha_today},
                          {text(r.missing.alpha_acid), got},
                          {"", sub_pointer(i, "alpha_today_percent")}});
    chart.description += fmt::format(" alpha acid (% w/w) {} and {};", text(r.missing.alpha_acid), got);
  } else {
    add("alpha acid (% w/w)", r.missing.alpha_acid, s.variety.alpha_acid);
  }
  add("beta acid (% w/w)", r.missing.beta_acid, s.variety.beta_acid);
  add("cohumulone (% of alpha)", r.missing.cohumulone, s.variety.cohumulone);
  return chart;
}

// The best three charted on one scale, so their bars can be compared from chart to chart.
std::vector<html::BarChart> bitter_charts(const SwapResult& r, std::size_t count) {
  std::vector<html::BarChart> charts;
  double max = 0.0;
  for (std::size_t i = 0; i < count; ++i) {
    charts.push_back(bitter_chart(r, i));
    for (const auto& row : charts.back().rows)
      for (double v : row.values) max = std::max(max, v);
  }
  for (auto& chart : charts) chart.axis_max = html::axis_end(max);
  return charts;
}

std::string pairs_table(const SwapResult& r) {
  html::Table table("Two varieties that together match better than the best single one (shares by weight)",
                    {{"blend"}, {"shares", true}, {"similarity", true}});
  for (std::size_t p = 0; p < r.pairs.size(); ++p) {
    const SubstitutePair& pair = r.pairs[p];
    const auto label = [&](int i) {
      return pair.lots[i].empty() ? pair.varieties[i] : fmt::format("{} ({})", pair.varieties[i], pair.lots[i]);
    };
    table.add_row({label(0) + " + " + label(1),
                   Cell(fmt::format("{:.0f} % + {:.0f} %", 100.0 * pair.shares[0], 100.0 * pair.shares[1]),
                        fmt::format("/pairs/{0}/shares/0 /pairs/{0}/shares/1", p), 100.0),
                   html::number_cell(pair.similarity, 0, "/100", fmt::format("/pairs/{}/similarity", p))});
  }
  return table.str();
}

std::vector<std::string> swap_cautions(const SwapResult& r) {
  std::vector<std::string> cautions;
  if (r.purpose == SwapPurpose::aroma) {
    cautions.emplace_back(hot_wort_caution());
    cautions.emplace_back(dry_hop_caution());
  }
  cautions.emplace_back(dogs_caution());
  return html::boxed(cautions);
}

}  // namespace

std::string swap_html(const SwapResult& r, UnitSystem units, bool with_pairs, const html::PageMeta& meta) {
  html::PageContent content;
  const bool aroma = r.purpose == SwapPurpose::aroma;
  content.title = fmt::format("Substitutes for {} ({} swap)", r.missing.name, to_string(r.purpose));
  content.summary =
      (r.from_stock
           ? fmt::format("Lots on hand in {}, alpha aged to {}. ", r.stock_name, r.on ? format_date(*r.on) : "today")
           : std::string("Varieties from the catalog. ")) +
      fmt::format("Grams per gram replaced hold the {}.", aroma ? "oil delivered (aroma)" : "IBU (alpha acid)");
  content.sections.push_back({"Ranked substitutes", ranking_table(r, units)});
  std::string charts;
  const std::size_t charted = std::min<std::size_t>(3, r.substitutes.size());
  if (aroma)
    for (std::size_t i = 0; i < charted; ++i) charts += html::bar_chart(aroma_chart(r, i));
  else
    for (const auto& chart : bitter_charts(r, charted)) charts += html::bar_chart(chart);
  content.sections.push_back(
      {aroma ? "Aroma, missing variety versus substitute" : "Bittering acids side by side", charts});
  content.sections.push_back({"Chemistry side by side", chemistry_table(r)});
  if (with_pairs && !r.pairs.empty()) content.sections.push_back({"Two-variety blends", pairs_table(r)});
  content.notes = r.notes;
  content.notes.emplace_back(
      "Similarity compares descriptors, not taste: smell a substitute before committing a batch.");
  content.cautions = swap_cautions(r);
  return html::page(content, meta);
}

}  // namespace bine

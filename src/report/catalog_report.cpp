#include "report/catalog_report.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>

#include "model/names.hpp"
#include "report/csv_sheet.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

nlohmann::json range_json(const Range& range) { return nlohmann::json::array({range.min, range.max}); }

// The strongest aroma axes, "citrus 4, floral 3", from explicit intensities only.
std::string leading_aromas(const Variety& variety, std::size_t count) {
  if (!variety.aroma) {
    if (variety.tags.empty()) return "no aroma data";
    std::string out = "tags: ";
    for (std::size_t i = 0; i < variety.tags.size() && i < count + 1; ++i) out += (i ? ", " : "") + variety.tags[i];
    return out;
  }
  std::vector<std::pair<double, std::string>> axes;
  for (const auto& [axis, value] : *variety.aroma)
    if (value > 0.0) axes.emplace_back(value, axis);
  std::stable_sort(axes.begin(), axes.end(), [](const auto& a, const auto& b) { return a.first > b.first; });
  std::string out;
  for (std::size_t i = 0; i < axes.size() && i < count; ++i)
    out += fmt::format("{}{} {:g}", i ? ", " : "", axes[i].second, axes[i].first);
  return out.empty() ? "neutral" : out;
}

void add_range_headers(std::vector<std::string>& headers, std::string_view what, std::string_view unit) {
  headers.push_back(fmt::format("{} min ({})", what, unit));
  headers.push_back(fmt::format("{} max ({})", what, unit));
}

void add_range_fields(std::vector<std::string>& fields, const std::optional<Range>& range) {
  fields.push_back(range ? csv_number(range->min) : "");
  fields.push_back(range ? csv_number(range->max) : "");
}

}  // namespace

std::string range_text(const std::optional<Range>& range, std::string_view unit) {
  if (!range) return "n/a";
  const std::string spacer = unit == "%" ? "" : " ";
  if (range->min == range->max) return fmt::format("{:.1f}{}{}", range->min, spacer, unit);
  return fmt::format("{:.1f}-{:.1f}{}{}", range->min, range->max, spacer, unit);
}

nlohmann::json variety_to_json(const Variety& variety) {
  nlohmann::json out;
  out["name"] = variety.name;
  if (!variety.origin.empty()) out["origin"] = variety.origin;
  if (variety.purpose) out["purpose"] = std::string(to_string(*variety.purpose));
  if (variety.alpha_acid) out["alpha_acid"] = range_json(*variety.alpha_acid);
  if (variety.beta_acid) out["beta_acid"] = range_json(*variety.beta_acid);
  if (variety.cohumulone) out["cohumulone"] = range_json(*variety.cohumulone);
  if (variety.total_oil) out["total_oil"] = range_json(*variety.total_oil);
  if (!variety.oils.empty()) {
    nlohmann::json oils;
    for (const auto& [compound, range] : variety.oils) oils[compound] = range_json(range);
    out["oils"] = std::move(oils);
  }
  if (variety.stability) out["stability"] = *variety.stability;
  if (variety.aroma) out["aroma"] = *variety.aroma;
  if (!variety.tags.empty()) out["tags"] = variety.tags;
  out["source"] = variety.source_file;
  return out;
}

nlohmann::json catalog_to_json(const Catalog& catalog) {
  nlohmann::json list = nlohmann::json::array();
  for (const auto& variety : catalog.varieties) list.push_back(variety_to_json(variety));
  return nlohmann::json{{"catalogs", catalog.names}, {"demo", catalog.demo}, {"varieties", std::move(list)}};
}

void render_catalog_list(std::ostream& out, const Catalog& catalog, const Lexicon& /*lexicon*/) {
  TextTable table({{"variety"}, {"origin"}, {"purpose"}, {"alpha", Align::right}, {"oil", Align::right}, {"aroma"}});
  std::vector<const Variety*> sorted;
  for (const auto& variety : catalog.varieties) sorted.push_back(&variety);
  std::stable_sort(sorted.begin(), sorted.end(), [](const Variety* a, const Variety* b) { return a->name < b->name; });
  for (const Variety* variety : sorted)
    table.add_row({variety->name, variety->origin, variety->purpose ? std::string(to_string(*variety->purpose)) : "",
                   range_text(variety->alpha_acid, "%"), range_text(variety->total_oil, "mL/100 g"),
                   leading_aromas(*variety, 3)});
  table.render(out);
  out << count_of(catalog.varieties.size(), "variety", "varieties");
  if (catalog.demo) out << " (includes the invented demo catalog: not real varieties or measurements)";
  out << '\n';
}

void render_variety(std::ostream& out, const Variety& variety, const Lexicon& lexicon) {
  out << variety.name << '\n';
  auto line = [&](std::string_view label, const std::string& value) {
    out << fmt::format("  {:<22}{}\n", label, value);
  };
  line("origin", variety.origin.empty() ? "n/a" : variety.origin);
  line("purpose", variety.purpose ? std::string(to_string(*variety.purpose)) : "n/a");
  line("alpha acid", range_text(variety.alpha_acid, "%"));
  line("beta acid", range_text(variety.beta_acid, "%"));
  line("cohumulone", range_text(variety.cohumulone, "% of alpha"));
  line("total oil", range_text(variety.total_oil, "mL/100 g"));
  for (const auto& compound : oil_compounds()) {
    auto it = variety.oils.find(compound);
    line(compound, it == variety.oils.end() ? "n/a" : range_text(it->second, "% of oil"));
  }
  line("storage stability",
       variety.stability ? fmt::format("{:.0f}% of alpha left after 6 months at 20 C", *variety.stability) : "n/a");
  if (variety.aroma) {
    out << "  aroma (0-5)\n";
    for (const auto& axis : lexicon.axes()) {
      auto it = variety.aroma->find(axis.name);
      const double value = it == variety.aroma->end() ? 0.0 : it->second;
      out << fmt::format("    {:<14}{:>4.1f}  {}\n", axis.name, value,
                         std::string(static_cast<std::size_t>(value * 4 + 0.5), '#'));
    }
  } else {
    line("aroma", "no intensities given");
  }
  std::string tags;
  for (const auto& tag : variety.tags) tags += (tags.empty() ? "" : ", ") + tag;
  line("descriptors", tags.empty() ? "none" : tags);
  line("from", variety.source_file);
}

std::string catalog_to_csv(const Catalog& catalog, const Lexicon& lexicon) {
  std::vector<std::string> headers{"variety", "origin", "purpose"};
  add_range_headers(headers, "alpha acid", "%");
  add_range_headers(headers, "beta acid", "%");
  add_range_headers(headers, "cohumulone", "% of alpha");
  add_range_headers(headers, "total oil", "mL/100 g");
  for (const auto& compound : oil_compounds()) add_range_headers(headers, compound, "% of oil");
  headers.emplace_back("stability (% of alpha left after 6 months at 20 C)");
  for (const auto& axis : lexicon.axes()) headers.push_back(fmt::format("aroma {} (0-5)", axis.name));
  headers.insert(headers.end(), {"tags", "catalog file"});
  CsvSheet sheet(std::move(headers));
  for (const Variety& v : catalog.varieties) {
    std::vector<std::string> row{v.name, v.origin, v.purpose ? std::string(to_string(*v.purpose)) : ""};
    add_range_fields(row, v.alpha_acid);
    add_range_fields(row, v.beta_acid);
    add_range_fields(row, v.cohumulone);
    add_range_fields(row, v.total_oil);
    for (const auto& compound : oil_compounds()) {
      const auto it = v.oils.find(compound);
      add_range_fields(row, it == v.oils.end() ? std::nullopt : std::optional<Range>(it->second));
    }
    row.push_back(csv_number(v.stability));
    for (const auto& axis : lexicon.axes()) {
      if (!v.aroma) {
        row.emplace_back();
        continue;
      }
      const auto it = v.aroma->find(axis.name);
      row.push_back(csv_number(it == v.aroma->end() ? 0.0 : it->second));
    }
    row.push_back(fmt::format("{}", fmt::join(v.tags, ", ")));
    row.push_back(v.source_file);
    sheet.add_row(std::move(row));
  }
  return sheet.str();
}

}  // namespace bine

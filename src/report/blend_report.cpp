#include "report/blend_report.hpp"

#include <fmt/format.h>

#include <cmath>
#include <string_view>

#include "report/bitterness_report.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

using Index = Eigen::Index;

std::string part_name(const BlendPart& part) {
  return part.lot.empty() ? part.variety : fmt::format("{} ({})", part.variety, part.lot);
}

/// Where the IBU to hold came from, as the brewer set it.
std::string_view source_words(IbuTargetSource source) {
  switch (source) {
    case IbuTargetSource::given:
      return "--ibu";
    case IbuTargetSource::recipe_target:
      return "the recipe's target_ibu";
    case IbuTargetSource::recipe_total:
      return "the recipe's current total";
  }
  return "";
}

/// How the part's alpha was obtained (the candidate's note), or its value when the request has none.
std::string alpha_note_of(const BlendPart& part, const BlendReportContext& context) {
  const auto& candidates = context.request->candidates;
  if (part.candidate < candidates.size() && !candidates[part.candidate].alpha_note.empty())
    return candidates[part.candidate].alpha_note;
  return fmt::format("{:.2f} %", part.alpha_percent);
}

/// The amounts, the whirlpool stand, and one row per part.
void render_parts(std::ostream& out, const BlendResult& result, const BlendReportContext& context, UnitSystem units) {
  const BlendPlan& plan = context.request->plan;
  out << fmt::format("  {} of late hops, {:.1f} mL of oil; {:.0f} % in the whirlpool",
                     format_mass(result.late_grams, units), result.oil_ml, 100.0 * plan.ibu.whirlpool_share);
  out << fmt::format(" ({} for {:.0f} min), the rest dry hop\n\n",
                     format_temperature(plan.whirlpool_temperature_c, units), plan.whirlpool_minutes);
  TextTable blend({{context.stock_mode ? "lot" : "variety"},
                   {"whirlpool", Align::right},
                   {"dry hop", Align::right},
                   {"total", Align::right},
                   {"oil share", Align::right},
                   {"IBU", Align::right}});
  for (std::size_t k = 0; k < result.parts.size(); ++k) {
    const BlendPart& part = result.parts[k];
    blend.add_row({part_name(part), format_mass(part.whirlpool_g, units), format_mass(part.dry_hop_g, units),
                   format_mass(part.grams, units), fmt::format("{:.0f} %", 100.0 * part.oil_share),
                   ibu_figure(part.whirlpool_ibu, part_range(context, k))});
  }
  blend.render(out, "  ");
  out << (context.on ? fmt::format("  alpha on the brew day, {}:\n", format_date(*context.on)) : "  alpha:\n");
  for (const auto& part : result.parts)
    out << fmt::format("    {}: {}\n", part_name(part), alpha_note_of(part, context));
}

/// Target versus blend on every axis the target or the blend uses.
void render_profile(std::ostream& out, const BlendResult& result, const BlendReportContext& context) {
  const auto axes = context.lexicon->axis_names();
  const BlendTarget& target = context.request->target;
  out << fmt::format("\nAroma, blend versus target (0-5; fit {:.2f} on the 0-5 scale, 0 is exact)\n", result.fit);
  TextTable profile({{"axis"}, {"target", Align::right}, {"blend", Align::right}, {"weight", Align::right}});
  for (Index a = 0; a < target.intensity.size(); ++a) {
    if (target.intensity[a] <= 0.0 && result.profile[a] < 0.05) continue;
    profile.add_row({axes[static_cast<std::size_t>(a)], fmt::format("{:.1f}", target.intensity[a]),
                     fmt::format("{:.1f}", result.profile[a]), fmt::format("{:.2f}", target.weight[a])});
  }
  profile.render(out, "  ");
}

/// The IBU held, part by part.
void render_ibu(std::ostream& out, const BlendResult& result, const BlendReportContext& context, UnitSystem units) {
  const BlendPlan& plan = context.request->plan;
  out << fmt::format("\nBitterness held at {:.1f} IBU ({})\n", plan.ibu.target_ibu,
                     source_words(plan.ibu.target_source));
  TextTable ibu({{"part"}, {"amount", Align::right}, {"IBU", Align::right}});
  if (plan.bittering)
    ibu.add_row({fmt::format("bittering: {} at {:.1f} % alpha, {:.0f} min",
                             plan.bittering->lot.empty() ? plan.bittering->variety
                                                         : plan.bittering->variety + " (" + plan.bittering->lot + ")",
                             plan.bittering->alpha_percent, plan.bittering->minutes),
                 format_mass(result.bittering_grams, units),
                 ibu_figure(result.bittering_ibu, bittering_range(context))});
  if (!plan.kept.empty() || plan.ibu.kept_ibu > 0.0)
    ibu.add_row({"other boil additions (kept)", "",
                 ibu_figure(plan.ibu.kept_ibu, blend_range(context, &BlendIntervals::kept))});
  ibu.add_row({"whirlpool (blend)", format_mass(result.whirlpool_grams, units),
               ibu_figure(result.late_ibu, blend_range(context, &BlendIntervals::late))});
  ibu.add_rule();
  ibu.add_row({"total", "", ibu_figure(result.total_ibu, blend_range(context, &BlendIntervals::total))});
  ibu.render(out, "  ");
  if (context.intervals != nullptr)
    out << "  "
        << interval_legend(plan.bitterness.brewhouse.has_value(), context.intervals->aged,
                           context.intervals->monte_carlo)
        << '\n';
  if (plan.bitterness.brewhouse) out << "  " << brewhouse_line(plan.bitterness) << ".\n";
}

/// The lots the blend and the charge draw on, and what is left of each.
void render_stock_left(std::ostream& out, const BlendResult& result, const BlendReportContext& context,
                       UnitSystem units) {
  const std::optional<BitteringHop>& bittering = context.request->plan.bittering;
  bool any_stock = result.bittering_left_g.has_value();
  for (const auto& part : result.parts) any_stock = any_stock || part.left_g.has_value();
  if (!any_stock) return;
  out << "\nStock left after brewing\n";
  TextTable left({{"lot"}, {"left", Align::right}});
  for (const auto& part : result.parts)
    if (part.left_g) left.add_row({part_name(part), format_mass(*part.left_g, units)});
  if (result.bittering_left_g && bittering) {
    bool listed = false;
    for (const auto& part : result.parts) listed = listed || (!part.lot.empty() && part.lot == bittering->lot);
    if (!listed)
      left.add_row({bittering->variety + " (" + bittering->lot + ")", format_mass(*result.bittering_left_g, units)});
  }
  left.render(out, "  ");
}

}  // namespace

const IbuRange* blend_range(const BlendReportContext& context, const IbuRange BlendIntervals::*which) {
  return context.intervals == nullptr ? nullptr : &(context.intervals->*which);
}

const IbuRange* part_range(const BlendReportContext& context, std::size_t k) {
  return context.intervals == nullptr ? nullptr : &context.intervals->parts[k];
}

const IbuRange* bittering_range(const BlendReportContext& context) {
  return context.intervals == nullptr || !context.intervals->bittering ? nullptr : &*context.intervals->bittering;
}

std::vector<std::string> blend_cautions(const BlendResult& result) {
  std::vector<std::string> cautions;
  bool whirlpool = false, dry_hop = false;
  for (const auto& part : result.parts) {
    whirlpool = whirlpool || part.whirlpool_g > 0.0;
    dry_hop = dry_hop || part.dry_hop_g > 0.0;
  }
  if (whirlpool)
    cautions.push_back("Whirlpool hops go into near-boiling wort: protect hands and eyes from hot wort and steam.");
  if (dry_hop)
    cautions.push_back(
        "Dry hops can restart fermentation (hop creep) and raise CO2: package only after the gravity has been "
        "stable for several days, or bottles and kegs may over-pressurise.");
  cautions.push_back("Hops are toxic to dogs: keep spent and fresh hops out of their reach.");
  cautions.push_back("Estimates from published models; follow local rules and licensed practice.");
  return cautions;
}

void render_blend_text(std::ostream& out, const BlendResult& result, const BlendReportContext& context,
                       UnitSystem units) {
  out << "Late-hop blend" << (context.recipe_name.empty() ? "" : " for " + context.recipe_name) << '\n';
  render_parts(out, result, context, units);
  render_profile(out, result, context);
  render_ibu(out, result, context, units);
  render_stock_left(out, result, context, units);
  if (!context.notes.empty()) {
    out << "\nNotes\n";
    for (const auto& note : context.notes) out << "  - " << note << '\n';
  }
  out << "\nModel: the blend's aroma is the oil-weighted mean of its hops' profiles, a linear first approximation\n"
         "(oil compounds such as linalool, geraniol and citronellol interact; taste and adjust).\n";
  out << "\nCautions\n";
  for (const auto& caution : blend_cautions(result)) out << "  - " << caution << '\n';
}

nlohmann::json blend_to_json(const BlendResult& result, const BlendReportContext& context) {
  using nlohmann::json;
  const auto axes = context.lexicon->axis_names();
  const BlendTarget& goal = context.request->target;
  const BlendPlan& plan = context.request->plan;
  json target = json::object(), profile = json::object(), weight = json::object();
  for (Index a = 0; a < goal.intensity.size(); ++a) {
    const auto& name = axes[static_cast<std::size_t>(a)];
    target[name] = rounded(goal.intensity[a], 4);
    profile[name] = rounded(result.profile[a], 4);
    weight[name] = rounded(goal.weight[a], 4);
  }
  const BlendIntervals* intervals = context.intervals;
  json varieties = json::array();
  for (const auto& part : result.parts) {
    json v{{"variety", part.variety},
           {"grams", rounded(part.grams, 2)},
           {"share", rounded(part.oil_share, 4)},
           {"whirlpool_g", rounded(part.whirlpool_g, 2)},
           {"dry_hop_g", rounded(part.dry_hop_g, 2)},
           {"whirlpool_ibu", rounded(part.whirlpool_ibu, 2)},
           {"alpha_acid", rounded(part.alpha_percent, 2)},
           {"alpha_note", alpha_note_of(part, context)}};
    if (!part.lot.empty()) v["lot"] = part.lot;
    if (part.left_g) v["left_g"] = rounded(*part.left_g, 2);
    if (intervals != nullptr) put_interval(v, "whirlpool_ibu", intervals->parts[varieties.size()]);
    varieties.push_back(v);
  }
  json bittering = nullptr;
  if (plan.bittering) {
    bittering = {{"variety", plan.bittering->variety},
                 {"grams", rounded(result.bittering_grams, 2)},
                 {"ibu", rounded(result.bittering_ibu, 2)},
                 {"alpha_acid", rounded(plan.bittering->alpha_percent, 2)},
                 {"minutes", rounded(plan.bittering->minutes, 1)}};
    if (!plan.bittering->lot.empty()) bittering["lot"] = plan.bittering->lot;
    if (result.bittering_left_g) bittering["left_g"] = rounded(*result.bittering_left_g, 2);
    if (intervals != nullptr && intervals->bittering) put_interval(bittering, "ibu", *intervals->bittering);
  }
  json doc{{"target", target},
           {"weights", weight},
           {"varieties", varieties},
           {"profile", profile},
           {"fit", rounded(result.fit, 4)},
           {"objective", rounded(result.objective, 6)},
           {"bittering", bittering},
           {"late_grams", rounded(result.late_grams, 2)},
           {"oil_ml", rounded(result.oil_ml, 3)},
           {"whirlpool_share", rounded(plan.ibu.whirlpool_share, 4)},
           {"whirlpool_temperature_c", rounded(plan.whirlpool_temperature_c, 2)},
           {"whirlpool_minutes", rounded(plan.whirlpool_minutes, 2)},
           {"ibu",
            {{"target", rounded(plan.ibu.target_ibu, 2)},
             {"source", std::string(source_words(plan.ibu.target_source))},
             {"kept", rounded(plan.ibu.kept_ibu, 2)},
             {"late", rounded(result.late_ibu, 2)},
             {"bittering", rounded(result.bittering_ibu, 2)}}},
           {"total_ibu", rounded(result.total_ibu, 2)},
           {"brewhouse", brewhouse_json(plan.bitterness)},
           {"notes", context.notes},
           {"cautions", blend_cautions(result)}};
  doc["on"] = context.on ? json(format_date(*context.on)) : json(nullptr);
  if (intervals != nullptr) {
    json& ibu = doc["ibu"];
    put_interval(ibu, "kept", intervals->kept);
    put_interval(ibu, "late", intervals->late);
    if (intervals->bittering) put_interval(ibu, "bittering", *intervals->bittering);
    put_interval(doc, "total_ibu", intervals->total);
    doc["interval"] = interval_json(intervals->monte_carlo);
  }
  return doc;
}

}  // namespace bine

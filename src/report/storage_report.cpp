#include "report/storage_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "model/names.hpp"
#include "report/bitterness_report.hpp"

namespace bine {

void render_age(std::ostream& out, const AgeQuery& query, const AgedAlpha& aged, UnitSystem units) {
  out << fmt::format("Estimated alpha acid on {}{}: {:.2f} % ({:.1f} % of the {:.2f} % at packaging)\n",
                     format_date(query.on), query.on_from_clock ? " (today; pass --on to reproduce)" : "",
                     aged.alpha_percent, 100.0 * aged.remaining, query.history.alpha_percent);
  const auto days = static_cast<std::size_t>(std::max(0.0, std::round(query.history.days)));
  out << fmt::format("  packaged {}, {} stored at {}, {}\n", format_date(query.packaged), count_of(days, "day", "days"),
                     format_temperature(query.history.storage.temperature_c, units),
                     to_string(query.history.storage.package));
  const std::string reference = format_temperature(20.0, units);
  out << fmt::format("  stability {:.1f} % of alpha left after 6 months at {} ({})\n", query.history.stability_percent,
                     reference, query.stability_source);
  out << fmt::format("  loss rate {:.6f} per day ({}, open) x temperature factor {:.3f} x package factor {:.2f}\n",
                     aged.rate_per_day, reference, aged.temperature_factor, aged.package_factor);
  for (const auto& note : query.notes) out << "  note: " << note << '\n';
  if (aged.warm_extrapolation)
    out << "  note: stored above " << format_temperature(20.0, units)
        << "; the temperature factor is extrapolated there and the estimate is rough\n";
  out << "Method: first-order loss after Garetz (1994). An estimate: a fresh lab analysis of the lot beats it.\n";
}

nlohmann::json age_to_json(const AgeQuery& query, const AgedAlpha& aged) {
  nlohmann::json out;
  out["alpha_acid"] = rounded(aged.alpha_percent, 4);
  out["alpha_acid_packaged"] = rounded(query.history.alpha_percent, 4);
  out["remaining"] = rounded(aged.remaining, 6);
  out["days"] = static_cast<long>(query.history.days);
  out["packaged"] = format_date(query.packaged);
  out["on"] = format_date(query.on);
  out["storage"] = {{"temperature_c", rounded(query.history.storage.temperature_c, 3)},
                    {"package", std::string(to_string(query.history.storage.package))}};
  out["stability_percent"] = rounded(query.history.stability_percent, 4);
  out["stability_source"] = query.stability_source;
  out["rate_per_day"] = rounded(aged.rate_per_day, 8);
  out["temperature_factor"] = rounded(aged.temperature_factor, 6);
  out["package_factor"] = aged.package_factor;
  std::vector<std::string> notes = query.notes;
  if (aged.warm_extrapolation) notes.emplace_back("stored above 20 C; the temperature factor is extrapolated");
  out["notes"] = notes;
  return out;
}

}  // namespace bine

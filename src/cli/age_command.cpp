// bine age: how much alpha acid a lot still has after months in the cold store.
#include <fmt/format.h>

#include <iostream>
#include <memory>

#include "cli/brew_day_option.hpp"
#include "cli/commands.hpp"
#include "engine/storage_loss.hpp"
#include "io/limits.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "report/storage_report.hpp"

namespace bine::cli {
namespace {

struct AgeOptions {
  std::string alpha;     // "11.2" or "11.2 %"
  std::string packaged;  // YYYY-MM-DD
  std::string stored;    // "TEMP,PACKAGE"
  std::string variety;
  std::string stability;  // % remaining after 6 months at 20 C, or good|fair|poor
  std::string hsi;
  std::string on;
  bool json = false;
};

std::optional<Storage> read_storage(const std::string& text, std::vector<std::string>& problems) {
  const auto comma = text.rfind(',');
  const std::string expected = "\"TEMP,PACKAGE\" such as \"-2 C,vacuum\"; package vacuum, sealed or open";
  if (comma == std::string::npos) {
    problems.push_back(fmt::format("--stored: \"{}\": no package given (expected {})", text, expected));
    return std::nullopt;
  }
  std::string word = text.substr(comma + 1);
  word.erase(0, word.find_first_not_of(' '));
  word.erase(word.find_last_not_of(' ') + 1);
  const auto package = package_from(word);
  if (!package)
    problems.push_back(fmt::format("--stored: \"{}\": unknown package \"{}\" (expected {})", text, word, expected));
  const auto temperature = read_option_quantity("--stored", text.substr(0, comma), Dimension::temperature,
                                                limits::storage_temperature, problems);
  if (!package || !temperature) return std::nullopt;
  return Storage{*temperature, *package};
}

/// Checks every option, collects every problem, and returns the question to answer.
AgeQuery validate(const GlobalOptions& globals, const AgeOptions& options) {
  std::vector<std::string> problems;
  AgeQuery query;
  const auto alpha = read_option_quantity("--alpha", options.alpha, Dimension::percent, limits::alpha_acid, problems);
  const auto storage = read_storage(options.stored, problems);
  std::optional<Date> packaged;
  std::optional<BrewDay> on;
  try {
    packaged = date_from_option("--packaged", options.packaged);
  } catch (const InputError& e) {
    problems.insert(problems.end(), e.lines().begin(), e.lines().end());
  }
  try {
    on = brew_day_from_option(options.on);
  } catch (const InputError& e) {
    problems.insert(problems.end(), e.lines().begin(), e.lines().end());
  }
  const int sources = !options.variety.empty() + !options.stability.empty() + !options.hsi.empty();
  if (sources != 1)
    problems.push_back(
        fmt::format("--variety, --stability, --hsi: {} given (expected exactly one, to say how well the "
                    "variety keeps)",
                    sources));
  std::optional<double> stability;
  if (!options.stability.empty()) {
    if (auto word = stability_of_class(options.stability)) {
      stability = *word;
      query.stability_source = fmt::format("--stability {}, common-practice class", options.stability);
    } else {
      stability =
          read_option_quantity("--stability", options.stability, Dimension::percent, limits::stability, problems);
      query.stability_source = "--stability";
    }
  }
  if (!options.hsi.empty()) {
    if (auto hsi = read_option_quantity("--hsi", options.hsi, Dimension::number, limits::hsi, problems)) {
      stability = 100.0 - percent_lost_from_hsi(*hsi);
      query.stability_source =
          fmt::format("--hsi {:g}: {:.1f} % lost = 110 x log10(HSI / 0.25)", *hsi, percent_lost_from_hsi(*hsi));
    }
  }
  if (!options.variety.empty() && sources == 1) {
    const DataSet data = globals.load();
    const Variety& variety = require_variety(data.catalog, options.variety, "--variety");
    if (variety.stability) {
      stability = *variety.stability;
      query.stability_source = fmt::format("catalog: {}", variety.name);
    } else {
      stability = kStabilityFair;
      query.stability_source = fmt::format("{} has no stability in the catalog; fair class assumed", variety.name);
    }
  }
  if (packaged && on && *packaged > on->date)
    problems.push_back(fmt::format("--packaged: {}: after the date --on {} (expected a packaging date on or before it)",
                                   options.packaged, format_date(on->date)));
  if (!problems.empty()) throw InputError(problems);
  query.packaged = *packaged;
  query.on = on->date;
  query.on_from_clock = on->from_clock;
  query.history = StorageHistory{*alpha, *stability, *storage, static_cast<double>(days_between(*packaged, on->date))};
  return query;
}

void run_age(const GlobalOptions& globals, const AgeOptions& options) {
  // 1. Read the question; 2. age the alpha; 3. render.
  const AgeQuery query = validate(globals, options);
  const AgedAlpha aged = age_alpha(query.history);
  if (options.json)
    std::cout << age_to_json(query, aged).dump(2) << '\n';
  else
    render_age(std::cout, query, aged, globals.unit_system());
}

}  // namespace

void setup_age_command(CLI::App& app, const GlobalOptions& globals) {
  auto options = std::make_shared<AgeOptions>();
  auto* age = app.add_subcommand("age", "estimate a lot's alpha acid today from its certificate and its storage");
  age->add_option("--alpha", options->alpha, "alpha acid % on the certificate at packaging")->required();
  age->add_option("--packaged", options->packaged, "packaging date, YYYY-MM-DD")->required();
  age->add_option("--stored", options->stored, "\"TEMP,PACKAGE\": storage temperature and vacuum|sealed|open")
      ->required();
  age->add_option("--variety", options->variety, "take the variety's stability from the catalog");
  age->add_option("--stability", options->stability,
                  "% of alpha left after 6 months at 20 C, or good (80), fair (65), poor (50)");
  age->add_option("--hsi", options->hsi, "a measured Hop Storage Index of the variety");
  age->add_option("--on", options->on, "the day to estimate for, YYYY-MM-DD (default: today)");
  age->add_flag("--json", options->json, "print JSON");
  age->footer(
      "Examples:\n"
      "  bine age --alpha 11.2 --packaged 2025-10-01 --stored \"-1 C,vacuum\" --variety Keelstone --on 2026-06-01\n"
      "  bine age --alpha 6.0 --packaged 2025-12-01 --stored \"0 F,vacuum\" --stability 50 --json\n"
      "  bine age --alpha 9 --packaged 2026-01-10 --stored \"4 C,sealed\" --hsi 0.31\n"
      "Model: first-order loss after Garetz (1994); rate halves per 15 C colder; vacuum 0.5, sealed 0.75, open 1.0.");
  age->callback([&globals, options] { run_age(globals, *options); });
}

}  // namespace bine::cli

// bine age: how much alpha acid a lot still has after months in the cold store.
#include <fmt/format.h>

#include <memory>

#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "engine/storage_loss.hpp"
#include "io/limits.hpp"
#include "model/catalog_lookup.hpp"
#include "model/names.hpp"
#include "report/html_reports.hpp"
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
  std::string html;
};

/// The question with every value read; the stability still to be looked up when a variety is named.
struct AgeArgs {
  AgeQuery query;
  std::string variety;  // --variety: stability from the catalog
  bool json = false;
  std::string html;
};

std::optional<Storage> read_storage(OptionReader& reader, const std::string& text) {
  const auto comma = text.rfind(',');
  const std::string expected = "\"TEMP,PACKAGE\" such as \"-2 C,vacuum\"; package vacuum, sealed or open";
  if (comma == std::string::npos) {
    reader.add(fmt::format("--stored: \"{}\": no package given (expected {})", text, expected));
    return std::nullopt;
  }
  const std::string word(trim_space(std::string_view(text).substr(comma + 1)));
  const auto package = package_from(word);
  if (!package) reader.add(fmt::format("--stored: \"{}\": unknown package \"{}\" (expected {})", text, word, expected));
  const auto temperature =
      reader.quantity("--stored", text.substr(0, comma), Dimension::temperature, limits::storage_temperature);
  if (!package || !temperature) return std::nullopt;
  return Storage{*temperature, *package};
}

/// --stability (a % or a class word): how well the variety keeps, with where it came from. The HSI is
/// a state, never a rate (docs/methods.md#hsi): it does not say how well the variety keeps.
std::optional<double> read_stability(OptionReader& reader, const AgeOptions& options, std::string& source) {
  if (!options.stability.empty()) {
    if (auto word = stability_of_class(options.stability)) {
      source = fmt::format("--stability {}, common-practice class", options.stability);
      return word;
    }
    source = "--stability";
    return reader.quantity("--stability", options.stability, Dimension::percent, limits::stability);
  }
  return std::nullopt;
}

AgeArgs parse_age_args(const AgeOptions& options) {
  OptionReader reader;
  AgeArgs args;
  args.json = options.json;
  args.html = options.html;
  args.variety = options.variety;
  const auto alpha = reader.quantity("--alpha", options.alpha, Dimension::percent, limits::alpha_acid);
  const auto storage = read_storage(reader, options.stored);
  const auto packaged = reader.date("--packaged", options.packaged);
  const auto on = reader.brew_day(options.on);
  const int sources = !options.variety.empty() + !options.stability.empty();
  reader.require(sources == 1, fmt::format("--variety, --stability: {} given (expected exactly one, to say how well "
                                           "the variety keeps; an HSI is a state and does not say it)",
                                           sources));
  const auto stability = read_stability(reader, options, args.query.stability_source);
  if (!options.hsi.empty())
    if (auto hsi = reader.quantity("--hsi", options.hsi, Dimension::number, limits::hsi))
      args.query.notes.push_back(fmt::format(
          "HSI {:.2f}: about {:.1f} % of the harvest alpha was lost before the analysis (110 x log10(HSI / 0.25)); a "
          "certificate alpha from the same analysis already includes it, so it is not taken off again, and the HSI "
          "does not change the storage rate",
          *hsi, percent_lost_from_hsi(*hsi)));
  if (packaged && on && *packaged > on->date)
    reader.add(fmt::format("--packaged: {}: after the date --on {} (expected a packaging date on or before it)",
                           options.packaged, format_date(on->date)));
  reader.throw_if_any();
  args.query.packaged = *packaged;
  args.query.on = on->date;
  args.query.on_from_clock = on->from_clock;
  args.query.history = StorageHistory{*alpha, stability.value_or(kStabilityFair), *storage,
                                      static_cast<double>(days_between(*packaged, on->date))};
  return args;
}

void run_age(const Console& console, const GlobalOptions& globals, AgeArgs args) {
  // 1. The variety's stability from the catalog, when named; 2. age the alpha; 3. render.
  std::optional<DataSet> data;  // only read for --variety
  if (!args.variety.empty()) {
    data = load_data(globals, console);
    const Variety& variety = require_variety(data->catalog, args.variety, "--variety");
    args.query.history.stability_percent = variety.stability.value_or(kStabilityFair);
    args.query.stability_source =
        variety.stability ? fmt::format("catalog: {}", variety.name)
                          : fmt::format("{} has no stability in the catalog; fair class assumed", variety.name);
  }
  const AgedAlpha aged = age_alpha(args.query.history);
  write_html(args.html, [&] {
    return age_html(
        args.query, aged, globals.unit_system(),
        page_meta(data ? &*data : nullptr, "", "",
                  "certificate alpha, packaging date and storage; stability from " + args.query.stability_source));
  });
  const auto document = [&] { return age_to_json(args.query, aged); };
  const auto text = [&](std::ostream& out) { render_age(out, args.query, aged, globals.unit_system()); };
  if (data)
    print_result(console, args.json, *data, document, text);  // the stability came from a catalog
  else
    print_result(console, args.json, document, text);
}

}  // namespace

void setup_age_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<AgeOptions>();
  auto* age = app.add_subcommand("age", "estimate a lot's alpha acid today from its certificate and its storage");
  age->add_option("--alpha", options->alpha, "alpha acid % on the certificate at packaging")->required();
  age->add_option("--packaged", options->packaged, "packaging date, YYYY-MM-DD")->required();
  age->add_option("--stored", options->stored, "\"TEMP,PACKAGE\": storage temperature and vacuum|sealed|open")
      ->required();
  age->add_option("--variety", options->variety, "take the variety's stability from the catalog");
  age->add_option("--stability", options->stability,
                  "% of alpha left after 6 months at 20 C, or good (80), fair (65), poor (50)");
  age->add_option("--hsi", options->hsi,
                  "the lot's measured Hop Storage Index: reports the loss before the analysis (not a rate)");
  age->add_option("--on", options->on, "the day to estimate for, YYYY-MM-DD (default: today)");
  age->add_flag("--json", options->json, "print JSON");
  add_html_option(age, options->html);
  age->footer(
      "Examples:\n"
      "  bine age --alpha 11.2 --packaged 2025-10-01 --stored \"-1 C,vacuum\" --variety Keelstone --on 2026-06-01\n"
      "  bine age --alpha 6.0 --packaged 2025-12-01 --stored \"0 F,vacuum\" --stability 50 --json\n"
      "  bine age --alpha 9 --packaged 2026-01-10 --stored \"4 C,sealed\" --stability 80 --hsi 0.31\n"
      "  bine age --alpha 9 --packaged 2026-01-10 --stored \"4 C,sealed\" --stability 80 --hsi 0.31 --html lot.html\n"
      "Model: first-order loss after Garetz (1994); rate halves per 15 C colder; vacuum 0.5, sealed 0.75, open 1.0.");
  commands.add(age,
               [&globals, options](const Console& console) { run_age(console, globals, parse_age_args(*options)); });
}

}  // namespace bine::cli

// bine stock: the cold store as a ledger. list shows every lot aged to a day; receive, adjust and
// undo change it, each change journalled beside the stock file before the file is replaced, under
// a lock (io/stock_ledger.hpp); history prints the journal.
#include <fmt/format.h>

#include <algorithm>
#include <memory>
#include <set>

#include "cli/bitterness_options.hpp"
#include "cli/cellar_options.hpp"
#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "engine/stock_plan.hpp"
#include "engine/stock_rebalance.hpp"
#include "engine/stock_view.hpp"
#include "io/brew_schedule.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/lot_receipts.hpp"
#include "io/recipe_file.hpp"
#include "io/stock_ledger.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"
#include "report/bitterness_report.hpp"
#include "report/html_reports.hpp"
#include "report/stock_plan_report.hpp"
#include "report/stock_report.hpp"

namespace bine::cli {
namespace {

struct ListOptions {
  std::string stock;
  std::string on;
  std::string stale_below;
  bool json = false;
  bool csv = false;
  std::string html;
};

/// A lot with less than this share of its certificate alpha is stale.
constexpr Bounds kStaleBelow{1.0, 99.0, "a stale share"};

struct ReceiveOptions {
  std::string lot, variety, amount, alpha, packaged, stored, form, beta, oil, hsi;
  std::string from;  // a receipt file: the lots come from it
};

struct AdjustOptions {
  std::string lot, to, reason;
};

struct UseOptions {
  std::string recipe;
  std::string batches;
  bool json = false;
  CellarOptions cellar;
  BitternessOptions bitterness;
};

struct PlanOptions {
  std::string schedule;
  CellarOptions cellar;
  BitternessOptions bitterness;
  bool json = false;
};

struct HistoryOptions {
  std::string lot;
  bool json = false;
};

std::size_t find_lot(const Stock& stock, const std::string& code, const std::string& option) {
  std::vector<std::string> codes;
  for (std::size_t i = 0; i < stock.lots.size(); ++i) {
    const std::string shown = bine::lot_code(stock.lots[i], i);
    if (fold_name(shown) == fold_name(code)) return i;
    codes.push_back(shown);
  }
  const std::string hint = did_you_mean(code, codes);
  throw InputError(fmt::format("{}: \"{}\": no such lot in {} ({}expected one of {})", option, code, stock.source_file,
                               hint.empty() ? "" : hint + "; ", fmt::join(codes, ", ")));
}

std::string lot_code(const Stock& stock, std::size_t index) { return bine::lot_code(stock.lots[index], index); }

void report_change(const Console& console, const StockLedger& ledger, const JournalEntry& entry,
                   const GlobalOptions& globals) {
  if (ledger.completed_pending())
    console.err << "bine: note: completed the last journal entry, which an interrupted bine had not yet written to "
                << ledger.stock_file().string() << '\n';
  render_change(console.out, entry, globals.unit_system());
  console.out << fmt::format("Written: {} (journal {})\n", ledger.stock_file().string(),
                             ledger.journal_file().string());
}

// ---- list -----------------------------------------------------------------------------------------

void run_list(const Console& console, const GlobalOptions& globals, const ListOptions& options,
              const std::string& stock_option) {
  OptionReader reader;
  const auto on = reader.brew_day(options.on);
  const auto stale_below =
      reader.optional_quantity("--stale-below", options.stale_below, Dimension::percent, kStaleBelow);
  const std::string conflict = csv_conflict(options.json, options.csv, options.html);
  reader.require(conflict.empty(), conflict);
  reader.throw_if_any();
  const Printed printed = printed_as(options.json, options.csv, options.html);
  const std::string file = stock_file_or_env(options.stock.empty() ? stock_option : options.stock);
  const DataSet data = load_data(globals, console);
  std::optional<StockView> view;
  {
    const StockLedger ledger(file, true);  // completes an interrupted change before the list is read
    view = view_stock(ledger.stock(), data.catalog, on->date, stale_below.value_or(75.0) / 100.0);
  }
  if (printed == Printed::csv && on->from_clock)
    print_notes(console, {"listed for today; pass --on DATE to repeat the list"});
  write_html(options.html, [&] { return stock_html(*view, globals.unit_system(), page_meta(&data, "", file)); });
  print_result(
      console, printed, data, [&] { return stock_list_to_json(*view); }, [&] { return stock_list_to_csv(*view); },
      [&](std::ostream& out) {
        render_stock_list(out, *view, globals.unit_system());
        if (on->from_clock) out << "(listed for today; pass --on DATE to repeat the list)\n";
      });
}

// ---- receive --------------------------------------------------------------------------------------

std::optional<Storage> read_stored(OptionReader& reader, const std::string& text) {
  const auto comma = text.rfind(',');
  const auto package =
      comma == std::string::npos ? std::nullopt : package_from(trim_space(std::string_view(text).substr(comma + 1)));
  if (!package) {
    reader.add(
        fmt::format("--stored: \"{}\": no package or an unknown one (expected \"TEMP,PACKAGE\" such as "
                    "\"-2 C,vacuum\"; package vacuum, sealed or open)",
                    text));
    return std::nullopt;
  }
  const auto temperature =
      reader.quantity("--stored", text.substr(0, comma), Dimension::temperature, limits::storage_temperature);
  if (!temperature) return std::nullopt;
  return Storage{*temperature, *package};
}

/// A lot as the stock file stores it (canonical units, the amount in grams as the ledger keeps it).
nlohmann::ordered_json lot_record(const Lot& lot) {
  nlohmann::ordered_json record;
  record["variety"] = lot.variety;
  record["lot"] = lot.lot;
  record["form"] = std::string(to_string(lot.form));
  if (lot.alpha_acid) record["alpha_acid"] = *lot.alpha_acid;
  if (lot.beta_acid) record["beta_acid"] = *lot.beta_acid;
  if (lot.total_oil) record["total_oil"] = *lot.total_oil;
  if (lot.hsi) record["hsi"] = *lot.hsi;
  if (lot.packaged) record["packaged"] = format_date(*lot.packaged);
  if (lot.storage)
    record["storage"] = {{"temperature", lot.storage->temperature_c},
                         {"package", std::string(to_string(lot.storage->package))}};
  record["on_hand"] = fmt::format("{} g", ledger_grams(lot.on_hand_g.value_or(0.0)));
  return record;
}

/// The lot --lot ... --stored give.
Lot read_receipt(const ReceiveOptions& o) {
  OptionReader reader;
  const auto given = [&](const std::string& value, std::string_view option, std::string_view what) {
    reader.require(
        !trim_space(value).empty(),
        fmt::format("{}: not given or empty (expected {}, or --from FILE for the lots of a file)", option, what));
  };
  if (o.lot.empty() && o.variety.empty() && o.amount.empty() && o.alpha.empty() && o.packaged.empty() &&
      o.stored.empty())
    throw InputError(
        "receive: no lot given (expected --lot, --variety, --amount, --alpha, --packaged and --stored, or --from "
        "FILE for the lots of a file)");
  given(o.lot, "--lot", "the lot code on the certificate");
  given(o.variety, "--variety", "the variety's name");
  Lot lot;
  lot.on_hand_g = reader.quantity("--amount", o.amount, Dimension::mass, limits::stock_mass);
  lot.alpha_acid = reader.quantity("--alpha", o.alpha, Dimension::percent, limits::alpha_acid);
  lot.beta_acid = reader.optional_quantity("--beta", o.beta, Dimension::percent, limits::beta_acid);
  lot.total_oil = reader.optional_quantity("--oil", o.oil, Dimension::oil_content, limits::total_oil);
  lot.hsi = reader.optional_quantity("--hsi", o.hsi, Dimension::number, limits::hsi);
  lot.packaged = reader.date("--packaged", o.packaged);
  lot.storage = read_stored(reader, o.stored);
  const auto form = form_from(o.form.empty() ? "pellet" : o.form);
  if (!form) reader.add(fmt::format("--form: \"{}\": unknown (expected pellet, whole or powder)", o.form));
  reader.throw_if_any();
  lot.variety = std::string(trim_space(o.variety));
  lot.lot = std::string(trim_space(o.lot));
  lot.form = *form;
  return lot;
}

/// --from FILE: the lot options are not given (the file gives every lot); --stored may be, for
/// the lots the file gives no storage.
std::optional<Storage> read_from_options(const ReceiveOptions& o) {
  OptionReader reader;
  const std::vector<std::pair<std::string_view, const std::string*>> per_lot{
      {"--lot", &o.lot},     {"--variety", &o.variety},   {"--amount", &o.amount},
      {"--alpha", &o.alpha}, {"--packaged", &o.packaged}, {"--form", &o.form},
      {"--beta", &o.beta},   {"--oil", &o.oil},           {"--hsi", &o.hsi}};
  for (const auto& [option, value] : per_lot)
    reader.require(value->empty(), fmt::format("{}: not with --from {} (the file gives every lot; expected one or "
                                               "the other)",
                                               option, o.from));
  std::optional<Storage> storage;
  if (!o.stored.empty()) storage = read_stored(reader, o.stored);
  reader.throw_if_any();
  return storage;
}

/// The lot the options give, refused when its code is already in the stock.
std::vector<Lot> new_lot(const Lot& lot, const Stock& stock) {
  for (std::size_t i = 0; i < stock.lots.size(); ++i)
    if (fold_name(stock.lots[i].lot) == fold_name(lot.lot))
      throw InputError(
          fmt::format("--lot: \"{}\": already in {} as lot {} ({}) (expected a new lot code; to "
                      "correct its amount use stock adjust)",
                      lot.lot, stock.source_file, i + 1, stock.lots[i].variety));
  return {lot};
}

/// Every lot of the --from file (checked whole before any goes in).
std::vector<Lot> file_lots(const std::string& file, const std::optional<Storage>& storage, const Stock& stock) {
  std::vector<Lot> lots;
  for (ReceivedLot& received : read_lot_receipts(read_text_file(file), file, storage, stock))
    lots.push_back(std::move(received.lot));
  return lots;
}

void run_receive(const Console& console, const GlobalOptions& globals, const ReceiveOptions& options,
                 const std::string& stock_option) {
  // The options are read before the stock is opened, so a bad one is named first.
  const bool from_file = !options.from.empty();
  const std::optional<Lot> single = from_file ? std::nullopt : std::optional<Lot>(read_receipt(options));
  const std::optional<Storage> storage = from_file ? read_from_options(options) : std::nullopt;
  StockLedger ledger(stock_file_or_env(stock_option));
  const Stock& stock = ledger.stock();
  JournalEntry entry;
  entry.command = "receive";
  if (from_file) entry.reason = "from " + options.from;
  for (const Lot& lot : from_file ? file_lots(options.from, storage, stock) : new_lot(*single, stock))
    entry.changes.push_back(LotChange{LotChangeKind::added, stock.lots.size() + entry.changes.size(), lot.lot,
                                      lot.variety, 0.0, ledger_grams(lot.on_hand_g.value_or(0.0)), lot_record(lot)});
  report_change(console, ledger, ledger.commit(std::move(entry)), globals);
}

// ---- adjust ---------------------------------------------------------------------------------------

void run_adjust(const Console& console, const GlobalOptions& globals, const AdjustOptions& options,
                const std::string& stock_option) {
  OptionReader reader;
  const auto to = reader.quantity("--to", options.to, Dimension::mass, limits::stock_mass);
  reader.require(!trim_space(options.reason).empty(), "--reason: empty (expected why the count changed)");
  reader.throw_if_any();
  StockLedger ledger(stock_file_or_env(stock_option));
  const Stock& stock = ledger.stock();
  const std::size_t index = find_lot(stock, options.lot, "LOT");
  JournalEntry entry;
  entry.command = "adjust";
  entry.reason = std::string(trim_space(options.reason));
  entry.changes.push_back(LotChange{LotChangeKind::amount,
                                    index,
                                    lot_code(stock, index),
                                    stock.lots[index].variety,
                                    stock.lots[index].on_hand_g.value_or(0.0),
                                    ledger_grams(*to),
                                    {}});
  report_change(console, ledger, ledger.commit(std::move(entry)), globals);
}

// ---- use ------------------------------------------------------------------------------------------

struct UseArgs {
  std::string recipe;
  std::size_t batches = 1;
  bool json = false;
  CellarChoice cellar;
  BitternessSettings settings;
};

UseArgs parse_use_args(const UseOptions& options) {
  OptionReader reader;
  UseArgs args;
  args.recipe = options.recipe;
  args.batches = reader.count("--batches", options.batches, limits::batches, 1).value_or(1);
  args.json = options.json;
  args.cellar = read_cellar_options(reader, options.cellar);
  args.settings = read_bitterness_options(reader, options.bitterness);
  reader.throw_if_any();
  return args;
}

/// A recipe the stock cannot serve whole changes nothing: exit 3 naming every lot short (grams
/// missing) and every addition no lot was found for; a lot without an amount cannot be deducted.
void refuse_incomplete(const StockRebalance& used, const Recipe& recipe, const Stock& stock, UnitSystem units) {
  std::vector<std::string> problems;
  for (const auto& code : used.result.lots_without_amount)
    for (std::size_t i = 0; i < stock.lots.size(); ++i)
      if (lot_code(stock, i) == code)
        problems.push_back(
            fmt::format("{}: /lots/{}/on_hand: lot {} gives no amount on hand, so nothing can be "
                        "deducted from it (record a count with stock adjust)",
                        stock.source_file, i, code));
  if (!problems.empty()) throw InputError(problems);
  for (const auto& s : used.result.shortfalls)
    problems.push_back(fmt::format("lot {} ({}): short {} (needs {}, has {})", s.lot, s.variety,
                                   format_mass(s.needed_g - s.on_hand_g, units), format_mass(s.needed_g, units),
                                   format_mass(s.on_hand_g, units)));
  for (const std::size_t index : used.result.without_lot) {
    const HopAddition& hop = recipe.hops[index];
    problems.push_back(fmt::format("addition {} ({}, {}): no usable lot in {}", index + 1,
                                   hop.variety.empty() ? hop.lot : hop.variety, describe_use(hop, units),
                                   stock.source_file));
  }
  if (!problems.empty())
    throw Infeasible(fmt::format("{}: the stock cannot serve the recipe, nothing was deducted: {}", stock.source_file,
                                 fmt::join(problems, "; ")),
                     {Remedy::add_stock});
}

void run_use(const Console& console, const GlobalOptions& globals, const UseArgs& args,
             const std::string& stock_option) {
  const UnitSystem units = globals.unit_system();
  const DataSet data = load_data(globals, console);
  const RecipeFile file = read_recipe_file(args.recipe, BeerXmlReadOptions{});
  const std::string recipe_sha256 = sha256_hex(read_text_file(args.recipe));
  // From here the lock is held: the lots are chosen from the stock as it is, and written back before
  // another bine may read it.
  StockLedger ledger(stock_file_or_env(stock_option));
  Stock stock = ledger.stock();
  if (stock.name.empty()) stock.name = ledger.stock_file().string();
  const Cellar cellar = age_cellar(stock, data.catalog, args.cellar.on.date, args.cellar.settings);
  const StockRebalance used = rebalance_from_stock(file.recipe, cellar, data.catalog, args.settings,
                                                   Weighing::as_weighed, static_cast<double>(args.batches));
  refuse_incomplete(used, used.recipe, stock, units);
  JournalEntry entry;
  entry.command = "use";
  entry.recipe = file.recipe.name.empty() ? args.recipe : file.recipe.name;
  entry.recipe_file = args.recipe;
  entry.recipe_sha256 = recipe_sha256;
  entry.batches = args.batches;
  entry.on = format_date(cellar.on);
  for (const LotDraw& draw : used.draws) {
    if (draw.grams <= 0.0) continue;
    const double before = stock.lots[draw.lot].on_hand_g.value_or(0.0);
    entry.changes.push_back(LotChange{
        LotChangeKind::amount, draw.lot, draw.code, draw.variety, before, ledger_grams(before - draw.grams), {}});
  }
  const JournalEntry& written = ledger.commit(std::move(entry));
  if (args.json) {
    if (ledger.completed_pending())
      console.err << "bine: note: completed the last journal entry, which an interrupted bine had not yet written to "
                  << ledger.stock_file().string() << '\n';
    console.out << stock_use_to_json(written, used.result.additions, ledger.stock_file().string(),
                                     ledger.journal_file().string())
                       .dump(2)
                << '\n';
    return;
  }
  console.out << fmt::format("{} x{} on {}{}, weighed per batch:\n", written.recipe, args.batches, written.on,
                             args.cellar.on.from_clock ? " (today; pass --on DATE to reproduce)" : "");
  for (const auto& row : used.result.additions)
    console.out << fmt::format("  addition {} {} ({}): {} from lot {}\n", row.index + 1, row.variety,
                               describe_use(used.recipe.hops[row.index], units), format_mass(row.grams_after, units),
                               row.lot);
  report_change(console, ledger, written, globals);
}

// ---- plan ---------------------------------------------------------------------------------------

/// Reads the schedule and each recipe it names, walks the brews through the stock (never written).
void run_plan(const Console& console, const GlobalOptions& globals, const PlanOptions& options,
              const std::string& stock_option) {
  OptionReader reader;
  const CellarChoice cellar = read_cellar_options(reader, options.cellar);
  const BitternessSettings settings = read_bitterness_options(reader, options.bitterness);
  reader.throw_if_any();
  const std::vector<ScheduledBrew> schedule = read_brew_schedule(options.schedule);
  const std::string stock_file = stock_file_or_env(stock_option);
  const DataSet data = load_data(globals, console);
  std::vector<PlannedBrew> brews;
  for (const ScheduledBrew& brew : schedule)
    brews.push_back(PlannedBrew{read_recipe_file(brew.recipe_file, BeerXmlReadOptions{}).recipe, brew.recipe_as_written,
                                brew.on, brew.batches});
  std::optional<StockPlan> plan;
  {
    const StockLedger ledger(stock_file, true);  // read under the lock, as it stands after any pending change
    plan = plan_stock(ledger.stock(), data.catalog, std::move(brews), cellar.settings, settings);
  }
  const PlanSource source{options.schedule, stock_file, cellar.settings.stale_below};
  print_result(
      console, options.json, data, [&] { return stock_plan_to_json(*plan, source); },
      [&](std::ostream& out) { render_stock_plan(out, *plan, source, globals.unit_system()); });
}

// ---- history and undo -----------------------------------------------------------------------------

void run_history(const Console& console, const GlobalOptions& globals, const HistoryOptions& options,
                 const std::string& stock_option) {
  const StockLedger ledger(stock_file_or_env(stock_option), true);
  std::vector<JournalEntry> shown;
  for (const JournalEntry& entry : ledger.entries())
    if (options.lot.empty() || std::any_of(entry.changes.begin(), entry.changes.end(), [&](const LotChange& c) {
          return fold_name(c.lot) == fold_name(options.lot);
        }))
      shown.push_back(entry);
  print_result(
      console, options.json, [&] { return history_to_json(shown); },
      [&](std::ostream& out) {
        render_history(out, shown, globals.unit_system());
        if (ledger.edited_since_last_entry())
          out << fmt::format("note: {} was changed by hand since the last entry\n", ledger.stock_file().string());
      });
}

/// The latest entry not yet undone (undo entries themselves are not undone: undo walks back).
const JournalEntry* entry_to_undo(const std::vector<JournalEntry>& entries) {
  std::set<std::size_t> undone;
  for (auto it = entries.rbegin(); it != entries.rend(); ++it) {
    if (it->undoes) {
      undone.insert(*it->undoes);
      continue;
    }
    if (undone.count(it->id) == 0) return &*it;
  }
  return nullptr;
}

void run_undo(const Console& console, const GlobalOptions& globals, const std::string& stock_option) {
  StockLedger ledger(stock_file_or_env(stock_option));
  const std::string file = ledger.stock_file().string();
  if (ledger.edited_since_last_entry())
    throw InputError(
        fmt::format("{}: was edited by hand since journal entry {} (its SHA-256 is not the one the "
                    "entry wrote); undo refuses to overwrite the edit (record the count with stock "
                    "adjust, or undo the edit by hand)",
                    file, ledger.entries().back().id));
  const JournalEntry* target = entry_to_undo(ledger.entries());
  if (target == nullptr)
    throw Infeasible(fmt::format("{}: nothing to undo (the journal has no change left to reverse)", file));
  JournalEntry entry;
  entry.command = "undo";
  entry.undoes = target->id;
  entry.reason = fmt::format("{} of {}", target->command, target->time);
  entry.changes = inverse_changes(target->changes);
  report_change(console, ledger, ledger.commit(std::move(entry)), globals);
}

constexpr std::string_view kStockFooter =
    "The stock file comes from --stock FILE or the BINE_STOCK environment variable. Every change is one JSON line\n"
    "in FILE.journal, written before FILE is replaced; FILE.lock keeps two bine runs from changing it at once.\n"
    "Examples:\n"
    "  bine stock list --stock stock.json --on 2026-12-01\n"
    "  bine stock --stock stock.json receive --lot TW-26-031 --variety Tidewell --amount \"5 kg\" --alpha 7.4 \\\n"
    "      --packaged 2026-10-02 --stored \"-2 C,vacuum\"\n"
    "  bine stock --stock stock.json use pale-ale.json --on 2026-12-01\n"
    "  bine stock --stock stock.json plan schedule.json\n"
    "  bine stock --stock stock.json adjust TW-25-044 --to \"2.2 kg\" --reason \"counted on the shelf\"\n"
    "  bine stock --stock stock.json history TW-25-044\n"
    "  bine stock --stock stock.json undo";

void setup_list(CLI::App* stock, const GlobalOptions& globals, CommandTable& commands,
                const std::shared_ptr<std::string>& stock_option) {
  auto options = std::make_shared<ListOptions>();
  auto* list =
      stock->add_subcommand("list", "every lot with its alpha today, freshness and amount; totals per variety");
  list->add_option("STOCK", options->stock, "the stock file (else --stock or BINE_STOCK)");
  list->add_option("--on", options->on, "the day to age every lot to, YYYY-MM-DD (default: today)");
  list->add_option("--stale-below", options->stale_below,
                   "a lot with less than this share of its certificate alpha is stale (default 75%)");
  list->add_flag("--json", options->json, "print JSON");
  list->add_flag("--csv", options->csv,
                 "print one CSV table for spreadsheets: a row per lot, units in the headers, canonical units "
                 "(save it: > lots.csv)");
  add_html_option(list, options->html);
  list->footer(
      "Examples:\n"
      "  bine stock list stock.json --on 2026-12-01\n"
      "  BINE_STOCK=stock.json bine --units us stock list --stale-below 80\n"
      "  bine stock list stock.json --json\n"
      "  bine stock list stock.json --on 2026-12-01 --csv\n"
      "  bine stock list stock.json --on 2026-12-01 --html cold-store.html");
  commands.add(list, [&globals, options, stock_option](const Console& console) {
    run_list(console, globals, *options, *stock_option);
  });
}

void setup_receive(CLI::App* stock, const GlobalOptions& globals, CommandTable& commands,
                   const std::shared_ptr<std::string>& stock_option) {
  auto o = std::make_shared<ReceiveOptions>();
  auto* receive = stock->add_subcommand("receive", "put new lots in the stock file, one or a file's (journalled)");
  receive->add_option("--lot", o->lot, "the lot code on the certificate (required without --from)");
  receive->add_option("--variety", o->variety, "the variety (required without --from)");
  receive->add_option("--amount", o->amount, "amount received, with its unit (\"5 kg\", \"11 lb\"; required)");
  receive->add_option("--alpha", o->alpha, "alpha acid % on the certificate (required without --from)");
  receive->add_option("--packaged", o->packaged, "packaging date, YYYY-MM-DD (required without --from)");
  receive->add_option("--stored", o->stored,
                      "\"TEMP,PACKAGE\" such as \"-2 C,vacuum\" (vacuum|sealed|open); with --from, for the lots "
                      "the file gives no storage");
  receive->add_option("--form", o->form, "pellet (default), whole or powder");
  receive->add_option("--beta", o->beta, "beta acid % on the certificate");
  receive->add_option("--oil", o->oil, "total oil, mL/100 g");
  receive->add_option("--hsi", o->hsi, "Hop Storage Index on the certificate");
  receive
      ->add_option("--from", o->from,
                   "every lot of this file: a CSV of certificates (headers as bine import reads them), "
                   "BeerXML hop records or a stock file (JSON); one bad lot and nothing is received")
      ->check(output_file_name());
  receive->footer(
      "Examples:\n"
      "  bine stock --stock stock.json receive --lot KS-26-002 --variety Keelstone --amount \"5 kg\" --alpha 12.1 \\\n"
      "      --packaged 2026-10-20 --stored \"-2 C,vacuum\" --oil 1.8\n"
      "  bine stock --stock stock.json receive --from certificates.csv --stored \"-2 C,vacuum\"\n"
      "The lots of a --from file go in as one journal entry (one undo takes them all out again).");
  commands.add(receive, [&globals, o, stock_option](const Console& console) {
    run_receive(console, globals, *o, *stock_option);
  });
}

void setup_use(CLI::App* stock, const GlobalOptions& globals, CommandTable& commands,
               const std::shared_ptr<std::string>& stock_option) {
  auto o = std::make_shared<UseOptions>();
  auto* use = stock->add_subcommand("use", "take what a recipe weighs out of the stock, lot by lot (journalled)");
  use->add_option("RECIPE", o->recipe, "recipe file (bine JSON or BeerXML 1.0)")->required();
  use->add_option("--batches", o->batches, "batches brewed (default 1)");
  use->add_flag("--json", o->json,
                "print JSON: the journal entry's id, each addition's lot and grams, each lot's grams before and after");
  add_cellar_options(use, o->cellar, true);
  add_bitterness_options(use, o->bitterness);
  use->footer(
      "The lots and grams are those rebalance --stock gives for the same options: the lot an addition names,\n"
      "else oldest packaging first, split across lots where one has too little. A shortfall changes nothing.\n"
      "Examples:\n"
      "  bine stock --stock stock.json use pale-ale.json --on 2026-12-01 --batches 2\n"
      "  bine stock --stock stock.json use pale-ale.json --on 2026-12-01 --json");
  commands.add(use, [&globals, o, stock_option](const Console& console) {
    run_use(console, globals, parse_use_args(*o), *stock_option);
  });
}

void setup_plan(CLI::App* stock, const GlobalOptions& globals, CommandTable& commands,
                const std::shared_ptr<std::string>& stock_option) {
  auto o = std::make_shared<PlanOptions>();
  auto* plan = stock->add_subcommand(
      "plan", "walk a brewing schedule through the stock: what runs short, by when, and what turns stale first");
  plan->add_option("SCHEDULE", o->schedule,
                   "JSON {\"brews\": [{\"recipe\", \"on\", \"batches\"}]} or CSV with headers recipe,on,batches; "
                   "recipe files relative to the schedule's folder")
      ->required();
  add_lot_judging_options(plan, o->cellar, true);
  plan->add_flag("--json", o->json, "print JSON (canonical units)");
  add_bitterness_options(plan, o->bitterness);
  plan->footer(
      "Each brew takes its hops as stock use would on its day (lots aged to that day); nothing is written.\n"
      "Examples:\n"
      "  bine stock --stock stock.json plan schedule.json\n"
      "  bine stock --stock stock.json plan schedule.json --json");
  commands.add(plan,
               [&globals, o, stock_option](const Console& console) { run_plan(console, globals, *o, *stock_option); });
}

void setup_changes(CLI::App* stock, const GlobalOptions& globals, CommandTable& commands,
                   const std::shared_ptr<std::string>& stock_option) {
  auto adjust_options = std::make_shared<AdjustOptions>();
  auto* adjust = stock->add_subcommand("adjust", "set a lot's amount after a count (journalled)");
  adjust->add_option("LOT", adjust_options->lot, "the lot code (or \"lot N\" for a lot without one)")->required();
  adjust->add_option("--to", adjust_options->to, "the amount counted, with its unit (\"2.2 kg\")")->required();
  adjust->add_option("--reason", adjust_options->reason, "why, for the journal")->required();
  adjust->footer("Example:\n  bine stock --stock stock.json adjust TW-25-044 --to \"2.2 kg\" --reason \"shelf count\"");
  commands.add(adjust, [&globals, adjust_options, stock_option](const Console& console) {
    run_adjust(console, globals, *adjust_options, *stock_option);
  });
  auto history_options = std::make_shared<HistoryOptions>();
  auto* history = stock->add_subcommand("history", "print the journal, or one lot's entries");
  history->add_option("LOT", history_options->lot, "only entries that change this lot");
  history->add_flag("--json", history_options->json, "print the entries as JSON");
  history->footer(
      "Examples:\n  bine stock --stock stock.json history\n  bine stock --stock stock.json history IM-25-031");
  commands.add(history, [&globals, history_options, stock_option](const Console& console) {
    run_history(console, globals, *history_options, *stock_option);
  });
  auto* undo = stock->add_subcommand("undo", "reverse the last journal entry not yet undone (itself journalled)");
  undo->footer("Example:\n  bine stock --stock stock.json undo   # again to step further back");
  commands.add(undo, [&globals, stock_option](const Console& console) { run_undo(console, globals, *stock_option); });
}

}  // namespace

void setup_stock_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto stock_option = std::make_shared<std::string>();
  auto* stock = app.add_subcommand("stock", "keep the cold store: list, receive, use, plan, adjust, undo, history");
  stock->add_option("--stock", *stock_option, "the stock file (default: $BINE_STOCK)");
  stock->require_subcommand(1);
  stock->fallthrough();
  stock->footer(std::string(kStockFooter));
  setup_list(stock, globals, commands, stock_option);
  setup_receive(stock, globals, commands, stock_option);
  setup_use(stock, globals, commands, stock_option);
  setup_plan(stock, globals, commands, stock_option);
  setup_changes(stock, globals, commands, stock_option);
}

}  // namespace bine::cli

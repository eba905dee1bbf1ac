#include "io/lot_receipts.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <map>

#include "io/beerxml.hpp"
#include "io/hop_import.hpp"
#include "io/loaders.hpp"
#include "io/shown_value.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

bool looks_like_json(std::string_view text) {
  if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  const auto first = text.find_first_not_of(" \t\r\n");
  return first != std::string_view::npos && text[first] == '{';
}

/// A certificate gives one measured value: a range ("4.5-6.0") is a problem, not its middle.
std::optional<double> single_value(const std::optional<Range>& range, std::string_view what, const std::string& where,
                                   Diagnostics& diagnostics) {
  if (!range) return std::nullopt;
  if (range->min != range->max)
    diagnostics.add(where, fmt::format("{} {:g}-{:g} is a range (expected the lot's one measured value)", what,
                                       range->min, range->max));
  return range->mid();
}

/// CSV rows or BeerXML records as lots; a bad value was named (line, column, value) by the reader.
std::vector<ReceivedLot> from_hop_records(const HopRecords& records, Diagnostics& diagnostics) {
  std::vector<ReceivedLot> lots;
  for (const ImportedHop& hop : records.hops) {
    ReceivedLot received;
    received.where = hop.where;
    Lot& lot = received.lot;
    lot.variety = hop.name;
    lot.lot = hop.lot;
    lot.form = hop.form.value_or(HopForm::pellet);
    lot.alpha_acid = single_value(hop.alpha_acid, "alpha acid", hop.where, diagnostics);
    lot.beta_acid = single_value(hop.beta_acid, "beta acid", hop.where, diagnostics);
    lot.total_oil = single_value(hop.total_oil, "total oil", hop.where, diagnostics);
    lot.packaged = hop.packaged;
    lot.on_hand_g = hop.on_hand_g;
    lot.hsi = hop.hsi;
    lots.push_back(std::move(received));
  }
  return lots;
}

/// What a single `stock receive` asks for, lot by lot; a lot without storage takes `storage`, and
/// lots with none at all are named in one line.
void check_complete(std::vector<ReceivedLot>& lots, const std::optional<Storage>& storage, Diagnostics& diagnostics) {
  std::vector<std::string> without_storage;
  for (ReceivedLot& received : lots) {
    Lot& lot = received.lot;
    const auto need = [&](bool present, std::string_view what) {
      if (!present)
        diagnostics.add(received.where,
                        fmt::format("{}: no {} (expected one for every lot received)", shown_value(lot.variety), what));
    };
    need(!trim_space(lot.lot).empty(), "lot code");
    need(lot.alpha_acid.has_value(), "alpha acid");
    need(lot.on_hand_g.has_value(), "amount");
    need(lot.packaged.has_value(), "packaging date");
    if (!lot.storage) lot.storage = storage;
    if (!lot.storage) without_storage.push_back(received.where);
  }
  if (without_storage.empty()) return;
  const std::string which = without_storage.size() == lots.size()
                                ? std::string("no lot has a storage")
                                : fmt::format("{}: no storage", fmt::join(without_storage, ", "));
  diagnostics.add_file(
      fmt::format("{} (expected --stored \"TEMP,PACKAGE\", such as \"-2 C,vacuum\", for the lots the file gives "
                  "none)",
                  which));
}

/// A lot code already in the stock, or twice in the file.
void check_new_codes(const std::vector<ReceivedLot>& lots, const Stock& stock, Diagnostics& diagnostics) {
  std::map<std::string, std::string> seen;  // folded code -> where
  for (std::size_t i = 0; i < stock.lots.size(); ++i)
    if (!stock.lots[i].lot.empty())
      seen.emplace(fold_name(stock.lots[i].lot), fmt::format("in {} as lot {}", stock.source_file, i + 1));
  for (const ReceivedLot& received : lots) {
    if (trim_space(received.lot.lot).empty()) continue;
    const auto [it, inserted] = seen.emplace(fold_name(received.lot.lot), "at " + received.where + " of this file");
    if (!inserted)
      diagnostics.add(received.where, fmt::format("lot {}: already {} (expected a new lot code; to correct an "
                                                  "amount use stock adjust)",
                                                  shown_value(received.lot.lot), it->second));
  }
}

/// The CSV's rows, the bad ones read past so that every problem in the file is listed at once;
/// when no row is good, the reader's own account of the bad rows.
HopRecords read_csv_rows(std::string_view text, const std::string& file) {
  CsvImportOptions every_row;
  every_row.skip_bad = true;
  try {
    return read_hop_csv(text, file, every_row);
  } catch (const InputError&) {
    return read_hop_csv(text, file, CsvImportOptions{});  // throws, naming each bad cell
  }
}

}  // namespace

std::vector<ReceivedLot> read_lot_receipts(std::string_view text, const std::string& file,
                                           const std::optional<Storage>& storage, const Stock& stock) {
  Diagnostics diagnostics(file);
  std::vector<ReceivedLot> lots;
  if (looks_like_json(text)) {
    const Stock given = parse_stock(text, file);  // names file, JSON pointer and value of a bad field
    for (std::size_t i = 0; i < given.lots.size(); ++i) lots.push_back({given.lots[i], fmt::format("/lots/{}", i)});
  } else {
    // A bad cell is named "line L, column C (HEADER): VALUE ... (expected ...)" by the reader.
    const HopRecords records = looks_like_xml(text) ? read_hop_beerxml(text, file) : read_csv_rows(text, file);
    for (const std::string& skipped : records.skipped) diagnostics.add_file(skipped);
    lots = from_hop_records(records, diagnostics);
  }
  check_complete(lots, storage, diagnostics);
  check_new_codes(lots, stock, diagnostics);
  diagnostics.throw_if_any();
  return lots;
}

}  // namespace bine

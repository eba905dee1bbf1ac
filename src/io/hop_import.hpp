#pragma once
// Hop records from the brewer's own files, for `bine import`: supplier spec sheets and certificates
// as CSV (columns found by our header synonym table, units read from the headers) and BeerXML HOP
// records. They become a catalog (variety ranges) or a stock file (lots on hand) in our JSON.
//
// BeerXML's HSI is the percent of alpha lost in 6 months (its 1.0 specification): it becomes the
// variety's stability, 100 - HSI. A CSV column "HSI" is the ASBC Hop Storage Index of one lot
// (about 0.2-0.6) and goes only into a stock file's lot.
#include <map>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// One hop record as read, every field optional but the name.
struct ImportedHop {
  std::string name;
  std::string origin;
  std::string lot;
  std::string notes;
  std::optional<Purpose> purpose;
  std::optional<HopForm> form;
  std::optional<Range> alpha_acid;  // % w/w (a single value is [v, v])
  std::optional<Range> beta_acid;
  std::optional<Range> cohumulone;  // % of alpha
  std::optional<Range> total_oil;   // mL/100 g
  std::map<std::string, Range> oils;
  std::optional<double> stability;  // % of alpha left after 6 months at 20 C
  std::optional<double> hsi;        // ASBC Hop Storage Index of a lot
  std::optional<Date> packaged;
  std::optional<double> on_hand_g;
  std::string where;  // "line 4" or a BeerXML element path, for notes
};

struct HopRecords {
  std::vector<ImportedHop> hops;
  std::vector<std::string> skipped;  // one line per row left out by skip_bad
  std::vector<std::string> notes;    // columns not used, assumptions
};

struct CsvImportOptions {
  std::vector<std::pair<std::string, std::string>> columns;  // --columns field=Header overrides
  bool skip_bad = false;
};

/// The field names --columns accepts, for help and messages.
std::vector<std::string> csv_field_names();

/// Reads hop records from a CSV table. A bad value is named "FILE: line L, column C (HEADER): VALUE
/// ... (expected ...)"; every bad row is reported and InputError thrown unless skip_bad, which keeps
/// the good rows and lists the others in `skipped`.
HopRecords read_hop_csv(std::string_view text, const std::string& file, const CsvImportOptions& options);

/// Reads every BeerXML HOP record (a HOPS list, or the hops of RECIPE records).
HopRecords read_hop_beerxml(std::string_view text, const std::string& file);

/// Where the words of a NOTES field went: the lexicon tags found, and the words it could not place.
struct PlacedNotes {
  std::vector<std::string> tags;
  std::vector<std::string> unplaced;
};

/// Finds the lexicon's tags and axis names in free text ("Bright lemon, pine and some diesel").
PlacedNotes place_notes(std::string_view notes, const Lexicon& lexicon);

/// A catalog document ({"catalog": ..., "varieties": [...]}); notes' words the lexicon cannot
/// place are added to `report`, one line per variety.
nlohmann::json hops_to_catalog(const HopRecords& records, const std::string& name, const Lexicon& lexicon,
                               std::vector<std::string>& report);

/// A stock document ({"stock": ..., "lots": [...]}).
nlohmann::json hops_to_stock(const HopRecords& records, const std::string& name, std::vector<std::string>& report);

}  // namespace bine

#pragma once
// The data model: varieties (catalog), lots (the brewer's cold store) and recipes. Plain values in
// canonical units (g, L, C, minutes, %, mL/100 g, specific gravity); loaders in src/io fill them.
#include <chrono>
#include <map>
#include <optional>
#include <string>
#include <unordered_map>
#include <vector>

namespace bine {

/// A [min, max] range as variety data give them (alpha 10-12 %).
struct Range {
  double min = 0.0;
  double max = 0.0;
  double mid() const { return 0.5 * (min + max); }
};

enum class Purpose { aroma, bittering, dual };
enum class HopForm { pellet, whole, powder };
enum class Package { vacuum, sealed, open };
enum class HopUse { first_wort, boil, whirlpool, dry_hop };

/// Oil compounds the catalog format carries, in % of total oil.
inline const std::vector<std::string>& oil_compounds() {
  static const std::vector<std::string> names{"myrcene",   "humulene", "caryophyllene",
                                              "farnesene", "linalool", "geraniol"};
  return names;
}

/// A hop variety as a catalog describes it. Every field but the name may be missing.
struct Variety {
  std::string name;
  std::string origin;
  std::optional<Purpose> purpose;
  std::optional<Range> alpha_acid;                     // % w/w
  std::optional<Range> beta_acid;                      // % w/w
  std::optional<Range> cohumulone;                     // % of alpha
  std::optional<Range> total_oil;                      // mL/100 g
  std::map<std::string, Range> oils;                   // compound -> % of total oil
  std::optional<double> stability;                     // % of alpha remaining after 6 months at 20 C
  std::optional<std::map<std::string, double>> aroma;  // axis -> 0..5; unnamed axes are 0
  std::vector<std::string> tags;
  std::string source_file;  // the catalog it came from, for messages
};

struct Catalog {
  std::vector<Variety> varieties;
  std::vector<std::string> names;  // catalog names merged in, in load order
  bool demo = false;
  /// Positions in `varieties` by folded name (fold_name), filled by index_variety_names
  /// (model/catalog_lookup.hpp); find_variety scans only when it does not cover every variety.
  std::unordered_map<std::string, std::size_t> by_folded_name;
};

using Date = std::chrono::sys_days;

struct Storage {
  double temperature_c = 0.0;
  Package package = Package::sealed;
};

/// One lot in the cold store, with its certificate values.
/// The brewer's own rub test of a lot: 0-5 per aroma axis (axes not scored are 0), and the day it
/// was scored. It stands for the lot's aroma in swap and blend instead of its variety's profile.
struct RubTest {
  Date scored{};
  std::vector<std::pair<std::string, double>> scores;  // axis name as written, 0-5
};

struct Lot {
  std::string variety;
  std::string lot;
  HopForm form = HopForm::pellet;
  std::optional<double> alpha_acid;  // % w/w on the certificate
  std::optional<double> beta_acid;
  std::optional<double> total_oil;  // mL/100 g
  std::optional<Date> packaged;
  std::optional<Storage> storage;
  std::optional<double> on_hand_g;
  std::optional<double> hsi;  // Hop Storage Index, measured
  std::optional<RubTest> rub_test;
};

struct Stock {
  std::string name;
  std::vector<Lot> lots;
  std::string source_file;
};

/// How the wort cools while whirlpool hops sit in it (recipe key "cooling"): straight from the
/// addition's temperature to `to_c` over its minutes, or by Newton's law of cooling with constant
/// `per_minute` toward `ambient_c`. Exactly one of `to_c` and `per_minute` is set.
struct Cooling {
  std::optional<double> to_c;
  std::optional<double> per_minute;
  double ambient_c = 20.0;
};

/// One hop addition in a recipe.
struct HopAddition {
  std::string variety;  // empty when only a lot is named
  std::string lot;      // lot code in a stock file, optional
  double grams = 0.0;
  std::optional<double> alpha_acid;  // % the recipe was written for
  HopUse use = HopUse::boil;
  std::optional<double> minutes;        // boil minutes, stand minutes, or dry-hop contact time
  std::optional<double> temperature_c;  // whirlpool only: the temperature it goes in at
  std::optional<Cooling> cooling;       // whirlpool only: the course after that (none: held)
  std::optional<HopForm> form;
  /// Total oil (mL/100 g) the amount was worked out for, when bine wrote it (recipe key "total_oil"),
  /// so that rebalancing a rebalanced recipe with the same lot changes nothing.
  std::optional<double> total_oil;
  // How the brewer wrote this addition ("oz", "d" ...; empty: canonical or bare number), kept on writing.
  std::string amount_unit;
  std::string time_unit;
};

/// How the brewer wrote a recipe's quantities (unit spellings of ParsedQuantity::unit; empty for a
/// bare number in the canonical unit), so that bine shows and writes them back the same way.
struct RecipeNotation {
  std::string volume;       // "L", "hL", "gal", "bbl" ...
  std::string gravity;      // "SG" or "P"
  std::string temperature;  // "C" or "F": hop stand and whirlpool temperatures
  std::string boil_time;    // "min" or "h"
  std::string stand_time;   // the hop stand's time
  /// The unit of the first hop amount written with one: new additions are written in it.
  std::string mass;
};

/// Wort held hot after flame-out before chilling (recipe key "hop_stand"). Boil and first-wort
/// additions keep isomerising during it; see engine/bitterness.hpp.
struct HopStand {
  double minutes = 0.0;
  double temperature_c = 100.0;
};

struct Recipe {
  std::string name;
  double batch_volume_l = 0.0;    // volume at the end of the boil
  double original_gravity = 1.0;  // SG
  double boil_minutes = 60.0;
  std::optional<double> target_ibu;
  std::optional<HopStand> hop_stand;  // hot stand after flame-out, before chilling
  std::vector<HopAddition> hops;
  std::string source_file;
  RecipeNotation notation;
};

/// The unit an addition's amount is written and weighed in: its own, else the recipe's ("" is grams).
std::string_view amount_unit(const Recipe& recipe, const HopAddition& hop);

std::string_view to_string(Purpose purpose);
std::string_view to_string(HopForm form);
std::string_view to_string(Package package);
std::string_view to_string(HopUse use);
std::optional<Purpose> purpose_from(std::string_view text);
std::optional<HopForm> form_from(std::string_view text);
std::optional<Package> package_from(std::string_view text);
std::optional<HopUse> use_from(std::string_view text);

/// Parses YYYY-MM-DD; nullopt when malformed or the day does not exist (2026-02-30).
std::optional<Date> parse_date(std::string_view text);
std::string format_date(Date date);

}  // namespace bine

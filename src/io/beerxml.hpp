#pragma once
// BeerXML 1.0, the open recipe exchange format: reading a RECIPE into our Recipe, writing a recipe
// back with only the hop amounts and alphas changed. HOP records for import: io/hop_import.hpp.
//
// What maps to what (the README's table says the same for brewers):
//   RECIPE/NAME -> name; BATCH_SIZE (L) -> batch volume; BOIL_TIME (min) -> boil time; OG (SG, else
//   EST_OG) -> original gravity; IBU -> target IBU.
//   HOP/NAME -> variety; ALPHA (%) -> alpha acid; AMOUNT (kg) -> grams; TIME (min) -> time;
//   USE Boil -> boil, First Wort -> first-wort, Dry Hop -> dry-hop, Aroma -> whirlpool at the
//   temperature the brewer gives (BeerXML has none), Mash -> kept in the file, not counted for IBU;
//   FORM Pellet -> pellet, Plug and Leaf -> whole.
//   HOP/HSI is "percent of alpha lost in 6 months of storage" in the 1.0 specification, a storage
//   rate: it becomes the variety's stability (100 - HSI), never a lot's ASBC Hop Storage Index.
// Safety: a file with a DOCTYPE is refused (no DTD or entity is ever read; pugixml expands no
// entity beyond the five predefined ones and character references), and so is one nested deeper
// than kMaxXmlDepth (io/xml_document.hpp). Parsing and every walk over the tree are iterative.
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// The whirlpool temperature an Aroma addition is read at when none is given (C). BeerXML's Aroma
/// is an addition at the end of the boil steeped for TIME minutes; 90 C is a hot stand just after
/// flame-out (common practice).
inline constexpr double kDefaultAromaTemperatureC = 90.0;

/// True when the text (after a UTF-8 byte-order mark and white space) starts like XML ('<').
bool looks_like_xml(std::string_view text);

struct BeerXmlReadOptions {
  std::string recipe_name;  // needed when the file holds several RECIPE records
  double aroma_temperature_c = kDefaultAromaTemperatureC;
  // How the brewer names a recipe and the Aroma temperature, for messages.
  std::string recipe_name_option = "--recipe-name";
  std::string aroma_temperature_option = "--whirlpool-temp";
};

/// The parsed document, kept so that a write changes only what bine changed.
struct BeerXmlDocument;

/// A recipe read from BeerXML and the document it came from.
struct BeerXmlRecipe {
  Recipe recipe;
  std::vector<std::string> notes;  // what the reading assumed (Aroma as whirlpool, Mash not counted)
  std::shared_ptr<BeerXmlDocument> document;
};

/// Reads one RECIPE. Throws InputError naming FILE, the element path and the value for every
/// problem; a file with several recipes and no (or an unknown) name lists the names present.
BeerXmlRecipe parse_beerxml_recipe(std::string_view text, const std::string& file, const BeerXmlReadOptions& options);

/// The source document with the recipe's hop additions made to match `after`: an addition that
/// matches one read from the file (same variety, use and time) keeps its HOP record with AMOUNT and
/// ALPHA rewritten; a new one gets a new HOP record (its HSI from the catalog's stability as
/// 100 - stability); one that is gone loses its record. Everything else is written back as it was,
/// in order. Changes the held document.
std::string beerxml_with_recipe(const BeerXmlRecipe& source, const Recipe& after, const Catalog* catalog);

}  // namespace bine

// BeerXML 1.0 reading and writing with pugixml; see beerxml.hpp for the mapping and the safety rules.
#include "io/beerxml.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <pugixml.hpp>
#include <sstream>

#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "io/shown_value.hpp"
#include "io/xml_document.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {

struct BeerXmlDocument {
  pugi::xml_document xml;
  XmlEncoding encoding;                // written back the way it was read
  pugi::xml_node recipe;               // the RECIPE element read
  std::vector<pugi::xml_node> hops;    // the HOP element of each addition in Recipe::hops
  std::vector<HopAddition> additions;  // the additions as read, to match against a changed recipe
};

namespace {

constexpr std::string_view kUses = "Boil, First Wort, Aroma, Dry Hop or Mash";
constexpr std::string_view kForms = "Pellet, Plug or Leaf";

/// A BeerXML word folded for comparison: lower case, spaces, '-' and '_' dropped ("Dry Hop" -> "dryhop").
std::string fold_word(std::string_view text) {
  std::string out;
  for (char c : trim_space(text))
    if (c != ' ' && c != '-' && c != '_') out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

std::optional<HopUse> beerxml_use(std::string_view text, bool& mash) {
  const std::string word = fold_word(text);
  mash = word == "mash";
  if (word == "boil") return HopUse::boil;
  if (word == "firstwort") return HopUse::first_wort;
  if (word == "aroma") return HopUse::whirlpool;
  if (word == "dryhop") return HopUse::dry_hop;
  return std::nullopt;
}

std::optional<HopForm> beerxml_form(std::string_view text) {
  const std::string word = fold_word(text);
  if (word == "pellet") return HopForm::pellet;
  if (word == "plug" || word == "leaf") return HopForm::whole;
  return std::nullopt;
}

/// Reads the numeric child `tag` of `parent` (BeerXML unit times `scale` gives the canonical unit).
std::optional<double> read_number(const XmlFields& fields, std::string_view tag, bool required, Dimension dimension,
                                  const Bounds& bounds, double scale = 1.0) {
  const auto value = fields.number(tag, required);
  if (!value) return std::nullopt;
  const double canonical = *value * scale;
  if (!check_bounds(canonical, dimension, bounds, fields.path(tag), fields.diagnostics())) return std::nullopt;
  return canonical;
}

struct ReadHop {
  std::optional<HopAddition> addition;  // nullopt for a Mash addition or one with a problem
  bool mash = false;
};

ReadHop read_recipe_hop(const XmlFields& fields, const BeerXmlReadOptions& options, double boil_minutes) {
  ReadHop read;
  HopAddition hop;
  hop.variety = fields.text("NAME", true).value_or("");
  const auto alpha = read_number(fields, "ALPHA", true, Dimension::percent, limits::alpha_acid);
  const auto grams = read_number(fields, "AMOUNT", true, Dimension::mass, limits::hop_mass, 1000.0);
  const auto minutes = read_number(fields, "TIME", true, Dimension::time, limits::addition_time);
  std::optional<HopUse> use;
  if (const auto text = fields.text("USE", true)) {
    use = beerxml_use(*text, read.mash);
    if (!use && !read.mash)
      fields.diagnostics().add(fields.path("USE"), fmt::format("{} is not one of {}", shown_value(*text), kUses));
  }
  if (const auto text = fields.text("FORM", false)) {
    hop.form = beerxml_form(*text);
    if (!hop.form)
      fields.diagnostics().add(fields.path("FORM"), fmt::format("{} is not one of {}", shown_value(*text), kForms));
  }
  if (use == HopUse::boil && minutes && boil_minutes > 0.0 && *minutes > boil_minutes + 1e-9)
    fields.diagnostics().add(fields.path("TIME"),
                             fmt::format("{:g} min is longer than the boil time of {:g} min", *minutes, boil_minutes));
  if (!use || !alpha || !grams || !minutes || hop.variety.empty()) return read;
  hop.alpha_acid = alpha;
  hop.grams = *grams;
  hop.use = *use;
  hop.minutes = minutes;
  if (hop.use == HopUse::whirlpool) hop.temperature_c = options.aroma_temperature_c;
  read.addition = hop;
  return read;
}

/// The RECIPE elements of the document: the children of a RECIPES root, or a RECIPE root.
std::vector<pugi::xml_node> recipe_nodes(const pugi::xml_document& xml) {
  std::vector<pugi::xml_node> nodes;
  const pugi::xml_node root = xml.document_element();
  if (tag_is(root, "RECIPE")) nodes.push_back(root);
  if (tag_is(root, "RECIPES"))
    for (pugi::xml_node child = root.first_child(); child; child = child.next_sibling())
      if (tag_is(child, "RECIPE")) nodes.push_back(child);
  return nodes;
}

/// The RECIPE to read: the only one, or the one named.
std::size_t choose_recipe(const std::vector<pugi::xml_node>& nodes, const std::string& file,
                          const BeerXmlReadOptions& options) {
  std::vector<std::string> names;
  for (const auto& node : nodes) names.push_back(shown_value(trim_space(child_text(node, "NAME"))));
  if (nodes.empty())
    throw InputError(file +
                     ": no RECIPE record (expected a BeerXML 1.0 RECIPES list; hop records are read by bine import)");
  if (options.recipe_name.empty()) {
    if (nodes.size() == 1) return 0;
    throw InputError(fmt::format("{}: holds {} recipes (expected {} NAME, one of: {})", file, nodes.size(),
                                 options.recipe_name_option, fmt::join(names, ", ")));
  }
  for (std::size_t i = 0; i < nodes.size(); ++i)
    if (fold_name(trim_space(child_text(nodes[i], "NAME"))) == fold_name(options.recipe_name)) return i;
  throw InputError(fmt::format("{}: {} {}: no such recipe (the file holds: {})", file, options.recipe_name_option,
                               shown_value(options.recipe_name), fmt::join(names, ", ")));
}

void read_recipe_values(const XmlFields& top, Recipe& recipe) {
  recipe.name = std::string(trim_space(top.text("NAME", false).value_or("")));
  recipe.batch_volume_l = read_number(top, "BATCH_SIZE", true, Dimension::volume, limits::batch_volume).value_or(0.0);
  recipe.boil_minutes = read_number(top, "BOIL_TIME", true, Dimension::time, limits::boil_time).value_or(0.0);
  const bool has_og = top.has("OG");
  const auto og = read_number(top, "OG", false, Dimension::gravity, limits::gravity);
  std::optional<double> estimated;
  if (!has_og) estimated = top.leading_number("EST_OG");
  if (!has_og && !estimated) top.diagnostics().add(top.path("OG"), "is missing (bine needs the original gravity, SG)");
  if (estimated && check_bounds(*estimated, Dimension::gravity, limits::gravity, top.path("EST_OG"), top.diagnostics()))
    recipe.original_gravity = *estimated;
  if (og) recipe.original_gravity = *og;
  recipe.target_ibu = read_number(top, "IBU", false, Dimension::number, limits::target_ibu);
}

// ---------------------------------------------------------------------------------------------
// Writing back

/// A number as BeerXML writes it: plain decimal to `resolution` (a power of ten), no trailing zeros.
std::string plain(double value, double resolution) {
  const int decimals = std::max(0, static_cast<int>(std::lround(-std::log10(resolution))));
  std::string text = fmt::format("{:.{}f}", value, decimals);
  if (text.find('.') != std::string::npos) {
    text.erase(text.find_last_not_of('0') + 1);
    if (text.back() == '.') text.pop_back();
  }
  return text == "-0" ? "0" : text;
}

std::string_view beerxml_use_name(HopUse use) {
  switch (use) {
    case HopUse::first_wort:
      return "First Wort";
    case HopUse::boil:
      return "Boil";
    case HopUse::whirlpool:
      return "Aroma";
    case HopUse::dry_hop:
      return "Dry Hop";
  }
  return "Boil";
}

bool is_blank_text(const pugi::xml_node& node) {
  return node.type() == pugi::node_pcdata && trim_space(node.value()).empty();
}

/// Sets the text of the child `tag`, adding the child when missing.
void set_child_text(pugi::xml_node node, std::string_view tag, const std::string& value) {
  pugi::xml_node child = child_element(node, tag);
  if (!child) {
    const pugi::xml_node last = node.last_child();
    child = is_blank_text(last) ? node.insert_child_before(std::string(tag).c_str(), last)
                                : node.append_child(std::string(tag).c_str());
  }
  child.text().set(value.c_str());
}

/// Sets a numeric child only when its value changed (beyond `resolution`), so an unchanged recipe is
/// written back as it was read.
void set_number(pugi::xml_node node, std::string_view tag, double value, double resolution) {
  const auto now = parse_plain_number(child_text(node, tag));
  if (now && std::abs(*now - value) < 0.5 * resolution) return;
  set_child_text(node, tag, plain(value, resolution));
}

bool same_addition(const HopAddition& a, const HopAddition& b) {
  return fold_name(a.variety) == fold_name(b.variety) && a.use == b.use &&
         std::abs(a.minutes.value_or(0.0) - b.minutes.value_or(0.0)) < 1e-6;
}

/// The text between sibling HOP records and before a HOP's first field, copied from an existing one.
struct Indent {
  std::string between;
  std::string field;
  std::string close;
};

Indent indent_of(const pugi::xml_node& hops) {
  Indent indent;
  const pugi::xml_node model = child_element(hops, "HOP");
  if (!model) return indent;
  if (is_blank_text(model.previous_sibling())) indent.between = model.previous_sibling().value();
  if (is_blank_text(model.first_child())) indent.field = model.first_child().value();
  if (is_blank_text(model.last_child())) indent.close = model.last_child().value();
  return indent;
}

void add_field(pugi::xml_node hop, const Indent& indent, const char* tag, const std::string& value) {
  if (!indent.field.empty()) hop.append_child(pugi::node_pcdata).set_value(indent.field.c_str());
  hop.append_child(tag).text().set(value.c_str());
}

/// A new HOP record after the last one (or at the end of HOPS).
void add_hop_record(pugi::xml_node hops, const HopAddition& hop, const Catalog* catalog) {
  const Indent indent = indent_of(hops);
  pugi::xml_node last_hop;
  for (pugi::xml_node child = hops.first_child(); child; child = child.next_sibling())
    if (tag_is(child, "HOP")) last_hop = child;
  pugi::xml_node record = last_hop ? hops.insert_child_after("HOP", last_hop) : hops.append_child("HOP");
  if (last_hop && !indent.between.empty())
    hops.insert_child_before(pugi::node_pcdata, record).set_value(indent.between.c_str());
  const Variety* variety = catalog ? find_variety(*catalog, hop.variety) : nullptr;
  std::optional<double> alpha = hop.alpha_acid;
  if (!alpha && variety && variety->alpha_acid) alpha = variety->alpha_acid->mid();
  add_field(record, indent, "NAME", hop.variety.empty() ? hop.lot : hop.variety);
  add_field(record, indent, "VERSION", "1");
  if (alpha) add_field(record, indent, "ALPHA", plain(*alpha, 1e-4));
  add_field(record, indent, "AMOUNT", plain(hop.grams / 1000.0, 1e-7));
  add_field(record, indent, "USE", std::string(beerxml_use_name(hop.use)));
  add_field(record, indent, "TIME", plain(hop.minutes.value_or(0.0), 1e-4));
  if (hop.form) add_field(record, indent, "FORM", *hop.form == HopForm::pellet ? "Pellet" : "Leaf");
  // BeerXML's HSI is % of alpha lost in 6 months; our stability is % left: HSI = 100 - stability.
  if (variety && variety->stability) add_field(record, indent, "HSI", plain(100.0 - *variety->stability, 1e-4));
  if (!indent.close.empty()) record.append_child(pugi::node_pcdata).set_value(indent.close.c_str());
}

void remove_hop_record(pugi::xml_node node) {
  pugi::xml_node parent = node.parent();
  if (is_blank_text(node.previous_sibling())) parent.remove_child(node.previous_sibling());
  parent.remove_child(node);
}

}  // namespace

bool looks_like_xml(std::string_view text) {
  if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  const auto first = text.find_first_not_of(" \t\r\n");
  return first != std::string_view::npos && text[first] == '<';
}

BeerXmlRecipe parse_beerxml_recipe(std::string_view text, const std::string& file, const BeerXmlReadOptions& options) {
  auto document = std::make_shared<BeerXmlDocument>();
  document->encoding = load_xml(text, file, document->xml);
  const std::vector<pugi::xml_node> nodes = recipe_nodes(document->xml);
  const std::size_t chosen = choose_recipe(nodes, file, options);
  document->recipe = nodes[chosen];
  Diagnostics diagnostics(file);
  const XmlFields top(document->recipe, element_path(document->recipe), diagnostics);
  BeerXmlRecipe result;
  result.recipe.source_file = file;
  read_recipe_values(top, result.recipe);
  std::size_t aroma = 0, mash = 0;
  const pugi::xml_node hops = top.child("HOPS");
  for (pugi::xml_node node = hops.first_child(); node; node = node.next_sibling()) {
    if (!tag_is(node, "HOP")) continue;
    const XmlFields fields(node, element_path(node), diagnostics);
    const ReadHop read = read_recipe_hop(fields, options, result.recipe.boil_minutes);
    mash += read.mash ? 1 : 0;
    if (!read.addition) continue;
    aroma += read.addition->use == HopUse::whirlpool ? 1 : 0;
    result.recipe.hops.push_back(*read.addition);
    document->hops.push_back(node);
  }
  diagnostics.throw_if_any();
  document->additions = result.recipe.hops;
  if (aroma > 0)
    result.notes.push_back(
        fmt::format("{} Aroma addition{} read as whirlpool at {:g} C (BeerXML gives no temperature; {} sets it)", aroma,
                    aroma == 1 ? "" : "s", options.aroma_temperature_c, options.aroma_temperature_option));
  if (mash > 0)
    result.notes.push_back(fmt::format("{} Mash addition{} not counted for IBU (kept in the file as written)", mash,
                                       mash == 1 ? "" : "s"));
  result.document = std::move(document);
  return result;
}

std::string beerxml_with_recipe(const BeerXmlRecipe& source, const Recipe& after, const Catalog* catalog) {
  BeerXmlDocument& document = *source.document;
  std::vector<bool> kept(document.additions.size(), false);
  std::vector<const HopAddition*> added;
  for (const auto& hop : after.hops) {
    std::size_t i = 0;
    while (i < document.additions.size() && (kept[i] || !same_addition(document.additions[i], hop))) ++i;
    if (i == document.additions.size()) {
      added.push_back(&hop);
      continue;
    }
    kept[i] = true;
    set_number(document.hops[i], "AMOUNT", hop.grams / 1000.0, 1e-7);
    if (hop.alpha_acid) set_number(document.hops[i], "ALPHA", *hop.alpha_acid, 1e-4);
  }
  pugi::xml_node hops = child_element(document.recipe, "HOPS");
  if (!hops && !added.empty()) hops = document.recipe.append_child("HOPS");
  for (const HopAddition* hop : added) add_hop_record(hops, *hop, catalog);
  for (std::size_t i = 0; i < kept.size(); ++i)
    if (!kept[i]) remove_hop_record(document.hops[i]);
  return save_xml(document.xml, document.encoding);
}

}  // namespace bine

// Hop records from CSV spec sheets: which column is which field (our synonym table, --columns), the
// unit each header names, and each cell read as spreadsheets write numbers. See hop_import.hpp.
#include "io/hop_import.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <set>

#include "io/csv_table.hpp"
#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "io/shown_value.hpp"
#include "io/xml_document.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

enum class Kind { text, purpose, form, range, number, date };

/// One field a column can fill: its --columns name, how its cells are read, its header synonyms
/// (normalised: lower case, no unit, punctuation as spaces).
struct FieldSpec {
  std::string_view field;
  Kind kind;
  Dimension dimension;
  Bounds bounds;
  std::vector<std::string_view> synonyms;
};

constexpr Bounds kNoBounds{-limits::kHuge, limits::kHuge, "a value"};

const std::vector<FieldSpec>& field_specs() {
  static const std::vector<FieldSpec> specs{
      {"name",
       Kind::text,
       Dimension::number,
       kNoBounds,
       {"name", "variety", "hop", "hop name", "variety name", "cultivar", "hop variety"}},
      {"origin", Kind::text, Dimension::number, kNoBounds, {"origin", "country", "country of origin", "region"}},
      {"purpose", Kind::purpose, Dimension::number, kNoBounds, {"purpose", "type", "usage", "hop type"}},
      {"alpha",
       Kind::range,
       Dimension::percent,
       limits::alpha_acid,
       {"alpha", "alpha acid", "alpha acids", "aa", "a acid", "a acids", "alphas"}},
      {"beta",
       Kind::range,
       Dimension::percent,
       limits::beta_acid,
       {"beta", "beta acid", "beta acids", "ba", "b acid", "b acids", "betas"}},
      {"cohumulone",
       Kind::range,
       Dimension::percent,
       limits::cohumulone,
       {"cohumulone", "co humulone", "coh", "co h", "cohumulone of alpha"}},
      {"total_oil",
       Kind::range,
       Dimension::oil_content,
       limits::total_oil,
       {"total oil", "oil", "oils", "total oils", "oil content"}},
      {"myrcene", Kind::range, Dimension::percent, limits::oil_fraction, {"myrcene"}},
      {"humulene", Kind::range, Dimension::percent, limits::oil_fraction, {"humulene"}},
      {"caryophyllene", Kind::range, Dimension::percent, limits::oil_fraction, {"caryophyllene"}},
      {"farnesene", Kind::range, Dimension::percent, limits::oil_fraction, {"farnesene"}},
      {"linalool", Kind::range, Dimension::percent, limits::oil_fraction, {"linalool"}},
      {"geraniol", Kind::range, Dimension::percent, limits::oil_fraction, {"geraniol"}},
      {"stability",
       Kind::number,
       Dimension::percent,
       limits::stability,
       {"stability", "storage stability", "alpha retained", "alpha left after 6 months"}},
      {"hsi", Kind::number, Dimension::number, limits::hsi, {"hsi", "hop storage index"}},
      {"lot",
       Kind::text,
       Dimension::number,
       kNoBounds,
       {"lot", "lot number", "lot no", "lot code", "batch", "batch number"}},
      {"form", Kind::form, Dimension::number, kNoBounds, {"form", "hop form", "product form"}},
      {"packaged",
       Kind::date,
       Dimension::number,
       kNoBounds,
       {"packaged", "packed", "pack date", "packaging date", "date packed"}},
      {"on_hand",
       Kind::number,
       Dimension::mass,
       limits::stock_mass,
       {"on hand", "amount", "quantity", "qty", "weight", "stock"}},
      {"notes",
       Kind::text,
       Dimension::number,
       kNoBounds,
       {"notes", "aroma", "aroma notes", "descriptors", "description", "flavour", "flavor", "sensory"}},
  };
  return specs;
}

std::string lower(std::string_view text) {
  std::string out(text);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

/// A header split into its label (normalised for the synonym table) and the unit it names:
/// "Total oil (mL/100 g)" -> {"total oil", "ml/100 g"}, "Alpha %" -> {"alpha", "%"}.
struct Header {
  std::string label;
  std::string unit;
};

Header split_header(std::string_view text) {
  std::string raw = lower(trim_space(text));
  Header header;
  for (const auto& [open, close] : {std::pair{'(', ')'}, std::pair{'[', ']'}}) {
    const auto from = raw.find(open);
    const auto to = raw.find(close, from);
    if (from == std::string::npos || to == std::string::npos) continue;
    header.unit = std::string(trim_space(std::string_view(raw).substr(from + 1, to - from - 1)));
    raw.erase(from, to - from + 1);
  }
  if (const auto percent = raw.find('%'); percent != std::string::npos) {
    if (header.unit.empty()) header.unit = "%";
    raw.erase(percent, 1);
  }
  if (header.unit == "% of alpha" || header.unit == "% of oil" || header.unit == "% of total oil") header.unit = "%";
  std::string label;
  for (char c : raw) {
    const char d = std::string_view("-_./:*").find(c) != std::string_view::npos ? ' ' : c;
    if (d == ' ' && (label.empty() || label.back() == ' ')) continue;
    label += d;
  }
  while (!label.empty() && label.back() == ' ') label.pop_back();
  header.label = label;
  return header;
}

const FieldSpec* spec_named(std::string_view field) {
  for (const auto& spec : field_specs())
    if (spec.field == field) return &spec;
  return nullptr;
}

const FieldSpec* spec_for_label(const std::string& label) {
  for (const auto& spec : field_specs())
    if (std::find(spec.synonyms.begin(), spec.synonyms.end(), label) != spec.synonyms.end()) return &spec;
  return nullptr;
}

/// A column in use: which field, the header as written, the unit its cells are in.
struct ColumnUse {
  const FieldSpec* spec = nullptr;
  std::size_t index = 0;
  std::string header;
  std::string unit;  // "" when the canonical unit
};

bool is_canonical_unit(const std::string& unit, Dimension dimension) {
  std::string compact;
  for (char c : lower(unit))
    if (c != ' ') compact += c;
  std::string canonical;
  for (char c : lower(canonical_unit(dimension)))
    if (c != ' ') canonical += c;
  return compact.empty() || compact == canonical || (dimension == Dimension::percent && compact == "%w/w");
}

/// Which column fills which field: --columns first, then the synonym table; unknown headers noted.
std::vector<ColumnUse> map_columns(const CsvTable& table, const std::string& file, const CsvImportOptions& options,
                                   std::vector<std::string>& notes) {
  std::vector<std::string> problems;
  std::vector<const FieldSpec*> chosen(table.header.fields.size(), nullptr);
  for (const auto& [field, header] : options.columns) {
    const FieldSpec* spec = spec_named(field);
    if (spec == nullptr) {
      problems.push_back(fmt::format("--columns: unknown field {} (expected one of {})", shown_value(field),
                                     fmt::join(csv_field_names(), ", ")));
      continue;
    }
    std::size_t i = 0;
    while (i < chosen.size() && fold_name(table.header.fields[i]) != fold_name(header)) ++i;
    if (i == chosen.size()) {
      problems.push_back(fmt::format("--columns: {}: no column headed {} in {} (the headers are {})", field,
                                     shown_value(header), file, fmt::join(table.header.fields, ", ")));
      continue;
    }
    chosen[i] = spec;
  }
  if (!problems.empty()) throw InputError(problems);
  std::set<std::string_view> taken;
  for (const auto* spec : chosen)
    if (spec) taken.insert(spec->field);
  std::vector<ColumnUse> columns;
  std::vector<std::string> unused;
  for (std::size_t i = 0; i < chosen.size(); ++i) {
    const Header header = split_header(table.header.fields[i]);
    const FieldSpec* spec = chosen[i] ? chosen[i] : spec_for_label(header.label);
    if (spec == nullptr || (!chosen[i] && !taken.insert(spec->field).second)) {
      if (!trim_space(table.header.fields[i]).empty()) unused.push_back(shown_value(table.header.fields[i]));
      continue;
    }
    ColumnUse use{spec, i, std::string(trim_space(table.header.fields[i])), header.unit};
    if (spec->kind == Kind::range || spec->kind == Kind::number) {
      if (is_canonical_unit(header.unit, spec->dimension)) {
        use.unit.clear();
      } else if (!parse_quantity("1 " + header.unit, spec->dimension).value) {
        problems.push_back(fmt::format("{}: line {}, column {} ({}): unit {} is not {} ({})", file, table.header.line,
                                       i + 1, use.header, shown_value(header.unit), dimension_noun(spec->dimension),
                                       accepted_units(spec->dimension)));
      }
    }
    columns.push_back(use);
  }
  if (!problems.empty()) throw InputError(problems);
  if (!taken.count("name"))
    throw InputError(
        fmt::format("{}: line {}: no column for the variety name (expected a header such as "
                    "\"Variety\" or \"Name\", or --columns name=HEADER)",
                    file, table.header.line));
  if (!unused.empty()) notes.push_back(fmt::format("columns not used: {}", fmt::join(unused, ", ")));
  return columns;
}

/// "4.5", "4,5", "4.5 %", "2.5 kg" (a unit in the cell wins over the header's).
std::optional<double> read_amount(std::string_view cell, const ColumnUse& column, std::string& problem) {
  std::string_view text = trim_space(cell);
  const auto split = text.find_first_not_of("0123456789.,+-eE ");
  std::string_view number = trim_space(text.substr(0, split));
  std::string unit(trim_space(split == std::string_view::npos ? std::string_view() : text.substr(split)));
  if (unit.empty()) unit = column.unit;
  const auto value = parse_spreadsheet_number(number);
  if (!value) {
    problem = fmt::format("{} is not a number (expected {} as a number such as 4.5 or 4,5)", shown_value(cell),
                          column.spec->bounds.what);
    return std::nullopt;
  }
  double canonical = *value;
  if (!is_canonical_unit(unit, column.spec->dimension)) {
    const ParsedQuantity parsed = parse_quantity(fmt::format("{} {}", *value, unit), column.spec->dimension);
    if (!parsed.value) {
      problem = fmt::format("{}: {}", shown_value(cell), parsed.error);
      return std::nullopt;
    }
    canonical = *parsed.value;
  }
  if (auto out = bounds_problem(canonical, column.spec->dimension, column.spec->bounds)) {
    problem = *out;
    return std::nullopt;
  }
  return canonical;
}

/// A cell with one value or a range "4.5-6.0" (also "4,5 - 6,0" and an en dash).
std::optional<Range> read_range(std::string_view cell, const ColumnUse& column, std::string& problem) {
  std::string text(trim_space(cell));
  for (std::size_t at = text.find("\xE2\x80\x93"); at != std::string::npos; at = text.find("\xE2\x80\x93"))
    text.replace(at, 3, "-");
  const auto dash = text.find('-', 1);
  if (dash == std::string::npos) {
    const auto single = read_amount(text, column, problem);
    if (!single) return std::nullopt;
    return Range{*single, *single};
  }
  const auto low = read_amount(std::string_view(text).substr(0, dash), column, problem);
  const auto high = low ? read_amount(std::string_view(text).substr(dash + 1), column, problem) : std::nullopt;
  if (!low || !high) return std::nullopt;
  if (*low > *high) {
    problem = fmt::format("{}: the range's first value is the larger (expected low-high, such as 4.5-6.0)",
                          shown_value(cell));
    return std::nullopt;
  }
  return Range{*low, *high};
}

std::optional<Purpose> read_purpose(std::string_view cell) {
  const std::string word = fold_name(cell);
  if (word == "aroma") return Purpose::aroma;
  if (word == "bittering" || word == "bitter") return Purpose::bittering;
  if (word == "dual" || word == "both" || word == "dual purpose") return Purpose::dual;
  return std::nullopt;
}

std::optional<HopForm> read_form(std::string_view cell) {
  const std::string word = fold_name(cell);
  if (word == "pellet" || word == "pellets" || word == "t90" || word == "t 90" || word == "t45" || word == "t 45")
    return HopForm::pellet;
  if (word == "whole" || word == "leaf" || word == "cone" || word == "cones" || word == "plug") return HopForm::whole;
  if (word == "powder" || word == "lupulin powder") return HopForm::powder;
  return std::nullopt;
}

/// YYYY-MM-DD, YYYY/MM/DD or DD.MM.YYYY (unambiguous forms only).
std::optional<Date> read_date(std::string_view cell) {
  std::string text(trim_space(cell));
  if (text.size() == 10 && text[4] == '/' && text[7] == '/') text[4] = text[7] = '-';
  if (text.size() == 10 && text[2] == '.' && text[5] == '.')
    text = text.substr(6, 4) + "-" + text.substr(3, 2) + "-" + text.substr(0, 2);
  return parse_date(text);
}

/// Puts one cell into the record; returns the problem, or "" when it fits.
std::string read_cell(const std::string& cell, const ColumnUse& column, ImportedHop& hop) {
  const std::string_view field = column.spec->field;
  std::string problem;
  switch (column.spec->kind) {
    case Kind::text: {
      const std::string text(trim_space(cell));
      if (field == "name") hop.name = text;
      if (field == "origin") hop.origin = text;
      if (field == "lot") hop.lot = text;
      if (field == "notes") hop.notes = text;
      return "";
    }
    case Kind::purpose:
      hop.purpose = read_purpose(cell);
      return hop.purpose
                 ? ""
                 : fmt::format("{} is not a purpose (expected aroma, bittering, dual or both)", shown_value(cell));
    case Kind::form:
      hop.form = read_form(cell);
      return hop.form ? ""
                      : fmt::format("{} is not a hop form (expected pellet, whole, leaf or powder)", shown_value(cell));
    case Kind::date:
      hop.packaged = read_date(cell);
      return hop.packaged
                 ? ""
                 : fmt::format("{} is not a date (expected YYYY-MM-DD, YYYY/MM/DD or DD.MM.YYYY)", shown_value(cell));
    case Kind::range: {
      const auto range = read_range(cell, column, problem);
      if (!range) return problem;
      if (field == "alpha") hop.alpha_acid = range;
      if (field == "beta") hop.beta_acid = range;
      if (field == "cohumulone") hop.cohumulone = range;
      if (field == "total_oil") hop.total_oil = range;
      if (spec_named(field) &&
          std::find(oil_compounds().begin(), oil_compounds().end(), field) != oil_compounds().end())
        hop.oils[std::string(field)] = *range;
      return "";
    }
    case Kind::number: {
      const auto value = read_amount(cell, column, problem);
      if (!value) return problem;
      if (field == "stability") hop.stability = value;
      if (field == "hsi") hop.hsi = value;
      if (field == "on_hand") hop.on_hand_g = value;
      return "";
    }
  }
  return "";
}

/// One data row: every problem, each "FILE: line L, column C (HEADER): ...".
std::vector<std::string> read_row(const CsvRow& row, const std::vector<ColumnUse>& columns, const std::string& file,
                                  ImportedHop& hop) {
  std::vector<std::string> problems;
  hop.where = fmt::format("line {}", row.line);
  for (const auto& column : columns) {
    const std::string cell = column.index < row.fields.size() ? row.fields[column.index] : std::string();
    if (trim_space(cell).empty()) continue;
    const std::string problem = read_cell(cell, column, hop);
    if (!problem.empty())
      problems.push_back(fmt::format("{}: line {}, column {} ({}): {}", file, row.line, column.index + 1,
                                     shown_value(column.header), problem));
  }
  if (hop.name.empty())
    problems.push_back(fmt::format("{}: line {}: no variety name (expected one in the name column)", file, row.line));
  return problems;
}

}  // namespace

std::vector<std::string> csv_field_names() {
  std::vector<std::string> names;
  for (const auto& spec : field_specs()) names.emplace_back(spec.field);
  return names;
}

HopRecords read_hop_csv(std::string_view text, const std::string& file, const CsvImportOptions& options) {
  const CsvTable table = parse_csv(text, file);
  HopRecords records;
  const std::vector<ColumnUse> columns = map_columns(table, file, options, records.notes);
  std::vector<std::string> problems;
  for (const auto& row : table.rows) {
    ImportedHop hop;
    const std::vector<std::string> row_problems = read_row(row, columns, file, hop);
    if (row_problems.empty()) {
      records.hops.push_back(std::move(hop));
      continue;
    }
    problems.insert(problems.end(), row_problems.begin(), row_problems.end());
    const std::string first = row_problems.front().substr(file.size() + 2);
    records.skipped.push_back(
        row_problems.size() == 1 ? first : fmt::format("{} (and {} more)", first, row_problems.size() - 1));
  }
  if (!problems.empty() && !options.skip_bad) throw InputError(problems, {});
  if (records.hops.empty()) throw InputError(file + ": no hop rows to import (expected rows below the header)");
  return records;
}

namespace {

/// Words that say how, not what ("notes of", "hints", "light"): neither placed nor listed.
bool is_filler(const std::string& word) {
  static const std::set<std::string> filler{
      "a",      "an",    "and",   "or",         "of",        "with",  "the",    "some",    "very",    "light", "slight",
      "strong", "notes", "note",  "hint",       "hints",     "aroma", "aromas", "flavour", "flavor",  "in",    "on",
      "to",     "like",  "tones", "undertones", "character", "touch", "bright", "subtle",  "intense", "mild",  "nose"};
  return filler.count(word) > 0;
}

/// The lexicon's own spelling of a tag or axis name, or "" when it has none.
std::string lexicon_term(const std::string& phrase, const Lexicon& lexicon) {
  const std::string folded = fold_name(phrase);
  for (const auto& tag : lexicon.all_tags())
    if (fold_name(tag) == folded) return tag;
  if (auto axis = lexicon.axis_index(phrase)) return lexicon.axes()[*axis].name;
  return "";
}

/// A plural's possible singulars ("peaches" -> "peache", "peach"; "berries" -> "berry").
std::vector<std::string> singulars(const std::string& word) {
  std::vector<std::string> out;
  if (word.size() > 4 && word.compare(word.size() - 3, 3, "ies") == 0)
    out.push_back(word.substr(0, word.size() - 3) + "y");
  if (word.size() > 3 && word.back() == 's') out.push_back(word.substr(0, word.size() - 1));
  if (word.size() > 4 && word.compare(word.size() - 2, 2, "es") == 0) out.push_back(word.substr(0, word.size() - 2));
  return out;
}

}  // namespace

PlacedNotes place_notes(std::string_view notes, const Lexicon& lexicon) {
  std::vector<std::string> words;
  std::string word;
  for (char c : std::string(notes) + " ") {
    const auto u = static_cast<unsigned char>(c);
    if (std::isalnum(u) || c == '-' || c == '\'' || u >= 0x80) {
      word += static_cast<char>(std::tolower(u));
    } else if (!word.empty()) {
      words.push_back(word);
      word.clear();
    }
  }
  PlacedNotes placed;
  for (std::size_t i = 0; i < words.size();) {
    std::size_t matched = 0;
    for (std::size_t n = std::min<std::size_t>(3, words.size() - i); n > 0 && matched == 0; --n) {
      std::string phrase = words[i];
      for (std::size_t k = 1; k < n; ++k) phrase += " " + words[i + k];
      std::string term = lexicon_term(phrase, lexicon);
      if (n == 1)
        for (const auto& one : singulars(phrase))
          if (term.empty()) term = lexicon_term(one, lexicon);
      if (term.empty()) continue;
      if (std::find(placed.tags.begin(), placed.tags.end(), term) == placed.tags.end()) placed.tags.push_back(term);
      matched = n;
    }
    if (matched == 0 && !is_filler(words[i]) &&
        std::find(placed.unplaced.begin(), placed.unplaced.end(), words[i]) == placed.unplaced.end())
      placed.unplaced.push_back(words[i]);
    i += std::max<std::size_t>(matched, 1);
  }
  return placed;
}

namespace {

nlohmann::json range_json(const Range& range) {
  if (range.min == range.max) return range.min;
  return nlohmann::json::array({range.min, range.max});
}

nlohmann::json variety_json(const ImportedHop& hop, const Lexicon& lexicon, std::vector<std::string>& report) {
  nlohmann::json out;
  out["name"] = hop.name;
  if (!hop.origin.empty()) out["origin"] = hop.origin;
  if (hop.purpose) out["purpose"] = std::string(to_string(*hop.purpose));
  if (hop.alpha_acid) out["alpha_acid"] = range_json(*hop.alpha_acid);
  if (hop.beta_acid) out["beta_acid"] = range_json(*hop.beta_acid);
  if (hop.cohumulone) out["cohumulone"] = range_json(*hop.cohumulone);
  if (hop.total_oil) out["total_oil"] = range_json(*hop.total_oil);
  for (const auto& [compound, range] : hop.oils) out["oils"][compound] = range_json(range);
  if (hop.stability) out["stability"] = *hop.stability;
  if (!hop.notes.empty()) {
    const PlacedNotes placed = place_notes(hop.notes, lexicon);
    if (!placed.tags.empty()) out["tags"] = placed.tags;
    if (!placed.unplaced.empty())
      report.push_back(fmt::format("{} ({}): words the aroma lexicon cannot place: {}", hop.name, hop.where,
                                   fmt::join(placed.unplaced, ", ")));
    out["notes"] = hop.notes;
  }
  return out;
}

}  // namespace

nlohmann::json hops_to_catalog(const HopRecords& records, const std::string& name, const Lexicon& lexicon,
                               std::vector<std::string>& report) {
  nlohmann::json varieties = nlohmann::json::array();
  std::map<std::string, std::string> seen;  // folded name -> where
  for (const auto& hop : records.hops) {
    const auto [it, inserted] = seen.emplace(fold_name(hop.name), hop.where);
    if (!inserted) {
      report.push_back(
          fmt::format("{} ({}): already read at {}, this record left out", hop.name, hop.where, it->second));
      continue;
    }
    if (hop.hsi)
      report.push_back(
          fmt::format("{} ({}): HSI {:g} describes one lot, not the variety (left out of the catalog; "
                      "import the file --to stock to keep it)",
                      hop.name, hop.where, *hop.hsi));
    varieties.push_back(variety_json(hop, lexicon, report));
  }
  return {{"catalog", {{"name", name}}}, {"varieties", std::move(varieties)}};
}

nlohmann::json hops_to_stock(const HopRecords& records, const std::string& name, std::vector<std::string>& report) {
  nlohmann::json lots = nlohmann::json::array();
  for (const auto& hop : records.hops) {
    nlohmann::json lot;
    lot["variety"] = hop.name;
    if (!hop.lot.empty()) lot["lot"] = hop.lot;
    if (hop.form) lot["form"] = std::string(to_string(*hop.form));
    // A lot has one measured value; a range from a spec sheet is taken at its middle (reported).
    const auto single = [&](const std::optional<Range>& range, const char* key) {
      if (!range) return;
      lot[key] = range->mid();
      if (range->min != range->max)
        report.push_back(fmt::format("{} ({}): {} {:g}-{:g} is a range; the lot takes its middle, {:g}", hop.name,
                                     hop.where, key, range->min, range->max, range->mid()));
    };
    single(hop.alpha_acid, "alpha_acid");
    single(hop.beta_acid, "beta_acid");
    single(hop.total_oil, "total_oil");
    if (hop.packaged) lot["packaged"] = format_date(*hop.packaged);
    if (hop.on_hand_g) lot["on_hand"] = fmt::format("{:g} g", *hop.on_hand_g);
    if (hop.hsi) lot["hsi"] = *hop.hsi;
    if (!hop.notes.empty()) lot["notes"] = hop.notes;
    lots.push_back(std::move(lot));
  }
  return {{"stock", {{"name", name}}}, {"lots", std::move(lots)}};
}

namespace {

/// Every HOP element whose parent is a HOPS list (or a lone HOP root), walked without recursion.
std::vector<pugi::xml_node> hop_elements(const pugi::xml_document& xml) {
  std::vector<pugi::xml_node> hops;
  std::vector<pugi::xml_node> pending{xml.document_element()};
  while (!pending.empty()) {
    const pugi::xml_node node = pending.back();
    pending.pop_back();
    if (tag_is(node, "HOP") && (tag_is(node.parent(), "HOPS") || node == xml.document_element())) {
      hops.push_back(node);
      continue;
    }
    std::vector<pugi::xml_node> children;
    for (pugi::xml_node child = node.first_child(); child; child = child.next_sibling())
      if (child.type() == pugi::node_element) children.push_back(child);
    pending.insert(pending.end(), children.rbegin(), children.rend());
  }
  return hops;
}

std::optional<Range> xml_range(const XmlFields& fields, std::string_view tag, const Bounds& bounds) {
  const auto value = fields.number(tag, false);
  if (!value || !check_bounds(*value, Dimension::percent, bounds, fields.path(tag), fields.diagnostics()))
    return std::nullopt;
  return Range{*value, *value};
}

ImportedHop xml_hop(const XmlFields& fields, const std::string& path) {
  ImportedHop hop;
  hop.where = path;
  hop.name = fields.text("NAME", true).value_or("");
  hop.origin = fields.text("ORIGIN", false).value_or("");
  hop.notes = fields.text("NOTES", false).value_or("");
  hop.alpha_acid = xml_range(fields, "ALPHA", limits::alpha_acid);
  hop.beta_acid = xml_range(fields, "BETA", limits::beta_acid);
  hop.cohumulone = xml_range(fields, "COHUMULONE", limits::cohumulone);
  for (const char* compound : {"MYRCENE", "HUMULENE", "CARYOPHYLLENE"})
    if (auto range = xml_range(fields, compound, limits::oil_fraction)) hop.oils[lower(compound)] = *range;
  // The 1.0 specification's HSI: % of alpha lost in 6 months of storage. Stability is % left.
  if (const auto hsi = fields.number("HSI", false)) {
    const double stability = 100.0 - *hsi;
    if (*hsi < 0.0 || stability < limits::stability.min)
      fields.diagnostics().add(
          fields.path("HSI"),
          fmt::format("{:g} is outside 0-99 (expected BeerXML's % of alpha lost in 6 months)", *hsi));
    else
      hop.stability = stability;
  }
  if (const auto type = fields.text("TYPE", false)) {
    hop.purpose = read_purpose(*type);
    if (!hop.purpose)
      fields.diagnostics().add(fields.path("TYPE"),
                               fmt::format("{} is not one of Bittering, Aroma or Both", shown_value(*type)));
  }
  if (const auto form = fields.text("FORM", false)) {
    hop.form = read_form(*form);
    if (!hop.form)
      fields.diagnostics().add(fields.path("FORM"),
                               fmt::format("{} is not one of Pellet, Plug or Leaf", shown_value(*form)));
  }
  if (const auto kg = fields.number("AMOUNT", false))
    if (check_bounds(*kg * 1000.0, Dimension::mass, limits::stock_mass, fields.path("AMOUNT"), fields.diagnostics()))
      hop.on_hand_g = *kg * 1000.0;
  return hop;
}

}  // namespace

HopRecords read_hop_beerxml(std::string_view text, const std::string& file) {
  pugi::xml_document xml;
  load_xml(text, file, xml);
  Diagnostics diagnostics(file);
  HopRecords records;
  for (const pugi::xml_node& node : hop_elements(xml)) {
    const std::string path = element_path(node);
    records.hops.push_back(xml_hop(XmlFields(node, path, diagnostics), path));
  }
  diagnostics.throw_if_any();
  if (records.hops.empty()) throw InputError(file + ": no HOP record (expected a BeerXML 1.0 HOPS list or RECIPES)");
  return records;
}

}  // namespace bine

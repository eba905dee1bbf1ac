// Reading a brewing schedule (io/brew_schedule.hpp): JSON through parse_json_text and FieldReader,
// CSV through parse_csv (libcsv), every problem collected before one InputError.
#include "io/brew_schedule.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/csv_table.hpp"
#include "io/file_io.hpp"
#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

std::filesystem::path beside(const std::filesystem::path& schedule, const std::string& recipe) {
  const std::filesystem::path path(recipe);
  if (path.is_absolute()) return path;
  return schedule.parent_path() / path;
}

std::vector<ScheduledBrew> read_json_schedule(std::string_view text, const std::filesystem::path& file,
                                              Diagnostics& diagnostics) {
  std::vector<ScheduledBrew> brews;
  const auto document = parse_json_text(text, diagnostics);
  if (!document) return brews;
  FieldReader top(*document, "", diagnostics);
  if (!top.ok()) return brews;
  top.allow_only({"brews"});
  const nlohmann::json* list = top.raw("brews");
  if (list == nullptr || !list->is_array()) {
    diagnostics.add("/brews", "missing or not a list (expected {\"brews\": [{\"recipe\", \"on\", \"batches\"}]})");
    return brews;
  }
  for (std::size_t i = 0; i < list->size(); ++i) {
    FieldReader entry((*list)[i], fmt::format("/brews/{}", i), diagnostics);
    if (!entry.ok()) continue;
    entry.allow_only({"recipe", "on", "batches"});
    const auto recipe = entry.text("recipe", true);
    const auto on = entry.date("on", true);
    const auto batches = entry.quantity("batches", Dimension::number, limits::batches, false);
    if (batches && std::floor(*batches) != *batches)
      diagnostics.add(entry.at("batches"), fmt::format("{} is not a whole number of batches", *batches));
    if (!recipe || !on) continue;
    brews.push_back(ScheduledBrew{beside(file, *recipe), *recipe, *on,
                                  batches ? static_cast<std::size_t>(*batches) : 1U, entry.pointer()});
  }
  return brews;
}

/// The column of each of recipe, on, batches (batches may be missing: 1 batch); problems for the others.
std::vector<std::optional<std::size_t>> schedule_columns(const CsvRow& header, Diagnostics& diagnostics) {
  const std::vector<std::string> names{"recipe", "on", "batches"};
  std::vector<std::optional<std::size_t>> columns(names.size());
  for (std::size_t c = 0; c < header.fields.size(); ++c) {
    const std::string name = fold_name(trim_space(header.fields[c]));
    const auto known = std::find(names.begin(), names.end(), name);
    if (known == names.end())
      diagnostics.add_file(fmt::format("line {}: column \"{}\": unknown header (expected recipe, on, batches)",
                                       header.line, header.fields[c]));
    else
      columns[static_cast<std::size_t>(known - names.begin())] = c;
  }
  for (std::size_t n = 0; n < 2; ++n)
    if (!columns[n])
      diagnostics.add_file(
          fmt::format("line {}: no \"{}\" column (expected headers recipe, on, batches)", header.line, names[n]));
  return columns;
}

std::optional<ScheduledBrew> csv_brew(const CsvRow& row, const std::vector<std::optional<std::size_t>>& columns,
                                      const std::filesystem::path& file, Diagnostics& diagnostics) {
  const auto field = [&](std::size_t n) {
    return columns[n] && *columns[n] < row.fields.size() ? std::string(trim_space(row.fields[*columns[n]]))
                                                         : std::string();
  };
  const std::string recipe = field(0), on_text = field(1), batches_text = field(2);
  bool ok = true;
  if (recipe.empty()) {
    diagnostics.add_file(fmt::format("line {}: recipe: empty (expected a recipe file)", row.line));
    ok = false;
  }
  const auto on = parse_date(on_text);
  if (!on) {
    diagnostics.add_file(
        fmt::format("line {}: on: \"{}\" is not a date that exists (expected YYYY-MM-DD)", row.line, on_text));
    ok = false;
  }
  std::size_t batches = 1;
  if (!batches_text.empty()) {
    const auto number = parse_spreadsheet_number(batches_text);
    if (!number || std::floor(*number) != *number || *number < limits::batches.min || *number > limits::batches.max) {
      diagnostics.add_file(fmt::format("line {}: batches: \"{}\" is not a whole number from {} to {}", row.line,
                                       batches_text, limits::batches.min, limits::batches.max));
      ok = false;
    } else {
      batches = static_cast<std::size_t>(*number);
    }
  }
  if (!ok) return std::nullopt;
  return ScheduledBrew{beside(file, recipe), recipe, *on, batches, fmt::format("line {}", row.line)};
}

std::vector<ScheduledBrew> read_csv_schedule(std::string_view text, const std::filesystem::path& file,
                                             Diagnostics& diagnostics) {
  const CsvTable table = parse_csv(text, file.string());
  const auto columns = schedule_columns(table.header, diagnostics);
  std::vector<ScheduledBrew> brews;
  if (!columns[0] || !columns[1]) return brews;
  for (const CsvRow& row : table.rows)
    if (auto brew = csv_brew(row, columns, file, diagnostics)) brews.push_back(std::move(*brew));
  return brews;
}

}  // namespace

std::vector<ScheduledBrew> read_brew_schedule(const std::filesystem::path& file) {
  const std::string text = read_text_file(file);
  Diagnostics diagnostics(file.string());
  const auto first = text.find_first_not_of(" \t\r\n\xEF\xBB\xBF");
  const bool json = first != std::string::npos && text[first] == '{';
  std::vector<ScheduledBrew> brews =
      json ? read_json_schedule(text, file, diagnostics) : read_csv_schedule(text, file, diagnostics);
  if (diagnostics.empty() && brews.empty())
    diagnostics.add_file("no brews (expected at least one recipe, on, batches)");
  diagnostics.throw_if_any();
  return brews;
}

}  // namespace bine

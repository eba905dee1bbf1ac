// Reading the calibration batch log (JSON or CSV; the CSV through libcsv).
#include "io/batch_log.hpp"

#include <csv.h>
#include <fmt/format.h>

#include <algorithm>
#include <map>

#include "io/file_io.hpp"
#include "io/json_fields.hpp"
#include "io/limits.hpp"
#include "model/errors.hpp"

namespace bine {
namespace {

using nlohmann::json;

std::filesystem::path beside(const std::string& file, const std::string& name) {
  const std::filesystem::path path(name);
  if (path.is_absolute()) return path;
  return std::filesystem::path(file).parent_path() / path;
}

// The rows of a CSV text, each a list of fields (libcsv, strict quoting).
struct CsvRows {
  std::vector<std::vector<std::string>> rows;
  std::vector<std::string> current;
};

void csv_field(void* data, std::size_t length, void* rows) {
  auto& current = static_cast<CsvRows*>(rows)->current;
  if (data == nullptr)
    current.emplace_back();
  else
    current.emplace_back(static_cast<const char*>(data), length);
}

void csv_row_end(int, void* rows) {
  auto* all = static_cast<CsvRows*>(rows);
  all->rows.push_back(std::move(all->current));
  all->current.clear();
}

std::vector<std::vector<std::string>> csv_rows(std::string_view text, const std::string& file) {
  csv_parser parser;
  if (csv_init(&parser, CSV_STRICT) != 0) throw InputError(file + ": cannot start the CSV reader");
  CsvRows rows;
  const bool parsed = csv_parse(&parser, text.data(), text.size(), csv_field, csv_row_end, &rows) == text.size() &&
                      csv_fini(&parser, csv_field, csv_row_end, &rows) == 0;
  const std::string problem = parsed ? "" : csv_strerror(csv_error(&parser));
  csv_free(&parser);
  if (!parsed) throw InputError(fmt::format("{}: not valid CSV ({})", file, problem));
  return std::move(rows.rows);
}

// A cell without surrounding blanks ("" when the row is short).
std::string cell(const std::vector<std::string>& row, std::optional<std::size_t> column) {
  if (!column || *column >= row.size()) return "";
  std::string text = row[*column];
  while (!text.empty() && (text.back() == ' ' || text.back() == '\r' || text.back() == '\t')) text.pop_back();
  const auto first = text.find_first_not_of(' ');
  return first == std::string::npos ? "" : text.substr(first);
}

}  // namespace

BatchLog parse_batch_log_json(std::string_view text, const std::string& file) {
  Diagnostics diagnostics(file);
  const auto document = parse_json_text(text, diagnostics);
  diagnostics.throw_if_any();
  BatchLog log;
  log.source_file = file;
  FieldReader top(*document, "", diagnostics);
  top.allow_only({"batches", "notes"});
  const json* batches = top.raw("batches");
  if (batches == nullptr || !batches->is_array()) {
    diagnostics.add("/batches", "is missing or not an array (expected [{\"recipe\", \"brewed\", \"lab_ibu\"}, ...])");
    diagnostics.throw_if_any();
  }
  for (std::size_t i = 0; i < batches->size(); ++i) {
    const std::string pointer = "/batches/" + std::to_string(i);
    FieldReader reader((*batches)[i], pointer, diagnostics);
    reader.allow_only({"recipe", "brewed", "lab_ibu", "stock", "notes"});
    LoggedBatch batch;
    batch.where = fmt::format("{}: {}", file, pointer);
    batch.recipe = beside(file, reader.text("recipe", true).value_or(""));
    batch.brewed = reader.date("brewed", true).value_or(Date{});
    batch.lab_ibu = reader.quantity("lab_ibu", Dimension::number, limits::lab_ibu, true).value_or(0.0);
    if (auto stock = reader.text("stock", false); stock && !stock->empty()) batch.stock = beside(file, *stock);
    log.batches.push_back(std::move(batch));
  }
  diagnostics.throw_if_any();
  return log;
}

BatchLog parse_batch_log_csv(std::string_view text, const std::string& file) {
  const auto rows = csv_rows(text, file);
  if (rows.empty()) throw InputError(file + ": row 1: is empty (expected a header: recipe,brewed,lab_ibu,stock)");
  std::map<std::string, std::size_t> columns;
  for (std::size_t c = 0; c < rows[0].size(); ++c) columns[cell(rows[0], c)] = c;
  const auto column = [&](const std::string& name) -> std::optional<std::size_t> {
    const auto found = columns.find(name);
    return found == columns.end() ? std::nullopt : std::optional<std::size_t>(found->second);
  };
  std::vector<std::string> problems;
  for (const char* required : {"recipe", "brewed", "lab_ibu"})
    if (!column(required))
      problems.push_back(
          fmt::format("{}: row 1: no \"{}\" column (expected a header: recipe,brewed,lab_ibu,stock)", file, required));
  if (!problems.empty()) throw InputError(problems);
  BatchLog log;
  log.source_file = file;
  for (std::size_t r = 1; r < rows.size(); ++r) {
    const auto& row = rows[r];
    const std::string where = fmt::format("{}: row {}", file, r + 1);
    if (std::all_of(row.begin(), row.end(), [&](const std::string& f) { return cell({f}, 0).empty(); })) continue;
    LoggedBatch batch;
    batch.where = where;
    const std::string recipe = cell(row, column("recipe"));
    if (recipe.empty()) problems.push_back(where + ": recipe: is empty (give the recipe file)");
    batch.recipe = beside(file, recipe);
    const std::string brewed = cell(row, column("brewed"));
    if (auto date = parse_date(brewed))
      batch.brewed = *date;
    else
      problems.push_back(fmt::format("{}: brewed: \"{}\" is not a date (expected YYYY-MM-DD)", where, brewed));
    const std::string lab = cell(row, column("lab_ibu"));
    const ParsedQuantity ibu = parse_quantity(lab, Dimension::number);
    if (!ibu.value)
      problems.push_back(fmt::format("{}: lab_ibu: \"{}\" is not a number of IBU", where, lab));
    else if (auto problem = bounds_problem(*ibu.value, Dimension::number, limits::lab_ibu))
      problems.push_back(fmt::format("{}: lab_ibu: {}", where, *problem));
    else
      batch.lab_ibu = *ibu.value;
    if (const std::string stock = cell(row, column("stock")); !stock.empty()) batch.stock = beside(file, stock);
    log.batches.push_back(std::move(batch));
  }
  if (!problems.empty()) throw InputError(problems);
  return log;
}

BatchLog load_batch_log(const std::filesystem::path& path) {
  const std::string text = read_text_file(path);
  std::string extension = path.extension().string();
  std::transform(extension.begin(), extension.end(), extension.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return extension == ".csv" ? parse_batch_log_csv(text, path.string()) : parse_batch_log_json(text, path.string());
}

}  // namespace bine

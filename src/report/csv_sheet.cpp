#include "report/csv_sheet.hpp"

#include <fmt/format.h>

#include <stdexcept>

#include "io/csv_table.hpp"

namespace bine {

CsvSheet::CsvSheet(std::vector<std::string> headers) : headers_(std::move(headers)) {}

void CsvSheet::add_row(std::vector<std::string> fields) {
  if (fields.size() != headers_.size())
    throw std::logic_error(fmt::format("CSV row of {} fields under {} headers", fields.size(), headers_.size()));
  rows_.push_back(std::move(fields));
}

std::string CsvSheet::str() const {
  std::string out = csv_line(headers_);
  for (const auto& row : rows_) out += csv_line(row);
  return out;
}

std::string csv_number(double value) {
  // fmt's "{}" is locale-independent and the shortest round-trip form.
  return fmt::format("{}", value == 0.0 ? 0.0 : value);
}

std::string csv_number(const std::optional<double>& value) { return value ? csv_number(*value) : std::string(); }

std::string csv_bool(bool value) { return value ? "true" : "false"; }

}  // namespace bine

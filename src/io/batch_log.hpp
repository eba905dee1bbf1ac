#pragma once
// The batch log bine calibrate reads: one row per beer a lab measured (recipe file, brew date,
// lab IBU, optionally the stock file its hops came from), as JSON or CSV.
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// One logged beer. Paths are resolved against the log's folder.
struct LoggedBatch {
  std::filesystem::path recipe;
  Date brewed{};
  double lab_ibu = 0.0;
  std::optional<std::filesystem::path> stock;
  std::string where;  // "log.json: /batches/3" or "log.csv: row 5" (the header is row 1), for messages
};

struct BatchLog {
  std::vector<LoggedBatch> batches;
  std::string source_file;
};

/// JSON: {"batches": [{"recipe", "brewed": "YYYY-MM-DD", "lab_ibu", "stock"}]}.
BatchLog parse_batch_log_json(std::string_view text, const std::string& file);
/// CSV with a header row naming the columns recipe, brewed, lab_ibu and (optional) stock.
BatchLog parse_batch_log_csv(std::string_view text, const std::string& file);
/// Reads a log; CSV when the file name ends in .csv, else JSON. Throws InputError with every problem.
BatchLog load_batch_log(const std::filesystem::path& path);

}  // namespace bine

#pragma once
// Where a command writes: its output, its warnings and timings. Handed to every command, so the
// binary, the in-process tests and the CLI fuzzer all capture the same streams and nothing escapes
// to the process's own stdout or stderr.
#include <functional>
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <vector>

#include "io/data_dir.hpp"
#include "report/timings.hpp"

namespace bine::cli {

struct Console {
  std::ostream& out;
  std::ostream& err;
  bool timings = false;          // --timings: phase timers on err
  bool err_is_terminal = false;  // err is the process's stderr and a terminal (progress bars)

  /// A timer for one phase of the command; prints to err when it ends, if timings are on.
  PhaseTimer time(std::string phase) const { return PhaseTimer(timings ? &err : nullptr, std::move(phase)); }
};

/// Prints a command's result: the JSON document (indented, one trailing newline) when `json`, else
/// the text rendering.
void print_result(const Console& console, bool json, const std::function<nlohmann::json()>& document,
                  const std::function<void(std::ostream&)>& text);
/// The same for a command whose figures come from catalogs: the JSON object gains "catalogs_used"
/// (name, file, demo) and the text ends with the catalogs-used line, so every output says where its
/// numbers came from and marks demo data.
void print_result(const Console& console, bool json, const DataSet& data,
                  const std::function<nlohmann::json()>& document, const std::function<void(std::ostream&)>& text);

/// What a command prints on its output: text tables (the default), one JSON document (--json) or
/// one CSV table for spreadsheets (--csv).
enum class Printed { text, json, csv };

/// Why --csv cannot go with the other output options given, or empty when it can: --csv goes with
/// neither --json nor a page (`html` names the --html file, empty when none), since a spreadsheet
/// table is the whole output.
std::string csv_conflict(bool json, bool csv, const std::string& html = "");

/// The output --json and --csv choose; throws InputError with csv_conflict's line.
Printed printed_as(bool json, bool csv, const std::string& html = "");

/// Prints a command's result as `printed` says: the JSON document, the CSV table (as `table`
/// writes it) or the text rendering.
void print_result(const Console& console, Printed printed, const DataSet& data,
                  const std::function<nlohmann::json()>& document, const std::function<std::string()>& table,
                  const std::function<void(std::ostream&)>& text);

/// In CSV output the notes a text report prints under its tables go to err, one "bine: note:" line
/// each, so the output stays one table.
void print_notes(const Console& console, const std::vector<std::string>& notes);

}  // namespace bine::cli

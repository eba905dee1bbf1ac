#pragma once
// A brewing schedule for `bine stock plan`: which recipe is brewed on which day, how many batches.
// JSON ({"brews": [{"recipe": FILE, "on": "YYYY-MM-DD", "batches": N}]}) or CSV (headers recipe,
// on, batches; read by io/csv_table), told apart by content (JSON starts with '{'). A recipe path
// is taken relative to the schedule's folder unless absolute. Every bad row is one problem naming
// the file, the line (CSV) or JSON pointer, the field and the value.
#include <cstddef>
#include <filesystem>
#include <string>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// One brew of the schedule.
struct ScheduledBrew {
  std::filesystem::path recipe_file;  // resolved against the schedule's folder
  std::string recipe_as_written;      // as the schedule gives it
  Date on{};
  std::size_t batches = 1;
  std::string where;  // "line 3" (CSV) or "/brews/2" (JSON), for messages
};

/// The brews of a schedule file, in file order. Throws InputError naming every bad row (at most
/// kMaxProblemLines), or a schedule without brews.
std::vector<ScheduledBrew> read_brew_schedule(const std::filesystem::path& file);

}  // namespace bine

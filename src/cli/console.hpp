#pragma once
// Where a command writes: its output, its warnings and timings. Handed to every command, so the
// binary, the in-process tests and the CLI fuzzer all capture the same streams and nothing escapes
// to the process's own stdout or stderr.
#include <functional>
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>

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

}  // namespace bine::cli

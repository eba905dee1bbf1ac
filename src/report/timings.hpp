#pragma once
// Scoped phase timers printed with --timings: the cheapest profiler a brewer can run.
#include <chrono>
#include <ostream>
#include <string>

namespace bine {

/// Measures the time from construction to destruction and prints one line to `sink` when it ends;
/// a null sink (timings off) prints nothing.
class PhaseTimer {
 public:
  PhaseTimer(std::ostream* sink, std::string phase);
  ~PhaseTimer();
  PhaseTimer(const PhaseTimer&) = delete;
  PhaseTimer& operator=(const PhaseTimer&) = delete;

 private:
  std::ostream* sink_;
  std::string phase_;
  std::chrono::steady_clock::time_point start_;
};

}  // namespace bine

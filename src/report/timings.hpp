#pragma once
// Scoped phase timers printed to stderr with --timings: the cheapest profiler a brewer can run.
#include <chrono>
#include <string>

namespace bine {

class PhaseTimer {
 public:
  PhaseTimer(bool enabled, std::string phase);
  ~PhaseTimer();
  PhaseTimer(const PhaseTimer&) = delete;
  PhaseTimer& operator=(const PhaseTimer&) = delete;

 private:
  bool enabled_;
  std::string phase_;
  std::chrono::steady_clock::time_point start_;
};

}  // namespace bine

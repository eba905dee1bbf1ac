#include "report/timings.hpp"

#include <fmt/format.h>

namespace bine {

PhaseTimer::PhaseTimer(std::ostream* sink, std::string phase)
    : sink_(sink), phase_(std::move(phase)), start_(std::chrono::steady_clock::now()) {}

PhaseTimer::~PhaseTimer() {
  if (sink_ == nullptr) return;
  const double ms = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start_).count();
  *sink_ << fmt::format("timing: {:<16} {:9.3f} ms\n", phase_, ms);
}

}  // namespace bine

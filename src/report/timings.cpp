#include "report/timings.hpp"

#include <fmt/format.h>

#include <cstdio>

namespace bine {

PhaseTimer::PhaseTimer(bool enabled, std::string phase)
    : enabled_(enabled), phase_(std::move(phase)), start_(std::chrono::steady_clock::now()) {}

PhaseTimer::~PhaseTimer() {
  if (!enabled_) return;
  const double ms = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start_).count();
  fmt::print(stderr, "timing: {:<16} {:9.3f} ms\n", phase_, ms);
}

}  // namespace bine

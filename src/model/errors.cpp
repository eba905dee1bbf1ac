#include "model/errors.hpp"

namespace bine {
namespace {
std::string join_lines(const std::vector<std::string>& lines) {
  std::string out;
  for (const auto& line : lines) {
    if (!out.empty()) out += '\n';
    out += line;
  }
  return out;
}
}  // namespace

InputError::InputError(std::string line) : std::runtime_error(line), lines_{std::move(line)} {}
InputError::InputError(std::vector<std::string> lines)
    : std::runtime_error(join_lines(lines)), lines_(std::move(lines)) {}

void Diagnostics::add(const std::string& pointer, const std::string& message) {
  lines_.push_back(file_ + ": " + (pointer.empty() ? std::string("/") : pointer) + ": " + message);
}

void Diagnostics::add_file(const std::string& message) { lines_.push_back(file_ + ": " + message); }

void Diagnostics::throw_if_any() const {
  if (!lines_.empty()) throw InputError(lines_);
}

}  // namespace bine

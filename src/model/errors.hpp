#pragma once
// The two errors a brewer can meet, each carrying its exit status. They are caught in one place
// (src/cli/main.cpp) and printed one line each with the prefix "bine: error: ".
#include <stdexcept>
#include <string>
#include <vector>

namespace bine {

/// Exit statuses: 0 ok, 2 bad input, 3 infeasible request.
inline constexpr int kExitBadInput = 2;
inline constexpr int kExitInfeasible = 3;

/// Bad input: a file, field or option that cannot be used. Holds one line per problem.
class InputError : public std::runtime_error {
 public:
  explicit InputError(std::string line);
  explicit InputError(std::vector<std::string> lines);
  const std::vector<std::string>& lines() const { return lines_; }

 private:
  std::vector<std::string> lines_;
};

/// A well-formed request that cannot be met (no stock, IBU already exceeded ...). Says why and
/// what would make it feasible.
class Infeasible : public std::runtime_error {
 public:
  explicit Infeasible(std::string why) : std::runtime_error(std::move(why)) {}
};

/// Collects every problem found in one file before stopping, so the brewer fixes them in one go.
/// Lines read `FILE: /json/pointer: what is wrong (what is expected)`.
class Diagnostics {
 public:
  explicit Diagnostics(std::string file) : file_(std::move(file)) {}
  void add(const std::string& pointer, const std::string& message);
  /// A problem with the file as a whole (unreadable, not JSON).
  void add_file(const std::string& message);
  bool empty() const { return lines_.empty(); }
  const std::string& file() const { return file_; }
  const std::vector<std::string>& lines() const { return lines_; }
  /// Throws InputError with every collected line when there is any.
  void throw_if_any() const;

 private:
  std::string file_;
  std::vector<std::string> lines_;
};

}  // namespace bine

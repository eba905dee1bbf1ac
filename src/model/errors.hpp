#pragma once
// The two errors a brewer can meet, each carrying its exit status. They are caught in one place
// (src/cli/app.cpp) and printed one line each with the prefix "bine: error: ".
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace bine {

/// Exit statuses: 0 ok, 2 bad input, 3 infeasible request.
inline constexpr int kExitBadInput = 2;
inline constexpr int kExitInfeasible = 3;

/// Something the brewer can change to make a request work, in the words of the domain. Engines attach
/// these to their errors instead of naming command-line options; the command line turns each into
/// the option that does it (src/cli/remedies.cpp).
enum class Remedy {
  lower_whirlpool_share,   // put less of the late hops in the whirlpool
  raise_whirlpool_share,   // put more of the late hops in the whirlpool
  lower_late_amount,       // fewer late grams (rate) or less oil (dose)
  raise_late_amount,       // more late grams or oil
  raise_target_ibu,        // a higher IBU to hold
  add_stock,               // more hops on hand
  more_varieties,          // allow more varieties in the blend
  allow_bittering,         // allow a bittering charge
  name_bittering_variety,  // say which variety bitters
  no_bittering,            // do without a bittering charge
  later_brew_day,          // brew on a later day
  whole_catalog,           // look beyond the lots on hand
  add_catalog,             // load another catalog
  aim_by_target,           // aim at an aroma profile instead of a variety
  give_late_amount,        // say how much late hop to use
  add_alpha_acid,          // give the hop's alpha acid in the catalog or stock
  add_aroma_stock,         // have lots of aroma varieties on hand
  add_aroma_catalog,       // load a catalog with aroma data
  trim_kept_additions,     // fewer grams or shorter times for the boil additions a recipe keeps
  bittering_with_alpha,    // bitter with a variety whose alpha acid is known
  give_stock_file,         // say which stock file the lots are in
};

/// The most characters a message quotes of one name or value ("unknown variety "...""): a longer one
/// shows its first 60 and its length, so a 10,000-character name makes a line of about a hundred.
inline constexpr std::size_t kMaxQuotedCharacters = 60;

/// The most characters of one message line; the rest is cut and counted. A backstop for what is not
/// quoted (a list of every lot code of a large stock, a long word in a command-line parse error).
inline constexpr std::size_t kMaxLineCharacters = 1000;

/// The first `count` characters of `text` (UTF-8 sequences; a byte that is not part of one counts as
/// one), never cut inside a character; all of `text` when it is not longer.
std::string_view first_characters(std::string_view text, std::size_t count);

/// `text` in double quotes as a message shows it: whole when it has at most kMaxQuotedCharacters
/// characters, else its first 60 (cut between UTF-8 characters, never inside one), "..." and its
/// length: "qqqq...q..." (10,000 characters).
std::string quoted_name(std::string_view text);

/// A message line as bine prints it (every InputError and Infeasible line, command-line parse errors):
/// each quoted text ("...") of more than kMaxQuotedCharacters characters cut as quoted_name cuts it,
/// control characters and bytes that are not UTF-8 escaped (\n, \xFF), invisible characters named
/// (\u200B), and the line cut after kMaxLineCharacters characters, saying how long it was. Call sites
/// only quote names; this is the one place that shortens them.
std::string message_line(std::string_view line);

/// Bad input: a file, field or option that cannot be used. Holds one line per problem.
class InputError : public std::runtime_error {
 public:
  explicit InputError(std::string line, std::vector<Remedy> remedies = {});
  explicit InputError(std::vector<std::string> lines, std::vector<Remedy> remedies = {});
  const std::vector<std::string>& lines() const { return lines_; }
  /// What would fix every line, for the command line to name its options.
  const std::vector<Remedy>& remedies() const { return remedies_; }

 private:
  std::vector<std::string> lines_;
  std::vector<Remedy> remedies_;
};

/// A well-formed request that cannot be met (no stock, IBU already exceeded ...). Says why in domain
/// words and lists what would make it feasible.
class Infeasible : public std::runtime_error {
 public:
  explicit Infeasible(const std::string& why, std::vector<Remedy> remedies = {})
      : std::runtime_error(message_line(why)), remedies_(std::move(remedies)) {}
  const std::vector<Remedy>& remedies() const { return remedies_; }

 private:
  std::vector<Remedy> remedies_;
};

/// At most this many problem lines are reported for one file or one command line; the rest are
/// counted ("... and 2999950 more problems"), so a broken file cannot flood the terminal or memory.
inline constexpr std::size_t kMaxProblemLines = 50;

/// The line that ends a capped list: "PREFIX... and N more problems (fix these first)".
std::string more_problems_line(const std::string& prefix, std::size_t more);

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
  /// The first kMaxProblemLines problems.
  const std::vector<std::string>& lines() const { return lines_; }
  /// Throws InputError with the collected lines (and how many more there were) when there is any.
  void throw_if_any() const;

 private:
  void push(std::string line);

  std::string file_;
  std::vector<std::string> lines_;
  std::size_t more_ = 0;  // problems beyond kMaxProblemLines, counted only
};

}  // namespace bine

#pragma once
// Matching variety names as brewers type them: case- and accent-insensitive, with "did you mean"
// suggestions by edit distance over the known names (as ninja suggests targets).
#include <array>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace bine {

/// Folds case, Latin accents (UTF-8) and runs of spaces, hyphens and underscores, so
/// "ETOILE-pale" and "Étoile Pâle" compare equal. The text is first put in Unicode normal form C
/// (a decomposed "e" + combining acute is the composed "é") and stripped of invisible characters
/// (zero-width space and joiners, word joiner, byte order mark, soft hyphen: Unicode's default
/// ignorables), so "Tide\u200Bwell" is "Tidewell".
std::string fold_name(std::string_view name);

/// Why `name` cannot be a name (a control character such as NUL, BEL, ESC or a newline, which would
/// break tables and terminals, or bytes that are not UTF-8), or nullopt when it can.
std::optional<std::string> name_problem(std::string_view name);

/// `text` without leading and trailing white space.
std::string_view trim_space(std::string_view text);

/// Levenshtein distance between two strings (bytes).
std::size_t edit_distance(std::string_view a, std::string_view b);

/// edit_distance(a, b) when it is at most `bound`, else bound + 1; costs O(bound x length) at most.
std::size_t edit_distance_within(std::string_view a, std::string_view b, std::size_t bound);

/// The longest name (bytes, after fold_name) that gets "did you mean" suggestions. A longer one is
/// not a typo of a known name (hop varieties, lot codes, axes and keys are far shorter) and is
/// answered without comparing it, which bounds the edit-distance work per known name.
inline constexpr std::size_t kMaxSuggestedLength = 64;

/// A name of at most kMaxSuggestedLength bytes to be compared with many others by edit distance.
/// distance_within(text, bound) equals edit_distance_within(name, text, bound); it runs Myers'
/// bit-vector algorithm (the table's column in one 64-bit word), a dozen word operations per byte
/// of `text`.
class NearName {
 public:
  /// Throws std::length_error for a name longer than kMaxSuggestedLength bytes.
  explicit NearName(std::string_view name);
  std::size_t distance_within(std::string_view text, std::size_t bound) const;

 private:
  std::array<std::uint64_t, 256> positions_{};  // per byte value: bit i set where name[i] is that byte
  std::size_t length_ = 0;
};

/// Up to `limit` known names closest to `wanted` (folded comparison), best first; none when the
/// folded `wanted` is longer than kMaxSuggestedLength.
std::vector<std::string> closest_names(std::string_view wanted, const std::vector<std::string>& known,
                                       std::size_t limit = 3);

/// A whole number with its digits in groups of three for messages: 250000 -> "250,000".
std::string grouped(std::size_t number);

/// "1 lot", "2 lots": the count with the noun in the number it needs.
std::string count_of(std::size_t count, std::string_view singular, std::string_view plural);

/// "did you mean A, B or C?" or an empty string.
std::string did_you_mean(std::string_view wanted, const std::vector<std::string>& known);

}  // namespace bine

#include "model/names.hpp"

#include <utf8proc.h>

#include <algorithm>
#include <cctype>
#include <cstdio>
#include <cstdlib>
#include <memory>
#include <numeric>
#include <stdexcept>

namespace bine {
namespace {

// Latin-1 Supplement letters U+00C0..U+00FF folded to ASCII (index = code point - 0xC0).
constexpr std::string_view kLatin1Fold[64] = {
    "a", "a", "a", "a", "a", "a", "ae", "c", "e",  "e",  "e", "e", "i", "i", "i", "i", "d",  "n", "o",  "o", "o", "o",
    "o", "x", "o", "u", "u", "u", "u",  "y", "th", "ss", "a", "a", "a", "a", "a", "a", "ae", "c", "e",  "e", "e", "e",
    "i", "i", "i", "i", "d", "n", "o",  "o", "o",  "o",  "o", "/", "o", "u", "u", "u", "u",  "y", "th", "y"};

// Latin Extended-A (U+0100..U+017F): base letters in pairs of upper/lower case, mostly.
char fold_extended_a(unsigned code) {
  static constexpr std::string_view base =
      "aaaaaaccccccccddddeeeeeeeeeegggggggghhhhiiiiiiiiiiiijjkkklllllll"
      "lllnnnnnnnnnoooooooorrrrrrssssssssttttttuuuuuuuuuuuuwwyyyzzzzzzs";
  const unsigned index = code - 0x100;
  return index < base.size() ? base[index] : '?';
}

// NFC with default ignorables removed (utf8proc, Unicode's own tables); text that is not UTF-8
// is left as it is.
std::string normal_form(std::string_view name) {
  bool ascii = true;
  for (char c : name) ascii = ascii && static_cast<unsigned char>(c) < 0x80;
  if (ascii) return std::string(name);  // the common case, and already normal
  utf8proc_uint8_t* mapped = nullptr;
  const auto length =
      utf8proc_map(reinterpret_cast<const utf8proc_uint8_t*>(name.data()), static_cast<utf8proc_ssize_t>(name.size()),
                   &mapped, static_cast<utf8proc_option_t>(UTF8PROC_STABLE | UTF8PROC_COMPOSE | UTF8PROC_IGNORE));
  if (length < 0) return std::string(name);
  const std::unique_ptr<utf8proc_uint8_t, decltype(&std::free)> owner(mapped, &std::free);
  return std::string(reinterpret_cast<const char*>(mapped), static_cast<std::size_t>(length));
}

}  // namespace

std::string_view trim_space(std::string_view text) {
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.front()))) text.remove_prefix(1);
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back()))) text.remove_suffix(1);
  return text;
}

std::optional<std::string> name_problem(std::string_view name) {
  const auto* bytes = reinterpret_cast<const utf8proc_uint8_t*>(name.data());
  utf8proc_ssize_t at = 0;
  const auto size = static_cast<utf8proc_ssize_t>(name.size());
  while (at < size) {
    utf8proc_int32_t code = 0;
    const auto length = utf8proc_iterate(bytes + at, size - at, &code);
    if (length <= 0) return std::string("is not valid UTF-8 text");
    if (utf8proc_category(code) == UTF8PROC_CATEGORY_CC) {
      char hex[16];
      std::snprintf(hex, sizeof hex, "U+%04X", static_cast<unsigned>(code));
      return std::string("contains the control character ") + hex +
             " (names may not hold NUL, BEL, escape sequences, tabs or line breaks)";
    }
    at += length;
  }
  return std::nullopt;
}

namespace {

std::string fold_normal(std::string_view name) {
  std::string out;
  bool pending_space = false;
  auto put = [&](std::string_view piece) {
    if (pending_space && !out.empty()) out += ' ';
    pending_space = false;
    out += piece;
  };
  for (std::size_t i = 0; i < name.size();) {
    const auto byte = static_cast<unsigned char>(name[i]);
    if (byte < 0x80) {
      if (std::isspace(byte) || byte == '-' || byte == '_') {
        pending_space = true;
      } else {
        const char c = static_cast<char>(std::tolower(byte));
        put(std::string_view(&c, 1));
      }
      ++i;
      continue;
    }
    // Two-byte UTF-8 sequences cover Latin-1 Supplement and Latin Extended-A.
    if ((byte & 0xE0) == 0xC0 && i + 1 < name.size()) {
      const unsigned code = ((byte & 0x1Fu) << 6) | (static_cast<unsigned char>(name[i + 1]) & 0x3Fu);
      if (code >= 0xC0 && code <= 0xFF) {
        put(kLatin1Fold[code - 0xC0]);
      } else if (code >= 0x100 && code <= 0x17F) {
        const char c = fold_extended_a(code);
        put(std::string_view(&c, 1));
      } else {
        put(name.substr(i, 2));
      }
      i += 2;
      continue;
    }
    put(name.substr(i, 1));
    ++i;
  }
  return out;
}

}  // namespace

std::string fold_name(std::string_view name) { return fold_normal(normal_form(name)); }

std::size_t edit_distance(std::string_view a, std::string_view b) {
  std::vector<std::size_t> row(b.size() + 1);
  std::iota(row.begin(), row.end(), std::size_t{0});
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diagonal = up;
    }
  }
  return row[b.size()];
}

std::size_t edit_distance_within(std::string_view a, std::string_view b, std::size_t bound) {
  const std::size_t over = bound + 1;
  const std::size_t gap = a.size() > b.size() ? a.size() - b.size() : b.size() - a.size();
  if (gap > bound) return over;  // every length difference costs an insertion or deletion
  // Row i holds distances from a[0..i) to b[0..j); only the band |i - j| <= bound can stay within
  // the bound (Ukkonen 1985), cells outside it count as over.
  std::vector<std::size_t> row(b.size() + 1, over);
  for (std::size_t j = 0; j <= std::min(b.size(), bound); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    const std::size_t first = i > bound ? i - bound : 1;
    const std::size_t last = std::min(b.size(), i + bound);
    std::size_t diagonal = row[first - 1];
    row[first - 1] = first == 1 && i <= bound ? i : over;
    std::size_t lowest = row[first - 1];
    for (std::size_t j = first; j <= last; ++j) {
      const std::size_t up = row[j];
      row[j] = std::min({std::min(up, over) + 1, row[j - 1] + 1, diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      row[j] = std::min(row[j], over);
      diagonal = up;
      lowest = std::min(lowest, row[j]);
    }
    if (lowest > bound) return over;  // no path through this row stays within the bound
  }
  return std::min(row[b.size()], over);
}

// Myers' bit-vector edit distance: G. Myers, "A fast bit-vector algorithm for approximate string
// matching based on dynamic programming", J. ACM 46(3), 395-415 (1999), in the form H. Hyyro gives
// for the distance between two whole strings ("Explaining and extending the bit-parallel approximate
// string matching algorithm of Myers", Univ. of Tampere report A-2001-10, 2001). Column j of the
// table D[i][j] (i over the name, j over the text) is kept as its vertical differences
// D[i][j] - D[i-1][j], each +1, 0 or -1: bit i of `plus` / `minus` says +1 / -1. Column 0 is
// 0, 1, ..., m (all +1); the top row is 0, 1, 2, ... (the whole text must be matched), so each step
// shifts a +1 into the horizontal differences. D[m][j] is followed through the top bit. Limits: a
// name of at most 64 bytes (one word); bytes, not characters, as in edit_distance.
NearName::NearName(std::string_view name) : length_(name.size()) {
  if (name.size() > kMaxSuggestedLength) throw std::length_error("NearName: a name longer than 64 bytes");
  for (std::size_t i = 0; i < name.size(); ++i)
    positions_[static_cast<unsigned char>(name[i])] |= std::uint64_t{1} << i;
}

std::size_t NearName::distance_within(std::string_view text, std::size_t bound) const {
  const std::size_t over = bound + 1;
  const std::size_t gap = length_ > text.size() ? length_ - text.size() : text.size() - length_;
  if (gap > bound) return over;  // every length difference costs an insertion or deletion
  if (length_ == 0) return text.size();
  const std::uint64_t top = std::uint64_t{1} << (length_ - 1);
  std::uint64_t plus = ~std::uint64_t{0};  // column 0: every vertical difference +1
  std::uint64_t minus = 0;
  std::size_t score = length_;  // D[m][0]
  for (std::size_t j = 0; j < text.size(); ++j) {
    const std::uint64_t equal = positions_[static_cast<unsigned char>(text[j])];
    const std::uint64_t vertical = equal | minus;
    const std::uint64_t horizontal = (((equal & plus) + plus) ^ plus) | equal;
    std::uint64_t horizontal_plus = minus | ~(horizontal | plus);
    std::uint64_t horizontal_minus = plus & horizontal;
    if (horizontal_plus & top)
      ++score;
    else if (horizontal_minus & top)
      --score;
    horizontal_plus = (horizontal_plus << 1) | 1u;  // the top row rises by one per text byte
    horizontal_minus <<= 1;
    plus = horizontal_minus | ~(vertical | horizontal_plus);
    minus = horizontal_plus & vertical;
    // D[m][n] >= D[m][j] - (bytes left): past the bound already, no need to read on.
    if (score > bound + (text.size() - j - 1)) return over;
  }
  return std::min(score, over);
}

// Scores every known name against what was typed, keeping only the `limit` best within the
// threshold; each distance is computed only as far as the worst one kept (length filter and early
// exit in NearName::distance_within). What was typed is considered only up to kMaxSuggestedLength
// bytes folded: a longer name gets no suggestion without any comparison, and a shorter one costs a
// few word operations per byte of the candidates that pass the length filter, so a 10 kB name
// against 124,000 names (some of them 10 kB long too) answers at once.
std::vector<std::string> closest_names(std::string_view wanted, const std::vector<std::string>& known,
                                       std::size_t limit) {
  const std::string folded = fold_name(wanted);
  if (folded.size() > kMaxSuggestedLength) return {};  // no name is typed that long by mistake
  const NearName near(folded);
  const std::size_t threshold = std::max<std::size_t>(3, folded.size() / 2);
  std::vector<std::pair<std::size_t, std::size_t>> best;  // (distance, index in known), best first
  for (std::size_t index = 0; index < known.size() && limit > 0; ++index) {
    if (best.size() == limit && best.back().first == 0) break;
    // Ties keep the earlier name, so once `limit` names are kept a new one must be strictly better.
    const std::size_t bound = best.size() < limit ? threshold : best.back().first - 1;
    const std::string candidate = fold_name(known[index]);
    std::size_t distance = 0;
    if (candidate == folded)
      distance = 0;
    else if (!folded.empty() && candidate.rfind(folded, 0) == 0)
      distance = 1;  // a name that starts with what was typed is a strong hint
    else
      distance = near.distance_within(candidate, bound);
    if (distance > bound) continue;
    const auto at = std::upper_bound(best.begin(), best.end(), distance,
                                     [](std::size_t d, const auto& entry) { return d < entry.first; });
    best.insert(at, {distance, index});
    if (best.size() > limit) best.pop_back();
  }
  std::vector<std::string> out;
  for (const auto& entry : best) out.push_back(known[entry.second]);
  return out;
}

std::string did_you_mean(std::string_view wanted, const std::vector<std::string>& known) {
  const auto names = closest_names(wanted, known);
  if (names.empty()) return {};
  std::string out = "did you mean ";
  for (std::size_t i = 0; i < names.size(); ++i) {
    if (i > 0) out += (i + 1 == names.size()) ? " or " : ", ";
    out += names[i];
  }
  return out + "?";
}

std::string grouped(std::size_t number) {
  const std::string digits = std::to_string(number);
  std::string out;
  for (std::size_t i = 0; i < digits.size(); ++i) {
    if (i > 0 && (digits.size() - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return out;
}

std::string count_of(std::size_t count, std::string_view singular, std::string_view plural) {
  return std::to_string(count) + " " + std::string(count == 1 ? singular : plural);
}

}  // namespace bine

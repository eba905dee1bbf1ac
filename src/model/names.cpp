#include "model/names.hpp"

#include <algorithm>
#include <cctype>
#include <numeric>

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

}  // namespace

std::string_view trim_space(std::string_view text) {
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.front()))) text.remove_prefix(1);
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back()))) text.remove_suffix(1);
  return text;
}

std::string fold_name(std::string_view name) {
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

std::vector<std::string> closest_names(std::string_view wanted, const std::vector<std::string>& known,
                                       std::size_t limit) {
  const std::string folded = fold_name(wanted);
  std::vector<std::pair<std::size_t, std::string>> scored;
  for (const auto& name : known) {
    const std::string candidate = fold_name(name);
    std::size_t distance = edit_distance(folded, candidate);
    // A name that starts with what was typed is a strong hint.
    if (!folded.empty() && candidate.rfind(folded, 0) == 0) distance = std::min<std::size_t>(distance, 1);
    scored.emplace_back(distance, name);
  }
  std::stable_sort(scored.begin(), scored.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
  const std::size_t threshold = std::max<std::size_t>(3, folded.size() / 2);
  std::vector<std::string> out;
  for (const auto& [distance, name] : scored) {
    if (out.size() >= limit || distance > threshold) break;
    out.push_back(name);
  }
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

std::string count_of(std::size_t count, std::string_view singular, std::string_view plural) {
  return std::to_string(count) + " " + std::string(count == 1 ? singular : plural);
}

}  // namespace bine

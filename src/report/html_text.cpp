#include "report/html_text.hpp"

#include <algorithm>
#include <array>

#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine::html {
namespace {

bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_alnum(char c) { return is_digit(c) || (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }

// Units the reports write after a number (output_format and the page texts).
constexpr std::array<std::string_view, 20> kUnits{"%",  "g",   "kg", "oz",  "lb",     "IBU",   "C",
                                                  "F",  "L",   "mL", "gal", "min",    "d",     "days",
                                                  "SG", "g/g", "h",  "ppm", "mL/100", "points"};

std::string_view without_trailing_punctuation(std::string_view word) {
  while (!word.empty() && std::string_view(",;:.)").find(word.back()) != std::string_view::npos) word.remove_suffix(1);
  return word;
}

// "12.3", "-1", "+0.47", "(80": a number, perhaps opened by a bracket or a sign.
bool is_number(std::string_view word) {
  if (!word.empty() && (word.front() == '(' || word.front() == '+' || word.front() == '-')) word.remove_prefix(1);
  if (word.empty() || !is_digit(word.front())) return false;
  bool dot = false;
  for (std::size_t i = 0; i < word.size(); ++i) {
    if (word[i] == '.' && !dot && i > 0 && i + 1 < word.size()) {
      dot = true;
    } else if (!is_digit(word[i])) {
      return false;
    }
  }
  return true;
}

bool is_unit(std::string_view word) {
  const std::string_view bare = without_trailing_punctuation(word);
  return std::find(kUnits.begin(), kUnits.end(), bare) != kUnits.end();
}

// "1." before a name, as in a ranked list.
bool is_rank(std::string_view word) {
  return word.size() >= 2 && word.back() == '.' &&
         std::all_of(word.begin(), word.end() - 1, [](char c) { return is_digit(c); });
}

// A lot code, a date, a range or an option: letters and digits joined by a hyphen, with a digit
// in it or opened by "--" ("stone-fruit" and "Late-hop" may break at their hyphen as words do).
bool hyphen_bound(std::string_view word) {
  bool joined = false;
  for (std::size_t i = 1; i + 1 < word.size(); ++i)
    joined = joined || (word[i] == '-' && is_alnum(word[i - 1]) && is_alnum(word[i + 1]));
  if (!joined) return false;
  return word.starts_with("--") || std::any_of(word.begin(), word.end(), [](char c) { return is_digit(c); });
}

struct Piece {
  std::string text;
  bool keep = false;  // held on one line
};

std::vector<Piece> pieces(std::string_view text) {
  std::vector<std::string_view> words;
  for (std::size_t start = 0;;) {
    const std::size_t end = text.find(' ', start);
    words.push_back(text.substr(start, end == std::string_view::npos ? std::string_view::npos : end - start));
    if (end == std::string_view::npos) break;
    start = end + 1;
  }
  std::vector<Piece> out;
  for (std::size_t i = 0; i < words.size(); ++i) {
    const std::string_view word = words[i];
    const bool pairs = i + 1 < words.size() && !words[i + 1].empty() &&
                       ((is_number(without_trailing_punctuation(word)) && is_unit(words[i + 1])) || is_rank(word));
    const std::string joined = pairs ? std::string(word) + " " + std::string(words[i + 1]) : std::string(word);
    if (pairs && display_width(joined) <= kMaxUnbroken) {
      out.push_back({joined, true});
      ++i;
    } else {
      out.push_back({std::string(word), hyphen_bound(word) && display_width(std::string(word)) <= kMaxUnbroken});
    }
  }
  return out;
}

std::vector<std::string_view> words_of(std::string_view heading) {
  std::vector<std::string_view> words;
  for (std::size_t start = 0; start <= heading.size();) {
    const std::size_t end = std::min(heading.find(' ', start), heading.size());
    if (end > start) words.push_back(heading.substr(start, end - start));
    start = end + 1;
  }
  return words;
}

// Where a heading of three words or more splits into two halves of about equal width: the first
// half is words [0, k). 0 for a heading of one or two words (it wraps at its one space, if at all).
std::size_t heading_split(const std::vector<std::string_view>& words) {
  if (words.size() < 3) return 0;
  std::size_t best = 1, best_width = std::string::npos;
  for (std::size_t k = 1; k < words.size(); ++k) {
    std::size_t first = k - 1, second = words.size() - k - 1;  // the spaces
    for (std::size_t w = 0; w < words.size(); ++w) (w < k ? first : second) += display_width(std::string(words[w]));
    if (std::max(first, second) < best_width) {
      best_width = std::max(first, second);
      best = k;
    }
  }
  return best;
}

std::string joined(const std::vector<std::string_view>& words, std::size_t from, std::size_t to) {
  std::string out;
  for (std::size_t w = from; w < to; ++w) out += (w > from ? " " : "") + std::string(words[w]);
  return out;
}

}  // namespace

std::vector<std::string> unbroken_pieces(std::string_view text) {
  std::vector<std::string> out;
  for (auto& piece : pieces(text)) out.push_back(std::move(piece.text));
  return out;
}

std::string text_html(std::string_view text) {
  std::string out;
  bool first = true;
  for (const Piece& piece : pieces(text)) {
    if (!first) out += ' ';
    first = false;
    out += piece.keep ? "<span class=\"nb\">" + html_escape(piece.text) + "</span>" : html_escape(piece.text);
  }
  return out;
}

std::string heading_html(std::string_view heading) {
  const auto words = words_of(heading);
  const std::size_t k = heading_split(words);
  if (k == 0) return html_escape(heading);
  return "<span class=\"nb\">" + html_escape(joined(words, 0, k)) + "</span> <span class=\"nb\">" +
         html_escape(joined(words, k, words.size())) + "</span>";
}

std::size_t heading_min_chars(std::string_view heading) {
  const auto words = words_of(heading);
  const std::size_t k = heading_split(words);
  if (k == 0) {
    std::size_t longest = 0;
    for (const auto word : words) longest = std::max(longest, display_width(std::string(word)));
    return longest;
  }
  return std::max(display_width(joined(words, 0, k)), display_width(joined(words, k, words.size())));
}

}  // namespace bine::html

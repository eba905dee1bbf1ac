#pragma once
// Running text on the HTML pages, so that a line never breaks where a brewer would misread it: a
// number and its unit stay together ("12.28 %", "80 C", "20 min"), so do a lot code, a date or a
// range ("KS-25-007", "2026-06-01", "6.0-8.0%"), an option ("--oil-dose") and a rank ("1. Seawick").
// Each such piece is one nowrap span; the text between them wraps as usual. A piece longer than
// kMaxUnbroken characters (a file path) is left free to wrap, so nothing is pushed past a phone's
// width. Table headings of three words or more wrap into at most two balanced lines.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace bine::html {

/// Longest piece (in characters) kept on one line.
inline constexpr std::size_t kMaxUnbroken = 24;

/// `text` cut into the pieces a line may break between: words, and the groups kept whole above.
std::vector<std::string> unbroken_pieces(std::string_view text);

/// `text` escaped, with each group kept whole in <span class="nb">.
std::string text_html(std::string_view text);

/// A column heading escaped; three words or more become two nowrap halves of about equal length.
std::string heading_html(std::string_view heading);

/// The longest half heading_html keeps on one line (the heading's narrowest width), in characters.
std::size_t heading_min_chars(std::string_view heading);

}  // namespace bine::html

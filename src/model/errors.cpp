#include "model/errors.hpp"

#include <utf8proc.h>

#include <cstdio>
#include <string_view>

#include "model/names.hpp"

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
// Length of the valid UTF-8 sequence starting at text[i], or 0 when it is not valid UTF-8.
std::size_t utf8_length(std::string_view text, std::size_t i) {
  const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char lead = byte(i);
  std::size_t length = 0;
  if (lead >= 0xC2 && lead <= 0xDF)
    length = 2;
  else if (lead >= 0xE0 && lead <= 0xEF)
    length = 3;
  else if (lead >= 0xF0 && lead <= 0xF4)
    length = 4;
  else
    return 0;
  if (i + length > text.size()) return 0;
  for (std::size_t k = 1; k < length; ++k)
    if ((byte(i + k) & 0xC0) != 0x80) return 0;
  if (lead == 0xE0 && byte(i + 1) < 0xA0) return 0;  // overlong
  if (lead == 0xED && byte(i + 1) > 0x9F) return 0;  // surrogate
  if (lead == 0xF0 && byte(i + 1) < 0x90) return 0;  // overlong
  if (lead == 0xF4 && byte(i + 1) > 0x8F) return 0;  // beyond U+10FFFF
  return length;
}

// "\u200B" for a character that shows nothing (zero-width space and joiners, byte order mark,
// soft hyphen, bidirectional controls: Unicode's default ignorables and format characters), else "".
std::string invisible_escape(std::string_view sequence) {
  utf8proc_int32_t code = 0;
  if (utf8proc_iterate(reinterpret_cast<const utf8proc_uint8_t*>(sequence.data()),
                       static_cast<utf8proc_ssize_t>(sequence.size()), &code) <= 0)
    return {};
  const utf8proc_property_t* property = utf8proc_get_property(code);
  if (!property->ignorable && property->category != UTF8PROC_CATEGORY_CF) return {};
  char text[16];
  std::snprintf(text, sizeof text, "\\u%04X", static_cast<unsigned>(code));
  return text;
}

// User text (file content, arguments) ends up inside messages. Keep each problem on one printable
// line: control characters and bytes that are not UTF-8 are shown as escapes (\n, \xFF).
std::string printable(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (std::size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    if (c >= 0x20 && c < 0x7F) {
      out += static_cast<char>(c);
      ++i;
    } else if (c == '\n') {
      out += "\\n";
      ++i;
    } else if (c == '\t') {
      out += "\\t";
      ++i;
    } else if (const std::size_t length = c >= 0x80 ? utf8_length(text, i) : 0; length > 0) {
      if (const std::string escape = invisible_escape(text.substr(i, length)); !escape.empty())
        out += escape;  // "Test\u200Bvine", not a name that looks like another
      else
        out.append(text.substr(i, length));
      i += length;
    } else {
      static constexpr char kHex[] = "0123456789ABCDEF";
      out += "\\x";
      out += kHex[c >> 4];
      out += kHex[c & 0xF];
      ++i;
    }
  }
  return out;
}

std::vector<std::string> message_lines(std::vector<std::string> lines) {
  for (auto& line : lines) line = message_line(line);
  return lines;
}

// The index after the character at text[i]: a UTF-8 sequence, or one byte that is not part of one.
std::size_t next_character(std::string_view text, std::size_t i) {
  const std::size_t length = static_cast<unsigned char>(text[i]) >= 0x80 ? utf8_length(text, i) : 0;
  return i + (length > 0 ? length : 1);
}

std::size_t character_count(std::string_view text) {
  std::size_t count = 0;
  for (std::size_t i = 0; i < text.size(); i = next_character(text, i)) ++count;
  return count;
}

// The bytes of the first `count` characters of `text` (all of it when it is not longer).
std::size_t prefix_bytes(std::string_view text, std::size_t count) {
  std::size_t i = 0;
  for (std::size_t seen = 0; i < text.size() && seen < count; ++seen) i = next_character(text, i);
  return i;
}

// The next double quote at or after `from` that no backslash escapes (brief() writes JSON strings,
// whose quotes inside are \"), or npos.
std::size_t next_quote(std::string_view line, std::size_t from) {
  for (std::size_t at = line.find('"', from); at != std::string_view::npos; at = line.find('"', at + 1))
    if (at == 0 || line[at - 1] != '\\') return at;
  return std::string_view::npos;
}

// Whether `rest` starts with the length quoted_name writes after a cut quote, " (10,000 characters)":
// that text is cut already (a message that quotes another message's line goes through twice).
bool starts_with_length(std::string_view rest) {
  if (rest.substr(0, 2) != " (") return false;
  const std::size_t digits = rest.find_first_not_of("0123456789,", 2);
  return digits > 2 && digits != std::string_view::npos && rest.substr(digits, 12) == " characters)";
}

// `line` with each quoted text of more than kMaxQuotedCharacters characters cut by quoted_name.
std::string cut_quoted(std::string_view line) {
  std::string out;
  std::size_t done = 0;
  for (std::size_t open = next_quote(line, 0); open != std::string_view::npos;) {
    const std::size_t close = next_quote(line, open + 1);
    if (close == std::string_view::npos) break;
    const std::string_view inside = line.substr(open + 1, close - open - 1);
    if (prefix_bytes(inside, kMaxQuotedCharacters) < inside.size() && !starts_with_length(line.substr(close + 1))) {
      out.append(line.substr(done, open - done));
      out += quoted_name(inside);
      done = close + 1;
    }
    open = next_quote(line, close + 1);
  }
  out.append(line.substr(done));
  return out;
}

// A JSON pointer with each part longer than kMaxQuotedCharacters characters cut ("/hops/0/qqq...").
std::string shown_pointer(const std::string& pointer) {
  std::string out;
  for (std::size_t start = 0; start < pointer.size();) {
    const std::size_t slash = pointer.find('/', start + 1);
    const std::size_t end = slash == std::string::npos ? pointer.size() : slash;
    const std::string_view part = std::string_view(pointer).substr(start, end - start);
    const std::size_t cut = prefix_bytes(part, kMaxQuotedCharacters + 1);  // the slash and 60 characters
    out.append(part.substr(0, cut));
    if (cut < part.size()) out += "...";
    start = end;
  }
  return out;
}

}  // namespace

std::string_view first_characters(std::string_view text, std::size_t count) {
  return text.substr(0, prefix_bytes(text, count));
}

std::string quoted_name(std::string_view text) {
  const std::size_t cut = prefix_bytes(text, kMaxQuotedCharacters);
  if (cut == text.size()) return "\"" + std::string(text) + "\"";
  return "\"" + std::string(text.substr(0, cut)) + "...\" (" + grouped(character_count(text)) + " characters)";
}

std::string message_line(std::string_view line) {
  std::string out = printable(cut_quoted(line));
  const std::size_t cut = prefix_bytes(out, kMaxLineCharacters);
  if (cut == out.size()) return out;
  const std::string_view rest = std::string_view(out).substr(cut);
  if (rest.substr(0, 5) == "... (" && rest.ends_with(" characters in all)")) return out;  // capped already
  return out.substr(0, cut) + "... (" + grouped(character_count(out)) + " characters in all)";
}

InputError::InputError(std::string line, std::vector<Remedy> remedies)
    : InputError(std::vector<std::string>{std::move(line)}, std::move(remedies)) {}
InputError::InputError(std::vector<std::string> lines, std::vector<Remedy> remedies)
    : std::runtime_error(join_lines(message_lines(lines))),
      lines_(message_lines(std::move(lines))),
      remedies_(std::move(remedies)) {}

void Diagnostics::push(std::string line) {
  if (lines_.size() < kMaxProblemLines)
    lines_.push_back(std::move(line));
  else
    ++more_;
}

void Diagnostics::add(const std::string& pointer, const std::string& message) {
  if (lines_.size() >= kMaxProblemLines) {
    ++more_;
    return;
  }
  push(file_ + ": " + (pointer.empty() ? std::string("/") : shown_pointer(pointer)) + ": " + message);
}

void Diagnostics::add_file(const std::string& message) { push(file_ + ": " + message); }

void Diagnostics::throw_if_any() const {
  if (lines_.empty()) return;
  std::vector<std::string> lines = lines_;
  if (more_ > 0) lines.push_back(more_problems_line(file_ + ": ", more_));
  throw InputError(std::move(lines));
}

std::string more_problems_line(const std::string& prefix, std::size_t more) {
  return prefix + "... and " + std::to_string(more) + (more == 1 ? " more problem" : " more problems") +
         " (fix these first)";
}

}  // namespace bine

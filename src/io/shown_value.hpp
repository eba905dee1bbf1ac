#pragma once
// A value from a file as an error message shows it: in double quotes, on one line (control
// characters become spaces), cut to 40 bytes, so a hostile value cannot break the one-line rule.
#include <string>
#include <string_view>

namespace bine {

inline std::string shown_value(std::string_view value) {
  std::string out;
  for (char c : value.substr(0, 40)) out += static_cast<unsigned char>(c) < 0x20 || c == 0x7f ? ' ' : c;
  return "\"" + out + (value.size() > 40 ? "...\"" : "\"");
}

}  // namespace bine
